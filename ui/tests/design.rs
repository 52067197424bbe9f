//! The design results and edits, natively: the frequency map and the design sections are drawn
//! from the report, a calibration's fit and a resizing's proposal are written into the case in
//! its units as one step that re-solves as proposed, and the undo history takes the step back.
#![cfg(not(target_arch = "wasm32"))]

use modebench_ui::doc::{self, design, history::History, Edit};
use modebench_ui::render::{self, Editing};

const BOOM: &str = include_str!("../../docs/scenarios/boom-root-calibration.json");
const FLOOR: &str = include_str!("../../docs/scenarios/floor-beam-variable-fan.json");

#[test]
fn the_results_show_the_map_what_moves_each_mode_and_the_fit() {
    let html = render::widget_html(BOOM);
    for part in [
        "class=\"mb-map\"",
        "What moves each mode most",
        "class=\"mb-calibration\"",
        "data-action=\"apply-fit\"",
    ] {
        assert!(html.contains(part), "no {part}");
    }
    // One row per elastic mode on the map, and a cross for each measured mode.
    assert_eq!(html.matches("class=\"mb-map-row\"").count(), 3);
    assert_eq!(html.matches("class=\"mb-map-measured\"").count(), 2);
    let html = render::widget_html(FLOOR);
    assert!(html.contains("class=\"mb-sweep\"") && html.contains("data-action=\"apply-resize\""));
    // Each mode's line is numbered at its end: labels 1, 2, … as many as the lines' modes.
    let lines = (0..20).filter(|k| html.contains(&format!("data-mode-index=\"{k}\""))).count();
    let labels = html.matches("dx=\"4\" dy=\"4\" fill=\"#2d6a8f\">").count();
    assert!(lines >= 2 && labels == lines, "{labels} labels for {lines} modes");
    assert!(html.contains("fill=\"#2d6a8f\">1</text>"));
    // Mode 1's band reaches into the fan's range: drawn in the warning colour.
    assert!(html.contains("mb-map-mode mb-map-close"));
    assert!(html.contains("Separation is (f − f<sub>e</sub>)/f<sub>e</sub>"));
}

#[test]
fn the_editor_offers_every_design_request() {
    let Ok(doc) = doc::read(FLOOR) else { panic!("JSON") };
    let fields = render::field_paths(&doc);
    for path in ["tolerances[0].field", "tolerances[1].plus_minus", "resize", "resize.field", "resize.points"]
    {
        assert!(fields.iter().any(|f| f == path), "no field for {path}");
    }
    let Ok(doc) = doc::read(BOOM) else { panic!("JSON") };
    let fields = render::field_paths(&doc);
    for path in ["measured[1].frequency", "calibrate[0].field", "calibrate[1].to"] {
        assert!(fields.iter().any(|f| f == path), "no field for {path}");
    }
    let html = render::editor_html(&doc, None, Editing::Live);
    assert!(html.contains("Left end: Rotational spring"), "the inputs are offered in words");
}

#[test]
fn a_fit_applied_reproduces_the_measurements_and_undoes_in_one_step() {
    let Ok(mut doc) = doc::read(BOOM) else { panic!("JSON") };
    let before = doc.clone();
    let report = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    let Some((changes, what)) = design::fit_changes(&doc, &report) else { panic!("a fit") };
    assert_eq!(changes[0].path, "left.rotational");
    assert!(changes[0].text.ends_with("N·mm/rad"), "in the case's units: {}", changes[0].text);
    assert_eq!((changes.len(), what.as_str()), (2, "use the fitted values"));
    let mut history = History::default();
    history.record(&doc, what);
    doc::apply(&mut doc, &Edit::Apply(changes), Some(&report));
    let after = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    // Written to six figures, the fit reproduces the measurements to about 1e-5.
    for m in &report.design.measured {
        let Some(mode) = after.modes.iter().find(|x| x.number == m.mode) else { panic!("mode {}", m.mode) };
        assert!((mode.frequency_hz / m.measured_hz - 1.0).abs() < 1e-5, "mode {}", m.mode);
    }
    assert_eq!(history.undo().map(|s| s.before), Some(before));
}

#[test]
fn a_proposed_size_applied_clears_every_margin_as_the_sweep_said() {
    let Ok(mut doc) = doc::read(FLOOR) else { panic!("JSON") };
    let report = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    let Some((changes, what)) = design::resize_changes(&doc, &report) else { panic!("a proposal") };
    assert!(changes[0].text.ends_with(" in"), "{}", changes[0].text);
    // The nearest feasible depth is the low edge of a window, 11.4945 in, which runs up to
    // 11.7956 in: rounded up into it, 12 in falls outside and 11.5 in is the fewest figures in.
    let Some(r) = report.design.resize.as_ref() else { panic!("a resizing") };
    let (a, b) = r.intervals[0];
    assert!((a / 0.0254 - 11.4945).abs() < 1e-4 && (b / 0.0254 - 11.7956).abs() < 1e-4, "{:?}", r.intervals);
    assert_eq!(changes[0].text, "11.5 in");
    assert!(changes[0].si > a && changes[0].si < b);
    // The undo's words name the input as the report does, its first letter lowered only.
    let Some(resize) = report.design.resize.as_ref() else { panic!("a resizing") };
    let label = &resize.input.label;
    assert_eq!(
        what,
        format!("set {}{} to {}", label[..1].to_ascii_lowercase(), &label[1..], changes[0].text)
    );
    doc::apply(&mut doc, &Edit::Apply(changes), Some(&report));
    let after = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    // The resizing judges the nominal frequencies: each clears the margin.
    for m in after.modes.iter().filter(|m| !m.rigid_body) {
        let s = m.nearest_excitation.as_ref().map_or(1.0, |s| s.margin);
        assert!(s >= after.margin, "mode {} is {s} from an excitation", m.number);
    }
}

#[test]
fn a_new_calibration_or_resizing_starts_on_an_input_that_keeps_the_camera_head_on_the_beam() {
    // The camera boom: one segment 1450 mm long with the head at its tip. Its length comes first
    // among the inputs, and a range from a quarter of it would put the head off the beam at
    // once; a new request starts on the next input instead, and solves.
    let Ok(mut doc) = doc::read(include_str!("../../docs/scenarios/sensor-boom.json")) else {
        panic!("JSON")
    };
    let report = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    assert_eq!(report.design.inputs[0].path, "segments[0].length", "the length is listed first");
    let calibrate = design::new_row(&doc, doc::List::Calibrate, Some(&report));
    let resize = design::new_resize(&doc, Some(&report));
    for row in [&calibrate, &resize] {
        let field = row["field"].as_str().unwrap_or_default();
        assert!(!field.ends_with(".length") && !field.ends_with(".position"), "{row}");
    }
    doc["measured"] = serde_json::json!([{ "mode": 1, "frequency": "10.6 Hz" }]);
    doc["calibrate"] = serde_json::json!([calibrate]);
    doc["resize"] = resize;
    let report = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    let calibration =
        report.design.calibration.as_ref().map(|c| c.problem.as_ref().map(|p| p.message.clone()));
    assert_eq!(calibration, Some(None), "the calibration solves");
    let resizing = report.design.resize.as_ref().map(|r| r.problem.as_ref().map(|p| p.message.clone()));
    assert_eq!(resizing, Some(None), "the resizing solves");
}

#[test]
fn one_fitted_value_is_named_with_its_input_in_the_undo_words() {
    // The root's stiffness calibrated alone: "Undo: set … to 3.1e6 N·mm/rad" says what changed.
    let Ok(mut doc) = doc::read(BOOM) else { panic!("JSON") };
    if let Some(rows) = doc["calibrate"].as_array_mut() {
        rows.truncate(1);
    }
    let report = doc::solve(&doc).unwrap_or_else(|e| panic!("{e}"));
    let Some((changes, what)) = design::fit_changes(&doc, &report) else { panic!("a fit") };
    let label = &report.design.calibration.as_ref().map(|c| c.inputs[0].label.clone()).unwrap_or_default();
    assert_eq!(changes.len(), 1);
    assert_eq!(
        what,
        format!("set {}{} to {}", label[..1].to_ascii_lowercase(), &label[1..], changes[0].text)
    );
}
