//! What the reader does to a calculator: typing, choosing, ticking, adding and removing rows,
//! choosing a mode, restoring the page's example and opening set-aside edits again. Each edit
//! is handed to the worker and stored at once; nothing here solves.

use super::Calculator;
use crate::doc::{self, text, Edit, List};
use crate::render::View;
use crate::widget::{dom, storage};
use crate::worker::latest::Purpose;
use modebench_ui::cases;
use wasm_bindgen::JsCast;
use web_sys::{Element, Event, HtmlInputElement, HtmlSelectElement};

impl Calculator {
    pub(in crate::widget) fn handle(&mut self, event: &Event) {
        let Some(target) = event.target().and_then(|t| t.dyn_into::<Element>().ok()) else { return };
        match event.type_().as_str() {
            "input" => self.on_input(&target),
            "change" => self.on_change(&target),
            "click" => self.on_click(&target),
            super::MEASURED_EVENT => self.on_measured(event),
            super::ATTACH_EVENT => self.on_attach(event),
            _ => {}
        }
    }

    /// Applies an edit, stores it and hands it to the worker. A structural edit redraws the
    /// editor at once; the results follow with the answer.
    fn edit(&mut self, edit: Edit, focus: Option<(&'static str, String)>) {
        self.edited = true;
        self.keep_saved_case();
        let undoable = cases::undo_words(&edit);
        if let Some(what) = &undoable {
            self.cases.record(what);
        }
        // Edits build on the report on show: a new row takes sensible values from it (a value
        // typed takes nothing from it, so the answer kept unread stays so).
        if !matches!(edit, Edit::Text { .. }) {
            self.read_last();
        }
        doc::apply(&mut self.doc, &edit, self.last.as_ref());
        // The worker starts on the edit first, drawing its results for the view on show; the
        // case is stored (all of it, up to tens of milliseconds with hundreds of rows) and the
        // editor redrawn while it solves, in this same task, so that nothing typed waits for a
        // later one to be kept.
        self.keep_open_sections();
        self.solver.submit(Purpose::Edit, text::write(&self.doc), &self.view);
        self.opened = false;
        self.store();
        if edit.is_structural() {
            self.draw_editor(false);
            self.refocus(focus);
        }
        if undoable.is_some() {
            self.note.clear();
            self.show_cases();
        }
        if matches!(&edit, Edit::Text { path, .. } if path == "title") {
            self.show_case_names();
        }
        self.show_solving();
    }

    /// Before the page's example is edited while the reader's stored case has not been shown
    /// yet (it is still being solved, or was too slow), the case is set aside: storing the
    /// edited example must not overwrite it. The calculator offers it back.
    fn keep_saved_case(&mut self) {
        if let Some((doc, mode)) = self.saved.take() {
            storage::set_aside(&self.key, &doc, mode);
            self.show_offer();
        }
    }

    fn on_input(&mut self, target: &Element) {
        let Some(input) = target.dyn_ref::<HtmlInputElement>() else { return };
        if input.type_() != "text" {
            return;
        }
        if let Some(key) = input.get_attribute("data-record") {
            self.cases.set_record(&key, &input.value());
            self.store();
            self.show_sheet();
        } else if let Some(path) = input.get_attribute("data-field") {
            // A number typed alone takes the unit the field shows beside it.
            let unit = input.get_attribute("data-unit").unwrap_or_default();
            self.edit(doc::typed(path, &input.value(), &unit), None);
        }
    }

    fn on_change(&mut self, target: &Element) {
        if let Some(select) = target.dyn_ref::<HtmlSelectElement>() {
            let value = select.value();
            if let Some(path) = select.get_attribute("data-field") {
                let focus = Some(("data-field", path.clone()));
                self.edit(Edit::Choose { path, value }, focus);
            } else if select.get_attribute("data-control").as_deref() == Some("case") {
                if let Ok(id) = value.parse() {
                    self.open_case(id);
                }
            } else if select.get_attribute("data-control").as_deref() == Some("segment-by") {
                if let Some(index) = dom::number(select, "data-index") {
                    self.edit(Edit::SegmentBy { index, by: value }, None);
                }
            }
        } else if let Some(input) = target.dyn_ref::<HtmlInputElement>() {
            if input.type_() == "checkbox" {
                if let Some(path) = input.get_attribute("data-field") {
                    let focus = Some(("data-field", path.clone()));
                    self.edit(Edit::Tick { path, on: input.checked() }, focus);
                }
            }
        }
    }

    fn on_click(&mut self, target: &Element) {
        if let Some(button) = target.closest("[data-show-mode]").ok().flatten() {
            if let Some(mode) = dom::number(&button, "data-show-mode") {
                self.show_mode(mode);
            }
            return;
        }
        let Some(button) = target.closest("[data-action]").ok().flatten() else { return };
        let list = button.get_attribute("data-list").as_deref().and_then(List::from_key);
        match (button.get_attribute("data-action").as_deref(), list) {
            (Some("add"), Some(list)) => {
                self.edit(Edit::Add(list), None);
                self.focus_after_add(list);
            }
            (Some("remove"), Some(list)) => {
                if let Some(index) = dom::number(&button, "data-index") {
                    self.edit(Edit::Remove(list, index), None);
                    self.focus_after_remove(list, index);
                }
            }
            (Some("apply-fit"), _) => self.apply_design(true),
            (Some("apply-resize"), _) => self.apply_design(false),
            (Some("restore"), _) => self.restore(),
            (Some("reopen"), _) => self.reopen(),
            (Some(action), _) => {
                self.case_action(action);
                self.show_undo();
            }
            _ => {}
        }
    }

    /// Draws the chosen mode from the report on show. Before the first report has come, the
    /// choice waits for it (see `confirmed`).
    fn show_mode(&mut self, mode: usize) {
        self.view.mode = mode;
        // While the stored case waits to be shown, the example on show is not stored over it.
        if self.saved.is_none() {
            self.store();
        }
        if self.has_report() || self.error.is_some() {
            self.draw_results();
            self.refocus(Some(("data-show-mode", mode.to_string())));
        }
    }

    /// Writes what the design study proposed (the calibration's fitted values, or the resizing's
    /// nearest feasible value) into the case as one step that "Undo" takes back.
    fn apply_design(&mut self, fit: bool) {
        self.read_last();
        let Some(report) = self.last.as_ref() else { return };
        let proposal = if fit {
            doc::design::fit_changes(&self.doc, report)
        } else {
            doc::design::resize_changes(&self.doc, report)
        };
        let Some((changes, what)) = proposal else { return };
        // One step in the case's own history, so that the case bar's "Undo" takes it back too.
        self.store_unless_waiting();
        self.cases.record(&what);
        self.edit(Edit::Apply(changes), None);
        // The case bar's own "Undo" takes the step back too; redraw it so that it says so.
        self.show_cases();
        self.show_undo();
        self.refocus(Some(("data-action", "undo".to_string())));
    }

    /// Keeps a tap test's measured frequencies in the case: the panel sends them in a
    /// `modebench-measured` event whose detail is the JSON text of the `measured` list's rows
    /// (none to clear it). They replace the list as one step that "Undo" takes back, and are
    /// solved, stored and printed like any measured frequency typed in the editor.
    fn on_measured(&mut self, event: &Event) {
        let Some(text) = event.dyn_ref::<web_sys::CustomEvent>().and_then(|e| e.detail().as_string()) else {
            return;
        };
        // The editor's own reader: serde_json's parser would add some 40 KB to the page's engine.
        let Ok(serde_json::Value::Array(rows)) = text::read_exact(&text) else { return };
        let what = if rows.is_empty() {
            "clear the measured frequencies".to_string()
        } else {
            format!("use the tap test's frequenc{}", if rows.len() == 1 { "y" } else { "ies" })
        };
        self.store_unless_waiting();
        self.cases.record(&what);
        self.edit(Edit::Measured(rows), None);
        self.show_cases();
        self.show_undo();
    }

    /// Adds the tablet or sensor fixed to the part for a tap test to the model: the panel sends
    /// a `modebench-attach` event whose detail is the JSON text of an attachment row, its values
    /// as the reader typed them (with their units). One step that "Undo" takes back; a value the
    /// core refuses shows as an error on its field, as if typed there.
    fn on_attach(&mut self, event: &Event) {
        let Some(text) = event.dyn_ref::<web_sys::CustomEvent>().and_then(|e| e.detail().as_string()) else {
            return;
        };
        let Ok(row @ serde_json::Value::Object(_)) = text::read_exact(&text) else { return };
        self.store_unless_waiting();
        self.cases.record("add the tap test's sensor to the model");
        self.edit(Edit::Attach(row), None);
        self.show_cases();
        self.show_undo();
    }

    /// Shows the page's example again in place of the open case; one undo puts the case back.
    fn restore(&mut self) {
        self.edited = true;
        self.keep_saved_case();
        self.cases.restore_example(&self.example);
        self.note = "The page's example is back in this case; “Undo” puts your values back.".into();
        self.error = None;
        self.view = View::default();
        self.load_example();
        self.store();
        self.draw_all();
        self.refocus(Some(("data-action", "restore".to_string())));
        self.start_over();
    }

    /// Opens the set-aside case again: it becomes the stored case and is solved like an edit
    /// (and, should it still be too slow, the calculator says so beside its fields).
    fn reopen(&mut self) {
        let Some((doc, mode)) = storage::load_set_aside(&self.key) else {
            self.show_offer();
            return;
        };
        self.edited = true;
        self.saved = None;
        storage::clear_set_aside(&self.key);
        self.doc = doc;
        self.view.mode = mode;
        self.store();
        self.error = None;
        self.draw_all();
        self.refocus(Some(("data-action", "restore".to_string())));
        self.start_over();
    }

    /// Hands a scenario that replaced the one on show to the worker; the results on show are
    /// greyed until its answer comes, as they belong to the other one.
    pub(super) fn start_over(&mut self) {
        self.opened = false;
        if self.error.is_none() {
            self.mark_waiting();
            self.solver.submit(Purpose::Edit, text::write(&self.doc), &self.view);
            self.show_solving();
        }
    }
}
