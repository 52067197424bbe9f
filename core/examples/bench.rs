//! Analyses a tap-test recording and prints the measured peaks as JSON.
//!
//! ```text
//! cargo run -p modebench --example bench -- recording.wav|recording.csv
//!     [--channel N] [--range LO:HI] [--scenario scenario.json] [--tap X] [--sensor X] [--full]
//! ```
//!
//! `--channel` is 1-based (the WAV channel, or the CSV signal column not counting the time
//! column); `--range` is in hertz; `--scenario` solves a scenario and matches its modes to the
//! peaks, with the tap and the sensor at `--tap` and `--sensor` (metres along the beam; by
//! default where mode 1 deflects most). By default it prints the sample rate, the taps, per peak
//! the frequency, the damping ratio by each method, the quality figure and the matched mode,
//! the predicted modes' matches, and the warnings; `--full` adds the spectrum. The format is
//! described in `docs/bench-format.md`.

use std::process::ExitCode;

use modebench::bench::{analyse_file, BenchOptions, Predicted};

const USAGE: &str = "usage: bench <recording.wav|.csv> [--channel N] [--range LO:HI] [--scenario file.json] [--tap X] [--sensor X] [--full]";

fn main() -> ExitCode {
    match run() {
        Ok(text) => {
            println!("{text}");
            ExitCode::SUCCESS
        }
        Err((code, message)) => {
            eprintln!("{message}");
            ExitCode::from(code)
        }
    }
}

/// The value after `--name`, if given.
fn option<'a>(args: &'a [String], name: &str) -> Result<Option<&'a str>, (u8, String)> {
    match args.iter().position(|a| a == name) {
        None => Ok(None),
        Some(i) => {
            args.get(i + 1).map(|v| Some(v.as_str())).ok_or((2, format!("{name} needs a value\n{USAGE}")))
        }
    }
}

fn number(text: &str, what: &str) -> Result<f64, (u8, String)> {
    text.trim()
        .parse::<f64>()
        .ok()
        .filter(|v| v.is_finite())
        .ok_or((2, format!("{what}: \"{text}\" is not a number")))
}

fn run() -> Result<String, (u8, String)> {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let valued = ["--channel", "--range", "--scenario", "--tap", "--sensor"];
    let mut path = None;
    let mut i = 0;
    while i < args.len() {
        if valued.contains(&args[i].as_str()) {
            i += 2;
            continue;
        }
        if !args[i].starts_with("--") && path.is_none() {
            path = Some(args[i].clone());
        } else if args[i] != "--full" {
            return Err((2, format!("unknown argument {}\n{USAGE}", args[i])));
        }
        i += 1;
    }
    let path = path.ok_or((2, USAGE.to_string()))?;
    let mut options = BenchOptions::default();
    if let Some(c) = option(&args, "--channel")? {
        let n = c.trim().parse::<usize>().ok().filter(|n| *n >= 1);
        options.channel = n.ok_or((2, format!("--channel: \"{c}\" is not a channel number (1, 2, …)")))? - 1;
    }
    if let Some(r) = option(&args, "--range")? {
        let (lo, hi) = r
            .split_once(':')
            .ok_or((2, format!("--range: \"{r}\" is not LO:HI in hertz (for example 20:2000)")))?;
        options.range_hz = Some((number(lo, "--range")?, number(hi, "--range")?));
    }
    if let Some(s) = option(&args, "--scenario")? {
        let text = std::fs::read_to_string(s).map_err(|e| (2, format!("error: cannot read {s}: {e}")))?;
        let report = modebench::solve_json(&text).map_err(|e| (1, format!("error in {s}: {e}")))?;
        let tap = option(&args, "--tap")?.map(|t| number(t, "--tap")).transpose()?;
        let sensor = option(&args, "--sensor")?.map(|t| number(t, "--sensor")).transpose()?;
        options.predicted = Some(Predicted::from_report(&report, tap, sensor));
    }
    let full = args.iter().any(|a| a == "--full");
    let bytes = std::fs::read(&path).map_err(|e| (2, format!("error: cannot read {path}: {e}")))?;
    let report = analyse_file(&bytes, &options).map_err(|e| (1, format!("error in {path}: {e}")))?;
    let mut value =
        serde_json::to_value(&report).map_err(|e| (1, format!("error: cannot write the results: {e}")))?;
    if !full {
        if let Some(map) = value.as_object_mut() {
            map.remove("spectrum");
        }
    }
    serde_json::to_string_pretty(&value).map_err(|e| (1, format!("error: cannot write the results: {e}")))
}
