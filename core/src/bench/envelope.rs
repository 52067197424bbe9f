//! The record reduced to a few numbers per block of about a millisecond, built in one streaming
//! pass: the mean square (for taps and the noise floor), the mean Teager–Kaiser energy (for the
//! sharp click of an impact, and so for double hits), and what shows clipping.
//!
//! The Teager–Kaiser energy `x[n]² − x[n−1]·x[n+1]` of a sinusoid A·cos(Ωn + φ) is A²·sin²Ω
//! whatever its phase (Kaiser, ICASSP 1990 — from memory; checked in the tests below), so it
//! follows an impact's broadband click without the ripple of a low carrier, and weighs a ring
//! at low frequency lightly.

/// Fewest samples in a block: the mean square of 16 samples of noise varies little enough that
/// a noise floor read from it is steady (a χ² of 16 degrees of freedom).
const MIN_BLOCK: usize = 16;

/// The envelope of a record.
#[derive(Clone, Debug, Default)]
pub struct Envelope {
    /// Samples per block.
    pub block: usize,
    /// Mean square per block.
    pub energy: Vec<f32>,
    /// Mean Teager–Kaiser energy per block, never below zero.
    pub burst: Vec<f32>,
    /// Samples seen.
    pub samples: usize,
    /// Largest magnitude seen.
    pub peak: f32,
    /// Runs of three or more equal samples at the largest magnitude (flat tops: clipping).
    pub flat_tops: usize,
    // Streaming state.
    sum: f64,
    tk: f64,
    filled: usize,
    prev: [f32; 2],
    run: (f32, usize),
    run_values: Vec<f32>,
}

impl Envelope {
    /// An empty envelope for a record at `rate_hz`: blocks of a millisecond, at least 16 samples.
    pub fn new(rate_hz: f64) -> Envelope {
        let block = ((rate_hz / 1000.0).round() as usize).max(MIN_BLOCK);
        Envelope { block, ..Envelope::default() }
    }

    /// Adds the next samples, a block's worth at a time: the loop over a block's samples
    /// carries its sums in registers and tests nothing per sample but the rare equal neighbour
    /// (a possible flat top).
    pub fn push(&mut self, chunk: &[f32]) {
        let mut rest = chunk;
        // The energy operator needs two samples before it: the record's first two are taken
        // one by one.
        while self.samples < 2 && !rest.is_empty() {
            self.push_one(rest[0]);
            rest = &rest[1..];
        }
        while !rest.is_empty() {
            let take = (self.block - self.filled).min(rest.len());
            let (part, tail) = rest.split_at(take);
            self.push_run(part);
            rest = tail;
            if self.filled == self.block {
                self.close_block();
            }
        }
    }

    /// One sample, with every test (the record's first two samples).
    fn push_one(&mut self, x: f32) {
        let x = if x.is_finite() { x } else { 0.0 };
        let v = x as f64;
        self.sum += v * v;
        if self.samples >= 2 {
            let [a, b] = self.prev;
            self.tk += (b as f64) * (b as f64) - (a as f64) * v;
        }
        self.prev = [self.prev[1], x];
        self.track_flat(x);
        self.samples += 1;
        self.filled += 1;
        if self.filled == self.block {
            self.close_block();
        }
    }

    /// Samples within one block, after the record's first two. The run of equal magnitudes is
    /// counted without a branch; only a run reaching three samples is looked at further.
    fn push_run(&mut self, part: &[f32]) {
        let (mut sum, mut tk, mut peak) = (self.sum, self.tk, self.peak);
        let [mut a, mut b] = self.prev;
        let (mut last, mut count) = self.run;
        for &x in part {
            let x = if x.is_finite() { x } else { 0.0 };
            let v = x as f64;
            sum += v * v;
            // The energy operator is centred on the previous sample, so each block's value lags
            // it by one sample: harmless at a millisecond's resolution.
            tk += (b as f64) * (b as f64) - (a as f64) * v;
            let m = x.abs();
            peak = peak.max(m);
            count = if m == last { count + 1 } else { 1 };
            last = m;
            if count == 3 && m > 0.0 && m >= peak * 0.999 && self.run_values.len() < 1 << 20 {
                self.run_values.push(m);
            }
            (a, b) = (b, x);
        }
        (self.sum, self.tk, self.peak, self.prev, self.run) = (sum, tk, peak, [a, b], (last, count));
        self.samples += part.len();
        self.filled += part.len();
    }

    fn track_flat(&mut self, x: f32) {
        let m = x.abs();
        if m > self.peak {
            self.peak = m;
        }
        if m > 0.0 && m == self.run.0 {
            self.run.1 += 1;
            if self.run.1 == 3 && m >= self.peak * 0.999 && self.run_values.len() < 1 << 20 {
                self.run_values.push(m);
            }
        } else {
            self.run = (m, 1);
        }
    }

    fn close_block(&mut self) {
        let n = self.filled.max(1) as f64;
        self.energy.push((self.sum / n) as f32);
        self.burst.push((self.tk / n).max(0.0) as f32);
        self.sum = 0.0;
        self.tk = 0.0;
        self.filled = 0;
    }

    /// Closes the last, partial block and counts the flat tops at the largest magnitude.
    pub fn finish(&mut self) {
        if self.filled > 0 {
            self.close_block();
        }
        let top = self.peak;
        self.flat_tops = self.run_values.iter().filter(|&&v| v >= top * 0.999).count();
        self.run_values = Vec::new();
    }

    /// The first sample of block `k`.
    pub fn start_of(&self, k: usize) -> usize {
        k * self.block
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn teager_kaiser_energy_of_a_sinusoid_is_a_squared_sin_squared_omega_whatever_the_phase() {
        // Kaiser's identity: x[n]² − x[n−1]x[n+1] = A² sin²Ω for A cos(Ωn + φ), exactly.
        for (omega, phase) in [(0.05, 0.0), (0.3, 1.0), (1.2, 2.5)] {
            let a = 0.7f64;
            let x: Vec<f32> = (0..4800).map(|n| (a * (omega * n as f64 + phase).cos()) as f32).collect();
            let mut e = Envelope::new(48_000.0);
            e.push(&x);
            e.finish();
            let want = a * a * f64::sin(omega).powi(2);
            for (k, &b) in e.burst.iter().enumerate().skip(1).take(e.burst.len() - 2) {
                assert!((b as f64 - want).abs() < 1e-5 + 1e-4 * want, "block {k}: {b} vs {want}");
            }
        }
    }

    #[test]
    fn flat_tops_at_full_scale_are_counted() {
        let mut x: Vec<f32> = (0..2000).map(|n| (n as f32 * 0.1).sin() * 1.3).collect();
        for v in &mut x {
            *v = v.clamp(-1.0, 1.0);
        }
        let mut e = Envelope::new(8000.0);
        e.push(&x);
        e.finish();
        assert!(e.flat_tops > 10, "{}", e.flat_tops);
        let clean: Vec<f32> = (0..2000).map(|n| (n as f32 * 0.1).sin()).collect();
        let mut e = Envelope::new(8000.0);
        e.push(&clean);
        e.finish();
        assert_eq!(e.flat_tops, 0);
    }
    #[test]
    fn blocks_are_the_plain_means_however_the_record_is_split() {
        // The definitions summed plainly per block (mean square; mean of x[n]² − x[n−1]x[n+1]
        // from the third sample on), against the streaming pass fed in uneven pieces.
        let mut rng = modebench_tests::random::Rng::new(11);
        let x: Vec<f32> = (0..5000).map(|_| (rng.unit() - 0.5) as f32).collect();
        let block = 16;
        let mut e = Envelope::new(16_000.0);
        let mut at = 0;
        for size in [1usize, 2, 3, 17, 40, 999].iter().cycle() {
            if at >= x.len() {
                break;
            }
            let end = (at + size).min(x.len());
            e.push(&x[at..end]);
            at = end;
        }
        e.finish();
        assert_eq!(e.block, block);
        assert_eq!(e.energy.len(), x.len().div_ceil(block));
        for (k, chunk) in x.chunks(block).enumerate() {
            let n = chunk.len() as f64;
            let ms = chunk.iter().map(|&v| v as f64 * v as f64).sum::<f64>() / n;
            let tk = (k * block..k * block + chunk.len())
                .filter(|&i| i >= 2)
                .map(|i| {
                    let (a, b, c) = (x[i - 2] as f64, x[i - 1] as f64, x[i] as f64);
                    b * b - a * c
                })
                .sum::<f64>()
                / n;
            assert!((e.energy[k] as f64 - ms).abs() <= 1e-6 * ms, "block {k}: {} vs {ms}", e.energy[k]);
            assert!(
                (e.burst[k] as f64 - tk.max(0.0)).abs() <= 1e-6 * ms,
                "block {k}: {} vs {tk}",
                e.burst[k]
            );
        }
        let top = x.iter().fold(0.0f32, |a, v| a.max(v.abs()));
        assert_eq!(e.peak, top);
        assert_eq!(e.samples, x.len());
    }
}
