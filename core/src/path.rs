//! Where in a scenario a value stands: a path of object keys and list indices, written
//! `segments[0].section.wall`. Errors carry one, the report's conversions name one, and the
//! editor uses the same text for its fields, which is what lets an error land beside the field
//! that caused it. A path is built step by step and written out once; text is read back only at
//! the edge, where the editor hands one over.

use std::fmt;

/// One step of a path: an object key or a list index.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub enum Step {
    /// A key of an object.
    Key(String),
    /// An index into a list.
    Index(usize),
}

/// A place in a scenario, from its root: `segments[0].section.wall`; empty for the whole.
#[derive(Clone, Debug, Default, PartialEq, Eq, Hash)]
pub struct FieldPath(Vec<Step>);

impl FieldPath {
    /// The whole scenario.
    pub fn root() -> FieldPath {
        FieldPath(Vec::new())
    }

    /// An item of a top-level list: `segments[2]`.
    #[inline(never)]
    pub fn item(list: &str, index: usize) -> FieldPath {
        FieldPath::root().key(list).index(index)
    }

    /// This path followed by an object key. A key the user typed is cut like any echo of user
    /// text, so that a pasted paragraph cannot swamp a message.
    #[must_use]
    #[inline(never)]
    pub fn key(&self, key: &str) -> FieldPath {
        let key =
            if key.chars().count() > crate::error::ECHO_LIMIT { crate::error::echo(key) } else { key.into() };
        self.then(Step::Key(key))
    }

    /// This path followed by a list index.
    #[must_use]
    pub fn index(&self, index: usize) -> FieldPath {
        self.then(Step::Index(index))
    }

    // Not inlined, nor are `item`, `key` and `join`: paths are built at a hundred places, none
    // of them in a solver's inner loop, and the solver's engine, built for speed, would otherwise
    // carry a copy of each at every one.
    #[inline(never)]
    fn then(&self, step: Step) -> FieldPath {
        // Room for the new step from the start: a clone has none, and the push would move it.
        let mut steps = Vec::with_capacity(self.0.len() + 1);
        steps.extend(self.0.iter().cloned());
        steps.push(step);
        FieldPath(steps)
    }

    /// This path followed by another (`segments[0]` then `section.wall`).
    #[must_use]
    #[inline(never)]
    pub fn join(&self, inner: &FieldPath) -> FieldPath {
        FieldPath(self.0.iter().chain(&inner.0).cloned().collect())
    }

    /// The steps, from the root.
    pub fn steps(&self) -> &[Step] {
        &self.0
    }

    /// Whether this is the whole scenario.
    pub fn is_empty(&self) -> bool {
        self.0.is_empty()
    }

    /// The path one step up (`segments[0].section` → `segments[0]` → `segments`); `None` at the
    /// root.
    pub fn parent(&self) -> Option<FieldPath> {
        let (_, parent) = self.0.split_last()?;
        Some(FieldPath(parent.to_vec()))
    }

    /// The last key, the field's own name (`wall`), when the path ends with one.
    pub fn last_key(&self) -> Option<&str> {
        match self.0.last()? {
            Step::Key(key) => Some(key),
            Step::Index(_) => None,
        }
    }

    /// Whether this path lies strictly inside `outer` (`segments[0].length` inside `segments[0]`).
    pub fn is_inside(&self, outer: &FieldPath) -> bool {
        self.0.len() > outer.0.len() && self.0.starts_with(&outer.0)
    }

    /// Whether the path is written `text`, compared as it is written out.
    pub fn reads_as(&self, text: &str) -> bool {
        struct Rest<'a>(&'a str);
        impl fmt::Write for Rest<'_> {
            fn write_str(&mut self, s: &str) -> fmt::Result {
                self.0 = self.0.strip_prefix(s).ok_or(fmt::Error)?;
                Ok(())
            }
        }
        let mut rest = Rest(text);
        fmt::write(&mut rest, format_args!("{self}")).is_ok() && rest.0.is_empty()
    }

    /// Reads a path as written (`segments[0].section.wall`); `None` when it is malformed (an
    /// index that is not a number, text after a closing bracket).
    pub fn parse(text: &str) -> Option<FieldPath> {
        let mut steps = Vec::new();
        if text.is_empty() {
            return Some(FieldPath(steps));
        }
        for part in text.split('.') {
            let (name, mut rest) = match part.find('[') {
                Some(i) => (&part[..i], &part[i..]),
                None => (part, ""),
            };
            if !name.is_empty() {
                steps.push(Step::Key(name.to_string()));
            }
            while let Some(inner) = rest.strip_prefix('[') {
                let close = inner.find(']')?;
                steps.push(Step::Index(inner[..close].parse().ok()?));
                rest = &inner[close + 1..];
            }
            if !rest.is_empty() {
                return None;
            }
        }
        Some(FieldPath(steps))
    }
}

impl fmt::Display for FieldPath {
    /// `segments[0].section.wall`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, step) in self.0.iter().enumerate() {
            match step {
                Step::Key(key) if i == 0 => f.write_str(key)?,
                Step::Key(key) => write!(f, ".{key}")?,
                Step::Index(index) => write!(f, "[{index}]")?,
            }
        }
        Ok(())
    }
}

/// Path text, read where it is written so: `"position"` is the field called position,
/// `"segments[2]"` the third segment; text that is not a path is taken as one key.
impl From<&str> for FieldPath {
    fn from(text: &str) -> FieldPath {
        FieldPath::parse(text).unwrap_or_else(|| FieldPath::root().key(text))
    }
}

impl From<String> for FieldPath {
    fn from(text: String) -> FieldPath {
        FieldPath::from(text.as_str())
    }
}

impl From<&FieldPath> for FieldPath {
    fn from(path: &FieldPath) -> FieldPath {
        path.clone()
    }
}

impl PartialEq<str> for FieldPath {
    fn eq(&self, text: &str) -> bool {
        self.reads_as(text)
    }
}

impl PartialEq<&str> for FieldPath {
    fn eq(&self, text: &&str) -> bool {
        self.reads_as(text)
    }
}

/// Serialised as its text, so an error's JSON reads `"path": "segments[0].length"`.
impl serde::Serialize for FieldPath {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.collect_str(self)
    }
}

impl<'de> serde::Deserialize<'de> for FieldPath {
    fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<FieldPath, D::Error> {
        let text = String::deserialize(deserializer)?;
        FieldPath::parse(&text).ok_or_else(|| serde::de::Error::custom(format!("not a field path: {text}")))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_are_written_and_read_back_as_the_scenario_names_them() {
        let p = FieldPath::root().key("segments").index(0).key("section").key("wall");
        assert_eq!(p.to_string(), "segments[0].section.wall");
        assert_eq!(FieldPath::parse("segments[0].section.wall"), Some(p.clone()));
        assert_eq!(FieldPath::parse("a[x]"), None);
        assert_eq!(FieldPath::parse("a[1]b"), None);
        assert_eq!(p.last_key(), Some("wall"));
        let segment = FieldPath::root().key("segments").index(0);
        assert!(p.is_inside(&segment) && !segment.is_inside(&p) && !p.is_inside(&p));
        assert_eq!(p.parent().and_then(|s| s.parent()), Some(segment.clone()));
        assert_eq!(segment.join(&FieldPath::from("length")).to_string(), "segments[0].length");
        assert_eq!(serde_json::to_string(&p).ok().as_deref(), Some("\"segments[0].section.wall\""));
    }
}
