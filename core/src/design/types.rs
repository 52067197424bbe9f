//! What the design study reports: the numeric inputs and what moves each mode, the tolerances
//! and bands, the measurements, the calibration's and the resizing's answers, and the drives with
//! the bands the margin forbids. SI throughout; `None` stands for rigid (infinite) values, so
//! every number in a report stays finite.

use crate::error::Error;
use crate::units::Kind;
use serde::{Deserialize, Serialize};

/// The design study, as the report shows it. Values are SI; `None` stands for rigid (infinite).
#[derive(Clone, Debug, Default, PartialEq, Serialize, Deserialize)]
pub struct Design {
    /// The numeric inputs, in the order of each mode's sensitivities.
    pub inputs: Vec<InputEcho>,
    /// Per elastic mode, ∂ln f/∂ln p for each input (`None` where it has no meaning).
    pub sensitivities: Vec<ModeSensitivity>,
    /// The tolerances on inputs, as read.
    pub tolerances: Vec<ToleranceEcho>,
    /// Per elastic mode, its band when inputs stray within their tolerances (empty without).
    pub bands: Vec<ModeBand>,
    /// The frequencies measured beside those computed.
    pub measured: Vec<MeasuredEcho>,
    /// The calibration asked for.
    pub calibration: Option<CalibrationReport>,
    /// The resizing asked for.
    pub resize: Option<ResizeReport>,
    /// Every order of every excitation: where it drives and what the margin forbids.
    pub drives: Vec<DriveEcho>,
    /// What the engineer should know about the study (what was left out, and why).
    pub notes: Vec<String>,
}

/// A numeric input.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct InputEcho {
    /// Its path in the scenario.
    pub path: String,
    /// The editor's words for it.
    pub label: String,
    /// Its kind of quantity.
    pub kind: Kind,
    /// Its value, SI (`None`: rigid).
    pub value: Option<f64>,
}

/// What moves one mode.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ModeSensitivity {
    /// The mode's number as the results list it.
    pub mode: usize,
    /// ∂ln f/∂ln p for each input: % of frequency per % of input, signed.
    pub per_input: Vec<Option<f64>>,
}

/// A tolerance as read.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ToleranceEcho {
    /// The input.
    pub input: InputEcho,
    /// ± this fraction, when given so.
    pub plus_minus: Option<f64>,
    /// The lowest value, SI.
    pub low: Option<f64>,
    /// The highest value, SI (`None`: rigid).
    pub high: Option<f64>,
}

/// A mode's band.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ModeBand {
    /// The mode's number.
    pub mode: usize,
    /// Lowest frequency the inputs can give, Hz.
    pub low_hz: f64,
    /// Highest, Hz.
    pub high_hz: f64,
}

/// A measured frequency beside the computed one.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct MeasuredEcho {
    /// The mode's number.
    pub mode: usize,
    /// Measured, Hz.
    pub measured_hz: f64,
    /// Computed, Hz.
    pub computed_hz: f64,
    /// (computed − measured)/measured.
    pub difference: f64,
}

/// A calibration's answer.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct CalibrationReport {
    /// The inputs fitted, with their values before.
    pub inputs: Vec<InputEcho>,
    /// The fitted value of each, SI (empty when there is no fit).
    pub fitted: Vec<f64>,
    /// Each measured mode's frequency at the fitted values, Hz.
    pub fitted_hz: Vec<f64>,
    /// (computed − measured)/measured at the fitted values, per measured frequency.
    pub residuals: Vec<f64>,
    /// The condition number of the fit's scaled Jacobian (two unknowns).
    pub condition: Option<f64>,
    /// Other values that fit one measurement as well.
    pub alternatives: Vec<f64>,
    /// What the engineer should know about the fit.
    pub notes: Vec<String>,
    /// Why there is no fit, when there is none.
    pub problem: Option<Error>,
}

/// A resizing's answer.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ResizeReport {
    /// The input resized, with its value today.
    pub input: InputEcho,
    /// The range searched, SI.
    pub low: f64,
    /// See `low`.
    pub high: f64,
    /// The intervals in which every mode clears every drive by the margin.
    pub intervals: Vec<(f64, f64)>,
    /// The value in them nearest today's.
    pub nearest: Option<f64>,
    /// Whether today's value clears every margin.
    pub clear_today: bool,
    /// The input values swept.
    pub x: Vec<f64>,
    /// The elastic frequencies at each, Hz.
    pub hz: Vec<Vec<f64>>,
    /// Why there is no answer, when there is none.
    pub problem: Option<Error>,
}

/// One order of one excitation.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct DriveEcho {
    /// Index of the excitation.
    pub excitation: usize,
    /// The order.
    pub order: f64,
    /// The driven range, Hz (equal ends for a single speed).
    pub low_hz: f64,
    /// See `low_hz`.
    pub high_hz: f64,
    /// The frequencies the margin keeps modes out of, Hz.
    pub forbidden_low_hz: f64,
    /// See `forbidden_low_hz`.
    pub forbidden_high_hz: f64,
}

impl Design {
    /// Whether every number is finite (rigid values are `None`).
    pub fn is_finite(&self) -> bool {
        let ok = |v: &f64| v.is_finite();
        let opt = |v: &Option<f64>| v.is_none_or(f64::is_finite);
        let input = |i: &InputEcho| opt(&i.value);
        self.inputs.iter().all(input)
            && self.sensitivities.iter().all(|s| s.per_input.iter().all(opt))
            && self
                .tolerances
                .iter()
                .all(|t| input(&t.input) && opt(&t.plus_minus) && opt(&t.low) && opt(&t.high))
            && self.bands.iter().all(|b| ok(&b.low_hz) && ok(&b.high_hz))
            && self.measured.iter().all(|m| ok(&m.measured_hz) && ok(&m.computed_hz) && ok(&m.difference))
            && self.calibration.as_ref().is_none_or(|c| {
                c.inputs.iter().all(input)
                    && c.fitted.iter().chain(&c.fitted_hz).chain(&c.residuals).chain(&c.alternatives).all(ok)
                    && opt(&c.condition)
            })
            && self.resize.as_ref().is_none_or(|r| {
                input(&r.input)
                    && ok(&r.low)
                    && ok(&r.high)
                    && r.intervals.iter().all(|(a, b)| ok(a) && ok(b))
                    && opt(&r.nearest)
                    && r.x.iter().chain(r.hz.iter().flatten()).all(ok)
            })
            && self.drives.iter().all(|d| {
                [d.order, d.low_hz, d.high_hz, d.forbidden_low_hz, d.forbidden_high_hz].iter().all(ok)
            })
    }
}
