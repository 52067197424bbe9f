//! Where the finite-element nodes go, how the unknowns are numbered, and where each attachment
//! sits on the elements.
//!
//! Nodes are placed at the ends, the segment joints, every point that holds the beam (supports,
//! rigid springs) and any points a caller asks for; then at the other attachments, unless one
//! lies closer to a node already placed than a quarter of the element length the mesh aims for
//! there. Such an attachment acts through the element's shape functions at its exact position
//! (a mass adds m·N·Nᵀ to the element's mass matrix, a spring k·N·Nᵀ to its stiffness). That
//! keeps every element long enough for the stiffness matrix to stay well conditioned: an element
//! a thousand times shorter than its neighbours makes the matrix's condition grow like the fourth
//! power of that ratio, and round-off then swamps the check the method is there to give.

use super::element::Element;
use super::{per_element, wavenumber, Mesh, WAVE_PER_ELEMENT as WAVE};
use crate::error::{Error, ErrorKind, Result};
use crate::model::{Attachment, End, Model, Theory, SAME_POINT};

/// Most elements a default mesh (sized from the wavelength) may have; past it the elements are
/// made longer and the check says it is not converged.
pub(crate) const MAX_DEFAULT_ELEMENTS: usize = 20_000;
/// An attachment closer to a node than this fraction of the element length aimed for there is
/// placed inside an element rather than given a node of its own.
const SEPARATION: f64 = 0.25;

/// A node: its position, its unknowns (`None` where held) and the finite end springs on it.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Node {
    pub(crate) x: f64,
    pub(crate) w: Option<usize>,
    pub(crate) theta: Option<usize>,
    pub(crate) spring: f64,
    pub(crate) rotational_spring: f64,
}

/// An element between nodes `i` and `i + 1` (its index is `i`), with its unknowns
/// [w₁, θ₁, w₂, θ₂].
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Placed {
    pub(crate) element: Element,
    pub(crate) x0: f64,
    pub(crate) dofs: [Option<usize>; 4],
}

/// An attachment (other than a rigid restraint) at local coordinate ξ of an element.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Point {
    pub(crate) element: usize,
    pub(crate) xi: f64,
    pub(crate) x: f64,
    /// Index of the attachment in the model (several may share a position).
    pub(crate) attachment: usize,
    pub(crate) kind: PointKind,
}

/// What acts at a [`Point`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum PointKind {
    Mass {
        mass: f64,
        rotary_inertia: f64,
    },
    Spring {
        stiffness: f64,
    },
    RotationalSpring {
        stiffness: f64,
    },
    /// A sprung mass with its own unknown; `attachment` is its index in the model.
    Sprung {
        mass: f64,
        stiffness: f64,
        dof: usize,
        attachment: usize,
    },
}

/// Nodes, elements and attachments of one mesh.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct FeMesh {
    pub(crate) nodes: Vec<Node>,
    pub(crate) elements: Vec<Placed>,
    pub(crate) points: Vec<Point>,
    pub(crate) dofs: usize,
    pub(crate) bandwidth: usize,
}

impl FeMesh {
    /// The mesh of `model` for `mesh`, with nodes also at `extra` positions.
    pub(crate) fn new(model: &Model, mesh: Mesh, extra: &[f64]) -> Result<FeMesh> {
        let length = model.length();
        let tolerance = SAME_POINT * length;
        let theory = model.theory();
        // The element length aimed for at x for modes up to ω.
        let wave = |x: f64, omega: f64| -> f64 {
            let index = model.segment_at(x);
            let s = &model.segments()[index];
            // An axial force adds the wavenumber √(|P|/EI): tension's boundary layers at the
            // supports are that short, and compression's buckling waves that long.
            let load = (model.axial_force(index).abs() / s.flexural_rigidity).sqrt();
            let h = (per_element(s, theory, omega) / wavenumber(s, theory, omega)).min(WAVE / load);
            if h.is_finite() {
                h.min(length)
            } else {
                length
            }
        };
        let design = |x: f64| -> f64 {
            match mesh {
                Mesh::Total(n) => length / n.max(1) as f64,
                Mesh::UpTo(omega) | Mesh::Between { highest: omega, .. } => wave(x, omega),
                Mesh::PerSpan(_) => 0.0,
            }
        };
        // How close an attachment may come to a node before it is put inside an element instead.
        let separation = |x: f64| -> f64 {
            match mesh {
                // An element of length h carries eigenvalues up to about 130·EI/(m·h⁴), so at
                // the lowest mode the round-off is about 8ε·130/(βh)⁴ (see `ROUND_OFF`): a tenth
                // of a wavelength's radian, βh = 0.05, keeps it near 4e-8. `wave` gives 0.5/β.
                Mesh::Between { lowest, .. } => 0.1 * wave(x, lowest),
                _ => SEPARATION * design(x),
            }
        };

        let mut fixed = vec![0.0, length];
        let mut x = 0.0;
        for s in &model.segments()[..model.segments().len() - 1] {
            x += s.length;
            fixed.push(x);
        }
        fixed.extend(model.attachments().iter().filter(|a| restraint(a).is_some()).map(Attachment::position));
        fixed.extend(extra.iter().copied().filter(|x| x.is_finite() && *x > 0.0 && *x < length));
        let fixed = merge(fixed, tolerance);
        let mut optional: Vec<f64> =
            model.attachments().iter().filter(|a| restraint(a).is_none()).map(Attachment::position).collect();
        crate::sort::floats(&mut optional);
        let corners = choose(&fixed, &optional, tolerance, &separation);

        // Elements per span between chosen nodes.
        let mut counts: Vec<f64> = corners
            .windows(2)
            .map(|w| {
                let span = w[1] - w[0];
                let n = match mesh {
                    Mesh::Total(n) => (n as f64 * span / length).round(),
                    Mesh::UpTo(_) | Mesh::Between { .. } => (span / design(0.5 * (w[0] + w[1]))).ceil(),
                    Mesh::PerSpan(n) => n as f64,
                };
                if n.is_finite() {
                    n.max(1.0)
                } else {
                    f64::INFINITY
                }
            })
            .collect();
        let total: f64 = counts.iter().sum();
        if total > MAX_DEFAULT_ELEMENTS as f64 {
            if !matches!(mesh, Mesh::UpTo(_) | Mesh::Between { .. }) {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    format!("the mesh would need {total:.0} elements; at most {MAX_DEFAULT_ELEMENTS}"),
                )
                .at("elements"));
            }
            let shrink = MAX_DEFAULT_ELEMENTS as f64 / total;
            counts.iter_mut().for_each(|n| *n = (*n * shrink).floor().max(1.0));
        }
        let mut xs = Vec::with_capacity(counts.iter().sum::<f64>() as usize + 1);
        for (w, n) in corners.windows(2).zip(&counts) {
            let n = *n as usize;
            for k in 0..n {
                xs.push(w[0] + (w[1] - w[0]) * k as f64 / n as f64);
            }
        }
        xs.push(length);
        build(model, xs, tolerance)
    }
}

/// Whether an attachment holds the beam rigidly: `Some((deflection, rotation))` held.
fn restraint(a: &Attachment) -> Option<(bool, bool)> {
    match *a {
        Attachment::Support { .. } => Some((true, false)),
        Attachment::Spring { stiffness, .. } if stiffness == f64::INFINITY => Some((true, false)),
        Attachment::RotationalSpring { stiffness, .. } if stiffness == f64::INFINITY => Some((false, true)),
        _ => None,
    }
}

/// Sorts positions and merges those closer than `tolerance`, keeping the first of each group.
fn merge(mut xs: Vec<f64>, tolerance: f64) -> Vec<f64> {
    crate::sort::floats(&mut xs);
    let mut out: Vec<f64> = Vec::with_capacity(xs.len());
    for x in xs {
        match out.last() {
            Some(&last) if x - last <= tolerance => {}
            _ => out.push(x),
        }
    }
    out
}

/// The fixed nodes plus each optional position (ascending) that lies at least `separation(x)`
/// (and more than `tolerance`) from every node kept so far and from the next fixed one.
fn choose(fixed: &[f64], optional: &[f64], tolerance: f64, separation: &dyn Fn(f64) -> f64) -> Vec<f64> {
    let mut out: Vec<f64> = Vec::with_capacity(fixed.len() + optional.len());
    let mut next_fixed = 0;
    for &x in optional {
        while next_fixed < fixed.len() && fixed[next_fixed] <= x {
            out.push(fixed[next_fixed]);
            next_fixed += 1;
        }
        let gap = separation(x).max(tolerance);
        let clear_before = out.last().is_none_or(|&p| x - p > gap);
        let clear_after = fixed.get(next_fixed).is_none_or(|&n| n - x > gap);
        if clear_before && clear_after {
            out.push(x);
        }
    }
    out.extend_from_slice(&fixed[next_fixed..]);
    out
}

/// Numbers the unknowns of the nodes at `xs` (ascending, first 0, last the length), builds the
/// elements and places the attachments.
fn build(model: &Model, xs: Vec<f64>, tolerance: f64) -> Result<FeMesh> {
    let length = model.length();
    let last = xs.len() - 1;
    let nearest = |x: f64| -> Option<usize> {
        let i = xs.partition_point(|p| *p < x - tolerance);
        (i < xs.len() && (xs[i] - x).abs() <= tolerance).then_some(i)
    };
    let mut held = vec![(false, false); xs.len()];
    let mut springs = vec![(0.0, 0.0); xs.len()];
    for (i, end) in [(0, model.left()), (last, model.right())] {
        let (kt, kr) = End::springs(end);
        held[i].0 |= kt == f64::INFINITY;
        held[i].1 |= kr == f64::INFINITY;
        springs[i].0 += if kt.is_finite() { kt } else { 0.0 };
        springs[i].1 += if kr.is_finite() { kr } else { 0.0 };
    }
    for a in model.attachments() {
        if let Some((w, t)) = restraint(a) {
            let i = nearest(a.position()).ok_or_else(|| misplaced(a.position()))?;
            held[i].0 |= w;
            held[i].1 |= t;
        }
    }
    // Each attachment goes on the element to its right (the last node's on the one to its left).
    let elements_count = last;
    let mut points: Vec<Point> = Vec::new();
    let mut sprung_in: Vec<Vec<usize>> = vec![Vec::new(); elements_count];
    for (index, a) in model.attachments().iter().enumerate() {
        if restraint(a).is_some() {
            continue;
        }
        let x = a.position();
        let element = xs.partition_point(|p| *p <= x + tolerance).saturating_sub(1).min(elements_count - 1);
        let (x0, x1) = (xs[element], xs[element + 1]);
        let xi = ((x - x0) / (x1 - x0)).clamp(0.0, 1.0);
        let xi = if xi * (x1 - x0) <= tolerance {
            0.0
        } else if (1.0 - xi) * (x1 - x0) <= tolerance {
            1.0
        } else {
            xi
        };
        let kind = match *a {
            Attachment::Mass { mass, rotary_inertia, .. } => PointKind::Mass { mass, rotary_inertia },
            Attachment::Spring { stiffness, .. } => PointKind::Spring { stiffness },
            Attachment::RotationalSpring { stiffness, .. } => PointKind::RotationalSpring { stiffness },
            Attachment::SprungMass { mass, stiffness, .. } => {
                sprung_in[element].push(points.len());
                PointKind::Sprung { mass, stiffness, dof: 0, attachment: index }
            }
            Attachment::Support { .. } => continue,
        };
        points.push(Point { element, xi, x, attachment: index, kind });
    }
    let mut dofs = 0;
    let mut next = || {
        dofs += 1;
        dofs - 1
    };
    let mut nodes = Vec::with_capacity(xs.len());
    for (i, &x) in xs.iter().enumerate() {
        let w = (!held[i].0).then(&mut next);
        let theta = (!held[i].1).then(&mut next);
        nodes.push(Node { x, w, theta, spring: springs[i].0, rotational_spring: springs[i].1 });
        if i < elements_count {
            for &p in &sprung_in[i] {
                if let PointKind::Sprung { dof, .. } = &mut points[p].kind {
                    *dof = next();
                }
            }
        }
    }
    let timoshenko = model.theory() == Theory::Timoshenko;
    let mut bandwidth = 0;
    let elements: Vec<Placed> = (0..elements_count)
        .map(|i| {
            let (a, b) = (&nodes[i], &nodes[i + 1]);
            let dofs = [a.w, a.theta, b.w, b.theta];
            let mut present: Vec<usize> = dofs.iter().flatten().copied().collect();
            for &p in &sprung_in[i] {
                if let PointKind::Sprung { dof, .. } = points[p].kind {
                    present.push(dof);
                }
            }
            if let (Some(lo), Some(hi)) = (present.iter().min(), present.iter().max()) {
                bandwidth = bandwidth.max(hi - lo);
            }
            let index = model.segment_at(0.5 * (a.x + b.x));
            let s = &model.segments()[index];
            Placed {
                element: Element {
                    length: b.x - a.x,
                    ei: s.flexural_rigidity,
                    kga: if timoshenko { s.shear_rigidity.unwrap_or(f64::INFINITY) } else { f64::INFINITY },
                    mass_per_length: s.mass_per_length,
                    rotary_inertia_per_length: if timoshenko { s.rotary_inertia_per_length } else { 0.0 },
                    axial: model.axial_force(index),
                },
                x0: a.x,
                dofs,
            }
        })
        .collect();
    debug_assert!((xs[last] - length).abs() <= tolerance);
    Ok(FeMesh { nodes, elements, points, dofs, bandwidth })
}

fn misplaced(x: f64) -> Error {
    Error::new(
        ErrorKind::Model,
        format!("internal: no node at the restraint at {x} m; please report this model"),
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::tests::two_spans as model;

    #[test]
    fn close_attachments_share_a_node_and_restraints_always_get_one() {
        let m = model(vec![
            Attachment::Mass { position: 1.5, mass: 2.0, rotary_inertia: 0.0 },
            Attachment::Mass { position: 1.5 + 1e-6, mass: 2.0, rotary_inertia: 0.0 },
            Attachment::Support { position: 2.5 },
            Attachment::SprungMass { position: 2.5 + 1e-7, mass: 1.0, stiffness: 10.0 },
        ]);
        let mesh = FeMesh::new(&m, Mesh::Total(30), &[]).unwrap();
        let xs: Vec<f64> = mesh.nodes.iter().map(|n| n.x).collect();
        assert!(xs.contains(&1.5) && xs.contains(&2.5) && xs.contains(&1.0));
        let shortest = mesh.elements.iter().map(|e| e.element.length).fold(f64::INFINITY, f64::min);
        assert!(shortest > 0.02, "an element of {shortest} m was made");
        // The second mass and the sprung mass sit inside elements.
        assert!(mesh.points.iter().any(|p| (p.x - (1.5 + 1e-6)).abs() < 1e-12 && p.xi > 0.0 && p.xi < 1.0));
        let support = mesh.nodes.iter().find(|n| n.x == 2.5).unwrap();
        assert_eq!(support.w, None);
        // Every sprung unknown lies within the band.
        for p in &mesh.points {
            if let PointKind::Sprung { dof, .. } = p.kind {
                for d in mesh.elements[p.element].dofs.iter().flatten() {
                    assert!(dof.abs_diff(*d) <= mesh.bandwidth);
                }
            }
        }
        // With one element per span, the nodes are exactly the natural points.
        let per = FeMesh::new(&m, Mesh::PerSpan(1), &[]).unwrap();
        assert_eq!(per.nodes.len(), 7);
    }
}
