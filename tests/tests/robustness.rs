//! The public API returns `Err` instead of panicking, and never returns a non-finite number, on
//! seeded random hostile input: NaN, ±∞, 0, 1e±300, negative values, wrong types and garbage
//! text, in models built directly and in scenario JSON. Its error messages stay short, never
//! show a non-finite number, and name the place in the scenario they concern.

use modebench::{analyse, Attachment, End, Error, Model, ModelParts, Options, Segment, Theory};
use modebench_tests::random::Rng;
use serde_json::{json, Value};
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

/// Common practice, no source: a message an engineer reads beside a field fits in a few lines.
const LONGEST_MESSAGE: usize = 300;

/// The checks every error message passes: short, and no NaN or infinity shown as a number. What
/// the user typed is echoed as typed (they may well have typed "NaN"), so it is left out of the
/// search for words.
fn assert_plain(e: &Error, case: &str) {
    let shown = e.to_string();
    assert!(shown.chars().count() < LONGEST_MESSAGE, "{case}: {} characters: {shown}", shown.chars().count());
    let typed: Vec<String> = e.value.iter().cloned().collect();
    assert!(!shows_non_finite(&shown, &typed), "{case}: a non-finite number in {shown:?}");
    // A path is built of steps, so it reads back as itself once written out.
    let path = e.path.to_string();
    assert!(
        !path.starts_with('.') && !path.ends_with('.') && !path.contains(".."),
        "{case}: malformed path in {shown:?}"
    );
}

/// Whether `text`, once the user's own words `typed` are taken out, shows NaN or infinity.
fn shows_non_finite(text: &str, typed: &[String]) -> bool {
    let mut typed: Vec<&String> = typed.iter().filter(|t| !t.is_empty()).collect();
    typed.sort_by_key(|t| std::cmp::Reverse(t.len()));
    let engine_words = typed.iter().fold(text.to_string(), |t, u| t.replace(u.as_str(), ""));
    engine_words
        .split(|c: char| !c.is_alphanumeric())
        .any(|w| ["nan", "inf", "infinity"].contains(&w.to_ascii_lowercase().as_str()))
}

/// Every text in a JSON value.
fn texts(v: &Value, out: &mut Vec<String>) {
    match v {
        Value::String(t) => out.push(t.clone()),
        Value::Array(items) => items.iter().for_each(|i| texts(i, out)),
        Value::Object(map) => map.values().for_each(|i| texts(i, out)),
        _ => {}
    }
}

/// A long text, as when a whole paragraph is pasted into a field.
fn long_text(rng: &mut Rng) -> String {
    let piece = ["x", "9", "m", "ab ", "\u{e9}"][rng.below(5)];
    piece.repeat(2_000 + rng.below(20_000))
}

/// A hostile value to put in place of a leaf.
fn hostile_value(rng: &mut Rng) -> Value {
    let fixed = [
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
        json!([1, "2 m"]),
        json!({}),
        json!({ "": 1 }),
        json!(0),
        json!(-1),
        json!(1e300),
        json!(1e308),
        json!(-1e308),
        json!(4.9e-324),
        json!("1e308 m"),
        json!("4.9e-324 mm"),
        json!("rigid"),
        json!("  7 mm  trailing"),
        json!(true),
        json!(21),
    ];
    match rng.below(8) {
        0 => Value::String(long_text(rng)),
        1 => Value::String(format!("3 {}", long_text(rng))),
        _ => fixed[rng.below(fixed.len())].clone(),
    }
}

/// The same quantity with a hostile number in front of the unit as typed ("114.3 mm" becomes
/// "1e308 mm"), or a hostile value when the leaf is not a quantity with a unit.
fn hostile_leaf(leaf: &Value, rng: &mut Rng) -> Value {
    let numbers = ["1e308", "-1e308", "4.9e-324", "1e-300", "-0", "NaN", "inf", "1e999"];
    match leaf.as_str().and_then(|t| t.split_once(' ')) {
        Some((_, unit)) if rng.below(2) == 0 => {
            Value::String(format!("{} {unit}", numbers[rng.below(numbers.len())]))
        }
        _ => hostile_value(rng),
    }
}

/// Names of the fields that the writer gives twice: a key `DUPLICATE` + `name` is written as
/// `name`, beside the real `name` (JSON values cannot hold a key twice; the text can).
const DUPLICATE: &str = "\u{1}again:";

/// What a mutation changed.
#[derive(Default)]
struct Changes {
    /// A field was inserted into the scenario object itself (the place of such a problem is
    /// the whole scenario, whose path is empty).
    at_root: bool,
}

/// Makes one hostile change somewhere in `v`: a leaf replaced, or a field with an empty, very
/// long or repeated name added to an object.
fn mutate(v: &mut Value, rng: &mut Rng, root: bool, changes: &mut Changes) {
    match v {
        Value::Object(map) if !map.is_empty() => {
            let keys: Vec<String> = map.keys().filter(|k| !k.starts_with(DUPLICATE)).cloned().collect();
            // Most fields of the scenario object are single values; lean towards the lists so
            // that the dimensions, materials and attachments get their share of changes.
            let nested: Vec<&String> = keys.iter().filter(|k| map[k.as_str()].is_array()).collect();
            let key = match root && !nested.is_empty() && rng.below(3) > 0 {
                true => nested[rng.below(nested.len())].clone(),
                false => keys[rng.below(keys.len())].clone(),
            };
            match rng.below(8) {
                0 => {
                    let name = match rng.below(3) {
                        0 => String::new(),
                        1 => "k".repeat(1_000 + rng.below(20_000)),
                        _ => format!("{DUPLICATE}{key}"),
                    };
                    changes.at_root |= root;
                    map.insert(name, hostile_value(rng));
                }
                1 | 2 => {
                    let leaf = hostile_leaf(&map[&key], rng);
                    map.insert(key, leaf);
                }
                _ => mutate(map.get_mut(&key).expect("key exists"), rng, false, changes),
            }
        }
        Value::Array(items) if !items.is_empty() => {
            let n = items.len();
            mutate(&mut items[rng.below(n)], rng, false, changes);
        }
        leaf => *leaf = hostile_leaf(leaf, rng),
    }
}

/// JSON text of `v`, writing the keys marked with [`DUPLICATE`] under their plain name; true when
/// it wrote such a key.
fn write(v: &Value, out: &mut String) -> bool {
    let mut repeated = false;
    match v {
        Value::Object(map) => {
            out.push('{');
            for (i, (key, item)) in map.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                let name = key.strip_prefix(DUPLICATE).unwrap_or(key);
                // A repeated empty name is refused as an empty name, not as a repeat.
                repeated |= !name.is_empty() && name.len() < key.len() && map.contains_key(name);
                out.push_str(&Value::String(name.to_string()).to_string());
                out.push(':');
                repeated |= write(item, out);
            }
            out.push('}');
        }
        Value::Array(items) => {
            out.push('[');
            for (i, item) in items.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                repeated |= write(item, out);
            }
            out.push(']');
        }
        leaf => out.push_str(&leaf.to_string()),
    }
    repeated
}

#[test]
fn hostile_scenarios_give_short_errors_with_paths_or_finite_reports() {
    let scenarios: Vec<Value> = std::fs::read_dir(concat!(env!("CARGO_MANIFEST_DIR"), "/../docs/scenarios"))
        .expect("docs/scenarios exists")
        .map(|e| {
            serde_json::from_str(&std::fs::read_to_string(e.expect("entry").path()).expect("read"))
                .expect("JSON")
        })
        .collect();
    assert!(!scenarios.is_empty());
    let mut rng = Rng::new(0xF00D);
    let (mut solved, mut refused) = (0, 0);
    for i in 0..1_000 {
        let mut s = scenarios[rng.below(scenarios.len())].clone();
        let mut changes = Changes::default();
        for _ in 0..1 + rng.below(3) {
            mutate(&mut s, &mut rng, true, &mut changes);
        }
        let mut text = String::new();
        let repeated = write(&s, &mut text);
        let case = format!("case {i}");
        match catch_unwind(|| modebench::solve_json(&text)) {
            Err(_) => panic!("{case} panicked on {text}"),
            Ok(Err(e)) => {
                refused += 1;
                assert_plain(&e, &case);
                assert!(!e.path.is_empty() || changes.at_root, "{case}: {e} names no place, for {text:.300}");
                if repeated {
                    assert!(
                        e.message.contains("given twice"),
                        "{case}: {e} for a repeated field in {text:.300}"
                    );
                }
            }
            Ok(Ok(report)) => {
                solved += 1;
                assert!(!repeated, "{case}: a repeated field was accepted: {text:.300}");
                let (mut typed, mut shown) = (Vec::new(), Vec::new());
                texts(&s, &mut typed);
                texts(&serde_json::to_value(&report).expect("serialises"), &mut shown);
                let bad = shown.iter().find(|t| shows_non_finite(t, &typed));
                assert!(bad.is_none(), "{case}: {bad:?} in the report of {text:.300}");
                assert!(report.is_finite(), "{case}: non-finite number in the report of {text}");
            }
        }
    }
    assert!(solved > 50 && refused > 500, "the sweep should both solve and refuse ({solved}, {refused})");
    // Garbage text is a syntax error with a message, not a panic.
    for text in ["", "{", "[]", "null", "{\"left\": 3}", "\u{0}", "{\"segments\": [{}]}"] {
        assert!(modebench::solve_json(text).is_err(), "{text:?} must be rejected");
    }
}
