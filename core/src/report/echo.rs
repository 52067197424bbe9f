//! The inputs echoed in a report: the beam as modelled, the excitations as read, and every unit
//! conversion applied.

use super::{AttachmentEcho, BeamEcho, ConversionEcho, EndEcho, ExcitationEcho, SegmentReport};
use crate::model::{Attachment, End, EndKind, Model};
use crate::scenario::Inputs;

/// The beam as modelled, from the validated model and how its segments were described.
pub(super) fn beam(model: &Model, inputs: &Inputs) -> BeamEcho {
    let mut start = 0.0;
    let segments = model
        .segments()
        .iter()
        .zip(&inputs.segments)
        .map(|(s, echo)| {
            let report = SegmentReport {
                start,
                end: start + s.length,
                flexural_rigidity: s.flexural_rigidity,
                mass_per_length: s.mass_per_length,
                shear_rigidity: s.shear_rigidity,
                echo: echo.clone(),
            };
            start += s.length;
            report
        })
        .collect();
    let finite = |v: f64| v.is_finite().then_some(v);
    let end = |e: End| match e {
        End::Free => EndEcho { kind: EndKind::Free, translational: None, rotational: None },
        End::Pinned => EndEcho { kind: EndKind::Pinned, translational: None, rotational: None },
        End::Clamped => EndEcho { kind: EndKind::Clamped, translational: None, rotational: None },
        End::Guided => EndEcho { kind: EndKind::Guided, translational: None, rotational: None },
        End::Elastic { translational, rotational } => EndEcho {
            kind: EndKind::Elastic,
            translational: finite(translational),
            rotational: finite(rotational),
        },
    };
    // The kind is the scenario's; what the model carries comes from the model's attachment, so
    // a kind of the scenario that the model carries as another is echoed under its own name.
    let attachments = model
        .attachments()
        .iter()
        .zip(inputs.labels.iter().zip(&inputs.kinds))
        .map(|(a, (label, &kind))| {
            let base = AttachmentEcho {
                kind,
                position: a.position(),
                label: label.clone(),
                mass: None,
                rotary_inertia: None,
                stiffness: None,
                rigid: false,
            };
            match *a {
                Attachment::Mass { mass, rotary_inertia, .. } => {
                    AttachmentEcho { mass: Some(mass), rotary_inertia: Some(rotary_inertia), ..base }
                }
                Attachment::Spring { stiffness, .. } | Attachment::RotationalSpring { stiffness, .. } => {
                    AttachmentEcho { stiffness: finite(stiffness), rigid: stiffness.is_infinite(), ..base }
                }
                Attachment::Support { .. } => AttachmentEcho { rigid: true, ..base },
                Attachment::SprungMass { mass, stiffness, .. } => {
                    AttachmentEcho { mass: Some(mass), stiffness: Some(stiffness), ..base }
                }
            }
        })
        .collect();
    BeamEcho {
        length: model.length(),
        segments,
        left: end(model.left()),
        right: end(model.right()),
        attachments,
    }
}

/// The excitations as read.
pub(super) fn excitations(inputs: &Inputs) -> Vec<ExcitationEcho> {
    inputs
        .excitations
        .iter()
        .map(|e| ExcitationEcho {
            label: e.label.clone(),
            frequency_hz: e.low_hz,
            up_to_hz: e.high_hz,
            orders: e.orders.clone(),
        })
        .collect()
}

/// Every unit conversion applied to the input, by the path it was written at.
pub(super) fn conversions(inputs: &Inputs) -> Vec<ConversionEcho> {
    inputs
        .conversions
        .iter()
        .map(|(path, c)| ConversionEcho { path: path.to_string(), text: c.text.clone() })
        .collect()
}
