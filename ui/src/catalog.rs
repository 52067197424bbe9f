//! What the editor offers: unit systems, theories, end supports, section shapes and attachment
//! types, each with its fields, the kind of quantity each field takes and the words shown for it.
//!
//! All of it is the core's schema (`modebench::schema`), the one description of the scenario
//! format; this module only adds what the editor asks of it. The JS API returns this catalogue
//! so that pages can build on it.

use modebench::schema::{self, Field, Range};
pub use modebench::schema::{
    find, Choice, Field as FieldSpec, Form, ATTACHMENTS, ENDS, EXTRA_MASS_FIELDS, MATERIAL_FIELDS,
    PROPERTY_FIELDS, SHAPES, SUBMERGED_FIELDS, THEORIES, UNIT_SYSTEMS,
};
pub use modebench::schema::{AXIAL_FIELDS, MATERIAL_RECORD_FIELDS};

/// The choice a scenario object names under `key` (an attachment's `type`, a section's `shape`).
pub(crate) fn chosen(
    list: &'static [Choice],
    object: Option<&serde_json::Value>,
    key: &str,
) -> Option<&'static Choice> {
    object.and_then(|v| v.get(key)).and_then(serde_json::Value::as_str).and_then(|id| find(list, id))
}

/// Every field the schema describes, choices' fields included.
fn every_field() -> impl Iterator<Item = &'static Field> {
    let lists: [&'static [Field]; 15] = [
        &schema::AXIAL_FIELDS,
        &schema::MATERIAL_RECORD_FIELDS,
        &schema::SCENARIO,
        &schema::SEGMENT,
        &PROPERTY_FIELDS,
        &MATERIAL_FIELDS,
        &EXTRA_MASS_FIELDS,
        &SUBMERGED_FIELDS,
        &schema::ATTACHMENT_FIELDS,
        &schema::EXCITATION_FIELDS,
        &schema::TOLERANCE_FIELDS,
        &schema::MEASURED_FIELDS,
        &schema::CALIBRATE_FIELDS,
        &schema::RESIZE_FIELDS,
        &[],
    ];
    let choices = SHAPES.iter().chain(&ATTACHMENTS).chain(&ENDS).flat_map(|c| c.fields.iter());
    lists.into_iter().flat_map(|l| l.iter()).chain(choices)
}

/// Whether the field named by its last key may be left empty (emptying it removes it, so the
/// core uses its default). Within a shape or type (`parent_type`) its own field decides: a
/// section's `depth` is optional only for the custom shape.
pub(crate) fn is_optional(key: &str, parent_type: Option<&str>) -> bool {
    let own = parent_type
        .and_then(|t| [&SHAPES[..], &ATTACHMENTS[..], &ENDS[..]].into_iter().find_map(|list| find(list, t)))
        .and_then(|c| c.fields.iter().find(|f| f.name == key));
    match own {
        Some(field) => field.optional,
        None => every_field().any(|f| f.name == key && f.optional),
    }
}

/// Fields that hold whole numbers, with their allowed range.
pub(crate) fn whole_number(key: &str) -> Option<(usize, usize)> {
    every_field().find(|f| f.name == key && f.form == Form::Count).and_then(|f| match f.range {
        Range::Whole(low, high) => Some((low, high)),
        _ => None,
    })
}
