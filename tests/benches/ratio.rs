//! The native side of WebAssembly ÷ native: the budget beam's two workloads (the exact method's
//! 10 modes; 200 finite elements, 10 modes), timed in batches as `tests/browser/ratio.mjs` times
//! them in the solver engine in Chromium.
//!
//! Two ways to run it:
//!
//! - on its own, `cargo bench -p modebench-tests --bench ratio`: each workload warmed by one
//!   batch, then 15 batches (`MODEBENCH_BATCHES` for another number; `MODEBENCH_ONLY=exact` or
//!   `=elements` for one workload, as for counting its instructions with callgrind), the median
//!   and the fastest batch per solve printed;
//! - as the native half of a paired run, `cargo bench -p modebench-tests --bench ratio --
//!   --serve`: it reads commands on stdin, one a line, `exact N` or `elements N`, runs that
//!   workload N times and answers each on stdout with `WORKLOAD N MICROSECONDS FOUND` (the
//!   batch's whole time, and the frequencies the last solve found); `quit` or the end of the
//!   input ends it. `ratio.mjs` starts it and alternates its batches with the browser's, so that
//!   both sides of each ratio are timed within a second of each other on a machine whose speed
//!   drifts over minutes.
//!
//! Each batch is timed by the monotonic clock around the whole batch, as the browser side times
//! its batches with `performance.now()`.

use modebench::fe::{self, Mesh};
use modebench::{exact, Model};
use std::hint::black_box;
use std::io::{BufRead, Write};
use std::time::Instant;

/// The workloads by the names both sides use: (key, what it is, batch size on its own).
const WORKLOADS: [(&str, &str, u32); 2] =
    [("exact", "exact, 10 modes", 400), ("elements", "finite elements, 200 elements, 10 modes", 60)];

fn solve(model: &Model, key: &str) -> Option<usize> {
    match key {
        "exact" => Some(exact::frequencies(black_box(model), 10).map_or(0, |f| f.len())),
        "elements" => {
            Some(fe::frequencies(black_box(model), 10, Mesh::Total(200)).map_or(0, |f| f.omegas.len()))
        }
        _ => None,
    }
}

/// Runs `key` `runs` times; the batch's time in microseconds and what the last solve found.
fn batch(model: &Model, key: &str, runs: u32) -> Option<(f64, usize)> {
    let start = Instant::now();
    let mut found = 0;
    for _ in 0..runs {
        found = black_box(solve(model, key)?);
    }
    Some((start.elapsed().as_secs_f64() * 1e6, found))
}

fn main() {
    let model: Model = modebench::model::budget_beam();
    if std::env::args().any(|a| a == "--serve") {
        serve(&model);
    } else {
        alone(&model);
    }
}

/// Answers `WORKLOAD N` lines until `quit` or the end of the input; an unknown line is answered
/// with `error` and the line, so the other side fails with it instead of waiting.
fn serve(model: &Model) {
    let stdin = std::io::stdin();
    let mut out = std::io::stdout().lock();
    for line in stdin.lock().lines() {
        let Ok(line) = line else { break };
        let line = line.trim();
        if line == "quit" {
            break;
        }
        let mut words = line.split_whitespace();
        let answer = match (words.next(), words.next().and_then(|n| n.parse::<u32>().ok())) {
            (Some(key), Some(runs)) => {
                batch(model, key, runs).map(|(micros, found)| format!("{key} {runs} {micros:.3} {found}"))
            }
            _ => None,
        };
        let answer = answer.unwrap_or_else(|| format!("error: not `exact N` or `elements N`: {line:?}"));
        if writeln!(out, "{answer}").and_then(|()| out.flush()).is_err() {
            break;
        }
    }
}

/// The workloads on their own: a few batches to warm up, then the timed ones.
fn alone(model: &Model) {
    let batches: usize = std::env::var("MODEBENCH_BATCHES").ok().and_then(|b| b.parse().ok()).unwrap_or(15);
    let only = std::env::var("MODEBENCH_ONLY").unwrap_or_default();
    for (key, name, runs) in WORKLOADS {
        if !only.is_empty() && only != key {
            continue;
        }
        let Some((_, found)) = batch(model, key, runs) else { unreachable!("{key} is a workload") };
        assert_eq!(found, 10, "{name}: 10 frequencies");
        let mut each: Vec<f64> = (0..batches)
            .filter_map(|_| batch(model, key, runs).map(|(micros, _)| micros / f64::from(runs)))
            .collect();
        each.sort_by(f64::total_cmp);
        println!(
            "native {name}: {:.1} µs (fastest batch {:.1} µs), median of {batches} batches of {runs}",
            each[batches / 2],
            each[0]
        );
    }
}
