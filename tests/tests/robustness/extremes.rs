//! The largest and smallest numbers a double holds, typed into every numeric field of a segment
//! given by section and material: each is refused at the field where it was typed, with what is
//! allowed, and no message shows the infinity or NaN that computing with it would give.
//!
//! 1e308 squared overflows, and 4.9e-324 (the smallest subnormal double, IEEE 754-2008) raised
//! to any power underflows to zero; the fields take them from the schema, so a field added later
//! is swept too.

use super::assert_plain;
use modebench::schema::{self, Field, Form};
use modebench::units::Kind;
use serde_json::{json, Value};

/// A valid value for every numeric field of the sections below, the material and the extra mass.
fn valid(shape: &str, field: &str) -> Option<Value> {
    let value = match (shape, field) {
        ("tube", "outer_diameter") => "60 mm",
        ("tube", "wall") => "4 mm",
        ("pipe", "outer_diameter") => "60.3 mm",
        ("pipe", "wall") => "3.91 mm",
        ("round", "diameter") => "50 mm",
        ("rectangle" | "rectangular-tube", "width") => "100 mm",
        ("rectangle" | "rectangular-tube", "depth") => "60 mm",
        ("rectangular-tube", "wall") => "5 mm",
        ("i-beam", "depth") => "300 mm",
        ("i-beam", "flange_width") => "150 mm",
        ("i-beam", "flange_thickness") => "10 mm",
        ("i-beam", "web_thickness") => "7 mm",
        ("custom", "area") => "1.2e-3 m^2",
        ("custom", "second_moment") => "3e-6 m^4",
        ("custom", "depth") => "0.1 m",
        ("custom", "shear_coefficient") => "0.8",
        _ => return None,
    };
    Some(json!(value))
}

/// The scenario's unit written after a number, in ASCII, for a field of this kind.
fn unit(kind: Kind) -> &'static str {
    match kind {
        Kind::Length => "mm",
        Kind::Area => "mm^2",
        Kind::SecondMoment => "mm^4",
        Kind::Pressure => "GPa",
        Kind::Density => "kg/m^3",
        Kind::MassPerLength => "kg/m",
        _ => "",
    }
}

/// Every way of typing the extremes into a field of `kind`: as plain numbers (SI) and with a unit.
fn extremes(kind: Kind) -> Vec<Value> {
    let mut values = vec![json!(1e308), json!(-1e308), json!(4.9e-324)];
    let unit = unit(kind);
    if !unit.is_empty() {
        values.extend([json!(format!("1e308 {unit}")), json!(format!("4.9e-324 {unit}"))]);
    }
    values
}

/// A pinned steel span of the given section, with a custom material whose fields are all given,
/// so that each can be replaced in turn, and a lining.
fn scenario(section: Value) -> Value {
    json!({
        "left": "pinned",
        "right": "pinned",
        "segments": [{
            "length": "1.5 m",
            "section": section,
            "material": {
                "youngs_modulus": "200 GPa",
                "density": "7850 kg/m^3",
                "poisson": 0.3,
                "shear_modulus": "77 GPa"
            },
            "extra_mass": { "lining": "0.5 kg/m" }
        }],
        "attachments": [{ "type": "mass", "position": "0.7 m", "mass": "2 kg" }]
    })
}

fn quantities(fields: &'static [Field]) -> impl Iterator<Item = &'static Field> {
    fields.iter().filter(|f| f.form == Form::Quantity)
}

/// Types `value` at `path` (keys under `segments[0]`) of `s` and solves it; a refusal must stand
/// at that path, and what is accepted must give a finite report.
fn try_at(s: &Value, keys: &[&str], kind: Kind, value: &Value, failures: &mut Vec<String>) {
    let mut s = s.clone();
    let mut place = &mut s["segments"][0];
    for key in keys {
        place = &mut place[*key];
    }
    *place = value.clone();
    let path = format!("segments[0].{}", keys.join("."));
    let case = format!("{value} at {path}");
    match modebench::solve_json(&s.to_string()) {
        Ok(report) => {
            if !report.is_finite() {
                failures.push(format!("{case}: accepted with a non-finite report"));
            }
            // Only a value inside the field's range may be accepted: 4.9e-324 for a field with
            // no lower bound. The huge and negative ones never.
            let typed =
                value.as_f64().or_else(|| value.as_str().and_then(|t| t.split(' ').next()?.parse().ok()));
            if typed.is_some_and(|v| v.abs() > 1.0) {
                failures.push(format!("{case}: accepted ({kind:?})"));
            }
        }
        Err(e) => {
            assert_plain(&e, &case);
            if e.path.to_string() != path {
                failures.push(format!("{case}: refused at {:?}: {e}", e.path.to_string()));
            }
        }
    }
}

#[test]
fn the_extremes_of_a_double_are_refused_where_they_were_typed() {
    let mut failures = Vec::new();
    let mut tried = 0;
    for shape in &schema::SHAPES {
        let mut section = json!({ "shape": shape.id });
        for field in quantities(shape.fields) {
            let value = valid(shape.id, field.name)
                .unwrap_or_else(|| panic!("no valid value for {}.{}", shape.id, field.name));
            section[field.name] = value;
        }
        if shape.id == "pipe" {
            section["nominal_size"] = json!("2");
            section["schedule"] = json!("40");
        }
        let base = scenario(section);
        assert!(modebench::solve_json(&base.to_string()).is_ok(), "the {} base must solve", shape.id);
        for field in quantities(shape.fields) {
            for value in extremes(field.kind) {
                try_at(&base, &["section", field.name], field.kind, &value, &mut failures);
                tried += 1;
            }
        }
        if shape.id != "tube" {
            continue;
        }
        // The material and the extra mass, once, on the tube (which has a bore to fill and may be
        // submerged).
        let mut base = base;
        base["segments"][0]["extra_mass"]["contents_density"] = json!("1000 kg/m^3");
        assert!(modebench::solve_json(&base.to_string()).is_ok(), "the filled tube must solve");
        for field in quantities(&schema::MATERIAL_FIELDS) {
            for value in extremes(field.kind) {
                try_at(&base, &["material", field.name], field.kind, &value, &mut failures);
                tried += 1;
            }
        }
        for field in quantities(&schema::EXTRA_MASS_FIELDS) {
            for value in extremes(field.kind) {
                try_at(&base, &["extra_mass", field.name], field.kind, &value, &mut failures);
                tried += 1;
            }
        }
        let mut submerged = base.clone();
        submerged["segments"][0]["extra_mass"]["submerged"] =
            json!({ "water_density": "1025 kg/m^3", "added_mass_coefficient": 1 });
        assert!(modebench::solve_json(&submerged.to_string()).is_ok(), "the submerged base must solve");
        for field in quantities(&schema::SUBMERGED_FIELDS) {
            for value in extremes(field.kind) {
                try_at(
                    &submerged,
                    &["extra_mass", "submerged", field.name],
                    field.kind,
                    &value,
                    &mut failures,
                );
                tried += 1;
            }
        }
    }
    assert!(tried > 100, "only {tried} cases");
    assert!(failures.is_empty(), "{} of {tried} cases:\n{}", failures.len(), failures.join("\n"));
}
