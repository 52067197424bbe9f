//! The tap test's warnings: what in the record or the result makes a figure less certain, and
//! what to do about it.

use super::super::peaks::Peak;
use super::super::taps::{Tap, WEAK_DB};
use super::super::types::{shown_hz, MeasuredPeak, SourceKind, Warning};
use crate::error::number;

/// Below this a microphone's response falls away (common practice, no source: phone and tablet
/// microphones are made for speech and roll off under some tens of hertz).
pub(super) const MICROPHONE_LOW_HZ: f64 = 30.0;
/// Above this fraction of the sample rate a peak may be a mode above half the rate folded back.
pub(super) const NEAR_NYQUIST: f64 = 0.4;

/// What the warnings are drawn from.
pub(super) struct Context<'a> {
    pub(super) rate_hz: f64,
    pub(super) source: SourceKind,
    pub(super) flat_tops: usize,
    pub(super) full_scale_hits: usize,
    pub(super) taps: &'a [Tap],
    pub(super) used: &'a [bool],
    pub(super) left_out: usize,
    pub(super) peaks: &'a [Peak],
    pub(super) bands: &'a [(usize, usize)],
    pub(super) notes: &'a [String],
}

fn warn(kind: &'static str, message: String) -> Warning {
    Warning { kind, message }
}

/// Measured frequencies as the panel's table of peaks shows them, so that a warning names a peak
/// by the figure the reader sees beside it.
fn list(frequencies: &[f64]) -> String {
    frequencies.iter().map(|f| format!("{} Hz", shown_hz(*f))).collect::<Vec<_>>().join(", ")
}

/// Every warning that applies, in a stable order.
pub(super) fn collect(c: &Context, peaks: &[MeasuredPeak]) -> Vec<Warning> {
    let mut out = Vec::new();
    let clipped = c.flat_tops.max(c.full_scale_hits);
    if clipped >= 2 {
        out.push(warn(
            "clipping",
            format!(
                "the record is clipped ({clipped} samples at full scale): levels and damping are unreliable; \
                 lower the input level or tap more softly"
            ),
        ));
    }
    let doubles: Vec<f64> =
        c.taps.iter().filter(|t| t.double_hit.is_some()).map(|t| t.onset as f64 / c.rate_hz).collect();
    if !doubles.is_empty() {
        let all = c.taps.iter().all(|t| t.double_hit.is_some());
        out.push(warn(
            "double-hit",
            format!(
                "{} struck twice (at {} s){}: let the hammer or knuckle bounce off at once",
                taps(doubles.len()),
                doubles.iter().map(|t| number((t * 100.0).round() / 100.0)).collect::<Vec<_>>().join(", "),
                if all {
                    "; every tap did, so they were analysed all the same"
                } else {
                    "; they were left out of the average"
                }
            ),
        ));
    }
    let still = c.taps.iter().filter(|t| t.cut_short).count();
    if still > 0 {
        out.push(warn(
            "still-ringing",
            format!(
                "{} while the part still rang from the one before: wait for the ring to die away between taps",
                if still == 1 { "one tap came".to_string() } else { format!("{still} taps came") }
            ),
        ));
    }
    let weak: Vec<&Tap> = c.taps.iter().filter(|t| t.level_db < WEAK_DB).collect();
    if !weak.is_empty() {
        out.push(warn(
            "weak-tap",
            format!(
                "{} less than {WEAK_DB} dB over the noise floor: tap harder or bring the sensor closer, \
                 or weak modes stay hidden",
                if weak.len() == 1 {
                    "one tap rose".to_string()
                } else {
                    format!("{} taps rose", weak.len())
                }
            ),
        ));
    }
    let used = c.used.iter().filter(|u| **u).count();
    if used == 1 {
        out.push(warn(
            "few-taps",
            "one tap was analysed: tap three to five times for an average and a consistency figure"
                .to_string(),
        ));
    }
    if c.left_out > 0 {
        out.push(warn(
            "taps-limited",
            format!(
                "{} left out to keep the analysis within its memory; record fewer taps",
                if c.left_out == 1 { "one tap was".to_string() } else { format!("{} taps were", c.left_out) }
            ),
        ));
    }
    if peaks.is_empty() {
        out.push(warn(
            "no-peak",
            "no peak stands 15 dB over the noise floor in the range searched: tap harder, record in a quieter place, or widen the range"
                .to_string(),
        ));
    }
    let short: Vec<f64> = peaks.iter().filter(|p| p.damping_fit.is_none()).map(|p| p.frequency_hz).collect();
    if !short.is_empty() {
        out.push(warn(
            "short-record",
            format!(
                "no decaying sinusoid could be fitted at {}: the ring-down kept is too short or too noisy for a damping \
                 ratio there; record longer after each tap",
                list(&short)
            ),
        ));
    }
    let audio =
        matches!(c.source, SourceKind::Microphone) || (c.source == SourceKind::File && c.rate_hz >= 8000.0);
    let low: Vec<f64> = peaks
        .iter()
        .filter(|p| audio && p.frequency_hz < MICROPHONE_LOW_HZ)
        .map(|p| p.frequency_hz)
        .collect();
    if !low.is_empty() {
        out.push(warn(
            "low-frequency",
            format!(
                "{} {} below about {MICROPHONE_LOW_HZ} Hz, where a microphone hears little: confirm with an \
                 accelerometer or the motion sensor",
                list(&low),
                lie(low.len())
            ),
        ));
    }
    let high: Vec<f64> =
        peaks.iter().filter(|p| p.frequency_hz > NEAR_NYQUIST * c.rate_hz).map(|p| p.frequency_hz).collect();
    if !high.is_empty() {
        out.push(warn(
            "near-nyquist",
            format!(
                "{} {} near half the sample rate ({} Hz): a mode above it would show here folded back; \
                 record at a higher rate to be sure",
                list(&high),
                lie(high.len()),
                number(c.rate_hz / 2.0)
            ),
        ));
    }
    for i in 1..c.peaks.len() {
        let (a, b) = (&c.peaks[i - 1], &c.peaks[i]);
        let close = b.position - a.position < 3.0 * (a.half_width + b.half_width);
        let narrow = c.bands[i].0 <= c.bands[i - 1].1 + 1 || c.bands[i].1 - c.bands[i].0 < 12;
        if close || narrow {
            out.push(warn(
                "overlapping-peaks",
                format!(
                    "the peaks at {} and {} Hz overlap: each one's damping is less certain",
                    shown_hz(peaks[i - 1].frequency_hz),
                    shown_hz(peaks[i].frequency_hz)
                ),
            ));
        }
    }
    for note in c.notes.iter().filter(|n| n.contains("resampled")) {
        out.push(warn("resampled", note.clone()));
    }
    out
}

/// The verb for a list of `n` frequencies.
fn lie(n: usize) -> &'static str {
    if n == 1 {
        "lies"
    } else {
        "lie"
    }
}

/// "one tap" or "3 taps".
fn taps(n: usize) -> String {
    if n == 1 {
        "one tap".to_string()
    } else {
        format!("{n} taps")
    }
}
