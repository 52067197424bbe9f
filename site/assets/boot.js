// Brings the prerendered calculators on this page to life with the WebAssembly engine.
//
// The engine is imported dynamically so that a page whose engine cannot load (an old browser,
// a host that serves .wasm with the wrong type, a copy of the site without the engine) keeps
// its prerendered results exactly as they are: nothing is hidden before the engine has taken
// over, and a failure only leaves a note on the calculators for the curious.

const calculators = document.querySelectorAll(".mb-calc");

async function boot() {
  const engine = await import("./modebench_web.js");
  await engine.default();
  engine.mountAll();
}

if (calculators.length > 0) {
  try {
    await boot();
  } catch (error) {
    for (const calculator of calculators) {
      calculator.dataset.engine = "unavailable";
    }
    console.warn("Modebench: the live calculator could not start; the results shown were computed when the page was built.", error);
  }
}
