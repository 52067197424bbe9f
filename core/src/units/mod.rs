//! Reading quantities with units ("27.2 in", "0.283 lb/in³") into SI, and writing SI values back
//! in a chosen unit system.
//!
//! # Why our own table
//! The crates we could use either check units at compile time (which cannot read a unit typed
//! into a scenario at run time) or parse unit strings without the dimension checks and the
//! pound-mass / pound-force distinction this engine depends on. The set of units a beam scenario
//! needs is small, so the crate keeps its own table ([`unit_list`]) with exact factors from
//! NIST SP 811, and a small grammar, both covered by tests against those definitions.
//!
//! # Conventions
//! - A plain JSON number is already SI. A string without a unit (`"2.5"`) is SI too. (The
//!   calculator's editor never stores one: a number typed there without a unit takes the unit
//!   its field shows, [`bare_unit`], written out with [`with_unit`].)
//! - `lb` (and `lbm`) is always pound-mass; pound-force is `lbf`. A density in `lb/in³` is
//!   therefore converted as a mass density, never as lbf·s²/in⁴.
//! - Frequencies are stored in hertz. A frequency field accepts Hz, kHz, rpm, cpm (cycles per
//!   minute) and rad/s; the cycle units are accepted nowhere else.
//! - Angles are dimensionless: `N·m/rad` and `N·m` are both rotational stiffnesses.
//! - Every conversion applied to a written unit is returned as a [`Conversion`] so that the user
//!   can see it, its SI value written to one digit more than the number typed carried.

mod display;
mod field;
mod kind;
mod list;
mod number;
mod parse;
pub(crate) mod table;

#[cfg(test)]
mod tests;
#[cfg(test)]
mod tests_display;

pub use display::{display_unit, format, significant, DisplayUnit, UnitSystem};
pub use field::{bare_unit, carried_digits, is_bare_number, with_unit};
pub use kind::Kind;
pub use list::{unit_list, UnitInfo};
pub use number::decimal;

use crate::error::{Error, ErrorKind};
use crate::path::FieldPath;
use parse::Factor;
use table::{Class, Dim};

/// A value as written in a scenario: a plain number (already SI) or text with a unit, "27.2 in".
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
#[serde(untagged)]
pub enum Quantity {
    /// A number in SI units (hertz for frequencies).
    Number(f64),
    /// A number with an optional unit, as in "27.2 in"; without a unit it is SI.
    Text(String),
}

impl std::fmt::Display for Quantity {
    /// Writes the value as the user gave it: "27.2 in", or the bare SI number (`1e308`, not 309
    /// digits); long text is cut.
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Quantity::Number(value) => f.write_str(&crate::error::as_typed(*value)),
            Quantity::Text(text) => f.write_str(&crate::error::echo(text)),
        }
    }
}

impl Quantity {
    /// Whether a unit was written: a plain number, or a text that is a number alone, is read as
    /// SI, which a message should then say.
    pub fn has_unit(&self) -> bool {
        match self {
            Quantity::Number(_) => false,
            Quantity::Text(text) => parse::parse_text(text).map_or(true, |p| !p.factors.is_empty()),
        }
    }
}

impl<'de> serde::Deserialize<'de> for Quantity {
    /// Accepts a JSON number or string, with a message that says so for anything else (an
    /// untagged derive would only say that no variant matched).
    fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        struct Visitor;
        impl serde::de::Visitor<'_> for Visitor {
            type Value = Quantity;
            fn expecting(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
                f.write_str("a number (SI) or a text with a unit, like \"27.2 in\"")
            }
            fn visit_f64<E>(self, v: f64) -> Result<Quantity, E> {
                Ok(Quantity::Number(v))
            }
            fn visit_i64<E>(self, v: i64) -> Result<Quantity, E> {
                Ok(Quantity::Number(v as f64))
            }
            fn visit_u64<E>(self, v: u64) -> Result<Quantity, E> {
                Ok(Quantity::Number(v as f64))
            }
            fn visit_str<E>(self, v: &str) -> Result<Quantity, E> {
                Ok(Quantity::Text(v.to_string()))
            }
        }
        deserializer.deserialize_any(Visitor)
    }
}

impl From<f64> for Quantity {
    fn from(value: f64) -> Self {
        Quantity::Number(value)
    }
}

impl From<&str> for Quantity {
    fn from(text: &str) -> Self {
        Quantity::Text(text.to_string())
    }
}

/// A value converted to SI, with the record of the conversion when a unit was converted.
#[derive(Clone, Debug, PartialEq)]
pub struct Converted {
    /// The value in SI units (hertz for frequencies).
    pub si: f64,
    /// What was converted, or `None` when the value was already SI.
    pub conversion: Option<Conversion>,
}

/// A record of one conversion applied, for display: "0.283 lb/in³ = 7833.4 kg/m³".
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Conversion {
    /// The value as written, tidied: "0.283 lb/in³".
    pub written: String,
    /// The SI value.
    pub si: f64,
    /// The SI unit of `si`, for example "kg/m³".
    pub si_unit: String,
    /// The whole conversion in words, "0.283 lb/in³ = 7833 kg/m³": the SI value to one digit more
    /// than the number typed carried ([`carried_digits`]), and at least three.
    pub text: String,
}

/// Converts a scenario value to SI for a field of the given kind.
///
/// A [`Quantity::Number`] is taken as SI and produces no conversion record; it must be finite.
/// Errors carry the offending value but no path: the caller adds the field path with
/// [`Error::at`].
///
/// Not inlined, nor is [`convert_field`]: the readers call them at dozens of places, and the
/// solver's engine builds the core for speed, which would copy them into each.
#[inline(never)]
pub fn convert(quantity: &Quantity, kind: Kind) -> Result<Converted, Error> {
    match quantity {
        Quantity::Number(value) if value.is_finite() => Ok(Converted { si: *value, conversion: None }),
        Quantity::Number(value) => {
            Err(Error::new(ErrorKind::NotFinite, "the value must be a finite number").with_number(*value))
        }
        Quantity::Text(text) => parse(text, kind),
    }
}

/// [`convert`] for the value written in `field`: an error names the field, and a conversion
/// applied is recorded in `conversions` with the field's name.
#[inline(never)]
pub fn convert_field(
    quantity: &Quantity,
    kind: Kind,
    field: &FieldPath,
    conversions: &mut Vec<(FieldPath, Conversion)>,
) -> Result<f64, Error> {
    let converted = convert(quantity, kind).map_err(|e| e.at(field))?;
    conversions.extend(converted.conversion.map(|c| (field.clone(), c)));
    Ok(converted.si)
}

/// [`convert_field`] for a field named by its key ("wall"), its path made only for an error or
/// a conversion recorded: the section and material readers read every field of every trial.
#[inline(never)]
pub fn convert_key(
    quantity: &Quantity,
    kind: Kind,
    key: &str,
    conversions: &mut Vec<(FieldPath, Conversion)>,
) -> Result<f64, Error> {
    let converted = convert(quantity, kind).map_err(|e| e.at(key))?;
    conversions.extend(converted.conversion.map(|c| (FieldPath::from(key), c)));
    Ok(converted.si)
}

/// Reads a quantity string such as "27.2 in" for a field of the given kind and converts it to SI.
///
/// The same few texts are read again and again (the design study reads the scenario some forty
/// times on every edit, and writing each conversion's record in words is most of the cost of
/// reading one), so the last texts read without error are remembered, with what they gave.
pub fn parse(text: &str, kind: Kind) -> Result<Converted, Error> {
    READ.with(|read| {
        let mut read = read.borrow_mut();
        let at = match read.iter().position(|(k, t, _)| *k == kind && t == text) {
            Some(at) => at,
            None => {
                let converted = parse_afresh(text, kind)?;
                if read.len() >= REMEMBERED {
                    read.clear();
                }
                read.push((kind, text.to_string(), converted));
                read.len() - 1
            }
        };
        Ok(read[at].2.clone())
    })
}

/// How many texts [`parse`] remembers: more than a large scenario writes with units. A list,
/// not a map: it is looked through in well under a microsecond, and a hash map would add its
/// hashing code to the engines.
const REMEMBERED: usize = 128;

thread_local! {
    /// The texts [`parse`] read last, by kind, with what each gave.
    static READ: std::cell::RefCell<Vec<(Kind, String, Converted)>> = const { std::cell::RefCell::new(Vec::new()) };
}

fn parse_afresh(text: &str, kind: Kind) -> Result<Converted, Error> {
    let shown = crate::error::echo(text);
    let parsed = parse::parse_text(text).map_err(|mut e| {
        if e.kind == ErrorKind::UnknownUnit {
            let examples = display::examples(kind).join(", ");
            let described = kind.describe();
            let mut sentence = described.chars();
            let capital: String = sentence
                .next()
                .map(|c| c.to_ascii_uppercase().to_string() + sentence.as_str())
                .unwrap_or_default();
            let separator = if e.message.ends_with('?') { " " } else { ". " };
            // A ratio has no unit to list: an empty list would leave the sentence unfinished.
            // Its reader takes no percentage either (the margin's own reader does, and says so).
            let written = if examples.is_empty() {
                format!("written as a plain number, as in {}", display::example(kind))
            } else {
                format!("written in units like {examples}")
            };
            e.message = format!("{}{separator}{capital} is {written}", e.message);
        }
        // The example is of the field's own kind, and a value such a field accepts: "27.2 Hz" for a
        // frequency, not a length, and "200 GPa" for a modulus, not "27.2 Pa".
        e.message = e.message.replace("\"27.2 in\"", &format!("\"{}\"", display::example(kind)));
        e.with_value(&shown)
    })?;
    if parsed.factors.is_empty() {
        return Ok(Converted { si: parsed.number, conversion: None });
    }
    let factor = unit_factor(&parsed.factors, kind, &shown).map_err(|e| e.with_value(&shown))?;
    let si = parsed.number * factor;
    if !si.is_finite() {
        return Err(Error::new(
            ErrorKind::NotFinite,
            format!("{shown} is too large to compute with in SI units (the largest is about 1e308)"),
        )
        .with_value(&shown));
    }
    let conversion = (factor != 1.0).then(|| {
        let written = format!("{} {}", parsed.number_text, pretty_unit(&parsed.factors));
        let si_unit = kind.si_unit();
        let digits = field::carried_digits(parsed.number_text) + 1;
        let shown = display::significant(si, digits.max(3));
        let text = format!("{written} = {shown} {si_unit}").trim_end().to_string();
        Conversion { written, si, si_unit: si_unit.to_string(), text }
    });
    Ok(Converted { si, conversion })
}

/// The SI value of one of the written unit, checked against the field's kind.
fn unit_factor(factors: &[Factor], kind: Kind, shown: &str) -> Result<f64, Error> {
    let mut dim = table::NONE;
    let mut factor = 1.0;
    let mut angle_power = 0;
    let mut pound_mass_power = 0;
    let mut pound_force_power = 0;
    for f in factors {
        dim = dim.times(f.unit.dim.pow(f.power));
        factor *= f.unit.factor.powi(f.power);
        match f.unit.class {
            Class::Angle => angle_power += f.power,
            Class::PoundMass => pound_mass_power += f.power,
            Class::PoundForce => pound_force_power += f.power,
            Class::Cycle => return cycle_unit(factors, f, kind, shown),
            Class::Plain => {}
        }
    }
    if kind == Kind::Frequency {
        if dim == table::PER_TIME && angle_power == 1 {
            // An angular frequency in rad/s; the field stores cycles per second.
            return Ok(factor / std::f64::consts::TAU);
        }
        let mut message = format!("expected a frequency, got {} ({shown})", kind::describe_dim(dim));
        if dim == table::PER_TIME {
            message = format!(
                "a frequency needs a unit that says what is counted: write Hz, kHz, rpm, cpm or rad/s, \
                 not {shown}"
            );
        }
        return Err(Error::new(ErrorKind::WrongDimension, message));
    }
    if dim == kind.dim() {
        return Ok(factor);
    }
    let mut message = format!("expected {}, got {} ({shown})", kind.describe(), kind::describe_dim(dim));
    // Reading every lb as lbf (or the reverse) would make the dimension fit: say which was meant.
    let force_per_mass = Dim::new(0, 1, -2);
    if pound_mass_power != 0 && dim.times(force_per_mass.pow(pound_mass_power)) == kind.dim() {
        message.push_str("; lb is pound-mass: write lbf for pound-force");
    } else if pound_force_power != 0 && dim.times(force_per_mass.pow(-pound_force_power)) == kind.dim() {
        message.push_str("; lbf is pound-force: write lb for pound-mass");
    }
    Err(Error::new(ErrorKind::WrongDimension, message))
}

/// Cycle units (Hz, rpm) are only valid alone and only in a frequency field.
fn cycle_unit(factors: &[Factor], cycle: &Factor, kind: Kind, shown: &str) -> Result<f64, Error> {
    if kind != Kind::Frequency {
        return Err(Error::new(
            ErrorKind::WrongDimension,
            format!(
                "expected {}, got a frequency ({shown}); {} is accepted only in frequency fields",
                kind.describe(),
                cycle.symbol
            ),
        ));
    }
    if factors.len() != 1 || cycle.power != 1 {
        return Err(Error::new(
            ErrorKind::WrongDimension,
            format!(
                "write {} on its own, not {shown}: a frequency is Hz, kHz, rpm, cpm or rad/s",
                cycle.symbol
            ),
        ));
    }
    Ok(cycle.unit.factor)
}

/// The unit expression written tidily: `lb/in^3` becomes `lb/in³`, `N*m` becomes `N·m`.
fn pretty_unit(factors: &[Factor]) -> String {
    let power = |f: &Factor| {
        let superscript = match f.power.abs() {
            1 => "",
            2 => "²",
            3 => "³",
            _ => "⁴",
        };
        // The unit's usual symbol, whichever spelling was typed: 4.5" is written 4.5 in.
        format!("{}{superscript}", f.unit.symbols[0])
    };
    let numerator: Vec<String> = factors.iter().filter(|f| f.power > 0).map(power).collect();
    let denominator: String =
        factors.iter().filter(|f| f.power < 0).map(|f| format!("/{}", power(f))).collect();
    format!("{}{denominator}", numerator.join("·"))
}
