//! An error marked in the editor: its message beside the field it names (or above the editor
//! when no field shows it), the field marked invalid or still to be filled, and the marks of
//! the error before taken off first.

use super::Calculator;
use crate::render;
use crate::widget::dom;
use modebench::Error;
use wasm_bindgen::JsCast;
use web_sys::HtmlInputElement;

impl Calculator {
    /// Takes the last error's marks out of the editor and places the error's, if any.
    pub(super) fn mark_error(&mut self) {
        self.unmark();
        let Some(error) = &self.error else { return };
        self.place_error(error);
        self.tie_errors();
    }

    fn unmark(&mut self) {
        // One look through the editor, on every answer: the messages go, the marks come off.
        let marks =
            ".mb-editor :is(.mb-field-error,.mb-invalid,.mb-unfilled,[aria-describedby],[aria-invalid])";
        for mark in dom::all(&self.root, marks) {
            if mark.class_list().contains("mb-field-error") {
                mark.remove();
                continue;
            }
            let _ = mark.class_list().remove_2("mb-invalid", "mb-unfilled");
            let _ = mark.remove_attribute("aria-describedby");
            let _ = mark.remove_attribute("aria-invalid");
        }
    }

    /// Puts the message for `error` beside its field, or above the editor.
    fn place_error(&self, error: &Error) {
        let general = dom::first(&self.root, ".mb-general-errors");
        let inputs = dom::all(&self.root, ".mb-editor [data-field]");
        let paths: Vec<String> =
            inputs.iter().map(|i| i.get_attribute("data-field").unwrap_or_default()).collect();
        let refs: Vec<&str> = paths.iter().map(String::as_str).collect();
        let place = render::placement(&error.path, &refs).and_then(|p| paths.iter().position(|q| q == p));
        match place.and_then(|i| inputs.get(i)) {
            Some(input) => {
                // A required field still empty is asked for, not marked wrong.
                let unfilled = input
                    .dyn_ref::<HtmlInputElement>()
                    .filter(|i| i.type_() == "text")
                    .is_some_and(|i| render::is_unfilled(error, &i.value()));
                if !unfilled {
                    let _ = input.set_attribute("aria-invalid", "true");
                }
                if let Some(field) = input.closest(".mb-field").ok().flatten() {
                    let (class, html) = if unfilled {
                        ("mb-unfilled", render::needed_html(error))
                    } else {
                        ("mb-invalid", render::field_error_html(error, false))
                    };
                    let _ = field.class_list().add_1(class);
                    let _ = field.insert_adjacent_html("beforeend", &html);
                }
            }
            None => {
                if let Some(g) = general {
                    g.set_inner_html(&render::field_error_html(error, true));
                }
            }
        }
    }
}
