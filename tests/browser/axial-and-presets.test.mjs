// Axial force and the presets on the worked pages, as a reader uses them: the hot line's
// temperature rise moves its frequencies and its critical load factor, a rise past buckling and a
// theory that cannot carry the force are refused on the field that was typed, and the pipe and
// contents presets of the discharge line record what the tables gave.

import assert from "node:assert/strict";
import { after, before, describe, test } from "node:test";
import { BROKEN_NUMBER, TABLETS, TEST_TIMEOUT_MS, closeAll, launch, mode1, openLive, settled, startSite } from "./support.mjs";

const HOT = "hot-line-between-anchors.html"; // 6 in sch 40 steel, 11 m, clamped–clamped, 45 °C rise
const PUMP = "pump-discharge-valve.html"; // 4 in sch 40 steel, water, US units
const RISE = '[data-field="segments[0].temperature_change"]';

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

async function choose(page, selector, value) {
  await page.locator(selector).selectOption(value);
  await page.waitForTimeout(50);
  await settled(page);
}

// The critical load factor of the hot line at a rise of ΔT kelvin: Euler's load of a
// clamped–clamped column, 4π²EI/L² (K = 0.5; Timoshenko & Gere, Theory of Elastic Stability,
// ch. 2 — from memory), over the force −E·A·α·ΔT of a member whose ends are held, with the
// steel preset's α = 12e-6 /K; E cancels. Pipe 6 in schedule 40: OD 6.625 in, wall 0.280 in
// (ASME B36.10M, from memory).
function hotLineFactor(rise) {
  const od = 6.625 * 0.0254;
  const id = od - 2 * 0.28 * 0.0254;
  const second = (Math.PI / 64) * (od ** 4 - id ** 4);
  const area = (Math.PI / 4) * (od ** 2 - id ** 2);
  return (4 * Math.PI ** 2 * second) / (11 ** 2 * area * 12e-6 * rise);
}

async function shownFactor(page) {
  const text = await page.locator(".mb-buckling").first().textContent();
  const match = text.match(/critical load factor ([0-9.]+)/);
  assert.ok(match, text);
  return Number(match[1]);
}

describe("the hot line between anchors", () => {
  for (const tablet of TABLETS) {
    test(`at ${tablet.width}×${tablet.height}, the rise moves the frequencies and the buckling check, and a rise past buckling is refused on its field`, { timeout: TEST_TIMEOUT_MS }, async () => {
      const viewport = { width: tablet.width, height: tablet.height };
      const { context, page, problems } = await openLive(browser, site.url + HOT, { contextOptions: { viewport, hasTouch: true } });
      // Shown to four figures.
      const factor = await shownFactor(page);
      assert.ok(Math.abs(factor - hotLineFactor(45)) <= 5e-4 * factor, `${factor} vs ${hotLineFactor(45)}`);
      assert.equal(await page.locator('.mb-warning[data-code="near-buckling"]').count(), 1, "past half the buckling load");
      const hot = await mode1(page);

      // Cold: no force, the frequency rises and the buckling check goes.
      await type(page, RISE, "0");
      const cold = await mode1(page);
      assert.ok(cold > hot, `cold ${cold} Hz, hot ${hot} Hz`);
      assert.equal(await page.locator(".mb-buckling").count(), 0);
      assert.equal(await page.locator('.mb-warning[data-code="near-buckling"]').count(), 0);

      // Hotter: lower again, and the factor falls as 1/ΔT.
      await type(page, RISE, "70 °C");
      const hotter = await mode1(page);
      assert.ok(hotter < hot, `70 °C gives ${hotter} Hz, 45 °C gave ${hot} Hz`);
      const factor70 = await shownFactor(page);
      assert.ok(Math.abs(factor70 - hotLineFactor(70)) <= 5e-4 * factor70, `${factor70} vs ${hotLineFactor(70)}`);

      // Past buckling (about 88 °C): refused beside the rise, which stays in view, and the last
      // results are kept greyed.
      await type(page, RISE, "95 °C");
      const error = page.locator(`.mb-field-error[data-for="segments[0].temperature_change"]`);
      await error.waitFor({ state: "visible", timeout: 5000 });
      assert.match(await error.textContent(), /buckled under these loads/);
      // Beside the field: no more than a line or two below it.
      const field = await page.locator(RISE).boundingBox();
      const box = await error.boundingBox();
      const gap = box.y - (field.y + field.height);
      assert.ok(gap >= 0 && gap < 40, `the message starts ${gap} px below the field`);
      assert.equal(await page.locator(RISE).getAttribute("aria-invalid"), "true");
      await page.waitForSelector(".mb-results.mb-stale");
      assert.doesNotMatch(await page.evaluate(() => document.body.innerText), BROKEN_NUMBER);

      // What was typed is kept for the next visit.
      const stored = await page.evaluate(() => Object.values(localStorage).join(" "));
      assert.match(stored, /"temperature_change":"95 °C"/);
      assert.deepEqual(problems, []);
      await context.close();
    });
  }

  test("the Timoshenko theory with the thermal force is refused on the rise, saying what to choose instead", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + HOT);
    await choose(page, '[data-field="theory"]', "timoshenko");
    const error = page.locator(`.mb-field-error[data-for="segments[0].temperature_change"]`);
    await error.waitFor({ state: "visible", timeout: 5000 });
    assert.match(await error.textContent(), /slender-beam theory only.*choose the Euler–Bernoulli theory/s);
    assert.equal(await page.locator('.mb-field-error[data-for="segments[0].axial_force"]').count(), 0);
    assert.deepEqual(problems, []);
    await context.close();
  });
});

describe("the discharge line's presets", () => {
  test("a pipe size and schedule chosen record the table's diameter and wall; contents record their density", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + PUMP);
    const section = "segments[0].section";
    const before = await mode1(page);
    // ASME B36.10M (from memory): 6 in is OD 6.625 in; schedule 40 wall 0.280 in, 80 0.432 in.
    await choose(page, `[data-field="${section}.nominal_size"]`, "6");
    assert.equal(await page.locator(`[data-field="${section}.outer_diameter"]`).inputValue(), "6.625 in");
    assert.equal(await page.locator(`[data-field="${section}.wall"]`).inputValue(), "0.28 in");
    const six = await mode1(page);
    assert.notEqual(six, before, "the larger pipe changes the frequency");
    await choose(page, `[data-field="${section}.schedule"]`, "80");
    assert.equal(await page.locator(`[data-field="${section}.wall"]`).inputValue(), "0.432 in");
    // The schedules offered are those the table defines for the size: 3-1/2 in has no 160 or XXS.
    await choose(page, `[data-field="${section}.nominal_size"]`, "3-1/2");
    const offered = await page.locator(`[data-field="${section}.schedule"] option`).evaluateAll((os) => os.map((o) => o.value));
    assert.deepEqual(offered, ["10", "40", "80", "STD", "XS"]);

    // Seawater, 1025 kg/m³ (the common offshore design value, from memory), recorded beside it.
    const extra = "segments[0].extra_mass";
    await choose(page, `[data-field="${extra}.contents"]`, "seawater");
    assert.equal(await page.locator(`[data-field="${extra}.contents_density"]`).inputValue(), "1025 kg/m^3");
    const stored = await page.evaluate(() => Object.values(localStorage).join(" "));
    assert.match(stored, /"contents":"seawater"/);
    assert.match(stored, /"contents_density":"1025 kg\/m\^3"/);
    assert.match(stored, /"nominal_size":"3-1\/2"/);
    assert.doesNotMatch(await page.evaluate(() => document.body.innerText), BROKEN_NUMBER);
    assert.deepEqual(problems, []);
    await context.close();
  });
});
