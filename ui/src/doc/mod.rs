//! The scenario being edited, held as JSON exactly as the user typed it, and how it is solved.
//!
//! The calculator keeps the scenario as a `serde_json::Value` rather than a typed `Scenario`
//! because what is typed may not parse yet; core reads the text and says what is wrong, with the
//! field path the editor uses to put the message beside the field.

pub mod design;
mod edit;
pub mod history;
pub mod path;
mod presets;
pub mod text;

#[cfg(test)]
mod tests;

pub use edit::{apply, Edit, List};

/// The edit for `text` typed into the field at `path` that shows `unit` beside it: a number
/// typed alone takes that unit, written out ("4.5" in a field showing "in" is stored as
/// "4.5 in"), so that the scenario says what was meant whatever units are chosen later. A value
/// typed with its tolerance ("6.02 ± 12.5 %", "6.02 ± 0.5") takes the unit the same way when
/// neither side carries one ("6.02 mm ± 12.5 %", "6.02 mm ± 0.5 mm"); the core reads the two
/// apart. Anything else is kept exactly as typed.
pub fn typed(path: String, text: &str, unit: &str) -> Edit {
    let with_unit = |t: &str| modebench::units::with_unit(t, unit);
    let written = match modebench::scenario::tolerant::split(text) {
        Some((value, tolerance)) => with_unit(value).and_then(|value| {
            if let Some(percent) = tolerance.strip_suffix('%') {
                Some(format!("{value} ± {} %", percent.trim()))
            } else {
                with_unit(tolerance).map(|tolerance| format!("{value} ± {tolerance}"))
            }
        }),
        None => with_unit(text),
    };
    Edit::Text { path, text: written.unwrap_or_else(|| text.to_string()) }
}

use modebench::schema;
use modebench::units::UnitSystem;
use modebench::{Error, ErrorKind, FieldPath, Report};
use serde_json::Value;

/// Reads scenario text into the editable form; an error names what is wrong with the JSON.
pub fn read(text: &str) -> Result<Value, Error> {
    text::read(text).map_err(|e| match e {
        text::Unread::Syntax(e) => {
            Error::new(ErrorKind::Syntax, format!("the scenario is not valid JSON: {e}"))
        }
        text::Unread::Twice(path) => modebench::scenario::given_twice(&path),
    })
}

/// The unit system the scenario asks for, read as the core reads it. An absent or unknown one is
/// drawn in SI; an unknown one is also refused by the solve, and the refusal is shown beside the
/// units field.
pub fn unit_system(doc: &Value) -> UnitSystem {
    modebench::scenario::unit_system_of(doc).unwrap_or_default()
}

/// Solves the scenario as it stands.
pub fn solve(doc: &Value) -> Result<Report, Error> {
    solve_with_hints(doc, &[])
}

/// Solves the scenario as it stands, starting the search from the frequencies (Hz) of the
/// case's report before the edit; see [`modebench::solve_value_with_hints`].
pub fn solve_with_hints(doc: &Value, hints_hz: &[f64]) -> Result<Report, Error> {
    check_whole_numbers(doc)?;
    modebench::solve_value_with_hints(doc, hints_hz)
}

/// Whole-number fields hold text only when what was typed is not a whole number; say so with
/// the field's path and range (core would only say a number was expected).
fn check_whole_numbers(doc: &Value) -> Result<(), Error> {
    let mut fields = vec![(FieldPath::from(schema::MODES.name), &schema::MODES)];
    let count = doc.get("excitations").and_then(Value::as_array).map_or(0, Vec::len);
    fields.extend(
        (0..count)
            .map(|i| (FieldPath::item("excitations", i).key(schema::HARMONICS.name), &schema::HARMONICS)),
    );
    // The design requests' whole numbers: a measured mode's number and a resizing's points.
    let measured = doc.get("measured").and_then(Value::as_array).map_or(0, Vec::len);
    let [mode, _] = &schema::MEASURED_FIELDS;
    fields.extend((0..measured).map(|i| (FieldPath::item("measured", i).key(mode.name), mode)));
    let points = &schema::RESIZE_FIELDS[3];
    fields.push((FieldPath::root().key("resize").key(points.name), points));
    for (place, field) in fields {
        if let Some(Value::String(text)) = path::get(doc, &place.to_string()) {
            let message = format!("{} must be {}", field.what, field.allowed());
            let error = Error::new(ErrorKind::OutOfRange, message).at(place);
            return Err(if text.trim().is_empty() { error } else { error.with_value(text) });
        }
    }
    Ok(())
}
