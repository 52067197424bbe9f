//! How long an edit takes in WebAssembly: solving an example scenario (the calculator's worker
//! does it on every keystroke) and writing its results (the page does it when the answer comes,
//! besides reading the answer and setting `innerHTML`). The times
//! are printed; `MODEBENCH_CHECK_TIMING=1` with `--release` also checks them against the budget.
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
