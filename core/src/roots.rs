//! Finding the first natural frequencies of a system from a counting function.
//!
//! Both solvers reduce to the same question: given a way to count the natural frequencies below
//! a trial ω (the Wittrick–Williams count for the exact method, the Sturm count for finite
//! elements), find the n-th frequency. The count never misses or duplicates a root, so bisection
//! on it isolates each frequency in an interval that holds exactly that one; a bracketed
//! root finder on the determinant then polishes it. Repeated frequencies stay unresolved by the
//! count and are reported once per multiplicity at the centre of a tiny interval.

use crate::error::{Error, ErrorKind, Result};

/// Sign and ln|det| of a matrix as a function of ω.
pub(crate) type Determinant<'a> = Box<dyn Fn(f64) -> (f64, f64) + 'a>;

/// A system whose natural frequencies can be counted and whose determinant can be evaluated.
pub(crate) trait Spectrum {
    /// Natural frequencies strictly below ω, and the part of that count that comes from poles
    /// of the matrix (J₀). Computed from pivots without interchanges, so it may misplace a root
    /// by a few parts in 10⁹ where a pivot vanishes; [`Spectrum::determinant`] does not.
    fn count(&self, omega: f64) -> Result<Count>;
    /// A function of ω giving the sign and ln|det| of a matrix that is singular exactly at the
    /// natural frequencies and has no poles on (0, `omega_max`], computed with a stably pivoted
    /// factorisation.
    fn determinant(&self, omega_max: f64) -> Result<Determinant<'_>>;
    /// Relative tolerance to polish roots to. The default is near machine precision; a system
    /// whose determinant is noisier than that (a fine finite-element mesh) sets a looser one, as
    /// polishing inside the noise only costs evaluations.
    fn tolerance(&self) -> f64 {
        POLISH
    }
}

/// The result of [`Spectrum::count`].
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) struct Count {
    /// Natural frequencies strictly below ω.
    pub(crate) below: usize,
    /// The part of `below` contributed by poles (J₀); the determinant is continuous only
    /// between trial frequencies with equal `poles`.
    pub(crate) poles: usize,
}

/// A natural frequency found by [`find`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Root {
    /// Angular frequency, rad/s.
    pub(crate) omega: f64,
    /// Number of coincident frequencies at this value (1 for a simple one).
    pub(crate) multiplicity: usize,
}

/// Relative width below which two frequencies count as one repeated frequency.
const REPEATED: f64 = 1e-13;
/// Relative tolerance of the polished root.
const POLISH: f64 = 4e-14;
/// Relative width the count narrows a bracket to before the determinant takes over.
const NARROW: f64 = 1e-3;
/// The furthest (relative) the polishing bracket is widened past the count's bracket.
const WIDEN: f64 = 1e-6;

/// The frequencies with indices `skip + 1 ..= skip + wanted` (1-based, ascending), where the
/// first `skip` are known to lie at zero (rigid-body modes).
///
/// `guess` is any positive ω of the right order; the search widens it as needed. `hints` are
/// trial frequencies probed first: good ones (near each root, from another method) save most of
/// the bisection; poor ones only cost a probe each.
pub(crate) fn find(
    skip: usize,
    wanted: usize,
    guess: f64,
    hints: &[f64],
    system: &dyn Spectrum,
) -> Result<Vec<Root>> {
    let target = skip + wanted;
    // Samples sorted by ω; ω = 0 is known to count `skip` (below any positive ω only the
    // rigid-body modes lie).
    let mut samples: Vec<(f64, Count)> = vec![(0.0, Count { below: skip, poles: 0 })];
    for &h in hints.iter().filter(|h| h.is_finite() && **h > 0.0) {
        insert(&mut samples, (h, sane(system.count(h)?)?));
    }
    let mut hi = if guess.is_finite() && guess > 0.0 { guess } else { 1.0 };
    if let Some(&(highest, c)) = samples.last() {
        if c.below >= target {
            hi = highest;
        }
    }
    loop {
        let c = sane(system.count(hi)?)?;
        insert(&mut samples, (hi, c));
        if c.below >= target {
            break;
        }
        hi *= 4.0;
        if !hi.is_finite() {
            return Err(no_convergence(target, "no upper bound on the frequencies was found"));
        }
    }

    let mut roots = Vec::with_capacity(wanted);
    let mut k = skip + 1;
    while k <= target {
        let mut iterations = 0;
        loop {
            iterations += 1;
            if iterations > 4000 {
                return Err(no_convergence(k, "bisection did not isolate the frequency"));
            }
            let (lo, clo, hi, chi) = bracket(&samples, k);
            if clo.below + 1 == k && chi.below == k {
                let omega = polish(lo, hi, k, system, &mut samples)?;
                roots.push(Root { omega, multiplicity: 1 });
                k += 1;
                break;
            }
            if hi - lo <= REPEATED * hi {
                // Several frequencies inside an interval at the limit of resolution.
                let multiplicity = chi.below - clo.below;
                let omega = 0.5 * (lo + hi);
                for _ in 0..multiplicity.min(target + 1 - k) {
                    roots.push(Root { omega, multiplicity });
                }
                k = chi.below.saturating_add(1).max(k + 1);
                break;
            }
            let mid = split(lo, hi);
            insert(&mut samples, (mid, sane(system.count(mid)?)?));
        }
    }
    roots.truncate(wanted);
    Ok(roots)
}

/// Counts beyond this mean the trial frequency has run far past any physical one (the inputs span
/// too many orders of magnitude); stop rather than bisect through them.
const MAX_COUNT: usize = 1_000_000;

fn sane(c: Count) -> Result<Count> {
    if c.below > MAX_COUNT {
        return Err(Error::new(
            ErrorKind::NoConvergence,
            "the frequencies could not be bracketed: the inputs span too many orders of magnitude (check the units)",
        ));
    }
    Ok(c)
}

/// A point inside (lo, hi), deliberately a little off the middle: the natural frequencies of
/// regular beams are simple multiples of one another, and exact halving would land on them.
fn split(lo: f64, hi: f64) -> f64 {
    lo + 0.471_404_520_791_031_7 * (hi - lo)
}

/// Adds a sample, keeping the list sorted by ω (samples arrive one at a time).
fn insert(samples: &mut Vec<(f64, Count)>, sample: (f64, Count)) {
    let at = samples.partition_point(|s| s.0 < sample.0);
    samples.insert(at, sample);
}

/// The tightest sampled interval with count(lo) < k ≤ count(hi).
fn bracket(samples: &[(f64, Count)], k: usize) -> (f64, Count, f64, Count) {
    let hi_index = samples.iter().position(|(_, c)| c.below >= k).unwrap_or(samples.len() - 1);
    let lo_index = samples[..hi_index].iter().rposition(|(_, c)| c.below < k).unwrap_or(0);
    let (lo, clo) = samples[lo_index];
    let (hi, chi) = samples[hi_index];
    (lo, clo, hi, chi)
}

/// Polishes the single frequency (the k-th) in (lo, hi] with Brent's method on a pole-free determinant,
/// scaled to its larger value at the ends. Where the count misplaced the root slightly (a pivot
/// close to zero), the bracket is widened by small steps until the determinant changes sign.
fn polish(
    mut lo: f64,
    mut hi: f64,
    k: usize,
    system: &dyn Spectrum,
    samples: &mut Vec<(f64, Count)>,
) -> Result<f64> {
    // Narrow by the count first. This moves the ends off ω = 0 (where the determinant vanishes
    // for rigid-body modes) and off neighbouring roots that an earlier sample may sit on.
    while lo == 0.0 || hi - lo > NARROW * hi {
        let mid = split(lo, hi);
        let c = system.count(mid)?;
        insert(samples, (mid, c));
        if c.below >= k {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    let det = system.determinant(hi * (1.0 + WIDEN))?;
    let (mut slo, mut llo) = det(lo);
    let (mut shi, mut lhi) = det(hi);
    // An end may sit on a neighbouring root (a sample that happened to land on it), giving two
    // sign changes in the bracket; narrowing by the count moves the ends off it.
    let mut narrowing = 0;
    while slo == shi && narrowing < 80 && hi - lo > POLISH * hi {
        narrowing += 1;
        let mid = split(lo, hi);
        if system.count(mid)?.below >= k {
            (hi, (shi, lhi)) = (mid, det(mid));
        } else {
            (lo, (slo, llo)) = (mid, det(mid));
        }
    }
    // The count may misplace a root by a few parts in 10⁹ where a pivot nearly vanishes; widen.
    let mut step = 1e-10;
    while slo == shi && step <= WIDEN {
        (lo, (slo, llo)) = (lo * (1.0 - step), det(lo * (1.0 - step)));
        (hi, (shi, lhi)) = (hi * (1.0 + step), det(hi * (1.0 + step)));
        step *= 4.0;
    }
    if slo == shi {
        return Ok(0.5 * (lo + hi));
    }
    let reference = llo.max(lhi);
    let value = |(sign, log): (f64, f64)| sign * (log - reference).clamp(-700.0, 700.0).exp();
    Ok(brent(lo, value((slo, llo)), hi, value((shi, lhi)), system.tolerance(), &|omega| {
        Some(value(det(omega)))
    })
    .unwrap_or(0.5 * (lo + hi)))
}

/// Brent's method (Brent, *Algorithms for Minimization without Derivatives*, 1973, ch. 4) on a
/// sign-changing bracket; `None` if the function stops being defined.
fn brent(
    mut a: f64,
    mut fa: f64,
    mut b: f64,
    mut fb: f64,
    tolerance: f64,
    f: &dyn Fn(f64) -> Option<f64>,
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
    for _ in 0..200 {
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
        fb = f(b)?;
    }
    Some(b)
}

fn no_convergence(mode: usize, why: &str) -> Error {
    Error::new(ErrorKind::NoConvergence, format!("mode {mode}: {why}; please report this model"))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A diagonal "system" with given eigenvalues, and poles that flip the determinant's sign.
    struct Diagonal {
        roots: &'static [f64],
        poles: &'static [f64],
    }

    impl Spectrum for Diagonal {
        fn count(&self, omega: f64) -> Result<Count> {
            let poles = self.poles.iter().filter(|p| **p < omega).count();
            Ok(Count { below: self.roots.iter().filter(|r| **r < omega).count(), poles })
        }
        fn determinant(&self, _: f64) -> Result<Determinant<'_>> {
            // Pole-free: the poles only enter the count, as in a refined layout.
            Ok(Box::new(move |omega| {
                let mut sign = 1.0;
                let mut log = 0.0;
                for v in self.roots.iter().map(|r| r - omega) {
                    sign *= v.signum();
                    log += v.abs().ln();
                }
                (sign, log)
            }))
        }
    }

    #[test]
    fn finds_every_root_once_including_repeated_and_near_poles() {
        static ROOTS: [f64; 6] = [1.0, 2.5, 2.5, 3.0, 3.0 + 1e-9, 7.0];
        static POLES: [f64; 2] = [2.5 + 1e-10, 5.0];
        let found = find(0, 6, 0.1, &[], &Diagonal { roots: &ROOTS, poles: &POLES }).unwrap();
        let omegas: Vec<f64> = found.iter().map(|r| r.omega).collect();
        assert_eq!(omegas.len(), 6);
        for (got, want) in omegas.iter().zip(ROOTS.iter()) {
            assert!((got - want).abs() <= 1e-12 * want, "{got} vs {want}");
        }
        assert_eq!(found[1].multiplicity, 2);
        assert_eq!(found[3].multiplicity, 1);
    }

    #[test]
    fn skips_rigid_body_modes() {
        static ROOTS: [f64; 4] = [0.0, 0.0, 4.0, 9.0];
        let found = find(2, 2, 100.0, &[], &Diagonal { roots: &ROOTS, poles: &[] }).unwrap();
        assert!((found[0].omega - 4.0).abs() < 1e-12 && (found[1].omega - 9.0).abs() < 1e-12);
        // Hints, good or bad, change nothing but the work done.
        let found =
            find(2, 2, 100.0, &[3.9, 4.1, 50.0, -1.0, f64::NAN], &Diagonal { roots: &ROOTS, poles: &[] })
                .unwrap();
        assert!((found[0].omega - 4.0).abs() < 1e-12 && (found[1].omega - 9.0).abs() < 1e-12);
    }
}
