//! The long fuzz run: a million seeded generated scenarios (`modebench_tests::fuzz`) on two
//! threads, in an optimised build with a one-second limit per case; prints its counts. Set
//! `MODEBENCH_FUZZ_CASES` for another number of cases.

use modebench_tests::fuzz;
use std::time::{Duration, Instant};

const SEED: u64 = 0x6D6F_6465_6265_6E63;
/// Cases between two progress lines of a thread.
const SLICE: u64 = 25_000;

fn main() {
    let cases: u64 =
        std::env::var("MODEBENCH_FUZZ_CASES").ok().and_then(|v| v.parse().ok()).unwrap_or(1_000_000);
    let threads = 2u64;
    let share = cases.div_ceil(threads);
    let started = Instant::now();
    let runs: Vec<_> = (0..threads)
        .map(|t| {
            let first = t * share;
            let count = share.min(cases.saturating_sub(first));
            std::thread::spawn(move || {
                // In slices, each followed by a line of counts on stderr: a run of half an hour
                // or more on a shared machine shows how far it got, even if it is stopped.
                let mut counts = fuzz::Counts::default();
                let mut done = 0;
                while done < count {
                    let slice = SLICE.min(count - done);
                    counts.add(&fuzz::run(SEED, first + done, slice, Duration::from_secs(1))?);
                    done += slice;
                    eprintln!(
                        "thread {t}: cases {first}..{} done after {:.0} s: {counts:?}",
                        first + done,
                        started.elapsed().as_secs_f64()
                    );
                }
                Ok::<_, String>(counts)
            })
        })
        .collect();
    let mut counts = fuzz::Counts::default();
    let mut failed = false;
    for run in runs {
        match run.join().expect("the run's thread does not panic") {
            Ok(c) => counts.add(&c),
            Err(failure) => {
                eprintln!("FAILED {failure}");
                failed = true;
            }
        }
    }
    println!(
        "fuzz: {} cases in {:.1} s: {} solved, {} refused, {} compared with FE ({} modes), slowest {} µs",
        counts.cases,
        started.elapsed().as_secs_f64(),
        counts.solved,
        counts.refused,
        counts.compared,
        counts.modes_compared,
        counts.slowest_us
    );
    if failed {
        std::process::exit(1);
    }
}
