//! The tap test: a recording of the part ringing after a few taps becomes its measured natural
//! frequencies and damping ratios, set beside the predicted modes.
//!
//! # Pipeline
//! 1. A reader ([`wav`], [`delimited`], or samples handed over as they are) gives one channel of
//!    samples at a uniform rate, streamed: a WAV file is read twice and never held whole.
//! 2. [`envelope`] reduces the record to one energy value per block of about a millisecond, and
//!    [`taps`] finds the taps in it: a rise of the energy well over the measured noise floor,
//!    with a pre-trigger; a second impact within 50 ms marks a double hit.
//! 3. Only the ring-down after each tap is kept (bounded memory). [`spectrum`] averages their
//!    power spectra and measures the noise floor from the record's quietest stretch;
//!    [`peaks`] finds the peaks that stand over it.
//! 4. [`fit`] fits a decaying sinusoid to each peak's band of each tap's ring-down by least
//!    squares (the primary frequency and damping ratio); [`damping`] adds the half-power
//!    bandwidth as a cross-check.
//! 5. [`matching`] pairs the peaks with the predicted modes; [`analysis`] assembles the result
//!    and its warnings ([`types`]). [`added_mass`] adds a sensor fixed to the part to the model,
//!    so that the prediction is of the part as tested.
//!
//! # Conventions
//! - Samples are `f32` as recorded (WAV integer samples scaled to ±1 of full scale); arithmetic
//!   is `f64`. Times in seconds from the first sample, frequencies in hertz.
//! - Spectra are one-sided, in dB of the amplitude a steady sine of that amplitude would show
//!   through the same window (the window's coherent gain is divided out), so the noise floor and
//!   the peaks read on the same scale. The FFT is unnormalised forward (`X_k = Σ x_n e^{-2πikn/M}`).
//! - A damping ratio is a fraction of critical damping (0.01 = 1 %).

pub mod added_mass;
pub mod analysis;
pub mod damping;
pub mod delimited;
pub mod envelope;
pub mod fit;
pub mod matching;
pub mod peaks;
mod resample;
mod source;
pub mod spectrum;
pub mod taps;
pub mod types;
pub mod wav;

pub use analysis::{analyse_csv, analyse_file, analyse_samples, analyse_timed, analyse_wav};
pub use matching::{Predicted, PredictedMode};
pub use types::{
    shown_hz, BenchOptions, BenchReport, MeasuredPeak, ModeMatch, SourceKind, TapReport, Warning,
};

/// The longest recording analysed: 30 minutes. Longer ones are refused with a message.
pub const MAX_SECONDS: f64 = 1800.0;

/// The largest file read: 200 MB.
pub const MAX_BYTES: usize = 200_000_000;

/// The fewest samples a recording must hold.
pub const MIN_SAMPLES: usize = 256;
