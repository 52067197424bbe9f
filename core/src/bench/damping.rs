//! The damping formulas of the textbooks, and the half-power cross-check on a spectrum.
//!
//! - Logarithmic decrement: δ = (1/n)·ln(x₀/xₙ) over n cycles, ζ = δ/√(4π² + δ²) (Rao,
//!   *Mechanical Vibrations*, free vibration with viscous damping — from memory).
//! - Half-power bandwidth: ζ ≈ (f₂ − f₁)/(2fₙ), f₁ and f₂ where the power has fallen to half
//!   its peak (Rao, same book, the quality factor and bandwidth — from memory). A record
//!   shorter than a few decay times τ = 1/(ζω) widens the peak and so over-reads ζ: the
//!   estimate is flagged when T/τ is under [`SHORT_RECORD_DECAYS`].

/// A half-power reading on a record shorter than this many decay times τ is flagged: the
/// truncated tail then holds more than e^(−2·6) ≈ 6·10⁻⁶ of the ring's energy and the
/// peak is visibly wider than the damping makes it (common practice, no source).
pub const SHORT_RECORD_DECAYS: f64 = 6.0;

/// ζ from the logarithmic decrement of `cycles` cycles from amplitude `first` to `last`.
pub fn log_decrement(first: f64, last: f64, cycles: f64) -> Option<f64> {
    if !(first > 0.0 && last > 0.0 && cycles > 0.0 && first.is_finite() && last.is_finite()) {
        return None;
    }
    let delta = (first / last).ln() / cycles;
    Some(delta / (4.0 * std::f64::consts::PI.powi(2) + delta * delta).sqrt())
}

/// ζ from the half-power frequencies f₁ < f₂ around the peak at `peak`.
pub fn half_power(f1: f64, f2: f64, peak: f64) -> Option<f64> {
    (f1 < f2 && peak > 0.0 && f1.is_finite() && f2.is_finite()).then(|| (f2 - f1) / (2.0 * peak))
}

/// The half-power frequencies (in bins) of the peak near bin `k` of a power spectrum `power`
/// (linear), searched within `lo..=hi`: the peak's largest bin within two bins of `k`, then
/// linear interpolation where the power crosses half of it on each side.
pub fn half_power_bins(power: &[f64], k: usize, lo: usize, hi: usize) -> Option<(f64, f64, f64)> {
    let hi = hi.min(power.len().checked_sub(1)?);
    let from = k.saturating_sub(2).max(lo);
    let to = (k + 2).min(hi);
    let top = (from..=to).max_by(|&a, &b| power[a].total_cmp(&power[b]))?;
    let half = power[top] * 0.5;
    let mut i = top;
    while i > lo && power[i - 1] >= half {
        i -= 1;
    }
    if i == lo {
        return None;
    }
    let left = (i - 1) as f64 + (half - power[i - 1]) / (power[i] - power[i - 1]);
    let mut j = top;
    while j < hi && power[j + 1] >= half {
        j += 1;
    }
    if j == hi {
        return None;
    }
    let right = j as f64 + (power[j] - half) / (power[j] - power[j + 1]);
    // The peak itself by a parabola through the three largest bins in dB.
    let (a, b, c) = (
        power[top - 1].max(1e-300).log10(),
        power[top].max(1e-300).log10(),
        power[(top + 1).min(hi)].max(1e-300).log10(),
    );
    let d = a - 2.0 * b + c;
    let p = if d < 0.0 { (0.5 * (a - c) / d).clamp(-0.5, 0.5) } else { 0.0 };
    Some((left, right, top as f64 + p))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn log_decrement_reads_the_damping_of_an_exact_decay() {
        // x(t) = e^(−ζωₙt)·cos(ω_d t): after n periods T_d = 2π/ω_d the amplitude ratio is
        // e^(ζωₙ n T_d), and Rao's formula returns ζ exactly.
        for zeta in [0.001f64, 0.02, 0.3] {
            let wn = 10.0f64;
            let wd = wn * (1.0 - zeta * zeta).sqrt();
            let n = 5.0;
            let ratio = (zeta * wn * n * 2.0 * std::f64::consts::PI / wd).exp();
            let got = log_decrement(ratio, 1.0, n).unwrap();
            assert!((got / zeta - 1.0).abs() < 1e-12, "{got} vs {zeta}");
        }
        assert_eq!(log_decrement(0.0, 1.0, 1.0), None);
    }

    #[test]
    fn half_power_of_a_single_degree_of_freedom_receptance_approaches_zeta() {
        // |H(ω)|² = 1/((ωₙ² − ω²)² + (2ζωₙω)²). Its exact half-power points (solved here by
        // bisection) give (ω₂ − ω₁)/(2ωₙ) = ζ + O(ζ²)... in fact ζ·(1 + O(ζ²)) for this form.
        for zeta in [0.001, 0.01, 0.05] {
            let wn = 1.0f64;
            let h2 = |w: f64| 1.0 / ((wn * wn - w * w).powi(2) + (2.0 * zeta * wn * w).powi(2));
            let wp = wn * (1.0 - 2.0 * zeta * zeta).sqrt();
            let half = 0.5 * h2(wp);
            let solve = |mut a: f64, mut b: f64| {
                for _ in 0..200 {
                    let c = 0.5 * (a + b);
                    if (h2(a) - half) * (h2(c) - half) <= 0.0 {
                        b = c
                    } else {
                        a = c
                    }
                }
                0.5 * (a + b)
            };
            let w1 = solve(wp * (1.0 - 10.0 * zeta), wp);
            let w2 = solve(wp, wp * (1.0 + 10.0 * zeta));
            let got = half_power(w1, w2, wn).unwrap();
            assert!((got / zeta - 1.0).abs() < 2.0 * zeta * zeta + 1e-9, "{got} vs {zeta}");
        }
    }

    #[test]
    fn half_power_bins_interpolates_a_lorentzian() {
        // Power 1/(1 + ((k − 500.3)/4)²) falls to half at 500.3 ± 4.
        let p: Vec<f64> = (0..1000).map(|k| 1.0 / (1.0 + ((k as f64 - 500.3) / 4.0).powi(2))).collect();
        let (l, r, top) = half_power_bins(&p, 500, 400, 600).unwrap();
        assert!((r - l - 8.0).abs() < 0.1, "{l} {r}");
        assert!((top - 500.3).abs() < 0.1, "{top}");
    }
}
