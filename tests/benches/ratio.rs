//! The native side of WebAssembly ÷ native, timed as `tests/browser/ratio.mjs` times the
//! WebAssembly side: the budget beam's two workloads (the exact method's 10 modes; 200 finite
//! elements, 10 modes) in batches of 200 and 40 solves, 15 batches after one to warm up, the
//! median and the fastest batch per solve printed. Run by `cargo xtask ratio` beside criterion's
//! figures (`--bench engine`): the fastest batch is the figure a shared machine's load moves
//! least, and it is taken the same way on both sides.
//!
//! `cargo bench -p modebench-tests --bench ratio` (`MODEBENCH_BATCHES` for another number of
//! batches; `MODEBENCH_ONLY=exact` or `=elements` for one workload, as for counting its
//! instructions with `perf stat`).

use modebench::fe::{self, Mesh};
use modebench::{exact, Model};
use std::hint::black_box;
use std::time::Instant;

fn main() {
    let model: Model = modebench_tests::models::budget_beam();
    let batches: usize = std::env::var("MODEBENCH_BATCHES").ok().and_then(|b| b.parse().ok()).unwrap_or(15);
    let only = std::env::var("MODEBENCH_ONLY").unwrap_or_default();
    let exact_run = || exact::frequencies(black_box(&model), 10).map_or(0, |f| f.len());
    let elements_run =
        || fe::frequencies(black_box(&model), 10, Mesh::Total(200)).map_or(0, |f| f.omegas.len());
    for (name, key, run, batch) in [
        ("exact, 10 modes", "exact", &exact_run as &dyn Fn() -> usize, 200u32),
        ("finite elements, 200 elements, 10 modes", "elements", &elements_run, 40),
    ] {
        if !only.is_empty() && only != key {
            continue;
        }
        let found = run();
        assert_eq!(found, 10, "{name}: 10 frequencies");
        for _ in 1..batch {
            black_box(run());
        }
        let mut each: Vec<f64> = (0..batches)
            .map(|_| {
                let start = Instant::now();
                for _ in 0..batch {
                    black_box(run());
                }
                start.elapsed().as_secs_f64() * 1e6 / f64::from(batch)
            })
            .collect();
        each.sort_by(f64::total_cmp);
        println!(
            "native {name}: {:.1} µs (fastest batch {:.1} µs), median of {batches} batches of {batch}",
            each[batches / 2],
            each[0]
        );
    }
}
