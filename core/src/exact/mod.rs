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

pub use shape::ModeShape;

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
            .map(|s| Member::new(&model.segments()[s.segment], s.length, model.theory()))
            .collect();
        System { layout, members }
    }
}

/// The first natural modes from the exact method, rigid-body modes first.
pub fn modes(model: &Model, elastic: usize) -> Result<Vec<ExactMode>> {
    let rigid = model.rigid_body_modes();
    let omegas = roots_of(model, elastic)?;
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
pub fn frequencies(model: &Model, elastic: usize) -> Result<Vec<f64>> {
    Ok(roots_of(model, elastic)?.iter().map(|r| r.omega).collect())
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
}

/// The exact method's spectrum: the station sweep on the natural stations (ends, segment
/// joints, attachments), each member cut into pieces for the reference frequency.
struct Natural(System);

impl roots::Spectrum for Natural {
    fn evaluator(&self, reference: f64) -> Result<roots::Evaluator<'_>> {
        let pieces = sweep::pieces(&self.0, reference)?;
        Ok(Box::new(move |omega| sweep::evaluate(&self.0, &pieces, omega)))
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
