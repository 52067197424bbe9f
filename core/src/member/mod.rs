//! Uniform beam members: their exact dynamic stiffness, clamped–clamped count and interior shape.

mod euler;
mod timoshenko;

pub(crate) use euler::Euler;
pub(crate) use timoshenko::Timoshenko;

use crate::model::{Segment, Theory};

/// A member's dynamic stiffness of [w₁, θ₁, w₂, θ₂] and its count of clamped–clamped
/// frequencies below the trial frequency.
pub(crate) type Evaluated = ([[f64; 4]; 4], usize);

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
    /// member's clamped–clamped natural frequencies strictly below ω (its share of J₀); `None`
    /// when a shear-flexible member is beyond what can be computed (see `MAX_PIECES`).
    pub(crate) fn stiffness_and_count(&self, omega: f64) -> Option<Evaluated> {
        match self {
            Member::Euler(e) => Some((e.stiffness(omega), e.clamped_count(omega))),
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
            Member::Euler(e) => count((e.lambda(omega) / 1.0).ceil()),
            Member::Timoshenko(t) => t.pieces(omega).max(count(t.lambda(omega).ceil())),
        }
    }

    /// Pieces to cut this member into so that none reaches its own first clamped–clamped
    /// frequency below `omega_max` (λ = 4.730 for a bending member; 3.5 leaves a margin).
    pub(crate) fn pole_free_pieces(&self, omega_max: f64) -> usize {
        match self {
            Member::Euler(e) => count((e.lambda(omega_max) / 3.5).ceil()),
            Member::Timoshenko(t) => t.pieces(omega_max),
        }
    }
}

/// A piece count from a float, at least 1, saturating past what any layout accepts (the layout
/// then reports the problem) and treating NaN the same way.
fn count(n: f64) -> usize {
    if n.is_nan() {
        usize::MAX / 4
    } else {
        n.clamp(1.0, 1e9) as usize
    }
}
