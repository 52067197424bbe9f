// Printed, a calculator page is the calculation record of the case on show: its own title (not
// the page example's once the case is the reader's own), the date and the record the reader
// filled in, every input, every mode's shape, the cautions, ticked boxes in words, and no heading
// printed without its section.

import assert from "node:assert/strict";
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { after, before, describe, test } from "node:test";
import { TEST_TIMEOUT_MS, closeAll, launch, openLive, settled, startSite } from "./support.mjs";

const BOOM = "sensor-boom.html";
const WATER = '[data-field="segments[0].extra_mass.submerged"]';

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

// What print shows: every visible heading with the text of the section it heads, and the rest.
async function printed(page) {
  await page.emulateMedia({ media: "print" });
  // Every mode's shape is drawn as print begins.
  await page.waitForSelector(".mb-sheet-shape svg", { state: "attached", timeout: 5000 });
  return page.evaluate(() => {
    const visible = (e) => e.getClientRects().length > 0 && getComputedStyle(e).visibility !== "hidden";
    const headings = [...document.querySelectorAll("main h1, main h2, main h3, main h4, main summary")]
      .filter(visible)
      .map((h) => {
        const section = h.tagName === "SUMMARY" ? h.parentElement : h.closest("section, details, .mb-head, main");
        const rest = section.innerText.replace(h.innerText, "").trim();
        return { heading: h.innerText.trim(), rest: rest.length };
      });
    const after = (e) => getComputedStyle(e, "::after").content;
    return {
      headings,
      h1: visible(document.querySelector("main > h1")),
      sheetTitle: [...document.querySelectorAll(".mb-sheet-title")].filter(visible).map((e) => e.innerText),
      record: document.querySelector(".mb-sheet-record")?.innerText ?? "",
      pageCautions: [...document.querySelectorAll('main > blockquote[class^="markdown-alert-"]')].some(visible),
      calculatorCaution: visible(document.querySelector(".mb-caution")),
      shapes: [...document.querySelectorAll(".mb-sheet-shape svg")].filter(visible).length,
      modes: document.querySelectorAll("table.mb-modes tr[data-mode]").length,
      water: after(document.querySelector(".mb-tick .mb-label")),
      conversions: visible(document.querySelector(".mb-conversions") ?? document.body),
      inputs: [...document.querySelectorAll(".mb-editor input[type=text]")].filter(visible).length,
    };
  });
}

// The text of each page of a PDF, by poppler's pdftotext (pages end with a form feed).
function pdfText(pdf) {
  const dir = mkdtempSync(join(tmpdir(), "modebench-print-"));
  try {
    const file = join(dir, "sheet.pdf");
    writeFileSync(file, pdf);
    let text;
    try {
      text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
    } catch (error) {
      throw new Error(`pdftotext could not read the printed sheet (poppler-utils; \`cargo xtask tools\` installs it): ${error.message}`);
    }
    return text.split("\f").slice(0, -1);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe("the printed sheet", () => {
  test("a case of the reader's own prints as its own calculation record, with nothing empty", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openLive(browser, site.url + BOOM, { ready: ".mb-cases" });

    // The example, printed: the page's title and its notes on the example, every mode drawn.
    let sheet = await printed(page);
    assert.ok(sheet.h1 && sheet.pageCautions && sheet.calculatorCaution, JSON.stringify(sheet));
    assert.equal(sheet.shapes, sheet.modes);
    await page.emulateMedia({ media: "screen" });

    await page.locator('.mb-cases [data-field="title"]').fill("Boom B, longer tube");
    await page.locator('[data-field="segments[0].length"]').fill("1.6 m");
    await page.click(".mb-record > summary");
    await page.locator('[data-record="preparer"]').fill("R. Preparer");
    await page.locator('[data-record="revision"]').fill("B");
    await page.locator(WATER).check();
    await settled(page);

    sheet = await printed(page);
    assert.deepEqual(sheet.sheetTitle, ["Boom B, longer tube"]);
    assert.ok(!sheet.h1, "the page example's title is not the case's");
    assert.ok(!sheet.pageCautions, "the page's notes on its example are left out");
    assert.ok(sheet.calculatorCaution, "the cautions every case carries stay");
    assert.match(sheet.record, /Date\s+\d{4}-\d{2}-\d{2}/);
    assert.match(sheet.record, /Prepared by\s+R\. Preparer/);
    assert.match(sheet.record, /Revision\s+B/);
    assert.equal(sheet.shapes, sheet.modes, "every mode's shape");
    assert.ok(sheet.modes > 1);
    assert.equal(sheet.water, '": yes"', "a ticked box is said in words");
    assert.ok(sheet.inputs > 5, "the inputs as typed");
    assert.ok(sheet.conversions, "the conversions, though their section was closed on screen");
    const empty = sheet.headings.filter((h) => h.rest === 0);
    assert.deepEqual(empty, [], "headings printed without their section");

    // The PDF itself: more than one page, as a sheet with every mode's shape runs on.
    const pdf = await page.pdf({ format: "A4" });
    assert.equal(pdf.subarray(0, 5).toString(), "%PDF-");
    const pages = pdf.toString("latin1").match(/\/Type\s*\/Page[^s]/g) ?? [];
    assert.ok(pages.length >= 2, `${pages.length} pages`);
    // Every page is numbered "Page n of N" and names the sheet at its foot, as read by poppler's
    // pdftotext (a reader other than the browser that printed it; `cargo xtask tools` installs
    // it), page by page.
    const text = pdfText(pdf);
    assert.equal(text.length, pages.length, "pdftotext reads as many pages");
    text.forEach((page, i) => {
      assert.match(page, new RegExp(`Page ${i + 1} of ${pages.length}\\b`), `page ${i + 1}: ${page.slice(-300)}`);
      assert.match(page, /Modebench calculation sheet/, `page ${i + 1}`);
    });
    assert.deepEqual(problems, []);
    await context.close();
  });
});
