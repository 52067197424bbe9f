//! The transfer matrix of a short uniform piece, and the stiffness its left end shows when the
//! right end is held: what the station sweep of the exact method carries along the beam.
//!
//! The state at a cross-section is (w, θ, Q, M): deflection, rotation (the section's rotation ψ
//! in a shear-flexible member), and the shear force and bending moment that the beam to the left
//! of the cut exerts there, Q = −EI·w‴ and M = EI·w″ for a slender member. With that sign choice
//! the force a station needs to be held at displacement u is the state's (Q, M), so a part of the
//! beam to the left of a cut is summed up by a 2×2 stiffness r with (Q, M) = r·(w, θ).
//!
//! Over a piece, state(right) = T·state(left). For a piece well below its own first
//! clamped–clamped frequency T is close to the identity whatever its length, so carrying r across
//! it by r′ = (T₂₁ + T₂₂·r)(T₁₁ + T₁₂·r)⁻¹ loses nothing to cancellation. The same update written
//! with the piece's dynamic stiffness, r′ = K₂₂ − K₂₁(r + K₁₁)⁻¹K₁₂, subtracts numbers of size
//! EI/h³ to get one of the size of r, and a piece a thousand times shorter than the beam costs
//! nine digits: that is what goes wrong when stations crowd.

/// A 2×2 matrix, row-major.
pub(crate) type Mat2 = [[f64; 2]; 2];

/// The transfer matrix of one piece in 2×2 blocks (displacements u = (w, θ), forces g = (Q, M)):
/// u₂ = t11·u₁ + t12·g₁, g₂ = t21·u₁ + t22·g₁; and `k11`, the stiffness the left end shows with
/// the right end held (the top-left block of the piece's dynamic stiffness), which is the pivot
/// of the elimination and so decides the count.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Transfer {
    pub(crate) t11: Mat2,
    pub(crate) t12: Mat2,
    pub(crate) t21: Mat2,
    pub(crate) t22: Mat2,
    pub(crate) k11: Mat2,
}

impl Transfer {
    /// Builds the blocks from a full 4×4 transfer matrix in the order (w, θ, Q, M).
    #[inline(always)]
    pub(crate) fn from_full(t: &[[f64; 4]; 4]) -> Transfer {
        let block = |r: usize, c: usize| [[t[r][c], t[r][c + 1]], [t[r + 1][c], t[r + 1][c + 1]]];
        let (t11, t12, t21, t22) = (block(0, 0), block(0, 2), block(2, 0), block(2, 2));
        // From u₂ = T₁₁u₁ + T₁₂g₁ with g₁ = −(K₁₁u₁ + K₁₂u₂) for every u₁, u₂: K₁₁ = T₁₂⁻¹T₁₁.
        let k11 = mul(&inverse(&t12), &t11);
        // Symmetric in exact arithmetic; make it so to the last bit, as the count reads its sign.
        let off = 0.5 * (k11[0][1] + k11[1][0]);
        Transfer { t11, t12, t21, t22, k11: [[k11[0][0], off], [off, k11[1][1]]] }
    }
}

/// a·b.
pub(crate) fn mul(a: &Mat2, b: &Mat2) -> Mat2 {
    [
        [a[0][0] * b[0][0] + a[0][1] * b[1][0], a[0][0] * b[0][1] + a[0][1] * b[1][1]],
        [a[1][0] * b[0][0] + a[1][1] * b[1][0], a[1][0] * b[0][1] + a[1][1] * b[1][1]],
    ]
}

/// a + b.
#[cfg(test)]
fn add(a: &Mat2, b: &Mat2) -> Mat2 {
    [[a[0][0] + b[0][0], a[0][1] + b[0][1]], [a[1][0] + b[1][0], a[1][1] + b[1][1]]]
}

/// det a.
pub(crate) fn det(a: &Mat2) -> f64 {
    a[0][0] * a[1][1] - a[0][1] * a[1][0]
}

/// a⁻¹ (infinite or NaN entries when a is singular; callers check).
pub(crate) fn inverse(a: &Mat2) -> Mat2 {
    let d = 1.0 / det(a);
    [[a[1][1] * d, -a[0][1] * d], [-a[1][0] * d, a[0][0] * d]]
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::member::{Euler, Timoshenko};

    /// The update through the transfer matrix and the one through the dynamic stiffness are the
    /// same algebra; on a piece of moderate length, where the stiffness form loses little, they
    /// must agree, and the pivot block must be the stiffness's top-left block.
    fn agrees_with_stiffness(t: &Transfer, k: &[[f64; 4]; 4]) {
        let scale = k.iter().flatten().fold(0.0f64, |m, v| m.max(v.abs()));
        for i in 0..2 {
            for j in 0..2 {
                assert!(
                    (t.k11[i][j] - k[i][j]).abs() < 1e-10 * scale,
                    "k11[{i}][{j}]: {} vs {}",
                    t.k11[i][j],
                    k[i][j]
                );
            }
        }
        let r = [[0.37 * scale, -0.11 * scale], [-0.11 * scale, 0.52 * scale]];
        let k11 = [[k[0][0], k[0][1]], [k[1][0], k[1][1]]];
        let k12 = [[k[0][2], k[0][3]], [k[1][2], k[1][3]]];
        let k21 = [[k[2][0], k[2][1]], [k[3][0], k[3][1]]];
        let k22 = [[k[2][2], k[2][3]], [k[3][2], k[3][3]]];
        let schur = mul(&k21, &mul(&inverse(&add(&r, &k11)), &k12));
        let by_stiffness = [
            [k22[0][0] - schur[0][0], k22[0][1] - schur[0][1]],
            [k22[1][0] - schur[1][0], k22[1][1] - schur[1][1]],
        ];
        let x = add(&t.t11, &mul(&t.t12, &r));
        let y = add(&t.t21, &mul(&t.t22, &r));
        let by_transfer = mul(&y, &inverse(&x));
        for i in 0..2 {
            for j in 0..2 {
                assert!(
                    (by_transfer[i][j] - by_stiffness[i][j]).abs() < 1e-9 * scale,
                    "r'[{i}][{j}]: {} vs {}",
                    by_transfer[i][j],
                    by_stiffness[i][j]
                );
            }
        }
    }

    #[test]
    fn euler_transfer_matches_its_dynamic_stiffness() {
        for (length, omega) in [(0.8, 0.0), (0.8, 3.0), (1.3, 2.5), (0.5, 30.0)] {
            let e = Euler { length, ei: 2.0, m: 3.0 };
            agrees_with_stiffness(&e.transfer(omega), &e.stiffness(omega));
        }
    }

    #[test]
    fn timoshenko_transfer_matches_its_dynamic_stiffness() {
        let t = Timoshenko { length: 0.3, ei: 2.0e4, kga: 3.0e5, m: 20.0, rho_i: 0.02 };
        for omega in [1.0, 150.0, 400.0] {
            // One piece at these frequencies, so the member's stiffness is the piece's own.
            assert_eq!(t.pieces(omega), 1, "ω = {omega}");
            let (k, count) = t.stiffness_and_count(omega).unwrap();
            assert_eq!(count, 0);
            agrees_with_stiffness(&t.transfer(omega), &k);
        }
    }

    #[test]
    fn a_very_short_piece_is_nearly_the_identity_and_its_pivot_is_its_static_stiffness() {
        // The static stiffness of a slender element, 12EI/h³, 6EI/h², 4EI/h (standard
        // finite-element result), is the pivot block's limit as the piece shrinks.
        let h = 1e-7;
        let e = Euler { length: h, ei: 2.0, m: 3.0 };
        let t = e.transfer(10.0);
        assert!((t.t11[0][0] - 1.0).abs() < 1e-15 && (t.t22[1][1] - 1.0).abs() < 1e-15);
        let expect = [[12.0 * 2.0 / h.powi(3), 6.0 * 2.0 / (h * h)], [6.0 * 2.0 / (h * h), 4.0 * 2.0 / h]];
        for i in 0..2 {
            for j in 0..2 {
                assert!((t.k11[i][j] - expect[i][j]).abs() < 1e-9 * expect[i][j].abs(), "{i}{j}");
            }
        }
    }
}
