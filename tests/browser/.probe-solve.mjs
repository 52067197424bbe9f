import { readFileSync } from "node:fs";
import { join } from "node:path";
import { DIST, launch, isolatedContext } from "./support.mjs";
const url = process.env.MODEBENCH_URL;
const browser = await launch();
const { context } = await isolatedContext(browser);
const page = await context.newPage();
for (const file of ["sensor-boom.html", "fan-floor-beam.html"]) {
  await page.goto(url + file);
  const raw = readFileSync(join(DIST, file), "utf8");
  const attribute = raw.match(/data-modebench="([^"]*)"/)[1];
  const text = attribute.replaceAll("&quot;", '"').replaceAll("&lt;", "<").replaceAll("&gt;", ">").replaceAll("&amp;", "&");
  const r = await page.evaluate(async (text) => {
    const engine = await import(new URL("assets/modebench_solver.js", document.baseURI).href);
    await engine.default();
    const s = JSON.parse(text);
    const times = { solve: [], page: [] };
    let sizes = {};
    for (let i = 0; i < 40; i++) {
      s.attachments[0].mass = `${(2 + 0.1 * (i % 20)).toFixed(1)} kg`;
      const t = JSON.stringify(s);
      let a = performance.now();
      const whole = engine.solveScenario(t);
      let b = performance.now();
      times.solve.push(b - a);
      if (engine.solveForPage) {
        a = performance.now();
        const [w, v] = engine.solveForPage(t);
        b = performance.now();
        times.page.push(b - a);
        sizes = { whole: w.length, view: v?.length };
      } else sizes = { whole: whole.length };
    }
    const med = (v) => v.length ? [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)].toFixed(2) : "-";
    return { solve: med(times.solve.slice(5)), page: med(times.page.slice(5)), sizes };
  }, text);
  console.log(file, JSON.stringify(r));
}
await browser.close();
