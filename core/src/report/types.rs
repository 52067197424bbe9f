//! The report's types: everything shown for one scenario, in SI, as the page and the solve
//! example read it. Every number in a report is finite; a method that cannot give a value gives
//! `None` (JSON `null`), never NaN.

use crate::analysis::{Separation, Warning};
use crate::bounds::Equivalent;
use crate::model::{AttachmentKind, EndKind, Theory};
use crate::scenario::SegmentEcho;
use crate::units::UnitSystem;

/// Everything shown for one scenario.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Report {
    /// The scenario's title.
    pub title: String,
    /// Unit system the user chose for display.
    pub units: UnitSystem,
    /// Beam theory of the main results.
    pub theory: Theory,
    /// The theory of `ModeReport::other_theory_hz`, when both are shown.
    pub comparison: Option<Theory>,
    /// The beam as modelled, in SI.
    pub beam: BeamEcho,
    /// Rigid-body modes (listed first in `modes`).
    pub rigid_body_modes: usize,
    /// One row per mode, ascending.
    pub modes: Vec<ModeReport>,
    /// Mode 1 by the approximate methods.
    pub fundamental: Option<FundamentalReport>,
    /// The finite-element mesh.
    pub fe: FeReport,
    /// Excitations and the margin checked against them.
    pub excitations: Vec<ExcitationEcho>,
    /// Separation margin wanted, as a ratio.
    pub margin: f64,
    /// Notes for the user.
    pub warnings: Vec<Warning>,
    /// Every unit conversion applied to the input.
    pub conversions: Vec<ConversionEcho>,
    /// The lowest multiple of the axial forces at which the beam buckles; `None` without
    /// compression (or when the tensions outweigh it).
    pub critical_load_factor: Option<f64>,
    /// What moves each mode, tolerance bands, measurements, calibration and resizing.
    pub design: crate::design::Design,
}

/// The beam as modelled.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct BeamEcho {
    /// Total length, m.
    pub length: f64,
    /// Segments left to right.
    pub segments: Vec<SegmentReport>,
    /// Left end.
    pub left: EndEcho,
    /// Right end.
    pub right: EndEcho,
    /// Attachments in input order.
    pub attachments: Vec<AttachmentEcho>,
}

/// One segment as modelled.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SegmentReport {
    /// Start, m from the left end.
    pub start: f64,
    /// End, m from the left end.
    pub end: f64,
    /// EI, N·m².
    pub flexural_rigidity: f64,
    /// Mass per length, kg/m.
    pub mass_per_length: f64,
    /// κGA, N, when known.
    pub shear_rigidity: Option<f64>,
    /// How the properties came about.
    #[serde(flatten)]
    pub echo: SegmentEcho,
}

/// An end as modelled. A stiffness of `None` in an elastic end means rigid.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct EndEcho {
    /// How the end is held.
    pub kind: EndKind,
    /// Translational spring, N/m (`None`: rigid); elastic ends only.
    pub translational: Option<f64>,
    /// Rotational spring, N·m/rad (`None`: rigid); elastic ends only.
    pub rotational: Option<f64>,
}

/// An attachment as modelled. A stiffness of `None` on a spring means rigid.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct AttachmentEcho {
    /// What is attached.
    pub kind: AttachmentKind,
    /// Position, m from the left end.
    pub position: f64,
    /// The user's label, possibly empty.
    pub label: String,
    /// Mass, kg.
    pub mass: Option<f64>,
    /// Rotary inertia, kg·m².
    pub rotary_inertia: Option<f64>,
    /// Stiffness, N/m or N·m/rad (`None` with `rigid`).
    pub stiffness: Option<f64>,
    /// Whether a spring is rigid.
    pub rigid: bool,
}

/// One mode.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ModeReport {
    /// 1-based, rigid-body modes first.
    pub number: usize,
    /// A rigid-body mode at 0 Hz.
    pub rigid_body: bool,
    /// Coincident frequencies at this value.
    pub multiplicity: usize,
    /// Exact natural frequency, Hz.
    pub frequency_hz: f64,
    /// The same in revolutions (cycles) per minute.
    pub rpm: f64,
    /// Finite-element frequency, Hz; `None` where the check gives none (see
    /// `analysis::ModeResult::fe_omega`).
    pub fe_frequency_hz: Option<f64>,
    /// (FE − exact)/exact.
    pub fe_difference: Option<f64>,
    /// The finite-element check's estimate of its own relative error (mesh and round-off).
    pub fe_error: Option<f64>,
    /// The exact frequency's estimated relative error (Rayleigh's quotient of its shape).
    pub accuracy: Option<f64>,
    /// The other theory's exact frequency, Hz, when `Report::comparison` is set.
    pub other_theory_hz: Option<f64>,
    /// Interior points where the deflection changes sign, m.
    pub nodes: Vec<f64>,
    /// Modal mass with the shape normalised to a largest translation of 1, kg.
    pub generalized_mass: f64,
    /// Sampled mode shape.
    pub shape: ShapeSamples,
    /// Translation of each sprung mass in this mode (same normalisation).
    pub sprung: Vec<SprungAmplitude>,
    /// The closest excitation (or harmonic) and how far away it is.
    pub nearest_excitation: Option<Separation>,
}

/// A sampled mode shape.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ShapeSamples {
    /// Positions, m.
    pub x: Vec<f64>,
    /// Deflections, largest translation +1.
    pub w: Vec<f64>,
}

/// A sprung mass's translation in a mode.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SprungAmplitude {
    /// Index of the attachment.
    pub attachment: usize,
    /// Translation.
    pub amplitude: f64,
}

/// An excitation as read.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ExcitationEcho {
    /// Its label.
    pub label: String,
    /// Frequency, or the bottom of a variable speed's range, Hz.
    pub frequency_hz: f64,
    /// The top of a variable speed's range, Hz.
    pub up_to_hz: Option<f64>,
    /// The orders checked (1 = the frequency itself).
    pub orders: Vec<f64>,
}

/// Mode 1 by the approximate methods.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct FundamentalReport {
    /// Exact, Hz.
    pub exact_hz: f64,
    /// Rayleigh's quotient with the static deflection curve (upper bound), Hz.
    pub rayleigh_hz: Option<f64>,
    /// Dunkerley's sum (lower bound), Hz.
    pub dunkerley_hz: Option<f64>,
    /// Equivalent single-degree-of-freedom system at a point.
    pub equivalent: Option<Equivalent>,
}

/// The finite-element mesh used.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct FeReport {
    /// Elements.
    pub elements: usize,
    /// Unknowns.
    pub dofs: usize,
}

/// One unit conversion applied to an input.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ConversionEcho {
    /// Field path.
    pub path: String,
    /// "0.283 lb/in³ = 7833.4 kg/m³".
    pub text: String,
}

impl Report {
    /// Whether every number in the report is finite (the solvers guarantee it; `solve` checks).
    pub fn is_finite(&self) -> bool {
        let ok = |v: f64| v.is_finite();
        let opt = |v: Option<f64>| v.is_none_or(f64::is_finite);
        let modes = self.modes.iter().all(|m| {
            ok(m.frequency_hz)
                && ok(m.rpm)
                && opt(m.fe_frequency_hz)
                && opt(m.fe_difference)
                && opt(m.fe_error)
                && opt(m.accuracy)
                && opt(m.other_theory_hz)
                && ok(m.generalized_mass)
                && m.nodes.iter().chain(&m.shape.x).chain(&m.shape.w).all(|v| v.is_finite())
                && m.sprung.iter().all(|s| ok(s.amplitude))
                && m.nearest_excitation.as_ref().is_none_or(|s| {
                    ok(s.margin)
                        && ok(s.separation)
                        && ok(s.frequency_hz)
                        && opt(s.up_to_hz)
                        && opt(s.band_separation)
                })
        });
        let fundamental = self.fundamental.is_none_or(|f| {
            ok(f.exact_hz)
                && opt(f.rayleigh_hz)
                && opt(f.dunkerley_hz)
                && f.equivalent.is_none_or(|e| ok(e.mass) && ok(e.stiffness) && ok(e.position))
        });
        let beam = ok(self.beam.length)
            && self.beam.segments.iter().all(|s| {
                ok(s.flexural_rigidity)
                    && ok(s.mass_per_length)
                    && opt(s.shear_rigidity)
                    && opt(s.echo.axial_force)
                    && opt(s.echo.thermal_force)
            })
            && self
                .beam
                .attachments
                .iter()
                .all(|a| ok(a.position) && opt(a.mass) && opt(a.rotary_inertia) && opt(a.stiffness));
        let excitations = self
            .excitations
            .iter()
            .all(|e| ok(e.frequency_hz) && opt(e.up_to_hz) && e.orders.iter().all(|o| ok(*o)));
        modes
            && fundamental
            && beam
            && ok(self.margin)
            && opt(self.critical_load_factor)
            && excitations
            && self.design.is_finite()
    }
}
