//! What moves each mode: the logarithmic derivative ∂ln f/∂ln p of each natural frequency with
//! respect to each input, by central differences on the exact solver.
//!
//! The exact frequencies are good to about 1e-13, so a relative step of 1e-5 leaves a rounding
//! error near 1e-8 in the derivative and a truncation error near the step squared, 1e-10: far
//! below what the answer is read to ("% of frequency per % of input"). An input at the edge of
//! what the model accepts (an attachment at the end of the beam) has a step outward refused; its
//! derivative is then the one-sided difference, good to about the step (1e-5), still far below
//! what is read. The tests hold the result against derivatives known in closed form.

use super::Frequencies;
use crate::error::{Error, ErrorKind, Result};

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
            let s = match (at(&up), at(&down)) {
                (Some(u), Some(d)) => (u.ln() - d.ln()) / (2.0 * STEP),
                (Some(u), None) => (u.ln() - f0[k].ln()) / STEP,
                (None, Some(d)) => (f0[k].ln() - d.ln()) / STEP,
                (None, None) => continue,
            };
            row[j] = s.is_finite().then_some(s);
        }
    }
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
