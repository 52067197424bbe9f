//! The bench worker's entry points: a file, the microphone's samples or the motion sensor's
//! timed values in, the panel's answer out as JSON text (see the module's head). Nothing is
//! thrown: every failure is an answer with a message.

use super::{analyse, Recording};
use wasm_bindgen::prelude::*;

/// Analyses a file's bytes (WAV or CSV).
#[wasm_bindgen(js_name = analyseFile)]
pub fn analyse_file(bytes: &[u8], options: &str) -> String {
    analyse(Recording::File(bytes), options)
}

/// Analyses samples taken at `rate_hz`.
#[wasm_bindgen(js_name = analyseSamples)]
pub fn analyse_samples(samples: &[f32], rate_hz: f64, options: &str) -> String {
    analyse(Recording::Samples(samples, rate_hz), options)
}

/// Analyses values taken at the given times (s).
#[wasm_bindgen(js_name = analyseTimed)]
pub fn analyse_timed(times: &[f64], values: &[f32], options: &str) -> String {
    analyse(Recording::Timed(times, values), options)
}
