//! The notes an analysis gives beside its numbers, each with a stable identifier the page keys on.

use crate::model::Model;

/// A note for the user about the results.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Warning {
    /// A stable identifier (`rigid-body`, `fe-unconverged`, …).
    pub code: WarningCode,
    /// What it means, in plain words.
    pub message: String,
}

/// The stable identifier of a [`Warning`], serialised in kebab case (`fe-unconverged`).
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum WarningCode {
    /// An exact frequency's own check (Rayleigh's quotient) disagrees by more than 1e-9.
    Accuracy,
    /// The axial compression is close to the load that buckles the beam.
    NearBuckling,
    /// The finite-element check differs from the exact value by more than it explains.
    FeDisagrees,
    /// Two attachments lie closer than the engine tells apart.
    SamePoint,
    /// The beam has rigid-body modes.
    RigidBody,
    /// The finite-element result has not converged.
    FeUnconverged,
    /// Some frequencies are repeated.
    Repeated,
    /// Mode 1 barely moves at the report point.
    ReportPointAtNode,
    /// A mode lies within the separation margin of an excitation.
    ResonanceMargin,
    /// Shear deformation and rotary inertia matter.
    ShearMatters,
    /// A value is implausible for its field or beside another (a diameter larger than the
    /// beam, a wall under 0.1 mm): most often a unit left off or mistyped.
    Implausible,
}

impl WarningCode {
    /// Every code, in the order they are declared.
    pub const ALL: [WarningCode; 11] = [
        WarningCode::Accuracy,
        WarningCode::NearBuckling,
        WarningCode::FeDisagrees,
        WarningCode::SamePoint,
        WarningCode::RigidBody,
        WarningCode::FeUnconverged,
        WarningCode::Repeated,
        WarningCode::ReportPointAtNode,
        WarningCode::ResonanceMargin,
        WarningCode::ShearMatters,
        WarningCode::Implausible,
    ];

    /// The identifier as serialised.
    pub fn id(self) -> &'static str {
        match self {
            WarningCode::Accuracy => "accuracy",
            WarningCode::NearBuckling => "near-buckling",
            WarningCode::FeDisagrees => "fe-disagrees",
            WarningCode::SamePoint => "same-point",
            WarningCode::RigidBody => "rigid-body",
            WarningCode::FeUnconverged => "fe-unconverged",
            WarningCode::Repeated => "repeated",
            WarningCode::ReportPointAtNode => "report-point-at-node",
            WarningCode::ResonanceMargin => "resonance-margin",
            WarningCode::ShearMatters => "shear-matters",
            WarningCode::Implausible => "implausible",
        }
    }
}

/// A note when two attachments lie closer than the engine tells apart and count as one point.
pub(super) fn merged_points(model: &Model) -> Option<Warning> {
    let tolerance = crate::model::SAME_POINT * model.length();
    let positions: Vec<f64> = model.attachments().iter().map(|a| a.position()).collect();
    let at: Vec<(f64, usize)> =
        crate::sort::order(&positions).into_iter().map(|i| (positions[i], i)).collect();
    let pair = at.windows(2).find(|w| w[1].0 > w[0].0 && w[1].0 - w[0].0 <= tolerance)?;
    let (first, second) = (pair[0].1.min(pair[1].1), pair[0].1.max(pair[1].1));
    Some(Warning {
        code: WarningCode::SamePoint,
        message: format!(
            "Attachments {} and {} are {:.1e} m apart, closer than the engine can tell apart (a trillionth of the \
             beam's length); they are treated as one point, which changes no frequency measurably.",
            first + 1,
            second + 1,
            pair[1].0 - pair[0].0
        ),
    })
}

/// How one mode's finite-element check compares with its exact value.
pub(super) struct Compared {
    /// Mode number.
    pub(super) number: usize,
    /// The exact frequency, rad/s.
    pub(super) exact: f64,
    /// How many exact frequencies coincide at it.
    pub(super) multiplicity: usize,
    /// The finite-element frequency, rad/s.
    pub(super) fe: f64,
    /// The check's estimate of its own error: mesh, attachments inside elements, round-off.
    pub(super) error: f64,
    /// Of that, round-off's part alone.
    pub(super) round_off: f64,
    /// The exact value's own estimate (Rayleigh's quotient of its shape).
    pub(super) accuracy: f64,
}

impl Compared {
    /// (FE − exact)/exact.
    pub(super) fn difference(&self) -> f64 {
        (self.fe - self.exact) / self.exact
    }
}

/// Bending stiffnesses of neighbouring segments this far apart are past what double precision
/// resolves side by side in either method (common practice, no source: stiffness terms enter
/// the matrices cubed against the segment length, so 1e8 leaves few digits for the modes).
const STIFFNESS_CONTRAST: f64 = 1e8;

/// Two frequencies of one list this close count as one listed twice.
const SAME: f64 = 1e-9;

/// The note on the finite-element check against the exact values, if one is due, naming the
/// column at fault where the evidence does:
///
/// - a frequency that one list gives twice and the other once is a mode the first lost to
///   rounding and filled with a copy (a duplicate shifts every later mode of its list by one);
/// - consistent-mass elements are a Rayleigh–Ritz model of the same beam, so each of their
///   frequencies lies at or above the true one (the inclusion principle; e.g. Bathe, *Finite
///   Element Procedures*, from memory) up to round-off: a check below the exact value by more
///   than its round-off shows the exact value at fault;
/// - a check above the exact value by more than its estimates explain shows the check at fault,
///   when the exact values up to there pass their own check (Rayleigh's quotient of each shape
///   within 1e-9); otherwise neither is advised.
///
/// With the note comes, where the check lists a frequency twice, the mode from which its column
/// is to be left blank.
pub(super) fn fe_comparison(model: &Model, modes: &[Compared]) -> Option<(Warning, Option<usize>)> {
    let pair = |v: &[f64], i: usize| i + 1 < v.len() && (v[i + 1] - v[i]).abs() <= SAME * v[i].abs();
    let exact: Vec<f64> = modes.iter().map(|m| m.exact).collect();
    let fe: Vec<f64> = modes.iter().map(|m| m.fe).collect();
    let cause = contrast_cause(model);
    for i in 0..modes.len() {
        let (in_exact, in_fe) = (pair(&exact, i) && modes[i].multiplicity == 1, pair(&fe, i));
        if in_exact != in_fe {
            let (twice, once) = if in_fe {
                ("finite-element check", "exact method")
            } else {
                ("exact method", "finite-element check")
            };
            let from = modes[i].number + 1;
            let advice = match in_fe {
                true => format!("Its column is left blank from mode {from} on."),
                false => {
                    format!("Do not rely on the {twice}'s column from mode {from} on; check the inputs.")
                }
            };
            return Some((
                Warning {
                    code: WarningCode::FeDisagrees,
                    message: format!(
                        "The {twice} gives mode {}'s frequency twice where the {once} finds it once: it has lost a \
                         mode to rounding{cause}, and its later modes may be misplaced. {advice}",
                        modes[i].number
                    ),
                },
                in_fe.then_some(from),
            ));
        }
    }
    let below = modes.iter().find(|m| m.difference() < -(10.0 * (m.round_off + m.accuracy) + 1e-9));
    if let Some(m) = below {
        return Some((Warning {
            code: WarningCode::FeDisagrees,
            message: format!(
                "The finite-element check puts mode {} {:.1e} below the exact value, more than its rounding \
                 explains ({:.0e}); elements of this kind cannot lie below the true frequency, so the exact method \
                 has missed or misplaced a mode here{cause}. Do not rely on either column from mode {} on; check \
                 the inputs.",
                m.number,
                -m.difference(),
                m.round_off,
                m.number
            ),
        }, None));
    }
    // The estimates are of order, not bounds: a factor 10 of margin.
    let at = modes.iter().position(|m| m.difference() > 10.0 * (m.error + m.accuracy) + 1e-12)?;
    let m = &modes[at];
    let certified = modes[..=at].iter().all(|m| m.accuracy <= super::TRUSTED);
    let advice = match certified {
        true => format!(
            "Elements of this kind can only err upwards, and the exact value's own check (Rayleigh's quotient of the \
             mode shape) agrees to {:.0e}: trust the exact value, and please report this model.",
            m.accuracy
        ),
        false => format!(
            "The exact values up to there do not all pass their own check (Rayleigh's quotient of the mode shape) \
             either{cause}: do not rely on either column from mode {} on; check the inputs.",
            m.number
        ),
    };
    Some((
        Warning {
            code: WarningCode::FeDisagrees,
            message: format!(
                "The finite-element check of mode {} lies {:.1e} above the exact value, more than its mesh and \
                 rounding explain ({:.0e}). {advice}",
                m.number,
                m.difference(),
                m.error
            ),
        },
        None,
    ))
}

/// The note when the finite-element check differs from the exact value by more than 0.1 % from
/// mode `number` on, within its own estimate, saying which part of that estimate explains it.
/// Rounding grows with the number of elements (as the fourth power: the largest eigenvalue the
/// mesh carries) and the mesh's error falls as the inverse fourth power, so where rounding
/// dominates, more elements make the check worse, and a mesh `(mesh / rounding)^⅛` times the
/// one given balances the two.
pub(super) fn fe_unconverged(
    model: &Model,
    number: usize,
    compared: Option<&Compared>,
    elements: Option<usize>,
) -> Warning {
    let (round_off, mesh) = compared.map_or((0.0, 1.0), |c| (c.round_off, (c.error - c.round_off).max(0.0)));
    let message = if round_off > mesh {
        let balance = match elements {
            Some(n) if mesh > 0.0 => {
                let better = (n as f64 * (mesh / round_off).powf(0.125)).round().max(1.0);
                format!("; about {better:.0} elements would balance rounding against the mesh's error")
            }
            _ => String::new(),
        };
        format!(
            "The finite-element check differs from the exact result by more than 0.1 % from mode {number} on, and \
             rounding in its matrices explains it (up to {round_off:.0e}){}: more elements would make it worse{balance}. \
             The exact results do not depend on it.",
            contrast_cause(model)
        )
    } else {
        format!(
            "The finite-element check differs from the exact result by more than 0.1 % from mode {number} on, as its \
             mesh predicts; use more elements if you rely on it. The exact results are not affected."
        )
    };
    Warning { code: WarningCode::FeUnconverged, message }
}

/// The note when the finite-element check could not be computed at all.
pub(super) fn fe_unsolved(model: &Model) -> Warning {
    Warning {
        code: WarningCode::FeUnconverged,
        message: format!(
            "The finite-element check could not be computed for this model: rounding in its matrices swamps the \
             modes sought{}. Its column is left blank; the exact results do not depend on it.",
            contrast_cause(model)
        ),
    }
}

/// The note when rounding in the check's matrices reaches `round_off` of mode `number`'s own
/// frequency (at least half of it): the check cannot tell that mode from zero, and its whole
/// column is left blank.
pub(super) fn fe_unresolved(model: &Model, number: usize, round_off: f64) -> Warning {
    let size = if round_off >= 1.0 {
        format!("about {} times itself", crate::error::roughly(round_off))
    } else {
        format!("about {:.0} % of itself", 100.0 * round_off)
    };
    Warning {
        code: WarningCode::FeUnconverged,
        message: format!(
            "The finite-element check cannot resolve mode {number}: rounding in its matrices could move that \
             frequency by {size}{}, so the check may have lost the mode and shifted the ones after it. Its column is \
             left blank; more elements would make it worse. The exact results do not depend on it.",
            contrast_cause(model)
        ),
    }
}

/// Words naming the likely cause of lost modes: segments of very different stiffness side by
/// side (empty when there are none).
fn contrast_cause(model: &Model) -> String {
    let segments = model.segments();
    let worst = (1..segments.len())
        .map(|i| {
            let (a, b) = (segments[i - 1].flexural_rigidity, segments[i].flexural_rigidity);
            (i, a.max(b) / a.min(b))
        })
        .max_by(|x, y| x.1.total_cmp(&y.1));
    match worst {
        Some((i, ratio)) if ratio > STIFFNESS_CONTRAST => format!(
            " (segments {} and {} differ in bending stiffness by a factor of {ratio:.0e}, more than double \
             precision resolves side by side)",
            i,
            i + 1
        ),
        _ => spring_cause(model),
    }
}

/// Words naming a spring far softer than the beam it holds (empty when there is none): the
/// beam's bending stiffness EI/L³ (EI/L for a rotational spring) against the softest finite
/// spring, grounded, at an end or under a sprung mass.
fn spring_cause(model: &Model) -> String {
    use crate::model::Attachment;
    let length = model.length();
    let ei = model.segments().iter().map(|s| s.flexural_rigidity).fold(0.0, f64::max);
    let (bending, turning) = (ei / length.powi(3), ei / length);
    let soft = |k: f64, against: f64| (k.is_finite() && k > 0.0).then(|| against / k);
    let mut ratios: Vec<f64> = Vec::new();
    for end in [model.left(), model.right()] {
        let (t, r) = end.springs();
        ratios.extend(soft(t, bending));
        ratios.extend(soft(r, turning));
    }
    for a in model.attachments() {
        ratios.extend(match *a {
            Attachment::Spring { stiffness, .. } | Attachment::SprungMass { stiffness, .. } => {
                soft(stiffness, bending)
            }
            Attachment::RotationalSpring { stiffness, .. } => soft(stiffness, turning),
            _ => None,
        });
    }
    match ratios.into_iter().fold(0.0, f64::max) {
        ratio if ratio > STIFFNESS_CONTRAST => format!(
            " (the beam's bending stiffness is {ratio:.0e} times that of its softest spring, more than double \
             precision resolves side by side)"
        ),
        _ => String::new(),
    }
}
