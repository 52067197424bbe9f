//! Approximations of the fundamental frequency shown beside the exact one: Rayleigh's quotient
//! with the static deflection curve (an upper bound), Dunkerley's sum (a lower bound), and the
//! equivalent single-degree-of-freedom system of mode 1 at a point.

mod dunkerley;
mod rayleigh;

pub use dunkerley::dunkerley;
pub use rayleigh::rayleigh;

use crate::exact::ModeShape;

/// Mass and stiffness of a single-degree-of-freedom system that has mode 1's frequency and the
/// mode's deflection at one point: the modal mass and stiffness with the shape scaled to unit
/// deflection there.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Equivalent {
    /// Point from the left end, m.
    pub position: f64,
    /// Equivalent mass, kg.
    pub mass: f64,
    /// Equivalent stiffness, N/m.
    pub stiffness: f64,
}

/// The equivalent system of a mode with angular frequency ω at `position`; `None` if the mode
/// has (almost) no deflection there.
pub fn equivalent(shape: &ModeShape, omega: f64, position: f64) -> Option<Equivalent> {
    let (w, _) = shape.at(position);
    if w.abs() < 1e-6 {
        return None;
    }
    let mass = shape.generalized_mass / (w * w);
    Some(Equivalent { position, mass, stiffness: omega * omega * mass })
}

/// The point of largest deflection of a shape on the beam.
pub fn largest_deflection(shape: &ModeShape) -> f64 {
    let mut best = (0.0, 0.0f64);
    for (x, w) in shape.x.iter().zip(&shape.deflection) {
        if w.abs() > best.1.abs() {
            best = (*x, *w);
        }
    }
    best.0
}
