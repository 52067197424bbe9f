//! Reading and writing the edited scenario as JSON text (the page's `data-modebench`
//! attribute and `localStorage`).
//!
//! A short reader and writer of our own instead of the general ones: the browser build only
//! handles these small documents, and the general machinery (deserialiser visitors, a second
//! float printer and parser) weighs more than the whole editor. Numbers are read with the same
//! decimal reader the unit parser uses, except by [`read_exact`]: the page reads the solving
//! worker's answers with it, whose numbers are the engine's results written in full.

use modebench::FieldPath;
use serde_json::{Map, Number, Value};

/// Why a text did not read.
#[derive(Debug, PartialEq)]
pub enum Unread {
    /// It is not JSON: what was expected, and where (a character offset).
    Syntax(String),
    /// A field is given twice in one object, at this path. Readers differ on which of the two
    /// they keep (RFC 8259, section 4), so the scenario keeps neither and says so.
    Twice(FieldPath),
}

impl std::fmt::Display for Unread {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Unread::Syntax(text) => f.write_str(text),
            Unread::Twice(path) => write!(f, "{}", modebench::scenario::given_twice(path)),
        }
    }
}

/// Parses JSON text; the error says where (a byte offset) and what was expected, or which field
/// is given twice.
pub fn read(text: &str) -> Result<Value, Unread> {
    parse(text, modebench::units::decimal)
}

/// Parses JSON text as [`read()`] does, reading every number to the nearest `f64` (the general
/// decimal parser of Rust's standard library): a number written in its shortest form comes back
/// bit for bit.
pub fn read_exact(text: &str) -> Result<Value, String> {
    parse(text, |number| number.parse().ok()).map_err(|e| e.to_string())
}

fn parse(text: &str, decimal: fn(&str) -> Option<f64>) -> Result<Value, Unread> {
    let mut r = Reader { b: text.as_bytes(), i: 0, depth: 0, decimal, repeated: None };
    let value = r.value().and_then(|value| {
        r.blank();
        if r.i == r.b.len() {
            Ok(value)
        } else {
            Err(r.fail("the end of the text"))
        }
    });
    match (value, r.repeated) {
        (_, Some(path)) => Err(Unread::Twice(path)),
        (Ok(value), None) => Ok(value),
        (Err(e), None) => Err(Unread::Syntax(e)),
    }
}

struct Reader<'a> {
    b: &'a [u8],
    i: usize,
    depth: usize,
    /// Reads a number's text; passed in, so that a build that never calls [`read_exact`] leaves
    /// the standard library's parser out.
    decimal: fn(&str) -> Option<f64>,
    /// The path of a field given twice, once one is found; built from the inside out as the
    /// reading unwinds, so that reading costs nothing more when no field is.
    repeated: Option<FieldPath>,
}

/// Deeper nesting than this is not a scenario; refusing it keeps the reader's stack bounded.
const MAX_DEPTH: usize = 64;

impl Reader<'_> {
    fn fail(&self, expected: &str) -> String {
        format!("expected {expected} at character {}", self.i + 1)
    }

    fn blank(&mut self) {
        while self.i < self.b.len() && matches!(self.b[self.i], b' ' | b'\t' | b'\n' | b'\r') {
            self.i += 1;
        }
    }

    fn eat(&mut self, c: u8) -> bool {
        self.blank();
        if self.b.get(self.i) == Some(&c) {
            self.i += 1;
            true
        } else {
            false
        }
    }

    fn word(&mut self, word: &str, value: Value) -> Result<Value, String> {
        if self.b[self.i..].starts_with(word.as_bytes()) {
            self.i += word.len();
            Ok(value)
        } else {
            Err(self.fail("a value"))
        }
    }

    fn value(&mut self) -> Result<Value, String> {
        self.blank();
        match self.b.get(self.i) {
            Some(b'{') => self.nested(|r| r.object()),
            Some(b'[') => self.nested(|r| r.array()),
            Some(b'"') => Ok(Value::String(self.string()?)),
            Some(b't') => self.word("true", Value::Bool(true)),
            Some(b'f') => self.word("false", Value::Bool(false)),
            Some(b'n') => self.word("null", Value::Null),
            Some(b'-' | b'0'..=b'9') => self.number(),
            _ => Err(self.fail("a value")),
        }
    }

    fn nested(&mut self, inner: impl FnOnce(&mut Self) -> Result<Value, String>) -> Result<Value, String> {
        self.depth += 1;
        if self.depth > MAX_DEPTH {
            return Err(self.fail("less nesting"));
        }
        self.i += 1;
        let value = inner(self);
        self.depth -= 1;
        value
    }

    fn object(&mut self) -> Result<Value, String> {
        let mut map = Map::new();
        if self.eat(b'}') {
            return Ok(Value::Object(map));
        }
        loop {
            self.blank();
            if self.b.get(self.i) != Some(&b'"') {
                return Err(self.fail("a quoted field name"));
            }
            let key = self.string()?;
            if !self.eat(b':') {
                return Err(self.fail("':'"));
            }
            // An empty name is refused wherever it stands, so a repeated one needs no message of
            // its own.
            if !key.is_empty() && map.contains_key(&key) {
                self.repeated = Some(FieldPath::root().key(&key));
                return Err(self.fail("each field once"));
            }
            let value = self.value().inspect_err(|_| {
                if let Some(inner) = &self.repeated {
                    self.repeated = Some(FieldPath::root().key(&key).join(inner));
                }
            })?;
            map.insert(key, value);
            if self.eat(b'}') {
                return Ok(Value::Object(map));
            }
            if !self.eat(b',') {
                return Err(self.fail("',' or '}'"));
            }
        }
    }

    fn array(&mut self) -> Result<Value, String> {
        let mut items = Vec::new();
        if self.eat(b']') {
            return Ok(Value::Array(items));
        }
        loop {
            let index = items.len();
            let item = self.value().inspect_err(|_| {
                if let Some(inner) = &self.repeated {
                    self.repeated = Some(FieldPath::root().index(index).join(inner));
                }
            })?;
            items.push(item);
            if self.eat(b']') {
                return Ok(Value::Array(items));
            }
            if !self.eat(b',') {
                return Err(self.fail("',' or ']'"));
            }
        }
    }

    fn hex4(&mut self) -> Result<u32, String> {
        let digits = self.b.get(self.i..self.i + 4).ok_or_else(|| self.fail("four hex digits"))?;
        let text = std::str::from_utf8(digits).map_err(|_| self.fail("four hex digits"))?;
        let code = u32::from_str_radix(text, 16).map_err(|_| self.fail("four hex digits"))?;
        self.i += 4;
        Ok(code)
    }

    fn string(&mut self) -> Result<String, String> {
        self.i += 1; // the opening quote
        let mut out = String::new();
        loop {
            let start = self.i;
            while self.i < self.b.len() && !matches!(self.b[self.i], b'"' | b'\\') && self.b[self.i] >= 0x20 {
                self.i += 1;
            }
            // The input is a &str, and we stop only at ASCII bytes, so the slice is valid UTF-8.
            out.push_str(std::str::from_utf8(&self.b[start..self.i]).map_err(|_| self.fail("text"))?);
            match self.b.get(self.i) {
                Some(b'"') => {
                    self.i += 1;
                    return Ok(out);
                }
                Some(b'\\') => {
                    self.i += 1;
                    let escape = *self.b.get(self.i).ok_or_else(|| self.fail("an escape"))?;
                    self.i += 1;
                    match escape {
                        b'"' => out.push('"'),
                        b'\\' => out.push('\\'),
                        b'/' => out.push('/'),
                        b'b' => out.push('\u{8}'),
                        b'f' => out.push('\u{c}'),
                        b'n' => out.push('\n'),
                        b'r' => out.push('\r'),
                        b't' => out.push('\t'),
                        b'u' => {
                            let mut code = self.hex4()?;
                            if (0xD800..0xDC00).contains(&code) && self.b[self.i..].starts_with(b"\\u") {
                                self.i += 2;
                                let low = self.hex4()?;
                                code = 0x10000 + ((code - 0xD800) << 10) + (low.wrapping_sub(0xDC00) & 0x3FF);
                            }
                            out.push(char::from_u32(code).unwrap_or('\u{fffd}'));
                        }
                        _ => return Err(self.fail("a valid escape")),
                    }
                }
                _ => return Err(self.fail("a closing '\"'")),
            }
        }
    }

    fn number(&mut self) -> Result<Value, String> {
        let start = self.i;
        while self.i < self.b.len()
            && matches!(self.b[self.i], b'-' | b'+' | b'.' | b'e' | b'E' | b'0'..=b'9')
        {
            self.i += 1;
        }
        let text = std::str::from_utf8(&self.b[start..self.i]).map_err(|_| self.fail("a number"))?;
        let value = (self.decimal)(text).ok_or_else(|| self.fail("a number"))?;
        // Whole numbers written without a point or exponent stay integers, as JSON readers keep them.
        if value.fract() == 0.0 && value.abs() < 9e15 && !text.contains(['.', 'e', 'E']) {
            return Ok(Value::Number((value as i64).into()));
        }
        // JSON has no infinities; a number too large for f64 is kept as text so the scenario
        // reader can say which field it is in.
        Ok(Number::from_f64(value).map_or_else(|| Value::String(text.to_string()), Value::Number))
    }
}

/// The value as compact JSON text; numbers as Rust prints them (shortest round-trip form).
pub fn write(value: &Value) -> String {
    let mut out = String::new();
    push(&mut out, value);
    out
}

/// A JSON number as text, the same way [`write()`] writes it.
pub fn number(n: &serde_json::Number) -> String {
    match (n.as_i64(), n.as_u64(), n.as_f64()) {
        (Some(i), _, _) => i.to_string(),
        (None, Some(u), _) => u.to_string(),
        (None, None, Some(f)) if f.is_finite() => format!("{f}"),
        _ => "null".to_string(),
    }
}

fn push(out: &mut String, value: &Value) {
    match value {
        Value::Null => out.push_str("null"),
        Value::Bool(b) => out.push_str(if *b { "true" } else { "false" }),
        Value::Number(n) => out.push_str(&number(n)),
        Value::String(s) => string(out, s),
        Value::Array(items) => {
            out.push('[');
            for (i, item) in items.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                push(out, item);
            }
            out.push(']');
        }
        Value::Object(map) => {
            out.push('{');
            for (i, (key, item)) in map.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                string(out, key);
                out.push(':');
                push(out, item);
            }
            out.push('}');
        }
    }
}

fn string(out: &mut String, s: &str) {
    out.push('"');
    for c in s.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            '\n' => out.push_str("\\n"),
            '\r' => out.push_str("\\r"),
            '\t' => out.push_str("\\t"),
            c if (c as u32) < 0x20 => {
                const HEX: &[u8; 16] = b"0123456789abcdef";
                out.push_str("\\u00");
                out.push(char::from(HEX[(c as usize) >> 4]));
                out.push(char::from(HEX[(c as usize) & 15]));
            }
            c => out.push(c),
        }
    }
    out.push('"');
}

#[cfg(test)]
mod tests {
    use super::write;
    use serde_json::{json, Value};

    #[test]
    fn reads_what_the_general_reader_reads() {
        // serde_json's reader is the reference.
        for text in [
            r#"{"a": [1, -2, 3.5, 1e3, -0.25e-2, true, false, null], "b": {"c": "x\"y\\z\n\u00e9\ud83d\ude00"}}"#,
            "[]",
            "{}",
            " 12 ",
            r#""µm""#,
        ] {
            let reference = serde_json::from_str::<Value>(text).ok();
            assert!(reference.is_some(), "{text} is valid JSON");
            assert_eq!(super::read(text).ok(), reference, "{text}");
        }
        for bad in [
            "",
            "{",
            "[1,]",
            "{\"a\" 1}",
            "tru",
            "\"open",
            "1 2",
            "{\"a\":1,}",
            "[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[]]",
        ] {
            assert!(super::read(bad).is_err(), "{bad:?} must be rejected");
        }
    }

    #[test]
    fn a_field_given_twice_is_refused_with_its_path() {
        // RFC 8259, section 4: names within an object should be unique, and readers differ on
        // which value of a repeated name they keep; serde_json keeps the last, silently.
        let cases = [
            (r#"{"left": "free", "left": "pinned"}"#, "left"),
            (r#"{"segments": [{"length": 1, "length": 2}]}"#, "segments[0].length"),
            (
                r#"{"segments": [{}, {"section": {"shape": "round", "shape": "tube"}}]}"#,
                "segments[1].section.shape",
            ),
            // Escapes spell the same name: "\u006c" is "l".
            (r#"{"a": {"len": 1, "\u006cen": 2}}"#, "a.len"),
        ];
        for (text, path) in cases {
            assert!(serde_json::from_str::<Value>(text).is_ok(), "{text} is JSON to serde_json");
            match super::read(text) {
                Err(super::Unread::Twice(at)) => assert_eq!(at.to_string(), path, "{text}"),
                other => panic!("{text}: {other:?}"),
            }
        }
        let shown = super::read(cases[1].0).unwrap_err().to_string();
        assert_eq!(shown, "segments[0].length: this field is given twice; keep one of the two");
        // Names that differ, and an empty name (refused later by the scenario reader), pass.
        assert!(super::read(r#"{"a": 1, "b": {"a": 2}, "": 3, "": 4}"#).is_ok());
    }

    #[test]
    fn round_trips_through_the_json_reader() {
        // serde_json's reader is the reference: whatever we write must read back unchanged.
        let doc = json!({
            "title": "Boom \"A\" \\ line\nnext\u{1}",
            "modes": 6,
            "margin": 0.15,
            "big": 1.0e300,
            "neg": -42,
            "list": [1, 2.5, "x", null, true, false, {}, []],
            "units": "si-mm"
        });
        let text = write(&doc);
        assert_eq!(serde_json::from_str::<Value>(&text).ok(), Some(doc));
    }
}
