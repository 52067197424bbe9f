//! Every published value in `tests/data/published.json`, through one `check()`.

use modebench_tests::{check, published};

#[test]
fn published_values() {
    let cases = published::cases();
    assert!(cases.len() >= 30, "the table should hold at least 30 cases, has {}", cases.len());
    for case in &cases {
        let got = published::evaluate(case).unwrap_or_else(|e| panic!("{}: {e}", case.id));
        check(&case.case, &case.source, case.expected, got, case.tolerance);
    }
}
