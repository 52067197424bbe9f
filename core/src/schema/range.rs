//! The values a field allows, in SI, and the message that says so when a value lies outside.

use crate::error::{number, ErrorKind};

/// The values a field allows, in SI units.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Range {
    /// Anything the field's form reads (a text, a name, an object).
    Any,
    /// Above zero, from `.0` to `.1`: ranges that hold every beam from a micro-machined
    /// cantilever to a bridge girder; a value outside is almost always a unit slip.
    Between(f64, f64),
    /// Zero to `.0`.
    UpTo(f64),
    /// From `-.0` to `.0`: a value with a sign (a force, tension positive).
    Magnitude(f64),
    /// Above zero, at most `.0` (which may be infinite).
    AboveZero(f64),
    /// At least `.0` and below `.1`.
    Below(f64, f64),
    /// Above 0 and below 1, written as a ratio or a percentage.
    Fraction,
    /// On the beam: from 0 to its length.
    OnTheBeam,
    /// A whole number from `.0` to `.1`.
    Whole(usize, usize),
}

impl Range {
    /// The range in words with its unit: "between 1e-9 and 1e6 m", "from 1 to 20".
    pub fn words(self, unit: &str, rigid: bool) -> String {
        let or_rigid = if rigid { ", or \"rigid\"" } else { "" };
        let text = match self {
            Range::Any => String::new(),
            Range::Between(lo, hi) => format!("between {} and {} {unit}", number(lo), number(hi)),
            Range::UpTo(hi) if hi.is_infinite() => "zero or more".to_string(),
            Range::UpTo(hi) => format!("between 0 and {} {unit}", number(hi)),
            Range::Magnitude(hi) => format!("between {} and {} {unit}", number(-hi), number(hi)),
            Range::AboveZero(hi) if hi.is_infinite() => "greater than zero".to_string(),
            Range::AboveZero(hi) => format!("greater than zero, at most {} {unit}", number(hi)),
            Range::Below(lo, hi) => format!("at least {} and below {}", number(lo), number(hi)),
            Range::Fraction => "between 0 and 100 %".to_string(),
            Range::OnTheBeam => "on the beam".to_string(),
            Range::Whole(lo, hi) => format!("a whole number from {lo} to {hi}"),
        };
        format!("{}{or_rigid}", text.trim_end())
    }

    /// The largest value allowed (infinite when there is none).
    pub fn high(self) -> f64 {
        match self {
            Range::Between(_, hi)
            | Range::UpTo(hi)
            | Range::Magnitude(hi)
            | Range::AboveZero(hi)
            | Range::Below(_, hi) => hi,
            Range::Fraction => 1.0,
            Range::Whole(_, hi) => hi as f64,
            Range::Any | Range::OnTheBeam => f64::INFINITY,
        }
    }

    /// Whether `v` (SI) lies in the range; `rigid` admits +∞.
    pub fn contains(self, v: f64, rigid: bool) -> bool {
        if !v.is_finite() {
            return v == f64::INFINITY && rigid;
        }
        match self {
            Range::Any | Range::OnTheBeam => !v.is_nan(),
            Range::Between(lo, hi) => v > 0.0 && (lo..=hi).contains(&v),
            Range::UpTo(hi) => (0.0..=hi).contains(&v),
            Range::Magnitude(hi) => v.abs() <= hi,
            Range::AboveZero(hi) => v > 0.0 && v <= hi,
            Range::Below(lo, hi) => v >= lo && v < hi,
            Range::Fraction => v > 0.0 && v < 1.0,
            Range::Whole(lo, hi) => v >= lo as f64 && v <= hi as f64 && v.fract() == 0.0,
        }
    }

    /// What is wrong with `v` (SI), for a field called `what` in `unit`: the kind of error and
    /// the message, which names the range; `None` when `v` is allowed.
    pub fn refuse(self, v: f64, what: &str, unit: &str, rigid: bool) -> Option<(ErrorKind, String)> {
        if self.contains(v, rigid) {
            return None;
        }
        let allowed = self.words(unit, rigid);
        Some(match self {
            // A stiffness that may be rigid says so beside its range.
            Range::UpTo(_) if rigid => (ErrorKind::OutOfRange, format!("{what} must lie {allowed}")),
            Range::AboveZero(_) if rigid => (ErrorKind::OutOfRange, format!("{what} must be {allowed}")),
            Range::UpTo(hi) if !v.is_finite() => {
                let comma = if hi.is_infinite() { "," } else { "" };
                (ErrorKind::NotFinite, format!("{what} must be a finite number{comma} {allowed}"))
            }
            Range::UpTo(hi) if v < 0.0 || hi.is_infinite() => {
                (ErrorKind::OutOfRange, format!("{what} must be zero or more"))
            }
            Range::UpTo(_) => (ErrorKind::OutOfRange, format!("{what} must lie {allowed}; check the unit")),
            Range::Between(..) if !v.is_finite() => {
                (ErrorKind::NotFinite, format!("{what} must be a finite number {allowed}"))
            }
            Range::Between(..) if v <= 0.0 => {
                (ErrorKind::OutOfRange, format!("{what} must be greater than zero ({allowed})"))
            }
            Range::Between(..) => {
                (ErrorKind::OutOfRange, format!("{what} must lie {allowed}; check the unit"))
            }
            Range::Fraction => (ErrorKind::OutOfRange, format!("{what} must lie {allowed}")),
            Range::Magnitude(_) if !v.is_finite() => {
                (ErrorKind::NotFinite, format!("{what} must be a finite number {allowed}"))
            }
            Range::Magnitude(_) => {
                (ErrorKind::OutOfRange, format!("{what} must lie {allowed}; check the unit"))
            }
            _ => (ErrorKind::OutOfRange, format!("{what} must be {allowed}")),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ranges_say_what_they_allow() {
        let length = Range::Between(1e-9, 1e6);
        assert_eq!(length.words("m", false), "between 1e-9 and 1e6 m");
        assert!(length.contains(1.0, false) && !length.contains(0.0, false) && !length.contains(2e6, false));
        assert_eq!(
            length.refuse(-1.0, "a length", "m", false),
            Some((
                ErrorKind::OutOfRange,
                "a length must be greater than zero (between 1e-9 and 1e6 m)".into()
            ))
        );
        let spring = Range::UpTo(1e20);
        assert!(spring.contains(f64::INFINITY, true) && !spring.contains(f64::INFINITY, false));
        assert_eq!(
            spring.refuse(-1.0, "a spring", "N/m", true).map(|r| r.1),
            Some("a spring must lie between 0 and 1e20 N/m, or \"rigid\"".into())
        );
        assert_eq!(Range::Whole(1, 20).words("", false), "a whole number from 1 to 20");
        let force = Range::Magnitude(1e12);
        assert!(
            force.contains(-5.0, false) && !force.contains(2e12, false) && !force.contains(f64::NAN, false)
        );
        assert_eq!(force.words("N", false), "between -1e12 and 1e12 N");
        assert!(!Range::Whole(1, 20).contains(2.5, false));
    }
}
