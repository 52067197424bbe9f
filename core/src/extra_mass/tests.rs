//! Tests of the mass per length: a water-filled and a submerged steel pipe worked by hand.

use super::*;
use crate::section::{properties, SectionInput};
use modebench_tests::check;

const STEEL: f64 = 7850.0;

fn pipe() -> SectionProps {
    // 168.3 mm × 7.11 mm: NPS 6 schedule 40, a common pipe size (common practice).
    let input = SectionInput::Tube { outer_diameter: "168.3 mm".into(), wall: "7.11 mm".into() };
    properties(&input, 0.3).unwrap()
}

fn rectangle() -> SectionProps {
    properties(&SectionInput::Rectangle { width: "40 mm".into(), depth: "60 mm".into() }, 0.3).unwrap()
}

fn extra(json: &str) -> ExtraMassInput {
    serde_json::from_str(json).unwrap_or_else(|e| panic!("{json}: {e}"))
}

#[test]
fn water_filled_steel_pipe_by_hand() {
    let (d_o, d_i) = (0.1683, 0.1683 - 2.0 * 0.00711);
    let quarter_pi = std::f64::consts::PI / 4.0;
    let mass = breakdown(&pipe(), STEEL, &extra(r#"{"contents_density": "1000 kg/m^3"}"#)).unwrap();
    let hand = "ρ·π(D²−d²)/4 and ρ_f·πd²/4 worked by hand";
    check("steel per metre", hand, STEEL * quarter_pi * (d_o * d_o - d_i * d_i), mass.structural, 1e-12);
    check("water per metre", hand, 1000.0 * quarter_pi * d_i * d_i, mass.contents, 1e-12);
    // Pipe tables list 28.26 kg/m plain-end mass for this size (ASME B36.10M — from memory).
    check("steel per metre vs pipe table", "ASME B36.10M (from memory)", 28.26, mass.structural, 1e-3);
    check("total", hand, mass.structural + mass.contents, mass.total(), 1e-15);
    assert_eq!((mass.lining, mass.added_water), (0.0, 0.0));
    assert!(mass.conversions.is_empty(), "kg/m³ is already SI");
}

#[test]
fn submerged_pipe_carries_added_water_mass() {
    let quarter_pi = std::f64::consts::PI / 4.0;
    let d_o: f64 = 0.1683;
    let source = "m_a = C_a·ρ_w·πD_o²/4, potential flow about a circular cylinder";
    let defaults = breakdown(&pipe(), STEEL, &extra(r#"{"submerged": {}}"#)).unwrap();
    check("seawater, C_a = 1", source, 1025.0 * quarter_pi * d_o * d_o, defaults.added_water, 1e-12);
    let fresh = extra(r#"{"submerged": {"water_density": "62.4 lb/ft^3", "added_mass_coefficient": 0.9}}"#);
    let fresh = breakdown(&pipe(), STEEL, &fresh).unwrap();
    let rho_w = 62.4 * 0.45359237 / 0.3048f64.powi(3);
    check(
        "fresh water in lb/ft³, C_a = 0.9",
        source,
        0.9 * rho_w * quarter_pi * d_o * d_o,
        fresh.added_water,
        1e-12,
    );
    assert_eq!(fresh.conversions.len(), 1);
    let round = properties(&SectionInput::Round { diameter: "50 mm".into() }, 0.3).unwrap();
    assert!(breakdown(&round, STEEL, &extra(r#"{"submerged": {}}"#)).unwrap().added_water > 0.0);
}

#[test]
fn lining_is_added_per_length() {
    let mass = breakdown(&rectangle(), STEEL, &extra(r#"{"lining": "2 lb/ft"}"#)).unwrap();
    check("2 lb/ft", "NIST SP 811 exact: lb and ft", 2.0 * 0.45359237 / 0.3048, mass.lining, 1e-12);
    check("rectangle steel", "ρ·b·h", STEEL * 0.040 * 0.060, mass.structural, 1e-12);
}

#[test]
fn impossible_extra_mass_is_rejected_with_the_field_named() {
    let cases: &[(SectionProps, &str, ErrorKind, &str)] = &[
        (rectangle(), r#"{"contents_density": "1000 kg/m^3"}"#, ErrorKind::Conflict, "contents_density"),
        (rectangle(), r#"{"submerged": {}}"#, ErrorKind::Conflict, "submerged"),
        (pipe(), r#"{"contents_density": "-1 kg/m^3"}"#, ErrorKind::OutOfRange, "contents_density"),
        (pipe(), r#"{"contents_density": "1000 kg/m"}"#, ErrorKind::WrongDimension, "contents_density"),
        (pipe(), r#"{"lining": "-2 kg/m"}"#, ErrorKind::OutOfRange, "lining"),
        (pipe(), r#"{"submerged": {"water_density": 0}}"#, ErrorKind::OutOfRange, "submerged.water_density"),
        (
            pipe(),
            r#"{"submerged": {"added_mass_coefficient": -1}}"#,
            ErrorKind::OutOfRange,
            "submerged.added_mass_coefficient",
        ),
    ];
    for (section, json, kind, path) in cases {
        let e = breakdown(section, STEEL, &extra(json)).expect_err(json);
        assert_eq!((e.kind, e.path.to_string().as_str()), (*kind, *path), "{json}: {e}");
    }
    // The water density's range is the one the format's documentation gives
    // (docs/scenario-format.md, `submerged`: between 1 and 100000 kg/m³), echoed with what was
    // typed; 0.5 kg/m³ is no water.
    let e =
        breakdown(&pipe(), STEEL, &extra(r#"{"submerged": {"water_density": "0.5 kg/m^3"}}"#)).unwrap_err();
    assert_eq!(
        (e.kind, e.path.to_string().as_str()),
        (ErrorKind::OutOfRange, "submerged.water_density"),
        "{e}"
    );
    assert!(
        e.to_string().contains("between 1 and 100000 kg/m³") && e.to_string().contains("\"0.5 kg/m^3\""),
        "{e}"
    );
    let e = breakdown(&rectangle(), STEEL, &extra(r#"{"submerged": {}}"#)).unwrap_err();
    assert!(e.message.contains("only modelled for round sections"), "{}", e.message);
    let e = breakdown(&rectangle(), STEEL, &extra(r#"{"contents_density": 1000}"#)).unwrap_err();
    assert_eq!(e.at("segments[0].extra_mass").path, "segments[0].extra_mass.contents_density");
    for density in [0.0, -1.0, f64::NAN, f64::INFINITY] {
        assert_eq!(
            breakdown(&pipe(), density, &ExtraMassInput::default()).unwrap_err().kind,
            ErrorKind::OutOfRange
        );
    }
    assert!(
        serde_json::from_str::<ExtraMassInput>(r#"{"contents": 1000}"#).is_err(),
        "unknown fields are rejected"
    );
}

#[test]
fn contents_presets_agree_with_the_gas_law_and_each_other() {
    // Air from the ideal gas law: ρ = p·M/(R·T) = 101325 × 0.028964/(8.314462 × 293.15) = 1.2041
    // kg/m³ (CODATA R, standard atmosphere — from memory); liquids ordered as a fact of chemistry:
    // oil < fresh water < seawater < the glycol mix.
    let air = contents_preset("air").unwrap().density;
    assert!((air - 101_325.0 * 0.028_964 / (8.314_462 * 293.15)).abs() < 1e-3);
    let d = |id| contents_preset(id).unwrap().density;
    assert!(d("light-oil") < d("water") && d("water") < d("seawater") && d("seawater") < d("glycol-mix"));
    assert!(contents_presets().iter().all(|c| !c.source.is_empty() && c.density > 0.0));
}
