//! The scenario being edited, held as JSON exactly as the user typed it, and how it is solved.
//!
//! The calculator keeps the scenario as a `serde_json::Value` rather than a typed `Scenario`
//! because what is typed may not parse yet; core reads the text and says what is wrong, with the
//! field path the editor uses to put the message beside the field.

mod edit;
pub mod path;
pub mod text;

#[cfg(test)]
mod tests;

pub use edit::{apply, Edit, List};

use crate::catalog;
use modebench::units::UnitSystem;
use modebench::{Error, ErrorKind, Report};
use serde_json::Value;

/// Reads scenario text into the editable form; an error names what is wrong with the JSON.
pub fn read(text: &str) -> Result<Value, Error> {
    text::read(text)
        .map_err(|e| Error::new(ErrorKind::Syntax, format!("the scenario is not valid JSON: {e}")))
}

/// The unit system the scenario asks for, SI when it is absent or not one we know.
pub fn unit_system(doc: &Value) -> UnitSystem {
    doc.get("units").and_then(serde_json::Value::as_str).and_then(UnitSystem::from_id).unwrap_or_default()
}

/// Solves the scenario as it stands.
pub fn solve(doc: &Value) -> Result<Report, Error> {
    check_whole_numbers(doc)?;
    modebench::solve_value(doc)
}

/// Whole-number fields hold text only when what was typed is not a whole number; say so with
/// the field's path and range (core would only say a number was expected).
fn check_whole_numbers(doc: &Value) -> Result<(), Error> {
    let mut paths = vec!["modes".to_string()];
    let count = doc.get("excitations").and_then(Value::as_array).map_or(0, Vec::len);
    paths.extend((0..count).map(|i| format!("excitations[{i}].harmonics")));
    for p in paths {
        let key = p.rsplit('.').next().unwrap_or(&p);
        if let (Some(Value::String(text)), Some((low, high))) =
            (path::get(doc, &p), catalog::whole_number(key))
        {
            let what = if key == "modes" { "the number of modes" } else { "the number of harmonics" };
            let error = Error::new(
                ErrorKind::OutOfRange,
                format!("{what} must be a whole number from {low} to {high}"),
            )
            .at(p.as_str());
            return Err(if text.trim().is_empty() { error } else { error.with_value(text) });
        }
    }
    Ok(())
}
