//! The physical kinds of value a scenario field can expect, with their SI dimension and unit.

use super::table::{self, Dim};

/// What physical kind of value a field expects.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Kind {
    /// Length, m.
    Length,
    /// Mass, kg.
    Mass,
    /// Force, N.
    Force,
    /// Pressure and elastic moduli, Pa.
    Pressure,
    /// Mass per volume, kg/m³.
    Density,
    /// Mass per length, kg/m.
    MassPerLength,
    /// Area, m².
    Area,
    /// Second moment of area, m⁴.
    SecondMoment,
    /// Flexural rigidity EI, N·m².
    FlexuralRigidity,
    /// Shear rigidity κGA, N.
    ShearRigidity,
    /// Translational stiffness, N/m.
    Stiffness,
    /// Rotational stiffness, N·m/rad.
    RotationalStiffness,
    /// Rotary (mass moment of) inertia, kg·m².
    RotaryInertia,
    /// Rotary inertia per length, kg·m.
    RotaryInertiaPerLength,
    /// Frequency, stored in hertz (cycles per second), not in rad/s.
    Frequency,
    /// A dimensionless ratio, such as Poisson's ratio.
    Ratio,
    /// A change of temperature, K (°C and °F read as changes, not as readings on a scale).
    TemperatureChange,
    /// A coefficient of thermal expansion, 1/K (strain per degree).
    ThermalExpansion,
}

impl Kind {
    /// Every kind, in the order used to name an unexpected dimension.
    pub const ALL: [Kind; 18] = [
        Kind::Length,
        Kind::Mass,
        Kind::Force,
        Kind::Pressure,
        Kind::Density,
        Kind::MassPerLength,
        Kind::Area,
        Kind::SecondMoment,
        Kind::FlexuralRigidity,
        Kind::ShearRigidity,
        Kind::Stiffness,
        Kind::RotationalStiffness,
        Kind::RotaryInertia,
        Kind::RotaryInertiaPerLength,
        Kind::Frequency,
        Kind::Ratio,
        Kind::TemperatureChange,
        Kind::ThermalExpansion,
    ];

    /// The dimension as exponents of mass, length and time; a frequency counts as 1/s.
    pub(crate) const fn dim(self) -> Dim {
        match self {
            Kind::Length => table::LENGTH,
            Kind::Mass => table::MASS,
            Kind::Force | Kind::ShearRigidity => table::FORCE,
            Kind::Pressure => table::PRESSURE,
            Kind::Density => Dim::new(1, -3, 0),
            Kind::MassPerLength => Dim::new(1, -1, 0),
            Kind::Area => Dim::new(0, 2, 0),
            Kind::SecondMoment => Dim::new(0, 4, 0),
            Kind::FlexuralRigidity => Dim::new(1, 3, -2),
            Kind::Stiffness => Dim::new(1, 0, -2),
            Kind::RotationalStiffness => Dim::new(1, 2, -2),
            Kind::RotaryInertia => Dim::new(1, 2, 0),
            Kind::RotaryInertiaPerLength => Dim::new(1, 1, 0),
            Kind::Frequency => table::PER_TIME,
            Kind::Ratio => table::NONE,
            Kind::TemperatureChange => table::TEMPERATURE,
            Kind::ThermalExpansion => table::TEMPERATURE.pow(-1),
        }
    }

    /// The kind's name in scenarios and the JS API: "length", "mass-per-length", …
    pub fn id(self) -> &'static str {
        match self {
            Kind::Length => "length",
            Kind::Mass => "mass",
            Kind::Force => "force",
            Kind::Pressure => "pressure",
            Kind::Density => "density",
            Kind::MassPerLength => "mass-per-length",
            Kind::Area => "area",
            Kind::SecondMoment => "second-moment",
            Kind::FlexuralRigidity => "flexural-rigidity",
            Kind::ShearRigidity => "shear-rigidity",
            Kind::Stiffness => "stiffness",
            Kind::RotationalStiffness => "rotational-stiffness",
            Kind::RotaryInertia => "rotary-inertia",
            Kind::RotaryInertiaPerLength => "rotary-inertia-per-length",
            Kind::Frequency => "frequency",
            Kind::Ratio => "ratio",
            Kind::TemperatureChange => "temperature-change",
            Kind::ThermalExpansion => "thermal-expansion",
        }
    }

    /// The kind with this name.
    pub fn from_id(id: &str) -> Option<Kind> {
        Kind::ALL.into_iter().find(|k| k.id() == id)
    }

    /// The SI unit values of this kind are stored in, written for display.
    pub fn si_unit(self) -> &'static str {
        match self {
            Kind::Length => "m",
            Kind::Mass => "kg",
            Kind::Force | Kind::ShearRigidity => "N",
            Kind::Pressure => "Pa",
            Kind::Density => "kg/m³",
            Kind::MassPerLength => "kg/m",
            Kind::Area => "m²",
            Kind::SecondMoment => "m⁴",
            Kind::FlexuralRigidity => "N·m²",
            Kind::Stiffness => "N/m",
            Kind::RotationalStiffness => "N·m/rad",
            Kind::RotaryInertia => "kg·m²",
            Kind::RotaryInertiaPerLength => "kg·m",
            Kind::Frequency => "Hz",
            Kind::Ratio => "",
            Kind::TemperatureChange => "K",
            Kind::ThermalExpansion => "/K",
        }
    }

    /// The kind in words with its article, for messages: "a length", "an area".
    pub fn describe(self) -> &'static str {
        match self {
            Kind::Length => "a length",
            Kind::Mass => "a mass",
            Kind::Force => "a force",
            Kind::Pressure => "a pressure or modulus",
            Kind::Density => "a density (mass per volume)",
            Kind::MassPerLength => "a mass per length",
            Kind::Area => "an area",
            Kind::SecondMoment => "a second moment of area",
            Kind::FlexuralRigidity => "a flexural rigidity (EI)",
            Kind::ShearRigidity => "a shear rigidity (κGA, a force)",
            Kind::Stiffness => "a stiffness (force per length)",
            Kind::RotationalStiffness => "a rotational stiffness (moment per radian)",
            Kind::RotaryInertia => "a rotary inertia (mass moment of inertia)",
            Kind::RotaryInertiaPerLength => "a rotary inertia per length",
            Kind::Frequency => "a frequency",
            Kind::Ratio => "a dimensionless ratio",
            Kind::TemperatureChange => "a temperature change",
            Kind::ThermalExpansion => "a coefficient of thermal expansion (per degree)",
        }
    }
}

/// Names a dimension for a message, using the first kind that has it, else its SI unit.
pub(crate) fn describe_dim(dim: Dim) -> String {
    if dim == table::TIME {
        return "a time".to_string();
    }
    match Kind::ALL.iter().find(|kind| kind.dim() == dim) {
        Some(kind) => kind.describe().to_string(),
        None => format!("a quantity in {}", si_expression(dim)),
    }
}

/// Writes a dimension as a product of SI base units: kg·m/s².
fn si_expression(dim: Dim) -> String {
    let parts = [("kg", dim.mass), ("m", dim.length), ("s", dim.time), ("K", dim.temperature)];
    let power = |symbol: &str, p: i32| match p {
        1 => symbol.to_string(),
        p => format!("{symbol}^{p}"),
    };
    let numerator: Vec<String> = parts.iter().filter(|(_, p)| *p > 0).map(|(s, p)| power(s, *p)).collect();
    let denominator: String =
        parts.iter().filter(|(_, p)| *p < 0).map(|(s, p)| format!("/{}", power(s, -p))).collect();
    let numerator = if numerator.is_empty() { "1".to_string() } else { numerator.join("·") };
    format!("{numerator}{denominator}")
}
