// The calculator's Web Worker in the single-file build, a classic script (see boot.js): the
// solver engine's glue (wasm-bindgen's
// `no-modules` output, defining `wasm_bindgen`) comes before this, and SOLVER_BASE64, the
// solver engine in base64, before that. It answers as `assets/solve-worker.js` does on the site:
// { id, scenario, mode, open } in, { id, answer, thinned, results, summary, mode, open } or
// { id, failed } out.

const ready = (async () => {
  const binary = atob(SOLVER_BASE64);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i += 1) {
    bytes[i] = binary.charCodeAt(i);
  }
  await wasm_bindgen({ module_or_path: bytes });
})();

self.addEventListener("message", async (event) => {
  const { id, scenario } = event.data;
  const mode = event.data.mode ?? 0;
  const open = event.data.open ?? "";
  try {
    await ready;
  } catch (error) {
    self.postMessage({ id, failed: String(error) });
    return;
  }
  const [answer, thinned, results, summary] = wasm_bindgen.solveForPage(scenario, mode, open);
  self.postMessage({ id, answer, thinned, results, summary, mode, open });
});
