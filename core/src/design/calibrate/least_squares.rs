//! The fit of two uncertain inputs to two or more measured frequencies: a bounded least-squares
//! fit of the relative residuals (fₖ − f_measured)/f_measured by Levenberg–Marquardt (Marquardt,
//! J. SIAM 11, 1963 — from memory), in the logarithms of the inputs (which keeps them positive and
//! puts inputs of different sizes on one footing), with the Jacobian by central differences.
//!
//! The problem is two by two, a screenful written here rather than a library that would bring a
//! second version of the matrix crate into the page's engine; nor the general dense matrices of
//! the one the core has, whose decompositions would double the size of the worker's engine for a
//! system of two. The Jacobian's condition number (its singular values are the square roots of
//! the eigenvalues of the 2 × 2 JᵀJ, in closed form) says whether the measurements can tell the
//! two inputs apart.

use super::{residuals, Fit, Measured, Unknown};
use crate::design::Frequencies;
use crate::error::{Error, ErrorKind, Result};

/// Levenberg–Marquardt on the logarithms of the unknowns (or the values themselves when a
/// range reaches below zero), each step clamped into the ranges.
pub(super) fn least_squares(
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
