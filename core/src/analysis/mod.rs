//! The three methods run side by side on one validated model, and the engineering judgements
//! made on their results: the other theory's frequencies where shear matters
//! ([`comparison`]), and the separation of each mode from the excitations ([`margins`]).

mod buckling;
pub mod comparison;
mod fundamental;
pub mod margins;
mod warnings;

pub use comparison::{other_theory, Comparison};
pub use margins::{Excitation, Separation};
pub use warnings::{Warning, WarningCode};

use warnings::{merged_points, Compared};

use crate::bounds::Equivalent;
use crate::error::{ErrorKind, Result};
use crate::exact::{self, ModeShape};
use crate::fe::{self, Mesh};
use crate::model::Model;

pub use crate::model::Options;
pub use crate::schema::MAX_MODES;

/// One mode from all methods.
#[derive(Clone, Debug, PartialEq)]
pub struct ModeResult {
    /// 1-based mode number, rigid-body modes first.
    pub number: usize,
    /// Exact angular frequency, rad/s.
    pub omega: f64,
    /// Number of coincident frequencies at this value.
    pub multiplicity: usize,
    /// Whether the mode is a rigid-body mode (0 Hz).
    pub rigid_body: bool,
    /// Finite-element angular frequency, rad/s: `None` for rigid-body modes, where the check
    /// could not be computed, and from a frequency the check lists twice on (a mode it lost to
    /// rounding; a note says so).
    pub fe_omega: Option<f64>,
    /// The finite-element check's own estimate of its relative error (mesh and round-off).
    pub fe_error: Option<f64>,
    /// The exact frequency's estimated relative error: how far Rayleigh's quotient of its mode
    /// shape lies from it (`None` for rigid-body modes).
    pub accuracy: Option<f64>,
    /// The exact mode shape.
    pub shape: ModeShape,
}

impl ModeResult {
    /// Exact frequency, Hz.
    pub fn frequency_hz(&self) -> f64 {
        self.omega / std::f64::consts::TAU
    }

    /// Relative difference of the finite-element frequency to the exact one.
    pub fn fe_difference(&self) -> Option<f64> {
        self.fe_omega.map(|f| (f - self.omega) / self.omega)
    }
}

/// The fundamental (first elastic) mode by the approximate methods.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Fundamental {
    /// Exact, rad/s.
    pub omega: f64,
    /// Rayleigh's quotient with the static deflection curve (upper bound), rad/s.
    pub rayleigh: Option<f64>,
    /// Dunkerley's sum (lower bound), rad/s.
    pub dunkerley: Option<f64>,
    /// Equivalent single-degree-of-freedom system.
    pub equivalent: Option<Equivalent>,
}

/// Everything the three methods found.
#[derive(Clone, Debug, PartialEq)]
pub struct Analysis {
    /// Rigid-body modes (at 0 Hz, listed first in `modes`).
    pub rigid_body_modes: usize,
    /// Modes, ascending.
    pub modes: Vec<ModeResult>,
    /// Mode 1 by the approximate methods (`None` for an unrestrained model).
    pub fundamental: Option<Fundamental>,
    /// Finite elements used.
    pub fe_elements: usize,
    /// Finite-element unknowns.
    pub fe_dofs: usize,
    /// The lowest multiple of the axial forces at which the beam buckles (`None` without
    /// compression).
    pub critical_load_factor: Option<f64>,
    /// Notes for the user.
    pub warnings: Vec<Warning>,
}

/// The angular frequencies (rad/s) of the modes [`analyse`] reports, rigid-body modes (0) first,
/// from the exact method alone: no mode shapes, finite elements or bounds. They are the same
/// numbers, bit for bit, as the same root finder gives both.
pub fn exact_omegas(model: &Model, options: &Options) -> Result<Vec<f64>> {
    let options = options.checked(model)?;
    let mut omegas = vec![0.0; model.rigid_body_modes()];
    omegas.extend(exact::frequencies(model, options.modes)?);
    Ok(omegas)
}

/// The force and the moment an attachment exerts on the beam in a mode (its inertia, or its
/// spring's force, from the mode's own deflection, rotation and sprung-mass amplitude).
fn point_loads(model: &Model, index: usize, shape: &ModeShape, omega: f64) -> (f64, f64) {
    use crate::model::Attachment;
    let w2 = omega * omega;
    let a = &model.attachments()[index];
    let (w, theta) = shape.at(a.position());
    match *a {
        Attachment::Mass { mass, rotary_inertia, .. } => (mass * w2 * w, rotary_inertia * w2 * theta),
        Attachment::Spring { stiffness, .. } if stiffness.is_finite() => (stiffness * w, 0.0),
        Attachment::RotationalSpring { stiffness, .. } if stiffness.is_finite() => (0.0, stiffness * theta),
        Attachment::SprungMass { stiffness, .. } => {
            let d = shape.sprung.iter().find(|(i, _)| *i == index).map_or(0.0, |(_, d)| *d);
            (stiffness * (w - d), 0.0)
        }
        _ => (0.0, 0.0),
    }
}

/// An attachment inside a finite element whose estimated error in some mode exceeds this gets a
/// node of its own: about the mesh's own error at its coarsest (see `fe::WAVE_PER_ELEMENT`).
const INTERIOR_LIMIT: f64 = 1e-5;
/// Most times the check is solved again for such attachments.
const REMESHES: usize = 3;

/// A finite-element frequency whose estimated round-off reaches this fraction of itself, and
/// which differs from the exact one by more than its mesh explains, is not resolved at all: the
/// check's count cannot tell that mode from zero, so it may have lost it and shifted every later
/// mode of its list (see `fe_unresolved`).
const UNRESOLVED: f64 = 0.5;

/// An exact frequency whose estimated relative error exceeds this is flagged.
pub const TRUSTED: f64 = 1e-9;

/// Runs the exact method, finite elements and the bounds.
pub fn analyse(model: &Model, options: &Options) -> Result<Analysis> {
    analyse_with_hints(model, options, &[])
}

/// As [`analyse`], with the exact search started from `hints` (rad/s; see
/// [`exact::modes_with_hints`]): the frequencies of the case before an edit.
pub fn analyse_with_hints(model: &Model, options: &Options, hints: &[f64]) -> Result<Analysis> {
    let options = &options.checked(model)?;
    let mut warnings = Vec::new();
    let critical_load_factor = buckling::factor(model, &mut warnings)?;
    let exact_modes = exact::modes_with_hints(model, options.modes, hints)?;
    let rigid = model.rigid_body_modes();
    let last = exact_modes.last().map_or(1.0, |m| m.omega);
    let first = exact_modes.iter().find(|m| !m.rigid_body).map_or(last, |m| m.omega);
    let mesh = match options.elements {
        Some(n) => Mesh::Total(n),
        None => Mesh::Between { lowest: first, highest: last },
    };
    let exact_elastic: Vec<f64> = exact_modes.iter().filter(|m| !m.rigid_body).map(|m| m.omega).collect();
    // The check is a second opinion: where its matrices' rounding swamps the modes sought (a
    // bar far stiffer than the springs that hold it), its root search gives up within its budget
    // and the exact results are reported without it, with a note, rather than not at all.
    let (mut fe, fe_failed) = match fe::frequencies_near(model, options.modes, mesh, &exact_elastic) {
        Ok(fe) => (fe, false),
        Err(e) if e.kind == ErrorKind::NoConvergence => (fe::unsolved(model, mesh)?, true),
        Err(e) => return Err(e),
    };
    // An attachment acting inside an element adds an error the mesh does not show (see
    // `fe::Interior::error`); where that error is large the check is solved again with those
    // attachments on nodes of their own, accepting the round-off of the shorter elements, which
    // the check then reports. New nodes can push another attachment inside an element, so this
    // is repeated a few times, keeping every node given before.
    let mut nodes: Vec<f64> = Vec::new();
    for _ in 0..REMESHES {
        let before = nodes.len();
        nodes.extend(fe.interior.iter().map(|p| p.position).filter(|x| {
            fe.interior.iter().filter(|p| p.position == *x).any(|p| {
                exact_modes.iter().filter(|m| !m.rigid_body).any(|m| {
                    let (force, moment) = point_loads(model, p.attachment, &m.shape, m.omega);
                    p.error(force, moment, m.omega, m.shape.generalized_mass) > INTERIOR_LIMIT
                })
            })
        }));
        if nodes.len() == before {
            break;
        }
        match fe::frequencies_with_nodes(model, options.modes, mesh, &exact_elastic, &nodes) {
            Ok(finer) => fe = finer,
            // The check before stands, with its estimate of what the attachments inside
            // elements cost it.
            Err(e) if e.kind == ErrorKind::NoConvergence => break,
            Err(e) => return Err(e),
        }
    }
    let mut modes = Vec::with_capacity(exact_modes.len());
    let mut compared = Vec::with_capacity(exact_modes.len());
    for (i, m) in exact_modes.into_iter().enumerate() {
        let elastic = (!m.rigid_body).then(|| i - rigid);
        let fe_omega = elastic.and_then(|j| fe.omegas.get(j).copied());
        // The check's round-off falls as 1/ω² (`fe::FeSolution::round_off`); it is taken at the
        // lower of its frequency and the exact one, since a check that lost this mode to
        // rounding lists a higher frequency here, whose estimate would flatter it.
        let round_off = |j: usize| {
            let (r, f) = (*fe.round_off.get(j)?, fe_omega?);
            Some(if m.omega > 0.0 && m.omega < f { r * (f / m.omega).powi(2) } else { r })
        };
        // Rayleigh's quotient of the shape, and its bending energy over ω²T, from one pass.
        let (quotient, bending) = if m.rigid_body { (0.0, 1.0) } else { m.shape.energies(model) };
        let fe_error = elastic.and_then(|j| {
            // What the attachments inside elements add, from this mode's deflection there.
            let interior: f64 = fe
                .interior
                .iter()
                .map(|p| {
                    let (force, moment) = point_loads(model, p.attachment, &m.shape, m.omega);
                    p.error(force, moment, m.omega, m.shape.generalized_mass)
                })
                .filter(|e| e.is_finite())
                .sum();
            // The mesh errs in the bending energy; compression cancels part of that energy, so
            // the error is scaled by bending energy over ω²T (`ModeShape::bending_to_kinetic`).
            let compressed = (0..model.segments().len()).any(|s| model.axial_force(s) < 0.0);
            let ratio = if compressed { bending } else { 1.0 };
            let amplified = if ratio.is_finite() { ratio.max(1.0) } else { 1.0 };
            Some(fe.mesh_error.get(j)? * amplified + round_off(j)? + interior)
        });
        let accuracy = (!m.rigid_body).then(|| {
            let quotient = quotient.sqrt();
            let error = ((quotient - m.omega) / m.omega).abs();
            if error.is_finite() {
                error
            } else {
                1.0
            }
        });
        if let (Some(j), Some(f), Some(error), Some(accuracy)) = (elastic, fe_omega, fe_error, accuracy) {
            compared.push(Compared {
                number: i + 1,
                exact: m.omega,
                multiplicity: m.multiplicity,
                fe: f,
                error,
                round_off: round_off(j).unwrap_or(0.0),
                accuracy,
            });
        }
        modes.push(ModeResult {
            number: i + 1,
            omega: m.omega,
            multiplicity: m.multiplicity,
            rigid_body: m.rigid_body,
            fe_omega,
            fe_error,
            accuracy,
            shape: m.shape,
        });
    }
    if let Some(close) = merged_points(model) {
        warnings.push(close);
    }
    // The least accurate mode is the one named: the first over the line may be the least of them.
    let worst = modes
        .iter()
        .filter(|m| m.accuracy.is_some_and(|a| a > TRUSTED))
        .max_by(|a, b| a.accuracy.unwrap_or(0.0).total_cmp(&b.accuracy.unwrap_or(0.0)));
    if let Some(m) = worst {
        warnings.push(Warning {
            code: WarningCode::Accuracy,
            message: format!(
                "Mode {} is good to only about {:.0e} (Rayleigh's quotient of its shape disagrees by that much): \
                 the inputs span so many orders of magnitude that rounding shows. Check the units.",
                m.number,
                m.accuracy.unwrap_or(1.0)
            ),
        });
    }
    if rigid > 0 {
        warnings.push(Warning {
            code: WarningCode::RigidBody,
            message: format!(
                "The beam is not held against {}: {rigid} rigid-body mode{} at 0 Hz. Rayleigh and Dunkerley \
                 estimates need a restrained beam and are not shown.",
                if rigid == 2 { "translation or rotation" } else { "moving as a rigid body" },
                if rigid == 1 { "" } else { "s" }
            ),
        });
    }
    // A mode the check cannot resolve at all leaves its whole list in doubt: its count may have
    // missed that mode and shifted every later one, with no copy to show it. The round-off
    // estimate is a bound, often far above the check's real error, so a check that still agrees
    // with the exact value within its mesh's error is kept; only one that disagrees by more
    // than the mesh explains, where nothing but that rounding could account for it, is dropped.
    let unresolved = |c: &&Compared| {
        let mesh = (c.error - c.round_off).max(0.0);
        c.round_off >= UNRESOLVED && c.difference().abs() > 10.0 * (mesh + c.accuracy) + 1e-9
    };
    if let Some(c) = compared.iter().find(unresolved) {
        warnings.push(warnings::fe_unresolved(model, c.number, c.round_off));
        for m in modes.iter_mut() {
            m.fe_omega = None;
            m.fe_error = None;
        }
        compared.clear();
    }
    let disagreement = warnings::fe_comparison(model, &compared);
    let disagrees = disagreement.is_some();
    if let Some((_, Some(from))) = &disagreement {
        // A frequency the check lists twice is a mode it lost to rounding: its column from the
        // copy on is blank rather than a list the note says not to rely on.
        for m in modes.iter_mut().filter(|m| m.number >= *from) {
            m.fe_omega = None;
            m.fe_error = None;
        }
    }
    warnings.extend(disagreement.map(|(w, _)| w));
    if fe_failed {
        warnings.push(warnings::fe_unsolved(model));
    } else if compared.is_empty() {
        // Nothing was compared: no elastic mode, or the note above on a mode it cannot resolve.
    } else if disagrees {
        // The note above says which column is at fault.
    } else if let Some(worst) = modes.iter().find(|m| m.fe_difference().is_some_and(|d| d.abs() > 1e-3)) {
        let compared = compared.iter().find(|c| c.number == worst.number);
        warnings.push(warnings::fe_unconverged(model, worst.number, compared, options.elements));
    }
    if modes.iter().any(|m| m.multiplicity > 1 && !m.rigid_body) {
        warnings.push(Warning {
            code: WarningCode::Repeated,
            message:
                "Some frequencies are repeated; their mode shapes are one mass-orthogonal choice among many."
                    .to_string(),
        });
    }
    let fundamental = fundamental::of(model, options, &modes, rigid, &mut warnings)?;
    Ok(Analysis {
        rigid_body_modes: rigid,
        modes,
        fundamental,
        fe_elements: fe.elements,
        fe_dofs: fe.dofs,
        critical_load_factor,
        warnings,
    })
}
