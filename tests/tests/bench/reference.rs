//! The tap test against scipy (`tests/python/tap_reference.py`): ring-downs synthesised by numpy,
//! written by scipy.io.wavfile (32-bit float and 16-bit PCM) and Python's csv module, read back
//! here; and the same signals' modes read by scipy.signal (periodogram and find_peaks for the
//! frequencies, a band-pass and hilbert's envelope for the damping).
//!
//! Asserted: the files round-trip (the three files give the same peaks, within 10⁻⁵ for the
//! float and CSV files, the 16-bit file's rounding allowed 10⁻⁴); every peak scipy finds is
//! found here and no other, ours within 0.05 % of the true damped frequency and the two agreeing
//! within 0.05 % or a quarter of the peak's half-power half-width ζ·f, whichever is larger (the
//! maximum of a periodogram of a heavily damped peak is pulled by its neighbours' skirts and its
//! negative-frequency image: 0.2 % at ζ = 2 % here); the damping agrees with scipy's envelope reading within 15 % (a
//! straight line through a band-passed envelope is the rougher of the two), and is within 5 % of
//! the true value.

use modebench::bench::{analyse_file, BenchOptions, BenchReport};
use modebench_tests::reference;
use serde_json::json;

fn cases() -> serde_json::Value {
    json!([
        { "id": "two-modes-48k", "rate": 48000, "seconds": 4.0, "noise": 0.001, "seed": 1,
          "modes": [[412.0, 0.006, 0.6, 0.4], [1375.0, 0.01, 0.4, -1.2]],
          "taps": [[0.2, 1.0], [1.5, 0.8], [2.8, 0.9]] },
        { "id": "three-modes-44k", "rate": 44100, "seconds": 3.0, "noise": 0.0005, "seed": 2,
          "modes": [[236.0, 0.012, 0.5, 2.0], [655.0, 0.005, 0.3, 0.1], [1820.0, 0.02, 0.4, -2.2]],
          "taps": [[0.15, 0.9], [1.6, 1.0]] },
        { "id": "logger-2k", "rate": 2000, "seconds": 6.0, "noise": 0.002, "seed": 3,
          "modes": [[31.5, 0.015, 0.8, 0.0], [148.0, 0.008, 0.3, 1.0]],
          "taps": [[0.5, 1.0]] }
    ])
}

fn case_of<'a>(id: &str, all: &'a serde_json::Value) -> &'a serde_json::Value {
    all.as_array().unwrap().iter().find(|c| c["id"] == id).unwrap()
}

fn read(path: &str) -> BenchReport {
    let bytes = std::fs::read(path).unwrap_or_else(|e| panic!("{path}: {e}"));
    analyse_file(&bytes, &BenchOptions::default()).unwrap_or_else(|e| panic!("{path}: {e}"))
}

#[test]
fn files_written_by_scipy_and_python_csv_agree_with_scipy_signal() {
    let dir = std::env::temp_dir().join(format!("modebench-tap-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let all = cases();
    let input = json!({ "dir": dir.to_str().unwrap(), "cases": all }).to_string();
    let Some(out) = reference::run("tap_reference.py", &["numpy", "scipy"], &input) else { return };
    let out: serde_json::Value = serde_json::from_str(&out).unwrap();
    for (id, got) in out.as_object().unwrap() {
        let case = case_of(id, &all);
        let float = read(got["wav_float"].as_str().unwrap());
        let pcm = read(got["wav_pcm16"].as_str().unwrap());
        let csv = read(got["csv"].as_str().unwrap());
        // Round trips: the three files give the same peaks.
        for (name, other, tol) in [("16-bit WAV", &pcm, 1e-4), ("CSV", &csv, 1e-5)] {
            assert_eq!(other.peaks.len(), float.peaks.len(), "{id}: {name}");
            for (a, b) in float.peaks.iter().zip(&other.peaks) {
                assert!(
                    (a.frequency_hz / b.frequency_hz - 1.0).abs() < tol,
                    "{id}: {name} {} vs {}",
                    b.frequency_hz,
                    a.frequency_hz
                );
            }
        }
        let scipy_hz: Vec<f64> =
            got["peaks_hz"].as_array().unwrap().iter().map(|v| v.as_f64().unwrap()).collect();
        let scipy_zeta: Vec<Option<f64>> =
            got["zeta"].as_array().unwrap().iter().map(|v| v.as_f64()).collect();
        assert_eq!(
            float.peaks.len(),
            scipy_hz.len(),
            "{id}: ours {:?}, scipy's {scipy_hz:?}",
            float.peaks.iter().map(|p| p.frequency_hz).collect::<Vec<_>>()
        );
        for ((p, hz), zeta) in float.peaks.iter().zip(&scipy_hz).zip(&scipy_zeta) {
            let mode = case["modes"]
                .as_array()
                .unwrap()
                .iter()
                .find(|m| (m[0].as_f64().unwrap() / hz - 1.0).abs() < 0.01)
                .unwrap_or_else(|| panic!("{id}: scipy's {hz} Hz is no mode"));
            let (f, z) = (mode[0].as_f64().unwrap(), mode[1].as_f64().unwrap());
            let damped = f * (1.0 - z * z).sqrt();
            let agree = (0.25 * z).max(5e-4);
            assert!(
                (p.frequency_hz / hz - 1.0).abs() < agree,
                "{id}: {} Hz here, {hz} Hz by scipy",
                p.frequency_hz
            );
            assert!(
                (p.frequency_hz / damped - 1.0).abs() < 5e-4,
                "{id}: {} Hz, truly {damped}",
                p.frequency_hz
            );
            let ours = p.damping_fit.unwrap_or_else(|| panic!("{id}: no fit at {hz} Hz"));
            assert!((ours / z - 1.0).abs() < 0.05, "{id}: ζ {ours}, truly {z}");
            let theirs = zeta.unwrap_or_else(|| panic!("{id}: scipy read no damping at {hz} Hz"));
            assert!((ours / theirs - 1.0).abs() < 0.15, "{id}: ζ {ours} here, {theirs} by scipy's envelope");
        }
        eprintln!("{id}: {} peaks agree with scipy", scipy_hz.len());
    }
    let _ = std::fs::remove_dir_all(&dir);
}
