//! The exact method: dynamic stiffness, the Wittrick–Williams count, and mode shapes.
//!
//! The number of natural frequencies below ω is J(ω) = J₀(ω) + s{K(ω)}, where s{K} is the number
//! of negative pivots of the exact dynamic stiffness K(ω) and J₀ counts the members' own
//! clamped–clamped frequencies below ω (Wittrick & Williams, Q. J. Mech. Appl. Math. 24, 1971).
//! The members are cut into pieces far below their own clamped–clamped frequencies, so J₀ = 0,
//! and K(ω) is eliminated station by station with transfer matrices (`sweep.rs`), which stays
//! accurate however closely stations crowd. The count isolates each frequency and Brent's method
//! on the determinant from the same elimination polishes it (`roots.rs`).

#[cfg(test)]
mod assemble;
mod shape;
mod solve;
pub(crate) mod statics;
mod sweep;

pub use shape::{Gradient, ModeShape, SegmentGradient};

use crate::error::Result;
use crate::layout::Layout;
use crate::member::Member;
use crate::model::Model;
use crate::roots;

/// One natural mode from the exact method.
#[derive(Clone, Debug, PartialEq)]
pub struct ExactMode {
    /// Angular frequency ω, rad/s (zero for a rigid-body mode).
    pub omega: f64,
    /// Number of coincident frequencies at this value (1 for a simple one).
    pub multiplicity: usize,
    /// Whether this is a rigid-body mode (ω = 0).
    pub rigid_body: bool,
    /// The mode shape.
    pub shape: ModeShape,
}

/// A layout with one member per span, ready to assemble at any ω.
#[derive(Clone, Debug)]
pub(crate) struct System {
    pub(crate) layout: Layout,
    pub(crate) members: Vec<Member>,
}

impl System {
    /// The members of `layout`, cut from `model`'s segments.
    pub(crate) fn new(model: &Model, layout: Layout) -> System {
        let members = layout
            .spans
            .iter()
            .map(|s| {
                Member::new(
                    &model.segments()[s.segment],
                    s.length,
                    model.theory(),
                    model.axial_force(s.segment),
                )
            })
            .collect();
        System { layout, members }
    }
}

/// The first natural modes from the exact method, rigid-body modes first.
pub fn modes(model: &Model, elastic: usize) -> Result<Vec<ExactMode>> {
    modes_with_hints(model, elastic, &[])
}

/// As [`modes`], with trial frequencies (rad/s) to probe first: the frequencies of the model
/// before an edit make most of the search unnecessary, and poor hints only cost a probe each.
/// The count still certifies every frequency, so the results do not depend on the hints beyond
/// the last digits of the polish.
pub fn modes_with_hints(model: &Model, elastic: usize, hints: &[f64]) -> Result<Vec<ExactMode>> {
    let rigid = model.rigid_body_modes();
    let (omegas, _) = search(model, elastic, hints)?;
    let mut out = Vec::with_capacity(rigid + omegas.len());
    let mut all: Vec<(f64, usize)> = vec![(0.0, rigid); rigid];
    all.extend(omegas.iter().map(|r| (r.omega, r.multiplicity)));
    let mut i = 0;
    while i < all.len() {
        let (omega, multiplicity) = all[i];
        let group = multiplicity.max(1).min(all.len() - i);
        let shapes = shape::shapes(model, omega, group)?;
        for s in shapes {
            out.push(ExactMode { omega, multiplicity, rigid_body: omega == 0.0, shape: s });
        }
        i += group;
    }
    Ok(out)
}

/// The first `elastic` natural angular frequencies (rad/s) above the rigid-body modes, ascending,
/// without mode shapes. A repeated frequency appears once per multiplicity.
#[inline(never)]
pub fn frequencies(model: &Model, elastic: usize) -> Result<Vec<f64>> {
    Ok(roots_of(model, elastic)?.iter().map(|r| r.omega).collect())
}

/// As [`frequencies`], probing `hints` first: frequencies near the ones sought (another theory's
/// or an earlier solve's) save most of the work of isolating them; poor ones cost a probe each.
#[inline(never)]
pub fn frequencies_with_hints(model: &Model, elastic: usize, hints: &[f64]) -> Result<Vec<f64>> {
    Ok(search(model, elastic, hints)?.0.iter().map(|r| r.omega).collect())
}

fn roots_of(model: &Model, elastic: usize) -> Result<Vec<roots::Root>> {
    Ok(search(model, elastic, &[])?.0)
}

/// The root search with its work, for the tests that hold the factorisations per mode down.
pub(crate) fn search(
    model: &Model,
    elastic: usize,
    hints: &[f64],
) -> Result<(Vec<roots::Root>, roots::Work)> {
    let spectrum = Natural(System::new(model, Layout::new(model, &|_| 1)?));
    let rigid = model.rigid_body_modes();
    roots::find(rigid, elastic, guess(model, rigid + elastic), hints, &spectrum)
        .map_err(|e| explain(model, e))
}

/// Adds the likeliest cause to a search that did not converge: two points of the beam so close
/// that the model is nearly degenerate there.
fn explain(model: &Model, e: crate::error::Error) -> crate::error::Error {
    if e.kind != crate::error::ErrorKind::NoConvergence {
        return e;
    }
    let positions: Vec<f64> = model.attachments().iter().map(|a| a.position()).collect();
    let at: Vec<(f64, usize)> =
        crate::sort::order(&positions).into_iter().map(|i| (positions[i], i)).collect();
    let closest = at
        .windows(2)
        .filter(|w| w[1].0 > w[0].0)
        .min_by(|a, b| (a[1].0 - a[0].0).total_cmp(&(b[1].0 - b[0].0)));
    let hint = match closest {
        Some(w) if w[1].0 - w[0].0 < 1e-6 * model.length() => format!(
            "attachments {} and {} are {:.1e} m apart; combine them or check the positions",
            w[0].1.min(w[1].1) + 1,
            w[0].1.max(w[1].1) + 1,
            w[1].0 - w[0].0
        ),
        _ => "please report this model".to_string(),
    };
    let message = format!("{}; {hint}", e.message);
    crate::error::Error { message, ..e }
}

/// How many pieces the sweep cuts each member of `system` into up to `reference` (for the
/// buckling search, which sweeps at ω = 0 with its own members).
pub(crate) fn sweep_pieces(system: &System, reference: f64) -> Result<Vec<usize>> {
    sweep::pieces(system, reference, crate::member::SWEEP_LAMBDA)
}

/// The station sweep's count and determinant at ω.
pub(crate) fn sweep_evaluate(system: &System, pieces: &[usize], omega: f64) -> roots::Evaluation {
    sweep::evaluate(system, pieces, omega)
}

/// The exact method's spectrum: the station sweep on the natural stations (ends, segment
/// joints, attachments), each member cut into pieces for the reference frequency.
struct Natural(System);

impl roots::Spectrum for Natural {
    fn evaluator(&self, reference: f64) -> Result<roots::Evaluator<'_>> {
        let pieces = sweep::pieces(&self.0, reference, crate::member::COUNT_LAMBDA)?;
        Ok(Box::new(move |omega| checked(&self.0, &pieces, omega)))
    }
}

/// The sweep at ω, its count held to the determinant's sign.
///
/// The count comes from each station's pivot block and the determinant from a telescoped
/// product, so rounding can tip the one without the other: where some station's pivot is within
/// rounding of zero (the part to its left at one of its own frequencies), its sign is noise, and
/// the count can come out one high or low far from any natural frequency of the beam (a plain
/// uniform bar cut into 78 pieces listed a twentieth frequency 1 % above the nineteenth). In
/// exact arithmetic the determinant's sign is (−1)^count, so a disagreement shows the tip; the
/// count is then taken again on pieces cut one finer, whose stations lie elsewhere, with the
/// determinant kept from the first sweep so that the search's function stays one continuous
/// function of ω. If the two still disagree, ω lies within rounding of a natural frequency, where
/// both are noise and the search's own handling of tipped counts applies.
fn checked(system: &System, pieces: &[usize], omega: f64) -> roots::Evaluation {
    let first = sweep::evaluate(system, pieces, omega);
    if !first.sign.is_finite() || parity(first.below) == first.sign {
        return first;
    }
    let finer: Vec<usize> = pieces.iter().map(|n| n + 1).collect();
    let again = sweep::evaluate(system, &finer, omega);
    if again.sign.is_finite() && parity(again.below) == first.sign {
        roots::Evaluation { below: again.below, ..first }
    } else {
        first
    }
}

/// (−1)^n.
fn parity(n: usize) -> f64 {
    if n.is_multiple_of(2) {
        1.0
    } else {
        -1.0
    }
}

/// A rough first trial ω: the `n`-th pinned–pinned frequency of the whole length with the
/// most flexible, heaviest segment's properties. The search widens it as needed.
pub(crate) fn guess(model: &Model, n: usize) -> f64 {
    let length = model.length();
    let ratio = model
        .segments()
        .iter()
        .map(|s| s.flexural_rigidity / s.mass_per_length)
        .fold(f64::INFINITY, f64::min);
    let k = n.max(1) as f64 * std::f64::consts::PI / length;
    // The odd factor keeps the first trial off the exact frequencies of regular beams.
    k * k * ratio.sqrt() * 0.213_7
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{Attachment, End, ModelParts, Segment, Theory};

    use crate::model::budget_beam as budget;

    #[test]
    fn the_search_spends_few_factorisations_per_mode() {
        // A regression guard on the work, counted, not timed: each evaluation is one sweep.
        let (_, work) = search(&budget(), 10, &[]).unwrap();
        // Measured: 65 (72 before the polish ended on its own steps' prediction).
        let per_mode = work.evaluations as f64 / 10.0;
        assert!(per_mode <= 7.0, "{per_mode} evaluations per mode");
    }

    #[test]
    fn an_edit_solved_from_the_frequencies_before_it_costs_a_fraction() {
        // The budget beam with its third mass 2 % heavier, searched cold and from the budget
        // beam's own frequencies: the same frequencies, for far fewer factorisations.
        let (before, _) = search(&budget(), 10, &[]).unwrap();
        let hints: Vec<f64> = before.iter().map(|r| r.omega).collect();
        let mut parts = budget().parts().clone();
        parts.attachments[2] = Attachment::Mass { position: 1.3, mass: 30.6, rotary_inertia: 0.0 };
        let edited = Model::new(parts).unwrap();
        let (cold, cold_work) = search(&edited, 10, &[]).unwrap();
        let (warm, warm_work) = search(&edited, 10, &hints).unwrap();
        for (c, w) in cold.iter().zip(&warm) {
            assert!((c.omega - w.omega).abs() <= 1e-13 * c.omega, "{} vs {}", c.omega, w.omega);
        }
        // Measured: 43 warm against 66 cold. The hints isolate every root at once; what remains
        // is the polish, which a hint cannot shorten much because the edit moved every root.
        assert!(
            warm_work.evaluations * 4 <= cold_work.evaluations * 3,
            "{} warm vs {} cold",
            warm_work.evaluations,
            cold_work.evaluations
        );
        // The same model again: every hint is a root.
        let (again, again_work) = search(&budget(), 10, &hints).unwrap();
        assert_eq!(again.len(), 10);
        for (a, h) in again.iter().zip(&hints) {
            assert!((a.omega - h).abs() <= 1e-13 * h && a.multiplicity == 1, "{a:?} vs {h}");
        }
        assert!(again_work.evaluations < warm_work.evaluations, "{} again", again_work.evaluations);
    }

    #[test]
    fn a_count_tipped_exactly_at_a_root_adds_no_phantom_frequency() {
        // A guided–free uniform beam: its elastic frequencies solve sin λ cosh λ + cos λ sinh λ
        // = 0 with ω = λ²·√(EI/m)/L² (the sliding–free case of the uniform-beam frequency
        // equations, e.g. Blevins, *Formulas for Natural Frequency and Mode Shape*, table 8-1,
        // from memory; solved here by bisection). On these dimensions a polishing step once
        // landed on the second root itself, where the count came out one too many, and a
        // phantom repeated frequency appeared beside it.
        let (length, ei, m) = (0.6940975879257381, 1.5583686139938904, 0.5894902331427984);
        let model = Model::new(ModelParts {
            segments: vec![Segment::slender(length, ei, m)],
            left: End::Guided,
            right: End::Free,
            attachments: vec![],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let (roots, _) = search(&model, 6, &[]).unwrap();
        let equation = |l: f64| l.sin() * l.cosh() + l.cos() * l.sinh();
        for (n, root) in roots.iter().enumerate() {
            let centre = (n as f64 + 0.75) * std::f64::consts::PI;
            let (mut lo, mut hi) = (centre - 0.3, centre + 0.3);
            for _ in 0..200 {
                let mid = 0.5 * (lo + hi);
                if (equation(mid) > 0.0) == (equation(lo) > 0.0) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            let lambda = 0.5 * (lo + hi);
            let want = lambda * lambda * (ei / m).sqrt() / (length * length);
            assert_eq!(root.multiplicity, 1, "mode {}: {roots:?}", n + 2);
            assert!((root.omega - want).abs() <= 1e-11 * want, "mode {}: {} vs {want}", n + 2, root.omega);
        }
    }

    #[test]
    fn attachments_a_micrometre_apart_solve_like_any_others() {
        // Two 0.4 masses on a unit pinned beam 1 µm apart, and a short stiff segment with a heavy
        // mass and a soft spring: both once took the search into an endless loop.
        let pair = Model::new(ModelParts {
            segments: vec![Segment::slender(1.0, 1.0, 1.0)],
            left: End::Pinned,
            right: End::Pinned,
            attachments: vec![
                Attachment::Mass { position: 0.3, mass: 0.4, rotary_inertia: 0.0 },
                Attachment::Mass { position: 0.300001, mass: 0.4, rotary_inertia: 0.0 },
            ],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let (roots, work) = search(&pair, 3, &[]).unwrap();
        assert!(work.evaluations <= 60, "{} evaluations", work.evaluations);
        // The merged 0.8 mass gives 1.0839061 Hz (ω = 6.810379…); 1 µm apart is within 1e-6 of it.
        assert!((roots[0].omega / std::f64::consts::TAU - 1.0839061).abs() < 2e-6);
        let stiff = Model::new(ModelParts {
            segments: vec![Segment::slender(1.0, 1.0e3, 2.0), Segment::slender(1e-4, 1.0e12, 2.0)],
            left: End::Clamped,
            right: End::Free,
            attachments: vec![
                Attachment::Mass { position: 1.0 + 5e-5, mass: 500.0, rotary_inertia: 0.0 },
                Attachment::Spring { position: 1.0001, stiffness: 12.5 },
            ],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let (_, work) = search(&stiff, 6, &[]).unwrap();
        assert!(work.evaluations <= 200, "{} evaluations", work.evaluations);
    }
}
