//! The exact dynamic stiffness of a uniform Euler–Bernoulli member, its clamped–clamped count,
//! and the deflection inside it.
//!
//! With λ = L·(mω²/EI)^¼ and s = sin λ, c = cos λ, S = sinh λ, C = cosh λ, D = 1 − C·c, the
//! stiffness of the end displacements [w₁, θ₁, w₂, θ₂] is (EI/L³) times
//!
//! ```text
//!  [  F     L·H    −F̄     L·H̄ ]     F = λ³(S c + C s)/D    F̄ = λ³(S + s)/D
//!  [  L·H   L²A   −L·H̄   L²B  ]     H = λ² S s/D           H̄ = λ²(C − c)/D
//!  [ −F̄   −L·H̄    F     −L·H  ]     A = λ (C s − S c)/D    B = λ (S − s)/D
//!  [  L·H̄  L²B   −L·H    L²A  ]
//! ```
//!
//! Two numerical hazards are handled. For small λ the numerators and D all vanish like powers
//! of λ and their direct evaluation cancels catastrophically, so the ratios are summed as power
//! series in t = λ⁴ with the common powers divided out. For large λ, C and S overflow, so
//! numerator and denominator are divided by C first.

use super::transfer::Transfer;

/// Terms of each series: the 12th term is below 1e-19 of the first at λ = 1.6.
pub(super) const SERIES_TERMS: usize = 12;

/// A uniform Euler–Bernoulli member.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Euler {
    pub(crate) length: f64,
    pub(crate) ei: f64,
    pub(crate) m: f64,
}

impl Euler {
    /// The frequency parameter λ = L·(mω²/EI)^¼.
    pub(crate) fn lambda(&self, omega: f64) -> f64 {
        self.length * self.beta(omega)
    }

    /// The wavenumber β = (mω²/EI)^¼, 1/m.
    pub(crate) fn beta(&self, omega: f64) -> f64 {
        (self.m * omega * omega / self.ei).sqrt().sqrt()
    }

    /// The transfer matrix of the member at ω in the state (w, θ, Q, M) of [`super::transfer`],
    /// from the Krylov–Duncan functions (summed as series, so only for members with λ below
    /// about 2: the sweep cuts longer ones).
    #[inline(always)]
    pub(crate) fn transfer(&self, omega: f64) -> Transfer {
        let b4 = self.m * omega * omega / self.ei;
        let [k1, k2, k3, k4] = krylov_inline(b4, self.length);
        let ei = self.ei;
        Transfer::from_full(&[
            [k1, k2, -k4 / ei, k3 / ei],
            [b4 * k4, k1, -k3 / ei, k2 / ei],
            [-ei * b4 * k2, -ei * b4 * k3, k1, -b4 * k4],
            [ei * b4 * k3, ei * b4 * k4, -k2, k1],
        ])
    }

    /// Deflection and slope at distance `x` from the left end, carried from the left-end state
    /// by the Krylov–Duncan functions, summed as series. Accurate while β·x stays below about 2;
    /// the shape solver cuts members into pieces short enough for that.
    pub(crate) fn propagate(&self, omega: f64, state: [f64; 4], x: f64) -> (f64, f64) {
        let [w0, t0, moment, shear] = state;
        let b4 = self.m * omega * omega / self.ei;
        let s = krylov(b4, x);
        let w = w0 * s[0] + t0 * s[1] - moment * s[2] + shear * s[3];
        let slope = w0 * b4 * s[3] + t0 * s[0] - moment * s[1] + shear * s[2];
        (w, slope)
    }

    /// The bending moment EI·w″ at distance `x` from the left end, from the left-end state.
    pub(crate) fn moment(&self, omega: f64, state: [f64; 4], x: f64) -> f64 {
        let [w0, t0, moment, shear] = state;
        let b4 = self.m * omega * omega / self.ei;
        let [k1, k2, k3, k4] = krylov(b4, x);
        self.ei * (w0 * b4 * k3 + t0 * b4 * k4 - moment * k1 + shear * k2)
    }
}

/// Krylov–Duncan functions scaled to stay finite as β → 0:
/// [K₁(βx), K₂(βx)/β, K₃(βx)/β², K₄(βx)/β³] with Kᵢ(z) = Σ z^(4k+i−1)/(4k+i−1)!.
///
/// Each is xⁱ⁻¹ times a power series in u = β⁴x⁴ with coefficients 1/(4k+i−1)!, whose terms
/// are all positive, so the sums lose nothing to cancellation. For u up to [`HORNER_LIMIT`]
/// (λ = βx ≤ 3, all the sweep and the shapes use) nine terms are summed by Horner's rule, the
/// ninth below 1e-20 of the first; beyond it the terms are summed until they stop changing the
/// sums.
pub(super) fn krylov(beta4: f64, x: f64) -> [f64; 4] {
    krylov_inline(beta4, x)
}

/// [`krylov`], inlined where it is called: the transfer matrix of the station sweep's pieces
/// (see [`Euler::transfer`]).
#[inline(always)]
fn krylov_inline(beta4: f64, x: f64) -> [f64; 4] {
    let u = beta4 * x.powi(4);
    let powers = [1.0, x, x * x, x * x * x];
    if u <= HORNER_LIMIT {
        return std::array::from_fn(|i| {
            let c = &HORNER[i];
            let sum = c[0]
                + u * (c[1]
                    + u * (c[2] + u * (c[3] + u * (c[4] + u * (c[5] + u * (c[6] + u * (c[7] + u * c[8])))))));
            powers[i] * sum
        });
    }
    let mut out = [0.0; 4];
    let mut term = [1.0, x, x * x / 2.0, x * x * x / 6.0];
    for k in 0..SERIES_TERMS {
        for (i, t) in term.iter_mut().enumerate() {
            out[i] += *t;
            let n = (4 * k + i) as f64;
            *t *= u / ((n + 1.0) * (n + 2.0) * (n + 3.0) * (n + 4.0));
        }
        // The terms fall by u/(4k)⁴ each round; stop once they no longer change any sum.
        if (0..4).all(|i| term[i].abs() <= 1e-17 * out[i].abs()) {
            break;
        }
    }
    out
}

/// Largest u = (βx)⁴ summed by [`HORNER`]: λ = 3 and a little over. The ninth term of the
/// first series is then u⁸/32! ≈ 8e-21 of the sum.
const HORNER_LIMIT: f64 = 81.8;

/// 1/(4k + i)! for i = 0..3 and k = 0..8, computed at compile time.
const HORNER: [[f64; 9]; 4] = {
    let mut out = [[0.0; 9]; 4];
    let mut i = 0;
    while i < 4 {
        let mut k = 0;
        while k < 9 {
            let n = 4 * k + i;
            let mut f = 1.0;
            let mut j = 2;
            while j <= n {
                f *= j as f64;
                j += 1;
            }
            out[i][k] = 1.0 / f;
            k += 1;
        }
        i += 1;
    }
    out
};

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn both_ways_of_summing_the_krylov_functions_agree() {
        // Horner's nine terms and the open-ended sum, on either side of the switch, against the
        // closed forms (cosh z ± cos z)/2 and (sinh z ± sin z)/2 (their definitions).
        for lambda in [0.0, 0.3, 1.0, 1.5, 1.51, 2.0, 2.9, 3.0, 3.01, 3.5] {
            let x = 0.7;
            let beta: f64 = lambda / x;
            let k = krylov(beta.powi(4), x);
            let z: f64 = lambda;
            if z == 0.0 {
                assert_eq!(k, [1.0, x, x * x / 2.0, x * x * x / 6.0]);
                continue;
            }
            let want = [
                0.5 * (z.cosh() + z.cos()),
                0.5 * (z.sinh() + z.sin()) / beta,
                0.5 * (z.cosh() - z.cos()) / (beta * beta),
                0.5 * (z.sinh() - z.sin()) / beta.powi(3),
            ];
            // The closed forms of K₃ and K₄ cancel like z², so they are only good to about ε/z².
            let tolerance = 1e-15 + 4.0 * f64::EPSILON / (z * z);
            for i in 0..4 {
                assert!(
                    (k[i] - want[i]).abs() <= tolerance * want[i].abs(),
                    "λ = {lambda}, K{}: {} vs {}",
                    i + 1,
                    k[i],
                    want[i]
                );
            }
        }
    }

    #[test]
    fn interior_deflection_reproduces_the_transfer_matrix() {
        // Carrying a state to the far end by the interior formulas and by the transfer matrix are
        // two evaluations of the same Krylov–Duncan functions; they must agree.
        let member = Euler { length: 0.4, ei: 2.0, m: 3.0 };
        let omega = 9.0; // λ ≈ 1.0
        let s = [0.3, -1.2, 0.8, 0.5];
        let t = member.transfer(omega);
        let (w1, t1) =
            member.propagate(omega, [s[0], s[1], -s[3] / member.ei, -s[2] / member.ei], member.length);
        let w = t.t11[0][0] * s[0] + t.t11[0][1] * s[1] + t.t12[0][0] * s[2] + t.t12[0][1] * s[3];
        let th = t.t11[1][0] * s[0] + t.t11[1][1] * s[1] + t.t12[1][0] * s[2] + t.t12[1][1] * s[3];
        assert!((w1 - w).abs() < 1e-13 && (t1 - th).abs() < 1e-13, "{w1} {w}; {t1} {th}");
    }
}
