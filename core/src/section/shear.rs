//! Timoshenko shear coefficients κ of the common shapes as functions of Poisson's ratio ν.
//!
//! Source: G. R. Cowper, "The shear coefficient in Timoshenko's beam theory", Journal of Applied
//! Mechanics 33 (1966) 335–340, table 1. The solid and hollow circle and the solid rectangle are
//! the well-known forms; the thin-walled box and I-section are written from memory, and their
//! limiting cases are tested (both reduce to the solid rectangle when the flanges vanish).

/// Solid rectangle: κ = 10(1+ν)/(12+11ν) (Cowper 1966).
pub(crate) fn rectangle(nu: f64) -> f64 {
    10.0 * (1.0 + nu) / (12.0 + 11.0 * nu)
}

/// Solid circle: κ = 6(1+ν)/(7+6ν) (Cowper 1966).
pub(crate) fn circle(nu: f64) -> f64 {
    6.0 * (1.0 + nu) / (7.0 + 6.0 * nu)
}

/// Hollow circle with inner-to-outer radius ratio `m` (Cowper 1966):
/// κ = 6(1+ν)(1+m²)² / [(7+6ν)(1+m²)² + (20+12ν)m²].
pub(crate) fn hollow_circle(nu: f64, m: f64) -> f64 {
    let a = (1.0 + m * m).powi(2);
    6.0 * (1.0 + nu) * a / ((7.0 + 6.0 * nu) * a + (20.0 + 12.0 * nu) * m * m)
}

/// The denominator terms shared by Cowper's thin-walled box and I-section.
fn thin_walled_base(nu: f64, m: f64) -> f64 {
    (12.0 + 72.0 * m + 150.0 * m * m + 90.0 * m.powi(3))
        + nu * (11.0 + 66.0 * m + 135.0 * m * m + 90.0 * m.powi(3))
}

/// Thin-walled box (Cowper 1966, table 1 — from memory), with `width` b across the plane of
/// bending, `depth` h in it (both to the wall centrelines), `flange` t₁ the top and bottom wall and
/// `web` t the side walls; m = b·t₁/(h·t), n = b/h:
/// κ = 10(1+ν)(1+3m)² / [(12+72m+150m²+90m³) + ν(11+66m+135m²+90m³) + 10n²((3+ν)m + 3m²)].
pub(crate) fn thin_walled_box(nu: f64, width: f64, depth: f64, flange: f64, web: f64) -> f64 {
    let m = width * flange / (depth * web);
    let n = width / depth;
    10.0 * (1.0 + nu) * (1.0 + 3.0 * m).powi(2)
        / (thin_walled_base(nu, m) + 10.0 * n * n * ((3.0 + nu) * m + 3.0 * m * m))
}

/// Thin-walled I-section bent about its strong axis (Cowper 1966, table 1 — from memory), with
/// flange width b, depth h between flange centrelines, flange thickness t_f and web thickness
/// t_w; m = 2·b·t_f/(h·t_w), n = b/h:
/// κ = 10(1+ν)(1+3m)² / [(12+72m+150m²+90m³) + ν(11+66m+135m²+90m³) + 30n²(m+m²) + 5νn²(8m+9m²)].
pub(crate) fn thin_walled_i(nu: f64, flange_width: f64, depth: f64, flange: f64, web: f64) -> f64 {
    let m = 2.0 * flange_width * flange / (depth * web);
    let n = flange_width / depth;
    10.0 * (1.0 + nu) * (1.0 + 3.0 * m).powi(2)
        / (thin_walled_base(nu, m) + 30.0 * n * n * (m + m * m) + 5.0 * nu * n * n * (8.0 * m + 9.0 * m * m))
}

/// I-section bent about its weak axis. Cowper's table has no such case; here the two flanges are
/// taken to carry the shear as two solid rectangles and the web is neglected, so the shear area
/// κA equals the rectangle's κ times the flange area. This is our own approximation, exact in the
/// limit of a vanishing web.
pub(crate) fn i_weak_axis(nu: f64, flange_area: f64, area: f64) -> f64 {
    rectangle(nu) * flange_area / area
}
