//! Browser binding and live calculator widget for Modebench.
//!
//! - [`render`] turns a scenario and its results into HTML and SVG. It compiles natively too, so
//!   the site builder prerenders every calculator with the same code the browser runs.
//! - [`doc`] holds the scenario being edited as JSON, exactly as typed, and applies edits to it.
//! - [`catalog`] lists what the editor offers: unit systems, ends, section shapes, attachments.
//! - [`worker`] is what the page and its solving Web Worker exchange, and which scenario the
//!   worker solves next (the newest edit wins).
//! - In WebAssembly only: the JS API and the live widget. What a build exports depends on its
//!   features: `page` the widget (`mountAll`), which never solves on the page's main thread;
//!   `solver` the worker's entry point (`solveScenario`); `api` (the default) adds `solve`,
//!   `parseQuantity`, `listSections`, `listMaterials` and `listUnits` for integrators.
//!
//! This crate holds no formula: every number it shows comes from the `modebench` core.

pub mod catalog;
pub mod doc;
pub mod render;
pub mod worker;

#[cfg(target_arch = "wasm32")]
pub mod api;
#[cfg(all(target_arch = "wasm32", feature = "page"))]
mod widget;
