//! Static flexibilities at every station, exact, in time and memory linear in the number of
//! stations: what Dunkerley's sum needs at each attached mass.
//!
//! Two sweeps at ω = 0, one from each end, give at every station the stiffness that the beam on
//! either side presents there (a 2×2 matrix on deflection and rotation), carried across each
//! piece as in [`super::sweep`] but as the matrix r itself, which is safe at ω = 0: the pivots of a
//! restrained beam's static stiffness are positive definite, so nothing passes through a pole.
//! The flexibility at a station is the inverse of the sum of the two sides and what is attached
//! there, on the unknowns that are free.

use crate::exact::System;
use crate::member::transfer::{inverse, mul, Mat2};

/// The static compliance at each station of `system` (its layout's stations in order), on the
/// free unknowns (held rows and columns zero); `None` when the beam has no static stiffness
/// there (it is not held against rigid-body motion).
pub(crate) fn compliances(system: &System) -> Option<Vec<Mat2>> {
    let stations = &system.layout.stations;
    let n = stations.len();
    let held: Vec<[bool; 2]> = stations.iter().map(|s| [s.w.is_none(), s.theta.is_none()]).collect();
    let local: Vec<Mat2> = stations.iter().map(|s| [[s.spring, 0.0], [0.0, s.rotational_spring]]).collect();
    // From the left: the stiffness of everything left of each station, before its own springs.
    let left = side(system, &held, &local, false);
    // From the right, on the mirrored beam (x → L − x turns θ and the moment's work-conjugate
    // force round), mapped back with S = diag(1, −1).
    let mirrored = side(system, &held, &local, true);
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        let r = &mirrored[n - 1 - i];
        let right = [[r[0][0], -r[0][1]], [-r[1][0], r[1][1]]];
        let k: Mat2 =
            std::array::from_fn(|a| std::array::from_fn(|b| left[i][a][b] + local[i][a][b] + right[a][b]));
        out.push(invert_free(&k, held[i])?);
    }
    Some(out)
}

/// The stiffness arriving at each station from one side (the stations' own springs excluded).
fn side(system: &System, held: &[[bool; 2]], local: &[Mat2], mirrored: bool) -> Vec<Mat2> {
    let n = held.len();
    let order: Vec<usize> = if mirrored { (0..n).rev().collect() } else { (0..n).collect() };
    let mut out = vec![[[0.0; 2]; 2]; n];
    let mut r: Mat2 = [[0.0; 2]; 2];
    for (step, &i) in order.iter().enumerate() {
        out[step] = r;
        if step + 1 == n {
            break;
        }
        let with_local: Mat2 = std::array::from_fn(|a| std::array::from_fn(|b| r[a][b] + local[i][a][b]));
        let member = &system.members[if mirrored { i - 1 } else { i }];
        let t = member.piece_transfer(1, 0.0);
        r = carry(&with_local, held[i], &t);
    }
    out
}

/// r carried across a piece with transfer blocks `t`, a held unknown entering as an unknown
/// reaction (the state u = 0, g = eⱼ).
fn carry(r: &Mat2, held: [bool; 2], t: &crate::member::transfer::Transfer) -> Mat2 {
    let free = [!held[0], !held[1]];
    let u: Mat2 = [[f64::from(u8::from(free[0])), 0.0], [0.0, f64::from(u8::from(free[1]))]];
    let g: Mat2 = std::array::from_fn(|a| {
        std::array::from_fn(|j| match (free[j], free[a]) {
            (true, true) => r[a][j],
            (true, false) => 0.0,
            (false, _) => f64::from(u8::from(a == j)),
        })
    });
    let sum =
        |p: Mat2, q: Mat2| -> Mat2 { std::array::from_fn(|a| std::array::from_fn(|b| p[a][b] + q[a][b])) };
    let x = sum(mul(&t.t11, &u), mul(&t.t12, &g));
    let y = sum(mul(&t.t21, &u), mul(&t.t22, &g));
    let next = mul(&y, &inverse(&x));
    let off = 0.5 * (next[0][1] + next[1][0]);
    [[next[0][0], off], [off, next[1][1]]]
}

/// The inverse of `k` on its free unknowns, zero on the held ones; `None` when that block is not
/// positive definite (the beam is free to move as a rigid body).
fn invert_free(k: &Mat2, held: [bool; 2]) -> Option<Mat2> {
    match held {
        [false, false] => {
            let d = k[0][0] * k[1][1] - k[0][1] * k[1][0];
            (d > 0.0 && k[0][0] > 0.0 && d.is_finite()).then(|| inverse(k))
        }
        [true, false] => (k[1][1] > 0.0).then(|| [[0.0, 0.0], [0.0, 1.0 / k[1][1]]]),
        [false, true] => (k[0][0] > 0.0).then(|| [[1.0 / k[0][0], 0.0], [0.0, 0.0]]),
        [true, true] => Some([[0.0; 2]; 2]),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::layout::Layout;
    use crate::model::{Attachment, End, Model, ModelParts, Segment, Theory};

    fn beam(left: End, right: End, extra: &[f64]) -> (Model, System) {
        let model = Model::new(ModelParts {
            segments: vec![Segment::slender(2.0, 3.0, 1.0)],
            left,
            right,
            attachments: vec![Attachment::Spring { position: 1.2, stiffness: 0.5 }],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let layout = Layout::with_points(&model, extra, &|_| 1).unwrap();
        (model.clone(), System::new(&model, layout))
    }

    #[test]
    fn flexibilities_match_the_textbook_deflections() {
        // Simply supported span L under a point load at a: δ = a²b²/(3EIL); cantilever tip:
        // δ = L³/(3EI), rotation L/EI under a tip moment (Roark's Formulas for Stress and Strain,
        // beam tables — from memory). The spring at 1.2 is far stiffer than nothing but is
        // removed here by checking a model without it.
        let model = Model::new(ModelParts {
            segments: vec![Segment::slender(2.0, 3.0, 1.0)],
            left: End::Pinned,
            right: End::Pinned,
            attachments: vec![],
            theory: Theory::EulerBernoulli,
        })
        .unwrap();
        let layout = Layout::with_points(&model, &[0.5], &|_| 1).unwrap();
        let c = compliances(&System::new(&model, layout)).unwrap();
        let (a, b) = (0.5, 1.5);
        assert!((c[1][0][0] - a * a * b * b / (3.0 * 3.0 * 2.0)).abs() < 1e-13);
        let cantilever =
            Model::new(ModelParts { left: End::Clamped, right: End::Free, ..model.parts().clone() }).unwrap();
        let c = compliances(&System::new(&cantilever, Layout::new(&cantilever, &|_| 1).unwrap())).unwrap();
        let tip = c.last().unwrap();
        assert!((tip[0][0] - 8.0 / 9.0).abs() < 1e-13 && (tip[1][1] - 2.0 / 3.0).abs() < 1e-13);
        assert_eq!(c[0], [[0.0; 2]; 2]);
    }

    #[test]
    fn flexibilities_agree_with_a_dense_solve_of_the_same_beam() {
        // The same flexibilities from the inverse of the assembled static stiffness (nalgebra).
        let (_, system) =
            beam(End::Elastic { translational: 4.0, rotational: 1.0 }, End::Pinned, &[0.3, 0.9, 1.7]);
        let c = compliances(&system).unwrap();
        let k = system.assemble(0.0);
        let n = system.layout.dofs();
        let dense = nalgebra::DMatrix::from_fn(n, n, |i, j| k.get(i, j)).try_inverse().unwrap();
        for (s, ci) in system.layout.stations.iter().zip(&c) {
            if let Some(w) = s.w {
                assert!((ci[0][0] - dense[(w, w)]).abs() < 1e-12 * dense[(w, w)].abs(), "at {}", s.x);
            }
            if let Some(t) = s.theta {
                assert!((ci[1][1] - dense[(t, t)]).abs() < 1e-12 * dense[(t, t)].abs(), "at {}", s.x);
            }
        }
    }
}
