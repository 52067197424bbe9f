// Compares the cold load of two builds of the site, A/B: both served side by side, the same page
// loaded alternately from each in a fresh browser context, so that the machine's drift touches
// both alike. Prints the median and the fastest time to the first paint and to the first live
// calculator. Judge first-load changes with this (or with processor time from a trace), not with
// two runs of the budget script made minutes apart.
//
//   node compare-loads.mjs <built site A> <built site B> [page] [loads]
//
// For example, with the current build copied to /tmp/before before a change:
//   node compare-loads.mjs /tmp/before ../../dist sensor-boom.html 25
//
// VIEWPORT=768x1024 (or another size) loads at that size instead of the default 1280 × 720.

import { resolve } from "node:path";
import { SETTLE_MS, launch, startSite } from "./support.mjs";

const [dirA, dirB, file = "sensor-boom.html", loads = "21"] = process.argv.slice(2);
const size = process.env.VIEWPORT?.match(/^(\d+)x(\d+)$/);
if (!dirA || !dirB || (process.env.VIEWPORT && !size)) {
  console.error("usage: [VIEWPORT=<width>x<height>] node compare-loads.mjs <built site A> <built site B> [page] [loads]");
  process.exit(2);
}
const VIEWPORT = size ? { width: Number(size[1]), height: Number(size[2]) } : null;

function summary(values) {
  const sorted = values.filter((v) => v !== null).sort((a, b) => a - b);
  if (sorted.length === 0) {
    return "    —";
  }
  const median = sorted[Math.floor(sorted.length / 2)];
  return `${median.toFixed(0).padStart(5)} (${sorted[0].toFixed(0)})`;
}

// Paths are taken from where the command runs; the servers run from the repository root.
const sites = [await startSite(resolve(dirA)), await startSite(resolve(dirB))];
const browser = await launch();
const results = sites.map(() => ({ paint: [], live: [] }));
try {
  for (let load = 0; load < Number(loads); load += 1) {
    for (const [i, site] of sites.entries()) {
      const context = await browser.newContext(VIEWPORT ? { viewport: VIEWPORT } : {});
      await context.addInitScript(() => {
        new MutationObserver(() => {
          if (window.__live === undefined && document.querySelector('.mb-calc[data-live="true"] td[data-hz]')) {
            window.__live = performance.now();
          }
        }).observe(document, { subtree: true, attributes: true, childList: true });
      });
      const page = await context.newPage();
      await new Promise((resolve) => setTimeout(resolve, SETTLE_MS));
      await page.goto(site.url + file);
      await page.waitForFunction(() => window.__live !== undefined, null, { timeout: 10_000 }).catch(() => {});
      const [paint, live] = await page.evaluate(() => [
        performance.getEntriesByName("first-contentful-paint")[0]?.startTime ?? null,
        window.__live ?? null,
      ]);
      results[i].paint.push(paint);
      results[i].live.push(live);
      await context.close();
    }
  }
  console.log(`${file}, ${loads} loads each; median (fastest), ms`);
  console.log(`${"".padEnd(12)} ${"first paint".padStart(14)} ${"live".padStart(14)}`);
  for (const [i, name] of ["A", "B"].entries()) {
    console.log(`${name.padEnd(12)} ${summary(results[i].paint).padStart(14)} ${summary(results[i].live).padStart(14)}`);
  }
} finally {
  await browser.close();
  sites.forEach((site) => site.stop());
}
