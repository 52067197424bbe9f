//! Where the samples come from: one channel at a uniform rate, read from the start as often as
//! the analysis asks (twice), so that a long WAV file is never held in memory whole.

use crate::Error;

/// One channel of samples at a uniform rate, readable from the start any number of times.
pub(crate) trait Source {
    /// Samples per second.
    fn rate_hz(&self) -> f64;
    /// Calls `visit` with consecutive runs of samples from the first to the last. Returns the
    /// number of samples visited.
    fn scan(&mut self, visit: &mut dyn FnMut(&[f32])) -> Result<usize, Error>;
    /// Samples at full scale seen by the last scan (integer WAV only; 0 when unknown).
    fn full_scale_hits(&self) -> usize {
        0
    }
}

/// Samples already in memory.
pub(crate) struct Memory<'a> {
    pub(crate) samples: &'a [f32],
    pub(crate) rate_hz: f64,
}

impl Source for Memory<'_> {
    fn rate_hz(&self) -> f64 {
        self.rate_hz
    }

    fn scan(&mut self, visit: &mut dyn FnMut(&[f32])) -> Result<usize, Error> {
        for chunk in self.samples.chunks(1 << 16) {
            visit(chunk);
        }
        Ok(self.samples.len())
    }
}
