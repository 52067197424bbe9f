//! A report, or an error, read back from JSON held as a `serde_json::Value`, field by field by
//! hand. The browser's page reads the answer of its solving worker this way: serde's derived
//! deserialisers for these types would cost the page's engine about 75 KB, this reader a
//! fraction of that. Each type lists its fields once, in `fields!`, and a field left out does
//! not compile; a test reads every documented scenario's report back equal, bit for bit, to
//! what serde reads.

use super::types::*;
use crate::analysis::{Separation, Warning, WarningCode};
use crate::bounds::Equivalent;
use crate::design::study::{
    CalibrationReport, Design, DriveEcho, InputEcho, MeasuredEcho, ModeBand, ModeSensitivity, ResizeReport,
    ToleranceEcho,
};
use crate::error::{Error, ErrorKind};
use crate::extra_mass::MassBreakdown;
use crate::model::{AttachmentKind, EndKind, Theory};
use crate::path::FieldPath;
use crate::scenario::SegmentEcho;
use crate::units::{Conversion, UnitSystem};
use serde_json::Value;

/// A value read from its JSON form; `None` when it is not of that form.
pub trait FromJson: Sized {
    /// Reads the value.
    fn from_json(value: &Value) -> Option<Self>;
}

/// The report a worker's answer holds.
pub fn report_from_json(value: &Value) -> Option<Report> {
    Report::from_json(value)
}

impl FromJson for f64 {
    fn from_json(value: &Value) -> Option<f64> {
        value.as_f64()
    }
}

impl FromJson for usize {
    fn from_json(value: &Value) -> Option<usize> {
        usize::try_from(value.as_u64()?).ok()
    }
}

impl FromJson for bool {
    fn from_json(value: &Value) -> Option<bool> {
        value.as_bool()
    }
}

impl FromJson for String {
    fn from_json(value: &Value) -> Option<String> {
        value.as_str().map(str::to_string)
    }
}

impl FromJson for FieldPath {
    fn from_json(value: &Value) -> Option<FieldPath> {
        FieldPath::parse(value.as_str()?)
    }
}

/// `null` is `None`, as serde writes it.
impl<T: FromJson> FromJson for Option<T> {
    fn from_json(value: &Value) -> Option<Option<T>> {
        if value.is_null() {
            Some(None)
        } else {
            T::from_json(value).map(Some)
        }
    }
}

/// A plain loop: collecting an iterator of options builds an adapter per item type, some 14 KB
/// of the page's engine over the report's lists (`docs/performance.md`, 2026-12-03).
impl<T: FromJson> FromJson for Vec<T> {
    fn from_json(value: &Value) -> Option<Vec<T>> {
        let items = value.as_array()?;
        let mut read = Vec::with_capacity(items.len());
        for item in items {
            read.push(T::from_json(item)?);
        }
        Some(read)
    }
}

/// A pair, written as a list of two.
impl<A: FromJson, B: FromJson> FromJson for (A, B) {
    fn from_json(value: &Value) -> Option<(A, B)> {
        match value.as_array()?.as_slice() {
            [a, b] => Some((A::from_json(a)?, B::from_json(b)?)),
            _ => None,
        }
    }
}

/// Enums written by their id.
macro_rules! by_id {
    ($($type:ty => $all:expr),* $(,)?) => {$(
        impl FromJson for $type {
            fn from_json(value: &Value) -> Option<$type> {
                let id = value.as_str()?;
                $all.into_iter().find(|k| k.id() == id)
            }
        }
    )*};
}

by_id! {
    UnitSystem => UnitSystem::ALL,
    Theory => Theory::ALL,
    EndKind => EndKind::ALL,
    AttachmentKind => AttachmentKind::ALL,
    WarningCode => WarningCode::ALL,
    ErrorKind => ErrorKind::ALL,
    crate::units::Kind => crate::units::Kind::ALL,
}

/// Structs written as objects, one key per field: each field is read from its key, a missing
/// key as `null`. Fields listed after `flatten` are read from the same object.
macro_rules! fields {
    ($($type:ident { $($field:ident),* $(; flatten $inner:ident)? })*) => {$(
        impl FromJson for $type {
            fn from_json(value: &Value) -> Option<$type> {
                let object = value.as_object()?;
                let at = |key: &str| object.get(key).unwrap_or(&Value::Null);
                Some($type {
                    $($field: FromJson::from_json(at(stringify!($field)))?,)*
                    $($inner: FromJson::from_json(value)?,)?
                })
            }
        }
    )*};
}

fields! {
    Report {
        title, units, theory, comparison, beam, rigid_body_modes, modes, fundamental, fe, excitations, margin,
        warnings, conversions, critical_load_factor, design
    }
    BeamEcho { length, segments, left, right, attachments }
    SegmentReport { start, end, flexural_rigidity, mass_per_length, shear_rigidity; flatten echo }
    SegmentEcho { section, material, mass, depth, gyration_squared, axial_force, thermal_force }
    MassBreakdown { structural, contents, lining, added_water, conversions }
    Conversion { written, si, si_unit, text }
    EndEcho { kind, translational, rotational }
    AttachmentEcho { kind, position, label, mass, rotary_inertia, stiffness, rigid }
    ModeReport {
        number, rigid_body, multiplicity, frequency_hz, rpm, fe_frequency_hz, fe_difference, fe_error, accuracy,
        other_theory_hz, nodes, generalized_mass, shape, sprung, nearest_excitation
    }
    ShapeSamples { x, w }
    SprungAmplitude { attachment, amplitude }
    Separation { excitation, order, frequency_hz, up_to_hz, separation, margin, band_separation, too_close }
    ExcitationEcho { label, frequency_hz, up_to_hz, orders }
    FundamentalReport { exact_hz, rayleigh_hz, dunkerley_hz, equivalent }
    Equivalent { position, mass, stiffness }
    FeReport { elements, dofs }
    Warning { code, message }
    ConversionEcho { path, text }
    Error { kind, path, value, si, message }
}

// The design study.
fields! {
    Design { inputs, sensitivities, tolerances, bands, measured, calibration, resize, drives, notes }
    InputEcho { path, label, kind, value }
    ModeSensitivity { mode, per_input }
    ToleranceEcho { input, plus_minus, low, high }
    ModeBand { mode, low_hz, high_hz }
    MeasuredEcho { mode, measured_hz, computed_hz, difference }
    CalibrationReport { inputs, fitted, fitted_hz, residuals, condition, alternatives, notes, problem }
    ResizeReport { input, low, high, intervals, nearest, clear_today, x, hz, problem }
    DriveEcho { excitation, order, low_hz, high_hz, forbidden_low_hz, forbidden_high_hz }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// What this reader reads is what serde's derived reader reads, bit for bit.
    #[test]
    fn reports_and_errors_read_back_as_serde_reads_them() {
        let scenarios = [
            include_str!("../../../docs/scenarios/sensor-boom.json"),
            include_str!("../../../docs/scenarios/fan-floor-beam-us.json"),
            include_str!("../../../docs/scenarios/filled-pipe-span.json"),
            include_str!("../../../docs/scenarios/absorber-on-platform-beam.json"),
            include_str!("../../../docs/scenarios/pump-discharge-valve-us.json"),
            include_str!("../../../docs/scenarios/hot-line-between-anchors.json"),
            include_str!("../../../docs/scenarios/boom-root-calibration.json"),
            include_str!("../../../docs/scenarios/floor-beam-variable-fan.json"),
        ];
        for text in scenarios {
            let Ok(report) = super::super::solve_json(text) else { panic!("{text}") };
            let Ok(value) = serde_json::to_value(&report) else { panic!("{text}") };
            assert_eq!(report_from_json(&value).as_ref(), Some(&report), "{text}");
        }
        let e = Error::new(ErrorKind::OutOfRange, "too long").at("segments[0].length").with_value("2 km");
        let Ok(value) = serde_json::to_value(&e) else { panic!("an error serialises") };
        assert_eq!(Error::from_json(&value), Some(e));
        assert_eq!(report_from_json(&serde_json::json!({"title": 1})), None);
    }
}
