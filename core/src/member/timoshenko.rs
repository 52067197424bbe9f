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

use nalgebra::{Matrix2, Matrix4, Vector4};

use super::transfer::Transfer;
use crate::band::SymBand;

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
    /// The Euler–Bernoulli λ = L·(ρAω²/EI)^¼ of the whole member.
    pub(crate) fn lambda(&self, omega: f64) -> f64 {
        self.length * (self.m * omega * omega / self.ei).sqrt().sqrt()
    }

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
    fn system(&self, h: f64, omega: f64) -> Matrix4<f64> {
        let w2 = omega * omega;
        let s = self.ei / (self.kga * h * h);
        let r = self.rho_i * w2 * h * h / self.ei;
        let l4 = self.m * w2 * h.powi(4) / self.ei;
        Matrix4::new(0.0, 1.0, 0.0, s, 0.0, 0.0, 1.0, 0.0, 0.0, -r, 0.0, -1.0, -l4, 0.0, 0.0, 0.0)
    }

    /// Dynamic stiffness of one piece of length h from its transfer matrix.
    fn piece_stiffness(&self, h: f64, omega: f64) -> [[f64; 4]; 4] {
        let t = exp_scaled(&self.system(h, omega));
        let block =
            |r: usize, c: usize| Matrix2::new(t[(r, c)], t[(r, c + 1)], t[(r + 1, c)], t[(r + 1, c + 1)]);
        let (t11, t12, t21, t22) = (block(0, 0), block(0, 2), block(2, 0), block(2, 2));
        let Some(t12_inv) = t12.try_inverse() else {
            return [[f64::INFINITY; 4]; 4];
        };
        // Scaled end "forces" s = (h²M/EI, h³Q/EI): s₀ = T12⁻¹(d_L − T11·d₀),
        // s_L = T21·d₀ + T22·s₀, with scaled displacements d = (w, hψ).
        let s0_d0 = -t12_inv * t11;
        let s0_dl = t12_inv;
        let sl_d0 = t21 + t22 * s0_d0;
        let sl_dl = t22 * s0_dl;
        // Nodal forces on [w₁, ψ₁, w₂, ψ₂]: V₁ = −Q₀, M₁ = −M₀, V₂ = Q_L, M₂ = M_L. Undo the
        // scaling: M = (EI/h²)·ŝ₁, Q = (EI/h³)·ŝ₂, ψ = d̂₂/h.
        let (ei, h2, h3) = (self.ei, h * h, h * h * h);
        let force_scale = [ei / h3, ei / h2]; // rows: V from ŝ₂, M from ŝ₁
        let disp_scale = [1.0, h]; // columns: w as is, ψ = d̂₂/h so ∂/∂ψ = h·∂/∂d̂₂
        let mut k = [[0.0; 4]; 4];
        for (row, (sign, from_left)) in [(-1.0, true), (1.0, false)].iter().enumerate() {
            for comp in 0..2 {
                // comp 0: V (from ŝ index 1), comp 1: M (from ŝ index 0).
                let s_index = 1 - comp;
                for col in 0..4 {
                    let (m, c) = if col < 2 {
                        (if *from_left { &s0_d0 } else { &sl_d0 }, col)
                    } else {
                        (if *from_left { &s0_dl } else { &sl_dl }, col - 2)
                    };
                    k[2 * row + comp][col] = sign * force_scale[comp] * m[(s_index, c)] * disp_scale[c];
                }
            }
        }
        k
    }

    /// The transfer matrix of the member at ω in the state (w, ψ, Q, M) of [`super::transfer`].
    /// Accurate for a member no longer than one piece at ω (see [`Timoshenko::pieces`]).
    pub(crate) fn transfer(&self, omega: f64) -> Transfer {
        let h = self.length;
        let t = exp_scaled(&self.system(h, omega));
        // The scaled state is y = (w, h·ψ, h²·M/EI, h³·Q/EI); the physical one s = (w, ψ, Q, M),
        // so y = P·s with y₀ = s₀, y₁ = h·s₁, y₂ = (h²/EI)·s₃, y₃ = (h³/EI)·s₂, and T = P⁻¹·T̂·P.
        let p = [(0, 1.0), (1, h), (3, h * h / self.ei), (2, h * h * h / self.ei)];
        let mut full = [[0.0; 4]; 4];
        for (yi, &(si, scale_i)) in p.iter().enumerate() {
            for (yj, &(sj, scale_j)) in p.iter().enumerate() {
                full[si][sj] = t[(yi, yj)] * scale_j / scale_i;
            }
        }
        Transfer::from_full(&full)
    }

    /// Dynamic stiffness of [w₁, ψ₁, w₂, ψ₂] and the number of clamped–clamped frequencies below ω;
    /// `None` when the member would need more than [`MAX_PIECES`] pieces.
    pub(crate) fn stiffness_and_count(&self, omega: f64) -> Option<([[f64; 4]; 4], usize)> {
        let n = self.pieces(omega);
        if n > MAX_PIECES {
            return None;
        }
        let h = self.length / n as f64;
        let p = self.piece_stiffness(h, omega);
        if n == 1 {
            return Some((p, 0));
        }
        // Interior stations 1..n−1, two unknowns each, ordered (w, ψ) station by station.
        let interior = 2 * (n - 1);
        let mut kii = SymBand::zeros(interior, 3);
        for piece in 0..n {
            // Piece `piece` joins station `piece` (local 0,1) and `piece + 1` (local 2,3).
            let ids: [Option<usize>; 4] = std::array::from_fn(|a| {
                let station = piece + a / 2;
                (station >= 1 && station < n).then(|| 2 * (station - 1) + a % 2)
            });
            for a in 0..4 {
                for b in 0..=a {
                    if let (Some(i), Some(j)) = (ids[a], ids[b]) {
                        kii.add(i, j, p[a][b]);
                    }
                }
            }
        }
        // One factorisation gives both the count and the condensation. Without interchanges it
        // loses accuracy next to the member's own clamped–clamped frequencies, where the
        // condensed stiffness has poles anyway; it serves the count, while roots are polished on
        // layouts whose pieces are never condensed.
        let factors = kii.ldlt();
        let count = factors.negative();
        // Coupling of the member ends to the first and last interior stations.
        let mut kie = vec![[0.0; 4]; interior]; // columns: w₁, ψ₁, w₂, ψ₂
        for a in 0..2 {
            for b in 0..2 {
                kie[b][a] = p[2 + b][a]; // station 1 with the left end (piece 0, local 2,3 × 0,1)
                kie[interior - 2 + b][2 + a] = p[b][2 + a]; // station n−1 with the right end
            }
        }
        let solved: Vec<Vec<f64>> =
            (0..4).map(|c| factors.solve(&kie.iter().map(|r| r[c]).collect::<Vec<_>>())).collect();
        let mut k = [[0.0; 4]; 4];
        for a in 0..4 {
            for b in 0..4 {
                // K_ee: the left end sees piece 0's (0,1) block, the right end piece n−1's (2,3).
                let kee = match (a < 2, b < 2) {
                    (true, true) => p[a][b],
                    (false, false) => p[a][b],
                    _ => 0.0,
                };
                let correction: f64 = (0..interior).map(|i| kie[i][a] * solved[b][i]).sum();
                k[a][b] = kee - correction;
            }
        }
        Some((k, count))
    }

    /// The left-end state (w, ψ, M, Q) for end values q at ω, from the piece stiffness.
    pub(crate) fn start_state(&self, omega: f64, q: [f64; 4]) -> [f64; 4] {
        let k = self.piece_stiffness(self.length, omega);
        let v1: f64 = (0..4).map(|j| k[0][j] * q[j]).sum();
        let m1: f64 = (0..4).map(|j| k[1][j] * q[j]).sum();
        // Nodal force and moment on the left end are the negative section shear and moment.
        [q[0], q[1], -m1, -v1]
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

/// exp(A) by scaling and squaring: exp(A/2^s) from its Taylor series, squared s times, with
/// ‖A/2^s‖ ≤ ½ so that 18 terms reach rounding. Cheaper than carrying four columns through
/// the series, and its cost grows only with log ‖A‖.
fn exp_scaled(a: &Matrix4<f64>) -> Matrix4<f64> {
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
fn propagate(a: &Matrix4<f64>, y: Vector4<f64>, t: f64) -> Vector4<f64> {
    exp_scaled(&(a * t)) * y
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::member::Euler;

    #[test]
    fn stiff_in_shear_it_reduces_to_euler_bernoulli() {
        // With κGA → ∞ and ρI = 0 the Timoshenko member is the Euler–Bernoulli one: the
        // stiffness and the clamped–clamped count must agree, including past several poles.
        let t = Timoshenko { length: 2.0, ei: 5.0, kga: 1e14, m: 1.5, rho_i: 0.0 };
        let e = Euler { length: 2.0, ei: 5.0, m: 1.5 };
        for lambda in [0.3, 2.0, 4.0, 6.1, 9.5, 15.0, 23.0] {
            let omega = (lambda / 2.0f64).powi(2) * (5.0f64 / 1.5).sqrt();
            let (kt, count) = t.stiffness_and_count(omega).unwrap();
            let ke = e.stiffness(omega);
            assert_eq!(count, e.clamped_count(omega), "λ = {lambda}");
            let scale = ke.iter().flatten().fold(0.0f64, |m, v| m.max(v.abs()));
            for i in 0..4 {
                for j in 0..4 {
                    assert!(
                        (kt[i][j] - ke[i][j]).abs() < 1e-7 * scale,
                        "λ = {lambda} ({i},{j}): {} vs {}",
                        kt[i][j],
                        ke[i][j]
                    );
                }
            }
        }
    }

    #[test]
    fn stiffness_is_symmetric_and_static_limit_matches_the_shear_element() {
        let t = Timoshenko { length: 0.5, ei: 2.0e4, kga: 3.0e5, m: 20.0, rho_i: 0.02 };
        let (k, _) = t.stiffness_and_count(1e-6).unwrap();
        let (l, p) = (t.length, 12.0 * t.ei / (t.kga * t.length * t.length));
        // Static stiffness of a Timoshenko beam element (Przemieniecki 1968 — from memory).
        let c = t.ei / ((1.0 + p) * l.powi(3));
        let row1 = [6.0 * l, (4.0 + p) * l * l, -6.0 * l, (2.0 - p) * l * l];
        for j in 0..4 {
            assert!((k[1][j] - c * row1[j]).abs() < 1e-8 * (c * row1[j]).abs(), "{j}");
        }
        let (k, _) = t.stiffness_and_count(900.0).unwrap();
        for i in 0..4 {
            for j in 0..4 {
                assert!((k[i][j] - k[j][i]).abs() < 1e-9 * k[i][j].abs().max(1.0));
            }
        }
    }

    #[test]
    fn scaled_exponential_matches_nalgebra() {
        // nalgebra's Padé approximant is an independent implementation of the same function.
        let a =
            Matrix4::new(0.0, 1.0, 0.0, 900.0, 0.0, 0.0, 1.0, 0.0, 0.0, -0.3, 0.0, -1.0, -2.0, 0.0, 0.0, 0.0);
        let (ours, reference) = (exp_scaled(&a), a.exp());
        let scale = reference.abs().max();
        assert!((ours - reference).abs().max() < 1e-11 * scale, "{ours} vs {reference}");
    }

    #[test]
    fn interior_values_reproduce_the_ends() {
        let t = Timoshenko { length: 0.05, ei: 2.0e4, kga: 3.0e5, m: 20.0, rho_i: 0.02 };
        let q = [0.2, -0.7, 0.4, 1.1];
        let omega = 1500.0;
        let (w, psi) = t.propagate(omega, t.start_state(omega, q), t.length);
        assert!((w - q[2]).abs() < 1e-10 && (psi - q[3]).abs() < 1e-9, "{w} {psi}");
    }
}
