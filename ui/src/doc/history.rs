//! The undo history of one case: every destructive or wholesale step (a row removed, the example
//! restored, a fit or a proposed size applied, a case deleted) records what it replaced, so that
//! one "Undo" puts it back.
//!
//! Typing is not recorded keystroke by keystroke: the field keeps its own text, and the browser's
//! own undo works inside it. What the history holds is the scenario as it was before each step,
//! with words for the button ("Undo: remove attachment 2"), and it is bounded so that a long
//! session cannot fill memory.

use serde_json::Value;

/// How many steps are kept; the oldest is forgotten first.
pub const DEPTH: usize = 50;

/// One step that can be undone: the scenario before it and what the step was.
#[derive(Clone, Debug, PartialEq)]
pub struct Step {
    /// The scenario as it was before the step, exactly as typed.
    pub before: Value,
    /// What the step did, in words for the undo control ("remove attachment 2").
    pub what: String,
}

/// The steps of one case, newest last.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct History {
    steps: Vec<Step>,
}

impl History {
    /// Records that `what` is about to replace `before`.
    pub fn record(&mut self, before: &Value, what: impl Into<String>) {
        if self.steps.len() == DEPTH {
            self.steps.remove(0);
        }
        self.steps.push(Step { before: before.clone(), what: what.into() });
    }

    /// The newest step, if any: what an undo control would offer.
    pub fn last(&self) -> Option<&Step> {
        self.steps.last()
    }

    /// Takes the newest step back: returns the scenario to put in place of the current one.
    pub fn undo(&mut self) -> Option<Step> {
        self.steps.pop()
    }

    /// How many steps can be undone.
    pub fn len(&self) -> usize {
        self.steps.len()
    }

    /// Whether nothing can be undone.
    pub fn is_empty(&self) -> bool {
        self.steps.is_empty()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::json;

    #[test]
    fn undo_returns_the_steps_newest_first() {
        let mut h = History::default();
        h.record(&json!({ "a": 1 }), "first");
        h.record(&json!({ "a": 2 }), "second");
        assert_eq!(h.last().map(|s| s.what.as_str()), Some("second"));
        assert_eq!(h.undo().map(|s| s.before), Some(json!({ "a": 2 })));
        assert_eq!(h.undo().map(|s| s.before), Some(json!({ "a": 1 })));
        assert!(h.undo().is_none());
        assert!(h.is_empty());
    }

    #[test]
    fn the_oldest_step_is_forgotten_past_the_depth() {
        let mut h = History::default();
        for i in 0..DEPTH + 3 {
            h.record(&json!(i), format!("step {i}"));
        }
        assert_eq!(h.len(), DEPTH);
        let mut oldest = None;
        while let Some(step) = h.undo() {
            oldest = Some(step.before);
        }
        assert_eq!(oldest, Some(json!(3)));
    }
}
