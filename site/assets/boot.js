// Brings the prerendered calculators on this page to life with the WebAssembly engine.
//
// The script is a deferred module, so it runs once the page is parsed; waiting for that
// explicitly keeps it correct should it ever be loaded `async`.
//
// The page's engine (`modebench_page`) edits, stores and draws. Each calculator solves in a Web
// Worker running `solve-worker.js` beside this script, which loads the solver engine
// (`modebench_solver`), so that no model, however slow, can freeze the page (but see
// `startSolver`).
// `globalThis.modebenchSolveBudgetMs`, when set before this script runs, replaces the time a
// solve may take before the worker is stopped (3000 ms); the browser tests use it. Once the
// calculators are live, `bench-panel.js` adds a tap-test panel under each.
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
  const [engine, io] = await Promise.all([import("./modebench_page.js"), import("./case-io.js")]);
  // The glue fetches and compiles the engine (the page has it preloaded), compiling from the
  // downloaded bytes when a host sends .wasm with a type other than application/wasm.
  await engine.default();
  await parsed;
  // A case opened from a link (its part after "#") is read before the calculators start, and
  // the link's case is taken off the address once a calculator holds it, so that a reload
  // shows the reader's edits rather than the link's case again.
  const incoming = await io.incomingCase(window.location);
  // Resolved against this script, so the site works under any sub-path of a host.
  engine.mountAll(new URL("solve-worker.js", import.meta.url).href, io.caseIo(incoming), startSolver);
  if (incoming) {
    history.replaceState(null, "", window.location.pathname + window.location.search);
  }
  // The tap-test panel under each calculator, closed: its script, and then its engine, load only
  // when a reader opens one, so a page that is only read fetches neither. A panel that cannot
  // start leaves the calculators as they are.
  for (const root of document.querySelectorAll(".mb-calc[data-modebench]")) {
    if (root.nextElementSibling?.classList.contains("mb-bench")) continue;
    const closed = document.createElement("details");
    closed.className = "mb-bench";
    const summary = document.createElement("summary");
    summary.textContent = "Tap test: measure this part's frequencies";
    closed.append(summary);
    root.after(closed);
    closed.addEventListener(
      "toggle",
      () => {
        import("./bench-panel.js")
          .then((bench) => bench.attachPanels())
          .catch((error) => console.warn("Modebench: the tap-test panel could not start.", error));
      },
      { once: true },
    );
  }
}

// Each calculator's worker as its engine sees it. Once a reader edits and a worker has solved a
// model in QUICK_MS, the page loads solve-here.js, which then solves the edits of a quick model
// that keep its shape. QUICK_MS keeps the page's first solves, run before the browser has
// optimised them (some ten times slower), under the 50 ms of a visible stall. `link.last`: the
// last scenario solved; `link.answer`: the last answer, with the solve's `ms`, wherever it ran;
// `link.answered`: its scenario.
const QUICK_MS = 4;
const quick = (link) => link.answer?.ms <= QUICK_MS;
const links = [];
let [here, editing] = [null, false];

function startSolver(url) {
  const worker = new Worker(url, { type: "module" });
  const link = { onmessage: null, onerror: null };
  link.terminate = () => (worker.terminate(), links.splice(links.indexOf(link), 1));
  worker.onmessage = (event) => {
    [link.answer, link.answered] = [event.data, link.last];
    loadHere();
    link.onmessage?.(event);
  };
  worker.onerror = (event) => link.onerror?.(event);
  link.postMessage = (request) => {
    // Solved here, the worker is only told that the reader is typing: its warm-up waits.
    const solved = here?.take?.(link, request);
    worker.postMessage(solved ? { edited: true } : request);
    if (!solved) link.last = request;
  };
  links.push(link);
  return link;
}

// Should the page's solver not load, every scenario goes on to the worker.
function loadHere() {
  const ready = links.find((link) => quick(link) && link.answer.answer?.startsWith('{"report"'));
  if (here === null && editing && ready) {
    here = {};
    import("./solve-here.js")
      .then((module) => module.start(ready, quick))
      .then((taker) => (here = taker))
      .catch((error) => console.warn("Modebench: the page's own solver did not load.", error));
  }
}

for (const kind of ["focusin", "input"]) {
  document.addEventListener(kind, () => ((editing = true), loadHere()), { once: true, capture: true });
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
