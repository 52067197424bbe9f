//! The browser engine: `modebench-web` compiled to WebAssembly with the size-first `wasm`
//! profile, bound with wasm-bindgen for `--target web`, and shrunk by `wasm-opt -Os` when
//! Debian's binaryen is installed.

use anyhow::{Context, Result};

use crate::project::{path_str, Project};
use crate::run;

/// The WebAssembly target.
pub(crate) const TARGET: &str = "wasm32-unknown-unknown";

/// The features Rust's wasm32 target enables by default; wasm-opt must accept them, and
/// must not use any others.
const WASM_FEATURES: [&str; 6] = [
    "--enable-bulk-memory",
    "--enable-sign-ext",
    "--enable-mutable-globals",
    "--enable-nontrapping-float-to-int",
    "--enable-reference-types",
    "--enable-multivalue",
];

/// Builds the engine into [`Project::engine_dir`].
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
    ]))?;
    let raw = project.target.join(TARGET).join("wasm").join("modebench_web.wasm");
    let out = project.engine_dir();
    if out.exists() {
        std::fs::remove_dir_all(&out).with_context(|| format!("emptying {}", out.display()))?;
    }
    run::status(
        run::cmd("wasm-bindgen", ["--target", "web", "--no-typescript", "--out-dir", path_str(&out)?])
            .arg(&raw),
    )?;
    let wasm = out.join("modebench_web_bg.wasm");
    let before = size(&wasm)?;
    if run::version("wasm-opt").is_some() {
        let optimised = out.join("modebench_web_bg.opt.wasm");
        run::status(run::cmd("wasm-opt", ["-Os"]).args(WASM_FEATURES).arg(&wasm).arg("-o").arg(&optimised))?;
        std::fs::rename(&optimised, &wasm)?;
        println!("wasm-opt -Os: {} → {} bytes", before, size(&wasm)?);
    } else {
        println!(
            "wasm-opt not found, so the engine is not shrunk ({before} bytes); `apt-get install binaryen` \
             provides it"
        );
    }
    Ok(())
}

fn size(path: &std::path::Path) -> Result<u64> {
    Ok(std::fs::metadata(path).with_context(|| format!("reading {}", path.display()))?.len())
}
