//! From a failing margin to the change that clears it, and from a measurement to a calibrated
//! model: separation margins against lines and bands of excitation, the sensitivity of each
//! frequency to each input, tolerance bands, calibration to measured frequencies, and the ranges
//! of a design input where every margin holds.
//!
//! Each tool works on a function from input values to the first natural frequencies, so it does
//! not know what the inputs are: a wall thickness, an end's stiffness, a support's position. The
//! scenario layer builds that function by writing the values into the scenario and solving it;
//! the tests build it on models directly.

pub mod calibrate;
pub mod inputs;
pub mod margin;
mod requests;
pub mod resize;
pub mod sensitivity;
pub mod study;
pub mod tolerance;
mod types;

pub use study::{study, Design};

use crate::error::Result;

/// The first natural frequencies (Hz, ascending) for given input values.
pub type Frequencies<'a> = dyn Fn(&[f64]) -> Result<Vec<f64>> + 'a;
