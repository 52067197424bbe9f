//! The scenario: a beam described the way an engineer writes it down, as JSON with unit strings.
//!
//! These types mirror the file format documented in `docs/scenario-format.md`. They hold what
//! the user wrote, unchecked; [`Scenario::to_model`] reads every value with its unit, checks it,
//! and returns the validated [`Model`](crate::Model) together with an echo of the inputs in SI.

mod read;

pub use read::{Inputs, SegmentEcho, DEFAULT_MARGIN};

use crate::error::{Error, ErrorKind, Result};
use crate::extra_mass::ExtraMassInput;
use crate::material::MaterialInput;
use crate::model::Theory;
use crate::section::SectionInput;
use crate::units::{Quantity, UnitSystem};

/// A whole scenario as written.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Scenario {
    /// A title for the results.
    #[serde(default)]
    pub title: String,
    /// Unit system for showing results and echoing inputs.
    #[serde(default)]
    pub units: UnitSystem,
    /// Beam theory; Euler–Bernoulli unless set.
    #[serde(default)]
    pub theory: Theory,
    /// Elastic modes to compute, 1 to 20.
    #[serde(default = "default_modes")]
    pub modes: usize,
    /// Finite elements in all; enough for about 1e-4 on the last mode when omitted.
    #[serde(default)]
    pub elements: Option<usize>,
    /// Point for mode 1's equivalent mass and stiffness; the point of largest deflection when
    /// omitted.
    #[serde(default)]
    pub report_point: Option<Quantity>,
    /// Support at x = 0.
    #[serde(deserialize_with = "end_or_name")]
    pub left: EndInput,
    /// Support at the far end.
    #[serde(deserialize_with = "end_or_name")]
    pub right: EndInput,
    /// Uniform segments from left to right.
    pub segments: Vec<SegmentInput>,
    /// Masses, springs, supports and sprung masses along the beam.
    #[serde(default)]
    pub attachments: Vec<AttachmentInput>,
    /// Frequencies the beam will be driven at (running speed, line frequency, blade pass).
    #[serde(default)]
    pub excitations: Vec<ExcitationInput>,
    /// Separation margin wanted between natural and excitation frequencies, as a ratio (0.2 or
    /// "20 %"); 0.2 when omitted.
    #[serde(default)]
    pub margin: Option<Quantity>,
}

fn default_modes() -> usize {
    6
}

/// How an end is held, as written: `"clamped"` or `{"type": "elastic", …}`.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(tag = "type", rename_all = "kebab-case", deny_unknown_fields)]
#[non_exhaustive]
pub enum EndInput {
    /// No restraint.
    Free,
    /// Deflection held.
    Pinned,
    /// Deflection and rotation held.
    Clamped,
    /// Rotation held, free to slide.
    Guided,
    /// Grounded springs; each 0 (absent) up to `"rigid"`.
    Elastic {
        /// Translational stiffness (N/m, or `"rigid"`); 0 when omitted.
        #[serde(default)]
        translational: Option<Quantity>,
        /// Rotational stiffness (N·m/rad, or `"rigid"`); 0 when omitted.
        #[serde(default)]
        rotational: Option<Quantity>,
    },
}

/// Accepts an end as a bare name (`"pinned"`) or as an object with a `type`.
fn end_or_name<'de, D: serde::Deserializer<'de>>(deserializer: D) -> std::result::Result<EndInput, D::Error> {
    use serde::de::Error as _;
    let value = <serde_json::Value as serde::Deserialize>::deserialize(deserializer)?;
    let value = match value {
        serde_json::Value::String(name) => serde_json::json!({ "type": name }),
        other => other,
    };
    serde_json::from_value(value).map_err(|e| D::Error::custom(end_message(&e.to_string())))
}

fn end_message(serde_message: &str) -> String {
    if serde_message.contains("unknown variant") {
        "an end is one of \"free\", \"pinned\", \"clamped\", \"guided\" or an elastic end \
         {\"type\": \"elastic\", \"translational\": …, \"rotational\": …}"
            .to_string()
    } else {
        serde_message.to_string()
    }
}

/// One uniform segment, given either by its properties or by a section and a material.
#[derive(Clone, Debug, Default, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SegmentInput {
    /// Length.
    pub length: Option<Quantity>,
    /// Bending stiffness EI (with `mass_per_length`, instead of a section and material).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub flexural_rigidity: Option<Quantity>,
    /// Mass per length, structural plus non-structural.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mass_per_length: Option<Quantity>,
    /// Shear rigidity κGA, for the Timoshenko theory.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub shear_rigidity: Option<Quantity>,
    /// Rotary inertia per length ρI, for the Timoshenko theory.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rotary_inertia_per_length: Option<Quantity>,
    /// Cross-section (with `material`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub section: Option<SectionInput>,
    /// Material: a preset id or custom properties (with `section`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub material: Option<MaterialInput>,
    /// Contents, lining and surrounding water (with `section`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub extra_mass: Option<ExtraMassInput>,
}

/// Something attached to the beam, as written.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(tag = "type", rename_all = "kebab-case", deny_unknown_fields)]
#[non_exhaustive]
pub enum AttachmentInput {
    /// A rigid body fixed to the beam.
    Mass {
        /// Distance from the left end.
        position: Quantity,
        /// Mass.
        mass: Quantity,
        /// Rotary inertia about the bending axis; 0 when omitted.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        rotary_inertia: Option<Quantity>,
        /// A name to show.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        label: Option<String>,
    },
    /// A grounded translational spring (or `"rigid"`).
    Spring {
        /// Distance from the left end.
        position: Quantity,
        /// Stiffness.
        stiffness: Quantity,
        /// A name to show.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        label: Option<String>,
    },
    /// A grounded rotational spring (or `"rigid"`).
    RotationalSpring {
        /// Distance from the left end.
        position: Quantity,
        /// Stiffness.
        stiffness: Quantity,
        /// A name to show.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        label: Option<String>,
    },
    /// A rigid intermediate support (a pin).
    Support {
        /// Distance from the left end.
        position: Quantity,
        /// A name to show.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        label: Option<String>,
    },
    /// A mass on a spring attached to the beam.
    SprungMass {
        /// Distance from the left end.
        position: Quantity,
        /// Mass.
        mass: Quantity,
        /// Spring stiffness.
        stiffness: Quantity,
        /// A name to show.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        label: Option<String>,
    },
}

/// A frequency the beam will be driven at.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ExcitationInput {
    /// What it is ("motor running speed").
    #[serde(default)]
    pub label: String,
    /// The frequency ("1780 rpm", "60 Hz").
    pub frequency: Quantity,
    /// How many multiples to check (1 = the frequency itself); 1 when omitted.
    #[serde(default = "one")]
    pub harmonics: usize,
}

fn one() -> usize {
    1
}

impl Scenario {
    /// Reads a scenario from JSON text. Errors name the field path and what was expected.
    pub fn from_json(text: &str) -> Result<Scenario> {
        let deserializer = &mut serde_json::Deserializer::from_str(text);
        serde_path_to_error::deserialize(deserializer).map_err(|e| {
            let path = e.path().to_string();
            let inner = e.into_inner();
            let message = tidy_serde_message(&inner.to_string());
            let path = if path == "." { String::new() } else { path };
            Error::new(ErrorKind::Syntax, message).at(path)
        })
    }
}

/// Serde's messages end with "at line 3 column 14"; keep that, but say "field" for the user.
fn tidy_serde_message(message: &str) -> String {
    message
        .replace("unknown field", "unknown field name")
        .replace("missing field", "this part needs the field")
        .replace("invalid type: ", "wrong kind of value: ")
}
