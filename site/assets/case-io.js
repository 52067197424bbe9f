// What the calculators ask of the browser for sharing and saving cases, handed to the engine by
// boot.js: compressing a case into a link, reading one back, downloading a file and picking one.
// Everything stays in the browser: a link carries the case after "#", which is never sent to a
// server, and files are read and written on this machine only.
//
// A link is PAGE#calc=N&case=DATA, N the calculator's place on the page from 1 and DATA the
// scenario's JSON text (UTF-8) compressed with raw DEFLATE and written in base64url without
// padding (docs/scenario-format.md, "A case in a link").

function toBase64Url(bytes) {
  let binary = "";
  for (let i = 0; i < bytes.length; i += 0x8000) {
    binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  }
  return btoa(binary).replaceAll("+", "-").replaceAll("/", "_").replace(/=+$/, "");
}

function fromBase64Url(text) {
  const binary = atob(text.replaceAll("-", "+").replaceAll("_", "/"));
  return Uint8Array.from(binary, (c) => c.charCodeAt(0));
}

async function through(bytes, stream) {
  const piped = new Blob([bytes]).stream().pipeThrough(stream);
  return new Uint8Array(await new Response(piped).arrayBuffer());
}

// The DATA of a link for a scenario's text.
export async function encodeCase(text) {
  const packed = await through(new TextEncoder().encode(text), new CompressionStream("deflate-raw"));
  return toBase64Url(packed);
}

// The scenario's text from a link's DATA.
export async function decodeCase(data) {
  const text = await through(fromBase64Url(data), new DecompressionStream("deflate-raw"));
  return new TextDecoder("utf-8", { fatal: true }).decode(text);
}

// The case a link to this page carries, if any: { calculator, text } or { calculator, error }.
export async function incomingCase(location) {
  const fields = new URLSearchParams(location.hash.slice(1));
  const data = fields.get("case");
  if (!data) {
    return null;
  }
  const calculator = Number(fields.get("calc") ?? "1");
  try {
    return { calculator, text: await decodeCase(data) };
  } catch (error) {
    return { calculator, error: `the link's case could not be read (${error.message}); it may have been cut short` };
  }
}

// The object the engine calls. Each asynchronous step reports through `done`, with a string on
// success and anything else on failure.
export function caseIo(incoming) {
  return {
    incoming,
    link(calculator, text, done) {
      encodeCase(text).then(
        (data) => {
          const url = new URL(window.location.href);
          url.hash = `calc=${calculator}&case=${data}`;
          done(url.href);
        },
        () => done(null),
      );
    },
    download(name, type, text) {
      const url = URL.createObjectURL(new Blob([text], { type }));
      const a = document.createElement("a");
      a.href = url;
      a.download = name;
      a.hidden = true;
      document.body.append(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 60_000);
    },
    pickFile(done) {
      const input = document.createElement("input");
      input.type = "file";
      input.accept = ".json,application/json";
      input.hidden = true;
      input.addEventListener("change", () => {
        const file = input.files?.[0];
        input.remove();
        if (file) {
          file.text().then(done, () => done(null));
        }
      });
      document.body.append(input);
      input.click();
    },
  };
}
