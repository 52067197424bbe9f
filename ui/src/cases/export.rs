//! What a case is saved as: the scenario file in the documented format, the results as CSV (one
//! row per mode, SI units named in the header) and as JSON (the scenario as typed beside the
//! engine's report), and the file names they get.

use crate::doc::text;
use modebench::Report;
use serde_json::Value;

/// The scenario as a file: the documented format, exactly as typed.
pub fn scenario_file(scenario: &Value) -> String {
    let mut out = text::write(scenario);
    out.push('\n');
    out
}

/// A file name from the case's title: its ASCII letters and digits in lower case, words joined by
/// hyphens, and `extension` (ASCII only, which every file system and mail client takes, and
/// which keeps Unicode's case tables out of the page's engine).
pub fn file_name(scenario: &Value, suffix: &str, extension: &str) -> String {
    let title = super::title_of(scenario).to_ascii_lowercase();
    let mut name = String::new();
    for word in title.split(|c: char| !c.is_ascii_alphanumeric()).filter(|w| !w.is_empty()) {
        if name.len() + word.len() > 60 {
            break;
        }
        if !name.is_empty() {
            name.push('-');
        }
        name.push_str(word);
    }
    if name.is_empty() {
        name.push_str("case");
    }
    format!("{name}{suffix}.{extension}")
}

/// The header of the results' CSV.
pub const CSV_HEADER: &str = "mode,frequency_hz,rpm,rigid_body,multiplicity,finite_element_hz,accuracy,\
                              other_theory_hz,generalized_mass_kg,nodes_m";

/// The results as CSV: one row per mode, numbers in SI as the engine gives them (full
/// precision, a point for the decimal), empty where there is no value; nodes separated by
/// spaces in one quoted cell.
pub fn results_csv(report: &Report) -> String {
    let mut out = String::from(CSV_HEADER);
    out.push_str("\r\n");
    let opt = |v: Option<f64>| v.map(|v| v.to_string()).unwrap_or_default();
    for m in &report.modes {
        let nodes: Vec<String> = m.nodes.iter().map(f64::to_string).collect();
        out.push_str(&format!(
            "{},{},{},{},{},{},{},{},{},\"{}\"\r\n",
            m.number,
            m.frequency_hz,
            m.rpm,
            m.rigid_body,
            m.multiplicity,
            opt(m.fe_frequency_hz),
            opt(m.accuracy),
            opt(m.other_theory_hz),
            m.generalized_mass,
            nodes.join(" ")
        ));
    }
    out
}

/// The results as JSON: `{"scenario": …as typed…, "report": …}`, where `report` is the engine's
/// report exactly as its worker wrote it (the worker's answer `{"report": …}`).
pub fn results_json(scenario: &Value, answer: &str) -> Option<String> {
    let report = answer.trim().strip_prefix("{\"report\":")?.strip_suffix('}')?;
    Some(format!("{{\"scenario\":{},\"report\":{report}}}\n", text::write(scenario)))
}

/// The scenario in a file the reader opened: a scenario file, or a results file (whose
/// `scenario` is the case as typed). An error says what the file is not.
pub fn scenario_from_file(text: &str) -> Result<Value, String> {
    let value = crate::doc::read(text).map_err(|e| {
        if e.path.is_empty() {
            format!("the file is not a scenario: {}", e.message)
        } else {
            // A field given twice: the place and the words, as the calculator shows them.
            format!("in the file, {e}")
        }
    })?;
    let scenario = match value.get("scenario") {
        Some(inner) if value.get("report").is_some() => inner.clone(),
        _ => value,
    };
    if scenario.is_object() {
        Ok(scenario)
    } else {
        Err("the file is not a scenario: a scenario is a JSON object, { … }".into())
    }
}
