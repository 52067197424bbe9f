//! The checks [`Model::new`](super::Model::new) and the options make, every range and its
//! message taken from the schema (`crate::schema`): a value outside is refused with the field's
//! path, the value in SI, and what is allowed.

use super::{Attachment, End, ModelParts, Segment, Theory, SAME_POINT};
use crate::error::{number, roughly, Error, ErrorKind, Result};
use crate::path::FieldPath;
use crate::schema::{self, Field};

/// Refuses a value (SI) outside its field's range, at the field's name.
pub(crate) fn value(field: &Field, v: f64) -> Result<()> {
    match field.range.refuse(v, field.what, field.unit(), field.rigid) {
        None => Ok(()),
        Some((kind, message)) => Err(Error::new(kind, message).at(field.name).with_si(v, field.unit())),
    }
}

/// Refuses a whole number outside its field's range, showing it as given.
pub(crate) fn whole(field: &Field, n: usize) -> Result<()> {
    match field.range.refuse(n as f64, field.what, "", false) {
        None => Ok(()),
        Some((kind, message)) => Err(Error::new(kind, message).at(field.name).with_value(n)),
    }
}

/// A position on a beam of `length` (m), returned moved onto an end when it lies within a
/// trillionth of the length of it, so that values converted from other units land exactly on
/// the end they were meant for.
pub(crate) fn on_the_beam(field: &Field, x: f64, length: f64) -> Result<f64> {
    let tolerance = SAME_POINT * length;
    if !x.is_finite() || x < -tolerance || x > length + tolerance {
        let kind = if x.is_finite() { ErrorKind::OutOfRange } else { ErrorKind::NotFinite };
        let what = field.name.replace('_', " ");
        return Err(Error::new(kind, format!("the {what} must lie on the beam (0 to {} m)", number(length)))
            .at(field.name)
            .with_si(x, "m"));
    }
    Ok(if x.abs() <= tolerance {
        0.0
    } else if (x - length).abs() <= tolerance {
        length
    } else {
        x
    })
}

/// Checks the parts and returns the beam's length; attachments at an end are moved onto it.
pub(super) fn parts(parts: &mut ModelParts) -> Result<f64> {
    if parts.segments.is_empty() {
        return Err(Error::new(ErrorKind::Missing, "the beam needs at least one segment").at("segments"));
    }
    let mut length = 0.0;
    for (i, s) in parts.segments.iter().enumerate() {
        segment(s).map_err(|e| e.at(FieldPath::item("segments", i)))?;
        length += s.length;
    }
    if !length.is_finite() {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "the total length of the segments is too large to compute with",
        )
        .at("segments"));
    }
    for (i, s) in parts.segments.iter().enumerate() {
        plausible_shear(s).map_err(|e| e.at(FieldPath::item("segments", i).key("shear_rigidity")))?;
    }
    if parts.theory == Theory::Timoshenko {
        if let Some(i) = parts.segments.iter().position(|s| s.shear_rigidity.is_none()) {
            return Err(Error::new(
                ErrorKind::Missing,
                "the Timoshenko theory needs a shear rigidity κGA (give a section and material, or the value)",
            )
            .at(FieldPath::item("segments", i).key("shear_rigidity")));
        }
    }
    end(parts.left).map_err(|e| e.at("left"))?;
    end(parts.right).map_err(|e| e.at("right"))?;
    for (i, a) in parts.attachments.iter_mut().enumerate() {
        attachment(a, length).map_err(|e| e.at(FieldPath::item("attachments", i)))?;
    }
    rigid_supports(parts, length)?;
    Ok(length)
}

fn segment(s: &Segment) -> Result<()> {
    value(&schema::LENGTH, s.length)?;
    value(&schema::FLEXURAL_RIGIDITY, s.flexural_rigidity)?;
    value(&schema::MASS_PER_LENGTH, s.mass_per_length)?;
    if let Some(kga) = s.shear_rigidity {
        value(&schema::SHEAR_RIGIDITY, kga)?;
    }
    value(&schema::ROTARY_INERTIA_PER_LENGTH, s.rotary_inertia_per_length)
}

/// The ratio EI/κGA ÷ ρI/m that [`plausible_shear`] accepts.
pub(crate) const SHEAR_RATIO: (f64, f64) = (1.0, 1000.0);

/// For any solid or hollow section of a real material, EI/κGA = (E/κG)·I/A, and E/κG lies between
/// about 2.4 (isotropic metals) and a few dozen (wood, pultruded composites across the grain);
/// I/A = ρI/ρA. A ratio far outside that says a value was typed in the wrong unit, and it would
/// also make the shear-flexible member needlessly expensive to compute.
fn plausible_shear(s: &Segment) -> Result<()> {
    let (Some(kga), true) = (s.shear_rigidity, s.rotary_inertia_per_length > 0.0) else { return Ok(()) };
    let ratio = (s.flexural_rigidity / kga) / (s.rotary_inertia_per_length / s.mass_per_length);
    if !(SHEAR_RATIO.0..=SHEAR_RATIO.1).contains(&ratio) {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "implausible with the other properties: EI/κGA is {} times ρI/m, where real sections \
                 give about 2.5 (metals) to 50 (wood, composites) and {} to {} is accepted; check the units \
                 of κGA, EI, ρI and m",
                roughly(ratio),
                number(SHEAR_RATIO.0),
                number(SHEAR_RATIO.1)
            ),
        )
        .with_si(kga, "N"));
    }
    Ok(())
}

fn end(end: End) -> Result<()> {
    if let End::Elastic { translational, rotational } = end {
        value(&schema::END_TRANSLATIONAL, translational)?;
        value(&schema::END_ROTATIONAL, rotational)?;
    }
    Ok(())
}

fn attachment(a: &mut Attachment, length: f64) -> Result<()> {
    let snapped = on_the_beam(&schema::POSITION, a.position(), length)?;
    match a {
        Attachment::Mass { position, mass, rotary_inertia } => {
            *position = snapped;
            value(&schema::MASS, *mass)?;
            value(&schema::ROTARY_INERTIA, *rotary_inertia)?;
            if *mass == 0.0 && *rotary_inertia == 0.0 {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    "a point mass needs a mass or a rotary inertia above zero",
                )
                .at("mass")
                .with_value(0));
            }
        }
        Attachment::Spring { position, stiffness } => {
            *position = snapped;
            value(&schema::SPRING_STIFFNESS, *stiffness)?;
        }
        Attachment::RotationalSpring { position, stiffness } => {
            *position = snapped;
            value(&schema::ROTATIONAL_STIFFNESS, *stiffness)?;
        }
        Attachment::Support { position } => *position = snapped,
        Attachment::SprungMass { position, mass, stiffness } => {
            *position = snapped;
            value(&schema::SPRUNG_MASS, *mass)?;
            if *stiffness == f64::INFINITY {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    "a sprung mass needs a finite spring; for a rigid mounting use a point mass",
                )
                .at("stiffness")
                .with_value("rigid"));
            }
            value(&schema::SPRUNG_STIFFNESS, *stiffness)?;
        }
    }
    Ok(())
}

/// Two rigid deflection restraints at one point make the model singular and mean nothing more
/// than one; say so rather than silently dropping one.
fn rigid_supports(parts: &ModelParts, length: f64) -> Result<()> {
    let tolerance = SAME_POINT * length;
    let mut held: Vec<(f64, String)> = Vec::new();
    if parts.left.springs().0 == f64::INFINITY {
        held.push((0.0, "left".to_string()));
    }
    if parts.right.springs().0 == f64::INFINITY {
        held.push((length, "right".to_string()));
    }
    for (i, a) in parts.attachments.iter().enumerate() {
        if !a.holds_deflection() {
            continue;
        }
        let x = a.position();
        if let Some((_, other)) = held.iter().find(|(y, _)| (x - y).abs() <= tolerance) {
            return Err(Error::new(
                ErrorKind::Conflict,
                format!(
                    "two rigid supports at one point: {other} already holds the deflection here; remove one"
                ),
            )
            .at(FieldPath::item("attachments", i).key("position"))
            .with_si(x, "m"));
        }
        held.push((x, format!("attachments[{i}]")));
    }
    Ok(())
}
