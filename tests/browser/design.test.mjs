// The design work on the page: the frequency map and what moves each mode are drawn from the
// worker's report; a calibration's fit and a resizing's proposal are applied in one step that
// the worker re-solves and "Undo" takes back; a speed range typed in the editor is judged with
// its sign. Nothing here solves on the page's thread: every answer comes from the worker.

import assert from "node:assert/strict";
import { after, before, describe, test } from "node:test";
import { BROKEN_NUMBER, TEST_TIMEOUT_MS, closeAll, launch, openLive, startSite } from "./support.mjs";

const ROOT = "calibrating-a-bolted-root.html";
const FLOOR = "floor-beam-variable-speed-fan.html";
const MODE = (n) => `table.mb-modes tr[data-mode="${n}"] td[data-hz]`;

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

async function hz(page, n) {
  return Number(await page.locator(MODE(n)).first().getAttribute("data-hz"));
}

// Waits until mode `n` has been recomputed away from `old`.
async function changed(page, n, old) {
  await page.waitForFunction(
    ([selector, value]) => {
      const cell = document.querySelector(selector);
      return cell && Number(cell.dataset.hz) !== value && !document.querySelector(".mb-calc").hasAttribute("data-solving");
    },
    [MODE(n), old],
    { timeout: 10_000 },
  );
}

async function assertNoBrokenNumbers(page) {
  const text = await page.evaluate(() => document.querySelector(".mb-calc").innerText);
  assert.doesNotMatch(text, BROKEN_NUMBER);
}

describe("design work on the page", () => {
  test("a calibration is applied in one step, reproduces the measurements, and is undone", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + ROOT);
    assert.equal(await page.locator("svg.mb-map").count(), 1, "the frequency map is drawn");
    assert.equal(await page.locator("svg.mb-map .mb-map-measured").count(), 2, "both measurements are on it");
    assert.ok((await page.locator(".mb-moves-table tr[data-moves-mode]").count()) >= 3, "what moves each mode");
    const before = await hz(page, 1);
    await page.locator('[data-action="apply-fit"]').click();
    await changed(page, 1, before);
    // The measurements, 10.47 Hz and 98.6 Hz, to the six figures the fit is written with.
    assert.ok(Math.abs((await hz(page, 1)) / 10.47 - 1) < 1e-5, `mode 1 at ${await hz(page, 1)} Hz`);
    assert.ok(Math.abs((await hz(page, 2)) / 98.6 - 1) < 1e-5, `mode 2 at ${await hz(page, 2)} Hz`);
    const rotational = await page.locator('[data-field="left.rotational"]').inputValue();
    assert.match(rotational, /N·mm\/rad$/, "written in the case's units");
    // The bar under the head names the step; the case bar's own Undo takes it back as well.
    const undo = page.locator('button.mb-undo[data-action="undo"]');
    assert.match(await undo.textContent(), /Undo: use the fitted values/);
    assert.equal(await page.locator('.mb-cases [data-action="undo"]').isDisabled(), false);
    const fitted = await hz(page, 1);
    await undo.click();
    await changed(page, 1, fitted);
    assert.ok(Math.abs((await hz(page, 1)) - before) <= 1e-9 * before, "undo restores the case");
    assert.equal(await page.locator('[data-field="left.rotational"]').inputValue(), "60000 N*m/rad");
    await assertNoBrokenNumbers(page);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("a resizing proposal is applied and every nominal margin then holds", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + FLOOR);
    assert.equal(await page.locator("svg.mb-sweep").count(), 1, "the sweep is plotted");
    assert.ok((await page.locator("svg.mb-sweep .mb-sweep-forbidden").count()) >= 2, "forbidden bands shaded");
    const before = await hz(page, 1);
    await page.locator('[data-action="apply-resize"]').click();
    await changed(page, 1, before);
    const depth = await page.locator('[data-field="segments[0].section.depth"]').inputValue();
    assert.match(depth, /^11\.0\d* in$/, `the proposed depth, ${depth}`);
    const separations = await page.$$eval("td.mb-separation", (cells) => cells.map((c) => Number(c.dataset.separation)));
    assert.ok(separations.every((s) => Math.abs(s) >= 0.15), `nominal separations ${separations}`);
    await assertNoBrokenNumbers(page);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("a speed range typed in the editor is judged from its nearer end, with its sign", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + FLOOR);
    const before = await page.locator('table.mb-modes tr[data-mode="1"] td.mb-separation').getAttribute("data-separation");
    // 600–900 rpm is 10–15 Hz; mode 1 lies just above it. Up to 1200 rpm (20 Hz) puts it inside.
    await page.locator('[data-field="excitations[0].up_to"]').fill("1200 rpm");
    await page.waitForFunction(
      (old) => {
        const cell = document.querySelector('table.mb-modes tr[data-mode="1"] td.mb-separation');
        return cell && cell.dataset.separation !== old && !document.querySelector(".mb-calc").hasAttribute("data-solving");
      },
      before,
      { timeout: 10_000 },
    );
    const cell = page.locator('table.mb-modes tr[data-mode="1"] td.mb-separation');
    assert.equal(Number(await cell.getAttribute("data-separation")), 0);
    assert.match(await cell.textContent(), /inside/);
    // Down to 600–750 rpm (10–12.5 Hz): the mode lies 24 % above, with a plus sign.
    await page.locator('[data-field="excitations[0].up_to"]').fill("750 rpm");
    await page.waitForFunction(
      () => {
        const cell = document.querySelector('table.mb-modes tr[data-mode="1"] td.mb-separation');
        return cell && Number(cell.dataset.separation) > 0 && !document.querySelector(".mb-calc").hasAttribute("data-solving");
      },
      null,
      { timeout: 10_000 },
    );
    assert.match(await cell.textContent(), /^\+/);
    await assertNoBrokenNumbers(page);
    assert.deepEqual(problems, []);
    await context.close();
  });
});
