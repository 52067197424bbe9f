//! The case bar under a live calculator's head: which case is open and its title, the steps on
//! cases with the undo, sharing and files, and the calculation record for the printed sheet.
//!
//! Drawn only by the live widget (the page as built has no cases); every control carries a
//! `data-action`, `data-control`, `data-field` or `data-record` that the widget listens for, and
//! nothing inline.

use super::{Cases, RECORD};
use crate::render::escape;
use serde_json::Value;

/// The `<option>`s of the case list, the open one selected.
pub fn options_html(cases: &Cases) -> String {
    let open = cases.open_case().id;
    cases
        .list()
        .iter()
        .map(|c| {
            let selected = if c.id == open { " selected" } else { "" };
            format!("<option value=\"{}\"{selected}>{}</option>", c.id, escape(&c.name()))
        })
        .collect()
}

/// The whole bar. `note` is said in its status line (what was just done, or why it failed).
pub fn bar_html(cases: &Cases, note: &str) -> String {
    let case = cases.open_case();
    let title = case.scenario.get("title").and_then(Value::as_str).unwrap_or("");
    let undo = match cases.undo_label() {
        Some(what) => format!(
            "<button type=\"button\" class=\"mb-button\" data-action=\"undo\">Undo: {}</button>",
            escape(what)
        ),
        None => {
            "<button type=\"button\" class=\"mb-button\" data-action=\"undo\" disabled>Undo</button>".into()
        }
    };
    let record: String = RECORD
        .iter()
        .map(|(key, label)| {
            let value = case.record.get(*key).and_then(Value::as_str).unwrap_or("");
            format!(
                "<label class=\"mb-field\"><span class=\"mb-label\">{label}</span><input class=\"mb-input\" type=\"text\" \
                 data-record=\"{key}\" value=\"{}\" autocomplete=\"off\"></label>",
                escape(value)
            )
        })
        .collect();
    format!(
        "<div class=\"mb-cases\" role=\"group\" aria-label=\"Your cases\">\
         <div class=\"mb-grid mb-case-pick\">\
         <label class=\"mb-field\"><span class=\"mb-label\">Case</span><select class=\"mb-select mb-case-list\" \
         data-control=\"case\">{options}</select></label>\
         <label class=\"mb-field\"><span class=\"mb-label\">Title of this case</span><input class=\"mb-input\" type=\"text\" \
         data-field=\"title\" value=\"{title}\" autocomplete=\"off\"></label></div>\
         <div class=\"mb-case-actions\">\
         <button type=\"button\" class=\"mb-button\" data-action=\"case-blank\">New blank case</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"case-example\">New copy of the example</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"case-duplicate\">Duplicate</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"case-delete\">Delete this case</button>\
         {undo}</div>\
         <details class=\"mb-fold mb-share\" data-part=\"share\"><summary>Share and save this case</summary>\
         <p class=\"mb-help\">The link carries the whole case in its part after “#”, which browsers never send \
         to a server. The file is the scenario in the documented format.</p>\
         <div class=\"mb-case-actions\">\
         <button type=\"button\" class=\"mb-button\" data-action=\"share-link\">Make a link to this case</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"save-file\">Download the scenario (JSON)</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"open-file\">Open a scenario file…</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"results-csv\">Download the results (CSV)</button>\
         <button type=\"button\" class=\"mb-button\" data-action=\"results-json\">Download the results (JSON)</button>\
         </div><label class=\"mb-field mb-share-field\"><span class=\"mb-label\">Link to this case</span>\
         <input type=\"text\" class=\"mb-input mb-share-link\" readonly value=\"\"></label></details>\
         <details class=\"mb-fold mb-record\" data-part=\"record\"><summary>Calculation record (printed with the \
         sheet)</summary><div class=\"mb-grid\">{record}</div></details>\
         <p class=\"mb-case-note\" role=\"status\">{note}</p></div>",
        options = options_html(cases),
        title = escape(title),
        note = escape(note),
    )
}
