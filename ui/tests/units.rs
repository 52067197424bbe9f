//! Units in the editor, checked natively: a number typed alone takes the unit its field shows,
//! a bare SI number from a file is shown with its SI unit, conversions are listed in words and
//! rounded to what was typed, implausible values are warned about with both values named, and
//! a new, still empty field is asked for rather than marked wrong.
#![cfg(not(target_arch = "wasm32"))]

use modebench::analysis::WarningCode;
use modebench::Report;
use modebench_ui::doc::{self, Edit};
use modebench_ui::render::{self, Editing, View};
use serde_json::{json, Value};

/// A water-filled two-span pipe in US units, as an engineer in the field would model it
/// (invented for these tests).
fn pipe() -> Value {
    json!({
        "title": "Two-span pipe",
        "units": "us-inch",
        "left": "pinned",
        "right": "pinned",
        "segments": [{
            "length": "24 ft",
            "section": { "shape": "tube", "outer_diameter": "4.5 in", "wall": "0.237 in" },
            "material": "steel",
            "extra_mass": { "contents_density": "62.4 lb/ft3" }
        }],
        "attachments": [{ "type": "support", "position": "12 ft" }],
        "excitations": [{ "label": "pump", "frequency": "1780 rpm" }]
    })
}

fn solve(doc: &Value) -> Report {
    match doc::solve(doc) {
        Ok(report) => report,
        Err(e) => panic!("the case should solve: {e}"),
    }
}

/// The `data-unit` and the unit shown beside the field at `path` in the live editor.
fn field_unit(doc: &Value, path: &str) -> (String, String) {
    let html = render::editor_html(doc, None, Editing::Live);
    let start = html.find(&format!("data-field=\"{path}\"")).unwrap_or_else(|| panic!("no field {path}"));
    let rest = &html[start..];
    let attribute = rest.split("data-unit=\"").nth(1).and_then(|r| r.split('"').next()).unwrap_or("");
    let shown = rest.split("<span class=\"mb-unit\">").nth(1).and_then(|r| r.split('<').next()).unwrap_or("");
    (attribute.to_string(), shown.to_string())
}

fn frequencies(report: &Report) -> Vec<f64> {
    report.modes.iter().map(|m| m.frequency_hz).collect()
}

#[test]
fn a_number_typed_alone_in_us_inch_reads_as_inches() {
    let written = solve(&pipe());
    let path = "segments[0].section.outer_diameter";
    assert_eq!(field_unit(&pipe(), path), ("in".to_string(), "in".to_string()));
    let mut doc = pipe();
    doc::apply(&mut doc, &doc::typed(path.to_string(), "4.5", "in"), None);
    assert_eq!(doc["segments"][0]["section"]["outer_diameter"], json!("4.5 in"));
    // The same pipe as with the unit written: the same frequencies, bit for bit.
    assert_eq!(frequencies(&solve(&doc)), frequencies(&written));
    // A unit typed is kept as typed, whatever the field shows.
    doc::apply(&mut doc, &doc::typed(path.to_string(), "114.3 mm", "in"), None);
    assert_eq!(doc["segments"][0]["section"]["outer_diameter"], json!("114.3 mm"));
    // Neither a word nor an unfinished number gets a unit.
    assert_eq!(doc::typed(path.to_string(), "1e", "in"), Edit::Text { path: path.into(), text: "1e".into() });
}

#[test]
fn a_value_typed_with_its_tolerance_takes_the_fields_unit_and_reads_as_a_tolerance() {
    let path = "segments[0].section.outer_diameter";
    let typed = |text: &str| match doc::typed(path.to_string(), text, "in") {
        Edit::Text { text, .. } => text,
        other => panic!("{other:?}"),
    };
    // Neither side with a unit: both take the field's; a unit typed on either side is kept.
    assert_eq!(typed("4.5 ± 2 %"), "4.5 in ± 2 %");
    assert_eq!(typed("4.5 +/- 0.05"), "4.5 in ± 0.05 in");
    assert_eq!(typed("4.5 ± 1 mm"), "4.5 ± 1 mm");
    assert_eq!(typed("114.3 mm ± 1 %"), "114.3 mm ± 1 %");
    // Solved, the field keeps its value as typed, the diameter is 4.5 in as written alone, and
    // the report lists the tolerance with a band around every mode.
    let mut doc = pipe();
    doc::apply(&mut doc, &doc::typed(path.to_string(), "4.5 ± 2 %", "in"), None);
    assert_eq!(doc["segments"][0]["section"]["outer_diameter"], json!("4.5 in ± 2 %"));
    let report = solve(&doc);
    assert_eq!(frequencies(&report), frequencies(&solve(&pipe())));
    let t = &report.design.tolerances;
    assert!(t.len() == 1 && t[0].input.path == path && t[0].plus_minus == Some(0.02), "{t:?}");
    assert_eq!(report.design.bands.len(), report.modes.iter().filter(|m| !m.rigid_body).count());
}

#[test]
fn a_number_typed_alone_in_a_field_holding_rpm_reads_as_rpm() {
    let path = "excitations[0].frequency";
    assert_eq!(field_unit(&pipe(), path).0, "rpm");
    let mut doc = pipe();
    doc::apply(&mut doc, &doc::typed(path.to_string(), "1780", "rpm"), None);
    let report = solve(&doc);
    // One rpm is one revolution per minute: 1/60 Hz, by definition.
    let hz = report.excitations[0].frequency_hz;
    assert!((hz - 1780.0 / 60.0).abs() <= 1e-12 * hz, "{hz} Hz");
    // In a field that shows Hz, the same number is hertz, and the field says so.
    let mut plain = pipe();
    plain["excitations"][0]["frequency"] = json!("60 Hz");
    assert_eq!(field_unit(&plain, path).0, "Hz");
}

#[test]
fn a_bare_si_number_from_a_file_shows_its_si_unit_beside_a_field_in_inches() {
    let mut doc = pipe();
    // 4.5 in is exactly 0.1143 m (0.0254 m per inch, NIST SP 811).
    doc["segments"][0]["section"]["outer_diameter"] = json!(0.1143);
    let html = render::editor_html(&doc, None, Editing::Live);
    assert!(
        html.contains(
            "data-field=\"segments[0].section.outer_diameter\" data-unit=\"in\" value=\"0.1143 m\""
        ),
        "the number is not shown with its unit"
    );
    let fixed = render::editor_html(&doc, None, Editing::Fixed);
    assert!(fixed.contains("data-field=\"segments[0].section.outer_diameter\">0.1143 m</span>"));
    let same = frequencies(&solve(&pipe()));
    for (a, b) in frequencies(&solve(&doc)).iter().zip(&same) {
        assert!((a - b).abs() <= 1e-12 * b, "{a} Hz against {b} Hz");
    }
}

#[test]
fn conversions_are_listed_in_words_rounded_to_what_was_typed() {
    let report = solve(&pipe());
    let html = render::results_html(Some(&report), false, &View::default());
    // 24 ft = 7.3152 m exactly; two digits typed, three shown. 4.5 in = 0.1143 m.
    for item in [
        "<span class=\"mb-conversion-field\">Segment 1, length</span>: 24 ft = 7.32 m",
        "<span class=\"mb-conversion-field\">Segment 1, outside diameter</span>: 4.5 in = 0.114 m",
        "<span class=\"mb-conversion-field\">Segment 1, wall</span>: 0.237 in = 0.00602 m",
        "<span class=\"mb-conversion-field\">Excitation 1, frequency</span>: 1780 rpm = 29.667 Hz",
    ] {
        assert!(html.contains(item), "missing {item}");
    }
    assert!(!html.contains("<code>segments["), "a data path is shown as the field's name");
    assert!(!html.contains("7.315200000"), "float noise in a conversion");
}

#[test]
fn implausible_values_are_warned_about_naming_both_values() {
    let implausible = |doc: &Value| -> Vec<String> {
        let report = solve(doc);
        let html = render::results_html(Some(&report), false, &View::default());
        assert_eq!(
            html.matches("data-code=\"implausible\"").count(),
            report.warnings.iter().filter(|w| w.code == WarningCode::Implausible).count(),
            "every warning is on the page"
        );
        report
            .warnings
            .iter()
            .filter(|w| w.code == WarningCode::Implausible)
            .map(|w| w.message.clone())
            .collect()
    };
    assert_eq!(implausible(&pipe()), Vec::<String>::new(), "the pipe as written is plausible");
    // "4.5" in a file is 4.5 m: wider than a 12 ft span (4.5 m = 177.2 in; 12 ft = 144 in).
    let mut doc = pipe();
    doc["segments"][0]["section"]["outer_diameter"] = json!("4.5");
    let found = implausible(&doc);
    assert!(
        found.iter().any(|m| m.starts_with("Segment 1, outside diameter: 177.2 in")
            && m.contains("longest span between supports (144 in)")),
        "{found:?}"
    );
    // A wall of 0.002 in (0.0508 mm) is under 0.1 mm.
    let mut doc = pipe();
    doc["segments"][0]["section"]["wall"] = json!("0.002 in");
    let found = implausible(&doc);
    assert!(
        found.iter().any(|m| m.starts_with("Segment 1, wall: 0.002 in is under 0.003937 in")
            && m.contains("outside diameter of 4.5 in")),
        "{found:?}"
    );
    // 1780 in a file is 1780 Hz: 106 800 rpm.
    let mut doc = pipe();
    doc["excitations"][0]["frequency"] = json!(1780);
    let found = implausible(&doc);
    assert!(
        found.iter().any(|m| m.starts_with("Excitation 1, frequency: 1780 Hz is 106800 rpm")),
        "{found:?}"
    );
}

#[test]
fn a_new_shape_asks_for_its_dimensions_without_marking_an_error() {
    let mut doc = pipe();
    doc["segments"][0]["section"] = json!({ "shape": "round", "diameter": "2 in" });
    doc::apply(
        &mut doc,
        &Edit::Choose { path: "segments[0].section.shape".into(), value: "tube".into() },
        None,
    );
    let error = doc::solve(&doc).err();
    assert!(error.is_some(), "the wall is still empty");
    let html = render::editor_html(&doc, error.as_ref(), Editing::Live);
    assert!(html.contains("mb-needed"), "the empty field is asked for");
    assert!(!html.contains("aria-invalid"), "nothing typed is marked wrong");
    assert!(!html.contains("role=\"alert\""), "nothing is announced as an error");
    // Typing something wrong there is an error.
    doc::apply(&mut doc, &doc::typed("segments[0].section.wall".into(), "thin", "in"), None);
    let error = doc::solve(&doc).err();
    let html = render::editor_html(&doc, error.as_ref(), Editing::Live);
    assert!(html.contains("aria-invalid=\"true\"") && !html.contains("mb-needed"));
}

#[test]
fn the_equivalent_mass_of_a_case_with_a_sprung_mass_is_explained() {
    let mut doc = pipe();
    let with_note = |doc: &Value| {
        render::results_html(Some(&solve(doc)), false, &View::default()).contains("mb-equivalent-note")
    };
    assert!(!with_note(&doc));
    doc["attachments"] = json!([
        { "type": "sprung-mass", "position": "6 ft", "mass": "50 lb", "stiffness": "2000 lbf/in" }
    ]);
    assert!(with_note(&doc));
}

#[test]
fn a_one_line_summary_of_the_modes_sits_between_the_editor_and_the_results() {
    let json = doc::text::write(&pipe());
    let html = render::widget_html(&json);
    let editor = html.find("class=\"mb-editor\"").unwrap_or(usize::MAX);
    let summary = html.find("class=\"mb-summary\"").unwrap_or(0);
    let results = html.find("class=\"mb-results\"").unwrap_or(0);
    assert!(editor < summary && summary < results, "the summary is not between editor and results");
    let report = solve(&pipe());
    let line = render::summary_html(Some(&report), false);
    // Each mode as the table shows it, with its separation from the pump.
    for m in report.modes.iter().take(6) {
        let shown = format!("{}: <span class=\"mb-summary-hz\">{}", m.number, format_hz(m.frequency_hz));
        assert!(line.contains(&shown), "{shown} missing from {line}");
    }
    assert!(line.contains("mb-summary-sep"));
    assert!(line.contains("aria-hidden=\"true\""), "a copy for the eye; the table is read out");
    let stale = render::summary_html(Some(&report), true);
    assert!(stale.contains("mb-stale-summary") && stale.contains("Earlier results"));
}

/// A frequency as the page writes it: four significant digits.
fn format_hz(hz: f64) -> String {
    format!("{} Hz", modebench::units::significant(hz, 4))
}
