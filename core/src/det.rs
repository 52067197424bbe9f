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
/// The magnitudes of a factor, [2⁻⁴⁰⁰, 2⁴⁰⁰), and of the product, [2⁻⁶⁰⁰, 2⁶⁰⁰), that
/// [`LogProduct::mul`] takes in by one multiplication: within [`FACTOR`] and [`RESCALE`].
const FAST_FACTOR: (f64, f64) = (f64::from_bits((1023 - 400) << 52), f64::from_bits((1023 + 400) << 52));
const FAST_PRODUCT: (f64, f64) = (f64::from_bits((1023 - 600) << 52), f64::from_bits((1023 + 600) << 52));

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
    ///
    /// Inlined, so that the common case costs a multiplication and two comparisons in the
    /// caller's loop: a call there makes the caller save every floating-point value it holds
    /// (none survives a call in registers, natively or in WebAssembly), which cost the station
    /// sweep more than the multiplication itself.
    #[inline(always)]
    pub(crate) fn mul(&mut self, x: f64) {
        // Most factors and products lie well inside both limits, where the steps below come to
        // `mantissa *= x`: take that at the cost of two comparisons (NaN, zero and infinity fail
        // them and take the long way). The limits are a little inside the long way's, so the
        // result is the same to the bit.
        let m = self.mantissa * x;
        if (FAST_FACTOR.0..FAST_FACTOR.1).contains(&x.abs())
            && (FAST_PRODUCT.0..FAST_PRODUCT.1).contains(&m.abs())
        {
            self.mantissa = m;
        } else {
            self.mul_rescaled(x);
        }
    }

    /// [`LogProduct::mul`] for a factor or product near the limits, zero, infinite or NaN.
    #[cold]
    #[inline(never)]
    fn mul_rescaled(&mut self, x: f64) {
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

    #[test]
    fn long_products_near_the_limits_of_the_short_way_keep_their_logarithm() {
        // Factors at and around the edges of the one-multiplication path, 2^±400, and runs of
        // them that carry the product past 2^±600 and back, against the sum of their logarithms
        // (ln of a product is the sum of the ln of its factors); seeded.
        let mut rng = modebench_tests::random::Rng::new(29);
        let edges = [2f64.powi(400), 2f64.powi(-400), 2f64.powi(399) * 1.999, 2f64.powi(-401) * 1.5];
        let mut p = LogProduct::one();
        let (mut sign, mut log, mut size) = (1.0, 0.0f64, 0.0f64);
        for i in 0..20_000 {
            let magnitude = if i % 7 == 0 { *rng.pick(&edges) } else { rng.log_range(1e-150, 1e150) };
            let x = if rng.unit() < 0.5 { -magnitude } else { magnitude };
            p.mul(x);
            sign *= x.signum();
            log += x.abs().ln();
            size = size.max(log.abs());
        }
        assert_eq!(p.sign(), sign);
        // Each ln carries a rounding of about ε·|ln x| ≤ 1e-13, so the sum is good to 20,000 of them.
        assert!((p.ln_abs() - log).abs() < 2e-9 * size.max(1.0), "{} vs {log}", p.ln_abs());
    }
}
