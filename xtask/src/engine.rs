//! The browser engine: `modebench-web` compiled to WebAssembly with the size-first `wasm`
//! profile, bound with wasm-bindgen for `--target web`, and shrunk by `wasm-opt -Oz` when
//! Debian's binaryen is installed.
//!
//! Pages get the widget alone (`--no-default-features`): the JS API for integrators (`solve`,
//! `parseQuantity`, the lists) is the crate's default `api` feature, tested by the
//! wasm-bindgen tests, and left out of what every page downloads.

use anyhow::{Context, Result};

use crate::project::{path_str, Project};
use crate::run;

/// The WebAssembly target.
pub(crate) const TARGET: &str = "wasm32-unknown-unknown";

/// Builds the engine into [`Project::engine_dir`].
///
/// wasm-opt runs on the compiler's output, before wasm-bindgen: the wasm-opt in Debian 12
/// (binaryen 108) rewrites the table of JavaScript references that wasm-bindgen adds, and the
/// engine then fails to start. Optimising first and binding second avoids that, and the binding
/// step adds only a little glue.
pub(crate) fn build(project: &Project) -> Result<()> {
    run::step("Build the browser engine (WebAssembly)");
    run::status(&mut project.cargo([
        "build",
        "-p",
        "modebench-web",
        "--target",
        TARGET,
        "--profile",
        "wasm",
        "--no-default-features",
    ]))?;
    let raw = project.target.join(TARGET).join("wasm").join("modebench_web.wasm");
    let out = project.engine_dir();
    let scratch = project.root.join("build").join("wasm-opt");
    for dir in [&out, &scratch] {
        if dir.exists() {
            std::fs::remove_dir_all(dir).with_context(|| format!("emptying {}", dir.display()))?;
        }
    }
    let input = match run::version("wasm-opt") {
        Some(_) => {
            std::fs::create_dir_all(&scratch)?;
            // wasm-bindgen names its output after its input, so the file keeps its name.
            let optimised = scratch.join("modebench_web.wasm");
            run::status(run::cmd("wasm-opt", ["-Oz", "--converge"]).arg(&raw).arg("-o").arg(&optimised))?;
            println!("wasm-opt -Oz: {} → {} bytes", size(&raw)?, size(&optimised)?);
            optimised
        }
        None => {
            println!("skipped: wasm-opt not found, so the engine is not shrunk; `apt-get install binaryen` provides it");
            raw
        }
    };
    run::status(
        run::cmd("wasm-bindgen", ["--target", "web", "--no-typescript", "--out-dir", path_str(&out)?])
            .arg(&input),
    )?;
    println!("engine: {} bytes", size(&out.join("modebench_web_bg.wasm"))?);
    Ok(())
}

fn size(path: &std::path::Path) -> Result<u64> {
    Ok(std::fs::metadata(path).with_context(|| format!("reading {}", path.display()))?.len())
}
