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
/// with `B = 0`, which reads the width at run time. The operations (so the results, to the last
/// bit) are the same either way. Only the solver's engine carries the kernels in the browser:
/// the page's engine never factors a matrix, and the linker leaves them out of it.
macro_rules! by_width {
    ($band:expr, $kernel:ident) => {{
        match $band.b {
            1 => $band.$kernel::<1>(),
            2 => $band.$kernel::<2>(),
            3 => $band.$kernel::<3>(),
            4 => $band.$kernel::<4>(),
            5 => $band.$kernel::<5>(),
            6 => $band.$kernel::<6>(),
            _ => $band.$kernel::<0>(),
        }
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

    /// Adds a symmetric 4 × 4 block (a member's or an element's) at the degrees of freedom
    /// `ids`; a `None` id is a held freedom, whose row and column are left out.
    pub(crate) fn scatter(&mut self, ids: &[Option<usize>; 4], block: &[[f64; 4]; 4]) {
        for (a, ia) in ids.iter().enumerate() {
            let Some(ia) = ia else { continue };
            for (b, ib) in ids.iter().enumerate().take(a + 1) {
                if let Some(ib) = ib {
                    self.add(*ia, *ib, block[a][b]);
                }
            }
        }
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

    /// The LDLᵀ factorisation without interchanges, kept for solving (the reference stiffness
    /// of shear-flexible members condenses its chain with it).
    #[cfg(test)]
    pub(crate) fn ldlt(mut self) -> Ldlt {
        let d = self.factor_in_place();
        Ldlt { factors: self, d }
    }

    /// Solves A·x = r for a symmetric positive definite A. Returns `None` when a pivot is not
    /// positive (the matrix is singular or indefinite).
    pub(crate) fn solve_positive(&self, rhs: &[Vec<f64>]) -> Option<Vec<Vec<f64>>> {
        let mut factors = self.clone();
        let d = factors.factor_in_place();
        let scale = (0..self.n).map(|i| self.data[i * (self.b + 1)].abs()).fold(0.0, f64::max);
        if d.iter().any(|p| !(p.is_finite() && *p > 1e-14 * scale)) {
            return None;
        }
        let ldlt = Ldlt { factors, d };
        Some(rhs.iter().map(|r| ldlt.solve(r)).collect())
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

/// An LDLᵀ factorisation: L in the strict lower band of `factors`, D in `d`.
#[derive(Clone, Debug)]
pub(crate) struct Ldlt {
    factors: SymBand,
    d: Vec<f64>,
}

impl Ldlt {
    /// Number of negative pivots, the number of negative eigenvalues.
    #[cfg(test)]
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

#[cfg(test)]
mod tests {
    use super::*;
    use nalgebra::DMatrix;

    /// A reproducible symmetric band matrix with entries in (−1, 1) and a shifted diagonal.
    fn sample(n: usize, b: usize, shift: f64, seed: u64) -> (SymBand, DMatrix<f64>) {
        let mut rng = modebench_tests::random::Rng::new(seed);
        let mut band = SymBand::zeros(n, b);
        let mut dense = DMatrix::zeros(n, n);
        for i in 0..n {
            for j in i.saturating_sub(b)..=i {
                let v = rng.range(-1.0, 1.0) + if i == j { shift } else { 0.0 };
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
    fn solves_agree_with_dense_cholesky() {
        // Every band width with a kernel of its own (1 to 6) and three that take the general
        // one, a diagonal matrix among them.
        for seed in 0..27 {
            let b = [0, 1, 2, 3, 4, 5, 6, 7, 9][seed as usize % 9];
            let rhs: Vec<f64> = (0..15).map(|i| (i as f64 * 0.37).sin()).collect();
            // A positive definite one through the LDLᵀ path.
            let (spd, dense_spd) = sample(15, b, 12.0, 200 + seed);
            let x = spd.solve_positive(std::slice::from_ref(&rhs)).unwrap().remove(0);
            let reference = dense_spd.cholesky().unwrap().solve(&nalgebra::DVector::from_vec(rhs));
            for i in 0..15 {
                assert!((x[i] - reference[i]).abs() < 1e-12 * (1.0 + reference[i].abs()));
            }
        }
    }
}
