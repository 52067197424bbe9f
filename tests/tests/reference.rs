//! The exact method against an independent computation with a general-purpose library: the
//! roots of the beam's boundary-value determinant, found with mpmath at 30 digits
//! (`tests/python/beam_roots.py`), for classical cases, published frequency-equation cases and
//! seeded random stepped beams with every kind of end and attachment; and the banded
//! finite-element eigensolver against scipy's dense generalized solver on the exported matrices.

use modebench::fe::{self, Mesh};
use modebench::{exact, Attachment, End, Model, ModelParts, Segment, Theory};
use modebench_tests::random::{self, Kinds, Rng};
use modebench_tests::{check, reference};

fn unit_beam(left: End, right: End, attachments: Vec<Attachment>) -> Model {
    Model::new(ModelParts {
        segments: vec![Segment::slender(1.0, 1.0, 1.0)],
        left,
        right,
        attachments,
        theory: Theory::EulerBernoulli,
    })
    .expect("valid model")
}

#[test]
fn exact_method_matches_mpmath_roots_of_the_characteristic_determinant() {
    let mut cases: Vec<(String, Model, usize)> = Vec::new();
    // Cantilever with a tip mass (and rotary inertia): the published frequency equation
    // 1 + cos λ cosh λ + μλ(cos λ sinh λ − sin λ cosh λ) = 0 (Blevins, table 8-8 — from memory)
    // is what the determinant reduces to without rotary inertia.
    for (mu, j) in [(0.2, 0.0), (1.0, 0.0), (5.0, 0.0), (1.0, 0.05)] {
        let tip = Attachment::Mass { position: 1.0, mass: mu, rotary_inertia: j };
        cases.push((format!("tip mass μ={mu} J={j}"), unit_beam(End::Clamped, End::Free, vec![tip]), 4));
    }
    // Simply supported beam with a mass at mid-span, and at a third.
    for (x, mass) in [(0.5, 1.0), (1.0 / 3.0, 0.5)] {
        let m = Attachment::Mass { position: x, mass, rotary_inertia: 0.0 };
        cases.push((
            format!("pinned beam, mass {mass} at {x:.3}"),
            unit_beam(End::Pinned, End::Pinned, vec![m]),
            4,
        ));
    }
    // Two equal spans, and a propped cantilever with a tuned sprung mass.
    cases.push((
        "two spans".into(),
        unit_beam(End::Pinned, End::Pinned, vec![Attachment::Support { position: 0.5 }]),
        4,
    ));
    cases.push((
        "sprung mass on a propped cantilever".into(),
        unit_beam(
            End::Clamped,
            End::Pinned,
            vec![Attachment::SprungMass { position: 0.6, mass: 0.3, stiffness: 60.0 }],
        ),
        4,
    ));
    let mut rng = Rng::new(0x5EED_0001);
    let kinds = Kinds { unrestrained: false, sprung: true, supports: true, timoshenko: false };
    for i in 0..12 {
        cases.push((format!("random model {i}"), random::model(&mut rng, kinds), 4));
    }
    let input = serde_json::json!({
        "models": cases.iter().map(|(id, m, n)| reference::model_json(id, m, *n)).collect::<Vec<_>>()
    });
    let Some(out) = reference::run("beam_roots.py", &["mpmath"], &input.to_string()) else { return };
    let roots: std::collections::HashMap<String, Vec<f64>> =
        serde_json::from_str(&out).expect("JSON from beam_roots.py");
    for (id, model, n) in &cases {
        let expected = &roots[id];
        assert_eq!(expected.len(), *n, "{id}: mpmath found {} roots", expected.len());
        let got = exact::frequencies(model, *n).expect("solves");
        for (k, (e, g)) in expected.iter().zip(&got).enumerate() {
            check(
                &format!("{id}, mode {}", k + 1),
                "mpmath roots of the characteristic determinant",
                *e,
                *g,
                1e-9,
            );
        }
    }
}

#[test]
fn banded_fe_solver_matches_scipy_on_the_same_matrices() {
    let mut rng = Rng::new(0x5EED_0002);
    let kinds = Kinds { unrestrained: false, sprung: true, supports: true, timoshenko: false };
    let mut models = Vec::new();
    for i in 0..6 {
        let model = random::model(&mut rng, kinds);
        let (k, m) = fe::matrices(&model, Mesh::Total(30)).expect("assembles");
        models.push((i, model, k, m));
    }
    let input = serde_json::json!({
        "problems": models.iter().map(|(i, _, k, m)| serde_json::json!({
            "id": i.to_string(),
            "k": (0..k.nrows()).map(|r| (0..k.ncols()).map(|c| k[(r, c)]).collect::<Vec<_>>()).collect::<Vec<_>>(),
            "m": (0..m.nrows()).map(|r| (0..m.ncols()).map(|c| m[(r, c)]).collect::<Vec<_>>()).collect::<Vec<_>>(),
            "count": 6,
        })).collect::<Vec<_>>()
    });
    let Some(out) = reference::run("fe_eigen.py", &["numpy", "scipy"], &input.to_string()) else { return };
    let omegas: std::collections::HashMap<String, Vec<f64>> =
        serde_json::from_str(&out).expect("JSON from fe_eigen.py");
    for (i, model, _, _) in &models {
        let got = fe::frequencies(model, 6, Mesh::Total(30)).expect("solves").omegas;
        for (k, (e, g)) in omegas[&i.to_string()].iter().zip(&got).enumerate() {
            check(&format!("random model {i}, FE mode {}", k + 1), "scipy.linalg.eigh(K, M)", *e, *g, 1e-9);
        }
    }
}

#[test]
fn a_near_mechanism_of_very_different_segments_is_told_apart_from_a_lost_mode() {
    // A guided–free beam whose first segment, a hair-thin tube, is 1e8 times more flexible than
    // the next, then a short heavy bar and a long I-beam: the whole beam rocks on the tube in a
    // mode near 1e-4 Hz. Rounding in the finite-element check's matrices is some 1e5 times that
    // mode's own frequency, so the check cannot see it: it once lost it and listed mode 3's
    // frequency in its place and again as mode 3, a shift of its whole list. The note must say
    // which mode the check cannot resolve and why, and leave the whole column blank (the check
    // cannot be trusted to number its later modes either); the exact method is right.
    let scenario = r#"{"left":"guided","modes":16,"right":"free","units":"us-inch","segments":[
        {"length":"0.06388033961465897 ft",
         "material":{"density":"6651.99626261817 kg/m^3","youngs_modulus":"143.9130290590764 GPa"},
         "section":{"outer_diameter":"0.00015499181683997264 m","shape":"tube","wall":"0.0003459875255531784 in"}},
        {"flexural_rigidity":"168.17579425082843 N·m²","length":"0.11766898921492856 m",
         "mass_per_length":"0.20066365440535336 kg/m"},
        {"flexural_rigidity":"138874.83974062404 N·m²","length":"0.05227396372254941 m",
         "mass_per_length":"329.2170717461562 kg/m"},
        {"length":"403.4341152398349 cm","material":"stainless-304",
         "section":{"depth":0.1434344988630106,"flange_thickness":"1.0897246025037495 cm",
                    "flange_width":"126.4106078923698 mm","shape":"i-beam","web_thickness":"0.8088515091373912 cm"}}]}"#;
    let report = modebench::solve_json(scenario).expect("solves");
    assert!(report.warnings.iter().all(|w| w.code.id() != "fe-disagrees"), "{:?}", report.warnings);
    let note = report
        .warnings
        .iter()
        .find(|w| w.message.contains("cannot resolve"))
        .unwrap_or_else(|| panic!("no note on the unresolved mode: {:?}", report.warnings));
    assert!(
        note.message.contains("cannot resolve mode 2")
            && note.message.contains("segments 1 and 2")
            && !note.message.contains("use more elements"),
        "{}",
        note.message
    );
    let listed: Vec<bool> = report.modes.iter().map(|m| m.fe_frequency_hz.is_some()).collect();
    assert!(listed.iter().all(|l| !l), "the check's column is not blank: {listed:?}");
    let model = modebench::Scenario::from_json(scenario).and_then(|s| s.to_model()).expect("valid").model;
    let omegas = exact::frequencies(&model, 4).expect("solves");
    let mut model_json = reference::transfer_matrix_json("rocking", &model, &omegas);
    model_json["between"] = serde_json::json!(10);
    let input = serde_json::json!({ "models": [model_json] });
    let Some(out) = reference::run("timoshenko_roots.py", &["mpmath"], &input.to_string()) else { return };
    let out: serde_json::Value = serde_json::from_str(&out).expect("JSON");
    // The transfer-matrix determinant at 40 digits changes sign within 1e-9 of each of the exact
    // method's first four frequencies and at no sampled point between them
    // (tests/python/timoshenko_roots.py).
    assert_eq!(out["rocking"]["problems"], serde_json::json!([]), "{out}");
}
