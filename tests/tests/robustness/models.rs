//! Hostile models built directly: analysed, they give an error or finite results.

use super::assert_plain;
use modebench::{analyse, Attachment, End, Model, ModelParts, Options, Segment, Theory};
use modebench_tests::random::Rng;
use std::panic::{catch_unwind, AssertUnwindSafe};

const HOSTILE: [f64; 12] =
    [f64::NAN, f64::INFINITY, -f64::INFINITY, 0.0, -1.0, 1e300, 1e-300, -1e-9, 1e12, 1e-12, 3.0, 0.5];

fn value(rng: &mut Rng) -> f64 {
    if rng.below(12) == 0 {
        HOSTILE[rng.below(HOSTILE.len())]
    } else {
        rng.log_range(1e-3, 1e3)
    }
}

fn hostile_parts(rng: &mut Rng) -> ModelParts {
    let segments = (0..rng.below(4))
        .map(|_| Segment {
            length: value(rng),
            flexural_rigidity: value(rng),
            mass_per_length: value(rng),
            shear_rigidity: if rng.below(2) == 0 { Some(value(rng)) } else { None },
            rotary_inertia_per_length: value(rng),
        })
        .collect();
    let end = |rng: &mut Rng| match rng.below(5) {
        0 => End::Free,
        1 => End::Pinned,
        2 => End::Clamped,
        3 => End::Guided,
        _ => End::Elastic { translational: value(rng), rotational: value(rng) },
    };
    let (left, right) = (end(rng), end(rng));
    let attachments = (0..rng.below(6))
        .map(|_| {
            let position = value(rng);
            match rng.below(5) {
                0 => Attachment::Mass { position, mass: value(rng), rotary_inertia: value(rng) },
                1 => Attachment::Spring { position, stiffness: value(rng) },
                2 => Attachment::RotationalSpring { position, stiffness: value(rng) },
                3 => Attachment::Support { position },
                _ => Attachment::SprungMass { position, mass: value(rng), stiffness: value(rng) },
            }
        })
        .collect();
    let theory = if rng.below(3) == 0 { Theory::Timoshenko } else { Theory::EulerBernoulli };
    ModelParts { segments, left, right, attachments, theory }
}

#[test]
fn hostile_models_give_errors_or_finite_results() {
    let mut rng = Rng::new(0xBAD);
    let (mut ok, mut err) = (0, 0);
    for i in 0..600 {
        let parts = hostile_parts(&mut rng);
        let modes = 1 + rng.below(6);

        let outcome = catch_unwind(AssertUnwindSafe(|| {
            let model = Model::new(parts.clone())?;
            analyse(&model, &Options::with_modes(modes))
        }));

        match outcome {
            Err(_) => panic!("case {i} panicked on {parts:#?}"),
            Ok(Err(e)) => {
                err += 1;
                assert_plain(&e, &format!("case {i}"));
                assert!(!e.path.is_empty(), "case {i}: {e} names no field");
            }
            Ok(Ok(a)) => {
                ok += 1;
                for m in &a.modes {
                    assert!(
                        m.omega.is_finite() && m.fe_omega.is_none_or(f64::is_finite),
                        "case {i}: {parts:#?}"
                    );
                    assert!(
                        m.shape.deflection.iter().chain(&m.shape.x).all(|v| v.is_finite()),
                        "case {i} shape"
                    );
                }
            }
        }
    }
    assert!(
        ok > 20 && err > 20,
        "the generator should produce both valid and invalid models ({ok} ok, {err} errors)"
    );
}
