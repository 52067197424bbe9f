// The live calculator against its DOM contract: the engine takes over the prerendered markup
// without changing a number, edits move the results the way physics says they must, bad input
// is named beside its field, and nothing typed is lost on reload.

import assert from "node:assert/strict";
import { after, before, describe, test } from "node:test";
import {
  BROKEN_NUMBER,
  MODE_1,
  TABLETS,
  TEST_TIMEOUT_MS,
  closeAll,
  isolatedContext,
  launch,
  mode1,
  openLive,
  pages,
  same,
  startSite,
} from "./support.mjs";
import { drawn, within } from "./waits.mjs";

const BOOM = "sensor-boom.html";
const TIP_MASS = '[data-field="attachments[0].mass"]';

// Native and WebAssembly builds use different implementations of sin, cosh and friends, so the
// last bits of a frequency may differ; one part in 10⁹ is far below any digit shown.
const SAME = 1e-9;

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

// Types into a field and waits until the first frequency has been recomputed.
async function typeAndWait(page, field, text) {
  const before = await page.locator(MODE_1).first().getAttribute("data-hz");
  await page.locator(field).fill(text);
  await page.waitForFunction(
    ([selector, old]) => document.querySelector(selector)?.dataset.hz !== old,
    [MODE_1, before],
    { timeout: 5000 },
  );
}

async function assertNoBrokenNumbers(page) {
  const text = await page.evaluate(() => document.body.innerText);
  assert.doesNotMatch(text, BROKEN_NUMBER, "visible text");
  const markup = await page.evaluate(() => {
    const copy = document.body.cloneNode(true);
    copy.querySelectorAll("[data-modebench]").forEach((e) => e.removeAttribute("data-modebench"));
    copy.querySelectorAll("input").forEach((e) => e.removeAttribute("value"));
    return copy.outerHTML;
  });
  assert.doesNotMatch(markup, BROKEN_NUMBER, "markup");
}

describe("the live calculator", () => {
  for (const file of pages()) {
    test(`${file}: the live numbers are the prerendered ones`, { timeout: TEST_TIMEOUT_MS }, async () => {
      const raw = await (await fetch(site.url + file)).text();
      const prerendered = [...raw.matchAll(/<td[^>]*\sdata-hz="([^"]+)"/g)].map((m) => Number(m[1]));
      if (!raw.includes('class="mb-calc"')) {
        return;
      }
      assert.ok(prerendered.length > 0, "the prerendered page shows frequencies");
      const { context, page, problems } = await openLive(browser, site.url + file, { settle: false });
      const live = await page.$$eval("td[data-hz]", (cells) => cells.map((c) => Number(c.dataset.hz)));
      assert.equal(live.length, prerendered.length);
      live.forEach((hz, i) => {
        assert.ok(Number.isFinite(hz) && hz >= 0, `row ${i}: ${hz}`);
        assert.ok(Math.abs(hz - prerendered[i]) <= SAME * Math.max(1, prerendered[i]), `row ${i}: ${hz} live, ${prerendered[i]} prerendered`);
      });
      assert.deepEqual(problems, []);
      await context.close();
    });
  }

  test("as built, the editor shows its values fixed; live, its controls take their place without moving", { timeout: TEST_TIMEOUT_MS }, async () => {
    const editorHeight = (page) =>
      page.evaluate(() => {
        const calculator = document.querySelector(".mb-calc");
        calculator.scrollIntoView();
        return document.querySelector(".mb-editor").getBoundingClientRect().height;
      });
    const still = await browser.newContext({ javaScriptEnabled: false });
    const built = await still.newPage();
    await built.goto(site.url + BOOM);
    const fixed = built.locator(".mb-calc").first();
    assert.equal(await fixed.locator("input, select, textarea").count(), 0, "no form control before the engine");
    assert.equal(await fixed.locator(TIP_MASS).textContent(), "2.8 kg");
    const body = (calculator) => calculator.evaluate((e) => getComputedStyle(e.querySelector(".mb-body")).contentVisibility);
    assert.equal(await body(fixed), "auto", "with script off, laid out once near the view");
    const fixedHeight = await editorHeight(built);
    await still.close();

    const { context, page, problems } = await openLive(browser, site.url + BOOM, { settle: false });
    const live = page.locator(".mb-calc").first();
    assert.ok((await live.locator("input").count()) > 10, "the engine drew the controls");
    assert.equal(await live.locator(".mb-fixed").count(), 0, "no fixed value is left");
    assert.equal(await page.locator(TIP_MASS).inputValue(), "2.8 kg");
    assert.equal(await body(live), "visible", "rendered in full once live");
    const liveHeight = await editorHeight(page);
    assert.ok(Math.abs(liveHeight - fixedHeight) <= 1, `the editor was ${fixedHeight} px tall fixed, ${liveHeight} px live`);
    assert.deepEqual(problems, []);
    await context.close();
  });

  // The browser reports every move of something on screen that no input caused (a layout
  // shift). The results' sections out of view are laid out only as they come into view, and a
  // section laid out late must not push what the reader is looking at.
  test("going live, and scrolling through the page and its results, moves nothing on screen", { timeout: TEST_TIMEOUT_MS }, async (t) => {
    for (const viewport of [{ width: 1280, height: 720 }, { width: 1920, height: 1080 }, ...TABLETS]) {
      const size = `${viewport.width}×${viewport.height}`;
      const step = (what, promise) => within(30_000, `${what} at ${size}`, promise);
      const { context } = await step("a new context", isolatedContext(browser, { viewport, hasTouch: viewport.width < 1280 }));
      await context.addInitScript(() => {
        window.modebenchShifts = [];
        new PerformanceObserver((list) => {
          for (const shift of list.getEntries()) {
            if (!shift.hadRecentInput) {
              const moved = shift.sources.map((s) => s.node?.className ?? s.node?.nodeName ?? "?");
              window.modebenchShifts.push(`${shift.value.toFixed(4)} at ${Math.round(shift.startTime)} ms: ${moved.join(", ")}`);
            }
          }
        }).observe({ type: "layout-shift", buffered: true });
      });
      const { page, problems } = await step("going live", openLive(browser, site.url + BOOM, { context }));
      const frame = () => drawn(page, { note: (what) => t.diagnostic(`${size}: ${what}`) });
      const scroll = (what, to, y) => step(`scrolling ${what}`, page.evaluate(to, y));
      const height = await step("reading the page's height", page.evaluate(() => document.documentElement.scrollHeight));
      for (let y = 0; y < height; y += viewport.height / 2) {
        await scroll(`the page to ${y} px`, (y) => window.scrollTo(0, y), y);
        await frame();
      }
      // On a wide screen the results are a column of their own beside the editor.
      await scroll("the page to the calculator", () => document.querySelector(".mb-calc").scrollIntoView());
      const column = await step("reading the results' height", page.evaluate(() => document.querySelector(".mb-results").scrollHeight));
      for (let y = 0; y < column; y += viewport.height / 2) {
        await scroll(`the results to ${y} px`, (y) => (document.querySelector(".mb-results").scrollTop = y), y);
        await frame();
      }
      assert.deepEqual(await step("reading the moves", page.evaluate(() => window.modebenchShifts)), [], `moves at ${size}`);
      assert.deepEqual(problems, [], size);
      await step("closing the context", context.close());
    }
  });

  test("before the engine, the calculator's body is held back for half a second at most, and printed in full", { timeout: TEST_TIMEOUT_MS }, async (t) => {
    const { context } = await isolatedContext(browser);
    // The page's script never arrives, so only the style sheet decides what shows.
    await context.route("**/assets/boot.js", (route) => route.abort());
    await context.addInitScript(() => {
      document.addEventListener("DOMContentLoaded", () => {
        const calculator = document.querySelector(".mb-calc");
        // Held at its start, so that what follows does not race the clock.
        const hold = calculator.getAnimations().find((a) => a.animationName === "mb-let-through");
        hold?.pause();
        window.__hold = hold ?? null;
      });
    });
    const page = await context.newPage();
    await page.goto(site.url + BOOM);
    const state = () =>
      page.evaluate(() => {
        const table = document.querySelector(".mb-calc table.mb-modes");
        return {
          body: getComputedStyle(document.querySelector(".mb-calc > .mb-body")).contentVisibility,
          table: table.checkVisibility({ contentVisibilityAuto: true }),
          head: document.querySelector(".mb-calc .mb-title").checkVisibility(),
        };
      });
    assert.equal(await page.evaluate(() => window.__hold?.effect.getTiming().delay), 500);
    await page.locator(".mb-calc").first().scrollIntoViewIfNeeded();
    assert.deepEqual(await state(), { body: "hidden", table: false, head: true }, "held back, title shown");
    await page.emulateMedia({ media: "print" });
    assert.equal((await state()).table, true, "printed in full even while held back");
    await page.emulateMedia({ media: "screen" });
    await page.evaluate(() => window.__hold.play());
    await page.waitForFunction(
      () => getComputedStyle(document.querySelector(".mb-calc > .mb-body")).contentVisibility === "auto",
      null,
      { timeout: 5000 },
    );
    await drawn(page, { note: (what) => t.diagnostic(what) });
    assert.deepEqual(await state(), { body: "auto", table: true, head: true }, "let through: the worked example shows");
    const hz = await page.locator(MODE_1).first().getAttribute("data-hz");
    assert.ok(Number(hz) > 0, `prerendered first frequency ${hz}`);
    await context.close();
  });

  test("choosing a mode as soon as the calculator is live draws that mode's shape", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + BOOM, { settle: false });
    const caption = () => page.locator(".mb-calc svg.mb-plot title").first().textContent();
    assert.match(await caption(), /^Mode 1: /);
    await page.locator('.mb-calc [data-show-mode="3"]').first().click();
    await page.waitForFunction(() => document.querySelector(".mb-calc svg.mb-plot title")?.textContent.startsWith("Mode 3: "));
    const hz = await page.locator('table.mb-modes tr[data-mode="3"] td[data-hz]').first().getAttribute("data-hz");
    assert.ok((await caption()).includes(`${Number(hz).toPrecision(4)} Hz`), `${await caption()} against ${hz} Hz`);
    assert.equal(await page.locator('.mb-calc [data-show-mode="3"]').first().getAttribute("aria-pressed"), "true");
    assert.deepEqual(problems, []);
    await context.close();
  });

  // The worker draws an edit's results for the view on show; the page draws its own whenever
  // the view changes. Both must agree to the character, or the page would show one thing after
  // typing and another after a click.
  test("an edit's results keep the mode chosen and the sections opened, drawn as the page draws them", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + BOOM, { settle: false });
    await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"));
    await page.locator('.mb-calc [data-show-mode="3"]').first().click();
    const fold = page.locator('.mb-calc details.mb-fold[data-part="model"]').first();
    await fold.locator("summary").click();
    await typeAndWait(page, TIP_MASS, "3.1 kg");
    const caption = await page.locator(".mb-calc svg.mb-plot title").first().textContent();
    const hz = await page.locator('table.mb-modes tr[data-mode="3"] td[data-hz]').first().getAttribute("data-hz");
    assert.ok(caption.startsWith("Mode 3: ") && caption.includes(`${Number(hz).toPrecision(4)} Hz`), `${caption} against ${hz} Hz`);
    assert.equal(await fold.getAttribute("open"), "", "the section opened stays open");
    const results = () => page.locator(".mb-calc .mb-results").first().innerHTML();
    const summary = () => page.locator(".mb-calc .mb-summary").first().innerHTML();
    const afterEdit = [await results(), await summary()];
    // Choosing the same mode again has the page draw the results itself, over the edit's.
    await page.locator('.mb-calc [data-show-mode="3"]').first().click();
    assert.deepEqual([await results(), await summary()], afterEdit);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("a heavier camera head lowers the first frequency; a lighter one raises it", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page } = await openLive(browser, site.url + BOOM, { settle: false });
    const start = await mode1(page);
    await typeAndWait(page, TIP_MASS, "4.2 kg");
    const heavier = await mode1(page);
    assert.ok(heavier < start, `4.2 kg: ${heavier} Hz is not below ${start} Hz`);
    await typeAndWait(page, TIP_MASS, "1.4 kg");
    const lighter = await mode1(page);
    assert.ok(lighter > start, `1.4 kg: ${lighter} Hz is not above ${start} Hz`);
    assert.equal(await page.locator("svg.mb-plot").count() > 0, true, "the mode plot is shown");
    await context.close();
  });

  for (const [typed, why] of [
    ["-3 kg", "a negative mass"],
    ["2.8 furlongs", "a length where a mass belongs"],
    ["", "nothing at all"],
    ["heavy", "no number"],
  ]) {
    test(`${why} ("${typed}") is named beside the field, and no broken number appears`, { timeout: TEST_TIMEOUT_MS }, async () => {
      const { context, page, problems } = await openLive(browser, site.url + BOOM, { settle: false });
      const lastGood = await mode1(page);
      await page.locator(TIP_MASS).fill(typed);
      const error = page.locator('.mb-field-error[data-for="attachments[0].mass"]');
      await error.waitFor({ state: "visible", timeout: 5000 });
      assert.ok((await error.innerText()).trim().length > 0, "the message says something");
      await page.waitForSelector(".mb-results.mb-stale");
      assert.equal(await mode1(page), lastGood, "the last good results stay");
      await assertNoBrokenNumbers(page);
      assert.deepEqual(problems, []);
      await context.close();
    });
  }

  test("typed faster than it solves, a refused value greys the results of the value just before it", { timeout: TEST_TIMEOUT_MS }, async () => {
    // "12", "12 lb", "12 lbf" in one task: the first goes to the worker, the second waits and
    // the third takes its place, so "12 lb" is never solved on its way; "12 lbf" is a force and
    // refused. The results greyed under the refusal are those of 12 lb, not of 3 kg typed before.
    const { context, page } = await openLive(browser, site.url + BOOM, { settle: false });
    await typeAndWait(page, TIP_MASS, "12 lb");
    const pounds = await mode1(page);
    await typeAndWait(page, TIP_MASS, "3 kg");
    assert.notEqual(await mode1(page), pounds);
    await page.evaluate((field) => {
      const input = document.querySelector(field);
      for (const text of ["12", "12 lb", "12 lbf"]) {
        input.value = text;
        input.dispatchEvent(new Event("input", { bubbles: true }));
      }
    }, TIP_MASS);
    await page.locator('.mb-field-error[data-for="attachments[0].mass"]').waitFor({ state: "visible", timeout: 5000 });
    await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"));
    await page.waitForSelector(".mb-results.mb-stale");
    assert.ok(same(await mode1(page), pounds), `greyed ${await mode1(page)} Hz against 12 lb's ${pounds} Hz`);
    await context.close();
  });

  test("a reload keeps what was typed", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page } = await openLive(browser, site.url + BOOM, { settle: false });
    await typeAndWait(page, TIP_MASS, "3.1 kg");
    const edited = await mode1(page);
    await page.reload();
    await page.waitForSelector('.mb-calc[data-live="true"]');
    // The page shows its example at once and the stored case as soon as the worker has solved it.
    await page.waitForFunction((field) => document.querySelector(field)?.value === "3.1 kg", TIP_MASS);
    await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"));
    // Solved afresh after the reload, not from the last answer's hints: the same to round-off.
    assert.ok(same(await mode1(page), edited), `${await mode1(page)} against ${edited}`);
    await context.close();
  });

  test("a reload straight after a keystroke keeps it, answered or not", { timeout: TEST_TIMEOUT_MS }, async () => {
    // The case is stored in the keystroke's own task, after the edit is posted to the worker:
    // a reload asked for in that same task, before any answer can come back, still finds every
    // character typed.
    const { context, page } = await openLive(browser, site.url + BOOM, { settle: false });
    await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"));
    await page.locator(TIP_MASS).click();
    await page.locator(TIP_MASS).press("Control+A");
    await page.locator(TIP_MASS).pressSequentially("3.4", { delay: 20 });
    await page.evaluate((field) => {
      const input = document.querySelector(field);
      input.value = "3.45 kg";
      input.dispatchEvent(new Event("input", { bubbles: true }));
      location.reload();
    }, TIP_MASS);
    await page.waitForSelector('.mb-calc[data-live="true"]');
    await page.waitForFunction((field) => document.querySelector(field)?.value === "3.45 kg", TIP_MASS);
    await context.close();
  });
});
