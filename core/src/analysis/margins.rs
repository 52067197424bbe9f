//! Separation margins: how far each natural frequency lies from the frequencies that drive the
//! beam (each excitation's orders, over its speed range), signed, and a warning when one lies
//! closer than the margin asked for.
//!
//! The separation of a natural frequency f from a drive at fₑ is (f − fₑ)/fₑ: negative below the
//! drive, positive above, and its size |f − fₑ|/fₑ is what a margin is stated in (common
//! practice, no source; codes differ in the margin they ask for, not in this definition). From a
//! speed range it is measured from the nearer end of the range, and is zero inside it
//! ([`Drive::separation`]). When the mode has a tolerance band, the band's nearer edge is judged.

use super::{Warning, WarningCode};
use crate::design::margin::Drive;

/// The separation of a natural frequency from one order of an excitation.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Separation {
    /// Index of the excitation.
    pub excitation: usize,
    /// The order (1 = the excitation itself, 2 = twice it, a blade count…).
    pub order: f64,
    /// The excitation frequency times the order, Hz (the bottom of a range).
    pub frequency_hz: f64,
    /// The top of the driven range, Hz, for a variable speed.
    pub up_to_hz: Option<f64>,
    /// (f − fₑ)/fₑ from the nearer end of the driven range: negative when the mode lies below
    /// it, positive above, zero inside.
    pub separation: f64,
    /// |separation|.
    pub margin: f64,
    /// The separation of the nearer edge of the mode's tolerance band (zero when the band
    /// reaches into the driven range), when the mode has a band.
    pub band_separation: Option<f64>,
    /// Whether the separation judged (the band's when there is one) is below the margin wanted.
    pub too_close: bool,
}

/// A frequency the beam is driven at, as the margins need it.
#[derive(Clone, Debug, PartialEq)]
pub struct Excitation {
    /// What it is; empty when the scenario gave no label.
    pub label: String,
    /// Frequency, or the bottom of a variable speed's range, Hz.
    pub low_hz: f64,
    /// The top of a variable speed's range, Hz.
    pub high_hz: Option<f64>,
    /// The multiples that drive the beam.
    pub orders: Vec<f64>,
}

/// One order of one excitation: where it drives.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Order {
    /// Index of the excitation.
    pub excitation: usize,
    /// The order.
    pub order: f64,
    /// The frequencies it drives at.
    pub drive: Drive,
}

/// Every order of every excitation, in input order.
pub fn orders(excitations: &[Excitation]) -> Vec<Order> {
    let mut out = Vec::new();
    for (i, e) in excitations.iter().enumerate() {
        for &order in &e.orders {
            let drive = match e.high_hz {
                Some(high) if high > e.low_hz => {
                    Drive::Band { low_hz: e.low_hz * order, high_hz: high * order }
                }
                _ => Drive::Line { hz: e.low_hz * order },
            };
            out.push(Order { excitation: i, order, drive });
        }
    }
    out
}

/// The signed separation of a band of frequencies [low, high] from a drive: that of its nearer
/// edge, zero when the band reaches into the driven range.
pub fn band_separation(drive: &Drive, (low, high): (f64, f64)) -> f64 {
    let (below, above) = (drive.separation(high), drive.separation(low));
    if below < 0.0 {
        below
    } else if above > 0.0 {
        above
    } else {
        0.0
    }
}

/// The closest excitation order to a natural frequency `f` (Hz) with its tolerance band, if
/// any: the one whose separation judged is smallest.
pub fn nearest(f: f64, band: Option<(f64, f64)>, orders: &[Order], margin: f64) -> Option<Separation> {
    let mut best: Option<(f64, Separation)> = None;
    for o in orders {
        let separation = o.drive.separation(f);
        let band_separation = band.map(|b| band_separation(&o.drive, b));
        let judged = band_separation.unwrap_or(separation).abs();
        if best.as_ref().is_none_or(|(b, s)| judged < *b || (judged == *b && separation.abs() < s.margin)) {
            let (low, high) = o.drive.range();
            best = Some((
                judged,
                Separation {
                    excitation: o.excitation,
                    order: o.order,
                    frequency_hz: low,
                    up_to_hz: (high > low).then_some(high),
                    separation,
                    margin: separation.abs(),
                    band_separation,
                    too_close: judged < margin,
                },
            ));
        }
    }
    best.map(|(_, s)| s)
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
    let judged = s.band_separation.unwrap_or(s.separation);
    let place = if judged == 0.0 {
        if s.band_separation.is_some() {
            "its tolerance band reaches into".to_string()
        } else {
            "it lies inside the range of".to_string()
        }
    } else {
        format!(
            "{}it lies {:.1} % {}",
            if s.band_separation.is_some() { "at the edge of its tolerance band " } else { "" },
            100.0 * judged.abs(),
            if judged < 0.0 { "below" } else { "above" }
        )
    };
    Some(Warning {
        code: WarningCode::ResonanceMargin,
        message: format!(
            "Mode {number}: {place} {}{} — less than the {:.0} % margin asked for. Resonance there can crack welds \
             and fail parts in fatigue. The design tools below say which inputs move this mode most and which \
             values clear every margin; confirm by test.",
            if label.is_empty() { "an excitation" } else { label },
            if s.order != 1.0 { format!(" (order {}×)", crate::error::number(s.order)) } else { String::new() },
            100.0 * margin
        ),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fan(high: Option<f64>, orders: Vec<f64>) -> Vec<Excitation> {
        vec![Excitation { label: "fan".into(), low_hz: 20.0, high_hz: high, orders }]
    }

    #[test]
    fn the_nearest_order_is_found_with_its_sign() {
        // Arithmetic: 59 Hz against 20 Hz × (1, 2, 3) is nearest the third order, 1/60 below it.
        let e = fan(None, vec![1.0, 2.0, 3.0]);
        let Some(s) = nearest(59.0, None, &orders(&e), 0.2) else { panic!("an excitation is given") };
        assert_eq!((s.order, s.frequency_hz, s.too_close), (3.0, 60.0, true));
        assert!((s.separation + 1.0 / 60.0).abs() < 1e-15 && (s.margin - 1.0 / 60.0).abs() < 1e-15);
        let w = resonance_warning([(2, Some(&s))], &e, 0.2).map(|w| w.message).unwrap_or_default();
        assert!(w.starts_with("Mode 2: it lies 1.7 % below fan (order 3×)"), "{w}");
        assert_eq!(nearest(59.0, None, &[], 0.2), None);
    }

    #[test]
    fn a_speed_range_is_judged_from_its_nearer_end_and_a_band_from_its_nearer_edge() {
        // 10–30 Hz × 2 drives 20–60 Hz: 66 Hz is 10 % above its top; 50 Hz lies inside.
        let e = vec![Excitation { low_hz: 10.0, ..fan(Some(30.0), vec![2.0]).remove(0) }];
        let o = orders(&e);
        let Some(s) = nearest(66.0, None, &o, 0.15) else { panic!() };
        assert_eq!((s.frequency_hz, s.up_to_hz), (20.0, Some(60.0)));
        assert!((s.separation - 0.1).abs() < 1e-15 && s.too_close);
        assert_eq!(nearest(50.0, None, &o, 0.15).map(|s| s.separation), Some(0.0));
        // A mode at 80 Hz clears by 33 %, but a band reaching down to 66 Hz clears by only 10 %.
        let Some(s) = nearest(80.0, Some((66.0, 90.0)), &o, 0.15) else { panic!() };
        assert!(s.band_separation.is_some_and(|b| (b - 0.1).abs() < 1e-15) && s.too_close, "{s:?}");
        assert!(!nearest(80.0, None, &o, 0.15).is_some_and(|s| s.too_close));
    }
}
