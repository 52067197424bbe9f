//! How long an edit takes in WebAssembly: solving an example scenario (the calculator's worker
//! does it on every keystroke) and writing its results (the page does it when the answer comes,
//! besides reading the answer and setting `innerHTML`). The times
//! are printed; `MODEBENCH_CHECK_TIMING=1` with `--release` also checks them against the budget.
//! The native benchmarks' two budget workloads are timed here too, for WebAssembly ÷ native.
#![cfg(target_arch = "wasm32")]

use modebench_web::{doc, render};
use wasm_bindgen_test::{console_log, wasm_bindgen_test};

fn median(values: &mut [f64]) -> f64 {
    values.sort_by(f64::total_cmp);
    values[values.len() / 2]
}

#[wasm_bindgen_test]
fn solving_and_drawing_an_example_is_quick() {
    for (case, text) in [
        ("sensor-boom", include_str!("../../docs/scenarios/sensor-boom.json")),
        ("fan-floor-beam-us", include_str!("../../docs/scenarios/fan-floor-beam-us.json")),
        ("filled-pipe-span", include_str!("../../docs/scenarios/filled-pipe-span.json")),
        ("absorber-on-platform-beam", include_str!("../../docs/scenarios/absorber-on-platform-beam.json")),
    ] {
        let Ok(scenario) = doc::read(text) else { panic!("{case} is JSON") };
        // One run first so that the engine has compiled the module's hot functions; then the
        // median of several runs, which a busy machine disturbs less than the mean.
        let report = doc::solve(&scenario).ok();
        let mut solve = Vec::new();
        let mut draw = Vec::new();
        let mut length = 0;
        // Unoptimised runs take half a second each; a few suffice to report them.
        let runs = if cfg!(debug_assertions) { 3 } else { 15 };
        for _ in 0..runs {
            let start = js_sys::Date::now();
            let _ = doc::solve(&scenario);
            solve.push(js_sys::Date::now() - start);
            let start = js_sys::Date::now();
            length = render::results_inner(report.as_ref(), false, &render::View::default()).len();
            draw.push(js_sys::Date::now() - start);
        }
        let (solve, draw) = (median(&mut solve), median(&mut draw));
        console_log!(
            "{case}: solve {solve:.1} ms, results markup {draw:.1} ms ({length} bytes), median of {runs}"
        );
        // An edit must leave most of a 16 ms frame for the browser to lay out the new results.
        // Timings on a shared machine vary with its load, so the bound is checked only when
        // asked for (MODEBENCH_CHECK_TIMING=1 at build time) on an optimised build.
        if option_env!("MODEBENCH_CHECK_TIMING") == Some("1") && !cfg!(debug_assertions) {
            assert!(solve + draw < 12.0, "{case}: {solve} + {draw} ms");
        }
    }
}

/// The design tools in WebAssembly, on a stepped floor beam given by properties with two masses
/// and an elastic end (20 numeric inputs, 10 modes): what moves each mode as every solve finds it
/// (through the shapes the solve computed; budget 20 ms), the same by central differences alone
/// (for comparison), and a 200-point resizing sweep with its edges refined (budget 200 ms).
/// Printed; checked only when asked for, on an optimised build, as above.
#[wasm_bindgen_test]
fn the_design_tools_are_quick_enough_for_the_worker() {
    use modebench::design::{inputs, margin::Drive, resize, sensitivity};
    use modebench::FieldPath;
    let Ok(doc) = doc::read(
        r#"{ "modes": 10, "left": { "type": "elastic", "translational": 5e7, "rotational": 2e5 }, "right": "pinned",
        "segments": [
          { "length": 1.5, "flexural_rigidity": 4e6, "mass_per_length": 40 },
          { "length": 2.0, "flexural_rigidity": 2.5e6, "mass_per_length": 32 },
          { "length": 1.5, "flexural_rigidity": 4e6, "mass_per_length": 40 },
          { "length": 1.0, "flexural_rigidity": 3e6, "mass_per_length": 36 } ],
        "attachments": [
          { "type": "mass", "position": 1.3, "mass": 30, "rotary_inertia": 0.4 },
          { "type": "mass", "position": 4.0, "mass": 20, "rotary_inertia": 0.2 } ] }"#,
    ) else {
        panic!("the bench scenario is JSON")
    };
    let all = inputs::all(&doc);
    assert_eq!(all.len(), 20);
    let paths: Vec<FieldPath> = all.iter().map(|i| i.path.clone()).collect();
    let values: Vec<f64> = all.iter().map(|i| i.value).collect();
    let runs = if cfg!(debug_assertions) { 1 } else { 7 };
    let mut times = Vec::new();
    for _ in 0..runs {
        let evaluator = inputs::Evaluator::new(&doc, &paths);
        let start = js_sys::Date::now();
        let s = sensitivity::sensitivities(&|p: &[f64]| evaluator.frequencies(p), &values);
        times.push(js_sys::Date::now() - start);
        assert!(s.is_ok());
    }
    let differences = median(&mut times);
    let Ok(read) = modebench::Scenario::from_value(&doc).and_then(|s| s.to_model()) else { panic!("reads") };
    let Ok(modes) = modebench::exact::modes(&read.model, 10) else { panic!("solves") };
    let solved: Vec<sensitivity::SolvedMode<'_>> = modes
        .iter()
        .filter(|m| !m.rigid_body)
        .map(|m| sensitivity::SolvedMode { omega: m.omega, multiplicity: m.multiplicity, shape: &m.shape })
        .collect();
    let hz: Vec<f64> = solved.iter().map(|m| m.omega / std::f64::consts::TAU).collect();
    let mut times = Vec::new();
    for _ in 0..runs {
        let evaluator = inputs::Evaluator::new(&doc, &paths).with_hints(&hz);
        let start = js_sys::Date::now();
        let s = sensitivity::through_shapes(
            &read.model,
            &solved,
            &|p: &[f64]| evaluator.read(p).map(|i| i.model),
            &|m: &modebench::Model| evaluator.solve(m, 10),
            &values,
        );
        times.push(js_sys::Date::now() - start);
        assert!(s.is_ok());
    }
    let sensitivities = median(&mut times);
    let ei = [FieldPath::item("segments", 1).key("flexural_rigidity")];
    let drives = [Drive::Band { low_hz: 10.0, high_hz: 30.0 }, Drive::Line { hz: 100.0 }];
    let mut times = Vec::new();
    for _ in 0..runs.min(3) {
        let evaluator = inputs::Evaluator::new(&doc, &ei);
        let start = js_sys::Date::now();
        let r = resize::resize(
            &|p: &[f64]| evaluator.frequencies(p),
            &[2.5e6],
            0,
            (5e5, 2e7),
            &drives,
            0.15,
            200,
        );
        times.push(js_sys::Date::now() - start);
        assert!(r.is_ok());
    }
    let sweep = median(&mut times);
    console_log!(
        "design: sensitivities of 10 modes to 20 inputs {sensitivities:.1} ms through the shapes, \
         {differences:.1} ms by central differences alone; 200-point sweep {sweep:.1} ms"
    );
    if option_env!("MODEBENCH_CHECK_TIMING") == Some("1") && !cfg!(debug_assertions) {
        assert!(sensitivities < 20.0 && sweep < 200.0, "{sensitivities} ms, {sweep} ms");
    }
}

use modebench::model::budget_beam as budget_model;

/// The native engine benchmarks' two budget workloads in WebAssembly, for the ratio of the two
/// (recorded in docs/performance.md): the exact method's first 10 frequencies of the budget beam,
/// and finite elements with 200 elements, 10 modes, on the same beam. `Date.now()` counts whole
/// milliseconds, so each figure is a batch of solves divided by its size; the median of the
/// batches is printed, and the fastest beside it. Printed only: a ratio depends on the machine.
#[wasm_bindgen_test]
fn the_budget_workloads_in_webassembly() {
    use modebench::fe::{self, Mesh};
    let model = budget_model();
    let exact = || modebench::exact::frequencies(std::hint::black_box(&model), 10).map(|f| f.len());
    let elements =
        || fe::frequencies(std::hint::black_box(&model), 10, Mesh::Total(200)).map(|f| f.omegas.len());
    let batches = if cfg!(debug_assertions) { 1 } else { 15 };
    for (case, solve, batch) in [
        ("exact, 10 modes, budget beam", &exact as &dyn Fn() -> Result<usize, modebench::Error>, 200),
        ("finite elements, 200 elements, 10 modes, budget beam", &elements, 40),
    ] {
        // The first solve compiles the module's hot functions; it is not counted.
        assert_eq!(solve().ok(), Some(10), "{case}: 10 frequencies");
        let mut each = Vec::new();
        for _ in 0..batches {
            let start = js_sys::Date::now();
            for _ in 0..batch {
                let _ = std::hint::black_box(solve());
            }
            each.push((js_sys::Date::now() - start) * 1000.0 / f64::from(batch));
        }
        let fastest = each.iter().copied().fold(f64::INFINITY, f64::min);
        let middle = median(&mut each);
        console_log!("{case}: {middle:.1} µs per solve (fastest batch {fastest:.1} µs), median of {batches} batches of {batch}");
    }
}
