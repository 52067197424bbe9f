//! Sorting the short lists of positions the solvers build.
//!
//! The lists hold tens to a few hundred numbers and arrive nearly sorted, where insertion sort is
//! as fast as any; one small function also keeps several copies of the general-purpose sort out
//! of the browser build.

/// Sorts numbers ascending (NaN last, as `f64::total_cmp` orders them).
pub(crate) fn floats(v: &mut [f64]) {
    for i in 1..v.len() {
        let x = v[i];
        let mut j = i;
        while j > 0 && v[j - 1].total_cmp(&x).is_gt() {
            v[j] = v[j - 1];
            j -= 1;
        }
        v[j] = x;
    }
}

/// The order that sorts `keys` ascending (as `f64::total_cmp` orders them), ties kept in their
/// given order: a bottom-up merge sort of indices. One copy serves every list sorted by a number
/// (attachments by position, roots by frequency), where the standard library's sort would add
/// a few kilobytes to the browser build for each type and comparison it is given.
pub(crate) fn order(keys: &[f64]) -> Vec<usize> {
    let n = keys.len();
    let mut a: Vec<usize> = (0..n).collect();
    let mut b = vec![0usize; n];
    let mut width = 1;
    while width < n {
        let mut start = 0;
        while start < n {
            let mid = (start + width).min(n);
            let end = (start + 2 * width).min(n);
            let (mut i, mut j) = (start, mid);
            for slot in &mut b[start..end] {
                // The left run wins ties, which keeps the sort stable.
                let left = i < mid && (j >= end || keys[a[i]].total_cmp(&keys[a[j]]).is_le());
                if left {
                    *slot = a[i];
                    i += 1;
                } else {
                    *slot = a[j];
                    j += 1;
                }
            }
            start = end;
        }
        std::mem::swap(&mut a, &mut b);
        width *= 2;
    }
    a
}

#[cfg(test)]
mod tests {
    #[test]
    fn sorts_like_the_standard_library() {
        let mut rng = modebench_tests::random::Rng::new(3);
        for n in 0..60 {
            let mut v: Vec<f64> = (0..n).map(|_| rng.unit() - 0.5).collect();
            let mut reference = v.clone();
            reference.sort_by(f64::total_cmp);
            super::floats(&mut v);
            assert_eq!(v, reference);
        }
    }

    #[test]
    fn orders_like_the_standard_librarys_stable_sort() {
        // Keys drawn from a few values, so that ties are common and stability shows.
        let mut rng = modebench_tests::random::Rng::new(11);
        for n in 0..70 {
            let keys: Vec<f64> = (0..n).map(|_| (rng.unit() * 5.0).floor()).collect();
            let mut reference: Vec<usize> = (0..n).collect();
            reference.sort_by(|&i, &j| keys[i].total_cmp(&keys[j]));
            assert_eq!(super::order(&keys), reference, "{keys:?}");
        }
    }
}
