//! Uniform beam members: their exact dynamic stiffness, clamped–clamped count and interior shape.

mod euler;

pub(crate) use euler::Euler;

use crate::model::{Segment, Theory};

/// A uniform member of one theory, cut from a segment.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Member {
    Euler(Euler),
}

impl Member {
    /// The member of `length` cut from `segment` under `theory`.
    pub(crate) fn new(segment: &Segment, length: f64, theory: Theory) -> Member {
        match theory {
            Theory::EulerBernoulli | Theory::Timoshenko => {
                Member::Euler(Euler { length, ei: segment.flexural_rigidity, m: segment.mass_per_length })
            }
        }
    }

    /// Dynamic stiffness of [w₁, θ₁, w₂, θ₂] at angular frequency ω.
    pub(crate) fn stiffness(&self, omega: f64) -> [[f64; 4]; 4] {
        match self {
            Member::Euler(e) => e.stiffness(omega),
        }
    }

    /// Number of clamped–clamped natural frequencies strictly below ω (the member's share of J₀).
    pub(crate) fn clamped_count(&self, omega: f64) -> usize {
        match self {
            Member::Euler(e) => e.clamped_count(omega),
        }
    }

    /// Deflection and rotation at `x` from the left end for end displacements `q`.
    pub(crate) fn deflection(&self, omega: f64, q: [f64; 4], x: f64) -> (f64, f64) {
        match self {
            Member::Euler(e) => e.deflection(omega, q, x),
        }
    }

    /// A dimensionless wavenumber-length: how many "radians of bending wave" fit in the member
    /// at ω. Used to cut members into pieces short enough for the interior shape.
    pub(crate) fn wave_length_parameter(&self, omega: f64) -> f64 {
        match self {
            Member::Euler(e) => e.lambda(omega),
        }
    }

    /// Pieces to cut this member into so that none reaches its own first clamped–clamped
    /// frequency below `omega_max` (λ = 4.730 for a bending member; 3.5 leaves a margin).
    pub(crate) fn pole_free_pieces(&self, omega_max: f64) -> usize {
        match self {
            Member::Euler(e) => (e.lambda(omega_max) / 3.5).ceil().max(1.0) as usize,
        }
    }
}
