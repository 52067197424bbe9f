//! The evaluator: a scenario's frequencies, and its model, as functions of some of its inputs,
//! each trial's values written into one copy of the scenario.

use super::{set, typed};
use crate::error::Result;
use crate::path::FieldPath;
use crate::scenario::Scenario;
use serde_json::Value;

/// The frequencies of a scenario as functions of some of its inputs, each solve started from the
/// frequencies of the one before: the design tools try values close to each other (a central
/// difference, the next point of a sweep, a bisection), and the root finder that is handed
/// nearby frequencies isolates them in a fraction of the work. Its answers are the same roots,
/// found by the same count and polished to the same tolerance.
///
/// The scenario is made ready once: its tolerances typed with their values split off, as every
/// reading would (a scenario that cannot be is read as it is, to draw the same error each time).
/// It is then read once into the typed scenario, and every trial writes all the inputs into that
/// one typed copy (`inputs/typed.rs`) and makes its model: writing an input overwrites what the trial
/// before wrote there, and turns a preset material or a named end into its values the first
/// time, as it would in a fresh copy, so each reading is the scenario's own with the trial's
/// values, without the JSON written and read again each time. Where a path is one the typed
/// writer does not know, and for a trial with a value that is not a number (NaN, which the
/// JSON writes as null), the trial is written into one JSON copy and read as before.
pub struct Evaluator<'a> {
    trial: std::cell::RefCell<Value>,
    /// Whether `trial` is ready, so that the reader need not look for tolerances again.
    ready: bool,
    /// The typed copy the trials are written into, when every path can be.
    typed: Option<std::cell::RefCell<typed::Typed<'a>>>,
    paths: &'a [FieldPath],
    hints: std::cell::RefCell<Vec<f64>>,
}

impl<'a> Evaluator<'a> {
    /// The evaluator of the inputs at `paths` of `doc`.
    pub fn new(doc: &'a Value, paths: &'a [FieldPath]) -> Evaluator<'a> {
        let (trial, ready) = match crate::scenario::tolerant::normalise(doc) {
            Ok(ready) => (ready.into_owned(), true),
            Err(_) => (doc.clone(), false),
        };
        let typed = if ready { typed::prepare(&trial, paths) } else { None };
        Evaluator {
            trial: std::cell::RefCell::new(trial),
            ready,
            typed: typed.map(std::cell::RefCell::new),
            paths,
            hints: std::cell::RefCell::new(Vec::new()),
        }
    }

    /// Whether the trials are written into the typed scenario (not the JSON).
    #[cfg(test)]
    pub(crate) fn is_typed(&self) -> bool {
        self.typed.is_some()
    }

    /// The elastic frequencies (Hz) with the inputs set to `values`.
    pub fn frequencies(&self, values: &[f64]) -> Result<Vec<f64>> {
        let inputs = self.reading(values, true)?;
        self.solve(&inputs.model, inputs.options.modes)
    }

    /// The scenario read and checked with the inputs set to `values`, not solved.
    pub fn read(&self, values: &[f64]) -> Result<crate::scenario::Inputs> {
        self.reading(values, false)
    }

    /// The model with the inputs set to `values`, not solved: [`Evaluator::read`]'s model (and
    /// error), read without the echo that the design tools do not use.
    pub fn model(&self, values: &[f64]) -> Result<crate::model::Model> {
        self.reading(values, true).map(|i| i.model)
    }

    fn reading(&self, values: &[f64], lean: bool) -> Result<crate::scenario::Inputs> {
        let to_model = |s: &Scenario| if lean { s.to_model_lean() } else { s.to_model() };
        let whole = values.len() >= self.paths.len() && !values.iter().any(|v| v.is_nan());
        if let Some(typed) = self.typed.as_ref().filter(|_| whole) {
            let mut typed = typed.borrow_mut();
            if typed.write(values).is_some() {
                return to_model(&typed.scenario);
            }
        }
        let mut trial = self.trial.borrow_mut();
        for (path, v) in self.paths.iter().zip(values) {
            set(&mut trial, path, *v)?;
        }
        let scenario =
            if self.ready { Scenario::from_ready_value(&trial)? } else { Scenario::from_value(&trial)? };
        to_model(&scenario)
    }

    /// The first `modes` elastic frequencies (Hz) of a model read by [`Evaluator::model`],
    /// started from the frequencies of the last solve.
    pub fn solve(&self, model: &crate::model::Model, modes: usize) -> Result<Vec<f64>> {
        let hints = self.hints.borrow().clone();
        let omegas = crate::exact::frequencies_with_hints(model, modes, &hints)?;
        self.hints.replace(omegas.clone());
        Ok(omegas.into_iter().map(|w| w / std::f64::consts::TAU).collect())
    }

    /// Hands the next solve these frequencies (Hz) to start from: the solved scenario's.
    pub fn with_hints(self, hz: &[f64]) -> Evaluator<'a> {
        self.hints.replace(hz.iter().map(|f| f * std::f64::consts::TAU).collect());
        self
    }
}
