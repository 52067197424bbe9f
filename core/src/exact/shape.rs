//! Mode shapes of the exact method: the null vector of K(ω) at a natural frequency, carried
//! inside each member by the member's exact shape functions.
//!
//! At a natural frequency a member may sit exactly on one of its own clamped–clamped
//! frequencies, and then its end values do not determine its interior (the mode can live inside
//! the member with all station values zero). To stay clear of that, the shape is computed on a
//! finer layout whose pieces are far below their first clamped–clamped frequency (λ ≤ 1 against
//! 4.73); the natural frequency of the structure does not depend on where stations are put, so
//! K(ω) on that layout is singular at the same ω and its null vector carries the whole shape.
//!
//! Normalisation: the largest translation anywhere (beam or sprung mass) is +1.

use crate::error::Result;
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
    q: [f64; 4],
    /// Left-end state for [`Member::propagate`], linear in `q`.
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

    fn scale(&mut self, factor: f64) {
        for v in &mut self.deflection {
            *v *= factor;
        }
        for (_, v) in &mut self.sprung {
            *v *= factor;
        }
        for p in &mut self.pieces {
            p.q.iter_mut().chain(p.state.iter_mut()).for_each(|v| *v *= factor);
        }
        self.generalized_mass *= factor * factor;
    }
}

/// `count` mass-orthogonal shapes at the natural frequency ω.
pub(crate) fn shapes(model: &Model, omega: f64, count: usize) -> Result<Vec<ModeShape>> {
    let theory = model.theory();
    let layout = Layout::new(model, &|span| {
        let member = Member::new(&model.segments()[span.segment], span.length, theory);
        member.shape_pieces(omega)
    })?;
    let system = System::new(model, layout);
    // Inverse iteration at the frequency itself: K(ω) is singular there, so each solve
    // multiplies the null-space part of the vector by ~1/ε; three solves leave nothing else.
    let lu = system.assemble(omega).lu();
    let mut vectors: Vec<Vec<f64>> = Vec::with_capacity(count);
    for j in 0..count {
        let mut v = start_vector(system.layout.dofs, j as u64);
        for _ in 0..3 {
            v = lu.solve(&v);
            let norm = v.iter().fold(0.0f64, |m, x| m.max(x.abs()));
            if norm > 0.0 && norm.is_finite() {
                v.iter_mut().for_each(|x| *x /= norm);
            }
        }
        vectors.push(v);
    }
    let mut out: Vec<ModeShape> = vectors.iter().map(|v| build(model, &system, omega, v)).collect();
    // Mass-orthonormalise a group of coincident modes (Gram–Schmidt), then normalise each.
    for i in 0..out.len() {
        for j in 0..i {
            let c = inner(model, &out[i], &out[j]) / inner(model, &out[j], &out[j]);
            let (head, tail) = out.split_at_mut(i);
            subtract(&mut tail[0], &head[j], c);
        }
    }
    if out.len() > 1 {
        // The combinations changed the piece values; sample them again.
        out = out.into_iter().map(|s| rebuild(model, &system, omega, &s)).collect();
    }
    for s in &mut out {
        normalise(s);
    }
    Ok(out)
}

fn start_vector(n: usize, seed: u64) -> Vec<f64> {
    let mut state = 0x5DEECE66D_u64 ^ seed.wrapping_mul(0x9E37_79B9_7F4A_7C15);
    (0..n)
        .map(|_| {
            state = state.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
            ((state >> 11) as f64 / (1u64 << 53) as f64) - 0.5
        })
        .collect()
}

/// The shape for a global vector of station values.
fn build(model: &Model, system: &System, omega: f64, v: &[f64]) -> ModeShape {
    let layout = &system.layout;
    let pieces: Vec<Piece> = layout
        .spans
        .iter()
        .zip(&system.members)
        .map(|(span, member)| {
            let seg = &model.segments()[span.segment];
            let q = layout.span_values(span, v);
            Piece {
                x0: layout.span_start(span),
                length: span.length,
                member: *member,
                q,
                state: member.start_state(omega, q),
                mass_per_length: seg.mass_per_length,
                rotary_inertia_per_length: match model.theory() {
                    crate::model::Theory::Timoshenko => seg.rotary_inertia_per_length,
                    crate::model::Theory::EulerBernoulli => 0.0,
                },
            }
        })
        .collect();
    let sprung: Vec<(usize, f64)> =
        layout.stations.iter().flat_map(|s| s.sprung.iter().map(|d| (d.attachment, v[d.dof]))).collect();
    let per_piece = SAMPLES.div_ceil(pieces.len()).max(2);
    let mut x = Vec::with_capacity(per_piece * pieces.len() + 1);
    let mut deflection = Vec::with_capacity(x.capacity());
    for p in &pieces {
        for j in 0..per_piece {
            let local = p.length * j as f64 / per_piece as f64;
            x.push(p.x0 + local);
            deflection.push(p.member.propagate(omega, p.state, local).0);
        }
    }
    if let Some(p) = pieces.last() {
        x.push(p.x0 + p.length);
        deflection.push(p.q[2]);
    }
    let mut shape =
        ModeShape { x, deflection, nodes: Vec::new(), sprung, generalized_mass: 0.0, pieces, omega };
    shape.generalized_mass = inner(model, &shape, &shape);
    shape
}

/// Rebuilds a shape's samples after its piece values were combined linearly.
fn rebuild(model: &Model, system: &System, omega: f64, s: &ModeShape) -> ModeShape {
    let mut v = vec![0.0; system.layout.dofs];
    for (span, p) in system.layout.spans.iter().zip(&s.pieces) {
        for (d, q) in system.layout.span_dofs(span).iter().zip(p.q) {
            if let Some(d) = d {
                v[*d] = q;
            }
        }
    }
    for st in &system.layout.stations {
        for d in &st.sprung {
            if let Some((_, a)) = s.sprung.iter().find(|(i, _)| *i == d.attachment) {
                v[d.dof] = *a;
            }
        }
    }
    build(model, system, omega, &v)
}

fn subtract(target: &mut ModeShape, other: &ModeShape, c: f64) {
    for (p, o) in target.pieces.iter_mut().zip(&other.pieces) {
        for (a, b) in p.q.iter_mut().zip(o.q).chain(p.state.iter_mut().zip(o.state)) {
            *a -= c * b;
        }
    }
    for ((_, a), (_, b)) in target.sprung.iter_mut().zip(&other.sprung) {
        *a -= c * b;
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
