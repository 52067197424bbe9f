//! Helpers shared by the crate's tests: a seeded random generator and one check for sourced values.

/// The splitmix64 generator (Steele, Lea & Flood, "Fast splittable pseudorandom number
/// generators", OOPSLA 2014): tiny, seedable, and good enough to vary test inputs.
pub(crate) struct SplitMix64(u64);

impl SplitMix64 {
    pub(crate) fn new(seed: u64) -> Self {
        SplitMix64(seed)
    }

    pub(crate) fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// A uniform index below `n` (n > 0); the small modulo bias does not matter for tests.
    pub(crate) fn below(&mut self, n: usize) -> usize {
        (self.next_u64() % n as u64) as usize
    }

    /// A uniform float in [0, 1).
    pub(crate) fn unit(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 / (1u64 << 53) as f64
    }

    /// One element of a non-empty slice.
    pub(crate) fn pick<'a, T>(&mut self, items: &'a [T]) -> &'a T {
        &items[self.below(items.len())]
    }
}

/// Compares `got` with a sourced `expected` value within a relative tolerance, and on failure
/// names the case, the source, both values and the tolerance.
#[track_caller]
pub(crate) fn check(case: &str, source: &str, expected: f64, got: f64, relative_tolerance: f64) {
    let error = if expected == 0.0 { got.abs() } else { ((got - expected) / expected).abs() };
    assert!(
        error <= relative_tolerance,
        "{case}\n  source:    {source}\n  expected:  {expected:e}\n  got:       {got:e}\n  \
         rel. error {error:e} > tolerance {relative_tolerance:e}"
    );
}
