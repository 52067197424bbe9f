//! What the tap test takes (its options) and what it gives: the taps found, the measured peaks
//! with their damping by two methods, the spectrum to draw, the match with the predicted modes
//! and the warnings. Every number is finite.

use super::matching::Predicted;

/// Where the samples came from: it decides which warnings apply (a microphone rolls off at low
/// frequency; the motion sensor samples slowly).
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum SourceKind {
    /// A file of unknown origin: judged by its sample rate.
    File,
    /// The tablet's microphone.
    Microphone,
    /// The tablet's motion sensor.
    Motion,
}

/// What to analyse and how.
#[derive(Clone, Debug)]
pub struct BenchOptions {
    /// The channel (0-based) of a WAV file or the signal column (0-based, time column not
    /// counted) of a CSV file.
    pub channel: usize,
    /// The frequency range searched for peaks, Hz; `None` for the default (5 Hz, or 0.5 Hz for
    /// records sampled below 1 kHz, up to 45 % of the sample rate).
    pub range_hz: Option<(f64, f64)>,
    /// Where the samples came from.
    pub source: SourceKind,
    /// At most this many points of the spectrum are returned for drawing (each the largest of
    /// the bins it stands for); `usize::MAX` returns every bin.
    pub spectrum_points: usize,
    /// The predicted modes to match, when a model is at hand.
    pub predicted: Option<Predicted>,
}

impl Default for BenchOptions {
    fn default() -> Self {
        BenchOptions {
            channel: 0,
            range_hz: None,
            source: SourceKind::File,
            spectrum_points: 1024,
            predicted: None,
        }
    }
}

/// One tap found in the record.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct TapReport {
    /// When it struck, s from the first sample.
    pub time_s: f64,
    /// How far its first moments rose over the noise floor, dB.
    pub level_db: f64,
    /// The length of its ring-down kept for the analysis, s.
    pub kept_s: f64,
    /// Whether its ring-down entered the average.
    pub used: bool,
    /// Why it was left out or is less certain (a double hit, struck while still ringing).
    pub note: Option<String>,
}

/// A measured frequency, Hz, as the reader is shown it wherever a peak is named (its table, its
/// mark on the spectrum, a warning): five significant figures, so that each names it alike.
pub fn shown_hz(hz: f64) -> String {
    crate::units::significant(hz, 5)
}

/// One peak of the spectrum, measured.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct MeasuredPeak {
    /// Damped natural frequency, Hz: the least-squares fit's where it succeeded, otherwise the
    /// interpolated spectral peak.
    pub frequency_hz: f64,
    /// The interpolated spectral peak (quadratic through three bins in dB), Hz.
    pub spectral_hz: f64,
    /// The undamped natural frequency f/√(1 − ζ²), Hz, when a damping ratio is known: what a
    /// model without damping predicts.
    pub undamped_hz: f64,
    /// Damping ratio from the least-squares fit of a decaying sinusoid (primary).
    pub damping_fit: Option<f64>,
    /// Damping ratio from the half-power bandwidth (cross-check).
    pub damping_half_power: Option<f64>,
    /// Why the half-power figure is less certain, or why it is absent.
    pub half_power_note: Option<String>,
    /// How well the decaying sinusoid explains the peak's band, 0–1 (1 − residual energy over
    /// band energy, averaged over the taps).
    pub quality: f64,
    /// The peak's height over the noise floor, dB.
    pub over_floor_db: f64,
    /// How far it stands over the lowest point between it and any higher peak, dB.
    pub prominence_db: f64,
    /// Spread of the fitted frequency across the taps (standard deviation over the mean, %),
    /// when two or more taps were fitted.
    pub tap_spread_percent: Option<f64>,
    /// Taps whose ring-down was fitted for this peak.
    pub taps_fitted: usize,
    /// The predicted mode it matches (1-based number), if any.
    pub mode: Option<usize>,
    /// That mode's predicted frequency, Hz.
    pub predicted_hz: Option<f64>,
    /// (predicted − measured undamped) / measured undamped, %: positive when the model is high.
    pub difference_percent: Option<f64>,
}

/// A predicted mode and what became of it.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct ModeMatch {
    /// The mode's number in the prediction (1-based).
    pub mode: usize,
    /// Predicted frequency, Hz.
    pub predicted_hz: f64,
    /// Index into [`BenchReport::peaks`] of the peak it matches.
    pub peak: Option<usize>,
    /// Measured undamped frequency, Hz, when matched.
    pub measured_hz: Option<f64>,
    /// (predicted − measured) / measured, %, when matched.
    pub difference_percent: Option<f64>,
    /// Why it may be absent or was not matched.
    pub note: Option<String>,
}

/// A warning about the record or the result, with an identifier a page can style or count.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct Warning {
    /// `clipping`, `short-record`, `low-frequency`, `near-nyquist`, `overlapping-peaks`,
    /// `weak-tap`, `double-hit`, `still-ringing`, `few-taps`, `no-peak`, `resampled`,
    /// `taps-limited`, `truncated-file`.
    pub kind: &'static str,
    /// What it means and what to do, in plain words.
    pub message: String,
}

/// The spectrum to draw: frequencies, the averaged level and the noise floor, in dB (see the
/// module's conventions).
#[derive(Clone, Debug, Default, PartialEq, serde::Serialize)]
pub struct SpectrumCurve {
    /// Frequencies, Hz, ascending.
    pub hz: Vec<f64>,
    /// Averaged level, dB.
    pub db: Vec<f64>,
    /// Noise floor, dB.
    pub floor_db: Vec<f64>,
}

/// The result of a tap test.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct BenchReport {
    /// Samples per second of the record as analysed.
    pub sample_rate_hz: f64,
    /// Length of the record, s.
    pub duration_s: f64,
    /// Channels (or signal columns) in the file.
    pub channels: usize,
    /// The channel analysed (0-based).
    pub channel: usize,
    /// Where the samples came from.
    pub source: SourceKind,
    /// The frequency range searched, Hz.
    pub range_hz: [f64; 2],
    /// The spectrum's bin spacing after zero padding, Hz.
    pub resolution_hz: f64,
    /// The taps found, in time order.
    pub taps: Vec<TapReport>,
    /// How alike the used taps' spectra are, 0–1 (the mean correlation of each tap's spectrum in
    /// dB with the average's, over the range where the average stands 10 dB over the floor);
    /// absent with fewer than two used taps.
    pub consistency: Option<f64>,
    /// The peaks, ascending in frequency.
    pub peaks: Vec<MeasuredPeak>,
    /// The predicted modes and their matches, when a prediction was given.
    pub modes: Vec<ModeMatch>,
    /// The spectrum to draw.
    pub spectrum: SpectrumCurve,
    /// What the reader did to the file (resampling, the channel chosen).
    pub notes: Vec<String>,
    /// Warnings about the record and the result.
    pub warnings: Vec<Warning>,
}

impl BenchReport {
    /// Whether every number in the report is finite (the analysis checks it before returning).
    pub fn is_finite(&self) -> bool {
        let all = |v: &[f64]| v.iter().all(|x| x.is_finite());
        let opt = |v: Option<f64>| v.is_none_or(f64::is_finite);
        [self.sample_rate_hz, self.duration_s, self.range_hz[0], self.range_hz[1], self.resolution_hz]
            .iter()
            .all(|x| x.is_finite())
            && opt(self.consistency)
            && self
                .taps
                .iter()
                .all(|t| t.time_s.is_finite() && t.level_db.is_finite() && t.kept_s.is_finite())
            && self.peaks.iter().all(|p| {
                all(&[
                    p.frequency_hz,
                    p.spectral_hz,
                    p.undamped_hz,
                    p.quality,
                    p.over_floor_db,
                    p.prominence_db,
                ]) && [
                    p.damping_fit,
                    p.damping_half_power,
                    p.tap_spread_percent,
                    p.predicted_hz,
                    p.difference_percent,
                ]
                .into_iter()
                .all(opt)
            })
            && self
                .modes
                .iter()
                .all(|m| m.predicted_hz.is_finite() && opt(m.measured_hz) && opt(m.difference_percent))
            && all(&self.spectrum.hz)
            && all(&self.spectrum.db)
            && all(&self.spectrum.floor_db)
    }
}
