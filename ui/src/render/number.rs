//! Numbers as the page shows them: a few significant figures, never "NaN" or "inf".

use modebench::units::{self, Kind, UnitSystem};

/// What is shown where a number cannot be (it is never expected: core reports only finite
/// values, but the page must not show "NaN" whatever happens).
pub(crate) const MISSING: &str = "—";

/// `value` with `significant` significant figures and no trailing zeros; plain notation from
/// 0.001 up to a million, `2.9e7` style outside that range; "—" for a value that is not finite.
pub(crate) fn sig(value: f64, significant: usize) -> String {
    units::significant(value, significant)
}

/// A frequency in hertz for the page: "11.52 Hz".
pub(crate) fn hz(value: f64) -> String {
    format!("{} Hz", sig(value, 4))
}

/// Revolutions (cycles) per minute: "691.5 rpm". A mode's comes with the report (`rpm`); an
/// excitation's is its frequency in hertz times 60.
pub(crate) fn rpm(value_rpm: f64) -> String {
    format!("{} rpm", sig(value_rpm, 4))
}

/// A ratio as a percentage: "12.5 %".
pub(crate) fn percent(ratio: f64, significant: usize) -> String {
    format!("{} %", sig(ratio * 100.0, significant))
}

/// A signed ratio as a percentage with its sign: "−16.2 %", "+4 %", "0 %" ("—" for none). A
/// ratio under 1e-9, the accuracy the engine gives its frequencies, is rounding and reads "0 %"
/// (a calibration that fits its measurements exactly comes out −6.7e-16, not "−6.7e-14 %").
pub(crate) fn signed_percent(ratio: f64, significant: usize) -> String {
    match ratio {
        r if r > 1e-9 => format!("+{}", percent(r, significant)),
        r if r < -1e-9 => format!("−{}", percent(-r, significant)),
        r if r.is_nan() => MISSING.to_string(),
        _ => "0 %".to_string(),
    }
}

/// An order of an excitation: "2×", "0.5×".
pub(crate) fn order(order: f64) -> String {
    format!("{}×", sig(order, 4))
}

/// An SI value in the display unit of the chosen system, through core's formatter.
pub(crate) fn quantity(si: f64, kind: Kind, system: UnitSystem) -> String {
    if si.is_finite() {
        units::format(si, kind, system)
    } else {
        MISSING.to_string()
    }
}

/// The full-precision text of a value for a `data-` attribute (Rust's shortest round-trip
/// form), or `None` when the value is not finite and the attribute is better left out.
pub(crate) fn exact(value: f64) -> Option<String> {
    value.is_finite().then(|| format!("{value}"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn significant_figures_and_guards() {
        assert_eq!(sig(11.524645583444405, 4), "11.52");
        assert_eq!(sig(19235.05, 4), "19235");
        assert_eq!(sig(3.1468e-9, 2), "3.1e-9");
        assert_eq!(sig(0.0, 4), "0");
        assert_eq!(sig(f64::NAN, 4), MISSING);
        assert_eq!(sig(f64::INFINITY, 4), MISSING);
        assert_eq!(percent(0.2, 3), "20 %");
        assert_eq!(exact(f64::NAN), None);
        assert_eq!(exact(0.1), Some("0.1".to_string()));
    }

    #[test]
    fn a_signed_percentage_under_the_engines_accuracy_reads_zero() {
        assert_eq!(signed_percent(0.0872, 3), "+8.72 %");
        assert_eq!(signed_percent(-0.162, 3), "−16.2 %");
        assert_eq!(signed_percent(-6.7e-16, 2), "0 %");
        assert_eq!(signed_percent(3e-8, 2), "+3e-6 %");
        assert_eq!(signed_percent(f64::NAN, 2), MISSING);
    }
}
