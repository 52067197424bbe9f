//! Mass per length that moves with a beam besides its own material: pipe contents, lining and the
//! water a submerged member drags along.
//!
//! - Contents fill the bore and move with the pipe in bending: m = ρ_f · A_bore.
//! - A circular cylinder vibrating in still water far from walls and the free surface carries an
//!   added mass m_a = C_a · ρ_w · π·D_o²/4 with C_a ≈ 1, the standard potential-flow result that
//!   offshore design practice uses (from memory). Only round sections are modelled: for other
//!   shapes the coefficient depends on the shape and direction, and none is cited here.

#[cfg(test)]
mod tests;

use crate::error::{echo, Error, ErrorKind};
use crate::path::FieldPath;
use crate::section::SectionProps;
use crate::units::{self, Conversion, Kind, Quantity};
use std::f64::consts::PI;

/// Water density assumed for a submerged member, kg/m³: seawater, the common offshore design
/// value (from memory). Write 1000 kg/m³ for fresh water.
pub const DEFAULT_WATER_DENSITY: f64 = 1025.0;

/// Added-mass coefficient C_a assumed for a submerged circular cylinder.
pub const DEFAULT_ADDED_MASS_COEFFICIENT: f64 = 1.0;

/// A fluid that may fill a pipe's bore, with its density and where that comes from.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize)]
pub struct Contents {
    /// Identifier used in scenarios, as "water".
    pub id: &'static str,
    /// Name for display.
    pub name: &'static str,
    /// Density, kg/m³.
    pub density: f64,
    /// Where the value comes from.
    pub source: &'static str,
}

static CONTENTS: [Contents; 5] = [
    Contents { id: "water", name: "Fresh water, 20 °C", density: 998.2, source: "Density of pure water at 20 °C, 998.2 kg/m³ (CRC Handbook of Chemistry and Physics — from memory)." },
    Contents { id: "seawater", name: "Seawater", density: 1025.0, source: "Typical seawater, 1025 kg/m³, the common offshore design value (from memory)." },
    Contents { id: "light-oil", name: "Light oil (diesel-like)", density: 850.0, source: "Diesel and light fuel oils, 820–860 kg/m³ at 15 °C; 850 chosen (common handbook range — from memory)." },
    Contents { id: "glycol-mix", name: "Water–glycol 50 %", density: 1070.0, source: "50 % ethylene glycol in water at 20 °C, about 1070 kg/m³ (coolant suppliers' tables — from memory)." },
    Contents { id: "air", name: "Air, 20 °C, 1 atm", density: 1.204, source: "Dry air at 20 °C and 101.325 kPa, 1.204 kg/m³ (ideal gas with M = 28.96 g/mol — from memory)." },
];

/// Every contents preset.
pub fn contents_presets() -> &'static [Contents] {
    &CONTENTS
}

/// The contents preset with this identifier.
pub fn contents_preset(id: &str) -> Option<&'static Contents> {
    CONTENTS.iter().find(|c| c.id == id)
}

/// Non-structural mass as written in a scenario; every part is optional.
#[derive(Clone, Debug, Default, PartialEq, serde::Serialize)]
pub struct ExtraMassInput {
    /// A contents preset by name ("water"); its density is used when `contents_density` is
    /// absent, and the editor records it there so that a saved case keeps it.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub contents: Option<String>,
    /// Density of a fluid or solid filling the bore.
    pub contents_density: Option<Quantity>,
    /// Mass per length of insulation, lining, cables and the like.
    pub lining: Option<Quantity>,
    /// Present when the member vibrates in water.
    pub submerged: Option<Submerged>,
}

/// The surrounding water of a submerged member.
#[derive(Clone, Debug, Default, PartialEq, serde::Serialize)]
pub struct Submerged {
    /// Water density; [`DEFAULT_WATER_DENSITY`] (seawater) when omitted.
    pub water_density: Option<Quantity>,
    /// Added-mass coefficient C_a; [`DEFAULT_ADDED_MASS_COEFFICIENT`] when omitted.
    pub added_mass_coefficient: Option<Quantity>,
}

/// Mass per length of each part, kg/m.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct MassBreakdown {
    /// The beam's own material: ρ·A.
    pub structural: f64,
    /// Contents of the bore.
    pub contents: f64,
    /// Lining, insulation, cables.
    pub lining: f64,
    /// Added mass of the surrounding water.
    pub added_water: f64,
    /// Unit conversions applied to the written values, by field ("lining").
    pub conversions: Vec<(FieldPath, Conversion)>,
}

impl MassBreakdown {
    /// Total mass per length that moves with the beam, kg/m.
    pub fn total(&self) -> f64 {
        self.structural + self.contents + self.lining + self.added_water
    }
}

/// Adds up the mass per length of a section of material density `material_density` (kg/m³) and
/// the extra mass described by `extra`.
///
/// Errors carry a path relative to `extra` (`contents_density`, `submerged.water_density`).
pub fn breakdown(
    section: &SectionProps,
    material_density: f64,
    extra: &ExtraMassInput,
) -> Result<MassBreakdown, Error> {
    if !(material_density.is_finite() && material_density > 0.0) {
        return Err(Error::new(ErrorKind::OutOfRange, "the material density must be positive and finite")
            .with_number(material_density));
    }
    let structural = material_density * section.area;
    if !(structural.is_finite() && structural > 0.0) {
        return Err(Error::new(ErrorKind::OutOfRange, "the section area must be positive and finite")
            .with_number(section.area));
    }
    let mut conversions = Vec::new();
    let mut read = |quantity: &Quantity, kind: Kind, field: &FieldPath| {
        units::convert_field(quantity, kind, field, &mut conversions)
    };
    let not_negative = |value: f64, quantity: &Quantity, field: &FieldPath, what: &str| {
        if value >= 0.0 {
            Ok(value)
        } else {
            Err(Error::new(ErrorKind::OutOfRange, format!("{what} must not be negative"))
                .at(field)
                .with_value(quantity))
        }
    };

    // A preset by name gives the density when none is recorded; a recorded density wins, so a
    // later change of the table never changes a saved case.
    let preset_density = match &extra.contents {
        None => None,
        Some(id) => Some(
            contents_preset(id.trim())
                .ok_or_else(|| {
                    let ids: Vec<&str> = CONTENTS.iter().map(|c| c.id).collect();
                    Error::new(
                        ErrorKind::UnknownOption,
                        format!("no contents called {}; the presets are {}", echo(id), ids.join(", ")),
                    )
                    .at("contents")
                    .with_value(id)
                })?
                .density,
        ),
    };
    let preset_quantity = preset_density.map(Quantity::Number);
    let contents = match extra.contents_density.as_ref().or(preset_quantity.as_ref()) {
        None => 0.0,
        Some(quantity) => {
            if section.bore_area.is_nan() || section.bore_area <= 0.0 {
                return Err(Error::new(
                    ErrorKind::Conflict,
                    "the section is solid: it has no bore to hold contents (use a tube or \
                     rectangular tube, or give the contents as lining mass per length)",
                )
                .at("contents_density")
                .with_value(quantity));
            }
            let rho = read(quantity, Kind::Density, &"contents_density".into())?;
            not_negative(rho, quantity, &"contents_density".into(), "the contents density")?
                * section.bore_area
        }
    };

    let lining = match &extra.lining {
        None => 0.0,
        Some(quantity) => not_negative(
            read(quantity, Kind::MassPerLength, &"lining".into())?,
            quantity,
            &"lining".into(),
            "the lining mass",
        )?,
    };

    let added_water = match &extra.submerged {
        None => 0.0,
        Some(submerged) => {
            let Some(d_o) = section.outer_diameter else {
                return Err(Error::new(
                    ErrorKind::Conflict,
                    "submerged added mass is only modelled for round sections (round bar or tube)",
                )
                .at("submerged"));
            };
            let rho_w = match &submerged.water_density {
                None => DEFAULT_WATER_DENSITY,
                Some(quantity) => {
                    let field = &FieldPath::from("submerged").key("water_density");
                    let rho_w = read(quantity, Kind::Density, field)?;
                    // The schema's range, as the format's documentation gives it.
                    crate::model::value(&crate::schema::SUBMERGED_FIELDS[0], rho_w)
                        .map_err(|e| e.at("submerged").with_value(quantity))?;
                    rho_w
                }
            };
            let c_a = match &submerged.added_mass_coefficient {
                None => DEFAULT_ADDED_MASS_COEFFICIENT,
                Some(quantity) => {
                    let field = &FieldPath::from("submerged").key("added_mass_coefficient");
                    not_negative(
                        read(quantity, Kind::Ratio, field)?,
                        quantity,
                        field,
                        "the added-mass coefficient",
                    )?
                }
            };
            c_a * rho_w * PI * d_o * d_o / 4.0
        }
    };

    let result = MassBreakdown { structural, contents, lining, added_water, conversions };
    if !result.total().is_finite() {
        // Name the input whose part overflowed (or is the largest), as typed.
        let parts = [
            (contents, "contents_density", extra.contents_density.as_ref()),
            (lining, "lining", extra.lining.as_ref()),
            (added_water, "submerged", None),
        ];
        let (_, field, typed) =
            parts.iter().fold(parts[0], |a, b| if b.0.total_cmp(&a.0).is_gt() { *b } else { a });
        let error = Error::new(
            ErrorKind::OutOfRange,
            format!(
                "the mass per length this gives is too large to compute with (a beam carries at most {} kg/m); \
                 check the unit",
                crate::error::number(crate::schema::MASS_PER_LENGTH.range.high())
            ),
        )
        .at(field);
        return Err(match typed {
            Some(typed) => error.with_value(typed),
            None => error,
        });
    }
    Ok(result)
}
