// The reader's own cases: several kept per calculator across reloads, every destructive step
// undone, and a case sent as a link or a file and opened back exactly as it was typed.

import assert from "node:assert/strict";
import { readFile, mkdtemp, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { after, before, describe, test } from "node:test";
import { TEST_TIMEOUT_MS, allSame, closeAll, isolatedContext, launch, mode1, openLive, same, settled, startSite, watchedPage } from "./support.mjs";

const BOOM = "sensor-boom.html";
const TIP_MASS = '[data-field="attachments[0].mass"]';
const TITLE = '.mb-cases [data-field="title"]';

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

// The sensor boom's calculator, live, its case bar drawn and its worker's answers in.
function openBoom(options = {}) {
  return openLive(browser, site.url + BOOM, { ready: ".mb-cases", ...options });
}

async function caseNames(page) {
  return page.$$eval(".mb-case-list option", (options) => options.map((o) => o.textContent));
}

// The open case as the calculator keeps it in this browser's storage.
async function openCase(page) {
  return page.evaluate(() => {
    const key = Object.keys(localStorage).find((k) => k.startsWith("modebench:") && !k.endsWith(":set-aside"));
    const stored = JSON.parse(localStorage.getItem(key));
    return stored.cases.find((c) => c.id === stored.open);
  });
}

// An edited case: a title of its own and a heavier tip, typed as a reader would.
async function editCase(page) {
  await page.locator(TITLE).fill("Boom with the heavier head");
  await page.locator(TIP_MASS).fill("3.4 kg");
  await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"));
  await settled(page);
}

describe("cases", () => {
  test("cases survive a reload, and undo brings back a deleted case and the restored example's values", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page, problems } = await openBoom();
    const example = await caseNames(page);
    assert.equal(example.length, 1);
    await editCase(page);
    await page.click('[data-action="case-blank"]');
    await page.locator(TITLE).fill("Bracket, blank start");
    assert.deepEqual(await caseNames(page), ["Boom with the heavier head", "Bracket, blank start"]);
    // A blank case asks for its values; nothing is solved from made-up numbers.
    assert.equal(await page.inputValue('[data-field="segments[0].length"]'), "");

    await page.reload();
    await page.waitForSelector(".mb-cases");
    assert.deepEqual(await caseNames(page), ["Boom with the heavier head", "Bracket, blank start"]);
    assert.equal(await page.inputValue(TITLE), "Bracket, blank start", "the open case stays open");

    await page.selectOption(".mb-case-list", { label: "Boom with the heavier head" });
    await settled(page);
    assert.equal(await page.inputValue(TIP_MASS), "3.4 kg");
    const heavier = await mode1(page);

    await page.click('[data-action="case-delete"]');
    assert.deepEqual(await caseNames(page), ["Bracket, blank start"]);
    await page.click('[data-action="undo"]');
    assert.deepEqual(await caseNames(page), ["Boom with the heavier head", "Bracket, blank start"]);
    assert.equal(await page.inputValue(TIP_MASS), "3.4 kg");

    await page.click('[data-action="restore"]');
    await settled(page);
    assert.notEqual(await page.inputValue(TIP_MASS), "3.4 kg", "the example is back");
    assert.match(await page.textContent('[data-action="undo"]'), /restore the page's example/);
    await page.click('[data-action="undo"]');
    await settled(page);
    assert.equal(await page.inputValue(TIP_MASS), "3.4 kg");
    // Solved again, perhaps from other hints than before: the same to round-off.
    assert.ok(same(await mode1(page), heavier), `${await mode1(page)} against ${heavier}`);

    // Removing a row is undone too.
    await page.click('[data-action="remove"][data-list="attachments"]');
    await page.click('[data-action="undo"]');
    assert.equal(await page.inputValue(TIP_MASS), "3.4 kg");
    await settled(page);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("a link carries the case exactly, and opens it in another browser", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context, page } = await openBoom();
    await editCase(page);
    const sent = await openCase(page);
    const hz = await mode1(page);
    await page.click(".mb-share > summary");
    await page.click('[data-action="share-link"]');
    await page.waitForFunction(() => document.querySelector(".mb-share-link").value.includes("#calc=1&case="));
    const link = await page.inputValue(".mb-share-link");
    assert.ok(link.startsWith(site.url + BOOM + "#"), link);
    assert.ok(!link.includes("3.4"), "the case is compressed, not written out");
    await context.close();

    const other = await isolatedContext(browser);
    const { page: received, problems } = await watchedPage(other.context);
    await received.goto(link);
    await received.waitForSelector(".mb-cases");
    await settled(received);
    const opened = await openCase(received);
    assert.deepEqual(opened.scenario, sent.scenario);
    assert.equal(await received.inputValue(TIP_MASS), "3.4 kg");
    // Solved afresh in the other browser, not from the sender's last answer: the same to round-off.
    assert.ok(same(await mode1(received), hz), `${await mode1(received)} against ${hz}`);
    assert.equal(new URL(received.url()).hash, "", "the link's case leaves the address once opened");
    // A reload shows the case kept, not the link's again.
    await received.reload();
    await received.waitForSelector(".mb-cases");
    assert.equal((await caseNames(received)).length, 2);
    assert.deepEqual(problems, []);
    await other.context.close();
  });

  test("a scenario file and the results files round-trip the case", { timeout: TEST_TIMEOUT_MS }, async () => {
    const dir = await mkdtemp(join(tmpdir(), "modebench-cases-"));
    const { context, page } = await openBoom({ contextOptions: { acceptDownloads: true } });
    await editCase(page);
    const sent = await openCase(page);
    await page.click(".mb-share > summary");

    const download = async (action) => {
      const [file] = await Promise.all([page.waitForEvent("download"), page.click(`[data-action="${action}"]`)]);
      const path = join(dir, file.suggestedFilename());
      await file.saveAs(path);
      return { name: file.suggestedFilename(), path, text: await readFile(path, "utf8") };
    };
    const scenario = await download("save-file");
    assert.equal(scenario.name, "boom-with-the-heavier-head.json");
    assert.deepEqual(JSON.parse(scenario.text), sent.scenario);

    const csv = await download("results-csv");
    const rows = csv.text.trim().split("\r\n");
    assert.match(rows[0], /^mode,frequency_hz,rpm,/);
    const shown = await page.$$eval("td[data-hz]", (cells) => cells.map((c) => Number(c.dataset.hz)));
    assert.deepEqual(rows.slice(1).map((r) => Number(r.split(",")[1])), shown);

    const results = JSON.parse((await download("results-json")).text);
    assert.deepEqual(results.scenario, sent.scenario);
    assert.deepEqual(results.report.modes.map((m) => m.frequency_hz), shown);
    await context.close();

    // In a browser that has never seen it, the file opens as a case of its own.
    const other = await openBoom();
    const { page: fresh, problems } = other;
    await fresh.click(".mb-share > summary");
    const [chooser] = await Promise.all([fresh.waitForEvent("filechooser"), fresh.click('[data-action="open-file"]')]);
    await chooser.setFiles(scenario.path);
    await fresh.waitForFunction(() => document.querySelectorAll(".mb-case-list option").length === 2);
    await settled(fresh);
    assert.deepEqual((await openCase(fresh)).scenario, sent.scenario);
    // Solved afresh, not from the sending page's previous answer: the same to round-off.
    const reread = await fresh.$$eval("td[data-hz]", (c) => c.map((x) => Number(x.dataset.hz)));
    assert.ok(allSame(reread, shown), `${reread} against ${shown}`);

    // A scenario with an input error opens too, as typed; the status line says where the error
    // is, since its field may be out of view.
    const wrong = join(dir, "heavier-head-in-lbf.json");
    const typed = structuredClone(sent.scenario);
    typed.title = "Head typed in lbf";
    typed.attachments[0].mass = "7.5 lbf";
    await writeFile(wrong, JSON.stringify(typed));
    const [chooser2] = await Promise.all([fresh.waitForEvent("filechooser"), fresh.click('[data-action="open-file"]')]);
    await chooser2.setFiles(wrong);
    await fresh.waitForFunction(() => document.querySelector(".mb-case-note").textContent.includes("input error"));
    assert.equal(
      await fresh.textContent(".mb-case-note"),
      "Opened the file as a new case. It has an input error at Attachment 1, mass; its message is in the form below.",
    );
    assert.equal(await fresh.inputValue(TIP_MASS), "7.5 lbf");
    assert.match(await fresh.textContent(".mb-field-error"), /lbf is pound-force/);
    assert.equal((await caseNames(fresh)).length, 3);

    // A file that is not a scenario is refused with a message, and no case is added.
    const bad = join(dir, "not-a-scenario.json");
    await writeFile(bad, "[1, 2, 3]");
    const [again] = await Promise.all([fresh.waitForEvent("filechooser"), fresh.click('[data-action="open-file"]')]);
    await again.setFiles(bad);
    await fresh.waitForFunction(() => document.querySelector(".mb-case-note").textContent.startsWith("Not opened"));
    assert.equal((await caseNames(fresh)).length, 3);
    assert.deepEqual(problems, []);
    await other.context.close();
  });
});
