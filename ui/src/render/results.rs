//! The results block: the mode table, mode 1's bounds, the mode plot, the warnings, and the
//! inputs as modelled.

use super::escape::escape;
use super::number::{self, hz, percent, quantity, rpm, signed_percent};
use super::{band, design, echo, map, plot};
use modebench::report::ModeReport;
use modebench::units::Kind;
use modebench::{Report, Theory};

/// What the reader has chosen to look at, kept across redraws.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct View {
    /// The mode drawn in the plot (its number); the first elastic mode when 0 or absent.
    pub mode: usize,
    /// The `data-part` names of the fold-out sections left open.
    pub open: Vec<String>,
}

/// The whole results element. `stale` marks results that belong to an earlier input (shown
/// greyed); `None` when no input has been solved yet.
pub fn results_html(report: Option<&Report>, stale: bool, view: &View) -> String {
    let class = if stale { "mb-results mb-stale" } else { "mb-results" };
    format!("<div class=\"{class}\" aria-live=\"polite\">{}</div>", results_inner(report, stale, view))
}

/// The inside of the results element, which the widget replaces on every edit.
pub fn results_inner(report: Option<&Report>, stale: bool, view: &View) -> String {
    let mut out = String::new();
    match (report, stale) {
        (None, _) => {
            out.push_str(
                "<p class=\"mb-stale-note\">No results yet: correct the field marked in the editor and they \
                 appear here.</p>",
            );
            return out;
        }
        (Some(_), true) => out.push_str(stale_note()),
        _ => {}
    }
    let Some(report) = report else { return out };
    let mode = chosen_mode(report, view.mode);
    out.push_str(&table(report));
    out.push_str(&warnings(report));
    out.push_str(&map::map_section(report));
    out.push_str(&design::design_html(report));
    out.push_str(&band::fundamental(report));
    out.push_str(&buckling(report));
    out.push_str(&plot_area(report, mode));
    out.push_str(&echo::echo(report, &view.open));
    out
}

/// The note above results that belong to an earlier input than the one in the editor.
pub fn stale_note() -> &'static str {
    "<p class=\"mb-stale-note\">These results belong to the last input that could be solved. Correct the field \
     marked in the editor to bring them up to date.</p>"
}

/// The mode to draw: the one asked for if it exists, else the first elastic mode.
pub(crate) fn chosen_mode(report: &Report, asked: usize) -> usize {
    if report.modes.iter().any(|m| m.number == asked) {
        return asked;
    }
    report.modes.iter().find(|m| !m.rigid_body).or(report.modes.first()).map_or(1, |m| m.number)
}

fn theory_name(theory: Theory) -> &'static str {
    match theory {
        Theory::Timoshenko => "Timoshenko",
        _ => "Euler–Bernoulli",
    }
}

fn table(report: &Report) -> String {
    let system = report.units;
    let other = report.comparison.map(|t| format!("<th scope=\"col\">{} check</th>", theory_name(t)));
    let has_excitations = !report.excitations.is_empty();
    let mut out = format!(
        "<h4 class=\"mb-results-title\">Natural frequencies — {}</h4><div class=\"mb-table-wrap\" tabindex=\"0\" \
         role=\"region\" aria-label=\"Natural frequencies (the table scrolls sideways when narrow)\">\
         <table class=\"mb-modes\"><thead><tr><th scope=\"col\">Mode</th><th scope=\"col\">Frequency</th>\
         <th scope=\"col\">Finite-element check</th><th scope=\"col\">Nodes from the left end</th>{}",
        theory_name(report.theory),
        other.unwrap_or_default()
    );
    if has_excitations {
        out.push_str(&format!(
            "<th scope=\"col\">Nearest excitation</th><th scope=\"col\">Separation (want ≥ {})</th>",
            percent(report.margin, 3)
        ));
    }
    out.push_str("</tr></thead><tbody>");
    for m in &report.modes {
        out.push_str(&row(report, m, system, has_excitations));
    }
    out.push_str("</tbody></table></div>");
    if has_excitations {
        out.push_str(&separation_note(report));
    }
    out
}

/// How the separation column is defined, under the table.
fn separation_note(report: &Report) -> String {
    let banded = !report.design.bands.is_empty();
    format!(
        "<p class=\"mb-note mb-separation-note\">Separation is (f − f<sub>e</sub>)/f<sub>e</sub>, with f the mode's \
         frequency and f<sub>e</sub> the excitation's (times its order; the nearer end of a speed range, and 0 inside \
         it): negative when the mode lies below the excitation, positive above. A mode is flagged when its size is \
         under {} — this definition and margins of 10–20 % are common practice, not from a single source; follow \
         the code that applies.{}</p>",
        percent(report.margin, 3),
        if banded {
            " With tolerances given, the edge of the mode's band nearer the excitation is judged (second figure)."
        } else {
            ""
        }
    )
}

fn row(report: &Report, m: &ModeReport, system: modebench::units::UnitSystem, excitations: bool) -> String {
    let close = m.nearest_excitation.as_ref().is_some_and(|s| s.too_close);
    let mut out = format!(
        "<tr data-mode=\"{}\"{}><th scope=\"row\">{}</th>",
        m.number,
        if close { " class=\"mb-too-close\"" } else { "" },
        m.number
    );
    let data_hz = number::exact(m.frequency_hz).map(|v| format!(" data-hz=\"{v}\"")).unwrap_or_default();
    let mut tags = String::new();
    if m.rigid_body {
        tags.push_str(" <span class=\"mb-tag\">rigid-body motion</span>");
    }
    if m.multiplicity > 1 {
        tags.push_str(&format!(" <span class=\"mb-tag\">repeated ×{}</span>", m.multiplicity));
    }
    out.push_str(&format!(
        "<td class=\"mb-hz\"{data_hz}><span class=\"mb-main\">{}</span>{tags}<span class=\"mb-sub\">{}</span></td>",
        hz(m.frequency_hz),
        rpm(m.rpm)
    ));
    // Differences far below the digits shown say only that the two methods agree.
    let difference = m.fe_difference.map(|d| match d {
        d if d.abs() < 1e-6 => "within 0.0001 %".to_string(),
        d if d > 0.0 => format!("+{}", percent(d, 2)),
        d => percent(d, 2),
    });
    match m.fe_frequency_hz.and_then(|f| number::exact(f).map(|text| (f, text))) {
        Some((f, text)) => out.push_str(&format!(
            "<td class=\"mb-fe\" data-fe-hz=\"{text}\"><span class=\"mb-main\">{}</span><span class=\"mb-sub\">{}</span></td>",
            hz(f),
            difference.unwrap_or_default()
        )),
        None => out.push_str(&format!("<td class=\"mb-fe\">{}</td>", number::MISSING)),
    }
    let nodes = if m.nodes.is_empty() {
        "none".to_string()
    } else {
        m.nodes
            .iter()
            .map(|x| format!("<span class=\"mb-node-at\">{}</span>", quantity(*x, Kind::Length, system)))
            .collect::<Vec<_>>()
            .join(", ")
    };
    out.push_str(&format!("<td class=\"mb-nodes\">{nodes}</td>"));
    if report.comparison.is_some() {
        out.push_str(&format!("<td>{}</td>", m.other_theory_hz.map_or(number::MISSING.to_string(), hz)));
    }
    if excitations {
        match &m.nearest_excitation {
            Some(s) => {
                let label = report
                    .excitations
                    .get(s.excitation)
                    .map(|e| e.label.trim())
                    .filter(|l| !l.is_empty())
                    .map_or(format!("excitation {}", s.excitation + 1), escape);
                let order =
                    if s.order != 1.0 { format!(" × {}", number::sig(s.order, 4)) } else { String::new() };
                let driven = match s.up_to_hz {
                    Some(top) => format!("{} to {}", hz(s.frequency_hz), hz(top)),
                    None => hz(s.frequency_hz),
                };
                out.push_str(&format!(
                    "<td class=\"mb-nearest\">{label}{order}<span class=\"mb-sub\">{driven}</span></td>"
                ));
                let flag = if s.too_close {
                    "<span class=\"mb-flag mb-flag-close\">⚠ too close</span>"
                } else {
                    "<span class=\"mb-flag mb-flag-clear\">clear</span>"
                };
                let side = match s.separation {
                    v if v < 0.0 => "below",
                    v if v > 0.0 => "above",
                    _ => "inside",
                };
                let band = s
                    .band_separation
                    .map(|b| format!("<span class=\"mb-sub\">band edge {}</span>", signed_percent(b, 3)))
                    .unwrap_or_default();
                out.push_str(&format!(
                    "<td class=\"mb-separation\" data-separation=\"{}\"><span class=\"mb-main\">{}</span>\
                     <span class=\"mb-sub\">{side}</span>{band}{flag}</td>",
                    number::exact(s.separation).unwrap_or_default(),
                    signed_percent(s.separation, 3)
                ));
            }
            None => out.push_str(&format!("<td>{0}</td><td>{0}</td>", number::MISSING)),
        }
    }
    out.push_str("</tr>");
    out
}

fn warnings(report: &Report) -> String {
    if report.warnings.is_empty() {
        return String::new();
    }
    let items: String = report
        .warnings
        .iter()
        .map(|w| {
            format!(
                "<li class=\"mb-warning\" data-code=\"{}\">{}</li>",
                escape(w.code.id()),
                escape(&w.message)
            )
        })
        .collect();
    format!("<ul class=\"mb-warnings\">{items}</ul>")
}

fn plot_area(report: &Report, mode: usize) -> String {
    let buttons: String = report
        .modes
        .iter()
        .map(|m| {
            format!(
                "<button type=\"button\" class=\"mb-button mb-mode-button\" data-show-mode=\"{0}\" \
                 aria-pressed=\"{1}\">Mode {0}<span class=\"mb-button-hz\">{2}</span></button>",
                m.number,
                m.number == mode,
                hz(m.frequency_hz)
            )
        })
        .collect();
    format!(
        "<section class=\"mb-plot-area\"><h4 class=\"mb-results-title\">Mode shape</h4><div class=\"mb-mode-buttons\" \
         role=\"group\" aria-label=\"Mode to draw\">{buttons}</div>{}<p class=\"mb-plot-key\">Circles mark nodes \
         (points that stay still); the dashed line is the beam at rest, drawn thicker where it is stiffer. \
         Deflections are scaled to fit{}.</p></section>",
        plot::plot_svg(report, mode),
        if report.modes.len() > 1 { "; choose a mode above" } else { "" }
    )
}

/// The buckling check of the axial forces, when some segment is compressed: how far they are
/// from the load that buckles the beam.
fn buckling(report: &Report) -> String {
    let Some(factor) = report.critical_load_factor else {
        let compressed = report.beam.segments.iter().any(|s| s.echo.axial_force.is_some_and(|p| p < 0.0));
        return if compressed {
            "<p class=\"mb-buckling\">Buckling: the tensions outweigh the compressions; these axial forces \
             do not buckle the beam at any multiple.</p>"
                .to_string()
        } else {
            String::new()
        };
    };
    format!(
        "<p class=\"mb-buckling\">Buckling: the axial forces are {} of the load that buckles the beam \
         (critical load factor {}: the forces would have to be {} times as large).</p>",
        percent(1.0 / factor, 3),
        number::sig(factor, 4),
        number::sig(factor, 3)
    )
}
