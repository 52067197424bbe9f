//! One live calculator: the scenario as typed, the last good report, and what is on show.
//! The scenario is solved in a Web Worker (see [`super::solver`]); this thread only edits,
//! stores, draws and marks errors, so the page stays responsive whatever the model. Typing
//! redraws only the results, the plot and the error marks, so the input keeps its focus and
//! caret; structural edits redraw the editor too. What happens on each event is in [`events`],
//! what happens on each answer from the worker in [`answers`], what is done to the reader's cases
//! (and their links and files) in [`cases`], how an error is marked beside its field in
//! [`marks`].

mod answers;
mod cases;
mod events;
mod focus;
mod marks;
mod patch;

use super::io::Io;
use super::solver::{Callbacks, Solver};
use super::{dom, storage};
use crate::doc::{self, text};
use crate::render::{self, Editing, View};
use crate::worker::latest::Purpose;
use modebench::{Error, Report};
use modebench_ui::cases::Cases;
use serde_json::Value;
use web_sys::Element;

/// The event by which the tap-test panel hands the calculator the frequencies it measured.
pub(in crate::widget) const MEASURED_EVENT: &str = "modebench-measured";

/// The event by which the tap-test panel adds the tablet or sensor fixed to the part to the
/// model, as an attachment row (JSON text) with its values as typed.
pub(in crate::widget) const ATTACH_EVENT: &str = "modebench-attach";

/// The callbacks that take the page script's replies about links and files.
pub(in crate::widget) struct Replies {
    /// Takes a link made for the open case.
    pub(in crate::widget) linked: js_sys::Function,
    /// Takes the text of a file the reader picked.
    pub(in crate::widget) opened: js_sys::Function,
}

pub(super) struct Calculator {
    root: Element,
    /// The page's scenario text, for "Restore the page's example".
    original: String,
    key: String,
    doc: Value,
    /// The report of the last scenario solved that is on show (or, greyed, under an error),
    /// unless a newer answer is kept unread in `unread`.
    last: Option<Report>,
    /// The newest edit's answer as the worker sent it for reading (a JavaScript string), not
    /// read yet: the worker drew its results, and it is read ([`Calculator::read_last`]) only when
    /// the report is next needed. When set, it is the report on show, in place of `last`.
    unread: Option<wasm_bindgen::JsValue>,
    /// The results and summary the worker drew for the newest edit, and the view it drew them
    /// for, until they are drawn.
    drawn: Option<(View, crate::worker::message::Drawn)>,
    error: Option<Error>,
    view: View,
    solver: Solver,
    /// Whether the reader has edited since the page opened: the example's confirmation then
    /// redraws nothing, as the newest edit's answer decides what shows.
    edited: bool,
    /// The reader's stored case and the mode they looked at, not on show yet: it is tried once
    /// the page shows its example, and shown if it is solved within the budget.
    saved: Option<(Value, usize)>,
    /// Whether the results on show are still those the page was built with: no report has
    /// come yet to draw in their place (the worker may not have answered, or not in time).
    built_results: bool,
    /// The reader's cases on this calculator, the open one being what the editor holds.
    cases: Cases,
    /// The page's example as read, for new cases and "Restore the page's example".
    example: Value,
    /// The calculator's place on the page, from 0.
    index: usize,
    /// The page script's helpers for links and files, and the callbacks for their replies.
    io: Io,
    replies: Option<Replies>,
    /// The worker's answer for the report on show, as it wrote it (a JavaScript string), for
    /// the results' JSON file.
    answer: Option<wasm_bindgen::JsValue>,
    /// Whether results read from an answer wait to be drawn, and the callback that draws them in
    /// a task of their own.
    waiting_draw: bool,
    draw_later: Option<js_sys::Function>,
    /// What the case bar's status line says.
    note: String,
    /// Whether a case was just opened (from the list, a file or a link) and its first answer has
    /// not come: if that answer is an input error, the status line says where it is, since the
    /// field may be out of view.
    opened: bool,
    /// The printed sheet's head as last drawn.
    sheet: String,
    /// The inside of the results element as last drawn by [`Calculator::draw_results`], from
    /// which the next drawing is patched; `None` when something else has drawn there since.
    results_shown: Option<crate::render::patch::Drawing>,
    /// What the one-line summary holds, as last drawn there (`None` when unknown), likewise.
    summary_shown: Option<crate::render::patch::Drawing>,
}

impl Calculator {
    pub(super) fn new(root: Element, index: usize, worker_url: &str, budget_ms: f64, io: Io) -> Self {
        let original = root.get_attribute("data-modebench").unwrap_or_default();
        let key = storage::key(index);
        let example = doc::read(&original).unwrap_or_else(|_| Value::Object(serde_json::Map::new()));
        let stored = storage::load_value(&key);
        let cases = Cases::load(stored.as_ref(), &example);
        // The open case is tried once the example is on show, unless it is the example itself.
        let open = cases.open_case();
        let saved = (open.scenario != example || open.mode != 0).then(|| (open.scenario.clone(), open.mode));
        let mut c = Calculator {
            root,
            original,
            key,
            doc: Value::Null,
            last: None,
            unread: None,
            drawn: None,
            error: None,
            view: View::default(),
            solver: Solver::new(worker_url, budget_ms),
            edited: false,
            saved,
            built_results: true,
            cases,
            example,
            index,
            io,
            replies: None,
            answer: None,
            note: String::new(),
            opened: false,
            sheet: String::new(),
            results_shown: None,
            summary_shown: None,
            waiting_draw: false,
            draw_later: None,
        };
        c.load_example();
        c
    }

    /// Takes over the calculator: draws the editor's controls at once in place of the fixed
    /// values the page was built with, and starts the worker on the page's example (to confirm
    /// the results on show) and then on the reader's stored case, if any.
    pub(super) fn go_live(&mut self, callbacks: Callbacks, replies: Replies) {
        self.solver.connect(callbacks);
        self.replies = Some(replies);
        if self.error.is_some() {
            // The page's own scenario cannot be read; say so at once.
            self.draw_all();
        } else {
            self.draw_editor(false);
            self.solver.submit(Purpose::Confirm, text::write(&self.doc), &self.view);
        }
        if let Some((doc, _)) = &self.saved {
            self.solver.submit(Purpose::Restore, text::write(doc), &self.view);
        }
        self.show_offer();
        self.show_cases();
        self.show_sheet();
        self.show_solving();
        self.open_incoming();
    }

    /// Gives the calculator the callback that draws results left for a task of their own.
    pub(super) fn set_draw_later(&mut self, callback: js_sys::Function) {
        self.draw_later = Some(callback);
    }

    /// Asks for the results to be drawn in a task of their own; false when that cannot be done.
    fn draw_later(&self) -> bool {
        match (&self.draw_later, web_sys::window()) {
            (Some(callback), Some(window)) => {
                window.set_timeout_with_callback_and_timeout_and_arguments_0(callback, 0).is_ok()
            }
            _ => false,
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

    /// Remembers which fold-out sections the reader opened, before they are redrawn.
    pub(super) fn keep_open_sections(&mut self) {
        self.view.open = dom::all(&self.root, "details.mb-fold[open]")
            .iter()
            .filter_map(|d| d.get_attribute("data-part"))
            .collect();
    }

    /// Whether the results on show list exactly these frequencies, digit for digit: the page's
    /// prerendered ones against the worker's, computed in this browser.
    fn shows(&self, report: &Report) -> bool {
        let rows = dom::all(&self.root, "tr[data-mode]");
        rows.len() == report.modes.len()
            && report.modes.iter().enumerate().all(|(i, m)| {
                let selector = format!("tr[data-mode=\"{}\"] td[data-hz]", i + 1);
                dom::first(&self.root, &selector).and_then(|td| td.get_attribute("data-hz"))
                    == Some(format!("{}", m.frequency_hz))
            })
    }
    /// Draws the whole calculator; before any report has come, around the results the page was
    /// built with.
    fn draw_all(&mut self) {
        self.read_last();
        self.keep_open_sections();
        let html = render::calculator_inner(
            &self.doc,
            self.error.as_ref(),
            self.last.as_ref(),
            &self.view,
            Editing::Live,
        );
        let kept =
            dom::first(&self.root, ".mb-results").filter(|_| self.built_results && self.last.is_none());
        let kept = kept.map(|results| results.outer_html());
        self.root.set_inner_html(&html);
        self.results_shown = None;
        self.summary_shown = None;
        match (kept, dom::first(&self.root, ".mb-results")) {
            (Some(built), Some(results)) => {
                results.set_outer_html(&built);
                self.show_built_results();
            }
            _ => {
                self.built_results = false;
                // What the results element now holds, for the next answer to be patched over
                // (drawn again here: the calculator's markup does not hand its parts back).
                let stale = self.error.is_some();
                let html = render::results_inner(self.last.as_ref(), stale, &self.view);
                self.results_shown = Some(crate::render::patch::Drawing::new(html));
            }
        }
        self.show_offer();
        self.tie_errors();
        self.show_cases();
        self.show_sheet();
    }

    /// Keeps the results the page was built with on show: greyed, with the note that they
    /// belong to an earlier input, while there is an error.
    fn show_built_results(&self) {
        let Some(results) = dom::first(&self.root, ".mb-results") else { return };
        let _ = results.remove_attribute("aria-busy");
        let note = dom::first(&results, ".mb-stale-note");
        self.grey_summary(self.error.is_some());
        if self.error.is_some() {
            let _ = results.class_list().add_1("mb-stale");
            if note.is_none() {
                let _ = results.insert_adjacent_html("afterbegin", render::stale_note());
            }
        } else {
            let _ = results.class_list().remove_1("mb-stale");
            if let Some(note) = note {
                note.remove();
            }
        }
    }

    /// Draws the editor's controls, leaving the results as they are; with `marks`, the error
    /// beside its field (after a structural edit the error's field may have moved, so the marks
    /// wait for the answer).
    fn draw_editor(&mut self, marks: bool) {
        if let Some(editor) = dom::first(&self.root, ".mb-editor") {
            let error = if marks { self.error.as_ref() } else { None };
            editor.set_inner_html(&render::editor_html(&self.doc, error, Editing::Live));
        }
        self.tie_errors();
    }

    /// Draws the results and moves the error mark, leaving the editor's inputs in place. Before
    /// any report has come, the results the page was built with stay (greyed under an error).
    fn draw_results(&mut self) {
        self.keep_open_sections();
        // What the worker drew is drawn if it was drawn for what the page would draw now: the
        // results of the newest edit's report, not greyed, in the view on show.
        let drawn = self.drawn.take().filter(|(view, _)| *view == self.view && self.error.is_none());
        let (results_html, summary_html) = match drawn {
            Some((_, drawn)) => (Some(drawn.results), Some(drawn.summary)),
            None => {
                self.read_last();
                (None, None)
            }
        };
        if !self.has_report() && self.built_results {
            self.show_built_results();
            self.mark_error();
            return;
        }
        self.built_results = false;
        if let Some(results) = dom::first(&self.root, ".mb-results") {
            let class = if self.error.is_some() { "mb-results mb-stale" } else { "mb-results" };
            results.set_class_name(class);
            let _ = results.remove_attribute("aria-busy");
            let html = results_html.unwrap_or_else(|| {
                render::results_inner(self.last.as_ref(), self.error.is_some(), &self.view)
            });
            self.results_shown = Some(patch::draw(&results, self.results_shown.as_ref(), html));
        }
        if let Some(summary) = dom::first(&self.root, ".mb-summary") {
            let stale = self.error.is_some();
            self.grey_summary(stale);
            let html = summary_html.unwrap_or_else(|| render::summary_inner(self.last.as_ref(), stale));
            self.summary_shown = Some(patch::draw(&summary, self.summary_shown.as_ref(), html));
        }
        self.mark_error();
        self.show_sheet();
    }

    /// Greys the one-line summary, or shows it in full colour again.
    fn grey_summary(&self, grey: bool) {
        if let Some(summary) = dom::first(&self.root, ".mb-summary") {
            let _ = summary.class_list().toggle_with_force("mb-stale-summary", grey);
        }
    }

    /// Greys the results on show while the scenario being edited is still with the worker.
    fn mark_waiting(&self) {
        if let Some(results) = dom::first(&self.root, ".mb-results") {
            let _ = results.class_list().add_1("mb-stale");
            let _ = results.set_attribute("aria-busy", "true");
        }
        self.grey_summary(true);
    }

    /// Shows the offer to open the reader's set-aside case again under the calculator's head,
    /// if there is such a case, and removes it otherwise.
    fn show_offer(&self) {
        let shown = dom::first(&self.root, ".mb-offer");
        match (storage::load_set_aside(&self.key).is_some(), shown) {
            (true, None) => {
                if let Some(head) = dom::first(&self.root, ".mb-head") {
                    let _ = head.insert_adjacent_html("afterend", render::offer_html());
                }
            }
            (false, Some(offer)) => offer.remove(),
            _ => {}
        }
    }

    /// Shows the undo control under the calculator's head while a step can be taken back, with
    /// what it would undo, and removes it otherwise.
    fn show_undo(&self) {
        let shown = dom::first(&self.root, ".mb-undo-bar");
        match (self.cases.undo_label(), shown) {
            (Some(what), shown) => {
                let html = render::undo_html(what);
                match shown {
                    Some(bar) => bar.set_outer_html(&html),
                    None => {
                        if let Some(head) = dom::first(&self.root, ".mb-head") {
                            let _ = head.insert_adjacent_html("afterend", &html);
                        }
                    }
                }
            }
            (None, Some(bar)) => bar.remove(),
            (None, None) => {}
        }
    }

    /// Marks the root with `data-solving` while a scenario is with the worker or waits for it,
    /// for tests and style alike.
    fn show_solving(&self) {
        let _ = self.root.toggle_attribute_with_force("data-solving", self.solver.busy());
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
}
