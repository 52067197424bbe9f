//! The editor's design requests: tolerances on inputs, measured frequencies, the inputs to
//! calibrate to them and the input to resize, each input chosen from the case's own numeric
//! inputs.

use super::editor::group;
use super::escape::escape;
use super::form::{Form, TextOptions};
use crate::doc::design::input_choices;
use serde_json::Value;

fn rows<'a>(doc: &'a Value, key: &str) -> &'a [Value] {
    doc.get(key).and_then(Value::as_array).map_or(&[], Vec::as_slice)
}

fn row_open(list: &str, index: usize, title: &str) -> String {
    format!(
        "<div class=\"mb-row\" data-row=\"{list}[{index}]\"><div class=\"mb-row-head\"><span class=\"mb-row-title\">{0}\
         </span><button type=\"button\" class=\"mb-button mb-remove\" data-action=\"remove\" data-list=\"{list}\" \
         data-index=\"{index}\" aria-label=\"Remove {0}\">Remove</button></div><div class=\"mb-grid\">",
        escape(title)
    )
}

fn add_button(list: &str, words: &str) -> String {
    format!("<button type=\"button\" class=\"mb-button mb-add\" data-action=\"add\" data-list=\"{list}\">{words}</button>")
}

/// The select of an input, with the case's inputs (and, for a tolerance, its two ends); a path
/// typed by hand that names none of them is kept as an option of its own.
fn input_select(form: &mut Form<'_>, path: &str, choices: &[(String, String)], ends: bool) -> String {
    let current = crate::doc::path::text(form.doc, path);
    let mut options: Vec<(String, String)> = choices.to_vec();
    if ends {
        options.push(("left".into(), "Left end: anywhere from pinned to clamped".into()));
        options.push(("right".into(), "Right end: anywhere from pinned to clamped".into()));
    }
    if !current.is_empty() && !options.iter().any(|(p, _)| *p == current) {
        options.push((current.clone(), current.clone()));
    }
    let refs: Vec<(&str, &str)> = options.iter().map(|(a, b)| (a.as_str(), b.as_str())).collect();
    form.select(path, "Input", &refs, &current, "")
}

fn optional(placeholder: &str) -> TextOptions<'_> {
    TextOptions { placeholder: Some(placeholder), optional: true, ..TextOptions::default() }
}

/// The design group of the editor.
pub(crate) fn design(form: &mut Form<'_>) -> String {
    let doc = form.doc;
    // Listing the inputs walks the whole scenario: only when a request needs the list.
    let needed =
        ["tolerances", "calibrate"].iter().any(|k| !rows(doc, k).is_empty()) || doc.get("resize").is_some();
    let choices = if needed { input_choices(doc) } else { Vec::new() };
    let mut body = String::from(
        "<p class=\"mb-help\">Optional. Tolerances give each mode a band, judged against the margin at its edges; \
         measured frequencies appear beside the computed ones and on the frequency map, and can calibrate one or two \
         uncertain inputs; resizing finds the values of one input for which every mode clears every excitation.</p>",
    );
    body.push_str("<h5 class=\"mb-subtitle\">Tolerances</h5>");
    for (i, t) in rows(doc, "tolerances").iter().enumerate() {
        let base = format!("tolerances[{i}]");
        body.push_str(&row_open("tolerances", i, &format!("Tolerance {}", i + 1)));
        body.push_str(&input_select(form, &format!("{base}.field"), &choices, true));
        let is_end = matches!(t.get("field").and_then(Value::as_str), Some("left" | "right"));
        if is_end {
            body.push_str(&form.text(&format!("{base}.from"), "From", optional("pinned")));
            body.push_str(&form.text(&format!("{base}.to"), "To", optional("clamped")));
        } else if t.get("from").is_some() || t.get("to").is_some() {
            body.push_str(&form.text(&format!("{base}.from"), "From", optional("low value with unit")));
            body.push_str(&form.text(&format!("{base}.to"), "To", optional("high value with unit")));
        } else {
            body.push_str(&form.text(&format!("{base}.plus_minus"), "± (a percentage)", optional("5 %")));
        }
        body.push_str("</div></div>");
    }
    body.push_str(&add_button("tolerances", "Add a tolerance"));
    body.push_str("<h5 class=\"mb-subtitle\">Measured frequencies</h5>");
    for i in 0..rows(doc, "measured").len() {
        let base = format!("measured[{i}]");
        body.push_str(&row_open("measured", i, &format!("Measurement {}", i + 1)));
        body.push_str(&form.text(
            &format!("{base}.mode"),
            "Mode number",
            TextOptions { placeholder: Some("1"), numeric: true, ..TextOptions::default() },
        ));
        body.push_str(&form.text(
            &format!("{base}.frequency"),
            "Measured frequency",
            TextOptions { placeholder: Some("e.g. 14.2 Hz"), ..TextOptions::default() },
        ));
        body.push_str("</div></div>");
    }
    body.push_str(&add_button("measured", "Add a measured frequency"));
    body.push_str("<h5 class=\"mb-subtitle\">Calibrate to the measurements (one or two inputs)</h5>");
    let calibrate = rows(doc, "calibrate");
    for i in 0..calibrate.len() {
        let base = format!("calibrate[{i}]");
        body.push_str(&row_open("calibrate", i, &format!("Uncertain input {}", i + 1)));
        body.push_str(&input_select(form, &format!("{base}.field"), &choices, false));
        body.push_str(&form.text(&format!("{base}.from"), "Lowest plausible", optional("value with unit")));
        body.push_str(&form.text(&format!("{base}.to"), "Highest plausible", optional("value with unit")));
        body.push_str("</div></div>");
    }
    if calibrate.len() < modebench::schema::MAX_UNKNOWNS {
        body.push_str(&add_button("calibrate", "Add an input to calibrate"));
    }
    body.push_str("<h5 class=\"mb-subtitle\">Resize to the margin</h5>");
    body.push_str(&form.tick("resize", "Find the values of one input that clear every margin"));
    if doc.get("resize").is_some() {
        body.push_str("<div class=\"mb-grid\">");
        body.push_str(&input_select(form, "resize.field", &choices, false));
        body.push_str(&form.text("resize.from", "From", optional("value with unit")));
        body.push_str(&form.text("resize.to", "To", optional("value with unit")));
        body.push_str(&form.text(
            "resize.points",
            "Points solved (20–1000)",
            TextOptions { placeholder: Some("200"), optional: true, numeric: true, ..TextOptions::default() },
        ));
        body.push_str("</div>");
    }
    group("mb-design", "Design work: tolerances, measurements, calibration, resizing", &body)
}
