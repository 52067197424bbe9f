//! Scenario text read into JSON, refusing a field given twice: a reader would silently keep
//! one of the two values, and the user could not tell which.

use crate::error::{Error, ErrorKind, Result};
use crate::path::FieldPath;
use serde::de::{DeserializeSeed, Deserializer, Error as _, MapAccess, SeqAccess, Visitor};
use serde_json::{Map, Number, Value};
use std::cell::RefCell;
use std::fmt;

/// Parses scenario text; an error names the path of a field given twice, or what is wrong
/// with the JSON.
pub(crate) fn read(text: &str) -> Result<Value> {
    let repeated = RefCell::new(None);
    let mut de = serde_json::Deserializer::from_str(text);
    let value = value(&mut de, &repeated).and_then(|v| de.end().map(|()| v));
    match (value, repeated.into_inner()) {
        (_, Some(path)) => Err(given_twice(&path)),
        (Ok(v), None) => Ok(v),
        (Err(e), None) => Err(Error::new(ErrorKind::Syntax, format!("the scenario is not valid JSON: {e}"))),
    }
}

/// The error for a field given twice at `path`.
pub fn given_twice(path: &FieldPath) -> Error {
    Error::new(ErrorKind::Conflict, "this field is given twice; keep one of the two").at(path)
}

/// Reads any JSON value from `deserializer`; the path of the first field given twice is left in
/// `repeated` (and the reading stops with an error).
pub(crate) fn value<'de, D: Deserializer<'de>>(
    deserializer: D,
    repeated: &RefCell<Option<FieldPath>>,
) -> std::result::Result<Value, D::Error> {
    Checked { path: FieldPath::root(), repeated }.deserialize(deserializer)
}

/// A value being read at `path`.
struct Checked<'r> {
    path: FieldPath,
    repeated: &'r RefCell<Option<FieldPath>>,
}

impl<'de> DeserializeSeed<'de> for Checked<'_> {
    type Value = Value;

    fn deserialize<D: Deserializer<'de>>(self, deserializer: D) -> std::result::Result<Value, D::Error> {
        deserializer.deserialize_any(self)
    }
}

impl<'de> Visitor<'de> for Checked<'_> {
    type Value = Value;

    fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str("a JSON value")
    }

    fn visit_bool<E>(self, v: bool) -> std::result::Result<Value, E> {
        Ok(Value::Bool(v))
    }

    fn visit_i64<E>(self, v: i64) -> std::result::Result<Value, E> {
        Ok(Value::Number(v.into()))
    }

    fn visit_u64<E>(self, v: u64) -> std::result::Result<Value, E> {
        Ok(Value::Number(v.into()))
    }

    fn visit_f64<E: serde::de::Error>(self, v: f64) -> std::result::Result<Value, E> {
        Number::from_f64(v).map(Value::Number).ok_or_else(|| E::custom("a number must be finite"))
    }

    fn visit_str<E>(self, v: &str) -> std::result::Result<Value, E> {
        Ok(Value::String(v.to_string()))
    }

    fn visit_string<E>(self, v: String) -> std::result::Result<Value, E> {
        Ok(Value::String(v))
    }

    fn visit_unit<E>(self) -> std::result::Result<Value, E> {
        Ok(Value::Null)
    }

    fn visit_none<E>(self) -> std::result::Result<Value, E> {
        Ok(Value::Null)
    }

    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> std::result::Result<Value, A::Error> {
        let mut items = Vec::new();
        loop {
            let path = self.path.index(items.len());
            match seq.next_element_seed(Checked { path, repeated: self.repeated })? {
                Some(item) => items.push(item),
                None => return Ok(Value::Array(items)),
            }
        }
    }

    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> std::result::Result<Value, A::Error> {
        let mut fields = Map::new();
        while let Some(key) = map.next_key::<String>()? {
            let path = self.path.key(&key);
            // No field has an empty name, and the reader refuses one wherever it stands, so
            // a repeated empty name needs no message of its own.
            if !key.is_empty() && fields.contains_key(&key) {
                *self.repeated.borrow_mut() = Some(path);
                return Err(A::Error::custom("a field is given twice"));
            }
            let item = map.next_value_seed(Checked { path, repeated: self.repeated })?;
            fields.insert(key, item);
        }
        Ok(Value::Object(fields))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_field_given_twice_is_refused_with_its_path() {
        // RFC 8259 §4: names within an object SHOULD be unique, and readers differ on which
        // value of a repeated name they keep; the scenario reader keeps neither.
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
            let e = read(text).expect_err(text);
            assert_eq!((e.kind, e.path.to_string().as_str()), (ErrorKind::Conflict, path), "{text}: {e}");
            assert!(e.to_string().ends_with("this field is given twice; keep one of the two"), "{e}");
        }
    }

    #[test]
    fn text_without_repeats_reads_as_serde_json_reads_it() {
        let text =
            r#"{"a": [1, -2, 3.5, "x\n", true, null, {"b": {}}], "c": 1e300, "d": 18446744073709551615}"#;
        let reference: Value = serde_json::from_str(text).unwrap();
        assert_eq!(read(text).unwrap(), reference);
        assert!(read(r#"{"": 1, "": 2}"#).is_ok(), "an empty name is refused by the scenario reader");
        for bad in ["", "{", "[1,]", "{\"a\" 1}", "1 2"] {
            let e = read(bad).expect_err(bad);
            assert_eq!(e.kind, ErrorKind::Syntax, "{bad}: {e}");
            assert!(e.message.starts_with("the scenario is not valid JSON"), "{e}");
        }
    }
}
