//! What moves each mode: the logarithmic derivative ∂ln f/∂ln p of each natural frequency with
//! respect to each input, by central differences on the exact solver, or through the mode shapes
//! where the input changes only stiffnesses and masses of the model.
//!
//! The exact frequencies are good to about 1e-13, so a relative step of 1e-5 leaves a rounding
//! error near 1e-8 in the derivative and a truncation error near the step squared, 1e-10: far
//! below what the answer is read to ("% of frequency per % of input"). An input at the edge of
//! what the model accepts (an attachment at the end of the beam) has a step outward refused; its
//! derivative is then the one-sided difference, good to about the step (1e-5), still far below
//! what is read. The tests hold the result against derivatives known in closed form.
//!
//! Through the shapes ([`through_shapes`]): an input's step is taken on the model only (the
//! scenario read again with the input moved, no solve), and the change of the model's values
//! times each mode's gradient ([`crate::exact::Gradient`], the first-order perturbation of the
//! eigenproblem) gives the change of ω². A section's dimension, a material's modulus, a mass or
//! a spring so costs a reading of the scenario instead of two solves. An input that moves a
//! length or a position (or a mode whose frequency is repeated, where the derivative is not
//! that of one shape) is differenced on the solver as before, each solve handed the frequencies
//! of the solved model.

use super::Frequencies;
use crate::error::{Error, ErrorKind, Result};
use crate::exact::ModeShape;
use crate::model::Model;

/// Relative step of the central differences.
const STEP: f64 = 1e-5;

/// ∂ln fₖ/∂ln pⱼ for every mode k and input j at the values `p0`; `None` for an input at zero
/// (a logarithmic derivative has no meaning there) or one whose change moves no frequency it can
/// be compared with.
pub fn sensitivities(frequencies: &Frequencies<'_>, p0: &[f64]) -> Result<Vec<Vec<Option<f64>>>> {
    let f0 = frequencies(p0)?;
    let mut out = vec![vec![None; p0.len()]; f0.len()];
    for (j, &value) in p0.iter().enumerate() {
        if value == 0.0 || !value.is_finite() {
            continue;
        }
        let mut at = p0.to_vec();
        at[j] = value * (1.0 + STEP);
        let up = frequencies(&at).ok();
        at[j] = value * (1.0 - STEP);
        let down = frequencies(&at).ok();
        for (k, row) in out.iter_mut().enumerate() {
            let at = |side: &Option<Vec<f64>>| side.as_ref().and_then(|f| f.get(k).copied());
            let Some(s) = log_slope(at(&up), at(&down), f0[k]) else { continue };
            row[j] = s.is_finite().then_some(s);
        }
    }
    moved(out, p0)
}

/// The frequencies on one side of a step, when the model there was read and solved.
type Sides = Option<Vec<f64>>;

/// A solved elastic mode, as the derivative through its shape needs it.
#[derive(Clone, Copy, Debug)]
pub struct SolvedMode<'a> {
    /// Angular frequency, rad/s.
    pub omega: f64,
    /// How many coincident frequencies share it.
    pub multiplicity: usize,
    /// Its exact shape, of the solved model.
    pub shape: &'a ModeShape,
}

/// ∂ln fₖ/∂ln pⱼ as [`sensitivities`] gives it, for the elastic `modes` of `model` solved at
/// inputs `p0`. `model_at` reads the model for other input values (without solving it);
/// `solve` gives the elastic frequencies (Hz) of such a model, for the inputs that move lengths
/// or positions.
pub fn through_shapes(
    model: &Model,
    modes: &[SolvedMode<'_>],
    model_at: &dyn Fn(&[f64]) -> Result<Model>,
    solve: &dyn Fn(&Model) -> Result<Vec<f64>>,
    p0: &[f64],
) -> Result<Vec<Vec<Option<f64>>>> {
    let f0: Vec<f64> = modes.iter().map(|m| m.omega / std::f64::consts::TAU).collect();
    let gradients: Vec<Option<crate::exact::Gradient>> = modes
        .iter()
        .map(|m| (m.multiplicity == 1 && m.omega > 0.0).then(|| m.shape.gradient(model)))
        .collect();
    let mut out = vec![vec![None; p0.len()]; modes.len()];
    for (j, &value) in p0.iter().enumerate() {
        if value == 0.0 || !value.is_finite() {
            continue;
        }
        let mut at = p0.to_vec();
        at[j] = value * (1.0 + STEP);
        let up = model_at(&at).ok();
        at[j] = value * (1.0 - STEP);
        let down = model_at(&at).ok();
        // The change of ω² over the step and the step's width in units of STEP.
        let (from, to, width) = match (&down, &up) {
            (Some(d), Some(u)) => (d, u, 2.0),
            (None, Some(u)) => (model, u, 1.0),
            (Some(d), None) => (d, model, 1.0),
            (None, None) => continue,
        };
        let mut solved: Option<(Sides, Sides)> = None;
        for (k, row) in out.iter_mut().enumerate() {
            let exact = gradients[k].as_ref().and_then(|g| g.change(from, to));
            let s = match exact {
                Some(d) => d / (width * STEP) / (2.0 * modes[k].omega * modes[k].omega),
                None => {
                    let (u, d) = solved.get_or_insert_with(|| {
                        (up.as_ref().and_then(|m| solve(m).ok()), down.as_ref().and_then(|m| solve(m).ok()))
                    });
                    let at = |side: &Option<Vec<f64>>| side.as_ref().and_then(|f| f.get(k).copied());
                    let Some(s) = log_slope(at(u), at(d), f0[k]) else { continue };
                    s
                }
            };
            row[j] = s.is_finite().then_some(s);
        }
    }
    moved(out, p0)
}

/// ∂ln f/∂ln p from the frequencies a step up and a step down (central), or from one side and
/// the frequency at the value itself (one-sided) where the other side could not be solved.
fn log_slope(up: Option<f64>, down: Option<f64>, f0: f64) -> Option<f64> {
    match (up, down) {
        (Some(u), Some(d)) => Some((u.ln() - d.ln()) / (2.0 * STEP)),
        (Some(u), None) => Some((u.ln() - f0.ln()) / STEP),
        (None, Some(d)) => Some((f0.ln() - d.ln()) / STEP),
        (None, None) => None,
    }
}

/// The sensitivities, unless no input moves any frequency at all.
fn moved(out: Vec<Vec<Option<f64>>>, p0: &[f64]) -> Result<Vec<Vec<Option<f64>>>> {
    if out.iter().flatten().all(Option::is_none) && !p0.is_empty() {
        return Err(Error::new(
            ErrorKind::Model,
            "no input moves any frequency (all are zero or not finite)",
        ));
    }
    Ok(out)
}

/// For one mode, the inputs that move it most: (input, ∂ln f/∂ln p), largest first.
pub fn strongest(row: &[Option<f64>], count: usize) -> Vec<(usize, f64)> {
    let given: Vec<(usize, f64)> = row.iter().enumerate().filter_map(|(j, s)| s.map(|s| (j, s))).collect();
    let keys: Vec<f64> = given.iter().map(|g| -g.1.abs()).collect();
    crate::sort::order(&keys).into_iter().take(count).map(|i| given[i]).collect()
}
