//! Values that pass their field's range but are implausible for it or beside the rest of the
//! case (a pipe wider than its span is long, a wall under 0.1 mm, a drive at 100 000 rpm): most
//! often a unit left off or mistyped. The case is still solved; the warning names the field in
//! words and both values, in the case's unit system, so that the reader can see which is wrong.
//!
//! The thresholds are rules of thumb (common practice, no source): they are set where a real
//! part is very unlikely, so that a warning is worth reading.

use super::{Inputs, Scenario};
use crate::analysis::{Warning, WarningCode};
use crate::model::{Attachment, Model};
use crate::path::FieldPath;
use crate::schema::{self, words};
use crate::section::SectionInput;
use crate::units::{self, Kind, Quantity};

/// Thinner than this, a wall, flange or web is foil, not a part of a beam (m).
pub const THINNEST_WALL: f64 = 1e-4;
/// A mass on the beam more than this many times the beam's own is most likely a unit slip.
pub const HEAVIEST_RATIO: f64 = 1e3;
/// Above this (Hz; 60 000 rpm), a drive frequency typed as a running speed is the likelier
/// reading.
pub const FASTEST_DRIVE_HZ: f64 = 1e3;

/// The warnings for implausible values of a scenario read into `inputs`.
pub fn warnings(scenario: &Scenario, inputs: &Inputs) -> Vec<Warning> {
    let system = scenario.units;
    let shown = |si: f64, kind: Kind| units::format(si, kind, system);
    let mut out = Vec::new();
    let span = longest_span(&inputs.model);
    for (i, segment) in scenario.segments.iter().enumerate() {
        let Some(section) = &segment.section else { continue };
        let at = FieldPath::item("segments", i).key("section");
        let (shape, outer, thin) = dimensions(section);
        for &(key, q) in &outer {
            let Some(size) = si(q, Kind::Length) else { continue };
            if size >= span {
                out.push(warning(format!(
                    "{}: {} is larger than the longest span between supports ({}); check the units of both.",
                    words(&at.key(key)),
                    shown(size, Kind::Length),
                    shown(span, Kind::Length)
                )));
            }
        }
        let widest = outer.iter().filter_map(|(key, q)| Some((*key, si(q, Kind::Length)?))).next();
        for &(key, q) in &thin {
            let Some(t) = si(q, Kind::Length) else { continue };
            if t < THINNEST_WALL {
                let beside = widest
                    .map(|(wide, size)| {
                        format!(", beside {} of {}", label(shape, wide), shown(size, Kind::Length))
                    })
                    .unwrap_or_default();
                out.push(warning(format!(
                    "{}: {} is under {}, thinner than any tube or plate is made{beside}; check its unit.",
                    words(&at.key(key)),
                    shown(t, Kind::Length),
                    shown(THINNEST_WALL, Kind::Length)
                )));
            }
        }
    }
    let beam_mass: f64 = inputs.model.segments().iter().map(|s| s.mass_per_length * s.length).sum();
    for (i, a) in scenario.attachments.iter().enumerate() {
        let Some(mass) = a.value("mass").and_then(|q| si(q, Kind::Mass)) else { continue };
        if beam_mass > 0.0 && mass > HEAVIEST_RATIO * beam_mass {
            out.push(warning(format!(
                "{}: {} is more than a thousand times the beam's own mass ({}); check its unit.",
                words(&FieldPath::item("attachments", i).key("mass")),
                shown(mass, Kind::Mass),
                shown(beam_mass, Kind::Mass)
            )));
        }
    }
    for (i, e) in scenario.excitations.iter().enumerate() {
        let Some(hz) = si(&e.frequency, Kind::Frequency) else { continue };
        let typed_fast = matches!(&e.frequency, Quantity::Text(t) if t.to_ascii_lowercase().contains("khz"));
        if hz > FASTEST_DRIVE_HZ && !typed_fast {
            out.push(warning(format!(
                "{}: {} is {} rpm, faster than almost any machine runs; if {} is a speed in rpm, write it \
                 with rpm.",
                words(&FieldPath::item("excitations", i).key("frequency")),
                shown(hz, Kind::Frequency),
                units::significant(hz * 60.0, 4),
                number_typed(&e.frequency)
            )));
        }
    }
    out
}

/// The longest stretch of the beam between two points held against deflection (the ends
/// count as such, held or not): the whole length when nothing holds it in between.
fn longest_span(model: &Model) -> f64 {
    let mut at: Vec<f64> = model
        .attachments()
        .iter()
        .filter(|a| match a {
            Attachment::Support { .. } => true,
            Attachment::Spring { stiffness, .. } => stiffness.is_infinite(),
            _ => false,
        })
        .map(Attachment::position)
        .collect();
    at.push(0.0);
    at.push(model.length());
    crate::sort::floats(&mut at);
    at.windows(2).map(|w| w[1] - w[0]).fold(0.0, f64::max)
}

/// Dimensions of a section, by their keys.
type Dimensions<'a> = Vec<(&'static str, &'a Quantity)>;

/// A section's shape id, its outside dimensions (the one in the plane of vibration first) and
/// its wall, flange and web thicknesses.
fn dimensions(section: &SectionInput) -> (&'static str, Dimensions<'_>, Dimensions<'_>) {
    match section {
        SectionInput::Rectangle { width, depth } => {
            ("rectangle", vec![("depth", depth), ("width", width)], vec![])
        }
        SectionInput::Round { diameter } => ("round", vec![("diameter", diameter)], vec![]),
        SectionInput::Tube { outer_diameter, wall } => {
            ("tube", vec![("outer_diameter", outer_diameter)], vec![("wall", wall)])
        }
        SectionInput::RectangularTube { width, depth, wall } => {
            ("rectangular-tube", vec![("depth", depth), ("width", width)], vec![("wall", wall)])
        }
        SectionInput::IBeam { depth, flange_width, flange_thickness, web_thickness, .. } => (
            "i-beam",
            vec![("depth", depth), ("flange_width", flange_width)],
            vec![("flange_thickness", flange_thickness), ("web_thickness", web_thickness)],
        ),
        // A pipe's dimensions come from the table unless recorded; only recorded ones were typed.
        SectionInput::Pipe { outer_diameter, wall, .. } => (
            "pipe",
            outer_diameter.iter().map(|d| ("outer_diameter", d)).collect(),
            wall.iter().map(|w| ("wall", w)).collect(),
        ),
        SectionInput::Custom { depth, .. } => {
            ("custom", depth.iter().map(|d| ("depth", d)).collect(), vec![])
        }
    }
}

/// A dimension of a shape in words, with its article: "an overall depth".
fn label(shape: &str, key: &str) -> String {
    let field = schema::find(&schema::SHAPES, shape).and_then(|c| c.fields.iter().find(|f| f.name == key));
    let own = schema::field_words(field.map_or("", |f| f.label), key);
    let article = if own.starts_with(['a', 'e', 'i', 'o', 'u']) { "an" } else { "a" };
    format!("{article} {own}")
}

/// The number of a value as typed, without its unit: "1780" of "1780 Hz".
fn number_typed(q: &Quantity) -> String {
    match q {
        Quantity::Number(v) => crate::error::as_typed(*v),
        Quantity::Text(t) => {
            let t = t.trim();
            let end =
                t.find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '-' | '+'))).unwrap_or(t.len());
            crate::error::echo(&t[..end])
        }
    }
}

fn si(q: &Quantity, kind: Kind) -> Option<f64> {
    units::convert(q, kind).ok().map(|c| c.si).filter(|v| v.is_finite())
}

fn warning(message: String) -> Warning {
    Warning { code: WarningCode::Implausible, message }
}

#[cfg(test)]
mod tests {
    use crate::analysis::WarningCode;

    /// The implausible-value warnings of a scenario (a 3 m steel tube, pinned, invented here).
    fn warned(extra: &str) -> Vec<String> {
        warned_with_wall("4 mm", extra)
    }

    fn warned_with_wall(wall: &str, extra: &str) -> Vec<String> {
        let text = format!(
            r#"{{"units": "si-mm", "left": "pinned", "right": "pinned", "segments": [{{"length": "3 m",
                "section": {{"shape": "tube", "outer_diameter": "60 mm", "wall": "{wall}"}},
                "material": "steel"}}]{extra}}}"#
        );
        let report = crate::solve_json(&text).unwrap_or_else(|e| panic!("{e}"));
        report
            .warnings
            .into_iter()
            .filter(|w| w.code == WarningCode::Implausible)
            .map(|w| w.message)
            .collect()
    }

    #[test]
    fn plausible_cases_get_no_warning() {
        assert!(warned("").is_empty());
        let drives = r#", "excitations": [{"frequency": "1780 rpm"}, {"frequency": "2 kHz"}, {"frequency": "120 Hz"}]"#;
        assert!(warned(drives).is_empty(), "{:?}", warned(drives));
        let light = r#", "attachments": [{"type": "mass", "position": "1 m", "mass": "20 kg"}]"#;
        assert!(warned(light).is_empty());
    }

    #[test]
    fn each_rule_names_the_field_and_both_values() {
        // A support at 1 m leaves a longest span of 2 m, narrower than a 2.5 m bar.
        let text = r#"{"units": "si-mm", "left": "pinned", "right": "pinned", "segments": [{"length": "3 m",
            "section": {"shape": "round", "diameter": "2500 mm"}, "material": "steel"}],
            "attachments": [{"type": "support", "position": "1 m"}]}"#;
        let found = crate::scenario::Scenario::from_json(text)
            .and_then(|s| Ok(super::warnings(&s, &s.to_model()?)))
            .unwrap_or_else(|e| panic!("{e}"));
        assert_eq!(found.len(), 1, "{found:?}");
        assert_eq!(
            found[0].message,
            "Segment 1, diameter: 2500 mm is larger than the longest span between supports (2000 mm); \
             check the units of both."
        );
        // 100 t on a tube of about 5.5 kg/m over 3 m: far more than a thousand times its mass.
        let heavy = warned(r#", "attachments": [{"type": "mass", "position": "1 m", "mass": "1e5 kg"}]"#);
        assert_eq!(heavy.len(), 1, "{heavy:?}");
        assert!(
            heavy[0].starts_with("Attachment 1, mass: 100000 kg is more than a thousand times"),
            "{heavy:?}"
        );
        let thin = warned_with_wall("0.05 mm", "");
        assert_eq!(
            thin,
            vec!["Segment 1, wall: 0.05 mm is under 0.1 mm, thinner than any tube or plate is made, beside an \
                  outside diameter of 60 mm; check its unit."
                .to_string()]
        );
        let fast = warned(r#", "excitations": [{"frequency": "1780"}]"#);
        assert_eq!(
            fast,
            vec!["Excitation 1, frequency: 1780 Hz is 106800 rpm, faster than almost any machine runs; if 1780 \
                  is a speed in rpm, write it with rpm."
                .to_string()]
        );
    }
}
