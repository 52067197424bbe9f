//! Running other programs: each command is printed before it runs, so a CI log reads as the
//! list of commands a developer would type.

use std::ffi::OsStr;
use std::path::Path;
use std::process::{Command, Output, Stdio};

use anyhow::{bail, Context, Result};

/// Prints a step heading.
pub(crate) fn step(title: &str) {
    println!("\n==> {title}");
}

/// A command line to print and run.
pub(crate) fn cmd<I, S>(program: &str, args: I) -> Command
where
    I: IntoIterator<Item = S>,
    S: AsRef<OsStr>,
{
    let mut command = Command::new(program);
    command.args(args);
    command
}

fn describe(command: &Command) -> String {
    let envs: Vec<String> = command
        .get_envs()
        .filter_map(|(k, v)| Some(format!("{}={}", k.to_string_lossy(), v?.to_string_lossy())))
        .collect();
    let args: Vec<String> = command.get_args().map(|a| a.to_string_lossy().into_owned()).collect();
    let mut line = envs.join(" ");
    if !line.is_empty() {
        line.push(' ');
    }
    line.push_str(&command.get_program().to_string_lossy());
    for arg in args {
        line.push(' ');
        line.push_str(&arg);
    }
    line
}

/// Runs a command with the terminal attached; fails unless it exits with 0.
pub(crate) fn status(command: &mut Command) -> Result<()> {
    let line = describe(command);
    println!("$ {line}");
    let status = command.status().with_context(|| format!("could not start `{line}`"))?;
    if !status.success() {
        bail!("`{line}` failed ({status})");
    }
    Ok(())
}

/// Runs a command and captures what it prints, without failing on a non-zero exit.
pub(crate) fn output(command: &mut Command) -> Result<Output> {
    let line = describe(command);
    command.stdin(Stdio::null()).output().with_context(|| format!("could not start `{line}`"))
}

/// The first line a program prints for `--version`, or `None` when it cannot be run.
pub(crate) fn version(program: &str) -> Option<String> {
    let out = Command::new(program).arg("--version").stdin(Stdio::null()).output().ok()?;
    out.status
        .success()
        .then(|| String::from_utf8_lossy(&out.stdout).lines().next().unwrap_or("").trim().to_string())
}

/// Whether a file exists and is a program, looked up in the PATH when it has no slash.
pub(crate) fn exists(program: &str) -> bool {
    if program.contains('/') {
        return Path::new(program).is_file();
    }
    std::env::var_os("PATH")
        .is_some_and(|paths| std::env::split_paths(&paths).any(|dir| dir.join(program).is_file()))
}
