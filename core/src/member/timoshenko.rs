//! The exact dynamic stiffness of a uniform Timoshenko member (shear deformation and rotary
//! inertia), its clamped–clamped count, and the deflection inside it.
//!
//! State y = (w, ψ, M, Q) with ψ the section rotation, M = EI·ψ′ and Q = κGA·(w′ − ψ) obeys,
//! in harmonic motion at ω,
//!
//! ```text
//! w′ = ψ + Q/κGA      ψ′ = M/EI      M′ = −Q − ρI·ω²·ψ      Q′ = −ρA·ω²·w
//! ```
//!
//! Over a short piece of length h the transfer matrix expm(A·h) is well conditioned, and the
//! piece's dynamic stiffness follows from it. A member is a chain of n equal pieces whose interior
//! stations are condensed out: K = K_ee − K_ei·K_ii⁻¹·K_ie. The pieces are short enough to lie
//! below their own first clamped–clamped frequency, so by the Wittrick–Williams argument applied
//! to the chain the member's clamped–clamped count is exactly the number of negative pivots of
//! K_ii. Both results are exact for any n that satisfies the length limit; n only sets accuracy.
//!
//! The length limit is a rigorous lower bound on a clamped–clamped piece's fundamental: from
//! ‖w‖ ≤ (h/π)‖w′‖, ‖ψ‖ ≤ (h/π)‖ψ′‖ and ‖w′‖² ≤ 2‖w′−ψ‖² + 2‖ψ‖², Rayleigh's quotient gives
//! ω₁² ≥ min(κGA/a, EI/b) with a = 2ρA(h/π)² and b = 2ρA(h/π)⁴ + ρI(h/π)².

use nalgebra::{Matrix4, Vector4};

use super::transfer::Transfer;

/// A uniform Timoshenko member.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Timoshenko {
    pub(crate) length: f64,
    pub(crate) ei: f64,
    pub(crate) kga: f64,
    /// Mass per length ρA, kg/m.
    pub(crate) m: f64,
    /// Rotary inertia per length ρI, kg·m.
    pub(crate) rho_i: f64,
}

/// Largest bending λ of one piece, for the accuracy of the transfer matrix.
const PIECE_LAMBDA: f64 = 1.2;
/// Margin on the piece's clamped–clamped lower bound over the frequency of interest.
const MARGIN: f64 = 1.1;
/// Most pieces one member may be cut into. Realistic sections need a few to a few dozen at the
/// frequencies asked for; thousands mean a shear rigidity implausibly low for the bending
/// stiffness and rotary inertia, and the computation would crawl.
pub(crate) const MAX_PIECES: usize = 4000;

impl Timoshenko {
    /// Longest piece whose clamped–clamped fundamental is provably above `omega`.
    fn longest_piece(&self, omega: f64) -> f64 {
        let w2 = (MARGIN * omega).powi(2);
        if w2 == 0.0 {
            return self.length;
        }
        let pi = std::f64::consts::PI;
        // κGA / (2ρA(h/π)²) ≥ ω²  ⇔  h ≤ π·√(κGA/(2ρA·ω²)).
        let shear = pi * (self.kga / (2.0 * self.m * w2)).sqrt();
        // EI / (2ρA·u² + ρI·u) ≥ ω² with u = (h/π)²  ⇔  2ρA·u² + ρI·u − EI/ω² ≤ 0.
        let u =
            (-self.rho_i + (self.rho_i * self.rho_i + 8.0 * self.m * self.ei / w2).sqrt()) / (4.0 * self.m);
        let bending = pi * u.sqrt();
        let accuracy = PIECE_LAMBDA * (self.ei / (self.m * omega * omega)).sqrt().sqrt();
        shear.min(bending).min(accuracy)
    }

    /// Pieces needed at `omega`; more than [`MAX_PIECES`] when the member cannot be handled.
    pub(crate) fn pieces(&self, omega: f64) -> usize {
        let n = (self.length / self.longest_piece(omega)).ceil();
        if n.is_nan() {
            MAX_PIECES + 1
        } else {
            n.clamp(1.0, (MAX_PIECES + 1) as f64) as usize
        }
    }

    /// The dimensionless system matrix for a piece of length h, in the scaled state
    /// (w, h·ψ, h²·M/EI, h³·Q/EI) and coordinate ξ = x/h.
    pub(super) fn system(&self, h: f64, omega: f64) -> Matrix4<f64> {
        let w2 = omega * omega;
        let s = self.ei / (self.kga * h * h);
        let r = self.rho_i * w2 * h * h / self.ei;
        let l4 = self.m * w2 * h.powi(4) / self.ei;
        Matrix4::new(0.0, 1.0, 0.0, s, 0.0, 0.0, 1.0, 0.0, 0.0, -r, 0.0, -1.0, -l4, 0.0, 0.0, 0.0)
    }

    /// The transfer matrix of the member at ω in the state (w, ψ, Q, M) of [`super::transfer`].
    /// Accurate for a member no longer than one piece at ω (see [`Timoshenko::pieces`]).
    pub(crate) fn transfer(&self, omega: f64) -> Transfer {
        let h = self.length;
        physical(&exp_scaled(&self.system(h, omega)), h, self.ei)
    }

    /// The bending moment and shear force at `x` from the left-end state (w, ψ, M, Q).
    pub(crate) fn forces(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        let h = self.length;
        let y0 =
            Vector4::new(state[0], h * state[1], state[2] * h * h / self.ei, state[3] * h * h * h / self.ei);
        let y = propagate(&self.system(h, omega), y0, x / h);
        (y[2] * self.ei / (h * h), y[3] * self.ei / (h * h * h))
    }

    /// Deflection and section rotation at `x` from the left-end state, carried by the transfer
    /// matrix. Accurate for a member no longer than one piece at ω.
    pub(crate) fn propagate(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        let h = self.length;
        let y0 =
            Vector4::new(state[0], h * state[1], state[2] * h * h / self.ei, state[3] * h * h * h / self.ei);
        let y = propagate(&self.system(h, omega), y0, x / h);
        (y[0], y[1] / h)
    }
}

/// A transfer matrix over a piece of length h in the scaled state y = (w, h·ψ, h²·M/EI,
/// h³·Q/EI) written for the physical state s = (w, ψ, Q, M): y = P·s with y₀ = s₀, y₁ = h·s₁,
/// y₂ = (h²/EI)·s₃, y₃ = (h³/EI)·s₂, so T = P⁻¹·T̂·P.
pub(super) fn physical(t: &Matrix4<f64>, h: f64, ei: f64) -> Transfer {
    let p = [(0, 1.0), (1, h), (3, h * h / ei), (2, h * h * h / ei)];
    let mut full = [[0.0; 4]; 4];
    for (yi, &(si, scale_i)) in p.iter().enumerate() {
        for (yj, &(sj, scale_j)) in p.iter().enumerate() {
            full[si][sj] = t[(yi, yj)] * scale_j / scale_i;
        }
    }
    Transfer::from_full(&full)
}

/// exp(A) by scaling and squaring: exp(A/2^s) from its Taylor series, squared s times, with
/// ‖A/2^s‖ ≤ ½ so that 18 terms reach rounding. Cheaper than carrying four columns through
/// the series, and its cost grows only with log ‖A‖.
pub(super) fn exp_scaled(a: &Matrix4<f64>) -> Matrix4<f64> {
    let norm = a.abs().row_sum().max();
    let squarings = (norm * 2.0).log2().ceil().max(0.0) as i32;
    let scaled = a / 2f64.powi(squarings);
    let mut term = Matrix4::identity();
    let mut sum = Matrix4::identity();
    for k in 1..=18 {
        term = term * scaled / k as f64;
        sum += term;
    }
    for _ in 0..squarings {
        sum = sum * sum;
    }
    sum
}

/// exp(A·t)·y.
pub(super) fn propagate(a: &Matrix4<f64>, y: Vector4<f64>, t: f64) -> Vector4<f64> {
    exp_scaled(&(a * t)) * y
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn scaled_exponential_matches_nalgebra() {
        // nalgebra's Padé approximant is an independent implementation of the same function.
        let a =
            Matrix4::new(0.0, 1.0, 0.0, 900.0, 0.0, 0.0, 1.0, 0.0, 0.0, -0.3, 0.0, -1.0, -2.0, 0.0, 0.0, 0.0);
        let (ours, reference) = (exp_scaled(&a), a.exp());
        let scale = reference.abs().max();
        assert!((ours - reference).abs().max() < 1e-11 * scale, "{ours} vs {reference}");
    }
}
