// Brings the prerendered calculators on this page to life with the WebAssembly engine.
//
// The script is a deferred module, so it runs once the page is parsed; waiting for that
// explicitly keeps it correct should it ever be loaded `async`.
//
// The engine is imported dynamically so that a page whose engine cannot load (an old browser,
// a host that serves .wasm with the wrong type, a copy of the site without the engine) keeps
// its prerendered results exactly as they are: nothing is hidden before the engine has taken
// over, and a failure only leaves a note on the calculators for the curious.

const parsed =
  document.readyState === "loading"
    ? new Promise((resolve) => document.addEventListener("DOMContentLoaded", resolve, { once: true }))
    : Promise.resolve();

const engineUrl = new URL("./modebench_web_bg.wasm", import.meta.url);

// Compiles the engine while its glue is being imported, rather than after. Streaming
// compilation needs the host to send .wasm as application/wasm; from any other host the
// engine is compiled from the downloaded bytes instead.
function compileEngine() {
  return WebAssembly.compileStreaming(fetch(engineUrl)).catch(async () => {
    const response = await fetch(engineUrl);
    if (!response.ok) {
      throw new Error(`${engineUrl} answered ${response.status}`);
    }
    return WebAssembly.compile(await response.arrayBuffer());
  });
}

async function boot() {
  const compiled = compileEngine();
  // If the import below fails, it is that failure the page reports; a failed compilation
  // left unawaited must not also surface as an unhandled rejection.
  compiled.catch(() => {});
  const engine = await import("./modebench_web.js");
  await engine.default({ module_or_path: await compiled });
  await parsed;
  engine.mountAll();
}

try {
  await boot();
} catch (error) {
  await parsed;
  for (const calculator of document.querySelectorAll(".mb-calc")) {
    calculator.dataset.engine = "unavailable";
  }
  console.warn("Modebench: the live calculator could not start; the results shown were computed when the page was built.", error);
}
