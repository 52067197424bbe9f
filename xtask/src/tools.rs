//! Installs what the commands need and is missing, saying what it installs: the WebAssembly
//! target, wasm-bindgen-cli at the version in `Cargo.lock`, the Python reference libraries,
//! Chromium, poppler's `pdftotext` (the print test reads the printed sheet with it), and the
//! browser-test packages.

use anyhow::{bail, Context, Result};

use crate::engine::TARGET;
use crate::project::Project;
use crate::run;

/// Which groups of tools a command needs.
#[derive(Clone, Copy)]
pub(crate) struct Needs {
    engine: bool,
    python: bool,
    browser: bool,
}

impl Needs {
    /// Building the engine and the site.
    pub(crate) const ENGINE: Needs = Needs { engine: true, python: false, browser: false };
    /// Building, and driving the site in Chromium.
    pub(crate) const BROWSER: Needs = Needs { engine: true, python: false, browser: true };
    /// Everything CI runs.
    pub(crate) const ALL: Needs = Needs { engine: true, python: true, browser: true };
}

/// Installs what `needs` asks for and is missing.
pub(crate) fn ensure(project: &Project, needs: Needs) -> Result<()> {
    run::step("Tools");
    if needs.engine {
        wasm_target()?;
        wasm_bindgen(project)?;
        wasm_opt(needs.browser)?;
    }
    if needs.python {
        python()?;
    }
    if needs.browser {
        chromium()?;
        pdftotext()?;
        npm(project)?;
    }
    Ok(())
}

fn wasm_target() -> Result<()> {
    let out = run::output(&mut run::cmd("rustup", ["target", "list", "--installed"]))?;
    if String::from_utf8_lossy(&out.stdout).lines().any(|l| l.trim() == TARGET) {
        println!("ok: Rust target {TARGET}");
        return Ok(());
    }
    println!("installing: Rust target {TARGET}");
    run::status(&mut run::cmd("rustup", ["target", "add", TARGET]))
}

/// wasm-bindgen-cli must match the wasm-bindgen library exactly, or the bindings it writes do
/// not fit the compiled engine.
fn wasm_bindgen(project: &Project) -> Result<()> {
    let wanted = wasm_bindgen_version(project)?;
    let found = run::version("wasm-bindgen");
    if found.as_deref().is_some_and(|v| v.split_whitespace().nth(1) == Some(wanted.as_str())) {
        println!("ok: wasm-bindgen {wanted}");
        return Ok(());
    }
    println!(
        "installing: wasm-bindgen-cli {wanted} (found {}); this compiles for several minutes",
        found.unwrap_or_else(|| "none".into())
    );
    let locked = run::status(&mut run::cmd(
        "cargo",
        ["install", "--locked", "wasm-bindgen-cli", "--version", &wanted],
    ));
    if locked.is_ok() {
        return Ok(());
    }
    // The tool's own lock file can name a dependency version the registry no longer serves (it
    // happened with webpki-roots); the tool's version, which is what must match, stays exact.
    println!("retrying: wasm-bindgen-cli {wanted} without its lock file, which names a dependency the registry lacks");
    run::status(&mut run::cmd("cargo", ["install", "wasm-bindgen-cli", "--version", &wanted]))
}

/// The wasm-bindgen version in `Cargo.lock`, or else the exact version pinned in the
/// workspace manifest (before any crate uses it, the lock file does not list it).
fn wasm_bindgen_version(project: &Project) -> Result<String> {
    let lock = std::fs::read_to_string(project.root.join("Cargo.lock")).context("reading Cargo.lock")?;
    let mut lines = lock.lines();
    while let Some(line) = lines.next() {
        if line.trim() == "name = \"wasm-bindgen\"" {
            if let Some(version) = lines.next().and_then(|l| l.trim().strip_prefix("version = ")) {
                return Ok(version.trim_matches('"').to_string());
            }
        }
    }
    let manifest = std::fs::read_to_string(project.root.join("Cargo.toml")).context("reading Cargo.toml")?;
    manifest
        .lines()
        .find_map(|l| l.trim().strip_prefix("wasm-bindgen = \"="))
        .map(|v| v.trim_end_matches('"').to_string())
        .context("no wasm-bindgen version in Cargo.lock or in Cargo.toml's workspace dependencies")
}

fn python() -> Result<()> {
    let check = run::output(&mut run::cmd("python3", ["-c", "import mpmath, numpy, scipy, gmpy2"]))?;
    if check.status.success() {
        println!("ok: Python mpmath, numpy, scipy, gmpy2");
        return Ok(());
    }
    println!("installing: Python packages mpmath numpy scipy gmpy2");
    run::status(&mut run::cmd(
        "python3",
        ["-m", "pip", "install", "--quiet", "mpmath", "numpy", "scipy", "gmpy2"],
    ))
}

/// Debian's wasm-opt shrinks the engine. Serving the site works without it (the engine is then
/// larger); the tests and the budgets need it, since they hold the engine to its size budget,
/// so for them it is installed like Chromium.
fn wasm_opt(required: bool) -> Result<()> {
    if let Some(version) = run::version("wasm-opt") {
        println!("ok: {version}");
        return Ok(());
    }
    if !required {
        println!(
            "skipped: wasm-opt (Debian package binaryen) is not installed; the engine will not be shrunk"
        );
        return Ok(());
    }
    apt_install("binaryen", "wasm-opt")
}

/// The browser tests drive Debian's Chromium.
fn chromium() -> Result<()> {
    if run::exists("/usr/bin/chromium") {
        println!("ok: {}", run::version("/usr/bin/chromium").unwrap_or_else(|| "chromium".into()));
        return Ok(());
    }
    apt_install("chromium", "/usr/bin/chromium")
}

/// The print test reads the text of the printed PDF with poppler's `pdftotext`, a reader that
/// is not Chromium's own.
fn pdftotext() -> Result<()> {
    if run::exists("/usr/bin/pdftotext") {
        println!("ok: pdftotext");
        return Ok(());
    }
    apt_install("poppler-utils", "/usr/bin/pdftotext")
}

/// Installs a Debian package, which can be done only as root.
fn apt_install(package: &str, what: &str) -> Result<()> {
    let uid = run::output(&mut run::cmd("id", ["-u"]))?;
    if String::from_utf8_lossy(&uid.stdout).trim() != "0" {
        bail!("{what} is missing; install it (`sudo apt-get install {package}`) and run again");
    }
    println!("installing: {package} (apt-get)");
    run::status(&mut run::cmd("apt-get", ["update"]))?;
    run::status(run::cmd("apt-get", ["install", "-y", package]).env("DEBIAN_FRONTEND", "noninteractive"))
}

/// The browser tests' npm packages, exactly as locked.
fn npm(project: &Project) -> Result<()> {
    let dir = project.browser_tests();
    let installed = dir.join("node_modules").join(".package-lock.json");
    let lock = dir.join("package-lock.json");
    let modified = |p: &std::path::Path| std::fs::metadata(p).and_then(|m| m.modified()).ok();
    if matches!((modified(&installed), modified(&lock)), (Some(a), Some(b)) if a >= b) {
        println!("ok: npm packages in tests/browser");
        return Ok(());
    }
    println!("installing: npm packages in tests/browser (npm ci)");
    run::status(run::cmd("npm", ["ci", "--no-audit", "--no-fund"]).current_dir(&dir))
}
