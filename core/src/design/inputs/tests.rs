//! Where inputs are read and written, and the evaluator that reads the scenario with them.

use super::*;
use serde_json::json;

#[test]
fn values_go_where_the_scenario_reads_them() {
    let mut doc = json!({
        "left": "pinned", "right": "free",
        "segments": [{ "length": "1.2 m", "section": { "shape": "round", "diameter": "20 mm" }, "material": "steel" }],
    });
    let at = |text: &str| FieldPath::parse(text).unwrap_or_default();
    // A pinned end is translation rigid and rotation free; a preset's modulus is its own.
    assert_eq!(input_at(&doc, &at("left.rotational")).map(|i| i.value), Ok(0.0));
    assert_eq!(input_at(&doc, &at("left.translational")).map(|i| i.value), Ok(f64::INFINITY));
    let e = input_at(&doc, &at("segments[0].material.youngs_modulus")).map(|i| i.value).unwrap_or(0.0);
    assert_eq!(Some(e), crate::material::preset("steel").map(|m| m.youngs_modulus));
    assert_eq!(input_at(&doc, &at("segments[0].section.diameter")).map(|i| i.value), Ok(0.02));
    // Writing turns them into springs and properties the reader takes back as written.
    assert!(set(&mut doc, &at("left.rotational"), 5e3).is_ok());
    assert!(set(&mut doc, &at("segments[0].material.youngs_modulus"), 1.9e11).is_ok());
    assert_eq!(doc["left"], json!({ "type": "elastic", "translational": "rigid", "rotational": 5e3 }));
    assert_eq!(input_at(&doc, &at("segments[0].material.youngs_modulus")).map(|i| i.value), Ok(1.9e11));
    assert!(Scenario::from_value(&doc).and_then(|s| s.to_model()).is_ok());
    // What is not a numeric input of the beam is refused with its path.
    let e = input_at(&doc, &at("segments[0].section.shape")).err().map(|e| e.path.to_string());
    assert_eq!(e.as_deref(), Some("segments[0].section.shape"));
    assert!(input_at(&doc, &at("margin")).is_err());
}

/// Every input of every documented scenario, each moved up and down by 1 % in turn through one
/// evaluator: each reading is the model read from a fresh copy of the scenario with every input
/// written in, the way the evaluator is defined (the evaluator reuses one copy).
#[test]
fn an_evaluator_reads_what_a_fresh_copy_of_the_scenario_reads() {
    let folder = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../docs/scenarios");
    let mut files: Vec<_> = std::fs::read_dir(&folder).expect("the documented scenarios").flatten().collect();
    files.sort_by_key(|f| f.file_name());
    assert!(files.len() >= 8, "{} scenarios", files.len());
    for file in files {
        let text = std::fs::read_to_string(file.path()).expect("a scenario");
        let doc: Value = serde_json::from_str(&text).expect("JSON");
        let inputs = all(&doc);
        let paths: Vec<FieldPath> = inputs.iter().map(|i| i.path.clone()).collect();
        let base: Vec<f64> = inputs.iter().map(|i| i.value).collect();
        let evaluator = Evaluator::new(&doc, &paths);
        let fresh = |values: &[f64]| {
            let mut trial = doc.clone();
            for (path, v) in paths.iter().zip(values) {
                set(&mut trial, path, *v)?;
            }
            Scenario::from_value(&trial)?.to_model()
        };
        let mut trials = vec![base.clone()];
        for j in 0..base.len() {
            for factor in [1.01, 0.99] {
                let mut at = base.clone();
                at[j] *= factor;
                trials.push(at);
            }
        }
        trials.push(base.clone());
        for values in &trials {
            let (ours, theirs) = (evaluator.read(values), fresh(values));
            assert_eq!(
                ours.map(|i| i.model),
                theirs.map(|i| i.model),
                "{}: {values:?}",
                file.file_name().to_string_lossy()
            );
        }
    }
}
