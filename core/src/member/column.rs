//! A uniform slender member carrying an axial force (a beam-column): its transfer matrix, how
//! finely the sweep cuts it, and the deflection and strain energy inside it.
//!
//! With the axial force P (tension positive) the state (w, θ, Q, M), Q now the whole transverse
//! force −EI·w‴ + P·w′ the section carries, obeys
//!
//! ```text
//! w′ = θ      θ′ = M/EI      M′ = −Q + P·θ      Q′ = −m·ω²·w
//! ```
//!
//! which is EI·w⁗ − P·w″ − m·ω²·w = 0, the beam-column equation (e.g. Timoshenko & Gere,
//! *Theory of Elastic Stability*, ch. 1 — from memory). Over a piece of length h, in the scaled
//! state (w, h·θ, h²·M/EI, h³·Q/EI), the system matrix has the entries p = P·h²/EI and
//! λ⁴ = m·ω²·h⁴/EI; the transfer matrix is its exponential, summed as in the shear-flexible
//! member. Pieces are cut so that |p| ≤ 1 as well as λ ≤ 1.5: a piece then stays far from its own
//! clamped–clamped buckling (|p| = 4π²) and frequencies, so it adds nothing to J₀, and the count
//! at ω = 0 counts buckling modes.

use nalgebra::{Matrix4, Vector4};

use super::timoshenko::{exp_scaled, physical, propagate};
use super::transfer::Transfer;

/// A uniform slender member under an axial force.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Column {
    pub(crate) length: f64,
    pub(crate) ei: f64,
    pub(crate) m: f64,
    /// Axial force, N, tension positive.
    pub(crate) p: f64,
}

impl Column {
    /// The bending λ = L·(mω²/EI)^¼ of the whole member.
    pub(crate) fn lambda(&self, omega: f64) -> f64 {
        self.length * (self.m * omega * omega / self.ei).sqrt().sqrt()
    }

    /// L·√(|P|/EI), the member's axial-force parameter.
    pub(crate) fn load_parameter(&self) -> f64 {
        self.length * (self.p.abs() / self.ei).sqrt()
    }

    /// The dimensionless system matrix for a piece of length h.
    fn system(&self, h: f64, omega: f64) -> Matrix4<f64> {
        let p = self.p * h * h / self.ei;
        let l4 = self.m * omega * omega * h.powi(4) / self.ei;
        Matrix4::new(0.0, 1.0, 0.0, 0.0, 0.0, 0.0, 1.0, 0.0, 0.0, p, 0.0, -1.0, -l4, 0.0, 0.0, 0.0)
    }

    /// The transfer matrix of the member at ω in the state (w, θ, Q, M).
    pub(crate) fn transfer(&self, omega: f64) -> Transfer {
        physical(&exp_scaled(&self.system(self.length, omega)), self.length, self.ei)
    }

    /// The state at `x` from the left-end state (w, θ, M, Q), in the scaled form's order.
    fn at(&self, omega: f64, state: [f64; 4], x: f64) -> Vector4<f64> {
        let h = self.length;
        let y0 =
            Vector4::new(state[0], h * state[1], state[2] * h * h / self.ei, state[3] * h * h * h / self.ei);
        propagate(&self.system(h, omega), y0, x / h)
    }

    /// Deflection and rotation at `x` from the left-end state (w, θ, M, Q).
    pub(crate) fn propagate(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        let y = self.at(omega, state, x);
        (y[0], y[1] / self.length)
    }

    /// Twice the strain energy per length at `x`: M²/EI from bending, and P·θ² the work of the
    /// axial force on the slope (which lowers it under compression).
    pub(crate) fn strain_density(&self, omega: f64, state: [f64; 4], x: f64) -> f64 {
        let h = self.length;
        let y = self.at(omega, state, x);
        let (theta, moment) = (y[1] / h, y[2] * self.ei / (h * h));
        moment * moment / self.ei + self.p * theta * theta
    }

    /// [`Column::strain_density`] and its bending part alone, M²/EI, from one evaluation.
    pub(crate) fn densities(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        let h = self.length;
        let y = self.at(omega, state, x);
        let (theta, moment) = (y[1] / h, y[2] * self.ei / (h * h));
        let bending = moment * moment / self.ei;
        (bending + self.p * theta * theta, bending)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::member::Euler;

    #[test]
    fn without_axial_force_it_is_the_slender_member() {
        // P = 0 leaves the Krylov–Duncan transfer matrix of the slender member, summed another way.
        let (length, ei, m, omega) = (0.6, 2.0, 3.0, 7.0);
        let a = Column { length, ei, m, p: 0.0 }.transfer(omega);
        let b = Euler { length, ei, m }.transfer(omega);
        for (x, y) in [(a.t11, b.t11), (a.t12, b.t12), (a.t21, b.t21), (a.t22, b.t22), (a.k11, b.k11)] {
            for i in 0..2 {
                for j in 0..2 {
                    assert!((x[i][j] - y[i][j]).abs() <= 1e-12 * y[i][j].abs().max(1e-3), "{x:?} vs {y:?}");
                }
            }
        }
    }

    #[test]
    fn static_stiffness_matches_the_beam_column_stability_functions() {
        // At ω = 0 and small P the pivot block is the static stiffness plus the consistent
        // geometric stiffness, K₁₁ = (EI/h³)[12, 6h; 6h, 4h²] + (P/30h)[36, 3h; 3h, 4h²] to first
        // order in P (the standard geometric stiffness of a Hermite element).
        let (h, ei, p) = (0.5, 3.0, 0.6);
        let t = Column { length: h, ei, m: 1.0, p }.transfer(0.0);
        let expect = [
            [12.0 * ei / h.powi(3) + 36.0 * p / (30.0 * h), 6.0 * ei / (h * h) + 3.0 * p / 30.0],
            [6.0 * ei / (h * h) + 3.0 * p / 30.0, 4.0 * ei / h + 4.0 * h * p / 30.0],
        ];
        for i in 0..2 {
            for j in 0..2 {
                // Second order in P·h²/EI = 0.05: about 3e-4 of the geometric part.
                assert!((t.k11[i][j] - expect[i][j]).abs() < 1e-4 * expect[i][j].abs(), "{i}{j}");
            }
        }
    }
}
