//! The field tables of `docs/scenario-format.md`, written from the schema. The document holds
//! each table between `<!-- schema: NAME -->` and `<!-- /schema -->`; a test checks that they
//! are current (`MODEBENCH_BLESS=1 cargo test -p modebench schema` rewrites them).

use super::{Choice, Field, Form, Range};

/// Every generated table: its name in the document's markers, and its Markdown.
pub fn tables() -> Vec<(&'static str, String)> {
    vec![
        ("scenario", fields(&super::SCENARIO)),
        ("ends", choices(&super::ENDS, "end")),
        ("segment", fields(&super::SEGMENT)),
        ("properties", fields(&super::PROPERTY_FIELDS)),
        ("shapes", choices(&super::SHAPES, "shape")),
        ("material", fields(&super::MATERIAL_FIELDS)),
        ("extra-mass", fields(&super::EXTRA_MASS_FIELDS)),
        ("submerged", fields(&super::SUBMERGED_FIELDS)),
        ("attachment", fields(&super::ATTACHMENT_FIELDS)),
        ("attachments", choices(&super::ATTACHMENTS, "type")),
        ("excitation", fields(&super::EXCITATION_FIELDS)),
        ("axial", fields(&super::AXIAL_FIELDS)),
        ("tolerance", fields(&super::TOLERANCE_FIELDS)),
        ("measured", fields(&super::MEASURED_FIELDS)),
        ("calibrate", fields(&super::CALIBRATE_FIELDS)),
        ("resize", fields(&super::RESIZE_FIELDS)),
        ("material-record", fields(&super::MATERIAL_RECORD_FIELDS)),
    ]
}

/// A table of fields: key, meaning, kind of value, what is allowed, and the default.
fn fields(list: &[Field]) -> String {
    let mut out =
        String::from("| field | meaning | value | allowed | default |\n| --- | --- | --- | --- | --- |\n");
    for f in list {
        let value = match f.form {
            // A range's ends take the kind of the input they belong to.
            Form::Quantity if f.range == Range::Any => "the input's kind of quantity".to_string(),
            Form::Quantity => f.kind.describe().to_string(),
            Form::Count => "a whole number".to_string(),
            Form::Percent => "a ratio or a percentage".to_string(),
            Form::Text => "a text".to_string(),
            Form::Name => "a name".to_string(),
            Form::Part => "below".to_string(),
        };
        let allowed = match f.range {
            Range::Any => String::new(),
            Range::Whole(lo, hi) => format!("{lo} to {hi}"),
            _ => f.allowed(),
        };
        let default = if f.optional { f.default } else { "required" };
        out.push_str(&format!("| `{}` | {} | {value} | {allowed} | {default} |\n", f.name, f.help));
    }
    out
}

/// A table of choices: the name in the scenario, what it is, and its own fields.
fn choices(list: &[Choice], key: &str) -> String {
    let mut out = format!("| `{key}` | what it is | fields |\n| --- | --- | --- |\n");
    for c in list {
        let fields: Vec<String> = c
            .fields
            .iter()
            .map(|f| {
                let allowed = f.allowed();
                let mut text = format!("`{}`", f.name);
                if f.form == Form::Quantity {
                    text.push_str(&format!(" ({}, {allowed}", f.kind.describe()));
                    text.push_str(if f.optional { ", optional)" } else { ")" });
                } else if f.optional {
                    text.push_str(&format!(" ({}, default {})", f.help, f.default));
                }
                text
            })
            .collect();
        let fields = if fields.is_empty() { "none".to_string() } else { fields.join("; ") };
        out.push_str(&format!("| `{}` | {} | {fields} |\n", c.id, c.help));
    }
    out
}

/// The document with every generated table replaced by its current form; `Err` names a table
/// whose markers are missing.
pub fn update(document: &str) -> Result<String, String> {
    let mut out = document.to_string();
    for (name, table) in tables() {
        let open = format!("<!-- schema: {name} -->\n");
        let close = "<!-- /schema -->";
        let start = out.find(&open).ok_or_else(|| format!("no \"{}\" marker", open.trim()))? + open.len();
        let end = start + out[start..].find(close).ok_or_else(|| format!("no end marker after {name}"))?;
        out.replace_range(start..end, &table);
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The format's documentation shows the tables this schema writes; a change to the table is
    /// a change to the document, made by `MODEBENCH_BLESS=1`.
    #[test]
    fn the_documented_tables_are_current() {
        let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../docs/scenario-format.md");
        let document = std::fs::read_to_string(&path).unwrap_or_default();
        let current = match update(&document) {
            Ok(current) => current,
            Err(e) => panic!("{}: {e}", path.display()),
        };
        if std::env::var_os("MODEBENCH_BLESS").is_some() {
            std::fs::write(&path, &current).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        } else {
            assert!(
                current == document,
                "docs/scenario-format.md is not current with the schema; run \
                 MODEBENCH_BLESS=1 cargo test -p modebench schema and review the diff"
            );
        }
    }

    #[test]
    fn every_field_has_words() {
        let lists: [&[Field]; 14] = [
            &super::super::AXIAL_FIELDS,
            &super::super::MATERIAL_RECORD_FIELDS,
            &super::super::SCENARIO,
            &super::super::SEGMENT,
            &super::super::PROPERTY_FIELDS,
            &super::super::MATERIAL_FIELDS,
            &super::super::EXTRA_MASS_FIELDS,
            &super::super::SUBMERGED_FIELDS,
            &super::super::ATTACHMENT_FIELDS,
            &super::super::EXCITATION_FIELDS,
            &super::super::TOLERANCE_FIELDS,
            &super::super::MEASURED_FIELDS,
            &super::super::CALIBRATE_FIELDS,
            &super::super::RESIZE_FIELDS,
        ];
        let choices =
            super::super::SHAPES.iter().chain(&super::super::ATTACHMENTS).chain(&super::super::ENDS);
        for f in lists.iter().flat_map(|l| l.iter()).chain(choices.flat_map(|c| c.fields)) {
            assert!(!f.what.is_empty() && !f.help.is_empty(), "{}", f.name);
            assert!(!f.optional || !f.default.is_empty(), "{} is optional without a default", f.name);
        }
    }
}
