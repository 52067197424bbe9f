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

    /// Adds the next samples.
    pub fn push(&mut self, chunk: &[f32]) {
        for &x in chunk {
            let x = if x.is_finite() { x } else { 0.0 };
            let v = x as f64;
            self.sum += v * v;
            // The energy operator is centred on the previous sample, so each block's value lags
            // it by one sample: harmless at a millisecond's resolution.
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
}
