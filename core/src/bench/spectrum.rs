//! Spectra of the kept ring-downs: each tapered at its end by the falling half of a 4-term
//! Blackman–Harris window, zero-padded to at least twice its length, and their power averaged
//! across taps; and the noise floor, measured by Welch's method on the record's quietest
//! stretch and put on the same scale.
//!
//! Why the falling half of a window: a ring-down starts from rest at the tap, so its start needs
//! no taper (the spectrum of a ring-down from rest is the part's response); only its end, cut
//! while it may still ring, would leak. The Blackman–Harris taper (Harris, Proc. IEEE 66, 1978:
//! a0…a3 = 0.35875, 0.48829, 0.14128, 0.01168 — from memory, its sidelobes checked below 90 dB
//! in the tests) leaves no sidelobe over a 60 dB noise floor, which a rectangular cut would.

use realfft::num_complex::Complex;
use realfft::{RealFftPlanner, RealToComplex};
use std::cell::RefCell;
use std::sync::Arc;

/// The 4-term Blackman–Harris coefficients.
const BH: [f64; 4] = [0.35875, 0.48829, 0.14128, 0.01168];

/// The falling half of a 4-term Blackman–Harris window of length 2n: 1 at the first sample,
/// near 0 at the last. One cosine per sample: cos 2x = 2c² − 1 and cos 3x = c(4c² − 3) with
/// c = cos x (Chebyshev's polynomials), as the window is taken for every sample of every tap.
/// The cosines themselves come by the angle-addition formula from a table of one block's
/// steps and one exact cosine and sine per block of 256 samples, so each is within a
/// few units in the last place of the library's and no error accumulates along the window.
pub fn falling_window(n: usize) -> Vec<f64> {
    // x = 2π(n + i)/2n = π + πi/n, so cos x = −cos(πi/n).
    let d = std::f64::consts::PI / n.max(1) as f64;
    let steps: Vec<(f64, f64)> = (0..STEP_BLOCK.min(n)).map(|j| (d * j as f64).sin_cos()).collect();
    let mut out = Vec::with_capacity(n);
    for start in (0..n).step_by(STEP_BLOCK) {
        let (s0, c0) = (d * start as f64).sin_cos();
        for &(sj, cj) in &steps[..STEP_BLOCK.min(n - start)] {
            let c = -(c0 * cj - s0 * sj);
            let c2 = c * c;
            out.push(BH[0] - BH[1] * c + BH[2] * (2.0 * c2 - 1.0) - BH[3] * c * (4.0 * c2 - 3.0));
        }
    }
    out
}

/// Samples per block of the window's angle-addition table.
const STEP_BLOCK: usize = 256;

/// The FFT length for segments of up to `longest` samples: at least twice it (the zero padding
/// the peak's interpolation and the fits were made for), and the smallest such length whose half
/// is 2ᵃ·3ᵇ·5ᶜ (a ≥ 3, b ≤ 3, c ≤ 2), small factors the mixed-radix transform has butterflies
/// for. Above 5400 such halves lie at most 8 % apart, where powers of two lie twice apart: a
/// power of two padded a segment of 70,000 samples to 262,144 points, this pads it to 147,456.
pub fn fft_length(longest: usize) -> usize {
    let half = longest.max(8);
    let mut best = usize::MAX;
    for odd in [1usize, 3, 5, 9, 15, 25, 27, 45, 75, 135, 225, 675] {
        let twos = half.div_ceil(odd).next_power_of_two().max(8);
        best = best.min(odd * twos);
    }
    2 * best
}

/// One forward real FFT of `samples` (times `window` if given), zero-padded to `m`, in single
/// precision: the samples arrive as `f32`, and the transform's rounding (relative to the
/// segment's whole energy about 10⁻⁷·√log₂m, some 130 dB under it at 2¹⁸ points) lies far
/// below any record's noise and a 16-bit file's quantisation (96 dB). Half the memory traffic
/// of double precision, and twice the lanes in the native SIMD (AVX, SSE) transforms.
pub struct Transformer {
    fft: Plan,
    input: Vec<f32>,
    output: Vec<Complex<f32>>,
    scratch: Vec<Complex<f32>>,
    m: usize,
}

/// A planned forward real transform.
type Plan = Arc<dyn RealToComplex<f32>>;

/// The most plans kept between analyses: the analysis uses two lengths (the ring-downs' and the
/// noise floor's), and a plan of 2²¹ points holds some 10 MB of twiddle factors.
const PLANS_KEPT: usize = 4;

thread_local! {
    /// Plans kept between analyses, the latest used first. Planning a transform of 2¹⁷ points
    /// (its twiddle factors, a sine and cosine each) takes some 22 million instructions, running
    /// it 2.5 million (docs/performance.md), and a reader analyses record after record of much
    /// the same length.
    static PLANS: RefCell<Vec<(usize, Plan)>> = const { RefCell::new(Vec::new()) };
}

/// The forward real transform of length `m`, from the kept plans or planned anew.
fn plan(m: usize) -> Plan {
    PLANS.with(|plans| {
        let mut plans = plans.borrow_mut();
        let fft = match plans.iter().position(|(len, _)| *len == m) {
            Some(i) => plans.remove(i).1,
            None => RealFftPlanner::<f32>::new().plan_fft_forward(m),
        };
        plans.insert(0, (m, Arc::clone(&fft)));
        plans.truncate(PLANS_KEPT);
        fft
    })
}

impl Transformer {
    /// A transformer of length `m` (even).
    pub fn new(m: usize) -> Transformer {
        let fft = plan(m);
        Transformer {
            input: vec![0.0; m],
            output: vec![Complex::default(); m / 2 + 1],
            scratch: vec![Complex::default(); fft.get_scratch_len()],
            fft,
            m,
        }
    }

    /// The spectrum (bins 0..=m/2) of `samples`, each times `window[i]` when given (then no
    /// more samples than the window has).
    pub fn forward(&mut self, samples: &[f32], window: Option<&[f64]>) -> &[Complex<f32>] {
        let n = samples.len().min(self.m).min(window.map_or(usize::MAX, <[f64]>::len));
        let (head, tail) = self.input.split_at_mut(n);
        match window {
            Some(w) => {
                head.iter_mut().zip(samples).zip(w).for_each(|((slot, x), w)| *slot = (*x as f64 * w) as f32)
            }
            None => head.copy_from_slice(&samples[..n]),
        }
        tail.fill(0.0);
        // The lengths match by construction, so the transform cannot fail.
        if self.fft.process_with_scratch(&mut self.input, &mut self.output, &mut self.scratch).is_err() {
            self.output.iter_mut().for_each(|c| *c = Complex::default());
        }
        &self.output
    }
}

/// |c|² of a single-precision bin, in double precision.
pub fn power(c: &Complex<f32>) -> f64 {
    let (re, im) = (c.re as f64, c.im as f64);
    re * re + im * im
}

/// The noise floor's power per sample at each of `bins` frequencies (`k·rate/m`), in dB:
/// Welch's average of Hann-windowed periodograms of `quiet`, smoothed across frequency by a
/// running median of 9 and interpolated in dB. White noise of variance σ² reads 10·log₁₀σ² at
/// every frequency. In dB because the analysis compares it with the spectrum in dB at every bin
/// (no power or logarithm per bin) and needs it in power only at the peaks.
pub fn noise_floor_db(quiet: &[f32], m: usize, bins: std::ops::Range<usize>) -> Vec<f64> {
    let s = (quiet.len() / 2).clamp(64, 4096).next_power_of_two().min(quiet.len().next_power_of_two());
    let s = if s > quiet.len() { (s / 2).max(8) } else { s };
    let hann: Vec<f64> =
        (0..s).map(|i| 0.5 - 0.5 * (2.0 * std::f64::consts::PI * i as f64 / s as f64).cos()).collect();
    let norm: f64 = hann.iter().map(|w| w * w).sum();
    let mut t = Transformer::new(s);
    let mut acc = vec![0.0f64; s / 2 + 1];
    let mut count = 0usize;
    let mut start = 0;
    while start + s <= quiet.len() {
        let spec = t.forward(&quiet[start..start + s], Some(&hann));
        for (a, c) in acc.iter_mut().zip(spec) {
            *a += power(c);
        }
        count += 1;
        start += s / 2;
    }
    if count == 0 {
        let spec = t.forward(quiet, Some(&hann));
        for (a, c) in acc.iter_mut().zip(spec) {
            *a += power(c);
        }
        count = 1;
    }
    // One-sided power per sample: E|Y|² / Σw² is σ² for white noise.
    let welch: Vec<f64> = acc.iter().map(|a| 10.0 * (a / count as f64 / norm).max(1e-300).log10()).collect();
    let smooth = running_median(&welch, 4);
    let ratio = s as f64 / m as f64;
    bins.map(|k| {
        let j = k as f64 * ratio;
        let i = (j as usize).min(smooth.len() - 1);
        let next = (i + 1).min(smooth.len() - 1);
        let a = (j - i as f64).clamp(0.0, 1.0);
        smooth[i] * (1.0 - a) + smooth[next] * a
    })
    .collect()
}

/// Running median of half-width `h` (the ends use what they have).
fn running_median(v: &[f64], h: usize) -> Vec<f64> {
    (0..v.len())
        .map(|i| {
            let mut w: Vec<f64> = v[i.saturating_sub(h)..(i + h + 1).min(v.len())].to_vec();
            let mid = w.len() / 2;
            w.select_nth_unstable_by(mid, f64::total_cmp);
            w[mid]
        })
        .collect()
}

/// Reduces `values` at bins `lo..` to at most `points` values, each the largest of the bins it
/// stands for (so no peak is lost in the drawing), with the frequency of that largest bin.
pub fn decimate(
    values: &[f64],
    floor: &[f64],
    lo: usize,
    bin_hz: f64,
    points: usize,
) -> (Vec<f64>, Vec<f64>, Vec<f64>) {
    let n = values.len();
    let per = n.div_ceil(points.max(1)).max(1);
    let (mut hz, mut db, mut fl) = (Vec::new(), Vec::new(), Vec::new());
    for start in (0..n).step_by(per) {
        let stop = (start + per).min(n);
        let (mut best, mut at) = (f64::NEG_INFINITY, start);
        for i in start..stop {
            if values[i] > best {
                best = values[i];
                at = i;
            }
        }
        hz.push((lo + at) as f64 * bin_hz);
        db.push(best);
        fl.push(floor[at]);
    }
    (hz, db, fl)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_taper_leaks_no_sidelobe_from_a_sine_cut_at_full_level() {
        // A steady sine cut at both ends: with the falling half-window only its start (a step,
        // the physics of a tap) is sharp. Away from the peak, nothing stands out as a sidelobe:
        // any local maximum either lies 90 dB under the peak (Harris's 4-term window: −92 dB
        // sidelobes) or rises less than 0.5 dB over its surroundings (the step's smooth tail,
        // rippled by the zero padding).
        let n = 4096;
        let m = fft_length(n);
        let f0 = 0.1 * m as f64 + 0.37;
        let x: Vec<f32> =
            (0..n).map(|i| (2.0 * std::f64::consts::PI * f0 * i as f64 / m as f64).cos() as f32).collect();
        let w = falling_window(n);
        let mut t = Transformer::new(m);
        let p: Vec<f64> = t.forward(&x, Some(&w)).iter().map(power).collect();
        let top = p.iter().cloned().fold(0.0, f64::max);
        let k0 = f0.round() as usize;
        for k in 8..p.len() - 8 {
            let far = (k as i64 - k0 as i64).unsigned_abs() as usize > 16;
            if far && p[k] > p[k - 1] && p[k] >= p[k + 1] {
                let low = p[k - 8..=k + 8].iter().cloned().fold(f64::INFINITY, f64::min);
                let level = 10.0 * (p[k] / top).log10();
                let rise = 10.0 * (p[k] / low).log10();
                assert!(
                    level < -90.0 || rise < 0.5,
                    "a sidelobe at bin {k}: {level} dB, {rise} dB over its surroundings"
                );
            }
        }
    }

    #[test]
    fn the_window_is_the_four_term_sum_of_cosines() {
        // The textbook form, a0 − a1·cos x + a2·cos 2x − a3·cos 3x (Harris 1978, from memory),
        // against the form used (one cosine per sample, by angle addition from a table): equal
        // to round-off at every sample, however long the window.
        for n in [1usize, 7, 256, 1000, 70_001] {
            let w = falling_window(n);
            for (i, v) in w.iter().enumerate() {
                let x = 2.0 * std::f64::consts::PI * (n + i) as f64 / (2 * n) as f64;
                let direct = BH[0] - BH[1] * x.cos() + BH[2] * (2.0 * x).cos() - BH[3] * (3.0 * x).cos();
                assert!((v - direct).abs() < 1e-15, "n {n}, sample {i}: {v} vs {direct}");
            }
        }
        assert!((falling_window(1000)[0] - 1.0).abs() < 1e-12);
    }

    #[test]
    fn the_transform_length_is_the_smallest_smooth_one_at_least_twice_the_segment() {
        // Against the definition searched plainly: the smallest even m ≥ 2n whose half has no
        // prime factor over 5, at least 2³ twos, at most 3³ and 5².
        let fits = |h: usize| {
            let (mut r, mut twos, mut threes, mut fives) = (h, 0, 0, 0);
            while r % 2 == 0 {
                r /= 2;
                twos += 1;
            }
            while r % 3 == 0 {
                r /= 3;
                threes += 1;
            }
            while r % 5 == 0 {
                r /= 5;
                fives += 1;
            }
            r == 1 && twos >= 3 && threes <= 3 && fives <= 2
        };
        for n in (1..5000).chain((5000..300_000).step_by(97)).chain([65_536, 70_001, 1 << 20]) {
            let plain = 2 * (n.max(8)..).find(|&h| fits(h)).unwrap_or(0);
            assert_eq!(fft_length(n), plain, "{n}");
            // Once every odd factor can take its three twos (8 · 675 = 5400), no more than 8 %
            // over twice the segment.
            if n >= 5400 {
                assert!(fft_length(n) as f64 <= 2.0 * 1.08 * n as f64, "{n}: {}", fft_length(n));
            }
        }
    }

    #[test]
    fn white_noise_reads_its_variance_as_the_floor() {
        let mut rng = modebench_tests::random::Rng::new(7);
        let sigma = 0.01f64;
        // Gaussian noise by Box–Muller.
        let x: Vec<f32> = (0..48_000)
            .map(|_| {
                (sigma
                    * (-2.0 * rng.unit().max(1e-300).ln()).sqrt()
                    * (2.0 * std::f64::consts::PI * rng.unit()).cos()) as f32
            })
            .collect();
        let floor = noise_floor_db(&x, 1 << 16, 100..30_000);
        let mean = floor.iter().map(|db| 10f64.powf(db / 10.0)).sum::<f64>() / floor.len() as f64;
        // The running median of a χ² with ~46 degrees of freedom sits about 1.5 % under its mean.
        assert!((mean / (sigma * sigma) - 1.0).abs() < 0.1, "{mean} vs {}", sigma * sigma);
    }
}
