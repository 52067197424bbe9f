//! Resizing to the margin: the ranges of one design input in which every mode keeps its margin
//! from every excitation, the value in them nearest today's, and the sweep to plot.
//!
//! Modes cross the forbidden bands as the input moves, so the feasible set is a union of
//! intervals. The range is swept on a grid (each point one solve), and each change between
//! feasible and not is refined by bisection on the input, to a millionth of the range. A mode
//! that dips into a band and out again between two grid points is missed: the grid is fine
//! enough for the smooth curves of real beams, and the caller may ask for more points.
//!
//! When inputs carry tolerances, each mode is judged on its band at every value tried
//! ([`resize_within`]): a value is feasible when every band's nearer edge keeps the margin, as
//! the report's margins judge it (`analysis::margins::band_separation`).

use super::margin::Drive;
use super::tolerance::Band;
use super::Frequencies;
use crate::error::{Error, ErrorKind, Result};
use serde::{Deserialize, Serialize};

/// What resizing found.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Resize {
    /// The intervals of the input in which every margin holds, ascending.
    pub intervals: Vec<(f64, f64)>,
    /// The feasible value nearest the current one (the current one when it is feasible).
    pub nearest: Option<f64>,
    /// The sweep: each input value with the frequencies there, Hz.
    pub sweep: Vec<(f64, Vec<f64>)>,
}

/// Bisections that refine each edge: the range halved this often is under a millionth of it.
const REFINE: usize = 22;

/// The intervals of input `input` within [low, high] (others at `p0`) where every mode clears
/// every drive by `margin`, from a sweep of `points` values.
pub fn resize(
    frequencies: &Frequencies<'_>,
    p0: &[f64],
    input: usize,
    range: (f64, f64),
    drives: &[Drive],
    margin: f64,
    points: usize,
) -> Result<Resize> {
    let exact = |p: &[f64]| -> Result<Vec<Band>> {
        Ok(frequencies(p)?.into_iter().map(|f| Band { nominal: f, low: f, high: f }).collect())
    };
    resize_within(&exact, p0, input, range, drives, margin, points)
}

/// Each mode's band (Hz) for given input values.
pub type Bands<'a> = dyn Fn(&[f64]) -> Result<Vec<Band>> + 'a;

/// Whether every band clears every drive by the margin: a band of one frequency as
/// [`Drive::too_close`] judges it, a wider one on its nearer edge as the report's margins do.
pub fn clear(bands: &[Band], drives: &[Drive], margin: f64) -> bool {
    bands.iter().all(|b| {
        drives.iter().all(|d| {
            if b.low == b.high {
                !d.too_close(b.nominal, margin)
            } else {
                crate::analysis::margins::band_separation(d, (b.low, b.high)).abs() >= margin
            }
        })
    })
}

/// As [`resize`], judging each mode on its band at every value tried: the sweep reports the
/// nominal frequencies, the intervals are where every band keeps the margin.
pub fn resize_within(
    bands: &Bands<'_>,
    p0: &[f64],
    input: usize,
    (low, high): (f64, f64),
    drives: &[Drive],
    margin: f64,
    points: usize,
) -> Result<Resize> {
    if !(low.is_finite() && high.is_finite() && low < high) || input >= p0.len() {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "a resizing range needs two finite ends, low below high",
        )
        .with_value(format!("{low} to {high}")));
    }
    if low < 0.0 && high > 0.0 {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "a resizing range must not cross zero (a thickness, length, mass or stiffness has one sign)",
        )
        .with_value(format!("{low} to {high}")));
    }
    if !(0.0..1.0).contains(&margin) {
        return Err(
            Error::new(ErrorKind::OutOfRange, "the margin must lie from 0 to 100 %").with_value(margin)
        );
    }
    let points = points.clamp(3, 2000);
    let at = |x: f64| -> Result<Vec<Band>> {
        let mut p = p0.to_vec();
        p[input] = x;
        bands(&p)
    };
    let mut sweep = Vec::with_capacity(points);
    let mut ok = Vec::with_capacity(points);
    for i in 0..points {
        let x = low + (high - low) * i as f64 / (points - 1) as f64;
        let b = at(x)?;
        ok.push(clear(&b, drives, margin));
        sweep.push((x, b.iter().map(|b| b.nominal).collect()));
    }
    let edge = |mut good: f64, mut bad: f64| -> Result<f64> {
        for _ in 0..REFINE {
            let mid = 0.5 * (good + bad);
            if clear(&at(mid)?, drives, margin) {
                good = mid;
            } else {
                bad = mid;
            }
        }
        Ok(good)
    };
    let mut intervals = Vec::new();
    let mut start: Option<f64> = ok[0].then_some(low);
    for i in 1..points {
        match (ok[i - 1], ok[i]) {
            (false, true) => start = Some(edge(sweep[i].0, sweep[i - 1].0)?),
            (true, false) => {
                let end = edge(sweep[i - 1].0, sweep[i].0)?;
                if let Some(s) = start.take() {
                    intervals.push((s, end));
                }
            }
            _ => {}
        }
    }
    if let Some(s) = start {
        intervals.push((s, high));
    }
    let current = p0[input];
    let nearest = intervals
        .iter()
        .map(|&(a, b)| current.clamp(a, b))
        .min_by(|a, b| (a - current).abs().total_cmp(&(b - current).abs()));
    Ok(Resize { intervals, nearest, sweep })
}
