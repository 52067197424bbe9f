//! Axial force, temperature change, pipe sizes and contents as a scenario writes them: each read
//! into the model's numbers, checked against the formulas they stand for, and refused with the
//! field named where they cannot apply.

use super::Scenario;
use crate::error::ErrorKind;
use serde_json::{json, Value};

fn read(scenario: &Value) -> crate::Result<super::Inputs> {
    Scenario::from_json(&scenario.to_string()).and_then(|s| s.to_model())
}

/// A 4 in schedule 40 steel pipe between two anchors.
fn pipe(extra: Value) -> Value {
    let mut segment = json!({
        "length": "6 m",
        "section": { "shape": "pipe", "nominal_size": "4", "schedule": "40" },
        "material": "steel"
    });
    if let (Some(s), Some(e)) = (segment.as_object_mut(), extra.as_object()) {
        s.extend(e.clone());
    }
    json!({ "left": "clamped", "right": "clamped", "segments": [segment] })
}

/// Area of the 4 in schedule 40 pipe, m²: OD 4.500 in, wall 0.237 in (ASME B36.10M, from memory).
fn area() -> f64 {
    let (d, t): (f64, f64) = (4.5 * 0.0254, 0.237 * 0.0254);
    std::f64::consts::PI * (d * d - (d - 2.0 * t).powi(2)) / 4.0
}

#[test]
fn a_temperature_rise_with_the_ends_held_is_the_force_minus_e_a_alpha_delta_t() {
    // −E·A·α·ΔT with the steel preset's E = 200 GPa and α = 12e-6 /K; 90 °F is a change of 50 K
    // (1 °F = 5/9 K, NIST SP 811).
    let want = -200e9 * area() * 12e-6 * 50.0;
    for dt in ["50 K", "50 °C", "50 degC", "90 °F", "90 degF"] {
        let inputs = read(&pipe(json!({ "temperature_change": dt }))).expect("reads");
        let got = inputs.model.axial_force(0);
        assert!((got - want).abs() < 1e-9 * want.abs(), "{dt}: {got} vs {want}");
        assert_eq!(inputs.segments[0].thermal_force, Some(got));
    }
    // A typed force adds to the thermal one.
    let both = read(&pipe(json!({ "temperature_change": "50 K", "axial_force": "10 kN" }))).expect("reads");
    assert!((both.model.axial_force(0) - (want + 1e4)).abs() < 1e-6);
    assert_eq!(both.segments[0].axial_force, Some(both.model.axial_force(0)));
}

#[test]
fn a_typed_force_is_the_same_beam_as_the_temperature_that_gives_it() {
    let thermal = read(&pipe(json!({ "temperature_change": "30 K" }))).expect("reads");
    let force = thermal.model.axial_force(0);
    let typed = read(&pipe(json!({ "axial_force": format!("{force} N") }))).expect("reads");
    let a = crate::exact::frequencies(&thermal.model, 3).expect("solves");
    let b = crate::exact::frequencies(&typed.model, 3).expect("solves");
    // The same beam to the last digits: the search may stop a rounding step apart.
    for (x, y) in a.iter().zip(&b) {
        assert!((x - y).abs() <= 1e-13 * x, "{a:?} vs {b:?}");
    }
}

#[test]
fn axial_inputs_that_cannot_apply_are_refused_with_the_field_named() {
    // No α for a segment given by its properties.
    let e = read(&json!({
        "left": "pinned", "right": "pinned",
        "segments": [{ "length": 2, "flexural_rigidity": 1e4, "mass_per_length": 5, "temperature_change": "40 K" }]
    }))
    .unwrap_err();
    assert_eq!(e.path.to_string(), "segments[0].temperature_change");
    assert_eq!(e.kind, ErrorKind::Conflict);
    // A custom material has no α either.
    let mut custom = pipe(json!({ "temperature_change": "40 K" }));
    custom["segments"][0]["material"] = json!({ "youngs_modulus": "200 GPa", "density": "7850 kg/m^3" });
    let e = read(&custom).unwrap_err();
    assert_eq!(e.path.to_string(), "segments[0].temperature_change");
    // Said in the editor's words, with an α a field accepts, not in the file's key names.
    assert!(e.message.contains("thermal expansion α") && e.message.contains("12e-6 /K"), "{e}");
    assert!(!e.message.contains('`'), "{e}");
    // A temperature is a change with a temperature unit, not a length.
    let e = read(&pipe(json!({ "temperature_change": "40 mm" }))).unwrap_err();
    assert_eq!(
        (e.path.to_string().as_str(), e.kind),
        ("segments[0].temperature_change", ErrorKind::WrongDimension)
    );
    // A force beyond any beam's strength is a unit slip.
    let e = read(&pipe(json!({ "axial_force": "-3e12 N" }))).unwrap_err();
    assert_eq!((e.path.to_string().as_str(), e.kind), ("segments[0].axial_force", ErrorKind::OutOfRange));
    // A beam free to move as a rigid body has nothing to react the force.
    let mut free = pipe(json!({ "axial_force": "-1 kN" }));
    free["left"] = json!("free");
    free["right"] = json!("free");
    assert_eq!(read(&free).unwrap_err().path.to_string(), "segments[0].axial_force");
    // The slender theory only.
    let mut deep = pipe(json!({ "axial_force": "-1 kN" }));
    deep["theory"] = json!("timoshenko");
    let e = read(&deep).unwrap_err();
    assert!(e.message.contains("slender-beam theory only"), "{e}");
}

#[test]
fn a_pipe_by_size_keeps_its_recorded_dimensions() {
    // The table's 4 in schedule 40 pipe, then the same size with other recorded dimensions: the
    // recorded ones are computed with, so a corrected table never changes a saved case.
    let table = read(&pipe(json!({}))).expect("reads");
    let mut recorded = pipe(json!({}));
    recorded["segments"][0]["section"]["outer_diameter"] = json!("4.5 in");
    recorded["segments"][0]["section"]["wall"] = json!("0.237 in");
    let same = read(&recorded).expect("reads");
    assert_eq!(table.model.segments(), same.model.segments());
    recorded["segments"][0]["section"]["wall"] = json!("0.25 in");
    let other = read(&recorded).expect("reads");
    assert!(other.model.segments()[0].mass_per_length > table.model.segments()[0].mass_per_length);
    // A schedule the standard does not define for the size names what is.
    let mut undefined = pipe(json!({}));
    undefined["segments"][0]["section"]["nominal_size"] = json!("3-1/2");
    undefined["segments"][0]["section"]["schedule"] = json!("160");
    let e = read(&undefined).unwrap_err();
    assert_eq!(e.path.to_string(), "segments[0].section.schedule");
    assert!(e.message.contains("defined: 10, 40, 80, STD, XS"), "{e}");
    // Sizes written as numbers read as the names.
    let mut numbers = pipe(json!({}));
    numbers["segments"][0]["section"]["nominal_size"] = json!(4);
    numbers["segments"][0]["section"]["schedule"] = json!(40);
    assert_eq!(read(&numbers).expect("reads").model.segments(), table.model.segments());
}

#[test]
fn contents_by_name_give_their_density_unless_one_is_recorded() {
    // Water at 998.2 kg/m³ in the bore of OD 4.500 in, wall 0.237 in.
    let bore = std::f64::consts::PI * ((4.5 - 2.0 * 0.237) * 0.0254f64).powi(2) / 4.0;
    let water = read(&pipe(json!({ "extra_mass": { "contents": "water" } }))).expect("reads");
    let mass = water.segments[0].mass.as_ref().expect("by section");
    assert!((mass.contents - 998.2 * bore).abs() < 1e-9);
    let recorded =
        read(&pipe(json!({ "extra_mass": { "contents": "water", "contents_density": "1000 kg/m^3" } })))
            .expect("reads");
    let mass = recorded.segments[0].mass.as_ref().expect("by section");
    assert!((mass.contents - 1000.0 * bore).abs() < 1e-9);
    let e = read(&pipe(json!({ "extra_mass": { "contents": "beer" } }))).unwrap_err();
    assert_eq!(
        (e.path.to_string().as_str(), e.kind),
        ("segments[0].extra_mass.contents", ErrorKind::UnknownOption)
    );
    assert!(e.message.contains("glycol-mix"), "{e}");
}

#[test]
fn extreme_axial_forces_end_in_a_result_or_a_clear_message() {
    // The largest tension and compression the format allows, on a light beam: either solved,
    // every number finite, or refused with a message (never a panic or a NaN).
    for force in ["1e12 N", "-1e12 N", "1e6 N", "-1e-9 N"] {
        let scenario = json!({
            "left": "pinned", "right": "clamped", "modes": 3,
            "segments": [{ "length": "0.5 m", "flexural_rigidity": "2 N*m^2", "mass_per_length": "0.1 kg/m",
                           "axial_force": force }]
        });
        match crate::solve_json(&scenario.to_string()) {
            Ok(report) => assert!(report.is_finite(), "{force}"),
            Err(e) => {
                assert!(!e.message.is_empty() && !e.message.contains("NaN"), "{force}: {e}");
                assert!(e.message.contains("buckled") || e.path == "segments[0].axial_force", "{force}: {e}");
            }
        }
    }
}

#[test]
fn a_force_that_cannot_be_computed_is_shown_on_the_field_that_gave_it() {
    // A segment whose force comes from its temperature alone has its refusals on the temperature,
    // with the value as typed; one with a typed force has them on the force.
    let on = |scenario: &Value| {
        let e = crate::solve_json(&scenario.to_string()).unwrap_err();
        (e.path.to_string(), e.value.clone().unwrap_or_default(), e.message)
    };
    let mut free = pipe(json!({ "temperature_change": "45 °C" }));
    free["left"] = json!("free");
    free["right"] = json!("free");
    assert_eq!(on(&free).0, "segments[0].temperature_change");
    let mut deep = pipe(json!({ "temperature_change": "45 °C" }));
    deep["theory"] = json!("timoshenko");
    let (path, value, _) = on(&deep);
    assert_eq!((path.as_str(), value.as_str()), ("segments[0].temperature_change", "45 °C"));
    // Buckled: the clamped–clamped 6 m pipe buckles at 4π²EI/L² (Euler's load, K = 0.5;
    // Timoshenko & Gere, Theory of Elastic Stability, ch. 2 — from memory), 0.66 MN with
    // EI = 200 GPa × 3.01e-6 m⁴ for the 4 in schedule 40 pipe, which −E·A·α·ΔT reaches at 134 K
    // (A = 2.05e-3 m²); 150 K is past it and 100 K short of it.
    let hot = |dt: &str| pipe(json!({ "temperature_change": dt }));
    assert!(crate::solve_json(&hot("100 K").to_string()).is_ok());
    let (path, value, message) = on(&hot("150 K"));
    assert_eq!((path.as_str(), value.as_str()), ("segments[0].temperature_change", "150 K"));
    assert!(message.contains("buckled"), "{message}");
    // Two segments, both past that load (more compression everywhere only lowers it): the
    // message is on the one in most compression.
    let mut two = pipe(json!({ "axial_force": "-0.7 MN" }));
    let mut second = two["segments"][0].clone();
    second["axial_force"] = json!("-1 MN");
    two["segments"][0]["length"] = json!("3 m");
    second["length"] = json!("3 m");
    if let Some(segments) = two["segments"].as_array_mut() {
        segments.push(second);
    }
    let (path, value, message) = on(&two);
    assert_eq!((path.as_str(), value.as_str()), ("segments[1].axial_force", "-1 MN"));
    assert!(message.contains("buckled"), "{message}");
}

#[test]
fn a_beam_too_taut_to_compute_as_a_beam_is_refused_as_a_string() {
    // L·√(P/EI) = 1118 (EI = 2 N·m², L = 1 m, P = 2.5e6 N): past what is computed, refused on the
    // force with the string's formula. The case the fuzz run found had 4.6e4 and took 88 s.
    let beam = |force: f64| {
        json!({
            "left": "pinned", "right": "pinned", "modes": 2,
            "segments": [{ "length": "1 m", "flexural_rigidity": "2 N*m^2", "mass_per_length": "1 kg/m",
                           "axial_force": format!("{force} N") }]
        })
    };
    let e = crate::solve_json(&beam(2.5e6).to_string()).unwrap_err();
    assert_eq!(e.path.to_string(), "segments[0].axial_force");
    assert!(e.message.contains("(n/2L)·√(P/m)"), "{e}");
    // L·√(P/EI) = 900 is computed, and accurately: ω₁² = (π/L)⁴·(EI/m)·[1 + P·L²/(π²·EI)] for a
    // pinned–pinned beam-column (Blevins, Formulas for Natural Frequency and Mode Shape — from
    // memory), some 6e-6 above (1/2L)·√(P/m), the taut string's.
    let report = crate::solve_json(&beam(1.62e6).to_string()).expect("solves");
    let pi = std::f64::consts::PI;
    let want = (pi.powi(4) * 2.0 * (1.0 + 1.62e6 / (pi * pi * 2.0))).sqrt() / (2.0 * pi);
    let got = report.modes[0].frequency_hz;
    assert!((got - want).abs() < 1e-9 * want, "{got} vs {want}");
}
