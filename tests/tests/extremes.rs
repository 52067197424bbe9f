//! Models at the edge of what double precision resolves, through the whole pipeline as the page
//! solves them: a near-rigid bar on soft springs, and a check meshed so finely that rounding, not
//! the mesh, limits it. Each gives its right answer or a clear message, never a loop, and the
//! finite-element check never lists a frequency twice nor advises more elements where more
//! elements make it worse.

use modebench::analysis::WarningCode;
use modebench::Report;
use modebench_tests::check;
use serde_json::{json, Value};

/// A uniform bar 1 m long of 1 kg/m with the given EI, its ends and attachments.
fn bar(ei: f64, left: Value, right: Value, attachments: Value) -> Value {
    json!({
        "modes": 4,
        "left": left,
        "right": right,
        "segments": [{ "length": 1, "flexural_rigidity": ei, "mass_per_length": 1 }],
        "attachments": attachments,
    })
}

fn solve(scenario: &Value) -> Report {
    modebench::solve_value(scenario).unwrap_or_else(|e| panic!("{scenario}: {e}"))
}

/// What every report of this file must satisfy: the check lists no frequency twice, and no
/// note advises more elements where rounding, not the mesh, is what it says limits the check.
fn check_the_check(report: &Report, case: &str) {
    let fe: Vec<f64> = report.modes.iter().filter_map(|m| m.fe_frequency_hz).collect();
    assert!(
        fe.windows(2).all(|w| w[1] > w[0] * (1.0 + 1e-9)),
        "{case}: the finite-element column lists a frequency twice: {fe:?}"
    );
    for w in &report.warnings {
        assert!(
            !(w.message.contains("rounding") && w.message.contains("use more elements")),
            "{case}: {}",
            w.message
        );
    }
}

/// Hz from ω².
fn hz(omega_squared: f64) -> f64 {
    omega_squared.sqrt() / std::f64::consts::TAU
}

#[test]
fn a_near_rigid_bar_on_soft_springs_gives_its_rigid_body_frequencies() {
    // A bar of mass M = mL on springs k at both free ends bounces at ω² = 2k/M and rocks about
    // its middle at ω² = 6k/M (2k·(L/2)² over ML²/12); pinned at one end with k at the other, it
    // turns at ω² = 3k/M (kL² over ML²/3). Rigid-body dynamics, a fact of the theory. The bar's
    // own bending adds a relative change of about k·L³/EI, below 1e-10 for EI ≥ 1e12, so the
    // engine's values must agree to 1e-9. 12.5 N/m once hung the root search; 100 N/m did not.
    for ei in [1e12, 1e15, 1e18] {
        for k in [12.5, 100.0] {
            let springs = json!([
                { "type": "spring", "position": 0, "stiffness": k },
                { "type": "spring", "position": 1, "stiffness": k }
            ]);
            let case = format!("free–free bar, EI = {ei:e}, springs of {k} N/m at both ends");
            let report = solve(&bar(ei, json!("free"), json!("free"), springs));
            let source = "rigid bar on end springs: ω² = 2k/M (bounce), 6k/M (rocking); fact of the theory";
            check(&case, source, hz(2.0 * k), report.modes[0].frequency_hz, 1e-9);
            check(&case, source, hz(6.0 * k), report.modes[1].frequency_hz, 1e-9);
            check_the_check(&report, &case);

            let tip = json!([{ "type": "spring", "position": 1, "stiffness": k }]);
            let case = format!("bar pinned at one end, EI = {ei:e}, a spring of {k} N/m at the other");
            let report = solve(&bar(ei, json!("pinned"), json!("free"), tip));
            let source = "rigid bar pinned at one end on a tip spring: ω² = 3k/M; fact of the theory";
            check(&case, source, hz(3.0 * k), report.modes[0].frequency_hz, 1e-9);
            check_the_check(&report, &case);
        }
    }
}

#[test]
fn a_check_that_rounding_limits_says_so_and_never_advises_more_elements() {
    // EI = 1e12 on a 12.5 N/m spring: the largest eigenvalue the mesh carries is some 1e16
    // times the mode's, so rounding (ε ≈ 2e-16 times that ratio) swamps the check whatever the
    // mesh; at 2000 elements as much as at the default. The note must blame rounding, and the
    // exact value still matches the rigid bar's (fact of the theory, as above).
    let tip = json!([{ "type": "spring", "position": 1, "stiffness": 12.5 }]);
    for elements in [None, Some(2000)] {
        let mut scenario = bar(1e12, json!("pinned"), json!("free"), tip.clone());
        if let Some(n) = elements {
            scenario["elements"] = json!(n);
        }
        let case = format!("near-rigid bar on a 12.5 N/m spring, elements {elements:?}");
        let report = solve(&scenario);
        check(&case, "ω² = 3k/M; fact of the theory", hz(3.0 * 12.5), report.modes[0].frequency_hz, 1e-9);
        check_the_check(&report, &case);
        let off = report.modes[0].fe_difference.is_none_or(|d| d.abs() > 1e-3);
        assert!(
            off,
            "{case}: the premise, a check swamped by rounding, no longer holds: {:?}",
            report.modes[0]
        );
        let note = report
            .warnings
            .iter()
            .find(|w| matches!(w.code, WarningCode::FeUnconverged | WarningCode::FeDisagrees))
            .unwrap_or_else(|| panic!("{case}: no note on the check: {:?}", report.warnings));
        assert!(note.message.contains("rounding"), "{case}: {}", note.message);
        assert!(!note.message.contains("use more elements"), "{case}: {}", note.message);
        assert!(note.message.contains("softest spring"), "{case}: the cause is not named: {}", note.message);
    }
}
