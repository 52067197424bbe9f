//! Browser binding and live calculator widget for Modebench.
//!
//! [`render`] turns a scenario and its results into HTML and SVG; it compiles natively too, so
//! the site builder prerenders every calculator with the same code the browser runs.

pub mod render;
