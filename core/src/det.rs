//! A determinant accumulated as the product of an elimination's pivots, kept as a mantissa and a
//! power of two so that products of thousands of pivots neither overflow nor underflow.

/// A running product of pivots: a mantissa and a power of two taken out of it, so that no
/// logarithm is needed until the end.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct LogProduct {
    /// The product since the last rescaling; its magnitude stays within 2^±600.
    mantissa: f64,
    /// The power of two taken out of `mantissa` by rescaling.
    exponent: i64,
}

/// Magnitudes (as binary exponents) the mantissa may reach before a power of two is taken out:
/// far enough from the limits of `f64` (±1022) that one more factor within ±400 cannot overflow
/// it. Factors beyond that are taken in by their own exponent first.
const RESCALE: i64 = 600;
const FACTOR: i64 = 400;

/// The binary exponent of a finite nonzero x (x = m·2^e with 1 ≤ |m| < 2), read from its bits;
/// subnormal numbers are scaled up first.
fn exponent_of(x: f64) -> i64 {
    let biased = ((x.to_bits() >> 52) & 0x7ff) as i64;
    match biased {
        0 if x == 0.0 => 0,
        0 => (((x * TWO_64).to_bits() >> 52) & 0x7ff) as i64 - 1023 - 64,
        _ => biased - 1023,
    }
}

/// 2⁶⁴, which brings any subnormal number into the normal range.
const TWO_64: f64 = 18_446_744_073_709_551_616.0;

/// x·2^e, exactly, in two steps so that e may exceed the exponent range of one `f64`.
fn scaled(x: f64, e: i64) -> f64 {
    let half = e / 2;
    let power = |k: i64| f64::from_bits(((k.clamp(-1022, 1023) + 1023) as u64) << 52);
    x * power(half) * power(e - half)
}

impl LogProduct {
    /// The empty product, 1.
    pub(crate) fn one() -> LogProduct {
        LogProduct { mantissa: 1.0, exponent: 0 }
    }

    /// Multiplies by `x`, exactly to rounding whatever the range of the factors: powers of two
    /// are moved into `exponent` (an exact operation) whenever the mantissa strays far from 1.
    pub(crate) fn mul(&mut self, x: f64) {
        if x == 0.0 || !x.is_finite() {
            self.mantissa *= x;
            return;
        }
        let mut x = x;
        let e = exponent_of(x);
        if e.abs() > FACTOR {
            x = scaled(x, -e);
            self.exponent += e;
        }
        self.mantissa *= x;
        let m = exponent_of(self.mantissa);
        if m.abs() > RESCALE {
            self.mantissa = scaled(self.mantissa, -m);
            self.exponent += m;
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
        self.exponent as f64 * std::f64::consts::LN_2 + self.mantissa.abs().ln()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn products_of_extreme_factors_keep_sign_and_logarithm() {
        let factors = [3.0, -1e200, 2e-180, -7.5, 1e-320, 4e90, 4e90, 4e90, -0.25, 1e300, 1e300, 1e-310];
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
