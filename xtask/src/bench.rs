//! `cargo xtask bench`: the engine's benchmarks, then the browser budgets measured on the
//! built site in headless Chromium. `cargo xtask ratio`: the two budget workloads natively and in
//! the solver engine in Chromium, in turns, for WebAssembly ÷ native.

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

/// How many times `ratio` runs the native benchmarks and then Chromium, in turn: a shared
/// machine's load moves both figures, and turns put the two sides of each ratio in one window.
const RATIO_ROUNDS: usize = 3;

/// Builds the solver engine with the timing exports, then runs the native benchmarks of the two
/// budget workloads (criterion's, and `--bench ratio`, which times batches as the browser side
/// does) and the same workloads in that engine in headless Chromium, in turns; both print their
/// figures (docs/performance.md records them).
pub(crate) fn ratio(project: &Project) -> Result<()> {
    let timing = engine::build_timing(project)?;
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
        run::status(&mut project.cargo(["bench", "-p", "modebench-tests", "--bench", "ratio"]))?;
        run::step(&format!("Round {round} of {RATIO_ROUNDS}: WebAssembly in Chromium"));
        run::status(
            run::cmd("node", ["ratio.mjs"])
                .current_dir(project.browser_tests())
                .env("MODEBENCH_TIMING_ENGINE", &timing),
        )?;
    }
    Ok(())
}
