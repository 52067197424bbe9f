//! What the printed calculation sheet adds to a live calculator: the case's title, the date, the
//! calculation record (prepared by, checked by, revision) the reader fills in, what the case is
//! (the page's worked example or a case of the reader's own, to which the page's text does not
//! apply), and every mode's shape side by side. Shown in print only (`print.css`).

use super::{title_of, Case, RECORD};
use crate::render::{escape, plot_svg};
use modebench::Report;
use serde_json::Value;

/// The sheet's head for the open case, `date` as the reader's browser gives it (YYYY-MM-DD).
/// `own` is whether the case differs from the page's example.
pub fn head_html(case: &Case, own: bool, date: &str) -> String {
    let mut cells = vec![("Date", date.to_string())];
    for (key, label) in RECORD {
        let value = case.record.get(key).and_then(Value::as_str).map(str::trim).unwrap_or("");
        cells.push((label, value.to_string()));
    }
    let record: String = cells
        .iter()
        .map(|(label, value)| {
            // An empty line is left to be filled in by hand on the printed sheet.
            let value = if value.is_empty() {
                "<span class=\"mb-sheet-blank\"></span>".into()
            } else {
                escape(value)
            };
            format!("<div class=\"mb-sheet-cell\"><dt>{label}</dt><dd>{value}</dd></div>")
        })
        .collect();
    let basis = if own {
        "A case of the reader's own: the page's text, figures and notes describe its worked example, not \
         this case. The cautions below apply to every case."
    } else {
        "The page's worked example, as described in the page's text."
    };
    format!(
        "<section class=\"mb-sheet\"><h2 class=\"mb-sheet-title\">{}</h2><dl class=\"mb-sheet-record\">{record}</dl>\
         <p class=\"mb-sheet-basis\">{basis}</p></section>",
        escape(&title_of(&case.scenario))
    )
}

/// Every mode's shape, small and side by side, for the printed sheet.
pub fn shapes_html(report: &Report) -> String {
    if report.modes.is_empty() {
        return String::new();
    }
    let figures: String = report
        .modes
        .iter()
        .map(|m| {
            format!(
                "<figure class=\"mb-sheet-shape\">{}<figcaption>Mode {}: {} Hz</figcaption></figure>",
                plot_svg(report, m.number),
                m.number,
                modebench::units::significant(m.frequency_hz, 4)
            )
        })
        .collect();
    format!(
        "<section class=\"mb-sheet-shapes\"><h4 class=\"mb-results-title\">Every mode's shape</h4>\
         <div class=\"mb-sheet-grid\">{figures}</div></section>"
    )
}
