//! Runs `modebench-site serve` on a built site: in the foreground for `cargo xtask serve`, or
//! in the background on a free port while the browser tests and budgets run.

use std::io::{BufRead, BufReader};
use std::process::{Child, Stdio};

use anyhow::{bail, Context, Result};

use crate::project::{path_str, Project, Site};
use crate::run;

/// Serves the site on `port` until stopped.
pub(crate) fn serve_forever(project: &Project, site: &Site, port: u16) -> Result<()> {
    run::step("Serve");
    run::status(
        run::cmd(
            path_str(&site.program)?,
            ["serve", "--dir", path_str(&site.dist)?, "--port", &port.to_string()],
        )
        .current_dir(&project.root),
    )
}

/// A server running in the background; stopped when dropped.
pub(crate) struct Background {
    child: Child,
    /// Its address, `http://127.0.0.1:PORT/`.
    pub(crate) url: String,
}

impl Background {
    /// Starts the server on a free port and waits for the line that gives its address.
    pub(crate) fn start(site: &Site) -> Result<Background> {
        let mut child =
            run::cmd(path_str(&site.program)?, ["serve", "--dir", path_str(&site.dist)?, "--port", "0"])
                .stdout(Stdio::piped())
                .spawn()
                .context("starting modebench-site serve")?;
        let stdout = child.stdout.take().context("no output from the server")?;
        let mut line = String::new();
        BufReader::new(stdout).read_line(&mut line)?;
        let Some(start) = line.find("http://127.0.0.1:") else {
            let _ = child.kill();
            bail!("the server did not say where it listens: {line:?}");
        };
        let url = line[start..].split_whitespace().next().unwrap_or_default().to_string();
        println!("serving {} at {url}", site.dist.display());
        Ok(Background { child, url })
    }
}

impl Drop for Background {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}
