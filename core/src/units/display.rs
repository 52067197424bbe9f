//! Writing SI values in the unit system the user reads in: "47.24 in", "29.01 Msi".

use super::table::{self, FAHRENHEIT_DEGREE, FOOT, INCH, POUND, POUND_FORCE, PSI};
use super::Kind;

/// The set of units results are shown in.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum UnitSystem {
    /// Metres, kilograms, newtons; moduli in GPa.
    #[default]
    Si,
    /// Millimetres with kilograms and newtons; moduli in MPa (N/mm²).
    SiMm,
    /// Inches, pound-mass and pound-force; moduli in Msi.
    UsInch,
    /// Feet, pound-mass and pound-force; moduli in psi.
    UsFoot,
}

impl UnitSystem {
    /// Every unit system.
    pub const ALL: [UnitSystem; 4] =
        [UnitSystem::Si, UnitSystem::SiMm, UnitSystem::UsInch, UnitSystem::UsFoot];

    /// The name used in scenarios: "si", "si-mm", "us-inch" or "us-foot".
    pub fn id(self) -> &'static str {
        match self {
            UnitSystem::Si => "si",
            UnitSystem::SiMm => "si-mm",
            UnitSystem::UsInch => "us-inch",
            UnitSystem::UsFoot => "us-foot",
        }
    }

    /// The unit system with this scenario name.
    pub fn from_id(id: &str) -> Option<UnitSystem> {
        UnitSystem::ALL.into_iter().find(|s| s.id() == id)
    }
}

/// The unit a kind is shown in: `value_in_unit = si * per_si`.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize)]
pub struct DisplayUnit {
    /// The symbol, with Unicode superscripts and `·` ("lb/in³"); empty for ratios.
    pub symbol: &'static str,
    /// How many of this unit make one SI unit of the kind.
    pub per_si: f64,
}

const fn unit(symbol: &'static str, si_per_unit: f64) -> DisplayUnit {
    DisplayUnit { symbol, per_si: 1.0 / si_per_unit }
}

/// The unit a kind is shown in for a unit system.
///
/// Frequencies are always shown in hertz; the caller adds rpm beside them where that helps.
pub fn display_unit(kind: Kind, system: UnitSystem) -> DisplayUnit {
    use UnitSystem::{Si, SiMm, UsFoot, UsInch};
    const MM: f64 = 1e-3;
    match (kind, system) {
        (Kind::Frequency, _) => unit("Hz", 1.0),
        (Kind::Ratio, _) => unit("", 1.0),
        (Kind::TemperatureChange, Si | SiMm) => unit("K", 1.0),
        (Kind::TemperatureChange, UsInch | UsFoot) => unit("°F", FAHRENHEIT_DEGREE),
        (Kind::ThermalExpansion, Si | SiMm) => unit("/K", 1.0),
        (Kind::ThermalExpansion, UsInch | UsFoot) => unit("/°F", 1.0 / FAHRENHEIT_DEGREE),
        (Kind::Mass, Si | SiMm) => unit("kg", 1.0),
        (Kind::Mass, UsInch | UsFoot) => unit("lb", POUND),
        (Kind::Force | Kind::ShearRigidity, Si | SiMm) => unit("N", 1.0),
        (Kind::Force | Kind::ShearRigidity, UsInch | UsFoot) => unit("lbf", POUND_FORCE),
        (Kind::Density, Si | SiMm) => unit("kg/m³", 1.0),
        (Kind::MassPerLength, Si | SiMm) => unit("kg/m", 1.0),
        (Kind::Length, Si) => unit("m", 1.0),
        (Kind::Pressure, Si) => unit("GPa", 1e9),
        (Kind::Area, Si) => unit("m²", 1.0),
        (Kind::SecondMoment, Si) => unit("m⁴", 1.0),
        (Kind::FlexuralRigidity, Si) => unit("N·m²", 1.0),
        (Kind::Stiffness, Si) => unit("N/m", 1.0),
        (Kind::RotationalStiffness, Si) => unit("N·m/rad", 1.0),
        (Kind::RotaryInertia, Si) => unit("kg·m²", 1.0),
        (Kind::RotaryInertiaPerLength, Si) => unit("kg·m", 1.0),
        (Kind::Length, SiMm) => unit("mm", MM),
        (Kind::Pressure, SiMm) => unit("MPa", 1e6),
        (Kind::Area, SiMm) => unit("mm²", MM * MM),
        (Kind::SecondMoment, SiMm) => unit("mm⁴", MM * MM * MM * MM),
        (Kind::FlexuralRigidity, SiMm) => unit("N·mm²", MM * MM),
        (Kind::Stiffness, SiMm) => unit("N/mm", 1.0 / MM),
        (Kind::RotationalStiffness, SiMm) => unit("N·mm/rad", MM),
        (Kind::RotaryInertia, SiMm) => unit("kg·mm²", MM * MM),
        (Kind::RotaryInertiaPerLength, SiMm) => unit("kg·mm", MM),
        (Kind::Length, UsInch) => unit("in", INCH),
        (Kind::Pressure, UsInch) => unit("Msi", 1e6 * PSI),
        (Kind::Density, UsInch) => unit("lb/in³", POUND / (INCH * INCH * INCH)),
        (Kind::MassPerLength, UsInch) => unit("lb/in", POUND / INCH),
        (Kind::Area, UsInch) => unit("in²", INCH * INCH),
        (Kind::SecondMoment, UsInch) => unit("in⁴", INCH * INCH * INCH * INCH),
        (Kind::FlexuralRigidity, UsInch) => unit("lbf·in²", POUND_FORCE * INCH * INCH),
        (Kind::Stiffness, UsInch) => unit("lbf/in", POUND_FORCE / INCH),
        (Kind::RotationalStiffness, UsInch) => unit("lbf·in/rad", POUND_FORCE * INCH),
        (Kind::RotaryInertia, UsInch) => unit("lb·in²", POUND * INCH * INCH),
        (Kind::RotaryInertiaPerLength, UsInch) => unit("lb·in", POUND * INCH),
        (Kind::Length, UsFoot) => unit("ft", FOOT),
        (Kind::Pressure, UsFoot) => unit("psi", PSI),
        (Kind::Density, UsFoot) => unit("lb/ft³", POUND / (FOOT * FOOT * FOOT)),
        (Kind::MassPerLength, UsFoot) => unit("lb/ft", POUND / FOOT),
        (Kind::Area, UsFoot) => unit("ft²", FOOT * FOOT),
        (Kind::SecondMoment, UsFoot) => unit("ft⁴", FOOT * FOOT * FOOT * FOOT),
        (Kind::FlexuralRigidity, UsFoot) => unit("lbf·ft²", POUND_FORCE * FOOT * FOOT),
        (Kind::Stiffness, UsFoot) => unit("lbf/ft", POUND_FORCE / FOOT),
        (Kind::RotationalStiffness, UsFoot) => unit("lbf·ft/rad", POUND_FORCE * FOOT),
        (Kind::RotaryInertia, UsFoot) => unit("lb·ft²", POUND * FOOT * FOOT),
        (Kind::RotaryInertiaPerLength, UsFoot) => unit("lb·ft", POUND * FOOT),
    }
}

/// Formats an SI value in the display unit of `kind` for `system`, to four significant digits:
/// "47.24 in". A value that is not finite is shown as "—", never as "NaN" or "inf".
pub fn format(si: f64, kind: Kind, system: UnitSystem) -> String {
    let unit = display_unit(kind, system);
    let value = si * unit.per_si;
    if !value.is_finite() {
        return "—".to_string();
    }
    let number = significant(value, 4);
    if unit.symbol.is_empty() {
        number
    } else {
        format!("{number} {}", unit.symbol)
    }
}

/// Writes `value` with `significant` significant digits (at least 1), without trailing zeros:
/// plain notation from 0.001 up to a million, `2.901e7` style outside that range.
pub fn significant(value: f64, significant: usize) -> String {
    if !value.is_finite() {
        return "—".to_string();
    }
    if value == 0.0 {
        return "0".to_string();
    }
    let significant = significant.clamp(1, 17);
    let exponent = value.abs().log10().floor() as i32;
    if (-3..6).contains(&exponent) {
        let decimals = (significant as i32 - 1 - exponent).max(0) as usize;
        trim_zeros(&format!("{value:.decimals$}")).to_string()
    } else {
        let text = format!("{value:.*e}", significant - 1);
        match text.split_once('e') {
            Some((mantissa, power)) => format!("{}e{power}", trim_zeros(mantissa)),
            None => text,
        }
    }
}

/// Removes trailing zeros after a decimal point, and the point itself if nothing follows it.
fn trim_zeros(text: &str) -> &str {
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.')
    } else {
        text
    }
}

/// A few unit spellings for a kind, for error messages: the base units of that dimension and
/// the display units of every system, without repeats.
pub(crate) fn examples(kind: Kind) -> Vec<&'static str> {
    let mut symbols: Vec<&'static str> = table::UNITS
        .iter()
        .filter(|u| u.dim == kind.dim() && u.class != table::Class::Angle)
        .filter(|u| kind == Kind::Frequency || u.class != table::Class::Cycle)
        .map(|u| u.symbols[0])
        .collect();
    if kind == Kind::Frequency {
        symbols.push("rad/s");
    }
    for system in UnitSystem::ALL {
        let symbol = display_unit(kind, system).symbol;
        if !symbol.is_empty() && !symbols.contains(&symbol) {
            symbols.push(symbol);
        }
    }
    symbols
}

/// A value of `kind` written with a unit, for the example a message gives ("as in \"27.2 in\""):
/// one that fields of the kind accept. 27.2 of the kind's first unit serves most kinds, but not
/// a modulus (27.2 Pa is far below any material's), a ratio (Poisson's ratio and the shear
/// coefficient are below 1) nor a coefficient of expansion (27.2 /K is no solid's).
pub(crate) fn example(kind: Kind) -> String {
    match kind {
        // A length in the inch the scenarios' own examples use, not the first unit, the metre.
        Kind::Length => "27.2 in".to_string(),
        // The steel preset's modulus, Poisson's ratio and expansion (core::material).
        Kind::Pressure => "200 GPa".to_string(),
        Kind::Ratio => "0.3".to_string(),
        Kind::ThermalExpansion => "12e-6 /K".to_string(),
        _ => examples(kind).first().map_or_else(|| "27.2".to_string(), |unit| format!("27.2 {unit}")),
    }
}
