//! The one error type of the crate: what went wrong, where in the input, and what is allowed.

use std::fmt;

/// What kind of problem an [`Error`] reports.
#[non_exhaustive]
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ErrorKind {
    /// The scenario text is not valid JSON, or a field has the wrong JSON type.
    Syntax,
    /// A required field is absent.
    Missing,
    /// A field holds a name or option that is not one of the allowed ones.
    UnknownOption,
    /// A number is NaN or infinite where a finite value is required.
    NotFinite,
    /// A number lies outside its allowed range (for example a negative length).
    OutOfRange,
    /// A quantity string names a unit that is not known.
    UnknownUnit,
    /// A quantity string has a unit of the wrong kind for its field (a pressure for a length).
    WrongDimension,
    /// Two inputs contradict each other (two rigid supports at one point, a tube wall
    /// thicker than its radius).
    Conflict,
    /// The model as a whole cannot be solved (for example it carries no mass).
    Model,
    /// A numerical method failed to converge; this is a defect worth reporting.
    NoConvergence,
}

impl ErrorKind {
    /// The kind's name as serialised: "unknown-unit", "out-of-range", …
    pub fn id(self) -> &'static str {
        match self {
            ErrorKind::Syntax => "syntax",
            ErrorKind::Missing => "missing",
            ErrorKind::UnknownOption => "unknown-option",
            ErrorKind::NotFinite => "not-finite",
            ErrorKind::OutOfRange => "out-of-range",
            ErrorKind::UnknownUnit => "unknown-unit",
            ErrorKind::WrongDimension => "wrong-dimension",
            ErrorKind::Conflict => "conflict",
            ErrorKind::Model => "model",
            ErrorKind::NoConvergence => "no-convergence",
        }
    }
}

/// An error with the field path it concerns (`attachments[2].position`), the offending value
/// as the user wrote it, and a message that says what is allowed.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Error {
    /// The kind of problem.
    pub kind: ErrorKind,
    /// Dotted path of the offending field, empty for whole-input problems.
    pub path: String,
    /// The offending value as written, when there is one.
    pub value: Option<String>,
    /// What is wrong and what is allowed, in plain words.
    pub message: String,
}

impl Error {
    /// A new error without a path; attach one with [`Error::at`].
    pub fn new(kind: ErrorKind, message: impl Into<String>) -> Self {
        Error { kind, path: String::new(), value: None, message: message.into() }
    }

    /// Sets the field path, prefixing any path already present (`segments[0]` + `section.wall`).
    #[must_use]
    pub fn at(mut self, path: impl AsRef<str>) -> Self {
        let outer = path.as_ref();
        self.path = match (outer.is_empty(), self.path.is_empty()) {
            (true, _) => self.path,
            (false, true) => outer.to_string(),
            (false, false) if self.path.starts_with('[') => format!("{outer}{}", self.path),
            (false, false) => format!("{outer}.{}", self.path),
        };
        self
    }

    /// Records the offending value as the user wrote it.
    #[must_use]
    pub fn with_value(mut self, value: impl fmt::Display) -> Self {
        self.value = Some(value.to_string());
        self
    }

    /// Records an offending number, written compactly (`1e300`, not three hundred digits).
    #[must_use]
    pub fn with_number(self, value: f64) -> Self {
        let text = if value == 0.0 || !value.is_finite() || (1e-4..1e9).contains(&value.abs()) {
            format!("{value}")
        } else {
            format!("{value:e}")
        };
        self.with_value(text)
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if !self.path.is_empty() {
            write!(f, "{}: ", self.path)?;
        }
        f.write_str(&self.message)?;
        if let Some(value) = &self.value {
            if !self.message.contains(value.as_str()) {
                write!(f, " (got {value})")?;
            }
        }
        Ok(())
    }
}

impl std::error::Error for Error {}

/// Shorthand used throughout the crate.
pub type Result<T, E = Error> = std::result::Result<T, E>;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_nest_outer_first() {
        let e =
            Error::new(ErrorKind::OutOfRange, "must be positive").at("wall").at("section").at("segments[0]");
        assert_eq!(e.path, "segments[0].section.wall");
        let e = Error::new(ErrorKind::OutOfRange, "x").at("[2]").at("attachments");
        assert_eq!(e.path, "attachments[2]");
    }

    /// An error crosses to another thread as JSON text with its kind, path, value and message.
    #[test]
    fn an_error_reads_back_from_its_json_as_itself() {
        let e = Error::new(ErrorKind::UnknownUnit, "unknown unit")
            .at("attachments[0].mass")
            .with_value("2.8 kgs");
        let json = serde_json::to_string(&e).unwrap_or_default();
        assert!(json.contains("\"kind\":\"unknown-unit\""), "{json}");
        assert_eq!(serde_json::from_str::<Error>(&json).ok(), Some(e));
    }

    #[test]
    fn display_names_field_and_value() {
        let e = Error::new(ErrorKind::OutOfRange, "a length must be positive")
            .at("segments[1].length")
            .with_value("-3");
        assert_eq!(e.to_string(), "segments[1].length: a length must be positive (got -3)");
    }
}
