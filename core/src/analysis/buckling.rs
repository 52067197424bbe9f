//! The axial forces against the load that buckles the beam: an error once it has buckled, a
//! warning when the compression comes near it.

use super::{Warning, WarningCode};
use crate::error::{Error, ErrorKind, Result};
use crate::model::Model;

/// Compression within this fraction of the critical load gets a warning.
const NEAR_BUCKLING: f64 = 0.5;
/// A critical load factor this close above 1 is the critical load itself, found to within the
/// root search's tolerance: the fundamental is zero there and the beam is treated as buckled.
const AT_BUCKLING: f64 = 1e-9;

/// The critical load factor of the axial forces: an error when the beam has buckled, and a
/// warning when the compression is more than half of what buckles it.
pub(super) fn factor(model: &Model, warnings: &mut Vec<Warning>) -> Result<Option<f64>> {
    let factor = crate::axial::critical_load_factor(model)?;
    if let Some(mu) = factor {
        if mu <= 1.0 + AT_BUCKLING {
            return Err(Error::new(
                ErrorKind::Model,
                format!(
                    "the beam has buckled under these loads: the axial forces are {:.3} times the load that buckles \
                     it, and a buckled beam has no natural frequencies about its straight shape. Reduce the \
                     compression or add supports",
                    1.0 / mu
                ),
            )
            .at(most_compressed(model)));
        }
        if 1.0 / mu > NEAR_BUCKLING {
            warnings.push(Warning {
                code: WarningCode::NearBuckling,
                message: format!(
                    "The axial compression is {:.0} % of the load that buckles the beam (critical load factor \
                     {mu:.3}). Frequencies fall steeply as it approaches 100 %, and small changes in the load, a \
                     temperature or an imperfection move them a lot; the applicable code sets the margin against \
                     buckling.",
                    100.0 / mu
                ),
            });
        }
    }
    Ok(factor)
}

/// The axial force of the segment in most compression: where a buckled beam's message is shown,
/// as the force to reduce first.
fn most_compressed(model: &Model) -> crate::path::FieldPath {
    let segment = (0..model.segments().len())
        .min_by(|a, b| model.axial_force(*a).total_cmp(&model.axial_force(*b)))
        .unwrap_or(0);
    crate::path::FieldPath::item("segments", segment).key(crate::schema::AXIAL_FORCE.name)
}
