//! The command line: `build`, `single` and `serve` with their few options, read without a parser
//! crate because there are so few.

use std::path::PathBuf;

use anyhow::{bail, Context, Result};

/// Printed for `help` and after a mistake on the command line.
pub(crate) const USAGE: &str = "\
usage:
  modebench-site build [--out DIR] [--root DIR] [--wasm DIR]
      Writes the whole site to DIR (default: dist). --root is the repository (default: found
      from the current folder); --wasm is the folder with the browser engine built by
      `cargo xtask build` (default: ROOT/build/wasm).
  modebench-site single [--out FILE] [--root DIR] [--wasm DIR]
      Writes one HTML file with one calculator and both engines inside it, which works opened
      from disk (default: build/single/modebench-calculator.html). --wasm is the folder with the
      engines bound for `no-modules` by `cargo xtask build --single-file` (default:
      ROOT/build/wasm-single).
  modebench-site serve [--dir DIR] [--port N]
      Serves a built site on http://127.0.0.1:N/ (default: dist on port 8080; 0 picks a free
      port). Build first: serve never builds.";

/// What to do.
pub(crate) enum Command {
    /// Build the site.
    Build(BuildOptions),
    /// Write the single-file build.
    Single(BuildOptions),
    /// Serve a built site.
    Serve(ServeOptions),
    /// Print the usage.
    Help,
}

/// Options of `build` and `single`.
pub(crate) struct BuildOptions {
    /// The repository root (holds `site/pages`).
    pub(crate) root: PathBuf,
    /// Where the site is written.
    pub(crate) out: PathBuf,
    /// The wasm-bindgen output to copy into `assets/` (`build`) or to embed (`single`).
    pub(crate) wasm: PathBuf,
}

/// Options of `serve`.
pub(crate) struct ServeOptions {
    /// The built site.
    pub(crate) dir: PathBuf,
    /// The port on 127.0.0.1; 0 lets the system pick one.
    pub(crate) port: u16,
}

impl Command {
    /// Reads the command from the process arguments.
    pub(crate) fn from_env() -> Result<Command> {
        Command::parse(std::env::args().skip(1).collect())
    }

    fn parse(args: Vec<String>) -> Result<Command> {
        let mut args = args.into_iter();
        let verb = args.next().unwrap_or_default();
        let mut pairs = Vec::new();
        while let Some(flag) = args.next() {
            let value = args.next().with_context(|| format!("{flag} needs a value\n{USAGE}"))?;
            pairs.push((flag, value));
        }
        match verb.as_str() {
            "build" | "single" => {
                let single = verb == "single";
                let mut root = None;
                let mut out = None;
                let mut wasm = None;
                for (flag, value) in pairs {
                    match flag.as_str() {
                        "--root" => root = Some(PathBuf::from(value)),
                        "--out" => out = Some(PathBuf::from(value)),
                        "--wasm" => wasm = Some(PathBuf::from(value)),
                        _ => bail!("{verb} does not know {flag}\n{USAGE}"),
                    }
                }
                let root = match root {
                    Some(root) => root,
                    None => find_root()?,
                };
                if single {
                    let wasm = wasm.unwrap_or_else(|| root.join("build").join("wasm-single"));
                    let out = out.unwrap_or_else(|| {
                        root.join("build").join("single").join("modebench-calculator.html")
                    });
                    return Ok(Command::Single(BuildOptions { root, out, wasm }));
                }
                let wasm = wasm.unwrap_or_else(|| root.join("build").join("wasm"));
                let out = out.unwrap_or_else(|| PathBuf::from("dist"));
                Ok(Command::Build(BuildOptions { root, out, wasm }))
            }
            "serve" => {
                let mut dir = PathBuf::from("dist");
                let mut port = 8080;
                for (flag, value) in pairs {
                    match flag.as_str() {
                        "--dir" => dir = PathBuf::from(value),
                        "--port" => {
                            port = value.parse().with_context(|| {
                                format!("--port takes a number from 0 to 65535 (got {value:?})")
                            })?
                        }
                        _ => bail!("serve does not know {flag}\n{USAGE}"),
                    }
                }
                Ok(Command::Serve(ServeOptions { dir, port }))
            }
            "" | "help" | "--help" | "-h" => Ok(Command::Help),
            other => bail!("unknown command {other:?}\n{USAGE}"),
        }
    }
}

/// The repository root: the nearest folder at or above the current one that has `site/pages`.
fn find_root() -> Result<PathBuf> {
    let start = std::env::current_dir().context("reading the current folder")?;
    start
        .ancestors()
        .find(|dir| dir.join("site").join("pages").is_dir())
        .map(PathBuf::from)
        .with_context(|| format!("no site/pages folder at or above {}; pass --root", start.display()))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn parse(text: &str) -> Result<Command> {
        Command::parse(text.split_whitespace().map(String::from).collect())
    }

    #[test]
    fn serve_reads_its_options() {
        let Ok(Command::Serve(options)) = parse("serve --dir out --port 0") else {
            panic!("serve was not read");
        };
        assert_eq!(options.dir, PathBuf::from("out"));
        assert_eq!(options.port, 0);
    }

    #[test]
    fn mistakes_say_what_is_allowed() {
        let message = format!("{:#}", parse("serve --port eighty").err().unwrap());
        assert!(message.contains("0 to 65535"), "{message}");
        assert!(parse("serve --dir").is_err());
        assert!(parse("publish").is_err());
        assert!(parse("build --root . --colour red").is_err());
        assert!(parse("single --root . --port 1").is_err());
    }
}
