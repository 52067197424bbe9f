//! The one error type of the crate: what went wrong, where in the input, and what is allowed.

use std::fmt;

use crate::path::FieldPath;

/// What kind of problem an [`Error`] reports.
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
    /// Every kind, in the order they are declared.
    pub const ALL: [ErrorKind; 10] = [
        ErrorKind::Syntax,
        ErrorKind::Missing,
        ErrorKind::UnknownOption,
        ErrorKind::NotFinite,
        ErrorKind::OutOfRange,
        ErrorKind::UnknownUnit,
        ErrorKind::WrongDimension,
        ErrorKind::Conflict,
        ErrorKind::Model,
        ErrorKind::NoConvergence,
    ];

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

/// How many characters of anything the user typed an error repeats: enough to recognise it,
/// few enough that a pasted paragraph cannot swamp the message.
pub const ECHO_LIMIT: usize = 60;

/// The longest message the crate writes. Every message quotes user text through [`echo`], so
/// none comes near it; it is the backstop that keeps a message readable should one not.
const MESSAGE_LIMIT: usize = 240;

/// User text as an error repeats it: trimmed, and cut to [`ECHO_LIMIT`] characters with an
/// ellipsis when longer. Every echo of user text in a message goes through here.
pub fn echo(text: &str) -> String {
    cut(text.trim(), ECHO_LIMIT)
}

fn cut(text: &str, limit: usize) -> String {
    match text.char_indices().nth(limit) {
        None => text.to_string(),
        Some((end, _)) => format!("{}…", &text[..end]),
    }
}

/// A number written compactly for a message (`1e300`, not three hundred digits; `0.1143`, not
/// `0.11430000000000001`). Never "NaN" or "inf": a non-finite number is not a value a user can
/// act on, so it is described instead.
pub fn number(value: f64) -> String {
    if value.is_nan() {
        return "an undefined value".to_string();
    }
    if value.is_infinite() {
        return if value > 0.0 {
            "a value too large to represent"
        } else {
            "a value too negative to represent"
        }
        .to_string();
    }
    crate::units::significant(value, 6)
}

/// A ratio or estimate for a message, to three significant figures (`2.6e6`, `380`); never
/// "NaN" or "inf", like [`number`].
pub(crate) fn roughly(value: f64) -> String {
    if value.is_finite() {
        crate::units::significant(value, 3)
    } else {
        number(value)
    }
}

/// A number as the user gave it in JSON, written back the shortest way that reads as the same
/// number (`0.1143`), in exponent form when very large or small (`1e308`, not 309 digits).
pub fn as_typed(value: f64) -> String {
    if !value.is_finite() {
        number(value)
    } else if value == 0.0 || (1e-4..1e9).contains(&value.abs()) {
        format!("{value}")
    } else {
        format!("{value:e}")
    }
}

/// An error with the field path it concerns (`attachments[2].position`), the offending value
/// as the user wrote it, and a message that says what is allowed.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Error {
    /// The kind of problem.
    pub kind: ErrorKind,
    /// Where the offending field is (`segments[0].length`), empty for whole-input problems;
    /// serialised as that text.
    pub path: FieldPath,
    /// The offending value as written (cut to [`ECHO_LIMIT`] characters), when there is one.
    pub value: Option<String>,
    /// The offending value in SI with its unit ("7.62 m"), when the check was made in SI.
    pub si: Option<String>,
    /// What is wrong and what is allowed, in plain words.
    pub message: String,
}

impl Error {
    /// A new error without a path; attach one with [`Error::at`]. Quote user text in `message`
    /// through [`echo`].
    ///
    /// This and the other builders below are generic only in their argument's conversion, which
    /// is all that is inlined at a call site; the work is one function not inlined. Errors are
    /// made at some hundreds of places in the core, which the solver's engine builds for speed,
    /// and each place carried its own copy of the work (`docs/performance.md`, 2026-12-03).
    pub fn new(kind: ErrorKind, message: impl Into<String>) -> Self {
        Error::with_message(kind, message.into())
    }

    #[inline(never)]
    fn with_message(kind: ErrorKind, message: String) -> Self {
        let message =
            if message.chars().count() > MESSAGE_LIMIT { cut(&message, MESSAGE_LIMIT) } else { message };
        Error { kind, path: FieldPath::root(), value: None, si: None, message }
    }

    /// Sets the field path, prefixing any path already present (`segments[0]` + `section.wall`).
    #[must_use]
    pub fn at(self, outer: impl Into<FieldPath>) -> Self {
        self.at_path(outer.into())
    }

    #[inline(never)]
    fn at_path(mut self, outer: FieldPath) -> Self {
        self.path = outer.join(&self.path);
        self
    }

    /// Records the offending value as the user wrote it.
    #[must_use]
    pub fn with_value(self, value: impl fmt::Display) -> Self {
        self.with_text(&value.to_string())
    }

    #[inline(never)]
    fn with_text(mut self, value: &str) -> Self {
        self.value = Some(echo(value));
        self
    }

    /// Records an offending number given in SI without a unit (a plain JSON number, or a value
    /// passed to the API). A non-finite number is left out: the message says what is wrong.
    #[must_use]
    pub fn with_number(self, value: f64) -> Self {
        if value.is_finite() {
            self.with_value(as_typed(value))
        } else {
            self
        }
    }

    /// Records the offending value as checked, in SI with its unit (`unit` empty for a ratio).
    /// What the user typed, when known, is added with [`Error::with_value`].
    #[must_use]
    pub fn with_si(mut self, value: f64, unit: &str) -> Self {
        if value.is_finite() {
            self.si = Some(format!("{} {unit}", number(value)).trim_end().to_string());
        }
        self
    }
}

impl fmt::Display for Error {
    /// `path: message; got "typed" (SI value)`, leaving out what the message already shows.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if !self.path.is_empty() {
            write!(f, "{}: ", self.path)?;
        }
        f.write_str(&self.message)?;
        let shown = |text: &str| mentions(&self.message, text);
        let typed = self.value.as_deref().filter(|v| !shown(v));
        let si = self.si.as_deref().filter(|si| !shown(si) && Some(*si) != self.value.as_deref());
        match (typed, si) {
            // A plain number typed is already SI: its unit is all the SI value adds.
            (Some(typed), Some(si)) if si.strip_prefix(typed).is_some_and(|unit| unit.starts_with(' ')) => {
                write!(f, "; got {si}")
            }
            (Some(typed), Some(si)) => write!(f, "; got {} ({si})", quoted(typed)),
            (Some(typed), None) => write!(f, "; got {}", quoted(typed)),
            (None, Some(si)) if self.value.is_none() => write!(f, "; got {si}"),
            _ => Ok(()),
        }
    }
}

/// Whether `message` already shows the value `text`: "the wall (40 mm)" shows "40 mm" and
/// "the web (51)" shows "51", but "1e20" does not show "0", nor does "between 0 and 100 %" show
/// a typed 0: a bare number counts as shown only in brackets or quotes, as messages quote values,
/// and so does any text inside quotes, where a message quotes one value whole.
pub fn mentions(message: &str, text: &str) -> bool {
    let part_of_word = |c: Option<char>| c.is_some_and(|c| c.is_alphanumeric() || c == '.' || c == '-');
    let bare_number = crate::units::decimal(text).is_some();
    !text.is_empty()
        && message.match_indices(text).any(|(i, _)| {
            let before = message[..i].chars().next_back();
            let after = message[i + text.len()..].chars().next();
            // Inside quotes a message quotes one value whole: "kg" typed alone is not shown by
            // the example "27.2 kg".
            let quoted = message[..i].matches('"').count() % 2 == 1;
            if bare_number || quoted {
                matches!((before, after), (Some('('), Some(')')) | (Some('"'), Some('"')))
            } else {
                !part_of_word(before) && !part_of_word(after)
            }
        })
}

/// A value as typed, in quotes unless it is a plain number.
fn quoted(typed: &str) -> String {
    if crate::units::decimal(typed).is_some() {
        typed.to_string()
    } else {
        format!("\"{typed}\"")
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
        let e = Error::new(ErrorKind::OutOfRange, "must be positive")
            .at("wall")
            .at("section")
            .at(FieldPath::item("segments", 0));
        assert_eq!(e.path, "segments[0].section.wall");
        let e = Error::new(ErrorKind::OutOfRange, "x").at(FieldPath::root().index(2)).at("attachments");
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
        assert_eq!(e.to_string(), "segments[1].length: a length must be positive; got -3");
    }

    #[test]
    fn display_gives_the_value_as_typed_and_in_si() {
        let e = Error::new(ErrorKind::OutOfRange, "must lie on the beam (0 to 7.6 m)")
            .at("report_point")
            .with_value("300 in")
            .with_si(7.62, "m");
        assert_eq!(e.to_string(), "report_point: must lie on the beam (0 to 7.6 m); got \"300 in\" (7.62 m)");
        // A value the message already quotes is not repeated; a number inside another is not
        // the value.
        let e = Error::new(ErrorKind::OutOfRange, "must be from 1 to 20").with_value(0);
        assert_eq!(e.to_string(), "must be from 1 to 20; got 0");
        let e = Error::new(ErrorKind::OutOfRange, "must lie between 0 and 100 %").with_value(0);
        assert_eq!(e.to_string(), "must lie between 0 and 100 %; got 0");
        let e = Error::new(ErrorKind::Conflict, "the web (51) must be thinner").with_value(51);
        assert_eq!(e.to_string(), "the web (51) must be thinner");
        let e = Error::new(ErrorKind::Conflict, "the wall (40 mm) must be thinner").with_value("40 mm");
        assert_eq!(e.to_string(), "the wall (40 mm) must be thinner");
        // A unit typed alone is not shown by a quoted example that ends in it.
        let e = Error::new(
            ErrorKind::Syntax,
            "the number is missing: write it before the unit, as in \"27.2 kg\"",
        )
        .with_value("kg");
        assert_eq!(
            e.to_string(),
            "the number is missing: write it before the unit, as in \"27.2 kg\"; got \"kg\""
        );
        let e = Error::new(ErrorKind::UnknownUnit, "unknown unit \"kgs\"").with_value("kgs");
        assert_eq!(e.to_string(), "unknown unit \"kgs\"");
        // Without what was typed, the SI value is the echo.
        let e = Error::new(ErrorKind::OutOfRange, "too long").with_si(2e6, "m");
        assert_eq!(e.to_string(), "too long; got 2e6 m");
    }

    #[test]
    fn echoes_of_user_text_are_cut() {
        // A pasted paragraph is repeated only as far as ECHO_LIMIT characters, in the value,
        // the path and the message.
        let paragraph = "é".repeat(100_000);
        let e = Error::new(ErrorKind::UnknownOption, format!("unknown material \"{}\"", echo(&paragraph)))
            .at(FieldPath::item("segments", 0).key(&paragraph))
            .with_value(&paragraph);
        assert_eq!(e.value.as_deref().map(|v| v.chars().count()), Some(ECHO_LIMIT + 1));
        let path = e.path.to_string();
        assert!(path.starts_with("segments[0].ééé") && path.ends_with('…'), "{path}");
        assert!(e.to_string().chars().count() < 300, "{e}");
        // The backstop: a message that quotes user text without `echo` is still cut.
        let e = Error::new(ErrorKind::Syntax, paragraph);
        assert_eq!(e.message.chars().count(), MESSAGE_LIMIT + 1);
    }

    #[test]
    fn non_finite_numbers_are_never_shown() {
        for v in [f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
            let e = Error::new(ErrorKind::NotFinite, "a length must be a finite number")
                .with_number(v)
                .with_si(v, "m");
            assert_eq!(e.to_string(), "a length must be a finite number");
            assert!(!number(v).contains("inf") && !number(v).contains("NaN"), "{}", number(v));
        }
        assert_eq!(number(0.114_300_000_000_000_01), "0.1143");
        assert_eq!(number(1e300), "1e300");
    }
}
