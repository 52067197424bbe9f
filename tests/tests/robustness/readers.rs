//! Seeded random inputs, hostile numbers included, never make the input readers panic; whatever
//! they accept is finite, and whatever they refuse is refused with a short message that shows
//! no NaN or infinity.

use super::assert_plain;
use modebench::extra_mass::{breakdown, ExtraMassInput, Submerged};
use modebench::material::{resolve, MaterialInput};
use modebench::section::{properties, BendingAxis, SectionInput, SectionProps};
use modebench::units::{parse, Kind, Quantity};
use modebench_tests::random::Rng;

const HOSTILE: [f64; 12] =
    [f64::NAN, f64::INFINITY, f64::NEG_INFINITY, 0.0, -0.0, 1e300, -1e300, 1e-300, 5e-324, -1.0, 0.5, 1.0];
const UNITS: [&str; 16] = [
    "", "m", "mm", "in", "ft", "kg", "lb", "lbf", "psi", "GPa", "kg/m^3", "lb/in³", "mm^2", "in^4", "Hz",
    "N m",
];

fn number(rng: &mut Rng) -> f64 {
    if rng.below(3) == 0 {
        *rng.pick(&HOSTILE)
    } else {
        // Magnitudes from 1e-12 to 1e12, a few of them negative.
        let magnitude = 10f64.powf(rng.unit() * 24.0 - 12.0);
        if rng.below(8) == 0 {
            -magnitude
        } else {
            magnitude
        }
    }
}

fn quantity(rng: &mut Rng) -> Quantity {
    match rng.below(4) {
        0 => Quantity::Number(number(rng)),
        1 => Quantity::Text(format!("{:e}", number(rng))),
        2 => Quantity::Text(format!("{} {}", number(rng), rng.pick(&UNITS))),
        _ => {
            let junk: String =
                (0..rng.below(12)).map(|_| char::from_u32(rng.below(0x250) as u32).unwrap_or('?')).collect();
            Quantity::Text(junk)
        }
    }
}

fn maybe(rng: &mut Rng) -> Option<Quantity> {
    (rng.below(2) == 0).then(|| quantity(rng))
}

fn section(rng: &mut Rng) -> SectionInput {
    let shape = rng.below(6);
    let mut q = || quantity(rng);
    match shape {
        0 => SectionInput::Rectangle { width: q(), depth: q() },
        1 => SectionInput::Round { diameter: q() },
        2 => SectionInput::Tube { outer_diameter: q(), wall: q() },
        3 => SectionInput::RectangularTube { width: q(), depth: q(), wall: q() },
        4 => SectionInput::IBeam {
            depth: q(),
            flange_width: q(),
            flange_thickness: q(),
            web_thickness: q(),
            axis: BendingAxis::Weak,
        },
        _ => SectionInput::Custom { area: q(), second_moment: q(), depth: None, shear_coefficient: None },
    }
}

fn assert_finite(what: &str, values: &[f64]) {
    assert!(values.iter().all(|v| v.is_finite()), "{what} accepted a non-finite result: {values:?}");
}

#[test]
fn random_inputs_give_errors_or_finite_values() {
    let mut rng = Rng::new(0x5eed_0003);
    for _ in 0..5_000 {
        let text = match quantity(&mut rng) {
            Quantity::Text(text) => text,
            Quantity::Number(n) => n.to_string(),
        };
        match parse(&text, *rng.pick(&Kind::ALL)) {
            Ok(converted) => assert_finite(&text, &[converted.si]),
            Err(e) => assert_plain(&e, &text),
        }

        let input = section(&mut rng);
        let poisson = if rng.below(4) == 0 { *rng.pick(&HOSTILE) } else { rng.unit() * 0.5 };
        let section = properties(&input, poisson);
        if let Err(e) = &section {
            assert_plain(e, "a reader");
        }
        if let Ok(p) = section {
            assert_finite(
                &format!("{input:?}"),
                &[p.area, p.second_moment, p.depth, p.shear_coefficient, p.bore_area],
            );
            assert!(p.area > 0.0 && p.second_moment > 0.0 && p.depth > 0.0, "{input:?} gave {p:?}");
            assert!(p.shear_coefficient > 0.0 && p.shear_coefficient <= 1.0, "{input:?} gave {p:?}");
        }

        let material = match rng.below(3) {
            0 => MaterialInput::Preset(rng.pick(&["steel", "douglas-fir", "", "Steel", "nan"]).to_string()),
            _ => MaterialInput::Custom {
                youngs_modulus: quantity(&mut rng),
                density: quantity(&mut rng),
                poisson: maybe(&mut rng),
                shear_modulus: maybe(&mut rng),
                preset: None,
                thermal_expansion: maybe(&mut rng),
            },
        };
        let resolved = resolve(&material);
        if let Err(e) = &resolved {
            assert_plain(e, "a reader");
        }
        if let Ok(m) = resolved {
            assert_finite(
                &format!("{material:?}"),
                &[m.youngs_modulus, m.density, m.shear_modulus, m.poisson],
            );
            assert!(m.youngs_modulus > 0.0 && m.density > 0.0 && m.shear_modulus > 0.0, "{material:?}");
        }

        let props = SectionProps {
            area: number(&mut rng),
            second_moment: number(&mut rng),
            depth: number(&mut rng),
            shear_coefficient: number(&mut rng),
            outer_diameter: (rng.below(2) == 0).then(|| number(&mut rng)),
            bore_area: number(&mut rng),
            conversions: Vec::new(),
        };
        let extra = ExtraMassInput {
            contents: None,
            contents_density: maybe(&mut rng),
            lining: maybe(&mut rng),
            submerged: (rng.below(2) == 0).then(|| Submerged {
                water_density: maybe(&mut rng),
                added_mass_coefficient: maybe(&mut rng),
            }),
        };
        let mass = breakdown(&props, number(&mut rng), &extra);
        if let Err(e) = &mass {
            assert_plain(e, "a reader");
        }
        if let Ok(mass) = mass {
            assert_finite(
                "breakdown",
                &[mass.structural, mass.contents, mass.lining, mass.added_water, mass.total()],
            );
        }
    }
}
