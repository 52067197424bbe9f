//! The list of accepted units, for the help text shown beside the input fields.

use super::table::{self, Class};
use super::Kind;

/// One accepted unit symbol with what it measures and its exact SI factor.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct UnitInfo {
    /// The canonical symbol, as in "lbf".
    pub symbol: &'static str,
    /// Other accepted spellings, as "um" for "µm".
    pub aliases: Vec<&'static str>,
    /// The unit's name, as in "pound-force".
    pub name: &'static str,
    /// What the unit measures in words: "length", "pressure or modulus", "time", "angle".
    pub quantity: &'static str,
    /// The field kind this unit fits on its own, if any (seconds and radians only combine).
    pub kind: Option<Kind>,
    /// The SI value of one of this unit, in `si_unit`.
    pub si_factor: f64,
    /// The SI unit of `si_factor`: "m", "kg", "Hz".
    pub si_unit: &'static str,
}

/// Every accepted unit symbol. Units combine with `*` or `·`, `/`, and powers `^2` or `²`, so
/// derived units such as lb/in³ or N·m/rad are not listed separately.
pub fn unit_list() -> Vec<UnitInfo> {
    table::UNITS
        .iter()
        .map(|unit| {
            let kind = match unit.class {
                Class::Angle => None,
                _ => Kind::ALL.iter().copied().find(|kind| kind.dim() == unit.dim),
            };
            let (quantity, si_unit) = match (unit.class, kind) {
                (Class::Angle, _) => ("angle", "rad"),
                (_, Some(kind)) => (quantity_name(kind), kind.si_unit()),
                (_, None) => ("time", "s"),
            };
            UnitInfo {
                symbol: unit.symbols[0],
                aliases: unit.symbols[1..].to_vec(),
                name: unit.name,
                quantity,
                kind,
                si_factor: unit.factor,
                si_unit,
            }
        })
        .collect()
}

fn quantity_name(kind: Kind) -> &'static str {
    let described = kind.describe();
    described.strip_prefix("a ").or_else(|| described.strip_prefix("an ")).unwrap_or(described)
}
