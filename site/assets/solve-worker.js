// Solves the scenarios of one calculator, off the page's main thread. The page sends
// { id, scenario } with the scenario as JSON text and receives { id, answer, view } with the
// answer as JSON text ({"report": …} or {"error": …}) and the answer the page draws (a report's
// every mode's shape cut to the samples its plot needs; an error as it is), or { id, failed }
// when the solver engine could not load. A solve that takes too long is not interrupted here: the page stops this worker and
// starts a fresh one.
//
// A module worker from the site's own folder, so the pages' policy (scripts from 'self' only,
// WebAssembly compilation allowed, nothing inline) admits it and the files it imports.

import init, { solveForPage } from "./modebench_solver.js";

const ready = init();

self.addEventListener("message", async (event) => {
  const { id, scenario } = event.data;
  try {
    await ready;
  } catch (error) {
    self.postMessage({ id, failed: String(error) });
    return;
  }
  const [answer, view] = solveForPage(scenario);
  self.postMessage({ id, answer, view });
});
