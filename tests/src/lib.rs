//! Shared pieces of the cross-crate checks: the table of published values, one comparison
//! helper, a seeded generator of random models, and the bridge to the Python reference library.

pub mod fuzz;
pub mod models;
pub mod published;
pub mod random;
pub mod reference;
pub mod ringdown;

/// Compares `got` with a sourced `expected` value within a relative tolerance and, on failure,
/// panics with the case, the source, both values and the tolerance.
#[track_caller]
pub fn check(case: &str, source: &str, expected: f64, got: f64, relative_tolerance: f64) {
    let error = relative_error(expected, got);
    assert!(
        error <= relative_tolerance,
        "{case}\n  source:     {source}\n  expected:   {expected:e}\n  got:        {got:e}\n  \
         rel. error: {error:e} > tolerance {relative_tolerance:e}"
    );
}

/// |got − expected| / |expected| (absolute when expected is zero).
pub fn relative_error(expected: f64, got: f64) -> f64 {
    relative_difference(expected, got).abs()
}

/// (got − expected) / expected, with its sign (got itself when expected is zero): the difference
/// the site's table of published checks shows.
pub fn relative_difference(expected: f64, got: f64) -> f64 {
    if expected == 0.0 {
        got
    } else {
        (got - expected) / expected
    }
}

/// Every mode's finite-element check lies within ten times its own error estimate (mesh and
/// rounding, plus the exact value's), as the report states them: what the fuzz run asserts of
/// every solved model, for the regression tests of the models it once stopped on.
pub fn assert_fe_within_its_estimate(report: &modebench::Report) {
    for m in &report.modes {
        let (d, e, a) =
            (m.fe_difference.unwrap_or(0.0), m.fe_error.unwrap_or(0.0), m.accuracy.unwrap_or(0.0));
        assert!(
            d.abs() <= 10.0 * (e + a) + 1e-9,
            "mode {}: FE differs by {d:e}, its estimate {e:e}",
            m.number
        );
    }
}
