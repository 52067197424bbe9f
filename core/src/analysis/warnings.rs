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
    let mut at: Vec<(f64, usize)> =
        model.attachments().iter().enumerate().map(|(i, a)| (a.position(), i)).collect();
    at.sort_by(|a, b| a.0.total_cmp(&b.0));
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
