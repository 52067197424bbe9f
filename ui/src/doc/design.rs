//! Applying what the design study proposes: the fitted values of a calibration, or the nearest
//! feasible value of a resizing, written into the case in its own units as one step (the
//! calculator records it in its undo history before applying it).
//!
//! A value goes where the study read it: a preset material's modulus turns the material into
//! its properties, an end's spring turns a named end into springs, as the core does when it
//! tries values (`modebench::design::inputs::set`); the value itself is then written as text
//! with the case's unit, to six significant figures, so it reads as the user would type it.

use super::path;
use modebench::design::inputs;
use modebench::design::study::{InputEcho, ResizeReport};
use modebench::units::{display_unit, significant, Kind, UnitSystem};
use modebench::{FieldPath, Report};
use serde_json::Value;

/// One value to write.
#[derive(Clone, Debug, PartialEq)]
pub struct Change {
    /// The input's path in the scenario.
    pub path: String,
    /// The value, SI.
    pub si: f64,
    /// The value as written into the case: "12.3457 mm".
    pub text: String,
}

/// A value in the case's unit, as text: "12.3457 mm" (SI for a ratio).
pub fn text_of(si: f64, kind: Kind, system: UnitSystem) -> String {
    let unit = display_unit(kind, system);
    let shown = significant(si * unit.per_si, 6);
    if unit.symbol.is_empty() {
        shown
    } else {
        format!("{shown} {}", unit.symbol)
    }
}

/// The fitted values of the report's calibration, with words for the undo control.
pub fn fit_changes(doc: &Value, report: &Report) -> Option<(Vec<Change>, String)> {
    let c = report.design.calibration.as_ref()?;
    if c.fitted.is_empty() || c.fitted.len() != c.inputs.len() {
        return None;
    }
    let system = super::unit_system(doc);
    let changes: Vec<Change> = c
        .inputs
        .iter()
        .zip(&c.fitted)
        .map(|(input, v)| Change { path: input.path.clone(), si: *v, text: text_of(*v, input.kind, system) })
        .collect();
    let what = match (&c.inputs[..], &changes[..]) {
        ([input], [change]) => set_words(&input.label, &change.text),
        _ => "use the fitted values".to_string(),
    };
    Some((changes, what))
}

/// Words for the undo control that name the input and its new value: "set head mass to 3.453 kg".
fn set_words(label: &str, text: &str) -> String {
    // Only the label's capital first letter is lowered, in ASCII: a symbol in it ("modulus E")
    // keeps its case, and `str::to_lowercase` would bring Unicode's case tables (some 16 KB)
    // into the page's engine.
    let mut label = label.to_string();
    if label.is_char_boundary(1) {
        label[..1].make_ascii_lowercase();
    }
    format!("set {label} to {text}")
}

/// The value a resizing puts into the model, SI. The feasible value nearest today's lies on an
/// edge of its interval, where a mode just meets its margin, so it is rounded into the interval
/// in the case's unit, to the fewest significant figures (two to six) that land inside, as a
/// designer rounds a dimension: 64.2815 mm on the low edge of a range up to 80 mm puts 65 mm.
/// Failing that (a very narrow interval) it is moved in by a little more than six figures'
/// rounding.
pub fn resize_value(r: &ResizeReport, system: UnitSystem) -> Option<f64> {
    let nearest = r.nearest?;
    let (a, b) = r.intervals.iter().copied().find(|(a, b)| nearest >= *a && nearest <= *b)?;
    let inward = if nearest - a < b - nearest { 1.0 } else { -1.0 };
    let per_si = display_unit(r.input.kind, system).per_si;
    let shown = nearest * per_si;
    let rounded = (2..=6).find_map(|digits| {
        let unit = 10f64.powf(shown.abs().log10().floor() + 1.0 - f64::from(digits));
        let v = (shown / unit * inward).ceil() * inward * unit / per_si;
        (v > a && v < b).then_some(v)
    });
    let step = (1e-4 * (b - a)).max(1e-5 * nearest.abs()).min(0.5 * (b - a));
    Some(rounded.unwrap_or(nearest + inward * step))
}

/// The value the report's resizing puts into the model, with words for the undo control.
pub fn resize_changes(doc: &Value, report: &Report) -> Option<(Vec<Change>, String)> {
    let r = report.design.resize.as_ref()?;
    let system = super::unit_system(doc);
    let v = resize_value(r, system)?;
    let text = text_of(v, r.input.kind, system);
    let what = set_words(&r.input.label, &text);
    Some((vec![Change { path: r.input.path.clone(), si: v, text }], what))
}

/// Writes the changes into the case; false when a path no longer names an input (the case was
/// edited since), and then nothing is written.
pub fn apply_changes(doc: &mut Value, changes: &[Change]) -> bool {
    let mut trial = doc.clone();
    for c in changes {
        let Some(at) = FieldPath::parse(&c.path) else { return false };
        if inputs::set(&mut trial, &at, c.si).is_err()
            || !path::set(&mut trial, &c.path, Value::String(c.text.clone()))
        {
            return false;
        }
    }
    *doc = trial;
    true
}

/// The numeric inputs of a case that a design request may name, with words for a list:
/// (`"segments[0].section.wall"`, `"Segment 1: Wall"`).
pub fn input_choices(doc: &Value) -> Vec<(String, String)> {
    inputs::paths(doc)
        .into_iter()
        .map(|(p, field)| {
            let path = p.to_string();
            let words = format!("{}: {}", owner(&path), field.label);
            (path, words)
        })
        .collect()
}

/// An input's value and kind as the last report read them (the page's engine does not read
/// units itself); `None` before a report, or for an input the report does not list.
fn reported(last: Option<&Report>, path: &str) -> Option<(f64, Kind)> {
    let input = last?.design.inputs.iter().find(|i| i.path == path)?;
    Some((input.value?, input.kind))
}

/// Who an input belongs to, in words: "Segment 1", "Attachment 2", "Left end".
pub fn owner(path: &str) -> String {
    let index = |list: &str| -> Option<usize> {
        let rest = path.strip_prefix(list)?.strip_prefix('[')?;
        rest[..rest.find(']')?].parse().ok()
    };
    if let Some(i) = index("segments") {
        format!("Segment {}", i + 1)
    } else if let Some(i) = index("attachments") {
        format!("Attachment {}", i + 1)
    } else if path.starts_with("left") {
        "Left end".to_string()
    } else if path.starts_with("right") {
        "Right end".to_string()
    } else {
        path.to_string()
    }
}

/// The input a new design request starts with: the first that moves nothing else. A segment's
/// length or an attachment's position shifts what lies beyond it, and a range over either soon
/// takes an attachment off the beam; the reader can still choose them.
fn first_input(last: Option<&Report>) -> Option<&InputEcho> {
    let inputs = &last?.design.inputs;
    inputs.iter().find(|i| !i.path.ends_with(".length") && !i.path.ends_with(".position")).or(inputs.first())
}

/// A new row of a design list, with values to start from: a tolerance of ± 5 % on the first
/// input, the next mode's computed frequency as a measurement, a calibration range from a
/// quarter to four times the first input's value (the first that moves nothing else).
pub fn new_row(doc: &Value, list: super::List, last: Option<&Report>) -> Value {
    let system = super::unit_system(doc);
    let first = first_input(last);
    let mut row = serde_json::Map::new();
    let text = |s: String| Value::String(s);
    match list {
        super::List::Measured => {
            let taken = doc.get("measured").and_then(Value::as_array).map_or(0, Vec::len);
            let mode = last.and_then(|r| r.modes.iter().filter(|m| !m.rigid_body).nth(taken));
            row.insert("mode".into(), Value::from(mode.map_or(taken + 1, |m| m.number) as u64));
            let hz = mode.map_or(String::new(), |m| format!("{} Hz", significant(m.frequency_hz, 4)));
            row.insert("frequency".into(), text(hz));
        }
        super::List::Calibrate => {
            if let Some(i) = first {
                row.insert("field".into(), text(i.path.clone()));
                if let Some(v) = i.value {
                    row.insert("from".into(), text(text_of(v / 4.0, i.kind, system)));
                    row.insert("to".into(), text(text_of(v * 4.0, i.kind, system)));
                }
            }
        }
        _ => {
            if let Some(i) = first {
                row.insert("field".into(), text(i.path.clone()));
            }
            row.insert("plus_minus".into(), text("5 %".into()));
        }
    }
    Value::Object(row)
}

/// Chose the input a design request names: an end in a tolerance ranges from pinned to
/// clamped; any other input keeps the request's spread (± 5 % for a tolerance that had an
/// end's names) and, for a range, starts from a quarter to four times its value.
pub fn choose_input(doc: &mut Value, parent: &str, value: &str, last: Option<&Report>) {
    let field = format!("{parent}.field");
    path::set(doc, &field, Value::String(value.to_string()));
    let is_tolerance = parent.starts_with("tolerances");
    let system = super::unit_system(doc);
    if is_tolerance && (value == "left" || value == "right") {
        path::remove(doc, &format!("{parent}.plus_minus"));
        path::set(doc, &format!("{parent}.from"), Value::String("pinned".into()));
        path::set(doc, &format!("{parent}.to"), Value::String("clamped".into()));
        return;
    }
    let named_end = |doc: &Value| {
        matches!(
            path::text(doc, &format!("{parent}.from")).as_str(),
            "pinned" | "free" | "clamped" | "guided"
        )
    };
    if is_tolerance && named_end(doc) {
        path::remove(doc, &format!("{parent}.from"));
        path::remove(doc, &format!("{parent}.to"));
        path::set(doc, &format!("{parent}.plus_minus"), Value::String("5 %".into()));
        return;
    }
    let Some((v, kind)) = reported(last, value) else { return };
    if !is_tolerance && v.is_finite() && v > 0.0 {
        path::set(doc, &format!("{parent}.from"), Value::String(text_of(v / 4.0, kind, system)));
        path::set(doc, &format!("{parent}.to"), Value::String(text_of(v * 4.0, kind, system)));
    }
}

/// A new resizing request: the first input that moves nothing else, from half to twice its value.
pub fn new_resize(doc: &Value, last: Option<&Report>) -> Value {
    let system = super::unit_system(doc);
    let mut row = serde_json::Map::new();
    if let Some(i) = first_input(last) {
        row.insert("field".into(), Value::String(i.path.clone()));
        if let Some(v) = i.value {
            row.insert("from".into(), Value::String(text_of(v / 2.0, i.kind, system)));
            row.insert("to".into(), Value::String(text_of(v * 2.0, i.kind, system)));
        }
    }
    Value::Object(row)
}
