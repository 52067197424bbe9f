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

/// Below this λ the power series are used; above it the closed forms (D > 1 there until the
/// first clamped–clamped root at λ ≈ 4.73, so no cancellation).
const SERIES_LIMIT: f64 = 1.6;

/// Terms of each series: the 12th term is below 1e-19 of the first at λ = 1.6.
const SERIES_TERMS: usize = 12;

/// A uniform Euler–Bernoulli member.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Euler {
    pub(crate) length: f64,
    pub(crate) ei: f64,
    pub(crate) m: f64,
}

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
    /// The frequency parameter λ = L·(mω²/EI)^¼.
    pub(crate) fn lambda(&self, omega: f64) -> f64 {
        self.length * self.beta(omega)
    }

    /// The wavenumber β = (mω²/EI)^¼, 1/m.
    pub(crate) fn beta(&self, omega: f64) -> f64 {
        (self.m * omega * omega / self.ei).sqrt().sqrt()
    }

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

    /// The left-end state (w, θ, M/EI, V/EI) for end values q at ω: deflection, slope, and the
    /// nodal moment and force (from the dynamic stiffness) per unit EI.
    pub(crate) fn start_state(&self, omega: f64, q: [f64; 4]) -> [f64; 4] {
        let k = self.stiffness(omega);
        let shear = (0..4).map(|j| k[0][j] * q[j]).sum::<f64>() / self.ei;
        let moment = (0..4).map(|j| k[1][j] * q[j]).sum::<f64>() / self.ei;
        [q[0], q[1], moment, shear]
    }

    /// The transfer matrix of the member at ω in the state (w, θ, Q, M) of [`super::transfer`],
    /// from the Krylov–Duncan functions (summed as series, so only for members with λ below
    /// about 2: the sweep cuts longer ones).
    pub(crate) fn transfer(&self, omega: f64) -> Transfer {
        let b4 = self.m * omega * omega / self.ei;
        let [k1, k2, k3, k4] = krylov(b4, self.length);
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
}

/// Krylov–Duncan functions scaled to stay finite as β → 0:
/// [K₁(βx), K₂(βx)/β, K₃(βx)/β², K₄(βx)/β³] with Kᵢ(z) = Σ z^(4k+i−1)/(4k+i−1)!.
fn krylov(beta4: f64, x: f64) -> [f64; 4] {
    let u = beta4 * x.powi(4);
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
    fn interior_deflection_reproduces_the_end_values() {
        let member = Euler { length: 0.4, ei: 2.0, m: 3.0 };
        let omega = 9.0; // λ ≈ 1.0
        let q = [0.3, -1.2, 0.8, 0.5];
        let state = member.start_state(omega, q);
        let (w0, t0) = member.propagate(omega, state, 0.0);
        let (w1, t1) = member.propagate(omega, state, member.length);
        for (got, want) in [(w0, q[0]), (t0, q[1]), (w1, q[2]), (t1, q[3])] {
            assert!((got - want).abs() < 1e-12, "{got} vs {want}");
        }
    }
}
