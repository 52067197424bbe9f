//! What the editor offers: unit systems, theories, end supports, section shapes and attachment
//! types, each with its fields, the kind of quantity each field takes and the words shown for it.
//!
//! The names on the left (`"tube"`, `"sprung-mass"`) are the scenario format's; the words are the
//! calculator's own. The JS API returns this catalogue so that pages can build on it.

use modebench::units::{Kind, UnitSystem};

/// One input field of a shape or attachment.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize)]
pub struct FieldSpec {
    /// The key in the scenario, as `"outer_diameter"`.
    pub name: &'static str,
    /// The words shown beside the input.
    pub label: &'static str,
    /// The kind of quantity the field takes.
    pub kind: Kind,
    /// Whether it may be left empty (core then uses its default).
    pub optional: bool,
    /// Whether `"rigid"` is accepted.
    pub rigid: bool,
}

const fn field(name: &'static str, label: &'static str, kind: Kind) -> FieldSpec {
    FieldSpec { name, label, kind, optional: false, rigid: false }
}

const fn optional(name: &'static str, label: &'static str, kind: Kind) -> FieldSpec {
    FieldSpec { name, label, kind, optional: true, rigid: false }
}

const fn spring(name: &'static str, label: &'static str, kind: Kind) -> FieldSpec {
    FieldSpec { name, label, kind, optional: false, rigid: true }
}

/// A named choice with the fields it brings.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize)]
pub struct Choice {
    /// The scenario's name for it.
    pub id: &'static str,
    /// The words shown.
    pub name: &'static str,
    /// Its fields, in the order shown.
    pub fields: &'static [FieldSpec],
}

/// The section shapes, with their dimensions.
pub static SHAPES: [Choice; 6] = [
    Choice {
        id: "tube",
        name: "Round tube or pipe",
        fields: &[
            field("outer_diameter", "Outside diameter", Kind::Length),
            field("wall", "Wall", Kind::Length),
        ],
    },
    Choice { id: "round", name: "Round bar", fields: &[field("diameter", "Diameter", Kind::Length)] },
    Choice {
        id: "rectangle",
        name: "Flat or square bar",
        fields: &[
            field("width", "Width (across)", Kind::Length),
            field("depth", "Depth (in the plane of vibration)", Kind::Length),
        ],
    },
    Choice {
        id: "rectangular-tube",
        name: "Box section",
        fields: &[
            field("width", "Width (across)", Kind::Length),
            field("depth", "Depth (in the plane of vibration)", Kind::Length),
            field("wall", "Wall", Kind::Length),
        ],
    },
    Choice {
        id: "i-beam",
        name: "I-section",
        fields: &[
            field("depth", "Overall depth", Kind::Length),
            field("flange_width", "Flange width", Kind::Length),
            field("flange_thickness", "Flange thickness", Kind::Length),
            field("web_thickness", "Web thickness", Kind::Length),
        ],
    },
    Choice {
        id: "custom",
        name: "Other (area and second moment)",
        fields: &[
            field("area", "Area", Kind::Area),
            field("second_moment", "Second moment of area", Kind::SecondMoment),
            optional("depth", "Depth (in the plane of vibration)", Kind::Length),
            optional("shear_coefficient", "Shear coefficient κ", Kind::Ratio),
        ],
    },
];

/// The attachment types, with their fields after the position.
pub static ATTACHMENTS: [Choice; 5] = [
    Choice {
        id: "mass",
        name: "Mass",
        fields: &[
            field("mass", "Mass", Kind::Mass),
            optional("rotary_inertia", "Rotary inertia", Kind::RotaryInertia),
        ],
    },
    Choice {
        id: "sprung-mass",
        name: "Mass on a spring",
        fields: &[field("mass", "Mass", Kind::Mass), field("stiffness", "Spring stiffness", Kind::Stiffness)],
    },
    Choice {
        id: "spring",
        name: "Spring to ground",
        fields: &[spring("stiffness", "Stiffness", Kind::Stiffness)],
    },
    Choice {
        id: "rotational-spring",
        name: "Rotational spring to ground",
        fields: &[spring("stiffness", "Stiffness", Kind::RotationalStiffness)],
    },
    Choice { id: "support", name: "Intermediate support", fields: &[] },
];

/// The end supports.
pub static ENDS: [Choice; 5] = [
    Choice { id: "clamped", name: "Clamped", fields: &[] },
    Choice { id: "pinned", name: "Pinned", fields: &[] },
    Choice { id: "free", name: "Free", fields: &[] },
    Choice { id: "guided", name: "Guided (slides, no turn)", fields: &[] },
    Choice {
        id: "elastic",
        name: "On springs",
        fields: &[
            FieldSpec { optional: true, ..spring("translational", "Translational spring", Kind::Stiffness) },
            FieldSpec {
                optional: true,
                ..spring("rotational", "Rotational spring", Kind::RotationalStiffness)
            },
        ],
    },
];

/// The unit systems with the calculator's words for them.
pub static SYSTEMS: [(UnitSystem, &str, &str); 4] = [
    (UnitSystem::Si, "si", "SI — m, kg, N"),
    (UnitSystem::SiMm, "si-mm", "SI — mm, kg, N"),
    (UnitSystem::UsInch, "us-inch", "US — in, lb, lbf"),
    (UnitSystem::UsFoot, "us-foot", "US — ft, lb, lbf"),
];

/// The beam theories with the calculator's words for them.
pub static THEORIES: [(&str, &str); 2] =
    [("euler-bernoulli", "Euler–Bernoulli (slender)"), ("timoshenko", "Timoshenko (deep beams)")];

/// The choice with this id in a list.
pub fn find(list: &'static [Choice], id: &str) -> Option<&'static Choice> {
    list.iter().find(|c| c.id == id)
}

/// The choice a scenario object names under `key` (an attachment's `type`, a section's `shape`).
pub(crate) fn chosen(
    list: &'static [Choice],
    object: Option<&serde_json::Value>,
    key: &str,
) -> Option<&'static Choice> {
    object.and_then(|v| v.get(key)).and_then(serde_json::Value::as_str).and_then(|id| find(list, id))
}

/// Fields of a segment given by its properties.
pub static PROPERTY_FIELDS: [FieldSpec; 4] = [
    field("flexural_rigidity", "Bending stiffness EI", Kind::FlexuralRigidity),
    field("mass_per_length", "Mass per length", Kind::MassPerLength),
    optional("shear_rigidity", "Shear rigidity κGA (deep beams)", Kind::ShearRigidity),
    optional(
        "rotary_inertia_per_length",
        "Rotary inertia per length (deep beams)",
        Kind::RotaryInertiaPerLength,
    ),
];

/// Fields of a custom material.
pub static MATERIAL_FIELDS: [FieldSpec; 4] = [
    field("youngs_modulus", "Young's modulus E", Kind::Pressure),
    field("density", "Density", Kind::Density),
    optional("poisson", "Poisson's ratio", Kind::Ratio),
    optional("shear_modulus", "Shear modulus G", Kind::Pressure),
];

/// Fields of the extra mass carried by a segment given by section.
pub static EXTRA_MASS_FIELDS: [FieldSpec; 2] = [
    optional("contents_density", "Contents density (fills the bore)", Kind::Density),
    optional("lining", "Lining, insulation, cables (per length)", Kind::MassPerLength),
];

/// Fields of the water around a submerged segment.
pub static SUBMERGED_FIELDS: [FieldSpec; 2] = [
    optional("water_density", "Water density (seawater if empty)", Kind::Density),
    optional("added_mass_coefficient", "Added-mass coefficient (1 if empty)", Kind::Ratio),
];

/// Keys that may be left empty wherever they appear: emptying them removes them, so core uses
/// its default.
const OPTIONAL_KEYS: [&str; 16] = [
    "title",
    "label",
    "rotary_inertia",
    "margin",
    "report_point",
    "elements",
    "harmonics",
    "translational",
    "rotational",
    "poisson",
    "shear_modulus",
    "shear_coefficient",
    "contents_density",
    "lining",
    "water_density",
    "added_mass_coefficient",
];

/// Whether the field named by its last key may be left empty. A section's `depth` is optional
/// only for the custom shape; `shear_rigidity` and `rotary_inertia_per_length` are optional.
pub(crate) fn is_optional(key: &str, parent_type: Option<&str>) -> bool {
    match key {
        "depth" => parent_type == Some("custom"),
        "shear_rigidity" | "rotary_inertia_per_length" => true,
        _ => OPTIONAL_KEYS.contains(&key),
    }
}

/// Fields that hold whole numbers, with their allowed range.
pub(crate) fn whole_number(key: &str) -> Option<(usize, usize)> {
    match key {
        "modes" => Some((1, modebench::analysis::MAX_MODES)),
        "harmonics" => Some((1, 50)),
        _ => None,
    }
}
