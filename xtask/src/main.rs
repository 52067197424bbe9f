//! Build, serve and test orchestration for Modebench (`cargo xtask <command>`).
//!
//! Every command first installs what it needs and is missing, and says so: the WebAssembly
//! target, `wasm-bindgen-cli` at the version in `Cargo.lock`, and for tests the Python
//! reference libraries, Chromium and the browser-test packages.

mod bench;
mod ci;
mod engine;
mod layers;
mod project;
mod run;
mod server;
mod tools;

use std::process::ExitCode;

use anyhow::{bail, Result};

const USAGE: &str = "\
usage: cargo xtask <command>
  serve   build the engine and the site, then serve it on http://127.0.0.1:8080/
  build   build the engine (WebAssembly) and the site into dist/
          --single-file: also one HTML file with a calculator and its engine inside, that
          works opened from disk: build/single/modebench-calculator.html
  test    everything CI runs: formatting, lints, docs, native and WebAssembly tests,
          the site build and the browser tests
  bench   the engine benchmarks and the browser budgets
  ratio   the two budget workloads natively and in the solver engine in Chromium, in
          turns: WebAssembly ÷ native
  tools   install whatever the commands above need and is missing";

fn main() -> ExitCode {
    match dispatch() {
        Ok(()) => ExitCode::SUCCESS,
        Err(error) => {
            eprintln!("xtask: {error:#}");
            ExitCode::FAILURE
        }
    }
}

fn dispatch() -> Result<()> {
    let command = std::env::args().nth(1).unwrap_or_default();
    let project = project::Project::find()?;
    match command.as_str() {
        "serve" => {
            tools::ensure(&project, tools::Needs::ENGINE)?;
            engine::build(&project)?;
            let site = project.build_site()?;
            server::serve_forever(&project, &site, 8080)
        }
        "build" => {
            let single = match std::env::args().nth(2).as_deref() {
                None => false,
                Some("--single-file") => true,
                Some(other) => bail!("build takes only --single-file (got {other:?})\n{USAGE}"),
            };
            tools::ensure(&project, tools::Needs::ENGINE)?;
            engine::build(&project)?;
            let site = project.build_site()?;
            if single {
                engine::bind_for_single_file(&project)?;
                site.write_single_file(&project)?;
            }
            Ok(())
        }
        "test" | "ci" => {
            tools::ensure(&project, tools::Needs::ALL)?;
            ci::run(&project)
        }
        "bench" => {
            tools::ensure(&project, tools::Needs::BROWSER)?;
            bench::run(&project)
        }
        "ratio" => {
            tools::ensure(&project, tools::Needs::BROWSER)?;
            bench::ratio(&project)
        }
        "tools" => tools::ensure(&project, tools::Needs::ALL),
        "" | "help" | "--help" | "-h" => {
            println!("{USAGE}");
            Ok(())
        }
        other => bail!("unknown command {other:?}\n{USAGE}"),
    }
}
