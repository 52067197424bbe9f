//! The JavaScript API of the WebAssembly module, for pages, their solving worker and tests.
//!
//! ```js
//! import init, { solve, parseQuantity, listSections, listMaterials, listUnits, mountAll, version }
//!   from "./modebench_web.js";
//! await init();
//! mountAll(new URL("solve-worker.js", import.meta.url).href);  // start every calculator on the page
//! const report = solve({ left: "clamped", right: "free",
//!   segments: [{ length: "1 m", flexural_rigidity: 1, mass_per_length: 1 }] });
//! report.modes[0].frequency_hz;               // plain objects, SI units, null where no value
//! parseQuantity("30e6 psi", "pressure");      // { si: 206842718795.3, si_unit: "Pa", conversion: "30e6 psi = …" }
//! try { solve({}) } catch (e) { e.path; e.kind; e.value; e.message }
//! ```
//!
//! Which of these a build exports depends on its features: `mountAll` with `page`,
//! `solveForPage` (the worker's entry point) with `solver`, the rest with `api`; `version`
//! always. Pages load a `page` build and their worker a `solver` build.
//!
//! Every failure is thrown as a JS `Error` carrying `path` (the scenario field, `""` for the
//! whole input), `kind` (as `"unknown-unit"`) and `value` (what was written, or `null`), made by
//! one helper, [`js_error`]. Nothing panics across the boundary; should a defect panic anyway,
//! the hook installed at start-up says so on the console.

#[cfg(feature = "api")]
use modebench::units::Kind;
use modebench::Error;
#[cfg(feature = "api")]
use modebench::ErrorKind;
#[cfg(feature = "api")]
use serde::Serialize;
use wasm_bindgen::prelude::*;

/// Installs the panic hook when the module starts.
#[wasm_bindgen(start)]
fn start() {
    std::panic::set_hook(Box::new(|info| {
        web_sys::console::error_1(
            &format!("Modebench stopped on an internal error; please report it with the scenario: {info}")
                .into(),
        );
    }));
}

/// Turns a core error into a JS `Error` with `path`, `kind` and `value` properties.
pub fn js_error(error: &Error) -> JsValue {
    let js = js_sys::Error::new(&error.to_string());
    let kind = error.kind.id();
    let value = error.value.as_deref().map_or(JsValue::NULL, JsValue::from_str);
    // Setting a property on a fresh Error object cannot fail; there is nothing to do if it did.
    let _ = js_sys::Reflect::set(&js, &"path".into(), &error.path.to_string().into());
    let _ = js_sys::Reflect::set(&js, &"kind".into(), &kind.into());
    let _ = js_sys::Reflect::set(&js, &"value".into(), &value);
    js.into()
}

#[cfg(feature = "api")]
/// Converts a value to plain JS objects (maps as objects, `None` as `null`).
fn to_js<T: Serialize + ?Sized>(value: &T) -> Result<JsValue, JsValue> {
    value.serialize(&serde_wasm_bindgen::Serializer::json_compatible()).map_err(|e| {
        js_error(&Error::new(ErrorKind::Syntax, format!("the result could not be converted: {e}")))
    })
}

/// Solves a scenario given as a JS object in the scenario format and returns the report: SI
/// values, frequencies in hertz, `null` where a method gives no value. Throws an `Error` with
/// `path`, `kind` and `value` when the scenario is wrong.
#[cfg(feature = "api")]
#[wasm_bindgen]
pub fn solve(scenario: JsValue) -> Result<JsValue, JsValue> {
    // Going through JSON text lets core's reader name the field path of any mistake.
    let text = js_sys::JSON::stringify(&scenario).ok().and_then(|t| JsValue::from(t).as_string());
    let Some(text) = text else {
        return Err(js_error(&Error::new(
            ErrorKind::Syntax,
            "the scenario must be a plain object that can be written as JSON",
        )));
    };
    let doc = crate::doc::read(&text).map_err(|e| js_error(&e))?;
    let report = modebench::solve_value(&doc).map_err(|e| js_error(&e))?;
    to_js(&report)
}

/// What `parseQuantity` returns.
#[cfg(feature = "api")]
#[derive(Serialize)]
struct Parsed {
    si: f64,
    si_unit: &'static str,
    conversion: Option<String>,
}

/// Reads a quantity such as `"30e6 psi"` for a field of the given kind (`"length"`, `"pressure"`,
/// `"stiffness"`, … as in the scenario format) and returns `{ si, si_unit, conversion }`.
/// Throws an `Error` naming what is allowed when the text or the kind is wrong.
#[cfg(feature = "api")]
#[wasm_bindgen(js_name = parseQuantity)]
pub fn parse_quantity(text: &str, kind: &str) -> Result<JsValue, JsValue> {
    let kind = Kind::from_id(kind).ok_or_else(|| {
        let names: Vec<&str> = Kind::ALL.iter().map(|k| k.id()).collect();
        js_error(
            &Error::new(
                ErrorKind::UnknownOption,
                format!("unknown kind of quantity; use one of {}", names.join(", ")),
            )
            .at("kind")
            .with_value(kind),
        )
    })?;
    let converted = modebench::units::parse(text, kind).map_err(|e| js_error(&e))?;
    to_js(&Parsed {
        si: converted.si,
        si_unit: kind.si_unit(),
        conversion: converted.conversion.map(|c| c.text),
    })
}

/// The section shapes the editor offers, each with its fields (`name`, `label`, `kind`,
/// `optional`).
#[cfg(feature = "api")]
#[wasm_bindgen(js_name = listSections)]
pub fn list_sections() -> Result<JsValue, JsValue> {
    to_js(&crate::catalog::SHAPES[..])
}

/// The preset materials with their properties in SI and their sources.
#[cfg(feature = "api")]
#[wasm_bindgen(js_name = listMaterials)]
pub fn list_materials() -> Result<JsValue, JsValue> {
    to_js(modebench::material::presets())
}

/// Every accepted unit symbol with its name, what it measures and its SI factor.
#[cfg(feature = "api")]
#[wasm_bindgen(js_name = listUnits)]
pub fn list_units() -> Result<JsValue, JsValue> {
    to_js(&modebench::units::unit_list())
}

/// Starts every calculator on the page (`.mb-calc[data-modebench]`) that is not live yet and
/// returns how many were started. `worker` is the URL of the solving worker's script
/// (`solve-worker.js`, which loads the `solver` build beside it); without it, the script is
/// looked for at `assets/solve-worker.js` from the page. `io` is what the calculators ask of the
/// browser to share and save cases (`assets/case-io.js`: `link`, `download`, `pickFile` and the
/// `incoming` case of a link); without it they keep cases but cannot share or save them.
/// `start`, when given, starts each worker instead of `new Worker(worker, {type: "module"})`:
/// called with the URL, it returns an object with a worker's `postMessage`, `terminate`,
/// `onmessage` and `onerror` (the site's `boot.js` passes one that solves a model quick to solve
/// on the page itself, with its own copy of the solver engine, and the rest in the worker).
#[cfg(feature = "page")]
#[wasm_bindgen(js_name = mountAll)]
pub fn mount_all(
    worker: Option<String>,
    io: Option<js_sys::Object>,
    start: Option<js_sys::Function>,
) -> usize {
    let io = io.map(JsValue::from).unwrap_or(JsValue::UNDEFINED);
    crate::widget::mount_all(worker.as_deref().unwrap_or("assets/solve-worker.js"), &io, start)
}

/// Solves a scenario given as JSON text and returns the answer as JSON text: `{"report": …}`
/// or `{"error": {kind, path, value, message}}`; it never throws. For integrators: the
/// calculator's worker calls [`solve_for_page`], and the solver's engine exports only that, so
/// that the whole solve is not compiled into it twice.
#[cfg(feature = "api")]
#[wasm_bindgen(js_name = solveScenario)]
pub fn solve_scenario(scenario: &str) -> String {
    crate::worker::message::solve(scenario)
}

/// Solves a scenario given as JSON text for the page, drawn for the reader's view (`mode`, the
/// mode plotted; `open`, the `data-part` names of the sections left open, one space between
/// them), and returns four values: the answer whole, `{"report": …}` or
/// `{"error": {kind, path, value, message}}`; the answer the page reads (every mode's shape cut
/// to the samples its plot needs; the same text for an error); and, for a report that is not
/// long, the inside of the results element and of the one-line summary as the page draws them
/// (`undefined` otherwise). The solving worker's whole job: it posts them all, and the page draws
/// the markup, reads the second text when it needs the report, and keeps the first for the
/// results file and the tap-test panel. With `draw` false the markup is not written (the two
/// last values are `undefined`): the worker's warm-up while the reader types. It never throws.
#[cfg(feature = "solver")]
#[wasm_bindgen(js_name = solveForPage)]
pub fn solve_for_page(scenario: &str, mode: f64, open: &str, draw: Option<bool>) -> js_sys::Array {
    use crate::worker::message;
    let view = message::view_from_message(mode, open);
    let page = message::solve_for_page(scenario, draw.unwrap_or(true).then_some(&view));
    let whole = JsValue::from_str(&page.whole);
    let read = page.thinned.map_or_else(|| whole.clone(), |v| JsValue::from_str(&v));
    let (results, summary) = match page.drawn {
        Some(d) => (JsValue::from_str(&d.results), JsValue::from_str(&d.summary)),
        None => (JsValue::UNDEFINED, JsValue::UNDEFINED),
    };
    js_sys::Array::of4(&whole, &read, &results, &summary)
}

/// The version of this module.
#[wasm_bindgen]
pub fn version() -> String {
    env!("CARGO_PKG_VERSION").to_string()
}
