// The embed page in another page's frame, as docs/offline-and-embedding.md shows it: the case in
// the frame's address is encoded here independently (raw DEFLATE, base64url, as the format
// documents), the frame computes it live, and once visited it computes with the network gone.

import assert from "node:assert/strict";
import { cpSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { after, before, describe, test } from "node:test";
import { deflateRawSync } from "node:zlib";
import { DIST, TEST_TIMEOUT_MS, closeAll, launch, offlineSite, startSite, untilKept, watchedPage } from "./support.mjs";

// A simply supported uniform beam: f₁ = (π/2)·√(EI/(m·L⁴)), textbook Euler–Bernoulli.
const CASE = {
  title: "Embedded check: a plain pinned beam",
  units: "si",
  modes: 3,
  left: "pinned",
  right: "pinned",
  segments: [{ length: "2 m", flexural_rigidity: "1000 N*m^2", mass_per_length: "2 kg/m" }],
};
const F1 = (Math.PI / 2) * Math.sqrt(1000 / (2 * 2 ** 4));

function caseData(scenario) {
  return deflateRawSync(Buffer.from(JSON.stringify(scenario), "utf8")).toString("base64url");
}

let browser;
let host;
let site;

before(async () => {
  browser = await launch();
  // A firm's own pages with the built site copied beside them, as the snippet assumes.
  host = mkdtempSync(join(tmpdir(), "modebench-embed-"));
  cpSync(DIST, join(host, "modebench"), { recursive: true });
  mkdirSync(join(host, "docs"));
  writeFileSync(join(host, "index.html"), "<p>Internal documents</p>");
  writeFileSync(
    join(host, "docs", "bracket.html"),
    `<!doctype html><html lang="en"><title>Bracket review</title>
<link rel="icon" href="../modebench/assets/mark.svg"><h1>Bracket review</h1>
<iframe src="../modebench/embed.html#calc=1&case=${caseData(CASE)}" title="Modebench calculator" width="1000" height="900"></iframe>
`,
  );
  site = await startSite(host);
});

after(async () => {
  await closeAll();
  rmSync(host, { recursive: true, force: true });
});

async function frameComputes(frame) {
  await frame.waitForSelector('.mb-calc[data-live="true"]', { timeout: 15_000 });
  await frame.waitForFunction(() => document.querySelector(".mb-calc [data-field=title]")?.value !== undefined);
  await frame.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"), null, {
    timeout: 10_000,
  });
  return Number(await frame.locator('tr[data-mode="1"] td[data-hz]').first().getAttribute("data-hz"));
}

describe("the embed page", () => {
  test("in another page's frame, it opens the case in its address and computes it, offline too", { timeout: TEST_TIMEOUT_MS }, async () => {
    const context = await browser.newContext();
    const { page, problems } = await watchedPage(context);
    await page.goto(site.url + "docs/bracket.html");
    const frame = page.frameLocator("iframe");
    const live = page.frames().find((f) => f.url().includes("embed.html")) ?? (await (await page.$("iframe")).contentFrame());
    const hz = await frameComputes(live);
    assert.ok(Math.abs(hz - F1) <= 1e-6 * F1, `${hz} Hz against ${F1} Hz`);
    assert.equal(await frame.locator('.mb-cases [data-field="title"]').inputValue(), CASE.title);
    assert.equal(await frame.locator('[data-field="segments[0].length"]').inputValue(), "2 m");
    assert.equal(await frame.locator(".site-nav").count(), 0, "the frame is the calculator alone");

    // Once the frame has been shown, the site keeps itself; the frame works with no network.
    assert.deepEqual(await untilKept(live), offlineSite().files);
    await context.setOffline(true);
    await page.goto(site.url + `modebench/embed.html#calc=1&case=${caseData(CASE)}`);
    assert.ok(Math.abs((await frameComputes(page.mainFrame())) - F1) <= 1e-6 * F1);
    assert.deepEqual(problems, []);
    await context.close();
  });
});
