//! The station sweep: the Wittrick–Williams count and the determinant of the dynamic stiffness
//! at a trial frequency, computed by carrying the beam's states from the left end to the right.
//!
//! Everything left of a cut is summed up by the two-dimensional set of states (u, g) it allows
//! there, u = (w, θ) and g = (Q, M) as in [`crate::member::transfer`]: a basis Z = [X; Y] of two
//! columns. It starts as the free end's (X = I, Y = 0); at a station Y takes in what is attached
//! (springs, −ω²·masses, each sprung mass condensed onto the deflection), a held deflection or
//! rotation keeps the combination of the columns that satisfies it and adds the unknown reaction
//! as a column; across a piece Z becomes T·Z; and after each piece the columns are
//! orthonormalised, so that they neither overflow nor collapse onto one direction.
//!
//! This is Gaussian elimination of the assembled K(ω) in the natural order without ever forming
//! its Schur complements r = Y·X⁻¹, which is what loses digits when stations crowd or when a
//! left part sits near its own resonance. The pivot block of each station, r + K₁₁, is congruent
//! to Xᵀ(Y + K₁₁X), so its negative eigenvalues (the count, by Sylvester's law of inertia) come
//! from well-scaled numbers. The product of the pivots telescopes: det K(ω) equals det Y at the
//! right end times a factor made of the pieces' det T₁₂⁻¹, the orthonormalisations' scales, the
//! sprung masses' pivots and det X where a station is clamped. Only det Y passes through zero, so
//! the determinant is smooth and its zeros are computed to full accuracy.
//!
//! Members are cut into pieces far below their own first clamped–clamped frequency, chosen for a
//! reference frequency at or above the trial one. The pieces then add nothing to J₀, the count is
//! the number of negative pivots, and on a fixed set of pieces the determinant is one continuous
//! function of ω whose sign changes exactly at the natural frequencies.

use crate::det::LogProduct;
use crate::error::{Error, ErrorKind, Result};
use crate::exact::System;
use crate::member::transfer::{det, Mat2, Transfer};
use crate::member::Member;
use crate::roots::Evaluation;

/// Most pieces one sweep may carry. Real models need a few hundred; more means a segment whose
/// stiffness and mass differ from the rest by so many orders of magnitude that it holds
/// thousands of waves at the frequencies asked for.
pub(crate) const MAX_PIECES: usize = 200_000;

/// How many pieces each member of `system` is cut into for frequencies up to `reference`, a
/// slender piece without axial force up to λ = `slender` (see [`Member::sweep_pieces`]).
pub(crate) fn pieces(system: &System, reference: f64, slender: f64) -> Result<Vec<usize>> {
    let mut total = 0usize;
    let mut out = Vec::with_capacity(system.members.len());
    for (span, member) in system.layout.spans.iter().zip(&system.members) {
        let n = member
            .sweep_pieces(reference, slender)
            .ok_or_else(|| too_short_in_shear(reference, span.segment))?;
        total = total.saturating_add(n);
        if total > MAX_PIECES {
            if let Member::Column(c) = member {
                // Pieces are cut so that |P|·h²/EI ≤ 1 (see `member::column`): when that is what
                // asks for them, the force is what to check.
                if c.load_parameter() >= c.lambda(reference) / crate::member::SWEEP_LAMBDA {
                    return Err(Error::new(
                        ErrorKind::Model,
                        format!(
                            "this segment's axial force is too large beside its bending stiffness to compute \
                             (|P|·L²/EI = {} over a span): check the force's unit; a member this taut is a \
                             string, whose frequencies are (n/2L)·√(P/m)",
                            crate::error::number(c.load_parameter().powi(2))
                        ),
                    )
                    .at(crate::path::FieldPath::item("segments", span.segment).key("axial_force")));
                }
            }
            return Err(Error::new(
                ErrorKind::Model,
                format!(
                    "this segment would need more than {MAX_PIECES} computation points at the frequencies asked \
                     for: its stiffness and mass differ from the rest of the beam by too many orders of magnitude \
                     (check the units), or ask for fewer modes"
                ),
            )
            .at(crate::path::FieldPath::item("segments", span.segment)));
        }
        out.push(n);
    }
    Ok(out)
}

fn too_short_in_shear(omega: f64, segment: usize) -> Error {
    Error::new(
        ErrorKind::Model,
        format!(
            "near {:.4e} Hz this segment's shear rigidity κGA is too low for its bending stiffness and rotary \
             inertia to be computed as a Timoshenko beam; check κGA and ρI (or the section)",
            omega / std::f64::consts::TAU
        ),
    )
    .at(crate::path::FieldPath::item("segments", segment))
}

/// Two states at a cut: `z[row][column]` with rows (w, θ, Q, M).
type Basis = [[f64; 2]; 4];

/// The count and the determinant at ω, with each member cut into `pieces` (from [`pieces`] at
/// a reference frequency not below ω).
pub(crate) fn evaluate(system: &System, pieces: &[usize], omega: f64) -> Evaluation {
    let w2 = omega * omega;
    let stations = &system.layout.stations;
    let last = stations.len() - 1;
    let metric = Metric::of(system);
    let mut below = 0usize;
    let mut factor = LogProduct::one();
    let mut z: Basis = [[1.0, 0.0], [0.0, 1.0], [0.0, 0.0], [0.0, 0.0]];
    let mut cached: Option<(&Member, usize, Transfer, f64)> = None;
    for (i, s) in stations.iter().enumerate() {
        let held = [s.w.is_none(), s.theta.is_none()];
        let mut a = [s.spring - w2 * s.mass, s.rotational_spring - w2 * s.rotary_inertia];
        for d in &s.sprung {
            // The sprung mass's own unknown is eliminated first: pivot k − mω², and what is left
            // of its spring acts on the deflection here (nothing when that is held).
            let p = d.stiffness - w2 * d.mass;
            below += usize::from(p < 0.0);
            factor.mul(p);
            if !held[0] {
                a[0] += d.stiffness - d.stiffness * (d.stiffness / p);
            }
        }
        for j in 0..2 {
            z[2][j] += a[0] * z[0][j];
            z[3][j] += a[1] * z[1][j];
        }
        z = constrain(z, held, &mut factor);
        if i == last {
            below += negative(&z, held, &[[0.0; 2]; 2]);
            factor.mul(det(&[[z[2][0], z[2][1]], [z[3][0], z[3][1]]]));
            break;
        }
        let member = &system.members[i];
        let n = pieces[i];
        let (t, det_t12) = match cached {
            Some((m, k, t, d)) if m == member && k == n => (t, d),
            _ => {
                let t = piece_transfer(member, n, omega);
                (t, det(&t.t12))
            }
        };
        cached = Some((member, n, t, det_t12));
        let mut held = held;
        for _ in 0..n {
            below += negative(&z, held, &t.k11);
            z = carry(&t, &z);
            factor.mul(metric.orthonormalise(&mut z) / det_t12);
            held = [false, false];
        }
    }
    Evaluation { below, sign: factor.sign(), log: factor.ln_abs() }
}

/// The transfer matrix at ω of one of `n` equal pieces of `member`: a slender member's (the
/// common case) computed inline, so that its numbers stay in the sweep's registers instead of
/// passing through memory on the way back from a call.
#[inline(always)]
fn piece_transfer(member: &Member, n: usize, omega: f64) -> Transfer {
    match member.piece(n) {
        Member::Euler(e) => e.transfer(omega),
        other => other.transfer(omega),
    }
}

/// Applies the station's held unknowns: of the two states, the combination that satisfies a held
/// deflection (or rotation) is kept and the reaction becomes the other column. A clamped station
/// keeps only the reactions; the left part's det X, singular at its own natural frequencies with
/// the station held, joins the factor.
fn constrain(z: Basis, held: [bool; 2], factor: &mut LogProduct) -> Basis {
    let combine = |c: [f64; 2]| -> [f64; 4] { std::array::from_fn(|r| z[r][0] * c[0] + z[r][1] * c[1]) };
    match held {
        [false, false] => z,
        [true, false] => {
            let k = combine([z[0][1], -z[0][0]]);
            [[0.0, 0.0], [k[1], 0.0], [k[2], 1.0], [k[3], 0.0]]
        }
        [false, true] => {
            let k = combine([z[1][1], -z[1][0]]);
            [[k[0], 0.0], [0.0, 0.0], [k[2], 0.0], [k[3], 1.0]]
        }
        [true, true] => {
            factor.mul(det(&[[z[0][0], z[0][1]], [z[1][0], z[1][1]]]));
            [[0.0, 0.0], [0.0, 0.0], [1.0, 0.0], [0.0, 1.0]]
        }
    }
}

/// The negative eigenvalues of the pivot block (Y + K·X)·X⁻¹ on the free unknowns, from the
/// congruent Xᵀ(Y + K·X); `k` is the next piece's K₁₁ (zero at the right end).
fn negative(z: &Basis, held: [bool; 2], k: &Mat2) -> usize {
    let x: Mat2 = [[z[0][0], z[0][1]], [z[1][0], z[1][1]]];
    let m: Mat2 =
        std::array::from_fn(|r| std::array::from_fn(|c| z[2 + r][c] + k[r][0] * z[0][c] + k[r][1] * z[1][c]));
    match held {
        [false, false] => {
            // det(XᵀM) = det X·det M, each from numbers of moderate size.
            let d = det(&x) * det(&m);
            if d < 0.0 {
                1
            } else {
                let s00 = x[0][0] * m[0][0] + x[1][0] * m[1][0];
                let s11 = x[0][1] * m[0][1] + x[1][1] * m[1][1];
                if s00 < 0.0 || (s00 == 0.0 && s11 < 0.0) {
                    2
                } else {
                    0
                }
            }
        }
        // One free unknown: the kept state is the first column.
        [true, false] => usize::from(x[1][0] * m[1][0] < 0.0),
        [false, true] => usize::from(x[0][0] * m[0][0] < 0.0),
        [true, true] => 0,
    }
}

/// T·Z.
fn carry(t: &Transfer, z: &Basis) -> Basis {
    let mut out = [[0.0; 2]; 4];
    for c in 0..2 {
        let (u, g) = ([z[0][c], z[1][c]], [z[2][c], z[3][c]]);
        for r in 0..2 {
            out[r][c] = t.t11[r][0] * u[0] + t.t11[r][1] * u[1] + t.t12[r][0] * g[0] + t.t12[r][1] * g[1];
            out[2 + r][c] = t.t21[r][0] * u[0] + t.t21[r][1] * u[1] + t.t22[r][0] * g[0] + t.t22[r][1] * g[1];
        }
    }
    out
}

/// The weights of the inner product, from the scales that make the four rows of a state
/// comparable (each a length): w, θ·ℓ, Q·ℓ³/EI, M·ℓ²/EI, with ℓ the beam's length and EI its
/// first segment's, each scale to the fourth power. Orthonormalising in this measure keeps the
/// two columns well apart whatever the units.
struct Metric([f64; 4]);

impl Metric {
    fn of(system: &System) -> Metric {
        let length = system.layout.stations.last().map_or(1.0, |s| s.x).max(f64::MIN_POSITIVE);
        let ei = system.members.first().map_or(1.0, Member::flexural_rigidity);
        let weights = [1.0, length, length.powi(3) / ei, length * length / ei];
        Metric(weights.map(|w| (w * w) * (w * w)))
    }

    /// Gram–Schmidt on the two columns; returns the product of their lengths before scaling,
    /// which joins the factor to keep det Y·factor unchanged.
    ///
    /// The column whose (w, θ) is the smaller part of it is normalised first and the other made
    /// orthogonal to it: subtracting a multiple of that column changes the other's (w, θ) by a
    /// multiple of its own small ones, which costs them no digits. The other order loses them
    /// just past a held deflection, where the reaction's column is almost all force: a piece a
    /// hair long then leaves its (w, θ) far below the rounding of the other column's, and the
    /// count at the next station, which rests on them, came out wrong.
    fn orthonormalise(&self, z: &mut Basis) -> f64 {
        let d = &self.0;
        let term = |z: &Basis, r: usize, a: usize, b: usize| d[r] * z[r][a] * z[r][b];
        let motion = |z: &Basis, c: usize| term(z, 0, c, c) + term(z, 1, c, c);
        let dot = |z: &Basis, a: usize, b: usize| {
            term(z, 0, a, b) + term(z, 1, a, b) + term(z, 2, a, b) + term(z, 3, a, b)
        };
        let squares = [dot(z, 0, 0), dot(z, 1, 1)];
        // (w, θ) as a share of each column, compared without dividing: m₁/n₁ < m₀/n₀.
        let (first, second) =
            if motion(z, 1) * squares[0] < motion(z, 0) * squares[1] { (1, 0) } else { (0, 1) };
        // Scaled by reciprocals: the columns' lengths only need to be near 1, and the factor
        // below takes the lengths themselves.
        let n0 = squares[first].sqrt();
        let inverse = 1.0 / n0;
        for row in z.iter_mut() {
            row[first] *= inverse;
        }
        let p = dot(z, first, second);
        for row in z.iter_mut() {
            row[second] -= p * row[first];
        }
        let n1 = dot(z, second, second).sqrt();
        let inverse = 1.0 / n1;
        for row in z.iter_mut() {
            row[second] *= inverse;
        }
        n0 * n1
    }
}
