//! Where things are: the workspace, cargo's target folder (which honours `CARGO_TARGET_DIR`),
//! the engine's build output and the built site.

use std::path::{Path, PathBuf};

use anyhow::{Context, Result};

use crate::run;

/// The workspace and the folders the commands write.
pub(crate) struct Project {
    /// The workspace root.
    pub(crate) root: PathBuf,
    /// Cargo's target folder.
    pub(crate) target: PathBuf,
}

/// A built site and the program that serves it.
pub(crate) struct Site {
    /// The `modebench-site` executable.
    pub(crate) program: PathBuf,
    /// The built site.
    pub(crate) dist: PathBuf,
}

impl Project {
    /// Asks cargo where the workspace and its target folder are.
    pub(crate) fn find() -> Result<Project> {
        let out = run::output(&mut run::cmd("cargo", ["metadata", "--format-version", "1", "--no-deps"]))?;
        if !out.status.success() {
            anyhow::bail!("cargo metadata failed: {}", String::from_utf8_lossy(&out.stderr));
        }
        let metadata: serde_json::Value =
            serde_json::from_slice(&out.stdout).context("reading cargo metadata")?;
        let path = |key: &str| {
            metadata[key].as_str().map(PathBuf::from).with_context(|| format!("cargo metadata has no {key}"))
        };
        Ok(Project { root: path("workspace_root")?, target: path("target_directory")? })
    }

    /// Where wasm-bindgen writes the engines (`modebench_page.js`, `modebench_solver.js` and their
    /// `.wasm`).
    pub(crate) fn engine_dir(&self) -> PathBuf {
        self.root.join("build").join("wasm")
    }

    /// Where the engines bound for the single-file build go.
    pub(crate) fn single_engine_dir(&self) -> PathBuf {
        self.root.join("build").join("wasm-single")
    }

    /// The single-file build.
    pub(crate) fn single_file(&self) -> PathBuf {
        self.root.join("build").join("single").join("modebench-calculator.html")
    }

    /// The built site.
    pub(crate) fn dist(&self) -> PathBuf {
        self.root.join("dist")
    }

    /// The browser tests and budget script.
    pub(crate) fn browser_tests(&self) -> PathBuf {
        self.root.join("tests").join("browser")
    }

    /// Runs cargo in the workspace.
    pub(crate) fn cargo<I, S>(&self, args: I) -> std::process::Command
    where
        I: IntoIterator<Item = S>,
        S: AsRef<std::ffi::OsStr>,
    {
        let mut command = run::cmd("cargo", args);
        command.current_dir(&self.root);
        command
    }

    /// Builds the site builder, then the site into `dist/` with the engine built before.
    pub(crate) fn build_site(&self) -> Result<Site> {
        run::step("Build the site");
        run::status(&mut self.cargo(["build", "--quiet", "-p", "modebench-site"]))?;
        let program =
            self.target.join("debug").join(format!("modebench-site{}", std::env::consts::EXE_SUFFIX));
        let dist = self.dist();
        run::status(
            run::cmd(path_str(&program)?, ["build", "--out", path_str(&dist)?, "--wasm"])
                .arg(self.engine_dir())
                .arg("--root")
                .arg(&self.root)
                .current_dir(&self.root),
        )?;
        Ok(Site { program, dist })
    }
}

impl Site {
    /// Writes the single-file build with the engines bound for it.
    pub(crate) fn write_single_file(&self, project: &Project) -> Result<()> {
        run::step("Build the single file");
        run::status(
            run::cmd(
                path_str(&self.program)?,
                ["single", "--out", path_str(&project.single_file())?, "--wasm"],
            )
            .arg(project.single_engine_dir())
            .arg("--root")
            .arg(&project.root)
            .current_dir(&project.root),
        )
    }
}

/// A path as text for a command line.
pub(crate) fn path_str(path: &Path) -> Result<&str> {
    path.to_str().with_context(|| format!("{} is not UTF-8", path.display()))
}
