//! Uniform beam members: their exact dynamic stiffness, clamped–clamped count and interior shape.

mod euler;
mod timoshenko;
pub(crate) mod transfer;

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

    /// The member's bending stiffness EI, N·m².
    pub(crate) fn flexural_rigidity(&self) -> f64 {
        match self {
            Member::Euler(e) => e.ei,
            Member::Timoshenko(t) => t.ei,
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

    /// Pieces the station sweep cuts this member into for frequencies up to `omega_max`: short
    /// enough that each piece's transfer matrix is close to the identity and accurately summed
    /// (λ ≤ [`SWEEP_LAMBDA`] for a slender piece), and so far below the piece's own first
    /// clamped–clamped frequency (λ = 4.730) that the pieces add no poles and nothing to J₀.
    /// `None` when a shear-flexible member would need more than its limit of pieces.
    pub(crate) fn sweep_pieces(&self, omega_max: f64) -> Option<usize> {
        match self {
            Member::Euler(e) => Some(count((e.lambda(omega_max) / SWEEP_LAMBDA).ceil())),
            Member::Timoshenko(t) => {
                let n = t.pieces(omega_max);
                (n <= timoshenko::MAX_PIECES).then_some(n)
            }
        }
    }

    /// The transfer matrix at ω of one of `pieces` equal pieces of this member.
    pub(crate) fn piece_transfer(&self, pieces: usize, omega: f64) -> transfer::Transfer {
        let share = 1.0 / pieces.max(1) as f64;
        match *self {
            Member::Euler(e) => Euler { length: e.length * share, ..e }.transfer(omega),
            Member::Timoshenko(t) => Timoshenko { length: t.length * share, ..t }.transfer(omega),
        }
    }
}

/// Largest λ of a slender piece in the station sweep. Its transfer matrix's entries then stay
/// below cosh 1.5 ≈ 2.4 (in units of the piece), so carrying a stiffness across it amplifies
/// rounding by no more than a few units.
pub(crate) const SWEEP_LAMBDA: f64 = 1.5;

/// A piece count from a float, at least 1, saturating past what any layout accepts (the layout
/// then reports the problem) and treating NaN the same way.
fn count(n: f64) -> usize {
    if n.is_nan() {
        usize::MAX / 4
    } else {
        n.clamp(1.0, 1e9) as usize
    }
}
