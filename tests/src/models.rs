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
        segments: vec![Segment::slender(1.0, 1.0, 1.0)],
        left: End::Pinned,
        right: End::Pinned,
        attachments: masses,
        theory: Theory::EulerBernoulli,
    })
    .expect("a pinned span with masses on it is a valid model")
}

pub use modebench::model::budget_beam;
