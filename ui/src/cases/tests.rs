//! The cases' list, naming, undo and storage, and what a case is saved as.

use super::export::{file_name, results_csv, results_json, scenario_file, scenario_from_file, CSV_HEADER};
use super::*;
use crate::doc::{self, Edit, List};

fn example() -> Value {
    doc::read(r#"{"title":"Sensor boom","units":"si-mm","left":"clamped","right":"free","segments":[{"length":"1 m","flexural_rigidity":"100 N*m^2","mass_per_length":"1 kg/m"}]}"#).unwrap()
}

fn titled(title: &str) -> Value {
    let mut s = example();
    s["title"] = Value::String(title.into());
    s
}

fn names(cases: &Cases) -> Vec<String> {
    cases.list().iter().map(Case::name).collect()
}

#[test]
fn with_nothing_stored_the_one_case_is_the_example() {
    let cases = Cases::load(None, &example());
    assert_eq!(names(&cases), ["Sensor boom"]);
    assert_eq!(cases.open_case().scenario, example());
    assert!(cases.undo_label().is_none());
}

#[test]
fn a_stored_edit_of_the_first_version_becomes_a_case() {
    let stored = doc::read(r#"{"version":1,"scenario":{"title":"Mine","modes":"7x"},"mode":2}"#).unwrap();
    let cases = Cases::load(Some(&stored), &example());
    assert_eq!(names(&cases), ["Mine"]);
    assert_eq!(cases.open_case().mode, 2);
    assert_eq!(cases.open_case().scenario["modes"], "7x", "kept exactly as typed");
}

#[test]
fn cases_survive_storage_exactly_with_the_one_that_was_open() {
    let mut cases = Cases::load(None, &example());
    cases.new_blank(&example());
    cases.keep(&titled("Pump skid"), 3);
    cases.set_record("preparer", "A. Reader");
    cases.new_from_example(&example());
    cases.open(cases.list()[1].id);
    let stored = doc::read(&doc::text::write(&cases.to_stored())).unwrap();
    let again = Cases::load(Some(&stored), &example());
    assert_eq!(again.list(), cases.list());
    assert_eq!(again.open_case().name(), "Pump skid");
    assert_eq!(again.open_case().record["preparer"], "A. Reader");
    // Ids are never reused, even after a reload.
    let mut again = again;
    again.new_blank(&example());
    let ids: Vec<u64> = again.list().iter().map(|c| c.id).collect();
    assert_eq!(ids, [1, 2, 3, 4]);
}

#[test]
fn new_cases_are_numbered_apart_so_that_no_two_in_the_list_read_alike() {
    let mut cases = Cases::load(None, &example());
    cases.new_from_example(&example());
    cases.new_from_example(&example());
    cases.new_blank(&example());
    cases.new_blank(&example());
    cases.duplicate();
    cases.duplicate();
    assert_eq!(
        names(&cases),
        [
            "Sensor boom",
            "Sensor boom (2)",
            "Sensor boom (3)",
            "New case",
            "New case (2)",
            "New case (2) (copy)",
            "New case (2) (copy) (copy)",
        ]
    );
}

#[test]
fn a_blank_case_keeps_the_example_units_and_asks_for_every_field() {
    let mut cases = Cases::load(None, &example());
    cases.new_blank(&example());
    let blank = &cases.open_case().scenario;
    assert_eq!(blank["units"], "si-mm");
    assert_eq!(blank["segments"][0]["length"], "");
    // The core refuses it, naming the first empty field, rather than solving a made-up beam.
    let error = doc::solve(blank).unwrap_err();
    assert!(error.path.to_string().starts_with("segments[0]"), "{error:?}");
}

#[test]
fn duplicate_names_the_copy_and_keeps_the_record() {
    let mut cases = Cases::load(None, &example());
    cases.set_record("revision", "B");
    cases.duplicate();
    assert_eq!(names(&cases), ["Sensor boom", "Sensor boom (copy)"]);
    assert_eq!(cases.open_case().record["revision"], "B");
    cases.keep(&titled("  "), 0);
    assert_eq!(cases.open_case().name(), UNTITLED);
}

#[test]
fn delete_then_undo_puts_the_case_back_where_it_was_and_opens_it() {
    let mut cases = Cases::load(None, &example());
    cases.keep(&titled("First"), 0);
    cases.new_blank(&example());
    cases.keep(&titled("Second"), 1);
    cases.new_blank(&example());
    cases.keep(&titled("Third"), 0);
    cases.open(2);
    cases.delete(&example());
    assert_eq!(names(&cases), ["First", "Third"]);
    assert_eq!(cases.open_case().name(), "Third");
    assert_eq!(cases.undo_label(), Some("delete case “Second”"));
    assert!(cases.undo());
    assert_eq!(names(&cases), ["First", "Second", "Third"]);
    assert_eq!(cases.open_case().name(), "Second");
    assert_eq!(cases.open_case().mode, 1);
    assert!(!cases.undo());
}

#[test]
fn deleting_the_last_case_leaves_a_copy_of_the_example() {
    let mut cases = Cases::load(None, &example());
    cases.keep(&titled("Only"), 0);
    cases.delete(&example());
    assert_eq!(names(&cases), ["Sensor boom"]);
    assert!(cases.undo());
    assert!(names(&cases).contains(&"Only".to_string()));
    assert_eq!(cases.open_case().name(), "Only");
}

#[test]
fn restoring_the_example_is_undone_and_so_is_a_removed_row() {
    let mut cases = Cases::load(None, &example());
    let mut mine = titled("Mine");
    mine["segments"][0]["length"] = Value::String("2.5 m".into());
    cases.keep(&mine, 2);
    cases.restore_example(&example());
    assert_eq!(cases.open_case().scenario, example());
    assert_eq!(cases.undo_label(), Some("restore the page's example"));
    assert!(cases.undo());
    assert_eq!(cases.open_case().scenario, mine);
    assert_eq!(cases.open_case().mode, 2);

    cases.record("remove segment 1");
    cases.keep(&example(), 0);
    assert!(cases.undo());
    assert_eq!(cases.open_case().scenario, mine);
}

#[test]
fn undo_reaches_a_case_even_after_another_was_opened() {
    let mut cases = Cases::load(None, &example());
    cases.keep(&titled("A"), 0);
    cases.restore_example(&example());
    cases.new_blank(&example());
    assert!(cases.undo());
    assert_eq!(cases.open_case().name(), "A");
}

#[test]
fn an_imported_case_is_added_once() {
    let mut cases = Cases::load(None, &example());
    assert!(cases.import(titled("From a link")));
    assert!(!cases.import(titled("From a link")));
    assert!(!cases.import(example()), "the example itself is already kept");
    assert_eq!(cases.open_case().scenario, example());
    assert_eq!(names(&cases), ["Sensor boom", "From a link"]);
}

#[test]
fn the_bar_escapes_titles_and_offers_undo_only_when_there_is_one() {
    let mut cases = Cases::load(None, &example());
    cases.keep(&titled("<b>&\""), 0);
    let html = bar::bar_html(&cases, "");
    assert!(html.contains("<option value=\"1\" selected>&lt;b&gt;&amp;&quot;</option>"), "{html}");
    assert!(html.contains("data-action=\"undo\" disabled>Undo</button>"), "{html}");
    assert!(!html.contains(" style="));
    cases.delete(&example());
    let html = bar::bar_html(&cases, "Deleted.");
    assert!(html.contains(">Undo: delete case “&lt;b&gt;&amp;&quot;”</button>"), "{html}");
}

#[test]
fn files_are_named_from_the_title() {
    assert_eq!(
        file_name(&titled("Fan on a 16 ft beam (rev. B)"), "", "json"),
        "fan-on-a-16-ft-beam-rev-b.json"
    );
    assert_eq!(file_name(&titled("—"), "-results", "csv"), "case-results.csv");
}

#[test]
fn the_scenario_file_reads_back_to_the_same_case() {
    let mut s = example();
    s["modes"] = Value::String("6 please".into());
    assert_eq!(doc::read(&scenario_file(&s)).unwrap(), s);
}

#[test]
fn the_csv_carries_the_engines_frequencies_in_full() {
    // A simply supported uniform beam: f₁ = (π/2)·√(EI/(m L⁴)), textbook Euler–Bernoulli.
    let s = doc::read(r#"{"title":"Pinned","left":"pinned","right":"pinned","modes":3,"segments":[{"length":"2 m","flexural_rigidity":"1000 N*m^2","mass_per_length":"2 kg/m"}]}"#).unwrap();
    let report = doc::solve(&s).unwrap();
    let csv = results_csv(&report);
    let mut lines = csv.split("\r\n");
    assert_eq!(lines.next(), Some(CSV_HEADER));
    let first: Vec<&str> = lines.next().unwrap().split(',').collect();
    let f1: f64 = first[1].parse().unwrap();
    let expected = std::f64::consts::PI / 2.0 * (1000.0_f64 / (2.0 * 2.0_f64.powi(4))).sqrt();
    assert!((f1 - expected).abs() < 1e-6 * expected, "{f1} against {expected}");
    assert_eq!(f1, report.modes[0].frequency_hz, "written in full");
    assert_eq!(csv.matches("\r\n").count(), 1 + report.modes.len());
}

#[test]
fn the_results_json_is_the_scenario_beside_the_report() {
    let s = titled("R");
    let json = results_json(&s, "{\"report\":{\"title\":\"R\",\"modes\":[]}}").unwrap();
    let value = doc::read(&json).unwrap();
    assert_eq!(value["scenario"], s);
    assert_eq!(value["report"]["title"], "R");
    assert!(results_json(&s, "{\"error\":{}}").is_none());
}

#[test]
fn edits_that_lose_typing_are_undoable_and_typing_is_not() {
    assert_eq!(undo_words(&Edit::Remove(List::Attachments, 1)).as_deref(), Some("remove attachment 2"));
    let clear = Edit::Tick { path: "segments[0].extra_mass".into(), on: false };
    assert_eq!(undo_words(&clear).as_deref(), Some("clear “extra mass”"));
    let retype = Edit::Choose { path: "attachments[0].type".into(), value: "spring".into() };
    assert_eq!(undo_words(&retype).as_deref(), Some("change “type”"));
    assert!(undo_words(&Edit::Choose { path: "units".into(), value: "si".into() }).is_none());
    assert!(undo_words(&Edit::Text { path: "title".into(), text: "x".into() }).is_none());
    assert!(undo_words(&Edit::Add(List::Segments)).is_none());
}

#[test]
fn a_scenario_or_a_results_file_opens_as_its_case() {
    let s = titled("Opened");
    assert_eq!(scenario_from_file(&scenario_file(&s)), Ok(s.clone()));
    let results = results_json(&s, "{\"report\":{\"modes\":[]}}").unwrap();
    assert_eq!(scenario_from_file(&results), Ok(s));
    assert!(scenario_from_file("[1, 2]").unwrap_err().contains("JSON object"));
    assert!(scenario_from_file("{ nope").unwrap_err().starts_with("the file is not a scenario"));
    // A hand-edited file that gives a field twice is refused with the field's place (RFC 8259,
    // section 4: readers differ on which of the two they keep).
    let twice = r#"{"left": "pinned", "right": "pinned", "segments": [{"length": "1 m", "length": "2 m"}]}"#;
    assert_eq!(
        scenario_from_file(twice),
        Err("in the file, segments[0].length: this field is given twice; keep one of the two".into())
    );
}

#[test]
fn the_sheet_names_the_case_dates_it_and_leaves_blanks_to_fill() {
    let mut cases = Cases::load(None, &example());
    cases.keep(&titled("Bracket <rev>"), 0);
    cases.set_record("checker", "J. Checker");
    let html = sheet::head_html(cases.open_case(), true, "2026-12-02");
    assert!(html.contains("<h2 class=\"mb-sheet-title\">Bracket &lt;rev&gt;</h2>"), "{html}");
    assert!(html.contains("<dt>Date</dt><dd>2026-12-02</dd>"));
    assert!(html.contains("<dt>Checked by</dt><dd>J. Checker</dd>"));
    assert!(html.contains("<dt>Prepared by</dt><dd><span class=\"mb-sheet-blank\"></span></dd>"));
    assert!(html.contains("reader's own"));
    let example_sheet = sheet::head_html(cases.open_case(), false, "2026-12-02");
    assert!(example_sheet.contains("worked example"));
}

#[test]
fn the_sheet_draws_every_mode() {
    let report = doc::solve(&example()).unwrap();
    let html = sheet::shapes_html(&report);
    assert_eq!(html.matches("<svg ").count(), report.modes.len());
    for m in &report.modes {
        assert!(html.contains(&format!("<figcaption>Mode {}: ", m.number)), "{html}");
    }
}
