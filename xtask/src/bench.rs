//! `cargo xtask bench`: the engine's benchmarks, then the browser budgets measured on the
//! built site in headless Chromium.

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
