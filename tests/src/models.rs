//! Models the benchmarks and the scale checks share.

use modebench::{Attachment, End, Model, ModelParts, Segment, Theory};

/// A pinned–pinned unit beam (L = 1, EI = 1, m = 1) carrying `n` equal point masses at the
/// midpoints of `n` equal parts, `total_mass` and `total_rotary_inertia` shared among them.
pub fn pinned_span_with_equal_masses(n: usize, total_mass: f64, total_rotary_inertia: f64) -> Model {
    let masses = (0..n)
        .map(|i| Attachment::Mass {
            position: (i as f64 + 0.5) / n as f64,
            mass: total_mass / n as f64,
            rotary_inertia: total_rotary_inertia / n as f64,
        })
        .collect();
    Model::new(ModelParts {
        segments: vec![Segment {
            length: 1.0,
            flexural_rigidity: 1.0,
            mass_per_length: 1.0,
            shear_rigidity: None,
            rotary_inertia_per_length: 0.0,
        }],
        left: End::Pinned,
        right: End::Pinned,
        attachments: masses,
        theory: Theory::EulerBernoulli,
    })
    .expect("a pinned span with masses on it is a valid model")
}

/// The speed budget's beam: a stepped, three-segment floor beam carrying ten attachments of
/// every kind (the benchmarks' workload; the core's own work test and the WebAssembly timing
/// build the same beam where this crate cannot reach).
pub fn budget_beam() -> Model {
    let seg = |length, ei, m| Segment {
        length,
        flexural_rigidity: ei,
        mass_per_length: m,
        shear_rigidity: None,
        rotary_inertia_per_length: 0.0,
    };
    Model::new(ModelParts {
        segments: vec![seg(1.5, 4.0e6, 40.0), seg(2.0, 2.5e6, 32.0), seg(1.5, 4.0e6, 40.0)],
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
    })
    .expect("the budget beam is a valid model")
}
