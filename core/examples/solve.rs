//! Solves a scenario file and prints the results as JSON.
//!
//! ```text
//! cargo run -p modebench --example solve -- path/to/scenario.json [--shapes] [--full]
//! ```
//!
//! By default it prints, per mode, the exact frequency, the finite-element frequency and their
//! difference, and the node positions; the Rayleigh and Dunkerley values for mode 1; the unit
//! conversions applied; any warnings; and the design study: for each mode the inputs that move
//! it most (% of frequency per % of input), the tolerance bands, the measured frequencies, the
//! calibration and the resizing asked for, and the drives with the bands the margin forbids.
//! `--shapes` adds the sampled mode shapes and the resizing sweep; `--full` prints the whole
//! report.

use std::process::ExitCode;

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let shapes = args.iter().any(|a| a == "--shapes");
    let full = args.iter().any(|a| a == "--full");
    let Some(path) = args.iter().find(|a| !a.starts_with("--")) else {
        eprintln!("usage: solve <scenario.json> [--shapes] [--full]");
        return ExitCode::from(2);
    };
    let text = match std::fs::read_to_string(path) {
        Ok(text) => text,
        Err(e) => {
            eprintln!("error: cannot read {path}: {e}");
            return ExitCode::from(2);
        }
    };
    let report = match modebench::solve_json(&text) {
        Ok(report) => report,
        Err(e) => {
            eprintln!("error in {path}: {e}");
            return ExitCode::FAILURE;
        }
    };
    let value = if full { serde_json::to_value(&report) } else { Ok(summary(&report, shapes)) };
    match value.and_then(|v| serde_json::to_string_pretty(&v)) {
        Ok(text) => {
            println!("{text}");
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("error: cannot write the results: {e}");
            ExitCode::FAILURE
        }
    }
}

fn summary(report: &modebench::Report, shapes: bool) -> serde_json::Value {
    let modes: Vec<serde_json::Value> = report
        .modes
        .iter()
        .map(|m| {
            let mut row = serde_json::json!({
                "mode": m.number,
                "rigid_body": m.rigid_body,
                "exact_hz": m.frequency_hz,
                "rpm": m.rpm,
                "fe_hz": m.fe_frequency_hz,
                "fe_difference": m.fe_difference,
                "nodes_m": m.nodes,
            });
            if let Some(other) = m.other_theory_hz {
                row["other_theory_hz"] = other.into();
            }
            if let Some(s) = &m.nearest_excitation {
                row["nearest_excitation"] = serde_json::json!({
                    "excitation": s.excitation, "order": s.order, "hz": s.frequency_hz, "up_to_hz": s.up_to_hz,
                    "separation": s.separation, "band_separation": s.band_separation, "too_close": s.too_close });
            }
            if shapes {
                row["shape"] = serde_json::json!({ "x_m": m.shape.x, "w": m.shape.w });
            }
            row
        })
        .collect();
    serde_json::json!({
        "title": report.title,
        "theory": report.theory,
        "comparison_theory": report.comparison,
        "modes": modes,
        "mode_1": report.fundamental.map(|f| serde_json::json!({
            "exact_hz": f.exact_hz,
            "rayleigh_hz": f.rayleigh_hz,
            "dunkerley_hz": f.dunkerley_hz,
            "equivalent": f.equivalent,
        })),
        "fe": report.fe,
        "conversions": report.conversions.iter().map(|c| format!("{}: {}", c.path, c.text)).collect::<Vec<_>>(),
        "warnings": report.warnings.iter().map(|w| w.message.clone()).collect::<Vec<_>>(),
        "design": design(&report.design, shapes),
    })
}

/// The design study in short: the three inputs that move each mode most, and the rest as is.
fn design(d: &modebench::design::Design, sweep: bool) -> serde_json::Value {
    let moves: Vec<serde_json::Value> = d
        .sensitivities
        .iter()
        .map(|s| {
            let top: Vec<serde_json::Value> = modebench::design::sensitivity::strongest(&s.per_input, 3)
                .into_iter()
                .filter_map(|(j, v)| {
                    Some(serde_json::json!({ "input": d.inputs.get(j)?.path, "percent_per_percent": v }))
                })
                .collect();
            serde_json::json!({ "mode": s.mode, "moved_most_by": top })
        })
        .collect();
    let mut out = serde_json::json!({
        "what_moves_each_mode": moves,
        "tolerances": d.tolerances,
        "bands": d.bands,
        "measured": d.measured,
        "calibration": d.calibration,
        "drives": d.drives,
    });
    if let Some(r) = &d.resize {
        let mut resize = serde_json::json!({
            "input": r.input, "from": r.low, "to": r.high, "feasible_intervals": r.intervals,
            "nearest": r.nearest, "clear_today": r.clear_today, "problem": r.problem,
        });
        if sweep {
            resize["sweep"] = serde_json::json!({ "x": r.x, "hz": r.hz });
        }
        out["resize"] = resize;
    }
    out
}
