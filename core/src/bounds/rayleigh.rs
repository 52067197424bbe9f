//! Rayleigh's quotient with the static deflection curve.
//!
//! The beam is loaded by the weights of its own mass and of every attached mass, each acting in
//! the direction the fundamental mode moves there (for an overhang or a continuous beam the
//! loads on alternate spans reverse). The static deflection y under those loads is an
//! admissible shape, so ω² ≈ ∫EI·y″² / (∫m·y² + Σ M·y² + Σ J·y′²) is an upper bound on the
//! fundamental (Rayleigh's principle). y is the finite-element solution on a mesh with nodes
//! where mode 1 changes sign; its energies are exact for the function it interpolates, so the
//! bound holds against the exact fundamental, not only the finite-element one.

use crate::exact::ModeShape;
use crate::fe::{Discrete, Mesh};
use crate::model::Model;

/// Standard gravity, m/s² (NIST SP 811). Only the direction and proportions of the loads
/// matter to the quotient; g is kept so the static deflection has its physical size.
const G: f64 = 9.80665;

/// Rayleigh's estimate of the fundamental angular frequency, given the exact mode 1 (for the
/// load directions) and its ω (for the mesh). `None` when the model has rigid-body modes.
pub fn rayleigh(model: &Model, mode1: &ModeShape, omega1: f64) -> Option<f64> {
    if model.rigid_body_modes() > 0 {
        return None;
    }
    let d = Discrete::new(model, Mesh::UpTo(4.0 * omega1), &mode1.nodes).ok()?;
    let sign = |x: f64| if mode1.at(x).0 < 0.0 { -1.0 } else { 1.0 };
    let mut load = vec![0.0; d.layout.dofs];
    for (span, e) in d.layout.spans.iter().zip(&d.elements) {
        let mid = d.layout.span_start(span) + 0.5 * span.length;
        let f = e.uniform_load(G * e.mass_per_length * sign(mid));
        for (dof, v) in d.layout.span_dofs(span).iter().zip(f) {
            if let Some(i) = dof {
                load[*i] += v;
            }
        }
    }
    for s in &d.layout.stations {
        if let Some(w) = s.w {
            load[w] += G * s.mass * sign(s.x);
        }
        for sp in &s.sprung {
            let amplitude = mode1.sprung.iter().find(|(i, _)| *i == sp.attachment).map_or(1.0, |(_, a)| *a);
            load[sp.dof] += G * sp.mass * if amplitude < 0.0 { -1.0 } else { 1.0 };
        }
    }
    let y = d.stiffness.solve_positive(&[load])?.remove(0);
    let strain = d.stiffness.form(&y, &y);
    let kinetic = d.mass.form(&y, &y);
    (strain > 0.0 && kinetic > 0.0).then(|| (strain / kinetic).sqrt())
}
