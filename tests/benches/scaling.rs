//! The engine at scale, printed as figures for docs/performance.md (a bench binary, not a timed
//! test): the exact solve of the budget beam, how the exact solve grows with the number of
//! attachments, and the banded finite-element solver against scipy's sparse eigensolver (eigsh,
//! shift-invert) on the same matrices in the same run.
//!
//! `cargo bench -p modebench-tests --bench scaling`

use modebench::fe::{self, Mesh};
use modebench::{exact, Model};
use modebench_tests::models;
use serde_json::json;
use std::hint::black_box;
use std::time::Instant;

/// Median and fastest seconds of `runs` calls. On a shared machine the median moves with the
/// load; the fastest run is one the scheduler did not interrupt, and moves far less.
fn time(runs: usize, mut f: impl FnMut()) -> (f64, f64) {
    f();
    let mut t: Vec<f64> = (0..runs)
        .map(|_| {
            let start = Instant::now();
            f();
            start.elapsed().as_secs_f64()
        })
        .collect();
    t.sort_by(f64::total_cmp);
    (t[runs / 2], t[0])
}

fn beam(n: usize) -> Model {
    models::pinned_span_with_equal_masses(n, 1.0, 0.0)
}

fn main() {
    let budget = models::budget_beam();
    let (t, fastest) = time(301, || {
        black_box(exact::frequencies(black_box(&budget), 10).expect("solves"));
    });
    println!(
        "exact, 10 modes, budget beam: {:.1} µs (median of 301), fastest {:.1} µs",
        t * 1e6,
        fastest * 1e6
    );

    let mut points = Vec::new();
    for n in [10, 100, 1000] {
        let model = beam(n);
        let (t, fastest) = time(31, || {
            black_box(exact::frequencies(black_box(&model), 10).expect("solves"));
        });
        println!(
            "exact, 10 modes, pinned beam with {n} masses: {:.3} ms (median of 31), fastest {:.3} ms",
            t * 1e3,
            fastest * 1e3
        );
        points.push((n as f64, t, fastest));
    }
    let exponent = |a: f64, b: f64| (b / a).ln() / (points[2].0 / points[1].0).ln();
    println!(
        "growth from 100 to 1000 attachments: exponent {:.2} (medians), {:.2} (fastest runs)",
        exponent(points[1].1, points[2].1),
        exponent(points[1].2, points[2].2)
    );

    for elements in [200, 1000] {
        let (t, fastest) = time(31, || {
            black_box(fe::frequencies(black_box(&budget), 10, Mesh::Total(elements)).expect("solves"));
        });
        let (k, m) = fe::matrices(&budget, Mesh::Total(elements)).expect("assembles");
        let n = k.nrows();
        let triplets = |a: &nalgebra::DMatrix<f64>| -> Vec<serde_json::Value> {
            let mut out = Vec::new();
            for i in 0..n {
                for j in 0..n {
                    if a[(i, j)] != 0.0 {
                        out.push(json!([i, j, a[(i, j)]]));
                    }
                }
            }
            out
        };
        let input = json!({ "k": triplets(&k), "m": triplets(&m), "n": n, "count": 10, "runs": 31 });
        let scipy =
            modebench_tests::reference::run("eigsh_timing.py", &["numpy", "scipy"], &input.to_string());
        let line = match scipy.and_then(|s| serde_json::from_str::<serde_json::Value>(&s).ok()) {
            Some(v) => {
                let s = v["seconds"].as_f64().unwrap_or(f64::NAN);
                let f = v["fastest"].as_f64().unwrap_or(f64::NAN);
                format!(
                    "scipy eigsh {:.3} ms, fastest {:.3} ms; ratio {:.2} (medians), {:.2} (fastest runs)",
                    s * 1e3,
                    f * 1e3,
                    t / s,
                    fastest / f
                )
            }
            None => "scipy not available".to_string(),
        };
        println!(
            "FE, {elements} elements ({n} unknowns), 10 modes: {:.3} ms (median of 31), fastest {:.3} ms; {line}",
            t * 1e3,
            fastest * 1e3
        );
    }
}
