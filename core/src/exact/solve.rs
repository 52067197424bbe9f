//! Solving K(ω)·x = f with the station sweep: the beam's response to loads at its stations, and,
//! at a natural frequency, its mode shape by inverse iteration.
//!
//! The forward sweep of [`super::sweep`] is made affine: the left part's states at a cut are
//! Z·c + z₀, the basis Z as before and z₀ one particular state that carries the loads met so
//! far. Each step is recorded (the orthonormalisation's R and the share of z₀ taken into the
//! basis, each station's held combination), so that once the right end fixes c the steps are
//! undone from right to left and give the state (w, θ, Q, M) at every cut. Nothing is ever
//! divided by a near-zero pivot except where K(ω) itself is nearly singular — at a natural
//! frequency, where the response grows along the mode as inverse iteration wants.

use crate::exact::System;
use crate::member::transfer::{det, inverse, Mat2, Transfer};
use crate::member::Member;

/// The response at every cut: the state at the start of each piece, and each sprung mass's
/// displacement.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Response {
    /// (left end x, the piece as a member of its own length, state (w, θ, Q, M) at its left end
    /// just right of the station).
    pub(crate) pieces: Vec<(f64, Member, [f64; 4])>,
    /// (index of the attachment in the model, displacement) of each sprung mass, in the order of
    /// the stations and of each station's `sprung`, the order [`StationLoad::sprung`] is given in.
    pub(crate) sprung: Vec<(usize, f64)>,
}

/// Loads at one station: on the deflection and the rotation, and on each sprung mass there (in
/// the order of the station's `sprung`).
#[derive(Clone, Debug, Default, PartialEq)]
pub(crate) struct StationLoad {
    pub(crate) force: [f64; 2],
    pub(crate) sprung: Vec<f64>,
}

type Basis = [[f64; 2]; 4];

/// What undoing one step needs.
enum Step {
    /// A station: the basis and particular state just after it (attachments and restraints
    /// applied), and how its coefficients map to those before.
    Station { after: Basis, particular: [f64; 4], back: Restraint, sprung: Vec<(usize, f64, f64, f64)> },
    /// A piece carried and orthonormalised: T·(Z·c + z₀) = Q·(R·c + p) + z₀′.
    Piece { r: Mat2, p: [f64; 2] },
}

/// How a station's held unknowns changed the coefficients: state after = Z′·c′ + z₀′ with the
/// state before = Z·c + z₀ where c = `combine`·c′₀ − `shift`.
enum Restraint {
    None,
    One {
        combine: [f64; 2],
        shift: [f64; 2],
    },
    /// Clamped: the coefficients before are fixed, c = `fixed`.
    Both {
        fixed: [f64; 2],
    },
}

/// The response of `system` at ω to `loads` (one per station), with each member cut into
/// `pieces`.
pub(crate) fn respond(system: &System, pieces: &[usize], omega: f64, loads: &[StationLoad]) -> Response {
    let w2 = omega * omega;
    let stations = &system.layout.stations;
    let last = stations.len() - 1;
    let mut z: Basis = [[1.0, 0.0], [0.0, 1.0], [0.0, 0.0], [0.0, 0.0]];
    let mut z0 = [0.0; 4];
    let mut steps: Vec<Step> = Vec::new();
    let mut placed: Vec<(f64, Member)> = Vec::new();
    for (i, s) in stations.iter().enumerate() {
        let held = [s.w.is_none(), s.theta.is_none()];
        let load = loads.get(i).cloned().unwrap_or_default();
        let mut a = [s.spring - w2 * s.mass, s.rotational_spring - w2 * s.rotary_inertia];
        let mut force = load.force;
        let mut sprung = Vec::new();
        for (k, d) in s.sprung.iter().enumerate() {
            // p·d − k·w = f_d: the spring passes (k − k²/p)·w − k·f_d/p to the beam. At the sprung
            // mass's own frequency p vanishes; a pivot of rounding size stands in for it, the
            // usual device of inverse iteration (the response then grows along that mode).
            let p = d.stiffness - w2 * d.mass;
            let p = if p.abs() < f64::EPSILON * d.stiffness { f64::EPSILON * d.stiffness } else { p };
            let fd = load.sprung.get(k).copied().unwrap_or(0.0);
            if !held[0] {
                a[0] += d.stiffness - d.stiffness * (d.stiffness / p);
                force[0] += d.stiffness * fd / p;
            }
            sprung.push((d.attachment, p, d.stiffness, fd));
        }
        for j in 0..2 {
            z[2][j] += a[0] * z[0][j];
            z[3][j] += a[1] * z[1][j];
        }
        z0[2] += a[0] * z0[0] - force[0];
        z0[3] += a[1] * z0[1] - force[1];
        let back;
        (z, z0, back) = restrain(z, z0, held);
        steps.push(Step::Station { after: z, particular: z0, back, sprung });
        if i == last {
            break;
        }
        let member = &system.members[i];
        let n = pieces[i];
        let t = member.piece_transfer(n, omega);
        let piece = member.piece(n);
        let x0 = s.x;
        let h = (stations[i + 1].x - x0) / n as f64;
        for k in 0..n {
            placed.push((x0 + h * k as f64, piece));
            let (nz, nz0, r, p) = carry(&t, &z, &z0);
            (z, z0) = (nz, nz0);
            steps.push(Step::Piece { r, p });
            if k + 1 < n {
                // An interior cut: nothing attached, nothing held.
                steps.push(Step::Station {
                    after: z,
                    particular: z0,
                    back: Restraint::None,
                    sprung: Vec::new(),
                });
            }
        }
    }
    // The right end: no force passes beyond it, g = Y·c + y₀ = 0.
    let e: Mat2 = [[z[2][0], z[2][1]], [z[3][0], z[3][1]]];
    let mut c = solve2(&e, [-z0[2], -z0[3]]);
    // Undo the steps from right to left.
    let mut states: Vec<[f64; 4]> = Vec::with_capacity(placed.len());
    let mut sprung_out = Vec::new();
    for step in steps.iter().rev() {
        match step {
            Step::Piece { r, p } => {
                // c_after = R·c_before + p.
                c = solve2(r, [c[0] - p[0], c[1] - p[1]]);
            }
            Step::Station { after, particular, back, sprung } => {
                let state: [f64; 4] =
                    std::array::from_fn(|row| after[row][0] * c[0] + after[row][1] * c[1] + particular[row]);
                states.push(state);
                // Backwards within the station too, so that the list reversed at the end runs in
                // the stations' order and each station's own (the order its loads are given in).
                for &(attachment, p, k, fd) in sprung.iter().rev() {
                    sprung_out.push((attachment, (fd + k * state[0]) / p));
                }
                c = match back {
                    Restraint::None => c,
                    Restraint::One { combine, shift } => {
                        [combine[0] * c[0] - shift[0], combine[1] * c[0] - shift[1]]
                    }
                    Restraint::Both { fixed } => *fixed,
                };
            }
        }
    }
    states.reverse();
    sprung_out.reverse();
    // One state per cut in order; the last is the right end, which starts no piece.
    let pieces = placed.into_iter().zip(states).map(|((x, m), s)| (x, m, s)).collect();
    Response { pieces, sprung: sprung_out }
}

/// Applies held unknowns to Z·c + z₀ (see [`Restraint`]).
fn restrain(z: Basis, z0: [f64; 4], held: [bool; 2]) -> (Basis, [f64; 4], Restraint) {
    let column = |c: [f64; 2]| -> [f64; 4] { std::array::from_fn(|r| z[r][0] * c[0] + z[r][1] * c[1]) };
    match held {
        [false, false] => (z, z0, Restraint::None),
        [true, true] => {
            // u = X·c + u₀ = 0 fixes c; only the reactions remain free.
            let x: Mat2 = [[z[0][0], z[0][1]], [z[1][0], z[1][1]]];
            let fixed = solve2(&x, [-z0[0], -z0[1]]);
            ([[0.0, 0.0], [0.0, 0.0], [1.0, 0.0], [0.0, 1.0]], [0.0; 4], Restraint::Both { fixed })
        }
        [w, _] => {
            // One held row h: keep the combination with zero there, move z₀ onto it, and let the
            // reaction (a unit force on that row) be the second column.
            let h = if w { 0 } else { 1 };
            let combine = [z[h][1], -z[h][0]];
            let j = if z[h][0].abs() >= z[h][1].abs() { 0 } else { 1 };
            let s = if z[h][j] == 0.0 { 0.0 } else { z0[h] / z[h][j] };
            let mut shift = [0.0; 2];
            shift[j] = s;
            let kept = column(combine);
            let mut particular: [f64; 4] = std::array::from_fn(|r| z0[r] - s * z[r][j]);
            particular[h] = 0.0;
            let mut next: Basis = [[0.0; 2]; 4];
            for r in 0..4 {
                next[r][0] = if r == h { 0.0 } else { kept[r] };
            }
            next[2 + h][1] = 1.0;
            (next, particular, Restraint::One { combine, shift })
        }
    }
}

/// T·(Z·c + z₀) written as Q·(R·c + p) + z₀′ with Q orthonormal (in the sweep's plain measure
/// of the scaled state, here unweighted: the response only needs the steps undone exactly).
fn carry(t: &Transfer, z: &Basis, z0: &[f64; 4]) -> (Basis, [f64; 4], Mat2, [f64; 2]) {
    let apply = |v: [f64; 4]| -> [f64; 4] {
        let (u, g) = ([v[0], v[1]], [v[2], v[3]]);
        let mut out = [0.0; 4];
        for r in 0..2 {
            out[r] = t.t11[r][0] * u[0] + t.t11[r][1] * u[1] + t.t12[r][0] * g[0] + t.t12[r][1] * g[1];
            out[2 + r] = t.t21[r][0] * u[0] + t.t21[r][1] * u[1] + t.t22[r][0] * g[0] + t.t22[r][1] * g[1];
        }
        out
    };
    let a = apply([z[0][0], z[1][0], z[2][0], z[3][0]]);
    let b = apply([z[0][1], z[1][1], z[2][1], z[3][1]]);
    let v = apply(*z0);
    let dot = |x: &[f64; 4], y: &[f64; 4]| (0..4).map(|i| x[i] * y[i]).sum::<f64>();
    let r00 = dot(&a, &a).sqrt();
    let q0: [f64; 4] = a.map(|x| x / r00);
    let r01 = dot(&q0, &b);
    let b1: [f64; 4] = std::array::from_fn(|i| b[i] - r01 * q0[i]);
    let r11 = dot(&b1, &b1).sqrt();
    let q1: [f64; 4] = b1.map(|x| x / r11);
    let p = [dot(&q0, &v), dot(&q1, &v)];
    let rest: [f64; 4] = std::array::from_fn(|i| v[i] - p[0] * q0[i] - p[1] * q1[i]);
    let q: Basis = std::array::from_fn(|r| [q0[r], q1[r]]);
    (q, rest, [[r00, r01], [0.0, r11]], p)
}

/// a⁻¹·b, falling back to the direction a maps to zero (scaled large) when a is singular to
/// rounding: at a natural frequency that direction is the mode, which is what is wanted.
fn solve2(a: &Mat2, b: [f64; 2]) -> [f64; 2] {
    let d = det(a);
    let scale = a.iter().flatten().fold(0.0f64, |m, v| m.max(v.abs()));
    if d.abs() > 1e-300 && d.abs() > f64::EPSILON * f64::EPSILON * scale * scale * 1e-8 {
        let inv = inverse(a);
        return [inv[0][0] * b[0] + inv[0][1] * b[1], inv[1][0] * b[0] + inv[1][1] * b[1]];
    }
    // Null vector of the row with more weight.
    let row = if a[0][0].abs() + a[0][1].abs() >= a[1][0].abs() + a[1][1].abs() { 0 } else { 1 };
    let v = if a[row][0] == 0.0 && a[row][1] == 0.0 { [1.0, 0.0] } else { [a[row][1], -a[row][0]] };
    let big = 1e150 / (v[0].abs() + v[1].abs()).max(f64::MIN_POSITIVE);
    [v[0] * big, v[1] * big]
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::layout::Layout;
    use crate::model::{Attachment, End, Model, ModelParts, Segment, Theory};

    #[test]
    fn static_response_matches_the_assembled_solve() {
        // The same loads through nalgebra's dense LU of the assembled K(ω) on the same stations.
        let model = Model::new(ModelParts {
            segments: vec![Segment::slender(1.2, 3.0, 1.5), Segment::slender(0.8, 1.0, 0.5)],
            left: End::Elastic { translational: 40.0, rotational: 3.0 },
            right: End::Pinned,
            attachments: vec![
                Attachment::Support { position: 0.7 },
                Attachment::Mass { position: 1.5, mass: 0.3, rotary_inertia: 0.01 },
                Attachment::SprungMass { position: 1.5, mass: 0.2, stiffness: 9.0 },
                Attachment::RotationalSpring { position: 0.4, stiffness: f64::INFINITY },
            ],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let system = System::new(&model, Layout::new(&model, &|_| 1).unwrap());
        let omega = 2.3;
        let pieces = vec![1; system.members.len()];
        let loads: Vec<StationLoad> = system
            .layout
            .stations
            .iter()
            .enumerate()
            .map(|(i, s)| StationLoad {
                force: [0.3 + i as f64, -0.2 * i as f64],
                sprung: s.sprung.iter().map(|_| 0.7).collect(),
            })
            .collect();
        let response = respond(&system, &pieces, omega, &loads);
        let k = system.assemble(omega);
        let n = system.layout.dofs();
        let dense = nalgebra::DMatrix::from_fn(n, n, |i, j| k.get(i, j));
        let mut f = nalgebra::DVector::zeros(n);
        for (s, l) in system.layout.stations.iter().zip(&loads) {
            if let Some(w) = s.w {
                f[w] = l.force[0];
            }
            if let Some(t) = s.theta {
                f[t] = l.force[1];
            }
            for (d, fd) in s.sprung.iter().zip(&l.sprung) {
                f[d.dof] = *fd;
            }
        }
        let x = dense.lu().solve(&f).unwrap();
        for ((_, _, state), s) in response.pieces.iter().zip(&system.layout.stations) {
            let w = s.w.map_or(0.0, |i| x[i]);
            let t = s.theta.map_or(0.0, |i| x[i]);
            assert!((state[0] - w).abs() < 1e-10 * (1.0 + w.abs()), "w at {}: {} vs {w}", s.x, state[0]);
            assert!((state[1] - t).abs() < 1e-10 * (1.0 + t.abs()), "θ at {}: {} vs {t}", s.x, state[1]);
        }
        let d = system.layout.stations.iter().flat_map(|s| &s.sprung).next().unwrap();
        assert!((response.sprung[0].1 - x[d.dof]).abs() < 1e-10 * (1.0 + x[d.dof].abs()));
    }
}
