//! Cross-sections: area, second moment, shear coefficient and bore of the common beam shapes.
//!
//! Every dimension is read with its unit and checked once here; the solver only sees the
//! resulting [`SectionProps`] in SI. Bending is about the axis perpendicular to `depth`, that is,
//! `depth` is measured in the plane of vibration.

pub mod pipe;
mod shear;
#[cfg(test)]
mod tests;
#[cfg(test)]
mod tests_grid;

use crate::error::{number, Error, ErrorKind};
use crate::path::FieldPath;
use crate::schema;
use crate::units::{self, Conversion, Kind, Quantity};
use std::f64::consts::PI;

/// Which principal axis an I-section bends about.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum BendingAxis {
    /// Bending about the axis parallel to the flanges: the web lies in the plane of vibration.
    #[default]
    Strong,
    /// Bending about the axis of the web: the flanges lie in the plane of vibration.
    Weak,
}

/// A cross-section as written in a scenario, every dimension a [`Quantity`] with its unit.
///
/// Unknown fields are rejected: `deny_unknown_fields` works with this internally tagged enum
/// because every variant is a struct variant (the tests check it).
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
#[serde(tag = "shape", rename_all = "kebab-case")]
pub enum SectionInput {
    /// Solid rectangle; `depth` is measured in the plane of vibration.
    Rectangle {
        /// Side across the plane of vibration.
        width: Quantity,
        /// Side in the plane of vibration.
        depth: Quantity,
    },
    /// Solid round bar.
    Round {
        /// Diameter.
        diameter: Quantity,
    },
    /// Round tube or pipe.
    Tube {
        /// Outer diameter.
        outer_diameter: Quantity,
        /// Wall thickness.
        wall: Quantity,
    },
    /// Steel pipe by nominal size and schedule ([`pipe`]); the outside diameter and wall the
    /// table gave are recorded beside them and, when present, are what is computed with.
    Pipe {
        /// Nominal size, as "4" or "1-1/2".
        nominal_size: String,
        /// Schedule, as "40" or "STD".
        schedule: String,
        /// The recorded outside diameter; the table's when absent.
        #[serde(skip_serializing_if = "Option::is_none")]
        outer_diameter: Option<Quantity>,
        /// The recorded wall; the table's when absent.
        #[serde(skip_serializing_if = "Option::is_none")]
        wall: Option<Quantity>,
    },
    /// Rectangular hollow section with a uniform wall.
    RectangularTube {
        /// Outer side across the plane of vibration.
        width: Quantity,
        /// Outer side in the plane of vibration.
        depth: Quantity,
        /// Wall thickness.
        wall: Quantity,
    },
    /// I-section (wide flange) with equal flanges, corner fillets ignored.
    IBeam {
        /// Overall depth, outside of flange to outside of flange.
        depth: Quantity,
        /// Width of each flange.
        flange_width: Quantity,
        /// Thickness of each flange.
        flange_thickness: Quantity,
        /// Thickness of the web.
        web_thickness: Quantity,
        /// The axis of bending; strong by default.
        axis: BendingAxis,
    },
    /// Properties given directly, for shapes not listed.
    Custom {
        /// Cross-section area.
        area: Quantity,
        /// Second moment of area about the bending axis.
        second_moment: Quantity,
        /// Depth in the plane of vibration; defaults to √(12·I/A), the depth of the rectangle
        /// with the same radius of gyration.
        depth: Option<Quantity>,
        /// Shear coefficient κ in (0, 1]; defaults to Cowper's solid-rectangle value for the
        /// material's Poisson's ratio.
        shear_coefficient: Option<Quantity>,
    },
}

/// Section properties in SI, ready for the solver.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct SectionProps {
    /// Cross-section area, m².
    pub area: f64,
    /// Second moment of area about the bending axis, m⁴.
    pub second_moment: f64,
    /// Depth in the plane of vibration, m, for slenderness checks.
    pub depth: f64,
    /// Timoshenko shear coefficient κ (Cowper 1966).
    pub shear_coefficient: f64,
    /// Outer diameter of round shapes, m, for the added mass of surrounding water.
    pub outer_diameter: Option<f64>,
    /// Open internal area that can hold contents, m²; 0 for solid shapes.
    pub bore_area: f64,
    /// Unit conversions applied to the written dimensions, by field ("depth").
    pub conversions: Vec<(FieldPath, Conversion)>,
}

/// A dimension as typed, with the metre it was read in when it was typed without a unit: "4" in
/// a message beside "60 mm" would not say that it was taken as 4 m.
fn as_typed(q: &Quantity) -> String {
    if q.has_unit() {
        q.to_string()
    } else {
        format!("{q} m")
    }
}

/// Computes the properties of a section for a material with Poisson's ratio `poisson`.
///
/// Errors carry a path relative to the section (`wall`), which the caller prefixes.
pub fn properties(input: &SectionInput, poisson: f64) -> Result<SectionProps, Error> {
    if !(poisson.is_finite() && (0.0..0.5).contains(&poisson)) {
        return Err(Error::new(ErrorKind::OutOfRange, "Poisson's ratio must be at least 0 and below 0.5")
            .with_number(poisson));
    }
    let mut read = Reader::default();
    let mut props = match input {
        SectionInput::Rectangle { width, depth } => {
            let (b, h) = (read.positive(width, "width")?, read.positive(depth, "depth")?);
            solid(b * h, b * h.powi(3) / 12.0, h, shear::rectangle(poisson))
        }
        SectionInput::Round { diameter } => {
            let d = read.positive(diameter, "diameter")?;
            let mut props = solid(PI * d * d / 4.0, PI * d.powi(4) / 64.0, d, shear::circle(poisson));
            props.outer_diameter = Some(d);
            props
        }
        SectionInput::Tube { outer_diameter, wall } => {
            let (d_o, t) = (read.positive(outer_diameter, "outer_diameter")?, read.positive(wall, "wall")?);
            if t >= d_o / 2.0 {
                return Err(Error::new(
                    ErrorKind::Conflict,
                    format!(
                        "the wall ({}) must be thinner than half the outer diameter ({})",
                        as_typed(wall),
                        as_typed(outer_diameter)
                    ),
                )
                .at("wall")
                .with_value(wall));
            }
            tube(d_o, t, poisson)
        }
        SectionInput::Pipe { nominal_size, schedule, outer_diameter, wall } => {
            // The size and schedule must name a pipe of the table even when the dimensions are
            // recorded, so that a case never carries a size that does not exist.
            let (table_od, table_wall) = pipe::dimensions(nominal_size, schedule)?;
            let d_o = match outer_diameter {
                Some(q) => read.positive(q, "outer_diameter")?,
                None => table_od,
            };
            let t = match wall {
                Some(q) => read.positive(q, "wall")?,
                None => table_wall,
            };
            if t >= d_o / 2.0 {
                return Err(Error::new(
                    ErrorKind::Conflict,
                    "the recorded wall must be thinner than half the recorded outside diameter",
                )
                .at("wall")
                .with_si(t, "m"));
            }
            tube(d_o, t, poisson)
        }
        SectionInput::RectangularTube { width, depth, wall } => {
            let (b, h) = (read.positive(width, "width")?, read.positive(depth, "depth")?);
            let t = read.positive(wall, "wall")?;
            if t >= b.min(h) / 2.0 {
                let smaller = if b <= h { width } else { depth };
                return Err(Error::new(
                    ErrorKind::Conflict,
                    format!(
                        "the wall ({}) must be thinner than half the smaller side ({})",
                        as_typed(wall),
                        as_typed(smaller)
                    ),
                )
                .at("wall")
                .with_value(wall));
            }
            rectangular_tube(b, h, t, poisson)
        }
        SectionInput::IBeam { depth, flange_width, flange_thickness, web_thickness, axis } => {
            let h = read.positive(depth, "depth")?;
            let b = read.positive(flange_width, "flange_width")?;
            let t_f = read.positive(flange_thickness, "flange_thickness")?;
            let t_w = read.positive(web_thickness, "web_thickness")?;
            if 2.0 * t_f >= h {
                return Err(Error::new(
                    ErrorKind::Conflict,
                    format!(
                        "the two flanges (2 × {flange_thickness}) must be thinner than the depth ({depth})"
                    ),
                )
                .at("flange_thickness")
                .with_value(flange_thickness));
            }
            if t_w > b {
                return Err(Error::new(
                    ErrorKind::Conflict,
                    format!(
                        "the web ({web_thickness}) must not be thicker than the flange width ({flange_width})"
                    ),
                )
                .at("web_thickness")
                .with_value(web_thickness));
            }
            i_beam(h, b, t_f, t_w, *axis, poisson)
        }
        SectionInput::Custom { area, second_moment, depth, shear_coefficient } => {
            let a = read.positive_of(area, Kind::Area, "area")?;
            let i = read.positive_of(second_moment, Kind::SecondMoment, "second_moment")?;
            let h = match depth {
                Some(depth) => read.positive(depth, "depth")?,
                None => (12.0 * i / a).sqrt(),
            };
            let kappa = match shear_coefficient {
                Some(kappa) => read.shear_coefficient(kappa)?,
                None => shear::rectangle(poisson),
            };
            solid(a, i, h, kappa)
        }
    };
    // The ranges of the dimensions keep every property finite and positive, and the formulas
    // add positive terms only; this stays as the last guard, naming the section as a whole.
    for (value, name) in [
        (props.area, "area"),
        (props.second_moment, "second moment of area"),
        (props.depth, "depth"),
        (props.shear_coefficient, "shear coefficient"),
    ] {
        if !(value.is_finite() && value > 0.0) {
            return Err(Error::new(
                ErrorKind::OutOfRange,
                format!("the section's {name} cannot be computed from these dimensions; check their units"),
            ));
        }
    }
    props.conversions = read.conversions;
    Ok(props)
}

/// A section without a bore to carry contents and without a round outside: the figures as given.
fn solid(area: f64, second_moment: f64, depth: f64, shear_coefficient: f64) -> SectionProps {
    SectionProps {
        area,
        second_moment,
        depth,
        shear_coefficient,
        outer_diameter: None,
        bore_area: 0.0,
        conversions: Vec::new(),
    }
}

fn tube(d_o: f64, t: f64, poisson: f64) -> SectionProps {
    let d_i = d_o - 2.0 * t;
    // D² − d² = 4t(D − t) avoids the cancellation of subtracting two close squares for thin walls.
    let difference_of_squares = 4.0 * t * (d_o - t);
    SectionProps {
        area: PI * difference_of_squares / 4.0,
        second_moment: PI * difference_of_squares * (d_o * d_o + d_i * d_i) / 64.0,
        depth: d_o,
        shear_coefficient: shear::hollow_circle(poisson, d_i / d_o),
        outer_diameter: Some(d_o),
        bore_area: PI * d_i * d_i / 4.0,
        conversions: Vec::new(),
    }
}

fn rectangular_tube(b: f64, h: f64, t: f64, poisson: f64) -> SectionProps {
    let (b_i, h_i) = (b - 2.0 * t, h - 2.0 * t);
    SectionProps {
        // bh − bᵢhᵢ and (bh³ − bᵢhᵢ³)/12 written as sums of positive terms, so that a thin wall
        // on a large box does not lose its area to cancellation.
        area: 2.0 * t * (b + h_i),
        second_moment: (2.0 * t * h.powi(3) + b_i * cube_difference(h, 2.0 * t)) / 12.0,
        depth: h,
        // Cowper's thin-walled formula is written with wall centreline dimensions.
        shear_coefficient: shear::thin_walled_box(poisson, b - t, h - t, t, t),
        outer_diameter: None,
        bore_area: b_i * h_i,
        conversions: Vec::new(),
    }
}

fn i_beam(h: f64, b: f64, t_f: f64, t_w: f64, axis: BendingAxis, poisson: f64) -> SectionProps {
    let h_w = h - 2.0 * t_f;
    let flange_area = 2.0 * b * t_f;
    let area = flange_area + h_w * t_w;
    let (second_moment, depth, shear_coefficient) = match axis {
        // [bh³ − (b − t_w)h_w³]/12 as a sum of positive terms (b ≥ t_w is checked).
        BendingAxis::Strong => (
            (t_w * h.powi(3) + (b - t_w) * cube_difference(h, 2.0 * t_f)) / 12.0,
            h,
            shear::thin_walled_i(poisson, b, h - t_f, t_f, t_w),
        ),
        BendingAxis::Weak => (
            (2.0 * t_f * b.powi(3) + h_w * t_w.powi(3)) / 12.0,
            b,
            shear::i_weak_axis(poisson, flange_area, area),
        ),
    };
    solid(area, second_moment, depth, shear_coefficient)
}

/// h³ − hᵢ³ for 0 < hᵢ = h − gap, without cancellation: gap·(h² + h·hᵢ + hᵢ²), with the gap
/// as given rather than recovered from h − hᵢ.
fn cube_difference(h: f64, gap: f64) -> f64 {
    let h_i = h - gap;
    gap * (h * h + h * h_i + h_i * h_i)
}

/// Reads dimensions with their units, checks their range and keeps the conversions applied.
#[derive(Default)]
struct Reader {
    conversions: Vec<(FieldPath, Conversion)>,
}

impl Reader {
    fn positive(&mut self, quantity: &Quantity, field: &str) -> Result<f64, Error> {
        self.positive_of(quantity, Kind::Length, field)
    }

    /// A dimension in its range: from a nanometre to a thousand kilometres for lengths, and the
    /// squares and fourth powers of those for areas and second moments. Every section property
    /// of dimensions in range is then a finite positive number, so a dimension that would make
    /// one overflow or underflow is named here, with what was typed.
    fn positive_of(&mut self, quantity: &Quantity, kind: Kind, field: &str) -> Result<f64, Error> {
        let value = self.read(quantity, kind, field)?;
        let range = match kind {
            Kind::Area => schema::AREA,
            Kind::SecondMoment => schema::SECOND_MOMENT,
            _ => schema::DIMENSION,
        };
        // Words only for a refused value: the design study reads sections thousands of times a solve.
        if range.contains(value, false) {
            return Ok(value);
        }
        let (what, unit) = (format!("the {}", field.replace('_', " ")), kind.si_unit());
        let Some((error, message)) = range.refuse(value, &what, unit, false) else { return Ok(value) };
        Err(Error::new(error, message).at(field).with_value(quantity).with_si(value, unit))
    }

    fn shear_coefficient(&mut self, quantity: &Quantity) -> Result<f64, Error> {
        let value = self.read(quantity, Kind::Ratio, "shear_coefficient")?;
        if value > 0.0 && value <= 1.0 {
            Ok(value)
        } else {
            let mut message = "the shear coefficient κ must be above 0 and at most 1".to_string();
            if value > 1.0 {
                message.push_str(&format!(" (a value such as {} may be the form factor 1/κ)", number(value)));
            }
            Err(Error::new(ErrorKind::OutOfRange, message).at("shear_coefficient").with_value(quantity))
        }
    }

    fn read(&mut self, quantity: &Quantity, kind: Kind, field: &str) -> Result<f64, Error> {
        units::convert_key(quantity, kind, field, &mut self.conversions)
    }
}
