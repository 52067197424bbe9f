//! The finite-element method: two-node beam elements with consistent mass, a node at every
//! segment boundary and attachment, and the generalised eigenproblem K·x = ω²·M·x.
//!
//! The eigenvalues are found the same way as the exact method's: a Sturm count (negative pivots
//! of K − ω²M, Sylvester's law of inertia) isolates each one, Brent's method on det(K − ω²M)
//! polishes it. That exploits the band structure: each count costs O(n·b²) for n unknowns and
//! half-bandwidth b. [`dense_frequencies`] solves the same problem with nalgebra's dense
//! symmetric eigensolver and serves as the slow obvious reference.

mod element;

pub(crate) use element::Element;

use crate::band::SymBand;
use crate::error::{Error, ErrorKind, Result};
use crate::layout::Layout;
use crate::model::{Model, Theory};
use crate::roots::{self, Evaluator, Spectrum};

/// How many elements to use.
#[derive(Clone, Copy, Debug, PartialEq)]
#[non_exhaustive]
pub enum Mesh {
    /// About this many elements in all, shared out by length (at least one per span between
    /// natural stations).
    Total(usize),
    /// Enough elements that modes up to this angular frequency (rad/s) converge to about 1e-4:
    /// at most 0.5 rad of bending wavenumber per element.
    UpTo(f64),
    /// Every span between natural stations (ends, segment boundaries, attachments) cut into this
    /// many equal elements; doubling it halves every element, as convergence studies need.
    PerSpan(usize),
}

/// Most elements a mesh may have. Round-off in the assembled matrices grows like n⁴ (the
/// condition of the beam stiffness), so beyond a few hundred elements more elements add noise,
/// not accuracy.
pub const MAX_ELEMENTS: usize = 2000;

/// Above this many elements the result carries round-off of about 1e-6 and a warning says so.
pub const NOISY_ELEMENTS: usize = 400;

/// Bending wavenumber × element length allowed by [`Mesh::UpTo`]. The Hermite element's
/// frequency error is about (βh)⁴/1440, so 0.5 gives about 4e-5.
const WAVE_PER_ELEMENT: f64 = 0.5;

/// Assembled stiffness and mass on a finite-element layout.
#[derive(Clone, Debug)]
pub(crate) struct Discrete {
    pub(crate) layout: Layout,
    pub(crate) elements: Vec<Element>,
    pub(crate) stiffness: SymBand,
    pub(crate) mass: SymBand,
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
}

/// The first `elastic` elastic natural frequencies by finite elements.
pub fn frequencies(model: &Model, elastic: usize, mesh: Mesh) -> Result<FeSolution> {
    frequencies_near(model, elastic, mesh, &[])
}

/// As [`frequencies`], given the exact frequencies (rad/s) the finite-element ones lie just above:
/// the search brackets each root from there, which saves most of the bisection.
pub fn frequencies_near(model: &Model, elastic: usize, mesh: Mesh, exact: &[f64]) -> Result<FeSolution> {
    let discrete = Discrete::new(model, mesh, &[])?;
    let rigid = model.rigid_body_modes();
    let available = discrete.layout.dofs.saturating_sub(rigid);
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
    Ok(FeSolution {
        omegas: roots.iter().map(|r| r.omega).collect(),
        elements: discrete.elements.len(),
        dofs: discrete.layout.dofs,
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
    let n = d.layout.dofs;
    let k = nalgebra::DMatrix::from_fn(n, n, |i, j| d.stiffness.get(i, j));
    let m = nalgebra::DMatrix::from_fn(n, n, |i, j| d.mass.get(i, j));
    Ok((k, m))
}

impl Discrete {
    /// Assembles K and M on a mesh, with extra nodes at `points`.
    pub(crate) fn new(model: &Model, mesh: Mesh, points: &[f64]) -> Result<Discrete> {
        let total_length = model.length();
        // Elements per natural span (between ends, segment boundaries, attachments, points).
        let natural = Layout::with_points(model, points, &|_| 1)?;
        let mut counts: Vec<f64> = natural
            .spans
            .iter()
            .map(|span| match mesh {
                Mesh::Total(total) => (total as f64 * span.length / total_length).round(),
                Mesh::UpTo(omega) => {
                    let s = &model.segments()[span.segment];
                    let theory = model.theory();
                    (wavenumber(s, theory, omega) * span.length / per_element(s, theory, omega)).ceil()
                }
                Mesh::PerSpan(n) => n as f64,
            })
            .map(|n| if n.is_finite() { n.max(1.0) } else { f64::INFINITY })
            .collect();
        if let Mesh::UpTo(_) = mesh {
            // A default mesh never exceeds the size where round-off starts to show; past it the
            // "not converged" warning tells the user instead.
            let total: f64 = counts.iter().sum();
            if total > NOISY_ELEMENTS as f64 {
                let shrink = NOISY_ELEMENTS as f64 / total;
                counts.iter_mut().for_each(|n| *n = (*n * shrink).floor().max(1.0));
            }
        }
        let layout = Layout::with_points(model, points, &|span| counts[span.left].min(1e9) as usize)?;
        let elements: Vec<Element> = layout
            .spans
            .iter()
            .map(|span| {
                let s = &model.segments()[span.segment];
                let timoshenko = model.theory() == Theory::Timoshenko;
                Element {
                    length: span.length,
                    ei: s.flexural_rigidity,
                    kga: if timoshenko { s.shear_rigidity.unwrap_or(f64::INFINITY) } else { f64::INFINITY },
                    mass_per_length: s.mass_per_length,
                    rotary_inertia_per_length: if timoshenko { s.rotary_inertia_per_length } else { 0.0 },
                }
            })
            .collect();
        let mut stiffness = SymBand::zeros(layout.dofs, layout.bandwidth);
        let mut mass = SymBand::zeros(layout.dofs, layout.bandwidth);
        for (span, e) in layout.spans.iter().zip(&elements) {
            let ids = layout.span_dofs(span);
            let (ke, me) = (e.stiffness(), e.mass());
            for (a, ia) in ids.iter().enumerate() {
                let Some(ia) = ia else { continue };
                for (b, ib) in ids.iter().enumerate().take(a + 1) {
                    if let Some(ib) = ib {
                        stiffness.add(*ia, *ib, ke[a][b]);
                        mass.add(*ia, *ib, me[a][b]);
                    }
                }
            }
        }
        for s in &layout.stations {
            if let Some(w) = s.w {
                stiffness.add(w, w, s.spring);
                mass.add(w, w, s.mass);
            }
            if let Some(t) = s.theta {
                stiffness.add(t, t, s.rotational_spring);
                mass.add(t, t, s.rotary_inertia);
            }
            for d in &s.sprung {
                stiffness.add(d.dof, d.dof, d.stiffness);
                mass.add(d.dof, d.dof, d.mass);
                if let Some(w) = s.w {
                    stiffness.add(w, w, d.stiffness);
                    stiffness.add(w, d.dof, -d.stiffness);
                }
            }
        }
        Ok(Discrete { layout, elements, stiffness, mass })
    }
}

/// Wavenumber × element length allowed for about 1e-4 at ω. The Hermite element's error is
/// about (kh)⁴/1440. The shear-flexible element's consistent mass adds an error of about
/// 0.045·σ·(kh)², with σ = s/(1 + s) and s = EI·k²/κGA the share of shear in the wave (fitted
/// to exact Timoshenko frequencies of rectangles from L/h = 2.5 to 20, modes 1–4), so stocky
/// sections need finer meshes: that element converges as h², not h⁴.
fn per_element(s: &crate::model::Segment, theory: Theory, omega: f64) -> f64 {
    let (Theory::Timoshenko, Some(kga)) = (theory, s.shear_rigidity) else { return WAVE_PER_ELEMENT };
    let k = wavenumber(s, theory, omega);
    let share = s.flexural_rigidity * k * k / kga;
    let sigma = share / (1.0 + share);
    WAVE_PER_ELEMENT.min((5e-5 / (0.045 * sigma)).sqrt())
}

/// The bending wavenumber of free waves at ω in a segment: (mω²/EI)^¼ for Euler–Bernoulli; for
/// Timoshenko the larger root k² of κGA·EI·k⁴ − ω²(κGA·ρI + ρA·EI)·k² + ρA·ω²(ρI·ω² − κGA) = 0
/// (the pinned–pinned frequency equation read for k), which is shorter-waved.
fn wavenumber(s: &crate::model::Segment, theory: Theory, omega: f64) -> f64 {
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

    /// The finite-element frequencies carry round-off of 1e-10 and more on any but the smallest
    /// meshes (the stiffness matrix's condition grows like n⁴); polishing further only costs time.
    fn tolerance(&self) -> f64 {
        1e-11
    }
}
