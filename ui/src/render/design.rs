//! The design results: what moves each mode, the modes' tolerance bands beside their measured
//! frequencies, the calibration's answer with its button to apply it, and the resizing's answer
//! with its sweep plot (each mode's frequency against the input, the forbidden bands shaded, the
//! feasible ranges marked) and its button to apply the proposal.

use super::escape::escape;
use super::number::{hz, percent, quantity, sig, signed_percent, MISSING};
use super::symbols::INK;
use modebench::design::study::{InputEcho, ResizeReport};
use modebench::design::Design;
use modebench::units::UnitSystem;
use modebench::Report;

/// How many inputs are listed per mode.
const TOP: usize = 3;

/// An input in words: "Segment 1: Overall depth", "Left end: Rotational spring",
/// "Attachment 2 (fan and motor): Mass".
pub(crate) fn input_name(report: &Report, input: &InputEcho) -> String {
    let path = input.path.as_str();
    let index = |list: &str| -> Option<usize> {
        let rest = path.strip_prefix(list)?.strip_prefix('[')?;
        rest[..rest.find(']')?].parse().ok()
    };
    let owner = if let Some(i) = index("segments") {
        format!("Segment {}", i + 1)
    } else if let Some(i) = index("attachments") {
        match report.beam.attachments.get(i).map(|a| a.label.trim()).filter(|l| !l.is_empty()) {
            Some(label) => format!("Attachment {} ({label})", i + 1),
            None => format!("Attachment {}", i + 1),
        }
    } else if path.starts_with("left") {
        "Left end".to_string()
    } else if path.starts_with("right") {
        "Right end".to_string()
    } else {
        String::new()
    };
    if owner.is_empty() {
        input.label.clone()
    } else {
        format!("{owner}: {}", input.label)
    }
}

fn value(v: Option<f64>, input: &InputEcho, system: UnitSystem) -> String {
    match v {
        Some(v) => quantity(v, input.kind, system),
        None => "rigid".to_string(),
    }
}

/// The whole design section, or nothing when the report has nothing to show there.
pub(crate) fn design_html(report: &Report) -> String {
    let mut out = notes(&report.design.notes);
    out.push_str(&moves(report));
    out.push_str(&bands(report));
    out.push_str(&calibration(report));
    out.push_str(&resizing(report));
    out
}

/// "What moves mode n most": the strongest inputs, signed, in % of frequency per % of input.
fn moves(report: &Report) -> String {
    let d = &report.design;
    if d.sensitivities.is_empty() || d.inputs.is_empty() {
        return String::new();
    }
    let mut rows = String::new();
    for s in &d.sensitivities {
        let top = modebench::design::sensitivity::strongest(&s.per_input, TOP);
        let items: Vec<String> = top
            .iter()
            .filter_map(|(j, v)| {
                let input = d.inputs.get(*j)?;
                Some(format!(
                    "<li data-input=\"{}\"><span class=\"mb-move-name\">{}</span> <span class=\"mb-move-value\">{} per \
                     +1 %</span></li>",
                    escape(&input.path),
                    escape(&input_name(report, input)),
                    signed_percent(v / 100.0, 2)
                ))
            })
            .collect();
        rows.push_str(&format!(
            "<tr data-moves-mode=\"{0}\"><th scope=\"row\">Mode {0}</th><td><ol class=\"mb-moves-list\">{1}</ol></td></tr>",
            s.mode,
            items.join("")
        ));
    }
    format!(
        "<section class=\"mb-moves\"><h4 class=\"mb-results-title\">What moves each mode most</h4>\
         <div class=\"mb-table-wrap\"><table class=\"mb-moves-table\"><thead><tr><th scope=\"col\">Mode</th>\
         <th scope=\"col\">Inputs, strongest first: change in frequency for 1 % more of the input</th></tr></thead>\
         <tbody>{rows}</tbody></table></div><p class=\"mb-note\">Each figure is ∂ln f/∂ln p, the logarithmic \
         derivative of the mode's frequency with respect to the input, from the exact mode shape (for a length or \
         a position, by central differences on the exact solver): \
         +0.5 % means 1 % more of the input raises the mode 0.5 %; a minus sign lowers it. It holds for small \
         changes; re-solve for large ones.</p></section>"
    )
}

/// The modes' bands and measurements, when there are any.
fn bands(report: &Report) -> String {
    let d = &report.design;
    if d.bands.is_empty() && d.measured.is_empty() {
        return String::new();
    }
    let system = report.units;
    let tolerances: Vec<String> = d
        .tolerances
        .iter()
        .map(|t| {
            let spread = match t.plus_minus {
                Some(p) => format!("± {}", percent(p, 3)),
                None => format!("{} to {}", value(t.low, &t.input, system), value(t.high, &t.input, system)),
            };
            format!("<li>{}: {spread}</li>", escape(&input_name(report, &t.input)))
        })
        .collect();
    let mut rows = String::new();
    for m in report.modes.iter().filter(|m| !m.rigid_body) {
        let band = d.bands.iter().find(|b| b.mode == m.number);
        let measured = d.measured.iter().find(|e| e.mode == m.number);
        if band.is_none() && measured.is_none() {
            continue;
        }
        rows.push_str(&format!(
            "<tr data-band-mode=\"{}\"><th scope=\"row\">{}</th><td>{}</td><td class=\"mb-band\">{}</td><td>{}</td><td>{}</td></tr>",
            m.number,
            m.number,
            hz(m.frequency_hz),
            band.map_or(MISSING.to_string(), |b| format!("{} to {}", hz(b.low_hz), hz(b.high_hz))),
            measured.map_or(MISSING.to_string(), |e| hz(e.measured_hz)),
            measured.map_or(MISSING.to_string(), |e| signed_percent(e.difference, 3))
        ));
    }
    let list = if tolerances.is_empty() {
        String::new()
    } else {
        format!(
            "<p class=\"mb-note\">Tolerances: </p><ul class=\"mb-tolerances\">{}</ul><p class=\"mb-note\">Each band \
             adds up every input's effect to first order and includes the frequencies solved at the mode's two worst \
             corners (every input at the end that raises it, then at the end that lowers it).</p>",
            tolerances.join("")
        )
    };
    format!(
        "<section class=\"mb-bands\"><h4 class=\"mb-results-title\">Tolerance bands and measurements</h4>\
         <div class=\"mb-table-wrap\"><table class=\"mb-bands-table\"><thead><tr><th scope=\"col\">Mode</th>\
         <th scope=\"col\">Computed</th><th scope=\"col\">Band</th><th scope=\"col\">Measured</th>\
         <th scope=\"col\">Computed − measured</th></tr></thead><tbody>{rows}</tbody></table></div>{list}</section>"
    )
}

fn notes(list: &[String]) -> String {
    if list.is_empty() {
        return String::new();
    }
    let items: String = list.iter().map(|n| format!("<li class=\"mb-warning\">{}</li>", escape(n))).collect();
    format!("<ul class=\"mb-warnings\">{items}</ul>")
}

/// The calibration's answer.
fn calibration(report: &Report) -> String {
    let Some(c) = &report.design.calibration else { return String::new() };
    let system = report.units;
    let mut out = String::from(
        "<section class=\"mb-calibration\"><h4 class=\"mb-results-title\">Calibration to the measured frequencies</h4>",
    );
    if let Some(p) = &c.problem {
        out.push_str(&format!("<p class=\"mb-problem\" role=\"status\">{}</p>", escape(&p.message)));
    }
    if !c.fitted.is_empty() {
        let rows: String = c
            .inputs
            .iter()
            .zip(&c.fitted)
            .map(|(input, fit)| {
                format!(
                    "<tr data-input=\"{}\"><th scope=\"row\">{}</th><td>{}</td><td class=\"mb-fitted\">{}</td></tr>",
                    escape(&input.path),
                    escape(&input_name(report, input)),
                    value(input.value, input, system),
                    quantity(*fit, input.kind, system)
                )
            })
            .collect();
        let residuals: Vec<String> = c.residuals.iter().map(|r| signed_percent(*r, 2)).collect();
        out.push_str(&format!(
            "<div class=\"mb-table-wrap\"><table class=\"mb-fit-table\"><thead><tr><th scope=\"col\">Input</th>\
             <th scope=\"col\">Now</th><th scope=\"col\">Fitted</th></tr></thead><tbody>{rows}</tbody></table></div>\
             <p class=\"mb-note\">At the fitted values the measured modes come out {} from their measurements \
             (computed − measured){}.{}</p><p><button type=\"button\" class=\"mb-button mb-apply\" \
             data-action=\"apply-fit\">Use the fitted value{} in the model</button></p>",
            residuals.join(", "),
            c.condition.map_or(String::new(), |k| format!("; condition number {}", sig(k, 2))),
            if c.alternatives.is_empty() {
                String::new()
            } else {
                let others: Vec<String> = c
                    .alternatives
                    .iter()
                    .filter_map(|a| Some(quantity(*a, c.inputs.first()?.kind, system)))
                    .collect();
                format!(" Other values fit as well: {}.", others.join(", "))
            },
            if c.fitted.len() > 1 { "s" } else { "" }
        ));
    }
    out.push_str(&notes(&c.notes));
    out.push_str("</section>");
    out
}

/// The resizing's answer with its sweep plot.
fn resizing(report: &Report) -> String {
    let Some(r) = &report.design.resize else { return String::new() };
    let system = report.units;
    let q = |v: f64| quantity(v, r.input.kind, system);
    let name = input_name(report, &r.input);
    let mut out = format!(
        "<section class=\"mb-resize\"><h4 class=\"mb-results-title\">Resizing: {}</h4>",
        escape(&name)
    );
    if let Some(p) = &r.problem {
        out.push_str(&format!("<p class=\"mb-problem\" role=\"status\">{}</p>", escape(&p.message)));
    }
    if !r.intervals.is_empty() {
        let ranges: Vec<String> =
            r.intervals.iter().map(|(a, b)| format!("{} to {}", q(*a), q(*b))).collect();
        out.push_str(&format!(
            "<p class=\"mb-feasible\">Searched from {} to {}: every mode clears every excitation by {} for \
             <span class=\"mb-intervals\">{}</span>.</p>",
            q(r.low),
            q(r.high),
            percent(report.margin, 3),
            ranges.join("; ")
        ));
    }
    if let (Some(v), Some(put)) = (r.nearest, crate::doc::design::resize_value(r, system)) {
        if r.clear_today {
            out.push_str("<p class=\"mb-note\">Today's value already clears every margin.</p>");
        } else {
            out.push_str(&format!(
                "<p class=\"mb-note\">The feasible value nearest today's ({}) is <strong class=\"mb-nearest-value\">{}</strong>, \
                 where a mode just meets its margin; rounded into the range, {}.</p>\
                 <p><button type=\"button\" class=\"mb-button mb-apply\" data-action=\"apply-resize\">Put {} into the \
                 model</button></p>",
                r.input.value.map_or("rigid".to_string(), &q),
                q(v),
                q(put),
                q(put)
            ));
        }
    }
    out.push_str(&sweep_svg(report, r));
    out.push_str("</section>");
    out
}

const W: f64 = 720.0;
const H: f64 = 300.0;
const X0: f64 = 70.0;
const X1: f64 = 700.0;
const Y0: f64 = 260.0;
const Y1: f64 = 30.0;

fn n(v: f64) -> String {
    if v.is_finite() {
        format!("{v:.1}")
    } else {
        "0".to_string()
    }
}

/// Each mode's frequency against the input, the forbidden bands shaded across, the feasible
/// ranges of the input shaded down, today's value and the nearest feasible one marked.
fn sweep_svg(report: &Report, r: &ResizeReport) -> String {
    let d: &Design = &report.design;
    if r.x.len() < 2 || r.hz.is_empty() {
        return String::new();
    }
    let top =
        r.hz.iter()
            .flatten()
            .copied()
            .chain(d.drives.iter().map(|z| z.forbidden_high_hz))
            .filter(|v| v.is_finite())
            .fold(0.0f64, f64::max);
    // Modes far above every drive flatten the plot; show up to a little past the highest zone.
    let zones = d.drives.iter().map(|z| z.forbidden_high_hz).fold(0.0f64, f64::max);
    let ymax = if zones > 0.0 { (zones * 1.6).min(top) } else { top }.max(1e-9);
    let xs = |v: f64| X0 + (X1 - X0) * (v - r.low) / (r.high - r.low).max(f64::MIN_POSITIVE);
    let ys = |f: f64| Y0 - (Y0 - Y1) * (f / ymax).clamp(0.0, 1.05);
    let label = "Each mode's frequency against the input, with the frequencies the margins forbid shaded";
    let mut out = format!(
        "<svg class=\"mb-sweep\" viewBox=\"0 0 {W} {H}\" role=\"img\" aria-label=\"{label}\" \
         font-family=\"system-ui, sans-serif\" font-size=\"12\"><title>{label}</title>"
    );
    for (a, b) in &r.intervals {
        out.push_str(&format!(
            "<rect class=\"mb-sweep-feasible\" x=\"{}\" y=\"{Y1}\" width=\"{}\" height=\"{}\" fill=\"#dcefe0\"/>",
            n(xs(*a)),
            n((xs(*b) - xs(*a)).max(1.0)),
            n(Y0 - Y1)
        ));
    }
    for z in &d.drives {
        let (a, b) = (ys(z.forbidden_high_hz.min(ymax * 1.05)), ys(z.forbidden_low_hz));
        out.push_str(&format!(
            "<rect class=\"mb-sweep-forbidden\" x=\"{X0}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#f4e2b8\" \
             opacity=\"0.7\"/>",
            n(a),
            n(X1 - X0),
            n((b - a).max(0.5))
        ));
    }
    let modes = r.hz.iter().map(Vec::len).min().unwrap_or(0);
    for k in 0..modes {
        // A mode above the plot is left out there, not drawn along its top edge.
        let mut runs: Vec<Vec<String>> = vec![Vec::new()];
        for (x, f) in r.x.iter().zip(&r.hz) {
            if f[k] <= ymax * 1.05 {
                if let Some(run) = runs.last_mut() {
                    run.push(format!("{},{}", n(xs(*x)), n(ys(f[k]))));
                }
            } else if runs.last().is_some_and(|run| !run.is_empty()) {
                runs.push(Vec::new());
            }
        }
        for run in runs.iter().filter(|run| run.len() > 1) {
            out.push_str(&format!(
                "<polyline class=\"mb-sweep-mode\" data-mode-index=\"{k}\" points=\"{}\" fill=\"none\" \
                 stroke=\"#2d6a8f\" stroke-width=\"2\"/>",
                run.join(" ")
            ));
        }
        // Each line's mode number where its last stretch ends, as the mode table numbers it.
        let number = report.modes.iter().filter(|m| !m.rigid_body).nth(k).map_or(k + 1, |m| m.number);
        if let Some((x, y)) =
            runs.iter().rev().find(|run| run.len() > 1).and_then(|run| run.last()?.split_once(','))
        {
            out.push_str(&format!(
                "<text x=\"{x}\" y=\"{y}\" dx=\"4\" dy=\"4\" fill=\"#2d6a8f\">{number}</text>"
            ));
        }
    }
    let mut marker = |v: f64, class: &str, colour: &str, words: &str, lift: f64| {
        if v.is_finite() && v >= r.low && v <= r.high {
            out.push_str(&format!(
                "<line class=\"{class}\" x1=\"{0}\" x2=\"{0}\" y1=\"{Y1}\" y2=\"{Y0}\" stroke=\"{colour}\" \
                 stroke-width=\"2\" stroke-dasharray=\"5 4\"/><text x=\"{0}\" y=\"{1}\" text-anchor=\"middle\" \
                 fill=\"{colour}\">{words}</text>",
                n(xs(v)),
                n(Y1 - 8.0 - lift)
            ));
        }
    };
    marker(r.input.value.unwrap_or(f64::NAN), "mb-sweep-now", INK, "today", 0.0);
    if !r.clear_today {
        marker(r.nearest.unwrap_or(f64::NAN), "mb-sweep-nearest", "#1f7a3a", "proposed", 12.0);
    }
    let system = report.units;
    out.push_str(&format!(
        "<line x1=\"{X0}\" x2=\"{X1}\" y1=\"{Y0}\" y2=\"{Y0}\" stroke=\"{INK}\"/>\
         <line x1=\"{X0}\" x2=\"{X0}\" y1=\"{Y1}\" y2=\"{Y0}\" stroke=\"{INK}\"/>\
         <text x=\"{X0}\" y=\"{}\" fill=\"{INK}\">{}</text><text x=\"{X1}\" y=\"{}\" text-anchor=\"end\" \
         fill=\"{INK}\">{}</text><text x=\"{}\" y=\"{Y1}\" text-anchor=\"end\" fill=\"{INK}\">{}</text>\
         <text x=\"{}\" y=\"{Y0}\" text-anchor=\"end\" fill=\"{INK}\">0</text></svg>",
        n(Y0 + 18.0),
        escape(&quantity(r.low, r.input.kind, system)),
        n(Y0 + 18.0),
        escape(&quantity(r.high, r.input.kind, system)),
        n(X0 - 6.0),
        escape(&hz(ymax)),
        n(X0 - 6.0)
    ));
    out.push_str(
        "<p class=\"mb-plot-key\">Lines are the modes' frequencies (numbered) as the input moves across its range; shaded \
         horizontal bands are the frequencies the margins forbid; green columns are the values of the input where \
         every mode clears every band.</p>",
    );
    out
}
