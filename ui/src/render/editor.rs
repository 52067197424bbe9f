//! The calculator's editor: set-up, ends, segments, attachments and excitations, every input
//! bound to its scenario path through `data-field`.

use super::errors;
use super::escape::escape;
use super::form::{Editing, Form, TextOptions};
use super::rows;
use super::symbols;
use crate::catalog;
use crate::doc::path;
use modebench::Error;
use serde_json::Value;

/// The editor's inner HTML for a scenario, with `error` (if any) beside the field it concerns,
/// or above the editor when it concerns no field on show.
pub fn editor_html(doc: &Value, error: Option<&Error>, editing: Editing) -> String {
    // The error's place depends on which fields are on show, so write the form once to learn
    // them, then again with the message in place. Writing it costs microseconds.
    let mut probe = Form::new(doc, editing, None, None);
    write(&mut probe, String::new());
    let place = error.and_then(|e| {
        let fields: Vec<&str> = probe.fields.iter().map(String::as_str).collect();
        errors::placement(&e.path, &fields).map(str::to_string)
    });
    let general = match (error, &place) {
        (Some(e), None) => errors::field_error_html(e, true),
        _ => String::new(),
    };
    let mut form = Form::new(doc, editing, error, place);
    write(&mut form, general)
}

/// The field paths the editor shows for a scenario, in page order.
pub fn field_paths(doc: &Value) -> Vec<String> {
    let mut form = Form::new(doc, Editing::Live, None, None);
    write(&mut form, String::new());
    form.fields
}

fn write(form: &mut Form<'_>, general: String) -> String {
    let mut out = format!("<div class=\"mb-general-errors\">{general}</div>");
    out.push_str(&setup(form));
    out.push_str(&ends(form));
    out.push_str(&rows::segments(form));
    out.push_str(&rows::attachments(form));
    out.push_str(&rows::excitations(form));
    out.push_str(&super::design_rows::design(form));
    out.push_str(
        "<p class=\"mb-help\">A number typed alone is read in the unit shown beside its field, which follows the \
         units chosen above (a frequency field keeps rpm once it holds rpm). Any other unit may be typed with the \
         number, as in 1450 mm, 4.5\", 24 ft, 2.8 kg, 62.4 lb/ft3, 30e6 psi, 2.5e6 N/m or 1780 rpm. Springs also \
         accept “rigid”.</p>",
    );
    out
}

/// A group of fields with a heading.
pub(crate) fn group(class: &str, heading: &str, body: &str) -> String {
    format!(
        "<section class=\"mb-group {class}\"><h4 class=\"mb-group-title\">{}</h4>{body}</section>",
        escape(heading)
    )
}

fn setup(form: &mut Form<'_>) -> String {
    let systems: Vec<(&str, &str)> = catalog::UNIT_SYSTEMS.iter().map(|(s, name)| (s.id(), *name)).collect();
    let units = text_or(form.doc, "units", "si");
    let theory = text_or(form.doc, "theory", "euler-bernoulli");
    let mut body = String::from("<div class=\"mb-grid\">");
    body.push_str(&form.select("units", "Units", &systems, &units, ""));
    body.push_str(&form.select("theory", "Beam theory", &catalog::THEORIES, &theory, ""));
    body.push_str(&form.text(
        "modes",
        "Modes to find (1–20)",
        TextOptions { placeholder: Some("6"), numeric: true, ..TextOptions::default() },
    ));
    body.push_str(&form.text(
        "margin",
        "Separation margin wanted",
        TextOptions { placeholder: Some("20 %"), optional: true, ..TextOptions::default() },
    ));
    body.push_str(&form.text(
        "report_point",
        "Equivalent system of mode 1 at",
        TextOptions {
            kind: Some(modebench::units::Kind::Length),
            placeholder: Some("largest deflection"),
            optional: true,
            ..TextOptions::default()
        },
    ));
    body.push_str("</div>");
    group("mb-setup", "Set-up", &body)
}

/// The text of a string at `path`, or `default` when absent.
fn text_or(doc: &Value, key: &str, default: &str) -> String {
    match path::get(doc, key) {
        Some(Value::String(s)) => s.clone(),
        Some(other) => crate::doc::text::write(other),
        None => default.to_string(),
    }
}

fn ends(form: &mut Form<'_>) -> String {
    let options: Vec<(&str, &str)> = catalog::ENDS.iter().map(|c| (c.id, c.name)).collect();
    let mut body = String::from("<div class=\"mb-grid mb-ends-grid\">");
    for (key, heading, right) in [("left", "Left end (x = 0)", false), ("right", "Right end", true)] {
        let value = path::get(form.doc, key);
        let kind = match value {
            Some(Value::String(s)) => s.clone(),
            Some(v) => v.get("type").and_then(Value::as_str).unwrap_or("").to_string(),
            None => String::new(),
        };
        let rotational = value.and_then(|v| v.get("rotational")).is_some_and(|r| r.as_f64() != Some(0.0));
        let icon = symbols::end_icon(&kind, right, rotational);
        body.push_str("<div class=\"mb-end\">");
        body.push_str(&form.select(key, heading, &options, &kind, &icon));
        if let Some(elastic) = catalog::find(&catalog::ENDS, "elastic").filter(|_| kind == "elastic") {
            for spec in elastic.fields {
                body.push_str(&form.spec(key, spec));
            }
        }
        body.push_str("</div>");
    }
    body.push_str("</div>");
    group("mb-ends", "Ends", &body)
}
