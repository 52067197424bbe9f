//! The budget beam: the model the engine's speed figures are stated for (the native
//! benchmarks, the WebAssembly timing build and the counted-work tests all solve it, so their
//! figures divide). A stepped, three-segment floor beam 5 m long, pinned at the left and
//! elastic at the right, carrying ten attachments of every kind. Invented for the benchmarks.

use super::{Attachment, End, Model, ModelParts, Segment, Theory};

/// The budget beam with its ten attachments.
pub fn budget_beam() -> Model {
    let parts = ModelParts {
        segments: vec![
            Segment::slender(1.5, 4.0e6, 40.0),
            Segment::slender(2.0, 2.5e6, 32.0),
            Segment::slender(1.5, 4.0e6, 40.0),
        ],
        left: End::Pinned,
        right: End::Elastic { translational: 5.0e6, rotational: 2.0e5 },
        attachments: vec![
            Attachment::Mass { position: 0.4, mass: 12.0, rotary_inertia: 0.3 },
            Attachment::Spring { position: 0.9, stiffness: 2.0e6 },
            Attachment::Mass { position: 1.3, mass: 30.0, rotary_inertia: 0.0 },
            Attachment::SprungMass { position: 1.8, mass: 45.0, stiffness: 8.0e5 },
            Attachment::RotationalSpring { position: 2.2, stiffness: 5.0e4 },
            Attachment::Support { position: 2.6 },
            Attachment::Mass { position: 3.1, mass: 8.0, rotary_inertia: 0.1 },
            Attachment::Spring { position: 3.5, stiffness: 1.0e6 },
            Attachment::Mass { position: 4.0, mass: 20.0, rotary_inertia: 0.0 },
            Attachment::SprungMass { position: 4.6, mass: 15.0, stiffness: 3.0e5 },
        ],
        theory: Theory::EulerBernoulli,
    };
    // Every position lies on the 5 m beam and every value is positive and finite.
    match Model::new(parts) {
        Ok(model) => model,
        Err(e) => unreachable!("the budget beam is a valid model: {e}"),
    }
}
