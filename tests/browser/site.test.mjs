// The built site as a reader on a tablet meets it: every page loads cleanly at both tablet
// sizes, asks nothing of any other host, fits the screen, and leaves a screenshot for review;
// on a wide screen, its calculators show their mode tables whole beside the editor.

import assert from "node:assert/strict";
import { cpSync, mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { after, before, describe, test } from "node:test";
import {
  BROKEN_NUMBER,
  BUDGET,
  DIST,
  ENGINES,
  SCREENSHOTS,
  TABLETS,
  TEST_TIMEOUT_MS,
  closeAll,
  isolatedContext,
  launch,
  pageWeight,
  pages,
  startSite,
  watchedPage,
} from "./support.mjs";

const POLICY =
  "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; img-src 'self'; " +
  "object-src 'none'; base-uri 'none'; form-action 'none'";

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
  mkdirSync(SCREENSHOTS, { recursive: true });
});

after(closeAll);

// Waits until the calculators on a page have gone live, if they will; pages keep their
// prerendered results when the engine is missing, so this never fails on its own.
async function settle(page) {
  const engine = await page.locator('script[src$="boot.js"]').count();
  if (engine > 0) {
    await page
      .waitForFunction(() => [...document.querySelectorAll(".mb-calc")].every((c) => c.dataset.live === "true"), null, {
        timeout: 3000,
      })
      .catch(() => {});
  }
}

// How far the page scrolls sideways, and each mode table of a calculator wider than its box.
function sideways(page) {
  return page.evaluate(() => ({
    overflow: document.documentElement.scrollWidth - window.innerWidth,
    clipped: [...document.querySelectorAll(".mb-table-wrap:has(> .mb-modes)")]
      .filter((wrap) => wrap.scrollWidth > wrap.clientWidth + 1)
      .map((wrap) => `${wrap.scrollWidth} px of table in ${wrap.clientWidth} px`),
  }));
}

describe("every page", () => {
  for (const file of pages()) {
    for (const tablet of TABLETS) {
      test(`${file} at ${tablet.width}×${tablet.height}: loads cleanly, stays local, fits, and is photographed`, { timeout: TEST_TIMEOUT_MS }, async () => {
        const { context, external } = await isolatedContext(browser, {
          viewport: { width: tablet.width, height: tablet.height },
          hasTouch: true,
        });
        const { page, problems } = await watchedPage(context);
        const response = await page.goto(site.url + file, { waitUntil: "load" });
        assert.equal(response.status(), 200);
        await settle(page);

        assert.deepEqual(problems, [], "console errors, exceptions or failed requests");
        assert.deepEqual(external, [], "requests that would leave 127.0.0.1");

        const { overflow, clipped } = await sideways(page);
        assert.ok(overflow <= 0, `the page scrolls sideways by ${overflow} px`);

        const small = await page.evaluate(() => {
          const targets = [
            ...document.querySelectorAll(".mb-calc input, .mb-calc button, .mb-calc select, .site-nav a"),
          ];
          return targets
            .filter((t) => t.getClientRects().length > 0 && getComputedStyle(t).visibility !== "hidden")
            .map((t) => ({ what: t.outerHTML.slice(0, 80), height: t.getBoundingClientRect().height }))
            .filter((t) => t.height < 44);
        });
        assert.deepEqual(small, [], "touch targets shorter than 44 px");

        // The mode table, separation margin included, is read without scrolling sideways.
        assert.deepEqual(clipped, [], "mode table wider than the calculator");

        const text = await page.evaluate(() => document.body.innerText);
        assert.doesNotMatch(text, BROKEN_NUMBER);

        await page.screenshot({
          path: join(SCREENSHOTS, `${file.replace(/\.html$/, "")}-${tablet.width}x${tablet.height}.png`),
          fullPage: true,
        });
        await context.close();
      });
    }
  }

  // A wide screen sets editor and results side by side; the calculator then spans more than the
  // prose, so that the results' column shows the mode table whole, as a tablet does.
  test("on wide screens every calculator's mode table shows every column beside the editor", { timeout: TEST_TIMEOUT_MS }, async () => {
    for (const viewport of [{ width: 1280, height: 800 }, { width: 1920, height: 1080 }]) {
      const { context } = await isolatedContext(browser, { viewport });
      const page = await context.newPage();
      for (const file of pages()) {
        await page.goto(site.url + file, { waitUntil: "load" });
        await settle(page);
        const where = `${file} at ${viewport.width}×${viewport.height}`;
        const { overflow, clipped } = await sideways(page);
        // Side by side: the results' column starts right of the editor's, on the same line.
        const beside = await page.evaluate(() =>
          [...document.querySelectorAll(".mb-calc")].every((calc) => {
            const [editor, results] = [calc.querySelector(".mb-editor"), calc.querySelector(".mb-results")];
            return !editor || !results || results.getBoundingClientRect().left >= editor.getBoundingClientRect().right;
          }),
        );
        assert.ok(overflow <= 0, `${where}: the page scrolls sideways by ${overflow} px`);
        assert.deepEqual(clipped, [], `${where}: mode table wider than its column`);
        assert.ok(beside, `${where}: editor and results are not side by side`);
      }
      await context.close();
    }
  });
});

describe("the site as files", () => {
  test("every page carries the content security policy, and serve sends it too", { timeout: TEST_TIMEOUT_MS }, async () => {
    for (const file of pages()) {
      const response = await fetch(site.url + file);
      assert.equal(response.headers.get("content-security-policy"), POLICY, file);
      const html = await response.text();
      assert.ok(html.includes(`<meta http-equiv="Content-Security-Policy" content="${POLICY}">`), file);
    }
  });

  test("every URL in every page is relative and reaches a file", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context } = await isolatedContext(browser);
    const page = await context.newPage();
    for (const file of pages()) {
      await page.goto(site.url + file);
      const urls = await page.evaluate(() =>
        [...document.querySelectorAll("[href], [src]")].map((e) => e.getAttribute("href") ?? e.getAttribute("src")),
      );
      for (const url of urls) {
        assert.doesNotMatch(url, /^(\/|[a-z]+:)/i, `${file}: ${url} is not relative`);
        if (!url.startsWith("#")) {
          const target = new URL(url, site.url + file);
          assert.equal((await fetch(target)).status, 200, `${file}: ${url}`);
        }
      }
    }
    await context.close();
  });

  test("each engine fits its size budget", () => {
    // After wasm-opt; `cargo xtask bench` prints the figures with the rest.
    for (const { name, file, budget } of ENGINES) {
      const bytes = statSync(join(DIST, "assets", file)).size;
      assert.ok(bytes <= budget, `the ${name} is ${bytes} bytes, over its budget of ${budget} (was it shrunk by wasm-opt?)`);
    }
  });

  test("a calculator page with everything it fetches to go live fits its gzipped budget", { timeout: TEST_TIMEOUT_MS }, async () => {
    // Each file gzipped alone, as a static host sends it; the worker's script and engine, fetched
    // once the page is live, are not counted. `cargo xtask bench` prints the same figures.
    for (const file of ["sensor-boom.html", "fan-floor-beam.html"]) {
      const { own } = await pageWeight(browser, site.url + file);
      assert.ok(own.parts.some((part) => part.startsWith("assets/modebench_page_bg.wasm ")), `${file} went live: ${own.parts.join(", ")}`);
      assert.ok(
        own.gzipped <= BUDGET.pageGzipBytes,
        `${file} weighs ${own.gzipped} bytes gzipped, over its budget of ${BUDGET.pageGzipBytes}: ${own.parts.join(", ")}`,
      );
    }
  });

  test("the engines and the worker are served with the types browsers insist on", { timeout: TEST_TIMEOUT_MS }, async () => {
    const types = {
      "assets/boot.js": /^text\/javascript/,
      "assets/solve-worker.js": /^text\/javascript/,
      "assets/site.css": /^text\/css/,
    };
    for (const [path, type] of Object.entries(types)) {
      const response = await fetch(site.url + path);
      assert.equal(response.status, 200, path);
      assert.match(response.headers.get("content-type"), type, path);
    }
    for (const { file } of ENGINES) {
      const wasm = await fetch(site.url + "assets/" + file);
      if (wasm.status === 200) {
        assert.equal(wasm.headers.get("content-type"), "application/wasm", file);
        const glue = await fetch(site.url + "assets/" + file.replace(/_bg\.wasm$/, ".js"));
        assert.match(glue.headers.get("content-type"), /^text\/javascript/, file);
      }
    }
  });

  test("a host that sends the engine with a generic type still gets a live calculator", { timeout: TEST_TIMEOUT_MS }, async () => {
    // Streaming compilation insists on application/wasm; plenty of file hosts send
    // application/octet-stream instead, and the page must then compile from the bytes.
    const context = await browser.newContext();
    await context.route("**/*.wasm", async (route) => {
      const response = await route.fetch();
      await route.fulfill({ response, headers: { ...response.headers(), "content-type": "application/octet-stream" } });
    });
    const { page, problems } = await watchedPage(context);
    await page.goto(site.url + "sensor-boom.html");
    await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 });
    assert.equal(await page.locator(".mb-calc[data-engine]").count(), 0, "the engine started");
    // The worker's solver engine arrives with the same type, and an edit is still solved.
    const mode1 = 'tr[data-mode="1"] td[data-hz]';
    const before = await page.locator(mode1).first().getAttribute("data-hz");
    await page.locator('[data-field="attachments[0].mass"]').fill("4.2 kg");
    await page.waitForFunction(([s, old]) => document.querySelector(s)?.dataset.hz !== old, [mode1, before]);
    assert.deepEqual(problems, []);
    // The offline worker may still be fetching the engines for its cache through the route;
    // closing the context under it must not fail the file after its tests have passed.
    await context.unrouteAll({ behavior: "ignoreErrors" });
    await context.close();
  });

  test("the site works unchanged under a sub-path of another host", { timeout: TEST_TIMEOUT_MS }, async () => {
    // A host that keeps the site in a folder of its own, as internal docs servers do.
    const host = mkdtempSync(join(tmpdir(), "modebench-host-"));
    mkdirSync(join(host, "docs"));
    writeFileSync(join(host, "index.html"), "<p>Internal documents</p>");
    // A copy, not a link: the server refuses links that lead out of the folder it serves.
    cpSync(DIST, join(host, "docs", "modebench"), { recursive: true });
    const elsewhere = await startSite(host);
    try {
      const { context, external } = await isolatedContext(browser);
      for (const file of pages()) {
        const { page, problems } = await watchedPage(context);
        await page.goto(`${elsewhere.url}docs/modebench/${file}`);
        await settle(page);
        assert.deepEqual(problems, [], file);
        await page.close();
      }
      assert.deepEqual(external, []);
      await context.close();
    } finally {
      elsewhere.stop();
      rmSync(host, { recursive: true, force: true });
    }
  });

  test("printed, a calculator page is a calculation sheet: title, calculator, cautions, no navigation", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context } = await isolatedContext(browser);
    const page = await context.newPage();
    for (const file of pages()) {
      await page.goto(site.url + file);
      await page.emulateMedia({ media: "print" });
      const shown = await page.evaluate(() => {
        const visible = (selector) =>
          [...document.querySelectorAll(selector)].some((e) => e.getClientRects().length > 0);
        return {
          calculator: document.querySelector(".mb-calc") !== null,
          title: visible("h1"),
          sheet: visible(".sheet-head"),
          calculatorShown: visible(".mb-calc"),
          // The page's own cautions, or (on the embed page, which has no text of its own) the
          // calculator's.
          caution: visible('blockquote[class^="markdown-alert-"], .mb-caution'),
          navigation: visible(".site-head, .site-nav, .site-foot"),
          buttons: visible("button"),
        };
      });
      assert.ok(shown.title && !shown.navigation && !shown.buttons, `${file}: ${JSON.stringify(shown)}`);
      if (shown.calculator) {
        assert.ok(shown.sheet && shown.calculatorShown && shown.caution, `${file}: ${JSON.stringify(shown)}`);
      }
      await page.emulateMedia({ media: "screen" });
    }
    await context.close();
  });

  test("the server never leaves the folder it serves", { timeout: TEST_TIMEOUT_MS }, async () => {
    for (const path of ["%2e%2e/Cargo.toml", "assets/%2e%2e/%2e%2e/Cargo.toml"]) {
      assert.notEqual((await fetch(site.url + path)).status, 200, path);
    }
  });
});
