//! One live calculator: the scenario as typed, the last good report, and what happens on each
//! edit. Typing redraws only the results, the plot and the error marks, so the input keeps its
//! focus and caret; structural edits redraw the editor too.

use super::{dom, storage};
use crate::doc::{self, Edit, List};
use crate::render::{self, Editing, View};
use modebench::{Error, Report};
use serde_json::Value;
use wasm_bindgen::JsCast;
use web_sys::{Element, Event, HtmlInputElement, HtmlSelectElement};

pub(super) struct Calculator {
    root: Element,
    /// The page's scenario text, for "Restore the page's example".
    original: String,
    key: String,
    doc: Value,
    last: Option<Report>,
    error: Option<Error>,
    view: View,
    /// The callback that solves and redraws at the next animation frame.
    frame: Option<js_sys::Function>,
    /// Typed edits that follow another within a frame wait for the next frame: however fast the
    /// reader types, the engine solves at most about once per frame and never falls behind.
    pending: bool,
    /// When the results were last brought up to date (`performance.now()`, ms).
    updated_at: f64,
    /// Whether the scenario came from the reader's stored edits rather than the page.
    restored: bool,
}

/// A display frame at 60 Hz, ms.
const FRAME_MS: f64 = 16.0;

impl Calculator {
    pub(super) fn new(root: Element, index: usize) -> Self {
        let original = root.get_attribute("data-modebench").unwrap_or_default();
        let key = storage::key(index);
        let mut c = Calculator {
            root,
            original,
            key,
            doc: Value::Null,
            last: None,
            error: None,
            view: View::default(),
            frame: None,
            pending: false,
            updated_at: f64::NEG_INFINITY,
            restored: false,
        };
        match storage::load(&c.key) {
            Some((doc, mode)) => {
                c.doc = doc;
                c.view.mode = mode;
                c.restored = true;
                // Solve the page's example first, so that a stored input that fails still has
                // results to show greyed.
                if let Ok(example) = doc::read(&c.original) {
                    c.last = doc::solve(&example).ok();
                }
            }
            None => c.load_example(),
        }
        c
    }

    /// Takes over the calculator. When the page shows exactly what the engine computes for its
    /// own scenario, only the editor is drawn (its controls replace the fixed values) and the
    /// full report waits until something needs it ([`Calculator::complete`]); otherwise the
    /// scenario is solved and the whole calculator drawn. Returns whether the report waits.
    pub(super) fn go_live(&mut self) -> bool {
        if self.shows_live_results() {
            self.draw_editor();
        } else {
            self.solve();
            self.draw_all();
        }
        self.report_waits()
    }

    /// Whether the scenario on show has not been solved yet: neither a report nor an error.
    /// Every path that shows a scenario solves it, except the page's own confirmed one.
    fn report_waits(&self) -> bool {
        self.last.is_none() && self.error.is_none()
    }

    /// Computes the full report of the scenario on show if it is still waiting: before any
    /// interaction, and once the page is idle after the calculator went live. Should the full
    /// solve fail where the frequencies alone did not, the calculator is redrawn to say so.
    pub(super) fn complete(&mut self) {
        if self.report_waits() {
            self.solve();
            if self.error.is_some() {
                self.draw_all();
            }
        }
    }

    fn load_example(&mut self) {
        match doc::read(&self.original) {
            Ok(doc) => self.doc = doc,
            Err(e) => {
                self.doc = Value::Object(serde_json::Map::new());
                self.error = Some(e);
            }
        }
    }

    fn solve(&mut self) {
        match doc::solve(&self.doc) {
            Ok(report) => {
                self.last = Some(report);
                self.error = None;
            }
            Err(e) => self.error = Some(e),
        }
    }

    /// Remembers which fold-out sections the reader opened, before they are redrawn.
    fn keep_open_sections(&mut self) {
        self.view.open = dom::all(&self.root, "details.mb-fold[open]")
            .iter()
            .filter_map(|d| d.get_attribute("data-part"))
            .collect();
    }

    /// Whether the page already shows exactly what the engine computes: the page's own scenario,
    /// and every mode's frequency in the prerendered table equal, digit for digit, to the one the
    /// engine finds now, in this browser. The frequencies come from the exact method alone, a
    /// fraction of a full solve; if a single one differs the calculator is solved and redrawn, so
    /// what the reader sees is always the engine's own result.
    fn shows_live_results(&self) -> bool {
        let (None, false) = (&self.error, self.restored) else { return false };
        let Ok(frequencies) = doc::frequencies(&self.doc) else { return false };
        let rows = dom::all(&self.root, "tr[data-mode]");
        rows.len() == frequencies.len()
            && frequencies.iter().enumerate().all(|(i, hz)| {
                let selector = format!("tr[data-mode=\"{}\"] td[data-hz]", i + 1);
                dom::first(&self.root, &selector).and_then(|td| td.get_attribute("data-hz"))
                    == Some(format!("{hz}"))
            })
    }

    /// Draws the whole calculator.
    pub(super) fn draw_all(&mut self) {
        self.keep_open_sections();
        let html = render::calculator_inner(
            &self.doc,
            self.error.as_ref(),
            self.last.as_ref(),
            &self.view,
            Editing::Live,
        );
        self.root.set_inner_html(&html);
    }

    /// Draws the editor's controls in place of the fixed values the page was built with,
    /// leaving the results as they are.
    pub(super) fn draw_editor(&mut self) {
        if let Some(editor) = dom::first(&self.root, ".mb-editor") {
            editor.set_inner_html(&render::editor_html(&self.doc, self.error.as_ref(), Editing::Live));
        }
    }

    /// Draws the results and moves the error mark, leaving the editor's inputs in place.
    fn draw_results(&mut self) {
        self.keep_open_sections();
        if let Some(results) = dom::first(&self.root, ".mb-results") {
            let class = if self.error.is_some() { "mb-results mb-stale" } else { "mb-results" };
            results.set_class_name(class);
            results.set_inner_html(&render::results_inner(
                self.last.as_ref(),
                self.error.is_some(),
                &self.view,
            ));
        }
        self.mark_error();
    }

    fn mark_error(&self) {
        for old in dom::all(&self.root, ".mb-editor .mb-field-error") {
            old.remove();
        }
        for field in dom::all(&self.root, ".mb-editor .mb-invalid") {
            let _ = field.class_list().remove_1("mb-invalid");
        }
        for input in dom::all(&self.root, ".mb-editor [aria-invalid]") {
            let _ = input.remove_attribute("aria-invalid");
        }
        let general = dom::first(&self.root, ".mb-general-errors");
        let Some(error) = &self.error else { return };
        let inputs = dom::all(&self.root, ".mb-editor [data-field]");
        let paths: Vec<String> =
            inputs.iter().map(|i| i.get_attribute("data-field").unwrap_or_default()).collect();
        let refs: Vec<&str> = paths.iter().map(String::as_str).collect();
        let place = render::placement(&error.path, &refs).and_then(|p| paths.iter().position(|q| q == p));
        match place.and_then(|i| inputs.get(i)) {
            Some(input) => {
                let _ = input.set_attribute("aria-invalid", "true");
                if let Some(field) = input.closest(".mb-field").ok().flatten() {
                    let _ = field.class_list().add_1("mb-invalid");
                    let _ = field.insert_adjacent_html("beforeend", &render::field_error_html(error, false));
                }
            }
            None => {
                if let Some(g) = general {
                    g.set_inner_html(&render::field_error_html(error, true));
                }
            }
        }
    }

    /// Gives the calculator the callback that runs [`Calculator::flush`] at the next frame.
    pub(super) fn set_frame(&mut self, frame: js_sys::Function) {
        self.frame = Some(frame);
    }

    /// Applies an edit and stores it. Typing is solved at the next animation frame; a
    /// structural edit is solved and the editor redrawn at once.
    fn edit(&mut self, edit: Edit, focus: Option<(&'static str, String)>) {
        doc::apply(&mut self.doc, &edit, self.last.as_ref());
        storage::save(&self.key, &self.doc, self.view.mode);
        if edit.is_structural() {
            self.pending = false;
            let started = dom::now();
            self.solve();
            self.draw_all();
            self.refocus(focus);
            self.stamp(started);
        } else {
            self.schedule();
        }
    }

    fn schedule(&mut self) {
        if self.pending {
            return;
        }
        // The first edit after a quiet spell is answered at once; only edits that crowd into
        // the same frame wait for the next one.
        if dom::now() - self.updated_at >= FRAME_MS {
            self.pending = true;
            self.flush();
            return;
        }
        let requested = match (web_sys::window(), &self.frame) {
            (Some(window), Some(frame)) => window.request_animation_frame(frame).is_ok(),
            _ => false,
        };
        self.pending = true;
        if !requested {
            self.flush();
        }
    }

    /// Solves the typed edits waiting for this frame and redraws the results.
    pub(super) fn flush(&mut self) {
        if !self.pending {
            return;
        }
        self.pending = false;
        let started = dom::now();
        self.solve();
        self.draw_results();
        self.stamp(started);
    }

    /// Records how long the last update took on the root's `data-update-ms`, so that the page
    /// can be checked for responsiveness.
    fn stamp(&mut self, started: f64) {
        self.updated_at = dom::now();
        let _ = self.root.set_attribute("data-update-ms", &format!("{:.1}", self.updated_at - started));
    }

    /// After the editor was redrawn, gives the focus back to the control that had it.
    fn refocus(&self, focus: Option<(&'static str, String)>) {
        let Some((attribute, value)) = focus else { return };
        let found = dom::all(&self.root, &format!("[{attribute}]"))
            .into_iter()
            .find(|e| e.get_attribute(attribute).as_deref() == Some(value.as_str()));
        if let Some(element) = found {
            dom::focus(&element);
        }
    }

    pub(super) fn handle(&mut self, event: &Event) {
        let Some(target) = event.target().and_then(|t| t.dyn_into::<Element>().ok()) else { return };
        // Edits build on the report of what was on show (a new row takes sensible values from
        // it), an invalid edit leaves it on show greyed, and a chosen mode is drawn from it.
        self.complete();
        match event.type_().as_str() {
            "input" => self.on_input(&target),
            "change" => self.on_change(&target),
            "click" => self.on_click(&target),
            _ => {}
        }
    }

    fn on_input(&mut self, target: &Element) {
        let Some(input) = target.dyn_ref::<HtmlInputElement>() else { return };
        if input.type_() != "text" {
            return;
        }
        if let Some(path) = input.get_attribute("data-field") {
            self.edit(Edit::Text { path, text: input.value() }, None);
        }
    }

    fn on_change(&mut self, target: &Element) {
        if let Some(select) = target.dyn_ref::<HtmlSelectElement>() {
            let value = select.value();
            if let Some(path) = select.get_attribute("data-field") {
                let focus = Some(("data-field", path.clone()));
                self.edit(Edit::Choose { path, value }, focus);
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
                self.view.mode = mode;
                storage::save(&self.key, &self.doc, mode);
                self.draw_results();
                self.refocus(Some(("data-show-mode", mode.to_string())));
            }
            return;
        }
        let Some(button) = target.closest("[data-action]").ok().flatten() else { return };
        let list = button.get_attribute("data-list").as_deref().and_then(List::from_key);
        match (button.get_attribute("data-action").as_deref(), list) {
            (Some("add"), Some(list)) => {
                self.edit(Edit::Add(list), Some(("data-list", list.key().to_string())));
            }
            (Some("remove"), Some(list)) => {
                if let Some(index) = dom::number(&button, "data-index") {
                    self.edit(Edit::Remove(list, index), None);
                }
            }
            (Some("restore"), _) => self.restore(),
            _ => {}
        }
    }

    /// Forgets the reader's edits and shows the page's example again.
    fn restore(&mut self) {
        storage::clear(&self.key);
        self.error = None;
        self.view = View::default();
        self.load_example();
        self.solve();
        self.draw_all();
        self.refocus(Some(("data-action", "restore".to_string())));
    }
}
