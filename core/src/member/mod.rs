//! Uniform beam members: their exact dynamic stiffness, clamped–clamped count and interior shape.

mod column;
mod euler;
#[cfg(test)]
pub(crate) mod reference;
mod timoshenko;
pub(crate) mod transfer;

pub(crate) use column::Column;
pub(crate) use euler::Euler;
pub(crate) use timoshenko::Timoshenko;

use crate::model::{Segment, Theory};

/// A uniform member of one theory, cut from a segment.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum Member {
    Euler(Euler),
    Timoshenko(Timoshenko),
    Column(Column),
}

impl Member {
    /// The member of `length` cut from `segment` under `theory`, carrying the axial force `p`
    /// (N, tension positive; only with the slender theory, which the model checks).
    pub(crate) fn new(segment: &Segment, length: f64, theory: Theory, p: f64) -> Member {
        if p != 0.0 {
            return Member::Column(Column {
                length,
                ei: segment.flexural_rigidity,
                m: segment.mass_per_length,
                p,
            });
        }
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

    /// The member's length, m.
    pub(crate) fn length(&self) -> f64 {
        match self {
            Member::Euler(e) => e.length,
            Member::Timoshenko(t) => t.length,
            Member::Column(c) => c.length,
        }
    }

    /// The member's bending stiffness EI, N·m².
    pub(crate) fn flexural_rigidity(&self) -> f64 {
        match self {
            Member::Euler(e) => e.ei,
            Member::Timoshenko(t) => t.ei,
            Member::Column(c) => c.ei,
        }
    }

    /// The left-end state for [`Member::propagate`] from the physical state (w, θ, Q, M) of the
    /// station sweep (see [`transfer`]).
    pub(crate) fn start_from(&self, s: [f64; 4]) -> [f64; 4] {
        match self {
            // The slender member carries (w, θ, F_θ/EI, F_w/EI) with F the nodal force the
            // member takes at its left end, which is −(Q, M) there.
            Member::Euler(e) => [s[0], s[1], -s[3] / e.ei, -s[2] / e.ei],
            Member::Timoshenko(_) | Member::Column(_) => [s[0], s[1], s[3], s[2]],
        }
    }

    /// Deflection and rotation at `x` from the left end, given the left-end state.
    pub(crate) fn propagate(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        match self {
            Member::Euler(e) => e.propagate(omega, state, x),
            Member::Timoshenko(t) => t.propagate(omega, state, x),
            Member::Column(c) => c.propagate(omega, state, x),
        }
    }

    /// Twice the strain energy per unit length at `x` from the left end, given the left-end
    /// state: M²/EI in bending, Q²/κGA in shear, P·θ² from an axial force.
    pub(crate) fn strain_density(&self, omega: f64, state: [f64; 4], x: f64) -> f64 {
        match self {
            Member::Euler(e) => {
                let m = e.moment(omega, state, x);
                m * m / e.ei
            }
            Member::Timoshenko(t) => {
                let (m, q) = t.forces(omega, state, x);
                m * m / t.ei + q * q / t.kga
            }
            Member::Column(c) => c.strain_density(omega, state, x),
        }
    }

    /// [`Member::strain_density`], and the same without the axial force's part (the energy the
    /// beam's own stiffness stores, which compression partly cancels), from one evaluation.
    pub(crate) fn densities(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        match self {
            Member::Column(c) => c.densities(omega, state, x),
            _ => {
                let d = self.strain_density(omega, state, x);
                (d, d)
            }
        }
    }

    /// Pieces the station sweep cuts this member into for frequencies up to `omega_max`: short
    /// enough that each piece's transfer matrix is accurately summed and well conditioned
    /// (λ ≤ `slender` for a slender piece without axial force: [`COUNT_LAMBDA`] for the count
    /// and determinant, [`SWEEP_LAMBDA`] for mode shapes, whose energies are integrated piece by
    /// piece; λ ≤ [`SWEEP_LAMBDA`] for a beam-column), and so far below the piece's own first
    /// clamped–clamped frequency (λ = 4.730) that the pieces add no poles and nothing to J₀.
    /// `None` when a shear-flexible member would need more than its limit of pieces.
    pub(crate) fn sweep_pieces(&self, omega_max: f64, slender: f64) -> Option<usize> {
        match self {
            Member::Euler(e) => Some(count((e.lambda(omega_max) / slender).ceil())),
            // Also |P|·h²/EI ≤ 1 per piece (see `column`).
            Member::Column(c) => {
                Some(count((c.lambda(omega_max) / SWEEP_LAMBDA).max(c.load_parameter()).ceil()))
            }
            Member::Timoshenko(t) => {
                let n = t.pieces(omega_max);
                (n <= timoshenko::MAX_PIECES).then_some(n)
            }
        }
    }

    /// One of `pieces` equal pieces of this member, as a member of its own.
    pub(crate) fn piece(&self, pieces: usize) -> Member {
        let share = 1.0 / pieces.max(1) as f64;
        match *self {
            Member::Euler(e) => Member::Euler(Euler { length: e.length * share, ..e }),
            Member::Timoshenko(t) => Member::Timoshenko(Timoshenko { length: t.length * share, ..t }),
            Member::Column(c) => Member::Column(Column { length: c.length * share, ..c }),
        }
    }

    /// The transfer matrix of the member at ω.
    pub(crate) fn transfer(&self, omega: f64) -> transfer::Transfer {
        match self {
            Member::Euler(e) => e.transfer(omega),
            Member::Timoshenko(t) => t.transfer(omega),
            Member::Column(c) => c.transfer(omega),
        }
    }

    /// The transfer matrix at ω of one of `pieces` equal pieces of this member.
    pub(crate) fn piece_transfer(&self, pieces: usize, omega: f64) -> transfer::Transfer {
        self.piece(pieces).transfer(omega)
    }
}

/// Largest λ of a slender piece in the station sweep of a mode shape, and of a beam-column's
/// piece. Its transfer matrix's entries then stay below cosh 1.5 ≈ 2.4 (in units of the piece),
/// so carrying a stiffness across it amplifies rounding by no more than a few units, and the
/// six-point Gauss rule integrates a shape's energies over it to about 1e-14.
pub(crate) const SWEEP_LAMBDA: f64 = 1.5;

/// Largest λ of a slender piece without axial force in the sweep that counts and takes the
/// determinant (the root search's, most of an exact solve's time). Its Krylov–Duncan functions
/// are sums of positive terms (no cancellation; nine terms to full precision), its entries stay
/// below cosh 3 ≈ 10 in units of the piece, and λ = 3 is well below the piece's first
/// clamped–clamped frequency (λ = 4.730), so J₀ stays zero. Twice [`SWEEP_LAMBDA`] halves the
/// pieces each trial frequency's sweep carries.
pub(crate) const COUNT_LAMBDA: f64 = 3.0;

/// A piece count from a float, at least 1, saturating past what any layout accepts (the layout
/// then reports the problem) and treating NaN the same way.
fn count(n: f64) -> usize {
    if n.is_nan() {
        usize::MAX / 4
    } else {
        n.clamp(1.0, 1e9) as usize
    }
}
