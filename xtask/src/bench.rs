//! `cargo xtask bench`: the engine's benchmarks, then the browser budgets measured on the
//! built site in headless Chromium. `cargo xtask ratio`: the two budget workloads natively and in
//! the solver engine in Chromium, their batches alternating, for WebAssembly ÷ native.

use anyhow::Result;

use crate::engine;
use crate::project::{path_str, Project};
use crate::run;
use crate::server::Background;

/// Runs the benchmarks and prints the budget figures.
pub(crate) fn run(project: &Project) -> Result<()> {
    run::step("Engine benchmarks");
    run::status(&mut project.cargo(["bench", "-p", "modebench-tests"]))?;

    engine::build(project)?;
    let site = project.build_site()?;

    run::step("Browser budgets");
    let server = Background::start(&site)?;
    run::status(
        run::cmd("node", ["budgets.mjs"])
            .current_dir(project.browser_tests())
            .env("MODEBENCH_URL", &server.url)
            .env("MODEBENCH_DIST", path_str(&site.dist)?)
            .env("MODEBENCH_ENGINE", project.engine_dir()),
    )
}

/// How many times `ratio` runs criterion and then the paired run: criterion's figures are
/// printed beside the pairs' as a check on the native side, and a shared machine's speed drifts
/// between rounds.
const RATIO_ROUNDS: usize = 3;

/// Builds the solver engine with the timing exports and the native ratio bench, then, in each
/// round, criterion's figures for the two budget workloads and the paired run:
/// `tests/browser/ratio.mjs` loads that engine in headless Chromium, starts the native bench
/// (`--bench ratio -- --serve`) beside it, and alternates their batches, printing the median of
/// the pairs' ratios and each side's figures (docs/performance.md records them).
pub(crate) fn ratio(project: &Project) -> Result<()> {
    let timing = engine::build_timing(project)?;
    run::step("Build the native ratio bench");
    run::status(&mut project.cargo(["bench", "--no-run", "-p", "modebench-tests", "--bench", "ratio"]))?;
    for round in 1..=RATIO_ROUNDS {
        run::step(&format!("Round {round} of {RATIO_ROUNDS}: native (criterion)"));
        run::status(&mut project.cargo([
            "bench",
            "-p",
            "modebench-tests",
            "--bench",
            "engine",
            "--",
            "--warm-up-time",
            "1",
            "--measurement-time",
            "3",
            "exact frequencies|finite elements",
        ]))?;
        run::step(&format!("Round {round} of {RATIO_ROUNDS}: native and WebAssembly in Chromium, in pairs"));
        run::status(
            run::cmd("node", ["ratio.mjs"])
                .current_dir(project.browser_tests())
                .env("MODEBENCH_TIMING_ENGINE", &timing),
        )?;
    }
    Ok(())
}
