// Solves the scenarios of one calculator, off the page's main thread. The page sends
// { id, scenario, mode, open } with the scenario as JSON text and the reader's view (the mode
// plotted; the `data-part` names of the sections left open, one space between them), and receives
// { id, answer, thinned, results, summary, mode, open, ms }: the answer as JSON text ({"report": …}
// or {"error": …}), the answer the page reads (a report's every mode's shape cut to the samples its
// plot needs; an error as it is), for a report that is not long the results and the one-line
// summary as the page draws them (undefined otherwise), the view they were drawn for, and how
// long the solve took here, ms (the page solves a model quick to solve itself, see boot.js, and
// then sends only { edited: true }, which is not answered: the warm-up below waits for a pause); or
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
// per solve, after a few hundred solves), on background threads that share the cores with the
// page and this worker: without the warm-up that compiling, a second and a half of it for a
// documented example on the two-core machine of docs/performance.md, fell on the reader's first
// hundred edits and slowed some of them. It solves the newest scenario that gave a report, so the
// search of the next edit starts from the same frequencies as without it. The first solve also
// compiles the engine, so the warm-up starts only after a first solve under FIRST_MS, and stops
// for good at a solve (its own, or an edit's) of WARM_UP_MS or more: a large model is not warmed
// up. It comes in two stretches:
// - While the reader types: the first WARM_UPS solves, WARM_UP_TOTAL_MS at most, go on between
//   the edits, so that a reader who types at once has most of the compiling behind them after
//   a few edits rather than a hundred: an edit waits at most for the one solve under way. They
//   solve without writing the results' markup (`solveForPage`'s last argument): the markup's
//   functions, run once per solve, would otherwise turn hot a few dozen edits later and be
//   compiled during them (the results' 24–34 ms and the frequency map's 21–22 ms on the machine
//   of docs/performance.md), while run as compiled quickly they cost an edit 0.3–0.4 ms, about
//   0.1 ms more than optimised.
// - While the reader reads: READING_WARM_UPS more, READING_TOTAL_MS at most, run only once no
//   request has come for QUIET_MS, back to back (a channel's message, not a timer, so that they are
//   over sooner), and pause at the next request until the reader pauses again. They solve and
//   write the markup, and so bring on the optimised compiling of the functions run once per solve
//   (the results' markup, the frequency map, the design study) while no edit is being typed.
const WARM_UPS = 120;
const WARM_UP_TOTAL_MS = 400;
const READING_WARM_UPS = 280;
const READING_TOTAL_MS = 1100;
const QUIET_MS = 500;
const FIRST_MS = 500;
const WARM_UP_MS = 25;
const typing = { solves: 0, ms: 0 };
const reading = { solves: 0, ms: 0 };
let answered = false;
// When the page's last request was answered.
let lastRequestMs = 0;
// The newest request that gave a report: [scenario, mode, open].
let newest = null;

const channel = new MessageChannel();
channel.port1.onmessage = warmUpStep;

// Each step schedules the next, so that one chain runs, started by the first answer: a timer for
// the first stretch's steps and for the wait for a pause, a channel's message for the second
// stretch's steps, back to back.
function warmUpStep() {
  if (newest === null) {
    return;
  }
  let stretch = null;
  if (typing.solves > 0 && typing.ms > 0) {
    stretch = typing;
  } else if (reading.solves > 0 && reading.ms > 0) {
    const quietMs = performance.now() - lastRequestMs;
    if (quietMs < QUIET_MS) {
      setTimeout(warmUpStep, QUIET_MS - quietMs);
      return;
    }
    stretch = reading;
  } else {
    return;
  }
  stretch.solves -= 1;
  const start = performance.now();
  solveForPage(...newest, stretch === reading);
  const ms = performance.now() - start;
  stretch.ms -= ms;
  if (ms >= WARM_UP_MS) {
    stopWarmUp();
  } else if (stretch === reading) {
    channel.port2.postMessage(null);
  } else {
    setTimeout(warmUpStep, 0);
  }
}

function stopWarmUp() {
  typing.solves = 0;
  reading.solves = 0;
}

self.addEventListener("message", async (event) => {
  if (event.data.edited) {
    // The page solved an edit itself (boot.js): the reader is typing, as after a request.
    lastRequestMs = performance.now();
    return;
  }
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
  const ms = performance.now() - start;
  self.postMessage({ id, answer, thinned, results, summary, mode, open, ms });
  lastRequestMs = performance.now();
  if (answer.startsWith('{"report"')) {
    if (ms < (first ? FIRST_MS : WARM_UP_MS)) {
      newest = [scenario, mode, open];
    } else {
      // A model too large to warm up on: the warm-up ends.
      stopWarmUp();
    }
  }
  if (first && newest !== null) {
    Object.assign(typing, { solves: WARM_UPS, ms: WARM_UP_TOTAL_MS });
    Object.assign(reading, { solves: READING_WARM_UPS, ms: READING_TOTAL_MS });
    setTimeout(warmUpStep, 0);
  }
});
