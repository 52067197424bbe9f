//! The kinds of end and attachment, named as the scenario format and the report name them, and
//! how each kind of attachment becomes the model's.

use super::Attachment;
use crate::error::Result;
use crate::schema;

/// How an end is held, as the scenario and the report name it: "free", "pinned", "clamped", "guided" or "elastic".
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum EndKind {
    /// No restraint.
    Free,
    /// Deflection held.
    Pinned,
    /// Deflection and rotation held.
    Clamped,
    /// Rotation held, free to slide.
    Guided,
    /// Grounded springs.
    Elastic,
}

impl EndKind {
    /// Every kind of end.
    pub const ALL: [EndKind; 5] =
        [EndKind::Free, EndKind::Pinned, EndKind::Clamped, EndKind::Guided, EndKind::Elastic];

    /// The name as serialised, the scenario format's own.
    pub fn id(self) -> &'static str {
        match self {
            EndKind::Free => "free",
            EndKind::Pinned => "pinned",
            EndKind::Clamped => "clamped",
            EndKind::Guided => "guided",
            EndKind::Elastic => "elastic",
        }
    }
}

/// What is attached, as the scenario and the report name it: "mass", "spring", "rotational-spring", "support" or
/// "sprung-mass".
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum AttachmentKind {
    /// A rigid body fixed to the beam.
    Mass,
    /// A grounded translational spring.
    Spring,
    /// A grounded rotational spring.
    RotationalSpring,
    /// A rigid intermediate support.
    Support,
    /// A mass on a spring attached to the beam.
    SprungMass,
}

impl AttachmentKind {
    /// Every kind of attachment.
    pub const ALL: [AttachmentKind; 5] = [
        AttachmentKind::Mass,
        AttachmentKind::Spring,
        AttachmentKind::RotationalSpring,
        AttachmentKind::Support,
        AttachmentKind::SprungMass,
    ];

    /// The name as serialised, the scenario format's own.
    pub fn id(self) -> &'static str {
        match self {
            AttachmentKind::Mass => "mass",
            AttachmentKind::Spring => "spring",
            AttachmentKind::RotationalSpring => "rotational-spring",
            AttachmentKind::Support => "support",
            AttachmentKind::SprungMass => "sprung-mass",
        }
    }
}

impl EndKind {
    /// The kind with this name.
    pub fn from_id(id: &str) -> Option<EndKind> {
        EndKind::ALL.into_iter().find(|k| k.id() == id)
    }
}

impl AttachmentKind {
    /// The model's attachment of this kind at `position` (m), given the values of the fields
    /// the schema lists for the kind, in SI (`value(key)`; 0 for an optional field left out).
    /// The model checks the result; a value the model does not carry as written is checked here.
    pub(crate) fn model(self, position: f64, value: &dyn Fn(&str) -> f64) -> Result<Attachment> {
        Ok(match self {
            AttachmentKind::Mass => Attachment::Mass {
                position,
                mass: value(schema::MASS.name),
                rotary_inertia: value(schema::ROTARY_INERTIA.name),
            },
            AttachmentKind::Spring => {
                Attachment::Spring { position, stiffness: value(schema::SPRING_STIFFNESS.name) }
            }
            AttachmentKind::RotationalSpring => {
                Attachment::RotationalSpring { position, stiffness: value(schema::ROTATIONAL_STIFFNESS.name) }
            }
            AttachmentKind::Support => Attachment::Support { position },
            AttachmentKind::SprungMass => Attachment::SprungMass {
                position,
                mass: value(schema::SPRUNG_MASS.name),
                stiffness: value(schema::SPRUNG_STIFFNESS.name),
            },
        })
    }

    /// The kind with this name.
    pub fn from_id(id: &str) -> Option<AttachmentKind> {
        AttachmentKind::ALL.into_iter().find(|k| k.id() == id)
    }
}
