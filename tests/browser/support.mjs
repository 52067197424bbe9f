// Shared set-up of the browser tests: the built site served on 127.0.0.1, headless Chromium,
// watchers for console errors and for any request that would leave this machine, and the opening
// of a live calculator that most tests start from.
//
// Every site server and browser started here is remembered, so that `closeAll` (each test file's
// `after` hook) ends them even when a test failed half-way, and a server still running when the
// process exits is killed: no test file can keep CI waiting on a child it left behind.

import { spawn } from "node:child_process";
import { readFileSync, readdirSync } from "node:fs";
import { gzipSync } from "node:zlib";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { chromium } from "playwright-core";
import { waitInPage } from "./waits.mjs";

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..");
export const DIST = resolve(process.env.MODEBENCH_DIST ?? join(ROOT, "dist"));
export const SCREENSHOTS = join(ROOT, "build", "screenshots");

// What the site is held to, kilobytes being 1000 bytes. `budgets.mjs` prints every figure against
// these; the engines' sizes, which do not drift with the machine, are also a test. The page's
// engine is what a calculator waits for before it is live; the solver's is fetched by the
// calculator's worker once the page is live, and is built for speed (its numerical core at
// opt-level 3, wasm-opt -O3) since every edit waits on it: its budget rose from 300 to 420 KB
// (docs/performance.md says why and what the page's engine gave back). Both were raised again on
// 2026-12-02 (320 → 410 KB and 420 → 610 KB) when the design study, axial force, the units in the
// editor and the reader's cases came in together over them; docs/performance.md records it as a
// debt to be won back, not as the new normal. On 2026-12-03 part of it was (page 404 → 382 KB,
// solver 601 → 572 KB) and the budgets were lowered to those sizes with a few KB to spare; the
// sensitivities through the mode shapes and the tolerances typed with a value then brought the
// solver back to 602 KB the same day, and its budget to 606 KB. Later that day the checks
// that keep close stations, taut and buckled beams and hostile input from giving wrong answers
// or unreadable messages added 11.5 KB (612.4 KB), and the budget became 616 KB: a debt again,
// recorded in docs/performance.md with where the solver's size goes. On 2026-12-03 it was paid
// (615.6 → 603.9 KB: errors, field paths and the scenario reader no longer copied into every
// place that calls them) and the budget returned to 606 KB. The whole calculator page gzipped,
// printed by `budgets.mjs`, became a test too (`site.test.mjs`) the same day, when it stood at
// 201.8 KB; the page's engine then gave back 9 KB, 2.8 KB of it gzipped. Later on 2026-12-03
// the budget rose to 608 KB for speed bought knowingly: the station sweep's transfer matrices
// computed in line (2.6 KB, 10 % fewer instructions per exact solve in WebAssembly) and the
// design study's readings made cheaper (the unit texts read once, one copy of the scenario:
// 2.5 KB, a quarter fewer instructions per edit's solve); docs/performance.md has the figures.
// That night it rose to 614 KB for the same kind of trade: the design study's trials written into
// the scenario as read instead of its JSON, and their models read without the echo (6.2 KB, a
// third fewer instructions per edit's solve, from 606,945 to 613,103 B), and with functions of one
// caller inlined only while small (`xtask/src/engine.rs`: 357 B at 1000 size units, 773 B at
// 300) it stood at 613,867 B. On 2026-12-04 it rose to 716 KB, and the page's engine by 2.9 KB
// (1.0 KB gzipped), for an edit's answer drawn sooner: the worker now also writes the results
// and the one-line summary as the page draws them (`worker::message::solve_for_page`), with the
// drawing code built for speed there (98.8 KB in all, 712,654 B), while the page draws the
// keystroke's frame, and the page draws that markup without reading the answer first. The
// page's part of an edit's answer fell from 3.9 to 2.4 ms (camera boom) and 3.2 to 1.8 ms (fan
// beam); docs/performance.md has the A/B. The solver loads after the page is live, so its
// size delays no first view. On 2026-12-05 the page's engine guard rose from 390 to 391 KB for
// three fixes found by using the calculator as a reader does (1.5 KB in all, 390,437 B): a value
// refused after one typed too fast to be solved now greys that one's results, solved again; the
// size a resizing puts is rounded into its range; new cases are numbered apart. The solver's
// rose the same night from 716 to 717 KB (716,007 B) for the same fixes' words and two clearer
// messages (a unit's example its field accepts; a range that takes the model off its beam).
// Later that day 3.5 KB came back: the engines are bound without wasm-bindgen's `name` and
// `producers` sections, which no browser reads (`xtask/src/engine.rs`); the page's engine, with
// a case opened with an input error now saying where the error is and the quotes of a field's
// message paired (about 0.9 KB together) and three clearer unit messages, stood at 388,539 B, and
// its guard came down to 389 KB. That afternoon it rose again to 390 KB (389,138 B): the page
// may start each calculator's worker through a function of its own, which solves a model quick
// to solve on the page itself (`boot.js`), 0.6 KB.
//
// The tap test's engine (`modebench_bench`) is fetched only when a reader opens a calculator's
// tap-test panel, by the panel's worker; built for size it weighed 525 KB on 2026-12-03, and its
// budget leaves room for the panel to grow a little, not for another library.
export const BUDGET = {
  pageEngineBytes: 390_000,
  solverEngineBytes: 717_000,
  benchEngineBytes: 560_000,
  pageGzipBytes: 200_000,
  coldLoadMs: 300,
  editMs: 16,
};

// The worker starts each solve from the previous answer, so a frequency reached along another
// path of edits (or read back from a file and solved afresh) agrees with the first to
// round-off, not always to the last bit; the engine promises 1e-12 relative, and two results
// that close are the same answer.
// The middle value (the mean of the two middle ones for an even count).
export function median(values) {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

export const SAME = 1e-12;
export const same = (a, b) => Math.abs(a - b) <= SAME * Math.abs(b);
export const allSame = (a, b) => a.length === b.length && a.every((x, i) => same(x, b[i]));

// Each browser test's own time limit (`test(name, { timeout: TEST_TIMEOUT_MS }, …)`), so that a
// test waiting on a page that never answers fails and the next runs. Node 20 has no default for
// every test of a file: its `--test-timeout`, which CI also sets, limits each file as a whole.
// Generous: the slowest test (the offline rebuild, which builds the site again) took about 20 s
// on a two-core machine loaded by other builds.
export const TEST_TIMEOUT_MS = 180_000;

// A cold load is timed in a fresh browser context (nothing cached) opened this long before the
// page is asked for. Opening a context, and closing the previous one, keeps the browser busy for
// a few hundred milliseconds on a small machine; a reader's browser is open and idle when they
// follow a link. Without the pause the medians here came out 17–68 ms slower (same build A/B,
// 15–21 loads each).
export const SETTLE_MS = 500;

// The engines' files, in `assets/`: the page's own, the one its workers solve with, and the one
// the tap-test panel's worker analyses recordings with.
export const ENGINES = [
  { name: "page engine", file: "modebench_page_bg.wasm", budget: BUDGET.pageEngineBytes },
  { name: "solver engine", file: "modebench_solver_bg.wasm", budget: BUDGET.solverEngineBytes },
  { name: "tap-test engine", file: "modebench_bench_bg.wasm", budget: BUDGET.benchEngineBytes },
];

// The two tablet sizes the site is laid out for.
export const TABLETS = [
  { name: "portrait", width: 768, height: 1024 },
  { name: "landscape", width: 1024, height: 768 },
];

// Every page of the built site, by file name.
export function pages() {
  return readdirSync(DIST)
    .filter((name) => name.endsWith(".html"))
    .sort();
}

// Serves the built site. `cargo xtask test` starts one server and passes its address in
// MODEBENCH_URL; run alone, each test file starts its own on a free port. A `dir` other than
// the built site always gets a server of its own.
export async function startSite(dir = DIST) {
  if (process.env.MODEBENCH_URL && dir === DIST) {
    return { url: process.env.MODEBENCH_URL.replace(/\/?$/, "/"), stop() {} };
  }
  const args = ["serve", "--dir", dir, "--port", "0"];
  const command = process.env.MODEBENCH_SITE_BIN
    ? [process.env.MODEBENCH_SITE_BIN, args]
    : ["cargo", ["run", "-q", "-p", "modebench-site", "--", ...args]];
  const server = spawn(command[0], command[1], { cwd: ROOT, stdio: ["ignore", "pipe", "inherit"] });
  servers.add(server);
  server.on("exit", () => servers.delete(server));
  const url = await new Promise((found, failed) => {
    let seen = "";
    const timer = setTimeout(() => failed(new Error(`the site server did not start: ${seen}`)), 120_000);
    server.stdout.on("data", (chunk) => {
      seen += chunk;
      const match = seen.match(/http:\/\/127\.0\.0\.1:\d+\//);
      if (match) {
        clearTimeout(timer);
        found(match[0]);
      }
    });
    server.on("exit", (code) => failed(new Error(`the site server stopped (exit ${code}): ${seen}`)));
  });
  // Neither the server nor its output keeps this process alive; the exit hook below ends it.
  server.unref();
  server.stdout.unref();
  return { url, stop: () => server.kill() };
}

// Every file a page fetches, gzipped one by one as a static host would send them: those it
// needs to go live, and those its calculators' workers fetch once it is live (their script and
// the solver engine), counted apart. `budgets.mjs` prints the figures; `site.test.mjs` holds the
// first to its budget.
export const WORKER_FILES = /(^|\/)(solve-worker\.js|modebench_solver[^/]*)$/;

export async function pageWeight(browser, url) {
  const { context } = await isolatedContext(browser);
  const page = await context.newPage();
  const files = new Set();
  // What the service worker fetches to keep the whole site for offline use runs in the
  // background once the page is live, and is no part of what the page waits for.
  context.on("response", (response) => {
    if (response.status() === 200 && !response.request().serviceWorker()) {
      files.add(new URL(response.url()).pathname);
    }
  });
  await page.goto(url);
  await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 }).catch(() => {});
  await page.waitForSelector('.mb-calc[data-live="true"]:not([data-solving])', { timeout: 10_000 }).catch(() => {});
  await context.close();
  const weigh = () => ({ raw: 0, gzipped: 0, files: 0, parts: [] });
  const [own, worker] = [weigh(), weigh()];
  const prefix = new URL(url).pathname.replace(/[^/]*$/, "");
  for (const path of files) {
    const relative = decodeURIComponent(path.slice(prefix.length)) || "index.html";
    const bytes = readFileSync(join(DIST, relative));
    const size = gzipSync(bytes).length;
    const part = WORKER_FILES.test(relative) ? worker : own;
    part.raw += bytes.length;
    part.gzipped += size;
    part.files += 1;
    part.parts.push(`${relative} ${(size / 1000).toFixed(1)}`);
  }
  return { own, worker };
}

// What this process started and has not ended yet.
const servers = new Set();
const browsers = new Set();

process.once("exit", () => {
  for (const server of servers) {
    server.kill();
  }
});

// Ends every browser and site server this process started: each test file's `after` hook, which
// runs whether its tests passed or not. A browser that does not close within ten seconds is
// left to the exit hook's end of the process.
export async function closeAll() {
  const closing = [...browsers].map((browser) =>
    Promise.race([browser.close().catch(() => {}), new Promise((done) => setTimeout(done, 10_000).unref())]),
  );
  browsers.clear();
  for (const server of servers) {
    server.kill();
  }
  await Promise.all(closing);
}

// Headless Chromium; `extra` adds switches (the tap-test panel's tests give it a fake microphone),
// and so does MODEBENCH_CHROMIUM_FLAGS, space-separated, for profiling (DEVELOPERS.md).
export async function launch(extra = []) {
  const flags = (process.env.MODEBENCH_CHROMIUM_FLAGS ?? "").split(" ").filter(Boolean);
  const browser = await launchChromium([...extra, ...flags]);
  browsers.add(browser);
  browser.on("disconnected", () => browsers.delete(browser));
  return browser;
}

function launchChromium(extra) {
  return chromium.launch({
    executablePath: process.env.CHROMIUM ?? "/usr/bin/chromium",
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      ...extra,
    ],
  });
}

// A browser context that lets requests reach 127.0.0.1 only, and remembers the others.
export async function isolatedContext(browser, options = {}) {
  const context = await browser.newContext(options);
  const external = [];
  await context.route("**/*", (route) => {
    const url = new URL(route.request().url());
    if (url.hostname === "127.0.0.1") {
      return route.continue();
    }
    external.push(url.href);
    return route.abort();
  });
  return { context, external };
}

// A page whose console errors, uncaught exceptions and failed requests are collected.
export async function watchedPage(context) {
  const page = await context.newPage();
  const problems = [];
  page.on("console", (message) => {
    if (message.type() === "error") {
      problems.push(`console: ${message.text()}`);
    }
  });
  page.on("pageerror", (error) => problems.push(`exception: ${error.message}`));
  page.on("requestfailed", (request) => problems.push(`request failed: ${request.url()}`));
  page.on("response", (response) => {
    if (response.status() >= 400) {
      problems.push(`HTTP ${response.status()}: ${response.url()}`);
    }
  });
  return { page, problems };
}

// Waits until no calculator on the page has a scenario with its worker (the root carries
// `data-solving` until the answer is drawn).
export async function settled(page, timeout = 10_000) {
  await page.waitForFunction(() => ![...document.querySelectorAll(".mb-calc")].some((c) => c.hasAttribute("data-solving")), null, {
    timeout,
  });
}

// Opens `url` in a new page and waits until its calculator is live and, unless `settle` is
// false, until its worker has answered. The page opens in `context` when given, else in a new
// isolated context made with `contextOptions`. Returns the context, the page and the problems
// `watchedPage` collects.
export async function openLive(browser, url, { context, contextOptions = {}, ready = '.mb-calc[data-live="true"]', settle = true } = {}) {
  const own = context ? null : await isolatedContext(browser, contextOptions);
  const used = context ?? own.context;
  const { page, problems } = await watchedPage(used);
  await page.goto(url);
  await page.waitForSelector(ready, { timeout: 10_000 });
  if (settle) {
    await settled(page);
  }
  return { context: used, page, problems, external: own?.external ?? [] };
}

// What the built site's service worker keeps: its version and its files, read from `sw.js`.
export function offlineSite(dist = DIST) {
  const worker = readFileSync(join(dist, "sw.js"), "utf8");
  const version = worker.match(/const VERSION = "([0-9a-f]+)";/)[1];
  const files = JSON.parse(worker.match(/const FILES = (\[.*\]);/)[1]);
  return { version, files };
}

// Waits until the site's service worker controls `target` (a page or frame), has settled (no
// worker installing or waiting), and its cache is the only one and holds every file of the
// version built in `dist`; returns the URLs kept, relative to the worker's folder.
export async function untilKept(target, dist = DIST) {
  const { version, files } = offlineSite(dist);
  return waitInPage(
    target,
    async ({ version, count }) => {
      const registration = await navigator.serviceWorker.getRegistration();
      const settled = registration?.active?.state === "activated" && !registration.installing && !registration.waiting;
      const names = await caches.keys();
      if (!navigator.serviceWorker.controller || !settled || names.length !== 1 || !names[0].endsWith(` ${version}`)) {
        return null;
      }
      const root = new URL("./", registration.active.scriptURL).href;
      const kept = (await (await caches.open(names[0])).keys()).map((r) => r.url.slice(root.length));
      return kept.length >= count ? kept.sort() : null;
    },
    { version, count: files.length },
    { what: `the service worker keeping the ${files.length} files of version ${version}` },
  );
}

// The first natural frequency in a calculator's mode table, and its value in hertz as the page
// holds it (the cell's `data-hz`, in full, not as rounded for show).
export const MODE_1 = 'table.mb-modes tr[data-mode="1"] td[data-hz]';

export async function mode1(page) {
  return Number(await page.locator(MODE_1).first().getAttribute("data-hz"));
}

// Words that mean a number went wrong somewhere between the engine and the page.
export const BROKEN_NUMBER = /\b(NaN|undefined|Infinity)\b/;

// Accessibility: axe-core's serious and critical findings on the page as it stands, one line
// each (rule, impact, the first elements concerned). The page's context must bypass the
// Content-Security-Policy (`bypassCSP: true`), since axe is added as a script of the test's own.
export const AXE_SCRIPT = join(ROOT, "tests", "browser", "node_modules", "axe-core", "axe.min.js");

export async function axeProblems(page) {
  if (!(await page.evaluate(() => typeof window.axe === "object"))) {
    await page.addScriptTag({ path: AXE_SCRIPT });
  }
  const violations = await page.evaluate(async () => {
    const result = await window.axe.run(document, { resultTypes: ["violations"] });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      targets: v.nodes.slice(0, 3).map((n) => n.target.join(" ")),
    }));
  });
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.targets.join("; ")}`);
}
