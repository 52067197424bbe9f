//! `build`: every page rendered, the assets and the browser engine copied, and the result
//! checked, into one folder that any static host can serve as it is.

use std::fmt;
use std::path::Path;

use anyhow::{bail, Context, Result};

use crate::args::BuildOptions;
use crate::css;
use crate::embed;
use crate::markdown;
use crate::offline;
use crate::page;
use crate::template::{self, Frame};
use crate::verify;

/// Marks a folder as written by this builder, so that a rebuild may empty it.
const MARKER: &str = ".modebench-site";

/// The engine files made by wasm-bindgen, copied into `assets/`: the page's own engine, and the
/// solver that `assets/solve-worker.js` runs in each calculator's Web Worker, and the tap test's
/// engine that `assets/bench-worker.js` runs once a tap-test panel is opened.
pub(crate) const ENGINE_FILES: [&str; 6] = [
    "modebench_page.js",
    "modebench_page_bg.wasm",
    "modebench_solver.js",
    "modebench_solver_bg.wasm",
    "modebench_bench.js",
    "modebench_bench_bg.wasm",
];

/// What a build wrote.
pub(crate) struct Summary {
    pages: usize,
    out: String,
    engine: bool,
}

impl fmt::Display for Summary {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "Built {} pages into {}", self.pages, self.out)?;
        if !self.engine {
            write!(
                f,
                " without the browser engine (no {} found): calculators show their prerendered \
                 results only. `cargo xtask build` builds the engine first.",
                ENGINE_FILES.join(" or ")
            )?;
        }
        Ok(())
    }
}

/// Builds the site.
pub(crate) fn build(options: &BuildOptions) -> Result<Summary> {
    let root = &options.root;
    let pages = page::read_pages(&root.join("site").join("pages"))?;
    prepare(&options.out)?;
    let assets = options.out.join("assets");
    std::fs::create_dir_all(&assets).with_context(|| format!("creating {}", assets.display()))?;
    copy_dir(&root.join("site").join("assets"), &assets)?;
    let engine = ENGINE_FILES.iter().all(|f| options.wasm.join(f).is_file());
    if engine {
        for file in ENGINE_FILES {
            copy(&options.wasm.join(file), &assets.join(file))?;
        }
    }
    let frame = Frame { pages: &pages, widget_css: assets.join("widget.css").is_file(), engine };
    let context = markdown::Scope { root, pages: &pages };
    for page in &pages {
        let body = markdown::to_html(&page.body, &context)
            .with_context(|| format!("in {}", page.source.display()))?;
        let html = template::document(page, &body, &frame);
        let path = options.out.join(page.file_name());
        std::fs::write(&path, html).with_context(|| format!("writing {}", path.display()))?;
    }
    let path = options.out.join(embed::FILE);
    std::fs::write(&path, embed::document(root, engine)?)
        .with_context(|| format!("writing {}", path.display()))?;
    verify::site(&options.out)?;
    offline::write_worker(&options.out)?;
    Ok(Summary { pages: pages.len(), out: options.out.display().to_string(), engine })
}

/// Empties the output folder if this builder wrote it, and refuses to touch any other folder
/// that has files in it.
fn prepare(out: &Path) -> Result<()> {
    if out.exists() {
        let empty =
            std::fs::read_dir(out).with_context(|| format!("reading {}", out.display()))?.next().is_none();
        if !empty {
            if !out.join(MARKER).is_file() {
                bail!(
                    "{} has files that this builder did not write; choose another --out or empty it",
                    out.display()
                );
            }
            std::fs::remove_dir_all(out).with_context(|| format!("emptying {}", out.display()))?;
        }
    }
    std::fs::create_dir_all(out).with_context(|| format!("creating {}", out.display()))?;
    std::fs::write(out.join(MARKER), "Written by modebench-site build; rebuilding empties this folder.\n")
        .with_context(|| format!("writing into {}", out.display()))
}

/// Copies the files (not sub-folders) of `from` into `to`, style sheets without their comments
/// ([`css::without_comments`]).
fn copy_dir(from: &Path, to: &Path) -> Result<()> {
    for entry in std::fs::read_dir(from).with_context(|| format!("reading {}", from.display()))? {
        let path = entry?.path();
        if path.is_file() {
            let out = to.join(path.file_name().context("a file without a name")?);
            if path.extension().is_some_and(|e| e == "css") {
                let sheet =
                    std::fs::read_to_string(&path).with_context(|| format!("reading {}", path.display()))?;
                std::fs::write(&out, css::without_comments(&sheet))
                    .with_context(|| format!("writing {}", out.display()))?;
            } else {
                copy(&path, &out)?;
            }
        }
    }
    Ok(())
}

fn copy(from: &Path, to: &Path) -> Result<()> {
    std::fs::copy(from, to).with_context(|| format!("copying {} to {}", from.display(), to.display()))?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_real_pages_build_and_a_foreign_folder_is_left_alone() {
        let root = Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/..")).to_path_buf();
        let scratch = std::env::temp_dir().join(format!("modebench-site-test-{}", std::process::id()));
        let _ = std::fs::remove_dir_all(&scratch);
        let out = scratch.join("dist");
        let options = BuildOptions { root: root.clone(), out: out.clone(), wasm: scratch.join("no-wasm") };
        let summary = build(&options).unwrap().to_string();
        assert!(summary.contains("without the browser engine"), "{summary}");
        assert!(out.join("index.html").is_file() && out.join("assets/site.css").is_file());
        // A rebuild empties the folder it wrote before.
        build(&options).unwrap();

        let foreign = scratch.join("foreign");
        std::fs::create_dir_all(&foreign).unwrap();
        std::fs::write(foreign.join("notes.txt"), "mine").unwrap();
        let options = BuildOptions { root, out: foreign.clone(), wasm: scratch.join("no-wasm") };
        assert!(build(&options).is_err());
        assert!(foreign.join("notes.txt").is_file());
        std::fs::remove_dir_all(&scratch).unwrap();
    }
}
