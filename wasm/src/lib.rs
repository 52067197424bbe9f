//! Browser binding and live calculator widget for Modebench.
//!
//! - [`render`] turns a scenario and its results into HTML and SVG. It compiles natively too, so
//!   the site builder prerenders every calculator with the same code the browser runs.
//! - [`doc`] holds the scenario being edited as JSON, exactly as typed, and applies edits to it.
//! - [`catalog`] lists what the editor offers: unit systems, ends, section shapes, attachments.
//! - In WebAssembly only: the JS API (`solve`, `parseQuantity`, `listSections`, `listMaterials`,
//!   `listUnits`, `mountAll`, `version`) and the live widget behind `mountAll`.
//!
//! This crate holds no formula: every number it shows comes from the `modebench` core.

pub mod catalog;
pub mod doc;
pub mod render;

#[cfg(target_arch = "wasm32")]
pub mod api;
#[cfg(target_arch = "wasm32")]
mod widget;
