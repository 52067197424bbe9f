//! Where the keyboard's focus goes after rows are added and removed, and the ties between a
//! message and its field that screen readers follow.
//!
//! After "Add", the focus goes to the new row's first control, so that the next keys type into
//! it; after "Remove", to the row that took the removed one's place, else the one before it,
//! else the list's Add button. Never to another row's Remove button: a second Enter would
//! remove that row too.

use super::Calculator;
use crate::doc::List;
use crate::widget::dom;
use serde_json::Value;

/// The controls a row's focus may land on, in page order.
const CONTROLS: &str = "input, select, textarea";

impl Calculator {
    /// How many rows the list has now.
    fn rows(&self, list: List) -> usize {
        self.doc.get(list.key()).and_then(Value::as_array).map_or(0, Vec::len)
    }

    /// Focuses the first control of row `index`; false when there is no such row.
    fn focus_row(&self, list: List, index: usize) -> bool {
        let selector = format!("[data-row=\"{}[{index}]\"]", list.key());
        let control = dom::first(&self.root, &selector).and_then(|row| dom::first(&row, CONTROLS));
        if let Some(control) = &control {
            dom::focus(control);
        }
        control.is_some()
    }

    fn focus_add_button(&self, list: List) {
        let selector = format!("[data-action=\"add\"][data-list=\"{}\"]", list.key());
        if let Some(button) = dom::first(&self.root, &selector) {
            dom::focus(&button);
        }
    }

    /// After a row was added at the end of `list`: its first control.
    pub(super) fn focus_after_add(&self, list: List) {
        let count = self.rows(list);
        if count == 0 || !self.focus_row(list, count - 1) {
            self.focus_add_button(list);
        }
    }

    /// After row `index` of `list` was removed: the row now in its place, else the one before,
    /// else the Add button.
    pub(super) fn focus_after_remove(&self, list: List, index: usize) {
        let count = self.rows(list);
        let done = (index < count && self.focus_row(list, index))
            || (index > 0 && index - 1 < count && self.focus_row(list, index - 1));
        if !done {
            self.focus_add_button(list);
        }
    }

    /// Ties every message in the editor to its field for assistive technology: the message gets
    /// an id of this calculator's own and the field's control names it in `aria-describedby`.
    pub(super) fn tie_errors(&self) {
        let prefix: String =
            self.key.chars().map(|c| if c.is_ascii_alphanumeric() { c } else { '-' }).collect();
        for (n, message) in dom::all(&self.root, ".mb-editor .mb-field .mb-field-error").iter().enumerate() {
            let id = format!("{prefix}-message-{n}");
            let _ = message.set_attribute("id", &id);
            let control = message
                .closest(".mb-field")
                .ok()
                .flatten()
                .and_then(|field| dom::first(&field, "[data-field], [data-control]"));
            if let Some(control) = control {
                let _ = control.set_attribute("aria-describedby", &id);
            }
        }
    }
}
