//! What the calculator does with the worker's answers, and when none comes in time: the
//! newest scenario's answer is drawn, an overtaken one is not, and a solve past its budget is
//! given up with a message beside the fields.

use super::Calculator;
use crate::render::View;
use crate::widget::solver::GREY_AFTER_MS;
use crate::widget::storage;
use crate::worker::latest::{Expiry, Purpose, Verdict};
use crate::worker::message::{self, Drawn};
use modebench::{Error, Report};
use wasm_bindgen::JsValue;
use web_sys::MessageEvent;

impl Calculator {
    /// Takes a message from the worker.
    pub(in crate::widget) fn on_answer(&mut self, event: &MessageEvent) {
        let Some(taken) = self.solver.answered(event) else {
            // The worker could not solve at all: its engine did not load.
            self.on_worker_error();
            return;
        };
        self.show_solving();
        // Only an answer that will be used is copied into the engine and read.
        let (text, answer) = (&taken.thinned, taken.whole.clone());
        match taken.verdict {
            // The example's report is what the page shows: keep it even if an edit overtook it,
            // so that an invalid edit still has results to show greyed.
            Verdict::Current(Purpose::Confirm) | Verdict::Overtaken(Purpose::Confirm) => {
                self.confirmed(read(text), answer);
            }
            Verdict::Current(Purpose::Restore) => self.restored(read(text), answer),
            // The results the worker drew are drawn as they came, and the answer read only
            // when the report is next needed.
            Verdict::Current(Purpose::Edit) => match taken.drawn() {
                Some(drawn) => self.solved_drawn(text.clone(), answer, drawn),
                None => self.solved(read(text), answer),
            },
            Verdict::Current(Purpose::Earlier) => self.earlier(read(text), answer),
            // Something newer is with the worker: this answer must not be drawn over it.
            Verdict::Overtaken(_) | Verdict::Unknown => {}
        }
    }

    /// The page's example, solved in this browser: if the results on show are exactly these,
    /// nothing is redrawn; otherwise (or if a mode was chosen meanwhile) they are replaced.
    fn confirmed(&mut self, outcome: Result<Report, Error>, answer: JsValue) {
        // An edit made since then is the reader's newest input; its answer decides what shows.
        let edited = self.edited;
        match outcome {
            Ok(report) => {
                let redraw = !self.shows(&report) || self.view.mode != 0;
                self.set_last(report);
                self.keep_answer(answer);
                if redraw && !edited {
                    self.draw_results();
                }
            }
            Err(error) if !edited => {
                self.error = Some(error);
                self.draw_results();
            }
            Err(_) => {}
        }
    }

    /// The reader's stored case, solved within the budget: it replaces the example on show
    /// (greyed under its error if it has one).
    fn restored(&mut self, outcome: Result<Report, Error>, answer: JsValue) {
        let Some((doc, mode)) = self.saved.take() else { return };
        self.doc = doc;
        self.view.mode = mode;
        self.adopt(outcome, answer);
        self.draw_all();
    }

    /// The newest edit, solved: its results, or its error beside its field. A long model's
    /// answer is drawn in a task of its own, after the one that read it: each stays short, so
    /// the page can take a keystroke or draw a frame between them. If a newer answer comes
    /// before the drawing, the newer is drawn.
    fn solved(&mut self, outcome: Result<Report, Error>, answer: JsValue) {
        let long = outcome.as_ref().is_ok_and(|r| !message::drawn_here(r));
        let opened = std::mem::take(&mut self.opened);
        self.adopt(outcome, answer);
        self.waiting_draw = true;
        if !long || !self.draw_later() {
            self.on_later();
        }
        if let Some(error) = &self.error {
            if opened {
                // The field may be out of view: the status line (above the form, where the
                // message is, beside its field or above them all) says where the error is.
                let place = modebench::schema::words(&error.path);
                let at = if place.is_empty() { place } else { format!(" at {place}") };
                let note =
                    format!("{} It has an input error{at}; its message is in the form below.", self.note);
                self.say(note.trim_start());
            }
            self.solver.submit_earlier(&self.view);
            self.show_solving();
        }
    }

    /// The edit before a refused one, solved again: its results replace the greyed ones while
    /// the refusal stands. Refused too, it changes nothing.
    fn earlier(&mut self, outcome: Result<Report, Error>, answer: JsValue) {
        if let (Ok(report), Some(_)) = (outcome, &self.error) {
            self.set_last(report);
            self.keep_answer(answer);
            self.draw_results();
        }
    }

    /// Makes a solved answer the one on show: its report and the worker's answer kept, or its
    /// error.
    fn adopt(&mut self, outcome: Result<Report, Error>, answer: JsValue) {
        match outcome {
            Ok(report) => {
                self.set_last(report);
                self.keep_answer(answer);
                self.error = None;
            }
            Err(error) => self.error = Some(error),
        }
    }

    /// The newest edit, solved, with the results and summary the worker drew for `drawn.0`:
    /// they are drawn at once (unless the reader changed the view meanwhile, when the page
    /// draws its own), and the answer's `text` for reading is kept unread until the report is
    /// next needed.
    fn solved_drawn(&mut self, text: JsValue, answer: JsValue, drawn: (View, Drawn)) {
        self.unread = Some(text);
        self.drawn = Some(drawn);
        self.opened = false;
        self.keep_answer(answer);
        self.error = None;
        // Drawn now, in place of an older answer's drawing still waiting for its task.
        self.waiting_draw = false;
        self.draw_results();
    }

    /// Draws the results left to draw by [`Calculator::solved`], if any (a newer answer may
    /// have drawn them already).
    pub(in crate::widget) fn on_later(&mut self) {
        if std::mem::take(&mut self.waiting_draw) {
            self.draw_results();
        }
    }

    /// Keeps the worker's answer for the report on show, and leaves it on the calculator's root
    /// as `modebenchAnswer` for the tap-test panel, whose engine matches its peaks with the
    /// report's modes (the page's engine neither reads nor analyses recordings).
    fn keep_answer(&mut self, answer: JsValue) {
        let _ = js_sys::Reflect::set(self.root.as_ref(), &JsValue::from_str("modebenchAnswer"), &answer);
        self.answer = Some(answer);
    }

    /// Reads the newest answer, if it was kept unread ([`Calculator::solved_drawn`]), into the
    /// report on show. The worker drew the results from this very text, so it reads; were it not
    /// to, the error is kept, and the next drawing shows it.
    pub(super) fn read_last(&mut self) {
        let Some(text) = self.unread.take() else { return };
        match read(&text) {
            Ok(report) => self.last = Some(report),
            Err(error) => self.error = Some(error),
        }
    }

    /// Whether a report is on show, read or kept unread.
    pub(super) fn has_report(&self) -> bool {
        self.last.is_some() || self.unread.is_some()
    }

    /// Makes `report` the report on show, in place of any answer kept unread.
    pub(super) fn set_last(&mut self, report: Report) {
        self.last = Some(report);
        self.unread = None;
        self.drawn = None;
    }

    /// Called by the solve's timer: gives up the solve if it has run past the budget.
    pub(in crate::widget) fn on_deadline(&mut self) {
        if let Some(expiry) = self.solver.expire() {
            let error = message::too_slow(self.solver.budget_ms());
            self.gave_up(expiry, error);
            self.show_solving();
        }
    }

    /// Called when the worker fails: the solve under way is given up.
    pub(in crate::widget) fn on_worker_error(&mut self) {
        if let Some(expiry) = self.solver.fail() {
            self.gave_up(expiry, message::failed());
            self.show_solving();
        }
    }

    /// Called a moment after an edit was handed to the worker: if it is still being solved,
    /// the results on show are greyed, as they belong to an earlier input.
    pub(in crate::widget) fn on_slow(&mut self) {
        if let Some((Purpose::Edit, ms)) = self.solver.running() {
            if ms >= f64::from(GREY_AFTER_MS) - 1.0 {
                self.mark_waiting();
            }
        }
    }

    /// A solve given up. If a newer scenario overtook it, that one is already with the fresh
    /// worker and nothing is said. The page's example keeps its prerendered results; the
    /// reader's stored case is set aside and offered back; an edit gets the message beside the
    /// fields, its results greyed.
    fn gave_up(&mut self, expiry: Expiry, error: Error) {
        if expiry.overtaken {
            return;
        }
        match expiry.purpose {
            Purpose::Confirm | Purpose::Earlier => {}
            Purpose::Restore => {
                if let Some((doc, mode)) = self.saved.take() {
                    storage::set_aside(&self.key, &doc, mode);
                }
                self.show_offer();
            }
            Purpose::Edit => {
                self.error = Some(error);
                self.draw_results();
            }
        }
    }
}

/// Reads an answer the worker sent (a JavaScript string) into the engine.
fn read(answer: &JsValue) -> Result<Report, Error> {
    message::read(&answer.as_string().unwrap_or_default())
}
