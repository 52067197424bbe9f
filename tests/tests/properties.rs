//! Properties the methods must have, on seeded random models (facts of the theory, named beside
//! each check).

use modebench::bounds;
use modebench::fe::{self, Mesh};
use modebench::{analyse, exact, Attachment, End, Model, ModelParts, Options, Segment, Theory};
use modebench_tests::random::{self, Kinds, Rng};
use modebench_tests::{check, relative_error};

const RESTRAINED: Kinds = Kinds { unrestrained: false, sprung: true, supports: true, timoshenko: false };
const ANY: Kinds = Kinds { unrestrained: true, sprung: true, supports: true, timoshenko: false };

fn rebuild(model: &Model, edit: impl FnOnce(&mut ModelParts)) -> Model {
    let mut parts = model.parts().clone();
    edit(&mut parts);
    Model::new(parts).expect("edited model is valid")
}

/// All frequencies including the rigid-body zeros, so spectra of different models line up.
fn spectrum(model: &Model, n: usize) -> Vec<f64> {
    let mut out = vec![0.0; model.rigid_body_modes()];
    out.extend(exact::frequencies(model, n).expect("solves"));
    out
}

#[test]
fn fe_converges_to_exact_at_fourth_order() {
    // The Hermite cubic element's eigenvalue error falls as h⁴ (Strang & Fix, An Analysis of the
    // Finite Element Method, ch. 6 — from memory): halving the elements divides it by about 16.
    let mut rng = Rng::new(11);
    for _ in 0..5 {
        let model = random::model(&mut rng, Kinds { sprung: false, ..RESTRAINED });
        let exact = exact::frequencies(&model, 3).expect("solves")[2];
        let error = |n| {
            let fe = fe::frequencies(&model, 3, Mesh::PerSpan(n)).expect("solves").omegas[2];
            (fe - exact) / exact
        };
        let (coarse, fine) = (error(6), error(12));
        assert!(coarse > 0.0 && fine > 0.0, "FE frequencies lie above the exact ones (Rayleigh–Ritz)");
        let order = (coarse / fine).log2();
        assert!((3.5..4.6).contains(&order), "observed order {order} (errors {coarse:e}, {fine:e})");
    }
}

#[test]
fn rayleigh_is_above_and_dunkerley_below_the_exact_fundamental() {
    // Rayleigh's principle (upper bound) and Dunkerley's sum (lower bound, by Weyl's inequality).
    let mut rng = Rng::new(12);
    for i in 0..60 {
        let model = random::model(&mut rng, RESTRAINED);
        let a = analyse(&model, &Options::with_modes(1)).expect("solves");
        let f = a.fundamental.expect("restrained model has a fundamental");
        let (r, d) = (f.rayleigh.expect("rayleigh"), f.dunkerley.expect("dunkerley"));
        assert!(r >= f.omega * (1.0 - 1e-10), "model {i}: Rayleigh {r} below exact {}", f.omega);
        assert!(d <= f.omega * (1.0 + 1e-10), "model {i}: Dunkerley {d} above exact {}", f.omega);
    }
}

#[test]
fn mirrored_model_has_the_same_frequencies() {
    // A fact of symmetry: reading the beam from the other end changes nothing.
    let mut rng = Rng::new(13);
    for _ in 0..20 {
        let model = random::model(&mut rng, ANY);
        let length = model.length();
        let mirrored = rebuild(&model, |p| {
            p.segments.reverse();
            std::mem::swap(&mut p.left, &mut p.right);
            for a in &mut p.attachments {
                let x = length - a.position();
                *a = match *a {
                    Attachment::Mass { mass, rotary_inertia, .. } => {
                        Attachment::Mass { position: x, mass, rotary_inertia }
                    }
                    Attachment::Spring { stiffness, .. } => Attachment::Spring { position: x, stiffness },
                    Attachment::RotationalSpring { stiffness, .. } => {
                        Attachment::RotationalSpring { position: x, stiffness }
                    }
                    Attachment::Support { .. } => Attachment::Support { position: x },
                    Attachment::SprungMass { mass, stiffness, .. } => {
                        Attachment::SprungMass { position: x, mass, stiffness }
                    }
                };
            }
        });
        for (a, b) in spectrum(&model, 5).iter().zip(spectrum(&mirrored, 5)) {
            assert!((a - b).abs() <= 1e-10 * a.max(1.0), "{a} vs {b}");
        }
    }
}

#[test]
fn four_times_the_stiffness_doubles_every_frequency() {
    // ω ∝ √(stiffness/mass): scaling every stiffness (EI and all springs) by 4 doubles ω.
    let mut rng = Rng::new(14);
    for _ in 0..20 {
        let model = random::model(&mut rng, ANY);
        let stiffer = rebuild(&model, |p| {
            for s in &mut p.segments {
                s.flexural_rigidity *= 4.0;
            }
            let scale_end = |e: &mut End| {
                if let End::Elastic { translational, rotational } = e {
                    *translational *= 4.0;
                    *rotational *= 4.0;
                }
            };
            scale_end(&mut p.left);
            scale_end(&mut p.right);
            for a in &mut p.attachments {
                match a {
                    Attachment::Spring { stiffness, .. }
                    | Attachment::RotationalSpring { stiffness, .. }
                    | Attachment::SprungMass { stiffness, .. } => *stiffness *= 4.0,
                    _ => {}
                }
            }
        });
        for (a, b) in spectrum(&model, 5).iter().zip(spectrum(&stiffer, 5)) {
            assert!((2.0 * a - b).abs() <= 1e-10 * b.max(1.0), "{a} ×2 vs {b}");
        }
    }
}

#[test]
fn mode_shapes_are_mass_orthogonal() {
    // Orthogonality of the modes of a self-adjoint problem with respect to the mass.
    let mut rng = Rng::new(15);
    for _ in 0..15 {
        let model = random::model(&mut rng, ANY);
        let modes = exact::modes(&model, 5).expect("solves");
        for i in 0..modes.len() {
            for j in 0..i {
                let (a, b) = (&modes[i].shape, &modes[j].shape);
                let c = a.mass_product(b, &model) / (a.generalized_mass * b.generalized_mass).sqrt();
                assert!(c.abs() < 1e-7, "modes {} and {}: normalised mass product {c:e}", i + 1, j + 1);
            }
        }
    }
}

#[test]
fn adding_mass_never_raises_and_adding_stiffness_never_lowers_a_frequency() {
    // Rayleigh's theorems on the effect of mass and stiffness changes (Rayleigh, Theory of Sound,
    // vol. 1, §88 — from memory): the spectrum moves monotonically.
    let mut rng = Rng::new(16);
    for _ in 0..25 {
        let model = random::model(&mut rng, ANY);
        let x = rng.range(0.0, 1.0) * model.length();
        let base = spectrum(&model, 5);
        let heavier = rebuild(&model, |p| {
            p.attachments.push(Attachment::Mass { position: x, mass: 0.3, rotary_inertia: 0.01 })
        });
        for (a, b) in base.iter().zip(spectrum(&heavier, 5)) {
            assert!(b <= a * (1.0 + 1e-10) + 1e-12, "mass raised a frequency: {a} → {b}");
        }
        let stiffer =
            rebuild(&model, |p| p.attachments.push(Attachment::Spring { position: x, stiffness: 5.0 }));
        for (a, b) in base.iter().zip(spectrum(&stiffer, 5)) {
            assert!(b >= a * (1.0 - 1e-10), "stiffness lowered a frequency: {a} → {b}");
        }
        let thicker = rebuild(&model, |p| p.segments[0].flexural_rigidity *= 1.5);
        for (a, b) in base.iter().zip(spectrum(&thicker, 5)) {
            assert!(b >= a * (1.0 - 1e-10), "EI lowered a frequency: {a} → {b}");
        }
    }
}

#[test]
fn fine_fe_agrees_with_exact_and_default_mesh_reaches_its_target() {
    // The slow obvious reference: a fine finite-element mesh converges to the exact answer; the
    // default mesh is sized for about 1e-4 on the last mode asked for.
    let mut rng = Rng::new(17);
    for i in 0..15 {
        let model = random::model(&mut rng, ANY);
        let exact = exact::frequencies(&model, 6).expect("solves");
        // 160 elements: discretisation error ~1e-7 on mode 6, round-off ~160⁴·ε ≈ 1e-7.
        let fine = fe::frequencies(&model, 6, Mesh::Total(160)).expect("solves").omegas;
        for (e, f) in exact.iter().zip(&fine) {
            check(&format!("model {i}"), "finite elements, 160 elements", *e, *f, 1e-6);
        }
        let a = analyse(&model, &Options::with_modes(6)).expect("solves");
        for m in a.modes.iter().filter(|m| !m.rigid_body) {
            let d = m.fe_difference().expect("FE frequency");
            assert!(d.abs() < 2e-4, "model {i} mode {}: default mesh difference {d:e}", m.number);
        }
    }
}

#[test]
fn the_finite_element_check_stays_within_its_own_error_estimate() {
    // What the check says of itself (mesh error from the element's error formula, round-off from
    // the pencil's conditioning) must cover its actual difference from the exact value, on random
    // models and on attachments that crowd; otherwise the report's warning about a disagreeing
    // check would cry wolf, or stay silent when it should not.
    let mut rng = Rng::new(23);
    for i in 0..40 {
        let mut model = random::model(&mut rng, ANY);
        if i % 4 == 0 {
            // Crowd a second mass next to the first attachment.
            let x = model.attachments().first().map_or(0.5 * model.length(), |a| a.position());
            let d = 10f64.powf(-rng.range(3.0, 11.0)) * model.length();
            let y = if x + d < model.length() { x + d } else { x - d };
            model = rebuild(&model, |p| {
                p.attachments.push(Attachment::Mass { position: y, mass: 0.3, rotary_inertia: 0.0 })
            });
        }
        let a = analyse(&model, &Options::with_modes(6)).expect("solves");
        assert!(
            a.warnings.iter().all(|w| w.code.id() != "fe-disagrees"),
            "model {i}: {:?}",
            a.warnings.iter().map(|w| &w.message).collect::<Vec<_>>()
        );
        for m in a.modes.iter().filter(|m| !m.rigid_body) {
            assert!(
                m.accuracy.is_some_and(|x| x < 1e-11),
                "model {i} mode {}: accuracy {:?}",
                m.number,
                m.accuracy
            );
            let (d, e) = (m.fe_difference().unwrap_or(0.0), m.fe_error.unwrap_or(0.0));
            assert!(
                d.abs() <= 10.0 * e + 1e-9,
                "model {i} mode {}: FE off by {d:e}, estimated {e:e}",
                m.number
            );
        }
    }
}

#[test]
fn banded_fe_solver_equals_the_dense_reference() {
    // nalgebra's dense symmetric eigensolver on the same matrices is the slow obvious reference.
    // Both carry round-off of about ε·κ(K) on the lowest modes, hence 1e-7 rather than 1e-12.
    let mut rng = Rng::new(18);
    for _ in 0..10 {
        let model = random::model(&mut rng, ANY);
        let rigid = model.rigid_body_modes();
        let dense = fe::dense_frequencies(&model, Mesh::Total(24)).expect("dense solve");
        let banded = fe::frequencies(&model, 5, Mesh::Total(24)).expect("banded solve").omegas;
        for (d, b) in dense[rigid..].iter().zip(&banded) {
            assert!(relative_error(*d, *b) < 1e-7, "{d} vs {b}");
        }
    }
}

#[test]
fn equivalent_system_reproduces_the_fundamental_and_the_tip_modal_mass() {
    // The equivalent mass of a cantilever's first mode at its tip is m·L/4 (the mode shape
    // normalised to 1 at the tip has ∫φ² dx = L/4 — a classical result, from memory).
    let model = Model::new(ModelParts {
        segments: vec![Segment::slender(2.0, 3.0, 5.0)],
        left: End::Clamped,
        right: End::Free,
        attachments: vec![],
        theory: Theory::EulerBernoulli,
    })
    .expect("valid");
    let modes = exact::modes(&model, 1).expect("solves");
    let eq = bounds::equivalent(&modes[0].shape, modes[0].omega, 2.0).expect("tip moves");
    check("cantilever tip equivalent mass", "m·L/4 (classical, from memory)", 5.0 * 2.0 / 4.0, eq.mass, 1e-9);
    check(
        "equivalent system frequency",
        "ω² = k/m by construction",
        modes[0].omega,
        (eq.stiffness / eq.mass).sqrt(),
        1e-12,
    );
}

#[test]
fn the_check_counts_every_attachment_that_shares_a_station_with_another() {
    // A 20 kg mass and a soft spring at one station 37 mm from a light mass with rotary inertia,
    // on a long guided–clamped tube: the mesh puts the station inside an element at first, so
    // the check must count both attachments there in its estimate and give the heavy mass a
    // node of its own. The finite-element result is a Rayleigh–Ritz value (at or above the
    // exact one) within its own estimate, with the factor 10 the report itself allows.
    let scenario = r#"{"left":"guided","right":"clamped","theory":"timoshenko",
        "attachments":[
          {"position":"791.1154774468031 mm","stiffness":"7.619196106401597 lbf/in","type":"spring"},
          {"mass":"43.1401139103292 lb","position":"791.1154774468031 mm","type":"mass"},
          {"position":"11.529479696540568 ft","stiffness":22673.832386339498,"type":"rotational-spring"},
          {"mass":"0.041104591558082444 kg","position":"61.863474669020654 in","type":"mass"},
          {"mass":"0.2749408867262459 lb","position":0.7538560878941233,"rotary_inertia":5.479326443540589e-6,"type":"mass"}],
        "segments":[{"extra_mass":{"lining":2.263871171634665},"length":"12.22420917082672 ft",
          "material":"gfrp-pultruded","section":{"outer_diameter":0.032941767952155504,"shape":"tube","wall":"0.002300520285517636 m"}}]}"#;
    for theory in ["timoshenko", "euler-bernoulli"] {
        let report = modebench::solve_json(&scenario.replace("timoshenko", theory)).expect("solves");
        assert!(report.warnings.iter().all(|w| w.code.id() != "fe-disagrees"), "{:?}", report.warnings);
        for m in &report.modes {
            let (d, e, a) = (m.fe_difference.unwrap(), m.fe_error.unwrap(), m.accuracy.unwrap());
            assert!(
                d >= -1e-9 && d <= 10.0 * (e + a),
                "{theory} mode {}: {d:e} against {e:e} + {a:e}",
                m.number
            );
        }
    }
}
