//! The scenario: a beam described the way an engineer writes it down, as JSON with unit strings.
//!
//! These types mirror the file format documented in `docs/scenario-format.md`. They hold what
//! the user wrote, unchecked; [`Scenario::to_model`] reads every value with its unit, checks it,
//! and returns the validated [`Model`](crate::Model) together with an echo of the inputs in SI.

mod derived;
mod design;
pub(crate) mod json;
mod parse;
pub mod plausible;
mod read;
#[cfg(test)]
mod tests;
#[cfg(test)]
mod tests_axial;
pub(crate) mod text;
pub mod tolerant;

pub use crate::schema::DEFAULT_MARGIN;
pub use design::{MeasuredInput, RangeInput, ResizeInput, ToleranceInput};
pub use read::{ExcitationRead, Inputs, SegmentEcho};
pub use text::given_twice;

use crate::error::Result;
use crate::extra_mass::ExtraMassInput;
use crate::material::MaterialInput;
use crate::model::{AttachmentKind, Theory};
use crate::section::SectionInput;
use crate::units::{Quantity, UnitSystem};

/// A whole scenario as written.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct Scenario {
    /// A title for the results.
    pub title: String,
    /// Unit system for showing results and echoing inputs.
    pub units: UnitSystem,
    /// Beam theory; Euler–Bernoulli unless set.
    pub theory: Theory,
    /// Elastic modes to compute, 1 to 20.
    pub modes: usize,
    /// Finite elements in all; enough for about 1e-4 on the last mode when omitted.
    pub elements: Option<usize>,
    /// Point for mode 1's equivalent mass and stiffness; the point of largest deflection when
    /// omitted.
    pub report_point: Option<Quantity>,
    /// Support at x = 0.
    pub left: EndInput,
    /// Support at the far end.
    pub right: EndInput,
    /// Uniform segments from left to right.
    pub segments: Vec<SegmentInput>,
    /// Masses, springs, supports and sprung masses along the beam.
    pub attachments: Vec<AttachmentInput>,
    /// Frequencies the beam will be driven at (running speed, line frequency, blade pass).
    pub excitations: Vec<ExcitationInput>,
    /// Separation margin wanted between natural and excitation frequencies, as a ratio (0.2 or
    /// "20 %"); 0.2 when omitted.
    pub margin: Option<Quantity>,
    /// How far inputs may stray from their values.
    pub tolerances: Vec<ToleranceInput>,
    /// Frequencies measured on the part.
    pub measured: Vec<MeasuredInput>,
    /// One or two inputs to fit to the measured frequencies.
    pub calibrate: Vec<RangeInput>,
    /// A design input and its range, to find where every margin holds.
    pub resize: Option<ResizeInput>,
}

/// How an end is held, as written: `"clamped"` or `{"type": "elastic", …}`.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
#[serde(tag = "type", rename_all = "kebab-case")]
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
        translational: Option<Quantity>,
        /// Rotational stiffness (N·m/rad, or `"rigid"`); 0 when omitted.
        rotational: Option<Quantity>,
    },
}

/// One uniform segment, given either by its properties or by a section and a material.
#[derive(Clone, Debug, Default, PartialEq, serde::Serialize)]
pub struct SegmentInput {
    /// Length.
    pub length: Option<Quantity>,
    /// Bending stiffness EI (with `mass_per_length`, instead of a section and material).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub flexural_rigidity: Option<Quantity>,
    /// Mass per length, structural plus non-structural.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mass_per_length: Option<Quantity>,
    /// Shear rigidity κGA, for the Timoshenko theory.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub shear_rigidity: Option<Quantity>,
    /// Rotary inertia per length ρI, for the Timoshenko theory.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rotary_inertia_per_length: Option<Quantity>,
    /// Cross-section (with `material`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub section: Option<SectionInput>,
    /// Material: a preset id or custom properties (with `section`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub material: Option<MaterialInput>,
    /// Contents, lining and surrounding water (with `section`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub extra_mass: Option<ExtraMassInput>,
    /// Axial force, tension positive.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub axial_force: Option<Quantity>,
    /// Temperature change since the ends were fixed, both ends held axially.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub temperature_change: Option<Quantity>,
}

/// Something attached to the beam, as written: its type, where it is, the values written for
/// the fields the schema gives its type (`crate::schema::ATTACHMENTS`), and a label.
#[derive(Clone, Debug, PartialEq)]
pub struct AttachmentInput {
    /// What is attached.
    pub kind: AttachmentKind,
    /// Distance from the left end.
    pub position: Quantity,
    /// The type's own fields as written, by key, in the schema's order; an optional field left
    /// out is absent.
    pub values: Vec<(&'static str, Quantity)>,
    /// A name to show.
    pub label: Option<String>,
}

impl AttachmentInput {
    /// The value written for the field `key`, if any.
    pub fn value(&self, key: &str) -> Option<&Quantity> {
        self.values.iter().find(|(k, _)| *k == key).map(|(_, q)| q)
    }
}

/// Written as the scenario format has it: `{"type": …, "position": …, its fields…, "label": …}`.
impl serde::Serialize for AttachmentInput {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> std::result::Result<S::Ok, S::Error> {
        use serde::ser::SerializeMap;
        let mut map = serializer.serialize_map(None)?;
        map.serialize_entry("type", self.kind.id())?;
        map.serialize_entry("position", &self.position)?;
        for (key, value) in &self.values {
            map.serialize_entry(key, value)?;
        }
        if let Some(label) = &self.label {
            map.serialize_entry("label", label)?;
        }
        map.end()
    }
}

/// A frequency the beam will be driven at.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct ExcitationInput {
    /// What it is ("motor running speed").
    pub label: String,
    /// The frequency ("1780 rpm", "60 Hz"); the bottom of the range for a variable speed.
    pub frequency: Quantity,
    /// The top of a variable speed's range.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub up_to: Option<Quantity>,
    /// The multiples that drive the beam (1×, 2×, a blade count ×); 1 to `harmonics` when omitted.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub orders: Option<Vec<f64>>,
    /// How many multiples to check (1 = the frequency itself); 1 when omitted.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub harmonics: Option<usize>,
}

impl Scenario {
    /// Reads a scenario from JSON text. Errors name the field path and what was expected; a
    /// field given twice is refused.
    pub fn from_json(text: &str) -> Result<Scenario> {
        Scenario::from_value(&text::read(text)?)
    }

    /// Reads a scenario from parsed JSON (never inlined, as `to_model`). A value typed with its
    /// tolerance ("6.02 mm ± 12.5 %") is read as the value and an entry of `tolerances`
    /// ([`tolerant`]).
    #[inline(never)]
    pub fn from_value(value: &serde_json::Value) -> Result<Scenario> {
        let value = tolerant::normalise(value)?;
        Scenario::from_ready_value(&value)
    }

    /// Reads a scenario whose tolerances typed with values [`tolerant::normalise`] has already
    /// split off; `from_value` for one that has none.
    pub(crate) fn from_ready_value(value: &serde_json::Value) -> Result<Scenario> {
        parse::scenario(&json::Node::root(value))
    }
}

/// The unit system a scenario held as JSON asks for, as [`Scenario::from_value`] reads it: the
/// default when absent, an error naming the field when it is not one of the systems.
pub fn unit_system_of(value: &serde_json::Value) -> Result<UnitSystem> {
    match json::Node::root(value).get("units") {
        Some(units) => parse::unit_system(&units),
        None => Ok(UnitSystem::default()),
    }
}

json::deserialize_via_value!(Scenario, parse::scenario);
json::deserialize_via_value!(EndInput, parse::end);
json::deserialize_via_value!(SegmentInput, parse::segment);
json::deserialize_via_value!(AttachmentInput, parse::attachment);
json::deserialize_via_value!(ExcitationInput, parse::excitation);
json::deserialize_via_value!(crate::section::SectionInput, parse::section);
json::deserialize_via_value!(crate::material::MaterialInput, parse::material);
json::deserialize_via_value!(crate::extra_mass::ExtraMassInput, parse::extra_mass);
json::deserialize_via_value!(crate::units::UnitSystem, parse::unit_system);
json::deserialize_via_value!(crate::model::Theory, parse::theory);
