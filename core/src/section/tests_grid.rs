//! An independent check of section properties: integrate over the shape on a fine grid of cells.

use super::tests::{i_beam_input, props, q};
use super::*;
use modebench_tests::check;

/// Area and second moment about the horizontal centroidal axis, by counting the centres of
/// `cells_x × cells_y` grid cells that fall inside the shape: an independent check that knows only
/// "is this point inside".
fn integrate(
    width: f64,
    height: f64,
    cells: (usize, usize),
    inside: impl Fn(f64, f64) -> bool,
) -> (f64, f64) {
    let (dx, dy) = (width / cells.0 as f64, height / cells.1 as f64);
    let (mut area, mut second_moment) = (0.0, 0.0);
    for j in 0..cells.1 {
        let y = -height / 2.0 + (j as f64 + 0.5) * dy;
        let count = (0..cells.0).filter(|&i| inside(-width / 2.0 + (i as f64 + 0.5) * dx, y)).count();
        let strip = count as f64 * dx * dy;
        area += strip;
        // A cell's own ∫y² adds dy²/12 per unit area to its centre's y².
        second_moment += strip * (y * y + dy * dy / 12.0);
    }
    (area, second_moment)
}

#[test]
fn properties_match_numerical_integration_over_the_shape() {
    const GRID: &str = "midpoint count over a grid of cells";
    // The plate shapes use 0.1 mm cells aligned with every edge, so the count is exact; the round
    // shapes' boundary error shrinks with the cell size (Gauss circle problem), hence 5e-4.
    let i_beam = |x: f64, y: f64| y.abs() <= 0.150 && (y.abs() >= 0.140 || x.abs() <= 0.0035);
    let (a, i) = integrate(0.150, 0.300, (1500, 3000), i_beam);
    let strong = props(&i_beam_input(BendingAxis::Strong));
    check("I-section area", GRID, a, strong.area, 1e-9);
    check("I-section strong-axis I", GRID, i, strong.second_moment, 1e-9);
    let (_, i_weak) = integrate(0.300, 0.150, (3000, 1500), |x, y| i_beam(y, x));
    check("I-section weak-axis I", GRID, i_weak, props(&i_beam_input(BendingAxis::Weak)).second_moment, 1e-9);

    let rhs = |x: f64, y: f64| !(x.abs() < 0.045 && y.abs() < 0.025);
    let (a, i) = integrate(0.100, 0.060, (1000, 600), rhs);
    let got =
        props(&SectionInput::RectangularTube { width: q("100 mm"), depth: q("60 mm"), wall: q("5 mm") });
    check("rectangular tube area", GRID, a, got.area, 1e-9);
    check("rectangular tube I", GRID, i, got.second_moment, 1e-9);

    let (r_o, r_i) = (0.1683 / 2.0, 0.1683 / 2.0 - 0.00711);
    let annulus = |x: f64, y: f64| (r_i * r_i..=r_o * r_o).contains(&(x * x + y * y));
    let (a, i) = integrate(0.1683, 0.1683, (3000, 3000), annulus);
    let got = props(&SectionInput::Tube { outer_diameter: q("168.3 mm"), wall: q("7.11 mm") });
    check("round tube area", GRID, a, got.area, 5e-4);
    check("round tube I", GRID, i, got.second_moment, 5e-4);

    let (a, i) = integrate(0.05, 0.05, (1000, 1000), |x, y| x * x + y * y <= 0.025 * 0.025);
    let got = props(&SectionInput::Round { diameter: q("50 mm") });
    check("round bar area", GRID, a, got.area, 5e-4);
    check("round bar I", GRID, i, got.second_moment, 5e-4);
}
