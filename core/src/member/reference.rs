//! The members' closed-form dynamic stiffness and clamped–clamped count: what the exact method
//! assembled before the station sweep, kept as the independent reference the transfer matrices,
//! the sweep and its solves are tested against.
//!
//! With λ = L·(mω²/EI)^¼ and s = sin λ, c = cos λ, S = sinh λ, C = cosh λ, D = 1 − C·c, the
//! slender member's stiffness of [w₁, θ₁, w₂, θ₂] is (EI/L³) times
//!
//! ```text
//!  [  F     L·H    −F̄     L·H̄ ]     F = λ³(S c + C s)/D    F̄ = λ³(S + s)/D
//!  [  L·H   L²A   −L·H̄   L²B  ]     H = λ² S s/D           H̄ = λ²(C − c)/D
//!  [ −F̄   −L·H̄    F     −L·H  ]     A = λ (C s − S c)/D    B = λ (S − s)/D
//!  [  L·H̄  L²B   −L·H    L²A  ]
//! ```
//!
//! For small λ the numerators and D all vanish like powers of λ and their direct evaluation
//! cancels, so the ratios are summed as power series in t = λ⁴; for large λ numerator and
//! denominator are divided by cosh λ first. The shear-flexible member's stiffness is condensed
//! from a chain of transfer-matrix pieces, its count read from the chain's interior pivots
//! (Wittrick–Williams applied to the chain).

use super::euler::SERIES_TERMS;
use super::timoshenko::{exp_scaled, MAX_PIECES};
use super::{Euler, Member, Timoshenko};
use crate::band::SymBand;
use nalgebra::Matrix2;

/// A member's dynamic stiffness of [w₁, θ₁, w₂, θ₂] and its count of clamped–clamped
/// frequencies below the trial frequency.
pub(crate) type Evaluated = ([[f64; 4]; 4], usize);

/// Below this λ the power series are used; above it the closed forms (D > 1 there until the
/// first clamped–clamped root at λ ≈ 4.73, so no cancellation).
const SERIES_LIMIT: f64 = 1.6;

/// The six stiffness functions of λ, already including their powers of λ (static limits
/// F = F̄ = 12, H = H̄ = 6, A = 4, B = 2).
#[derive(Clone, Copy, Debug, PartialEq)]
struct Functions {
    f: f64,
    fb: f64,
    h: f64,
    hb: f64,
    a: f64,
    b: f64,
}

/// 1/n! for n = 0 ..= 4·SERIES_TERMS + 3, computed once at compile time.
const INVERSE_FACTORIALS: [f64; 4 * SERIES_TERMS + 4] = {
    let mut out = [1.0; 4 * SERIES_TERMS + 4];
    let mut k = 1;
    while k < out.len() {
        out[k] = out[k - 1] / k as f64;
        k += 1;
    }
    out
};

fn functions(lambda: f64) -> Functions {
    if lambda < SERIES_LIMIT {
        series(lambda)
    } else {
        closed(lambda)
    }
}

/// Power series in t = λ⁴ of each numerator and of D, with λ⁴ divided out of D.
fn series(lambda: f64) -> Functions {
    let inv = &INVERSE_FACTORIALS;
    let t = lambda.powi(4);
    let (mut d, mut nf, mut nfb, mut nh, mut nhb, mut na, mut nb) = (0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0);
    let mut tk = 1.0; // t^k
    let mut alt = 1.0; // (−4)^k
    for k in 0..SERIES_TERMS {
        let kk = 4 * k;
        // D/λ⁴ = Σ (−1)^k 4^(k+1) t^k / (4k+4)!  — note −(−4)^(k+1) = 4·(−4)^k.
        let signed = alt * tk;
        d += 4.0 * signed * inv[kk + 4];
        nf += 2.0 * signed * inv[kk + 1];
        nfb += 2.0 * tk * inv[kk + 1];
        nh += 2.0 * signed * inv[kk + 2];
        nhb += 2.0 * tk * inv[kk + 2];
        na += 4.0 * signed * inv[kk + 3];
        nb += 2.0 * tk * inv[kk + 3];
        tk *= t;
        alt *= -4.0;
    }
    let r = 1.0 / d;
    Functions { f: nf * r, fb: nfb * r, h: nh * r, hb: nhb * r, a: na * r, b: nb * r }
}

/// The closed forms with numerator and denominator divided by cosh λ.
fn closed(lambda: f64) -> Functions {
    let (s, c) = lambda.sin_cos();
    // tanh λ and sech λ from one exponential (λ > 0 here).
    let q = (-lambda).exp();
    let q2 = q * q;
    let over = 1.0 / (1.0 + q2);
    let tau = (1.0 - q2) * over;
    let e = 2.0 * q * over;
    let r = 1.0 / (e - c);
    let l1 = lambda * r;
    let l2 = lambda * l1;
    let l3 = lambda * l2;
    Functions {
        f: l3 * (tau * c + s),
        fb: l3 * (tau + s * e),
        h: l2 * tau * s,
        hb: l2 * (1.0 - c * e),
        a: l1 * (s - tau * c),
        b: l1 * (tau - s * e),
    }
}

/// 1/cosh λ without overflow.
fn sech(lambda: f64) -> f64 {
    let q = (-lambda.abs()).exp();
    2.0 * q / (1.0 + q * q)
}

impl Euler {
    /// The 4×4 dynamic stiffness of [w₁, θ₁, w₂, θ₂].
    pub(crate) fn stiffness(&self, omega: f64) -> [[f64; 4]; 4] {
        let l = self.length;
        let g = functions(self.lambda(omega));
        let k = self.ei / (l * l * l);
        let (f, fb, h, hb, a, b) =
            (g.f * k, g.fb * k, g.h * k * l, g.hb * k * l, g.a * k * l * l, g.b * k * l * l);
        [[f, h, -fb, hb], [h, a, -hb, b], [-fb, -hb, f, -h], [hb, b, -h, a]]
    }

    /// Number of the member's clamped–clamped natural frequencies strictly below ω:
    /// J = i − ½[1 − (−1)^i·sgn(1 − cosh λ·cos λ)] with i = ⌊λ/π⌋.
    pub(crate) fn clamped_count(&self, omega: f64) -> usize {
        let lambda = self.lambda(omega);
        if lambda < 4.0 {
            return 0; // The first root is λ = 4.730…; D > 0 below it.
        }
        let i = (lambda / std::f64::consts::PI).floor().min(1e12);
        // sgn(1 − C·c) = sgn(sech λ − cos λ) since cosh λ > 0.
        let sign = (sech(lambda) - lambda.cos()).signum();
        let parity = if i % 2.0 == 0.0 { 1.0 } else { -1.0 };
        (i - 0.5 * (1.0 - parity * sign)) as usize
    }
}

impl Timoshenko {
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
}

impl Member {
    /// Dynamic stiffness of [w₁, θ₁, w₂, θ₂] at angular frequency ω, and the number of the
    /// member's clamped–clamped natural frequencies strictly below ω (its share of J₀); `None`
    /// when a shear-flexible member is beyond what can be computed (see `MAX_PIECES`), and for
    /// a beam-column, which has no closed form kept here (its checks are against the classical
    /// beam-column results instead).
    pub(crate) fn stiffness_and_count(&self, omega: f64) -> Option<Evaluated> {
        match self {
            Member::Euler(e) => Some((e.stiffness(omega), e.clamped_count(omega))),
            Member::Timoshenko(t) => t.stiffness_and_count(omega),
            Member::Column(_) => None,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn series_and_closed_forms_agree_where_they_meet() {
        // Both forms are exact; at λ = 1.6 they must agree to rounding.
        for lambda in [1.2, 1.6, 2.0] {
            let (a, b) = (series(lambda), closed(lambda));
            for (x, y) in [(a.f, b.f), (a.fb, b.fb), (a.h, b.h), (a.hb, b.hb), (a.a, b.a), (a.b, b.b)] {
                assert!((x - y).abs() <= 1e-12 * y.abs(), "λ = {lambda}: {x} vs {y}");
            }
        }
    }

    #[test]
    fn small_lambda_matches_static_stiffness_minus_consistent_mass() {
        // K(ω) = K_static − ω²·M_consistent + O(λ⁸) for the Hermite-cubic matrices (standard
        // finite-element textbooks, e.g. Przemieniecki, Theory of Matrix Structural Analysis).
        let member = Euler { length: 0.7, ei: 3.0, m: 2.0 };
        let l = member.length;
        let ks = [[12.0, 6.0 * l, -12.0, 6.0 * l], [6.0 * l, 4.0 * l * l, -6.0 * l, 2.0 * l * l]];
        let ms = [[156.0, 22.0 * l, 54.0, -13.0 * l], [22.0 * l, 4.0 * l * l, 13.0 * l, -3.0 * l * l]];
        // The static part must be exact at ω = 0; the inertia part must match −ω²M to O(λ⁴).
        let k0 = member.stiffness(0.0);
        let omega = 0.1;
        let lambda4 = member.lambda(omega).powi(4);
        let k = member.stiffness(omega);
        for i in 0..2 {
            for j in 0..4 {
                let stat = member.ei / l.powi(3) * ks[i][j];
                assert!((k0[i][j] - stat).abs() < 1e-13 * stat.abs(), "static {i},{j}");
                let inertia = -omega * omega * member.m * l / 420.0 * ms[i][j];
                let got = k[i][j] - k0[i][j];
                assert!(
                    (got - inertia).abs() < lambda4 * inertia.abs(),
                    "inertia {i},{j}: {got} vs {inertia}"
                );
            }
        }
    }

    #[test]
    fn large_lambda_stays_finite() {
        let member = Euler { length: 1.0, ei: 1.0, m: 1.0 };
        for lambda in [50.0, 400.0, 800.0, 5000.0] {
            let k = member.stiffness(lambda * lambda);
            assert!(k.iter().flatten().all(|v| v.is_finite()), "λ = {lambda}");
        }
    }

    #[test]
    fn clamped_count_matches_a_direct_root_count() {
        // Count the roots of cosh λ·cos λ = 1 below λ by scanning for sign changes of
        // sech λ − cos λ on a fine grid, and compare with the closed-form count.
        let member = Euler { length: 1.0, ei: 1.0, m: 1.0 };
        let mut roots = 0;
        let mut previous = sech(0.5) - 0.5f64.cos();
        let mut lambda = 0.5;
        while lambda < 60.0 {
            let next = lambda + 1e-3;
            let value = sech(next) - next.cos();
            if value.signum() != previous.signum() {
                roots += 1;
            }
            previous = value;
            lambda = next;
            if (lambda * 1000.0).round() as i64 % 250 == 0 {
                assert_eq!(member.clamped_count(lambda * lambda), roots, "λ = {lambda}");
            }
        }
    }

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
    fn interior_values_reproduce_the_transfer_matrix() {
        let t = Timoshenko { length: 0.05, ei: 2.0e4, kga: 3.0e5, m: 20.0, rho_i: 0.02 };
        let omega = 1500.0;
        let s = [0.2, -0.7, 40.0, 1.1];
        let m = t.transfer(omega);
        let (w, psi) = t.propagate(omega, Member::Timoshenko(t).start_from(s), t.length);
        let w_t = m.t11[0][0] * s[0] + m.t11[0][1] * s[1] + m.t12[0][0] * s[2] + m.t12[0][1] * s[3];
        let psi_t = m.t11[1][0] * s[0] + m.t11[1][1] * s[1] + m.t12[1][0] * s[2] + m.t12[1][1] * s[3];
        assert!((w - w_t).abs() < 1e-12 && (psi - psi_t).abs() < 1e-11, "{w} {w_t}; {psi} {psi_t}");
    }
}
