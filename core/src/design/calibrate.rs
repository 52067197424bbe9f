//! Calibrating a model to measured frequencies: the value of one uncertain input that puts a
//! mode at its measured frequency, or of two inputs that best fit two or more measured
//! frequencies.
//!
//! One unknown: the input's range is scanned for sign changes of fₖ(p) − f_measured (a stiffness
//! or a mass moves a frequency one way only, a length or a thickness may not), and each change is
//! refined by Brent's method on the solver. Two unknowns: a bounded least-squares fit of the
//! relative residuals (fₖ − f_measured)/f_measured by Levenberg–Marquardt (Marquardt, J. SIAM
//! 11, 1963 — from memory), in the logarithms of the inputs (which keeps them positive and puts
//! inputs of different sizes on one footing), with the Jacobian by central differences. With two
//! unknowns the problem is two by two, a screenful written here rather than a library that would
//! bring a second version of the matrix crate into the page's engine; nor the general dense
//! matrices of the one the core has, whose decompositions would double the size of the worker's
//! engine for a system of two. The Jacobian's condition number (its singular values are the
//! square roots of the eigenvalues of the 2 × 2 JᵀJ, in closed form) says whether the
//! measurements can tell the two inputs apart.
//!
//! A few lines past 400: the one-unknown root solve and the two-unknown fit share their checks
//! of the range and of the conditioning, kept beside both.

use super::Frequencies;
use crate::error::{Error, ErrorKind, Result};
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

/// Brent's method on a sign-changing bracket of the input (the same method the root finder
/// uses, here on whole solves).
fn refine(g: &dyn Fn(f64) -> Result<f64>, mut a: f64, mut fa: f64, mut b: f64, mut fb: f64) -> Result<f64> {
    let (mut c, mut fc) = (a, fa);
    let mut d = b - a;
    let mut e = d;
    for _ in 0..100 {
        if fb.signum() == fc.signum() {
            (c, fc) = (a, fa);
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            (a, fa) = (b, fb);
            (b, fb) = (c, fc);
            (c, fc) = (a, fa);
        }
        let tol = 2.0 * f64::EPSILON * b.abs() + 1e-12 * b.abs().max(1e-300);
        let m = 0.5 * (c - b);
        if m.abs() <= tol || fb == 0.0 {
            return Ok(b);
        }
        if e.abs() >= tol && fa.abs() > fb.abs() {
            let s = fb / fa;
            let (mut p, mut q) = if a == c {
                (2.0 * m * s, 1.0 - s)
            } else {
                let (qa, r) = (fa / fc, fb / fc);
                (s * (2.0 * m * qa * (qa - r) - (b - a) * (r - 1.0)), (qa - 1.0) * (r - 1.0) * (s - 1.0))
            };
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            if 2.0 * p < (3.0 * m * q - (tol * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        (a, fa) = (b, fb);
        b += if d.abs() > tol { d } else { tol.copysign(m) };
        fb = g(b)?;
    }
    Ok(b)
}

/// Levenberg–Marquardt on the logarithms of the unknowns (or the values themselves when a
/// range reaches below zero), each step clamped into the ranges.
fn least_squares(
    frequencies: &Frequencies<'_>,
    p0: &[f64],
    unknowns: &[Unknown],
    measured: &[Measured],
) -> Result<Fit> {
    let logs = unknowns.iter().all(|u| u.low > 0.0);
    let to_p = |z: &[f64]| -> Vec<f64> {
        let mut p = p0.to_vec();
        for (u, v) in unknowns.iter().zip(z) {
            let x = if logs { v.exp() } else { *v };
            p[u.input] = x.clamp(u.low, u.high);
        }
        p
    };
    let clamp = |z: &mut [f64]| {
        for (u, v) in unknowns.iter().zip(z.iter_mut()) {
            let (lo, hi) = if logs { (u.low.ln(), u.high.ln()) } else { (u.low, u.high) };
            *v = v.clamp(lo, hi);
        }
    };
    let mut z: Vec<f64> = unknowns
        .iter()
        .map(|u| {
            let x = p0[u.input].clamp(u.low, u.high);
            if logs {
                x.ln()
            } else {
                x
            }
        })
        .collect();
    clamp(&mut z);
    let n = z.len();
    let norm = |v: &[f64]| v.iter().map(|x| x * x).sum::<f64>().sqrt();
    let mut r = residuals(frequencies, &to_p(&z), measured)?;
    let mut lambda = 1e-3;
    // The Jacobian by columns: jacobian[j][i] = ∂rᵢ/∂zⱼ.
    let mut jacobian = vec![vec![0.0; measured.len()]; n];
    let dot = |a: &[f64], b: &[f64]| a.iter().zip(b).map(|(x, y)| x * y).sum::<f64>();
    for _ in 0..60 {
        for j in 0..n {
            let h = if logs { 1e-6 } else { 1e-6 * z[j].abs().max(1e-12) };
            let (mut up, mut down) = (z.clone(), z.clone());
            up[j] += h;
            down[j] -= h;
            let ru = residuals(frequencies, &to_p(&up), measured)?;
            let rd = residuals(frequencies, &to_p(&down), measured)?;
            for i in 0..measured.len() {
                jacobian[j][i] = (ru[i] - rd[i]) / (2.0 * h);
            }
        }
        let jtj: Vec<Vec<f64>> =
            (0..n).map(|a| (0..n).map(|b| dot(&jacobian[a], &jacobian[b])).collect()).collect();
        let g: Vec<f64> = (0..n).map(|a| dot(&jacobian[a], &r)).collect();
        let mut improved = false;
        for _ in 0..20 {
            let mut a = jtj.clone();
            for (d, row) in a.iter_mut().enumerate() {
                row[d] += lambda * jtj[d][d].max(1e-30);
            }
            let Some(step) = solve_small(&a, &g.iter().map(|v| -v).collect::<Vec<_>>()) else { break };
            let mut trial: Vec<f64> = z.iter().zip(step.iter()).map(|(a, b)| a + b).collect();
            clamp(&mut trial);
            let rt = residuals(frequencies, &to_p(&trial), measured)?;
            if norm(&rt) < norm(&r) {
                let moved = trial.iter().zip(&z).map(|(a, b)| (a - b).abs()).fold(0.0, f64::max);
                z = trial;
                r = rt;
                lambda = (lambda * 0.3).max(1e-12);
                improved = moved > 1e-12;
                break;
            }
            lambda *= 10.0;
        }
        if !improved || norm(&r) < 1e-13 {
            break;
        }
    }
    let jtj: Vec<Vec<f64>> =
        (0..n).map(|a| (0..n).map(|b| dot(&jacobian[a], &jacobian[b])).collect()).collect();
    let (largest, smallest) = singular_values(&jtj);
    if largest == 0.0 || !largest.is_finite() {
        return Err(Error::new(
            ErrorKind::Model,
            "the measured modes do not move with these inputs: nothing to fit; choose inputs that change them",
        ));
    }
    let condition = largest / smallest;
    let p = to_p(&z);
    let values: Vec<f64> = unknowns.iter().map(|u| p[u.input]).collect();
    let mut notes = Vec::new();
    if !condition.is_finite() {
        notes.push(
            "the two inputs move the measured modes in the same proportion (the fit is singular): the \
             measurements cannot tell them apart, and other pairs fit as well"
                .to_string(),
        );
    } else if condition > 1e4 {
        notes.push(format!(
            "the two inputs move the measured modes in nearly the same proportion (condition number {condition:.1e}): \
             the measurements cannot tell them apart, and other pairs fit as well"
        ));
    }
    for (i, (u, v)) in unknowns.iter().zip(&values).enumerate() {
        if (*v - u.low).abs() <= 1e-9 * u.low.abs().max(1e-300) || (*v - u.high).abs() <= 1e-9 * u.high.abs()
        {
            notes.push(format!(
                "fitted value {} lies at the end of its range: the best fit may lie outside it, or the model lacks \
                 something",
                i + 1
            ));
        }
    }
    let worst = r.iter().fold(0.0f64, |m, v| m.max(v.abs()));
    if worst > 1e-3 {
        notes.push(format!(
            "no values in the ranges reproduce the measurements: the largest residual is {:.2} %",
            100.0 * worst
        ));
    }
    Ok(Fit { values, residuals: r, condition: Some(condition), alternatives: Vec::new(), notes })
}

/// The solution of a 1 × 1 or 2 × 2 system by Cramer's rule; `None` when it is singular.
fn solve_small(a: &[Vec<f64>], b: &[f64]) -> Option<Vec<f64>> {
    match (a, b) {
        ([row], [b0]) => (row[0] != 0.0).then(|| vec![b0 / row[0]]),
        ([r0, r1], [b0, b1]) => {
            let det = r0[0] * r1[1] - r0[1] * r1[0];
            (det != 0.0 && det.is_finite())
                .then(|| vec![(b0 * r1[1] - r0[1] * b1) / det, (r0[0] * b1 - b0 * r1[0]) / det])
        }
        _ => None,
    }
}

/// The largest and smallest singular values of a Jacobian J of one or two columns, from its
/// JᵀJ: the square roots of the eigenvalues of a symmetric 1 × 1 or 2 × 2 matrix.
fn singular_values(jtj: &[Vec<f64>]) -> (f64, f64) {
    match jtj {
        [row] => (row[0].max(0.0).sqrt(), row[0].max(0.0).sqrt()),
        [r0, r1] => {
            let (a, b, c) = (r0[0], r0[1], r1[1]);
            let mean = 0.5 * (a + c);
            let radius = (0.25 * (a - c) * (a - c) + b * b).sqrt();
            ((mean + radius).max(0.0).sqrt(), (mean - radius).max(0.0).sqrt())
        }
        _ => (0.0, 0.0),
    }
}
