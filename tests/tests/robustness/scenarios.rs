//! Hostile scenarios: one change at a time to each documented scenario gives a short error with
//! a path, or a finite report.

use super::{assert_plain, shows_non_finite};
use modebench_tests::random::Rng;
use serde_json::{json, Value};
use std::panic::catch_unwind;

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
