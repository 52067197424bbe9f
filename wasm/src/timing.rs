//! The native benchmarks' two budget workloads as exports of a WebAssembly build, so that a
//! browser can time them against `tests/benches/engine.rs` (WebAssembly ÷ native, recorded in
//! docs/performance.md). In WebAssembly the module is compiled only with the `timing` feature,
//! which no shipped engine has (natively it is compiled for its tests): `cargo xtask ratio`
//! builds the solver engine with it, as the site's is built otherwise, and
//! `tests/browser/ratio.mjs` times the exports in Chromium.
//!
//! Each export runs its workload `runs` times and returns how many frequencies the last run
//! found (0 on an error), so that nothing is optimised away and the caller can check the work
//! was done; the caller times the call.

pub use modebench::model::budget_beam;

#[cfg(all(target_arch = "wasm32", feature = "timing"))]
use wasm_bindgen::prelude::*;

/// The exact method's first 10 frequencies of the budget beam, `runs` times.
pub fn exact_runs(model: &modebench::Model, runs: u32) -> usize {
    let mut found = 0;
    for _ in 0..runs {
        found = modebench::exact::frequencies(std::hint::black_box(model), 10).map_or(0, |f| f.len());
    }
    found
}

/// The finite elements' first 10 frequencies of the budget beam with 200 elements, `runs` times.
pub fn elements_runs(model: &modebench::Model, runs: u32) -> usize {
    use modebench::fe::{self, Mesh};
    let mut found = 0;
    for _ in 0..runs {
        found =
            fe::frequencies(std::hint::black_box(model), 10, Mesh::Total(200)).map_or(0, |f| f.omegas.len());
    }
    found
}

/// `exact_runs` on the budget beam, for the browser.
#[cfg(all(target_arch = "wasm32", feature = "timing"))]
#[wasm_bindgen(js_name = benchExact)]
pub fn bench_exact(runs: u32) -> usize {
    exact_runs(&budget_beam(), runs)
}

/// `elements_runs` on the budget beam, for the browser.
#[cfg(all(target_arch = "wasm32", feature = "timing"))]
#[wasm_bindgen(js_name = benchElements)]
pub fn bench_elements(runs: u32) -> usize {
    elements_runs(&budget_beam(), runs)
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests {
    use super::*;

    /// Both workloads find their 10 frequencies, and the exact ones agree with finite elements
    /// to the mesh's error (the two methods are independent; 200 Hermite elements put the 10th
    /// mode within about 1e-5 relative of the exact value: the cubic element's error falls as
    /// h⁴, from memory).
    #[test]
    fn both_workloads_do_their_work() {
        let model = budget_beam();
        assert_eq!(exact_runs(&model, 2), 10);
        assert_eq!(elements_runs(&model, 2), 10);
        let exact = modebench::exact::frequencies(&model, 10).expect("solves");
        let fe = modebench::fe::frequencies(&model, 10, modebench::fe::Mesh::Total(200)).expect("solves");
        for (e, f) in exact.iter().zip(&fe.omegas) {
            assert!((f - e).abs() <= 1e-5 * e, "exact {e}, FE {f}");
        }
    }
}
