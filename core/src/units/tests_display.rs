//! Tests of showing values: display units agree with the parser and with NIST factors.

use super::*;
use modebench_tests::check;

const NIST: &str = "NIST SP 811 (2008), appendix B";

#[test]
fn every_display_unit_parses_back_to_its_own_factor() {
    // The display table and the parsing table are written separately; one unit of each display
    // symbol, read back by the parser, must be worth exactly 1 / per_si in SI.
    for system in UnitSystem::ALL {
        for kind in Kind::ALL {
            let unit = display_unit(kind, system);
            let text = format!("1 {}", unit.symbol);
            let si = parse(&text, kind).unwrap_or_else(|e| panic!("{text:?} as {kind:?}: {e}")).si;
            check(
                &format!("{text} as {kind:?} in {system:?}"),
                "display table vs parser",
                1.0 / unit.per_si,
                si,
                1e-12,
            );
        }
    }
}

#[test]
fn display_factors_match_nist() {
    let cases: &[(Kind, UnitSystem, f64, &str)] = &[
        (Kind::Length, UnitSystem::UsInch, 0.0254, "in = 0.0254 m, exact"),
        (Kind::Length, UnitSystem::UsFoot, 0.3048, "ft = 0.3048 m, exact"),
        (Kind::Mass, UnitSystem::UsInch, 0.45359237, "lb = 0.45359237 kg, exact"),
        (Kind::Force, UnitSystem::UsFoot, 4.4482216152605, "lbf = 4.4482216152605 N, exact"),
        (Kind::Pressure, UnitSystem::UsFoot, 6894.757293168361, "psi, exact from lbf and in"),
        (Kind::Pressure, UnitSystem::UsInch, 6894.757293168361e6, "Msi = 10⁶ psi"),
        (Kind::Density, UnitSystem::UsInch, 2.767990e4, "B.8: lb/in³ = 2.767 990 E+04 kg/m³"),
        (Kind::Density, UnitSystem::UsFoot, 1.601846e1, "B.8: lb/ft³ = 1.601 846 E+01 kg/m³"),
        (Kind::Stiffness, UnitSystem::UsInch, 1.751268e2, "B.8: lbf/in = 1.751 268 E+02 N/m"),
        (Kind::SecondMoment, UnitSystem::UsInch, 4.162314e-7, "B.8: in⁴ = 4.162 314 E-07 m⁴"),
    ];
    for (kind, system, si_per_unit, source) in cases {
        let tolerance = if source.contains("exact") { 1e-12 } else { 1e-6 };
        let got = 1.0 / display_unit(*kind, *system).per_si;
        check(&format!("{kind:?} in {system:?}"), &format!("{NIST}, {source}"), *si_per_unit, got, tolerance);
    }
}

#[test]
fn values_are_formatted_to_four_significant_digits() {
    let cases: &[(f64, Kind, UnitSystem, &str)] = &[
        (1.2, Kind::Length, UnitSystem::UsInch, "47.24 in"),
        (1.2, Kind::Length, UnitSystem::SiMm, "1200 mm"),
        (200e9, Kind::Pressure, UnitSystem::Si, "200 GPa"),
        (200e9, Kind::Pressure, UnitSystem::UsInch, "29.01 Msi"),
        (200e9, Kind::Pressure, UnitSystem::UsFoot, "2.901e7 psi"),
        (7850.0, Kind::Density, UnitSystem::UsInch, "0.2836 lb/in³"),
        (1e7, Kind::Stiffness, UnitSystem::Si, "1e7 N/m"),
        (1e-5, Kind::Length, UnitSystem::Si, "1e-5 m"),
        (0.0123456, Kind::Length, UnitSystem::Si, "0.01235 m"),
        (-3.0, Kind::Length, UnitSystem::Si, "-3 m"),
        (0.0, Kind::Length, UnitSystem::Si, "0 m"),
        (-0.0, Kind::Mass, UnitSystem::Si, "0 kg"),
        (9.99996, Kind::Mass, UnitSystem::Si, "10 kg"),
        (0.3, Kind::Ratio, UnitSystem::UsInch, "0.3"),
        (29.6667, Kind::Frequency, UnitSystem::UsFoot, "29.67 Hz"),
        (f64::NAN, Kind::Length, UnitSystem::Si, "—"),
        (f64::INFINITY, Kind::Force, UnitSystem::UsInch, "—"),
        (f64::MAX, Kind::SecondMoment, UnitSystem::SiMm, "—"),
    ];
    for (si, kind, system, expected) in cases {
        assert_eq!(format(*si, *kind, *system), *expected, "{si} as {kind:?} in {system:?}");
    }
}

#[test]
fn formatted_values_read_back_within_rounding() {
    // Four significant digits round within half a unit in the fourth digit: 5e-4 relative.
    let mut rng = modebench_tests::random::Rng::new(0x5eed_0002);
    for _ in 0..2_000 {
        let si = 10f64.powf(rng.unit() * 24.0 - 12.0);
        let kind = *rng.pick(&Kind::ALL);
        let system = *rng.pick(&UnitSystem::ALL);
        let text = format(si, kind, system);
        let back = parse(&text, kind).unwrap_or_else(|e| panic!("{text:?}: {e}")).si;
        check(&text, "round trip through format and parse", si, back, 5e-4);
    }
}

#[test]
fn serde_names_are_kebab_case() {
    let systems: Vec<UnitSystem> = serde_json::from_str(r#"["si", "si-mm", "us-inch", "us-foot"]"#).unwrap();
    assert_eq!(systems, UnitSystem::ALL);
    assert_eq!(UnitSystem::default(), UnitSystem::Si);
    assert_eq!(serde_json::to_string(&Kind::MassPerLength).unwrap(), r#""mass-per-length""#);
}

#[test]
fn unit_list_covers_the_table_and_each_entry_parses() {
    let list = unit_list();
    let lbf = list.iter().find(|u| u.symbol == "lbf").expect("lbf is listed");
    check("lbf in the list", "NIST SP 811, lbf exact", 4.4482216152605, lbf.si_factor, 1e-12);
    assert_eq!(lbf.kind, Some(Kind::Force));
    let mut symbols = Vec::new();
    for info in &list {
        for symbol in std::iter::once(&info.symbol).chain(&info.aliases) {
            assert!(!symbols.contains(symbol), "{symbol} is listed twice");
            symbols.push(*symbol);
            if let Some(kind) = info.kind {
                let si = parse(&format!("1 {symbol}"), kind).unwrap().si;
                assert_eq!(si, info.si_factor, "{symbol}");
            }
        }
    }
    for required in
        ["m", "mm", "cm", "µm", "um", "kg", "g", "t", "N", "kN", "MN", "Pa", "kPa", "MPa", "GPa", "s"]
    {
        assert!(symbols.contains(&required), "{required} is missing");
    }
    for required in
        ["in", "ft", "lb", "lbm", "lbf", "kip", "slug", "psi", "ksi", "Msi", "rad", "Hz", "rpm", "cpm"]
    {
        assert!(symbols.contains(&required), "{required} is missing");
    }
    assert_eq!(list.iter().find(|u| u.symbol == "s").unwrap().quantity, "time");
    assert_eq!(list.iter().find(|u| u.symbol == "rad").unwrap().kind, None);
}
