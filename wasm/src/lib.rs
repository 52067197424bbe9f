//! Browser binding and live calculator widget for Modebench: what only the browser has.
//!
//! The calculator's drawing, editing and catalogue are the `modebench-ui` crate's, re-exported
//! here as [`render`], [`doc`] and [`catalog`]; this crate adds:
//! - [`worker`]: what the page and its solving Web Worker exchange, and which scenario the
//!   worker solves next (the newest edit wins). Plain Rust, tested natively.
//! - In WebAssembly only: the JS API and the live widget (the DOM, the worker, storage). What a
//!   build exports depends on its features: `page` the widget (`mountAll`), which never solves
//!   (the site's `solve-here.js` solves a quick model's edits on the page with a `solver` build);
//!   `solver` the worker's entry point (`solveForPage`); `api` (the
//!   default) adds `solveScenario`, `solve`, `parseQuantity`, `listSections`, `listMaterials` and `listUnits` for
//!   integrators; `bench` the tap-test panel's engine ([`bench`]: `analyseFile`, `analyseSamples`,
//!   `analyseTimed`), loaded by the bench worker only when the reader opens the panel; `timing`
//!   the budget workloads ([`timing`]: `benchExact`, `benchElements`), for measuring
//!   WebAssembly against native only, never in a shipped engine.
//!
//! This crate holds no formula: every number it shows comes from the `modebench` core.

pub use modebench_ui::{catalog, doc, render};

pub mod worker;

// Natively for its tests; in WebAssembly only in the build that measures (feature `timing`).
#[cfg(any(not(target_arch = "wasm32"), feature = "timing"))]
pub mod timing;

#[cfg(feature = "bench")]
pub mod bench;

#[cfg(target_arch = "wasm32")]
pub mod api;
#[cfg(all(target_arch = "wasm32", feature = "page"))]
mod widget;
