//! The JS API, called through JavaScript values as a page would call it (run in Node with
//! `wasm-bindgen-test-runner`): round trips of `solve`, errors as JS `Error`s with their path,
//! and quantities read with their units.
// The JS API is the default `api` feature; the page build leaves it out.
#![cfg(feature = "api")]
#![cfg(target_arch = "wasm32")]

use js_sys::{Array, Reflect, JSON};
use modebench_web::api;
use wasm_bindgen::{JsCast, JsValue};
use wasm_bindgen_test::wasm_bindgen_test;

fn get(value: &JsValue, key: &str) -> JsValue {
    Reflect::get(value, &key.into()).unwrap_or(JsValue::UNDEFINED)
}

fn number(value: &JsValue, key: &str) -> f64 {
    get(value, key).as_f64().unwrap_or(f64::NAN)
}

fn js(text: &str) -> JsValue {
    JSON::parse(text).unwrap_or(JsValue::UNDEFINED)
}

fn modes(report: &JsValue) -> Array {
    get(report, "modes").dyn_into::<Array>().unwrap_or_default()
}

/// Clamped–free uniform beam: λ₁ = 1.875104068711961 and f₁ = λ₁²/(2π)·√(EI/(mL⁴)) (Blevins,
/// Formulas for Natural Frequency and Mode Shape, table 8-1 — from memory).
#[wasm_bindgen_test]
fn solve_matches_the_published_cantilever_value() {
    let scenario = js(r#"{"left": "clamped", "right": "free", "modes": 2,
        "segments": [{"length": 1, "flexural_rigidity": 1, "mass_per_length": 1}]}"#);
    let report = api::solve(scenario).unwrap_or(JsValue::NULL);
    let lambda: f64 = 1.875104068711961;
    let expected = lambda * lambda / std::f64::consts::TAU;
    let got = number(&modes(&report).get(0), "frequency_hz");
    assert!((got / expected - 1.0).abs() < 1e-9, "expected {expected}, got {got}");
}

/// The report crosses into JS unchanged: every frequency equals the one core computes directly.
#[wasm_bindgen_test]
fn solve_round_trips_a_docs_scenario_exactly() {
    let text = include_str!("../../docs/scenarios/sensor-boom.json");
    let direct = modebench::solve_json(text).map(|r| r.modes).unwrap_or_default();
    let report = api::solve(js(text)).unwrap_or(JsValue::NULL);
    let through_js = modes(&report);
    assert_eq!(through_js.length() as usize, direct.len());
    for (i, m) in direct.iter().enumerate() {
        let row = through_js.get(i as u32);
        assert_eq!(number(&row, "frequency_hz"), m.frequency_hz, "mode {}", m.number);
        let fe = get(&row, "fe_frequency_hz");
        assert_eq!(fe.as_f64(), m.fe_frequency_hz, "mode {}", m.number);
    }
    // Maps and structs arrive as plain objects, and a missing value as null, not undefined.
    let fundamental = get(&report, "fundamental");
    assert!(fundamental.is_object());
    assert!(get(&report, "comparison").is_string() || get(&report, "comparison").is_null());
}

#[wasm_bindgen_test]
fn errors_are_js_errors_with_path_kind_and_value() {
    let text = include_str!("../../docs/scenarios/sensor-boom.json").replace("\"2.8 kg\"", "\"2.8 kgs\"");
    let error = api::solve(js(&text)).err().unwrap_or(JsValue::NULL);
    assert!(error.is_instance_of::<js_sys::Error>());
    assert_eq!(get(&error, "path").as_string().as_deref(), Some("attachments[0].mass"));
    assert_eq!(get(&error, "kind").as_string().as_deref(), Some("unknown-unit"));
    assert_eq!(get(&error, "value").as_string().as_deref(), Some("2.8 kgs"));
    let message = get(&error, "message").as_string().unwrap_or_default();
    assert!(message.starts_with("attachments[0].mass: "), "{message}");

    let error = api::solve(js(r#"{"left": "clamped"}"#)).err().unwrap_or(JsValue::NULL);
    assert!(error.is_instance_of::<js_sys::Error>());
    // The first thing missing is the right end; the error says so by its path.
    assert_eq!(get(&error, "kind").as_string().as_deref(), Some("missing"));
    assert_eq!(get(&error, "path").as_string().as_deref(), Some("right"));
    assert!(get(&error, "value").is_null());

    let error = api::solve(JsValue::UNDEFINED).err().unwrap_or(JsValue::NULL);
    assert!(error.is_instance_of::<js_sys::Error>());
    assert_eq!(get(&error, "path").as_string().as_deref(), Some(""));
}

/// The worker's entry point answers in JSON text, through JavaScript's own JSON reader: the
/// report with every frequency exactly as core computes it, or the error with its path.
#[wasm_bindgen_test]
fn solve_scenario_answers_in_json_text() {
    let text = include_str!("../../docs/scenarios/sensor-boom.json");
    let direct = modebench::solve_json(text).map(|r| r.modes).unwrap_or_default();
    let answer = js(&api::solve_scenario(text));
    let through_js = modes(&get(&answer, "report"));
    assert_eq!(through_js.length() as usize, direct.len());
    for (i, m) in direct.iter().enumerate() {
        assert_eq!(number(&through_js.get(i as u32), "frequency_hz"), m.frequency_hz, "mode {}", m.number);
    }
    let wrong = js(&api::solve_scenario(&text.replace("\"2.8 kg\"", "\"2.8 kgs\"")));
    let error = get(&wrong, "error");
    assert_eq!(get(&error, "path").as_string().as_deref(), Some("attachments[0].mass"));
    assert_eq!(get(&error, "kind").as_string().as_deref(), Some("unknown-unit"));
    assert!(get(&wrong, "report").is_undefined());
}

/// 1 psi = 1 lbf/in² = 0.45359237 kg × 9.80665 m/s² / (0.0254 m)² = 6894.757293168361 Pa (NIST SP
/// 811, appendix B, exact definitions).
#[wasm_bindgen_test]
fn parse_quantity_reads_units_and_names_mistakes() {
    let parsed = api::parse_quantity("30e6 psi", "pressure").unwrap_or(JsValue::NULL);
    let expected = 30e6 * 0.45359237 * 9.80665 / (0.0254 * 0.0254);
    let si = number(&parsed, "si");
    assert!((si / expected - 1.0).abs() < 1e-14, "expected {expected}, got {si}");
    assert_eq!(get(&parsed, "si_unit").as_string().as_deref(), Some("Pa"));
    assert!(get(&parsed, "conversion").as_string().is_some_and(|c| c.starts_with("30e6 psi = ")));

    let rpm = api::parse_quantity("1780 rpm", "frequency").unwrap_or(JsValue::NULL);
    assert!((number(&rpm, "si") - 1780.0 / 60.0).abs() < 1e-12);
    let plain = api::parse_quantity("2.5", "length").unwrap_or(JsValue::NULL);
    assert_eq!(number(&plain, "si"), 2.5);
    assert!(get(&plain, "conversion").is_null());

    let error = api::parse_quantity("2 kg", "length").err().unwrap_or(JsValue::NULL);
    assert!(error.is_instance_of::<js_sys::Error>());
    assert_eq!(get(&error, "kind").as_string().as_deref(), Some("wrong-dimension"));
    let error = api::parse_quantity("2 m", "distance").err().unwrap_or(JsValue::NULL);
    assert_eq!(get(&error, "path").as_string().as_deref(), Some("kind"));
    assert_eq!(get(&error, "kind").as_string().as_deref(), Some("unknown-option"));
}

#[wasm_bindgen_test]
fn lists_describe_sections_materials_and_units() {
    let sections = api::list_sections().unwrap_or(JsValue::NULL).dyn_into::<Array>().unwrap_or_default();
    let ids: Vec<String> = sections.iter().filter_map(|s| get(&s, "id").as_string()).collect();
    assert!(ids.iter().any(|id| id == "tube") && ids.iter().any(|id| id == "i-beam"), "{ids:?}");
    let materials = api::list_materials().unwrap_or(JsValue::NULL).dyn_into::<Array>().unwrap_or_default();
    let steel = materials.iter().find(|m| get(m, "id").as_string().as_deref() == Some("steel"));
    assert!(steel.is_some_and(|s| number(&s, "youngs_modulus") > 1e11));
    let units = api::list_units().unwrap_or(JsValue::NULL).dyn_into::<Array>().unwrap_or_default();
    assert!(units.iter().any(|u| get(&u, "symbol").as_string().as_deref() == Some("lbf")));
    assert!(!api::version().is_empty());
    // Outside a browser there is no document, and mounting finds nothing rather than failing.
    assert_eq!(api::mount_all(None, None, None), 0);
}
