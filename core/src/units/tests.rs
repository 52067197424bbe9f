//! Tests of reading quantities: exact factors from NIST SP 811, grammar, and error messages.
//!
//! Longer than 400 lines on purpose: every test here reads through the one parser of this module
//! and its message texts, which the tests of grammar and of messages both pin; split in two, each
//! half would repeat the other's helpers.

use super::*;
use modebench_tests::{check, random::Rng};

// Exact definitions restated from NIST Special Publication 811 (2008), appendix B, so that the
// checks below do not reuse the constants of the code under test.
const IN: f64 = 0.0254;
const FT: f64 = 0.3048;
const LB: f64 = 0.45359237;
const G_N: f64 = 9.80665;
const NIST: &str = "NIST SP 811 (2008), appendix B, exact definitions";
/// Relative tolerance for values built from exact definitions: a few roundings of f64.
const EXACT: f64 = 1e-12;

fn si(text: &str, kind: Kind) -> f64 {
    match parse(text, kind) {
        Ok(converted) => converted.si,
        Err(e) => panic!("{text:?} as {kind:?} failed: {e}"),
    }
}

fn error(text: &str, kind: Kind) -> Error {
    match parse(text, kind) {
        Ok(converted) => panic!("{text:?} as {kind:?} should fail, got {}", converted.si),
        Err(e) => e,
    }
}

#[test]
fn examples_convert_to_exact_si_values() {
    let lbf = LB * G_N;
    let cases: &[(&str, Kind, f64)] = &[
        ("27.2 in", Kind::Length, 27.2 * IN),
        ("690 mm", Kind::Length, 0.690),
        ("0.283 lb/in^3", Kind::Density, 0.283 * LB / (IN * IN * IN)),
        ("0.283 lb/in³", Kind::Density, 0.283 * LB / (IN * IN * IN)),
        ("30e6 psi", Kind::Pressure, 30e6 * lbf / (IN * IN)),
        ("200 GPa", Kind::Pressure, 200e9),
        ("1780 rpm", Kind::Frequency, 1780.0 / 60.0),
        ("2.5 kg", Kind::Mass, 2.5),
        ("12 lbf/in", Kind::Stiffness, 12.0 * lbf / IN),
        ("850 N*m/rad", Kind::RotationalStiffness, 850.0),
        ("850 N·m/rad", Kind::RotationalStiffness, 850.0),
        ("850 N⋅m", Kind::RotationalStiffness, 850.0),
        ("0.02 kg*m^2", Kind::RotaryInertia, 0.02),
        ("7.5 lb*in^2", Kind::RotaryInertia, 7.5 * LB * IN * IN),
        ("1.2e4 N*m^2", Kind::FlexuralRigidity, 1.2e4),
        ("3.1 kg/m", Kind::MassPerLength, 3.1),
        ("120 Hz", Kind::Frequency, 120.0),
        ("377 rad/s", Kind::Frequency, 377.0 / (2.0 * std::f64::consts::PI)),
        ("5 lbf*s^2/in", Kind::Mass, 5.0 * lbf / IN),
        ("2 slug", Kind::Mass, 2.0 * lbf / FT),
        ("2.5", Kind::Length, 2.5),
        ("3 µm", Kind::Length, 3e-6),
        ("3 μm", Kind::Length, 3e-6),
        ("3 um", Kind::Length, 3e-6),
        ("4 cm", Kind::Length, 0.04),
        ("4 ft", Kind::Length, 4.0 * FT),
        ("4 g", Kind::Mass, 4e-3),
        ("4 t", Kind::Mass, 4e3),
        ("4 lbm", Kind::Mass, 4.0 * LB),
        ("4 kN", Kind::Force, 4e3),
        ("4 MN", Kind::Force, 4e6),
        ("4 kip", Kind::Force, 4e3 * lbf),
        ("4 lbf", Kind::ShearRigidity, 4.0 * lbf),
        ("4 kPa", Kind::Pressure, 4e3),
        ("4 MPa", Kind::Pressure, 4e6),
        ("4 Pa", Kind::Pressure, 4.0),
        ("4 ksi", Kind::Pressure, 4e3 * lbf / (IN * IN)),
        ("4 Msi", Kind::Pressure, 4e6 * lbf / (IN * IN)),
        ("4 N/m", Kind::Stiffness, 4.0),
        ("4 N/mm", Kind::Stiffness, 4e3),
        ("4 kN/m", Kind::Stiffness, 4e3),
        ("4 lb/ft^3", Kind::Density, 4.0 * LB / (FT * FT * FT)),
        ("4 lb/ft", Kind::MassPerLength, 4.0 * LB / FT),
        ("4 in^4", Kind::SecondMoment, 4.0 * IN * IN * IN * IN),
        ("4 in⁴", Kind::SecondMoment, 4.0 * IN * IN * IN * IN),
        ("4 mm²", Kind::Area, 4e-6),
        ("4 kg·m", Kind::RotaryInertiaPerLength, 4.0),
        ("4 kHz", Kind::Frequency, 4e3),
        ("60 cpm", Kind::Frequency, 1.0),
        ("0.3", Kind::Ratio, 0.3),
        ("5m", Kind::Length, 5.0),
        ("  5 m  ", Kind::Length, 5.0),
        ("+5 m", Kind::Length, 5.0),
        ("-5 m", Kind::Length, -5.0),
        (".5 m", Kind::Length, 0.5),
        ("5. m", Kind::Length, 5.0),
        ("5E-3 m", Kind::Length, 5e-3),
        ("12 lbf / in", Kind::Stiffness, 12.0 * lbf / IN),
        ("1 kg/m/s^2", Kind::Pressure, 1.0),
    ];
    for (text, kind, expected) in cases {
        check(&format!("{text} as {kind:?}"), NIST, *expected, si(text, *kind), EXACT);
    }
}

#[test]
fn derived_factors_match_nist_exact_values() {
    // Each expected value below is the exact definition worked out to 17 digits (NIST SP 811,
    // appendix B); the tabulated 7-digit factors of B.8/B.9 are checked too.
    let cases: &[(&str, Kind, f64, f64, &str)] = &[
        ("1 lbf", Kind::Force, 4.4482216152605, EXACT, "lbf = lb·g_n, exact"),
        ("1 psi", Kind::Pressure, 6894.757293168361, EXACT, "psi = lbf/in², exact"),
        ("1 slug", Kind::Mass, 14.593902937206364, EXACT, "slug = lbf·s²/ft, exact"),
        ("1 lbf*s^2/in", Kind::Mass, 175.12683524647636, EXACT, "lbf·s²/in, exact"),
        ("1 lb/in^3", Kind::Density, 2.767990e4, 1e-6, "B.8: lb/in³ = 2.767 990 E+04 kg/m³"),
        ("1 lb/ft^3", Kind::Density, 1.601846e1, 1e-6, "B.8: lb/ft³ = 1.601 846 E+01 kg/m³"),
        ("1 lbf/in", Kind::Stiffness, 1.751268e2, 1e-6, "B.8: lbf/in = 1.751 268 E+02 N/m"),
        ("1 lb*in^2", Kind::RotaryInertia, 2.926397e-4, 1e-6, "B.8: lb·in² = 2.926 397 E-04 kg·m²"),
    ];
    for (text, kind, expected, tolerance, detail) in cases {
        check(text, &format!("NIST SP 811, {detail}"), *expected, si(text, *kind), *tolerance);
    }
    check(
        "0.283 lb/in³ as a density",
        "0.283 × 0.45359237 / 0.0254³ (NIST SP 811 exact definitions)",
        7833.4,
        si("0.283 lb/in^3", Kind::Density),
        1e-5,
    );
}

#[test]
fn pound_mass_read_as_lbf_s2_per_in_is_off_by_g_over_inch() {
    // The trap of inch-pound-second units: lbf·s²/in is g_n / (1 in) times a pound-mass.
    let ratio = si("1 lbf*s^2/in", Kind::Mass) / si("1 lb", Kind::Mass);
    check("lbf·s²/in ÷ lb", "g_n / 0.0254 m, NIST SP 811 exact", 386.0885826771654, ratio, EXACT);
    check("same, from the definitions", NIST, G_N / IN, ratio, EXACT);
}

#[test]
fn conversions_are_recorded_tidily() {
    let converted = parse("0.283 lb/in^3", Kind::Density).unwrap();
    let conversion = converted.conversion.expect("a conversion record");
    assert_eq!(conversion.written, "0.283 lb/in³");
    assert_eq!(conversion.si_unit, "kg/m³");
    assert_eq!(conversion.text, "0.283 lb/in³ = 7833 kg/m³");
    let rpm = parse("1780 rpm", Kind::Frequency).unwrap().conversion.unwrap();
    assert_eq!(rpm.text, "1780 rpm = 29.667 Hz");
    let mixed = parse("5 lbf*s^2/in", Kind::Mass).unwrap().conversion.unwrap();
    assert_eq!(mixed.written, "5 lbf·s²/in");
    // Values already in SI need no record.
    assert_eq!(parse("2.5 kg", Kind::Mass).unwrap().conversion, None);
    assert_eq!(parse("850 N*m/rad", Kind::RotationalStiffness).unwrap().conversion, None);
    assert_eq!(parse("2.5", Kind::Length).unwrap().conversion, None);
    assert_eq!(
        convert(&Quantity::Number(2.5), Kind::Length).unwrap(),
        Converted { si: 2.5, conversion: None }
    );
}

#[test]
fn quantity_deserialises_from_number_or_text() {
    let q: Vec<Quantity> = serde_json::from_str(r#"[2.5, "27.2 in", 3]"#).unwrap();
    assert_eq!(q, vec![Quantity::Number(2.5), Quantity::Text("27.2 in".into()), Quantity::Number(3.0)]);
    assert_eq!(convert(&q[1], Kind::Length).unwrap().si, 27.2 * IN);
}

#[test]
fn errors_name_what_was_expected_and_what_was_given() {
    let cases: &[(&str, Kind, ErrorKind, &str)] = &[
        ("", Kind::Length, ErrorKind::Syntax, "empty"),
        ("   ", Kind::Length, ErrorKind::Syntax, "empty"),
        ("in", Kind::Length, ErrorKind::Syntax, "number is missing"),
        ("kg*m^2", Kind::RotaryInertia, ErrorKind::Syntax, "number is missing"),
        ("abc", Kind::Mass, ErrorKind::Syntax, "must start with a number"),
        ("4.5\"\"", Kind::Length, ErrorKind::Syntax, "unexpected '\"' after the unit in"),
        ("heavy kg", Kind::Mass, ErrorKind::Syntax, "must start with a number"),
        ("-", Kind::Length, ErrorKind::Syntax, "must start with a number"),
        ("*5 m", Kind::Length, ErrorKind::Syntax, "must start with a number"),
        ("27.2 inhc", Kind::Length, ErrorKind::UnknownUnit, "did you mean in"),
        ("27.2 furlong", Kind::Length, ErrorKind::UnknownUnit, "m, cm, mm, µm, in, ft"),
        ("5 lbs", Kind::Force, ErrorKind::UnknownUnit, "lbf for pound-force"),
        ("5 mpa", Kind::Pressure, ErrorKind::UnknownUnit, "MPa"),
        (
            "30e6 psi",
            Kind::Length,
            ErrorKind::WrongDimension,
            "expected a length, got a pressure or modulus (30e6 psi)",
        ),
        ("12 lb", Kind::Force, ErrorKind::WrongDimension, "lb is pound-mass: write lbf for pound-force"),
        ("12 lb/in", Kind::Stiffness, ErrorKind::WrongDimension, "lb is pound-mass"),
        (
            "0.283 lbf/in^3",
            Kind::Density,
            ErrorKind::WrongDimension,
            "lbf is pound-force: write lb for pound-mass",
        ),
        ("5 lbf", Kind::Mass, ErrorKind::WrongDimension, "lbf is pound-force"),
        ("1780 rpm", Kind::Length, ErrorKind::WrongDimension, "rpm is accepted only in frequency fields"),
        ("50 Hz", Kind::Stiffness, ErrorKind::WrongDimension, "got a frequency"),
        ("5 Hz^2", Kind::Frequency, ErrorKind::WrongDimension, "on its own"),
        ("5 Hz*s", Kind::Frequency, ErrorKind::WrongDimension, "on its own"),
        (
            "377 rad",
            Kind::Frequency,
            ErrorKind::WrongDimension,
            "expected a frequency, got a dimensionless ratio",
        ),
        ("5 s", Kind::Frequency, ErrorKind::WrongDimension, "got a time"),
        ("5 m/s/m", Kind::Frequency, ErrorKind::WrongDimension, "what is counted"),
        ("2.5 kg", Kind::Frequency, ErrorKind::WrongDimension, "expected a frequency, got a mass"),
        ("0.3 mm", Kind::Ratio, ErrorKind::WrongDimension, "expected a dimensionless ratio, got a length"),
        ("5 kg/s", Kind::Mass, ErrorKind::WrongDimension, "a quantity in kg/s"),
        ("5 N m", Kind::RotationalStiffness, ErrorKind::Syntax, "space between units is not a product"),
        ("27.2 in abc", Kind::Length, ErrorKind::Syntax, "space between units"),
        ("27.2 in!", Kind::Length, ErrorKind::Syntax, "unexpected '!'"),
        ("27.2 in 5", Kind::Length, ErrorKind::Syntax, "one unit"),
        ("27.2 kg 5", Kind::Mass, ErrorKind::Syntax, "unexpected '5'"),
        ("1,000 m", Kind::Length, ErrorKind::Syntax, "thousands with no separator, as in 1500"),
        ("1,5 kg", Kind::Mass, ErrorKind::Syntax, "write decimals with a point, as in 1.5"),
        ("1,5", Kind::Mass, ErrorKind::Syntax, "a comma cannot be read in a number"),
        ("5, kg", Kind::Mass, ErrorKind::Syntax, "expected a unit symbol where ','"),
        ("1 500 mm", Kind::Length, ErrorKind::Syntax, "no space inside, as in 1500"),
        ("2 1/2 in", Kind::Length, ErrorKind::Syntax, "a number cannot be read in parts"),
        (
            "4'6\"",
            Kind::Length,
            ErrorKind::Syntax,
            "write a length in one unit, as 5.5 ft or 66 in, not two (ft then 6…)",
        ),
        ("4\u{2032}6\u{2033}", Kind::Length, ErrorKind::Syntax, "not two (ft then 6…)"),
        ("5 ft 6 in", Kind::Length, ErrorKind::Syntax, "not two (ft then 6…)"),
        ("5 *m", Kind::Length, ErrorKind::Syntax, "expected a unit symbol"),
        ("5 m/", Kind::Length, ErrorKind::Syntax, "at the end"),
        ("5 m^5", Kind::SecondMoment, ErrorKind::Syntax, "must be 1, 2, 3 or 4"),
        ("5 m^-1", Kind::Length, ErrorKind::Syntax, "negative power"),
        ("5 m^22", Kind::Area, ErrorKind::Syntax, "must be 1, 2, 3 or 4"),
        ("5 m²³", Kind::Area, ErrorKind::Syntax, "must be 1, 2, 3 or 4"),
        ("5 m⁻¹", Kind::Length, ErrorKind::Syntax, "must be 1, 2, 3 or 4"),
        ("5 m5", Kind::Area, ErrorKind::Syntax, "must be 1, 2, 3 or 4"),
        ("5 m0", Kind::Area, ErrorKind::Syntax, "must be 1, 2, 3 or 4"),
        ("5' 6\"", Kind::Length, ErrorKind::Syntax, "one unit, as 5.5 ft or 66 in"),
        ("5 MPA", Kind::Pressure, ErrorKind::UnknownUnit, "MPa"),
        ("5 Rad/s", Kind::Frequency, ErrorKind::UnknownUnit, "unknown unit"),
        ("5 kg/m*s", Kind::Pressure, ErrorKind::Syntax, "ambiguous"),
        ("5 m*m*m*m*m*m*m*m*m", Kind::Length, ErrorKind::Syntax, "more than 8 parts"),
        ("1e400 m", Kind::Length, ErrorKind::NotFinite, "too large"),
        ("1e300 GPa", Kind::Pressure, ErrorKind::NotFinite, "too large"),
        ("NaN", Kind::Length, ErrorKind::NotFinite, "finite"),
        ("-inf m", Kind::Length, ErrorKind::NotFinite, "finite"),
        ("Infinity", Kind::Length, ErrorKind::NotFinite, "finite"),
    ];
    for (text, kind, expected_kind, fragment) in cases {
        let e = error(text, *kind);
        assert_eq!(e.kind, *expected_kind, "{text:?}: {e}");
        assert!(e.message.contains(fragment), "{text:?}: message {:?} lacks {fragment:?}", e.message);
        assert!(e.path.is_empty(), "{text:?}: a single value carries no path");
        assert_eq!(e.value.as_deref(), Some(text.trim()), "{text:?}: the value is recorded");
    }
    let e = convert(&Quantity::Number(f64::NAN), Kind::Length).unwrap_err();
    assert_eq!(e.kind, ErrorKind::NotFinite);
    let e = convert(&Quantity::Number(f64::INFINITY), Kind::Mass).unwrap_err();
    assert_eq!(e.kind, ErrorKind::NotFinite);
    let e = error("30e6 psi", Kind::Length).at("segments[0].length");
    assert_eq!(e.to_string(), "segments[0].length: expected a length, got a pressure or modulus (30e6 psi)");
}

/// Random strings built from pieces of real quantities and from arbitrary characters never make
/// the parser panic, and every value it accepts is finite.
#[test]
fn random_text_never_panics() {
    const PIECES: &[&str] = &[
        "1", "27.2", "-", "+", ".", "e", "E", "5e3", "1e308", "1e-320", "9e999", " ", "  ", "*", "·", "/",
        "^", "^2", "^4", "^9", "²", "³", "⁴", "⁻", "m", "mm", "µ", "μm", "in", "ft", "lb", "lbf", "psi",
        "Hz", "rpm", "rad", "s", "kg", "N", "GPa", "slug", "(", ")", ",", "nan", "inf", "\u{0}", "\t", "é",
        "💥", "0",
    ];
    let mut rng = Rng::new(0x5eed_0001);
    for _ in 0..20_000 {
        let mut text = String::new();
        for _ in 0..rng.below(9) {
            if rng.below(10) == 0 {
                text.push(char::from_u32(rng.below(0x3000) as u32).unwrap_or('?'));
            } else {
                text.push_str(rng.pick::<&str>(PIECES));
            }
        }
        let kind = *rng.pick(&Kind::ALL);
        if let Ok(converted) = parse(&text, kind) {
            assert!(converted.si.is_finite(), "{text:?} as {kind:?} gave {}", converted.si);
        }
    }
    let long = "m".repeat(100_000);
    assert!(parse(&format!("1 {long}"), Kind::Length).is_err());
    assert!(parse(&"9".repeat(100_000), Kind::Length).is_err());
}

#[test]
fn common_spellings_read_as_their_units() {
    // Each spelling against the exact definition of its unit (NIST SP 811, appendix B): the inch
    // and foot by name and by their marks (with the curly and prime forms a tablet's keyboard
    // types), lb/ft3 and pcf as a pound per cubic foot, and the cycle units in any case.
    let pcf = LB / (FT * FT * FT);
    let cases: &[(&str, Kind, f64)] = &[
        ("4.5 inch", Kind::Length, 4.5 * IN),
        ("4.5 inches", Kind::Length, 4.5 * IN),
        ("4.5in", Kind::Length, 4.5 * IN),
        ("4.5\"", Kind::Length, 4.5 * IN),
        ("4.5 \"", Kind::Length, 4.5 * IN),
        ("4.5\u{201d}", Kind::Length, 4.5 * IN),
        ("4.5\u{2033}", Kind::Length, 4.5 * IN),
        ("24'", Kind::Length, 24.0 * FT),
        ("24\u{2019}", Kind::Length, 24.0 * FT),
        ("24\u{2032}", Kind::Length, 24.0 * FT),
        ("24 ft", Kind::Length, 24.0 * FT),
        ("24 feet", Kind::Length, 24.0 * FT),
        ("1 foot", Kind::Length, FT),
        ("62.4 lb/ft3", Kind::Density, 62.4 * pcf),
        ("62.4 lb/ft^3", Kind::Density, 62.4 * pcf),
        ("62.4 pcf", Kind::Density, 62.4 * pcf),
        ("1000 kg/m3", Kind::Density, 1000.0),
        ("3 in2", Kind::Area, 3.0 * IN * IN),
        ("7.5 lb*in2", Kind::RotaryInertia, 7.5 * LB * IN * IN),
        ("1780 rpm", Kind::Frequency, 1780.0 / 60.0),
        ("1780 RPM", Kind::Frequency, 1780.0 / 60.0),
        ("1780 Rpm", Kind::Frequency, 1780.0 / 60.0),
        ("1780 rPm", Kind::Frequency, 1780.0 / 60.0),
        ("60 Hz", Kind::Frequency, 60.0),
        ("60 hz", Kind::Frequency, 60.0),
        ("60 HZ", Kind::Frequency, 60.0),
        ("2 khz", Kind::Frequency, 2e3),
        ("2 KHz", Kind::Frequency, 2e3),
        ("90 CPM", Kind::Frequency, 1.5),
    ];
    for (text, kind, expected) in cases {
        check(&format!("{text} as {kind:?}"), NIST, *expected, si(text, *kind), EXACT);
    }
    check(
        "1 pcf",
        "NIST SP 811, B.8: lb/ft³ = 1.601 846 E+01 kg/m³",
        1.601846e1,
        si("1 pcf", Kind::Density),
        1e-6,
    );
    // Written out in the usual symbol, whatever spelling was typed.
    let written = |text: &str, kind| parse(text, kind).unwrap().conversion.unwrap().written;
    assert_eq!(written("4.5\"", Kind::Length), "4.5 in");
    assert_eq!(written("24 feet", Kind::Length), "24 ft");
    assert_eq!(written("62.4 lb/ft3", Kind::Density), "62.4 lb/ft³");
    assert_eq!(written("1780 RPM", Kind::Frequency), "1780 rpm");
}

#[test]
fn converted_values_carry_the_digits_typed_and_one_more() {
    // 24 ft is exactly 7.3152 m (0.3048 m per foot, NIST SP 811); two digits typed, three shown.
    let text = |typed: &str, kind| parse(typed, kind).unwrap().conversion.unwrap().text;
    assert_eq!(text("24 ft", Kind::Length), "24 ft = 7.32 m");
    assert_eq!(text("24.000 ft", Kind::Length), "24.000 ft = 7.3152 m");
    assert_eq!(text("4.5 in", Kind::Length), "4.5 in = 0.114 m");
    assert_eq!(text("0.237 in", Kind::Length), "0.237 in = 0.00602 m");
    assert_eq!(text("30e6 psi", Kind::Pressure), "30e6 psi = 2.07e11 Pa");
    assert_eq!(text("1780 rpm", Kind::Frequency), "1780 rpm = 29.667 Hz");
    // No float noise reaches the text, whatever was typed.
    let mut rng = Rng::new(0x5eed_0024);
    for _ in 0..2000 {
        let typed = format!("{}.{} ft", rng.below(1000), rng.below(1000));
        let shown = text(&typed, Kind::Length);
        let number = shown.split(" = ").nth(1).and_then(|s| s.strip_suffix(" m")).unwrap_or("");
        assert!(number.len() <= 9, "{shown}");
        assert!(!number.contains("0000000") && !number.contains("9999999"), "{shown}");
    }
}

#[test]
fn a_value_without_its_number_is_answered_with_an_example_of_its_own_kind() {
    // Common practice, no source: the example in a message is one the field accepts, so a fan
    // speed typed as "rpm" is not told to write "27.2 in".
    let frequency = parse("rpm", Kind::Frequency).unwrap_err();
    assert!(
        frequency.message.contains("as in \"27.2 Hz\"") && !frequency.message.contains(" in\""),
        "{frequency}"
    );
    let length = parse("mm", Kind::Length).unwrap_err();
    assert!(length.message.contains("as in \"27.2 in\""), "{length}");
    let empty = parse(" ", Kind::Mass).unwrap_err();
    assert!(empty.message.contains("as in \"27.2 kg\""), "{empty}");
    // A modulus field refuses 27.2 Pa as implausible, and Poisson's ratio refuses 27.2.
    let modulus = parse("abc", Kind::Pressure).unwrap_err();
    assert!(modulus.message.contains("as in \"200 GPa\""), "{modulus}");
    let ratio = parse("abc", Kind::Ratio).unwrap_err();
    assert!(ratio.message.contains("as in \"0.3\""), "{ratio}");
    for kind in Kind::ALL {
        let example = display::example(kind);
        let read = parse(&example, kind).unwrap_or_else(|e| panic!("{kind:?}: {example} is refused: {e}"));
        assert!(read.si > 0.0, "{kind:?}: {example}");
    }
    let modulus = parse(&display::example(Kind::Pressure), Kind::Pressure).unwrap().si;
    assert!(crate::schema::MODULUS.contains(modulus, false), "{modulus} Pa");
    let expansion = parse(&display::example(Kind::ThermalExpansion), Kind::ThermalExpansion).unwrap().si;
    assert!(crate::schema::MATERIAL_RECORD_FIELDS[1].range.contains(expansion, false), "{expansion} /K");
}

#[test]
fn an_unknown_unit_in_a_ratio_is_answered_with_a_plain_number() {
    // Common practice, no source: a ratio has no unit to list, so the message says how it is
    // written instead of ending on an empty list. A percentage is not offered: the ratio's
    // reader refuses one (only the margin's and the tolerance's own readers take it).
    let e = parse("12 furlongs", Kind::Ratio).unwrap_err();
    assert_eq!(e.kind, ErrorKind::UnknownUnit);
    assert!(e.message.ends_with("A dimensionless ratio is written as a plain number, as in 0.3"), "{e}");
    assert!(!e.message.contains("units like"), "{e}");
    assert!(parse("15 %", Kind::Ratio).is_err(), "the ratio's reader takes no percentage");
    // Kinds with units still list them.
    let e = parse("12 furlongs", Kind::Pressure).unwrap_err();
    assert!(e.message.contains("written in units like Pa, kPa, MPa, GPa"), "{e}");
}

#[test]
fn a_text_read_again_gives_what_it_gave_the_first_time() {
    // The reader remembers texts it has read; reading one again (and after more than it
    // remembers) gives the same value and the same record, and a refused text is refused again.
    let first = parse("0.283 lb/in^3", Kind::Density).expect("reads");
    for i in 0..300 {
        assert!(parse(&format!("{i} mm"), Kind::Length).is_ok());
        assert_eq!(parse("0.283 lb/in^3", Kind::Density), Ok(first.clone()));
    }
    // The same text for another kind is read for that kind.
    assert!(parse("0.283 lb/in^3", Kind::Length).is_err());
    assert_eq!(parse("12 furlongs", Kind::Length), parse("12 furlongs", Kind::Length));
    assert!(parse("12 furlongs", Kind::Length).is_err());
}
