//! Reading the design requests against the scenario: a tolerance's ratio, an input's range in
//! its own kind (two different values of one sign), an end "between pinned and clamped", and
//! errors about an input placed at the request's own field.

use super::inputs::{self, Input};
use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::scenario::RangeInput;
use crate::units::{self, Kind, Quantity};
use serde_json::Value;

/// A ratio written as a number (0.05) or a percentage ("5 %"), above 0 and below 1.
pub(super) fn ratio(q: &Quantity, at: &FieldPath) -> Result<f64> {
    let v = match q {
        Quantity::Number(v) => Some(*v),
        Quantity::Text(t) => match t.trim().strip_suffix('%') {
            Some(n) => units::decimal(n.trim()).map(|v| v / 100.0),
            None => units::parse(t, Kind::Ratio).ok().map(|c| c.si),
        },
    };
    match v {
        Some(v) if v > 0.0 && v < 1.0 => Ok(v),
        _ => Err(Error::new(
            ErrorKind::OutOfRange,
            "a tolerance is a ratio above 0 and below 1: 0.05 or \"5 %\"",
        )
        .at(at.clone())
        .with_value(q)),
    }
}

/// The range of an input, read in its own kind and checked: two different values of one sign.
pub(super) fn range_of(input: &Input, from: &Quantity, to: &Quantity, at: &FieldPath) -> Result<(f64, f64)> {
    let low = inputs::read(from, input.field, &at.key("from"))?;
    let high = inputs::read(to, input.field, &at.key("to"))?;
    if low >= high {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!("the range must run upwards: `to` ({to}) must lie above `from` ({from})"),
        )
        .at(at.key("to"))
        .with_value(to));
    }
    if low < 0.0 && high > 0.0 {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "the range must not cross zero: a thickness, length, mass or stiffness has one sign",
        )
        .at(at.key("from"))
        .with_value(from));
    }
    Ok((low, high))
}

/// An end "between pinned and clamped" (or free and guided): its rotational spring from zero to
/// rigid, its translational one as the pair has it.
pub(super) fn end_range(
    doc: &Value,
    t: &crate::scenario::ToleranceInput,
    at: &FieldPath,
) -> Result<Option<Input>> {
    let [crate::path::Step::Key(end)] = t.field.steps() else { return Ok(None) };
    if end != "left" && end != "right" {
        return Ok(None);
    }
    let name = |q: &Option<Quantity>| match q {
        Some(Quantity::Text(s)) => s.trim().to_ascii_lowercase(),
        _ => String::new(),
    };
    let pair = [name(&t.from), name(&t.to)];
    let translational = match pair.each_ref().map(String::as_str) {
        ["pinned", "clamped"] | ["clamped", "pinned"] => f64::INFINITY,
        ["free", "guided"] | ["guided", "free"] => 0.0,
        _ => return Err(Error::new(
            ErrorKind::UnknownOption,
            "an end may range from \"pinned\" to \"clamped\", or from \"free\" to \"guided\" (its rotation \
                 held by anything from nothing to rigid)",
        )
        .at(at.key("from"))
        .with_value(format!("{} to {}", pair[0], pair[1]))),
    };
    let path = t.field.key("rotational");
    let today = inputs::input_at(doc, &t.field.key("translational"))?;
    if today.value != translational {
        return Err(Error::new(
            ErrorKind::Conflict,
            format!(
                "this end's translation is {}, but a range from {} to {} has it {}; change the end or the range",
                if today.value.is_infinite() { "held" } else { "free or sprung" },
                pair[0],
                pair[1],
                if translational.is_infinite() { "held" } else { "free" }
            ),
        )
        .at(t.field.clone()));
    }
    inputs::input_at(doc, &path).map(Some)
}

/// An error about an input's path placed at the request's `field` (the path it names may not
/// exist in the editor), keeping its words.
pub(super) fn relocate(mut e: Error, at: &FieldPath) -> Error {
    if e.value.is_none() {
        let shown = e.path.to_string();
        e = e.with_value(shown);
    }
    e.path = at.clone();
    e
}

/// The inputs of ranged requests with their checked ranges.
pub(super) fn ranged(
    doc: &Value,
    list: &[&RangeInput],
    at: &dyn Fn(usize) -> FieldPath,
) -> Result<Vec<(Input, f64, f64)>> {
    list.iter()
        .enumerate()
        .map(|(i, r)| {
            let input = inputs::input_at(doc, &r.field).map_err(|e| relocate(e, &at(i).key("field")))?;
            let (low, high) = range_of(&input, &r.from, &r.to, &at(i))?;
            Ok((input, low, high))
        })
        .collect()
}
