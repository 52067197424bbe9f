//! Samples taken at uneven times put onto a uniform grid by linear interpolation: a CSV whose
//! time steps wander, or the motion sensor's events stamped by the browser.

use crate::error::{number, Error};
use crate::ErrorKind;

/// How far a time step may stray from the median step before the record is resampled.
pub(crate) const UNIFORM_TOLERANCE: f64 = 0.01;

/// Uniform samples made from `(time, value)` pairs, and a note when they had to be resampled.
pub(crate) struct Uniform {
    pub(crate) rate_hz: f64,
    pub(crate) samples: Vec<f32>,
    pub(crate) note: Option<String>,
}

/// Puts `values` taken at `times` (seconds, strictly increasing, checked by the caller) on a
/// uniform grid at the median step. Steps within 1 % of the median are taken as uniform.
pub(crate) fn uniform(times: &[f64], values: &[f32], what: &str) -> Result<Uniform, Error> {
    let n = times.len().min(values.len());
    if n < 2 {
        return Err(Error::new(ErrorKind::Missing, format!("{what}: at least two samples are needed")));
    }
    let mut steps: Vec<f64> = times[..n].windows(2).map(|w| w[1] - w[0]).collect();
    let worst = steps.iter().cloned().fold(0.0, f64::max);
    let least = steps.iter().cloned().fold(f64::INFINITY, f64::min);
    let mid = steps.len() / 2;
    steps.select_nth_unstable_by(mid, f64::total_cmp);
    let step = steps[mid];
    if !(step > 0.0 && step.is_finite()) {
        return Err(Error::new(ErrorKind::OutOfRange, format!("{what}: the time does not increase")));
    }
    let rate_hz = 1.0 / step;
    let spread = ((worst - step) / step).max((step - least) / step);
    if spread <= UNIFORM_TOLERANCE {
        return Ok(Uniform { rate_hz, samples: values[..n].to_vec(), note: None });
    }
    let span = times[n - 1] - times[0];
    let count = (span / step).floor() as usize + 1;
    // A gap of many steps cannot be filled by interpolation (and would take unbounded memory).
    if count > 2 * n + 1024 {
        let (at, gap) = times[..n].windows(2).map(|w| w[1] - w[0]).enumerate().fold((0, 0.0), |a, (i, g)| {
            if g > a.1 {
                (i, g)
            } else {
                a
            }
        });
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "{what}: a gap of {} s after sample {} where the steps are {} s: record without gaps, or cut the file there",
                number(gap),
                at + 1,
                number(step)
            ),
        ));
    }
    let mut samples = Vec::with_capacity(count);
    let mut j = 0;
    for i in 0..count {
        let t = times[0] + i as f64 * step;
        while j + 2 < n && times[j + 1] < t {
            j += 1;
        }
        let (t0, t1) = (times[j], times[j + 1]);
        let a = ((t - t0) / (t1 - t0)).clamp(0.0, 1.0);
        samples.push((values[j] as f64 * (1.0 - a) + values[j + 1] as f64 * a) as f32);
    }
    let note = format!(
        "{what}: the time steps vary by up to {} % of their median ({} s), so the record was \
         resampled to a uniform {} Hz by linear interpolation",
        number((spread * 100.0 * 10.0).round() / 10.0),
        number(step),
        number(rate_hz)
    );
    Ok(Uniform { rate_hz, samples, note: Some(note) })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn steady_steps_are_kept_and_wandering_ones_resampled() {
        let times: Vec<f64> = (0..100).map(|i| i as f64 * 0.01 + 0.00003 * (i % 2) as f64).collect();
        let values: Vec<f32> = (0..100).map(|i| i as f32).collect();
        let u = uniform(&times, &values, "time").unwrap();
        assert!(u.note.is_none());
        assert_eq!(u.samples.len(), 100);
        // A ramp sampled at jittered times is a ramp again on the uniform grid.
        let times: Vec<f64> =
            (0..100).map(|i| i as f64 * 0.01 + if i % 3 == 0 { 0.003 } else { 0.0 }).collect();
        let values: Vec<f32> = times.iter().map(|t| (2.0 * t) as f32).collect();
        let u = uniform(&times, &values, "time").unwrap();
        assert!(u.note.as_deref().unwrap().contains("resampled"));
        for (i, v) in u.samples.iter().enumerate() {
            let t = times[0] + i as f64 / u.rate_hz;
            assert!((*v as f64 - 2.0 * t).abs() < 1e-5, "{i}: {v} vs {}", 2.0 * t);
        }
        // A gap of a thousand steps is refused, not filled.
        let mut times: Vec<f64> = (0..100).map(|i| i as f64 * 0.01).collect();
        times[99] = 1e9;
        let e = uniform(&times, &values, "time").err().unwrap().to_string();
        assert!(e.contains("gap"), "{e}");
    }
}
