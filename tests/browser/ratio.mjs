// WebAssembly ÷ native, measured in pairs: the solver engine built with the `timing` feature
// (`cargo xtask ratio` builds it as the site's solver engine is built, into build/timing/) loaded
// in headless Chromium, and the native ratio bench (`tests/benches/ratio.rs --serve`) started
// beside it; batches of the same workload alternate between the two, so that the two sides of
// each ratio are timed within a second of each other. A shared virtual machine changes speed over
// minutes: timing the sides minutes apart paired a fast native moment with a slow browser one.
//
// The workloads: `exact` (the exact method's 10 modes of the budget beam; the engine's
// `benchExact`) and `elements` (200 finite elements, 10 modes, the same beam; `benchElements`).
// For each: warm-up batches on both sides first (V8 compiles a module's functions at its
// baseline tier and tiers the hot ones up while they run; a few seconds of solving is far more
// than it needs), then PAIRS rounds, each one batch of every side back to back, the order turned
// by one place each round (with one engine: native first, then the browser first) so that no
// side always runs just after another. Printed: the median of the rounds' ratios (the figure
// docs/performance.md records) with their spread, and each side's median and fastest batch per
// solve. Never fails on a figure.
//
// The page's clock: Chromium coarsens `performance.now()` (100 µs steps on a page that is not
// cross-origin isolated, 5 µs on one that is). The page here is served cross-origin isolated
// from a secure origin, so its steps are fine; the step is measured and printed, and the batch
// sizes keep every batch at 20 ms or more on both sides (a batch under that is flagged).
//
//   MODEBENCH_TIMING_ENGINE=build/timing node tests/browser/ratio.mjs
//
// MODEBENCH_TIMING_ENGINE_B=DIR adds a second engine (another build of the same timing engine)
// on a page of its own: each round then times native, engine A and engine B, the order turned
// by one place each round, and B ÷ A is printed from the same rounds, an A/B of two builds in
// one run.
//
// MODEBENCH_PAIRS (rounds; default 21), MODEBENCH_WARMUP (warm-up batches per side, default 8),
// MODEBENCH_ONLY=exact or =elements for one workload, MODEBENCH_NATIVE for the command that
// starts the native side (default: `cargo bench -q -p modebench-tests --bench ratio -- --serve`
// from the repository's root; `cargo xtask ratio` builds it first).
//
// The engine's files are handed to the page by request interception, so no server is needed and
// nothing leaves the browser. It runs on the page's main thread: the same V8 and the same
// compiled module as the calculator's worker, without the worker's messages around each solve.

import { spawn } from "node:child_process";
import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { createInterface } from "node:readline";
import { ROOT, closeAll, launch, median } from "./support.mjs";

const ENGINE = resolve(process.env.MODEBENCH_TIMING_ENGINE ?? join(ROOT, "build", "timing"));
const PAIRS = Number(process.env.MODEBENCH_PAIRS ?? 21);
const WARMUP = Number(process.env.MODEBENCH_WARMUP ?? 8);
const ONLY = process.env.MODEBENCH_ONLY ?? "";
const AGAINST = process.env.MODEBENCH_TIMING_ENGINE_B ? resolve(process.env.MODEBENCH_TIMING_ENGINE_B) : "";
const NATIVE = process.env.MODEBENCH_NATIVE ?? "cargo bench -q -p modebench-tests --bench ratio -- --serve";
// Pages on a secure origin (localhost is one) so that they can be cross-origin isolated;
// requests to it are answered by interception, so nothing need listen on the port.
const PORT = 8131;
const TYPES = { ".html": "text/html", ".js": "text/javascript", ".wasm": "application/wasm" };
const ISOLATED = { "Cross-Origin-Opener-Policy": "same-origin", "Cross-Origin-Embedder-Policy": "require-corp" };
// Shortest batch, in milliseconds, either side may take: 200 steps of the clock of a page that
// is not isolated, 4,000 of this one's, and long enough that one slice of the scheduler does not
// decide it.
const SHORTEST_MS = 20;

// Solves per batch: at the figures of 2026-12-03 (exact 66–90 µs natively, 80–145 µs in
// Chromium; FE 480–690 µs and 520–780 µs) every batch lasts 26 ms or more on both sides, with
// room for the native side to get faster (300 exact solves once took 20.1 ms).
const WORKLOADS = [
  { key: "exact", name: "exact, 10 modes, budget beam", runs: 400, bench: "benchExact" },
  { key: "elements", name: "finite elements, 200 elements, 10 modes, budget beam", runs: 60, bench: "benchElements" },
];

// The native side: one process for the whole run, asked for one batch at a time.
function startNative() {
  const child = spawn(NATIVE, { cwd: ROOT, shell: true, stdio: ["pipe", "pipe", "inherit"] });
  const lines = createInterface({ input: child.stdout });
  const waiting = [];
  lines.on("line", (line) => waiting.shift()?.resolve(line));
  child.on("exit", (code) => {
    for (const w of waiting.splice(0)) {
      w.reject(new Error(`the native side (${NATIVE}) ended with ${code}`));
    }
  });
  return {
    // The batch's time in microseconds and the frequencies found.
    async batch(key, runs) {
      const answer = new Promise((resolve, reject) => waiting.push({ resolve, reject }));
      child.stdin.write(`${key} ${runs}\n`);
      const line = await answer;
      const [k, n, micros, found] = line.split(" ");
      if (k !== key || Number(n) !== runs || !Number.isFinite(Number(micros))) {
        throw new Error(`the native side answered ${JSON.stringify(line)} to "${key} ${runs}"`);
      }
      return { micros: Number(micros), found: Number(found) };
    },
    end() {
      child.stdin.end("quit\n");
    },
  };
}

// A page with the engine in `dir` loaded and kept between batches, on a cross-origin isolated
// page of its own origin; the page clock's step is the smallest nonzero difference between
// successive readings.
async function openEngine(browser, dir, index) {
  const origin = `http://localhost:${PORT + index}`;
  const context = await browser.newContext();
  await context.route("**/*", async (route) => {
    const url = new URL(route.request().url());
    if (url.origin !== origin) {
      return route.abort();
    }
    if (url.pathname === "/") {
      return route.fulfill({
        contentType: TYPES[".html"],
        headers: ISOLATED,
        body: "<!doctype html><title>timing</title>",
      });
    }
    const name = url.pathname.slice(1);
    if (!/^modebench_solver(_bg\.wasm|\.js)$/.test(name)) {
      return route.fulfill({ status: 404, body: "" });
    }
    return route.fulfill({
      contentType: TYPES[name.slice(name.lastIndexOf("."))],
      headers: ISOLATED,
      body: readFileSync(join(dir, name)),
    });
  });
  const page = await context.newPage();
  page.on("console", (message) => console.log(`page: ${message.text()}`));
  await page.goto(`${origin}/`);
  const clock = await page.evaluate(async () => {
    const engine = await import("/modebench_solver.js");
    await engine.default();
    globalThis.timingEngine = engine;
    let step = Infinity;
    for (let changes = 0; changes < 200; changes++) {
      const a = performance.now();
      let b = performance.now();
      while (b === a) {
        b = performance.now();
      }
      step = Math.min(step, b - a);
    }
    return { step: step * 1000, isolated: globalThis.crossOriginIsolated };
  });
  return {
    clock,
    // The batch's time in microseconds and the frequencies found.
    batch: (bench, runs) =>
      page.evaluate(
        ([bench, runs]) => {
          const start = performance.now();
          const found = globalThis.timingEngine[bench](runs);
          return { micros: (performance.now() - start) * 1000, found };
        },
        [bench, runs],
      ),
  };
}

const native = startNative();
const browser = await launch();
try {
  // One page per engine, each on its own origin's port.
  const engines = [];
  for (const [i, dir] of [ENGINE, ...(AGAINST ? [AGAINST] : [])].entries()) {
    engines.push({ label: i === 0 ? "Chromium" : "Chromium, engine B", dir, ...(await openEngine(browser, dir, i)) });
  }
  console.log(`Chromium ${browser.version()}, engine ${ENGINE}${AGAINST ? `, engine B ${AGAINST}` : ""}`);
  console.log(
    `page clock: steps of ${engines[0].clock.step.toFixed(1)} µs, cross-origin isolated: ${engines[0].clock.isolated}; ` +
      `native side: ${NATIVE}`,
  );
  const sides = [{ label: "native", batch: (w) => native.batch(w.key, w.runs) }].concat(
    engines.map((e) => ({ label: e.label, batch: (w) => e.batch(w.bench, w.runs) })),
  );
  for (const workload of WORKLOADS) {
    const { key, name, runs } = workload;
    if (ONLY && ONLY !== key) {
      continue;
    }
    for (let i = 0; i < WARMUP; i++) {
      for (const side of sides) {
        await side.batch(workload);
      }
    }
    // Each round times every side once, the order turned by one place each round.
    const rounds = [];
    for (let i = 0; i < PAIRS; i++) {
      const round = new Array(sides.length);
      for (let j = 0; j < sides.length; j++) {
        const k = (i + j) % sides.length;
        round[k] = await sides[k].batch(workload);
      }
      rounds.push(round);
    }
    console.log(`${name}, ${PAIRS} rounds of batches of ${runs} solves (after ${WARMUP} warm-up batches each side):`);
    const perSolve = (k) => rounds.map((r) => r[k].micros / runs);
    const summary = (k) => ({ median: median(perSolve(k)), fastest: Math.min(...perSolve(k)) });
    const paired = (k, against, words) => {
      const ratios = rounds.map((r) => r[k].micros / r[against].micros).sort((a, b) => a - b);
      const [x, y] = [summary(k), summary(against)];
      console.log(
        `  ${words}, median of the pairs' ratios: ${median(ratios).toFixed(2)} ` +
          `(pairs from ${ratios[0].toFixed(2)} to ${ratios[ratios.length - 1].toFixed(2)}; ` +
          `middle half ${ratios[Math.floor(ratios.length / 4)].toFixed(2)}–` +
          `${ratios[Math.floor((3 * ratios.length) / 4)].toFixed(2)}); ` +
          `÷ by medians ${(x.median / y.median).toFixed(2)}, by fastest batches ${(x.fastest / y.fastest).toFixed(2)}`,
      );
    };
    for (let k = 1; k < sides.length; k++) {
      paired(k, 0, `${sides[k].label} ÷ native`);
    }
    if (sides.length === 3) {
      paired(2, 1, "engine B ÷ engine A");
    }
    console.log(
      "  " +
        sides
          .map((side, k) => {
            const { median, fastest } = summary(k);
            return `${side.label} ${median.toFixed(1)} µs per solve (fastest batch ${fastest.toFixed(1)})`;
          })
          .join(", "),
    );
    const found = sides.map((side, k) => [side.label, Math.min(...rounds.map((r) => r[k].found))]);
    for (const [label, least] of found.filter(([, least]) => least !== 10)) {
      console.log(`  note: ${label} found ${least} frequencies in some batch, not 10: the figure is not the workload's`);
    }
    const short = rounds.filter((r) => r.some((b) => b.micros < SHORTEST_MS * 1000)).length;
    if (short) {
      console.log(`  note: ${short} rounds had a batch under ${SHORTEST_MS} ms`);
    }
  }
} finally {
  native.end();
  await closeAll();
}
