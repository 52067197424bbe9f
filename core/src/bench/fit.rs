//! The primary damping estimate: a least-squares fit of a decaying sinusoid
//! A·e^(−σt)·cos(ω_d·t + φ) to one peak's band of a tap's ring-down.
//!
//! The fit is made on the ring-down's spectrum, which by Parseval's theorem is the same least
//! squares as on the band-passed ring-down in time, and lets the model be exact: the DFT of N
//! samples of C·e^(s·n) is C·(1 − qᴺ)/(1 − q) with q = e^(s − iθ), θ = 2πk/M, so the record's
//! end (cut while still ringing) and the negative frequency's image are part of the model rather
//! than errors (the bias of a half-power reading on a short record does not arise). A complex
//! quadratic under the peak takes up the skirts of the neighbouring peaks. The model is
//! fitted by Levenberg–Marquardt (Marquardt, J. SIAM 11, 1963 — from memory) on σ, ω_d, the
//! amplitude's real and imaginary parts and the quadratic's six coefficients, starting from the
//! spectral peak and its half-power width.

use nalgebra::{SMatrix, SVector};
use realfft::num_complex::Complex;

type C64 = Complex<f64>;

/// The most bins of a band a fit evaluates.
const MAX_BINS: usize = 128;

/// Whether the background under the peak is a quadratic (else a straight line).
const CURVED: bool = false;

/// A fitted ring-down, per sample (multiply by the sample rate for per second).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Fit {
    /// Decay rate σ, rad per sample.
    pub sigma: f64,
    /// Damped angular frequency ω_d, rad per sample.
    pub omega: f64,
    /// Amplitude A of the cosine at the first sample.
    pub amplitude: f64,
    /// 1 − residual energy over the band's energy.
    pub quality: f64,
    /// The fitted sinusoid's energy in the band (the sum of its |DFT|² over the band's bins).
    pub energy: f64,
    /// How much the ring-down reduces the band's residual compared with the background alone,
    /// over the residual left per degree of freedom.
    pub significance: f64,
}

impl Fit {
    /// Damping ratio ζ = σ/√(σ² + ω_d²).
    pub fn damping(&self) -> f64 {
        self.sigma / self.sigma.hypot(self.omega)
    }
}

/// What one fit works on: the DFT of `n` samples zero-padded to `m`, bins `lo..=hi`.
pub struct Band<'a> {
    /// The spectrum, bins 0..=m/2, as the single-precision transform gives it.
    pub spectrum: &'a [Complex<f32>],
    /// FFT length.
    pub m: usize,
    /// Samples transformed (the ring-down's length).
    pub n: usize,
    /// First bin of the band.
    pub lo: usize,
    /// Last bin of the band.
    pub hi: usize,
}

/// e^z − 1 without cancellation near z = 0.
fn expm1(z: C64) -> C64 {
    let half = (z.im * 0.5).sin();
    C64::new(z.re.exp_m1() * z.im.cos() - 2.0 * half * half, z.re.exp() * z.im.sin())
}

/// G(z) = (e^{Nz} − 1)/(e^z − 1) and its derivative, from a = e^{Nz} − 1 and b = e^z − 1.
fn kernel(a: C64, b: C64, n: f64) -> (C64, C64) {
    let g = a / b;
    let dg = ((a + 1.0) * n * b - a * (b + 1.0)) / (b * b);
    (g, dg)
}

/// A bin's fixed factors: at z = s − iθ with s = −σ ± iω, e^z = e^s·r and e^{Nz} = e^{Ns}·r_N
/// with r = e^{−iθ} and r_N = e^{−iNθ}. Each e^z − 1 is then (e^s − 1)·r + (r − 1), which keeps
/// the accuracy of `expm1` near z = 0 while the transcendental functions are taken once per
/// trial parameters instead of at every bin (most of the fit's time before).
#[derive(Clone, Copy)]
struct Bin {
    /// r − 1.
    r1: C64,
    /// r_N − 1.
    rn1: C64,
}

impl Bin {
    /// Bin `k` of an `m`-point DFT of `n` samples. N·k is reduced modulo m in integers, so the
    /// phase N·θ is not taken of a large argument.
    fn new(k: usize, m: usize, n: usize) -> Bin {
        let two_pi = 2.0 * std::f64::consts::PI;
        let theta = two_pi * k as f64 / m as f64;
        let wrapped = ((n as u128 * k as u128) % m as u128) as f64;
        Bin { r1: expm1(C64::new(0.0, -theta)), rn1: expm1(C64::new(0.0, -two_pi * wrapped / m as f64)) }
    }

    /// (e^{Nz} − 1, e^z − 1) from e^s − 1 and e^{Ns} − 1.
    fn at(&self, e1: C64, en1: C64) -> (C64, C64) {
        (en1 * (self.rn1 + 1.0) + self.rn1, e1 * (self.r1 + 1.0) + self.r1)
    }
}

/// Fits the band starting from ω₀ and σ₀ (rad per sample). `None` when the fit does not settle
/// on a decaying sinusoid inside the band.
pub fn fit(band: &Band, omega0: f64, sigma0: f64) -> Option<Fit> {
    let width = band.hi.checked_sub(band.lo)? + 1;
    if width < 5 || band.hi >= band.spectrum.len() || band.n < 8 {
        return None;
    }
    // A wide band is sampled at every `stride`-th bin, at most some 128 bins: the model is
    // exact at every bin, and neighbouring bins of a zero-padded spectrum say much the same.
    let stride = width.div_ceil(MAX_BINS).max(1);
    let bins: Vec<usize> = (band.lo..=band.hi).step_by(stride).collect();
    let count = bins.len();
    let two_pi = 2.0 * std::f64::consts::PI;
    let theta = |k: usize| two_pi * k as f64 / band.m as f64;
    let kc = 0.5 * (band.lo + band.hi) as f64;
    let half = 0.5 * (band.hi - band.lo) as f64;
    let n = band.n as f64;
    let data: Vec<C64> =
        bins.iter().map(|&k| C64::new(band.spectrum[k].re as f64, band.spectrum[k].im as f64)).collect();
    let energy: f64 = data.iter().map(|c| c.norm_sqr()).sum();
    if energy <= 0.0 {
        return None;
    }
    let fixed: Vec<Bin> = bins.iter().map(|&k| Bin::new(k, band.m, band.n)).collect();
    let i = C64::new(0.0, 1.0);
    // e^s − 1 and e^{Ns} − 1 for s = −σ + iω (the positive frequency) and −σ − iω (its image).
    let exps = |p: &SVector<f64, 10>| -> [C64; 4] {
        let (s, t) = (C64::new(-p[0], p[1]), C64::new(-p[0], -p[1]));
        [expm1(s), expm1(s * n), expm1(t), expm1(t * n)]
    };
    // The model's columns (∂m/∂p) and value at parameters p, at the `j`-th bin of the band.
    let columns = |p: &SVector<f64, 10>, e: &[C64; 4], j: usize| -> ([C64; 10], C64) {
        let k = bins[j];
        let c = C64::new(p[2], p[3]);
        let u = (k as f64 - kc) / half.max(1.0);
        let q = if CURVED { u * u } else { 0.0 };
        let (a, b) = fixed[j].at(e[0], e[1]);
        let (g, dg) = kernel(a, b, n);
        let (a, b) = fixed[j].at(e[2], e[3]);
        let (h, dh) = kernel(a, b, n);
        let cols = [
            -(c * dg + c.conj() * dh),
            i * c * dg - i * c.conj() * dh,
            g + h,
            i * (g - h),
            C64::new(1.0, 0.0),
            i,
            C64::new(u, 0.0),
            i * u,
            C64::new(q, 0.0),
            i * q,
        ];
        let value =
            c * g + c.conj() * h + C64::new(p[4], p[5]) + C64::new(p[6], p[7]) * u + C64::new(p[8], p[9]) * q;
        (cols, value)
    };
    // The model's value alone (the same sums as `columns`, without the derivatives).
    let value = |p: &SVector<f64, 10>, e: &[C64; 4], j: usize| -> C64 {
        let k = bins[j];
        let c = C64::new(p[2], p[3]);
        let u = (k as f64 - kc) / half.max(1.0);
        let q = if CURVED { u * u } else { 0.0 };
        let (a, b) = fixed[j].at(e[0], e[1]);
        let g = a / b;
        let (a, b) = fixed[j].at(e[2], e[3]);
        let h = a / b;
        c * g + c.conj() * h + C64::new(p[4], p[5]) + C64::new(p[6], p[7]) * u + C64::new(p[8], p[9]) * q
    };
    let cost = |p: &SVector<f64, 10>| -> f64 {
        let e = exps(p);
        data.iter().enumerate().map(|(j, x)| (x - value(p, &e, j)).norm_sqr()).sum()
    };
    // Normal equations of the linearised problem over the parameters `free`.
    let normal = |p: &SVector<f64, 10>, free: usize| -> (SMatrix<f64, 10, 10>, SVector<f64, 10>) {
        let mut a = SMatrix::<f64, 10, 10>::zeros();
        let mut g = SVector::<f64, 10>::zeros();
        let e = exps(p);
        for (j, x) in data.iter().enumerate() {
            let (cols, value) = columns(p, &e, j);
            let r = x - value;
            for j in 10 - free..10 {
                g[j] += (cols[j].conj() * r).re;
                for l in j..10 {
                    a[(j, l)] += (cols[j].conj() * cols[l]).re;
                }
            }
        }
        // The matrix is symmetric: Re(conj(c_j)·c_l) = Re(conj(c_l)·c_j), the same products
        // summed in the same order, so the lower half is copied bit for bit.
        for j in 0..10 {
            for l in 0..j {
                a[(j, l)] = a[(l, j)];
            }
        }
        for j in 0..10 {
            if j < 10 - free || a[(j, j)] == 0.0 {
                a[(j, j)] = 1.0;
            }
        }
        (a, g)
    };
    let mut p = SVector::<f64, 10>::from([sigma0.max(1e-9), omega0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0]);
    // The background alone first: what the band holds without a ring-down in it.
    let (a, g) = normal(&p, 6);
    let without = cost(&(p + a.lu().solve(&g)?));
    // Then the amplitude and the background, with σ and ω held: a linear problem, solved exactly.
    let (a, g) = normal(&p, 8);
    p += a.lu().solve(&g)?;
    let mut current = cost(&p);
    let mut lambda = 1e-3;
    for _ in 0..60 {
        let (a, g) = normal(&p, 10);
        let mut damped = a;
        for j in 0..10 {
            damped[(j, j)] += lambda * a[(j, j)].max(1e-300);
        }
        let Some(step) = damped.lu().solve(&g) else { break };
        let mut trial = p + step;
        if trial[0] <= 0.0 {
            trial[0] = p[0] * 0.5;
        }
        let next = cost(&trial);
        if next.is_finite() && next <= current {
            // Settled when the phase the step moves over the whole record is negligible.
            let settled = (step[1] * n).abs() < 1e-7 && (step[0] * n).abs() < 1e-7;
            p = trial;
            current = next;
            lambda = (lambda / 3.0).max(1e-12);
            if settled {
                break;
            }
        } else {
            lambda *= 4.0;
            if lambda > 1e12 {
                break;
            }
        }
    }
    let (lo, hi) = (theta(band.lo), theta(band.hi));
    let c = C64::new(p[2], p[3]);
    let e = exps(&p);
    let explained: f64 = stride as f64
        * fixed
            .iter()
            .map(|b| {
                let (a, d) = b.at(e[0], e[1]);
                let (a2, d2) = b.at(e[2], e[3]);
                (c * (a / d) + c.conj() * (a2 / d2)).norm_sqr()
            })
            .sum::<f64>();
    // The ring-down's share of the band against the noise left per degree of freedom: a
    // sinusoid fitted to noise alone takes up a few (its four parameters, and the best of the
    // frequencies it could choose).
    let dof = (2 * count).saturating_sub(10).max(1) as f64;
    let significance = (without - current).max(0.0) / (current / dof).max(1e-300);
    let fit = Fit {
        energy: explained,
        significance,
        sigma: p[0],
        omega: p[1],
        amplitude: 2.0 * p[2].hypot(p[3]),
        quality: (1.0 - current / energy).clamp(0.0, 1.0),
    };
    let inside = fit.omega > lo && fit.omega < hi;
    (fit.sigma > 0.0 && fit.sigma < 1.0 && inside && fit.amplitude > 0.0 && fit.quality.is_finite())
        .then_some(fit)
}

#[cfg(test)]
mod tests {
    use super::super::spectrum::{fft_length, Transformer};
    use super::*;

    /// A ring-down cut short and one rung out, with a neighbour's skirt: the fit returns the
    /// frequency and decay rate the samples were made with, to 3·10⁻⁵ and 1 % (the quadratic
    /// under the peak takes up most, not all, of a heavily damped neighbour's curved skirt).
    #[test]
    fn recovers_a_decaying_sinusoid_exactly_whether_cut_short_or_not() {
        let n = 6000;
        let m = fft_length(n);
        let mut t = Transformer::new(m);
        for (omega, zeta, phase) in [(0.21f64, 0.0005f64, 0.3f64), (0.5, 0.01, 2.0), (0.05, 0.03, -1.0)] {
            let sigma = zeta * omega / (1.0 - zeta * zeta).sqrt();
            let x: Vec<f32> = (0..n)
                .map(|i| {
                    let i = i as f64;
                    ((-sigma * i).exp() * (omega * i + phase).cos()
                        + 0.3 * (-0.01 * i).exp() * (1.7 * omega * i).cos()) as f32
                })
                .collect();
            let spec = t.forward(&x, None).to_vec();
            let kc = (omega * m as f64 / (2.0 * std::f64::consts::PI)).round() as usize;
            // The band as the analysis takes it: six half-power half-widths each side.
            let k = (6.0 * sigma * m as f64 / (2.0 * std::f64::consts::PI)).max(12.0) as usize;
            let band = Band { spectrum: &spec, m, n, lo: kc - k, hi: kc + k };
            let f = fit(&band, omega * 1.0002, sigma * 3.0 + 1e-4).expect("a fit");
            assert!((f.omega / omega - 1.0).abs() < 3e-5, "ω {} vs {omega}", f.omega);
            assert!((f.damping() / zeta - 1.0).abs() < 1e-2, "ζ {} vs {zeta}", f.damping());
            assert!(f.quality > 0.999, "{}", f.quality);
        }
    }
}
