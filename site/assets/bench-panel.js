// The tap-test panel under each live calculator: record the part ringing with the microphone or
// the motion sensor, or open a recording (WAV or CSV), and see its measured frequencies and
// damping beside the calculator's predicted modes; then keep them in the case as its measured
// frequencies.
//
// What runs where:
// - This module (main thread) builds the panel, reads the microphone through an AudioWorklet
//   (`bench-capture.js`) or the motion sensor through `devicemotion`, and shows what comes back.
//   It computes nothing.
// - The analysis, and the drawing of its results, run in a module worker (`bench-worker.js`)
//   with the tap test's own engine, created the first time a panel is opened, so that a page
//   whose reader never opens one downloads nothing more.
// - The matched frequencies go to the calculator as a `modebench-measured` event on its root
//   (detail: the JSON text of the scenario's `measured` rows); the page's engine keeps them as
//   one step of the case that "Undo" takes back. The calculator leaves the solving worker's
//   answer for the report on show on its root as `modebenchAnswer`, and the panel hands it to
//   the worker so that the peaks are matched with the predicted modes.
//
// Recordings never leave the device: they go from the microphone, sensor or file to the worker
// and nowhere else, and are not stored.
//
// Longer than 400 lines on purpose: the panel is one class whose methods share one recording's
// state (the source running and how to stop it, the answer its peaks were matched with, the rows
// to keep), and a second module would be a second request, made only after this one is read,
// when a reader opens a panel at the bench.

const LONGEST_S = 60; // a microphone or sensor record stops by itself after this long
const LARGEST_FILE_BYTES = 200_000_000; // the core reads no larger file (bench::MAX_BYTES)
const NO_MOTION_MS = 1500; // no sensor event in this long: the device reports no motion
const ANSWER_WAIT_MS = 5000; // the longest a recording waits for the calculator's first results

let worker = null;
let nextId = 1;
const waiting = new Map();

// The bench worker, started on first use; each request gets its answer by id.
function analyse(message, transfer = []) {
  if (!worker) {
    worker = new Worker(new URL("bench-worker.js", import.meta.url), { type: "module" });
    worker.addEventListener("message", (event) => {
      const done = waiting.get(event.data.id);
      waiting.delete(event.data.id);
      if (done) done(event.data);
    });
    worker.addEventListener("error", () => {
      for (const done of waiting.values()) done({ failed: "the tap test's engine stopped" });
      waiting.clear();
      worker = null;
    });
  }
  const id = nextId++;
  return new Promise((resolve) => {
    waiting.set(id, resolve);
    worker.postMessage({ id, ...message }, transfer);
  });
}

function element(tag, attributes = {}, text = "") {
  const e = document.createElement(tag);
  for (const [name, value] of Object.entries(attributes)) e.setAttribute(name, value);
  if (text) e.textContent = text;
  return e;
}

function button(text, action) {
  return element("button", { type: "button", class: "mb-button", "data-bench-action": action }, text);
}

// The caution, above the controls that start a record: it is read before the part is tapped.
function caution() {
  const p = element("p", { class: "mb-caution mb-bench-caution" });
  p.append(
    element("strong", {}, "Take care."),
    " Keep clear of rotating or energised parts while tapping: stop and isolate the machine first. A tap test " +
      "checks the model; it does not replace the acceptance test of the applicable code, and where resonance " +
      "could cause a fatigue failure a qualified engineer must judge the result.",
  );
  return p;
}

// The panel's markup, built once per calculator.
function build(index) {
  const panel = element("details", { class: "mb-bench", "data-bench-for": String(index) });
  panel.append(element("summary", {}, "Tap test: measure this part's frequencies"));
  const body = element("div", { class: "mb-bench-body" });
  body.append(
    element(
      "p",
      { class: "mb-note" },
      "Tap the part lightly a few times, a second or two apart, and record its ring-down with this " +
        "tablet's microphone (held a few centimetres from the part) or its motion sensor (the tablet " +
        "fixed to the part), or open a recording. The peaks found are set beside the predicted modes above.",
    ),
    caution(),
    element(
      "p",
      { class: "mb-bench-private" },
      "Recordings never leave this device: they are analysed in this browser, sent nowhere and not stored.",
    ),
  );
  // Where the part was tapped and heard: a mode with a node at either may be missing from the
  // record, and the match says so instead of pairing it with a neighbour's peak.
  const where = element("fieldset", { class: "mb-bench-source mb-bench-where-fields" });
  where.append(element("legend", {}, "Where, from the left end (blank: where mode 1 moves most)"));
  const tapAt = element("label", {}, "Tapped at ");
  tapAt.append(element("input", { type: "text", size: "8", placeholder: "e.g. 0.9 m", "data-bench-tap-at": "" }));
  const heardAt = element("label", {}, "Microphone or sensor at ");
  heardAt.append(element("input", { type: "text", size: "8", placeholder: "e.g. 1.2 m", "data-bench-sensor-at": "" }));
  where.append(tapAt, heardAt);
  body.append(where);
  const sources = element("div", { class: "mb-bench-sources" });
  const mic = element("fieldset", { class: "mb-bench-source", "data-source": "microphone" });
  mic.append(element("legend", {}, "Microphone"));
  const meterLabel = element("label", { class: "mb-bench-meter" }, "Level ");
  meterLabel.append(element("meter", { min: "0", max: "1", value: "0", low: "0.05", high: "0.9", optimum: "0.5" }));
  mic.append(button("Start recording", "mic-start"), button("Stop and analyse", "mic-stop"), meterLabel);
  const motion = element("fieldset", { class: "mb-bench-source", "data-source": "motion" });
  motion.append(
    element("legend", {}, "Motion sensor"),
    button("Start the motion sensor", "motion-start"),
    button("Stop and analyse", "motion-stop"),
    element(
      "p",
      { class: "mb-note" },
      "For low modes only: browsers report motion some 20 to 60 times a second, which serves modes up to " +
        "about 8 to 24 Hz. The panel says the limit once the sensor runs. A tablet fixed to the part adds its mass:",
    ),
  );
  const sensorMass = element("label", {}, "Its mass ");
  sensorMass.append(element("input", { type: "text", size: "8", placeholder: "e.g. 480 g", "data-bench-sensor-mass": "" }));
  const sensorAt = element("label", {}, "at, from the left end ");
  sensorAt.append(element("input", { type: "text", size: "8", placeholder: "e.g. 1.2 m", "data-bench-sensor-position": "" }));
  motion.append(sensorMass, sensorAt, button("Add it to the model", "add-sensor"));
  const file = element("fieldset", { class: "mb-bench-source", "data-source": "file" });
  const pick = element("label", {}, "Recording (WAV, or CSV: a time column and signal columns) ");
  pick.append(element("input", { type: "file", accept: ".wav,.csv,.txt,.tsv,audio/wav,text/csv", "data-bench-file": "" }));
  const channel = element("label", {}, "Channel ");
  channel.append(element("input", { type: "text", inputmode: "numeric", size: "3", value: "1", "data-bench-channel": "" }));
  file.append(element("legend", {}, "File"), pick, channel);
  sources.append(mic, motion, file);
  body.append(sources);
  body.append(element("p", { class: "mb-bench-status", role: "status", "aria-live": "polite" }));
  body.append(element("div", { class: "mb-bench-results" }));
  const keep = element("p", { class: "mb-bench-keep" });
  keep.append(button("Use as measured", "keep"), button("Clear the case's measured frequencies", "clear"));
  body.append(keep);
  panel.append(body);
  return panel;
}

class Panel {
  constructor(root, index) {
    this.root = root;
    this.panel = build(index);
    root.after(this.panel);
    this.status = this.panel.querySelector(".mb-bench-status");
    this.results = this.panel.querySelector(".mb-bench-results");
    this.meter = this.panel.querySelector("meter");
    this.measured = [];
    this.capture = null;
    this.setState("idle");
    this.panel.addEventListener("toggle", () => {
      // The engine is fetched as the panel opens, so that a record's results come at once.
      if (this.panel.open) analyse({ kind: "warm" });
    });
    this.panel.addEventListener("click", (event) => {
      const action = event.target.closest("[data-bench-action]")?.dataset.benchAction;
      if (action) this.act(action);
    });
    this.panel.querySelector("[data-bench-file]").addEventListener("change", (event) => this.openFile(event.target));
    this.keepTyped(index);
    // When the calculator's predicted frequencies change after a recording was matched with them
    // (an input edited), the match shown is out of date: say so rather than leave it standing.
    this.matchedWith = null;
    new MutationObserver(() => this.checkMatch()).observe(root, { attributes: true, attributeFilter: ["data-solving"] });
  }

  // What the reader types in the panel (positions, the sensor's mass, the channel) is kept in
  // this browser for this page's calculator, so that a reload loses none of it. Storage that
  // is refused (a private window, a full quota) only means nothing is kept.
  keepTyped(index) {
    const key = `modebench-bench:${location.pathname}:${index}`;
    const fields = [...this.panel.querySelectorAll('input[type="text"]')];
    let saved = {};
    try {
      saved = JSON.parse(localStorage.getItem(key) ?? "{}") ?? {};
    } catch {
      saved = {};
    }
    const name = (input) => Object.keys(input.dataset)[0];
    for (const input of fields) {
      if (typeof saved[name(input)] === "string") input.value = saved[name(input)];
    }
    this.panel.addEventListener("input", (event) => {
      if (!fields.includes(event.target)) return;
      const values = Object.fromEntries(fields.map((input) => [name(input), input.value]));
      try {
        localStorage.setItem(key, JSON.stringify(values));
      } catch {
        // Nothing kept: the fields still work for this visit.
      }
    });
  }

  checkMatch() {
    if (this.root.hasAttribute("data-solving") || !this.matchedWith || !this.results.firstChild) return;
    const now = predictedHz(this.root.modebenchAnswer);
    const same =
      now &&
      now.length === this.matchedWith.length &&
      now.every((hz, i) => Math.abs(hz - this.matchedWith[i]) <= 1e-9 * Math.abs(hz));
    let note = this.results.querySelector(".mb-bench-stale");
    if (same) {
      note?.remove();
    } else if (!note) {
      note = element(
        "p",
        { class: "mb-bench-stale", role: "status" },
        "The calculator's results have changed since this recording was matched with them: the " +
          "“Predicted” and difference columns below are of the earlier results. Open or record it " +
          "again to match the new ones.",
      );
      this.results.prepend(note);
    }
  }

  // Which buttons are live: "idle", "microphone" or "motion" (recording), "busy" (analysing).
  setState(state) {
    this.state = state;
    this.panel.dataset.benchState = state;
    const live = {
      "mic-start": state === "idle",
      "mic-stop": state === "microphone",
      "motion-start": state === "idle",
      "motion-stop": state === "motion",
      keep: state === "idle" && this.measured.length > 0,
      clear: state === "idle",
      "add-sensor": state === "idle",
    };
    for (const [action, on] of Object.entries(live)) {
      this.panel.querySelector(`[data-bench-action="${action}"]`).disabled = !on;
    }
  }

  say(text, error = false) {
    this.status.textContent = text;
    this.status.classList.toggle("mb-bench-error", error);
  }

  act(action) {
    if (action === "mic-start") this.startMicrophone();
    else if (action === "mic-stop" || action === "motion-stop") this.stop();
    else if (action === "motion-start") this.startMotion();
    else if (action === "keep") this.keep(this.measured);
    else if (action === "clear") this.keep([]);
    else if (action === "add-sensor") this.addSensor();
  }

  // Adds the tablet or sensor fixed to the part to the model as a point mass, as typed: both
  // values must carry their unit, so that nothing typed here is read in a unit the reader did not
  // see. A value the calculator refuses shows as an error on the new attachment's field.
  addSensor() {
    const mass = this.panel.querySelector("[data-bench-sensor-mass]").value.trim();
    const position = this.panel.querySelector("[data-bench-sensor-position]").value.trim();
    const hasUnit = (text) => /[0-9.]\s*[^\d\s.,eE+-]/.test(text) || /[a-df-zA-DF-Z"']/.test(text);
    if (!mass || !position || !hasUnit(mass) || !hasUnit(position)) {
      this.say(
        `To add the sensor, type its mass and where it sits from the left end, each with its unit ` +
          `(e.g. 480 g at 1.2 m); got mass “${mass}”, position “${position}”.`,
        true,
      );
      return;
    }
    const row = { type: "mass", label: "tablet or sensor fixed for the tap test", position, mass };
    this.root.dispatchEvent(new CustomEvent("modebench-attach", { detail: JSON.stringify(row) }));
    this.say(
      `Added to the model as a point mass of ${mass} at ${position}: the predicted modes above are now of the ` +
        "part as tested. “Undo” at the top of the calculator takes this back.",
    );
  }

  keep(rows) {
    this.root.dispatchEvent(new CustomEvent("modebench-measured", { detail: JSON.stringify(rows) }));
    this.say(
      rows.length
        ? `Kept in the case as measured frequencies (mode ${rows.map((r) => r.mode).join(", ")}): the results above ` +
            "show them beside the computed ones. “Undo” at the top of the calculator takes this back."
        : "The case's measured frequencies are cleared. “Undo” at the top of the calculator puts them back.",
    );
  }

  // The analysis's options, with the calculator's latest results to match the peaks against. A
  // recording opened while the calculator's first results are still on their way waits for them
  // (a few seconds at most), so that its peaks are not left unmatched.
  async options(source) {
    const channel = this.panel.querySelector("[data-bench-channel]").value;
    const deadline = performance.now() + ANSWER_WAIT_MS;
    while (typeof this.root.modebenchAnswer !== "string" && performance.now() < deadline) {
      await new Promise((done) => setTimeout(done, 100));
    }
    const answer = typeof this.root.modebenchAnswer === "string" ? this.root.modebenchAnswer : undefined;
    this.matchedWith = predictedHz(answer);
    const tap_at = this.panel.querySelector("[data-bench-tap-at]").value;
    const sensor_at = this.panel.querySelector("[data-bench-sensor-at]").value;
    return JSON.stringify({ source, channel: source === "file" ? channel : "", answer, tap_at, sensor_at });
  }

  async startMicrophone() {
    if (!window.isSecureContext || !navigator.mediaDevices?.getUserMedia || typeof AudioWorkletNode === "undefined") {
      this.say(
        "The microphone cannot be used here: browsers offer it only to pages opened over https or from this " +
          "computer, and only where audio capture is supported. Open a recording instead (File, below).",
        true,
      );
      return;
    }
    this.setState("busy");
    this.say("Asking for the microphone…");
    let stream;
    try {
      // The browser's voice processing would reshape the decay that gives the damping.
      stream = await navigator.mediaDevices.getUserMedia({
        audio: { echoCancellation: false, noiseSuppression: false, autoGainControl: false },
        video: false,
      });
    } catch (error) {
      this.setState("idle");
      const why =
        error.name === "NotAllowedError" || error.name === "SecurityError"
          ? "permission to use the microphone was denied. Allow it in the browser's settings for this site and press Start again"
          : error.name === "NotFoundError" || error.name === "OverconstrainedError"
            ? "no microphone was found on this device"
            : `the browser could not start it (${error.name})`;
      this.say(`The microphone is not recording: ${why}. A recording can still be opened as a file (below).`, true);
      return;
    }
    try {
      const context = new AudioContext();
      await context.audioWorklet.addModule(new URL("bench-capture.js", import.meta.url));
      const source = context.createMediaStreamSource(stream);
      const node = new AudioWorkletNode(context, "modebench-bench-capture", { numberOfInputs: 1, numberOfOutputs: 1 });
      const blocks = [];
      let length = 0;
      const limit = Math.round(LONGEST_S * context.sampleRate);
      node.port.onmessage = (event) => {
        if (length >= limit) return;
        blocks.push(event.data.block);
        length += event.data.block.length;
        this.meter.value = event.data.peak;
        if (length >= limit) this.stop(`The record reached ${LONGEST_S} s and was stopped.`);
      };
      // The processor writes nothing to its output: the destination only keeps it running.
      source.connect(node).connect(context.destination);
      await context.resume();
      this.capture = { kind: "microphone", stream, context, blocks, length: () => length };
      this.setState("microphone");
      this.say(
        `Recording at ${context.sampleRate} Hz. Tap the part now, a few times, a second or two apart; ` +
          "then press “Stop and analyse”.",
      );
    } catch (error) {
      for (const track of stream.getTracks()) track.stop();
      this.setState("idle");
      this.say(`The microphone could not be read (${error.name}: ${error.message}). Open a recording instead.`, true);
    }
  }

  async startMotion() {
    if (!window.isSecureContext || typeof DeviceMotionEvent === "undefined") {
      this.say(
        "This browser offers no motion sensor to this page (it needs a page opened over https or from this " +
          "computer, and a device with one). Open a recording instead (File, below).",
        true,
      );
      return;
    }
    if (typeof DeviceMotionEvent.requestPermission === "function") {
      // Some tablets ask the reader first, and only from a tap like this one.
      let answer = "denied";
      try {
        answer = await DeviceMotionEvent.requestPermission();
      } catch {
        answer = "denied";
      }
      if (answer !== "granted") {
        this.say("Permission to read the motion sensor was denied. A recording can still be opened as a file (below).", true);
        return;
      }
    }
    const times = [];
    const values = [];
    const listener = (event) => {
      // Across the screen's plane (the tablet lies on the part); gravity, where included, is a
      // constant that the analysis's spectrum does not mistake for a mode.
      const z = event.acceleration?.z ?? event.accelerationIncludingGravity?.z;
      if (typeof z !== "number" || !Number.isFinite(z)) return;
      times.push(event.timeStamp / 1000);
      values.push(z);
      if (times.length === 50) {
        const rate = (times.length - 1) / (times[times.length - 1] - times[0]);
        // The limit the analysis gives afterwards too: 40 % of the rate, above which it warns that a
        // peak lies too near half the rate to be read well (core's `NEAR_NYQUIST`).
        this.say(
          `The motion sensor reports about ${Math.round(rate)} times a second: modes up to about ` +
            `${Math.round(0.4 * rate)} Hz can be measured. Tap the part now; then press “Stop and analyse”.`,
        );
      }
      if (times.length > 0 && times[times.length - 1] - times[0] > LONGEST_S) {
        this.stop(`The record reached ${LONGEST_S} s and was stopped.`);
      }
    };
    window.addEventListener("devicemotion", listener);
    const quiet = setTimeout(() => {
      if (this.capture?.kind === "motion" && times.length === 0) {
        this.capture.end();
        this.capture = null;
        this.setState("idle");
        this.say("This device reported no motion: it has no sensor, or the browser keeps it from this page. Open a recording instead.", true);
      }
    }, NO_MOTION_MS);
    this.capture = {
      kind: "motion",
      times,
      values,
      end: () => {
        clearTimeout(quiet);
        window.removeEventListener("devicemotion", listener);
      },
    };
    this.setState("motion");
    this.say("Starting the motion sensor…");
  }

  // Ends the record under way and analyses it.
  async stop(note = "") {
    const capture = this.capture;
    if (!capture) return;
    this.capture = null;
    this.setState("busy");
    const ended = performance.now();
    if (capture.kind === "microphone") {
      for (const track of capture.stream.getTracks()) track.stop();
      const rate = capture.context.sampleRate;
      await capture.context.close();
      const samples = new Float32Array(capture.length());
      let at = 0;
      for (const block of capture.blocks) {
        samples.set(block.subarray(0, samples.length - at), at);
        at += block.length;
        if (at >= samples.length) break;
      }
      this.meter.value = 0;
      await this.show(
        analyse({ kind: "samples", samples, rate, options: await this.options("microphone") }, [samples.buffer]),
        ended,
        note,
      );
    } else {
      capture.end();
      const times = Float64Array.from(capture.times);
      const values = Float32Array.from(capture.values);
      await this.show(
        analyse({ kind: "timed", times, values, options: await this.options("motion") }, [times.buffer, values.buffer]),
        ended,
        note,
      );
    }
  }

  async openFile(input) {
    const file = input.files?.[0];
    if (!file || this.state !== "idle") return;
    if (file.size > LARGEST_FILE_BYTES) {
      this.say(`The file “${file.name}” is ${Math.round(file.size / 1e6)} MB; at most 200 MB can be analysed.`, true);
      return;
    }
    this.setState("busy");
    this.say(`Reading “${file.name}”…`);
    let bytes;
    try {
      bytes = await file.arrayBuffer();
    } catch (error) {
      this.setState("idle");
      this.say(`The file “${file.name}” could not be read (${error.name}).`, true);
      return;
    }
    await this.show(analyse({ kind: "file", bytes, options: await this.options("file") }, [bytes]), performance.now(), "", file.name);
    // The same file may be opened again after a change of channel.
    input.value = "";
  }

  async show(pending, ended, note, name = "") {
    this.say("Analysing…");
    const reply = await pending;
    this.measured = [];
    if (reply.failed) {
      this.results.replaceChildren();
      this.say(`The tap test's engine could not start (${reply.failed}); try reloading the page.`, true);
    } else {
      const answer = JSON.parse(reply.answer);
      if (answer.ok) {
        this.results.innerHTML = answer.html;
        this.measured = answer.measured;
        const waited = performance.now() - ended;
        this.panel.dataset.analysisMs = reply.ms.toFixed(1);
        this.panel.dataset.resultMs = waited.toFixed(1);
        const matched = answer.measured.length
          ? `${answer.measured.length} matched with predicted modes: “Use as measured” keeps them in the case.`
          : "None matched a predicted mode.";
        this.say(
          `${name ? `“${name}”: ` : ""}${answer.peaks.length} peak${answer.peaks.length === 1 ? "" : "s"} found; ${matched} ${note}`.trim(),
        );
      } else {
        this.results.replaceChildren();
        this.say(`${name ? `“${name}”: ` : ""}${answer.message}`, true);
      }
    }
    this.setState("idle");
  }
}

// The predicted frequencies (Hz) of a calculator's answer as the solving worker gave it, or null.
function predictedHz(answer) {
  try {
    const modes = JSON.parse(answer).report?.modes;
    return Array.isArray(modes) ? modes.map((m) => m.frequency_hz) : null;
  } catch {
    return null;
  }
}

// Adds a tap-test panel under every live calculator that has none.
// A closed panel that the page's boot script put there (a summary only, until this script has
// loaded) is replaced by the whole panel; the one the reader opened opens, with the focus kept
// on its summary.
export function attachPanels() {
  const panels = [];
  document.querySelectorAll(".mb-calc[data-modebench]").forEach((root, index) => {
    const placed = root.nextElementSibling?.classList.contains("mb-bench") ? root.nextElementSibling : null;
    if (placed?.querySelector(".mb-bench-body")) return;
    const opened = placed?.open ?? false;
    const focused = placed?.contains(document.activeElement) ?? false;
    placed?.remove();
    const panel = new Panel(root, index);
    if (opened) panel.panel.open = true;
    if (focused) panel.panel.querySelector("summary").focus();
    panels.push(panel);
  });
  return panels.length;
}
