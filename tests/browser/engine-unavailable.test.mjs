// A calculator whose engine cannot start says so: it shows the page's worked example and a note
// that the live calculator could not start, not the promise that it will soon become editable.

import assert from "node:assert/strict";
import { after, before, describe, test } from "node:test";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { DIST, MODE_1, TEST_TIMEOUT_MS, closeAll, isolatedContext, launch, openLive, startSite } from "./support.mjs";

const BOOM = "sensor-boom.html";

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

// Which of the two notes in the calculator's head can be seen.
async function notes(page) {
  const calculator = page.locator(".mb-calc").first();
  return {
    loading: await calculator.locator(".mb-static-note").isVisible(),
    unavailable: await calculator.locator(".mb-unavailable-note").isVisible(),
  };
}

describe("a calculator without its engine", () => {
  for (const [what, pattern] of [
    ["the engine's WebAssembly", "**/*.wasm"],
    ["the engine's script", "**/modebench_page.js"],
  ]) {
    test(`when ${what} fails to load, it says the live calculator could not start`, { timeout: TEST_TIMEOUT_MS }, async () => {
      const { context } = await isolatedContext(browser);
      await context.route(pattern, (route) => route.abort());
      const page = await context.newPage();
      await page.goto(site.url + BOOM);
      await page.waitForSelector('.mb-calc[data-engine="unavailable"]', { timeout: 10_000 });
      assert.deepEqual(await notes(page), { loading: false, unavailable: true });
      const note = await page.locator(".mb-calc .mb-unavailable-note").first().innerText();
      assert.match(note, /could not start/);
      assert.match(note, /worked example, computed when the page was built/);
      // The worked example is still there to read.
      await page.locator(MODE_1).first().scrollIntoViewIfNeeded();
      assert.ok(await page.locator(MODE_1).first().isVisible(), "the prerendered results show");
      assert.ok(Number(await page.locator(MODE_1).first().getAttribute("data-hz")) > 0);
      await context.close();
    });
  }

  test("while the page's script has not run, it says the calculator becomes editable once it has", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context } = await isolatedContext(browser);
    // The script never arrives: the state of a page still loading it.
    await context.route("**/assets/boot.js", (route) => route.abort());
    const page = await context.newPage();
    await page.goto(site.url + BOOM);
    assert.deepEqual(await notes(page), { loading: true, unavailable: false });
    assert.match(await page.locator(".mb-calc .mb-static-note").first().innerText(), /becomes editable/);
    await context.close();
  });

  for (const file of [BOOM, "embed.html"]) {
    test(`${file} opened from disk says at once that it cannot be edited, not that it soon will be`, { timeout: TEST_TIMEOUT_MS }, async () => {
      // Browsers refuse a page's module scripts from file://; its classic script says so. A plain
      // context: an isolated one's routing refuses file:// addresses.
      const context = await browser.newContext();
      const page = await context.newPage();
      await page.goto(pathToFileURL(join(DIST, file)).href);
      await page.waitForSelector('.mb-calc[data-engine="unavailable"]', { timeout: 5000 });
      assert.deepEqual(await notes(page), { loading: false, unavailable: true });
      assert.ok(Number(await page.locator(MODE_1).first().getAttribute("data-hz")) > 0, "the worked example shows");
      await context.close();
    });
  }

  test("once live, neither note shows", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page } = await openLive(browser, site.url + BOOM, { settle: false });
    assert.deepEqual(await notes(page), { loading: false, unavailable: false });
    await context.close();
  });
});
