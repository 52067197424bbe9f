//! The tap-test panel's engine: a recording (a file's bytes, the microphone's samples, the motion
//! sensor's timed values) analysed by the core's tap test, matched with the calculator's last
//! report, and drawn as the panel's results (`modebench_ui::render::bench`). It runs in the bench worker
//! (`site/assets/bench-worker.js`), never on the page's main thread; the page's engine only
//! receives the measured frequencies the reader chooses to keep.
//!
//! Plain Rust, tested natively; `entry.rs` binds it for the worker. What goes in and out is
//! JSON text, so that the worker's glue stays a few lines:
//! - in, the options: `{"source": "microphone"|"motion"|"file", "answer": "<the solving
//!   worker's answer for the report on show>", "channel": "<1-based, as typed>", "tap_at": "<where
//!   the part was tapped, from the left end, with its unit>", "sensor_at": "<where the microphone
//!   or sensor was>"}`, every key optional (a position left blank is where mode 1 moves most);
//! - out: `{"ok": true, "html": …, "measured": [{"mode": 2, "frequency": "14.236 Hz"}], "peaks":
//!   [Hz, …], "taps": n, "rate_hz": …}` or `{"ok": false, "message": …}`.

#[cfg(target_arch = "wasm32")]
pub mod entry;

use crate::worker::message;
use modebench::bench::{self, BenchOptions, BenchReport, Predicted, SourceKind};
use modebench::units::{self, is_bare_number, significant, Kind};
use modebench::{Error, Report};
use modebench_ui::render::bench as render;
use serde_json::{json, Value};

/// A recording as it reaches the engine.
pub enum Recording<'a> {
    /// A file's bytes: WAV, or CSV text (the core tells them apart).
    File(&'a [u8]),
    /// Samples at a uniform rate (Hz), as the microphone gave them.
    Samples(&'a [f32], f64),
    /// Values at the given times (s, increasing), as the motion sensor gave them.
    Timed(&'a [f64], &'a [f32]),
}

/// What the panel asked for, read from its options.
struct Asked {
    options: BenchOptions,
    /// Where the tap and the sensor were taken to be, in words, when the calculator had a
    /// prediction to match.
    matched_at: Option<String>,
}

/// Analyses a recording and returns the panel's answer as JSON text (see the module's head).
/// Every failure, of the options or of the recording, is an answer with a message.
pub fn analyse(recording: Recording, options: &str) -> String {
    let answer = match asked(options).and_then(|a| run(recording, a)) {
        Ok(value) => value,
        Err(message) => json!({ "ok": false, "message": message }),
    };
    answer.to_string()
}

fn run(recording: Recording, asked: Asked) -> Result<Value, String> {
    let report = match recording {
        Recording::File(bytes) => bench::analyse_file(bytes, &asked.options),
        Recording::Samples(samples, rate) => bench::analyse_samples(samples, rate, &asked.options),
        Recording::Timed(times, values) => bench::analyse_timed(times, values, &asked.options),
    }
    .map_err(|e| words(&e))?;
    Ok(json!({
        "ok": true,
        "html": render::results_html(&report, asked.matched_at.as_deref()),
        "measured": measured(&report),
        "peaks": report.peaks.iter().map(|p| p.frequency_hz).collect::<Vec<_>>(),
        "taps": report.taps.iter().filter(|t| t.used).count(),
        "rate_hz": report.sample_rate_hz,
    }))
}

/// The matched modes as rows of the scenario's `measured` list: the mode's number as the results
/// list it, and the measured undamped frequency (what the undamped model predicts), to five
/// significant figures, in hertz.
pub fn measured(report: &BenchReport) -> Vec<Value> {
    report
        .modes
        .iter()
        .filter_map(|m| {
            let hz = m.measured_hz.filter(|hz| hz.is_finite() && *hz > 0.0)?;
            Some(json!({ "mode": m.mode, "frequency": format!("{} Hz", significant(hz, 5)) }))
        })
        .collect()
}

/// A core error in words for the panel: what is wrong, where, and the value as it came.
fn words(error: &Error) -> String {
    let text = error.to_string();
    let mut chars = text.chars();
    match chars.next() {
        Some(first) => first.to_uppercase().chain(chars).collect(),
        None => "The recording could not be analysed.".to_string(),
    }
}

/// Reads the panel's options.
fn asked(text: &str) -> Result<Asked, String> {
    let value: Value =
        serde_json::from_str(text).map_err(|e| format!("The panel's options are not JSON: {e}"))?;
    let source = match value.get("source").and_then(Value::as_str).unwrap_or("file") {
        "microphone" => SourceKind::Microphone,
        "motion" => SourceKind::Motion,
        "file" => SourceKind::File,
        other => return Err(format!("Source: \"{other}\" is not one of microphone, motion, file.")),
    };
    let mut options = BenchOptions { source, ..BenchOptions::default() };
    if let Some(typed) = value.get("channel").and_then(Value::as_str).filter(|t| !t.trim().is_empty()) {
        options.channel = channel(typed)?;
    }
    let report = value.get("answer").and_then(Value::as_str).and_then(|a| message::read(a).ok());
    let mut matched_at = None;
    if let Some(report) = report {
        let tap = position(&value, "tap_at", "Tapped at", &report)?;
        let sensor = position(&value, "sensor_at", "Microphone or sensor at", &report)?;
        let predicted = Predicted::from_report(&report, tap, sensor);
        let place = |typed: Option<f64>, at: f64| {
            let shown = units::format(at, Kind::Length, report.units);
            if typed.is_some() {
                shown
            } else {
                format!("{shown} (where mode 1 moves most, as none was typed)")
            }
        };
        matched_at = Some(format!(
            "Matched with the part tapped at {} and heard at {} from the left end.",
            place(tap, predicted.tap_m),
            place(sensor, predicted.sensor_m)
        ));
        options.predicted = Some(predicted);
    }
    Ok(Asked { options, matched_at })
}

/// A position along the beam typed by the reader (`key` of the options, shown as `label`), in
/// metres: blank is none; it must carry its unit, so that a number is never read in a unit the
/// reader did not see, and lie on the beam.
fn position(value: &Value, key: &str, label: &str, report: &Report) -> Result<Option<f64>, String> {
    let Some(typed) = value.get(key).and_then(Value::as_str).map(str::trim).filter(|t| !t.is_empty()) else {
        return Ok(None);
    };
    let shown: String = typed.chars().take(60).collect();
    let length = units::format(report.beam.length, Kind::Length, report.units);
    let allowed = format!("type where it was along the beam from the left end, with its unit (e.g. 1.2 m or 47 in), from 0 to {length}");
    if is_bare_number(typed) {
        return Err(format!("{label}: \"{shown}\" has no unit; {allowed}."));
    }
    let at = units::parse(typed, Kind::Length)
        .map_err(|e| format!("{label}: \"{shown}\" is not a length ({}); {allowed}.", e.message))?
        .si;
    // A position typed to the beam's length in other units may land a rounding past its end.
    let slack = 1e-9 * report.beam.length;
    if !(at >= -slack && at <= report.beam.length + slack) {
        return Err(format!("{label}: \"{shown}\" is not on the beam; {allowed}."));
    }
    Ok(Some(at.clamp(0.0, report.beam.length)))
}

/// A channel typed by the reader: a whole number from 1, as the file counts them.
fn channel(typed: &str) -> Result<usize, String> {
    match typed.trim().parse::<usize>() {
        Ok(n) if n >= 1 => Ok(n - 1),
        _ => Err(format!(
            "Channel: \"{}\" is not a channel number; type 1 for the first channel (or the first signal column of a CSV file), 2 for the second, and so on.",
            typed.chars().take(60).collect::<String>()
        )),
    }
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests;
