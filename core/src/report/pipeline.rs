//! The public entry points: read a scenario, check it, run the analysis and its judgements, and
//! present the results as a [`Report`].

use super::{echo, FeReport, FundamentalReport, ModeReport, Report, ShapeSamples, SprungAmplitude};
use crate::analysis::{self, margins, Excitation};
use crate::error::{Error, ErrorKind, Result};
use crate::scenario::Scenario;

/// Reads, checks and solves a scenario given as parsed JSON.
pub fn solve_value(value: &serde_json::Value) -> Result<Report> {
    solve_value_with_hints(value, &[])
}

/// The natural frequencies (Hz) of the modes a [`Report`] of this scenario lists, in its order
/// and bit for bit its `frequency_hz`, from the exact method alone. For a first look at a
/// scenario whose report is known (a page's prerendered one): a fraction of the work of
/// [`solve_value`]. An error here is the one [`solve_value`] gives, which may also fail in the
/// steps this leaves out.
pub fn frequencies_value(value: &serde_json::Value) -> Result<Vec<f64>> {
    let scenario = Scenario::from_value(value)?;
    let inputs = scenario.to_model()?;
    let omegas =
        analysis::exact_omegas(&inputs.model, &inputs.options).map_err(|e| scenario.at_typed_force(e))?;
    let hz: Vec<f64> = omegas.into_iter().map(hz).collect();
    if !hz.iter().all(|f| f.is_finite()) {
        return Err(overflow());
    }
    Ok(hz)
}

/// Reads, checks and solves a scenario given as JSON text.
pub fn solve_json(text: &str) -> Result<Report> {
    solve_value(&crate::scenario::text::read(text)?)
}

/// Reads, checks and solves a scenario.
pub fn solve(scenario: &Scenario) -> Result<Report> {
    let doc = serde_json::to_value(scenario)
        .map_err(|e| Error::new(ErrorKind::Model, format!("the scenario could not be copied: {e}")))?;
    solve_with(scenario, &doc, &[])
}

/// Reads, checks and solves a scenario given as parsed JSON, starting the search from the
/// frequencies (Hz) of an earlier report, typically the case's before the edit being solved.
/// The results are those of [`solve_value`] to within the root search's tolerance, whatever the
/// hints: every frequency is still isolated by the count.
pub fn solve_value_with_hints(value: &serde_json::Value, hints_hz: &[f64]) -> Result<Report> {
    // The design study writes trial values into the scenario with each tolerance typed beside
    // its value already split off.
    let value = crate::scenario::tolerant::normalise(value)?;
    solve_with(&Scenario::from_value(&value)?, &value, hints_hz)
}

/// Solves a scenario read from `doc`, the JSON it was read from, which the design study writes
/// trial values into (the browser's worker solves from JSON, so it never writes a scenario back
/// out to JSON), starting from hints (Hz) as for [`solve_value_with_hints`].
fn solve_with(scenario: &Scenario, doc: &serde_json::Value, hints_hz: &[f64]) -> Result<Report> {
    let inputs = scenario.to_model()?;
    let model = &inputs.model;
    let hints: Vec<f64> = hints_hz.iter().map(|f| f * std::f64::consts::TAU).collect();
    // An error of the axial force is shown on the field that gave it.
    let analysis = analysis::analyse_with_hints(model, &inputs.options, &hints)
        .map_err(|e| scenario.at_typed_force(e))?;
    let gyration: Vec<Option<f64>> = inputs.segments.iter().map(|s| s.gyration_squared).collect();
    let comparison =
        analysis::other_theory(model, &gyration, &analysis).map_err(|e| scenario.at_typed_force(e))?;
    let excitations: Vec<Excitation> = inputs
        .excitations
        .iter()
        .map(|e| Excitation {
            label: e.label.clone(),
            low_hz: e.low_hz,
            high_hz: e.high_hz,
            orders: e.orders.clone(),
        })
        .collect();
    let orders = margins::orders(&excitations);
    let elastic_hz: Vec<f64> = analysis.modes.iter().filter(|m| !m.rigid_body).map(|m| hz(m.omega)).collect();
    let elastic: Vec<crate::design::sensitivity::SolvedMode<'_>> = analysis
        .modes
        .iter()
        .filter(|m| !m.rigid_body)
        .map(|m| crate::design::sensitivity::SolvedMode {
            omega: m.omega,
            multiplicity: m.multiplicity,
            shape: &m.shape,
        })
        .collect();
    let design = crate::design::study(
        scenario,
        doc,
        &crate::design::study::Solved {
            elastic_hz: &elastic_hz,
            rigid: analysis.rigid_body_modes,
            orders: &orders,
            margin: inputs.margin,
            model,
            modes: &elastic,
        },
    )?;
    let modes: Vec<ModeReport> = analysis
        .modes
        .iter()
        .enumerate()
        .map(|(i, m)| {
            let f = hz(m.omega);
            ModeReport {
                number: m.number,
                rigid_body: m.rigid_body,
                multiplicity: m.multiplicity,
                frequency_hz: f,
                rpm: f * 60.0,
                fe_frequency_hz: m.fe_omega.map(hz),
                fe_difference: m.fe_difference(),
                fe_error: m.fe_error,
                accuracy: m.accuracy,
                other_theory_hz: comparison.as_ref().and_then(|c| c.omegas.get(i).copied()).map(hz),
                nodes: m.shape.nodes.clone(),
                generalized_mass: m.shape.generalized_mass,
                shape: ShapeSamples { x: m.shape.x.clone(), w: m.shape.deflection.clone() },
                sprung: m
                    .shape
                    .sprung
                    .iter()
                    .map(|&(attachment, amplitude)| SprungAmplitude { attachment, amplitude })
                    .collect(),
                nearest_excitation: if m.rigid_body {
                    None
                } else {
                    let band =
                        design.bands.iter().find(|b| b.mode == m.number).map(|b| (b.low_hz, b.high_hz));
                    margins::nearest(f, band, &orders, inputs.margin)
                },
            }
        })
        .collect();
    let mut warnings = analysis.warnings.clone();
    warnings.extend(comparison.as_ref().and_then(|c| c.warning.clone()));
    warnings.extend(crate::scenario::plausible::warnings(scenario, &inputs));
    warnings.extend(margins::resonance_warning(
        modes.iter().map(|m| (m.number, m.nearest_excitation.as_ref())),
        &excitations,
        inputs.margin,
    ));
    let report = Report {
        title: scenario.title.clone(),
        units: scenario.units,
        theory: model.theory(),
        comparison: comparison.as_ref().filter(|c| !c.omegas.is_empty()).map(|c| c.theory),
        beam: echo::beam(model, &inputs),
        rigid_body_modes: analysis.rigid_body_modes,
        modes,
        fundamental: analysis.fundamental.map(|f| FundamentalReport {
            exact_hz: hz(f.omega),
            rayleigh_hz: f.rayleigh.map(hz),
            dunkerley_hz: f.dunkerley.map(hz),
            equivalent: f.equivalent,
        }),
        fe: FeReport { elements: analysis.fe_elements, dofs: analysis.fe_dofs },
        excitations: echo::excitations(&inputs),
        margin: inputs.margin,
        warnings,
        conversions: echo::conversions(&inputs),
        critical_load_factor: analysis.critical_load_factor,
        design,
    };
    if !report.is_finite() {
        return Err(overflow());
    }
    Ok(report)
}

/// Hertz from rad/s.
fn hz(omega: f64) -> f64 {
    omega / std::f64::consts::TAU
}

/// The error of a result too large to compute with.
fn overflow() -> Error {
    Error::new(
        ErrorKind::NoConvergence,
        "a result overflowed the range of numbers the engine computes with; check the orders of magnitude of \
         the inputs (units, exponents)",
    )
}
