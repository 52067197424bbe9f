//! Builds the Modebench documentation site into a self-contained folder, and serves that folder.
//!
//! `modebench-site build` turns the Markdown pages in `site/pages/` into a `dist/` folder that
//! works from any static host and any sub-path; `modebench-site serve` only serves a folder that
//! was built before, on 127.0.0.1; `modebench-site single` writes one HTML file with a calculator
//! and its engines inside, for use from disk.

mod args;
mod builder;
mod calculator;
mod checks;
mod css;
mod embed;
mod markdown;
mod math;
mod offline;
mod page;
mod page_list;
mod serve;
mod single;
mod template;
mod verify;

use std::process::ExitCode;

fn main() -> ExitCode {
    let result = args::Command::from_env().and_then(|command| match command {
        args::Command::Build(options) => builder::build(&options).map(|report| {
            println!("{report}");
        }),
        args::Command::Single(options) => {
            single::write(&options.root, &options.wasm, &options.out).map(|bytes| {
                println!(
                    "Wrote {} ({bytes} bytes): one calculator that works opened from disk",
                    options.out.display()
                );
            })
        }
        args::Command::Serve(options) => serve::serve(&options),
        args::Command::Help => {
            println!("{}", args::USAGE);
            Ok(())
        }
    });
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(error) => {
            eprintln!("modebench-site: {error:#}");
            ExitCode::FAILURE
        }
    }
}
