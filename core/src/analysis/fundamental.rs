//! Mode 1 of a restrained beam as the hand methods see it: Rayleigh's and Dunkerley's bounds,
//! shown only where they hold, and the equivalent single-degree-of-freedom system at the report
//! point.

use super::{Fundamental, ModeResult, Options, Warning, WarningCode};
use crate::bounds;
use crate::error::Result;
use crate::model::Model;

/// The fundamental's bounds and equivalent system, when the beam has no rigid-body mode (`rigid`
/// of them come first in `modes`), with a warning for each thing withheld.
pub(super) fn of(
    model: &Model,
    options: &Options,
    modes: &[ModeResult],
    rigid: usize,
    warnings: &mut Vec<Warning>,
) -> Result<Option<Fundamental>> {
    Ok(match modes.get(rigid) {
        Some(first) if rigid == 0 => {
            let position = options.report_point.unwrap_or_else(|| bounds::largest_deflection(&first.shape));
            let equivalent = bounds::equivalent(&first.shape, first.omega, position);
            if equivalent.is_none() {
                warnings.push(Warning {
                    code: WarningCode::ReportPointAtNode,
                    message: "Mode 1 barely moves at the chosen report point, so no equivalent mass is given there."
                        .to_string(),
                });
            }
            let (rayleigh, dunkerley) = trusted_bounds(
                first.omega,
                bounds::rayleigh(model, &first.shape, first.omega),
                bounds::dunkerley(model)?,
            );
            if rayleigh.withheld || dunkerley.withheld {
                warnings.push(Warning {
                    code: WarningCode::Accuracy,
                    message: "Rayleigh's or Dunkerley's bound came out on the wrong side of the exact mode 1, which \
                              happens only when the model's stiffnesses differ by more than double precision resolves \
                              (an extremely stiff spring or support on a very flexible beam): the bound is not shown, \
                              and mode 1 itself may be inaccurate. Check the stiffnesses."
                        .to_string(),
                });
            }
            Some(Fundamental {
                omega: first.omega,
                rayleigh: rayleigh.value,
                dunkerley: dunkerley.value,
                equivalent,
            })
        }
        _ => None,
    })
}

/// A bound as shown: its value, or none when it was withheld.
struct Shown {
    value: Option<f64>,
    withheld: bool,
}

/// Rayleigh's upper and Dunkerley's lower bound on mode 1 as they may be shown. Both hold in
/// exact arithmetic for every model they are computed for; a computed one on the wrong side of
/// the exact value (beyond 1e-9, the exact value's own accuracy) shows that round-off has taken
/// over, and a bound that is not one is not shown as one.
fn trusted_bounds(omega: f64, rayleigh: Option<f64>, dunkerley: Option<f64>) -> (Shown, Shown) {
    const SLACK: f64 = 1e-9;
    let check = |value: Option<f64>, holds: &dyn Fn(f64) -> bool| match value {
        Some(v) if !holds(v) => Shown { value: None, withheld: true },
        value => Shown { value, withheld: false },
    };
    (check(rayleigh, &|r| r >= omega * (1.0 - SLACK)), check(dunkerley, &|d| d <= omega * (1.0 + SLACK)))
}
