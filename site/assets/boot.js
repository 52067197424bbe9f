// Brings the prerendered calculators on this page to life with the WebAssembly engine.
//
// The script is a deferred module, so it runs once the page is parsed; waiting for that
// explicitly keeps it correct should it ever be loaded `async`.
//
// The engine is imported dynamically so that a page whose engine cannot load (an old browser,
// a host that will not serve it, a copy of the site without the engine) keeps
// its prerendered results exactly as they are. Marking the calculators unavailable shows their
// bodies at once (the style sheet otherwise holds them back for up to half a second while the
// engine starts); the console note is for the curious.

const parsed =
  document.readyState === "loading"
    ? new Promise((resolve) => document.addEventListener("DOMContentLoaded", resolve, { once: true }))
    : Promise.resolve();

async function boot() {
  const engine = await import("./modebench_web.js");
  // The glue fetches and compiles the engine (the page has it preloaded), compiling from the
  // downloaded bytes when a host sends .wasm with a type other than application/wasm.
  await engine.default();
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
