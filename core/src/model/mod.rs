//! The validated beam model: SI values only, checked once, trusted by every solver.
//!
//! Raw input (a scenario with unit strings) becomes [`ModelParts`] with plain SI numbers, and
//! [`Model::new`] checks those parts and builds the only type the solvers accept. Error paths use
//! the scenario's field names (`segments[1].length`, `attachments[2].position`) so that a message
//! points at what the user typed.

mod budget;
mod check;
mod kinds;
mod options;

pub use budget::budget_beam;
pub use kinds::{AttachmentKind, EndKind};
pub use options::Options;

pub(crate) use check::{value, whole, SHEAR_RATIO};

use crate::error::Result;

/// Which beam theory the exact and finite-element solvers use.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Theory {
    /// Bending only: plane sections stay normal to the axis; no rotary inertia.
    #[default]
    EulerBernoulli,
    /// Bending with shear deformation and rotary inertia.
    Timoshenko,
}

impl Theory {
    /// Both theories.
    pub const ALL: [Theory; 2] = [Theory::EulerBernoulli, Theory::Timoshenko];

    /// The name used in scenarios: "euler-bernoulli" or "timoshenko".
    pub fn id(self) -> &'static str {
        match self {
            Theory::EulerBernoulli => "euler-bernoulli",
            Theory::Timoshenko => "timoshenko",
        }
    }
}

/// One uniform stretch of the beam.
#[derive(Clone, Debug, PartialEq)]
pub struct Segment {
    /// Length, m.
    pub length: f64,
    /// Bending stiffness EI, N·m².
    pub flexural_rigidity: f64,
    /// Mass per unit length, structural plus non-structural, kg/m.
    pub mass_per_length: f64,
    /// Shear rigidity κGA, N; `None` means rigid in shear. Used by the Timoshenko theory only.
    pub shear_rigidity: Option<f64>,
    /// Rotary inertia per unit length ρI, kg·m. Used by the Timoshenko theory only.
    pub rotary_inertia_per_length: f64,
}

impl Segment {
    /// A segment as the Euler–Bernoulli theory sees it: rigid in shear, without rotary inertia.
    pub fn slender(length: f64, flexural_rigidity: f64, mass_per_length: f64) -> Self {
        Self {
            length,
            flexural_rigidity,
            mass_per_length,
            shear_rigidity: None,
            rotary_inertia_per_length: 0.0,
        }
    }
}

/// How an end of the beam is held.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum End {
    /// No restraint.
    Free,
    /// Deflection held, rotation free.
    Pinned,
    /// Deflection and rotation held.
    Clamped,
    /// Rotation held, free to slide.
    Guided,
    /// Grounded translational (N/m) and rotational (N·m/rad) springs; `f64::INFINITY` is rigid.
    Elastic {
        /// Translational stiffness, N/m, 0 … ∞.
        translational: f64,
        /// Rotational stiffness, N·m/rad, 0 … ∞.
        rotational: f64,
    },
}

impl End {
    /// Grounded (translational, rotational) stiffness of the end; `INFINITY` means held.
    pub fn springs(self) -> (f64, f64) {
        match self {
            End::Free => (0.0, 0.0),
            End::Pinned => (f64::INFINITY, 0.0),
            End::Clamped => (f64::INFINITY, f64::INFINITY),
            End::Guided => (0.0, f64::INFINITY),
            End::Elastic { translational, rotational } => (translational, rotational),
        }
    }
}

/// Something attached to the beam at a position measured from the left end.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Attachment {
    /// A rigid body fixed to the beam: mass (kg) and rotary inertia about the beam's bending
    /// axis (kg·m²).
    Mass {
        /// Position from the left end, m.
        position: f64,
        /// Mass, kg.
        mass: f64,
        /// Rotary inertia, kg·m².
        rotary_inertia: f64,
    },
    /// A grounded translational spring, N/m; `INFINITY` is a rigid support.
    Spring {
        /// Position from the left end, m.
        position: f64,
        /// Stiffness, N/m.
        stiffness: f64,
    },
    /// A grounded rotational spring, N·m/rad; `INFINITY` holds the rotation.
    RotationalSpring {
        /// Position from the left end, m.
        position: f64,
        /// Stiffness, N·m/rad.
        stiffness: f64,
    },
    /// A rigid intermediate support that holds deflection and lets the beam rotate.
    Support {
        /// Position from the left end, m.
        position: f64,
    },
    /// A mass on a spring whose other end is fixed to the beam (equipment on isolators, a tuned
    /// absorber). It adds one degree of freedom and its own mode.
    SprungMass {
        /// Position from the left end, m.
        position: f64,
        /// Mass, kg.
        mass: f64,
        /// Spring stiffness, N/m.
        stiffness: f64,
    },
}

impl Attachment {
    /// Position from the left end, m.
    pub fn position(&self) -> f64 {
        match *self {
            Attachment::Mass { position, .. }
            | Attachment::Spring { position, .. }
            | Attachment::RotationalSpring { position, .. }
            | Attachment::Support { position }
            | Attachment::SprungMass { position, .. } => position,
        }
    }

    /// Whether the attachment rigidly holds the deflection at its position.
    pub(crate) fn holds_deflection(&self) -> bool {
        match *self {
            Attachment::Support { .. } => true,
            Attachment::Spring { stiffness, .. } => stiffness == f64::INFINITY,
            _ => false,
        }
    }
}

/// The plain SI parts of a model before validation.
#[derive(Clone, Debug, PartialEq)]
pub struct ModelParts {
    /// Uniform segments laid end to end from x = 0.
    pub segments: Vec<Segment>,
    /// Support at x = 0.
    pub left: End,
    /// Support at the far end.
    pub right: End,
    /// Attachments, in any order.
    pub attachments: Vec<Attachment>,
    /// Beam theory.
    pub theory: Theory,
}

/// A validated beam model. Construct it with [`Model::new`]; every solver takes it as given.
#[derive(Clone, Debug, PartialEq)]
pub struct Model {
    parts: ModelParts,
    length: f64,
    /// Axial force in each segment, N, tension positive; empty when there is none (see
    /// `crate::axial`).
    pub(crate) axial: Vec<f64>,
}

/// Positions closer than this fraction of the beam length are one point: below what the
/// engine's arithmetic can tell apart, and far below the depth of any section, so that merging
/// them changes no frequency by more than a few parts in 10¹¹.
pub(crate) const SAME_POINT: f64 = 1e-12;

impl Model {
    /// Checks the parts and returns the model, or the first problem found.
    ///
    /// Positions within a trillionth of the length of an end are moved onto it, so that values
    /// converted from other units land exactly on the end they were meant for.
    pub fn new(mut parts: ModelParts) -> Result<Model> {
        let length = check::parts(&mut parts)?;
        Ok(Model { parts, length, axial: Vec::new() })
    }

    /// The segments, left to right.
    pub fn segments(&self) -> &[Segment] {
        &self.parts.segments
    }

    /// The support at x = 0.
    pub fn left(&self) -> End {
        self.parts.left
    }

    /// The support at x = length.
    pub fn right(&self) -> End {
        self.parts.right
    }

    /// The attachments, in input order.
    pub fn attachments(&self) -> &[Attachment] {
        &self.parts.attachments
    }

    /// The beam theory.
    pub fn theory(&self) -> Theory {
        self.parts.theory
    }

    /// Total length, m.
    pub fn length(&self) -> f64 {
        self.length
    }

    /// The parts this model was built from.
    pub fn parts(&self) -> &ModelParts {
        &self.parts
    }

    /// The same model with different attachments (re-validated).
    pub fn with_attachments(&self, attachments: Vec<Attachment>) -> Result<Model> {
        Model::new(ModelParts { attachments, ..self.parts.clone() })?.with_axial_forces(self.axial.clone())
    }

    /// The same model under another theory (re-validated).
    pub fn with_theory(&self, theory: Theory) -> Result<Model> {
        Model::new(ModelParts { theory, ..self.parts.clone() })?.with_axial_forces(self.axial.clone())
    }

    /// The segment index and local coordinate of a position (the left segment at a boundary).
    pub(crate) fn segment_at(&self, x: f64) -> usize {
        let mut start = 0.0;
        let last = self.parts.segments.len() - 1;
        for (i, s) in self.parts.segments.iter().enumerate() {
            if x <= start + s.length || i == last {
                return i;
            }
            start += s.length;
        }
        last
    }

    /// Number of rigid-body modes: motions w = a + b·x that no restraint resists.
    pub fn rigid_body_modes(&self) -> usize {
        // Each restraint is a row of a 2×2 system on (a, b): a deflection restraint at x gives
        // [1, x], a rotation restraint gives [0, 1]. The rank of those rows is what is held.
        let mut rows: Vec<[f64; 2]> = Vec::new();
        let mut end = |e: End, x: f64| {
            let (kt, kr) = e.springs();
            if kt > 0.0 {
                rows.push([1.0, x]);
            }
            if kr > 0.0 {
                rows.push([0.0, 1.0]);
            }
        };
        end(self.parts.left, 0.0);
        end(self.parts.right, self.length);
        for a in &self.parts.attachments {
            match *a {
                Attachment::Spring { position, .. } | Attachment::Support { position } => {
                    rows.push([1.0, position])
                }
                Attachment::RotationalSpring { .. } => rows.push([0.0, 1.0]),
                Attachment::Mass { .. } | Attachment::SprungMass { .. } => {}
            }
        }
        let scale = self.length;
        let has_rotation = rows.iter().any(|r| r[0] == 0.0);
        let mut deflection_points = rows.iter().filter(|r| r[0] != 0.0).map(|r| r[1]);
        let first = deflection_points.next();
        let two_points =
            first.is_some_and(|x0| deflection_points.any(|x| (x - x0).abs() > SAME_POINT * scale));
        let rank = match (first.is_some(), has_rotation, two_points) {
            (_, _, true) => 2,
            (true, true, _) => 2,
            (true, false, false) | (false, true, _) => 1,
            (false, false, _) => 0,
        };
        2 - rank
    }
}

#[cfg(test)]
pub(crate) mod tests {
    use super::*;
    use crate::error::ErrorKind;

    /// Clamped at 0, pinned at 3 m: unit segments of 1 and 2 m carrying `attachments`.
    pub(crate) fn two_spans(attachments: Vec<Attachment>) -> Model {
        Model::new(ModelParts {
            segments: vec![Segment::slender(1.0, 1.0, 1.0), Segment::slender(2.0, 1.0, 1.0)],
            left: End::Clamped,
            right: End::Pinned,
            attachments,
            theory: Theory::EulerBernoulli,
        })
        .unwrap()
    }

    fn uniform(left: End, right: End) -> ModelParts {
        ModelParts {
            segments: vec![Segment::slender(1.0, 1.0, 1.0)],
            left,
            right,
            attachments: vec![],
            theory: Theory::EulerBernoulli,
        }
    }

    #[test]
    fn rigid_body_modes_follow_the_restraints() {
        // Facts of statics: a free–free beam translates and rotates; one pin leaves rotation;
        // a guided end leaves translation; two pins or a clamp hold everything.
        let count = |l, r| Model::new(uniform(l, r)).unwrap().rigid_body_modes();
        assert_eq!(count(End::Free, End::Free), 2);
        assert_eq!(count(End::Pinned, End::Free), 1);
        assert_eq!(count(End::Guided, End::Free), 1);
        assert_eq!(count(End::Guided, End::Guided), 1);
        assert_eq!(count(End::Clamped, End::Free), 0);
        assert_eq!(count(End::Pinned, End::Pinned), 0);
        assert_eq!(count(End::Guided, End::Pinned), 0);
        let mut p = uniform(End::Free, End::Free);
        p.attachments.push(Attachment::Support { position: 0.3 });
        assert_eq!(Model::new(p.clone()).unwrap().rigid_body_modes(), 1);
        p.attachments.push(Attachment::Spring { position: 0.7, stiffness: 10.0 });
        assert_eq!(Model::new(p).unwrap().rigid_body_modes(), 0);
    }

    #[test]
    fn errors_name_the_field() {
        let mut p = uniform(End::Pinned, End::Pinned);
        p.segments[0].length = -1.0;
        assert_eq!(Model::new(p).unwrap_err().path, "segments[0].length");
        let mut p = uniform(End::Pinned, End::Pinned);
        p.attachments = vec![
            Attachment::Support { position: 0.5 },
            Attachment::Mass { position: 1.5, mass: 1.0, rotary_inertia: 0.0 },
        ];
        let e = Model::new(p).unwrap_err();
        assert_eq!(e.path, "attachments[1].position");
        assert_eq!(e.kind, ErrorKind::OutOfRange);
        let mut p = uniform(End::Pinned, End::Pinned);
        p.attachments = vec![Attachment::Support { position: 1.0 }];
        assert_eq!(Model::new(p).unwrap_err().kind, ErrorKind::Conflict);
        let mut p = uniform(End::Elastic { translational: f64::NAN, rotational: 0.0 }, End::Free);
        assert_eq!(Model::new(p.clone()).unwrap_err().path, "left.translational");
        p.left = End::Free;
        p.segments[0].mass_per_length = f64::INFINITY;
        assert_eq!(Model::new(p).unwrap_err().kind, ErrorKind::NotFinite);
    }

    #[test]
    fn positions_at_the_ends_snap() {
        let mut p = uniform(End::Free, End::Free);
        p.attachments = vec![Attachment::Support { position: 1.0 + 1e-13 }];
        let m = Model::new(p).unwrap();
        assert_eq!(m.attachments()[0].position(), 1.0);
    }
}
