//! Edits made in the calculator's editor, applied to the scenario held as JSON.
//!
//! Text is stored exactly as typed, so nothing is lost on reload even when it does not parse;
//! core reports what is wrong with it. Structural edits (a new row, another attachment type,
//! another section shape) carry over what still fits and fill the rest with plain defaults.

use super::path;
use super::presets::{contents, material, pipe_size, recorded};
use crate::catalog;
use modebench::units::{self, Kind, UnitSystem};
use modebench::Report;
use serde_json::{Map, Value};

/// A list of rows in the editor.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum List {
    /// `segments`.
    Segments,
    /// `attachments`.
    Attachments,
    /// `excitations`.
    Excitations,
    /// `tolerances`.
    Tolerances,
    /// `measured`.
    Measured,
    /// `calibrate`.
    Calibrate,
}

impl List {
    /// The list's key in the scenario.
    pub fn key(self) -> &'static str {
        match self {
            List::Segments => "segments",
            List::Attachments => "attachments",
            List::Excitations => "excitations",
            List::Tolerances => "tolerances",
            List::Measured => "measured",
            List::Calibrate => "calibrate",
        }
    }

    /// The list for a scenario key.
    pub fn from_key(key: &str) -> Option<List> {
        [
            List::Segments,
            List::Attachments,
            List::Excitations,
            List::Tolerances,
            List::Measured,
            List::Calibrate,
        ]
        .into_iter()
        .find(|l| l.key() == key)
    }
}

/// Something the user did in the editor.
#[derive(Clone, Debug, PartialEq)]
pub enum Edit {
    /// Typed into a text field.
    Text {
        /// The field's path.
        path: String,
        /// Everything in the field.
        text: String,
    },
    /// Chose an option of a select.
    Choose {
        /// The select's path.
        path: String,
        /// The option's value.
        value: String,
    },
    /// Ticked or cleared a checkbox that adds or removes a part.
    Tick {
        /// The part's path.
        path: String,
        /// Ticked.
        on: bool,
    },
    /// Chose how a segment is described: `"properties"` (EI and mass) or `"section"`.
    SegmentBy {
        /// The segment's index.
        index: usize,
        /// `"properties"` or `"section"`.
        by: String,
    },
    /// Added a row at the end of a list.
    Add(List),
    /// Removed a row.
    Remove(List, usize),
    /// Wrote values the design study proposed (a fit, a size), as one step.
    Apply(Vec<super::design::Change>),
    /// Replaced the `measured` list with a tap test's rows (`{"mode": 2, "frequency": "14.2
    /// Hz"}`), as one step; no rows clear it.
    Measured(Vec<Value>),
    /// Added an attachment row made elsewhere (the tap-test panel's tablet or sensor fixed to the
    /// part, as a point mass with its values as typed, units included), as one step.
    Attach(Value),
}

impl Edit {
    /// Whether the editor must be drawn again after this edit (fields appear or go), as opposed
    /// to typing, after which only the results change.
    pub fn is_structural(&self) -> bool {
        !matches!(self, Edit::Text { .. })
    }
}

/// Applies an edit. `last` is the last good report, used to give new rows sensible values (a
/// new mass goes to mid-span; a segment switched to properties keeps its EI and mass).
pub fn apply(doc: &mut Value, edit: &Edit, last: Option<&Report>) {
    let system = super::unit_system(doc);
    match edit {
        Edit::Text { path, text } => set_text(doc, path, text),
        Edit::Choose { path, value } => choose(doc, path, value, system, last),
        Edit::Tick { path: p, on: true } if p == "resize" => {
            if path::get(doc, p).is_none() {
                let row = super::design::new_resize(doc, last);
                path::set(doc, p, row);
            }
        }
        Edit::Tick { path: p, on: true } => {
            if path::get(doc, p).is_none() {
                path::set(doc, p, Value::Object(Map::new()));
            }
        }
        Edit::Tick { path: p, on: false } => {
            path::remove(doc, p);
        }
        Edit::SegmentBy { index, by } => segment_by(doc, *index, by, system, last),
        Edit::Apply(changes) => {
            super::design::apply_changes(doc, changes);
        }
        Edit::Measured(rows) if rows.is_empty() => {
            path::remove(doc, List::Measured.key());
        }
        Edit::Measured(rows) => {
            path::set(doc, List::Measured.key(), Value::Array(rows.clone()));
        }
        Edit::Attach(row) => push(doc, List::Attachments, row.clone()),
        Edit::Add(list) => add(doc, *list, system, last),
        Edit::Remove(list, index) => {
            // A beam keeps at least one segment; the editor offers no remove button then.
            let count = doc.get(list.key()).and_then(Value::as_array).map_or(0, Vec::len);
            if *list != List::Segments || count > 1 {
                path::remove(doc, &format!("{}[{index}]", list.key()));
            }
        }
    }
}

/// The last key of a path and the path of the object holding it.
fn split_key(path: &str) -> (&str, &str) {
    match path.rfind('.') {
        Some(i) => (&path[..i], &path[i + 1..]),
        None => ("", path),
    }
}

/// The `type` or `shape` of the object at `path`, which decides what its fields mean.
fn type_of<'a>(doc: &'a Value, path: &str) -> Option<&'a str> {
    let parent = path::get(doc, path)?;
    parent.get("shape").or_else(|| parent.get("type")).and_then(Value::as_str)
}

fn set_text(doc: &mut Value, path: &str, text: &str) {
    let (parent, key) = split_key(path);
    // A recorded material's value typed over is no longer the preset's: it loses its name.
    let recorded =
        parent.ends_with(".material") && path::get(doc, parent).is_some_and(|m| m.get("preset").is_some());
    if recorded {
        path::remove(doc, &format!("{parent}.preset"));
    }
    let optional = catalog::is_optional(key, type_of(doc, parent));
    let trimmed = text.trim();
    if trimmed.is_empty() && optional {
        path::remove(doc, path);
        return;
    }
    let value = match (catalog::whole_number(key), trimmed.parse::<u64>()) {
        // A whole-number field that reads as one is stored as a number; anything else is kept as
        // typed, and the check before solving names the field.
        (Some(_), Ok(n)) => Value::from(n),
        _ => Value::String(text.to_string()),
    };
    path::set(doc, path, value);
}

fn choose(doc: &mut Value, path: &str, value: &str, system: UnitSystem, last: Option<&Report>) {
    let (parent, key) = split_key(path);
    match key {
        "left" | "right" if parent.is_empty() => {
            let current = path::get(doc, path);
            let elastic = current.and_then(|c| c.get("type")).and_then(Value::as_str) == Some("elastic");
            if value == "elastic" && !elastic {
                path::set(doc, path, text_object(&[("type", "elastic"), ("translational", "rigid")]));
            } else if value != "elastic" {
                path::set(doc, path, Value::String(value.to_string()));
            }
        }
        "type" => retype(doc, parent, value, system),
        "shape" => reshape(doc, parent, value),
        "nominal_size" | "schedule" => pipe_size(doc, parent, key, value),
        "contents" => contents(doc, parent, value),
        "material" => material(doc, path, value, system),
        "field" => super::design::choose_input(doc, parent, value, last),
        _ => {
            path::set(doc, path, Value::String(value.to_string()));
        }
    }
}

/// Plain values for new rows in each unit system, typed as a user would type them.
struct Defaults {
    mass: &'static str,
    stiffness: &'static str,
    rotational_stiffness: &'static str,
    frequency: &'static str,
    width: &'static str,
    depth: &'static str,
}

fn defaults(system: UnitSystem) -> Defaults {
    match system {
        UnitSystem::Si | UnitSystem::SiMm => Defaults {
            mass: "1 kg",
            stiffness: "1e6 N/m",
            rotational_stiffness: "1e4 N*m/rad",
            frequency: "50 Hz",
            width: "40 mm",
            depth: "10 mm",
        },
        UnitSystem::UsInch | UnitSystem::UsFoot => Defaults {
            mass: "2 lb",
            stiffness: "5000 lbf/in",
            rotational_stiffness: "1e5 lbf*in/rad",
            frequency: "60 Hz",
            width: "1.5 in",
            depth: "0.375 in",
        },
    }
}

fn default_for(kind: Kind, d: &Defaults) -> &'static str {
    match kind {
        Kind::Mass => d.mass,
        Kind::Stiffness => d.stiffness,
        Kind::RotationalStiffness => d.rotational_stiffness,
        _ => "",
    }
}

/// Gives an attachment another type, keeping its position, label and any field of the same
/// name and kind.
fn retype(doc: &mut Value, path: &str, id: &str, system: UnitSystem) {
    let Some(new) = catalog::find(&catalog::ATTACHMENTS, id) else { return };
    let old = path::get(doc, path).cloned().unwrap_or_default();
    let old_fields =
        old.get("type").and_then(Value::as_str).and_then(|t| catalog::find(&catalog::ATTACHMENTS, t));
    let d = defaults(system);
    let mut object = Map::new();
    object.insert("type".into(), Value::String(id.to_string()));
    for key in ["label", "position"] {
        if let Some(v) = old.get(key) {
            object.insert(key.into(), v.clone());
        }
    }
    for f in new.fields {
        let same = old_fields.and_then(|o| o.fields.iter().find(|g| g.name == f.name && g.kind == f.kind));
        match (same.and_then(|_| old.get(f.name)), f.optional) {
            (Some(v), _) => {
                object.insert(f.name.into(), v.clone());
            }
            (None, false) => {
                object.insert(f.name.into(), Value::String(default_for(f.kind, &d).to_string()));
            }
            (None, true) => {}
        }
    }
    path::set(doc, path, Value::Object(object));
}

/// Gives a section another shape, keeping dimensions of the same name (and a diameter as the
/// outside diameter); new dimensions start empty so the editor asks for them.
fn reshape(doc: &mut Value, path: &str, id: &str) {
    let Some(new) = catalog::find(&catalog::SHAPES, id) else { return };
    if id == "pipe" {
        // A pipe starts as a common size, its dimensions recorded from the table.
        path::set(doc, path, text_object(&[("shape", "pipe"), ("nominal_size", "4"), ("schedule", "40")]));
        pipe_size(doc, path, "schedule", "40");
        return;
    }
    let old = path::get(doc, path).cloned().unwrap_or_default();
    let mut object = Map::new();
    object.insert("shape".into(), Value::String(id.to_string()));
    for f in new.fields.iter().filter(|f| f.form == catalog::Form::Quantity) {
        let alias = match f.name {
            "diameter" => "outer_diameter",
            "outer_diameter" => "diameter",
            other => other,
        };
        match old.get(f.name).or_else(|| old.get(alias)) {
            Some(v) => {
                object.insert(f.name.into(), v.clone());
            }
            None if !f.optional => {
                object.insert(f.name.into(), Value::String(String::new()));
            }
            None => {}
        }
    }
    path::set(doc, path, Value::Object(object));
}

fn segment_by(doc: &mut Value, index: usize, by: &str, system: UnitSystem, last: Option<&Report>) {
    let path = format!("segments[{index}]");
    let Some(old) = path::get(doc, &path).cloned() else { return };
    let by_section = old.get("section").is_some() || old.get("material").is_some();
    let mut object = Map::new();
    if let Some(length) = old.get("length") {
        object.insert("length".into(), length.clone());
    }
    match by {
        "section" if !by_section => {
            let d = defaults(system);
            object.insert(
                "section".into(),
                text_object(&[("shape", "rectangle"), ("width", d.width), ("depth", d.depth)]),
            );
            let steel =
                modebench::material::preset("steel").map_or_else(|| Value::String("steel".into()), recorded);
            object.insert("material".into(), steel);
        }
        "properties" if by_section => {
            // Keep the same beam: start from the properties the section and material gave.
            let shown = last.and_then(|r| r.beam.segments.get(index));
            let text = |v: Option<f64>, kind| v.map(|v| units::format(v, kind, system)).unwrap_or_default();
            object.insert(
                "flexural_rigidity".into(),
                text(shown.map(|s| s.flexural_rigidity), Kind::FlexuralRigidity).into(),
            );
            object.insert(
                "mass_per_length".into(),
                text(shown.map(|s| s.mass_per_length), Kind::MassPerLength).into(),
            );
            if let Some(kga) = shown.and_then(|s| s.shear_rigidity) {
                object
                    .insert("shear_rigidity".into(), units::format(kga, Kind::ShearRigidity, system).into());
            }
        }
        _ => return,
    }
    path::set(doc, &path, Value::Object(object));
}

fn add(doc: &mut Value, list: List, system: UnitSystem, last: Option<&Report>) {
    let d = defaults(system);
    let row = match list {
        // A new segment starts as a copy of the last one, which is usually what comes next.
        List::Segments => doc
            .get("segments")
            .and_then(Value::as_array)
            .and_then(|s| s.last())
            .cloned()
            .unwrap_or_else(|| text_object(&[("length", "")])),
        List::Attachments => {
            let middle = last.map(|r| units::format(r.beam.length / 2.0, Kind::Length, system));
            text_object(&[("type", "mass"), ("position", &middle.unwrap_or_default()), ("mass", d.mass)])
        }
        List::Excitations => text_object(&[("label", ""), ("frequency", d.frequency)]),
        List::Tolerances | List::Measured | List::Calibrate => super::design::new_row(doc, list, last),
    };
    push(doc, list, row);
}

/// Appends `row` to `list`, making the list if the case has none.
fn push(doc: &mut Value, list: List, row: Value) {
    if let Some(object) = doc.as_object_mut() {
        let rows = object.entry(list.key()).or_insert_with(|| Value::Array(Vec::new()));
        if !rows.is_array() {
            *rows = Value::Array(Vec::new());
        }
        if let Some(rows) = rows.as_array_mut() {
            rows.push(row);
        }
    }
}

/// A JSON object of text fields. Built directly rather than with `json!`, which goes through
/// the general serialiser and would bring it into the browser build.
pub(super) fn text_object(fields: &[(&str, &str)]) -> Value {
    let mut map = Map::new();
    for (key, value) in fields {
        map.insert((*key).to_string(), Value::String((*value).to_string()));
    }
    Value::Object(map)
}
