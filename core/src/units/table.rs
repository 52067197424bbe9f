//! The table of accepted unit symbols, each with its dimension and exact SI factor.
//!
//! Factors are built from the exact definitions of NIST Special Publication 811 (2008), appendix B,
//! so that derived units (psi, slug, lbf·s²/in) inherit exactness instead of carrying rounded
//! constants of their own.

/// Metres in one international inch (NIST SP 811, exact).
pub(crate) const INCH: f64 = 0.0254;
/// Metres in one international foot (NIST SP 811, exact).
pub(crate) const FOOT: f64 = 0.3048;
/// Kilograms in one avoirdupois pound-mass (NIST SP 811, exact).
pub(crate) const POUND: f64 = 0.453_592_37;
/// Standard acceleration of gravity in m/s² (NIST SP 811, exact).
pub(crate) const STANDARD_GRAVITY: f64 = 9.806_65;
/// Newtons in one pound-force, defined as one pound-mass under standard gravity.
pub(crate) const POUND_FORCE: f64 = POUND * STANDARD_GRAVITY;
/// Pascals in one psi (pound-force per square inch).
pub(crate) const PSI: f64 = POUND_FORCE / (INCH * INCH);
/// Kilograms in one slug (lbf·s²/ft).
pub(crate) const SLUG: f64 = POUND_FORCE / FOOT;

/// A physical dimension as integer exponents of mass, length, time and temperature.
///
/// Angles are dimensionless, so a radian changes neither the dimension nor the factor; that lets
/// `N·m/rad` and `N·m` both describe a rotational stiffness.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub(crate) struct Dim {
    pub(crate) mass: i32,
    pub(crate) length: i32,
    pub(crate) time: i32,
    /// Temperature (a difference of temperature: only temperature changes are read).
    pub(crate) temperature: i32,
}

impl Dim {
    pub(crate) const fn new(mass: i32, length: i32, time: i32) -> Self {
        Dim { mass, length, time, temperature: 0 }
    }

    /// This dimension raised to an integer power.
    pub(crate) const fn pow(self, power: i32) -> Self {
        Dim {
            mass: self.mass * power,
            length: self.length * power,
            time: self.time * power,
            temperature: self.temperature * power,
        }
    }

    /// The product of two dimensions.
    pub(crate) const fn times(self, other: Dim) -> Self {
        Dim {
            mass: self.mass + other.mass,
            length: self.length + other.length,
            time: self.time + other.time,
            temperature: self.temperature + other.temperature,
        }
    }
}

pub(crate) const NONE: Dim = Dim::new(0, 0, 0);
pub(crate) const LENGTH: Dim = Dim::new(0, 1, 0);
pub(crate) const MASS: Dim = Dim::new(1, 0, 0);
pub(crate) const TIME: Dim = Dim::new(0, 0, 1);
pub(crate) const FORCE: Dim = Dim::new(1, 1, -2);
pub(crate) const PRESSURE: Dim = Dim::new(1, -1, -2);
pub(crate) const PER_TIME: Dim = Dim::new(0, 0, -1);
/// A change of temperature (kelvin).
pub(crate) const TEMPERATURE: Dim = Dim { mass: 0, length: 0, time: 0, temperature: 1 };
/// Kelvins in one degree Fahrenheit of temperature change (NIST SP 811, exact).
pub(crate) const FAHRENHEIT_DEGREE: f64 = 5.0 / 9.0;

/// What a unit is beyond its dimension, where that changes how it may be used.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Class {
    /// An ordinary unit that combines freely.
    Plain,
    /// The radian: dimensionless, but it marks an angular frequency in a frequency field.
    Angle,
    /// A cycle-based frequency (Hz, rpm): valid only alone in a frequency field, factor in Hz.
    Cycle,
    /// Pound-mass, which users often confuse with pound-force.
    PoundMass,
    /// Pound-force, which users often confuse with pound-mass.
    PoundForce,
}

/// One accepted unit.
#[derive(Debug)]
pub(crate) struct Unit {
    /// Accepted spellings; the first is the canonical one.
    pub(crate) symbols: &'static [&'static str],
    pub(crate) name: &'static str,
    pub(crate) dim: Dim,
    /// SI value of one of this unit (Hz for cycle units).
    pub(crate) factor: f64,
    pub(crate) class: Class,
}

const fn plain(symbols: &'static [&'static str], name: &'static str, dim: Dim, factor: f64) -> Unit {
    Unit { symbols, name, dim, factor, class: Class::Plain }
}

const fn special(
    symbols: &'static [&'static str],
    name: &'static str,
    dim: Dim,
    factor: f64,
    class: Class,
) -> Unit {
    Unit { symbols, name, dim, factor, class }
}

/// Every accepted unit. Prefixed forms are listed one by one rather than generated, because a
/// general prefix rule would quietly accept look-alikes such as `mPa` (millipascal) for `MPa`.
pub(crate) static UNITS: &[Unit] = &[
    plain(&["m"], "metre", LENGTH, 1.0),
    plain(&["cm"], "centimetre", LENGTH, 1e-2),
    plain(&["mm"], "millimetre", LENGTH, 1e-3),
    plain(&["µm", "μm", "um"], "micrometre", LENGTH, 1e-6),
    // The marks `"` and `'` (and the curly and prime forms a tablet's keyboard puts in their
    // place) are the common shorthand for inches and feet, as in 4.5" or 24'.
    plain(&["in", "inch", "inches", "\"", "\u{201d}", "\u{2033}"], "inch", LENGTH, INCH),
    plain(&["ft", "foot", "feet", "'", "\u{2019}", "\u{2032}"], "foot", LENGTH, FOOT),
    plain(&["kg"], "kilogram", MASS, 1.0),
    plain(&["g"], "gram", MASS, 1e-3),
    plain(&["t"], "tonne", MASS, 1e3),
    special(&["lb", "lbm"], "pound-mass", MASS, POUND, Class::PoundMass),
    plain(&["slug"], "slug (lbf·s²/ft)", MASS, SLUG),
    plain(&["pcf"], "pound per cubic foot", Dim::new(1, -3, 0), POUND / (FOOT * FOOT * FOOT)),
    plain(&["N"], "newton", FORCE, 1.0),
    plain(&["kN"], "kilonewton", FORCE, 1e3),
    plain(&["MN"], "meganewton", FORCE, 1e6),
    special(&["lbf"], "pound-force", FORCE, POUND_FORCE, Class::PoundForce),
    plain(&["kip"], "kip (1000 lbf)", FORCE, 1e3 * POUND_FORCE),
    plain(&["Pa"], "pascal", PRESSURE, 1.0),
    plain(&["kPa"], "kilopascal", PRESSURE, 1e3),
    plain(&["MPa"], "megapascal", PRESSURE, 1e6),
    plain(&["GPa"], "gigapascal", PRESSURE, 1e9),
    plain(&["psi"], "pound-force per square inch", PRESSURE, PSI),
    plain(&["ksi"], "kilo-psi", PRESSURE, 1e3 * PSI),
    plain(&["Msi"], "mega-psi", PRESSURE, 1e6 * PSI),
    plain(&["s"], "second", TIME, 1.0),
    special(&["rad"], "radian", NONE, 1.0, Class::Angle),
    special(&["Hz"], "hertz", PER_TIME, 1.0, Class::Cycle),
    special(&["kHz"], "kilohertz", PER_TIME, 1e3, Class::Cycle),
    special(&["rpm"], "revolutions per minute", PER_TIME, 1.0 / 60.0, Class::Cycle),
    special(&["cpm"], "cycles per minute", PER_TIME, 1.0 / 60.0, Class::Cycle),
    // Temperature changes only: a change of 1 °C is a change of 1 K, whatever the scale's zero.
    plain(&["K"], "kelvin (temperature change)", TEMPERATURE, 1.0),
    plain(&["°C", "degC"], "degree Celsius (temperature change)", TEMPERATURE, 1.0),
    plain(&["°F", "degF"], "degree Fahrenheit (temperature change)", TEMPERATURE, FAHRENHEIT_DEGREE),
];

/// The unit with this spelling, and the spelling as stored in the table. Spellings are
/// case-sensitive (`mPa` is not `MPa`), except for the cycle units: `RPM`, `Rpm` and `hz` can mean
/// nothing else, and are commonly written so.
pub(crate) fn lookup(symbol: &str) -> Option<(&'static Unit, &'static str)> {
    let exact = UNITS.iter().find_map(|unit| unit.symbols.iter().find(|s| **s == symbol).map(|s| (unit, *s)));
    exact.or_else(|| {
        UNITS
            .iter()
            .filter(|unit| unit.class == Class::Cycle)
            .find_map(|unit| unit.symbols.iter().find(|s| s.eq_ignore_ascii_case(symbol)).map(|s| (unit, *s)))
    })
}

/// Whether `c` is a unit written as a mark rather than letters: the inch and foot marks.
pub(crate) fn is_mark(c: char) -> bool {
    matches!(c, '"' | '\u{201d}' | '\u{2033}' | '\'' | '\u{2019}' | '\u{2032}')
}

/// Up to four known symbols that look like `symbol`, closest first, for an "unknown unit" hint.
pub(crate) fn similar(symbol: &str) -> Vec<&'static str> {
    // ASCII folding is enough for unit symbols, and keeps Unicode case tables out of the build.
    let lower = symbol.to_ascii_lowercase();
    let mut scored: Vec<(usize, &'static str)> = UNITS
        .iter()
        .flat_map(|unit| unit.symbols.iter().take(1))
        .filter_map(|candidate| {
            let distance = edit_distance(&lower, &candidate.to_ascii_lowercase());
            // A distance as long as both words would suggest every short symbol for any typo.
            let longest = lower.chars().count().max(candidate.chars().count());
            (distance <= 2 && distance < longest).then_some((distance, *candidate))
        })
        .collect();
    // Few candidates: a plain minimum-first pass keeps the general sort out of the build.
    for i in 1..scored.len() {
        let mut j = i;
        while j > 0 && scored[j - 1].0 > scored[j].0 {
            scored.swap(j - 1, j);
            j -= 1;
        }
    }
    scored.into_iter().take(4).map(|(_, s)| s).collect()
}

/// Levenshtein distance over characters; the inputs are short unit symbols.
fn edit_distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut previous: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.chars().enumerate() {
        let mut current = vec![i + 1];
        for (j, cb) in b.iter().enumerate() {
            let substitution = previous[j] + usize::from(ca != *cb);
            current.push(substitution.min(previous[j + 1] + 1).min(current[j] + 1));
        }
        previous = current;
    }
    previous[b.len()]
}
