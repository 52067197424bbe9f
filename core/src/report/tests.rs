//! The report against its own quick path and its JSON.

use super::*;
use crate::error::Result;

const SCENARIOS: [&str; 4] = [
    include_str!("../../../docs/scenarios/sensor-boom.json"),
    include_str!("../../../docs/scenarios/fan-floor-beam-us.json"),
    include_str!("../../../docs/scenarios/filled-pipe-span.json"),
    include_str!("../../../docs/scenarios/absorber-on-platform-beam.json"),
];

fn both(value: &serde_json::Value) -> (Result<Vec<f64>>, Result<Vec<f64>>) {
    let quick = frequencies_value(value);
    let full = solve_value(value).map(|r| r.modes.iter().map(|m| m.frequency_hz).collect());
    (quick, full)
}

#[test]
fn the_quick_frequencies_are_the_reports_bit_for_bit() {
    for text in SCENARIOS {
        let Ok(doc) = serde_json::from_str::<serde_json::Value>(text) else { panic!("{text}") };
        let mut cases = vec![doc.clone()];
        // The other theory, and a beam free at both ends (two rigid-body modes at 0 Hz).
        let mut other = doc.clone();
        other["theory"] = serde_json::json!("timoshenko");
        cases.push(other);
        let mut free = doc.clone();
        free["left"] = serde_json::json!("free");
        free["right"] = serde_json::json!("free");
        cases.push(free);
        for case in cases {
            let (quick, full) = match both(&case) {
                (Ok(quick), Ok(full)) => (quick, full),
                // Shear needs a section; a beam given by EI and mass alone cannot be Timoshenko.
                (Err(quick), Err(full)) if case["theory"] == "timoshenko" => {
                    assert_eq!(quick.to_string(), full.to_string());
                    continue;
                }
                other => panic!("{case}: {other:?}"),
            };
            assert!(!quick.is_empty());
            let same =
                quick.len() == full.len() && quick.iter().zip(&full).all(|(a, b)| a.to_bits() == b.to_bits());
            assert!(same, "{case}: {quick:?} quick, {full:?} in the report");
        }
    }
}

/// A report crosses to another thread as JSON text (the browser solves in a worker): read
/// back, it equals the one written, bit for bit (`PartialEq` on every `f64`).
#[test]
fn a_report_reads_back_from_its_json_as_itself() {
    for text in SCENARIOS {
        let Ok(report) = solve_json(text) else { panic!("{text}") };
        let Ok(json) = serde_json::to_string(&report) else { panic!("{text}") };
        let back: Report = match serde_json::from_str(&json) {
            Ok(back) => back,
            Err(e) => panic!("{e}: {json}"),
        };
        assert_eq!(back, report, "{json}");
    }
}

/// The kinds' `id` is the name they serialise to, so that a page writes what a report says.
#[test]
fn kinds_name_themselves_as_they_serialise() {
    for kind in EndKind::ALL {
        assert_eq!(serde_json::to_value(kind).ok(), Some(serde_json::json!(kind.id())));
    }
    for kind in AttachmentKind::ALL {
        assert_eq!(serde_json::to_value(kind).ok(), Some(serde_json::json!(kind.id())));
    }
    for code in crate::analysis::WarningCode::ALL {
        assert_eq!(serde_json::to_value(code).ok(), Some(serde_json::json!(code.id())));
    }
}

#[test]
fn a_scenario_the_quick_path_refuses_is_refused_by_the_report_with_the_same_message() {
    let Ok(mut doc) = serde_json::from_str::<serde_json::Value>(SCENARIOS[0]) else { panic!() };
    for (field, value) in [("modes", serde_json::json!(0)), ("left", serde_json::json!("welded"))] {
        let mut case = doc.clone();
        case[field] = value;
        let (Err(quick), Err(full)) = both(&case) else { panic!("{case} should be refused") };
        assert_eq!(quick.to_string(), full.to_string());
    }
    doc["attachments"][0]["mass"] = serde_json::json!("2.8 furlongs");
    let (Err(quick), Err(full)) = both(&doc) else { panic!("a length is not a mass") };
    assert_eq!(quick.to_string(), full.to_string());
}
