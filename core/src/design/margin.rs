//! Separation margins: how far each natural frequency lies from each excitation, signed, and
//! the band of frequencies each excitation forbids.
//!
//! An excitation is a line (a fixed running speed times an order, line frequency, a blade pass)
//! or a band (a variable-speed drive's range times an order). The separation of a frequency f
//! from a line at fₑ is (f − fₑ)/fₑ: negative below, positive above, and its size |f − fₑ|/fₑ is
//! what a margin is stated in (common practice, no source; codes differ in the margin they ask
//! for, not in this definition). From a band [f₁, f₂] it is measured from the nearer edge, and is
//! zero inside. A margin m forbids [f₁·(1 − m), f₂·(1 + m)].

use serde::{Deserialize, Serialize};

/// A frequency an excitation drives at: a line, or a band swept by a variable speed.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "kebab-case")]
pub enum Drive {
    /// One frequency, Hz.
    Line {
        /// Hz.
        hz: f64,
    },
    /// A range of frequencies, Hz.
    Band {
        /// Lower end, Hz.
        low_hz: f64,
        /// Upper end, Hz.
        high_hz: f64,
    },
}

impl Drive {
    /// The ends of the driven range (equal for a line).
    pub fn range(&self) -> (f64, f64) {
        match *self {
            Drive::Line { hz } => (hz, hz),
            Drive::Band { low_hz, high_hz } => (low_hz.min(high_hz), low_hz.max(high_hz)),
        }
    }

    /// The frequencies a margin m keeps a natural frequency out of.
    pub fn forbidden(&self, margin: f64) -> (f64, f64) {
        let (low, high) = self.range();
        (low * (1.0 - margin), high * (1.0 + margin))
    }

    /// The signed separation of a natural frequency f: (f − fₑ)/fₑ from the nearer end of the
    /// range, zero inside it.
    pub fn separation(&self, f: f64) -> f64 {
        let (low, high) = self.range();
        if f < low {
            (f - low) / low
        } else if f > high {
            (f - high) / high
        } else {
            0.0
        }
    }

    /// Whether f lies inside the band a margin forbids.
    pub fn too_close(&self, f: f64, margin: f64) -> bool {
        let (low, high) = self.forbidden(margin);
        f > low && f < high
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn separation_is_signed_and_measured_from_the_nearer_edge() {
        let line = Drive::Line { hz: 100.0 };
        assert_eq!(line.separation(84.0), -0.16);
        assert!((line.separation(116.0) - 0.16).abs() < 1e-15);
        assert!(line.too_close(85.0, 0.2) && !line.too_close(79.0, 0.2));
        let band = Drive::Band { low_hz: 10.0, high_hz: 30.0 };
        assert_eq!(band.separation(20.0), 0.0);
        assert!((band.separation(33.0) - 0.1).abs() < 1e-15 && (band.separation(9.0) + 0.1).abs() < 1e-15);
        assert_eq!(band.forbidden(0.1), (9.0, 33.0));
        assert!(band.too_close(32.9, 0.1) && !band.too_close(33.1, 0.1));
    }
}
