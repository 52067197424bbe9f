//! Field paths such as `segments[0].section.wall`: reading, writing and removing the value they
//! name in a scenario held as JSON.
//!
//! The same paths appear in core's errors (as a [`FieldPath`]) and in the editor's `data-field`
//! attributes (as its text), which is what lets an error land beside the field that caused it.

pub use modebench::path::{FieldPath, Step};
use serde_json::{Map, Value};

/// Splits a path into steps; `None` when it is malformed (an index that is not a number). The
/// core's [`FieldPath`] reads it, as it reads the paths of its errors.
pub fn parse(path: &str) -> Option<Vec<Step>> {
    FieldPath::parse(path).map(|p| p.steps().to_vec())
}

/// The value at `path`, if there is one.
pub fn get<'a>(doc: &'a Value, path: &str) -> Option<&'a Value> {
    let mut here = doc;
    for step in parse(path)? {
        here = match step {
            Step::Key(key) => here.as_object()?.get(&key)?,
            Step::Index(i) => here.as_array()?.get(i)?,
        };
    }
    Some(here)
}

/// The text a field shows for the value at `path`: a string as written, a number in Rust's
/// shortest round-trip form, nothing for anything else.
pub fn text(doc: &Value, path: &str) -> String {
    match get(doc, path) {
        Some(Value::String(s)) => s.clone(),
        Some(Value::Number(n)) => super::text::number(n),
        // A list of numbers (an excitation's orders) is shown as it may be typed: "1, 2, 6".
        Some(Value::Array(items)) if items.iter().all(Value::is_number) => {
            items.iter().filter_map(|v| v.as_number().map(super::text::number)).collect::<Vec<_>>().join(", ")
        }
        _ => String::new(),
    }
}

/// Sets the value at `path`, creating objects on the way; returns false when the path runs
/// through an array index that does not exist.
pub fn set(doc: &mut Value, path: &str, value: Value) -> bool {
    let Some(steps) = parse(path) else { return false };
    let Some((last, parents)) = steps.split_last() else {
        *doc = value;
        return true;
    };
    let mut here = doc;
    for step in parents {
        here = match step {
            Step::Key(key) => match as_object(here) {
                Some(object) => object.entry(key.clone()).or_insert_with(|| Value::Object(Map::new())),
                None => return false,
            },
            Step::Index(i) => match here.as_array_mut().and_then(|a| a.get_mut(*i)) {
                Some(item) => item,
                None => return false,
            },
        };
    }
    match last {
        Step::Key(key) => match as_object(here) {
            Some(object) => {
                object.insert(key.clone(), value);
                true
            }
            None => false,
        },
        Step::Index(i) => match here.as_array_mut().and_then(|a| a.get_mut(*i)) {
            Some(item) => {
                *item = value;
                true
            }
            None => false,
        },
    }
}

/// Removes the value at `path` (an object key or an array element) and returns it.
pub fn remove(doc: &mut Value, path: &str) -> Option<Value> {
    let steps = parse(path)?;
    let (last, parents) = steps.split_last()?;
    let mut here = doc;
    for step in parents {
        here = match step {
            Step::Key(key) => here.as_object_mut()?.get_mut(key)?,
            Step::Index(i) => here.as_array_mut()?.get_mut(*i)?,
        };
    }
    match last {
        Step::Key(key) => here.as_object_mut()?.remove(key),
        Step::Index(i) => {
            let array = here.as_array_mut()?;
            (*i < array.len()).then(|| array.remove(*i))
        }
    }
}

/// Makes `value` an object, keeping a bare end name (`"pinned"`) as its `type`, and returns it
/// (always `Some`; the option only spares the code a panic path).
fn as_object(value: &mut Value) -> Option<&mut Map<String, Value>> {
    if !value.is_object() {
        let mut map = Map::new();
        if let Value::String(name) = value {
            map.insert("type".to_string(), Value::String(name.clone()));
        }
        *value = Value::Object(map);
    }
    value.as_object_mut()
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::json;

    #[test]
    fn paths_split_into_keys_and_indices() {
        assert_eq!(
            parse("segments[0].section.wall"),
            Some(vec![
                Step::Key("segments".into()),
                Step::Index(0),
                Step::Key("section".into()),
                Step::Key("wall".into())
            ])
        );
        assert_eq!(parse("a[x]"), None);
        assert_eq!(parse("a[1]b"), None);
    }

    #[test]
    fn set_get_and_remove_round_trip() {
        let mut doc = json!({"left": "pinned", "segments": [{"length": "1 m"}]});
        assert!(set(&mut doc, "segments[0].section.wall", json!("4 mm")));
        assert_eq!(text(&doc, "segments[0].section.wall"), "4 mm");
        assert!(!set(&mut doc, "segments[3].length", json!("1 m")));
        assert!(set(&mut doc, "left.translational", json!("rigid")));
        assert_eq!(doc["left"], json!({"type": "pinned", "translational": "rigid"}));
        assert_eq!(
            remove(&mut doc, "segments[0]"),
            Some(json!({"length": "1 m", "section": {"wall": "4 mm"}}))
        );
        assert_eq!(remove(&mut doc, "segments[0]"), None);
        set(&mut doc, "modes", json!(4));
        assert_eq!(text(&doc, "modes"), "4");
    }
}
