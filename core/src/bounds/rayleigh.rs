//! Rayleigh's quotient with the static deflection curve.
//!
//! The beam is loaded by the weights of its own mass and of every attached mass, each acting in
//! the direction the fundamental mode moves there (for an overhang or a continuous beam the
//! loads on alternate spans reverse). The static deflection y under those loads is an
//! admissible shape, so ω² ≈ ∫EI·y″² / (∫m·y² + Σ M·y² + Σ J·y′²) is an upper bound on the
//! fundamental (Rayleigh's principle), for either theory. y is the finite-element solution on a
//! mesh with nodes where mode 1 changes sign; whatever its accuracy, the quotient of the field it
//! interpolates is a bound, as long as the energies are those of that field. They are summed
//! element by element as squares (never as yᵀKy, which cancels when elements are short), so the
//! bound holds to rounding. An axial force P adds its work on the slope, ∫P·y′², to the strain
//! energy (each element's geometric part), and its geometric stiffness to the static solve;
//! below the buckling load the quotient is still an upper bound by the same principle.

use crate::exact::ModeShape;
use crate::fe::{Discrete, Mesh, PointKind};
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
    let d =
        Discrete::new(model, Mesh::Between { lowest: omega1, highest: 4.0 * omega1 }, &mode1.nodes).ok()?;
    let mesh = &d.mesh;
    let sign = |x: f64| if mode1.at(x).0 < 0.0 { -1.0 } else { 1.0 };
    let mut load = vec![0.0; mesh.dofs];
    let mut scatter = |dofs: &[Option<usize>; 4], f: [f64; 4]| {
        for (dof, v) in dofs.iter().zip(f) {
            if let Some(i) = dof {
                load[*i] += v;
            }
        }
    };
    for p in &mesh.elements {
        let mid = p.x0 + 0.5 * p.element.length;
        scatter(&p.dofs, p.element.uniform_load(G * p.element.mass_per_length * sign(mid)));
    }
    let mut sprung_loads = Vec::new();
    for p in &mesh.points {
        let placed = &mesh.elements[p.element];
        match p.kind {
            PointKind::Mass { mass, .. } => {
                let (nw, _) = placed.element.at(p.xi);
                scatter(&placed.dofs, nw.map(|n| n * G * mass * sign(p.x)));
            }
            PointKind::Sprung { mass, dof, attachment, .. } => {
                let amplitude = mode1.sprung.iter().find(|(i, _)| *i == attachment).map_or(1.0, |(_, a)| *a);
                sprung_loads.push((dof, G * mass * if amplitude < 0.0 { -1.0 } else { 1.0 }));
            }
            _ => {}
        }
    }
    for (dof, f) in sprung_loads {
        load[dof] += f;
    }
    let y = d.stiffness.solve_positive(&[load])?.remove(0);
    let (strain, kinetic) = energies(&d, &y);
    (strain > 0.0 && kinetic > 0.0).then(|| (strain / kinetic).sqrt())
}

/// Twice the strain and kinetic energies (per ω²) of the mesh's field for the unknowns `y`.
fn energies(d: &Discrete, y: &[f64]) -> (f64, f64) {
    let mesh = &d.mesh;
    let value = |dof: Option<usize>| dof.map_or(0.0, |i| y[i]);
    let (mut strain, mut kinetic) = (0.0, 0.0);
    for p in &mesh.elements {
        let (u, t) = p.element.energies(&p.dofs.map(value));
        strain += u;
        kinetic += t;
    }
    for n in &mesh.nodes {
        strain += n.spring * value(n.w).powi(2) + n.rotational_spring * value(n.theta).powi(2);
    }
    for p in &mesh.points {
        let placed = &mesh.elements[p.element];
        let q = placed.dofs.map(value);
        let (nw, npsi) = placed.element.at(p.xi);
        let w: f64 = (0..4).map(|i| nw[i] * q[i]).sum();
        let psi: f64 = (0..4).map(|i| npsi[i] * q[i]).sum();
        match p.kind {
            PointKind::Mass { mass, rotary_inertia } => kinetic += mass * w * w + rotary_inertia * psi * psi,
            PointKind::Spring { stiffness } => strain += stiffness * w * w,
            PointKind::RotationalSpring { stiffness } => strain += stiffness * psi * psi,
            PointKind::Sprung { mass, stiffness, dof, .. } => {
                strain += stiffness * (w - y[dof]).powi(2);
                kinetic += mass * y[dof] * y[dof];
            }
        }
    }
    (strain, kinetic)
}
