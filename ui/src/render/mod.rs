//! HTML and SVG for a calculator: the same markup prerendered by the site builder and redrawn
//! live by the widget.
//!
//! Everything here is a pure function of the scenario (as typed) and its results, so it compiles
//! natively and in WebAssembly alike. User text is always escaped; no element carries a `style`
//! attribute (the pages' Content-Security-Policy forbids inline styles), and no number is written
//! without a guard, so "NaN", "inf" and "undefined" never reach the page.

mod band;
#[cfg(feature = "bench")]
pub mod bench;
mod design;
mod design_rows;
mod echo;
mod editor;
mod errors;
mod escape;
mod form;
mod map;
mod number;
mod offer;
pub mod patch;
mod plot;
mod results;
mod rows;
mod summary;
mod symbols;

pub use editor::{editor_html, field_paths};
pub use errors::{field_error_html, is_unfilled, message, needed_html, placement};
pub use escape::escape;
pub use form::Editing;
pub use offer::offer_html;
pub use plot::{plot_svg, thin_shapes, THIN_TOLERANCE};
pub use results::{results_html, results_inner, stale_note, View};
pub use summary::{summary_html, summary_inner};

use crate::doc;
use modebench::{Error, Report};
use serde_json::Value;

/// The whole calculator for a scenario given as JSON text, as a page is built: the root element
/// with the scenario in `data-modebench`, the editor with its values fixed until the engine takes
/// over, and the results (or the error beside its field).
pub fn widget_html(scenario_json: &str) -> String {
    let (doc, outcome) = match doc::read(scenario_json) {
        Ok(doc) => {
            // Drawn as the live calculator draws it, from each shape's samples that its plot needs.
            let outcome = doc::solve(&doc).map(|mut report| {
                thin_shapes(&mut report);
                report
            });
            (doc, outcome)
        }
        Err(e) => (Value::Object(serde_json::Map::new()), Err(e)),
    };
    let (report, error) = match &outcome {
        Ok(report) => (Some(report), None),
        Err(e) => (None, Some(e)),
    };
    format!(
        "<div class=\"mb-calc\" data-modebench=\"{}\">{}</div>",
        escape(scenario_json),
        calculator_inner(&doc, error, report, &View::default(), Editing::Fixed)
    )
}

/// The inside of a calculator's root. With an `error`, `report` is the last good one (or none)
/// and is shown greyed.
pub fn calculator_inner(
    doc: &Value,
    error: Option<&Error>,
    report: Option<&Report>,
    view: &View,
    editing: Editing,
) -> String {
    let title = doc.get("title").and_then(Value::as_str).map(str::trim).filter(|t| !t.is_empty());
    let title = title.map(|t| format!("<h3 class=\"mb-title\">{}</h3>", escape(t))).unwrap_or_default();
    // Both notes are in the markup; the style sheet shows the one for the state the page's script
    // leaves on the root (none while loading, `data-engine="unavailable"` when it gave up), since
    // no script may be written into the page.
    format!(
        "<div class=\"mb-head\">{title}<p class=\"mb-static-note\">This calculator becomes editable once the page's \
         script has loaded; until then it shows the worked example.</p><p class=\"mb-unavailable-note\">The live \
         calculator could not start in this browser (its script or WebAssembly is unavailable), so it cannot be \
         edited. The figures shown are the page's worked example, computed when the page was built.</p>\
         <button type=\"button\" class=\"mb-button mb-restore\" data-action=\"restore\">Restore the page's \
         example</button></div><div class=\"mb-body\"><div class=\"mb-editor\">{}</div>{}{}</div>{}",
        editor_html(doc, error, editing),
        summary_html(report, error.is_some()),
        results_html(report, error.is_some(), view),
        caution_html()
    )
}

/// The control that takes back the newest recorded step ("Undo: use the fitted value").
pub fn undo_html(what: &str) -> String {
    format!(
        "<p class=\"mb-undo-bar\" role=\"status\"><button type=\"button\" class=\"mb-button mb-undo\" \
         data-action=\"undo\">Undo: {}</button></p>",
        escape(what)
    )
}

/// The caution shown under every calculator's results.
pub fn caution_html() -> &'static str {
    "<p class=\"mb-caution\"><strong>Use with care.</strong> These natural frequencies are estimates from an \
     idealised model: confirm them by test (a tap test or a run-up) before relying on them. Running near a \
     natural frequency causes resonance, which cracks welds and fails parts in fatigue. Follow the codes and \
     standards that apply to your equipment, and have a qualified engineer review any design whose failure \
     could hurt someone.</p>"
}
