//! Polishing one isolated frequency: Brent's method on the determinant, deflated by the
//! frequencies already found, inside an interval the count says holds exactly that one. Every
//! evaluation goes through the search's budget, and Brent's loop has its own cap, so a
//! determinant that is only noise ends the polish rather than prolonging it. Once a frequency is
//! polished, the counts that rounding tipped near it are dropped, so that they cannot bracket a
//! phantom one beside it.

use super::{Evaluator, Search};
use crate::error::Result;

/// The relative size of an interpolation step below which Brent's iteration is taken to have
/// settled into its superlinear convergence (see [`brent`]).
const SETTLED: f64 = 1e-6;
/// Most iterations of Brent's method on one interval: far past the ten or so a root takes; the
/// search's budget of evaluations usually stops a polish on noise before this does.
const BRENT_STEPS: usize = 200;
/// Relative distance from a root within which a count that contradicts it is taken for the
/// rounding of a nearly singular matrix (see [`Search::forget_tipped_counts`]): far wider than any
/// model double precision can solve shows, far narrower than two distinct modes of a beam lie.
const NOISE_LIMIT: f64 = 1e-7;

impl Search {
    /// The one frequency in the sampled interval (lo, hi] (counts k − 1 and k), by Brent's
    /// method on the determinant scaled by its larger value at the ends.
    pub(super) fn polish(
        &mut self,
        evaluator: &Evaluator<'_>,
        lo: usize,
        hi: usize,
        known: &[f64],
        tolerance: f64,
    ) -> Result<f64> {
        let (a, b) = (self.samples[lo], self.samples[hi]);
        let (slo, llo) = match a.value {
            Some(v) => v,
            None => self.revalue(evaluator, lo)?,
        };
        let (shi, lhi) = match b.value {
            Some(v) => v,
            None => self.revalue(evaluator, hi)?,
        };
        if slo == shi {
            // Only where an end sits within rounding of a root; the count still brackets it.
            return Ok(0.5 * (a.omega + b.omega));
        }
        // The determinant divided by (ω − ωⱼ) for every frequency already found below the
        // interval: those factors bend the determinant most across the interval, and without
        // them the interpolation steps converge from the first. The product is positive inside
        // the interval, so the sign change is the same. (Dividing also by the hints above the
        // interval was tried and cost more evaluations on a warm start, not fewer.)
        // One logarithm of the product rather than a sum of logarithms, which took a twentieth of a
        // solve's instructions.
        let deflated = |omega: f64, log: f64| {
            let mut product = crate::det::LogProduct::one();
            for w in known {
                product.mul(omega - w);
            }
            log - product.ln_abs()
        };
        let (dlo, dhi) = (deflated(a.omega, llo), deflated(b.omega, lhi));
        let reference = dlo.max(dhi);
        let scaled = |omega: f64, sign: f64, log: f64| {
            sign * (deflated(omega, log) - reference).clamp(-700.0, 700.0).exp()
        };
        let mut failure = None;
        let root = brent(
            a.omega,
            scaled(a.omega, slo, llo),
            b.omega,
            scaled(b.omega, shi, lhi),
            tolerance,
            &mut |omega| match self.evaluate(evaluator, omega) {
                Ok(e) => Some(scaled(omega, e.sign, e.log)),
                Err(e) => {
                    failure = Some(e);
                    None
                }
            },
        );
        match (root, failure) {
            (_, Some(e)) => Err(e),
            (Some(root), None) => Ok(root),
            (None, None) => Ok(0.5 * (a.omega + b.omega)),
        }
    }

    /// Drops the samples taken within rounding of the k-th frequency, just found at ω, whose
    /// count is neither k − 1 nor k or contradicts another count. There the matrix is singular to
    /// working precision: an elimination step's pivot is rounding noise, and the next pivot,
    /// divided by it, can take either sign, so the count may be off by one in either direction;
    /// left in place, such a sample would bracket a phantom frequency beside the real one (the
    /// k-th found twice, and every later one shifted by one).
    ///
    /// How wide that window is depends on the model: about ε times the ratio of its stiffest to
    /// its softest parts, so a near-rigid spring on a thin rod widens it to a part in 10¹⁰. The
    /// counts themselves say how wide it is: a count cannot fall as ω rises (it is the number of
    /// frequencies below ω), so a sample whose count is above a later one's or below an earlier
    /// one's, or that puts the k-th frequency on the wrong side of ω, is rounding, and twice the
    /// distance to the farthest such sample is dropped. Contradictions farther than
    /// [`NOISE_LIMIT`] are not the rounding near one root; they are left for the checks on the
    /// whole list to refuse.
    pub(super) fn forget_tipped_counts(&mut self, omega: f64, k: usize, tolerance: f64) {
        let n = self.samples.len();
        let mut before = vec![0usize; n];
        let mut after = vec![usize::MAX; n];
        for i in 1..n {
            before[i] = before[i - 1].max(self.samples[i - 1].below);
        }
        for i in (0..n.saturating_sub(1)).rev() {
            after[i] = after[i + 1].min(self.samples[i + 1].below);
        }
        let contradicts = |i: usize| {
            let s = &self.samples[i];
            s.below > after[i]
                || s.below < before[i]
                || (s.omega < omega && s.below >= k)
                || (s.omega > omega && s.below < k)
        };
        let seen = (0..n)
            .filter(|&i| (self.samples[i].omega - omega).abs() <= NOISE_LIMIT * omega && contradicts(i))
            .map(|i| (self.samples[i].omega - omega).abs())
            .fold(0.0, f64::max);
        let window = (2.0 * (tolerance + f64::EPSILON) * omega).max(2.0 * seen);
        let keep: Vec<bool> = (0..n)
            .map(|i| {
                let s = &self.samples[i];
                (s.omega - omega).abs() > window || ((s.below + 1 == k || s.below == k) && !contradicts(i))
            })
            .collect();
        let mut flags = keep.into_iter();
        self.samples.retain(|_| flags.next().unwrap_or(true));
    }

    /// Evaluates the sample at `index` again on the search's discretisation (its first value
    /// was taken on another), in place.
    fn revalue(&mut self, evaluator: &Evaluator<'_>, index: usize) -> Result<(f64, f64)> {
        let omega = self.samples[index].omega;
        let e = self.evaluate(evaluator, omega)?;
        // `evaluate` inserted a second sample at the same ω (or a nudged one); keep one.
        if let Some(at) = self.samples.iter().position(|s| s.omega == omega && s.value.is_none()) {
            self.samples.remove(at);
        }
        Ok((e.sign, e.log))
    }
}

/// Brent's method (Brent, *Algorithms for Minimization without Derivatives*, 1973, ch. 4) on a
/// sign-changing bracket, to `tolerance` relative to the root; `None` if the function stops
/// being defined. The root polish and the calibration's search over an input both use it.
pub(crate) fn brent(
    mut a: f64,
    mut fa: f64,
    mut b: f64,
    mut fb: f64,
    tolerance: f64,
    f: &mut dyn FnMut(f64) -> Option<f64>,
) -> Option<f64> {
    if fa == 0.0 {
        return Some(a);
    }
    if fb == 0.0 {
        return Some(b);
    }
    let (mut c, mut fc) = (a, fa);
    let mut d = b - a;
    let mut e = d;
    // The interpolation step taken in this iteration (NaN when it bisected).
    let mut p_over_q: f64;
    // The points evaluated after interpolation steps in a row (see `Settling`).
    let mut settling = Settling::default();
    for _ in 0..BRENT_STEPS {
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
        let tol = 2.0 * f64::EPSILON * b.abs() + 0.5 * tolerance * b.abs();
        let m = 0.5 * (c - b);
        if m.abs() <= tol || fb == 0.0 {
            return Some(b);
        }
        if e.abs() >= tol && fa.abs() > fb.abs() {
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                p = 2.0 * m * s;
                q = 1.0 - s;
            } else {
                let qa = fa / fc;
                let r = fb / fc;
                p = s * (2.0 * m * qa * (qa - r) - (b - a) * (r - 1.0));
                q = (qa - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            if 2.0 * p < (3.0 * m * q - (tol * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
                p_over_q = d;
            } else {
                d = m;
                p_over_q = f64::NAN;
                e = m;
            }
        } else {
            d = m;
            p_over_q = f64::NAN;
            e = m;
        }
        if d == p_over_q && d.abs() <= tol && e.abs() <= SETTLED * b.abs() {
            // Two interpolation steps in a row, the last smaller than the tolerance and the one
            // before it already small: convergence is superlinear there, so the stepped
            // estimate's error is far smaller still, and evaluating it (or stepping across the
            // root only to shrink the bracket) would cost one more factorisation for nothing.
            // Far from the root a step can be small for other reasons (values at the ends that
            // differ by many orders of magnitude), so the step before must be small too.
            return Some(b + d);
        }
        let interpolated = d == p_over_q;
        if interpolated && settling.converged(b + d, tolerance) {
            return Some(b + d);
        }
        (a, fa) = (b, fb);
        b += if d.abs() > tol { d } else { tol.copysign(m) };
        fb = f(b)?;
        if interpolated {
            settling.push(b);
        } else {
            settling = Settling::default();
        }
    }
    Some(b)
}

/// The last points Brent's iteration evaluated in its interpolation phase, and what they say
/// about the error of the next iterate.
///
/// Once the iteration is in its superlinear phase the errors of its iterates fall as in the
/// secant method, E₊ ≈ c·E·E₋, with c = |f″/2f′| near the root (inverse quadratic interpolation
/// falls faster still, E₊ ≈ c·E·E₋·E₋₋, so the secant's rule overstates the error; Brent 1973,
/// ch. 3 and 4). The next iterate, b + d, is far nearer the root than the points before it, so
/// their distances to it are their errors; three of them give c, and the error of b + d is about
/// c·E·E₋. When that, overstated [`SETTLING_MARGIN`] times and with c taken as at least 1 (in
/// units of the root), is below half the tolerance, b + d is returned without evaluating there,
/// which would only confirm it. Points that rounding moves give a large c and so no early end; a
/// bisection clears the points, since its error does not follow the rule.
#[derive(Clone, Copy, Default)]
struct Settling {
    /// The last points evaluated after interpolation steps, latest first; NaN where none.
    points: [f64; 4],
    /// How many of `points` are set.
    count: usize,
}

/// The factor by which [`Settling`] overstates the error it predicts before it trusts it.
const SETTLING_MARGIN: f64 = 10.0;

impl Settling {
    /// Records a point evaluated after an interpolation step.
    fn push(&mut self, x: f64) {
        let [a, b, c, _] = self.points;
        self.points = [x, a, b, c];
        self.count = (self.count + 1).min(4);
    }

    /// Whether `next`, the iterate an interpolation step leads to, is predicted within
    /// `tolerance` (relative) of the root.
    fn converged(&self, next: f64, tolerance: f64) -> bool {
        if self.count < 3 {
            return false;
        }
        let error = |i: usize| ((self.points[i] - next) / next).abs();
        // c from each run of three points recorded, the largest kept.
        let mut c = 1.0f64;
        for i in 0..self.count - 2 {
            c = c.max(error(i) / (error(i + 1) * error(i + 2)));
        }
        SETTLING_MARGIN * c * error(0) * error(1) <= 0.5 * tolerance
    }
}
