//! Calibrating a model to measured frequencies: the value of one uncertain input that puts a
//! mode at its measured frequency, or of two inputs that best fit two or more measured
//! frequencies.
//!
//! One unknown: the input's range is scanned for sign changes of fₖ(p) − f_measured (a stiffness
//! or a mass moves a frequency one way only, a length or a thickness may not), and each change is
//! refined by Brent's method on the solver. Two unknowns: a bounded least-squares fit by
//! Levenberg–Marquardt (`calibrate/least_squares.rs`). Both share the checks of the request made
//! here, and the relative residuals.

mod least_squares;

use super::Frequencies;
use crate::error::{Error, ErrorKind, Result};
use least_squares::least_squares;
use serde::{Deserialize, Serialize};

/// A measured frequency of an elastic mode (`mode` 0 is the first elastic one).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Measured {
    /// Index of the mode among the elastic ones, from 0.
    pub mode: usize,
    /// Hz.
    pub hz: f64,
}

/// An input to fit: its index among the function's inputs and the range it may take.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Unknown {
    /// Index among the inputs.
    pub input: usize,
    /// Lowest value allowed.
    pub low: f64,
    /// Highest value allowed.
    pub high: f64,
}

/// The result of a calibration.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Fit {
    /// The fitted value of each unknown, in order.
    pub values: Vec<f64>,
    /// (computed − measured)/measured for each measurement, at the fitted values.
    pub residuals: Vec<f64>,
    /// The condition number of the scaled Jacobian (two unknowns only): large when the
    /// measurements cannot tell the inputs apart.
    pub condition: Option<f64>,
    /// Other values that fit as well (one unknown whose frequency is not monotone in it).
    pub alternatives: Vec<f64>,
    /// What the engineer should know about the fit.
    pub notes: Vec<String>,
}

/// Points scanned across a single unknown's range for sign changes.
const SCAN: usize = 24;

/// Fits `unknowns` (one or two) so that the modes measured take the frequencies measured, the
/// other inputs staying at `p0`.
pub fn calibrate(
    frequencies: &Frequencies<'_>,
    p0: &[f64],
    unknowns: &[Unknown],
    measured: &[Measured],
) -> Result<Fit> {
    if unknowns.is_empty() || unknowns.len() > 2 {
        return Err(
            Error::new(ErrorKind::OutOfRange, "calibrate one or two inputs").with_value(unknowns.len())
        );
    }
    if measured.len() < unknowns.len() {
        return Err(Error::new(
            ErrorKind::Missing,
            format!("{} unknowns need at least as many measured frequencies", unknowns.len()),
        )
        .with_value(measured.len()));
    }
    for u in unknowns {
        if !(u.low.is_finite() && u.high.is_finite() && u.low < u.high) || u.input >= p0.len() {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                "a calibration range needs two finite ends, low below high",
            )
            .with_value(format!("{} to {}", u.low, u.high)));
        }
        if u.unknowns_cross_zero() {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                "a calibration range must not cross zero (a stiffness, mass or length has one sign)",
            )
            .with_value(format!("{} to {}", u.low, u.high)));
        }
    }
    for m in measured {
        if !(m.hz.is_finite() && m.hz > 0.0) {
            return Err(
                Error::new(ErrorKind::OutOfRange, "a measured frequency must be above zero").with_value(m.hz)
            );
        }
    }
    if unknowns.len() == 1 && measured.len() == 1 {
        one(frequencies, p0, unknowns[0], measured[0])
    } else {
        least_squares(frequencies, p0, unknowns, measured)
    }
}

impl Unknown {
    fn unknowns_cross_zero(&self) -> bool {
        self.low < 0.0 && self.high > 0.0 || self.low == 0.0
    }
}

fn residuals(frequencies: &Frequencies<'_>, p: &[f64], measured: &[Measured]) -> Result<Vec<f64>> {
    let f = frequencies(p)?;
    measured
        .iter()
        .map(|m| {
            f.get(m.mode).map(|v| (v - m.hz) / m.hz).ok_or_else(|| {
                Error::new(ErrorKind::OutOfRange, format!("mode {} was not computed", m.mode + 1))
            })
        })
        .collect()
}

fn one(frequencies: &Frequencies<'_>, p0: &[f64], u: Unknown, m: Measured) -> Result<Fit> {
    let at = |x: f64| -> Result<f64> {
        let mut p = p0.to_vec();
        p[u.input] = x;
        Ok(residuals(frequencies, &p, &[m])?[0])
    };
    let logarithmic = u.low > 0.0 && u.high / u.low > 10.0;
    let point = |i: usize| -> f64 {
        let t = i as f64 / SCAN as f64;
        if logarithmic {
            u.low * (u.high / u.low).powf(t)
        } else {
            u.low + (u.high - u.low) * t
        }
    };
    let xs: Vec<f64> = (0..=SCAN).map(point).collect();
    let gs: Vec<f64> = xs.iter().map(|x| at(*x)).collect::<Result<_>>()?;
    let mut roots = Vec::new();
    for i in 0..SCAN {
        if gs[i] == 0.0 {
            roots.push(xs[i]);
        } else if gs[i].signum() != gs[i + 1].signum() {
            roots.push(refine(&at, xs[i], gs[i], xs[i + 1], gs[i + 1])?);
        }
    }
    if gs[SCAN] == 0.0 {
        roots.push(xs[SCAN]);
    }
    if roots.is_empty() {
        let (i, g) = gs
            .iter()
            .enumerate()
            .min_by(|a, b| a.1.abs().total_cmp(&b.1.abs()))
            .map(|(i, g)| (i, *g))
            .unwrap_or((0, 1.0));
        let place = match i {
            0 => "at the low end of the range",
            i if i == SCAN => "at the high end of the range",
            _ => "inside the range",
        };
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "no value in the range brings the mode measured at {} Hz there: the closest, {place}, leaves it \
                 {:.2} % {}; widen the range, choose another input, or check the mode's number and the measurement",
                crate::error::number(m.hz),
                100.0 * g.abs(),
                if g > 0.0 { "above" } else { "below" }
            ),
        ));
    }
    let current = p0[u.input];
    let distances: Vec<f64> = roots.iter().map(|r| (r - current).abs()).collect();
    let roots: Vec<f64> = crate::sort::order(&distances).into_iter().map(|i| roots[i]).collect();
    let value = roots[0];
    let mut notes = Vec::new();
    if roots.len() > 1 {
        notes.push(format!(
            "{} values of the input fit; the one nearest today's is given, the others are listed",
            roots.len()
        ));
    }
    Ok(Fit {
        values: vec![value],
        residuals: vec![at(value)?],
        condition: None,
        alternatives: roots[1..].to_vec(),
        notes,
    })
}

/// The root of `g` in a sign-changing bracket of the input, by Brent's method (the root
/// finder's, [`crate::roots::brent`]), to 1e-12 of the input; the first error a solve gives
/// ends the search with that error.
fn refine(g: &dyn Fn(f64) -> Result<f64>, a: f64, fa: f64, b: f64, fb: f64) -> Result<f64> {
    let mut failure = None;
    let root = crate::roots::brent(a, fa, b, fb, 2e-12, &mut |x| match g(x) {
        Ok(v) => Some(v),
        Err(e) => {
            failure = Some(e);
            None
        }
    });
    match (failure, root) {
        (Some(e), _) => Err(e),
        (None, Some(root)) => Ok(root),
        // `brent` gives up only when the function does; the arm keeps the match whole.
        (None, None) => Ok(0.5 * (a + b)),
    }
}
