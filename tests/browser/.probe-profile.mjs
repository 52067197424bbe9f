import { launch, isolatedContext, openLive } from "./support.mjs";
const url = process.env.MODEBENCH_URL + (process.env.PAGE ?? "sensor-boom.html");
const browser = await launch();
const { context } = await isolatedContext(browser);
const { page } = await openLive(browser, url, { context, settle: false });
await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"));
await page.locator(".mb-calc").first().scrollIntoViewIfNeeded();
const cdp = await context.newCDPSession(page);
await cdp.send("Profiler.enable");
await cdp.send("Profiler.setSamplingInterval", { interval: 50 });
await cdp.send("Profiler.start");
for (let edit = 0; edit < 40; edit++) {
  const value = `${(2.0 + 0.1 * (edit % 20)).toFixed(1)} kg`;
  await page.evaluate(async (value) => {
    await new Promise((r) => setTimeout(r, 150));
    const root = document.querySelector(".mb-calc");
    const input = root.querySelector('[data-field="attachments[0].mass"]');
    const hz = root.querySelector('tr[data-mode="1"] td[data-hz]')?.dataset.hz;
    input.value = value;
    input.dispatchEvent(new Event("input", { bubbles: true }));
    await new Promise((resolve) => {
      const t = setInterval(() => {
        if (root.querySelector('tr[data-mode="1"] td[data-hz]')?.dataset.hz !== hz) { clearInterval(t); resolve(); }
      }, 2);
      setTimeout(() => { clearInterval(t); resolve(); }, 2000);
    });
  }, value);
}
const { profile } = await cdp.send("Profiler.stop");
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const self = new Map();
const dt = profile.timeDeltas;
profile.samples.forEach((id, i) => {
  const n = byId.get(id);
  const name = `${n.callFrame.functionName || "(anon)"} ${n.callFrame.url.split("/").pop()}`;
  self.set(name, (self.get(name) ?? 0) + (dt[i + 1] ?? 0) / 1000);
});
// inclusive time for wasm/JS functions by walking parents
const parent = new Map();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const incl = new Map();
profile.samples.forEach((id, i) => {
  const seen = new Set();
  for (let x = id; x !== undefined; x = parent.get(x)) {
    const n = byId.get(x);
    const name = n.callFrame.functionName || "(anon)";
    if (seen.has(name)) continue;
    seen.add(name);
    incl.set(name, (incl.get(name) ?? 0) + (dt[i + 1] ?? 0) / 1000);
  }
});
const top = (m, k) => [...m].filter(([n]) => !/^\((idle|root)\)/.test(n)).sort((a, b) => b[1] - a[1]).slice(0, k);
console.log("SELF (ms over 40 edits)");
for (const [n, t] of top(self, 45)) console.log(t.toFixed(1).padStart(8), n.slice(0, 140));
console.log("INCLUSIVE");
for (const [n, t] of top(incl, 60)) console.log(t.toFixed(1).padStart(8), n.slice(0, 140));
await browser.close();
