//! Dunkerley's lower bound on the fundamental.
//!
//! 1/ω² ≈ 1/ω_b² + Σ 1/ωᵢ², with ω_b the fundamental of the beam alone (its own mass, all its
//! supports and springs) and ωᵢ that of each attached mass alone on the massless beam:
//! ωᵢ² = 1/(Mᵢ·δᵢ) with δᵢ the static flexibility at the mass, 1/(Jᵢ·δθᵢ) for a rotary inertia,
//! and 1/(m·(δ + 1/k)) for a sprung mass. The sum is a lower bound because the largest
//! eigenvalue of a sum of positive semi-definite matrices is at most the sum of their largest
//! eigenvalues (Weyl's inequality), applied to the flexibility-weighted mass split by part.

use crate::error::Result;
use crate::exact;
use crate::fe::{Discrete, Mesh};
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

    // Static flexibilities of the massless beam; the elements are exact at the nodes for
    // concentrated loads, so one element per span is enough.
    let d = Discrete::new(model, Mesh::Total(1), &[]);
    let mut unit_loads = Vec::new();
    let mut terms: Vec<(usize, f64, f64)> = Vec::new(); // (dof, inertia, added series flexibility)
    for s in &d.layout.stations {
        if let Some(w) = s.w {
            if s.mass > 0.0 {
                terms.push((w, s.mass, 0.0));
            }
            for sp in &s.sprung {
                terms.push((w, sp.mass, 1.0 / sp.stiffness));
            }
        } else {
            // A sprung mass on a held point vibrates on its own spring only.
            for sp in &s.sprung {
                inverse_sum += sp.mass / sp.stiffness;
            }
        }
        if let Some(t) = s.theta {
            if s.rotary_inertia > 0.0 {
                terms.push((t, s.rotary_inertia, 0.0));
            }
        }
    }
    for (dof, _, _) in &terms {
        let mut f = vec![0.0; d.layout.dofs];
        f[*dof] = 1.0;
        unit_loads.push(f);
    }
    // The sprung masses' own degrees of freedom are massless here; condense them by removing
    // their springs from the static matrix (a massless sprung dof carries no force).
    let static_k = beam_only_stiffness(&d);
    let Some(solutions) = static_k.solve_positive(&unit_loads) else {
        return Ok(None);
    };
    for ((dof, inertia, series), x) in terms.iter().zip(&solutions) {
        let flexibility = x[*dof] + series;
        inverse_sum += inertia * flexibility;
    }
    Ok(Some(1.0 / inverse_sum.sqrt()))
}

/// The stiffness matrix without the sprung masses' springs, with their degrees of freedom left
/// as decoupled unit diagonals so the matrix stays positive definite.
fn beam_only_stiffness(d: &Discrete) -> crate::band::SymBand {
    let mut k = d.stiffness.clone();
    for s in &d.layout.stations {
        for sp in &s.sprung {
            k.add(sp.dof, sp.dof, 1.0 - sp.stiffness);
            if let Some(w) = s.w {
                k.add(w, w, -sp.stiffness);
                k.add(w, sp.dof, sp.stiffness);
            }
        }
    }
    k
}
