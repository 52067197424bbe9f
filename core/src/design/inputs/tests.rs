//! Where inputs are read and written, and the evaluator that reads the scenario with them.

use super::*;
use crate::model::Model;
use crate::scenario::Scenario;
use serde_json::json;

/// The model read from a fresh copy of `doc` with `values` written at `paths`: what an
/// evaluator's reading is defined to be.
fn fresh(doc: &Value, paths: &[FieldPath], values: &[f64]) -> Result<crate::scenario::Inputs> {
    let mut trial = doc.clone();
    for (path, v) in paths.iter().zip(values) {
        set(&mut trial, path, *v)?;
    }
    Scenario::from_value(&trial)?.to_model()
}

fn paths_of(texts: &[&str]) -> Vec<FieldPath> {
    texts.iter().map(|t| FieldPath::parse(t).unwrap_or_default()).collect()
}

/// The values `base`, then each moved 1 % up and 1 % down in turn, the others as they are.
fn each_moved(base: &[f64]) -> Vec<Vec<f64>> {
    let mut trials = vec![base.to_vec()];
    for j in 0..base.len() {
        for factor in [1.01, 0.99] {
            let mut at = base.to_vec();
            at[j] *= factor;
            trials.push(at);
        }
    }
    trials
}

/// Each trial read by one evaluator of `paths` (which must write them into the typed scenario
/// when `typed`), held against a fresh copy's reading; the models read, for further checks.
fn read_alike(doc: &Value, texts: &[&str], trials: &[Vec<f64>], typed: bool) -> Vec<Result<Model>> {
    let paths = paths_of(texts);
    let evaluator = Evaluator::new(doc, &paths);
    assert_eq!(evaluator.is_typed(), typed, "{texts:?}");
    let mut models = Vec::new();
    for values in trials {
        let ours = evaluator.read(values).map(|i| i.model);
        assert_eq!(ours, fresh(doc, &paths, values).map(|i| i.model), "{texts:?} at {values:?}");
        assert_eq!(evaluator.model(values), ours, "lean: {texts:?} at {values:?}");
        models.push(ours);
    }
    models
}

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
/// evaluator: each reading, full or lean, is the model read from a fresh copy of the scenario's
/// JSON with every input written in, the way the evaluator is defined (the evaluator writes the
/// values into one typed copy).
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
        // Every path of a documented scenario is one the typed writer knows.
        assert!(evaluator.is_typed(), "{}", file.file_name().to_string_lossy());
        let fresh = |values: &[f64]| fresh(&doc, &paths, values);
        let mut trials = each_moved(&base);
        trials.push(base.clone());
        for values in &trials {
            let (ours, theirs) = (evaluator.read(values), fresh(values));
            let theirs = theirs.map(|i| i.model);
            let name = file.file_name().to_string_lossy().to_string();
            assert_eq!(ours.map(|i| i.model), theirs, "{name}: {values:?}");
            // The lean reading the design tools use gives the same model, and the same error.
            assert_eq!(evaluator.model(values), theirs, "lean, {name}: {values:?}");
        }
    }
}

/// A preset material's modulus and density become a custom material of the preset's values:
/// its α (the temperature change still gives its force) and its stated shear modulus, which
/// is not E/2(1+ν) for a pultruded profile, carried over.
#[test]
fn a_preset_materials_modulus_and_density_are_written_as_its_values() {
    let doc = json!({
        "left": "clamped", "right": "clamped",
        "segments": [{
            "length": "0.8 m", "section": { "shape": "rectangle", "width": "60 mm", "depth": "80 mm" },
            "material": "gfrp-pultruded", "temperature_change": "-10 K",
        }],
    });
    let preset = crate::material::preset("gfrp-pultruded").map(|m| (m.youngs_modulus, m.density));
    let (e, rho) = preset.unwrap_or_default();
    let trials = [vec![e, rho], vec![e * 1.01, rho], vec![e, rho * 0.99], vec![e * 0.99, rho * 1.01]];
    let models = read_alike(
        &doc,
        &["segments[0].material.youngs_modulus", "segments[0].material.density"],
        &trials,
        true,
    );
    // EI = E·I and m = ρ·A (Euler–Bernoulli beam theory): the moduli and the density scale them.
    let m = |k: usize| models[k].as_ref().map(|m| m.segments()[0].clone()).ok();
    let (Some(base), Some(stiffer), Some(lighter)) = (m(0), m(1), m(2)) else { panic!("{models:?}") };
    assert!((stiffer.flexural_rigidity / base.flexural_rigidity - 1.01).abs() < 1e-12);
    assert!((lighter.mass_per_length / base.mass_per_length - 0.99).abs() < 1e-12);
    // κGA with the preset's stated G = 3 GPa, not E/2(1+ν) = 9.3 GPa; κ of a solid rectangle is
    // 10(1+ν)/(12+11ν), about 0.85 (Cowper 1966).
    let kappa_a = base.shear_rigidity.unwrap_or_default() / 3e9;
    assert!(kappa_a > 0.8 * 0.06 * 0.08 && kappa_a < 0.06 * 0.08, "{kappa_a}");
}

/// A named end, as a name or as an object, becomes an elastic end of its springs ("rigid"
/// where infinite) when one of them is written.
#[test]
fn a_named_ends_springs_are_written_as_an_elastic_end() {
    let doc = json!({
        "left": "pinned", "right": { "type": "clamped" },
        "segments": [{ "length": "2 m", "flexural_rigidity": "2e5 N*m^2", "mass_per_length": "12 kg/m" }],
    });
    let texts = ["left.rotational", "right.translational"];
    let trials =
        [vec![0.0, f64::INFINITY], vec![5e3, 1e9], vec![8e4, f64::INFINITY], vec![f64::INFINITY, 2e8]];
    let models = read_alike(&doc, &texts, &trials, true);
    let ends = |k: usize| models[k].as_ref().map(|m| (m.left(), m.right())).ok();
    let inf = f64::INFINITY;
    assert_eq!(
        ends(1),
        Some((
            crate::model::End::Elastic { translational: inf, rotational: 5e3 },
            crate::model::End::Elastic { translational: 1e9, rotational: inf }
        ))
    );
    // The end not written stays as named.
    let one = read_alike(&doc, &["left.rotational"], &[vec![7e3]], true);
    assert_eq!(one[0].as_ref().map(|m| m.right()).ok(), Some(crate::model::End::Clamped));
}

/// An optional field left out (an extra mass's lining, its water, a mass's rotary inertia, a
/// segment's rotary inertia) is created when written.
#[test]
fn an_absent_optional_field_is_created_when_written() {
    let doc = json!({
        "left": "clamped", "right": "free",
        "segments": [
            { "length": "1 m", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "4 mm" }, "material": "steel" },
            { "length": "0.5 m", "flexural_rigidity": "4e4 N*m^2", "mass_per_length": "6 kg/m" },
        ],
        "attachments": [{ "type": "mass", "position": "1.5 m", "mass": "2 kg" }],
    });
    let texts = [
        "segments[0].extra_mass.lining",
        "segments[0].extra_mass.submerged.water_density",
        "attachments[0].rotary_inertia",
        "segments[1].rotary_inertia_per_length",
    ];
    let trials =
        [vec![0.5, 1025.0, 0.01, 1e-3], vec![0.505, 1025.0, 0.01, 1e-3], vec![0.5, 1000.0, 0.0101, 0.99e-3]];
    let models = read_alike(&doc, &texts, &trials, true);
    assert!(models.iter().all(Result::is_ok), "{models:?}");
    // A NaN is written as null in the JSON, which reads as absent: such a trial is read there.
    read_alike(&doc, &texts, &[vec![f64::NAN, 1025.0, 0.01, 1e-3], vec![0.5, 1025.0, 0.01, 1e-3]], true);
}

/// A dimension of each section shape the documented scenarios use (round, tube, pipe,
/// I-section), a pipe's recorded wall left out included, and an attachment's position.
#[test]
fn section_dimensions_and_positions_are_written_where_the_reader_takes_them() {
    let doc = json!({
        "left": "pinned", "right": "pinned",
        "segments": [
            { "length": "1 m", "section": { "shape": "round", "diameter": "40 mm" }, "material": "steel" },
            { "length": "1 m", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "5 mm" }, "material": "steel" },
            { "length": "1 m", "section": { "shape": "pipe", "nominal_size": "2", "schedule": "40" }, "material": "steel" },
            { "length": "1 m", "section": { "shape": "i-beam", "depth": "200 mm", "flange_width": "100 mm",
              "flange_thickness": "8 mm", "web_thickness": "5.6 mm" }, "material": "steel" },
        ],
        "attachments": [{ "type": "sprung-mass", "position": "2.5 m", "mass": "20 kg", "stiffness": "4e5 N/m" }],
    });
    let texts = [
        "segments[0].section.diameter",
        "segments[1].section.outer_diameter",
        "segments[1].section.wall",
        "segments[2].section.wall",
        "segments[3].section.depth",
        "segments[3].section.flange_width",
        "segments[3].section.flange_thickness",
        "segments[3].section.web_thickness",
        "attachments[0].position",
    ];
    let base = vec![0.04, 0.06, 0.005, 0.0039, 0.2, 0.1, 0.008, 0.0056, 2.5];
    let trials = each_moved(&base);
    let models = read_alike(&doc, &texts, &trials, true);
    assert!(models.iter().all(Result::is_ok), "{models:?}");
    // Each trial moved the model: the value went somewhere the reader takes it.
    assert!(models[1..].iter().all(|m| m != &models[0]));
}

/// The section shapes no documented scenario uses (a solid rectangle, a box, a custom section):
/// every dimension of each is written where the reader takes it, under the Timoshenko theory so
/// that a custom section's shear coefficient and depth count too.
#[test]
fn the_other_section_shapes_are_written_where_the_reader_takes_them() {
    let doc = json!({
        "theory": "timoshenko", "left": "clamped", "right": "free",
        "segments": [
            { "length": "0.6 m", "section": { "shape": "rectangle", "width": "40 mm", "depth": "60 mm" }, "material": "steel" },
            { "length": "0.6 m", "section": { "shape": "rectangular-tube", "width": "80 mm", "depth": "120 mm", "wall": "4 mm" },
              "material": "steel" },
            { "length": "0.6 m", "section": { "shape": "custom", "area": "1e-3 m^2", "second_moment": "2e-6 m^4",
              "depth": "100 mm", "shear_coefficient": 0.5 }, "material": "steel" },
        ],
    });
    let texts = [
        "segments[0].section.width",
        "segments[0].section.depth",
        "segments[1].section.width",
        "segments[1].section.depth",
        "segments[1].section.wall",
        "segments[2].section.area",
        "segments[2].section.second_moment",
        "segments[2].section.depth",
        "segments[2].section.shear_coefficient",
    ];
    let base = vec![0.04, 0.06, 0.08, 0.12, 0.004, 1e-3, 2e-6, 0.1, 0.5];
    let trials = each_moved(&base);
    let models = read_alike(&doc, &texts, &trials, true);
    assert!(models.iter().all(Result::is_ok), "{models:?}");
    // Each trial moved the model, but for the custom section's depth, which the model does not
    // hold once its area, second moment and shear coefficient are given.
    let unmoved: Vec<&str> =
        (1..trials.len()).filter(|&t| models[t] == models[0]).map(|t| texts[(t - 1) / 2]).collect();
    assert_eq!(unmoved, ["segments[2].section.depth"; 2]);
}

/// A trial value the model refuses draws the error a fresh copy draws, at the same path; a path
/// the typed writer does not know is read through the JSON, as before.
#[test]
fn refused_values_and_unknown_paths_read_as_a_fresh_copy_does() {
    let doc = json!({
        "left": "clamped", "right": "free",
        "segments": [{ "length": "1.2 m", "section": { "shape": "round", "diameter": "20 mm" }, "material": "steel" }],
        "attachments": [{ "type": "mass", "position": "1.2 m", "mass": "0.5 kg" }],
    });
    let texts = ["attachments[0].position", "segments[0].material.density"];
    let models = read_alike(&doc, &texts, &[vec![1.5, 7850.0], vec![1.0, -3.0], vec![1.0, 7850.0]], true);
    let path = |k: usize| models[k].as_ref().err().map(|e| e.path.to_string());
    assert_eq!(path(0).as_deref(), Some("attachments[0].position"));
    assert_eq!(path(1).as_deref(), Some("segments[0].material.density"));
    assert!(models[2].is_ok());
    // The report point and a section's text field are not the typed writer's: read as JSON.
    read_alike(
        &doc,
        &["report_point", "segments[0].material.density"],
        &[vec![0.6, 7000.0], vec![2.0, 7000.0]],
        false,
    );
    read_alike(&doc, &["segments[0].section.shape"], &[vec![1.0]], false);
}
