//! The table of published values in `tests/data/published.json`, and how each case is evaluated.
//!
//! The site's "How Modebench computes" page renders the same table with the same evaluation, so
//! what the page shows is what the tests check.

use modebench::{Error, Scenario};

/// The table as JSON text.
pub const TABLE: &str = include_str!("../data/published.json");

/// One published value.
#[derive(Clone, Debug, PartialEq, serde::Deserialize)]
pub struct Case {
    /// Stable identifier.
    pub id: String,
    /// What is checked, in words.
    pub case: String,
    /// Where the value comes from.
    pub source: String,
    /// The scenario, in the documented format.
    pub scenario: Scenario,
    /// `lambda` (λ = √ω on a unit beam) or `hz`.
    pub quantity: String,
    /// Elastic mode number, from 1.
    pub mode: usize,
    /// The published value.
    pub expected: f64,
    /// Relative tolerance.
    pub tolerance: f64,
}

#[derive(serde::Deserialize)]
struct Table {
    cases: Vec<Case>,
}

/// Every case in the table.
///
/// # Panics
/// If the table file is malformed; it is part of the source tree, so that is a build error.
pub fn cases() -> Vec<Case> {
    serde_json::from_str::<Table>(TABLE).expect("tests/data/published.json is valid").cases
}

/// Modebench's value for a case (exact method).
pub fn evaluate(case: &Case) -> Result<f64, Error> {
    let report = modebench::solve(&case.scenario)?;
    if case.quantity == "critical_load_factor" {
        return report.critical_load_factor.ok_or_else(|| {
            Error::new(modebench::ErrorKind::Model, format!("case {} has no critical load factor", case.id))
        });
    }
    let elastic: Vec<_> = report.modes.iter().filter(|m| !m.rigid_body).collect();
    let mode = elastic.get(case.mode.saturating_sub(1)).ok_or_else(|| {
        Error::new(
            modebench::ErrorKind::Model,
            format!("case {} asks for mode {} which was not computed", case.id, case.mode),
        )
    })?;
    Ok(match case.quantity.as_str() {
        "lambda" => (std::f64::consts::TAU * mode.frequency_hz).sqrt(),
        _ => mode.frequency_hz,
    })
}
