//! The grammar of a quantity string: a number, then an optional unit expression.
//!
//! ```text
//! quantity   = number [ws] [units]
//! number     = [+-] digits [. digits] [(e|E) [+-] digits]     (or . digits)
//! units      = ["/" [ws]] factor { [ws] ("*" | "·" | "⋅") [ws] factor } { [ws] "/" [ws] factor }
//! factor     = symbol [ ["^"] (1|2|3|4) | "¹" | "²" | "³" | "⁴" ]
//! symbol     = letters | '"' | "'"                       (the inch and foot marks, and their
//!                                                          curly and prime forms)
//! ```
//!
//! A space between two units is rejected rather than read as a product, because `N m` next to
//! `N/m` is too easy to misread. Everything after the first `/` is a denominator, and a `*` after a
//! `/` is rejected as ambiguous (`kg/m*s`): each denominator unit takes its own `/` (`kg/m/s`).
//! This module checks only the grammar; dimensions are checked by the caller.

use super::table::{self, Unit};
use crate::error::{Error, ErrorKind};

/// At most this many units in one expression; real ones need three or four.
const MAX_FACTORS: usize = 8;

/// One unit of an expression with its signed power (negative in the denominator).
#[derive(Clone, Copy, Debug)]
pub(crate) struct Factor {
    pub(crate) unit: &'static Unit,
    /// The spelling that was written, as stored in the table.
    pub(crate) symbol: &'static str,
    pub(crate) power: i32,
}

/// A quantity string split into its finite number and its unit factors (empty for a bare number).
#[derive(Clone, Debug)]
pub(crate) struct Parsed<'a> {
    pub(crate) number: f64,
    pub(crate) number_text: &'a str,
    pub(crate) factors: Vec<Factor>,
}

fn syntax(message: impl Into<String>) -> Error {
    Error::new(ErrorKind::Syntax, message)
}

/// Splits `text` into a number and unit factors, or says what is wrong with its form.
pub(crate) fn parse_text(text: &str) -> Result<Parsed<'_>, Error> {
    let s = text.trim();
    if s.is_empty() {
        return Err(syntax("the value is empty: write a number, optionally with a unit, as in \"27.2 in\""));
    }
    let length = scan_number(s);
    if length == 0 {
        return Err(missing_number(s));
    }
    let number_text = &s[..length];
    let number = super::number::decimal(number_text)
        .ok_or_else(|| syntax(format!("\"{number_text}\" is not a number that can be read")))?;
    if !number.is_finite() {
        return Err(Error::new(
            ErrorKind::NotFinite,
            format!(
                "the number {} is too large to compute with (the largest is about 1e308)",
                crate::error::echo(number_text)
            ),
        ));
    }
    // A decimal comma ("1,5 kg") or a thousands separator ("1,500 mm") is neither read nor
    // guessed at: which of the two was meant cannot be told from the text.
    let after = &s[length..];
    if after.strip_prefix(',').is_some_and(|t| t.starts_with(|c: char| c.is_ascii_digit())) {
        return Err(syntax(
            "a comma cannot be read in a number: write decimals with a point, as in 1.5, and thousands \
             with no separator, as in 1500",
        ));
    }
    let rest = after.trim_start();
    // "1 500 mm" (a space between thousands) or "2 1/2 in" (a whole and a fraction).
    if rest.len() < after.len() && rest.starts_with(|c: char| c.is_ascii_digit()) {
        return Err(syntax(
            "a number cannot be read in parts: write it whole, with no space inside, as in 1500 or 2.5",
        ));
    }
    let factors = if rest.is_empty() { Vec::new() } else { parse_units(rest)? };
    Ok(Parsed { number, number_text, factors })
}

/// The length in bytes of the number at the start of `s`, or 0 when there is none.
fn scan_number(s: &str) -> usize {
    let b = s.as_bytes();
    let digits_from = |mut i: usize| {
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        i
    };
    let mut i = 0;
    if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
        i += 1;
    }
    let integer_end = digits_from(i);
    let mut digits = integer_end - i;
    i = integer_end;
    if i < b.len() && b[i] == b'.' {
        let fraction_end = digits_from(i + 1);
        digits += fraction_end - (i + 1);
        i = fraction_end;
    }
    if digits == 0 {
        return 0;
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        let mut j = i + 1;
        if j < b.len() && (b[j] == b'+' || b[j] == b'-') {
            j += 1;
        }
        let exponent_end = digits_from(j);
        // Only digits make an exponent; otherwise the `e` is left for the unit parser to reject.
        if exponent_end > j {
            i = exponent_end;
        }
    }
    i
}

fn missing_number(s: &str) -> Error {
    let unsigned = s.trim_start_matches(['+', '-']).to_ascii_lowercase();
    if unsigned.starts_with("nan") || unsigned.starts_with("inf") {
        return Error::new(
            ErrorKind::NotFinite,
            "the value must be a finite number with an optional unit, as in \"27.2 in\"",
        );
    }
    // "in" alone is a unit without its number; "abc" is no unit, and is told what a value is.
    match s.chars().next() {
        Some(c) if is_letter(c) && parse_units(s.trim_end()).is_ok() => {
            syntax("the number is missing: write it before the unit, as in \"27.2 in\"")
        }
        _ => syntax("the value must start with a number, as in \"27.2 in\""),
    }
}

/// A letter of a unit symbol: ASCII letters and the micro sign (both code points for it). Unit
/// symbols need no more, and the full Unicode tables would weigh on the browser build.
fn is_letter(c: char) -> bool {
    c.is_ascii_alphabetic() || matches!(c, 'µ' | 'μ' | '°')
}

/// Spaces that may separate a number and its unit: ASCII blanks and the no-break spaces that word
/// processors put there.
fn is_space(c: char) -> bool {
    c.is_ascii_whitespace() || matches!(c, '\u{a0}' | '\u{202f}' | '\u{2009}')
}

/// Parses the unit expression that follows the number.
fn parse_units(s: &str) -> Result<Vec<Factor>, Error> {
    let mut chars = s.chars().peekable();
    let mut factors = Vec::new();
    // A leading '/' is a unit of one over something: "12e-6 /K", a coefficient per degree.
    let mut in_denominator = chars.next_if_eq(&'/').is_some();
    while chars.next_if(|c| is_space(*c)).is_some() {}
    loop {
        let symbol: String = match chars.peek() {
            Some(c) if table::is_mark(*c) => chars.next().map(String::from).unwrap_or_default(),
            _ => std::iter::from_fn(|| chars.next_if(|c| is_letter(*c))).collect(),
        };
        if symbol.is_empty() {
            return Err(match chars.peek() {
                Some(c) => syntax(format!("expected a unit symbol where '{c}' stands")),
                None => syntax("expected a unit symbol at the end"),
            });
        }
        let (unit, spelled) = table::lookup(&symbol).ok_or_else(|| unknown_unit(&symbol))?;
        // A digit after a foot or inch mark starts a second length (4'6"), not a power.
        if symbol.chars().all(table::is_mark) {
            if let Some(c) = chars.peek().filter(|c| c.is_ascii_digit()) {
                return Err(two_lengths(unit.symbols[0], *c));
            }
        }
        let power = parse_power(&mut chars, spelled)?;
        factors.push(Factor { unit, symbol: spelled, power: if in_denominator { -power } else { power } });
        if factors.len() > MAX_FACTORS {
            return Err(syntax(format!("the unit has more than {MAX_FACTORS} parts")));
        }

        let mut spaced = false;
        while chars.next_if(|c| is_space(*c)).is_some() {
            spaced = true;
        }
        match chars.next() {
            None => return Ok(factors),
            Some('*' | '·' | '⋅') if in_denominator => {
                return Err(syntax(
                    "'*' after '/' is ambiguous: give each unit of the denominator its own '/', \
                     as in kg/m/s",
                ));
            }
            Some('*' | '·' | '⋅') => {}
            Some('/') => in_denominator = true,
            Some(c) if spaced && c.is_ascii_digit() && unit.dim == table::LENGTH => {
                return Err(two_lengths(unit.symbols[0], c));
            }
            Some(c) if spaced && is_letter(c) => {
                return Err(syntax(format!(
                    "a space between units is not a product: write {spelled}*{c}… or {spelled}·{c}…"
                )));
            }
            // Named by its symbol: after an inch mark, "the unit \"" would read as a stray quote.
            Some(c) => return Err(syntax(format!("unexpected '{c}' after the unit {}", unit.symbols[0]))),
        }
        while chars.next_if(|c| is_space(*c)).is_some() {}
    }
}

/// A length written in two units, as feet then inches; the first is named by its symbol, a mark
/// (4'6") being no clearer in the message than the value typed.
fn two_lengths(symbol: &str, next: char) -> Error {
    syntax(format!("write a length in one unit, as 5.5 ft or 66 in, not two ({symbol} then {next}…)"))
}

/// Reads an optional exponent after a unit symbol: `^2`, `2` or a superscript digit.
fn parse_power(chars: &mut std::iter::Peekable<std::str::Chars<'_>>, symbol: &str) -> Result<i32, Error> {
    let bad_power = || {
        syntax(format!(
            "the power of {symbol} must be 1, 2, 3 or 4 (as in {symbol}^2 or {symbol}²); \
             divide with '/' instead of a negative power"
        ))
    };
    let power = match chars.peek().copied() {
        Some('^') => {
            chars.next();
            match chars.next().and_then(|c| c.to_digit(10)) {
                Some(d @ 1..=4) => d as i32,
                _ => return Err(bad_power()),
            }
        }
        // A digit straight after the symbol is a power too, as commonly written: lb/ft3, m2.
        Some(c @ '1'..='4') => {
            chars.next();
            c as i32 - '0' as i32
        }
        Some(c @ ('¹' | '²' | '³' | '⁴')) => {
            chars.next();
            match c {
                '¹' => 1,
                '²' => 2,
                '³' => 3,
                _ => 4,
            }
        }
        Some('⁰' | '⁵'..='⁹' | '⁻') => return Err(bad_power()),
        Some('0' | '5'..='9') => return Err(bad_power()),
        _ => return Ok(1),
    };
    // A second digit (`m^22`, `m²³`) would be a power above 4.
    if chars.peek().is_some_and(|c| c.is_ascii_digit() || "⁰¹²³⁴⁵⁶⁷⁸⁹".contains(*c)) {
        return Err(bad_power());
    }
    Ok(power)
}

fn unknown_unit(symbol: &str) -> Error {
    // "lbs" is common in writing but ambiguous between mass and force, which this engine must not
    // guess.
    if symbol == "lbs" {
        return Error::new(
            ErrorKind::UnknownUnit,
            "unknown unit \"lbs\": write lb for pound-mass or lbf for pound-force",
        );
    }
    // Very long words are not unit symbols; do not spend time comparing them with the table.
    let shown: String = symbol.chars().take(24).collect();
    let similar = if symbol.chars().count() <= 12 { table::similar(symbol) } else { Vec::new() };
    let mut message = format!("unknown unit \"{shown}\"");
    if !similar.is_empty() {
        message.push_str(&format!("; did you mean {}?", similar.join(" or ")));
    }
    Error::new(ErrorKind::UnknownUnit, message)
}
