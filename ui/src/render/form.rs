//! The editor's building blocks: text fields, selects and checkboxes bound to scenario paths,
//! with the error message placed beside the field it concerns.
//!
//! Each is written in one of two ways (see [`Editing`]): as a form control, or fixed, as the
//! value in a box of the control's size, for the page as built, before the engine runs.

use super::errors;
use super::escape::escape;
use crate::catalog::FieldSpec;
use crate::doc::path;
use modebench::units::{self, Kind, UnitSystem};
use modebench::Error;
use serde_json::Value;

/// Whether the editor can be edited.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Editing {
    /// Form controls, for the live widget.
    Live,
    /// The values as text in boxes the size of the controls, for the page as built: nothing
    /// there can be edited before the engine has loaded, so nothing pretends to be editable,
    /// and the browser has no form to examine while it first lays out the page. The engine
    /// replaces them with the controls, in place, when it takes over.
    Fixed,
}

/// The editor being written: the scenario, the unit system, and where the error goes.
pub(crate) struct Form<'a> {
    pub(crate) doc: &'a Value,
    pub(crate) system: UnitSystem,
    pub(crate) editing: Editing,
    error: Option<&'a Error>,
    /// The field path the error is shown beside, once known.
    error_at: Option<String>,
    /// Every field path written, in page order.
    pub(crate) fields: Vec<String>,
}

/// A field's state in the form: marks for the field in error and the message beside it.
struct Slot {
    class: &'static str,
    aria: &'static str,
    error: String,
}

/// Extra settings for a text field.
#[derive(Clone, Copy, Default)]
pub(crate) struct TextOptions<'a> {
    pub(crate) kind: Option<Kind>,
    pub(crate) optional: bool,
    pub(crate) rigid: bool,
    pub(crate) placeholder: Option<&'a str>,
    pub(crate) numeric: bool,
}

impl<'a> Form<'a> {
    pub(crate) fn new(
        doc: &'a Value,
        editing: Editing,
        error: Option<&'a Error>,
        error_at: Option<String>,
    ) -> Self {
        Form { doc, system: crate::doc::unit_system(doc), editing, error, error_at, fields: Vec::new() }
    }

    /// Records a field and returns its state: the extra attribute and class when it is the
    /// field in error, and the error element to put beside it. A text field (`typed` is what it
    /// holds) still empty is asked for rather than marked wrong.
    fn enter(&mut self, path: &str, typed: Option<&str>) -> Slot {
        self.fields.push(path.to_string());
        match (self.error, &self.error_at) {
            (Some(e), Some(at)) if at == path && typed.is_some_and(|t| errors::is_unfilled(e, t)) => {
                Slot { class: " mb-unfilled", aria: "", error: errors::needed_html(e) }
            }
            (Some(e), Some(at)) if at == path => Slot {
                class: " mb-invalid",
                aria: " aria-invalid=\"true\"",
                error: errors::field_error_html(e, false),
            },
            _ => Slot { class: "", aria: "", error: String::new() },
        }
    }

    /// A text field holding what was typed at `path`. A quantity's field shows beside it the
    /// unit a number typed alone takes, and says it in `data-unit` for the widget, which writes
    /// that unit out when such a number is typed.
    pub(crate) fn text(&mut self, path: &str, label: &str, options: TextOptions<'_>) -> String {
        let stored = path::text(self.doc, path);
        let unit = options.kind.map_or("", |kind| units::bare_unit(kind, self.system, &stored));
        let value = match options.kind {
            Some(kind) => shown_value(stored, kind, unit),
            None => stored,
        };
        let (unit_html, unit_attribute) = if unit.is_empty() {
            (String::new(), String::new())
        } else {
            (
                format!("<span class=\"mb-unit\">{}</span>", escape(unit)),
                format!(" data-unit=\"{}\"", escape(unit)),
            )
        };
        let placeholder = match (options.placeholder, options.kind) {
            (Some(p), _) => p.to_string(),
            // The unit is beside the box; the placeholder says only what else the field takes.
            (None, Some(_)) => match (options.rigid, options.optional) {
                // An end's spring left empty is no spring (0), which the box says, in words short
                // enough for the box on a tablet held upright.
                (true, true) => "none if empty, or rigid".to_string(),
                (true, false) => "a number, or rigid".to_string(),
                (false, true) => "optional".to_string(),
                (false, false) => String::new(),
            },
            (None, None) => String::new(),
        };
        let mode = if options.numeric { "numeric" } else { "text" };
        let slot = self.enter(path, Some(&value));
        if self.editing == Editing::Fixed {
            let (shown, empty) = if value.is_empty() { (&placeholder, " mb-empty") } else { (&value, "") };
            return format!(
                "<div class=\"mb-field{}\"><span class=\"mb-label\">{}</span><span class=\"mb-input-row\">\
                 <span class=\"mb-input mb-fixed{empty}\" data-field=\"{}\">{}</span>{unit_html}</span>{}</div>",
                slot.class,
                escape(label),
                escape(path),
                escape(shown),
                slot.error
            );
        }
        format!(
            "<label class=\"mb-field{}\"><span class=\"mb-label\">{}</span><span class=\"mb-input-row\">\
             <input class=\"mb-input\" type=\"text\" inputmode=\"{mode}\" autocomplete=\"off\" autocapitalize=\"off\" \
             spellcheck=\"false\" data-field=\"{}\"{unit_attribute} value=\"{}\" placeholder=\"{}\"{}>{unit_html}</span>\
             {}</label>",
            slot.class,
            escape(label),
            escape(path),
            escape(&value),
            escape(&placeholder),
            slot.aria,
            slot.error
        )
    }

    /// A text field described by the catalogue, under the object at `base`.
    /// Only quantities are drawn so: other fields (names, nested objects) have controls of
    /// their own.
    pub(crate) fn spec(&mut self, base: &str, spec: &FieldSpec) -> String {
        if spec.form != crate::catalog::Form::Quantity {
            return String::new();
        }
        let options = TextOptions {
            kind: Some(spec.kind),
            optional: spec.optional,
            rigid: spec.rigid,
            ..TextOptions::default()
        };
        self.text(&format!("{base}.{}", spec.name), spec.label, options)
    }

    /// A select at `path` with `current` chosen; an unknown current value is kept as an option
    /// so the page shows what the scenario says (and the error beside it says what is allowed).
    pub(crate) fn select(
        &mut self,
        path: &str,
        label: &str,
        options: &[(&str, &str)],
        current: &str,
        after: &str,
    ) -> String {
        let slot = self.enter(path, None);
        if self.editing == Editing::Fixed {
            let shown = options.iter().find(|(id, _)| *id == current).map_or(current, |(_, name)| *name);
            return fixed_choice(
                slot.class,
                label,
                &format!(" data-field=\"{}\"", escape(path)),
                shown,
                after,
            ) + &slot.error
                + "</div>";
        }
        let mut list = String::new();
        if !options.iter().any(|(id, _)| *id == current) {
            list.push_str(&format!("<option value=\"{0}\" selected>{0}</option>", escape(current)));
        }
        for (id, name) in options {
            let selected = if *id == current { " selected" } else { "" };
            list.push_str(&format!("<option value=\"{}\"{selected}>{}</option>", escape(id), escape(name)));
        }
        format!(
            "<label class=\"mb-field mb-choice{}\"><span class=\"mb-label\">{}</span><span class=\"mb-select-row\">\
             <select class=\"mb-select\" data-field=\"{}\"{}>{list}</select>{after}</span>{}</label>",
            slot.class,
            escape(label),
            escape(path),
            slot.aria,
            slot.error
        )
    }

    /// A checkbox that adds the part at `path` when ticked and removes it when cleared.
    pub(crate) fn tick(&mut self, path: &str, label: &str) -> String {
        let on = path::get(self.doc, path).is_some();
        let slot = self.enter(path, None);
        if self.editing == Editing::Fixed {
            return format!(
                "<div class=\"mb-field mb-tick{}\"><span class=\"mb-checkbox mb-fixed\" data-field=\"{}\" \
                 data-checked=\"{on}\"></span><span class=\"mb-label\">{}</span>{}</div>",
                slot.class,
                escape(path),
                escape(label),
                slot.error
            );
        }
        format!(
            "<label class=\"mb-field mb-tick{}\"><input class=\"mb-checkbox\" type=\"checkbox\" data-field=\"{}\"{}{}>\
             <span class=\"mb-label\">{}</span>{}</label>",
            slot.class,
            escape(path),
            if on { " checked" } else { "" },
            slot.aria,
            escape(label),
            slot.error
        )
    }
}

/// The opening of a fixed select: its label, the chosen option's words in a box, and what
/// follows the box (a drawing); the caller adds any message and closes the `div`.
pub(crate) fn fixed_choice(class: &str, label: &str, attributes: &str, shown: &str, after: &str) -> String {
    format!(
        "<div class=\"mb-field mb-choice{class}\"><span class=\"mb-label\">{}</span><span class=\"mb-select-row\">\
         <span class=\"mb-select mb-fixed\"{attributes}>{}</span>{after}</span>",
        escape(label),
        escape(shown)
    )
}

/// What a quantity's field shows for the value stored: as typed, except a number stored without
/// a unit (a scenario file's, which is SI) where the field's unit is another: that number is
/// shown with its SI unit, so that the unit beside the field cannot be taken for its own.
fn shown_value(stored: String, kind: Kind, unit: &str) -> String {
    let si = kind.si_unit();
    match units::with_unit(&stored, si) {
        Some(with_si) if unit != si => with_si,
        _ => stored,
    }
}
