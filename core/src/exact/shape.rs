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

mod energy;
mod gradient;
mod sample;

pub use gradient::{Gradient, SegmentGradient};

use crate::error::Result;
use crate::exact::solve::{respond, StationLoad};
use crate::exact::sweep;
use crate::exact::System;
use crate::layout::Layout;
use crate::member::Member;
use crate::model::Model;
use energy::inner;
use sample::{normalise, resample};

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
    let pieces = sweep::pieces(&system, omega, crate::member::SWEEP_LAMBDA)?;
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

#[cfg(test)]
mod tests {
    use crate::model::{Attachment, End, Model, ModelParts, Segment, Theory};

    #[test]
    fn a_sprung_mass_on_a_held_point_vibrates_alone() {
        // A mass on a spring whose base cannot move is a single-degree-of-freedom oscillator:
        // ω = √(k/m), the beam at rest (a fact of the theory). The inverse iteration meets an
        // exactly vanishing pivot there and must still give a finite shape.
        let model = Model::new(ModelParts {
            segments: vec![Segment::slender(2.0, 4.1e6, 36.0)],
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
    fn two_sprung_masses_on_one_held_point_each_vibrate_alone() {
        // Two such oscillators on one support: each vibrates at its own √(k/m) with the other and
        // the beam at rest (the same fact), and Rayleigh's quotient of each shape is its own
        // k/m. The shapes' inverse iteration must load each mass with its own response, however
        // the two are listed.
        let (light, heavy) = ((0.17, 4.6e3), (0.38, 4.9e4));
        let model = Model::new(ModelParts {
            segments: vec![Segment::slender(1.0, 1.0e3, 1.0)],
            left: End::Pinned,
            right: End::Pinned,
            attachments: vec![
                Attachment::Support { position: 0.5 },
                Attachment::SprungMass { position: 0.5, mass: heavy.0, stiffness: heavy.1 },
                Attachment::SprungMass { position: 0.5, mass: light.0, stiffness: light.1 },
            ],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let modes = crate::exact::modes(&model, 6).unwrap();
        for (index, (m, k)) in [(2, light), (1, heavy)] {
            let own = (k / m).sqrt();
            let Some(mode) = modes.iter().find(|x| (x.omega - own).abs() < 1e-9 * own) else {
                panic!("no mode at {own} rad/s: {:?}", modes.iter().map(|x| x.omega).collect::<Vec<_>>())
            };
            let quotient = mode.shape.rayleigh_quotient(&model).sqrt();
            assert!((quotient / own - 1.0).abs() < 1e-9, "attachment {index}: √R = {quotient}, ω = {own}");
            let moving: Vec<usize> =
                mode.shape.sprung.iter().filter(|(_, d)| d.abs() > 1e-9).map(|(i, _)| *i).collect();
            assert_eq!(moving, [index], "{:?}", mode.shape.sprung);
        }
    }
}
