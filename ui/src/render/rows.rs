//! The editor's lists: segments, attachments and excitations, each row with its own fields and
//! a remove button, each list with an add button.

use super::editor::group;
use super::escape::escape;
use super::form::{fixed_choice, Editing, Form, TextOptions};
use crate::catalog::{self, Choice};
use crate::doc::path;
use serde_json::Value;

fn rows<'a>(doc: &'a Value, key: &str) -> &'a [Value] {
    doc.get(key).and_then(Value::as_array).map_or(&[], Vec::as_slice)
}

fn row_open(list: &str, index: usize, title: &str, removable: bool) -> String {
    let remove = if removable {
        format!(
            "<button type=\"button\" class=\"mb-button mb-remove\" data-action=\"remove\" data-list=\"{list}\" \
             data-index=\"{index}\" aria-label=\"Remove {0}\">Remove</button>",
            escape(title)
        )
    } else {
        String::new()
    };
    format!(
        "<div class=\"mb-row\" data-row=\"{list}[{index}]\"><div class=\"mb-row-head\"><span class=\"mb-row-title\">{}\
         </span>{remove}</div><div class=\"mb-grid\">",
        escape(title)
    )
}

fn add_button(list: &str, words: &str) -> String {
    format!("<button type=\"button\" class=\"mb-button mb-add\" data-action=\"add\" data-list=\"{list}\">{words}</button>")
}

fn names(list: &'static [Choice]) -> Vec<(&'static str, &'static str)> {
    list.iter().map(|c| (c.id, c.name)).collect()
}

/// The segments, left to right.
pub(crate) fn segments(form: &mut Form<'_>) -> String {
    let doc = form.doc;
    let segments = rows(doc, "segments");
    let mut body = String::new();
    for (i, segment) in segments.iter().enumerate() {
        let base = format!("segments[{i}]");
        body.push_str(&row_open("segments", i, &format!("Segment {}", i + 1), segments.len() > 1));
        body.push_str(&form.text(
            &format!("{base}.length"),
            "Length",
            TextOptions { kind: Some(modebench::units::Kind::Length), ..TextOptions::default() },
        ));
        let by_section = segment.get("section").is_some() || segment.get("material").is_some();
        body.push_str(&segment_by(i, by_section, form.editing));
        if by_section {
            body.push_str(&section_fields(form, &base, segment));
        } else {
            for spec in &catalog::PROPERTY_FIELDS {
                body.push_str(&form.spec(&base, spec));
            }
        }
        body.push_str(&axial_fields(form, &base, segment, by_section));
        body.push_str("</div></div>");
    }
    body.push_str(&add_button("segments", "Add a segment"));
    group("mb-segments", "Segments, left to right", &body)
}

/// How a segment is described; this choice is not a scenario field but decides which are.
fn segment_by(index: usize, by_section: bool, editing: Editing) -> String {
    const WAYS: [(&str, &str); 2] =
        [("section", "Section and material"), ("properties", "Bending stiffness and mass")];
    let chosen = if by_section { 0 } else { 1 };
    if editing == Editing::Fixed {
        return fixed_choice("", "Described by", "", WAYS[chosen].1, "") + "</div>";
    }
    let options: String = WAYS
        .iter()
        .enumerate()
        .map(|(i, (value, words))| {
            format!(
                "<option value=\"{value}\"{}>{words}</option>",
                if i == chosen { " selected" } else { "" }
            )
        })
        .collect();
    format!(
        "<label class=\"mb-field mb-choice\"><span class=\"mb-label\">Described by</span><span class=\"mb-select-row\">\
         <select class=\"mb-select\" data-control=\"segment-by\" data-index=\"{index}\">{options}</select></span></label>"
    )
}

fn section_fields(form: &mut Form<'_>, base: &str, segment: &Value) -> String {
    let mut out = String::new();
    let section_path = format!("{base}.section");
    let shape = catalog::chosen(&catalog::SHAPES, segment.get("section"), "shape");
    let shape_id = segment.get("section").and_then(|s| s.get("shape")).and_then(Value::as_str).unwrap_or("");
    out.push_str(&form.select(
        &format!("{section_path}.shape"),
        "Section",
        &names(&catalog::SHAPES),
        shape_id,
        "",
    ));
    if shape_id == "pipe" {
        out.push_str(&pipe_fields(form, &section_path));
    }
    if let Some(shape) = shape {
        for spec in shape.fields {
            out.push_str(&form.spec(&section_path, spec));
        }
        if shape.id == "i-beam" {
            let axis = path::text(form.doc, &format!("{section_path}.axis"));
            let axis = if axis.is_empty() { "strong".to_string() } else { axis };
            out.push_str(&form.select(
                &format!("{section_path}.axis"),
                "Bends about (strong: web in the plane)",
                &[("strong", "Strong axis"), ("weak", "Weak axis")],
                &axis,
                "",
            ));
        }
    }
    out.push_str(&material_fields(form, base, segment));
    let extra = format!("{base}.extra_mass");
    let has = |key: &str| segment.get("extra_mass").and_then(|e| e.get(key)).is_some();
    let hollow = matches!(shape_id, "tube" | "pipe" | "rectangular-tube" | "custom");
    let round = matches!(shape_id, "tube" | "pipe" | "round");
    if hollow || has("contents") {
        out.push_str(&contents_field(form, &extra, segment));
    }
    for spec in &catalog::EXTRA_MASS_FIELDS {
        if spec.name != "contents_density" || hollow || has(spec.name) {
            out.push_str(&form.spec(&extra, spec));
        }
    }
    if round || has("submerged") {
        out.push_str(
            "<p class=\"mb-hint\">Contents fill the bore and move with it. Surrounding water is outside the part, \
             which vibrates in it. A water-filled pipe in air has contents only; tick the box below only if the \
             part is under water (then both count, once each).</p>",
        );
        out.push_str(&form.tick(
            &format!("{extra}.submerged"),
            "Under water: it vibrates surrounded by water (not what fills it)",
        ));
        if has("submerged") {
            for spec in &catalog::SUBMERGED_FIELDS {
                out.push_str(&form.spec(&format!("{extra}.submerged"), spec));
            }
        }
    }
    out
}

fn material_fields(form: &mut Form<'_>, base: &str, segment: &Value) -> String {
    let presets = modebench::material::presets();
    let mut options: Vec<(&str, &str)> = presets.iter().map(|m| (m.id, m.name)).collect();
    options.push(("custom", "Other (type its properties)"));
    let material = segment.get("material");
    let current = match material {
        Some(Value::String(id)) => id.clone(),
        // A preset recorded with its values shows as the preset, its values below it.
        Some(Value::Object(o)) => o.get("preset").and_then(Value::as_str).unwrap_or("custom").to_string(),
        _ => String::new(),
    };
    let path = format!("{base}.material");
    let mut out = form.select(&path, "Material", &options, &current, "");
    if material.is_some_and(Value::is_object) {
        for spec in catalog::MATERIAL_FIELDS.iter().chain(&catalog::MATERIAL_RECORD_FIELDS) {
            out.push_str(&form.spec(&path, spec));
        }
    }
    out
}

/// Masses, springs and supports along the beam.
pub(crate) fn attachments(form: &mut Form<'_>) -> String {
    let doc = form.doc;
    let list = rows(doc, "attachments");
    let mut body = String::new();
    for (i, attachment) in list.iter().enumerate() {
        let base = format!("attachments[{i}]");
        let choice = catalog::chosen(&catalog::ATTACHMENTS, Some(attachment), "type");
        let type_id = attachment.get("type").and_then(Value::as_str).unwrap_or("");
        let title = match attachment.get("label").and_then(Value::as_str).filter(|l| !l.trim().is_empty()) {
            Some(label) => format!("{} — {label}", i + 1),
            None => format!("Attachment {}", i + 1),
        };
        body.push_str(&row_open("attachments", i, &title, true));
        body.push_str(&form.select(
            &format!("{base}.type"),
            "Type",
            &names(&catalog::ATTACHMENTS),
            type_id,
            "",
        ));
        body.push_str(&form.text(
            &format!("{base}.position"),
            "Position from the left end",
            TextOptions { kind: Some(modebench::units::Kind::Length), ..TextOptions::default() },
        ));
        for spec in choice.map_or(&[][..], |c| c.fields) {
            body.push_str(&form.spec(&base, spec));
        }
        body.push_str(&form.text(
            &format!("{base}.label"),
            "Label",
            TextOptions { placeholder: Some("optional name"), optional: true, ..TextOptions::default() },
        ));
        body.push_str("</div></div>");
    }
    body.push_str(&add_button("attachments", "Add an attachment"));
    group("mb-attachments", "Attachments", &body)
}

/// The frequencies the beam is driven at.
pub(crate) fn excitations(form: &mut Form<'_>) -> String {
    let doc = form.doc;
    let list = rows(doc, "excitations");
    let mut body = String::new();
    for i in 0..list.len() {
        let base = format!("excitations[{i}]");
        body.push_str(&row_open("excitations", i, &format!("Excitation {}", i + 1), true));
        body.push_str(&form.text(
            &format!("{base}.label"),
            "What drives it",
            TextOptions {
                placeholder: Some("e.g. pump running speed"),
                optional: true,
                ..TextOptions::default()
            },
        ));
        body.push_str(&form.text(
            &format!("{base}.frequency"),
            "Frequency",
            TextOptions {
                kind: Some(modebench::units::Kind::Frequency),
                placeholder: Some("e.g. 1780 rpm or 60 Hz"),
                ..TextOptions::default()
            },
        ));
        body.push_str(&form.text(
            &format!("{base}.up_to"),
            "Up to (variable speed)",
            TextOptions {
                placeholder: Some("optional, e.g. 1800 rpm"),
                optional: true,
                ..TextOptions::default()
            },
        ));
        // Older scenarios count multiples; the orders field says which ones.
        if list[i].get("harmonics").is_some() {
            body.push_str(&form.text(
                &format!("{base}.harmonics"),
                "Multiples to check",
                TextOptions {
                    placeholder: Some("1"),
                    optional: true,
                    numeric: true,
                    ..TextOptions::default()
                },
            ));
        } else {
            body.push_str(&form.text(
                &format!("{base}.orders"),
                "Orders (1×, 2×, blade count…)",
                TextOptions { placeholder: Some("1"), optional: true, ..TextOptions::default() },
            ));
        }
        body.push_str("</div></div>");
    }
    body.push_str(&add_button("excitations", "Add an excitation"));
    group("mb-excitations", "Excitations (running speeds, line frequency, blade pass)", &body)
}

/// A segment's axial force, and the temperature change with its ends held where the section
/// and material give E·A·α.
fn axial_fields(form: &mut Form<'_>, base: &str, segment: &Value, by_section: bool) -> String {
    let mut out = form.spec(base, &catalog::AXIAL_FIELDS[0]);
    if by_section || segment.get(catalog::AXIAL_FIELDS[1].name).is_some() {
        out.push_str(&form.spec(base, &catalog::AXIAL_FIELDS[1]));
    }
    out
}

/// A steel pipe's nominal size and schedule, from the table; choosing either records the
/// outside diameter and wall it gives (drawn after these as text fields).
fn pipe_fields(form: &mut Form<'_>, section_path: &str) -> String {
    use modebench::section::pipe;
    let size = path::text(form.doc, &format!("{section_path}.nominal_size"));
    let schedule = path::text(form.doc, &format!("{section_path}.schedule"));
    let sizes: Vec<(&str, String)> = pipe::sizes().map(|s| (s, format!("{s} in"))).collect();
    let sizes: Vec<(&str, &str)> = sizes.iter().map(|(id, words)| (*id, words.as_str())).collect();
    let mut out = form.select(&format!("{section_path}.nominal_size"), "Nominal size", &sizes, &size, "");
    let schedules: Vec<(&str, &str)> = pipe::schedules(&size).into_iter().map(|s| (s, s)).collect();
    out.push_str(&form.select(&format!("{section_path}.schedule"), "Schedule", &schedules, &schedule, ""));
    out
}

/// What fills the bore: a preset (its density recorded beside it), or a density typed.
fn contents_field(form: &mut Form<'_>, extra: &str, segment: &Value) -> String {
    let presets = modebench::extra_mass::contents_presets();
    let mut options: Vec<(&str, &str)> = vec![("none", "Empty, or a density typed below")];
    options.extend(presets.iter().map(|c| (c.id, c.name)));
    let current = segment
        .get("extra_mass")
        .and_then(|e| e.get("contents"))
        .and_then(Value::as_str)
        .unwrap_or("none")
        .to_string();
    form.select(&format!("{extra}.contents"), "Contents", &options, &current, "")
}
