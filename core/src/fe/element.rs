//! The two-node beam element: Hermite cubics for Euler–Bernoulli, and for Timoshenko the
//! interdependent-interpolation element, whose shape functions solve the static Timoshenko
//! equations exactly and so do not lock in shear.
//!
//! With ξ = x/L and Φ = 12EI/(κGA·L²) (Φ = 0 without shear deformation), the deflection and the
//! section rotation of the element are w = N_w·q and ψ = N_ψ·q for q = [w₁, θ₁, w₂, θ₂]:
//!
//! ```text
//! (1+Φ)·N_w = [ 2ξ³−3ξ²−Φξ+1+Φ,  L(ξ³−(2+Φ/2)ξ²+(1+Φ/2)ξ),  −2ξ³+3ξ²+Φξ,  L(ξ³−(1−Φ/2)ξ²−(Φ/2)ξ) ]
//! (1+Φ)·N_ψ = [ 6(ξ²−ξ)/L,       3ξ²−(4+Φ)ξ+1+Φ,             −6(ξ²−ξ)/L,   3ξ²−(2−Φ)ξ ]
//! ```
//!
//! Stiffness, mass and load vectors are integrated from these functions by Gauss–Legendre
//! quadrature, exact for their polynomial degrees, rather than typed in.

/// Properties of one element.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Element {
    pub(crate) length: f64,
    pub(crate) ei: f64,
    /// κGA, N; infinite for Euler–Bernoulli.
    pub(crate) kga: f64,
    pub(crate) mass_per_length: f64,
    /// ρI, kg·m; zero for Euler–Bernoulli.
    pub(crate) rotary_inertia_per_length: f64,
    /// Axial force, N, tension positive (slender elements only).
    pub(crate) axial: f64,
}

/// Gauss–Legendre 4-point rule on [0, 1] (Abramowitz & Stegun, table 25.4), exact to degree 7.
const GAUSS4: [(f64, f64); 4] = [
    (0.069_431_844_202_973_71, 0.173_927_422_568_726_93),
    (0.330_009_478_207_571_87, 0.326_072_577_431_273_07),
    (0.669_990_521_792_428_1, 0.326_072_577_431_273_07),
    (0.930_568_155_797_026_3, 0.173_927_422_568_726_93),
];

/// Values at ξ of the shape functions and their x-derivatives.
struct Shapes {
    w: [f64; 4],
    dw: [f64; 4],
    psi: [f64; 4],
    dpsi: [f64; 4],
}

impl Element {
    fn phi(&self) -> f64 {
        if self.kga.is_finite() {
            12.0 * self.ei / (self.kga * self.length * self.length)
        } else {
            0.0
        }
    }

    fn shapes(&self, xi: f64) -> Shapes {
        let (l, p) = (self.length, self.phi());
        let s = 1.0 / (1.0 + p);
        let (x2, x3) = (xi * xi, xi * xi * xi);
        let w = [
            s * (2.0 * x3 - 3.0 * x2 - p * xi + 1.0 + p),
            s * l * (x3 - (2.0 + 0.5 * p) * x2 + (1.0 + 0.5 * p) * xi),
            s * (-2.0 * x3 + 3.0 * x2 + p * xi),
            s * l * (x3 - (1.0 - 0.5 * p) * x2 - 0.5 * p * xi),
        ];
        // d/dx = (1/L)·d/dξ.
        let dw = [
            s * (6.0 * x2 - 6.0 * xi - p) / l,
            s * (3.0 * x2 - (4.0 + p) * xi + 1.0 + 0.5 * p),
            s * (-6.0 * x2 + 6.0 * xi + p) / l,
            s * (3.0 * x2 - (2.0 - p) * xi - 0.5 * p),
        ];
        let psi = [
            s * 6.0 * (x2 - xi) / l,
            s * (3.0 * x2 - (4.0 + p) * xi + 1.0 + p),
            -s * 6.0 * (x2 - xi) / l,
            s * (3.0 * x2 - (2.0 - p) * xi),
        ];
        let dpsi = [
            s * 6.0 * (2.0 * xi - 1.0) / (l * l),
            s * (6.0 * xi - 4.0 - p) / l,
            -s * 6.0 * (2.0 * xi - 1.0) / (l * l),
            s * (6.0 * xi - 2.0 + p) / l,
        ];
        Shapes { w, dw, psi, dpsi }
    }

    /// Stiffness: ∫ EI·ψ′ψ′ + κGA·(w′ − ψ)(w′ − ψ) dx, plus the consistent geometric stiffness
    /// of the axial force, ∫ P·w′w′ dx ((P/30L)·[36, 3L, −36, 3L; …] for the cubic element).
    pub(crate) fn stiffness(&self) -> [[f64; 4]; 4] {
        let mut k = [[0.0; 4]; 4];
        let shear = self.kga.is_finite();
        for (xi, weight) in GAUSS4 {
            let n = self.shapes(xi);
            let gamma: [f64; 4] = std::array::from_fn(|i| n.dw[i] - n.psi[i]);
            for i in 0..4 {
                for j in 0..4 {
                    let mut v = self.ei * n.dpsi[i] * n.dpsi[j] + self.axial * n.dw[i] * n.dw[j];
                    if shear {
                        v += self.kga * gamma[i] * gamma[j];
                    }
                    k[i][j] += weight * self.length * v;
                }
            }
        }
        k
    }

    /// Consistent mass: ∫ m·w·w + ρI·ψ·ψ dx.
    pub(crate) fn mass(&self) -> [[f64; 4]; 4] {
        let mut m = [[0.0; 4]; 4];
        for (xi, weight) in GAUSS4 {
            let n = self.shapes(xi);
            for i in 0..4 {
                for j in 0..4 {
                    let v = self.mass_per_length * n.w[i] * n.w[j]
                        + self.rotary_inertia_per_length * n.psi[i] * n.psi[j];
                    m[i][j] += weight * self.length * v;
                }
            }
        }
        m
    }

    /// The deflection and rotation shape functions at ξ = x/L: w = N_w·q, ψ = N_ψ·q (the
    /// rotation of a slender element's section is w′, which N_ψ then equals).
    pub(crate) fn at(&self, xi: f64) -> ([f64; 4], [f64; 4]) {
        let n = self.shapes(xi);
        (n.w, n.psi)
    }

    /// The strain and kinetic energies (both times two) of the element's field for end values q,
    /// summed as squares at the quadrature points rather than as qᵀKq and qᵀMq: the sums of
    /// squares cannot lose their sign or their digits to cancellation, however short the element.
    pub(crate) fn energies(&self, q: &[f64; 4]) -> (f64, f64) {
        let (mut strain, mut kinetic) = (0.0, 0.0);
        let shear = self.kga.is_finite();
        let dot = |a: &[f64; 4]| -> f64 { (0..4).map(|i| a[i] * q[i]).sum() };
        for (xi, weight) in GAUSS4 {
            let n = self.shapes(xi);
            let curvature = dot(&n.dpsi);
            let mut u = self.ei * curvature * curvature;
            if shear {
                let gamma: [f64; 4] = std::array::from_fn(|i| n.dw[i] - n.psi[i]);
                let g = dot(&gamma);
                u += self.kga * g * g;
            }
            let (w, psi, slope) = (dot(&n.w), dot(&n.psi), dot(&n.dw));
            u += self.axial * slope * slope;
            strain += weight * self.length * u;
            kinetic += weight
                * self.length
                * (self.mass_per_length * w * w + self.rotary_inertia_per_length * psi * psi);
        }
        (strain, kinetic)
    }

    /// Consistent nodal loads of a uniform transverse load q (N/m): ∫ q·N_w dx.
    pub(crate) fn uniform_load(&self, q: f64) -> [f64; 4] {
        let mut f = [0.0; 4];
        for (xi, weight) in GAUSS4 {
            let n = self.shapes(xi);
            for i in 0..4 {
                f[i] += weight * self.length * q * n.w[i];
            }
        }
        f
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn element(kga: f64, rho_i: f64) -> Element {
        Element {
            length: 0.8,
            ei: 2.0e3,
            kga,
            mass_per_length: 3.0,
            rotary_inertia_per_length: rho_i,
            axial: 0.0,
        }
    }

    #[test]
    fn hermite_matrices_match_the_textbook_forms() {
        // The Hermite-cubic stiffness (EI/L³)[12, 6L, −12, 6L; …] and consistent mass
        // (mL/420)[156, 22L, 54, −13L; …] (Przemieniecki, Theory of Matrix Structural Analysis,
        // 1968 — from memory).
        let e = element(f64::INFINITY, 0.0);
        let l = e.length;
        let ks = [
            [12.0, 6.0 * l, -12.0, 6.0 * l],
            [6.0 * l, 4.0 * l * l, -6.0 * l, 2.0 * l * l],
            [-12.0, -6.0 * l, 12.0, -6.0 * l],
            [6.0 * l, 2.0 * l * l, -6.0 * l, 4.0 * l * l],
        ];
        let ms = [
            [156.0, 22.0 * l, 54.0, -13.0 * l],
            [22.0 * l, 4.0 * l * l, 13.0 * l, -3.0 * l * l],
            [54.0, 13.0 * l, 156.0, -22.0 * l],
            [-13.0 * l, -3.0 * l * l, -22.0 * l, 4.0 * l * l],
        ];
        let (k, m) = (e.stiffness(), e.mass());
        for i in 0..4 {
            for j in 0..4 {
                let kx = e.ei / l.powi(3) * ks[i][j];
                let mx = e.mass_per_length * l / 420.0 * ms[i][j];
                assert!((k[i][j] - kx).abs() < 1e-10 * kx.abs().max(1.0), "K {i}{j}");
                assert!((m[i][j] - mx).abs() < 1e-13 * mx.abs().max(1.0), "M {i}{j}");
            }
        }
        let f = e.uniform_load(5.0);
        let expect = [5.0 * l / 2.0, 5.0 * l * l / 12.0, 5.0 * l / 2.0, -5.0 * l * l / 12.0];
        for i in 0..4 {
            assert!((f[i] - expect[i]).abs() < 1e-13);
        }
    }

    #[test]
    fn geometric_stiffness_matches_the_textbook_form() {
        // (P/30L)·[36, 3L, −36, 3L; 3L, 4L², −3L, −L²; …] (Przemieniecki, Theory of Matrix
        // Structural Analysis, 1968 — from memory), as the difference the axial force makes.
        let bare = element(f64::INFINITY, 0.0);
        let loaded = Element { axial: -150.0, ..bare };
        let (l, p) = (bare.length, loaded.axial);
        let g = [
            [36.0, 3.0 * l, -36.0, 3.0 * l],
            [3.0 * l, 4.0 * l * l, -3.0 * l, -l * l],
            [-36.0, -3.0 * l, 36.0, -3.0 * l],
            [3.0 * l, -l * l, -3.0 * l, 4.0 * l * l],
        ];
        let (k0, k1) = (bare.stiffness(), loaded.stiffness());
        for i in 0..4 {
            for j in 0..4 {
                let want = p / (30.0 * l) * g[i][j];
                assert!((k1[i][j] - k0[i][j] - want).abs() < 1e-9 * want.abs().max(1.0), "{i}{j}");
            }
        }
    }

    #[test]
    fn shear_element_matches_its_closed_form_stiffness() {
        // K = EI/((1+Φ)L³)·[12, 6L, −12, 6L; 6L, (4+Φ)L², −6L, (2−Φ)L²; …] for the element
        // whose shape functions solve the static Timoshenko equations (Przemieniecki 1968 — from
        // memory).
        let e = element(5.0e4, 0.01);
        let (l, p) = (e.length, e.phi());
        let c = e.ei / ((1.0 + p) * l.powi(3));
        let row0 = [12.0, 6.0 * l, -12.0, 6.0 * l];
        let row1 = [6.0 * l, (4.0 + p) * l * l, -6.0 * l, (2.0 - p) * l * l];
        let k = e.stiffness();
        for j in 0..4 {
            assert!((k[0][j] - c * row0[j]).abs() < 1e-9 * (c * row0[j]).abs());
            assert!((k[1][j] - c * row1[j]).abs() < 1e-9 * (c * row1[j]).abs());
        }
    }

    #[test]
    fn shape_functions_interpolate_and_solve_the_static_equations() {
        let e = element(3.0e4, 0.0);
        let unit = |i: usize| -> [f64; 4] { std::array::from_fn(|j| if i == j { 1.0 } else { 0.0 }) };
        for i in 0..4 {
            let (s0, s1) = (e.shapes(0.0), e.shapes(1.0));
            let expect = unit(i);
            for (got, want) in [s0.w[i], s0.psi[i], s1.w[i], s1.psi[i]].iter().zip(expect) {
                assert!((got - want).abs() < 1e-14);
            }
            // EI·ψ″ + κGA·(w′ − ψ) = 0 and (w′ − ψ)′ = 0 everywhere (no load).
            for xi in [0.1, 0.5, 0.9] {
                let n = e.shapes(xi);
                let m = e.shapes(xi + 1e-6);
                let psi2 = (m.dpsi[i] - n.dpsi[i]) / (1e-6 * e.length);
                let gamma = n.dw[i] - n.psi[i];
                let gamma_next = m.dw[i] - m.psi[i];
                assert!((e.ei * psi2 + e.kga * gamma).abs() < 1e-5 * e.kga.max(e.ei), "{i} {xi}");
                assert!((gamma_next - gamma).abs() < 1e-9);
            }
        }
    }
}
