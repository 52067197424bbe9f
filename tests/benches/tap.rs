//! Speed of the tap test (printed by criterion; figures go in docs/performance.md): a 10 s record
//! at 48 kHz, mono, three modes struck four times, through the whole analysis (taps, spectra,
//! noise floor, peaks, fitted and half-power damping) — goal 20 ms; and the same record read from
//! a 16-bit WAV file, as the browser's panel reads it. Then the same steps in
//! numpy/scipy (`tests/python/tap_timing.py`) on the same samples, and the ratio.

use criterion::{criterion_group, criterion_main, Criterion};
use modebench::bench::{analyse_samples, analyse_wav, BenchOptions};
use modebench_tests::random::Rng;
use modebench_tests::ringdown::{self, Mode, Record};
use std::hint::black_box;

fn record() -> Record {
    let modes = [
        Mode { hz: 187.0, zeta: 0.004, amplitude: 0.5, phase: 0.3 },
        Mode { hz: 1043.0, zeta: 0.01, amplitude: 0.35, phase: -0.8 },
        Mode { hz: 2870.0, zeta: 0.006, amplitude: 0.25, phase: 2.1 },
    ];
    let taps = [(0.4, 1.0), (2.9, 0.9), (5.4, 0.95), (7.9, 0.85)];
    ringdown::record(&mut Rng::new(2026), 48_000.0, 10.0, &modes, &taps, 0.001, true)
}

fn tap_test(c: &mut Criterion) {
    let r = record();
    let options = BenchOptions::default();
    let report = analyse_samples(&r.samples, r.rate_hz, &options).expect("the benchmark record analyses");
    assert_eq!(report.peaks.len(), 3, "{:?}", report.peaks);
    c.bench_function("tap test, 10 s at 48 kHz, 4 taps, 3 modes", |b| {
        b.iter(|| analyse_samples(black_box(&r.samples), r.rate_hz, &options))
    });
    // The same record as the panel opens a file: a 16-bit WAV read twice (taps, then ring-downs).
    let file = ringdown::wav_int(&r.samples, 1, 48_000, 16);
    assert_eq!(analyse_wav(&file, &options).expect("the WAV analyses").peaks.len(), 3);
    c.bench_function("tap test, the same as a 16-bit WAV file", |b| {
        b.iter(|| analyse_wav(black_box(&file), &options))
    });
}

fn against_scipy(_: &mut Criterion) {
    let r = record();
    let options = BenchOptions::default();
    let runs = 7;
    let mut times: Vec<f64> = (0..runs)
        .map(|_| {
            let start = std::time::Instant::now();
            black_box(analyse_samples(&r.samples, r.rate_hz, &options).ok());
            start.elapsed().as_secs_f64()
        })
        .collect();
    times.sort_by(f64::total_cmp);
    let ours = times[runs / 2];
    let path = std::env::temp_dir().join(format!("modebench-tap-timing-{}.wav", std::process::id()));
    if std::fs::write(&path, ringdown::wav(&r.samples, 1, 48_000, true)).is_err() {
        println!("tap test: {:.2} ms (median of {runs}); could not write the record for scipy", ours * 1e3);
        return;
    }
    let input = serde_json::json!({ "wav": path.to_str(), "taps": r.taps.iter().map(|t| t.0).collect::<Vec<_>>(), "runs": runs });
    let scipy = modebench_tests::reference::run("tap_timing.py", &["numpy", "scipy"], &input.to_string());
    let _ = std::fs::remove_file(&path);
    let line = match scipy.and_then(|s| serde_json::from_str::<serde_json::Value>(&s).ok()) {
        Some(v) => {
            let s = v["seconds"].as_f64().unwrap_or(f64::NAN);
            format!("numpy/scipy {:.2} ms (peaks {}), ratio {:.2}", s * 1e3, v["peaks_hz"], ours / s)
        }
        None => "scipy not available".to_string(),
    };
    println!("tap test, 10 s at 48 kHz: {:.2} ms (median of {runs}); {line}", ours * 1e3);
}

criterion_group!(benches, tap_test, against_scipy);
criterion_main!(benches);
