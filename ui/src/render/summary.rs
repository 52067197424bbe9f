//! The results in one line, kept in view at the foot of the screen while the reader works down
//! the editor on a tablet: each mode's frequency, and its separation from the nearest
//! excitation when there are excitations. The full mode table below is the record; this is a
//! copy of it for the eye, hidden from assistive technology (which reads the table, announced
//! as it changes).

use super::number::{hz, percent};
use modebench::Report;

/// Modes shown in the line; more would wrap to a block that hides the fields.
const SHOWN: usize = 6;

/// The summary element, greyed (`stale`) when its results belong to an earlier input; a line
/// that says so when nothing has been solved yet.
pub fn summary_html(report: Option<&Report>, stale: bool) -> String {
    let class = if stale { "mb-summary mb-stale-summary" } else { "mb-summary" };
    format!("<div class=\"{class}\" aria-hidden=\"true\">{}</div>", summary_inner(report, stale))
}

/// What the summary element holds, for the page to draw over its last drawing.
pub fn summary_inner(report: Option<&Report>, stale: bool) -> String {
    let Some(report) = report else {
        return "<span class=\"mb-summary-title\">No results yet</span>".to_string();
    };
    let mut items = String::new();
    for m in report.modes.iter().take(SHOWN) {
        let (close, separation) = match &m.nearest_excitation {
            Some(s) => {
                (s.too_close, format!(" <span class=\"mb-summary-sep\">{}</span>", percent(s.margin, 2)))
            }
            None => (false, String::new()),
        };
        let mark = if close { " mb-summary-close" } else { "" };
        let flag = if close { "⚠ " } else { "" };
        items.push_str(&format!(
            "<span class=\"mb-summary-mode{mark}\">{flag}{}: <span class=\"mb-summary-hz\">{}</span>{separation}</span>",
            m.number,
            hz(m.frequency_hz)
        ));
    }
    if report.modes.len() > SHOWN {
        items.push_str(&format!(
            "<span class=\"mb-summary-more\">+{} more below</span>",
            report.modes.len() - SHOWN
        ));
    }
    let title = if stale { "Earlier results" } else { "Modes" };
    format!("<span class=\"mb-summary-title\">{title}</span>{items}")
}
