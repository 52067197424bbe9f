// The single-file build opened from disk (file://), where the site's own pages cannot start their
// calculators: it goes live, computes a case in its address against the textbook's closed form,
// recomputes after an edit, keeps the edit over a reload, and asks for nothing outside itself.
// `cargo xtask build --single-file` makes the file; `cargo xtask test` passes its path in
// MODEBENCH_SINGLE_FILE.

import assert from "node:assert/strict";
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { after, before, describe, test } from "node:test";
import { deflateRawSync } from "node:zlib";
import { MODE_1, ROOT, TEST_TIMEOUT_MS, axeProblems, closeAll, launch, openLive, settled } from "./support.mjs";

const FILE = process.env.MODEBENCH_SINGLE_FILE ?? join(ROOT, "build", "single", "modebench-calculator.html");
const URL_OF_FILE = pathToFileURL(FILE).href;
const TIP_MASS = '[data-field="attachments[0].mass"]';

// A simply supported uniform beam: f₁ = (π/2)·√(EI/(m·L⁴)), textbook Euler–Bernoulli (as in
// embed.test.mjs), and f₂ = 4·f₁ (the n² law of the pinned–pinned beam).
const CASE = {
  title: "From disk: a plain pinned beam",
  units: "si",
  modes: 3,
  left: "pinned",
  right: "pinned",
  segments: [{ length: "2 m", flexural_rigidity: "1000 N*m^2", mass_per_length: "2 kg/m" }],
};
const F1 = (Math.PI / 2) * Math.sqrt(1000 / (2 * 2 ** 4));

let browser;

before(async () => {
  assert.ok(existsSync(FILE), `${FILE} is missing: \`cargo xtask build --single-file\` makes it`);
  browser = await launch();
});

after(closeAll);

// Opens the file and remembers every request that is not for the file itself or for what it
// makes in memory (its worker's blob: address).
async function openFile(url, context) {
  const opened = await openLive(browser, url, { context });
  const elsewhere = [];
  opened.context.on("request", (request) => {
    if (!/^(file|blob|data):/.test(request.url())) {
      elsewhere.push(request.url());
    }
  });
  return { ...opened, elsewhere };
}

async function mode(page, n) {
  return Number(await page.locator(`table.mb-modes tr[data-mode="${n}"] td[data-hz]`).first().getAttribute("data-hz"));
}

describe("the single file, opened from disk", () => {
  test("it goes live, computes a case from its address as the textbook does, and an edit", { timeout: TEST_TIMEOUT_MS }, async () => {
    const data = deflateRawSync(Buffer.from(JSON.stringify(CASE), "utf8")).toString("base64url");
    const context = await browser.newContext();
    const { page, problems, elsewhere } = await openFile(`${URL_OF_FILE}#calc=1&case=${data}`, context);
    assert.equal(new URL(page.url()).protocol, "file:");
    await page.waitForFunction((title) => document.querySelector('.mb-cases [data-field="title"]')?.value === title, CASE.title, {
      timeout: 10_000,
    });
    // The example's results stay until the link's case is solved.
    const example = Number(/data-hz="([^"]+)"/.exec(readFileSync(FILE, "utf8"))[1]);
    await page.waitForFunction((old) => Number(document.querySelector('tr[data-mode="1"] td[data-hz]')?.dataset.hz) !== old, example, {
      timeout: 10_000,
    });
    await settled(page);
    const f1 = await mode(page, 1);
    assert.ok(Math.abs(f1 - F1) <= 1e-6 * F1, `${f1} Hz against ${F1} Hz`);
    assert.ok(Math.abs((await mode(page, 2)) / f1 - 4) <= 1e-6, "f₂ = 4 f₁");

    // An edit is solved by the worker the file starts from itself.
    const before = await page.locator(MODE_1).first().getAttribute("data-hz");
    await page.locator('[data-field="segments[0].length"]').fill("4 m");
    await page.waitForFunction((old) => document.querySelector('tr[data-mode="1"] td[data-hz]')?.dataset.hz !== old, before, {
      timeout: 10_000,
    });
    await settled(page);
    // Twice the span, a quarter of the frequency (f₁ ∝ 1/L²).
    assert.ok(Math.abs((await mode(page, 1)) / F1 - 0.25) <= 1e-6, `${await mode(page, 1)} Hz at 4 m`);
    assert.deepEqual(problems, [], "no error, no request refused by the file's policy");
    assert.deepEqual(elsewhere, []);
    await context.close();
  });

  test("the example computes, an edit moves it the way physics says, and a reload keeps it", { timeout: TEST_TIMEOUT_MS }, async () => {
    const context = await browser.newContext();
    const { page, problems, elsewhere } = await openFile(URL_OF_FILE, context);
    const policy = await page.getAttribute('meta[http-equiv="Content-Security-Policy"]', "content");
    assert.match(policy, /^default-src 'none'; script-src 'sha256-[A-Za-z0-9+/]+=*' 'wasm-unsafe-eval';/);
    assert.doesNotMatch(policy, /'self'|'unsafe-inline'|'unsafe-eval'/);
    const start = await mode(page, 1);
    assert.ok(start > 0);
    // A heavier tip mass lowers the first frequency (Rayleigh's quotient: more kinetic energy
    // for the same strain energy).
    await page.locator(TIP_MASS).fill("4.2 kg");
    await page.waitForFunction((old) => Number(document.querySelector('tr[data-mode="1"] td[data-hz]')?.dataset.hz) !== old, start, {
      timeout: 10_000,
    });
    await settled(page);
    const heavier = await mode(page, 1);
    assert.ok(heavier < start, `4.2 kg: ${heavier} Hz is not below ${start} Hz`);
    await page.reload();
    await page.waitForSelector('.mb-calc[data-live="true"]');
    await page.waitForFunction((field) => document.querySelector(field)?.value === "4.2 kg", TIP_MASS, { timeout: 10_000 });
    await settled(page);
    assert.equal(await mode(page, 1), heavier);
    assert.deepEqual(problems, []);
    assert.deepEqual(elsewhere, []);
    await context.close();
  });

  test("axe-core finds no serious or critical problem, an input error showing included", { timeout: TEST_TIMEOUT_MS }, async () => {
    // The context bypasses the file's policy only so that axe can be added (support.mjs); it is
    // not an isolated one, whose routing refuses file:// addresses.
    const context = await browser.newContext({ bypassCSP: true });
    const { page } = await openLive(browser, URL_OF_FILE, { context });
    assert.deepEqual(await axeProblems(page), []);
    await page.locator(TIP_MASS).fill("-3 kg");
    await page.locator('.mb-field-error[data-for="attachments[0].mass"]').waitFor({ state: "visible", timeout: 5000 });
    assert.deepEqual(await axeProblems(page), []);
    await context.close();
  });
});
