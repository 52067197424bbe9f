//! The reader's cases on a live calculator: opening, starting, duplicating and deleting cases,
//! the undo, the calculation record, and sharing and saving a case as a link or a file. What a
//! case is and how undo works is `modebench_ui::cases`; this file binds it to the page.

use super::Calculator;
use crate::doc::text;
use crate::widget::{dom, storage};
use modebench_ui::cases::{bar, export, sheet};
use wasm_bindgen::JsCast;
use web_sys::HtmlInputElement;

impl Calculator {
    /// Keeps the scenario being edited in the open case and stores every case.
    pub(super) fn store(&mut self) {
        self.cases.keep(&self.doc, self.view.mode);
        storage::save_value(&self.key, &self.cases.to_stored());
    }

    /// Draws the case bar under the calculator's head afresh, its fold-outs as they were.
    pub(super) fn show_cases(&mut self) {
        // A redraw of the whole calculator has removed the bar already; what was open then is in
        // the view.
        if let Some(old) = dom::first(&self.root, ".mb-cases") {
            self.keep_open_sections();
            old.remove();
        }
        let Some(head) = dom::first(&self.root, ".mb-head") else { return };
        let _ = head.insert_adjacent_html("afterend", &bar::bar_html(&self.cases, &self.note));
        for fold in dom::all(&self.root, ".mb-cases details[data-part]") {
            let part = fold.get_attribute("data-part").unwrap_or_default();
            if self.view.open.contains(&part) {
                let _ = fold.set_attribute("open", "");
            }
        }
    }

    /// Draws what the printed sheet adds above the calculator (shown in print only): the case's
    /// title, the date and the calculation record; and
    /// marks the root `data-own-case` when the case is not the page's example, so that print
    /// leaves out the page's words about its example.
    ///
    /// Nothing is touched when the sheet on show is already this one: a change under the
    /// calculator's root makes the browser restyle all of it, which on a model with hundreds of
    /// rows takes longer than a keystroke may.
    pub(super) fn show_sheet(&mut self) {
        let own = self.doc != self.example;
        if self.root.has_attribute("data-own-case") != own {
            let _ = self.root.toggle_attribute_with_force("data-own-case", own);
        }
        let today = js_sys::Date::new_0();
        let date =
            format!("{:04}-{:02}-{:02}", today.get_full_year(), today.get_month() + 1, today.get_date());
        let case = self.cases.open_case();
        let html = sheet::head_html(case, own, &date);
        let shown = dom::first(&self.root, ".mb-sheet");
        if shown.is_some() && html == self.sheet {
            return;
        }
        if let Some(old) = shown {
            old.remove();
        }
        if let Some(head) = dom::first(&self.root, ".mb-head") {
            let _ = head.insert_adjacent_html("afterend", &html);
        }
        self.sheet = html;
    }

    /// Draws every mode's shape for the printed sheet, as the page is about to be printed: a
    /// large model's twenty shapes take longer to draw than a keystroke may, so they are not
    /// drawn with every answer (the results' redraw removes them again: the elements they add
    /// leave the results with more elements than their last drawing, so the next answer draws
    /// the results whole instead of patching them).
    pub(in crate::widget) fn on_print(&mut self) {
        for old in dom::all(&self.root, ".mb-sheet-shapes") {
            old.remove();
        }
        self.read_last();
        let shapes = self.last.as_ref().filter(|_| self.error.is_none()).map(sheet::shapes_html);
        if let (Some(shapes), Some(results)) = (shapes, dom::first(&self.root, ".mb-results")) {
            let _ = results.insert_adjacent_html("beforeend", &shapes);
        }
    }

    /// Redraws only the case list's names, after the title was typed (the title's field keeps
    /// its focus and caret).
    pub(super) fn show_case_names(&mut self) {
        if let Some(list) = dom::first(&self.root, ".mb-case-list") {
            list.set_inner_html(&bar::options_html(&self.cases));
        }
        if let Some(title) = dom::first(&self.root, ".mb-head .mb-title") {
            title.set_text_content(Some(&modebench_ui::cases::title_of(&self.doc)));
        }
        self.show_sheet();
    }

    pub(super) fn say(&mut self, note: &str) {
        self.note = note.to_string();
        if let Some(line) = dom::first(&self.root, ".mb-case-note") {
            line.set_text_content(Some(note));
        }
    }

    /// Puts the open case in the editor and hands it to the worker, after the cases changed.
    fn show_open_case(&mut self, focus: &str) {
        self.edited = true;
        // A stored case still waiting to be shown is in the list already; whatever the reader
        // chose now is shown instead.
        self.saved = None;
        let case = self.cases.open_case();
        self.doc = case.scenario.clone();
        self.view.mode = case.mode;
        self.error = None;
        self.answer = None;
        self.store();
        self.draw_all();
        self.refocus(Some(("data-action", focus.to_string())));
        self.start_over();
        self.opened = true;
    }

    /// Opens another case from the list.
    pub(super) fn open_case(&mut self, id: u64) {
        self.store_unless_waiting();
        if self.cases.open(id) {
            self.note.clear();
            self.show_open_case("case-open");
            self.refocus(Some(("data-control", "case".to_string())));
        }
    }

    /// While the stored case waits to be shown the editor holds the example, which must not be
    /// kept over it.
    pub(super) fn store_unless_waiting(&mut self) {
        if self.saved.is_none() {
            self.store();
        }
    }

    /// The case bar's buttons, and the sharing and saving ones.
    pub(super) fn case_action(&mut self, action: &str) {
        match action {
            "case-blank" | "case-example" | "case-duplicate" | "case-delete" | "undo" => {
                self.store_unless_waiting();
                let note = match action {
                    "case-blank" => {
                        self.cases.new_blank(&self.example);
                        "A blank case: type each value with its unit.".to_string()
                    }
                    "case-example" => {
                        self.cases.new_from_example(&self.example);
                        "A new case, copied from the page's example.".to_string()
                    }
                    "case-duplicate" => {
                        self.cases.duplicate();
                        "A copy of the case; its title says so.".to_string()
                    }
                    "case-delete" => {
                        let name = self.cases.open_case().name();
                        self.cases.delete(&self.example);
                        format!("Deleted “{name}”. “Undo” brings it back.")
                    }
                    _ => match self.cases.undo_label().map(str::to_string) {
                        Some(what) if self.cases.undo() => format!("Undone: {what}."),
                        _ => return,
                    },
                };
                self.note = note;
                self.show_open_case(action);
            }
            "share-link" => self.share_link(),
            "save-file" => {
                let name = export::file_name(&self.doc, "", "json");
                let file = export::scenario_file(&self.doc);
                self.saved_file(&name, "application/json", &file);
            }
            "open-file" => {
                let asked = self.replies.as_ref().is_some_and(|r| self.io.pick_file(&r.opened));
                if !asked {
                    self.say("Files cannot be opened on this page.");
                }
            }
            "results-csv" | "results-json" => self.save_results(action == "results-csv"),
            _ => {}
        }
    }

    fn saved_file(&mut self, name: &str, kind: &str, text: &str) {
        if self.io.download(name, kind, text) {
            self.say(&format!("Saved as {name} (in your downloads)."));
        } else {
            self.say("Files cannot be saved on this page.");
        }
    }

    fn save_results(&mut self, csv: bool) {
        self.read_last();
        let current = self.error.is_none() && !self.solver.busy();
        let (Some(report), Some(answer), true) = (&self.last, &self.answer, current) else {
            self.say("There are no results for this case yet: correct the field marked, or wait for them.");
            return;
        };
        let (name, kind, file) = if csv {
            (export::file_name(&self.doc, "-results", "csv"), "text/csv", Some(export::results_csv(report)))
        } else {
            let file = answer.as_string().and_then(|answer| export::results_json(&self.doc, &answer));
            (export::file_name(&self.doc, "-results", "json"), "application/json", file)
        };
        match file {
            Some(file) => self.saved_file(&name, kind, &file),
            None => self.say("There are no results for this case yet."),
        }
    }

    fn share_link(&mut self) {
        let text = text::write(&self.doc);
        let asked = self.replies.as_ref().is_some_and(|r| self.io.link(self.index + 1, &text, &r.linked));
        if asked {
            self.say("Making the link…");
        } else {
            self.say("Links cannot be made on this page.");
        }
    }

    /// Takes the link made for the case: shown, selected, for the reader to copy.
    pub(in crate::widget) fn on_link(&mut self, link: Option<String>) {
        let field = dom::first(&self.root, ".mb-share-link");
        let field = field.and_then(|f| f.dyn_into::<HtmlInputElement>().ok());
        match (link, field) {
            (Some(link), Some(field)) => {
                field.set_value(&link);
                dom::focus(&field);
                field.select();
                self.say(&format!(
                    "The link below carries this case ({} characters): copy it and send it.",
                    link.chars().count()
                ));
            }
            _ => self.say("This browser could not make the link (it lacks compression streams)."),
        }
    }

    /// Takes the text of a file the reader picked: its scenario becomes a case, opened.
    pub(in crate::widget) fn on_file(&mut self, text: Option<String>) {
        match text.as_deref().map(export::scenario_from_file) {
            Some(Ok(scenario)) => {
                self.store_unless_waiting();
                let added = self.cases.import(scenario);
                self.note =
                    if added { "Opened the file as a new case." } else { "That case is here already." }
                        .into();
                self.show_open_case("open-file");
            }
            Some(Err(why)) => self.say(&format!("Not opened: {why}.")),
            None => self.say("Not opened: the file could not be read."),
        }
    }

    /// Opens the case a link to the page carried, if it is for this calculator.
    pub(super) fn open_incoming(&mut self) {
        match self.io.incoming(self.index + 1) {
            Some(Ok(text)) => match export::scenario_from_file(&text) {
                Ok(scenario) => {
                    self.store_unless_waiting();
                    let added = self.cases.import(scenario);
                    self.note = if added {
                        "Opened the case the link carried."
                    } else {
                        "The link's case is here already."
                    }
                    .into();
                    self.show_open_case("case-open");
                }
                Err(why) => self.say(&format!("The link's case was not opened: {why}.")),
            },
            Some(Err(why)) => self.say(&format!("The link's case was not opened: {why}.")),
            None => {}
        }
    }
}
