//! Edits applied to scenarios: text kept as typed, optional fields removed when emptied,
//! structural edits that carry over what still fits.

use super::{apply, path, solve, Edit, List};
use serde_json::{json, Value};

fn boom() -> Value {
    json!({
        "units": "si-mm",
        "left": "clamped",
        "right": "free",
        "segments": [{
            "length": "1450 mm",
            "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "4 mm" },
            "material": "aluminium-6061-t6"
        }],
        "attachments": [{ "type": "mass", "position": "1450 mm", "mass": "2.8 kg", "label": "camera" }]
    })
}

fn text(path: &str, text: &str) -> Edit {
    Edit::Text { path: path.to_string(), text: text.to_string() }
}

fn choose(path: &str, value: &str) -> Edit {
    Edit::Choose { path: path.to_string(), value: value.to_string() }
}

#[test]
fn text_is_kept_exactly_as_typed_even_when_wrong() {
    let mut doc = boom();
    apply(&mut doc, &text("attachments[0].mass", "2.8 kgg "), None);
    assert_eq!(doc["attachments"][0]["mass"], json!("2.8 kgg "));
    let error = solve(&doc).err();
    assert_eq!(error.map(|e| e.path.to_string()), Some("attachments[0].mass".to_string()));
}

#[test]
fn emptied_optional_fields_are_removed_and_required_ones_kept_empty() {
    let mut doc = boom();
    apply(&mut doc, &text("attachments[0].label", "  "), None);
    assert!(doc["attachments"][0].get("label").is_none());
    apply(&mut doc, &text("attachments[0].position", ""), None);
    assert_eq!(doc["attachments"][0]["position"], json!(""));
    assert_eq!(solve(&doc).err().map(|e| e.path.to_string()), Some("attachments[0].position".to_string()));
}

#[test]
fn whole_numbers_are_stored_as_numbers_and_bad_ones_named() {
    let mut doc = boom();
    apply(&mut doc, &text("modes", "3"), None);
    assert_eq!(doc["modes"], json!(3));
    apply(&mut doc, &text("modes", "three"), None);
    let error = solve(&doc).err();
    assert_eq!(error.as_ref().map(|e| e.path.to_string()).as_deref(), Some("modes"));
    assert!(error.is_some_and(|e| e.message.contains("whole number from 1 to 20")));
}

#[test]
fn retyping_an_attachment_keeps_position_label_and_fitting_fields() {
    let mut doc = boom();
    apply(&mut doc, &choose("attachments[0].type", "sprung-mass"), None);
    let a = &doc["attachments"][0];
    assert_eq!(a["type"], json!("sprung-mass"));
    assert_eq!(a["position"], json!("1450 mm"));
    assert_eq!(a["label"], json!("camera"));
    assert_eq!(a["mass"], json!("2.8 kg"));
    assert_eq!(a["stiffness"], json!("1e6 N/m"));
    assert!(solve(&doc).is_ok());
    apply(&mut doc, &choose("attachments[0].type", "rotational-spring"), None);
    // A translational stiffness does not carry over to a rotational spring.
    assert_eq!(doc["attachments"][0]["stiffness"], json!("1e4 N*m/rad"));
    assert!(doc["attachments"][0].get("mass").is_none());
}

#[test]
fn elastic_ends_and_springs() {
    let mut doc = boom();
    apply(&mut doc, &choose("right", "elastic"), None);
    assert_eq!(doc["right"], json!({ "type": "elastic", "translational": "rigid" }));
    apply(&mut doc, &text("right.rotational", "300 N*m/rad"), None);
    assert!(solve(&doc).is_ok());
    apply(&mut doc, &choose("right", "pinned"), None);
    assert_eq!(doc["right"], json!("pinned"));
}

#[test]
fn reshaping_keeps_dimensions_of_the_same_name() {
    let mut doc = boom();
    apply(&mut doc, &choose("segments[0].section.shape", "round"), None);
    assert_eq!(doc["segments"][0]["section"], json!({ "shape": "round", "diameter": "60 mm" }));
    apply(&mut doc, &choose("segments[0].section.shape", "rectangular-tube"), None);
    assert_eq!(doc["segments"][0]["section"]["wall"], json!(""));
}

#[test]
fn switching_a_segment_to_properties_keeps_the_same_beam() {
    let mut doc = boom();
    let before = solve(&doc).ok();
    apply(&mut doc, &Edit::SegmentBy { index: 0, by: "properties".into() }, before.as_ref());
    assert!(doc["segments"][0].get("section").is_none());
    let after = solve(&doc).ok();
    let f = |r: &Option<modebench::Report>| r.as_ref().map(|r| r.modes[0].frequency_hz).unwrap_or(f64::NAN);
    // The properties are shown to four significant figures, so the frequency moves by less than
    // a part in a thousand.
    assert!((f(&after) / f(&before) - 1.0).abs() < 1e-3, "{} vs {}", f(&after), f(&before));
    apply(&mut doc, &Edit::SegmentBy { index: 0, by: "section".into() }, None);
    assert_eq!(doc["segments"][0]["material"]["preset"], json!("steel"));
    assert!(solve(&doc).is_ok());
}

#[test]
fn custom_material_starts_from_the_preset() {
    let mut doc = boom();
    apply(&mut doc, &choose("segments[0].material", "custom"), None);
    assert_eq!(
        doc["segments"][0]["material"],
        json!({ "youngs_modulus": "68900 MPa", "density": "2700 kg/m³", "thermal_expansion": "2.36e-5 /K" })
    );
    assert!(solve(&doc).is_ok());
}

#[test]
fn rows_are_added_and_removed_but_one_segment_stays() {
    let mut doc = boom();
    let report = solve(&doc).ok();
    apply(&mut doc, &Edit::Add(List::Attachments), report.as_ref());
    assert_eq!(doc["attachments"][1], json!({ "type": "mass", "position": "725 mm", "mass": "1 kg" }));
    apply(&mut doc, &Edit::Add(List::Excitations), None);
    assert_eq!(doc["excitations"][0]["frequency"], json!("50 Hz"));
    apply(&mut doc, &Edit::Add(List::Segments), None);
    assert_eq!(doc["segments"].as_array().map(Vec::len), Some(2));
    assert!(solve(&doc).is_ok());
    apply(&mut doc, &Edit::Remove(List::Segments, 1), None);
    apply(&mut doc, &Edit::Remove(List::Segments, 0), None);
    assert_eq!(doc["segments"].as_array().map(Vec::len), Some(1));
    apply(&mut doc, &Edit::Remove(List::Attachments, 0), None);
    assert_eq!(path::text(&doc, "attachments[0].position"), "725 mm");
}

#[test]
fn submerged_is_ticked_on_and_off() {
    let mut doc = boom();
    let tick = |on| Edit::Tick { path: "segments[0].extra_mass.submerged".into(), on };
    apply(&mut doc, &tick(true), None);
    assert_eq!(doc["segments"][0]["extra_mass"]["submerged"], json!({}));
    assert!(solve(&doc).is_ok());
    apply(&mut doc, &tick(false), None);
    assert_eq!(doc["segments"][0]["extra_mass"], json!({}));
}

#[test]
fn a_pipe_size_records_the_dimensions_the_table_gives() {
    let mut doc = boom();
    apply(&mut doc, &choose("segments[0].section.shape", "pipe"), None);
    let section = &doc["segments"][0]["section"];
    assert_eq!(section["nominal_size"], json!("4"));
    assert_eq!(
        (section["outer_diameter"].clone(), section["wall"].clone()),
        (json!("4.5 in"), json!("0.237 in"))
    );
    apply(&mut doc, &choose("segments[0].section.nominal_size", "6"), None);
    apply(&mut doc, &choose("segments[0].section.schedule", "80"), None);
    let section = &doc["segments"][0]["section"];
    // ASME B36.10M, 6 in schedule 80: OD 6.625 in, wall 0.432 in (from memory).
    assert_eq!(
        (section["outer_diameter"].clone(), section["wall"].clone()),
        (json!("6.625 in"), json!("0.432 in"))
    );
    assert!(solve(&doc).is_ok());
    // A schedule the size does not have leaves nothing recorded, and the reader says what is.
    apply(&mut doc, &choose("segments[0].section.nominal_size", "3-1/2"), None);
    apply(&mut doc, &choose("segments[0].section.schedule", "160"), None);
    assert!(doc["segments"][0]["section"].get("wall").is_none());
    let e = solve(&doc).err().map(|e| e.path.to_string());
    assert_eq!(e.as_deref(), Some("segments[0].section.schedule"));
}

#[test]
fn contents_by_name_record_their_density() {
    let mut doc = boom();
    apply(&mut doc, &choose("segments[0].extra_mass.contents", "glycol-mix"), None);
    let extra = &doc["segments"][0]["extra_mass"];
    assert_eq!(
        (extra["contents"].clone(), extra["contents_density"].clone()),
        (json!("glycol-mix"), json!("1070 kg/m^3"))
    );
    assert!(solve(&doc).is_ok());
    apply(&mut doc, &choose("segments[0].extra_mass.contents", "none"), None);
    assert!(doc["segments"][0]["extra_mass"].get("contents_density").is_none());
}

#[test]
fn an_axial_force_typed_in_the_editor_reaches_the_report() {
    let mut doc = boom();
    doc["right"] = json!("pinned");
    apply(&mut doc, &text("segments[0].axial_force", "-2 kN"), None);
    let report = solve(&doc).expect("solves");
    assert_eq!(report.beam.segments[0].echo.axial_force, Some(-2000.0));
    assert!(report.critical_load_factor.is_some_and(|f| f > 1.0));
    // Emptied, the optional field goes.
    apply(&mut doc, &text("segments[0].axial_force", ""), None);
    assert!(doc["segments"][0].get("axial_force").is_none());
}

#[test]
fn a_preset_material_is_recorded_with_its_values() {
    let mut doc = boom();
    apply(&mut doc, &choose("segments[0].material", "stainless-304"), None);
    // The preset's values (supplier data sheets for 304, with the presets), as the table has them.
    assert_eq!(
        doc["segments"][0]["material"],
        json!({ "preset": "stainless-304", "youngs_modulus": "193 GPa", "density": "8000 kg/m^3",
                "poisson": 0.29, "thermal_expansion": "1.73e-5 /K" })
    );
    let recorded = solve(&doc).expect("solves");
    doc["segments"][0]["material"] = json!("stainless-304");
    let by_name = solve(&doc).expect("solves");
    let f = |r: &modebench::Report| r.modes[0].frequency_hz;
    assert!((f(&recorded) / f(&by_name) - 1.0).abs() < 1e-12);
    assert_eq!(recorded.beam.segments[0].echo.material.as_deref(), Some("Stainless steel 304 (as recorded)"));
    // Typing over a recorded value makes the material custom.
    apply(&mut doc, &choose("segments[0].material", "steel"), None);
    apply(&mut doc, &text("segments[0].material.density", "7800 kg/m^3"), None);
    assert!(doc["segments"][0]["material"].get("preset").is_none());
    // A recorded α serves a temperature change, in °F as well.
    doc["segments"][0]["material"]["thermal_expansion"] = json!("6.667e-6 /°F");
    doc["segments"][0]["temperature_change"] = json!("18 °F");
    doc["right"] = json!("pinned");
    let hot = solve(&doc).expect("solves");
    let p = hot.beam.segments[0].echo.thermal_force.expect("thermal");
    // −E·A·α·ΔT with α = 6.667e-6 /°F = 1.2e-5 /K and ΔT = 18 °F = 10 K (1 °F = 5/9 K).
    let area = std::f64::consts::PI * (0.06f64.powi(2) - 0.052f64.powi(2)) / 4.0;
    let want = -200e9 * area * 6.667e-6 * 1.8 * 10.0;
    assert!((p / want - 1.0).abs() < 1e-9, "{p} vs {want}");
}

#[test]
fn a_tap_tests_frequencies_replace_the_measured_list_and_solve_as_measured() {
    let mut doc = boom();
    apply(&mut doc, &Edit::Add(List::Measured), None);
    let rows = vec![json!({"mode": 1, "frequency": "9.5 Hz"}), json!({"mode": 2, "frequency": "61.2 Hz"})];
    apply(&mut doc, &Edit::Measured(rows.clone()), None);
    assert_eq!(doc["measured"], Value::Array(rows));
    // The core reads them as the measured frequencies (its design study lists each beside its
    // mode; the format is docs/scenario-format.md's `measured`).
    let report = solve(&doc).unwrap();
    let measured: Vec<f64> = report.design.measured.iter().map(|m| m.measured_hz).collect();
    assert_eq!(measured, [9.5, 61.2]);
    apply(&mut doc, &Edit::Measured(Vec::new()), None);
    assert!(doc.get("measured").is_none(), "no rows clear the list");
}

#[test]
fn a_sensor_fixed_for_the_tap_test_is_added_as_a_point_mass_that_lowers_mode_1() {
    // A mass added where the first mode moves lowers its frequency (Rayleigh's quotient: the
    // kinetic energy grows, the strain energy does not; any vibrations textbook).
    let mut doc = boom();
    let before = solve(&doc).unwrap().modes[0].frequency_hz;
    let count = doc["attachments"].as_array().map_or(0, Vec::len);
    let row = json!({"type": "mass", "label": "tablet fixed for the tap test", "position": "1.2 m", "mass": "480 g"});
    apply(&mut doc, &Edit::Attach(row.clone()), None);
    assert_eq!(doc["attachments"].as_array().map(Vec::len), Some(count + 1));
    assert_eq!(doc["attachments"][count], row);
    let after = solve(&doc).unwrap().modes[0].frequency_hz;
    assert!(after < before, "{after} Hz with the tablet, {before} Hz without");
}
