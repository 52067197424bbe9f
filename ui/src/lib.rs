//! The calculator's user interface, in pure Rust: what the site builder prerenders and what the
//! browser's widget draws and edits with, the same code natively and in WebAssembly.
//!
//! - [`render`] turns a scenario and its results into HTML and SVG.
//! - [`doc`] holds the scenario being edited as JSON, exactly as typed, and applies edits to it.
//! - [`catalog`] is what the editor offers, from the core's schema of the scenario format.
//! - [`cases`] keeps the reader's own cases (list, names, undo) and what they are saved as.
//!
//! This crate holds no formula and no browser binding: every number it shows comes from the
//! `modebench` core, and the DOM, the worker and storage are `modebench-web`'s.

pub mod cases;
pub mod catalog;
pub mod doc;
pub mod render;
