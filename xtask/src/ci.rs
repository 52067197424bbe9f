//! `cargo xtask test`: exactly what CI runs, in the order that fails fastest — formatting,
//! lints, docs, native tests, the invariants that the core and the UI build for WebAssembly and
//! that each crate depends only on what it may (no web crate outside the binding), the
//! binding's tests in Node, the site build with the single file, and the browser tests.

use anyhow::{bail, Result};

use crate::engine::{self, TARGET};
use crate::layers;
use crate::project::{path_str, Project};
use crate::run;
use crate::server::Background;

/// Node's time limit for the browser tests, so that a test waiting on a page that never answers
/// fails instead of holding CI. Node 20's runner applies `--test-timeout` to each test file as a
/// whole (it stops the file's process and reports its unfinished tests as cancelled), not to each
/// test in it: ten minutes, where the longest file (`editor.test.mjs`, axe-core on every page at
/// both tablet sizes) took about two on a two-core machine loaded by other builds. Each file's
/// `after` hook closes its browser and servers whether its tests passed or not (`closeAll` in
/// `tests/browser/support.mjs`).
const BROWSER_TEST_TIMEOUT: &str = "--test-timeout=600000";

/// Runs every check; stops at the first failure.
pub(crate) fn run(project: &Project) -> Result<()> {
    run::step("Formatting");
    run::status(&mut project.cargo(["fmt", "--all", "--", "--check"]))?;

    run::step("Lints");
    run::status(&mut project.cargo(["clippy", "--workspace", "--all-targets", "--", "-D", "warnings"]))?;
    // The tap test's engine is a feature no workspace-wide command turns on: lint it natively.
    run::status(&mut project.cargo([
        "clippy",
        "-p",
        "modebench-web",
        "--features",
        "bench",
        "--all-targets",
        "--",
        "-D",
        "warnings",
    ]))?;
    // The widget and the JS API compile only for WebAssembly; lint them there, as the
    // integrators' build and as each of the three engines.
    let engines = engine::ENGINES.map(|e| ["--no-default-features", "--features", e.feature]);
    for features in [&[][..], &engines[0][..], &engines[1][..], &engines[2][..]] {
        let mut args = vec!["clippy", "-p", "modebench-web", "--target", TARGET, "--all-targets"];
        args.extend_from_slice(features);
        args.extend_from_slice(&["--", "-D", "warnings"]);
        run::status(&mut project.cargo(args))?;
    }

    run::step("Documentation");
    run::status(project.cargo(["doc", "--workspace", "--no-deps"]).env("RUSTDOCFLAGS", "-Dwarnings"))?;

    run::step("Native tests");
    // The reference-library checks (mpmath, scipy) must run here, not skip: the tools step
    // installed Python's packages.
    run::status(project.cargo(["test", "--workspace"]).env("MODEBENCH_REQUIRE_REFERENCE", "1"))?;
    // The tap test's engine (its options, positions and drawing), which the workspace's run
    // leaves out with its feature.
    run::status(&mut project.cargo([
        "test",
        "-p",
        "modebench-web",
        "--features",
        "bench",
        "--lib",
        "bench::",
    ]))?;

    run::step("The core and the UI build for WebAssembly; each crate depends only on what it may");
    run::status(&mut project.cargo(["check", "-p", "modebench", "-p", "modebench-ui", "--target", TARGET]))?;
    layers::check(project)?;

    run::step("Binding tests in Node (wasm-bindgen-test)");
    run::status(
        project
            .cargo(["test", "-p", "modebench-web", "--target", TARGET])
            .env("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER", "wasm-bindgen-test-runner"),
    )?;

    engine::build(project)?;
    let site = project.build_site()?;
    engine::bind_for_single_file(project)?;
    site.write_single_file(project)?;

    run::step("Browser tests (headless Chromium)");
    let server = Background::start(&site)?;
    let dir = project.browser_tests();
    let files = browser_test_files(&dir)?;
    run::status(
        run::cmd("node", ["--test", "--test-concurrency=1", BROWSER_TEST_TIMEOUT])
            .args(&files)
            .current_dir(&dir)
            .env("MODEBENCH_URL", &server.url)
            .env("MODEBENCH_DIST", &site.dist)
            .env("MODEBENCH_SINGLE_FILE", project.single_file())
            .env("MODEBENCH_SITE_BIN", path_str(&site.program)?),
    )?;
    drop(server);
    println!("\nAll checks passed.");
    Ok(())
}

/// The `*.test.mjs` files, named one by one so that Node runs exactly these.
fn browser_test_files(dir: &std::path::Path) -> Result<Vec<String>> {
    let mut files: Vec<String> = std::fs::read_dir(dir)?
        .filter_map(|e| e.ok()?.file_name().into_string().ok())
        .filter(|name| name.ends_with(".test.mjs"))
        .collect();
    files.sort();
    if files.is_empty() {
        bail!("no browser tests in {}", dir.display());
    }
    Ok(files)
}
