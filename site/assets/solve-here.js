// The page's own copy of the solver, for the edits of a model quick to solve: loaded by boot.js
// once a reader has started editing and a calculator's worker has solved its model quickly. An
// edit solved here is answered within the keystroke's own task, without the two messages and the
// wait for the keystroke's frame that the worker's answer cannot skip (docs/performance.md).

import init, { solveForPage } from "./modebench_solver.js";

// A scenario's shape: its text with each quoted value that starts with a number written as that
// number's decade and what follows it ("2.8 kg" as "0 kg", "1480 rpm" as "3 rpm"); keys, rows,
// words and plain numbers (the counts: modes, elements) as they are. An edit is solved here only
// when the shape is the last solve's: no value moved by a factor of ten or more, and no unit,
// support or count changed, so that it cannot make a quick solve many times longer.
export const shape = (text) =>
  text.replace(/"((?:[^"\\]|\\.)*)"(\s*:)?/g, (quoted, inner, key) => {
    const number = !key && /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?)(.*)$/i.exec(inner);
    return number ? `"${Math.floor(Math.log10(Math.abs(number[1])))}${number[2]}"` : quoted;
  });

// Loads the engine (the worker's copy is in the browser's cache by then) and runs `link`'s last
// scenario, which the worker solved quickly, again and again, a solve per task, as the worker
// does (solve-worker.js): the browser compiles hot code again, optimised, and this has that done
// before the first edit solved here rather than during it. The first half solves without writing
// the results' markup, the second with it; a solve of WARM_UP_MS or more ends it early. Resolves
// to what boot.js asks: `take(link, request)`, true when it solved the request here.
export async function start(link, quick) {
  const warm = link.answered;
  await init();
  const [WARM_UPS, WARM_UP_MS, TOTAL_MS] = [120, 25, 500];
  let [done, total] = [0, 0];
  await new Promise((resolve) => {
    const step = () => {
      const begun = performance.now();
      solveForPage(warm.scenario, warm.mode, warm.open, done >= WARM_UPS / 2);
      const ms = performance.now() - begun;
      [done, total] = [done + 1, total + ms];
      if (ms < WARM_UP_MS && done < WARM_UPS && total < TOTAL_MS) setTimeout(step, 0);
      else resolve();
    };
    setTimeout(step, 0);
  });
  let working = true;
  return {
    take(link, request) {
      const form = shape(request.scenario);
      if (!working || !quick(link) || !link.last || form !== shape(link.last.scenario) || form === link.slowHere) {
        return false;
      }
      const { id, scenario, mode, open } = request;
      try {
        const begun = performance.now();
        const [answer, thinned, results, summary] = solveForPage(scenario, mode, open);
        const data = { id, answer, thinned, results, summary, mode, open, ms: performance.now() - begun };
        Object.assign(link, { last: request, answer: data, answered: request });
        // A shape the page solved slowly stays with the worker, which may solve it quickly (its
        // thread less busy, its copy more optimised): the two would otherwise take turns.
        link.slowHere = quick(link) ? null : form;
        // Handed over as the worker's message would be: after the keystroke's handler returns.
        queueMicrotask(() => link.onmessage?.(new MessageEvent("message", { data })));
        return true;
      } catch (error) {
        working = false;
        console.warn("Modebench: the page's own solver stopped; the worker solves from now on.", error);
        return false;
      }
    },
  };
}
