//! The public API returns `Err` instead of panicking, and never returns a non-finite number, on
//! seeded random hostile input: NaN, ±∞, 0, 1e±300, negative values, wrong types and garbage
//! text, in models built directly and in scenario JSON.

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
            Ok(Err(_)) => err += 1,
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

/// Replaces one random leaf of a JSON value with a hostile one.
fn mutate(v: &mut serde_json::Value, rng: &mut Rng) {
    use serde_json::{json, Value};
    let hostile = [
        json!("NaN"),
        json!("inf"),
        json!("-3 kg"),
        json!("1e400 m"),
        json!("2.8 furlongs"),
        json!("30e6 psi"),
        json!("12 lb"),
        json!(""),
        json!(null),
        json!([]),
        json!({}),
        json!(0),
        json!(-1),
        json!(1e300),
        json!("rigid"),
        json!("  7 mm  trailing"),
        json!(true),
        json!(21),
    ];
    match v {
        Value::Object(map) if !map.is_empty() => {
            let keys: Vec<String> = map.keys().cloned().collect();
            let key = &keys[rng.below(keys.len())];
            if rng.below(3) == 0 {
                map.insert(key.clone(), hostile[rng.below(hostile.len())].clone());
            } else {
                mutate(map.get_mut(key).expect("key exists"), rng);
            }
        }
        Value::Array(items) if !items.is_empty() => {
            let n = items.len();
            mutate(&mut items[rng.below(n)], rng);
        }
        leaf => *leaf = hostile[rng.below(hostile.len())].clone(),
    }
}

#[test]
fn hostile_scenarios_give_errors_with_paths_or_finite_reports() {
    let scenarios: Vec<serde_json::Value> =
        std::fs::read_dir(concat!(env!("CARGO_MANIFEST_DIR"), "/../docs/scenarios"))
            .expect("docs/scenarios exists")
            .map(|e| {
                serde_json::from_str(&std::fs::read_to_string(e.expect("entry").path()).expect("read"))
                    .expect("JSON")
            })
            .collect();
    assert!(!scenarios.is_empty());
    let mut rng = Rng::new(0xF00D);
    for i in 0..300 {
        let mut s = scenarios[rng.below(scenarios.len())].clone();
        for _ in 0..1 + rng.below(3) {
            mutate(&mut s, &mut rng);
        }
        let text = s.to_string();
        match catch_unwind(|| modebench::solve_json(&text)) {
            Err(_) => panic!("case {i} panicked on {text}"),
            Ok(Err(e)) => assert!(!e.message.is_empty(), "case {i}: empty message"),
            Ok(Ok(report)) => {
                let json = serde_json::to_string(&report).expect("serialises");
                assert!(!json.contains("NaN") && !json.contains("inf"), "case {i}: {json}");
                assert!(report.is_finite(), "case {i}: non-finite number in the report of {text}");
            }
        }
    }
    // Garbage text is a syntax error with a message, not a panic.
    for text in ["", "{", "[]", "null", "{\"left\": 3}", "\u{0}", "{\"segments\": [{}]}"] {
        assert!(modebench::solve_json(text).is_err(), "{text:?} must be rejected");
    }
}
