//! The reader's own cases on one calculator: several scenarios kept in the browser, each named by
//! its title, one of them open, with an undo for every step that destroys something (a case
//! deleted, the page's example restored over a case, a row removed, a part cleared).
//!
//! Everything here is plain Rust over JSON values, tested natively; the widget only stores
//! [`Cases::to_stored`] in `localStorage` after every change and draws [`bar`]. The stored form
//! is versioned: version 1 (one scenario and the mode shown, as the calculator kept before it had
//! cases) is read as one case.

pub mod bar;
pub mod export;
pub mod sheet;

#[cfg(test)]
mod tests;

use crate::doc::history::History;
use crate::doc::{Edit, List};
use serde_json::{Map, Value};

/// What a case is called when its title is empty.
pub const UNTITLED: &str = "Untitled case";

/// The words of the calculation record a case carries for its printed sheet, by key.
pub const RECORD: [(&str, &str); 3] =
    [("preparer", "Prepared by"), ("checker", "Checked by"), ("revision", "Revision")];

/// One case: its scenario exactly as typed, the mode on show and its calculation record.
#[derive(Clone, Debug, PartialEq)]
pub struct Case {
    /// Stable within one browser's shelf; never reused.
    pub id: u64,
    /// The scenario as typed (its `title` is the case's name).
    pub scenario: Value,
    /// The mode on show, from 0.
    pub mode: usize,
    /// Who prepared and checked the case and its revision, as typed (keys of [`RECORD`]).
    pub record: Map<String, Value>,
}

impl Case {
    /// The case's name: its scenario's title, or [`UNTITLED`].
    pub fn name(&self) -> String {
        title_of(&self.scenario)
    }

    fn to_value(&self) -> Value {
        let mut m = Map::new();
        m.insert("id".into(), Value::from(self.id));
        m.insert("scenario".into(), self.scenario.clone());
        m.insert("mode".into(), Value::from(self.mode as u64));
        m.insert("record".into(), Value::Object(self.record.clone()));
        Value::Object(m)
    }

    fn from_value(v: &Value) -> Option<Case> {
        let scenario = v.get("scenario").filter(|s| s.is_object())?.clone();
        Some(Case {
            id: v.get("id").and_then(Value::as_u64)?,
            scenario,
            mode: v.get("mode").and_then(Value::as_u64).unwrap_or(0) as usize,
            record: v.get("record").and_then(Value::as_object).cloned().unwrap_or_default(),
        })
    }
}

/// A scenario's title, trimmed, or [`UNTITLED`].
pub fn title_of(scenario: &Value) -> String {
    let title = scenario.get("title").and_then(Value::as_str).map(str::trim).unwrap_or("");
    if title.is_empty() {
        UNTITLED.to_string()
    } else {
        title.to_string()
    }
}

/// A blank scenario in the example's unit system: one segment whose fields wait to be typed.
pub fn blank(example: &Value) -> Value {
    let mut m = Map::new();
    m.insert("title".into(), Value::String("New case".into()));
    if let Some(units) = example.get("units") {
        m.insert("units".into(), units.clone());
    }
    m.insert("left".into(), Value::String("pinned".into()));
    m.insert("right".into(), Value::String("pinned".into()));
    let mut segment = Map::new();
    for key in ["length", "flexural_rigidity", "mass_per_length"] {
        segment.insert(key.into(), Value::String(String::new()));
    }
    m.insert("segments".into(), Value::Array(vec![Value::Object(segment)]));
    Value::Object(m)
}

/// Every case on one calculator, which one is open, and the undo history of their steps.
#[derive(Clone, Debug)]
pub struct Cases {
    list: Vec<Case>,
    open: u64,
    next: u64,
    history: History,
}

impl Cases {
    /// The cases as stored (any version, or nothing stored: one case, a copy of the example).
    pub fn load(stored: Option<&Value>, example: &Value) -> Cases {
        let mut cases = Cases { list: Vec::new(), open: 0, next: 1, history: History::default() };
        match stored.and_then(|s| s.get("version")).and_then(Value::as_u64) {
            Some(2) => {
                let stored = stored.unwrap_or(&Value::Null);
                let list = stored.get("cases").and_then(Value::as_array);
                cases.list =
                    list.map(|l| l.iter().filter_map(Case::from_value).collect()).unwrap_or_default();
                let highest = cases.list.iter().map(|c| c.id).max().unwrap_or(0);
                cases.next = stored.get("next").and_then(Value::as_u64).unwrap_or(0).max(highest + 1);
                cases.open = stored.get("open").and_then(Value::as_u64).unwrap_or(0);
            }
            Some(1) => {
                let stored = stored.unwrap_or(&Value::Null);
                if let Some(scenario) = stored.get("scenario").filter(|s| s.is_object()) {
                    let mode = stored.get("mode").and_then(Value::as_u64).unwrap_or(0) as usize;
                    cases.add(scenario.clone(), mode);
                }
            }
            _ => {}
        }
        if cases.list.is_empty() {
            cases.add(example.clone(), 0);
        }
        if cases.find(cases.open).is_none() {
            cases.open = cases.list[0].id;
        }
        cases
    }

    /// The form kept in storage (version 2).
    pub fn to_stored(&self) -> Value {
        let mut m = Map::new();
        m.insert("version".into(), Value::from(2u64));
        m.insert("open".into(), Value::from(self.open));
        m.insert("next".into(), Value::from(self.next));
        m.insert("cases".into(), Value::Array(self.list.iter().map(Case::to_value).collect()));
        Value::Object(m)
    }

    /// Every case, in the order made.
    pub fn list(&self) -> &[Case] {
        &self.list
    }

    /// The open case.
    pub fn open_case(&self) -> &Case {
        let i = self.find(self.open).unwrap_or(0);
        &self.list[i]
    }

    fn open_mut(&mut self) -> &mut Case {
        let i = self.find(self.open).unwrap_or(0);
        &mut self.list[i]
    }

    fn find(&self, id: u64) -> Option<usize> {
        self.list.iter().position(|c| c.id == id)
    }

    fn add(&mut self, scenario: Value, mode: usize) -> u64 {
        let id = self.next;
        self.next += 1;
        self.list.push(Case { id, scenario, mode, record: Map::new() });
        self.open = id;
        id
    }

    /// Keeps the scenario being edited and the mode on show in the open case.
    pub fn keep(&mut self, scenario: &Value, mode: usize) {
        let case = self.open_mut();
        case.scenario = scenario.clone();
        case.mode = mode;
    }

    /// Sets one line of the open case's calculation record (a key of [`RECORD`]).
    pub fn set_record(&mut self, key: &str, text: &str) {
        if RECORD.iter().any(|(k, _)| *k == key) {
            self.open_mut().record.insert(key.into(), Value::String(text.to_string()));
        }
    }

    /// Opens another case; `false` if there is no such case.
    pub fn open(&mut self, id: u64) -> bool {
        let found = self.find(id).is_some();
        if found {
            self.open = id;
        }
        found
    }

    /// Starts a blank case in the example's units, and opens it.
    pub fn new_blank(&mut self, example: &Value) {
        let scenario = blank(example);
        let title = title_of(&scenario);
        let scenario = self.titled_apart(scenario, title);
        self.add(scenario, 0);
    }

    /// Starts a case from a copy of the page's example, and opens it.
    pub fn new_from_example(&mut self, example: &Value) {
        let scenario = self.titled_apart(example.clone(), title_of(example));
        self.add(scenario, 0);
    }

    /// A new case's scenario under the title `wanted`, numbered when a case kept already has it
    /// ("Fan beam (2)"), so that the list of cases never shows two alike. The title is written
    /// only when it differs from the scenario's own.
    fn titled_apart(&self, mut scenario: Value, wanted: String) -> Value {
        let taken = |title: &str| self.list.iter().any(|c| title_of(&c.scenario) == title);
        let mut title = wanted.clone();
        let mut n = 1usize;
        while taken(&title) {
            n += 1;
            title = format!("{wanted} ({n})");
        }
        if title != title_of(&scenario) {
            if let Some(m) = scenario.as_object_mut() {
                m.insert("title".into(), Value::String(title));
            }
        }
        scenario
    }

    /// Copies the open case under the title "… (copy)", and opens the copy.
    pub fn duplicate(&mut self) {
        let source = self.open_case().clone();
        let title = format!("{} (copy)", title_of(&source.scenario));
        let scenario = self.titled_apart(source.scenario, title);
        let id = self.add(scenario, source.mode);
        if let Some(i) = self.find(id) {
            self.list[i].record = source.record;
        }
    }

    /// Opens a case that came from a link or a file: an identical case already kept is opened
    /// rather than copied again; otherwise it is added. Returns whether a case was added.
    pub fn import(&mut self, scenario: Value) -> bool {
        if let Some(same) = self.list.iter().find(|c| c.scenario == scenario) {
            self.open = same.id;
            return false;
        }
        self.add(scenario, 0);
        true
    }

    /// Deletes the open case (undoable) and opens its neighbour; deleting the last case leaves a
    /// fresh copy of the example.
    pub fn delete(&mut self, example: &Value) {
        let Some(i) = self.find(self.open) else { return };
        let case = self.list.remove(i);
        let mut before = Map::new();
        before.insert("deleted".into(), case.to_value());
        before.insert("at".into(), Value::from(i as u64));
        self.history.record(&Value::Object(before), format!("delete case “{}”", case.name()));
        if self.list.is_empty() {
            self.add(example.clone(), 0);
        } else {
            self.open = self.list[i.min(self.list.len() - 1)].id;
        }
    }

    /// Records that a step is about to change the open case's scenario, for one undo to put it
    /// back (`what` names the step: "remove attachment 2").
    pub fn record(&mut self, what: &str) {
        let case = self.open_case();
        let mut before = Map::new();
        before.insert("case".into(), Value::from(case.id));
        before.insert("scenario".into(), case.scenario.clone());
        before.insert("mode".into(), Value::from(case.mode as u64));
        self.history.record(&Value::Object(before), what);
    }

    /// Puts the page's example in place of the open case (undoable).
    pub fn restore_example(&mut self, example: &Value) {
        self.record("restore the page's example");
        let case = self.open_mut();
        case.scenario = example.clone();
        case.mode = 0;
    }

    /// What an undo would take back, in words.
    pub fn undo_label(&self) -> Option<&str> {
        self.history.last().map(|s| s.what.as_str())
    }

    /// Takes back the newest recorded step and opens the case it concerned. Returns whether
    /// anything was undone.
    pub fn undo(&mut self) -> bool {
        let Some(step) = self.history.undo() else { return false };
        if let Some(case) = step.before.get("deleted").and_then(Case::from_value) {
            let at = step.before.get("at").and_then(Value::as_u64).unwrap_or(0) as usize;
            let id = case.id;
            self.list.insert(at.min(self.list.len()), case);
            self.open = id;
            return true;
        }
        let id = step.before.get("case").and_then(Value::as_u64).unwrap_or(0);
        // A step on a case deleted since cannot be taken back on its own; the next one is.
        let Some(i) = self.find(id) else { return self.undo() };
        if let Some(scenario) = step.before.get("scenario").filter(|s| s.is_object()) {
            self.list[i].scenario = scenario.clone();
        }
        self.list[i].mode = step.before.get("mode").and_then(Value::as_u64).unwrap_or(0) as usize;
        self.open = id;
        true
    }
}

/// The words for undoing an edit of the editor that loses what was typed (a row removed, a part
/// cleared, a choice that drops fields), or `None` for an edit that loses nothing.
pub fn undo_words(edit: &Edit) -> Option<String> {
    let words = |key: &str| key.rsplit('.').next().unwrap_or(key).replace('_', " ");
    match edit {
        Edit::Remove(list, index) => {
            let row = match list {
                List::Segments => "segment",
                List::Attachments => "attachment",
                List::Excitations => "excitation",
                List::Tolerances => "tolerance",
                List::Measured => "measured frequency",
                List::Calibrate => "calibrated input",
            };
            Some(format!("remove {row} {}", index + 1))
        }
        Edit::Tick { path, on: false } => Some(format!("clear “{}”", words(path))),
        Edit::SegmentBy { index, .. } => Some(format!("change how segment {} is described", index + 1)),
        Edit::Choose { path, .. } => {
            let key = path.rsplit('.').next().unwrap_or(path);
            matches!(key, "type" | "shape" | "material" | "left" | "right")
                .then(|| format!("change “{}”", words(path)))
        }
        // A fit or a size applied, a tap test's frequencies kept or its sensor's mass added, is
        // recorded, with its own words, where it is applied.
        Edit::Text { .. }
        | Edit::Add(_)
        | Edit::Tick { on: true, .. }
        | Edit::Apply(_)
        | Edit::Measured(_)
        | Edit::Attach(_) => None,
    }
}
