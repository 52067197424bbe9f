//! A determinant accumulated as the product of an elimination's pivots, kept as a sign and a
//! natural logarithm so that products of thousands of pivots neither overflow nor underflow.

/// A running product of pivots.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct LogProduct {
    /// The product since the last rescaling; its magnitude stays within 1e±150.
    mantissa: f64,
    /// ln of the factor taken out of `mantissa` by rescaling.
    log: f64,
}

/// Magnitudes the mantissa may reach before its logarithm is taken out: far enough from the
/// limits of `f64` that one more pivot (a 2×2 block's determinant of entries up to 1e150 is
/// handled separately below) cannot overflow it.
const RESCALE: f64 = 1e100;

impl LogProduct {
    /// The empty product, 1.
    pub(crate) fn one() -> LogProduct {
        LogProduct { mantissa: 1.0, log: 0.0 }
    }

    /// Multiplies by `x`. A factor that is itself huge or tiny is taken in by its logarithm, so
    /// the product is exact to rounding whatever the pivots' range. Taking logarithms only on
    /// rescaling keeps a sweep of hundreds of pivots to a handful of `ln` calls.
    pub(crate) fn mul(&mut self, x: f64) {
        let a = x.abs();
        if !(1.0 / RESCALE..=RESCALE).contains(&a) {
            if a == 0.0 || !a.is_finite() {
                self.mantissa *= x;
                return;
            }
            self.log += a.ln();
            self.mantissa *= x.signum();
            return;
        }
        self.mantissa *= x;
        let m = self.mantissa.abs();
        if !(1.0 / RESCALE..=RESCALE).contains(&m) && m != 0.0 && m.is_finite() {
            self.log += m.ln();
            self.mantissa = self.mantissa.signum();
        }
    }

    /// −1, 0 or +1 (NaN if a factor was NaN).
    pub(crate) fn sign(&self) -> f64 {
        if self.mantissa == 0.0 {
            0.0
        } else {
            self.mantissa.signum()
        }
    }

    /// ln |product| (−∞ for a zero product).
    pub(crate) fn ln_abs(&self) -> f64 {
        self.log + self.mantissa.abs().ln()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn products_of_extreme_factors_keep_sign_and_logarithm() {
        let factors = [3.0, -1e200, 2e-180, -7.5, 1e-320, 4e90, 4e90, 4e90, -0.25];
        let mut p = LogProduct::one();
        let (mut sign, mut log) = (1.0, 0.0f64);
        for x in factors {
            p.mul(x);
            sign *= f64::signum(x);
            log += f64::ln(f64::abs(x));
        }
        assert_eq!(p.sign(), sign);
        assert!((p.ln_abs() - log).abs() < 1e-12 * log.abs(), "{} vs {log}", p.ln_abs());
        p.mul(0.0);
        assert_eq!(p.sign(), 0.0);
        assert_eq!(p.ln_abs(), f64::NEG_INFINITY);
    }
}
