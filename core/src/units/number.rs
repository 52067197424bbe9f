//! Reading a decimal number ("27.2", "-3e-4", ".5") into an `f64`.
//!
//! Correctly rounded whenever the significand has at most 15 significant digits and the decimal
//! exponent is within ±22 — every number an engineer types — because both the significand and
//! the power of ten are then exact in `f64` and one multiplication or division rounds once
//! (Clinger, "How to read floating point numbers accurately", PLDI 1990). Longer or more extreme
//! inputs are within a few units in the last place. Our own reader keeps the general-purpose
//! decimal parser, and its tables, out of the browser build.

/// Powers of ten that are exact in `f64`.
const EXACT: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18,
    1e19, 1e20, 1e21, 1e22,
];

/// The value of a number written as `[+-]digits[.digits][(e|E)[+-]digits]` (at least one digit
/// before or after the point), or `None` when `text` is not exactly that.
pub fn decimal(text: &str) -> Option<f64> {
    let b = text.as_bytes();
    let mut i = 0;
    let negative = match b.first() {
        Some(b'-') => {
            i = 1;
            true
        }
        Some(b'+') => {
            i = 1;
            false
        }
        _ => false,
    };
    let mut significand: u64 = 0;
    let mut kept = 0; // significant digits kept in `significand`
    let mut dropped_exponent: i64 = 0; // digits beyond 19 raise the exponent instead
    let mut any = false;
    let mut seen_point = false;
    while i < b.len() {
        match b[i] {
            d @ b'0'..=b'9' => {
                any = true;
                if kept < 19 {
                    if significand != 0 || d != b'0' {
                        kept += 1;
                    }
                    significand = significand * 10 + u64::from(d - b'0');
                    if seen_point {
                        dropped_exponent -= 1;
                    }
                } else if !seen_point {
                    dropped_exponent += 1;
                }
            }
            b'.' if !seen_point => seen_point = true,
            _ => break,
        }
        i += 1;
    }
    if !any {
        return None;
    }
    let mut exponent: i64 = 0;
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        i += 1;
        let sign = match b.get(i) {
            Some(b'-') => {
                i += 1;
                -1
            }
            Some(b'+') => {
                i += 1;
                1
            }
            _ => 1,
        };
        let start = i;
        while i < b.len() && b[i].is_ascii_digit() {
            exponent = (exponent * 10 + i64::from(b[i] - b'0')).min(100_000);
            i += 1;
        }
        if i == start {
            return None;
        }
        exponent *= sign;
    }
    if i != b.len() {
        return None;
    }
    let e = exponent + dropped_exponent;
    let m = significand as f64;
    let value = if significand == 0 {
        0.0
    } else if significand < (1 << 53) && e.abs() <= 22 {
        // Clinger's fast path: both factors exact, one rounding.
        if e >= 0 {
            m * EXACT[e as usize]
        } else {
            m / EXACT[(-e) as usize]
        }
    } else if e > 308 + 19 {
        f64::INFINITY
    } else if e < -343 - 19 {
        0.0
    } else {
        // Split the power so that no intermediate overflows or underflows.
        let half = e / 2;
        m * 10f64.powi(half as i32) * 10f64.powi((e - half) as i32)
    };
    Some(if negative { -value } else { value })
}

#[cfg(test)]
mod tests {
    use super::decimal;
    use modebench_tests::random::Rng;

    #[test]
    fn agrees_with_the_standard_library() {
        // The standard library's correctly rounded parser is the reference.
        for text in [
            "27.2",
            "0.0254",
            "0.45359237",
            "-3e-4",
            ".5",
            "5.",
            "1e22",
            "9007199254740993",
            "0",
            "-0.0",
            "1.7976931348623157e308",
            "4.9e-324",
            "123456789012345678901234567890",
            "0.000000000000000000000000001",
        ] {
            let (ours, reference) = (decimal(text).unwrap(), text.parse::<f64>().unwrap());
            let ulps = (ours.to_bits() as i64 - reference.to_bits() as i64).abs();
            assert!(ulps <= 2, "{text}: {ours} vs {reference}");
        }
        let mut rng = Rng::new(7);
        for _ in 0..20000 {
            let digits = 1 + rng.below(15);
            let mut text: String = (0..digits).map(|_| char::from(b'0' + rng.below(10) as u8)).collect();
            let point = rng.below(digits + 1);
            text.insert(point, '.');
            if rng.below(2) == 0 {
                text.push_str(&format!("e{}", rng.below(41) as i32 - 20));
            }
            if text == "." || text.starts_with(".e") {
                continue;
            }
            let (ours, reference) = (decimal(&text).unwrap(), text.parse::<f64>().unwrap());
            // The decimal exponent once the point is moved behind the last digit.
            let mantissa = text.split(['e', 'E']).next().unwrap_or("");
            let after_point = mantissa.split('.').nth(1).map_or(0, str::len) as i64;
            let written = text.split(['e', 'E']).nth(1).map_or(0, |e| e.parse::<i64>().unwrap());
            let ulps = (ours.to_bits() as i64 - reference.to_bits() as i64).abs();
            if (written - after_point).abs() <= 22 {
                assert_eq!(ulps, 0, "{text}: fast path must round exactly");
            } else {
                assert!(ulps <= 2, "{text}: {ulps} ulps");
            }
        }
    }

    #[test]
    fn rejects_what_is_not_a_number() {
        for text in ["", "+", "-", ".", "e5", "1e", "1e+", "1.2.3", "1,5", "0x10", "1 ", "nan", "inf"] {
            assert_eq!(decimal(text), None, "{text:?}");
        }
    }
}
