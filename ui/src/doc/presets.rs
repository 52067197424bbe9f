//! Presets chosen in the editor: a material, a pipe's nominal size and schedule, a contents
//! preset. Each is recorded in the scenario with the values it gave (a material's properties, a
//! pipe's outside diameter and wall, a contents density), so that a corrected table never
//! changes a saved case.

use super::edit::text_object;
use super::path;
use modebench::units::{self, Kind, UnitSystem};
use serde_json::{Map, Value};

/// Picks a preset, recording the values it gives beside its name so that a saved case keeps
/// them, or turns the material into custom properties that start from the preset.
pub(super) fn material(doc: &mut Value, path: &str, id: &str, system: UnitSystem) {
    if id != "custom" {
        let value = match modebench::material::preset(id) {
            Some(m) => recorded(m),
            None => Value::String(id.to_string()),
        };
        path::set(doc, path, value);
        return;
    }
    let current = path::get(doc, path).cloned();
    if let Some(Value::Object(mut object)) = current {
        // A recorded preset becomes custom by losing its name; its values stay.
        object.remove("preset");
        path::set(doc, path, Value::Object(object));
        return;
    }
    let preset = current.as_ref().and_then(Value::as_str).and_then(modebench::material::preset);
    let (e, rho) = match preset {
        Some(m) => (
            units::format(m.youngs_modulus, Kind::Pressure, system),
            units::format(m.density, Kind::Density, system),
        ),
        None => (String::new(), String::new()),
    };
    let mut object = text_object(&[("youngs_modulus", &e), ("density", &rho)]);
    if let (Some(m), Some(map)) = (preset, object.as_object_mut()) {
        map.insert(
            "thermal_expansion".into(),
            units::format(m.thermal_expansion, Kind::ThermalExpansion, system).into(),
        );
    }
    path::set(doc, path, object);
}

/// A preset material with the values it gives, in SI as the table has them.
pub(super) fn recorded(m: &modebench::material::Material) -> Value {
    let mut map = Map::new();
    map.insert("preset".into(), m.id.into());
    map.insert("youngs_modulus".into(), format!("{} GPa", m.youngs_modulus / 1e9).into());
    map.insert("density".into(), format!("{} kg/m^3", m.density).into());
    map.insert("poisson".into(), Value::from(m.poisson));
    if let Some(g) = m.shear_modulus_override {
        map.insert("shear_modulus".into(), format!("{} GPa", g / 1e9).into());
    }
    map.insert("thermal_expansion".into(), format!("{:e} /K", m.thermal_expansion).into());
    Value::Object(map)
}

/// Sets a pipe's nominal size or schedule and records the outside diameter and wall the table
/// gives for the pair, in inches as the table has them; a pair the table does not define has
/// no recorded dimensions, so the reader names what is allowed.
pub(super) fn pipe_size(doc: &mut Value, section: &str, key: &str, value: &str) {
    path::set(doc, &format!("{section}.{key}"), Value::String(value.to_string()));
    let size = path::text(doc, &format!("{section}.nominal_size"));
    let schedule = path::text(doc, &format!("{section}.schedule"));
    match modebench::section::pipe::inches(&size, &schedule) {
        Ok((outside, wall)) => {
            path::set(doc, &format!("{section}.outer_diameter"), Value::String(format!("{outside} in")));
            path::set(doc, &format!("{section}.wall"), Value::String(format!("{wall} in")));
        }
        Err(_) => {
            path::remove(doc, &format!("{section}.outer_diameter"));
            path::remove(doc, &format!("{section}.wall"));
        }
    }
}

/// Picks a contents preset and records its density beside it (in SI, as the table has it), or
/// clears both.
pub(super) fn contents(doc: &mut Value, extra: &str, id: &str) {
    match modebench::extra_mass::contents_preset(id) {
        Some(preset) => {
            path::set(doc, &format!("{extra}.contents"), Value::String(id.to_string()));
            path::set(
                doc,
                &format!("{extra}.contents_density"),
                Value::String(format!("{} kg/m^3", preset.density)),
            );
        }
        None => {
            path::remove(doc, &format!("{extra}.contents"));
            path::remove(doc, &format!("{extra}.contents_density"));
        }
    }
}
