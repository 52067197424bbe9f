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
}
