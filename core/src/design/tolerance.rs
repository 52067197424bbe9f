//! Tolerance bands: the range each natural frequency may take when inputs lie anywhere within
//! their tolerances.
//!
//! The first-order band adds up each input's effect, |∂ln f/∂ln p|·(Δp/p). Frequencies are not
//! linear in their inputs, so each mode is also solved at its two worst corners (every input at
//! the end of its range that moves that mode up, then every one at the end that moves it down),
//! and the band spans both estimates. An input may carry a relative tolerance (±5 %) or a range of
//! its own (an end's rotational stiffness between pinned and clamped: 0 to rigid).

use super::sensitivity::sensitivities;
use super::Frequencies;
use crate::error::Result;
use serde::{Deserialize, Serialize};

/// How far an input may stray.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Spread {
    /// ± this fraction of the value.
    Relative {
        /// The fraction, e.g. 0.05 for ±5 %.
        fraction: f64,
    },
    /// Anywhere between two values (either may be infinite, as for a rigid spring).
    Between {
        /// One end.
        low: f64,
        /// The other end.
        high: f64,
    },
}

/// A mode's band, Hz.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Band {
    /// The frequency at the nominal inputs.
    pub nominal: f64,
    /// Lowest and highest frequency the inputs can give.
    pub low: f64,
    /// See `low`.
    pub high: f64,
}

/// The band of every mode for inputs `p0` with the spreads given (`None`: exact).
pub fn bands(frequencies: &Frequencies<'_>, p0: &[f64], spreads: &[Option<Spread>]) -> Result<Vec<Band>> {
    let f0 = frequencies(p0)?;
    // Only a relative spread uses its input's sensitivity.
    let relative: Vec<usize> =
        (0..p0.len()).filter(|&j| matches!(spreads.get(j), Some(Some(Spread::Relative { .. })))).collect();
    let mut s = vec![vec![None; p0.len()]; f0.len()];
    if !relative.is_empty() {
        let some = |q: &[f64]| {
            let mut p = p0.to_vec();
            for (&j, v) in relative.iter().zip(q) {
                p[j] = *v;
            }
            frequencies(&p)
        };
        let q0: Vec<f64> = relative.iter().map(|&j| p0[j]).collect();
        for (row, found) in s.iter_mut().zip(sensitivities(&some, &q0)?) {
            for (&j, v) in relative.iter().zip(found) {
                row[j] = v;
            }
        }
    }
    bands_from(frequencies, p0, spreads, &f0, &s)
}

/// As [`bands`], given the frequencies at `p0` and their sensitivities to the inputs (∂ln fₖ/∂ln
/// pⱼ, as [`sensitivities`] gives them), found already.
pub fn bands_from(
    frequencies: &Frequencies<'_>,
    p0: &[f64],
    spreads: &[Option<Spread>],
    f0: &[f64],
    s: &[Vec<Option<f64>>],
) -> Result<Vec<Band>> {
    // The two ends of each input's range, and for each mode which end raises it.
    let ends: Vec<Option<(f64, f64)>> = p0
        .iter()
        .zip(spreads)
        .map(|(p, spread)| match *spread {
            Some(Spread::Relative { fraction }) => Some((p * (1.0 - fraction), p * (1.0 + fraction))),
            Some(Spread::Between { low, high }) => Some((low.min(high), low.max(high))),
            None => None,
        })
        .collect();
    // For a range (which may be infinite) the direction comes from solving at its ends.
    let mut raises_at_high = vec![vec![true; p0.len()]; f0.len()];
    for (j, end) in ends.iter().enumerate() {
        let Some((low, high)) = *end else { continue };
        let (at_low, at_high) = if matches!(spreads[j], Some(Spread::Between { .. })) {
            let mut p = p0.to_vec();
            p[j] = low;
            let fl = frequencies(&p)?;
            p[j] = high;
            (fl, frequencies(&p)?)
        } else {
            (Vec::new(), Vec::new())
        };
        for k in 0..f0.len() {
            raises_at_high[k][j] = match (at_low.get(k), at_high.get(k)) {
                (Some(a), Some(b)) => b >= a,
                _ => s[k][j].is_none_or(|v| v >= 0.0) == (high >= low),
            };
        }
    }
    // Most modes share their worst corners (a stiffer, lighter beam raises them all): each
    // corner is solved once.
    let solved: std::cell::RefCell<Vec<(Vec<f64>, Vec<f64>)>> = std::cell::RefCell::new(Vec::new());
    let solved_at = |p: &[f64]| -> Result<Vec<f64>> {
        if let Some((_, f)) = solved.borrow().iter().find(|(q, _)| q.as_slice() == p) {
            return Ok(f.clone());
        }
        let f = frequencies(p)?;
        solved.borrow_mut().push((p.to_vec(), f.clone()));
        Ok(f)
    };
    let mut out = Vec::with_capacity(f0.len());
    for (k, &nominal) in f0.iter().enumerate() {
        // First order: Σ |S|·Δp/p over the relative spreads.
        let linear: f64 = p0
            .iter()
            .zip(spreads)
            .enumerate()
            .filter_map(|(j, (_, spread))| match spread {
                Some(Spread::Relative { fraction }) => s[k][j].map(|v| v.abs() * fraction),
                _ => None,
            })
            .sum();
        let corner = |up: bool| -> Vec<f64> {
            p0.iter()
                .enumerate()
                .map(|(j, p)| match ends[j] {
                    Some((low, high)) => {
                        if raises_at_high[k][j] == up {
                            high
                        } else {
                            low
                        }
                    }
                    None => *p,
                })
                .collect()
        };
        let top = solved_at(&corner(true))?.get(k).copied().unwrap_or(nominal);
        let bottom = solved_at(&corner(false))?.get(k).copied().unwrap_or(nominal);
        let low = nominal.min(top).min(bottom).min(nominal * (1.0 - linear));
        let high = nominal.max(top).max(bottom).max(nominal * (1.0 + linear));
        out.push(Band { nominal, low, high });
    }
    Ok(out)
}
