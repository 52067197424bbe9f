// The tap-test panel end to end in Chromium: a synthetic ring-down of known modes fed as the
// microphone (Chromium's fake capture device plays a WAV file as the microphone) and imported as
// a WAV and a CSV file through the panel's file input, and as the motion sensor's `devicemotion`
// readings at an uneven rate; the listed peaks are checked against the frequencies the records
// were made of. A denied microphone says so and leaves file import
// working; no request leaves 127.0.0.1 while recording; the frequencies kept as measured survive
// a reload and are taken back by "Undo". The analysis times are printed, not asserted
// (docs/performance.md records them).
//
// The records are made here, from a seeded generator: each tap starts decaying sinusoids
// x(t) = A e^(−ζωt) sin(ω_d t + φ), ω_d = ω√(1 − ζ²) (the damped oscillator's free response, a
// fact of the theory), so the damped frequencies listed must be the ones written.
//
// Longer than 400 lines on purpose: the records' makers (ring-down, WAV writer) are shared by
// every test of the panel, and splitting the file would copy them or add a module for one file.

import assert from "node:assert/strict";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { after, before, describe, test } from "node:test";
import { BROKEN_NUMBER, ROOT, TEST_TIMEOUT_MS, axeProblems, closeAll, isolatedContext, launch, startSite, watchedPage } from "./support.mjs";

const PAGE = "sensor-boom.html";
const MODE = (n) => `table.mb-modes tr[data-mode="${n}"] td[data-hz]`;
// The core's own checks of synthetic records hold frequencies to 0.05 %. The microphone's path
// adds the resampler between the fake capture device's clock and the audio context's, which
// keeps the two in step by varying its ratio slightly: on this machine it moved a 1250 Hz mode by
// 0.2 % and a 440 Hz one by 0.03 %, so that path is held to 0.5 % (a real microphone's
// frequencies are those of the tablet's one clock).
const FILE_TOLERANCE = 5e-4;
const MICROPHONE_TOLERANCE = 5e-3;

// A seeded generator (mulberry32, common practice, no source), so every run hears the same record.
function generator(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// `seconds` of samples at `rate`: a tap at each of `taps` (s) rings the modes ({hz, zeta, amplitude}
// with hz the damped frequency) over uniform noise of the given amplitude. An impulse starts each
// mode from rest, so its response starts at zero: A e^(−ζωt) sin(ω_d t).
function ringDown({ rate, seconds, modes, taps, noise, seed }) {
  const random = generator(seed);
  const samples = new Float64Array(Math.round(rate * seconds));
  for (let n = 0; n < samples.length; n++) samples[n] = noise * (2 * random() - 1);
  for (const start of taps) {
    for (let n = Math.round(start * rate); n < samples.length; n++) {
      const t = n / rate - start;
      modes.forEach((m) => {
        const wd = 2 * Math.PI * m.hz;
        const wn = wd / Math.sqrt(1 - m.zeta * m.zeta);
        samples[n] += m.amplitude * Math.exp(-m.zeta * wn * t) * Math.sin(wd * t);
      });
    }
  }
  return samples;
}

// A 16-bit PCM mono WAV file of the samples (RIFF layout, as Microsoft's WAVE format defines it).
function wav(samples, rate) {
  const data = samples.length * 2;
  const bytes = Buffer.alloc(44 + data);
  bytes.write("RIFF", 0, "ascii");
  bytes.writeUInt32LE(36 + data, 4);
  bytes.write("WAVEfmt ", 8, "ascii");
  bytes.writeUInt32LE(16, 16);
  bytes.writeUInt16LE(1, 20);
  bytes.writeUInt16LE(1, 22);
  bytes.writeUInt32LE(rate, 24);
  bytes.writeUInt32LE(rate * 2, 28);
  bytes.writeUInt16LE(2, 32);
  bytes.writeUInt16LE(16, 34);
  bytes.write("data", 36, "ascii");
  bytes.writeUInt32LE(data, 40);
  samples.forEach((s, i) => bytes.writeInt16LE(Math.max(-32767, Math.min(32767, Math.round(s * 32767))), 44 + 2 * i));
  return bytes;
}

// The fake microphone's record: two modes, three taps in 4 s, 60 dB under full scale noise.
const HEARD = [
  { hz: 440, zeta: 0.005, amplitude: 0.3 },
  { hz: 1250, zeta: 0.003, amplitude: 0.15 },
];
const folder = mkdtempSync(join(tmpdir(), "modebench-bench-"));
const heardFile = join(folder, "taps.wav");
writeFileSync(
  heardFile,
  wav(ringDown({ rate: 48000, seconds: 4, modes: HEARD, taps: [0.3, 1.5, 2.7], noise: 1e-3, seed: 11 }), 48000),
);

let site;
let browser;

before(async () => {
  site = await startSite();
  browser = await launch();
});

after(closeAll);

async function openPanel(context) {
  const { page, problems } = await watchedPage(context);
  await page.goto(site.url + PAGE);
  await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 });
  await page.waitForFunction(() => !document.querySelector(".mb-calc")?.hasAttribute("data-solving"), null, {
    timeout: 10_000,
  });
  await page.locator(".mb-bench > summary").first().click();
  return { page, problems };
}

// The listed peaks (Hz) after an analysis, or the message.
async function listed(page) {
  await page.waitForFunction(() => document.querySelector(".mb-bench")?.dataset.benchState === "idle", null, {
    timeout: 15_000,
  });
  return page.evaluate(() =>
    [...document.querySelectorAll(".mb-bench-peaks tr[data-peak] td[data-hz]")].map((td) => Number(td.dataset.hz)),
  );
}

function assertListed(peaks, wanted, tolerance, what) {
  for (const hz of wanted) {
    const nearest = peaks.reduce((a, b) => (Math.abs(b - hz) < Math.abs(a - hz) ? b : a), Infinity);
    assert.ok(Math.abs(nearest / hz - 1) <= tolerance, `${what}: ${hz} Hz listed as ${nearest} Hz (peaks ${peaks})`);
  }
}

async function predicted(page, n) {
  return Number(await page.locator(MODE(n)).first().getAttribute("data-hz"));
}

describe("the tap-test panel", () => {
  test("the microphone hears the synthetic taps: peaks listed at the frequencies recorded, nothing sent", { timeout: TEST_TIMEOUT_MS }, async () => {
    const micBrowser = await launch([
      "--use-fake-ui-for-media-stream",
      "--use-fake-device-for-media-stream",
      `--use-file-for-fake-audio-capture=${heardFile}`,
      "--autoplay-policy=no-user-gesture-required",
    ]);
    try {
      const { context, external } = await isolatedContext(micBrowser);
      await context.grantPermissions(["microphone"], { origin: site.url });
      const { page, problems } = await openPanel(context);
      const requests = [];
      page.on("request", (request) => requests.push(`${request.method()} ${request.url()}`));
      await page.locator('[data-bench-action="mic-start"]').click();
      await page.waitForFunction(() => document.querySelector(".mb-bench")?.dataset.benchState === "microphone", null, {
        timeout: 10_000,
      });
      assert.match(await page.locator(".mb-bench-status").textContent(), /Tap the part now/);
      // The level meter follows the taps (they peak at 0.45 of full scale, the noise at 0.001).
      const started = Date.now();
      await page.waitForFunction(() => document.querySelector(".mb-bench meter").value > 0.1, null, { timeout: 4000 });
      // The file loops: 4.5 s hears its three taps at least once.
      await page.waitForTimeout(Math.max(0, 4500 - (Date.now() - started)));
      await page.locator('[data-bench-action="mic-stop"]').click();
      const peaks = await listed(page);
      const status = await page.locator(".mb-bench-status").textContent();
      assertListed(peaks, HEARD.map((m) => m.hz), MICROPHONE_TOLERANCE, `microphone (${status})`);
      const timing = await page.evaluate(() => ({ ...document.querySelector(".mb-bench").dataset }));
      console.log(
        `microphone record: analysis ${timing.analysisMs} ms in the worker, results ${timing.resultMs} ms after the record's end`,
      );
      // Recordings never leave the device: every request of the capture was for the site's own files.
      const sent = requests.filter((r) => !r.startsWith("GET ") || !new URL(r.slice(4)).hostname.startsWith("127.0.0.1"));
      assert.deepEqual(sent, [], "no request but the site's own files during the capture");
      assert.deepEqual(external, []);
      assert.doesNotMatch(await page.locator(".mb-bench").innerText(), BROKEN_NUMBER);
      assert.deepEqual(problems, []);
      await context.close();
    } finally {
      await micBrowser.close();
    }
  });

  test("a denied microphone says so, and a file can still be opened", { timeout: TEST_TIMEOUT_MS }, async () => {
    const deniedBrowser = await launch(["--use-fake-device-for-media-stream", "--deny-permission-prompts"]);
    try {
      const { context } = await isolatedContext(deniedBrowser);
      const { page } = await openPanel(context);
      await page.locator('[data-bench-action="mic-start"]').click();
      await page.waitForSelector(".mb-bench-status.mb-bench-error", { timeout: 10_000 });
      const message = await page.locator(".mb-bench-status").textContent();
      assert.match(message, /permission to use the microphone was denied/, message);
      assert.match(message, /opened as a file/);
      const rate = 8000;
      const samples = ringDown({ rate, seconds: 3, modes: [{ hz: 700, zeta: 0.004, amplitude: 0.4 }], taps: [0.2, 1.5], noise: 1e-3, seed: 5 });
      await page.locator("[data-bench-file]").setInputFiles({ name: "after-denial.wav", mimeType: "audio/wav", buffer: wav(samples, rate) });
      assertListed(await listed(page), [700], FILE_TOLERANCE, "file after a denied microphone");
      await context.close();
    } finally {
      await deniedBrowser.close();
    }
  });

  test("WAV and CSV files are analysed, matched with the predicted modes, kept as measured, reloaded and undone", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context } = await isolatedContext(browser);
    const { page, problems } = await openPanel(context);
    const f1 = await predicted(page, 1);
    const f2 = await predicted(page, 2);
    // The part as modelled, damped 2 %: what it rings at is f√(1 − ζ²). The taps are 3 s apart,
    // over four decay times of mode 1, as the worked tap-test page asks.
    const zeta = 0.02;
    const damped = [f1, f2].map((f) => f * Math.sqrt(1 - zeta * zeta));
    const rate = 8000;
    const samples = ringDown({
      rate,
      seconds: 9.3,
      modes: damped.map((hz, k) => ({ hz, zeta, amplitude: 0.4 / (k + 1) })),
      taps: [0.3, 3.3, 6.3],
      noise: 5e-4,
      seed: 23,
    });
    await page.locator("[data-bench-file]").setInputFiles({ name: "boom.wav", mimeType: "audio/wav", buffer: wav(samples, rate) });
    const peaks = await listed(page);
    assertListed(peaks, damped, FILE_TOLERANCE, "WAV file");
    const rows = await page.locator(".mb-bench-peaks tr[data-peak]").allInnerTexts();
    assert.ok(rows.some((r) => /\t1\t/.test(r)) && rows.some((r) => /\t2\t/.test(r)), `modes 1 and 2 matched: ${rows}`);
    assert.equal(await page.locator("svg.mb-bench-plot .mb-bench-predicted").count() >= 2, true, "predicted modes marked");

    // Kept as measured: one step, solved, shown beside the computed frequencies.
    await page.locator('[data-bench-action="keep"]').click();
    await page.waitForSelector('[data-field="measured[1].frequency"]', { timeout: 10_000 });
    await page.waitForFunction(() => !document.querySelector(".mb-calc").hasAttribute("data-solving"), null, { timeout: 10_000 });
    const kept = Number((await page.locator('[data-field="measured[0].frequency"]').inputValue()).replace(/\s*Hz$/, ""));
    // The measured undamped frequency is the model's own (to the fit's accuracy, five figures).
    assert.ok(Math.abs(kept / f1 - 1) < 1e-3, `mode 1 kept as ${kept} Hz against ${f1} Hz`);
    assert.match(await page.locator(".mb-calc").innerText(), /measured/i);
    assert.match(await page.locator("button.mb-undo").textContent(), /use the tap test's frequencies/);
    // Keeping them changes no predicted frequency, so the match shown is still the current one.
    assert.equal(await page.locator(".mb-bench-stale").count(), 0, "keeping the measured values left the match current");

    const measuredRow = '[data-field="measured[0].frequency"]';
    const gone = () => page.waitForFunction((sel) => !document.querySelector(sel), measuredRow, { timeout: 10_000 });
    const back = () => page.waitForSelector(measuredRow, { timeout: 10_000 });

    // "Undo" takes the step back; kept again, a reload keeps them with the case.
    await page.locator("button.mb-undo").click();
    await gone();
    await page.locator('[data-bench-action="keep"]').click();
    await back();
    await page.reload();
    await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 });
    await back();
    const reloaded = Number((await page.locator(measuredRow).inputValue()).replace(/\s*Hz$/, ""));
    assert.equal(reloaded, kept);

    // The panel clears them, and "Undo" brings them back.
    await page.locator(".mb-bench > summary").first().click();
    await page.locator('[data-bench-action="clear"]').click();
    await gone();
    assert.match(await page.locator("button.mb-undo").textContent(), /clear the measured frequencies/);
    await page.locator("button.mb-undo").click();
    await back();

    // A CSV of an accelerometer: a time column and one signal column, mode 1 only, at 500 Hz.
    const csvRate = 500;
    const slow = ringDown({ rate: csvRate, seconds: 12, modes: [{ hz: damped[0], zeta, amplitude: 2 }], taps: [0.5, 4.5, 8.5], noise: 2e-3, seed: 31 });
    const csv = ["time_s,accel_m_s2", ...Array.from(slow, (v, i) => `${(i / csvRate).toFixed(6)},${v.toFixed(6)}`)].join("\n");
    await page.locator("[data-bench-file]").setInputFiles({ name: "logger.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    assertListed(await listed(page), [damped[0]], FILE_TOLERANCE, "CSV file");

    // An input edited after the match: the panel says its predicted column is of the earlier results.
    const before = await predicted(page, 1);
    await page.locator('[data-field="attachments[0].mass"]').fill("3 kg");
    await page.waitForFunction(
      ([selector, old]) => Number(document.querySelector(selector)?.dataset.hz) !== old && !document.querySelector(".mb-calc").hasAttribute("data-solving"),
      [MODE(1), before],
      { timeout: 10_000 },
    );
    await page.waitForSelector(".mb-bench-stale", { timeout: 5000 });

    // A bad channel is named with what was typed and what is allowed.
    await page.locator("[data-bench-channel]").fill("second");
    await page.locator("[data-bench-file]").setInputFiles({ name: "logger.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await page.waitForSelector(".mb-bench-status.mb-bench-error", { timeout: 10_000 });
    assert.match(await page.locator(".mb-bench-status").textContent(), /Channel: "second" is not a channel number; type 1/);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("where the part was tapped and heard is typed with its unit, used in the match and kept across a reload", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context } = await isolatedContext(browser);
    const { page, problems } = await openPanel(context);
    const f1 = await predicted(page, 1);
    const zeta = 0.02;
    const rate = 8000;
    const record = wav(
      ringDown({ rate, seconds: 6.3, modes: [{ hz: f1 * Math.sqrt(1 - zeta * zeta), zeta, amplitude: 0.4 }], taps: [0.3, 3.3], noise: 5e-4, seed: 5 }),
      rate,
    );
    const open = async () => {
      await page.locator("[data-bench-file]").setInputFiles({ name: "boom.wav", mimeType: "audio/wav", buffer: record });
      await listed(page);
    };
    // A number alone is refused by name, with what was typed and what is allowed.
    await page.locator("[data-bench-tap-at]").fill("900");
    await open();
    assert.match(await page.locator(".mb-bench-status.mb-bench-error").textContent(), /Tapped at: "900" has no unit; .*from 0 to 1450 mm/);
    // With units, the match says where it took the tap and the microphone to be.
    await page.locator("[data-bench-tap-at]").fill("900 mm");
    await page.locator("[data-bench-sensor-at]").fill("1.4 m");
    await open();
    assert.match(await page.locator(".mb-bench-where").textContent(), /tapped at 900 mm and heard at 1400 mm from the left end/);
    // A reload keeps what was typed in the panel.
    await page.reload();
    await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 });
    await page.locator(".mb-bench > summary").first().click();
    await page.waitForSelector("[data-bench-tap-at]", { timeout: 10_000 });
    assert.equal(await page.locator("[data-bench-tap-at]").inputValue(), "900 mm");
    assert.equal(await page.locator("[data-bench-sensor-at]").inputValue(), "1.4 m");
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("the motion sensor's readings, at an uneven rate, give the part's low mode", { timeout: TEST_TIMEOUT_MS }, async () => {
    // A tablet fixed to the part reports its motion some 60 times a second, never exactly evenly.
    // The readings are made here as the browser would hand them to the page: `devicemotion`
    // events, each with its own time stamp (set on the event, so that twelve seconds of readings
    // need not take twelve seconds). Two taps on a 4.2 Hz mode with 2 % damping, and a little
    // noise; the damped frequency is f·√(1 − ζ²) (any vibrations textbook).
    const { context } = await isolatedContext(browser);
    const { page, problems } = await openPanel(context);
    await page.locator('[data-bench-action="motion-start"]').first().click();
    await page.waitForFunction(() => document.querySelector(".mb-bench")?.dataset.benchState === "motion");
    const mode = { hz: 4.2, zeta: 0.02 };
    await page.evaluate(({ hz, zeta }) => {
      let seed = 7;
      const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
      const start = performance.now();
      const sigma = zeta * 2 * Math.PI * hz;
      const damped = hz * Math.sqrt(1 - zeta * zeta);
      for (let t = 0; t < 12; t += (1 + 0.2 * (random() - 0.5)) / 60) {
        let z = 0.02 * (random() - 0.5);
        for (const t0 of [1, 6.5]) {
          if (t >= t0) z += 3 * Math.exp(-sigma * (t - t0)) * Math.cos(2 * Math.PI * damped * (t - t0));
        }
        const event = new DeviceMotionEvent("devicemotion", { acceleration: { x: 0, y: 0, z }, interval: 16 });
        Object.defineProperty(event, "timeStamp", { value: start + t * 1000 });
        window.dispatchEvent(event);
      }
    }, mode);
    await page.locator('[data-bench-action="motion-stop"]').first().click();
    const peaks = await listed(page);
    assertListed(peaks, [mode.hz * Math.sqrt(1 - mode.zeta ** 2)], 5e-3, "motion sensor");
    const text = await page.locator(".mb-bench").first().innerText();
    assert.match(text, /modes up to about/, "the panel says up to which frequency the sensor serves");
    assert.doesNotMatch(text, BROKEN_NUMBER);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("the tablet fixed to the part is added to the model as one step, and only with its units", { timeout: TEST_TIMEOUT_MS }, async () => {
    // A mass added where mode 1 moves lowers it (Rayleigh's quotient; any vibrations textbook).
    const { context } = await isolatedContext(browser);
    const { page, problems } = await openPanel(context);
    const masses = '[data-field^="attachments["][data-field$="].mass"]';
    const count = await page.locator(masses).count();
    const f1 = await predicted(page, 1);

    // A bare number is refused, not read in a unit the reader did not see.
    await page.locator("[data-bench-sensor-mass]").fill("480");
    await page.locator("[data-bench-sensor-position]").fill("1.2 m");
    await page.locator('[data-bench-action="add-sensor"]').click();
    assert.match(await page.locator(".mb-bench-status").textContent(), /each with its unit.*mass “480”/);
    assert.equal(await page.locator(masses).count(), count);

    await page.locator("[data-bench-sensor-mass]").fill("480 g");
    await page.locator('[data-bench-action="add-sensor"]').click();
    await page.waitForFunction(([sel, n]) => document.querySelectorAll(sel).length === n + 1, [masses, count], { timeout: 10_000 });
    await page.waitForFunction(
      ([selector, old]) => Number(document.querySelector(selector)?.dataset.hz) < old && !document.querySelector(".mb-calc").hasAttribute("data-solving"),
      [MODE(1), f1],
      { timeout: 10_000 },
    );
    assert.equal(await page.locator(masses).nth(count).inputValue(), "480 g");
    assert.match(await page.locator("button.mb-undo").textContent(), /add the tap test's sensor/);
    await page.locator("button.mb-undo").click();
    await page.waitForFunction(([sel, n]) => document.querySelectorAll(sel).length === n, [masses, count], { timeout: 10_000 });
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("the worked page's recording, opened in the panel at a tablet's size: four modes matched, no accessibility problem", { timeout: TEST_TIMEOUT_MS }, async () => {
    // axe-core is added as a script of the test's own, which the page's policy would block.
    const { context } = await isolatedContext(browser, { bypassCSP: true, viewport: { width: 768, height: 1024 } });
    const { page, problems } = await watchedPage(context);
    await page.goto(site.url + "tap-testing-the-boom.html");
    await page.waitForSelector('.mb-calc[data-live="true"]', { timeout: 10_000 });
    await page.locator(".mb-bench > summary").click();
    await page.locator("[data-bench-file]").setInputFiles(join(ROOT, "site", "assets", "boom-taps.wav"));
    await listed(page);
    // The page's table: modes 1–4 measured 4.5, 3.5, 2.5 and 2.0 % under the prediction (the
    // recording was made so; tests/tests/bench/page.rs keeps it and the page in step), so the
    // model is high by 1/(1 − d) − 1 of each measured frequency, as the calculator counts it.
    const differences = await page.locator(".mb-bench-peaks tr[data-peak] td[data-difference]").allInnerTexts();
    assert.deepEqual(differences, ["+4.71 %", "+3.63 %", "+2.56 %", "+2.04 %"]);
    // Each comparison sits in view beside its frequency at a tablet's width in portrait.
    const hidden = await page.evaluate(() => {
      const wrap = document.querySelector(".mb-bench-peaks").closest(".mb-table-wrap").getBoundingClientRect();
      return [...document.querySelectorAll(".mb-bench-peaks td[data-difference]")].filter((td) => td.getBoundingClientRect().right > wrap.right + 0.5).length;
    });
    assert.equal(hidden, 0, "every predicted − measured cell in view without scrolling sideways");
    const tapNotes = await page.locator(".mb-bench").innerText();
    assert.match(tapNotes, /1\.9\d* s[^\n]*struck while the part still rang/, "the second tap is the one named");
    assert.deepEqual(await axeProblems(page), []);
    assert.deepEqual(problems, []);
    await context.close();
  });

  test("a 10 s record at 48 kHz is analysed in the worker (time printed)", { timeout: TEST_TIMEOUT_MS }, async () => {
    const { context } = await isolatedContext(browser);
    const { page } = await openPanel(context);
    const rate = 48000;
    const samples = ringDown({
      rate,
      seconds: 10,
      modes: [
        { hz: 180, zeta: 0.01, amplitude: 0.3 },
        { hz: 1130, zeta: 0.004, amplitude: 0.2 },
        { hz: 3050, zeta: 0.002, amplitude: 0.1 },
      ],
      taps: [0.5, 3.5, 6.5],
      noise: 1e-3,
      seed: 3,
    });
    const file = { name: "ten-seconds.wav", mimeType: "audio/wav", buffer: wav(samples, rate) };
    const times = [];
    for (let run = 0; run < 5; run++) {
      await page.locator("[data-bench-file]").setInputFiles(file);
      assertListed(await listed(page), [180, 1130, 3050], FILE_TOLERANCE, "10 s record");
      times.push(Number(await page.locator(".mb-bench").getAttribute("data-analysis-ms")));
    }
    times.sort((a, b) => a - b);
    console.log(`10 s × 48 kHz WAV in the bench worker: median ${times[2]} ms (runs ${times.join(", ")} ms)`);
    await context.close();
  });
});
