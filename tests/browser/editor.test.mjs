// The editor as an engineer at the bench uses it: a number typed without a unit takes the unit
// its field shows, an implausible value is warned about with both values named, the keyboard's
// focus after Add and Remove lands where the next key is safe, and axe-core finds no serious or
// critical accessibility problem on any page, an input error showing included.

import assert from "node:assert/strict";
import { after, before, describe, test } from "node:test";
import { TABLETS, TEST_TIMEOUT_MS, axeProblems, closeAll, launch, mode1, openLive, pages, settled, startSite } from "./support.mjs";

const FAN = "fan-floor-beam.html"; // a US-inch case: 16 ft I-beam, a 540 lb fan at 6.5 ft
const BOOM = "sensor-boom.html";

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

async function type(page, selector, text) {
  await page.locator(selector).fill(text);
  await page.waitForTimeout(50);
  await settled(page);
}

describe("units in the editor", () => {
  test("in US inch, a position typed without a unit reads as inches", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + FAN);
    const position = '[data-field="attachments[0].position"]';
    assert.equal(await page.locator(position).getAttribute("data-unit"), "in");
    const shown = page.locator(`.mb-field:has(${position}) .mb-unit`);
    assert.equal(await shown.textContent(), "in", "the field shows its unit");
    const written = await mode1(page);
    // 6.5 ft is 78 in. Read as metres, 78 would lie off the 16 ft beam and be refused.
    await type(page, position, "80");
    assert.notEqual(await mode1(page), written, "moving the fan changes the frequency");
    await type(page, position, "78");
    assert.equal(await page.locator(".mb-editor .mb-field-error").count(), 0, "no error");
    const same = await mode1(page);
    assert.ok(Math.abs(same - written) <= 1e-9 * written, `78 gives ${same} Hz, 6.5 ft gave ${written} Hz`);
    const conversions = await page.locator(".mb-conversions").textContent();
    assert.match(conversions, /Attachment 1, position: 78 in = 1\.98 m/);
    // What was stored says what was meant.
    const stored = await page.evaluate(() => Object.values(localStorage).join(" "));
    assert.match(stored, /"position":"78 in"/);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("a wall thinner than 0.1 mm is warned about, naming both values", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + FAN);
    await type(page, '[data-field="segments[0].section.flange_thickness"]', "0.002");
    const warning = page.locator('.mb-warning[data-code="implausible"]');
    await warning.first().waitFor({ state: "visible", timeout: 5000 });
    const text = await warning.first().textContent();
    assert.match(text, /^Segment 1, flange thickness: 0\.002 in is under 0\.003937 in/);
    assert.match(text, /beside an overall depth of 10 in/);
    assert.deepEqual(problems, []);
    await context.close();
  });
});

describe("at the bench", () => {
  for (const tablet of TABLETS) {
    test(`at ${tablet.width}×${tablet.height}, the modes stay in view while a field at the top of the editor changes`, { timeout: TEST_TIMEOUT_MS }, async () => {
      const viewport = { width: tablet.width, height: tablet.height };
      const { context, page, problems } = await openLive(browser, site.url + FAN, { contextOptions: { viewport, hasTouch: true } });
      await page.locator(".jump a").click();
      const depth = '[data-field="segments[0].section.depth"]';
      await page.locator(depth).scrollIntoViewIfNeeded();
      await type(page, depth, "12 in");
      const { inView, onTop } = await page.evaluate(() => {
        const summary = document.querySelector(".mb-summary");
        const box = summary.getBoundingClientRect();
        // Drawn over the editor groups it sticks across (each group paints apart, at level zero).
        const hit = document.elementFromPoint(box.left + box.width / 2, box.top + box.height / 2);
        return {
          inView: box.height > 0 && box.top >= 0 && box.bottom <= window.innerHeight,
          onTop: hit?.closest(".mb-summary") === summary,
        };
      });
      assert.ok(inView, "the summary of the modes is on screen");
      assert.ok(onTop, "the summary is drawn over the editor, not under it");
      // It shows what the table shows, for the input as it now stands.
      const table = (await page.locator('table.mb-modes tr[data-mode="1"] .mb-main').first().textContent()).trim();
      const line = await page.locator(".mb-summary").textContent();
      assert.ok(line.includes(`1: ${table}`), `"${line}" lacks mode 1 at ${table}`);
      assert.deepEqual(problems, []);
      await context.close();
    });
  }
});

describe("focus after adding and removing rows", () => {
  for (const list of ["attachments", "segments", "excitations"]) {
    test(`${list}: Add focuses the new row's first field; Remove the next row, then the Add button`, { timeout: TEST_TIMEOUT_MS }, async () => {
      const { context, page, problems } = await openLive(browser, site.url + FAN);
      const rows = () => page.locator(`[data-row^="${list}["]`).count();
      const before = await rows();
      const add = page.locator(`[data-action="add"][data-list="${list}"]`);
      await add.focus();
      await page.keyboard.press("Enter");
      await page.waitForFunction(([l, n]) => document.querySelectorAll(`[data-row^="${l}["]`).length === n, [list, before + 1]);
      const focused = () =>
        page.evaluate((l) => {
          const active = document.activeElement;
          const row = active?.closest(`[data-row^="${l}["]`);
          const first = row?.querySelector("input, select, textarea");
          return {
            row: row?.dataset.row ?? null,
            first: first === active,
            remove: active?.dataset.action === "remove",
            add: active?.dataset.action === "add" && active?.dataset.list === l,
          };
        }, list);
      assert.deepEqual(await focused(), { row: `${list}[${before}]`, first: true, remove: false, add: false });
      // A second Enter must not remove anything.
      const count = await rows();
      await page.keyboard.press("Enter");
      await page.waitForTimeout(200);
      assert.equal(await rows(), count, "Enter after Add removed nothing");
      // Remove the first row: the row that took its place has the focus.
      await page.locator(`[data-action="remove"][data-list="${list}"][data-index="0"]`).click();
      await page.waitForFunction(([l, n]) => document.querySelectorAll(`[data-row^="${l}["]`).length === n, [list, count - 1]);
      assert.deepEqual(await focused(), { row: `${list}[0]`, first: true, remove: false, add: false });
      // Remove the last row: the one before it; with none left, the Add button. (A beam keeps
      // at least one segment: its last has no Remove button.)
      const last = (await rows()) - 1;
      if (list === "segments" && last === 0) {
        assert.equal(await page.locator('[data-action="remove"][data-list="segments"]').count(), 0);
        await context.close();
        return;
      }
      await page.locator(`[data-action="remove"][data-list="${list}"][data-index="${last}"]`).click();
      await page.waitForFunction(([l, n]) => document.querySelectorAll(`[data-row^="${l}["]`).length === n, [list, last]);
      if (last > 0) {
        assert.deepEqual(await focused(), { row: `${list}[${last - 1}]`, first: true, remove: false, add: false });
      } else {
        assert.deepEqual(await focused(), { row: null, first: false, remove: false, add: true });
      }
      assert.deepEqual(problems, []);
      await context.close();
    });
  }
});

describe("accessibility (axe-core)", () => {
  for (const file of pages()) {
    for (const tablet of TABLETS) {
      test(`${file} at ${tablet.width}×${tablet.height}: no serious or critical problem`, { timeout: TEST_TIMEOUT_MS }, async () => {
        const viewport = { width: tablet.width, height: tablet.height };
        const calculators = /class="mb-calc"/.test(await (await fetch(site.url + file)).text());
        const { context, page } = await openLive(browser, site.url + file, {
          contextOptions: { bypassCSP: true, viewport, hasTouch: true },
          ready: calculators ? '.mb-calc[data-live="true"]' : "main",
        });
        assert.deepEqual(await axeProblems(page), []);
        await context.close();
      });
    }
  }

  test("with an input error showing, the error is tied to its field and nothing serious is found", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page } = await openLive(browser, site.url + BOOM, { contextOptions: { bypassCSP: true } });
    const mass = '[data-field="attachments[0].mass"]';
    await page.locator(mass).fill("-3 kg");
    const error = page.locator('.mb-field-error[data-for="attachments[0].mass"]');
    await error.waitFor({ state: "visible", timeout: 5000 });
    await page.waitForSelector(".mb-results.mb-stale");
    const id = await error.getAttribute("id");
    assert.ok(id, "the message has an id");
    assert.equal(await page.locator(mass).getAttribute("aria-describedby"), id);
    assert.equal(await page.locator(mass).getAttribute("aria-invalid"), "true");
    assert.deepEqual(await axeProblems(page), []);
    // A field emptied is asked for, tied the same way, and not marked wrong.
    await page.locator(mass).fill("");
    await page.locator('.mb-needed[data-for="attachments[0].mass"]').waitFor({ state: "visible", timeout: 5000 });
    assert.equal(await page.locator(mass).getAttribute("aria-invalid"), null);
    assert.ok(await page.locator(mass).getAttribute("aria-describedby"));
    assert.deepEqual(await axeProblems(page), []);
    await context.close();
  });
});
