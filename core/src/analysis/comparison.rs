//! Whether the other beam theory should be shown beside the chosen one, and its frequencies.
//!
//! Under the Timoshenko theory the slender-beam (Euler–Bernoulli) result is always shown beside
//! it, with a warning when it is more than 1 % higher. Under Euler–Bernoulli a first-order
//! estimate of the shear and rotary-inertia effect decides: above 1 % on some mode, the Timoshenko
//! result is computed and shown. Either second solve starts its root search from the first
//! solve's frequencies, which lie close to the other theory's.

use super::{Analysis, Warning, WarningCode};
use crate::error::Result;
use crate::exact;
use crate::model::{Model, Theory};

/// The other theory's results.
#[derive(Clone, Debug, PartialEq)]
pub struct Comparison {
    /// The theory of `omegas`.
    pub theory: Theory,
    /// Its angular frequencies, rad/s, one per mode of the analysis (rigid-body modes at 0);
    /// empty when only its warning is given (an axial force under the slender theory).
    pub omegas: Vec<f64>,
    /// What the difference means for the user, when it matters.
    pub warning: Option<Warning>,
}

/// First-order estimate of how much Euler–Bernoulli overestimates a mode at ω: for a wave of
/// wavenumber k, ω_T ≈ ω_EB·(1 − ½k²(I/A + EI/κGA)) (from the pinned–pinned Timoshenko frequency
/// equation expanded in k²). The largest over segments; `None` without shear data.
/// `gyration_squared` holds each segment's I/A, m², when known.
pub fn shear_effect(model: &Model, gyration_squared: &[Option<f64>], omega: f64) -> Option<f64> {
    let mut worst: Option<f64> = None;
    for (s, r2) in model.segments().iter().zip(gyration_squared) {
        let (kga, r2) = (s.shear_rigidity?, (*r2)?);
        let k2 = (s.mass_per_length * omega * omega / s.flexural_rigidity).sqrt();
        let effect = 0.5 * k2 * (r2 + s.flexural_rigidity / kga);
        worst = Some(worst.map_or(effect, |w: f64| w.max(effect)));
    }
    worst
}

/// Decides whether to show the other theory beside the chosen one, and computes it.
pub fn other_theory(
    model: &Model,
    gyration_squared: &[Option<f64>],
    analysis: &Analysis,
) -> Result<Option<Comparison>> {
    let elastic = analysis.modes.len() - analysis.rigid_body_modes;
    let first: Vec<f64> = analysis.modes.iter().filter(|m| !m.rigid_body).map(|m| m.omega).collect();
    let solve = |theory: Theory| -> Result<Vec<f64>> {
        let found = exact::frequencies_with_hints(&model.with_theory(theory)?, elastic, &first)?;
        Ok(vec![0.0; analysis.rigid_body_modes].into_iter().chain(found).collect())
    };
    match model.theory() {
        Theory::Timoshenko => {
            let omegas = solve(Theory::EulerBernoulli)?;
            let warning = analysis
                .modes
                .iter()
                .zip(&omegas)
                .filter(|(m, _)| !m.rigid_body)
                .map(|(m, o)| (m.number, o / m.omega - 1.0))
                .find(|(_, r)| *r > 0.01)
                .map(|(m, ratio)| Warning {
                    code: WarningCode::ShearMatters,
                    message: format!(
                        "Shear deformation and rotary inertia matter here: the slender-beam (Euler–Bernoulli) \
                         result is {:.1} % higher for mode {m}. Both are shown.",
                        100.0 * ratio
                    ),
                });
            Ok(Some(Comparison { theory: Theory::EulerBernoulli, omegas, warning }))
        }
        Theory::EulerBernoulli => {
            let estimate = analysis.modes.iter().filter(|m| !m.rigid_body).find_map(|m| {
                shear_effect(model, gyration_squared, m.omega).filter(|e| *e > 0.01).map(|e| (m.number, e))
            });
            let Some((number, effect)) = estimate else { return Ok(None) };
            if model.has_axial_force() {
                // The shear-flexible member is not offered with an axial force (see `axial`):
                // the estimate is said, and no second set of frequencies is computed.
                let warning = Warning {
                    code: WarningCode::ShearMatters,
                    message: format!(
                        "From mode {number} on, the wavelength is short for the section depth: the slender-beam \
                         result is estimated to be {:.1} % too high (first-order shear and rotary-inertia \
                         correction). With an axial force the Timoshenko result is not computed, so read these \
                         modes as upper estimates.",
                        100.0 * effect
                    ),
                };
                return Ok(Some(Comparison {
                    theory: Theory::Timoshenko,
                    omegas: Vec::new(),
                    warning: Some(warning),
                }));
            }
            let omegas = solve(Theory::Timoshenko)?;
            let warning = Warning {
                code: WarningCode::ShearMatters,
                message: format!(
                    "From mode {number} on, the wavelength is short for the section depth: the slender-beam result \
                     is estimated to be {:.1} % too high (first-order shear and rotary-inertia correction). The \
                     Timoshenko result is shown beside it; consider switching the theory to Timoshenko.",
                    100.0 * effect
                ),
            };
            Ok(Some(Comparison { theory: Theory::Timoshenko, omegas, warning: Some(warning) }))
        }
    }
}
