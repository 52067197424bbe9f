// WebAssembly ÷ native, the WebAssembly side: the solver engine built with the `timing` feature
// (`cargo xtask ratio` builds it as the site's solver engine is built, into build/timing/, and
// runs this script after the native benchmarks) loaded in headless Chromium, its two budget
// workloads (`benchExact`: the exact method's 10 modes of the budget beam; `benchElements`: 200
// finite elements, 10 modes, the same beam) each timed in batches with `performance.now()`.
// Prints the median and the fastest batch per solve; never fails on a figure.
//
//   MODEBENCH_TIMING_ENGINE=build/timing node tests/browser/ratio.mjs
//
// The engine's files are handed to the page by request interception, so no server is needed and
// nothing leaves the browser. It runs on the page's main thread: the same V8 and the same
// compiled module as the calculator's worker, without the worker's messages around each solve.

import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { ROOT, closeAll, launch } from "./support.mjs";

const ENGINE = resolve(process.env.MODEBENCH_TIMING_ENGINE ?? join(ROOT, "build", "timing"));
const BATCHES = Number(process.env.MODEBENCH_BATCHES ?? 15);
const ORIGIN = "http://timing.invalid";
const TYPES = { ".html": "text/html", ".js": "text/javascript", ".wasm": "application/wasm" };

const browser = await launch();
try {
  const context = await browser.newContext();
  await context.route("**/*", async (route) => {
    const url = new URL(route.request().url());
    if (url.origin !== ORIGIN) {
      return route.abort();
    }
    if (url.pathname === "/") {
      return route.fulfill({ contentType: TYPES[".html"], body: "<!doctype html><title>timing</title>" });
    }
    const name = url.pathname.slice(1);
    if (!/^modebench_solver(_bg\.wasm|\.js)$/.test(name)) {
      return route.fulfill({ status: 404, body: "" });
    }
    return route.fulfill({ contentType: TYPES[name.slice(name.lastIndexOf("."))], body: readFileSync(join(ENGINE, name)) });
  });
  const page = await context.newPage();
  page.on("console", (message) => console.log(`page: ${message.text()}`));
  await page.goto(`${ORIGIN}/`);
  const figures = await page.evaluate(async (batches) => {
    const engine = await import("/modebench_solver.js");
    await engine.default();
    const results = [];
    for (const [name, run, batch] of [
      ["exact, 10 modes, budget beam", engine.benchExact, 200],
      ["finite elements, 200 elements, 10 modes, budget beam", engine.benchElements, 40],
    ]) {
      // The first batch lets V8 compile the module's hot functions at its top tier.
      const found = run(batch);
      const each = [];
      for (let i = 0; i < batches; i++) {
        const start = performance.now();
        run(batch);
        each.push(((performance.now() - start) * 1000) / batch);
      }
      each.sort((a, b) => a - b);
      results.push({ name, found, batch, median: each[Math.floor(each.length / 2)], fastest: each[0] });
    }
    return results;
  }, BATCHES);
  console.log(`Chromium ${browser.version()}, engine ${ENGINE}`);
  for (const { name, found, batch, median, fastest } of figures) {
    const note = found === 10 ? "" : `  (found ${found} frequencies, not 10: the figure is not the workload's)`;
    console.log(
      `${name}: ${median.toFixed(1)} µs per solve (fastest batch ${fastest.toFixed(1)} µs), median of ${BATCHES} batches of ${batch}${note}`,
    );
  }
} finally {
  await closeAll();
}
