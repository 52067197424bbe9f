//! The finite-element method: two-node beam elements with consistent mass and the generalised
//! eigenproblem K·x = ω²·M·x.
//!
//! The eigenvalues are found the same way as the exact method's: a Sturm count (negative pivots
//! of K − ω²M, Sylvester's law of inertia) isolates each one, and Brent's method on det(K − ω²M)
//! from the same LDLᵀ factorisation polishes it. That exploits the band structure: each
//! evaluation costs O(n·b²) for n unknowns and half-bandwidth b. [`dense_frequencies`] solves
//! the same problem with nalgebra's dense symmetric eigensolver and serves as the slow obvious
//! reference. Each frequency comes with two error estimates: the mesh's (the element's error
//! formula at that mode's wavenumber) and round-off's (machine precision times the ratio of the
//! largest eigenvalue the mesh can carry to the mode's), so that a check that disagrees with the
//! exact method can be told apart from one that is not converged.

mod element;
mod mesh;

pub(crate) use mesh::{FeMesh, PointKind};

use crate::band::SymBand;
use crate::error::{Error, ErrorKind, Result};
use crate::model::{Model, Theory};
use crate::roots::{self, Evaluator, Spectrum};

/// How many elements to use.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Mesh {
    /// About this many elements in all, shared out by length (at least one per span between
    /// nodes).
    Total(usize),
    /// Enough elements that modes up to this angular frequency (rad/s) converge to about 4e-5:
    /// at most 0.5 rad of bending wavenumber per element, in every span and segment.
    UpTo(f64),
    /// As [`Mesh::UpTo`] for `highest`, with every attachment on a node of its own unless that
    /// would make an element so short that round-off at `lowest` (the lowest frequency of
    /// interest) would exceed about 1e-7; such an attachment acts inside its element.
    Between {
        /// The lowest frequency of interest, rad/s.
        lowest: f64,
        /// The highest frequency of interest, rad/s.
        highest: f64,
    },
    /// Every span between natural stations (ends, segment boundaries, attachments) cut into this
    /// many equal elements, every attachment on a node of its own; doubling it halves every
    /// element, as convergence studies need.
    PerSpan(usize),
}

/// Most elements a mesh may have. Round-off in the assembled matrices grows like n⁴ (the
/// condition of the beam stiffness), so beyond a few hundred elements more elements add noise,
/// not accuracy.
pub const MAX_ELEMENTS: usize = 2000;

/// Bending wavenumber × element length allowed by [`Mesh::UpTo`]. The Hermite element's
/// frequency error is about (βh)⁴/1440, so 0.5 gives about 4e-5.
pub(crate) const WAVE_PER_ELEMENT: f64 = 0.5;

/// Assembled stiffness and mass on a mesh.
#[derive(Clone, Debug)]
pub(crate) struct Discrete {
    pub(crate) mesh: FeMesh,
    pub(crate) stiffness: SymBand,
    pub(crate) mass: SymBand,
    /// An estimate of the largest eigenvalue of K·x = λ·M·x (see `largest_eigenvalue`).
    largest: f64,
}

/// Frequencies from the finite-element method.
#[derive(Clone, Debug, PartialEq)]
pub struct FeSolution {
    /// Angular frequencies of the elastic modes (rigid-body modes excluded), rad/s, ascending.
    pub omegas: Vec<f64>,
    /// Elements used.
    pub elements: usize,
    /// Unknowns (degrees of freedom) after supports are applied.
    pub dofs: usize,
    /// Estimated relative error of each frequency from the mesh (the discretisation).
    pub mesh_error: Vec<f64>,
    /// Estimated relative error of each frequency from round-off in the matrices.
    pub round_off: Vec<f64>,
    /// The attachments placed inside elements rather than on nodes, whose own discretisation
    /// error depends on the mode's deflection there (see [`Interior::error`]).
    pub interior: Vec<Interior>,
}

/// An attachment that acts inside an element, at distances `a` and `b` from its ends.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Interior {
    /// Index of the attachment in the model.
    pub attachment: usize,
    /// Position, m.
    pub position: f64,
    /// Distances to the element's ends, m.
    pub a: f64,
    /// See `a`.
    pub b: f64,
    /// The element's bending stiffness EI, N·m².
    pub flexural_rigidity: f64,
    /// The element's shear rigidity κGA, N; infinite for a slender element.
    pub shear_rigidity: f64,
}

impl Interior {
    /// The relative error that a force F and a moment C acting here (the mode's inertia or
    /// spring forces at this point) add to a mode's ω. A cubic element bends between its nodes
    /// only as its end values dictate, so it misses the compliance of its span clamped at both
    /// ends under a load at this point: the inverse of the two clamped pieces' end stiffnesses
    /// added, EI·[12/a³ + 12/b³, 6/b² − 6/a²; 6/b² − 6/a², 4/a + 4/b] (the standard slender
    /// element's stiffness), and in a shear-flexible element also the two pieces' shear
    /// compliance under the force, a·b/((a + b)·κGA) (the two pieces' shear stiffnesses κGA/a
    /// and κGA/b in parallel; added to the bending part it is the clamped–clamped Timoshenko
    /// beam's exact deflection at midspan, FL³/192EI + FL/4κGA, e.g. Roark's formulas, from
    /// memory). Near a node the shear part dominates: a heavy mass a short way inside an element
    /// of a thin rod bounces on that shear compliance in a mode of its own, which the element
    /// cannot show. Against the mode's energy ω²·T (T its generalised mass in the same
    /// normalisation as F and C) that is δω/ω ≈ (F, C)·compliance·(F, C)/(2ω²T).
    pub fn error(&self, force: f64, moment: f64, omega: f64, generalized_mass: f64) -> f64 {
        let (a, b, ei) = (self.a, self.b, self.flexural_rigidity);
        let k = [
            [ei * (12.0 / a.powi(3) + 12.0 / b.powi(3)), ei * (6.0 / (b * b) - 6.0 / (a * a))],
            [ei * (6.0 / (b * b) - 6.0 / (a * a)), ei * (4.0 / a + 4.0 / b)],
        ];
        let det = k[0][0] * k[1][1] - k[0][1] * k[1][0];
        let bending =
            (k[1][1] * force * force - 2.0 * k[0][1] * force * moment + k[0][0] * moment * moment) / det;
        let shear = match self.shear_rigidity.is_finite() {
            true => a * b / ((a + b) * self.shear_rigidity) * force * force,
            false => 0.0,
        };
        (bending + shear) / (2.0 * omega * omega * generalized_mass)
    }
}

/// The first `elastic` elastic natural frequencies by finite elements.
pub fn frequencies(model: &Model, elastic: usize, mesh: Mesh) -> Result<FeSolution> {
    frequencies_near(model, elastic, mesh, &[])
}

/// As [`frequencies`], given the exact frequencies (rad/s) the finite-element ones lie just above:
/// the search brackets each root from there, which saves most of the bisection.
pub fn frequencies_near(model: &Model, elastic: usize, mesh: Mesh, exact: &[f64]) -> Result<FeSolution> {
    frequencies_with_nodes(model, elastic, mesh, exact, &[])
}

/// As [`frequencies_near`], with nodes also at `nodes` (m): attachments there act on a node of
/// their own rather than inside an element, whatever the mesh's spacing.
pub fn frequencies_with_nodes(
    model: &Model,
    elastic: usize,
    mesh: Mesh,
    exact: &[f64],
    nodes: &[f64],
) -> Result<FeSolution> {
    let discrete = Discrete::new(model, mesh, nodes)?;
    let rigid = model.rigid_body_modes();
    let available = discrete.mesh.dofs.saturating_sub(rigid);
    if available < elastic {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!("the mesh has only {available} elastic modes; use more elements (at least {elastic} modes asked)"),
        )
        .at("elements"));
    }
    let guess = crate::exact::guess(model, rigid + elastic);
    // Consistent-mass elements give frequencies at or above the exact ones, usually by less than
    // a few parts in a thousand: probe at each exact value and a little above it.
    let hints: Vec<f64> = exact.iter().filter(|w| **w > 0.0).flat_map(|w| [*w, w * 1.002]).collect();
    let (roots, _) = roots::find(rigid, elastic, guess, &hints, &discrete)?;
    let omegas: Vec<f64> = roots.iter().map(|r| r.omega).collect();
    let largest = discrete.largest;
    let interior = discrete
        .mesh
        .points
        .iter()
        .filter(|p| p.xi > 0.0 && p.xi < 1.0)
        .map(|p| {
            let e = &discrete.mesh.elements[p.element];
            Interior {
                attachment: p.attachment,
                position: p.x,
                a: p.xi * e.element.length,
                b: (1.0 - p.xi) * e.element.length,
                flexural_rigidity: e.element.ei,
                shear_rigidity: e.element.kga,
            }
        })
        .collect();
    Ok(FeSolution {
        interior,
        mesh_error: omegas.iter().map(|w| discrete.mesh_error(model.theory(), *w)).collect(),
        round_off: omegas.iter().map(|w| ROUND_OFF * f64::EPSILON * largest / (w * w)).collect(),
        omegas,
        elements: discrete.mesh.elements.len(),
        dofs: discrete.mesh.dofs,
    })
}

/// The mesh of [`frequencies_with_nodes`] with no frequencies: what the check would have used
/// when its root search cannot resolve the model (its matrices' rounding swamps the modes), so
/// that the report can still say which mesh it tried.
pub(crate) fn unsolved(model: &Model, mesh: Mesh) -> Result<FeSolution> {
    let mesh = FeMesh::new(model, mesh, &[])?;
    Ok(FeSolution {
        omegas: Vec::new(),
        elements: mesh.elements.len(),
        dofs: mesh.dofs,
        mesh_error: Vec::new(),
        round_off: Vec::new(),
        interior: Vec::new(),
    })
}

/// All natural frequencies of the finite-element model, by nalgebra's dense solver: M = LLᵀ,
/// then the eigenvalues of L⁻¹KL⁻ᵀ. O(n³); the reference the banded solver is tested against.
pub fn dense_frequencies(model: &Model, mesh: Mesh) -> Result<Vec<f64>> {
    let (k, m) = matrices(model, mesh)?;
    let chol = m.cholesky().ok_or_else(|| {
        Error::new(
            ErrorKind::Model,
            "the mass matrix is not positive definite (a massless degree of freedom)",
        )
    })?;
    let l_inv = chol.l().try_inverse().ok_or_else(|| Error::new(ErrorKind::Model, "singular mass matrix"))?;
    let a = &l_inv * k * l_inv.transpose();
    let a = (&a + a.transpose()) * 0.5;
    let mut eig: Vec<f64> = a.symmetric_eigen().eigenvalues.iter().map(|v| v.max(0.0).sqrt()).collect();
    eig.sort_by(f64::total_cmp);
    Ok(eig)
}

/// The dense stiffness and mass matrices of the finite-element model (held degrees of freedom
/// removed), for cross-checks with other libraries.
pub fn matrices(model: &Model, mesh: Mesh) -> Result<(nalgebra::DMatrix<f64>, nalgebra::DMatrix<f64>)> {
    let d = Discrete::new(model, mesh, &[])?;
    let n = d.mesh.dofs;
    let k = nalgebra::DMatrix::from_fn(n, n, |i, j| d.stiffness.get(i, j));
    let m = nalgebra::DMatrix::from_fn(n, n, |i, j| d.mass.get(i, j));
    Ok((k, m))
}

/// The round-off of a frequency is about this many units of machine precision times the ratio
/// of the largest eigenvalue of the pencil to the mode's own (the usual perturbation bound for a
/// symmetric eigenproblem, with a margin for the factorisation's growth).
const ROUND_OFF: f64 = 8.0;

impl Discrete {
    /// Assembles K and M on a mesh, with extra nodes at `points`.
    pub(crate) fn new(model: &Model, mesh: Mesh, points: &[f64]) -> Result<Discrete> {
        let mesh = FeMesh::new(model, mesh, points)?;
        let mut stiffness = SymBand::zeros(mesh.dofs, mesh.bandwidth);
        let mut mass = SymBand::zeros(mesh.dofs, mesh.bandwidth);
        let outer = |n: &[f64; 4], scale: f64| -> [[f64; 4]; 4] {
            std::array::from_fn(|a| std::array::from_fn(|b| scale * n[a] * n[b]))
        };
        for e in &mesh.elements {
            stiffness.scatter(&e.dofs, &e.element.stiffness());
            mass.scatter(&e.dofs, &e.element.mass());
        }
        for n in &mesh.nodes {
            if let Some(w) = n.w {
                stiffness.add(w, w, n.spring);
            }
            if let Some(t) = n.theta {
                stiffness.add(t, t, n.rotational_spring);
            }
        }
        for p in &mesh.points {
            let placed = &mesh.elements[p.element];
            let (nw, npsi) = placed.element.at(p.xi);
            match p.kind {
                PointKind::Mass { mass: m, rotary_inertia } => {
                    mass.scatter(&placed.dofs, &outer(&nw, m));
                    mass.scatter(&placed.dofs, &outer(&npsi, rotary_inertia));
                }
                PointKind::Spring { stiffness: k } => stiffness.scatter(&placed.dofs, &outer(&nw, k)),
                PointKind::RotationalSpring { stiffness: k } => {
                    stiffness.scatter(&placed.dofs, &outer(&npsi, k))
                }
                PointKind::Sprung { mass: m, stiffness: k, dof, .. } => {
                    // k·(N·q − d)²: the spring between the beam's point and the mass.
                    stiffness.scatter(&placed.dofs, &outer(&nw, k));
                    for (id, n) in placed.dofs.iter().zip(nw) {
                        if let Some(id) = id {
                            stiffness.add(*id, dof, -k * n);
                        }
                    }
                    stiffness.add(dof, dof, k);
                    mass.add(dof, dof, m);
                }
            }
        }
        let mut d = Discrete { mesh, stiffness, mass, largest: 0.0 };
        d.largest = d.largest_eigenvalue();
        Ok(d)
    }

    /// An estimate of the largest eigenvalue of K·x = λ·M·x: four times the largest ratio of
    /// their diagonals (within a small factor of it for beam meshes, and never far below).
    fn largest_eigenvalue(&self) -> f64 {
        (0..self.mesh.dofs)
            .map(|i| self.stiffness.get(i, i) / self.mass.get(i, i))
            .filter(|r| r.is_finite())
            .fold(0.0, f64::max)
            * 4.0
    }

    /// The mesh's estimated relative error at ω: the worst element's (kh)⁴/1440, plus for a
    /// shear-flexible element the part that converges only as h² (see [`per_element`]).
    fn mesh_error(&self, theory: Theory, omega: f64) -> f64 {
        self.mesh
            .elements
            .iter()
            .map(|p| {
                let e = &p.element;
                let segment = crate::model::Segment {
                    length: e.length,
                    flexural_rigidity: e.ei,
                    mass_per_length: e.mass_per_length,
                    shear_rigidity: e.kga.is_finite().then_some(e.kga),
                    rotary_inertia_per_length: e.rotary_inertia_per_length,
                };
                let kh = with_axial_force(wavenumber(&segment, theory, omega), e.axial, e.ei) * e.length;
                let mut error = kh.powi(4) / 1440.0;
                if let (Theory::Timoshenko, Some(kga)) = (theory, segment.shear_rigidity) {
                    let k = kh / e.length;
                    let share = e.ei * k * k / kga;
                    error += 0.045 * share / (1.0 + share) * kh * kh;
                }
                error
            })
            .fold(0.0, f64::max)
    }
}

/// Wavenumber × element length allowed for about 1e-4 at ω. The Hermite element's error is
/// about (kh)⁴/1440. The shear-flexible element's consistent mass adds an error of about
/// 0.045·σ·(kh)², with σ = s/(1 + s) and s = EI·k²/κGA the share of shear in the wave (fitted
/// to exact Timoshenko frequencies of rectangles from L/h = 2.5 to 20, modes 1–4), so stocky
/// sections need finer meshes: that element converges as h², not h⁴.
pub(crate) fn per_element(s: &crate::model::Segment, theory: Theory, omega: f64) -> f64 {
    let (Theory::Timoshenko, Some(kga)) = (theory, s.shear_rigidity) else { return WAVE_PER_ELEMENT };
    let k = wavenumber(s, theory, omega);
    let share = s.flexural_rigidity * k * k / kga;
    let sigma = share / (1.0 + share);
    WAVE_PER_ELEMENT.min((5e-5 / (0.045 * sigma)).sqrt())
}

/// The larger wavenumber of a slender beam-column's solutions at the bending wavenumber `k`
/// (that at ω without the force) under the axial force `p`: k² = (|P|/EI + √((P/EI)² + 4k⁴))/2,
/// from the characteristic equation EI·s⁴ − P·s² − m·ω² = 0 of EI·w⁗ − P·w″ − m·ω²·w = 0 (the
/// oscillating waves under compression, the decaying ones under tension). Without a force it is
/// `k`.
fn with_axial_force(k: f64, p: f64, ei: f64) -> f64 {
    if p == 0.0 {
        return k;
    }
    let q = p.abs() / ei;
    ((q + (q * q + 4.0 * k.powi(4)).sqrt()) / 2.0).sqrt()
}

/// The bending wavenumber of free waves at ω in a segment: (mω²/EI)^¼ for Euler–Bernoulli; for
/// Timoshenko the larger root k² of κGA·EI·k⁴ − ω²(κGA·ρI + ρA·EI)·k² + ρA·ω²(ρI·ω² − κGA) = 0
/// (the pinned–pinned frequency equation read for k), which is shorter-waved.
pub(crate) fn wavenumber(s: &crate::model::Segment, theory: Theory, omega: f64) -> f64 {
    let w2 = omega * omega;
    let euler = (s.mass_per_length * w2 / s.flexural_rigidity).sqrt().sqrt();
    let (Theory::Timoshenko, Some(kga)) = (theory, s.shear_rigidity) else { return euler };
    let (ei, ra, ri) = (s.flexural_rigidity, s.mass_per_length, s.rotary_inertia_per_length);
    let b = w2 * (kga * ri + ra * ei);
    let c = ra * w2 * (ri * w2 - kga);
    let k2 = (b + (b * b - 4.0 * kga * ei * c).max(0.0).sqrt()) / (2.0 * kga * ei);
    k2.sqrt().max(euler)
}

impl Spectrum for Discrete {
    /// The Sturm count (negative pivots of K − ω²M) and det(K − ω²M) from one LDLᵀ.
    fn evaluator(&self, _: f64) -> Result<Evaluator<'_>> {
        Ok(Box::new(move |omega| self.stiffness.minus_scaled(omega * omega, &self.mass).into_evaluation()))
    }

    /// The frequencies carry round-off of up to ε times the ratio of the largest eigenvalue the
    /// mesh can carry to the mode's (see [`FeSolution::round_off`]); polishing much further
    /// than that bisects noise and only costs evaluations. The estimate is a bound, often a
    /// hundred times the round-off that shows, so the polish goes that much further.
    fn tolerance(&self, omega: f64) -> f64 {
        (0.01 * ROUND_OFF * f64::EPSILON * self.largest / (omega * omega)).clamp(1e-12, 1e-9)
    }
}
