//! Standard pipe sizes: outside diameter and wall thickness by nominal size and schedule, for
//! welded and seamless wrought steel pipe.
//!
//! Values are those of ASME B36.10M, *Welded and Seamless Wrought Steel Pipe*, in inches, as
//! recalled (from memory; check against the standard before relying on a value). The sizes are the
//! ones met on a plant, ½ in to 24 in. A schedule that the standard does not define for a size is
//! absent rather than guessed. STD, XS and XXS are the standard, extra-strong and
//! double-extra-strong weights; for sizes up to 10 in STD equals schedule 40, and up to 8 in XS
//! equals schedule 80.

use crate::error::{echo, Error, ErrorKind, Result};

/// One nominal size: its name, outside diameter (in) and the walls (in) of the schedules in
/// [`SCHEDULES`] order, `None` where not defined.
struct Size {
    nominal: &'static str,
    outside: f64,
    walls: [Option<f64>; 7],
}

/// The schedules, in the order each size lists its walls.
pub const SCHEDULES: [&str; 7] = ["10", "40", "80", "160", "STD", "XS", "XXS"];

const fn size(nominal: &'static str, outside: f64, walls: [Option<f64>; 7]) -> Size {
    Size { nominal, outside, walls }
}

const N: Option<f64> = None;

/// ASME B36.10M (from memory): schedules 10, 40, 80, 160, STD, XS, XXS. (0.318 in is a wall,
/// not an approximation of 1/π.)
#[allow(clippy::approx_constant)]
static SIZES: [Size; 21] = [
    size(
        "1/2",
        0.840,
        [Some(0.083), Some(0.109), Some(0.147), Some(0.188), Some(0.109), Some(0.147), Some(0.294)],
    ),
    size(
        "3/4",
        1.050,
        [Some(0.083), Some(0.113), Some(0.154), Some(0.219), Some(0.113), Some(0.154), Some(0.308)],
    ),
    size(
        "1",
        1.315,
        [Some(0.109), Some(0.133), Some(0.179), Some(0.250), Some(0.133), Some(0.179), Some(0.358)],
    ),
    size(
        "1-1/4",
        1.660,
        [Some(0.109), Some(0.140), Some(0.191), Some(0.250), Some(0.140), Some(0.191), Some(0.382)],
    ),
    size(
        "1-1/2",
        1.900,
        [Some(0.109), Some(0.145), Some(0.200), Some(0.281), Some(0.145), Some(0.200), Some(0.400)],
    ),
    size(
        "2",
        2.375,
        [Some(0.109), Some(0.154), Some(0.218), Some(0.344), Some(0.154), Some(0.218), Some(0.436)],
    ),
    size(
        "2-1/2",
        2.875,
        [Some(0.120), Some(0.203), Some(0.276), Some(0.375), Some(0.203), Some(0.276), Some(0.552)],
    ),
    size(
        "3",
        3.500,
        [Some(0.120), Some(0.216), Some(0.300), Some(0.438), Some(0.216), Some(0.300), Some(0.600)],
    ),
    size("3-1/2", 4.000, [Some(0.120), Some(0.226), Some(0.318), N, Some(0.226), Some(0.318), N]),
    size(
        "4",
        4.500,
        [Some(0.120), Some(0.237), Some(0.337), Some(0.531), Some(0.237), Some(0.337), Some(0.674)],
    ),
    size(
        "5",
        5.563,
        [Some(0.134), Some(0.258), Some(0.375), Some(0.625), Some(0.258), Some(0.375), Some(0.750)],
    ),
    size(
        "6",
        6.625,
        [Some(0.134), Some(0.280), Some(0.432), Some(0.719), Some(0.280), Some(0.432), Some(0.864)],
    ),
    size(
        "8",
        8.625,
        [Some(0.148), Some(0.322), Some(0.500), Some(0.906), Some(0.322), Some(0.500), Some(0.875)],
    ),
    size(
        "10",
        10.750,
        [Some(0.165), Some(0.365), Some(0.594), Some(1.125), Some(0.365), Some(0.500), Some(1.000)],
    ),
    size(
        "12",
        12.750,
        [Some(0.180), Some(0.406), Some(0.688), Some(1.312), Some(0.375), Some(0.500), Some(1.000)],
    ),
    size("14", 14.000, [Some(0.250), Some(0.438), Some(0.750), Some(1.406), Some(0.375), Some(0.500), N]),
    size("16", 16.000, [Some(0.250), Some(0.500), Some(0.844), Some(1.594), Some(0.375), Some(0.500), N]),
    size("18", 18.000, [Some(0.250), Some(0.562), Some(0.938), Some(1.781), Some(0.375), Some(0.500), N]),
    size("20", 20.000, [Some(0.250), Some(0.594), Some(1.031), Some(1.969), Some(0.375), Some(0.500), N]),
    // 22 in has no schedule 40 in the standard (from memory).
    size("22", 22.000, [Some(0.250), N, Some(1.125), Some(2.125), Some(0.375), Some(0.500), N]),
    size("24", 24.000, [Some(0.250), Some(0.688), Some(1.219), Some(2.344), Some(0.375), Some(0.500), N]),
];

/// The nominal sizes, smallest first.
pub fn sizes() -> impl Iterator<Item = &'static str> {
    SIZES.iter().map(|s| s.nominal)
}

/// The schedules defined for a nominal size.
pub fn schedules(nominal: &str) -> Vec<&'static str> {
    SIZES
        .iter()
        .find(|s| s.nominal == nominal)
        .map(|s| SCHEDULES.iter().zip(&s.walls).filter(|(_, w)| w.is_some()).map(|(n, _)| *n).collect())
        .unwrap_or_default()
}

/// Outside diameter and wall, m, of a nominal size and schedule. Accepts "4", "4 in", "1-1/2",
/// "1.5" and schedule names in any case ("sch 40", "40", "std").
pub fn dimensions(nominal: &str, schedule: &str) -> Result<(f64, f64)> {
    const INCH: f64 = 0.0254;
    let (outside, wall) = inches(nominal, schedule)?;
    Ok((outside * INCH, wall * INCH))
}

/// Outside diameter and wall in inches, as the table gives them, of a nominal size and schedule
/// read as [`dimensions`] reads them.
pub fn inches(nominal: &str, schedule: &str) -> Result<(f64, f64)> {
    let wanted = normalise_size(nominal);
    let size = SIZES.iter().find(|s| s.nominal == wanted).ok_or_else(|| {
        let known: Vec<&str> = sizes().collect();
        Error::new(
            ErrorKind::UnknownOption,
            format!("no standard pipe size \"{}\"; known sizes: {}", echo(nominal), known.join(", ")),
        )
        .at("nominal_size")
        .with_value(nominal)
    })?;
    let name = schedule.trim().to_ascii_uppercase();
    let name = name.trim_start_matches("SCH").trim_start_matches("EDULE").trim();
    let index = SCHEDULES.iter().position(|s| *s == name);
    let wall = index.and_then(|i| size.walls[i]).ok_or_else(|| {
        Error::new(
            ErrorKind::UnknownOption,
            format!(
                "schedule \"{}\" is not defined for {} in pipe; defined: {}",
                echo(schedule),
                size.nominal,
                schedules(size.nominal).join(", ")
            ),
        )
        .at("schedule")
        .with_value(schedule)
    })?;
    Ok((size.outside, wall))
}

/// "1.5", "1 1/2", "1-1/2 in", "4\"" → the table's names.
fn normalise_size(text: &str) -> String {
    let t = text.trim().trim_end_matches('"').trim_end_matches("in").trim().replace(' ', "-");
    match t.as_str() {
        "0.5" | ".5" => "1/2".into(),
        "0.75" | ".75" => "3/4".into(),
        "1.25" => "1-1/4".into(),
        "1.5" => "1-1/2".into(),
        "2.5" => "2-1/2".into(),
        "3.5" => "3-1/2".into(),
        other => other.trim_end_matches(".0").to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_table_is_consistent_with_itself_and_the_standard_s_rules() {
        // Rules of the standard (from memory): walls grow with the schedule (10 < 40 < 80 < 160),
        // STD = 40 up to 10 in and 0.375 in above, XS = 80 up to 8 in and 0.500 in above; the bore
        // stays open.
        for s in &SIZES {
            let w = |i: usize| s.walls[i];
            let ordered: Vec<f64> = [0, 1, 2, 3].iter().filter_map(|i| w(*i)).collect();
            assert!(ordered.windows(2).all(|p| p[0] < p[1]), "{}: {ordered:?}", s.nominal);
            let inches: f64 = match s.nominal {
                "1/2" => 0.5,
                "3/4" => 0.75,
                "1-1/4" => 1.25,
                "1-1/2" => 1.5,
                "2-1/2" => 2.5,
                "3-1/2" => 3.5,
                n => n.parse().unwrap(),
            };
            if inches <= 10.0 {
                assert_eq!(w(4), w(1), "{}: STD is schedule 40", s.nominal);
            } else {
                assert_eq!(w(4), Some(0.375), "{}: STD", s.nominal);
            }
            if inches <= 8.0 {
                assert_eq!(w(5), w(2), "{}: XS is schedule 80", s.nominal);
            } else {
                assert_eq!(w(5), Some(0.500), "{}: XS", s.nominal);
            }
            for wall in s.walls.iter().flatten() {
                assert!(2.0 * wall < s.outside, "{}", s.nominal);
            }
        }
    }

    #[test]
    fn names_are_read_as_engineers_write_them() {
        let (od, t) = dimensions("4", "40").unwrap();
        assert!((od - 4.5 * 0.0254).abs() < 1e-15 && (t - 0.237 * 0.0254).abs() < 1e-15);
        assert_eq!(dimensions("1.5", "sch 80").unwrap(), dimensions("1-1/2 in", "80").unwrap());
        assert_eq!(dimensions("6\"", "std").unwrap(), dimensions("6", "40").unwrap());
        assert!(dimensions("3-1/2", "160").unwrap_err().message.contains("not defined"));
        assert!(dimensions("7", "40").unwrap_err().message.contains("no standard pipe size"));
        // 22 in: outside 22.000 in, XS 0.500 in, no schedule 40 (ASME B36.10M, from memory).
        let (od, t) = dimensions("22", "XS").unwrap();
        assert!((od - 22.0 * 0.0254).abs() < 1e-15 && (t - 0.5 * 0.0254).abs() < 1e-15);
        assert!(dimensions("22", "40").unwrap_err().message.contains("not defined"));
    }

    #[test]
    fn a_pasted_paragraph_is_quoted_only_in_part() {
        // Common practice, no source: a message read beside a field fits in a few lines, so what
        // was typed is repeated only as far as ECHO_LIMIT characters, ending in an ellipsis, and
        // the sizes or schedules allowed are still there to read.
        let paragraph = "x".repeat(1_000_000);
        for e in [dimensions(&paragraph, "40").unwrap_err(), dimensions("2", &paragraph).unwrap_err()] {
            let shown = e.to_string();
            assert!(shown.chars().count() < 300, "{} characters: {shown:.400}", shown.chars().count());
            let quoted = format!("\"{}…\"", "x".repeat(crate::error::ECHO_LIMIT));
            assert!(shown.contains(&quoted), "{shown}");
            assert!(shown.contains("known sizes: 1/2") || shown.contains("defined: 10, 40"), "{shown}");
        }
    }
}
