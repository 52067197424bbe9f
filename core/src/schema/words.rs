//! A field's place in words, for people: `segments[0].section.wall` is "Segment 1, wall". Lists
//! and conversions shown to the user name fields so; the path stays the key machines use.

use super::{Field, ATTACHMENTS, ENDS, SHAPES};
use crate::path::{FieldPath, Step};

/// The field at `path` in words: "Segment 1, wall", "Attachment 2, mass", "Left end,
/// rotational spring", "Margin". The words of each field are the editor's label, without its
/// note in brackets.
pub fn words(path: &FieldPath) -> String {
    let steps = path.steps();
    let mut parts: Vec<String> = Vec::new();
    let mut i = 0;
    while i < steps.len() {
        let last = i + 1 == steps.len();
        match (&steps[i], steps.get(i + 1)) {
            (Step::Key(list), Some(Step::Index(n))) => {
                let item = match list.as_str() {
                    "segments" => "Segment",
                    "attachments" => "Attachment",
                    "excitations" => "Excitation",
                    other => other,
                };
                parts.push(format!("{item} {}", n + 1));
                i += 2;
                continue;
            }
            (Step::Key(key), _) => match key.as_str() {
                "left" => parts.push("left end".into()),
                "right" => parts.push("right end".into()),
                // Containers the field's own words already place ("Segment 1, wall").
                "section" | "material" | "extra_mass" if !last => {}
                "submerged" if !last => {}
                "submerged" => parts.push("water around it".into()),
                "section" => parts.push("section".into()),
                "material" => parts.push("material".into()),
                "extra_mass" => parts.push("extra mass".into()),
                other => parts.push(label(other)),
            },
            (Step::Index(n), _) => parts.push(format!("item {}", n + 1)),
        }
        i += 1;
    }
    let mut text = parts.join(", ");
    if text.is_empty() {
        return "the whole scenario".to_string();
    }
    // ASCII case only: every word here starts with an ASCII letter, and the Unicode case tables
    // would weigh on the browser build.
    if text.is_char_boundary(1) {
        text[..1].make_ascii_uppercase();
    }
    text
}

/// Every field the format describes, choices' fields included.
fn every_field() -> impl Iterator<Item = &'static Field> {
    let lists: [&'static [Field]; 8] = [
        &super::SCENARIO,
        &super::SEGMENT,
        &super::PROPERTY_FIELDS,
        &super::MATERIAL_FIELDS,
        &super::EXTRA_MASS_FIELDS,
        &super::SUBMERGED_FIELDS,
        &super::ATTACHMENT_FIELDS,
        &super::EXCITATION_FIELDS,
    ];
    let choices = SHAPES.iter().chain(&ATTACHMENTS).chain(&ENDS).flat_map(|c| c.fields.iter());
    lists.into_iter().flat_map(|l| l.iter()).chain(choices)
}

/// A field's words from its label: the note in brackets dropped, and a capital that only
/// starts the label lowered ("Wall" is "wall"; "Young's modulus E" keeps its name).
fn label(key: &str) -> String {
    let found = every_field().find(|f| f.name == key && !f.label.is_empty()).map(|f| f.label);
    let Some(label) = found else { return key.replace('_', " ") };
    field_words(label, key)
}

/// A field's words from its editor's `label`, as [`words`] writes them ("Overall depth" is
/// "overall depth"); the `key` with spaces when the label is empty.
pub fn field_words(label: &str, key: &str) -> String {
    let plain = label.split(" (").next().unwrap_or(label).trim();
    let first_word = plain.split(' ').next().unwrap_or("");
    if first_word.ends_with("'s") {
        return plain.to_string();
    }
    if plain.is_empty() {
        return key.replace('_', " ");
    }
    let mut plain = plain.to_string();
    if plain.is_char_boundary(1) {
        plain[..1].make_ascii_lowercase();
    }
    plain
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_read_as_words() {
        for (path, expected) in [
            ("segments[0].section.wall", "Segment 1, wall"),
            ("segments[0].section.outer_diameter", "Segment 1, outside diameter"),
            ("segments[2].length", "Segment 3, length"),
            ("segments[0].material.youngs_modulus", "Segment 1, Young's modulus E"),
            ("segments[0].extra_mass.contents_density", "Segment 1, contents density"),
            ("segments[0].extra_mass.submerged.water_density", "Segment 1, water density"),
            ("segments[0].extra_mass.submerged", "Segment 1, water around it"),
            ("segments[1].section", "Segment 2, section"),
            ("attachments[1].mass", "Attachment 2, mass"),
            ("excitations[0].frequency", "Excitation 1, frequency"),
            ("left.rotational", "Left end, rotational spring"),
            ("margin", "Margin"),
            ("report_point", "Report point"),
            ("", "the whole scenario"),
        ] {
            let parsed = FieldPath::parse(path).unwrap_or_default();
            assert_eq!(words(&parsed), expected, "{path}");
        }
    }
}
