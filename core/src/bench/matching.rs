//! Pairing measured peaks with predicted modes, knowing where the part was tapped and where the
//! sensor sat: a mode with a node near either is barely excited or barely heard, so when no
//! peak matches it the result says why instead of pairing it with a neighbour's peak.

use super::types::{MeasuredPeak, ModeMatch};
use crate::report::Report;

/// A mode whose deflection at the tap or the sensor is under this fraction of its largest may
/// be absent from the record (common practice, no source: about −16 dB of excitation).
pub const NODE_FRACTION: f64 = 0.15;

/// A peak matches a mode when within this fraction of its frequency.
pub const MATCH_WITHIN: f64 = 0.3;

/// One predicted mode as the tap test needs it.
#[derive(Clone, Debug, PartialEq)]
pub struct PredictedMode {
    /// Its number (1-based).
    pub number: usize,
    /// Natural frequency, Hz.
    pub hz: f64,
    /// Deflection at the tap over the largest (0–1).
    pub at_tap: f64,
    /// Deflection at the sensor over the largest (0–1).
    pub at_sensor: f64,
}

/// The predicted modes and where the tap and the sensor were.
#[derive(Clone, Debug, PartialEq)]
pub struct Predicted {
    /// The modes, ascending.
    pub modes: Vec<PredictedMode>,
    /// Where the part was tapped, m.
    pub tap_m: f64,
    /// Where the sensor was, m.
    pub sensor_m: f64,
}

impl Predicted {
    /// The flexible modes of a solved report; the tap and the sensor at `tap_m` and `sensor_m`,
    /// or by default where mode 1 (the first flexible mode) deflects most.
    pub fn from_report(report: &Report, tap_m: Option<f64>, sensor_m: Option<f64>) -> Predicted {
        let flexible: Vec<_> =
            report.modes.iter().filter(|m| !m.rigid_body && m.frequency_hz > 0.0).collect();
        let default = flexible
            .first()
            .and_then(|m| {
                m.shape
                    .x
                    .iter()
                    .zip(&m.shape.w)
                    .max_by(|a, b| a.1.abs().total_cmp(&b.1.abs()))
                    .map(|(x, _)| *x)
            })
            .unwrap_or(0.0);
        let tap = tap_m.filter(|x| x.is_finite()).unwrap_or(default);
        let sensor = sensor_m.filter(|x| x.is_finite()).unwrap_or(default);
        let modes = flexible
            .iter()
            .map(|m| {
                let top = m.shape.w.iter().fold(0.0f64, |a, w| a.max(w.abs())).max(1e-300);
                let at = |x: f64| (interpolate(&m.shape.x, &m.shape.w, x) / top).abs().min(1.0);
                PredictedMode { number: m.number, hz: m.frequency_hz, at_tap: at(tap), at_sensor: at(sensor) }
            })
            .collect();
        Predicted { modes, tap_m: tap, sensor_m: sensor }
    }
}

/// Linear interpolation of `w` sampled at ascending `x` (the ends held).
fn interpolate(x: &[f64], w: &[f64], at: f64) -> f64 {
    let n = x.len().min(w.len());
    if n == 0 {
        return 0.0;
    }
    if at <= x[0] {
        return w[0];
    }
    for i in 1..n {
        if at <= x[i] {
            let a = if x[i] > x[i - 1] { (at - x[i - 1]) / (x[i] - x[i - 1]) } else { 1.0 };
            return w[i - 1] * (1.0 - a) + w[i] * a;
        }
    }
    w[n - 1]
}

/// Pairs peaks with modes one to one, the closest pairs (in relative frequency) first; modes
/// with a node near the tap or the sensor yield to the others. Fills each matched peak's mode
/// fields and returns every predicted mode within `range_hz` with its match or the reason it has
/// none; modes outside the range are listed with that reason.
pub fn pair(peaks: &mut [MeasuredPeak], predicted: &Predicted, range_hz: [f64; 2]) -> Vec<ModeMatch> {
    let node = |m: &PredictedMode| m.at_tap < NODE_FRACTION || m.at_sensor < NODE_FRACTION;
    let mut pairs: Vec<(f64, usize, usize)> = Vec::new();
    for (i, m) in predicted.modes.iter().enumerate() {
        for (j, p) in peaks.iter().enumerate() {
            let d = (p.undamped_hz - m.hz).abs() / m.hz;
            if d <= MATCH_WITHIN {
                pairs.push((d + if node(m) { 1.0 } else { 0.0 }, i, j));
            }
        }
    }
    pairs.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut mode_peak: Vec<Option<usize>> = vec![None; predicted.modes.len()];
    let mut taken = vec![false; peaks.len()];
    for (_, i, j) in pairs {
        if mode_peak[i].is_none() && !taken[j] {
            mode_peak[i] = Some(j);
            taken[j] = true;
        }
    }
    predicted
        .modes
        .iter()
        .zip(&mode_peak)
        .map(|(m, &peak)| {
            let mut row = ModeMatch {
                mode: m.number,
                predicted_hz: m.hz,
                peak,
                measured_hz: None,
                difference_percent: None,
                note: None,
            };
            if let Some(j) = peak {
                let p = &mut peaks[j];
                // The model's error, as the calculator states it beside a measured frequency.
                let diff = (m.hz - p.undamped_hz) / p.undamped_hz * 100.0;
                p.mode = Some(m.number);
                p.predicted_hz = Some(m.hz);
                p.difference_percent = Some(diff);
                row.measured_hz = Some(p.undamped_hz);
                row.difference_percent = Some(diff);
            } else if m.hz < range_hz[0] || m.hz > range_hz[1] {
                row.note = Some(format!(
                    "outside the range searched ({}–{} Hz)",
                    crate::error::number(range_hz[0]),
                    crate::error::number(range_hz[1])
                ));
            } else if node(m) {
                let (place, value) = if m.at_tap <= m.at_sensor { ("tap", m.at_tap) } else { ("sensor", m.at_sensor) };
                row.note = Some(format!(
                    "may be absent: the mode has a node near the {place} (deflection there {} % of its largest); \
                     tap or listen elsewhere to see it",
                    (value * 100.0).round()
                ));
            } else {
                row.note = Some(format!(
                    "no peak within {} % of the prediction: the model may be off, or the tap too weak at this frequency",
                    (MATCH_WITHIN * 100.0).round()
                ));
            }
            row
        })
        .collect()
}
