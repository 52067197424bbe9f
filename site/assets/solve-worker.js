// Solves the scenarios of one calculator, off the page's main thread. The page sends
// { id, scenario, mode, open } with the scenario as JSON text and the reader's view (the mode
// plotted; the `data-part` names of the sections left open, one space between them), and receives
// { id, answer, thinned, results, summary, mode, open }: the answer as JSON text ({"report": …} or
// {"error": …}), the answer the page reads (a report's every mode's shape cut to the samples its
// plot needs; an error as it is), for a report that is not long the results and the one-line
// summary as the page draws them (undefined otherwise), and the view they were drawn for; or
// { id, failed } when the solver engine could not load. A solve that takes too long is not
// interrupted here: the page stops this worker and starts a fresh one.
//
// A module worker from the site's own folder, so the pages' policy (scripts from 'self' only,
// WebAssembly compilation allowed, nothing inline) admits it and the files it imports.

import init, { solveForPage } from "./modebench_solver.js";

const ready = init();

// After its first answer, the worker solves the newest scenario that gave a report again and
// again, one solve per task, between the page's requests. The browser runs new code as compiled
// quickly and compiles a function again, optimised, once it has run enough (a function run once
// per solve, after a hundred solves or so), on background threads that share the cores with the
// page and this worker: without the warm-up that compiling, a second and a half of it for a
// documented example on the two-core machine of docs/performance.md, fell on the reader's first
// hundred edits and slowed some of them. The warm-up goes on while the reader types, so that a
// reader who types at once has it behind them after a few edits rather than a hundred: an edit
// waits at most for the one solve under way. It solves the newest scenario that gave a report,
// so the search of the next edit starts from the same frequencies as without it. The first
// solve also compiles the engine, so the warm-up starts only after a first solve under FIRST_MS
// and goes on only while each solve (its own, and each edit's) takes under WARM_UP_MS, for at
// most WARM_UPS solves and WARM_UP_TOTAL_MS in all: a large model is not warmed up.
const WARM_UPS = 120;
const FIRST_MS = 500;
const WARM_UP_MS = 25;
const WARM_UP_TOTAL_MS = 400;
let warmUps = 0;
let warmUpLeftMs = 0;
let answered = false;
// The newest request that gave a report: [scenario, mode, open].
let newest = null;

function warmUp() {
  setTimeout(() => {
    if (warmUps <= 0 || warmUpLeftMs <= 0 || newest === null) {
      return;
    }
    warmUps -= 1;
    const start = performance.now();
    solveForPage(...newest);
    const ms = performance.now() - start;
    warmUpLeftMs -= ms;
    if (ms < WARM_UP_MS) {
      warmUp();
    } else {
      warmUps = 0;
    }
  }, 0);
}

self.addEventListener("message", async (event) => {
  const { id, scenario } = event.data;
  const mode = event.data.mode ?? 0;
  const open = event.data.open ?? "";
  const first = !answered;
  answered = true;
  try {
    await ready;
  } catch (error) {
    self.postMessage({ id, failed: String(error) });
    return;
  }
  const start = performance.now();
  const [answer, thinned, results, summary] = solveForPage(scenario, mode, open);
  self.postMessage({ id, answer, thinned, results, summary, mode, open });
  const ms = performance.now() - start;
  if (answer.startsWith('{"report"')) {
    if (ms < (first ? FIRST_MS : WARM_UP_MS)) {
      newest = [scenario, mode, open];
    } else {
      // A model too large to warm up on: the warm-up ends.
      warmUps = 0;
    }
  }
  if (first && newest !== null) {
    warmUps = WARM_UPS;
    warmUpLeftMs = WARM_UP_TOTAL_MS;
    warmUp();
  }
});
