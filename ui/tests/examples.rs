//! The example scenarios that the pages and the single file load carry every preset they use as
//! the values it gave, as a case saved by the editor does: a later correction of a preset table
//! must never change a case a reader saved from a worked page without their seeing it. Each
//! recorded value is checked against the table it came from, so that a change of the table is a
//! deliberate change of the examples too.
#![cfg(not(target_arch = "wasm32"))]

use modebench::units::{self, Kind};
use serde_json::Value;
use std::path::PathBuf;

fn examples() -> Vec<(String, Value)> {
    let folder = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../docs/scenarios");
    let mut found: Vec<(String, Value)> = std::fs::read_dir(&folder)
        .expect("docs/scenarios is readable")
        .map(|entry| entry.expect("an entry of docs/scenarios").path())
        .filter(|path| path.extension().is_some_and(|e| e == "json"))
        .map(|path| {
            let text = std::fs::read_to_string(&path).expect("an example is readable");
            let name = path.file_name().unwrap().to_string_lossy().into_owned();
            (name, serde_json::from_str(&text).expect("an example is JSON"))
        })
        .collect();
    found.sort_by(|a, b| a.0.cmp(&b.0));
    assert!(found.len() >= 8, "the examples were found: {}", found.len());
    found
}

/// A recorded value read back in SI, to compare with the table's.
fn si(value: &Value, kind: Kind) -> f64 {
    match value {
        Value::Number(n) => n.as_f64().unwrap(),
        Value::String(text) => units::parse(text, kind).unwrap().si,
        other => panic!("a recorded value is a number or a quantity, got {other}"),
    }
}

fn close(recorded: f64, table: f64) -> bool {
    (recorded - table).abs() <= 1e-12 * table.abs()
}

#[test]
fn every_preset_in_an_example_is_recorded_with_the_values_its_table_gives() {
    let mut checked = 0;
    for (name, scenario) in examples() {
        let segments = scenario["segments"].as_array().cloned().unwrap_or_default();
        for (i, segment) in segments.iter().enumerate() {
            let at = format!("{name}: segments[{i}]");
            match &segment["material"] {
                Value::Null => {}
                Value::String(id) => panic!("{at}.material names the preset \"{id}\" without its values"),
                recorded => {
                    if let Some(id) = recorded["preset"].as_str() {
                        let m =
                            modebench::material::preset(id).unwrap_or_else(|| panic!("{at}: no preset {id}"));
                        assert!(
                            close(si(&recorded["youngs_modulus"], Kind::Pressure), m.youngs_modulus),
                            "{at} E"
                        );
                        assert!(close(si(&recorded["density"], Kind::Density), m.density), "{at} density");
                        assert!(close(si(&recorded["poisson"], Kind::Ratio), m.poisson), "{at} ν");
                        let alpha = si(&recorded["thermal_expansion"], Kind::ThermalExpansion);
                        assert!(close(alpha, m.thermal_expansion), "{at} α");
                        checked += 1;
                    }
                }
            }
            let section = &segment["section"];
            if section["shape"] == "pipe" {
                let (od, wall) = modebench::section::pipe::dimensions(
                    section["nominal_size"].as_str().unwrap(),
                    section["schedule"].as_str().unwrap(),
                )
                .unwrap();
                assert!(
                    section.get("outer_diameter").is_some(),
                    "{at}: the pipe's outside diameter is recorded"
                );
                assert!(close(si(&section["outer_diameter"], Kind::Length), od), "{at} outside diameter");
                assert!(close(si(&section["wall"], Kind::Length), wall), "{at} wall");
                checked += 1;
            }
            let extra = &segment["extra_mass"];
            if let Some(id) = extra["contents"].as_str() {
                let preset = modebench::extra_mass::contents_preset(id).unwrap();
                assert!(extra.get("contents_density").is_some(), "{at}: the density of {id} is recorded");
                assert!(close(si(&extra["contents_density"], Kind::Density), preset.density), "{at} {id}");
                checked += 1;
            }
        }
    }
    assert!(checked >= 12, "presets checked: {checked}");
}
