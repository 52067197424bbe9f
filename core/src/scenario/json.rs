//! A small reader over a parsed JSON value that keeps the field path, so every error can name
//! the field it concerns (`segments[0].section.wall`) and say what was expected.
//!
//! The scenario is read by hand rather than by derived deserialisers: the messages are ours, and
//! the browser build stays small (generic deserialiser code for tagged enums is large).
//!
//! The reader's methods are not inlined: each is called at dozens of places, reading a scenario
//! is a small part of a solve, and the solver's engine builds the core for speed, which would
//! otherwise copy each method into every place that calls it (`docs/performance.md`).

use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::units::Quantity;
use serde_json::{Map, Value};

/// A JSON value and the path it was found at.
#[derive(Clone, Debug)]
pub(crate) struct Node<'a> {
    value: &'a Value,
    path: FieldPath,
}

/// Field names for a message, written only when one is refused.
#[cold]
#[inline(never)]
fn listed(names: &[&str]) -> String {
    names.join(", ")
}

/// What kind of JSON a value is, for messages.
fn describe(v: &Value) -> &'static str {
    match v {
        Value::Null => "null",
        Value::Bool(_) => "true/false",
        Value::Number(_) => "a number",
        Value::String(_) => "a text",
        Value::Array(_) => "a list",
        Value::Object(_) => "an object",
    }
}

impl<'a> Node<'a> {
    /// The whole document.
    pub(crate) fn root(value: &'a Value) -> Node<'a> {
        Node { value, path: FieldPath::root() }
    }

    /// Where this value stands in the scenario (`segments[0].section`; empty for the whole).
    pub(crate) fn path(&self) -> &FieldPath {
        &self.path
    }

    #[inline(never)]
    fn error(&self, kind: ErrorKind, message: String) -> Error {
        Error::new(kind, message).at(&self.path)
    }

    /// An error about this node's type: "expected …, not a list".
    #[inline(never)]
    pub(crate) fn expected(&self, what: &str) -> Error {
        let e = self.error(ErrorKind::Syntax, format!("expected {what}, not {}", describe(self.value)));
        self.with_shown_value(e)
    }

    /// Records this node's value on an error, as the user wrote it where that is short.
    #[inline(never)]
    fn with_shown_value(&self, e: Error) -> Error {
        match self.value {
            Value::String(s) => e.with_value(s),
            Value::Number(n) => e.with_number(n.as_f64().unwrap_or(f64::NAN)),
            Value::Bool(b) => e.with_value(b),
            _ => e,
        }
    }

    #[inline(never)]
    fn child_path(&self, name: &str) -> FieldPath {
        self.path.key(name)
    }

    /// Checks that the node is an object, before reading a field that says what else it holds.
    pub(crate) fn object(&self, what: &str) -> Result<&'a Map<String, Value>> {
        self.value.as_object().ok_or_else(|| self.expected(what))
    }

    /// Checks that the node is an object whose field names are all in `allowed`.
    #[inline(never)]
    pub(crate) fn fields(&self, what: &str, allowed: &[&str]) -> Result<&'a Map<String, Value>> {
        let map = self.object(what)?;
        match map.keys().find(|k| !allowed.contains(&k.as_str())) {
            // An empty name has no place of its own: the error stands at the object holding it.
            Some(unknown) if unknown.is_empty() => {
                let whose = if self.path.is_empty() { "the scenario has" } else { "this holds" };
                Err(self.error(
                    ErrorKind::Syntax,
                    format!(
                        "{whose} a field with an empty name; give its name or remove it (allowed here: \
                         {})",
                        listed(allowed)
                    ),
                ))
            }
            // The path ends with the unknown name, so the message need not repeat it.
            Some(unknown) => Err(Error::new(
                ErrorKind::Syntax,
                format!("this field name is not known; allowed here: {}", listed(allowed)),
            )
            .at(self.child_path(unknown))),
            None => Ok(map),
        }
    }

    /// A field of this object, when present and not null.
    #[inline(never)]
    pub(crate) fn get(&self, name: &str) -> Option<Node<'a>> {
        let value = self.value.as_object()?.get(name).filter(|v| !v.is_null())?;
        Some(Node { value, path: self.child_path(name) })
    }

    /// A field that must be present.
    #[inline(never)]
    pub(crate) fn require(&self, name: &str, what: &str) -> Result<Node<'a>> {
        self.get(name).ok_or_else(|| {
            Error::new(ErrorKind::Missing, format!("this needs {what} (field \"{name}\")"))
                .at(self.child_path(name))
        })
    }

    /// The items of a list.
    #[inline(never)]
    pub(crate) fn items(&self, what: &str) -> Result<Vec<Node<'a>>> {
        let list = self.value.as_array().ok_or_else(|| self.expected(what))?;
        Ok(list.iter().enumerate().map(|(i, value)| Node { value, path: self.path.index(i) }).collect())
    }

    /// The text of a string.
    #[inline(never)]
    pub(crate) fn text(&self, what: &str) -> Result<&'a str> {
        self.value.as_str().ok_or_else(|| self.expected(what))
    }

    /// Whether the node is a string.
    pub(crate) fn is_text(&self) -> bool {
        self.value.is_string()
    }

    /// A number or a text with a unit.
    #[inline(never)]
    pub(crate) fn quantity(&self) -> Result<Quantity> {
        match self.value {
            Value::Number(n) => Ok(Quantity::Number(n.as_f64().unwrap_or(f64::NAN))),
            Value::String(s) => Ok(Quantity::Text(s.clone())),
            _ => Err(self.expected("a number (SI) or a text with a unit, like \"27.2 in\"")),
        }
    }

    /// An optional quantity field.
    #[inline(never)]
    pub(crate) fn quantity_at(&self, name: &str) -> Result<Option<Quantity>> {
        self.get(name).map(|n| n.quantity()).transpose()
    }

    /// A required quantity field.
    #[inline(never)]
    pub(crate) fn require_quantity(&self, name: &str, what: &str) -> Result<Quantity> {
        self.require(name, what)?.quantity()
    }

    /// An optional text field.
    #[inline(never)]
    pub(crate) fn text_at(&self, name: &str) -> Result<Option<String>> {
        self.get(name).map(|n| n.text("a text").map(str::to_string)).transpose()
    }

    /// A whole number for `field`; its range is checked with the model, in one place.
    #[inline(never)]
    pub(crate) fn whole(&self, field: &crate::schema::Field) -> Result<usize> {
        let allowed = field.range.words("", false);
        if !self.value.is_number() {
            return Err(self.expected(&allowed));
        }
        let n = self.value.as_u64().and_then(|n| usize::try_from(n).ok());
        n.ok_or_else(|| {
            self.with_shown_value(self.error(ErrorKind::OutOfRange, format!("expected {allowed}")))
        })
    }

    /// One of the `choices` the schema lists, by its id.
    pub(crate) fn one_of(
        &self,
        what: &str,
        choices: &'static [crate::schema::Choice],
    ) -> Result<&'static crate::schema::Choice> {
        let names: Vec<(&str, &'static crate::schema::Choice)> = choices.iter().map(|c| (c.id, c)).collect();
        self.choice(what, &names)
    }

    /// One of the `names`, mapped to its value.
    pub(crate) fn choice<T: Copy>(&self, what: &str, names: &[(&str, T)]) -> Result<T> {
        let text = self.text(what)?;
        names.iter().find(|(n, _)| *n == text).map(|(_, v)| *v).ok_or_else(|| {
            let list: Vec<String> = names.iter().map(|(n, _)| format!("\"{n}\"")).collect();
            self.error(ErrorKind::UnknownOption, format!("{what} is one of {}", list.join(", ")))
                .with_value(text)
        })
    }
}

/// Implements `serde::Deserialize` through `serde_json::Value` and one of the scenario readers,
/// so files and tests can use serde while the reading logic stays in one place (a field given
/// twice is refused there too).
macro_rules! deserialize_via_value {
    ($type:ty, $read:path) => {
        impl<'de> serde::Deserialize<'de> for $type {
            fn deserialize<D: serde::Deserializer<'de>>(
                deserializer: D,
            ) -> std::result::Result<Self, D::Error> {
                let repeated = std::cell::RefCell::new(None);
                let value =
                    $crate::scenario::text::value(deserializer, &repeated).map_err(|e| {
                        match repeated.borrow().as_ref() {
                            Some(path) => <D::Error as serde::de::Error>::custom(
                                $crate::scenario::text::given_twice(path),
                            ),
                            None => e,
                        }
                    })?;
                $read(&$crate::scenario::json::Node::root(&value))
                    .map_err(<D::Error as serde::de::Error>::custom)
            }
        }
    };
}
pub(crate) use deserialize_via_value;
