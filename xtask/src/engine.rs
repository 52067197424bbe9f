//! The browser engines: `modebench-web` compiled to WebAssembly twice with the size-first
//! `wasm` profile, bound with wasm-bindgen for `--target web`, and shrunk by `wasm-opt -Oz`
//! when Debian's binaryen is installed.
//!
//! A page loads two engines, and a third when the reader opens a tap-test panel. `modebench_page` (feature `page`) runs on the page's main thread:
//! the widget, the editor and the drawing of results. It never calls the solver, so the linker
//! leaves the solver out and the page downloads less before it is live. `modebench_solver`
//! (feature `solver`) runs in the calculator's Web Worker (`assets/solve-worker.js`): it solves,
//! and writes the results' markup that the page draws; the page loads a second copy once a
//! reader edits a model the worker found quick to solve, for that model's edits
//! (`assets/boot.js`).
//! `modebench_bench` (feature `bench`) runs in the bench worker (`assets/bench-worker.js`),
//! started only when a calculator's tap-test panel is opened: the core's signal analysis and
//! its readers, which neither of the others carries.
//! The JS API for integrators (`solve`, `parseQuantity`, the lists) is the crate's default
//! `api` feature, tested by the wasm-bindgen tests, and in neither.

use anyhow::{Context, Result};

use crate::project::{path_str, Project};
use crate::run;

/// The WebAssembly target.
pub(crate) const TARGET: &str = "wasm32-unknown-unknown";

/// One engine: the crate feature it is built with, the name of its files, and what it is
/// optimised for.
pub(crate) struct Engine {
    /// The `modebench-web` feature that decides what it exports.
    pub(crate) feature: &'static str,
    /// wasm-bindgen's `--out-name`: `NAME.js` and `NAME_bg.wasm`.
    pub(crate) name: &'static str,
    /// The cargo profile (see the workspace's Cargo.toml).
    pub(crate) profile: &'static str,
    /// wasm-opt's level: `-Oz` for size, `-O3` for speed.
    pub(crate) level: &'static str,
    /// wasm-opt's other options.
    pub(crate) options: &'static [&'static str],
}

/// wasm-opt's options beyond the level, for the page's and the solver's engines. By default
/// wasm-opt inlines every function that has one caller, whatever its size, which made the
/// worker's entry point one function of 126 KB (the whole solve) and two others of 53 and 44 KB.
/// The browser first runs an engine's code as compiled quickly, and compiles each function again,
/// optimised, once it is hot; it compiles on background threads, on the same cores as the page
/// and the worker. For those three functions that took 0.5, 0.16 and 0.1 s, while the reader
/// typed the first edits, and slowed them. A function of one caller is now inlined only up to
/// 300 of wasm-opt's size units (at 1000 the solve's own function was still 18 KB and took
/// 0.17 s; at 300 it is 6 KB), and the solver's largest function is the design study, 28 KB, as
/// the compiler made it; the small functions the numerical core's loops call are inlined as
/// before. The page's engine, whose answer-drawing functions the browser compiles again the same
/// way during the first edits, takes the same limit: its optimised compiling during 40 edits fell
/// from 104–128 to 95–102 ms, and the whole page gzipped is no larger (199.1–199.3 KB).
const INLINE_OPTIONS: &[&str] = &["--one-caller-inline-max-function-size", "300"];

/// wasm-bindgen's options beyond the target, for every engine: the `name` section it writes
/// (3.4 KB in the page's engine, names of its own generated glue functions only, since wasm-opt
/// has already dropped the compiler's) and the `producers` section (the tools' versions) are
/// left out. No browser reads either; an error's stack shows the same function numbers without
/// them.
const BIND_OPTIONS: &[&str] = &["--remove-name-section", "--remove-producers-section"];

/// The engines a page loads: its own, then its worker's, then the tap-test panel's.
pub(crate) const ENGINES: [Engine; 3] = [
    Engine {
        feature: "page",
        name: "modebench_page",
        profile: "wasm",
        level: "-Oz",
        options: INLINE_OPTIONS,
    },
    // The solver runs in a worker loaded after the page is live: its speed is what an edit
    // waits for, its size nothing the first view does.
    Engine {
        feature: "solver",
        name: "modebench_solver",
        profile: "wasm-solver",
        level: "-O3",
        options: INLINE_OPTIONS,
    },
    // The tap test's engine loads when its panel opens, while the reader sets up the part: its
    // size delays nothing else on the page, and built for size its analysis of a 10 s record
    // still stays within the budget docs/performance.md records, so it is built for size.
    Engine { feature: "bench", name: "modebench_bench", profile: "wasm", level: "-Oz", options: &[] },
];

/// Builds every engine into [`Project::engine_dir`].
pub(crate) fn build(project: &Project) -> Result<()> {
    let out = project.engine_dir();
    let scratch = project.root.join("build").join("wasm-opt");
    for dir in [&out, &scratch] {
        if dir.exists() {
            std::fs::remove_dir_all(dir).with_context(|| format!("emptying {}", dir.display()))?;
        }
    }
    std::fs::create_dir_all(&scratch)?;
    for engine in &ENGINES {
        build_one(project, engine, &scratch, &out)?;
    }
    for engine in &ENGINES {
        println!("{}: {} bytes", engine.name, size(&out.join(format!("{}_bg.wasm", engine.name)))?);
    }
    Ok(())
}

/// Binds both engines, as [`build`] left them optimised, a second time for wasm-bindgen's
/// `no-modules` target into [`Project::single_engine_dir`]: glue that defines one global and so
/// can sit inside the single-file build's inline script (`modebench-site single`).
pub(crate) fn bind_for_single_file(project: &Project) -> Result<()> {
    let out = project.single_engine_dir();
    if out.exists() {
        std::fs::remove_dir_all(&out).with_context(|| format!("emptying {}", out.display()))?;
    }
    let scratch = project.root.join("build").join("wasm-opt");
    for engine in &ENGINES {
        run::step(&format!("Bind {} for the single-file build (no-modules)", engine.name));
        run::status(
            run::cmd(
                "wasm-bindgen",
                [
                    "--target",
                    "no-modules",
                    "--no-typescript",
                    "--out-name",
                    engine.name,
                    "--out-dir",
                    path_str(&out)?,
                ],
            )
            .args(BIND_OPTIONS)
            .arg(scratch.join(format!("{}.wasm", engine.name))),
        )?;
    }
    Ok(())
}

/// Builds one engine.
///
/// wasm-opt runs on the compiler's output, before wasm-bindgen: the wasm-opt in Debian 12
/// (binaryen 108) rewrites the table of JavaScript references that wasm-bindgen adds, and the
/// engine then fails to start. Optimising first and binding second avoids that, and the binding
/// step adds only a little glue.
fn build_one(
    project: &Project,
    engine: &Engine,
    scratch: &std::path::Path,
    out: &std::path::Path,
) -> Result<()> {
    run::step(&format!(
        "Build the browser engine {} (WebAssembly, feature `{}`)",
        engine.name, engine.feature
    ));
    run::status(&mut project.cargo([
        "build",
        "-p",
        "modebench-web",
        "--target",
        TARGET,
        "--profile",
        engine.profile,
        "--no-default-features",
        "--features",
        engine.feature,
    ]))?;
    let raw = project.target.join(TARGET).join(engine.profile).join("modebench_web.wasm");
    // The next engine's build writes the same file, so each is taken out of cargo's folder first.
    let input = scratch.join(format!("{}.wasm", engine.name));
    match run::version("wasm-opt") {
        Some(_) => {
            run::status(
                run::cmd("wasm-opt", [engine.level, "--converge"])
                    .args(engine.options)
                    .arg(&raw)
                    .arg("-o")
                    .arg(&input),
            )?;
            println!("wasm-opt {}: {} → {} bytes", engine.level, size(&raw)?, size(&input)?);
        }
        None => {
            println!("skipped: wasm-opt not found, so the engine is not shrunk; `apt-get install binaryen` provides it");
            std::fs::copy(&raw, &input).with_context(|| format!("copying {}", raw.display()))?;
        }
    }
    run::status(
        run::cmd(
            "wasm-bindgen",
            ["--target", "web", "--no-typescript", "--out-name", engine.name, "--out-dir", path_str(out)?],
        )
        .args(BIND_OPTIONS)
        .arg(&input),
    )
}

/// The solver engine as [`build`] builds it, with the `timing` feature's exports (the native
/// benchmarks' two budget workloads) added, into `build/timing/`, for `cargo xtask ratio`. Its
/// size is printed but is not the shipped engine's.
pub(crate) fn build_timing(project: &Project) -> Result<std::path::PathBuf> {
    let out = project.root.join("build").join("timing");
    let scratch = out.join("wasm-opt");
    if out.exists() {
        std::fs::remove_dir_all(&out).with_context(|| format!("emptying {}", out.display()))?;
    }
    std::fs::create_dir_all(&scratch)?;
    let solver =
        ENGINES.iter().find(|e| e.feature == "solver").context("the solver engine is one of ENGINES")?;
    let timing = Engine {
        feature: "solver,timing",
        name: solver.name,
        profile: solver.profile,
        level: solver.level,
        options: solver.options,
    };
    build_one(project, &timing, &scratch, &out)?;
    println!(
        "{} with the timing exports: {} bytes",
        timing.name,
        size(&out.join(format!("{}_bg.wasm", timing.name)))?
    );
    Ok(out)
}

fn size(path: &std::path::Path) -> Result<u64> {
    Ok(std::fs::metadata(path).with_context(|| format!("reading {}", path.display()))?.len())
}
