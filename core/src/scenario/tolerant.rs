//! A value typed with its tolerance: "6.02 mm ± 12.5 %", "200 GPa ±5%", "6.02 ± 0.5 mm", with
//! "+/-" for "±". It is read once, here, before the rest of the reader: the field keeps the value
//! alone and the tolerance becomes an entry of `tolerances` (± its fraction of the value), so
//! everything after sees what it would have seen had the two been written apart.
//!
//! Only the beam's numeric inputs take a tolerance (the inputs the design study can move); one
//! typed anywhere else is refused with its field. A relative tolerance is a percentage above 0
//! and below 100; an absolute one is an amount of the field's kind below the value itself. A
//! number written without a unit on one side takes the unit of the other ("6.02 ± 0.5 mm" is
//! 6.02 mm ± 0.5 mm; "6.02 mm ± 0.5" is ± 0.5 mm); with neither, the number is SI, as anywhere in
//! a scenario file.

use crate::design::inputs::field_at;
use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::units::{self, Quantity};
use serde_json::{Map, Value};
use std::borrow::Cow;

/// The value and the tolerance of a text that holds a "±" (or "+/-"), each trimmed; `None` for a
/// text without one.
pub fn split(text: &str) -> Option<(&str, &str)> {
    let (at, sign) =
        [("±", 2), ("+/-", 3)].iter().filter_map(|(s, n)| text.find(s).map(|i| (i, *n))).min()?;
    Some((text[..at].trim(), text[at + sign..].trim()))
}

/// Where a number at the start of `text` ends (digits, a point, an exponent).
fn number_end(text: &str) -> usize {
    let bytes = text.as_bytes();
    let mut i = 0;
    while i < bytes.len()
        && (bytes[i].is_ascii_digit() || bytes[i] == b'.' || (i == 0 && matches!(bytes[i], b'+' | b'-')))
    {
        i += 1;
    }
    if i < bytes.len() && (bytes[i] == b'e' || bytes[i] == b'E') {
        let mut j = i + 1;
        if j < bytes.len() && (bytes[j] == b'+' || bytes[j] == b'-') {
            j += 1;
        }
        if j < bytes.len() && bytes[j].is_ascii_digit() {
            i = j;
            while i < bytes.len() && bytes[i].is_ascii_digit() {
                i += 1;
            }
        }
    }
    i
}

/// The unit written after a number ("mm" of "0.5 mm"), empty when there is none.
fn unit_of(text: &str) -> &str {
    text[number_end(text)..].trim()
}

fn malformed(path: &FieldPath, text: &str, why: &str) -> Error {
    Error::new(
        ErrorKind::Syntax,
        format!(
            "{why}; a value with its tolerance is written \"6.02 mm ± 12.5 %\", \"200 GPa ±5%\" or \"6.02 ± 0.5 mm\" \
             (\"+/-\" for \"±\"): a percentage above 0 and below 100, or an amount in the field's units smaller than \
             the value"
        ),
    )
    .at(path.clone())
    .with_value(text)
}

/// One value read with its tolerance: the value as it is to be written, and ± the fraction.
fn read(doc: &Value, path: &FieldPath, text: &str) -> Result<(String, f64)> {
    let Some(field) = field_at(doc, path) else {
        return Err(Error::new(
            ErrorKind::Conflict,
            "a tolerance (±) may be typed only with a numeric input of the beam (a dimension, a material \
             property, a mass, a spring or a position); write this value alone",
        )
        .at(path.clone())
        .with_value(text));
    };
    let Some((value, tolerance)) = split(text) else { return Err(malformed(path, text, "no ± found")) };
    if split(tolerance).is_some() {
        return Err(malformed(path, text, "one ± only"));
    }
    if value.is_empty() || tolerance.is_empty() {
        return Err(malformed(path, text, "a value before the ± and a tolerance after it are both needed"));
    }
    if let Some(percent) = tolerance.strip_suffix('%') {
        let fraction = units::decimal(percent.trim()).map(|v| v / 100.0);
        return match fraction {
            Some(f) if f > 0.0 && f < 1.0 => Ok((value.to_string(), f)),
            _ => Err(malformed(path, text, "the percentage must lie above 0 and below 100")),
        };
    }
    let (value_unit, tolerance_unit) = (unit_of(value), unit_of(tolerance));
    let value = match (value_unit.is_empty(), tolerance_unit.is_empty()) {
        (true, false) => format!("{value} {tolerance_unit}"),
        _ => value.to_string(),
    };
    let tolerance = match (value_unit.is_empty(), tolerance_unit.is_empty()) {
        (false, true) => format!("{tolerance} {value_unit}"),
        _ => tolerance.to_string(),
    };
    let v = units::convert(&Quantity::Text(value.clone()), field.kind).map_err(|e| e.at(path.clone()))?.si;
    let d = units::convert(&Quantity::Text(tolerance), field.kind)
        .map_err(|e| {
            malformed(path, text, &format!("the tolerance is not an amount of this field ({})", e.message))
        })?
        .si;
    if !(d > 0.0 && d.is_finite() && v.is_finite() && d < v.abs()) {
        return Err(malformed(path, text, "the tolerance must be above zero and smaller than the value"));
    }
    Ok((value, d / v.abs()))
}

/// The paths and texts of every string of the scenario holding a "±" or "+/-", leaving out
/// titles, labels and the design requests (which hold paths and ranges, not values).
fn typed(value: &Value, at: FieldPath, out: &mut Vec<(FieldPath, String)>) {
    match value {
        Value::String(s) if split(s).is_some() => out.push((at, s.clone())),
        Value::Object(map) => {
            for (k, v) in map {
                let top =
                    at.is_empty() && matches!(k.as_str(), "tolerances" | "measured" | "calibrate" | "resize");
                if !(top || k == "title" || k == "label") {
                    typed(v, at.key(k), out);
                }
            }
        }
        Value::Array(items) => {
            for (i, v) in items.iter().enumerate() {
                typed(v, at.index(i), out);
            }
        }
        _ => {}
    }
}

/// The scenario with every value typed with its tolerance split into the value and an entry of
/// `tolerances`; the scenario itself when none is.
pub fn normalise(doc: &Value) -> Result<Cow<'_, Value>> {
    let mut found = Vec::new();
    typed(doc, FieldPath::root(), &mut found);
    if found.is_empty() {
        return Ok(Cow::Borrowed(doc));
    }
    let listed: Vec<FieldPath> = doc
        .get("tolerances")
        .and_then(Value::as_array)
        .map(|list| {
            list.iter()
                .filter_map(|t| t.get("field")?.as_str().and_then(|f| FieldPath::parse(f.trim())))
                .collect()
        })
        .unwrap_or_default();
    let mut out = doc.clone();
    let mut entries = Vec::new();
    for (path, text) in found {
        if listed.contains(&path) {
            return Err(Error::new(
                ErrorKind::Conflict,
                "this input has a tolerance typed with its value and another under tolerances; keep one",
            )
            .at(path)
            .with_value(text));
        }
        let (value, fraction) = read(doc, &path, &text)?;
        if let Some(slot) = at_mut(&mut out, &path) {
            *slot = Value::String(value);
        }
        let mut entry = Map::new();
        entry.insert("field".into(), Value::String(path.to_string()));
        entry.insert(
            "plus_minus".into(),
            serde_json::Number::from_f64(fraction).map_or(Value::Null, Value::Number),
        );
        entries.push(Value::Object(entry));
    }
    if let Some(map) = out.as_object_mut() {
        // Not a list: the reader refuses it with its own message.
        if let Value::Array(list) = map.entry("tolerances").or_insert_with(|| Value::Array(Vec::new())) {
            list.extend(entries);
        }
    }
    Ok(Cow::Owned(out))
}

fn at_mut<'a>(doc: &'a mut Value, path: &FieldPath) -> Option<&'a mut Value> {
    let mut at = doc;
    for step in path.steps() {
        at = match step {
            crate::path::Step::Key(k) => at.get_mut(k.as_str())?,
            crate::path::Step::Index(i) => at.get_mut(*i)?,
        };
    }
    Some(at)
}

#[cfg(test)]
mod tests;
