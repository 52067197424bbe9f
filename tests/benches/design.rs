//! Speed of the design tools (printed by criterion; figures go in docs/performance.md):
//! - what moves each mode: ∂ln f/∂ln p of 10 modes to 20 inputs, as every solve finds it
//!   (through the mode shapes the solve computed, with central differences on the solver for
//!   lengths and positions) — budget 20 ms in the browser's solver engine — and, for
//!   comparison, by central differences on the exact solver alone, each value written into the
//!   scenario and read again;
//! - a 200-point resizing sweep of one input with its edges refined — budget 200 ms there;
//! - a whole scenario with every design request, through `solve`.

use criterion::{criterion_group, criterion_main, Criterion};
use modebench::design::margin::Drive;
use modebench::design::{inputs, resize, sensitivity};
use modebench::FieldPath;
use serde_json::{json, Value};
use std::hint::black_box;

/// A stepped floor beam given by properties, with two masses and an elastic end: 20 numeric
/// inputs, 10 modes.
fn twenty_inputs() -> Value {
    let seg = |l: f64, ei: f64, m: f64| json!({ "length": l, "flexural_rigidity": ei, "mass_per_length": m });
    json!({
        "modes": 10,
        "left": { "type": "elastic", "translational": 5.0e7, "rotational": 2.0e5 },
        "right": "pinned",
        "segments": [seg(1.5, 4.0e6, 40.0), seg(2.0, 2.5e6, 32.0), seg(1.5, 4.0e6, 40.0), seg(1.0, 3.0e6, 36.0)],
        "attachments": [
            { "type": "mass", "position": 1.3, "mass": 30.0, "rotary_inertia": 0.4 },
            { "type": "mass", "position": 4.0, "mass": 20.0, "rotary_inertia": 0.2 },
        ],
        "excitations": [{ "frequency": "600 rpm", "up_to": "1800 rpm", "orders": [1, 2] }, { "frequency": "50 Hz", "orders": [2] }],
    })
}

fn design(c: &mut Criterion) {
    let doc = twenty_inputs();
    let all = inputs::all(&doc);
    assert_eq!(all.len(), 20, "the bench model has 20 inputs");
    let paths: Vec<FieldPath> = all.iter().map(|i| i.path.clone()).collect();
    let values: Vec<f64> = all.iter().map(|i| i.value).collect();
    let evaluator = inputs::Evaluator::new(&doc, &paths);
    let f = |p: &[f64]| evaluator.frequencies(p);
    let read = modebench::Scenario::from_value(&doc).and_then(|s| s.to_model()).expect("reads");
    let modes = modebench::exact::modes(&read.model, 10).expect("solves");
    let solved: Vec<sensitivity::SolvedMode<'_>> = modes
        .iter()
        .filter(|m| !m.rigid_body)
        .map(|m| sensitivity::SolvedMode { omega: m.omega, multiplicity: m.multiplicity, shape: &m.shape })
        .collect();
    let hz: Vec<f64> = solved.iter().map(|m| m.omega / std::f64::consts::TAU).collect();
    c.bench_function("sensitivities through the shapes, 10 modes to 20 inputs", |b| {
        b.iter(|| {
            let evaluator = inputs::Evaluator::new(&doc, &paths).with_hints(&hz);
            sensitivity::through_shapes(
                &read.model,
                &solved,
                &|p: &[f64]| evaluator.model(p),
                &|m: &modebench::Model| evaluator.solve(m, 10),
                black_box(&values),
            )
            .expect("solves")
        })
    });
    c.bench_function("sensitivities, 10 modes to 20 inputs", |b| {
        b.iter(|| sensitivity::sensitivities(&f, black_box(&values)).expect("solves"))
    });
    // The same by central differences alone, without handing each solve the frequencies of the one before, for comparison.
    let fresh = |p: &[f64]| inputs::frequencies(&doc, &paths, p);
    c.bench_function("sensitivities, 10 modes to 20 inputs, each solve from scratch", |b| {
        b.iter(|| sensitivity::sensitivities(&fresh, black_box(&values)).expect("solves"))
    });
    let depth = [FieldPath::item("segments", 1).key("flexural_rigidity")];
    let sweep = inputs::Evaluator::new(&doc, &depth);
    let g = |p: &[f64]| sweep.frequencies(p);
    let drives = [Drive::Band { low_hz: 10.0, high_hz: 30.0 }, Drive::Line { hz: 100.0 }];
    c.bench_function("resizing sweep, 200 points, 10 modes", |b| {
        b.iter(|| {
            resize::resize(&g, &[2.5e6], 0, (5.0e5, 2.0e7), black_box(&drives), 0.15, 200).expect("solves")
        })
    });
    let mut whole = twenty_inputs();
    whole["tolerances"] = json!([{ "field": "segments[1].flexural_rigidity", "plus_minus": "10 %" }, { "field": "left", "from": "pinned", "to": "clamped" }]);
    whole["measured"] = json!([{ "mode": 1, "frequency": "20 Hz" }]);
    whole["calibrate"] = json!([{ "field": "left.rotational", "from": "1e3 N*m/rad", "to": "1e9 N*m/rad" }]);
    whole["left"]["translational"] = json!("rigid");
    c.bench_function("solve with every design request but resizing", |b| {
        b.iter(|| modebench::solve_value(black_box(&whole)).expect("solves"))
    });
}

criterion_group!(benches, design);
criterion_main!(benches);
