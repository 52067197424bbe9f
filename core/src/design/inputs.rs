//! The numeric inputs of a scenario as the design tools see them: a path into the scenario (as
//! JSON), the schema's field there, its value in SI, how to write a new value in, and the
//! function from input values to natural frequencies that the tools work on.
//!
//! A new value is written into a copy of the scenario (the scenario as read, `inputs/typed.rs`,
//! or its JSON), whose model is read and checked again like any scenario's, so every derived
//! property (a section's second moment from its wall, a mass per length from a density)
//! follows, and a value the model refuses is refused with its message.
//! A preset material's modulus or density becomes a custom material of the preset's properties;
//! an end's spring on a pinned, clamped, free or guided end makes it an elastic end of the same
//! springs (pinned: translation rigid, rotation free).

use crate::error::{Error, ErrorKind, Result};
use crate::path::{FieldPath, Step};
use crate::schema::{self, Field};
use crate::units::{self, Kind, Quantity};
use serde_json::{Map, Value};

/// One numeric input.
#[derive(Clone, Debug, PartialEq)]
pub struct Input {
    /// Where it stands in the scenario.
    pub path: FieldPath,
    /// The schema's field there.
    pub field: &'static Field,
    /// Its value, SI (infinite for a rigid spring).
    pub value: f64,
}

fn key(step: &Step) -> Option<&str> {
    match step {
        Step::Key(k) => Some(k),
        Step::Index(_) => None,
    }
}

/// The value at a path, if present and not null.
pub fn value_at<'a>(doc: &'a Value, path: &FieldPath) -> Option<&'a Value> {
    let mut at = doc;
    for step in path.steps() {
        at = match step {
            Step::Key(k) => at.get(k.as_str())?,
            Step::Index(i) => at.get(*i)?,
        };
    }
    (!at.is_null()).then_some(at)
}

fn quantity_field(list: &'static [Field], name: &str) -> Option<&'static Field> {
    list.iter().find(|f| f.name == name && f.form == schema::Form::Quantity)
}

/// The schema's field that a path names in this scenario, when it is a numeric input of the
/// beam (not an excitation, the margin or a count).
pub fn field_at(doc: &Value, path: &FieldPath) -> Option<&'static Field> {
    let steps = path.steps();
    let named = |i: usize| steps.get(i).and_then(key);
    match (named(0)?, steps.len()) {
        ("segments", 3) => quantity_field(&schema::SEGMENT, named(2)?)
            .or(quantity_field(&schema::PROPERTY_FIELDS, named(2)?)),
        ("segments", 4) => {
            let segment =
                value_at(doc, &FieldPath::root().key("segments").join(&index_path(steps.get(1)?)?))?;
            let last = named(3)?;
            match named(2)? {
                "section" => {
                    let shape = segment.get("section")?.get("shape")?.as_str()?;
                    quantity_field(schema::find(&schema::SHAPES, shape)?.fields, last)
                }
                "material" => quantity_field(&schema::MATERIAL_FIELDS, last),
                "extra_mass" => quantity_field(&schema::EXTRA_MASS_FIELDS, last),
                _ => None,
            }
        }
        ("segments", 5) if named(2)? == "extra_mass" && named(3)? == "submerged" => {
            quantity_field(&schema::SUBMERGED_FIELDS, named(4)?)
        }
        ("left" | "right", 2) => match named(1)? {
            "translational" => Some(&schema::END_TRANSLATIONAL),
            "rotational" => Some(&schema::END_ROTATIONAL),
            _ => None,
        },
        ("attachments", 3) => {
            let name = named(2)?;
            if name == schema::POSITION.name {
                return Some(&schema::POSITION);
            }
            let attachment = value_at(doc, &path.parent()?)?;
            let kind = attachment.get("type")?.as_str()?;
            quantity_field(schema::find(&schema::ATTACHMENTS, kind)?.fields, name)
        }
        _ => None,
    }
}

fn index_path(step: &Step) -> Option<FieldPath> {
    match step {
        Step::Index(i) => Some(FieldPath::root().index(*i)),
        Step::Key(_) => None,
    }
}

/// The springs an end of a named kind has: (translational, rotational).
fn end_springs(end: &Value) -> Option<(f64, f64)> {
    let kind = end.as_str().or_else(|| end.get("type")?.as_str())?;
    Some(match kind {
        "free" => (0.0, 0.0),
        "pinned" => (f64::INFINITY, 0.0),
        "clamped" => (f64::INFINITY, f64::INFINITY),
        "guided" => (0.0, f64::INFINITY),
        _ => return None,
    })
}

fn not_an_input(path: &FieldPath, why: &str) -> Error {
    Error::new(ErrorKind::UnknownOption, format!("{why}; name a numeric input of the beam, such as \"segments[0].length\", \"segments[0].section.wall\", \"left.rotational\" or \"attachments[0].mass\"")).at(path.clone())
}

/// Reads a value written for `field` (a quantity with its unit, or "rigid" where a stiffness
/// allows it) into SI; the error stands at `at`.
pub fn read(q: &Quantity, field: &Field, at: &FieldPath) -> Result<f64> {
    if let Quantity::Text(t) = q {
        if field.rigid && matches!(t.trim().to_ascii_lowercase().as_str(), "rigid" | "infinite" | "inf") {
            return Ok(f64::INFINITY);
        }
    }
    let si = units::convert(q, field.kind).map_err(|e| e.at(at.clone()))?.si;
    if !si.is_finite() {
        return Err(Error::new(ErrorKind::OutOfRange, "expected a finite value")
            .at(at.clone())
            .with_value(q));
    }
    Ok(si)
}

/// The input at a path of the scenario, with its current value.
pub fn input_at(doc: &Value, path: &FieldPath) -> Result<Input> {
    let Some(field) = field_at(doc, path) else {
        return Err(not_an_input(path, "this is not a numeric input of the beam in this scenario"));
    };
    let value = match value_at(doc, path) {
        Some(v) => {
            read(&json_quantity(v).ok_or_else(|| not_an_input(path, "this holds no number"))?, field, path)?
        }
        None => default_value(doc, path, field)?,
    };
    Ok(Input { path: path.clone(), field, value })
}

fn json_quantity(v: &Value) -> Option<Quantity> {
    match v {
        Value::Number(n) => n.as_f64().map(Quantity::Number),
        Value::String(s) => Some(Quantity::Text(s.clone())),
        _ => None,
    }
}

/// The value an input has when the scenario does not write it: a preset material's property, a
/// named end's spring, or the zero of an optional spring or extra mass.
fn default_value(doc: &Value, path: &FieldPath, field: &Field) -> Result<f64> {
    let parent = path.parent().and_then(|p| value_at(doc, &p).cloned());
    if let Some(id) = parent.as_ref().and_then(Value::as_str).filter(|_| path.steps().len() == 4) {
        if let Some(m) = crate::material::preset(id.trim()) {
            return Ok(match field.name {
                "youngs_modulus" => m.youngs_modulus,
                "density" => m.density,
                "poisson" => m.poisson,
                _ => m.shear_modulus(),
            });
        }
    }
    if let Some((t, r)) = parent.as_ref().and_then(end_springs) {
        return Ok(if field.name == "translational" { t } else { r });
    }
    let zero = matches!(
        field.kind,
        Kind::Stiffness | Kind::RotationalStiffness | Kind::RotaryInertia | Kind::RotaryInertiaPerLength
    ) || matches!(field.name, "contents_density" | "lining");
    if field.optional && zero {
        return Ok(0.0);
    }
    Err(not_an_input(path, "this input is not written in the scenario; give it a value first"))
}

/// Every numeric input of the beam that the scenario writes (and a preset material's modulus and
/// density), finite and above zero: the inputs whose logarithmic derivatives mean something.
pub fn all(doc: &Value) -> Vec<Input> {
    paths(doc)
        .iter()
        .filter_map(|(p, _)| input_at(doc, p).ok())
        .filter(|i| i.value.is_finite() && i.value > 0.0)
        .collect()
}

/// The paths of the numeric inputs of the beam that the scenario writes (and a preset
/// material's modulus and density), with their fields, without reading their values: what an
/// editor offers to choose from (the page's engine does without the unit reader).
pub fn paths(doc: &Value) -> Vec<(FieldPath, &'static Field)> {
    let mut paths = Vec::new();
    let count = |name: &str| doc.get(name).and_then(Value::as_array).map_or(0, Vec::len);
    for i in 0..count("segments") {
        let base = FieldPath::item("segments", i);
        let Some(segment) = value_at(doc, &base) else { continue };
        for (part, keys) in [("", object_keys(segment)), ("section", child_keys(segment, "section"))] {
            let at = if part.is_empty() { base.clone() } else { base.key(part) };
            paths.extend(keys.into_iter().map(|k| at.key(&k)));
        }
        match segment.get("material") {
            Some(Value::String(_)) => {
                paths.extend(["youngs_modulus", "density"].map(|k| base.key("material").key(k)));
            }
            Some(m) => paths.extend(object_keys(m).into_iter().map(|k| base.key("material").key(&k))),
            None => {}
        }
        let extra = base.key("extra_mass");
        paths.extend(child_keys(segment, "extra_mass").into_iter().map(|k| extra.key(&k)));
        if let Some(e) = segment.get("extra_mass") {
            paths.extend(child_keys(e, "submerged").into_iter().map(|k| extra.key("submerged").key(&k)));
        }
    }
    for end in ["left", "right"] {
        if let Some(v) = doc.get(end).filter(|v| v.is_object()) {
            paths.extend(object_keys(v).into_iter().map(|k| FieldPath::root().key(end).key(&k)));
        }
    }
    for i in 0..count("attachments") {
        let base = FieldPath::item("attachments", i);
        if let Some(a) = value_at(doc, &base) {
            paths.extend(object_keys(a).into_iter().map(|k| base.key(&k)));
        }
    }
    paths.into_iter().filter_map(|p| field_at(doc, &p).map(|f| (p, f))).collect()
}

fn object_keys(v: &Value) -> Vec<String> {
    v.as_object().map(|m| m.keys().cloned().collect()).unwrap_or_default()
}

fn child_keys(v: &Value, name: &str) -> Vec<String> {
    v.get(name).map(object_keys).unwrap_or_default()
}

/// Writes an SI value (infinite: "rigid") at an input's path, turning a preset material into its
/// properties and a named end into its springs first. Not inlined: the evaluator's trials and
/// the typed writer's check both call it, in the solver's engine.
#[inline(never)]
pub fn set(doc: &mut Value, path: &FieldPath, value: f64) -> Result<()> {
    let steps = path.steps();
    let Some((Step::Key(last), parents)) = steps.split_last() else {
        return Err(not_an_input(path, "this is not a numeric input of the beam"));
    };
    let parent_path = path.parent().unwrap_or_default();
    // A preset material or a named end becomes the object of its values.
    let replacement = match value_at(doc, &parent_path) {
        Some(Value::String(id)) => {
            if let Some(m) = crate::material::preset(id.trim()) {
                let mut map = Map::new();
                map.insert("youngs_modulus".into(), m.youngs_modulus.into());
                map.insert("density".into(), m.density.into());
                map.insert("poisson".into(), m.poisson.into());
                // α too, or a temperature change on the segment would lose its force.
                map.insert("thermal_expansion".into(), m.thermal_expansion.into());
                if m.shear_modulus() != m.youngs_modulus / (2.0 * (1.0 + m.poisson)) {
                    map.insert("shear_modulus".into(), m.shear_modulus().into());
                }
                Some(Value::Object(map))
            } else if let Some((t, r)) = end_springs(&Value::String(id.clone())) {
                let mut map = Map::new();
                map.insert("type".into(), "elastic".into());
                map.insert("translational".into(), spring(t));
                map.insert("rotational".into(), spring(r));
                Some(Value::Object(map))
            } else {
                None
            }
        }
        Some(v @ Value::Object(_)) if v.get("type").and_then(Value::as_str) != Some("elastic") => {
            end_springs(v).map(|(t, r)| {
                let mut map = Map::new();
                map.insert("type".into(), "elastic".into());
                map.insert("translational".into(), spring(t));
                map.insert("rotational".into(), spring(r));
                Value::Object(map)
            })
        }
        _ => None,
    };
    let mut at = &mut *doc;
    for step in parents {
        at = match step {
            Step::Key(k) => match at {
                Value::Object(map) => map.entry(k.clone()).or_insert_with(|| Value::Object(Map::new())),
                _ => return Err(not_an_input(path, "this is not a numeric input of the beam")),
            },
            Step::Index(i) => match at.get_mut(*i) {
                Some(v) => v,
                None => return Err(not_an_input(path, "there is no such item")),
            },
        };
    }
    if let Some(r) = replacement {
        *at = r;
    }
    let Some(map) = at.as_object_mut() else {
        return Err(not_an_input(path, "this is not a numeric input of the beam"));
    };
    map.insert(last.clone(), spring(value));
    Ok(())
}

fn spring(v: f64) -> Value {
    if v.is_infinite() {
        Value::String("rigid".into())
    } else {
        serde_json::Number::from_f64(v).map_or(Value::Null, Value::Number)
    }
}

/// The first `modes` elastic natural frequencies (Hz) of a scenario with the inputs at `paths`
/// set to `values`.
pub fn frequencies(doc: &Value, paths: &[FieldPath], values: &[f64]) -> Result<Vec<f64>> {
    Evaluator::new(doc, paths).frequencies(values)
}

pub use evaluator::Evaluator;

mod evaluator;
#[cfg(test)]
mod tests;
mod typed;
