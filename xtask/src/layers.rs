//! What each crate of the workspace may depend on, checked on the dependency graph as built for
//! WebAssembly (`cargo tree --target wasm32-unknown-unknown -e normal`), as ARCHITECTURE.md
//! states it: the core depends on no other crate of ours and on no web crate; the UI on the
//! core only, and on no web crate; the site builder on the UI, the core and the published table
//! of the tests crate, and on no web crate; the tests crate on the core; the binding on the UI
//! and the core (its web crates are its own).

use anyhow::{bail, Result};

use crate::engine::TARGET;
use crate::project::Project;
use crate::run;

/// The crates that tie Rust to the browser.
const WEB_CRATES: [&str; 4] = ["wasm-bindgen", "js-sys", "web-sys", "serde-wasm-bindgen"];

/// Each crate of ours, the crates of ours it may use, and whether it may use web crates.
const RULES: [(&str, &[&str], bool); 5] = [
    ("modebench", &[], false),
    ("modebench-ui", &["modebench"], false),
    ("modebench-site", &["modebench", "modebench-ui", "modebench-tests"], false),
    ("modebench-tests", &["modebench"], false),
    ("modebench-web", &["modebench", "modebench-ui"], true),
];

/// Checks every rule; fails naming the first crate that breaks one.
pub(crate) fn check(project: &Project) -> Result<()> {
    for (krate, allowed, web) in RULES {
        let direct = direct_dependencies(project, krate)?;
        if let Some(bad) =
            direct.iter().find(|d| d.starts_with("modebench") && !allowed.contains(&d.as_str()))
        {
            bail!("{krate} depends on {bad}; it may use only {allowed:?} of the workspace's crates");
        }
        if !web {
            for w in WEB_CRATES {
                no_path_to(project, krate, w)?;
            }
        }
        println!("ok: {krate} uses {} of ours{}", list(&direct), if web { "" } else { ", no web crate" });
    }
    Ok(())
}

fn list(direct: &[String]) -> String {
    let ours: Vec<&str> = direct.iter().map(String::as_str).filter(|d| d.starts_with("modebench")).collect();
    if ours.is_empty() {
        "none".to_string()
    } else {
        ours.join(", ")
    }
}

/// The crate's direct normal dependencies, by name.
fn direct_dependencies(project: &Project, krate: &str) -> Result<Vec<String>> {
    let args = [
        "tree", "-p", krate, "--target", TARGET, "-e", "normal", "--depth", "1", "--prefix", "none",
        "--format", "{p}",
    ];
    let out = run::output(&mut project.cargo(args))?;
    if !out.status.success() {
        bail!("cargo {} failed:\n{}", args.join(" "), String::from_utf8_lossy(&out.stderr));
    }
    let stdout = String::from_utf8_lossy(&out.stdout);
    // The first line is the crate itself; each other line starts with a dependency's name.
    Ok(stdout.lines().skip(1).filter_map(|l| l.split_whitespace().next()).map(str::to_string).collect())
}

/// `cargo tree -i` must print nothing. Cargo refuses the query when the crate is nowhere in the
/// graph, which proves the same thing.
fn no_path_to(project: &Project, krate: &str, web: &str) -> Result<()> {
    let args = ["tree", "-p", krate, "-i", web, "--target", TARGET, "-e", "normal"];
    let out = run::output(&mut project.cargo(args))?;
    let stdout = String::from_utf8_lossy(&out.stdout);
    let stderr = String::from_utf8_lossy(&out.stderr);
    if (out.status.success() && stdout.trim().is_empty())
        || (!out.status.success() && stderr.contains("did not match any packages"))
    {
        return Ok(());
    }
    bail!("{krate} depends on {web}:\n{stdout}{stderr}")
}
