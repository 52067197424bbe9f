//! Dunkerley's lower bound on the fundamental.
//!
//! 1/ω² ≈ 1/ω_b² + Σ 1/ωᵢ², with ω_b the fundamental of the beam alone (its own mass, all its
//! supports and springs) and ωᵢ that of each attached mass alone on the massless beam:
//! ωᵢ² = 1/(Mᵢ·δᵢ) with δᵢ the static flexibility at the mass, 1/(Jᵢ·δθᵢ) for a rotary inertia,
//! and 1/(m·(δ + 1/k)) for a sprung mass. The sum is a lower bound because the largest
//! eigenvalue of a sum of positive semi-definite matrices is at most the sum of their largest
//! eigenvalues (Weyl's inequality), applied to the flexibility-weighted mass split by part; it
//! holds for every model with no rigid-body mode, shear-flexible ones included, since every part
//! is positive semi-definite whatever the theory.
//!
//! An axial force enters through the loaded beam's own frequency and flexibilities (the exact
//! beam-column members). The argument needs the stiffness, with the force's geometric part,
//! to be positive definite: true for any tension and for compression below the buckling load,
//! the only case analysed (a buckled beam is refused), so the sum stays a lower bound there.
//!
//! The flexibilities are exact (two static sweeps, [`crate::exact::statics`]), so the bound is
//! one to rounding; they take memory and time linear in the number of masses.

use crate::error::Result;
use crate::exact::{self, statics, System};
use crate::layout::Layout;
use crate::model::{Attachment, Model};

/// Dunkerley's estimate of the fundamental angular frequency. `None` when the model has
/// rigid-body modes (the massless beam has no flexibility then).
pub fn dunkerley(model: &Model) -> Result<Option<f64>> {
    if model.rigid_body_modes() > 0 {
        return Ok(None);
    }
    let bare: Vec<Attachment> = model
        .attachments()
        .iter()
        .filter(|a| !matches!(a, Attachment::Mass { .. } | Attachment::SprungMass { .. }))
        .copied()
        .collect();
    let beam = model.with_attachments(bare)?;
    let omega_b = exact::frequencies(&beam, 1)?[0];
    let mut inverse_sum = 1.0 / (omega_b * omega_b);

    // The bare beam with a station at every mass, so that each has its flexibility.
    let at: Vec<f64> = model.attachments().iter().map(Attachment::position).collect();
    let layout = Layout::with_points(&beam, &at, &|_| 1)?;
    let system = System::new(&beam, layout);
    let Some(compliance) = statics::compliances(&system) else {
        return Ok(None);
    };
    let stations = &system.layout.stations;
    let tolerance = crate::model::SAME_POINT * model.length();
    for a in model.attachments() {
        let x = a.position();
        let i = stations.partition_point(|s| s.x < x - tolerance).min(stations.len() - 1);
        let c = compliance[i];
        match *a {
            Attachment::Mass { mass, rotary_inertia, .. } => {
                inverse_sum += mass * c[0][0] + rotary_inertia * c[1][1];
            }
            // A sprung mass rides on its spring in series with the beam's flexibility there
            // (zero on a held point).
            Attachment::SprungMass { mass, stiffness, .. } => {
                inverse_sum += mass * (c[0][0] + 1.0 / stiffness)
            }
            _ => {}
        }
    }
    Ok(Some(1.0 / inverse_sum.sqrt()))
}
