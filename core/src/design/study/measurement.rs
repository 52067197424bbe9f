//! The measured frequencies of a design study beside the computed ones, and the calibration of
//! one or two uncertain inputs to them. A measured mode that was not computed, or a calibration
//! that names the same input twice or a range of two signs, is an error naming its field; a fit
//! that cannot be made is an answer the report shows.

use super::{echo, CalibrationReport, Design, MeasuredEcho, Solved};
use crate::design::calibrate::{self, Fit, Measured, Unknown};
use crate::design::inputs;
use crate::design::requests::ranged;
use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::scenario::{RangeInput, Scenario};
use serde_json::Value;

// Out of the study's own function: see `tolerances` in study.rs.
#[inline(never)]
pub(super) fn measured(
    scenario: &Scenario,
    solved: &Solved<'_>,
    design: &mut Design,
) -> Result<Vec<Measured>> {
    let mut out = Vec::new();
    for (i, m) in scenario.measured.iter().enumerate() {
        let at = FieldPath::item("measured", i);
        let field = &crate::schema::MEASURED_FIELDS[1];
        // The check names its own field: the error is placed under the row, not under the field.
        crate::model::whole(&crate::schema::MEASURED_FIELDS[0], m.mode).map_err(|e| e.at(at.clone()))?;
        let hz = inputs::read(&m.frequency, field, &at.key("frequency"))?;
        crate::model::value(field, hz).map_err(|e| e.at(at.clone()).with_value(&m.frequency))?;
        let elastic = m.mode.checked_sub(solved.rigid + 1).filter(|k| *k < solved.elastic_hz.len());
        let Some(k) = elastic else {
            let shown = solved.rigid + solved.elastic_hz.len();
            return Err(Error::new(
                ErrorKind::OutOfRange,
                if m.mode <= solved.rigid {
                    format!("mode {} is a rigid-body mode at 0 Hz; measured modes are elastic ones", m.mode)
                } else {
                    format!("only modes up to {shown} are computed; ask for more modes or check the number")
                },
            )
            .at(at.key("mode"))
            .with_value(m.mode));
        };
        if out.iter().any(|o: &Measured| o.mode == k) {
            return Err(Error::new(ErrorKind::Conflict, "this mode is already measured").at(at.key("mode")));
        }
        let computed = solved.elastic_hz[k];
        design.measured.push(MeasuredEcho {
            mode: m.mode,
            measured_hz: hz,
            computed_hz: computed,
            difference: (computed - hz) / hz,
        });
        out.push(Measured { mode: k, hz });
    }
    Ok(out)
}

// Out of the study's own function: see `tolerances` in study.rs.
#[inline(never)]
pub(super) fn calibration(
    scenario: &Scenario,
    doc: &Value,
    measured: &[Measured],
    design: &mut Design,
) -> Result<()> {
    if scenario.calibrate.is_empty() {
        return Ok(());
    }
    let count = scenario.calibrate.len();
    if count > crate::schema::MAX_UNKNOWNS {
        return Err(Error::new(ErrorKind::OutOfRange, "calibrate one or two inputs at a time")
            .at("calibrate")
            .with_value(count));
    }
    if measured.len() < count {
        return Err(Error::new(
            ErrorKind::Missing,
            format!(
                "calibrating {count} input{} needs at least {count} measured frequenc{}; add them under `measured`",
                if count == 1 { "" } else { "s" },
                if count == 1 { "y" } else { "ies" }
            ),
        )
        .at("measured"));
    }
    let list: Vec<&RangeInput> = scenario.calibrate.iter().collect();
    let chosen = ranged(doc, &list, &|i| FieldPath::item("calibrate", i))?;
    for (i, (_, low, high)) in chosen.iter().enumerate() {
        let one_sign = low.is_finite() && high.is_finite() && (*low > 0.0 || *high < 0.0);
        if !one_sign {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                "a calibration range needs two finite ends of one sign, neither zero (e.g. from 1e3 to 1e9 N·m/rad \
                 for a rotational spring)",
            )
            .at(FieldPath::item("calibrate", i).key("from")));
        }
    }
    if chosen.len() == 2 && chosen[0].0.path == chosen[1].0.path {
        return Err(Error::new(ErrorKind::Conflict, "the two inputs are the same")
            .at(FieldPath::item("calibrate", 1)));
    }
    let paths: Vec<FieldPath> = chosen.iter().map(|c| c.0.path.clone()).collect();
    let p0: Vec<f64> = chosen.iter().map(|c| c.0.value).collect();
    let evaluator = inputs::Evaluator::new(doc, &paths);
    let f = |p: &[f64]| evaluator.frequencies(p);
    let unknowns: Vec<Unknown> =
        chosen.iter().enumerate().map(|(i, c)| Unknown { input: i, low: c.1, high: c.2 }).collect();
    let mut report = CalibrationReport {
        inputs: chosen.iter().map(|c| echo(&c.0)).collect(),
        fitted: Vec::new(),
        fitted_hz: Vec::new(),
        residuals: Vec::new(),
        condition: None,
        alternatives: Vec::new(),
        notes: Vec::new(),
        problem: None,
    };
    match calibrate::calibrate(&f, &p0, &unknowns, measured) {
        Ok(Fit { values, residuals, condition, alternatives, notes }) => {
            let at = f(&values)?;
            report.fitted_hz = measured.iter().filter_map(|m| at.get(m.mode).copied()).collect();
            report.fitted = values;
            report.residuals = residuals;
            report.condition = condition.filter(|c| c.is_finite());
            report.alternatives = alternatives;
            report.notes = notes;
        }
        Err(e) => {
            report.problem =
                Some(super::unsolvable_in_range(e).at(FieldPath::item("calibrate", 0).key("from")))
        }
    }
    design.calibration = Some(report);
    Ok(())
}
