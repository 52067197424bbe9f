//! Materials: preset elastic properties with their sources, and custom materials read with units.
//!
//! The presets are single representative room-temperature values for quick checks, not design
//! allowables: where sources give a range, the value chosen and the reason are stated beside it.

#[cfg(test)]
mod tests;

use crate::error::{echo, number, Error, ErrorKind};
use crate::units::{self, Conversion, Kind, Quantity};

/// Poisson's ratio assumed when a custom material does not give one.
pub const DEFAULT_POISSON: f64 = 0.3;

/// A preset material, in SI.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct Material {
    /// Identifier used in scenarios, as "steel".
    pub id: &'static str,
    /// Name for display.
    pub name: &'static str,
    /// Young's modulus E, Pa.
    pub youngs_modulus: f64,
    /// Density, kg/m³.
    pub density: f64,
    /// Poisson's ratio ν.
    pub poisson: f64,
    /// Shear modulus G, Pa, where it departs from the isotropic E/(2(1+ν)) (fibre composites,
    /// wood); `None` for isotropic metals.
    pub shear_modulus_override: Option<f64>,
    /// Coefficient of thermal expansion along the member near room temperature, 1/K: what turns
    /// a temperature change of a member held at both ends into an axial force, −E·A·α·ΔT.
    pub thermal_expansion: f64,
    /// Where the values come from.
    pub source: &'static str,
}

impl Material {
    /// Shear modulus G: the stated value for anisotropic materials, otherwise E/(2(1+ν)).
    pub fn shear_modulus(&self) -> f64 {
        self.shear_modulus_override.unwrap_or(self.youngs_modulus / (2.0 * (1.0 + self.poisson)))
    }
}

const fn metal(
    id: &'static str,
    name: &'static str,
    (youngs_modulus, density, poisson, thermal_expansion): (f64, f64, f64, f64),
    source: &'static str,
) -> Material {
    Material {
        id,
        name,
        youngs_modulus,
        density,
        poisson,
        shear_modulus_override: None,
        thermal_expansion,
        source,
    }
}

static PRESETS: [Material; 7] = [
    // Common handbook values for carbon and structural steel; ν = 0.3 is the usual handbook value.
    metal(
        "steel",
        "Carbon / structural steel",
        (200e9, 7850.0, 0.30, 12e-6),
        "Common handbook values for carbon and structural steel: E = 200 GPa, 7850 kg/m³, ν = 0.30, \
         α = 12e-6 /K (about 11.7e-6 near room temperature; from memory).",
    ),
    // Supplier data sheets for annealed 304 (ν = 0.29 as those sheets commonly give it — from memory).
    metal(
        "stainless-304",
        "Stainless steel 304",
        (193e9, 8000.0, 0.29, 17.3e-6),
        "Supplier data sheets for annealed 304: E = 193 GPa, 8000 kg/m³; ν = 0.29, α = 17.3e-6 /K \
         from 0 to 100 °C (from memory).",
    ),
    // Supplier data sheets for 6061-T6 (ν = 0.33 — from memory).
    metal(
        "aluminium-6061-t6",
        "Aluminium 6061-T6",
        (68.9e9, 2700.0, 0.33, 23.6e-6),
        "Supplier data sheets for 6061-T6: E = 68.9 GPa (10.0 Msi), 2700 kg/m³; ν = 0.33, α = 23.6e-6 /K \
         (from memory).",
    ),
    // Data sheets give E = 110–114 GPa; 113.8 GPa is the figure most quote for annealed bar (from
    // memory), and ν = 0.342 likewise.
    metal(
        "titanium-ti6al4v",
        "Titanium Ti-6Al-4V",
        (113.8e9, 4430.0, 0.342, 8.6e-6),
        "Supplier data sheets give E = 110–114 GPa; 113.8 GPa chosen as the value most quote for \
         annealed bar (from memory); 4430 kg/m³; ν = 0.342, α = 8.6e-6 /K (from memory).",
    ),
    // Supplier data sheets for free-cutting brass C36000 (ν = 0.31 — from memory).
    metal(
        "brass-c36000",
        "Free-cutting brass C36000",
        (97e9, 8490.0, 0.31, 20.5e-6),
        "Supplier data sheets for C36000: E = 97 GPa, 8490 kg/m³; ν = 0.31, α = 20.5e-6 /K (from memory).",
    ),
    // EN 13706 grades span E = 17–40 GPa and 1600–2100 kg/m³ (from memory). The E23 grade's
    // minimum longitudinal modulus of 23 GPa is chosen as a conservative common profile, with a
    // mid-range density. The in-plane shear modulus of pultruded profiles (about 3 GPa in
    // manufacturers' design manuals — from memory) is far below E/(2(1+ν)), so it is stated.
    Material {
        id: "gfrp-pultruded",
        name: "Pultruded GFRP (longitudinal)",
        youngs_modulus: 23e9,
        density: 1850.0,
        poisson: 0.23,
        shear_modulus_override: Some(3e9),
        thermal_expansion: 8e-6,
        source: "EN 13706 grades span E = 17–40 GPa, 1600–2100 kg/m³ (from memory): E = 23 GPa (grade \
                 E23 minimum) and 1850 kg/m³ chosen; ν = 0.23 and in-plane G = 3 GPa from \
                 manufacturers' design manuals; α = 8e-6 /K along the fibres, within the 6–10e-6 \
                 they quote (from memory).",
    },
    // USDA Forest Products Laboratory, Wood Handbook: Douglas-fir at 12 % moisture content,
    // E ≈ 12 GPa measured in static bending (so it includes shear deflection; about 10 % higher in
    // pure bending), density ≈ 500 kg/m³. The handbook lists several Douglas-fir varieties whose E
    // spans roughly 10–13 GPa (from memory); 12 GPa is a representative middle value. ν_LR = 0.29 and G_LR/E_L = 0.064 from the handbook's
    // elastic-ratio table (from memory): wood is far softer in shear than E/(2(1+ν)) suggests.
    Material {
        id: "douglas-fir",
        name: "Douglas-fir (12 % moisture)",
        youngs_modulus: 12e9,
        density: 500.0,
        poisson: 0.29,
        shear_modulus_override: Some(0.064 * 12e9),
        thermal_expansion: 4e-6,
        source: "USDA Wood Handbook, Douglas-fir at 12 % moisture: E = 12 GPa from static bending \
                 (includes shear deflection; about 10 % higher in pure bending; varieties span roughly \
                 10–13 GPa), 500 kg/m³; \
                 ν_LR = 0.29 and G_LR = 0.064·E; α = 4e-6 /K along the grain, within the \
                 handbook's 3–5e-6 (from memory).",
    },
];

/// Every preset material.
pub fn presets() -> &'static [Material] {
    &PRESETS
}

/// The preset with this id, if there is one.
pub fn preset(id: &str) -> Option<&'static Material> {
    PRESETS.iter().find(|m| m.id == id)
}

/// A material as written in a scenario: a preset id, or properties with units.
///
/// Misspelt fields of a custom material are rejected rather than silently defaulted.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
#[serde(untagged)]
pub enum MaterialInput {
    /// The id of a preset, as "steel".
    Preset(String),
    /// Properties given directly.
    Custom {
        /// Young's modulus E.
        youngs_modulus: Quantity,
        /// Density (mass per volume).
        density: Quantity,
        /// Poisson's ratio; 0.3 when omitted ([`DEFAULT_POISSON`]).
        poisson: Option<Quantity>,
        /// Shear modulus G; E/(2(1+ν)) when omitted. Give it for anisotropic materials.
        shear_modulus: Option<Quantity>,
        /// The preset these properties were recorded from, when the editor recorded one.
        #[serde(skip_serializing_if = "Option::is_none")]
        preset: Option<String>,
        /// Coefficient of thermal expansion; none when omitted (no temperature change then).
        #[serde(skip_serializing_if = "Option::is_none")]
        thermal_expansion: Option<Quantity>,
    },
}

/// A material resolved to SI, from a preset or from custom properties.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct ResolvedMaterial {
    /// Name for display.
    pub name: String,
    /// Young's modulus E, Pa.
    pub youngs_modulus: f64,
    /// Density, kg/m³.
    pub density: f64,
    /// Shear modulus G, Pa.
    pub shear_modulus: f64,
    /// Poisson's ratio ν.
    pub poisson: f64,
    /// Coefficient of thermal expansion, 1/K: the preset's; `None` for a custom material.
    pub thermal_expansion: Option<f64>,
    /// Unit conversions applied to the written properties, by field ("youngs_modulus").
    pub conversions: Vec<(crate::path::FieldPath, Conversion)>,
}

/// Resolves a preset id or custom properties to SI values.
///
/// Errors for custom properties carry the field name (`density`) as a relative path; an unknown
/// preset carries no path, so the caller's path (`material`) names it.
pub fn resolve(input: &MaterialInput) -> Result<ResolvedMaterial, Error> {
    match input {
        MaterialInput::Preset(id) => {
            let material = preset(id.trim()).ok_or_else(|| {
                let ids: Vec<&str> = PRESETS.iter().map(|m| m.id).collect();
                Error::new(
                    ErrorKind::UnknownOption,
                    format!("unknown material \"{}\"; the presets are {}", echo(id), ids.join(", ")),
                )
                .with_value(id)
            })?;
            Ok(ResolvedMaterial {
                name: material.name.to_string(),
                youngs_modulus: material.youngs_modulus,
                density: material.density,
                shear_modulus: material.shear_modulus(),
                poisson: material.poisson,
                thermal_expansion: Some(material.thermal_expansion),
                conversions: Vec::new(),
            })
        }
        MaterialInput::Custom {
            youngs_modulus,
            density,
            poisson,
            shear_modulus,
            preset,
            thermal_expansion,
        } => {
            let mut m = resolve_custom(youngs_modulus, density, poisson.as_ref(), shear_modulus.as_ref())?;
            if let Some(q) = thermal_expansion {
                let mut conversions = Vec::new();
                let alpha =
                    units::convert_key(q, Kind::ThermalExpansion, "thermal_expansion", &mut conversions)?;
                let field = &crate::schema::MATERIAL_RECORD_FIELDS[1];
                if let Some((kind, message)) = field.range.refuse(alpha, field.what, field.unit(), false) {
                    return Err(Error::new(kind, message)
                        .at(field.name)
                        .with_value(q)
                        .with_si(alpha, field.unit()));
                }
                m.thermal_expansion = Some(alpha);
                m.conversions.extend(conversions);
            }
            // The recorded values are what is computed with; the preset only names them.
            if let Some(id) = preset {
                m.name = match self::preset(id.trim()) {
                    Some(p) => format!("{} (as recorded)", p.name),
                    None => format!("{} (as recorded)", echo(id)),
                };
            }
            Ok(m)
        }
    }
}

/// Plausible moduli and densities, from the schema.
const MODULUS_RANGE: (f64, f64) = bounds(crate::schema::MODULUS);
const DENSITY_RANGE: (f64, f64) = bounds(crate::schema::DENSITY);

const fn bounds(range: crate::schema::Range) -> (f64, f64) {
    match range {
        crate::schema::Range::Between(low, high) => (low, high),
        _ => (0.0, f64::INFINITY),
    }
}

fn resolve_custom(
    youngs_modulus: &Quantity,
    density: &Quantity,
    poisson: Option<&Quantity>,
    shear_modulus: Option<&Quantity>,
) -> Result<ResolvedMaterial, Error> {
    let mut conversions = Vec::new();
    let mut read = |quantity: &Quantity, kind: Kind, field: &str| {
        units::convert_key(quantity, kind, field, &mut conversions)
    };
    let e = read(youngs_modulus, Kind::Pressure, "youngs_modulus")?;
    let e = plausible(e, youngs_modulus, "youngs_modulus", "Young's modulus", MODULUS_RANGE, Kind::Pressure)?;
    let rho = read(density, Kind::Density, "density")?;
    let rho = plausible(rho, density, "density", "the density", DENSITY_RANGE, Kind::Density)?;
    let nu = match poisson {
        None => DEFAULT_POISSON,
        Some(quantity) => {
            let nu = read(quantity, Kind::Ratio, "poisson")?;
            if !(0.0..0.5).contains(&nu) {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    "Poisson's ratio must be at least 0 and below 0.5 (metals are near 0.3)",
                )
                .at("poisson")
                .with_value(quantity));
            }
            nu
        }
    };
    let g = match shear_modulus {
        None => e / (2.0 * (1.0 + nu)),
        Some(quantity) => {
            let g = read(quantity, Kind::Pressure, "shear_modulus")?;
            plausible(g, quantity, "shear_modulus", "the shear modulus", MODULUS_RANGE, Kind::Pressure)?
        }
    };
    Ok(ResolvedMaterial {
        name: "Custom material".to_string(),
        youngs_modulus: e,
        density: rho,
        shear_modulus: g,
        poisson: nu,
        thermal_expansion: None,
        conversions,
    })
}

/// Checks that a property lies in its plausible range, with a hint when it was typed without a
/// unit and is too small, as a value meant in another unit but read in SI is.
fn plausible(
    value: f64,
    quantity: &Quantity,
    field: &str,
    what: &str,
    (low, high): (f64, f64),
    kind: Kind,
) -> Result<f64, Error> {
    if (low..=high).contains(&value) {
        return Ok(value);
    }
    let unit = kind.si_unit();
    let mut message = if value > 0.0 {
        format!("{what} must lie between {} and {} {unit}", number(low), number(high))
    } else {
        format!("{what} must be greater than zero (between {} and {} {unit})", number(low), number(high))
    };
    // Only a bare number was read in SI for want of a unit; a value typed with one ("0.0005 MPa",
    // as the editor writes a number typed beside MPa) is simply too small, and the hint would
    // contradict the unit the reader sees.
    if value > 0.0 && value < low && !quantity.has_unit() {
        message.push_str(&format!("; a number without a unit is read in {unit}, so write the unit"));
    }
    Err(Error::new(ErrorKind::OutOfRange, message).at(field).with_value(quantity).with_si(value, unit))
}
