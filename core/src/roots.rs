//! Finding the first natural frequencies of a system from a counting function and a determinant.
//!
//! Both solvers reduce to the same question: given, at any trial ω, the number of natural
//! frequencies below it (the Wittrick–Williams count for the exact method, the Sturm count for
//! finite elements) and, from the same factorisation, the determinant of the matrix that is
//! singular at them, find the n-th frequency. The count never misses or duplicates a root, so it
//! isolates each frequency in an interval that holds exactly that one; the determinant changes
//! sign exactly once in such an interval, and Brent's method on it converges superlinearly.
//! Trial points are placed by interpolation (beam frequencies are close to evenly spaced in √ω),
//! and every trial, the polishing ones included, also counts, so the next frequency starts from
//! a bracket the previous one left behind.
//!
//! Every loop is bounded: a solve has a budget of evaluations, and past it the search stops with
//! [`ErrorKind::NoConvergence`] instead of running on. Repeated frequencies stay unresolved by the
//! count and are reported once per multiplicity at the centre of a tiny interval.
//!
//! This file isolates each frequency by the count; `roots/polish.rs` narrows an isolated one
//! down with Brent's method on the determinant.

use crate::error::{Error, ErrorKind, Result};

mod polish;

pub(crate) use polish::brent;

/// What one factorisation at a trial ω gives.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Evaluation {
    /// Natural frequencies strictly below ω.
    pub(crate) below: usize,
    /// Sign of the determinant: (−1)^`below`, or NaN when the elimination broke down.
    pub(crate) sign: f64,
    /// ln |determinant|, on the discretisation the evaluator was made for.
    pub(crate) log: f64,
}

/// An evaluator for trial frequencies up to the reference it was made for.
pub(crate) type Evaluator<'a> = Box<dyn Fn(f64) -> Evaluation + 'a>;

/// A system whose natural frequencies can be counted and whose determinant can be evaluated.
pub(crate) trait Spectrum {
    /// An evaluator valid for every trial ω in [0, `reference`]: the count is exact there, and
    /// the determinant is one continuous function of ω (one discretisation for all trials).
    fn evaluator(&self, reference: f64) -> Result<Evaluator<'_>>;
    /// Relative tolerance to polish a root near ω to. The default is near machine precision; a
    /// system whose determinant is noisier than that (a fine finite-element mesh) sets a looser
    /// one, as polishing inside the noise only costs evaluations.
    fn tolerance(&self, _omega: f64) -> f64 {
        POLISH
    }
}

/// A natural frequency found by [`find`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Root {
    /// Angular frequency, rad/s.
    pub(crate) omega: f64,
    /// Number of coincident frequencies at this value (1 for a simple one).
    pub(crate) multiplicity: usize,
}

/// What a search spent, for tests and benchmarks.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub(crate) struct Work {
    /// Factorisations (evaluations of count and determinant) in all.
    pub(crate) evaluations: usize,
}

/// Relative width below which two frequencies count as one repeated frequency.
const REPEATED: f64 = 1e-13;
/// Relative tolerance of the polished root.
const POLISH: f64 = 4e-14;
/// How far above each hint (relative) it is probed.
const HINT_OFFSET: f64 = 1e-9;
/// Evaluations a search may spend besides those per mode (finding an upper bound, hints).
const BUDGET_BASE: usize = 400;
/// Evaluations a search may spend per frequency asked for. Isolating two frequencies a part in
/// 10¹³ apart by halving takes about 45; polishing about 10.
const BUDGET_PER_MODE: usize = 200;
/// Retries at a slightly moved trial frequency when an elimination breaks down on an exactly
/// singular intermediate pivot.
const NUDGES: usize = 3;

/// The frequencies with indices `skip + 1 ..= skip + wanted` (1-based, ascending), where the
/// first `skip` are known to lie at zero (rigid-body modes).
///
/// `guess` is any positive ω of the right order; the search widens it as needed. `hints` are
/// trial frequencies probed first: good ones (near each root: the previous solve of an edited
/// model, or another method's results) save most of the isolation; poor ones only cost a probe.
pub(crate) fn find(
    skip: usize,
    wanted: usize,
    guess: f64,
    hints: &[f64],
    system: &dyn Spectrum,
) -> Result<(Vec<Root>, Work)> {
    let target = skip + wanted;
    let mut search = Search {
        samples: vec![Sample { omega: 0.0, below: skip, value: None }],
        budget: BUDGET_BASE + BUDGET_PER_MODE * wanted,
        work: Work::default(),
        skip,
    };
    let mut hints: Vec<f64> = hints.iter().copied().filter(|h| h.is_finite() && *h > 0.0).collect();
    crate::sort::floats(&mut hints);

    // An upper end with at least `target` frequencies below it, which fixes the discretisation.
    let mut top = match hints.last() {
        Some(&h) => h * 1.05,
        None if guess.is_finite() && guess > 0.0 => guess,
        None => 1.0,
    };
    let evaluator = loop {
        let evaluator = system.evaluator(top)?;
        let e = search.evaluate(&evaluator, top)?;
        if e.below >= target {
            // Determinants taken on the discretisations of the lower trials are not comparable
            // with this one's; their counts are.
            for s in search.samples.iter_mut().filter(|s| s.omega != top) {
                s.value = None;
            }
            break evaluator;
        }
        top *= 4.0;
        if !top.is_finite() {
            return Err(no_convergence(target, "no upper bound on the frequencies was found"));
        }
    };
    for &h in hints.iter().filter(|h| **h < top) {
        // A hint may be a root itself (the same model solved again), and a count taken within
        // rounding of a root may be off by one; a part in 10⁹ above it is clear of that and
        // still leaves the root at the very end of its bracket.
        search.evaluate(&evaluator, h * (1.0 + HINT_OFFSET))?;
    }

    let mut roots: Vec<Root> = Vec::with_capacity(wanted);
    let mut k = skip + 1;
    while k <= target {
        let mut tries = 0usize;
        loop {
            let (lo, hi) = search.bracket(k);
            let (a, b) = (search.samples[lo], search.samples[hi]);
            if a.below + 1 == k && b.below == k && (a.omega > 0.0 || skip == 0) {
                let tolerance = system.tolerance(b.omega);
                let known: Vec<f64> = roots.iter().map(|r| r.omega).filter(|&w| w < a.omega).collect();
                let omega = search.polish(&evaluator, lo, hi, &known, tolerance)?;
                search.forget_tipped_counts(omega, k, tolerance);
                roots.push(Root { omega, multiplicity: 1 });
                k += 1;
                break;
            }
            if b.omega - a.omega <= REPEATED * b.omega && a.omega > 0.0 {
                // Several frequencies inside an interval at the limit of resolution.
                let multiplicity = b.below - a.below;
                let omega = 0.5 * (a.omega + b.omega);
                for _ in 0..multiplicity.min(target + 1 - k) {
                    roots.push(Root { omega, multiplicity });
                }
                k = b.below.saturating_add(1).max(k + 1);
                break;
            }
            let trial = next_trial(&a, &b, k, &roots, tries);
            tries += 1;
            search.evaluate(&evaluator, trial)?;
        }
    }
    roots.truncate(wanted);
    // Each root lies in a bracket above the one before, so the list is ascending whenever the
    // counts are consistent. When the model's stiffnesses span more than double precision
    // resolves, counts at tiny trial frequencies are round-off, and a list out of order is the
    // sign of it: refuse it rather than show frequencies that mean nothing.
    if let Some(i) = roots.windows(2).position(|w| w[1].omega < w[0].omega * (1.0 - 1e-9)) {
        return Err(no_convergence(
            skip + i + 2,
            "the stiffnesses differ by more than double precision resolves \
             (a segment, spring or support far softer or stiffer than the rest)",
        ));
    }
    // Two roots of a close pair may come out swapped by less than that, within the polish's
    // tolerance: list them ascending.
    let omegas: Vec<f64> = roots.iter().map(|r| r.omega).collect();
    let roots = crate::sort::order(&omegas).into_iter().map(|i| roots[i]).collect();
    Ok((roots, search.work))
}

/// A trial frequency with its count, and its determinant once the discretisation is fixed.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Sample {
    omega: f64,
    below: usize,
    /// (sign, ln|det|) on the search's one discretisation.
    value: Option<(f64, f64)>,
}

struct Search {
    /// Sorted by ω.
    samples: Vec<Sample>,
    budget: usize,
    work: Work,
    skip: usize,
}

impl Search {
    /// Evaluates at ω (nudging it off an exactly singular intermediate pivot), records the
    /// sample, and returns it.
    fn evaluate(&mut self, evaluator: &Evaluator<'_>, omega: f64) -> Result<Evaluation> {
        let mut trial = omega;
        for attempt in 0..=NUDGES {
            if self.work.evaluations >= self.budget {
                return Err(no_convergence(
                    self.samples
                        .iter()
                        .rposition(|s| s.below > self.skip)
                        .map_or(self.skip + 1, |i| self.samples[i].below),
                    &format!("the search used its budget of {} evaluations", self.budget),
                ));
            }
            self.work.evaluations += 1;
            let e = evaluator(trial);
            if e.sign.is_finite() && !e.log.is_nan() {
                let at = self.samples.partition_point(|s| s.omega < trial);
                self.samples
                    .insert(at, Sample { omega: trial, below: e.below, value: Some((e.sign, e.log)) });
                return Ok(e);
            }
            trial = omega * (1.0 + 1e-12 * (attempt + 1) as f64);
        }
        Err(no_convergence(self.skip + 1, "the elimination broke down at every trial frequency near a root"))
    }

    /// Indices of the tightest sampled interval with count(lo) < k ≤ count(hi).
    fn bracket(&self, k: usize) -> (usize, usize) {
        let hi = self.samples.iter().position(|s| s.below >= k).unwrap_or(self.samples.len() - 1);
        let lo = self.samples[..hi].iter().rposition(|s| s.below < k).unwrap_or(0);
        (lo, hi)
    }
}

/// Where to look next for the k-th frequency inside the sampled interval (a, b). Beam
/// frequencies are close to evenly spaced in √ω (λ grows by about π per mode), so the interval's
/// count says where in it the k-th lies; the step after the last found frequency is a better
/// guess still. Every other trial halves the interval, so that the search shrinks it at least
/// geometrically however wrong the guesses.
fn next_trial(a: &Sample, b: &Sample, k: usize, roots: &[Root], tries: usize) -> f64 {
    let width = b.omega - a.omega;
    let bisect = a.omega + 0.471_404_520_791_031_7 * width;
    if tries % 2 == 1 || b.below <= a.below {
        return bisect;
    }
    let (sa, sb) = (a.omega.sqrt(), b.omega.sqrt());
    let mut s = sa + (sb - sa) * ((k - a.below) as f64 - 0.5) / (b.below - a.below) as f64;
    if let [.., p, q] = roots {
        // Just past where the spacing of the last two frequencies puts the next one, so that the
        // trial most likely lands above it and closes the bracket.
        let step = q.omega.sqrt() - p.omega.sqrt();
        if step > 0.0 && a.omega >= q.omega {
            s = q.omega.sqrt() + 1.1 * step;
        }
    }
    let trial = s * s;
    if trial > a.omega + 0.02 * width && trial < b.omega - 0.02 * width {
        trial
    } else {
        bisect
    }
}

fn no_convergence(mode: usize, why: &str) -> Error {
    Error::new(ErrorKind::NoConvergence, format!("mode {mode}: {why}"))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A diagonal "system" with given eigenvalues.
    struct Diagonal {
        roots: &'static [f64],
    }

    impl Spectrum for Diagonal {
        fn evaluator(&self, _: f64) -> Result<Evaluator<'_>> {
            Ok(Box::new(move |omega| {
                let mut sign = 1.0;
                let mut log = 0.0;
                for v in self.roots.iter().map(|r| r - omega) {
                    sign *= v.signum();
                    log += v.abs().ln();
                }
                Evaluation { below: self.roots.iter().filter(|r| **r < omega).count(), sign, log }
            }))
        }
    }

    #[test]
    fn finds_every_root_once_including_repeated_and_close_ones() {
        static ROOTS: [f64; 6] = [1.0, 2.5, 2.5, 3.0, 3.0 + 1e-9, 7.0];
        let (found, _) = find(0, 6, 0.1, &[], &Diagonal { roots: &ROOTS }).unwrap();
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
        let (found, _) = find(2, 2, 100.0, &[], &Diagonal { roots: &ROOTS }).unwrap();
        assert!((found[0].omega - 4.0).abs() < 1e-12 && (found[1].omega - 9.0).abs() < 1e-12);
        // Hints, good or bad, change nothing but the work done.
        let (found, _) =
            find(2, 2, 100.0, &[3.9, 4.1, 50.0, -1.0, f64::NAN], &Diagonal { roots: &ROOTS }).unwrap();
        assert!((found[0].omega - 4.0).abs() < 1e-12 && (found[1].omega - 9.0).abs() < 1e-12);
    }

    /// A count that contradicts itself (as round-off can make one, far worse than it ever does)
    /// must end in an error within the budget, never in a loop.
    struct Liar;

    impl Spectrum for Liar {
        fn evaluator(&self, _: f64) -> Result<Evaluator<'_>> {
            Ok(Box::new(|omega| Evaluation {
                below: if omega > 1.0 { 5 } else { usize::from(((omega * 1e6) as u64).is_multiple_of(2)) },
                sign: 1.0,
                log: 0.0,
            }))
        }
    }

    #[test]
    fn a_contradictory_count_ends_within_the_budget() {
        match find(0, 3, 1.0, &[], &Liar) {
            Err(e) => assert_eq!(e.kind, ErrorKind::NoConvergence),
            Ok((_, work)) => assert!(work.evaluations <= BUDGET_BASE + 3 * BUDGET_PER_MODE, "{work:?}"),
        }
    }

    /// A count that puts every frequency below any trial above zero, as round-off made one on
    /// two masses a micrometre apart: the interval above the first frequency then shrinks
    /// towards zero with nothing to polish, and only the budget ends the search.
    struct AllAtZero;

    impl Spectrum for AllAtZero {
        fn evaluator(&self, _: f64) -> Result<Evaluator<'_>> {
            Ok(Box::new(|omega| Evaluation { below: if omega > 0.0 { 5 } else { 0 }, sign: 1.0, log: 0.0 }))
        }
    }

    #[test]
    fn a_count_with_every_root_at_zero_ends_in_an_error_within_the_budget() {
        for skip in [0, 1] {
            let e = find(skip, 2, 1.0, &[], &AllAtZero).expect_err("no frequency can be isolated");
            assert_eq!(e.kind, ErrorKind::NoConvergence, "{e}");
            assert!(e.message.contains("budget"), "{e}");
        }
    }
}
