//! Speed of the engine on the budget cases (printed by criterion; figures go in
//! docs/performance.md):
//! - exact method, first 10 modes of a 3-segment beam with 10 attachments — budget 1 ms;
//! - finite elements, 200 elements, first 10 modes — budget 5 ms;
//! - a whole documented scenario through `solve` (all three methods, shapes, report);
//! - two 0.4 kg masses 1 µm apart on a pinned unit beam, and a near-rigid bar (EI = 1e12) on a
//!   12.5 N/m spring, through `solve` — budget 100 ms each (both once ran without end).

use criterion::{criterion_group, criterion_main, Criterion};
use modebench::fe::{self, Mesh};
use modebench::{exact, Model};
use std::hint::black_box;

fn budget_model() -> Model {
    modebench_tests::models::budget_beam()
}

fn engine(c: &mut Criterion) {
    let model = budget_model();
    c.bench_function("exact frequencies, 10 modes, 3 segments, 10 attachments", |b| {
        b.iter(|| exact::frequencies(black_box(&model), 10).expect("solves"))
    });
    c.bench_function("exact modes with shapes, 10 modes, 3 segments, 10 attachments", |b| {
        b.iter(|| exact::modes(black_box(&model), 10).expect("solves"))
    });
    c.bench_function("finite elements, 200 elements, 10 modes", |b| {
        b.iter(|| fe::frequencies(black_box(&model), 10, Mesh::Total(200)).expect("solves"))
    });
    let scenario = include_str!("../../docs/scenarios/sensor-boom.json");
    c.bench_function("solve a documented scenario (sensor boom, all methods)", |b| {
        b.iter(|| modebench::solve_json(black_box(scenario)).expect("solves"))
    });
    // The slowest documented page to edit: US units throughout, tolerances and a resizing study.
    let fan = include_str!("../../docs/scenarios/fan-floor-beam-us.json");
    c.bench_function("solve a documented scenario (fan floor beam, all methods)", |b| {
        b.iter(|| modebench::solve_json(black_box(fan)).expect("solves"))
    });
    let close = serde_json::json!({
        "modes": 4, "left": "pinned", "right": "pinned",
        "segments": [{ "length": 1, "flexural_rigidity": 1, "mass_per_length": 1 }],
        "attachments": [
            { "type": "mass", "position": 0.3, "mass": 0.4 },
            { "type": "mass", "position": 0.300001, "mass": 0.4 }
        ]
    });
    c.bench_function("solve two masses 1 µm apart (all methods)", |b| {
        b.iter(|| modebench::solve_value(black_box(&close)).expect("solves"))
    });
    let stiff = serde_json::json!({
        "modes": 4, "left": "pinned", "right": "free",
        "segments": [{ "length": 1, "flexural_rigidity": 1e12, "mass_per_length": 1 }],
        "attachments": [{ "type": "spring", "position": 1, "stiffness": 12.5 }]
    });
    c.bench_function("solve a near-rigid bar on a 12.5 N/m spring (all methods)", |b| {
        b.iter(|| modebench::solve_value(black_box(&stiff)).expect("solves"))
    });
}

criterion_group!(benches, engine);
criterion_main!(benches);
