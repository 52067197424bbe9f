//! The derivative of a natural frequency with respect to each value of the model, through its
//! mode shape: the first-order perturbation of a symmetric eigenproblem,
//! ∂(ω²)/∂q = φᵀ(∂K/∂q − ω²·∂M/∂q)φ / φᵀMφ (Fox & Kapoor, AIAA J. 6, 1968; also Meirovitch,
//! Fundamentals of Vibrations, on Rayleigh's quotient being stationary — from memory).
//!
//! Rayleigh's quotient ω² = U/T of the exact shape is stationary, so a change of any stiffness or
//! mass of the model moves ω² by (δU − ω²·δT)/T with the shape held: each value's derivative is
//! its share of the strain energy U or the kinetic energy T, divided by the value. The shares are
//! the same integrals [`ModeShape::rayleigh_quotient`] sums (twice the energies, per ω² for T),
//! taken part by part. Lengths and positions move the stations, not only the energies; they have
//! no entry here, and [`Gradient::change`] declines a change of them.

use super::energy::GAUSS;
use super::ModeShape;
use crate::member::Member;
use crate::model::{Attachment, Model, Segment};

/// ∂(ω²)/∂q of one mode for the values q of one segment, (rad/s)² per unit of each.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct SegmentGradient {
    /// Per N·m² of EI.
    pub flexural_rigidity: f64,
    /// Per kg/m.
    pub mass_per_length: f64,
    /// Per N of κGA (shear-flexible members only).
    pub shear_rigidity: f64,
    /// Per kg·m of ρI (shear-flexible members only).
    pub rotary_inertia_per_length: f64,
    /// Per N of axial force, tension positive.
    pub axial_force: f64,
}

/// ∂(ω²)/∂q of one mode for every stiffness and mass of the model.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Gradient {
    /// Per segment.
    pub segments: Vec<SegmentGradient>,
    /// The left end's translational and rotational springs.
    pub left: [f64; 2],
    /// The right end's.
    pub right: [f64; 2],
    /// Per attachment, in the model's order: a mass's [mass, rotary inertia], a spring's
    /// [stiffness, 0], a sprung mass's [mass, stiffness], a support's [0, 0].
    pub attachments: Vec<[f64; 2]>,
}

impl ModeShape {
    /// ∂(ω²)/∂q of this mode for every stiffness and mass of `model`, the model it was computed
    /// for. Meaningful for a simple (not repeated) frequency.
    pub fn gradient(&self, model: &Model) -> Gradient {
        let omega2 = self.omega * self.omega;
        let t = self.generalized_mass;
        let mut segments = vec![SegmentGradient::default(); model.segments().len()];
        for p in &self.pieces {
            let g = &mut segments[model.segment_at(p.x0 + 0.5 * p.length)];
            let half = 0.5 * p.length;
            for (xi, weight) in GAUSS {
                let x = half * (1.0 + xi);
                let w = weight * half / t;
                let (deflection, rotation) = p.member.propagate(self.omega, p.state, x);
                g.mass_per_length -= w * omega2 * deflection * deflection;
                match p.member {
                    Member::Euler(e) => {
                        let moment = e.moment(self.omega, p.state, x);
                        g.flexural_rigidity += w * (moment / e.ei).powi(2);
                    }
                    Member::Timoshenko(m) => {
                        let (moment, shear) = m.forces(self.omega, p.state, x);
                        g.flexural_rigidity += w * (moment / m.ei).powi(2);
                        g.shear_rigidity += w * (shear / m.kga).powi(2);
                        g.rotary_inertia_per_length -= w * omega2 * rotation * rotation;
                    }
                    Member::Column(c) => {
                        // Twice the strain energy per length is M²/EI + P·θ².
                        let axial = rotation * rotation;
                        let bending = c.strain_density(self.omega, p.state, x) - c.p * axial;
                        g.flexural_rigidity += w * bending / c.ei;
                        g.axial_force += w * axial;
                    }
                }
            }
        }
        let end = |x: f64| {
            let (w, theta) = self.at(x);
            [w * w / t, theta * theta / t]
        };
        let attachments = model
            .attachments()
            .iter()
            .enumerate()
            .map(|(index, a)| match *a {
                Attachment::Mass { position, .. } => {
                    let (w, theta) = self.at(position);
                    [-omega2 * w * w / t, -omega2 * theta * theta / t]
                }
                Attachment::Spring { position, .. } => [self.at(position).0.powi(2) / t, 0.0],
                Attachment::RotationalSpring { position, .. } => [self.at(position).1.powi(2) / t, 0.0],
                Attachment::SprungMass { position, .. } => {
                    let u = self.sprung.iter().find(|(i, _)| *i == index).map_or(0.0, |(_, u)| *u);
                    [-omega2 * u * u / t, (self.at(position).0 - u).powi(2) / t]
                }
                Attachment::Support { .. } => [0.0, 0.0],
            })
            .collect();
        Gradient { segments, left: end(0.0), right: end(model.length()), attachments }
    }
}

impl Gradient {
    /// The first-order change of ω² from `before` (the model of the shape) to `after`: the sum of
    /// each value's derivative times its change. `None` when the two differ in what the gradient
    /// does not cover: a length, a position, the theory, the kind or number of ends and
    /// attachments, or a spring going to or from rigid.
    pub fn change(&self, before: &Model, after: &Model) -> Option<f64> {
        if before.theory() != after.theory()
            || before.segments().len() != after.segments().len()
            || before.attachments().len() != after.attachments().len()
            || self.segments.len() != before.segments().len()
        {
            return None;
        }
        let mut sum = 0.0;
        // A rigid spring stays infinite: rigid to rigid is no change, and a change to or from
        // rigid has no finite difference and is declined.
        let mut add = |derivative: f64, a: f64, b: f64| -> Option<()> {
            if a == b {
                return Some(());
            }
            let d = b - a;
            d.is_finite().then(|| sum += derivative * d)
        };
        for (i, (a, b)) in before.segments().iter().zip(after.segments()).enumerate() {
            let g = &self.segments[i];
            let Segment {
                length,
                flexural_rigidity,
                mass_per_length,
                shear_rigidity,
                rotary_inertia_per_length,
            } = *a;
            if length != b.length || shear_rigidity.is_some() != b.shear_rigidity.is_some() {
                return None;
            }
            add(g.flexural_rigidity, flexural_rigidity, b.flexural_rigidity)?;
            add(g.mass_per_length, mass_per_length, b.mass_per_length)?;
            add(g.shear_rigidity, shear_rigidity.unwrap_or(0.0), b.shear_rigidity.unwrap_or(0.0))?;
            add(g.rotary_inertia_per_length, rotary_inertia_per_length, b.rotary_inertia_per_length)?;
            add(g.axial_force, before.axial_force(i), after.axial_force(i))?;
        }
        for (g, (a, b)) in
            [(self.left, (before.left(), after.left())), (self.right, (before.right(), after.right()))]
        {
            let ((ta, ra), (tb, rb)) = (a.springs(), b.springs());
            add(g[0], ta, tb)?;
            add(g[1], ra, rb)?;
        }
        for (g, (a, b)) in self.attachments.iter().zip(before.attachments().iter().zip(after.attachments())) {
            if a.position() != b.position() {
                return None;
            }
            let (x, y) = match (*a, *b) {
                (
                    Attachment::Mass { mass, rotary_inertia, .. },
                    Attachment::Mass { mass: m, rotary_inertia: j, .. },
                ) => ([mass, rotary_inertia], [m, j]),
                (Attachment::Spring { stiffness, .. }, Attachment::Spring { stiffness: k, .. })
                | (
                    Attachment::RotationalSpring { stiffness, .. },
                    Attachment::RotationalSpring { stiffness: k, .. },
                ) => ([stiffness, 0.0], [k, 0.0]),
                (
                    Attachment::SprungMass { mass, stiffness, .. },
                    Attachment::SprungMass { mass: m, stiffness: k, .. },
                ) => ([mass, stiffness], [m, k]),
                (Attachment::Support { .. }, Attachment::Support { .. }) => ([0.0; 2], [0.0; 2]),
                _ => return None,
            };
            add(g[0], x[0], y[0])?;
            add(g[1], x[1], y[1])?;
        }
        Some(sum)
    }
}
