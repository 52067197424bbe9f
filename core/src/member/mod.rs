//! Uniform beam members: their exact dynamic stiffness, clamped–clamped count and interior shape.

mod euler;
mod timoshenko;

pub(crate) use euler::Euler;
pub(crate) use timoshenko::Timoshenko;

use crate::model::{Segment, Theory};

/// A uniform member of one theory, cut from a segment.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Member {
    Euler(Euler),
    Timoshenko(Timoshenko),
}

impl Member {
    /// The member of `length` cut from `segment` under `theory`.
    pub(crate) fn new(segment: &Segment, length: f64, theory: Theory) -> Member {
        match theory {
            Theory::Timoshenko => match segment.shear_rigidity {
                Some(kga) => Member::Timoshenko(Timoshenko {
                    length,
                    ei: segment.flexural_rigidity,
                    kga,
                    m: segment.mass_per_length,
                    rho_i: segment.rotary_inertia_per_length,
                }),
                None => {
                    Member::Euler(Euler { length, ei: segment.flexural_rigidity, m: segment.mass_per_length })
                }
            },
            Theory::EulerBernoulli => {
                Member::Euler(Euler { length, ei: segment.flexural_rigidity, m: segment.mass_per_length })
            }
        }
    }

    /// Dynamic stiffness of [w₁, θ₁, w₂, θ₂] at angular frequency ω, and the number of the
    /// member's clamped–clamped natural frequencies strictly below ω (its share of J₀).
    pub(crate) fn stiffness_and_count(&self, omega: f64) -> ([[f64; 4]; 4], usize) {
        match self {
            Member::Euler(e) => (e.stiffness(omega), e.clamped_count(omega)),
            Member::Timoshenko(t) => t.stiffness_and_count(omega),
        }
    }

    /// The state at the left end from which [`Member::propagate`] carries the shape inside the
    /// member; linear in the end values `q`.
    pub(crate) fn start_state(&self, omega: f64, q: [f64; 4]) -> [f64; 4] {
        match self {
            Member::Euler(e) => e.start_state(omega, q),
            Member::Timoshenko(t) => t.start_state(omega, q),
        }
    }

    /// Deflection and rotation at `x` from the left end, given the left-end state.
    pub(crate) fn propagate(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        match self {
            Member::Euler(e) => e.propagate(omega, state, x),
            Member::Timoshenko(t) => t.propagate(omega, state, x),
        }
    }

    /// Pieces to cut this member into for its interior shape at ω: short enough that the
    /// interior formulas are accurate and no piece reaches its own clamped–clamped frequency.
    pub(crate) fn shape_pieces(&self, omega: f64) -> usize {
        match self {
            Member::Euler(e) => (e.lambda(omega) / 1.0).ceil().max(1.0) as usize,
            Member::Timoshenko(t) => t.pieces(omega).max(t.lambda(omega).ceil() as usize),
        }
    }

    /// Pieces to cut this member into so that none reaches its own first clamped–clamped
    /// frequency below `omega_max` (λ = 4.730 for a bending member; 3.5 leaves a margin).
    pub(crate) fn pole_free_pieces(&self, omega_max: f64) -> usize {
        match self {
            Member::Euler(e) => (e.lambda(omega_max) / 3.5).ceil().max(1.0) as usize,
            Member::Timoshenko(t) => t.pieces(omega_max),
        }
    }
}
