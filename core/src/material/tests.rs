//! Tests of materials: preset values against their stated sources, custom input and its checks.

use super::*;
use modebench_tests::check;

#[test]
fn presets_hold_the_values_their_sources_state() {
    // (id, E in Pa, density in kg/m³, tolerance, source) — the numbers of each source string,
    // with the imperial figures quoted beside them converted by NIST SP 811 factors.
    const PSI: f64 = 6894.757293168361;
    const LB_PER_IN3: f64 = 0.45359237 / (0.0254 * 0.0254 * 0.0254);
    let cases: &[(&str, f64, f64, f64, &str)] = &[
        ("steel", 200e9, 7850.0, 1e-12, "common handbook value"),
        ("steel", 29e6 * PSI, 0.284 * LB_PER_IN3, 0.01, "common handbook value in US units"),
        ("stainless-304", 193e9, 8000.0, 1e-12, "supplier data sheets"),
        ("aluminium-6061-t6", 68.9e9, 2700.0, 1e-12, "supplier data sheets"),
        ("aluminium-6061-t6", 10.0e6 * PSI, 0.0975 * LB_PER_IN3, 0.005, "supplier data sheets, US units"),
        ("titanium-ti6al4v", 112e9, 4430.0, 0.02, "supplier data sheets, 110–114 GPa"),
        ("brass-c36000", 97e9, 8490.0, 1e-12, "supplier data sheets"),
        ("gfrp-pultruded", 28.5e9, 1850.0, 0.4, "EN 13706 grades, 17–40 GPa, 1600–2100 kg/m³ (from memory)"),
        ("douglas-fir", 12e9, 500.0, 1e-12, "USDA Wood Handbook, 12 % moisture"),
    ];
    for (id, e, rho, tolerance, source) in cases {
        let material = preset(id).unwrap_or_else(|| panic!("preset {id}"));
        check(&format!("{id} E"), source, *e, material.youngs_modulus, *tolerance);
        check(&format!("{id} density"), source, *rho, material.density, *tolerance);
    }
    let mut ids: Vec<&str> = presets().iter().map(|m| m.id).collect();
    ids.sort_unstable();
    ids.dedup();
    assert_eq!(ids.len(), 7);
    for material in presets() {
        assert!((0.0..0.5).contains(&material.poisson), "{}", material.id);
        assert!(material.source.len() > 20, "{} states its source", material.id);
        assert!(material.shear_modulus() > 0.0 && material.shear_modulus() < material.youngs_modulus / 2.0);
        assert!((MODULUS_RANGE.0..=MODULUS_RANGE.1).contains(&material.youngs_modulus));
        assert!((DENSITY_RANGE.0..=DENSITY_RANGE.1).contains(&material.density));
    }
}

#[test]
fn shear_modulus_is_isotropic_unless_stated() {
    let steel = preset("steel").unwrap();
    check("steel G = E/(2(1+ν))", "isotropic elasticity", 200e9 / 2.6, steel.shear_modulus(), 1e-15);
    // Wood and pultruded composites are far softer in shear than the isotropic relation says.
    let fir = preset("douglas-fir").unwrap();
    check(
        "Douglas-fir G_LR = 0.064 E",
        "USDA Wood Handbook (from memory)",
        0.064 * 12e9,
        fir.shear_modulus(),
        1e-12,
    );
    assert!(preset("gfrp-pultruded").unwrap().shear_modulus() < 23e9 / (2.0 * 1.23) / 2.0);
}

#[test]
fn presets_and_custom_materials_resolve() {
    let input: MaterialInput = serde_json::from_str(r#""aluminium-6061-t6""#).unwrap();
    let aluminium = resolve(&input).unwrap();
    assert_eq!((aluminium.youngs_modulus, aluminium.density, aluminium.poisson), (68.9e9, 2700.0, 0.33));
    assert!(aluminium.conversions.is_empty());

    let json = r#"{"youngs_modulus": "30e6 psi", "density": "0.283 lb/in^3"}"#;
    let custom = resolve(&serde_json::from_str(json).unwrap()).unwrap();
    check(
        "30e6 psi",
        "NIST SP 811: psi = 6894.757293168361 Pa",
        30e6 * 6894.757293168361,
        custom.youngs_modulus,
        1e-12,
    );
    check(
        "0.283 lb/in³",
        "NIST SP 811 exact definitions",
        0.283 * 0.45359237 / 0.0254f64.powi(3),
        custom.density,
        1e-12,
    );
    assert_eq!(custom.poisson, DEFAULT_POISSON, "ν defaults to 0.3");
    check("G from E and ν", "isotropic elasticity", custom.youngs_modulus / 2.6, custom.shear_modulus, 1e-15);
    assert_eq!(custom.conversions.len(), 2);

    let json = r#"{"youngs_modulus": 20e9, "density": 1800, "poisson": 0.25, "shear_modulus": "3 GPa"}"#;
    let composite = resolve(&serde_json::from_str(json).unwrap()).unwrap();
    assert_eq!((composite.poisson, composite.shear_modulus), (0.25, 3e9));

    let misspelt = r#"{"youngs_modulus": "200 GPa", "density": 7850, "poison": 0.3}"#;
    assert!(serde_json::from_str::<MaterialInput>(misspelt).is_err(), "unknown fields are rejected");
}

#[test]
fn bad_materials_are_rejected_with_the_field_named() {
    let e = resolve(&MaterialInput::Preset("unobtainium".into())).unwrap_err();
    assert_eq!((e.kind, e.path.to_string().as_str()), (ErrorKind::UnknownOption, ""));
    for id in ["steel", "stainless-304", "douglas-fir"] {
        assert!(e.message.contains(id), "the message lists {id}: {}", e.message);
    }
    let custom = |e: &str, rho: &str, nu: Option<&str>, g: Option<&str>| MaterialInput::Custom {
        youngs_modulus: e.into(),
        density: rho.into(),
        poisson: nu.map(Quantity::from),
        shear_modulus: g.map(Quantity::from),
        preset: None,
        thermal_expansion: None,
    };
    let cases = [
        (custom("-200 GPa", "7850", None, None), ErrorKind::OutOfRange, "youngs_modulus"),
        (custom("200 GPa", "0", None, None), ErrorKind::OutOfRange, "density"),
        (custom("200 GPa", "7850 kg/m^2", None, None), ErrorKind::WrongDimension, "density"),
        (custom("200 GPa", "7850", Some("0.5"), None), ErrorKind::OutOfRange, "poisson"),
        (custom("200 GPa", "7850", Some("-0.1"), None), ErrorKind::OutOfRange, "poisson"),
        (custom("200 GPa", "7850", Some("NaN"), None), ErrorKind::NotFinite, "poisson"),
        (custom("200 GPa", "7850", None, Some("0 Pa")), ErrorKind::OutOfRange, "shear_modulus"),
        (custom("200 mm", "7850", None, None), ErrorKind::WrongDimension, "youngs_modulus"),
        (custom("1e300 GPa", "7850", None, None), ErrorKind::NotFinite, "youngs_modulus"),
        (custom("5e-324", "7850", None, None), ErrorKind::OutOfRange, "youngs_modulus"),
        // Values typed without their unit are read as SI and land far outside plausible ranges.
        (custom("200", "7850", None, None), ErrorKind::OutOfRange, "youngs_modulus"),
        (custom("30e6 psi", "0.283", None, None), ErrorKind::OutOfRange, "density"),
    ];
    for (input, kind, path) in cases {
        let e = resolve(&input).expect_err(&format!("{input:?}"));
        assert_eq!((e.kind, e.path.to_string().as_str()), (kind, path), "{input:?}: {e}");
    }
    let e = resolve(&custom("200 GPa", "7850", Some("0.7"), None)).unwrap_err();
    assert!(e.message.contains("below 0.5"), "{}", e.message);
    let e = resolve(&custom("200", "7850", None, None)).unwrap_err();
    assert!(e.message.contains("write the unit"), "{}", e.message);
}

#[test]
fn only_a_number_typed_without_a_unit_is_told_to_write_one() {
    // Common practice, no source: the hint that a bare number is read in SI is true only of a
    // bare number. The editor writes a number typed beside "MPa" as "0.0005 MPa"; telling its
    // reader to write the unit would contradict the unit they see.
    let custom = |e: &str, rho: &str, g: Option<&str>| MaterialInput::Custom {
        youngs_modulus: e.into(),
        density: rho.into(),
        poisson: None,
        shear_modulus: g.map(Quantity::from),
        preset: None,
        thermal_expansion: None,
    };
    let hint = "a number without a unit";
    let cases = [
        (custom("0.0005", "7850", None), "youngs_modulus", true),
        (custom("0.0005 MPa", "7850", None), "youngs_modulus", false),
        (custom("27.2 Pa", "7850", None), "youngs_modulus", false),
        (custom("200 GPa", "0.5", None), "density", true),
        (custom("200 GPa", "0.5 kg/m^3", None), "density", false),
        (custom("200 GPa", "7850", Some("20")), "shear_modulus", true),
        (custom("200 GPa", "7850", Some("20 Pa")), "shear_modulus", false),
    ];
    for (input, path, hinted) in cases {
        let e = resolve(&input).expect_err(&format!("{input:?}"));
        assert_eq!((e.kind, e.path.to_string().as_str()), (ErrorKind::OutOfRange, path), "{e}");
        assert_eq!(e.message.contains(hint), hinted, "{e}");
        assert!(e.message.contains("must lie between"), "{e} says the range");
    }
    // A value typed with a unit is named as typed and in SI.
    let shown = resolve(&custom("0.0005 MPa", "7850", None)).unwrap_err().to_string();
    assert!(shown.contains("got \"0.0005 MPa\" (500 Pa)"), "{shown}");
}
