//! The panel's engine natively: a synthetic ring-down of known modes analysed and matched with a
//! solved scenario, the rows it offers for the case's measured list, and the messages for bad
//! options and bad recordings.

use super::{analyse, Recording};
use crate::worker::message;
use modebench_tests::random::Rng;
use modebench_tests::ringdown::{self, Mode};
use serde_json::Value;

/// A record of `taps` taps 2 s apart, each ringing modes at the given damped frequencies (Hz)
/// with damping ratio `zeta` on top of what still rings, in a little seeded noise: the test kit's
/// synthetic ring-down, so the record is the same on every run.
fn ring_downs(modes: &[f64], zeta: f64, rate: f64, taps: usize) -> Vec<f32> {
    let modes: Vec<Mode> = modes
        .iter()
        .enumerate()
        .map(|(k, fd)| Mode {
            hz: fd / (1.0 - zeta * zeta).sqrt(),
            zeta,
            amplitude: 0.3 / (k + 1) as f64,
            phase: 0.4 * k as f64,
        })
        .collect();
    let struck: Vec<(f64, f64)> = (0..taps).map(|i| (0.3 + 2.0 * i as f64, 1.0)).collect();
    let seconds = 0.3 + 2.0 * taps as f64;
    ringdown::record(&mut Rng::new(0x5eed_1234), rate, seconds, &modes, &struck, 6e-5, false).samples
}

fn answer(text: &str) -> Value {
    serde_json::from_str(text).unwrap()
}

/// A cantilever of 1 m, EI = 1000 N·m², m = 1 kg/m: modes 1 and 2 at 17.7 and 110.9 Hz
/// (1.8751² and 4.6941² × √(EI/m)/(2πL²); Blevins, *Formulas for Natural Frequency and Mode
/// Shape*, table 8-1 — from memory). The solver's own values are used for the match.
const CANTILEVER: &str = r#"{"left": "clamped", "right": "free", "modes": 2,
    "segments": [{"length": "1 m", "flexural_rigidity": "1000 N*m^2", "mass_per_length": "1 kg/m"}]}"#;

#[test]
fn the_peaks_of_a_synthetic_record_are_its_frequencies_and_match_the_prediction() {
    let solved = message::solve(CANTILEVER);
    let report = message::read(&solved).unwrap();
    let predicted: Vec<f64> = report.modes.iter().map(|m| m.frequency_hz).collect();
    assert!((predicted[0] - 17.69).abs() < 0.05, "{predicted:?}");
    let zeta: f64 = 0.02;
    // The part rings at the model's frequencies, damped: f_d = f √(1 − ζ²) (a fact of the
    // damped oscillator's equation).
    let damped: Vec<f64> = predicted.iter().map(|f| f * (1.0 - zeta * zeta).sqrt()).collect();
    let rate = 8000.0;
    let samples = ring_downs(&damped, zeta, rate, 3);
    let options = serde_json::json!({ "source": "file", "answer": solved }).to_string();
    let out = answer(&analyse(Recording::Samples(&samples, rate), &options));
    assert_eq!(out["ok"], true, "{out}");
    let peaks: Vec<f64> = out["peaks"].as_array().unwrap().iter().map(|p| p.as_f64().unwrap()).collect();
    assert_eq!(peaks.len(), 2, "{peaks:?}");
    for (got, want) in peaks.iter().zip(&damped) {
        // The core's own check of synthetic records holds frequencies to 0.05 %.
        assert!((got / want - 1.0).abs() < 5e-4, "peak {got} Hz, signal {want} Hz");
    }
    let measured = out["measured"].as_array().unwrap();
    assert_eq!(measured.len(), 2, "{out}");
    for (row, (number, f)) in measured.iter().zip(report.modes.iter().map(|m| (m.number, m.frequency_hz))) {
        assert_eq!(row["mode"], number);
        let text = row["frequency"].as_str().unwrap();
        let hz: f64 = text.strip_suffix(" Hz").unwrap().parse().unwrap();
        // The measured undamped frequency is the model's, within the fit's accuracy and the
        // five figures written.
        assert!((hz / f - 1.0).abs() < 1e-3, "{text} against {f} Hz");
    }
    let html = out["html"].as_str().unwrap();
    assert!(html.contains("<svg class=\"mb-bench-plot\""), "{html}");
    assert_eq!(html.matches("class=\"mb-bench-predicted\"").count(), 2, "both predicted modes are marked");
    assert_eq!(html.matches("<tr data-peak=").count(), 2);
    assert!(!html.contains("NaN") && !html.contains("inf"), "{html}");
    assert!(!html.contains(" style="), "the page's policy blocks inline styles");
}

#[test]
fn without_a_prediction_the_table_says_so_and_offers_nothing_to_keep() {
    let samples = ring_downs(&[440.0], 0.005, 44100.0, 2);
    let out = answer(&analyse(Recording::Samples(&samples, 44100.0), r#"{"source": "microphone"}"#));
    assert_eq!(out["ok"], true, "{out}");
    assert_eq!(out["measured"].as_array().unwrap().len(), 0);
    assert!(out["html"].as_str().unwrap().contains("No predicted modes to match"));
}

#[test]
fn bad_options_and_bad_recordings_are_answered_with_a_message() {
    let wav = [b"RIFF".as_slice(), &[0u8; 8]].concat();
    for (recording, options, expected) in [
        (
            Recording::File(b"time,a\n0,1\n"),
            r#"{"channel": "two"}"#,
            "Channel: \"two\" is not a channel number",
        ),
        (Recording::File(b"time,a\n0,1\n"), r#"{"channel": "0"}"#, "Channel: \"0\""),
        (Recording::File(b"x"), r#"{"source": "radio"}"#, "Source: \"radio\""),
        (Recording::File(&wav), "{}", "WAV"),
        (Recording::Samples(&[0.0; 10], 0.0), "{}", "sample rate"),
        (Recording::Timed(&[0.0, 0.0], &[1.0, 2.0]), "{}", "do not increase"),
    ] {
        let out = answer(&analyse(recording, options));
        assert_eq!(out["ok"], false, "{out}");
        let message = out["message"].as_str().unwrap();
        assert!(message.contains(expected), "{message} should say {expected}");
    }
}

/// The second mode of a cantilever has its node at 0.7834 L from the clamp (Blevins, *Formulas
/// for Natural Frequency and Mode Shape*, table 8-1 — from memory). A record with mode 1 alone,
/// of a part tapped there, leaves mode 2 unmatched because of the tap, not for want of a peak.
#[test]
fn a_tap_typed_at_a_modes_node_says_why_that_mode_is_missing() {
    let solved = message::solve(CANTILEVER);
    let report = message::read(&solved).unwrap();
    let first = report.modes[0].frequency_hz;
    let samples = ring_downs(&[first * (1.0f64 - 4e-4).sqrt()], 0.02, 8000.0, 3);
    let run = |tap: &str| {
        let options = serde_json::json!({ "source": "file", "answer": solved, "tap_at": tap }).to_string();
        answer(&analyse(Recording::Samples(&samples, 8000.0), &options))
    };
    let at_node = run("78.34 cm");
    assert_eq!(at_node["ok"], true, "{at_node}");
    let html = at_node["html"].as_str().unwrap();
    assert!(html.contains("tapped at 78.34 cm") || html.contains("tapped at 0.7834 m"), "{html}");
    assert!(html.contains("node near the tap"), "{html}");
    let at_tip = run("");
    let html = at_tip["html"].as_str().unwrap();
    assert!(html.contains("where mode 1 moves most"), "{html}");
    assert!(!html.contains("node near the tap"), "{html}");
}

#[test]
fn a_tap_or_sensor_position_without_its_unit_or_off_the_beam_is_refused_by_name() {
    let solved = message::solve(CANTILEVER);
    let samples = ring_downs(&[17.7], 0.02, 8000.0, 1);
    for (key, typed, expected) in [
        ("tap_at", "0.5", "Tapped at: \"0.5\" has no unit"),
        ("sensor_at", "2 m", "Microphone or sensor at: \"2 m\" is not on the beam"),
        ("sensor_at", "-1 in", "Microphone or sensor at: \"-1 in\" is not on the beam"),
        ("tap_at", "half way", "Tapped at: \"half way\" is not a length"),
    ] {
        let options = serde_json::json!({ "source": "file", "answer": solved, key: typed }).to_string();
        let out = answer(&analyse(Recording::Samples(&samples, 8000.0), &options));
        assert_eq!(out["ok"], false, "{out}");
        let message = out["message"].as_str().unwrap();
        assert!(message.contains(expected), "{message} should say {expected}");
        assert!(message.contains("from 0 to 1 m"), "{message} should give the range");
    }
}
