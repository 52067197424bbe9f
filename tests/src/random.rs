//! The one seeded generator of the workspace's tests, and random models for property checks:
//! stepped beams with every kind of end and attachment.

use modebench::{Attachment, End, Model, ModelParts, Segment, Theory};

/// The splitmix64 generator (Steele, Lea & Flood, OOPSLA 2014): small, seedable, reproducible.
#[derive(Clone, Debug)]
pub struct Rng(u64);

impl Rng {
    /// A generator with the given seed.
    pub fn new(seed: u64) -> Rng {
        Rng(seed)
    }

    /// The next 64 random bits.
    pub fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// Uniform in [0, 1).
    pub fn unit(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Uniform in [lo, hi).
    pub fn range(&mut self, lo: f64, hi: f64) -> f64 {
        lo + (hi - lo) * self.unit()
    }

    /// Log-uniform in [lo, hi).
    pub fn log_range(&mut self, lo: f64, hi: f64) -> f64 {
        (lo.ln() + (hi.ln() - lo.ln()) * self.unit()).exp()
    }

    /// Uniform index below n (n > 0); the small modulo bias does not matter for tests.
    pub fn below(&mut self, n: usize) -> usize {
        (self.next_u64() % n as u64) as usize
    }

    /// One element of a non-empty slice.
    pub fn pick<'a, T>(&mut self, items: &'a [T]) -> &'a T {
        &items[self.below(items.len())]
    }
}

/// What a random model may contain.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Kinds {
    /// Allow ends that leave rigid-body modes.
    pub unrestrained: bool,
    /// Allow sprung masses.
    pub sprung: bool,
    /// Allow rigid intermediate supports.
    pub supports: bool,
    /// Timoshenko beams with shear deformation and rotary inertia of a stocky section.
    pub timoshenko: bool,
}

/// A random valid model: 1–3 segments, random ends, 0–4 attachments at distinct interior points.
pub fn model(rng: &mut Rng, kinds: Kinds) -> Model {
    loop {
        if let Ok(m) = Model::new(parts(rng, kinds)) {
            if kinds.unrestrained || m.rigid_body_modes() == 0 {
                return m;
            }
        }
    }
}

fn parts(rng: &mut Rng, kinds: Kinds) -> ModelParts {
    let n = 1 + rng.below(3);
    let segments: Vec<Segment> = (0..n)
        .map(|_| {
            let (length, ei, m) = (rng.range(0.3, 1.5), rng.log_range(0.3, 3.0), rng.log_range(0.5, 2.0));
            // A section whose radius of gyration is 1–10 % of the segment length, shear stiffness
            // such that EI/(κGA·L²) is of the same order.
            let (kga, rho_i) = if kinds.timoshenko {
                (
                    Some(ei / (rng.log_range(1e-3, 2e-2) * length * length)),
                    m * (rng.log_range(0.01, 0.1) * length).powi(2),
                )
            } else {
                (None, 0.0)
            };
            Segment {
                length,
                flexural_rigidity: ei,
                mass_per_length: m,
                shear_rigidity: kga,
                rotary_inertia_per_length: rho_i,
            }
        })
        .collect();
    let length: f64 = segments.iter().map(|s| s.length).sum();
    let stiff = 1.0 / length.powi(3);
    let end = |rng: &mut Rng| match rng.below(5) {
        0 => End::Free,
        1 => End::Pinned,
        2 => End::Clamped,
        3 => End::Guided,
        _ => End::Elastic {
            translational: rng.log_range(1.0, 1e3) * stiff,
            rotational: rng.log_range(0.1, 1e2) * stiff * length * length,
        },
    };
    let left = end(rng);
    let right = end(rng);
    let mut positions: Vec<f64> = Vec::new();
    let count = rng.below(5);
    let mut attachments = Vec::new();
    while attachments.len() < count {
        let x = rng.range(0.05, 0.95) * length;
        if positions.iter().any(|p| (p - x).abs() < 0.03 * length) {
            continue;
        }
        positions.push(x);
        let mass = rng.log_range(0.05, 1.0) * length;
        attachments.push(match rng.below(6) {
            0 | 1 => Attachment::Mass {
                position: x,
                mass,
                rotary_inertia: if rng.below(2) == 0 { 0.0 } else { mass * 0.01 },
            },
            2 => Attachment::Spring { position: x, stiffness: rng.log_range(1.0, 1e3) * stiff },
            3 => Attachment::RotationalSpring {
                position: x,
                stiffness: rng.log_range(0.1, 1e2) * stiff * length * length,
            },
            4 if kinds.supports => Attachment::Support { position: x },
            5 if kinds.sprung => {
                Attachment::SprungMass { position: x, mass, stiffness: rng.log_range(1.0, 1e3) * stiff }
            }
            _ => Attachment::Mass { position: x, mass, rotary_inertia: 0.0 },
        });
    }
    let theory = if kinds.timoshenko { Theory::Timoshenko } else { Theory::EulerBernoulli };
    ModelParts { segments, left, right, attachments, theory }
}
