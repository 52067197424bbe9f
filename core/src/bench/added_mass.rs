//! The mass a tap test adds: a tablet or an accelerometer fixed to the part moves with it and
//! lowers its modes. This adds it to a scenario as a point mass, so the prediction compared
//! with the measurement is the part as it was tested.

use crate::error::as_typed;
use crate::{Error, ErrorKind, FieldPath};

/// The label the added mass carries in the scenario.
pub const LABEL: &str = "sensor fixed for the tap test";

/// `scenario` (its JSON value) with a point mass of `mass_kg` at `position_m` (from the left
/// end) added to its attachments, written in SI units with their unit strings.
pub fn with_sensor_mass(
    scenario: &serde_json::Value,
    mass_kg: f64,
    position_m: f64,
) -> Result<serde_json::Value, Error> {
    if !(mass_kg.is_finite() && mass_kg > 0.0 && mass_kg <= 1000.0) {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "the sensor's mass must be above 0 kg and at most 1000 kg",
        )
        .with_number(mass_kg)
        .with_si(mass_kg, "kg")
        .at(FieldPath::root().key("sensor_mass")));
    }
    if !(position_m.is_finite() && position_m >= 0.0) {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "the sensor's position must be 0 m or more from the left end",
        )
        .with_number(position_m)
        .at(FieldPath::root().key("sensor_position")));
    }
    let mut out = scenario.clone();
    let Some(map) = out.as_object_mut() else {
        return Err(Error::new(ErrorKind::Syntax, "the scenario is not a JSON object"));
    };
    let entry = map.entry("attachments").or_insert_with(|| serde_json::Value::Array(Vec::new()));
    let Some(list) = entry.as_array_mut() else {
        return Err(Error::new(ErrorKind::Syntax, "the scenario's attachments are not a list")
            .at(FieldPath::root().key("attachments")));
    };
    list.push(serde_json::json!({
        "type": "mass",
        "label": LABEL,
        "position": format!("{} m", as_typed(position_m)),
        "mass": format!("{} kg", as_typed(mass_kg)),
    }));
    Ok(out)
}
