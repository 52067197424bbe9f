//! The energies of a mode shape, integrated piece by piece with each member's exact shape
//! functions: the mass-weighted inner product (kinetic energy per ω²), which orthogonalises and
//! normalises the shapes, and Rayleigh's quotient (strain over kinetic energy), which checks
//! each shape's frequency.

use super::ModeShape;
use crate::model::{Attachment, Model};

impl ModeShape {
    /// The mass-weighted inner product of two shapes of the same model:
    /// ∫ m·φ·ψ dx + ∫ ρI·φ′·ψ′ dx + Σ point masses and rotary inertias + Σ sprung masses.
    /// Zero (to rounding) for two different modes: the modes are mass-orthogonal.
    pub fn mass_product(&self, other: &ModeShape, model: &Model) -> f64 {
        inner(model, self, other)
    }

    /// Rayleigh's quotient of the shape as computed, ω² = U/T: the strain energy in bending (and
    /// shear), springs and isolators over the kinetic energy per ω². For the exact mode shape it
    /// is exactly ω², and it is stationary there, so for a computed one it errs only to second
    /// order in the shape's error: how far its root lies from the frequency the shape was
    /// computed at measures that frequency's error.
    pub fn rayleigh_quotient(&self, model: &Model) -> f64 {
        self.energies(model).0
    }

    /// Rayleigh's quotient (see [`ModeShape::rayleigh_quotient`]) and the beam's own strain
    /// energy over ω²T (see [`ModeShape::bending_to_kinetic`]), from one pass over the pieces.
    pub fn energies(&self, model: &Model) -> (f64, f64) {
        let (mut strain, mut bending) = (0.0, 0.0);
        for p in &self.pieces {
            let half = 0.5 * p.length;
            for (xi, weight) in GAUSS {
                let x = half * (1.0 + xi);
                let (all, own) = p.member.densities(self.omega, p.state, x);
                strain += weight * half * all;
                bending += weight * half * own;
            }
        }
        let (kt_left, kr_left) = model.left().springs();
        let (kt_right, kr_right) = model.right().springs();
        for (x, kt, kr) in [(0.0, kt_left, kr_left), (model.length(), kt_right, kr_right)] {
            let (w, t) = self.at(x);
            strain += finite(kt) * w * w + finite(kr) * t * t;
        }
        for (index, a) in model.attachments().iter().enumerate() {
            match *a {
                Attachment::Spring { position, stiffness } => {
                    strain += finite(stiffness) * self.at(position).0.powi(2);
                }
                Attachment::RotationalSpring { position, stiffness } => {
                    strain += finite(stiffness) * self.at(position).1.powi(2);
                }
                Attachment::SprungMass { position, stiffness, .. } => {
                    let d = self.sprung.iter().find(|(i, _)| *i == index).map_or(0.0, |(_, d)| *d);
                    strain += stiffness * (self.at(position).0 - d).powi(2);
                }
                _ => {}
            }
        }
        let kinetic = inner(model, self, self);
        (strain / kinetic, bending / (self.omega * self.omega * kinetic))
    }
}

impl ModeShape {
    /// The beam's own strain energy in this mode (bending and shear, the axial force's work
    /// left out) over its kinetic energy per ω² times ω²: 1 for a beam with no springs and no
    /// axial force (U = ω²T), below 1 where springs or tension carry part of the stiffness, and
    /// above it under compression, which cancels part of the bending energy: near buckling U is
    /// many times ω²T. An error made in the bending energy (a finite element's) is an error of
    /// ω² relative to U, so it shows in ω amplified by this ratio.
    pub fn bending_to_kinetic(&self, model: &Model) -> f64 {
        self.energies(model).1
    }
}

/// A stiffness that is not rigid; a rigid one holds its point still and stores no energy.
fn finite(k: f64) -> f64 {
    if k.is_finite() {
        k
    } else {
        0.0
    }
}

/// Gauss–Legendre 6-point abscissae and weights on [−1, 1] (Abramowitz & Stegun, table 25.4).
pub(super) const GAUSS: [(f64, f64); 6] = [
    (-0.932_469_514_203_152, 0.171_324_492_379_170),
    (-0.661_209_386_466_265, 0.360_761_573_048_139),
    (-0.238_619_186_083_197, 0.467_913_934_572_691),
    (0.238_619_186_083_197, 0.467_913_934_572_691),
    (0.661_209_386_466_265, 0.360_761_573_048_139),
    (0.932_469_514_203_152, 0.171_324_492_379_170),
];

pub(super) fn inner(model: &Model, a: &ModeShape, b: &ModeShape) -> f64 {
    // The two shapes may sit on different piece layouts (each is cut for its own frequency), so
    // integrate over the union of their piece boundaries; within each interval both are smooth.
    let mut cuts: Vec<f64> = a.pieces.iter().chain(&b.pieces).map(|p| p.x0).collect();
    cuts.push(model.length());
    crate::sort::floats(&mut cuts);
    cuts.dedup_by(|x, y| (*x - *y).abs() <= 1e-12 * model.length());
    let mut sum = 0.0;
    for w in cuts.windows(2) {
        let (x0, x1) = (w[0], w[1]);
        let half = 0.5 * (x1 - x0);
        let piece =
            &a.pieces[a.pieces.partition_point(|p| p.x0 + p.length <= x0 + half).min(a.pieces.len() - 1)];
        for (xi, weight) in GAUSS {
            let x = x0 + half * (1.0 + xi);
            let (wa, ta) = a.at(x);
            let (wb, tb) = b.at(x);
            sum +=
                weight * half * (piece.mass_per_length * wa * wb + piece.rotary_inertia_per_length * ta * tb);
        }
    }
    for attachment in model.attachments() {
        if let Attachment::Mass { position, mass, rotary_inertia } = *attachment {
            let (wa, ta) = a.at(position);
            let (wb, tb) = b.at(position);
            sum += mass * wa * wb + rotary_inertia * ta * tb;
        }
    }
    for ((i, ua), (_, ub)) in a.sprung.iter().zip(&b.sprung) {
        if let Attachment::SprungMass { mass, .. } = model.attachments()[*i] {
            sum += mass * ua * ub;
        }
    }
    sum
}

#[cfg(test)]
mod tests {
    use crate::model::{Attachment, End, Model, ModelParts, Segment, Theory};

    #[test]
    fn rayleigh_quotient_of_each_mode_is_its_frequency() {
        // Rayleigh's quotient of an exact mode shape is its ω² (a fact of the theory), for every
        // kind of member, end and attachment; and a shape computed at a wrong frequency has a
        // quotient that points back at the right one.
        for theory in [Theory::EulerBernoulli, Theory::Timoshenko] {
            let model = Model::new(ModelParts {
                segments: vec![
                    Segment {
                        length: 0.8,
                        flexural_rigidity: 3.0e3,
                        mass_per_length: 6.0,
                        shear_rigidity: Some(4.0e5),
                        rotary_inertia_per_length: 0.004,
                    },
                    Segment {
                        length: 1.1,
                        flexural_rigidity: 1.5e3,
                        mass_per_length: 4.0,
                        shear_rigidity: Some(3.0e5),
                        rotary_inertia_per_length: 0.002,
                    },
                ],
                left: End::Elastic { translational: 2.0e5, rotational: 4.0e3 },
                right: End::Pinned,
                attachments: vec![
                    Attachment::Mass { position: 0.5, mass: 1.2, rotary_inertia: 0.01 },
                    Attachment::Spring { position: 1.4, stiffness: 3.0e4 },
                    Attachment::RotationalSpring { position: 1.0, stiffness: 500.0 },
                    Attachment::SprungMass { position: 1.6, mass: 0.7, stiffness: 2.0e4 },
                    Attachment::Support { position: 1.2 },
                ],
                theory,
            })
            .unwrap();
            for m in crate::exact::modes(&model, 5).unwrap() {
                let rq = m.shape.rayleigh_quotient(&model).sqrt();
                assert!(((rq - m.omega) / m.omega).abs() < 1e-12, "{theory:?}: {rq} vs {}", m.omega);
            }
        }
    }
}
