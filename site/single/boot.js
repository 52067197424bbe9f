// Starts the calculator of the single-file build, which works opened from disk (file://) as well
// as from any address. Both engines are in this one file: the page's own as base64 in the data
// block #mb-page-engine, the solver's with the worker's code in #mb-solver-code, from which a
// Blob becomes the calculator's Web Worker. The page's main thread still never solves.
//
// The builder puts this script after the page engine's glue (wasm-bindgen's `no-modules` output,
// which defines `wasm_bindgen`) and after `io`, the functions of `case-io.js`; the page's policy
// admits the whole script by its hash.

function engineBytes(id) {
  const binary = atob(document.getElementById(id).textContent.trim());
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i += 1) {
    bytes[i] = binary.charCodeAt(i);
  }
  return bytes;
}

// A page opened from disk has an opaque origin, and Chromium will not start a module worker from
// a blob: address there (nor from a file). The solver's code in #mb-solver-code is a classic
// script, so the workers the calculator asks for start as classic ones: the engine's glue above
// looks `Worker` up each time it creates one, and this page runs no other script.
const BrowserWorker = globalThis.Worker;
globalThis.Worker = class extends BrowserWorker {
  constructor(url, options = {}) {
    super(url, { ...options, type: "classic" });
  }
};

async function boot() {
  await wasm_bindgen({ module_or_path: engineBytes("mb-page-engine") });
  // One Blob for every worker the calculator starts (it starts a fresh one after a solve that
  // ran too long); the policy admits workers from blob: addresses only.
  const code = document.getElementById("mb-solver-code").textContent;
  const worker = URL.createObjectURL(new Blob([code], { type: "text/javascript" }));
  const incoming = await io.incomingCase(window.location);
  wasm_bindgen.mountAll(worker, io.caseIo(incoming));
  if (incoming) {
    try {
      history.replaceState(null, "", window.location.pathname + window.location.search);
    } catch {
      // Some browsers refuse to change a file:// address; the link's case is then shown again
      // on a reload, which loses nothing.
    }
  }
}

try {
  await boot();
} catch (error) {
  for (const calculator of document.querySelectorAll(".mb-calc")) {
    calculator.dataset.engine = "unavailable";
  }
  console.warn("Modebench: the live calculator could not start; the results shown were computed when the file was built.", error);
}
