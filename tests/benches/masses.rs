//! A beam carrying thousands of point masses, printed as figures for docs/performance.md (a bench
//! binary, not a timed test): the time and the growth of the process's peak memory of Dunkerley's
//! sum, of the other parts of a solve, and of the whole report, for 2,000 and 10,000 masses.
//!
//! Each figure of memory is the growth of the peak resident set (`VmHWM`, Linux) over the peak
//! before that step; the steps run from the smallest to the largest, so a step that needed more
//! than any before it shows by how much.
//!
//! `cargo bench -p modebench-tests --bench masses`

use modebench::{bounds, exact, Model};
use modebench_tests::models;
use serde_json::json;
use std::hint::black_box;
use std::time::Instant;

/// The process's peak resident set, kB (Linux); 0 elsewhere.
fn peak_kb() -> u64 {
    let status = std::fs::read_to_string("/proc/self/status").unwrap_or_default();
    let line = status.lines().find(|l| l.starts_with("VmHWM:")).unwrap_or_default();
    line.split_whitespace().nth(1).and_then(|kb| kb.parse().ok()).unwrap_or(0)
}

/// The fastest of `runs` calls, in seconds, and by how much the peak memory grew meanwhile, kB.
fn measure(runs: usize, mut f: impl FnMut()) -> (f64, u64) {
    let before = peak_kb();
    let fastest = (0..runs)
        .map(|_| {
            let start = Instant::now();
            f();
            start.elapsed().as_secs_f64()
        })
        .fold(f64::INFINITY, f64::min);
    (fastest, peak_kb().saturating_sub(before))
}

/// A pinned unit beam with `n` equal masses spread evenly, together as heavy as the beam.
fn model(n: usize) -> Model {
    models::pinned_span_with_equal_masses(n, 1.0, 1e-4)
}

/// The same beam as a scenario, for the whole report.
fn scenario(n: usize) -> String {
    let masses: Vec<_> = (0..n)
        .map(|i| {
            json!({
                "type": "mass",
                "position": (i as f64 + 0.5) / n as f64,
                "mass": 1.0 / n as f64,
                "rotary_inertia": 1e-4 / n as f64
            })
        })
        .collect();
    json!({
        "left": "pinned",
        "right": "pinned",
        "segments": [{ "length": 1, "flexural_rigidity": 1, "mass_per_length": 1 }],
        "attachments": masses
    })
    .to_string()
}

fn main() {
    const SIZES: [usize; 2] = [2_000, 10_000];
    let runs = |n: usize| if n > 5_000 { 5 } else { 11 };
    println!("peak resident set at the start: {} kB", peak_kb());
    // Dunkerley's sum first, so that its growth is measured against the smallest peak.
    for n in SIZES {
        let model = model(n);
        let (t, kb) = measure(runs(n), || {
            black_box(bounds::dunkerley(black_box(&model)).expect("solves"));
        });
        println!(
            "{n} masses, Dunkerley's sum: {:.2} ms (fastest of {}), peak grew {kb} kB to {} kB",
            t * 1e3,
            runs(n),
            peak_kb()
        );
    }
    for n in SIZES {
        let model = model(n);
        let (t, kb) = measure(runs(n), || {
            black_box(exact::frequencies(black_box(&model), 6).expect("solves"));
        });
        println!(
            "{n} masses, exact, 6 modes: {:.1} ms (fastest of {}), peak grew {kb} kB to {} kB",
            t * 1e3,
            runs(n),
            peak_kb()
        );
    }
    for n in SIZES {
        let text = scenario(n);
        let (t, kb) = measure(3, || {
            black_box(modebench::solve_json(black_box(&text)).expect("solves"));
        });
        println!(
            "{n} masses, the whole report: {:.0} ms (fastest of 3), peak grew {kb} kB to {} kB",
            t * 1e3,
            peak_kb()
        );
    }
}
