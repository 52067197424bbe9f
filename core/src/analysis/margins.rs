//! Separation margins: how far each natural frequency lies from the frequencies that drive the
//! beam and their harmonics, and a warning when one lies closer than the margin asked for.

use super::{Warning, WarningCode};

/// The separation of a natural frequency from an excitation.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Separation {
    /// Index of the excitation.
    pub excitation: usize,
    /// Harmonic order (1 = the excitation itself).
    pub order: usize,
    /// The excitation frequency times the order, Hz.
    pub frequency_hz: f64,
    /// |f_natural − f_excitation| / f_excitation.
    pub margin: f64,
    /// Whether the margin is below the one wanted.
    pub too_close: bool,
}

/// A frequency the beam is driven at, as the margins need it.
#[derive(Clone, Debug, PartialEq)]
pub struct Excitation {
    /// What it is; empty when the scenario gave no label.
    pub label: String,
    /// Frequency, Hz.
    pub frequency_hz: f64,
    /// Harmonics to check (1 = the frequency itself).
    pub harmonics: usize,
}

/// The closest excitation harmonic to a natural frequency `f` (Hz).
pub fn nearest(f: f64, excitations: &[Excitation], margin: f64) -> Option<Separation> {
    let mut best: Option<Separation> = None;
    for (i, e) in excitations.iter().enumerate() {
        for order in 1..=e.harmonics {
            let fe = e.frequency_hz * order as f64;
            let m = (f - fe).abs() / fe;
            if best.as_ref().is_none_or(|b| m < b.margin) {
                best = Some(Separation {
                    excitation: i,
                    order,
                    frequency_hz: fe,
                    margin: m,
                    too_close: m < margin,
                });
            }
        }
    }
    best
}

/// The warning for the first mode (by number) that lies too close to an excitation, given each
/// mode's number and nearest excitation.
pub fn resonance_warning<'a>(
    modes: impl IntoIterator<Item = (usize, Option<&'a Separation>)>,
    excitations: &[Excitation],
    margin: f64,
) -> Option<Warning> {
    let (number, s) = modes.into_iter().find_map(|(n, s)| s.filter(|s| s.too_close).map(|s| (n, s)))?;
    let label = excitations.get(s.excitation).map_or("", |e| e.label.as_str());
    Some(Warning {
        code: WarningCode::ResonanceMargin,
        message: format!(
            "Mode {} lies within {:.1} % of {}{} — less than the {:.0} % margin asked for. Resonance there can \
             crack welds and fail parts in fatigue: stiffen, lighten or move the part, and confirm by test.",
            number,
            100.0 * s.margin,
            if label.is_empty() { "an excitation" } else { label },
            if s.order > 1 { format!(" (harmonic {})", s.order) } else { String::new() },
            100.0 * margin
        ),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_nearest_harmonic_is_found() {
        // Arithmetic: 59 Hz against 20 Hz × (1, 2, 3) is nearest the third harmonic, 1/60 away.
        let e = [Excitation { label: "fan".into(), frequency_hz: 20.0, harmonics: 3 }];
        let Some(s) = nearest(59.0, &e, 0.2) else { panic!("an excitation is given") };
        assert_eq!((s.order, s.frequency_hz, s.too_close), (3, 60.0, true));
        assert!((s.margin - 1.0 / 60.0).abs() < 1e-15);
        let w = resonance_warning([(2, Some(&s))], &e, 0.2).map(|w| w.message).unwrap_or_default();
        assert!(w.starts_with("Mode 2 lies within 1.7 % of fan (harmonic 3)"), "{w}");
        assert_eq!(nearest(59.0, &[], 0.2), None);
    }
}
