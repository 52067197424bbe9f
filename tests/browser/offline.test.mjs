// Offline after the first visit: the service worker keeps the whole site, so that with the
// network gone a reload and every page still work and every calculator still computes; and a
// rebuilt site replaces what was kept on the reader's next visits.
//
// These contexts do not route requests: routing in the test browser bypasses service workers.
// The site asks only for its own files (site.test.mjs checks that), so nothing leaves anyway.
//
// Waits on the worker and its cache go through `untilKept`: Playwright's `waitForFunction` does
// not wait for an async predicate's promise, and took these for met at once, before anything was
// kept (which is why only part of the site was seen kept, and the rebuilt site sometimes not).

import assert from "node:assert/strict";
import { spawn } from "node:child_process";
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { after, before, describe, test } from "node:test";
import { DIST, ROOT, TEST_TIMEOUT_MS, closeAll, launch, offlineSite, pages, startSite, untilKept, watchedPage } from "./support.mjs";

let browser;

before(async () => {
  browser = await launch();
});

after(closeAll);

// Visits a page and waits until the service worker of the site built in `dist` controls it and
// has kept every file; returns the page and the files kept.
async function firstVisit(context, url, dist = DIST) {
  const { page, problems } = await watchedPage(context);
  await page.goto(url);
  const kept = await untilKept(page, dist);
  return { page, problems, kept };
}

async function computes(page) {
  if ((await page.locator(".mb-calc").count()) === 0) {
    return;
  }
  await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 });
  await page.waitForFunction(() => ![...document.querySelectorAll(".mb-calc")].some((c) => c.hasAttribute("data-solving")), null, {
    timeout: 10_000,
  });
  const hz = await page.$$eval("td[data-hz]", (cells) => cells.map((c) => Number(c.dataset.hz)));
  assert.ok(hz.length > 0 && hz.every((f) => Number.isFinite(f) && f >= 0), `${page.url()}: ${hz}`);
}

describe("offline", () => {
  test("after the first visit, a reload and every page work and compute with the network gone", { timeout: TEST_TIMEOUT_MS }, async () => {
    const site = await startSite();
    const context = await browser.newContext();
    const { page, kept } = await firstVisit(context, site.url + "index.html");
    // Every file of the site, as the builder listed it: every page, the engines, the recording.
    const { files } = offlineSite();
    assert.deepEqual(kept, files);
    for (const file of [...pages(), "assets/modebench_solver_bg.wasm", "assets/boom-taps.wav", "embed.html"]) {
      assert.ok(files.includes(file), `${file} is kept`);
    }

    await context.setOffline(true);
    await page.reload();
    assert.match(await page.title(), /Modebench/);
    for (const file of pages()) {
      await page.goto(site.url + file);
      await computes(page);
      // An edit is solved offline too: the worker and its engine come from the cache.
      const field = page.locator('[data-field="attachments[0].mass"]');
      if ((await field.count()) > 0) {
        const before = await page.locator('tr[data-mode="1"] td[data-hz]').first().getAttribute("data-hz");
        await field.first().fill("9 kg");
        await page.waitForFunction(
          (old) => document.querySelector('tr[data-mode="1"] td[data-hz]')?.dataset.hz !== old,
          before,
          { timeout: 10_000 },
        );
      }
    }
    // The site's folder itself is its home page, offline too.
    await page.goto(site.url);
    assert.match(await page.title(), /^Modebench$/);
    await context.close();
  });

  test("after a rebuild, the service worker serves the new version", { timeout: TEST_TIMEOUT_MS }, async () => {
    // A copy of the site and of the sources it is built from, so the rebuild touches neither.
    const scratch = mkdtempSync(join(tmpdir(), "modebench-offline-"));
    const root = join(scratch, "root");
    const dist = join(scratch, "dist");
    for (const part of ["site/pages", "site/assets", "docs"]) {
      cpSync(join(ROOT, part), join(root, part), { recursive: true });
    }
    cpSync(DIST, dist, { recursive: true });
    const site = await startSite(dist);
    const context = await browser.newContext();
    const { page, problems } = await firstVisit(context, site.url + "index.html", dist);
    const old = offlineSite(dist).version;

    const index = join(root, "site/pages/00-index.md");
    writeFileSync(index, readFileSync(index, "utf8") + "\n\nThis copy was rebuilt for the offline test.\n");
    await rebuild(root, dist, join(DIST, "assets"));
    const fresh = offlineSite(dist);
    assert.notEqual(fresh.version, old);

    // The next visit finds the new worker, which keeps the new files, drops the old ones and
    // takes over the page; the visit after that is the new version.
    await page.reload();
    assert.deepEqual(await untilKept(page, dist), fresh.files);
    await page.reload();
    assert.match(await page.textContent("main"), /rebuilt for the offline test/);
    // And offline, the new version is what is kept.
    await context.setOffline(true);
    await page.reload();
    assert.match(await page.textContent("main"), /rebuilt for the offline test/);
    assert.deepEqual(problems, []);
    await context.close();
    site.stop();
    rmSync(scratch, { recursive: true, force: true });
  });
});

// Builds the site from `root` into `dist` with the engine in `wasm`, as `cargo xtask build` does.
function rebuild(root, dist, wasm) {
  const args = ["build", "--root", root, "--out", dist, "--wasm", wasm];
  const command = process.env.MODEBENCH_SITE_BIN
    ? [process.env.MODEBENCH_SITE_BIN, args]
    : ["cargo", ["run", "-q", "-p", "modebench-site", "--", ...args]];
  return new Promise((done, failed) => {
    const child = spawn(command[0], command[1], { cwd: ROOT, stdio: ["ignore", "inherit", "inherit"] });
    child.on("exit", (code) => (code === 0 ? done() : failed(new Error(`the rebuild failed (exit ${code})`))));
  });
}
