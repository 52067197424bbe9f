//! The speed budget's beam, as `tests/benches/engine.rs` builds it from the test kit
//! (`modebench_tests::models::budget_beam`, which WebAssembly builds cannot reach): a stepped,
//! three-segment floor beam carrying ten attachments of every kind, pinned at the left, elastic
//! at the right. The WebAssembly timing test includes this file too; a native test holds it to
//! the kit's.

/// The budget beam, kept the same as the benchmarks' so that the two figures divide.
pub fn budget_beam() -> modebench::Model {
    use modebench::{Attachment, End, Model, ModelParts, Segment, Theory};
    let seg = |length, ei, m| Segment {
        length,
        flexural_rigidity: ei,
        mass_per_length: m,
        shear_rigidity: None,
        rotary_inertia_per_length: 0.0,
    };
    let attachments = vec![
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
    ];
    let Ok(model) = Model::new(ModelParts {
        segments: vec![seg(1.5, 4.0e6, 40.0), seg(2.0, 2.5e6, 32.0), seg(1.5, 4.0e6, 40.0)],
        left: End::Pinned,
        right: End::Elastic { translational: 5.0e6, rotational: 2.0e5 },
        attachments,
        theory: Theory::EulerBernoulli,
    }) else {
        panic!("the budget model is valid")
    };
    model
}
