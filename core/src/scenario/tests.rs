//! Errors in a scenario name the place the user wrote, repeat what was typed with its SI value,
//! and say what is allowed.

use super::Scenario;
use crate::error::{Error, ErrorKind};
use serde_json::{json, Value};

/// A steel tube on two pins: a segment given by section and material.
fn tube() -> Value {
    json!({
        "left": "pinned",
        "right": "pinned",
        "segments": [{
            "length": "1.45 m",
            "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "4 mm" },
            "material": "steel"
        }],
        "attachments": [{ "type": "mass", "position": "0.7 m", "mass": "2 kg" }]
    })
}

/// The error that reading and checking `scenario` gives (not solving it).
fn refused(scenario: &Value) -> Error {
    match Scenario::from_json(&scenario.to_string()).and_then(|s| s.to_model()) {
        Ok(_) => panic!("{scenario} must be refused"),
        Err(e) => e,
    }
}

#[test]
fn a_field_given_twice_is_refused() {
    let text = r#"{"left": "pinned", "right": "pinned", "segments": [{"length": "1 m", "length": "2 m",
        "flexural_rigidity": 1, "mass_per_length": 1}]}"#;
    let e = Scenario::from_json(text).unwrap_err();
    assert_eq!(e.to_string(), "segments[0].length: this field is given twice; keep one of the two");
    // Through serde as well.
    let e = serde_json::from_str::<Scenario>(text).unwrap_err().to_string();
    assert!(e.starts_with("segments[0].length: this field is given twice"), "{e}");
}

#[test]
fn the_shear_check_of_a_section_names_the_field_that_decides_it() {
    // A shear modulus typed a thousand times too small (MPa for GPa): E/G = 2.6e5, where real
    // materials have 2.5 to 50. The segment has no shear_rigidity field to name.
    let mut s = tube();
    s["segments"][0]["material"] =
        json!({ "youngs_modulus": "200 GPa", "density": "7850 kg/m^3", "shear_modulus": "77 MPa" });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].material.shear_modulus", "{e}");
    assert!(e.to_string().contains("got \"77 MPa\" (7.7e7 Pa)"), "{e}");
    // Contents 640 times the weight of a 0.1 mm wall: the extra mass decides it.
    let mut s = tube();
    s["segments"][0]["section"]["wall"] = json!("0.1 mm");
    s["segments"][0]["extra_mass"] = json!({ "contents_density": "20000 kg/m^3" });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].extra_mass", "{e}");
    // A 0.01 mm web under 1 m flanges shears so easily (κ = 2.5e-5) that the section decides it.
    let mut s = tube();
    s["segments"][0]["section"] = json!({ "shape": "i-beam", "depth": "300 mm", "flange_width": "1000 mm",
        "flange_thickness": "50 mm", "web_thickness": "0.01 mm" });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].section", "{e}");
    assert!(e.message.contains("shear coefficient"), "{e}");
    // EI = E·I far above any beam's: the section's dimensions, not a flexural_rigidity field.
    let mut s = tube();
    s["segments"][0]["section"] = json!({ "shape": "rectangle", "width": "1000 m", "depth": "1000 m" });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].section", "{e}");
    assert!(e.message.contains("between 1e-30 and 1e20 N·m²"), "{e}");
    // A segment given by its properties keeps the field it was given by.
    let mut s = tube();
    s["segments"][0] = json!({ "length": "1 m", "flexural_rigidity": "1e5 N*m^2", "mass_per_length": "10 kg/m",
        "shear_rigidity": "1 N", "rotary_inertia_per_length": "1e-3 kg*m" });
    assert_eq!(refused(&s).path, "segments[0].shear_rigidity");
}

#[test]
fn every_error_from_a_place_names_it() {
    let cases = [
        (json!({ "": 1 }), "", "the scenario has a field with an empty name"),
        (json!({ "segments": [{ "": 1 }] }), "segments[0]", "this holds a field with an empty name"),
        (json!({ "attachments": [[]] }), "attachments[0]", "expected an attachment object"),
        (json!({ "segments": [{ "section": { "shape": [] } }] }), "segments[0].section.shape", "not a list"),
        (json!({ "segments": [{ "section": [] }] }), "segments[0].section", "expected a section object"),
        (
            json!({ "left": { "type": "pinned", "rotational": null } }),
            "left.rotational",
            "only an \"elastic\" end",
        ),
    ];
    for (change, path, fragment) in cases {
        let mut s = tube();
        for (k, v) in change.as_object().into_iter().flatten() {
            s[k] = v.clone();
        }
        let e = refused(&s);
        assert_eq!(e.path, path, "{e}");
        assert!(e.message.contains(fragment), "{e} lacks {fragment:?}");
    }
}

#[test]
fn a_number_checked_in_si_is_echoed_as_typed_with_its_si_value_and_range() {
    let mut s = tube();
    s["report_point"] = json!("300 in");
    let e = refused(&s);
    assert_eq!(e.kind, ErrorKind::OutOfRange);
    assert_eq!(
        e.to_string(),
        "report_point: the report point must lie on the beam (0 to 1.45 m); got \"300 in\" (7.62 m)"
    );
    let mut s = tube();
    s["attachments"][0]["position"] = json!("2100 mm");
    let e = refused(&s);
    assert_eq!(
        e.to_string(),
        "attachments[0].position: the position must lie on the beam (0 to 1.45 m); got \"2100 mm\" (2.1 m)"
    );
    let mut s = tube();
    s["segments"][0]["length"] = json!("8e6 ft");
    let e = refused(&s);
    assert_eq!(
        e.to_string(),
        "segments[0].length: a length must lie between 1e-9 and 1e6 m; check the unit; got \"8e6 ft\" (2.4384e6 m)"
    );
    let mut s = tube();
    s["segments"][0]["section"]["outer_diameter"] = json!(1e308);
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].section.outer_diameter");
    // A plain number is already SI: the echo adds only its unit.
    assert!(e.to_string().ends_with("got 1e308 m"), "{e}");
}

#[test]
fn a_report_point_at_the_end_is_on_the_beam_whatever_the_rounding() {
    // 0.7 m + 0.1 m adds up to 0.7999999999999999 m in binary floating point; "0.8 m" is the end.
    let mut s = tube();
    s["segments"] = json!([
        { "length": "0.7 m", "flexural_rigidity": "1e4 N*m^2", "mass_per_length": "5 kg/m" },
        { "length": "0.1 m", "flexural_rigidity": "1e4 N*m^2", "mass_per_length": "5 kg/m" }
    ]);
    s["report_point"] = json!("0.8 m");
    let inputs = Scenario::from_json(&s.to_string()).and_then(|s| s.to_model()).unwrap();
    assert_eq!(inputs.options.report_point, Some(inputs.model.length()));
}

/// Every kind of attachment and every section shape the schema lists is read into the model, a
/// kind's fields as the schema describes them (a fact of this format: the schema is its one
/// description).
#[test]
fn every_kind_and_shape_the_schema_lists_is_read() {
    use crate::model::AttachmentKind;
    use crate::schema::{self, Form};
    assert_eq!(schema::ATTACHMENTS.len(), AttachmentKind::ALL.len());
    let value = |f: &schema::Field| match f.kind {
        crate::units::Kind::Ratio => json!(0.5),
        kind => json!(format!("1 {}", kind.si_unit())),
    };
    for kind in AttachmentKind::ALL {
        let Some(choice) = schema::find(&schema::ATTACHMENTS, kind.id()) else {
            panic!("{} is not in the schema", kind.id())
        };
        let mut s = tube();
        let mut a = json!({ "type": kind.id(), "position": "0.7 m" });
        for f in choice.fields {
            a[f.name] = value(f);
        }
        s["attachments"] = json!([a]);
        let inputs = Scenario::from_json(&s.to_string()).and_then(|s| s.to_model());
        assert!(inputs.as_ref().is_ok_and(|i| i.kinds == [kind]), "{a}: {inputs:?}");
    }
    for shape in &schema::SHAPES {
        let mut s = tube();
        let mut section = json!({ "shape": shape.id });
        for f in shape.fields.iter().filter(|f| f.form == Form::Quantity && !f.optional) {
            section[f.name] = json!("10 mm");
        }
        if shape.id == "custom" {
            section = json!({ "shape": "custom", "area": "1e-4 m^2", "second_moment": "1e-9 m^4" });
        }
        if shape.id.ends_with("tube") {
            section["wall"] = json!("1 mm");
        }
        if shape.id == "pipe" {
            section = json!({ "shape": "pipe", "nominal_size": "2", "schedule": "40" });
        }
        if shape.id == "i-beam" {
            section["flange_thickness"] = json!("1 mm");
            section["web_thickness"] = json!("1 mm");
        }
        s["segments"][0]["section"] = section.clone();
        let read = Scenario::from_json(&s.to_string()).and_then(|s| s.to_model());
        assert!(read.is_ok(), "{section}: {read:?}");
    }
}

#[test]
fn an_extra_mass_or_shear_coefficient_out_of_range_is_named_where_it_was_typed() {
    // No water is 200 times denser than seawater's 1025 kg/m³ (from memory; the densest liquid
    // at room temperature, mercury, is about 13,500 kg/m³): refused by the field's documented
    // range, at the field, rather than computed with.
    let mut s = tube();
    s["segments"][0]["extra_mass"] = json!({ "submerged": { "water_density": "2e5 kg/m^3" } });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].extra_mass.submerged.water_density", "{e}");
    assert!(e.to_string().contains("between 1 and 100000 kg/m³"), "{e}");
    assert!(e.to_string().contains("got \"2e5 kg/m^3\""), "{e}");
    // A lining of a million tonnes a metre is the heaviest part by far: it is named, as typed,
    // not the extra mass as a whole.
    let mut s = tube();
    s["segments"][0]["extra_mass"] = json!({ "lining": "1e9 t/m" });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].extra_mass.lining", "{e}");
    assert!(e.to_string().contains("got \"1e9 t/m\" (1e12 kg/m)"), "{e}");
    // Contents given by density, far too dense: the density is named.
    let mut s = tube();
    s["segments"][0]["extra_mass"] = json!({ "contents_density": "1e20 kg/m^3" });
    assert_eq!(refused(&s).path, "segments[0].extra_mass.contents_density");
    // An added-mass coefficient that overflows the water's part: the water's density and the
    // diameter are bounded by their ranges, so the coefficient is to blame.
    let mut s = tube();
    s["segments"][0]["extra_mass"] = json!({ "submerged": { "added_mass_coefficient": 1e308 } });
    assert_eq!(refused(&s).path, "segments[0].extra_mass.submerged.added_mass_coefficient");
    // A shear coefficient typed absurdly small (κ of real sections lies from about 0.1 to 1,
    // Cowper 1966) makes κGA too small while G·A alone is fine: κ is named, as typed.
    let mut s = tube();
    s["segments"][0]["section"] = json!({ "shape": "custom", "area": "1e-3 m^2", "second_moment": "1e-6 m^4",
        "shear_coefficient": 1e-30 });
    let e = refused(&s);
    assert_eq!(e.path, "segments[0].section.shear_coefficient", "{e}");
    assert!(e.to_string().contains("got 1e-30"), "{e}");
}

#[test]
fn a_value_outside_its_documented_range_is_echoed_as_typed_with_the_range() {
    // The allowed ranges are those docs/scenario-format.md gives for each field; every refusal
    // repeats the value as typed, unit and all, and says what is allowed.
    type Change = fn(&mut Value);
    let cases: [(Change, &str, &str, &str); 14] = [
        (
            |s| s["segments"][0]["length"] = json!("0 ft"),
            "segments[0].length",
            "0 ft",
            "between 1e-9 and 1e6 m",
        ),
        (
            |s| s["segments"][0]["section"]["outer_diameter"] = json!("-2 in"),
            "segments[0].section.outer_diameter",
            "-2 in",
            "between 1e-9 and 1e6 m",
        ),
        (
            |s| s["segments"][0]["material"] = json!({ "youngs_modulus": "1 Pa", "density": "7850 kg/m^3" }),
            "segments[0].material.youngs_modulus",
            "1 Pa",
            "between 1000 and 1e13 Pa",
        ),
        (
            |s| {
                s["segments"][0]["material"] = json!({ "youngs_modulus": "200 GPa", "density": "0.5 kg/m^3" })
            },
            "segments[0].material.density",
            "0.5 kg/m^3",
            "between 1 and 100000 kg/m³",
        ),
        (
            |s| s["segments"][0]["axial_force"] = json!("1e15 lbf"),
            "segments[0].axial_force",
            "1e15 lbf",
            "between -1e12 and 1e12 N",
        ),
        (
            |s| s["segments"][0]["extra_mass"] = json!({ "lining": "-1 lb/ft" }),
            "segments[0].extra_mass.lining",
            "-1 lb/ft",
            "must be zero or more",
        ),
        (
            |s| s["segments"][0]["extra_mass"] = json!({ "submerged": { "water_density": "0.5 kg/m^3" } }),
            "segments[0].extra_mass.submerged.water_density",
            "0.5 kg/m^3",
            "between 1 and 100000 kg/m³",
        ),
        (|s| s["attachments"][0]["mass"] = json!("-3 lb"), "attachments[0].mass", "-3 lb", "zero or more"),
        (|s| s["attachments"][0]["position"] = json!("2 m"), "attachments[0].position", "2 m", "0 to 1.45 m"),
        (
            |s| s["left"] = json!({ "type": "elastic", "translational": "-5 lbf/in" }),
            "left.translational",
            "-5 lbf/in",
            "between 0 and 1e20 N/m, or \"rigid\"",
        ),
        (
            |s| s["excitations"] = json!([{ "frequency": "-5 Hz" }]),
            "excitations[0].frequency",
            "-5 Hz",
            "greater than zero",
        ),
        (|s| s["margin"] = json!("150 %"), "margin", "150 %", "between 0 and 100 %"),
        (
            |s| s["margin"] = json!("12 furlongs"),
            "margin",
            "12 furlongs",
            "written as a plain number, as in 0.3, or as a percentage, as in 20 %",
        ),
        (
            |s| s["excitations"] = json!([{ "frequency": "1800 rpm", "up_to": "-10 Hz" }]),
            "excitations[0].up_to",
            "-10 Hz",
            "greater than zero",
        ),
    ];
    for (change, path, typed, allowed) in cases {
        let mut s = tube();
        change(&mut s);
        let e = refused(&s);
        let shown = e.to_string();
        assert_eq!(e.path, path, "{shown}");
        assert!(shown.contains(&format!("got \"{typed}\"")), "{shown} repeats {typed:?} as typed");
        assert!(shown.contains(allowed), "{shown} says what is allowed: {allowed}");
    }
}
