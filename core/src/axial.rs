//! Axial force in the beam: a force in each segment (tension positive), checked against what the
//! engine can compute, and the critical load factor of the forces given.
//!
//! The forces enter the exact method through the beam-column members of `member::column`, the
//! finite elements through their geometric stiffness, and Rayleigh's quotient through the work
//! of the force on the slope. The critical load factor is the lowest multiple μ of the given
//! forces at which the beam buckles: the count of natural frequencies below ω = 0⁺ is the number
//! of buckling modes at a load multiple, and it steps at each critical μ (the static stiffness
//! K + μ·K_G loses one positive eigenvalue there), so the root finder of the frequencies finds μ
//! the same way.

use crate::error::{Error, ErrorKind, Result};
use crate::exact::{self, System};
use crate::layout::Layout;
use crate::model::{Model, Theory};
use crate::path::FieldPath;
use crate::roots::{self, Evaluation, Evaluator, Spectrum};

/// Largest axial force accepted, N (the schema's).
const LIMIT: f64 = crate::schema::AXIAL_FORCE_LIMIT;

/// The path of a segment's axial force.
fn force_path(segment: usize) -> FieldPath {
    FieldPath::item("segments", segment).key(crate::schema::AXIAL_FORCE.name)
}

impl Model {
    /// The same model with an axial force in each segment (N, tension positive; one per
    /// segment, or none). Refused with the Timoshenko theory, and on a beam free to move as a
    /// rigid body, which nothing would hold against the force.
    pub fn with_axial_forces(mut self, forces: Vec<f64>) -> Result<Model> {
        if forces.iter().all(|f| *f == 0.0) {
            self.axial = Vec::new();
            return Ok(self);
        }
        if forces.len() != self.segments().len() {
            return Err(Error::new(
                ErrorKind::Model,
                format!("{} axial forces for {} segments", forces.len(), self.segments().len()),
            ));
        }
        for (i, f) in forces.iter().enumerate() {
            if !f.is_finite() || f.abs() > LIMIT {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    format!("an axial force must lie between −{LIMIT:e} and {LIMIT:e} N; check the unit"),
                )
                .at(force_path(i))
                .with_number(*f));
            }
        }
        let at = forces.iter().position(|f| *f != 0.0).unwrap_or(0);
        if self.theory() == Theory::Timoshenko {
            return Err(Error::new(
                ErrorKind::Conflict,
                "an axial force is computed with the slender-beam theory only (with shear deformation, the two \
                 usual ways of letting the force act disagree for a stocky member in compression); choose the \
                 Euler–Bernoulli theory",
            )
            .at(force_path(at)));
        }
        if self.rigid_body_modes() > 0 {
            return Err(Error::new(
                ErrorKind::Model,
                "an axial force needs a beam held against moving as a rigid body (ends or supports that react it)",
            )
            .at(force_path(at)));
        }
        self.axial = forces;
        Ok(self)
    }

    /// The axial force in a segment, N, tension positive.
    pub fn axial_force(&self, segment: usize) -> f64 {
        self.axial.get(segment).copied().unwrap_or(0.0)
    }

    /// Whether any segment carries an axial force.
    pub fn has_axial_force(&self) -> bool {
        !self.axial.is_empty()
    }
}

/// Largest Σ L·√(|P|/EI) over the segments that is computed. The exact method cuts a member into
/// pieces with |P|·h²/EI ≤ 1 and the elements are as short, so this sum is about how many of
/// each the beam needs: at three thousand a model of twenty modes took 3 s natively (10 s in the
/// fuzz run's unoptimised build on a busy machine), past the browser's budget. A beam this taut
/// is a string to within a few parts in a thousand (the bending stiffness raises its
/// frequencies by about 2/(L·√(P/EI)) with clamped ends, through the boundary layers there, and
/// less with pinned ones — the stiff string's asymptotics, from memory), which the message says.
const TAUT: f64 = 1e3;

/// Refuses axial forces so large beside the bending stiffness that the beam is a string and
/// computing it as a beam would take too long: see `TAUT`. The message is on the segment that
/// contributes most.
pub fn check_taut(model: &Model) -> Result<()> {
    let parts: Vec<f64> = model
        .segments()
        .iter()
        .enumerate()
        .map(|(i, s)| s.length * (model.axial_force(i).abs() / s.flexural_rigidity).sqrt())
        .collect();
    let total: f64 = parts.iter().sum();
    if total <= TAUT {
        return Ok(());
    }
    let worst = (0..parts.len()).max_by(|a, b| parts[*a].total_cmp(&parts[*b])).unwrap_or(0);
    Err(Error::new(
        ErrorKind::Model,
        format!(
            "the axial force is too large beside the bending stiffness to compute (L·√(|P|/EI) = {} over \
             the beam, at most {}): check the force's unit; a member this taut is a string, whose \
             frequencies are (n/2L)·√(P/m)",
            crate::error::number(total),
            crate::error::number(TAUT)
        ),
    )
    .at(force_path(worst)))
}

/// The critical load factor of the model's axial forces: the lowest multiple of them at which
/// the beam buckles. `None` when there are no forces or they cannot buckle it (tension only).
pub fn critical_load_factor(model: &Model) -> Result<Option<f64>> {
    if !model.has_axial_force() || model.axial.iter().all(|f| *f >= 0.0) {
        return Ok(None);
    }
    let layout = Layout::new(model, &|_| 1)?;
    let spectrum = Buckling { model, layout };
    match roots::find(0, 1, 1.0, &[], &spectrum) {
        Ok((roots, _)) => Ok(roots.first().map(|r| r.omega)),
        // The count never stepped: mixed forces whose compressions the tensions outweigh.
        Err(e) if e.kind == ErrorKind::NoConvergence && e.message.contains("no upper bound") => Ok(None),
        Err(e) => Err(e),
    }
}

/// The buckling problem as a spectrum in the load factor μ: the static count and determinant of
/// the beam with its axial forces times μ.
struct Buckling<'a> {
    model: &'a Model,
    layout: Layout,
}

impl Buckling<'_> {
    fn system(&self, factor: f64) -> Result<System> {
        let forces = self.model.axial.iter().map(|f| f * factor).collect();
        let scaled = self.model.clone().with_axial_forces(forces)?;
        Ok(System::new(&scaled, self.layout.clone()))
    }
}

impl Spectrum for Buckling<'_> {
    fn evaluator(&self, reference: f64) -> Result<Evaluator<'_>> {
        // Pieces cut for the largest factor tried keep every piece far from its own buckling.
        let pieces = exact::sweep_pieces(&self.system(reference)?, 0.0)?;
        Ok(Box::new(move |factor| match self.system(factor) {
            Ok(system) => exact::sweep_evaluate(&system, &pieces, 0.0),
            Err(_) => Evaluation { below: usize::MAX / 2, sign: f64::NAN, log: f64::NAN },
        }))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{End, ModelParts, Segment};

    fn column(left: End, right: End, force: f64) -> Model {
        Model::new(ModelParts {
            segments: vec![Segment::slender(2.0, 3.0, 1.5)],
            left,
            right,
            attachments: vec![],
            theory: Theory::EulerBernoulli,
        })
        .unwrap()
        .with_axial_forces(vec![force])
        .unwrap()
    }

    #[test]
    fn euler_buckling_loads_of_the_classical_end_pairs() {
        // P_cr = π²EI/(K·L)² with K = 1 pinned–pinned, 0.5 clamped–clamped, 0.699 clamped–pinned
        // (the root of tan x = x: K = π/4.4934), 2 clamped–free (Euler's columns; Timoshenko & Gere,
        // Theory of Elastic Stability, ch. 2 — from memory).
        let (ei, l) = (3.0, 2.0);
        let cases = [
            (End::Pinned, End::Pinned, 1.0),
            (End::Clamped, End::Clamped, 0.5),
            (End::Clamped, End::Pinned, std::f64::consts::PI / 4.493_409_457_909_064),
            (End::Clamped, End::Free, 2.0),
        ];
        for (left, right, k) in cases {
            let p_cr = std::f64::consts::PI.powi(2) * ei / (k * l).powi(2);
            let load = -0.3 * p_cr;
            let factor = critical_load_factor(&column(left, right, load)).unwrap().unwrap();
            assert!((factor - 1.0 / 0.3).abs() < 1e-9 * factor, "{left:?}–{right:?}: μ = {factor}");
        }
        assert_eq!(critical_load_factor(&column(End::Pinned, End::Pinned, 10.0)).unwrap(), None);
    }

    #[test]
    fn pinned_frequencies_under_axial_force() {
        // ω_n² = (nπ/L)⁴·(EI/m)·[1 + P·L²/(n²π²·EI)] for a pinned–pinned beam-column (the classical
        // result, e.g. Blevins, Formulas for Natural Frequency and Mode Shape — from memory), for
        // tension and compression and several n.
        let (ei, m, l) = (3.0, 1.5, 2.0);
        for force in [-5.0, -1.0, 0.0, 2.0, 40.0] {
            let model = column(End::Pinned, End::Pinned, force);
            let got = exact::frequencies(&model, 4).unwrap();
            for (n, omega) in got.iter().enumerate() {
                let k = (n + 1) as f64 * std::f64::consts::PI / l;
                let want = (k.powi(4) * ei / m * (1.0 + force / (k * k * ei))).sqrt();
                assert!(
                    (omega - want).abs() < 1e-11 * want,
                    "P = {force}, mode {}: {omega} vs {want}",
                    n + 1
                );
            }
        }
    }

    #[test]
    fn forces_the_engine_cannot_take_are_refused() {
        let base = column(End::Pinned, End::Pinned, 0.0);
        let free =
            Model::new(ModelParts { left: End::Free, right: End::Free, ..base.parts().clone() }).unwrap();
        assert!(free.with_axial_forces(vec![-1.0]).is_err());
        // The refusal says what to do instead, whole: the error type cuts a message past its
        // length limit, which once took this one's remedy off.
        let shear = Model::new(ModelParts {
            segments: vec![Segment {
                shear_rigidity: Some(1e3),
                rotary_inertia_per_length: 1e-3,
                ..base.segments()[0]
            }],
            theory: Theory::Timoshenko,
            ..base.parts().clone()
        })
        .unwrap();
        let refusal = shear.with_axial_forces(vec![-1.0]).unwrap_err();
        assert!(refusal.message.ends_with("choose the Euler–Bernoulli theory"), "{}", refusal.message);
        assert!(column(End::Pinned, End::Pinned, 0.0).with_axial_forces(vec![f64::NAN]).is_err());
        assert!(column(End::Pinned, End::Pinned, 0.0).with_axial_forces(vec![1.0, 2.0]).is_err());
    }
}
