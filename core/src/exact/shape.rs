//! Mode shapes of the exact method: the response of the beam to loads at its natural frequency,
//! by inverse iteration with the station sweep ([`super::solve`]), carried inside each piece by
//! the member's exact shape functions.
//!
//! K(ω) is singular at a natural frequency, so its response to almost any load is almost wholly
//! the mode; a second solve with the first response as the load leaves nothing else. The sweep
//! keeps that exact however closely stations crowd, where a banded factorisation of K would be
//! swamped by the stiffness of very short pieces. The members are cut into pieces short enough
//! that the interior formulas are accurate (λ ≤ 1.5 each), and a mode that lives inside a member
//! with every station at rest is found like any other.
//!
//! Normalisation: the largest translation anywhere (beam or sprung mass) is +1.

mod gradient;

pub use gradient::{Gradient, SegmentGradient};

use crate::error::Result;
use crate::exact::solve::{respond, StationLoad};
use crate::exact::sweep;
use crate::exact::System;
use crate::layout::Layout;
use crate::member::Member;
use crate::model::Model;

/// Points sampled along the beam for plotting (at least).
const SAMPLES: usize = 160;
/// Deflections below this fraction of the largest count as zero when looking for nodes.
const ZERO: f64 = 1e-9;

/// A normalised mode shape.
#[derive(Clone, Debug, PartialEq)]
pub struct ModeShape {
    /// Sample positions from the left end, m, ascending.
    pub x: Vec<f64>,
    /// Deflection at each sample, normalised so the largest translation is +1.
    pub deflection: Vec<f64>,
    /// Interior points where the deflection changes sign, m.
    pub nodes: Vec<f64>,
    /// Translation of each sprung mass: (index of the attachment in the model, amplitude).
    pub sprung: Vec<(usize, f64)>,
    /// Generalised (modal) mass of the shape as normalised, kg.
    pub generalized_mass: f64,
    pieces: Vec<Piece>,
    omega: f64,
}

#[derive(Clone, Copy, Debug, PartialEq)]
struct Piece {
    x0: f64,
    length: f64,
    member: Member,
    /// Left-end state for [`Member::propagate`].
    state: [f64; 4],
    mass_per_length: f64,
    rotary_inertia_per_length: f64,
}

impl ModeShape {
    /// Deflection and rotation at `x` (clamped to the beam).
    pub fn at(&self, x: f64) -> (f64, f64) {
        let i = self.pieces.partition_point(|p| p.x0 + p.length < x).min(self.pieces.len() - 1);
        let p = &self.pieces[i];
        p.member.propagate(self.omega, p.state, (x - p.x0).clamp(0.0, p.length))
    }

    /// The mass-weighted inner product of two shapes of the same model:
    /// ∫ m·φ·ψ dx + ∫ ρI·φ′·ψ′ dx + Σ point masses and rotary inertias + Σ sprung masses.
    /// Zero (to rounding) for two different modes: the modes are mass-orthogonal.
    pub fn mass_product(&self, other: &ModeShape, model: &Model) -> f64 {
        inner(model, self, other)
    }

    /// Rayleigh's quotient of the shape as computed, ω² = U/T: the strain energy in bending (and
    /// shear), springs and isolators over the kinetic energy per ω². For the exact mode shape it
    /// is exactly ω², and it is stationary there, so for a computed one it errs only to second
    /// order in the shape's error: how far its root lies from the frequency the shape was
    /// computed at measures that frequency's error.
    pub fn rayleigh_quotient(&self, model: &Model) -> f64 {
        let mut strain = 0.0;
        for p in &self.pieces {
            let half = 0.5 * p.length;
            for (xi, weight) in GAUSS {
                let x = half * (1.0 + xi);
                strain += weight * half * p.member.strain_density(self.omega, p.state, x);
            }
        }
        let (kt_left, kr_left) = model.left().springs();
        let (kt_right, kr_right) = model.right().springs();
        for (x, kt, kr) in [(0.0, kt_left, kr_left), (model.length(), kt_right, kr_right)] {
            let (w, t) = self.at(x);
            strain += finite(kt) * w * w + finite(kr) * t * t;
        }
        for (index, a) in model.attachments().iter().enumerate() {
            match *a {
                crate::model::Attachment::Spring { position, stiffness } => {
                    strain += finite(stiffness) * self.at(position).0.powi(2);
                }
                crate::model::Attachment::RotationalSpring { position, stiffness } => {
                    strain += finite(stiffness) * self.at(position).1.powi(2);
                }
                crate::model::Attachment::SprungMass { position, stiffness, .. } => {
                    let d = self.sprung.iter().find(|(i, _)| *i == index).map_or(0.0, |(_, d)| *d);
                    strain += stiffness * (self.at(position).0 - d).powi(2);
                }
                _ => {}
            }
        }
        strain / inner(model, self, self)
    }

    fn scale(&mut self, factor: f64) {
        for v in &mut self.deflection {
            *v *= factor;
        }
        for (_, v) in &mut self.sprung {
            *v *= factor;
        }
        for p in &mut self.pieces {
            p.state.iter_mut().for_each(|v| *v *= factor);
        }
        self.generalized_mass *= factor * factor;
    }
}

/// `count` mass-orthogonal shapes at the natural frequency ω.
pub(crate) fn shapes(model: &Model, omega: f64, count: usize) -> Result<Vec<ModeShape>> {
    // The iteration loads the stations; on a beam with no station free to move (a clamped–
    // clamped beam with nothing on it) the supports would take every load and the response be
    // nothing, so each span then gets a free station at its middle. Otherwise spans are left
    // whole, which keeps the shapes' samples (and the report) as small as they were.
    let plain = Layout::new(model, &|_| 1)?;
    let held = plain.stations.iter().all(|s| s.w.is_none() && s.theta.is_none() && s.sprung.is_empty());
    let layout = if held { Layout::new(model, &|_| 2)? } else { plain };
    let system = System::new(model, layout);
    let pieces = sweep::pieces(&system, omega)?;
    let mut out: Vec<ModeShape> = Vec::with_capacity(count);
    if omega == 0.0 {
        // Rigid-body modes: the motions w = a + b·x that no restraint resists, the sprung masses
        // moving with the beam.
        let response = crate::exact::solve::respond(&system, &pieces, 0.0, &[]);
        for (a, b) in rigid_motions(model).into_iter().take(count) {
            let mut shape = build(model, 0.0, &response);
            for p in &mut shape.pieces {
                p.state = p.member.start_from([a + b * p.x0, b, 0.0, 0.0]);
            }
            for (i, d) in &mut shape.sprung {
                *d = a + b * model.attachments()[*i].position();
            }
            out.push(shape);
        }
    }
    for j in out.len()..count {
        let mut seed = 0x0005_DEEC_E66D_u64 ^ (j as u64).wrapping_mul(0x9E37_79B9_7F4A_7C15);
        let mut random = move || {
            seed = seed.wrapping_mul(6_364_136_223_846_793_005).wrapping_add(1_442_695_040_888_963_407);
            ((seed >> 11) as f64 / (1u64 << 53) as f64) - 0.5
        };
        let mut loads: Vec<StationLoad> = system
            .layout
            .stations
            .iter()
            .map(|s| StationLoad {
                force: [random(), random()],
                sprung: s.sprung.iter().map(|_| random()).collect(),
            })
            .collect();
        let mut shape = None;
        for _ in 0..2 {
            let response = respond(&system, &pieces, omega, &loads);
            let built = build(model, omega, &response);
            // The next load: this response, scaled to order one, at the stations.
            let largest = built
                .deflection
                .iter()
                .chain(built.sprung.iter().map(|(_, a)| a))
                .fold(0.0f64, |m, v| m.max(v.abs()));
            let scale = if largest > 0.0 && largest.is_finite() { 1.0 / largest } else { 1.0 };
            let mut cursor = 0;
            for (s, load) in system.layout.stations.iter().zip(loads.iter_mut()) {
                let (w, t) = built.at(s.x);
                load.force = [w * scale, t * scale];
                for f in load.sprung.iter_mut() {
                    *f = built.sprung.get(cursor).map_or(0.0, |(_, a)| a * scale);
                    cursor += 1;
                }
            }
            shape = Some(built);
        }
        if let Some(mut s) = shape {
            // Inverse iteration leaves the shape at an arbitrary, possibly huge, scale.
            normalise(&mut s);
            out.push(s);
        }
    }
    // Mass-orthonormalise a group of coincident modes (Gram–Schmidt), then normalise each.
    for i in 0..out.len() {
        for j in 0..i {
            let c = inner(model, &out[i], &out[j]) / inner(model, &out[j], &out[j]);
            let (head, tail) = out.split_at_mut(i);
            subtract(&mut tail[0], &head[j], c);
        }
    }
    for s in &mut out {
        resample(s);
        s.generalized_mass = inner(model, s, s);
        normalise(s);
    }
    Ok(out)
}

/// A basis (a, b) of the rigid-body motions w = a + b·x the model's restraints allow: every
/// deflection restraint at x holds a + b·x = 0, every rotation restraint b = 0.
fn rigid_motions(model: &Model) -> Vec<(f64, f64)> {
    let mut deflection: Vec<f64> = Vec::new();
    let mut rotation = false;
    let (left, right) = (model.left().springs(), model.right().springs());
    for (x, (kt, kr)) in [(0.0, left), (model.length(), right)] {
        if kt > 0.0 {
            deflection.push(x);
        }
        rotation |= kr > 0.0;
    }
    for a in model.attachments() {
        match *a {
            crate::model::Attachment::Spring { position, .. }
            | crate::model::Attachment::Support { position } => deflection.push(position),
            crate::model::Attachment::RotationalSpring { .. } => rotation = true,
            _ => {}
        }
    }
    match (deflection.first(), rotation) {
        (None, false) => vec![(1.0, 0.0), (0.0, 1.0)],
        (None, true) => vec![(1.0, 0.0)],
        (Some(&x0), false) => vec![(-x0, 1.0)],
        (Some(_), true) => Vec::new(),
    }
}

/// The shape for a response of the sweep.
fn build(model: &Model, omega: f64, response: &crate::exact::solve::Response) -> ModeShape {
    let pieces: Vec<Piece> = response
        .pieces
        .iter()
        .map(|&(x0, member, state)| {
            let seg = &model.segments()[model.segment_at(x0 + 0.5 * member.length())];
            Piece {
                x0,
                length: member.length(),
                member,
                state: member.start_from(state),
                mass_per_length: seg.mass_per_length,
                rotary_inertia_per_length: match model.theory() {
                    crate::model::Theory::Timoshenko => seg.rotary_inertia_per_length,
                    crate::model::Theory::EulerBernoulli => 0.0,
                },
            }
        })
        .collect();
    let mut shape = ModeShape {
        x: Vec::new(),
        deflection: Vec::new(),
        nodes: Vec::new(),
        sprung: response.sprung.clone(),
        generalized_mass: 0.0,
        pieces,
        omega,
    };
    resample(&mut shape);
    shape
}

/// Samples the deflection for plotting: at least [`SAMPLES`] points, each piece's ends included.
fn resample(s: &mut ModeShape) {
    let per_piece = SAMPLES.div_ceil(s.pieces.len().max(1)).max(2);
    s.x.clear();
    s.deflection.clear();
    for p in &s.pieces {
        for j in 0..per_piece {
            let local = p.length * j as f64 / per_piece as f64;
            s.x.push(p.x0 + local);
            s.deflection.push(p.member.propagate(s.omega, p.state, local).0);
        }
    }
    if let Some(p) = s.pieces.last() {
        s.x.push(p.x0 + p.length);
        s.deflection.push(p.member.propagate(s.omega, p.state, p.length).0);
    }
}

fn subtract(target: &mut ModeShape, other: &ModeShape, c: f64) {
    for (p, o) in target.pieces.iter_mut().zip(&other.pieces) {
        for (a, b) in p.state.iter_mut().zip(o.state) {
            *a -= c * b;
        }
    }
    for ((_, a), (_, b)) in target.sprung.iter_mut().zip(&other.sprung) {
        *a -= c * b;
    }
}

/// A stiffness that is not rigid; a rigid one holds its point still and stores no energy.
fn finite(k: f64) -> f64 {
    if k.is_finite() {
        k
    } else {
        0.0
    }
}

/// Gauss–Legendre 6-point abscissae and weights on [−1, 1] (Abramowitz & Stegun, table 25.4).
const GAUSS: [(f64, f64); 6] = [
    (-0.932_469_514_203_152, 0.171_324_492_379_170),
    (-0.661_209_386_466_265, 0.360_761_573_048_139),
    (-0.238_619_186_083_197, 0.467_913_934_572_691),
    (0.238_619_186_083_197, 0.467_913_934_572_691),
    (0.661_209_386_466_265, 0.360_761_573_048_139),
    (0.932_469_514_203_152, 0.171_324_492_379_170),
];

fn inner(model: &Model, a: &ModeShape, b: &ModeShape) -> f64 {
    // The two shapes may sit on different piece layouts (each is cut for its own frequency), so
    // integrate over the union of their piece boundaries; within each interval both are smooth.
    let mut cuts: Vec<f64> = a.pieces.iter().chain(&b.pieces).map(|p| p.x0).collect();
    cuts.push(model.length());
    crate::sort::floats(&mut cuts);
    cuts.dedup_by(|x, y| (*x - *y).abs() <= 1e-12 * model.length());
    let mut sum = 0.0;
    for w in cuts.windows(2) {
        let (x0, x1) = (w[0], w[1]);
        let half = 0.5 * (x1 - x0);
        let piece =
            &a.pieces[a.pieces.partition_point(|p| p.x0 + p.length <= x0 + half).min(a.pieces.len() - 1)];
        for (xi, weight) in GAUSS {
            let x = x0 + half * (1.0 + xi);
            let (wa, ta) = a.at(x);
            let (wb, tb) = b.at(x);
            sum +=
                weight * half * (piece.mass_per_length * wa * wb + piece.rotary_inertia_per_length * ta * tb);
        }
    }
    for attachment in model.attachments() {
        if let crate::model::Attachment::Mass { position, mass, rotary_inertia } = *attachment {
            let (wa, ta) = a.at(position);
            let (wb, tb) = b.at(position);
            sum += mass * wa * wb + rotary_inertia * ta * tb;
        }
    }
    for ((i, ua), (_, ub)) in a.sprung.iter().zip(&b.sprung) {
        if let crate::model::Attachment::SprungMass { mass, .. } = model.attachments()[*i] {
            sum += mass * ua * ub;
        }
    }
    sum
}

fn normalise(s: &mut ModeShape) {
    let mut largest = 0.0f64;
    for v in s.deflection.iter().chain(s.sprung.iter().map(|(_, a)| a)) {
        if v.abs() > largest.abs() {
            largest = *v;
        }
    }
    if largest != 0.0 && largest.is_finite() {
        s.scale(1.0 / largest);
    }
    s.nodes = nodes(s);
}

/// Points where the deflection changes sign, found from the samples and refined by bisection on
/// the exact shape. A run of zero samples between opposite signs (a support) counts once, at
/// its middle.
fn nodes(s: &ModeShape) -> Vec<f64> {
    let mut out = Vec::new();
    let mut last: Option<(usize, f64)> = None;
    for (i, &v) in s.deflection.iter().enumerate() {
        if v.abs() <= ZERO {
            continue;
        }
        if let Some((j, u)) = last {
            if u.signum() != v.signum() {
                if i > j + 1 {
                    // Zero samples in between: the crossing is the middle of that run.
                    out.push(0.5 * (s.x[j + 1] + s.x[i - 1]));
                } else {
                    out.push(bisect(s, s.x[j], s.x[i], u));
                }
            }
        }
        last = Some((i, v));
    }
    out
}

fn bisect(s: &ModeShape, mut a: f64, mut b: f64, value_at_a: f64) -> f64 {
    // 44 halvings take a sample interval below a billionth of a micrometre on any real beam.
    for _ in 0..44 {
        let m = 0.5 * (a + b);
        if m <= a || m >= b {
            break;
        }
        if s.at(m).0.signum() == value_at_a.signum() {
            a = m;
        } else {
            b = m;
        }
    }
    0.5 * (a + b)
}

#[cfg(test)]
mod tests {
    use crate::model::{Attachment, End, Model, ModelParts, Segment, Theory};

    #[test]
    fn a_sprung_mass_on_a_held_point_vibrates_alone() {
        // A mass on a spring whose base cannot move is a single-degree-of-freedom oscillator:
        // ω = √(k/m), the beam at rest (a fact of the theory). The inverse iteration meets an
        // exactly vanishing pivot there and must still give a finite shape.
        let model = Model::new(ModelParts {
            segments: vec![Segment {
                length: 2.0,
                flexural_rigidity: 4.1e6,
                mass_per_length: 36.0,
                shear_rigidity: None,
                rotary_inertia_per_length: 0.0,
            }],
            left: End::Clamped,
            right: End::Clamped,
            attachments: vec![Attachment::SprungMass { position: 0.0, mass: 180.0, stiffness: 9.0e5 }],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let modes = crate::exact::modes(&model, 2).unwrap();
        let own = (9.0e5f64 / 180.0).sqrt();
        assert!((modes[0].omega - own).abs() < 1e-12 * own);
        let shape = &modes[0].shape;
        assert_eq!(shape.sprung, vec![(0, 1.0)]);
        assert!(shape.deflection.iter().all(|w| w.is_finite() && w.abs() < 1e-9));
        assert!(shape.generalized_mass.is_finite() && (shape.generalized_mass - 180.0).abs() < 1e-6);
    }

    #[test]
    fn rayleigh_quotient_of_each_mode_is_its_frequency() {
        // Rayleigh's quotient of an exact mode shape is its ω² (a fact of the theory), for every
        // kind of member, end and attachment; and a shape computed at a wrong frequency has a
        // quotient that points back at the right one.
        for theory in [Theory::EulerBernoulli, Theory::Timoshenko] {
            let model = Model::new(ModelParts {
                segments: vec![
                    Segment {
                        length: 0.8,
                        flexural_rigidity: 3.0e3,
                        mass_per_length: 6.0,
                        shear_rigidity: Some(4.0e5),
                        rotary_inertia_per_length: 0.004,
                    },
                    Segment {
                        length: 1.1,
                        flexural_rigidity: 1.5e3,
                        mass_per_length: 4.0,
                        shear_rigidity: Some(3.0e5),
                        rotary_inertia_per_length: 0.002,
                    },
                ],
                left: End::Elastic { translational: 2.0e5, rotational: 4.0e3 },
                right: End::Pinned,
                attachments: vec![
                    Attachment::Mass { position: 0.5, mass: 1.2, rotary_inertia: 0.01 },
                    Attachment::Spring { position: 1.4, stiffness: 3.0e4 },
                    Attachment::RotationalSpring { position: 1.0, stiffness: 500.0 },
                    Attachment::SprungMass { position: 1.6, mass: 0.7, stiffness: 2.0e4 },
                    Attachment::Support { position: 1.2 },
                ],
                theory,
            })
            .unwrap();
            for m in crate::exact::modes(&model, 5).unwrap() {
                let rq = m.shape.rayleigh_quotient(&model).sqrt();
                assert!(((rq - m.omega) / m.omega).abs() < 1e-12, "{theory:?}: {rq} vs {}", m.omega);
            }
        }
    }
}
