//! The unit a number typed without one takes in the calculator's editor, and how precisely a
//! typed number was given.
//!
//! A scenario file keeps its rule: a bare number is SI. The editor shows a unit beside each
//! field, and a number typed there alone means that unit; the editor writes the unit out
//! ([`with_unit`]) before it stores the value, so the stored scenario says what was meant and
//! keeps meaning it whatever unit system is chosen later.

use super::table::Class;
use super::{display_unit, Kind, UnitSystem};

/// The unit a number typed alone into a field of `kind` takes, for the unit system chosen and
/// the value the field holds now (`current`, as written).
///
/// It is the unit the system shows that kind in, except for frequencies: every system shows them
/// in hertz, yet a running speed is as often written in rpm, so a frequency field keeps the cycle
/// unit its value is written in (`1780 rpm`: a new `1800` is 1800 rpm). Empty for ratios.
pub fn bare_unit(kind: Kind, system: UnitSystem, current: &str) -> &'static str {
    if kind == Kind::Frequency {
        if let Ok(parsed) = super::parse::parse_text(current) {
            if let [factor] = parsed.factors.as_slice() {
                if factor.unit.class == Class::Cycle && factor.power == 1 {
                    return factor.unit.symbols[0];
                }
            }
        }
    }
    display_unit(kind, system).symbol
}

/// Whether `text` is a number alone, with no unit (blanks around it allowed).
pub fn is_bare_number(text: &str) -> bool {
    super::parse::parse_text(text).is_ok_and(|parsed| parsed.factors.is_empty())
}

/// `text` with `unit` written after it when `text` is a number alone ("4.5" and "in" give
/// "4.5 in"); `None` when it has a unit already, is not a number, or `unit` is empty.
pub fn with_unit(text: &str, unit: &str) -> Option<String> {
    (!unit.is_empty() && is_bare_number(text)).then(|| format!("{} {unit}", text.trim()))
}

/// How many significant digits a typed number carries: `24` two, `0.283` three, `1780` four
/// (trailing zeros of a whole number are counted: the reader cannot know they are not
/// meant), `30e6` two. Zero carries one. Text that is not a number carries none.
pub fn carried_digits(number: &str) -> usize {
    let text = number.trim().trim_start_matches(['+', '-']);
    let mantissa = text.split(['e', 'E']).next().unwrap_or("");
    if mantissa.is_empty() || !mantissa.bytes().all(|b| b.is_ascii_digit() || b == b'.') {
        return 0;
    }
    let digits: String = mantissa.chars().filter(char::is_ascii_digit).collect();
    let significant = digits.trim_start_matches('0').len();
    match (digits.is_empty(), significant) {
        (true, _) => 0,
        (false, 0) => 1,
        (false, n) => n,
    }
}

/// The canonical symbols of the cycle units, for tests that every one is kept.
#[cfg(test)]
pub(crate) fn cycle_symbols() -> Vec<&'static str> {
    super::table::UNITS.iter().filter(|u| u.class == Class::Cycle).map(|u| u.symbols[0]).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_bare_number_takes_the_unit_the_field_shows() {
        assert_eq!(bare_unit(Kind::Length, UnitSystem::UsInch, ""), "in");
        assert_eq!(bare_unit(Kind::Length, UnitSystem::UsInch, "114.3 mm"), "in");
        assert_eq!(bare_unit(Kind::Length, UnitSystem::SiMm, "4.5 in"), "mm");
        assert_eq!(bare_unit(Kind::Density, UnitSystem::UsFoot, ""), "lb/ft³");
        assert_eq!(bare_unit(Kind::Ratio, UnitSystem::UsInch, "0.3"), "");
        // A frequency field keeps the cycle unit its value is written in.
        assert_eq!(bare_unit(Kind::Frequency, UnitSystem::UsInch, "1780 rpm"), "rpm");
        assert_eq!(bare_unit(Kind::Frequency, UnitSystem::Si, "1780 RPM"), "rpm");
        assert_eq!(bare_unit(Kind::Frequency, UnitSystem::Si, "3 kHz"), "kHz");
        assert_eq!(bare_unit(Kind::Frequency, UnitSystem::Si, "377 rad/s"), "Hz");
        assert_eq!(bare_unit(Kind::Frequency, UnitSystem::UsFoot, "60"), "Hz");
        assert_eq!(bare_unit(Kind::Frequency, UnitSystem::UsFoot, ""), "Hz");
        for symbol in cycle_symbols() {
            assert_eq!(bare_unit(Kind::Frequency, UnitSystem::Si, &format!("5 {symbol}")), symbol);
        }
    }

    #[test]
    fn only_a_number_alone_gets_the_unit_written_out() {
        assert_eq!(with_unit("4.5", "in").as_deref(), Some("4.5 in"));
        assert_eq!(with_unit(" 1780 ", "rpm").as_deref(), Some("1780 rpm"));
        assert_eq!(with_unit("-2e3", "lbf/in").as_deref(), Some("-2e3 lbf/in"));
        assert_eq!(with_unit("4.5 mm", "in"), None);
        assert_eq!(with_unit("4.5\"", "mm"), None);
        assert_eq!(with_unit("rigid", "N/m"), None);
        assert_eq!(with_unit("", "in"), None);
        assert_eq!(with_unit("4.5", ""), None);
        assert_eq!(with_unit("1e", "in"), None);
    }

    #[test]
    fn digits_carried_are_counted_as_written() {
        for (text, digits) in [
            ("24", 2),
            ("0.283", 3),
            ("1780", 4),
            ("30e6", 2),
            ("4.50", 3),
            ("-0.0025", 2),
            (".5", 1),
            ("0", 1),
            ("0.0", 1),
            ("1.2345678", 8),
            ("x", 0),
            ("", 0),
        ] {
            assert_eq!(carried_digits(text), digits, "{text}");
        }
    }
}
