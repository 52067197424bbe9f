//! The design study of a scenario: what moves each mode (sensitivities to every numeric input),
//! the tolerance band of each mode, the measured frequencies beside the computed ones, the
//! calibration asked for, the resizing asked for, and the drives with the bands they forbid.
//!
//! The requests are checked here, where the scenario's values and the field each path names are
//! known: a path that names no numeric input, a range that crosses zero or runs backwards, a
//! measured mode that was not computed is an error naming its field, like any bad input. A
//! request that is well put but has no answer (no value in range reaches the measurement, no
//! value clears every margin) is an answer: the report says so and why. The measured frequencies
//! and the calibration to them are read and run in `study/measurement.rs`.

mod measurement;

use super::inputs::{self, Input};
use super::margin::Drive;
use super::requests::{end_range, range_of, ranged, ratio, relocate};
use super::resize;
use super::sensitivity::{through_shapes, SolvedMode};
use super::tolerance::{bands, bands_from, Band, Spread};
use crate::analysis::margins::Order;
use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::scenario::Scenario;
use measurement::{calibration, measured};
use serde_json::Value;

pub use super::types::*;

/// A search's failure, said as one: a model refused at a value tried (a field's error, with its
/// path) means the range takes the model somewhere it cannot be solved, which the field's own
/// words alone ("the position must lie on the beam") do not tell a reader who only set a range.
fn unsolvable_in_range(e: Error) -> Error {
    if e.path.is_empty() {
        return e;
    }
    let message = format!(
        "at some values in this range the model cannot be solved ({}: {}); narrow the range or choose \
         another input",
        crate::schema::words(&e.path),
        e.message
    );
    Error { message, ..e }
}

fn echo(input: &Input) -> InputEcho {
    InputEcho {
        path: input.path.to_string(),
        label: input.field.label.to_string(),
        kind: input.field.kind,
        value: input.value.is_finite().then_some(input.value),
    }
}

/// The most inputs × modes whose sensitivities are found on every solve: the budgeted case (20
/// inputs, 10 modes) with room to spare; a model of hundreds of attachments would otherwise make
/// every edit wait for thousands of solves.
const MOST_SENSITIVITIES: usize = 400;

/// What the study needs of the solved scenario.
pub struct Solved<'a> {
    /// The elastic frequencies, Hz.
    pub elastic_hz: &'a [f64],
    /// Rigid-body modes listed before them.
    pub rigid: usize,
    /// Every order of every excitation.
    pub orders: &'a [Order],
    /// The margin wanted.
    pub margin: f64,
    /// The model solved.
    pub model: &'a crate::model::Model,
    /// Its elastic modes, with their shapes.
    pub modes: &'a [SolvedMode<'a>],
}

/// Runs the design study of a scenario.
pub fn study(scenario: &Scenario, doc: &Value, solved: &Solved<'_>) -> Result<Design> {
    let doc = doc.clone();
    let drives = solved
        .orders
        .iter()
        .map(|o| {
            let (low_hz, high_hz) = o.drive.range();
            let (forbidden_low_hz, forbidden_high_hz) = o.drive.forbidden(solved.margin);
            DriveEcho {
                excitation: o.excitation,
                order: o.order,
                low_hz,
                high_hz,
                forbidden_low_hz,
                forbidden_high_hz,
            }
        })
        .collect();
    let mut design = Design { drives, ..Design::default() };
    // What moves each mode.
    let all = inputs::all(&doc);
    let paths: Vec<FieldPath> = all.iter().map(|i| i.path.clone()).collect();
    let values: Vec<f64> = all.iter().map(|i| i.value).collect();
    let evaluator = inputs::Evaluator::new(&doc, &paths).with_hints(solved.elastic_hz);
    let model_at = |p: &[f64]| evaluator.model(p);
    let solve = |m: &crate::model::Model| evaluator.solve(m, solved.modes.len());
    let work = all.len() * solved.elastic_hz.len();
    if work > MOST_SENSITIVITIES {
        design.notes.push(format!(
            "What moves each mode is left out: {} inputs and {} modes would take {} extra solves on every edit. \
             Fewer modes, or fewer attachments (lump the small ones), bring it back.",
            all.len(),
            solved.elastic_hz.len(),
            2 * all.len()
        ));
    } else if let Ok(s) = through_shapes(solved.model, solved.modes, &model_at, &solve, &values) {
        design.inputs = all.iter().map(echo).collect();
        design.sensitivities = s
            .into_iter()
            .enumerate()
            .map(|(k, per_input)| ModeSensitivity { mode: solved.rigid + k + 1, per_input })
            .collect();
    }
    let tolerated = tolerances(scenario, &doc, solved, &mut design)?;
    let measured = measured(scenario, solved, &mut design)?;
    calibration(scenario, &doc, &measured, &mut design)?;
    resizing(scenario, &doc, solved, &tolerated, &mut design)?;
    Ok(design)
}

/// The inputs that carry tolerances, with their spreads.
type Tolerated = Vec<(Input, Spread)>;

// This step and the other requests' (`resizing`, `measured`, `calibration`) are kept out of the
// study's own function: each runs only when the scenario asks for it, and a browser compiles a
// hot WebAssembly function whole, optimised. Inlined, they made the study one function of 28 KB
// in the solver's engine, whose optimised compiling took 50 ms during a reader's edits.
#[inline(never)]
fn tolerances(
    scenario: &Scenario,
    doc: &Value,
    solved: &Solved<'_>,
    design: &mut Design,
) -> Result<Tolerated> {
    if scenario.tolerances.is_empty() {
        return Ok(Vec::new());
    }
    let mut chosen: Vec<Input> = Vec::new();
    let mut spreads = Vec::new();
    for (i, t) in scenario.tolerances.iter().enumerate() {
        let at = FieldPath::item("tolerances", i);
        let (input, spread) = match end_range(doc, t, &at)? {
            Some(input) => (input, Spread::Between { low: 0.0, high: f64::INFINITY }),
            None => {
                let input = inputs::input_at(doc, &t.field).map_err(|e| relocate(e, &at.key("field")))?;
                let spread = match (&t.plus_minus, &t.from, &t.to) {
                    (Some(pm), _, _) => {
                        let fraction = ratio(pm, &at.key("plus_minus"))?;
                        if !(input.value.is_finite() && input.value != 0.0) {
                            return Err(Error::new(
                                ErrorKind::Conflict,
                                "a ± tolerance needs a finite value other than zero; give a range from … to …",
                            )
                            .at(at.key("plus_minus")));
                        }
                        Spread::Relative { fraction }
                    }
                    (None, Some(from), Some(to)) => {
                        let (low, high) = range_of(&input, from, to, &at)?;
                        Spread::Between { low, high }
                    }
                    _ => {
                        return Err(Error::new(
                            ErrorKind::Missing,
                            "a tolerance needs plus_minus or from and to",
                        )
                        .at(at.key("plus_minus")))
                    }
                };
                (input, spread)
            }
        };
        if chosen.iter().any(|c| c.path == input.path) {
            return Err(
                Error::new(ErrorKind::Conflict, "this input already has a tolerance").at(at.key("field"))
            );
        }
        let (low, high, plus_minus) = match spread {
            Spread::Relative { fraction } => {
                let (a, b) = (input.value * (1.0 - fraction), input.value * (1.0 + fraction));
                (a.min(b), a.max(b), Some(fraction))
            }
            Spread::Between { low, high } => (low, high, None),
        };
        design.tolerances.push(ToleranceEcho {
            input: echo(&input),
            plus_minus,
            low: low.is_finite().then_some(low),
            high: high.is_finite().then_some(high),
        });
        chosen.push(input);
        spreads.push(Some(spread));
    }
    let paths: Vec<FieldPath> = chosen.iter().map(|i| i.path.clone()).collect();
    let values: Vec<f64> = chosen.iter().map(|i| i.value).collect();
    let evaluator = inputs::Evaluator::new(doc, &paths).with_hints(solved.elastic_hz);
    let f = |p: &[f64]| evaluator.frequencies(p);
    // The sensitivities found for every input serve the band when they cover these inputs.
    let columns: Option<Vec<usize>> =
        paths.iter().map(|p| design.inputs.iter().position(|i| i.path == p.to_string())).collect();
    let b = match columns {
        Some(columns) if design.sensitivities.len() == solved.elastic_hz.len() => {
            let s: Vec<Vec<Option<f64>>> = design
                .sensitivities
                .iter()
                .map(|row| columns.iter().map(|&j| row.per_input[j]).collect())
                .collect();
            bands_from(&f, &values, &spreads, solved.elastic_hz, &s)?
        }
        _ => bands(&f, &values, &spreads)?,
    };
    design.bands = b
        .iter()
        .enumerate()
        .map(|(k, b)| ModeBand { mode: solved.rigid + k + 1, low_hz: b.low, high_hz: b.high })
        .collect();
    Ok(chosen.into_iter().zip(spreads.into_iter().flatten()).collect())
}

// Out of the study's own function: see `tolerances`.
#[inline(never)]
fn resizing(
    scenario: &Scenario,
    doc: &Value,
    solved: &Solved<'_>,
    tolerated: &Tolerated,
    design: &mut Design,
) -> Result<()> {
    let Some(r) = &scenario.resize else { return Ok(()) };
    crate::model::whole(&crate::schema::RESIZE_FIELDS[3], r.points).map_err(|e| e.at("resize"))?;
    let chosen = ranged(doc, &[&r.range], &|_| FieldPath::root().key("resize"))?;
    let (input, low, high) =
        chosen.into_iter().next().ok_or_else(|| Error::new(ErrorKind::Missing, "nothing to resize"))?;
    if !(low.is_finite() && high.is_finite()) {
        return Err(Error::new(ErrorKind::OutOfRange, "a resizing range needs two finite ends")
            .at(FieldPath::root().key("resize").key("to")));
    }
    let drives: Vec<Drive> = solved.orders.iter().map(|o| o.drive).collect();
    // The input resized first, then every other input with a tolerance: each value tried is
    // judged on the bands the tolerances give there. The resized input's own tolerance follows
    // it when it is ± a fraction; a range of its own has no meaning while it moves.
    let mut paths = vec![input.path.clone()];
    let mut values = vec![input.value];
    let mut spreads: Vec<Option<Spread>> = vec![None];
    for (other, spread) in tolerated {
        if other.path == input.path {
            if let Spread::Relative { .. } = spread {
                spreads[0] = Some(*spread);
            } else {
                design.notes.push(format!(
                    "The range given as the tolerance of {} is left out while resizing it.",
                    input.field.label
                ));
            }
            continue;
        }
        paths.push(other.path.clone());
        values.push(other.value);
        spreads.push(Some(*spread));
    }
    let evaluator = inputs::Evaluator::new(doc, &paths).with_hints(solved.elastic_hz);
    let f = |p: &[f64]| evaluator.frequencies(p);
    let within = |p: &[f64]| bands(&f, p, &spreads);
    let today: Vec<Band> = match design.bands.len() {
        0 => solved.elastic_hz.iter().map(|&f| Band { nominal: f, low: f, high: f }).collect(),
        _ => design
            .bands
            .iter()
            .zip(solved.elastic_hz)
            .map(|(b, &f)| Band { nominal: f, low: b.low_hz, high: b.high_hz })
            .collect(),
    };
    let clear_today = resize::clear(&today, &drives, solved.margin);
    let mut report = ResizeReport {
        input: echo(&input),
        low,
        high,
        intervals: Vec::new(),
        nearest: None,
        clear_today,
        x: Vec::new(),
        hz: Vec::new(),
        problem: None,
    };
    if drives.is_empty() {
        report.problem = Some(
            Error::new(
                ErrorKind::Missing,
                "there are no excitations to keep clear of; add the speeds that drive the beam",
            )
            .at("excitations"),
        );
    } else {
        let found = if tolerated.is_empty() {
            resize::resize(&f, &values, 0, (low, high), &drives, solved.margin, r.points)
        } else {
            resize::resize_within(&within, &values, 0, (low, high), &drives, solved.margin, r.points)
        };
        match found {
            Ok(found) => {
                if found.intervals.is_empty() {
                    report.problem = Some(Error::new(
                        ErrorKind::Model,
                        format!(
                            "no value in this range clears every mode{} from every excitation by the margin; widen \
                             the range, resize another input, or change the margin after checking what your code asks",
                            if tolerated.is_empty() { "" } else { "'s tolerance band" }
                        ),
                    ));
                }
                report.intervals = found.intervals;
                report.nearest = found.nearest;
                let (x, hz) = found.sweep.into_iter().unzip();
                report.x = x;
                report.hz = hz;
            }
            Err(e) => report.problem = Some(unsolvable_in_range(e)),
        }
    }
    design.resize = Some(report);
    Ok(())
}
