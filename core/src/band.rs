//! Symmetric banded matrices: assembly, LDLᵀ inertia and determinant, and solves.
//!
//! Every matrix the solvers build (dynamic stiffness K(ω), finite-element K − σM) couples only
//! neighbouring stations, so it is stored by its lower band. The LDLᵀ factorisation runs without
//! row interchanges because the Wittrick–Williams and Sturm counts need exactly the pivots of
//! Gaussian elimination in the natural order; the number of negative pivots is the number of
//! negative eigenvalues (Sylvester's law of inertia).

/// A symmetric n×n matrix with half-bandwidth `b`: entry (i, j) is zero when |i − j| > b.
#[derive(Clone, Debug)]
pub(crate) struct SymBand {
    n: usize,
    b: usize,
    /// Row-major lower band: `data[i * (b + 1) + k]` holds A[i][i − k].
    data: Vec<f64>,
}

/// Calls `$kernel::<B>()` with the half-bandwidth as a constant for the narrow bands of beams
/// (1 to 6), so that the kernels' short inner loops unroll; any other width runs the same kernel
/// with `B = 0`, which reads the width at run time. The WebAssembly build keeps the general
/// kernel alone: there the size of what every page downloads is budgeted, and the operations
/// (so the results, to the last bit) are the same either way.
macro_rules! by_width {
    ($band:expr, $kernel:ident) => {{
        #[cfg(target_arch = "wasm32")]
        let result = $band.$kernel::<0>();
        #[cfg(not(target_arch = "wasm32"))]
        let result = match $band.b {
            1 => $band.$kernel::<1>(),
            2 => $band.$kernel::<2>(),
            3 => $band.$kernel::<3>(),
            4 => $band.$kernel::<4>(),
            5 => $band.$kernel::<5>(),
            6 => $band.$kernel::<6>(),
            _ => $band.$kernel::<0>(),
        };
        result
    }};
}

impl SymBand {
    /// A zero matrix.
    pub(crate) fn zeros(n: usize, b: usize) -> SymBand {
        SymBand { n, b, data: vec![0.0; n * (b + 1)] }
    }

    /// Adds `v` to A[i][j] (and so to A[j][i]).
    ///
    /// # Panics
    /// If |i − j| exceeds the bandwidth: the assembler sized the band wrongly, a programming error.
    pub(crate) fn add(&mut self, i: usize, j: usize, v: f64) {
        let (hi, lo) = if i >= j { (i, j) } else { (j, i) };
        let k = hi - lo;
        assert!(k <= self.b && hi < self.n, "entry ({i}, {j}) lies outside the band");
        self.data[hi * (self.b + 1) + k] += v;
    }

    /// A[i][j].
    pub(crate) fn get(&self, i: usize, j: usize) -> f64 {
        let (hi, lo) = if i >= j { (i, j) } else { (j, i) };
        let k = hi - lo;
        if k > self.b || hi >= self.n {
            0.0
        } else {
            self.data[hi * (self.b + 1) + k]
        }
    }

    /// y = A·x.
    pub(crate) fn mul(&self, x: &[f64]) -> Vec<f64> {
        let mut y = vec![0.0; self.n];
        for i in 0..self.n {
            for k in 0..=self.b.min(i) {
                let j = i - k;
                let a = self.data[i * (self.b + 1) + k];
                y[i] += a * x[j];
                if k > 0 {
                    y[j] += a * x[i];
                }
            }
        }
        y
    }

    /// xᵀ·A·y.
    pub(crate) fn form(&self, x: &[f64], y: &[f64]) -> f64 {
        self.mul(y).iter().zip(x).map(|(a, b)| a * b).sum()
    }

    /// A − s·B for two matrices of the same shape (bandwidth the larger of the two).
    pub(crate) fn minus_scaled(&self, s: f64, other: &SymBand) -> SymBand {
        debug_assert_eq!(self.n, other.n);
        if self.b == other.b {
            let data = self.data.iter().zip(&other.data).map(|(a, m)| a - s * m).collect();
            return SymBand { n: self.n, b: self.b, data };
        }
        let b = self.b.max(other.b);
        let mut out = SymBand::zeros(self.n, b);
        for i in 0..self.n {
            for k in 0..=b.min(i) {
                out.data[i * (b + 1) + k] = self.get(i, i - k) - s * other.get(i, i - k);
            }
        }
        out
    }

    /// In-place LDLᵀ without interchanges; returns the pivots. The strict lower band of `data`
    /// then holds L.
    fn factor_in_place(&mut self) -> Vec<f64> {
        by_width!(self, factor_kernel)
    }

    /// [`SymBand::factor_in_place`] for half-bandwidth `B`, or for `self.b` when `B` is 0.
    /// Right-looking: each pivot's column is scaled into L, and the block of the band below and
    /// right of the pivot loses L·d·Lᵀ at once.
    fn factor_kernel<const B: usize>(&mut self) -> Vec<f64> {
        let n = self.n;
        let b = if B > 0 { B } else { self.b };
        let w = b + 1;
        let mut d = vec![0.0; n];
        // The pivot's column before scaling, a(j + i, j) for i = 1..=b.
        let mut column = vec![0.0; b];
        for j in 0..n {
            d[j] = self.data[j * w];
            let m = b.min(n - 1 - j);
            if B > 0 && m == B {
                ldl_step(&mut self.data, j, w, B, &mut [0.0; B]);
            } else {
                ldl_step(&mut self.data, j, w, m, &mut column);
            }
        }
        d
    }

    /// The inertia count and the determinant from one LDLᵀ factorisation without
    /// interchanges: the Sturm count and the root function of the finite-element search. Without
    /// pivoting a pivot can be tiny where a leading minor is nearly singular; the determinant is
    /// still the product of the pivots. An exactly zero pivot before the last spoils the rest of
    /// the factorisation and shows as a NaN sign, on which the search moves the trial frequency;
    /// a zero last pivot is a zero determinant, a trial on the root to rounding.
    pub(crate) fn into_evaluation(mut self) -> crate::roots::Evaluation {
        let d = self.factor_in_place();
        let mut product = crate::det::LogProduct::one();
        let mut below = 0;
        for p in &d {
            below += usize::from(*p < 0.0);
            product.mul(*p);
        }
        let sign = if d.iter().all(|p| p.is_finite()) { product.sign() } else { f64::NAN };
        crate::roots::Evaluation { below, sign, log: product.ln_abs() }
    }

    /// The LDLᵀ factorisation without interchanges, kept for solving. For the inertia of a
    /// matrix and for solves where moderate accuracy near a singular point is enough (the
    /// pivoted [`SymBand::lu`] is the stable choice otherwise).
    pub(crate) fn ldlt(mut self) -> Ldlt {
        let d = self.factor_in_place();
        Ldlt { factors: self, d }
    }

    /// Solves A·x = r for a symmetric positive definite A. Returns `None` when a pivot is not
    /// positive (the matrix is singular or indefinite).
    pub(crate) fn solve_positive(&self, rhs: &[Vec<f64>]) -> Option<Vec<Vec<f64>>> {
        let mut f = self.clone();
        let d = f.factor_in_place();
        let scale = (0..self.n).map(|i| self.data[i * (self.b + 1)].abs()).fold(0.0, f64::max);
        if d.iter().any(|p| !(p.is_finite() && *p > 1e-14 * scale)) {
            return None;
        }
        let (n, b, w) = (self.n, self.b, self.b + 1);
        Some(
            rhs.iter()
                .map(|r| {
                    let mut x = r.clone();
                    for i in 0..n {
                        for k in i.saturating_sub(b)..i {
                            x[i] -= f.data[i * w + (i - k)] * x[k];
                        }
                    }
                    for i in 0..n {
                        x[i] /= d[i];
                    }
                    for i in (0..n).rev() {
                        for r in (i + 1)..n.min(i + b + 1) {
                            x[i] -= f.data[r * w + (r - i)] * x[r];
                        }
                    }
                    x
                })
                .collect(),
        )
    }

    /// LU factorisation with partial pivoting, for matrices that may be indefinite and nearly
    /// singular: a stable determinant near a natural frequency, and inverse iteration there.
    ///
    /// The unblocked band algorithm of LAPACK's `dgbtf2`: column-major band storage with room for
    /// the b extra super-diagonals that row interchanges fill in.
    pub(crate) fn lu(&self) -> BandLu {
        by_width!(self, lu_kernel)
    }

    /// [`SymBand::lu`] for half-bandwidth `B`, or for `self.b` when `B` is 0.
    fn lu_kernel<const B: usize>(&self) -> BandLu {
        let n = self.n;
        let kl = if B > 0 { B } else { self.b };
        let ku = kl;
        let ld = 2 * kl + ku + 1;
        let kv = kl + ku; // storage row of the diagonal
        let mut ab = vec![0.0; ld * n];
        // Copy the lower band (row i, offset k = i − j) and its mirror above the diagonal.
        let w = kl + 1;
        for i in 0..n {
            for k in 0..=kl.min(i) {
                let v = self.data[i * w + k];
                let j = i - k;
                ab[j * ld + kv + k] = v; // A[i][j], i ≥ j
                ab[i * ld + kv - k] = v; // A[j][i]
            }
        }
        let mut pivots = vec![0usize; n];
        let mut ju = 0usize;
        for j in 0..n {
            let km = kl.min(n - 1 - j);
            let column = j * ld + kv;
            let mut p = 0;
            for i in 1..=km {
                if ab[column + i].abs() > ab[column + p].abs() {
                    p = i;
                }
            }
            pivots[j] = j + p;
            if ab[column + p] == 0.0 {
                continue;
            }
            ju = ju.max((j + ku + p).min(n - 1));
            if p != 0 {
                // Swap rows j and j + p in columns j..=ju.
                for c in j..=ju {
                    let base = c * ld + kv;
                    ab.swap(base + j - c, base + j + p - c);
                }
            }
            // Scale the multipliers below the pivot; columns j + 1 ..= ju lie after them in
            // storage, so they are updated through the second half of one split.
            let (head, tail) = ab.split_at_mut(column + km + 1);
            let inverse = 1.0 / head[column];
            let l = &mut head[column + 1..];
            for m in l.iter_mut() {
                *m *= inverse;
            }
            if ju == j {
                continue; // nothing right of the pivot (the last column, or a diagonal matrix)
            }
            // Row j of column c sits at `top` in `tail`, the rows below it follow; from one
            // column to the next that place moves by ld − 1. For c = j + 1 that is
            // (j + 1)·ld + kv − 1 in `ab`, less the length of `head`.
            let top = ld - km - 2;
            if B > 0 && km == B {
                let l: [f64; B] = std::array::from_fn(|i| l[i]);
                lu_update(tail, top, ju - j, ld - 1, &l);
            } else {
                lu_update(tail, top, ju - j, ld - 1, l);
            }
        }
        let scale = self.data.iter().fold(0.0f64, |m, v| m.max(v.abs())).max(f64::MIN_POSITIVE);
        BandLu { n, kl, ld, ab, pivots, scale }
    }
}

/// One step of the right-looking LDLᵀ at pivot j: scales the `m` entries below the pivot into
/// L (keeping them unscaled in `column`) and takes L·d·Lᵀ from the block below and right of it.
/// Row j + i, columns j + 1 ..= j + i, sits at offsets i − 1 down to 0 of row j + i. Always
/// inlined, so that a constant `m` unrolls the loops.
#[inline(always)]
fn ldl_step(data: &mut [f64], j: usize, w: usize, m: usize, column: &mut [f64]) {
    let pivot = data[j * w];
    for i in 1..=m {
        let at = (j + i) * w + i;
        column[i - 1] = data[at];
        data[at] /= pivot;
    }
    for i in 1..=m {
        let row = &mut data[(j + i) * w..=(j + i) * w + i];
        let l = row[i];
        for k in 1..=i {
            row[i - k] -= l * column[k - 1];
        }
    }
}

/// The LU's update right of a pivot: `count` columns, the first with the pivot's row at `top`
/// in `tail` and each next one `stride` further on, lose u·l from the rows below, u being the
/// column's entry in the pivot's row. Always inlined, so that an `l` of constant length unrolls.
#[inline(always)]
fn lu_update(tail: &mut [f64], mut top: usize, count: usize, stride: usize, l: &[f64]) {
    for _ in 0..count {
        let u = tail[top];
        if u != 0.0 {
            for (a, m) in tail[top + 1..top + 1 + l.len()].iter_mut().zip(l) {
                *a -= m * u;
            }
        }
        top += stride;
    }
}

/// An LDLᵀ factorisation: L in the strict lower band of `factors`, D in `d`.
#[derive(Clone, Debug)]
pub(crate) struct Ldlt {
    factors: SymBand,
    d: Vec<f64>,
}

impl Ldlt {
    /// Number of negative pivots, the number of negative eigenvalues.
    pub(crate) fn negative(&self) -> usize {
        self.d.iter().filter(|p| **p < 0.0).count()
    }

    /// Solves A·x = r.
    pub(crate) fn solve(&self, rhs: &[f64]) -> Vec<f64> {
        let f = &self.factors;
        let (n, b, w) = (f.n, f.b, f.b + 1);
        let mut x = rhs.to_vec();
        for i in 0..n {
            for k in i.saturating_sub(b)..i {
                x[i] -= f.data[i * w + (i - k)] * x[k];
            }
        }
        for i in 0..n {
            x[i] /= self.d[i];
        }
        for i in (0..n).rev() {
            for r in (i + 1)..n.min(i + b + 1) {
                x[i] -= f.data[r * w + (r - i)] * x[r];
            }
        }
        x
    }
}

/// A banded LU factorisation with partial pivoting, in LAPACK's band layout.
#[derive(Clone, Debug)]
pub(crate) struct BandLu {
    n: usize,
    kl: usize,
    ld: usize,
    ab: Vec<f64>,
    pivots: Vec<usize>,
    scale: f64,
}

impl BandLu {
    fn diagonal(&self, j: usize) -> f64 {
        self.ab[j * self.ld + self.ld - 1 - self.kl]
    }

    /// Solves A·x = r. A pivot that vanishes is replaced by a tiny value, the usual device that
    /// makes inverse iteration converge in one step.
    pub(crate) fn solve(&self, rhs: &[f64]) -> Vec<f64> {
        let (n, kl, ld) = (self.n, self.kl, self.ld);
        let kv = ld - 1 - kl;
        let mut x = rhs.to_vec();
        for j in 0..n {
            x.swap(j, self.pivots[j]);
            let km = kl.min(n - 1 - j);
            for i in 1..=km {
                x[j + i] -= self.ab[j * ld + kv + i] * x[j];
            }
        }
        let tiny = f64::EPSILON * self.scale;
        let upper = kv; // U has kl + ku super-diagonals
        for j in (0..n).rev() {
            let d = self.diagonal(j);
            let pivot = if d.abs() < tiny * 1e-3 {
                if d == 0.0 {
                    tiny
                } else {
                    tiny.copysign(d)
                }
            } else {
                d
            };
            x[j] /= pivot;
            let xj = x[j];
            for i in j.saturating_sub(upper)..j {
                x[i] -= self.ab[j * ld + kv + i - j] * xj;
            }
        }
        x
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use nalgebra::DMatrix;

    /// A reproducible symmetric band matrix with entries in (−1, 1) and a shifted diagonal.
    fn sample(n: usize, b: usize, shift: f64, seed: u64) -> (SymBand, DMatrix<f64>) {
        let mut s = seed;
        let mut next = || {
            s = s.wrapping_add(0x9E37_79B9_7F4A_7C15);
            let mut z = s;
            z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
            z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
            ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64 * 2.0 - 1.0
        };
        let mut band = SymBand::zeros(n, b);
        let mut dense = DMatrix::zeros(n, n);
        for i in 0..n {
            for j in i.saturating_sub(b)..=i {
                let v = next() + if i == j { shift } else { 0.0 };
                band.add(i, j, v);
                dense[(i, j)] = v;
                dense[(j, i)] = v;
            }
        }
        (band, dense)
    }

    #[test]
    fn count_and_determinant_match_dense_eigenvalues() {
        // Sylvester's law of inertia: the LDLᵀ pivot signs equal the eigenvalue signs, and the
        // pivots' product is the eigenvalues' product; checked against nalgebra's dense symmetric
        // eigensolver on seeded random matrices.
        for seed in 0..40 {
            let (band, dense) = sample(12, 3, 0.3 * (seed % 7) as f64 - 1.0, seed);
            let eig = dense.clone().symmetric_eigen().eigenvalues;
            let negative = eig.iter().filter(|v| **v < 0.0).count();
            let evaluation = band.into_evaluation();
            assert_eq!(evaluation.below, negative, "seed {seed}");
            let det: f64 = eig.iter().product();
            assert!((evaluation.log - det.abs().ln()).abs() < 1e-9, "seed {seed}");
            assert_eq!(evaluation.sign, det.signum(), "seed {seed}");
        }
    }

    #[test]
    fn solves_agree_with_dense_lu() {
        // Every band width with a kernel of its own (1 to 6) and three that take the general
        // one, a diagonal matrix among them.
        for seed in 0..27 {
            let b = [0, 1, 2, 3, 4, 5, 6, 7, 9][seed as usize % 9];
            let (band, dense) = sample(15, b, 0.0, 100 + seed);
            let rhs: Vec<f64> = (0..15).map(|i| (i as f64 * 0.37).sin()).collect();
            let x = band.lu().solve(&rhs);
            let reference = dense.clone().lu().solve(&nalgebra::DVector::from_vec(rhs.clone())).unwrap();
            for i in 0..15 {
                assert!(
                    (x[i] - reference[i]).abs() < 1e-9 * (1.0 + reference[i].abs()),
                    "seed {seed} (b = {b}) row {i}"
                );
            }
            // A positive definite one through the LDLᵀ path.
            let (spd, dense_spd) = sample(15, 4, 12.0, 200 + seed);
            let x = spd.solve_positive(std::slice::from_ref(&rhs)).unwrap().remove(0);
            let reference = dense_spd.cholesky().unwrap().solve(&nalgebra::DVector::from_vec(rhs));
            for i in 0..15 {
                assert!((x[i] - reference[i]).abs() < 1e-12 * (1.0 + reference[i].abs()));
            }
        }
    }

    #[test]
    fn product_and_form() {
        let (band, dense) = sample(9, 2, 0.5, 7);
        let x: Vec<f64> = (0..9).map(|i| i as f64 - 4.0).collect();
        let y = band.mul(&x);
        let reference = &dense * nalgebra::DVector::from_vec(x.clone());
        for i in 0..9 {
            assert!((y[i] - reference[i]).abs() < 1e-12);
        }
        assert!((band.form(&x, &x) - x.iter().zip(&y).map(|(a, b)| a * b).sum::<f64>()).abs() < 1e-12);
    }
}
