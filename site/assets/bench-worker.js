// Analyses tap-test recordings off the page's main thread, with the tap test's own engine
// (`modebench_bench`), which only this worker loads, and only once a reader opens a tap-test
// panel. The page sends { id, kind, options, … } and receives { id, answer, ms } with the
// answer as JSON text ({"ok": true, "html": …, "measured": […]} or {"ok": false, "message": …}),
// or { id, failed } when the engine could not load. `ms` is how long the analysis took here.
//
//   kind "file":    { bytes: ArrayBuffer }               a WAV or CSV file as read
//   kind "samples": { samples: Float32Array, rate }      the microphone's record
//   kind "timed":   { times: Float64Array, values: Float32Array }   the motion sensor's
//
// A module worker from the site's own folder, so the pages' policy admits it and its imports.
// Nothing here sends anything anywhere: the recording stays in this browser.

import init, { analyseFile, analyseSamples, analyseTimed } from "./modebench_bench.js";

const ready = init();

let warmed = false;

function warmUp() {
  if (warmed) return;
  warmed = true;
  const rate = 8000;
  const samples = new Float32Array(rate / 2);
  for (let i = rate / 20; i < samples.length; i += 1) {
    const t = (i - rate / 20) / rate;
    samples[i] = Math.exp(-20 * t) * Math.sin(2 * Math.PI * 440 * t);
  }
  try {
    analyseSamples(samples, rate, JSON.stringify({ source: "microphone", channel: "" }));
  } catch {
    // Nothing to report: the first real record compiles the code instead.
  }
}

self.addEventListener("message", async (event) => {
  const { id, kind, options } = event.data;
  try {
    await ready;
  } catch (error) {
    self.postMessage({ id, failed: String(error) });
    return;
  }
  if (kind === "warm") {
    // The panel was opened: the engine is ready for its first record. One analysis of a short
    // made-up ring (half a second, one tap) runs the analysis's code once now, while the reader
    // sets up the part, so that the browser has compiled it before the first real record ends;
    // its answer is dropped.
    warmUp();
    self.postMessage({ id, ready: true });
    return;
  }
  const started = performance.now();
  let answer;
  if (kind === "file") {
    answer = analyseFile(new Uint8Array(event.data.bytes), options);
  } else if (kind === "samples") {
    answer = analyseSamples(event.data.samples, event.data.rate, options);
  } else if (kind === "timed") {
    answer = analyseTimed(event.data.times, event.data.values, options);
  } else {
    answer = JSON.stringify({ ok: false, message: `Unknown kind of recording: ${kind}` });
  }
  self.postMessage({ id, answer, ms: performance.now() - started });
});
