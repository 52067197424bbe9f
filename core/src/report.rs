//! The results of a scenario, in SI, ready to be shown: one row per mode from every method, the
//! bounds on mode 1, the inputs echoed, every conversion applied, and the warnings.
//!
//! Every number in a report is finite; a method that cannot give a value gives `None` (JSON
//! `null`), never NaN.

use crate::analysis::{self, Analysis, Warning, WarningCode};
use crate::bounds::Equivalent;
use crate::error::{Error, ErrorKind, Result};
use crate::exact;
use crate::model::{Attachment, End, Model, Theory};
use crate::scenario::{Inputs, Scenario, SegmentEcho};
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

/// How an end is held, as a report names it: "free", "pinned", "clamped", "guided" or "elastic".
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
#[non_exhaustive]
pub enum EndKind {
    /// No restraint.
    Free,
    /// Deflection held.
    Pinned,
    /// Deflection and rotation held.
    Clamped,
    /// Rotation held, free to slide.
    Guided,
    /// Grounded springs.
    Elastic,
}

impl EndKind {
    /// The name as serialised, the scenario format's own.
    pub fn id(self) -> &'static str {
        match self {
            EndKind::Free => "free",
            EndKind::Pinned => "pinned",
            EndKind::Clamped => "clamped",
            EndKind::Guided => "guided",
            EndKind::Elastic => "elastic",
        }
    }
}

/// What is attached, as a report names it: "mass", "spring", "rotational-spring", "support" or
/// "sprung-mass".
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
#[non_exhaustive]
pub enum AttachmentKind {
    /// A rigid body fixed to the beam.
    Mass,
    /// A grounded translational spring.
    Spring,
    /// A grounded rotational spring.
    RotationalSpring,
    /// A rigid intermediate support.
    Support,
    /// A mass on a spring attached to the beam.
    SprungMass,
}

impl AttachmentKind {
    /// The name as serialised, the scenario format's own.
    pub fn id(self) -> &'static str {
        match self {
            AttachmentKind::Mass => "mass",
            AttachmentKind::Spring => "spring",
            AttachmentKind::RotationalSpring => "rotational-spring",
            AttachmentKind::Support => "support",
            AttachmentKind::SprungMass => "sprung-mass",
        }
    }
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
    /// Finite-element frequency, Hz.
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

/// The separation of a natural frequency from an excitation.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Separation {
    /// Index of the excitation.
    pub excitation: usize,
    /// Harmonic order (1 = the excitation itself).
    pub order: usize,
    /// The excitation frequency times the order, Hz.
    pub frequency_hz: f64,
    /// |f_natural − f_excitation| / f_excitation.
    pub margin: f64,
    /// Whether the margin is below the one wanted.
    pub too_close: bool,
}

/// An excitation as read.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct ExcitationEcho {
    /// Its label.
    pub label: String,
    /// Frequency, Hz.
    pub frequency_hz: f64,
    /// Harmonics checked.
    pub harmonics: usize,
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
                && m.nearest_excitation.as_ref().is_none_or(|s| ok(s.margin) && ok(s.frequency_hz))
        });
        let fundamental = self.fundamental.is_none_or(|f| {
            ok(f.exact_hz)
                && opt(f.rayleigh_hz)
                && opt(f.dunkerley_hz)
                && f.equivalent.is_none_or(|e| ok(e.mass) && ok(e.stiffness) && ok(e.position))
        });
        let beam = ok(self.beam.length)
            && self
                .beam
                .segments
                .iter()
                .all(|s| ok(s.flexural_rigidity) && ok(s.mass_per_length) && opt(s.shear_rigidity))
            && self
                .beam
                .attachments
                .iter()
                .all(|a| ok(a.position) && opt(a.mass) && opt(a.rotary_inertia) && opt(a.stiffness));
        modes && fundamental && beam && ok(self.margin) && self.excitations.iter().all(|e| ok(e.frequency_hz))
    }
}

/// Reads, checks and solves a scenario given as parsed JSON.
pub fn solve_value(value: &serde_json::Value) -> Result<Report> {
    solve(&Scenario::from_value(value)?)
}

/// The natural frequencies (Hz) of the modes a [`Report`] of this scenario lists, in its order
/// and bit for bit its `frequency_hz`, from the exact method alone. For a first look at a
/// scenario whose report is known (a page's prerendered one): a fraction of the work of
/// [`solve_value`]. An error here is the one [`solve_value`] gives, which may also fail in the
/// steps this leaves out.
pub fn frequencies_value(value: &serde_json::Value) -> Result<Vec<f64>> {
    let inputs = Scenario::from_value(value)?.to_model()?;
    let hz: Vec<f64> = analysis::exact_omegas(&inputs.model, &inputs.options)?
        .into_iter()
        .map(|omega| omega / std::f64::consts::TAU)
        .collect();
    if !hz.iter().all(|f| f.is_finite()) {
        return Err(overflow());
    }
    Ok(hz)
}

/// The error of a result too large to compute with.
fn overflow() -> Error {
    Error::new(
        ErrorKind::NoConvergence,
        "a result overflowed the range of numbers the engine computes with; check the orders of magnitude of \
         the inputs (units, exponents)",
    )
}

/// Reads, checks and solves a scenario given as JSON text.
pub fn solve_json(text: &str) -> Result<Report> {
    solve(&Scenario::from_json(text)?)
}

/// Reads, checks and solves a scenario.
pub fn solve(scenario: &Scenario) -> Result<Report> {
    let inputs = scenario.to_model()?;
    let analysis = analysis::analyse(&inputs.model, &inputs.options)?;
    let report = build(scenario, inputs, analysis)?;
    if !report.is_finite() {
        return Err(overflow());
    }
    Ok(report)
}

fn build(scenario: &Scenario, inputs: Inputs, analysis: Analysis) -> Result<Report> {
    let model = &inputs.model;
    let hz = |omega: f64| omega / std::f64::consts::TAU;
    let mut warnings = analysis.warnings.clone();
    let (comparison, other) = comparison(model, &inputs, &analysis, &mut warnings)?;
    let excitations: Vec<ExcitationEcho> = inputs
        .excitations
        .iter()
        .map(|(label, f, harmonics)| ExcitationEcho {
            label: label.clone(),
            frequency_hz: *f,
            harmonics: *harmonics,
        })
        .collect();
    let modes: Vec<ModeReport> = analysis
        .modes
        .iter()
        .enumerate()
        .map(|(i, m)| {
            let f = hz(m.omega);
            ModeReport {
                number: m.number,
                rigid_body: m.rigid_body,
                multiplicity: m.multiplicity,
                frequency_hz: f,
                rpm: f * 60.0,
                fe_frequency_hz: m.fe_omega.map(hz),
                fe_difference: m.fe_difference(),
                fe_error: m.fe_error,
                accuracy: m.accuracy,
                other_theory_hz: other.as_ref().and_then(|o| o.get(i).copied()).map(hz),
                nodes: m.shape.nodes.clone(),
                generalized_mass: m.shape.generalized_mass,
                shape: ShapeSamples { x: m.shape.x.clone(), w: m.shape.deflection.clone() },
                sprung: m
                    .shape
                    .sprung
                    .iter()
                    .map(|(attachment, amplitude)| SprungAmplitude {
                        attachment: *attachment,
                        amplitude: *amplitude,
                    })
                    .collect(),
                nearest_excitation: if m.rigid_body { None } else { nearest(f, &excitations, inputs.margin) },
            }
        })
        .collect();
    if let Some(close) = modes.iter().find(|m| m.nearest_excitation.as_ref().is_some_and(|s| s.too_close)) {
        let s =
            close.nearest_excitation.as_ref().map(|s| (s.margin, s.excitation, s.order)).unwrap_or_default();
        let label = &excitations[s.1].label;
        warnings.push(Warning {
            code: WarningCode::ResonanceMargin,
            message: format!(
                "Mode {} lies within {:.1} % of {}{} — less than the {:.0} % margin asked for. Resonance there can \
                 crack welds and fail parts in fatigue: stiffen, lighten or move the part, and confirm by test.",
                close.number,
                100.0 * s.0,
                if label.is_empty() { "an excitation" } else { label },
                if s.2 > 1 { format!(" (harmonic {})", s.2) } else { String::new() },
                100.0 * inputs.margin
            ),
        });
    }
    let fundamental = analysis.fundamental.map(|f| FundamentalReport {
        exact_hz: hz(f.omega),
        rayleigh_hz: f.rayleigh.map(hz),
        dunkerley_hz: f.dunkerley.map(hz),
        equivalent: f.equivalent,
    });
    Ok(Report {
        title: scenario.title.clone(),
        units: scenario.units,
        theory: model.theory(),
        comparison,
        beam: beam_echo(model, &inputs),
        rigid_body_modes: analysis.rigid_body_modes,
        modes,
        fundamental,
        fe: FeReport { elements: analysis.fe_elements, dofs: analysis.fe_dofs },
        excitations,
        margin: inputs.margin,
        warnings,
        conversions: inputs
            .conversions
            .iter()
            .map(|(path, c)| ConversionEcho { path: path.clone(), text: c.text.clone() })
            .collect(),
    })
}

/// The closest excitation harmonic to a natural frequency.
fn nearest(f: f64, excitations: &[ExcitationEcho], margin: f64) -> Option<Separation> {
    let mut best: Option<Separation> = None;
    for (i, e) in excitations.iter().enumerate() {
        for order in 1..=e.harmonics {
            let fe = e.frequency_hz * order as f64;
            let m = (f - fe).abs() / fe;
            if best.as_ref().is_none_or(|b| m < b.margin) {
                best = Some(Separation {
                    excitation: i,
                    order,
                    frequency_hz: fe,
                    margin: m,
                    too_close: m < margin,
                });
            }
        }
    }
    best
}

/// First-order estimate of how much Euler–Bernoulli overestimates a mode at ω: for a wave of
/// wavenumber k, ω_T ≈ ω_EB·(1 − ½k²(I/A + EI/κGA)) (from the pinned–pinned Timoshenko frequency
/// equation expanded in k²). The largest over segments; `None` without shear data.
fn shear_effect(model: &Model, inputs: &Inputs, omega: f64) -> Option<f64> {
    let mut worst: Option<f64> = None;
    for (s, echo) in model.segments().iter().zip(&inputs.segments) {
        let (kga, r2) = (s.shear_rigidity?, echo.gyration_squared?);
        let k2 = (s.mass_per_length * omega * omega / s.flexural_rigidity).sqrt();
        let effect = 0.5 * k2 * (r2 + s.flexural_rigidity / kga);
        worst = Some(worst.map_or(effect, |w: f64| w.max(effect)));
    }
    worst
}

/// Decides whether to show the other theory beside the chosen one, and computes it.
fn comparison(
    model: &Model,
    inputs: &Inputs,
    analysis: &Analysis,
    warnings: &mut Vec<Warning>,
) -> Result<(Option<Theory>, Option<Vec<f64>>)> {
    let elastic = analysis.modes.len() - analysis.rigid_body_modes;
    let rigid = vec![0.0; analysis.rigid_body_modes];
    match model.theory() {
        Theory::Timoshenko => {
            let eb = exact::frequencies(&model.with_theory(Theory::EulerBernoulli)?, elastic)?;
            let other: Vec<f64> = rigid.into_iter().chain(eb.iter().copied()).collect();
            if let Some((m, ratio)) = analysis
                .modes
                .iter()
                .zip(&other)
                .filter(|(m, _)| !m.rigid_body)
                .map(|(m, o)| (m.number, o / m.omega - 1.0))
                .find(|(_, r)| *r > 0.01)
            {
                warnings.push(Warning {
                    code: WarningCode::ShearMatters,
                    message: format!(
                        "Shear deformation and rotary inertia matter here: the slender-beam (Euler–Bernoulli) \
                         result is {:.1} % higher for mode {m}. Both are shown.",
                        100.0 * ratio
                    ),
                });
            }
            Ok((Some(Theory::EulerBernoulli), Some(other)))
        }
        _ => {
            let estimate = analysis.modes.iter().filter(|m| !m.rigid_body).find_map(|m| {
                shear_effect(model, inputs, m.omega).filter(|e| *e > 0.01).map(|e| (m.number, e))
            });
            let Some((number, effect)) = estimate else { return Ok((None, None)) };
            let timoshenko = exact::frequencies(&model.with_theory(Theory::Timoshenko)?, elastic)?;
            let other: Vec<f64> = rigid.into_iter().chain(timoshenko.iter().copied()).collect();
            warnings.push(Warning {
                code: WarningCode::ShearMatters,
                message: format!(
                    "From mode {number} on, the wavelength is short for the section depth: the slender-beam result \
                     is estimated to be {:.1} % too high (first-order shear and rotary-inertia correction). The \
                     Timoshenko result is shown beside it; consider switching the theory to Timoshenko.",
                    100.0 * effect
                ),
            });
            Ok((Some(Theory::Timoshenko), Some(other)))
        }
    }
}

fn beam_echo(model: &Model, inputs: &Inputs) -> BeamEcho {
    let mut start = 0.0;
    let segments = model
        .segments()
        .iter()
        .zip(&inputs.segments)
        .map(|(s, echo)| {
            let report = SegmentReport {
                start,
                end: start + s.length,
                flexural_rigidity: s.flexural_rigidity,
                mass_per_length: s.mass_per_length,
                shear_rigidity: s.shear_rigidity,
                echo: echo.clone(),
            };
            start += s.length;
            report
        })
        .collect();
    let finite = |v: f64| v.is_finite().then_some(v);
    let end = |e: End| match e {
        End::Free => EndEcho { kind: EndKind::Free, translational: None, rotational: None },
        End::Pinned => EndEcho { kind: EndKind::Pinned, translational: None, rotational: None },
        End::Clamped => EndEcho { kind: EndKind::Clamped, translational: None, rotational: None },
        End::Guided => EndEcho { kind: EndKind::Guided, translational: None, rotational: None },
        End::Elastic { translational, rotational } => EndEcho {
            kind: EndKind::Elastic,
            translational: finite(translational),
            rotational: finite(rotational),
        },
    };
    let attachments = model
        .attachments()
        .iter()
        .zip(&inputs.labels)
        .map(|(a, label)| {
            let base = AttachmentEcho {
                kind: AttachmentKind::Mass,
                position: a.position(),
                label: label.clone(),
                mass: None,
                rotary_inertia: None,
                stiffness: None,
                rigid: false,
            };
            match *a {
                Attachment::Mass { mass, rotary_inertia, .. } => AttachmentEcho {
                    kind: AttachmentKind::Mass,
                    mass: Some(mass),
                    rotary_inertia: Some(rotary_inertia),
                    ..base
                },
                Attachment::Spring { stiffness, .. } => AttachmentEcho {
                    kind: AttachmentKind::Spring,
                    stiffness: finite(stiffness),
                    rigid: stiffness.is_infinite(),
                    ..base
                },
                Attachment::RotationalSpring { stiffness, .. } => AttachmentEcho {
                    kind: AttachmentKind::RotationalSpring,
                    stiffness: finite(stiffness),
                    rigid: stiffness.is_infinite(),
                    ..base
                },
                Attachment::Support { .. } => {
                    AttachmentEcho { kind: AttachmentKind::Support, rigid: true, ..base }
                }
                Attachment::SprungMass { mass, stiffness, .. } => AttachmentEcho {
                    kind: AttachmentKind::SprungMass,
                    mass: Some(mass),
                    stiffness: Some(stiffness),
                    ..base
                },
            }
        })
        .collect();
    BeamEcho {
        length: model.length(),
        segments,
        left: end(model.left()),
        right: end(model.right()),
        attachments,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const SCENARIOS: [&str; 4] = [
        include_str!("../../docs/scenarios/sensor-boom.json"),
        include_str!("../../docs/scenarios/fan-floor-beam-us.json"),
        include_str!("../../docs/scenarios/filled-pipe-span.json"),
        include_str!("../../docs/scenarios/absorber-on-platform-beam.json"),
    ];

    fn both(value: &serde_json::Value) -> (Result<Vec<f64>>, Result<Vec<f64>>) {
        let quick = frequencies_value(value);
        let full = solve_value(value).map(|r| r.modes.iter().map(|m| m.frequency_hz).collect());
        (quick, full)
    }

    #[test]
    fn the_quick_frequencies_are_the_reports_bit_for_bit() {
        for text in SCENARIOS {
            let Ok(doc) = serde_json::from_str::<serde_json::Value>(text) else { panic!("{text}") };
            let mut cases = vec![doc.clone()];
            // The other theory, and a beam free at both ends (two rigid-body modes at 0 Hz).
            let mut other = doc.clone();
            other["theory"] = serde_json::json!("timoshenko");
            cases.push(other);
            let mut free = doc.clone();
            free["left"] = serde_json::json!("free");
            free["right"] = serde_json::json!("free");
            cases.push(free);
            for case in cases {
                let (quick, full) = match both(&case) {
                    (Ok(quick), Ok(full)) => (quick, full),
                    // Shear needs a section; a beam given by EI and mass alone cannot be Timoshenko.
                    (Err(quick), Err(full)) if case["theory"] == "timoshenko" => {
                        assert_eq!(quick.to_string(), full.to_string());
                        continue;
                    }
                    other => panic!("{case}: {other:?}"),
                };
                assert!(!quick.is_empty());
                let same = quick.len() == full.len()
                    && quick.iter().zip(&full).all(|(a, b)| a.to_bits() == b.to_bits());
                assert!(same, "{case}: {quick:?} quick, {full:?} in the report");
            }
        }
    }

    /// A report crosses to another thread as JSON text (the browser solves in a worker): read
    /// back, it equals the one written, bit for bit (`PartialEq` on every `f64`).
    #[test]
    fn a_report_reads_back_from_its_json_as_itself() {
        for text in SCENARIOS {
            let Ok(report) = solve_json(text) else { panic!("{text}") };
            let Ok(json) = serde_json::to_string(&report) else { panic!("{text}") };
            let back: Report = match serde_json::from_str(&json) {
                Ok(back) => back,
                Err(e) => panic!("{e}: {json}"),
            };
            assert_eq!(back, report, "{json}");
        }
    }

    /// The kinds' `id` is the name they serialise to, so that a page writes what a report says.
    #[test]
    fn kinds_name_themselves_as_they_serialise() {
        let ends = [EndKind::Free, EndKind::Pinned, EndKind::Clamped, EndKind::Guided, EndKind::Elastic];
        for kind in ends {
            assert_eq!(serde_json::to_value(kind).ok(), Some(serde_json::json!(kind.id())));
        }
        let attachments = [
            AttachmentKind::Mass,
            AttachmentKind::Spring,
            AttachmentKind::RotationalSpring,
            AttachmentKind::Support,
            AttachmentKind::SprungMass,
        ];
        for kind in attachments {
            assert_eq!(serde_json::to_value(kind).ok(), Some(serde_json::json!(kind.id())));
        }
        use crate::analysis::WarningCode as W;
        let codes = [
            W::Accuracy,
            W::NearBuckling,
            W::FeDisagrees,
            W::SamePoint,
            W::RigidBody,
            W::FeUnconverged,
            W::Repeated,
            W::ReportPointAtNode,
            W::ResonanceMargin,
            W::ShearMatters,
        ];
        for code in codes {
            assert_eq!(serde_json::to_value(code).ok(), Some(serde_json::json!(code.id())));
        }
    }

    #[test]
    fn a_scenario_the_quick_path_refuses_is_refused_by_the_report_with_the_same_message() {
        let Ok(mut doc) = serde_json::from_str::<serde_json::Value>(SCENARIOS[0]) else { panic!() };
        for (field, value) in [("modes", serde_json::json!(0)), ("left", serde_json::json!("welded"))] {
            let mut case = doc.clone();
            case[field] = value;
            let (Err(quick), Err(full)) = both(&case) else { panic!("{case} should be refused") };
            assert_eq!(quick.to_string(), full.to_string());
        }
        doc["attachments"][0]["mass"] = serde_json::json!("2.8 furlongs");
        let (Err(quick), Err(full)) = both(&doc) else { panic!("a length is not a mass") };
        assert_eq!(quick.to_string(), full.to_string());
    }
}
