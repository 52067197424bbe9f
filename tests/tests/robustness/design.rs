//! Design requests that are badly put or have no answer: a refusal naming the field and what is
//! allowed, or a report that says why there is no answer; never a panic or a NaN.

use super::{assert_plain, shows_non_finite};
use serde_json::{json, Value};

/// The camera boom with an elastic root, a tip mass, the fan and the mains.
fn boom() -> Value {
    json!({
        "units": "si-mm", "modes": 3,
        "left": { "type": "elastic", "translational": "rigid", "rotational": "2.5e4 N*m/rad" },
        "right": "free",
        "segments": [{ "length": "1450 mm", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "4 mm" },
                       "material": "aluminium-6061-t6" }],
        "attachments": [{ "type": "mass", "position": "1450 mm", "mass": "2.8 kg" }],
        "excitations": [{ "label": "cell fan", "frequency": "1480 rpm" }, { "frequency": "50 Hz", "orders": "1, 2" }],
    })
}

/// The boom's segment with the wall written as `wall`.
fn tube(wall: &str) -> Value {
    json!([{ "length": "1450 mm", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": wall },
             "material": "aluminium-6061-t6" }])
}

fn with(changes: Value) -> Value {
    let mut doc = boom();
    for (k, v) in changes.as_object().into_iter().flatten() {
        doc[k] = v.clone();
    }
    doc
}

#[test]
fn badly_put_requests_are_refused_by_their_field() {
    let measured = json!([{ "mode": 1, "frequency": "6 Hz" }]);
    let cases = [
        // A range that crosses zero.
        (
            json!({ "measured": measured, "calibrate": [{ "field": "left.rotational", "from": "-1 N*m/rad", "to": "1e6 N*m/rad" }] }),
            "calibrate[0].from",
            "cross zero",
        ),
        (
            json!({ "resize": { "field": "attachments[0].position", "from": "-100 mm", "to": "1000 mm" } }),
            "resize.from",
            "cross zero",
        ),
        // A range that runs backwards, and one that reaches rigid where a fit needs a number.
        (
            json!({ "resize": { "field": "segments[0].section.wall", "from": "5 mm", "to": "3 mm" } }),
            "resize.to",
            "upwards",
        ),
        (
            json!({ "measured": measured, "calibrate": [{ "field": "left.rotational", "from": "1e3 N*m/rad", "to": "rigid" }] }),
            "calibrate[0].from",
            "finite",
        ),
        // Something that is not a numeric input, and a path that is not a path.
        (
            json!({ "tolerances": [{ "field": "excitations[0].frequency", "plus_minus": "5 %" }] }),
            "tolerances[0].field",
            "numeric input",
        ),
        (
            json!({ "tolerances": [{ "field": "segments[x].wall", "plus_minus": "5 %" }] }),
            "tolerances[0].field",
            "path",
        ),
        // A tolerance of 150 %, and one given twice over.
        (
            json!({ "tolerances": [{ "field": "segments[0].section.wall", "plus_minus": "150 %" }] }),
            "tolerances[0].plus_minus",
            "below 1",
        ),
        (
            json!({ "tolerances": [{ "field": "segments[0].section.wall", "plus_minus": 0.1, "from": "3 mm", "to": "5 mm" }] }),
            "tolerances[0].plus_minus",
            "not both",
        ),
        // A tolerance typed with its value: too wide, not a tolerance, larger than the value, and
        // typed with a running speed, which is not an input of the beam.
        (json!({ "segments": tube("4 mm ± 150 %") }), "segments[0].section.wall", "percentage"),
        (json!({ "segments": tube("4 mm ± abc") }), "segments[0].section.wall", "\"6.02 mm ± 12.5 %\""),
        (json!({ "segments": tube("4 ± 5 mm") }), "segments[0].section.wall", "smaller than the value"),
        (
            json!({ "excitations": [{ "frequency": "1480 rpm +/- 2 %" }] }),
            "excitations[0].frequency",
            "numeric input of the beam",
        ),
        // An end between pinned and clamped that is held otherwise, and an unknown pair.
        (
            json!({ "left": "free", "tolerances": [{ "field": "left", "from": "pinned", "to": "clamped" }] }),
            "left",
            "translation",
        ),
        (
            json!({ "tolerances": [{ "field": "left", "from": "pinned", "to": "free" }] }),
            "tolerances[0].from",
            "pinned",
        ),
        // A measured mode that was not computed, a calibration without measurements, three unknowns.
        (json!({ "measured": [{ "mode": 9, "frequency": "60 Hz" }] }), "measured[0].mode", "modes up to 3"),
        // Values outside the ranges the format's documentation gives (docs/scenario-format.md:
        // a mode's number from 1, a measured frequency above zero, 20 to 1000 points), each
        // refused at its own field and not at a field inside it.
        (
            json!({ "measured": [{ "mode": 0, "frequency": "60 Hz" }] }),
            "measured[0].mode",
            "a whole number from 1 to 26",
        ),
        (
            json!({ "measured": [{ "mode": 1, "frequency": "-10 Hz" }] }),
            "measured[0].frequency",
            "must be greater than zero",
        ),
        (
            json!({ "resize": { "field": "segments[0].section.wall", "from": "2 mm", "to": "8 mm", "points": 5 } }),
            "resize.points",
            "a whole number from 20 to 1000",
        ),
        (
            json!({ "calibrate": [{ "field": "left.rotational", "from": "1e3 N*m/rad", "to": "1e7 N*m/rad" }] }),
            "measured",
            "measured",
        ),
        // Orders that are not orders.
        (
            json!({ "excitations": [{ "frequency": "50 Hz", "orders": "1, two" }] }),
            "excitations[0].orders",
            "orders",
        ),
        (
            json!({ "excitations": [{ "frequency": "50 Hz", "orders": [0] }] }),
            "excitations[0].orders",
            "order",
        ),
        (
            json!({ "excitations": [{ "frequency": "50 Hz", "orders": [1], "harmonics": 2 }] }),
            "excitations[0].harmonics",
            "not both",
        ),
        (
            json!({ "excitations": [{ "frequency": "1800 rpm", "up_to": "600 rpm" }] }),
            "excitations[0].up_to",
            "below",
        ),
    ];
    for (i, (changes, path, words)) in cases.into_iter().enumerate() {
        let doc = with(changes);
        let case = format!("design case {i}");
        match modebench::solve_value(&doc) {
            Ok(_) => panic!("{case}: accepted {doc}"),
            Err(e) => {
                assert_plain(&e, &case);
                assert_eq!(e.path.to_string(), path, "{case}: {e}");
                assert!(e.message.contains(words), "{case}: {e}");
            }
        }
    }
}

#[test]
fn requests_without_an_answer_say_why_and_show_no_nan() {
    let check = |doc: &Value, case: &str| {
        let report = modebench::solve_value(doc).unwrap_or_else(|e| panic!("{case}: {e}"));
        assert!(report.is_finite(), "{case}");
        let mut shown = String::new();
        let text = serde_json::to_string(&report.design).unwrap_or_default();
        shown.push_str(&text);
        assert!(!shows_non_finite(&shown, &[]), "{case}: {shown:.300}");
        report.design
    };
    // A measurement no root stiffness reaches: even a rigid root leaves mode 1 far below 60 Hz.
    let d = check(
        &with(json!({
            "measured": [{ "mode": 1, "frequency": "60 Hz" }],
            "calibrate": [{ "field": "left.rotational", "from": "1e2 N*m/rad", "to": "1e9 N*m/rad" }],
        })),
        "unreachable",
    );
    let c = d.calibration.expect("a calibration");
    assert!(
        c.fitted.is_empty()
            && c.problem.as_ref().is_some_and(|p| p.message.contains("no value in the range")),
        "{c:?}"
    );
    // No depth clears a band of drives over every frequency the modes can take.
    let d = check(
        &with(json!({
            "excitations": [{ "frequency": "0.1 Hz", "up_to": "5000 Hz" }],
            "resize": { "field": "segments[0].section.wall", "from": "2 mm", "to": "8 mm", "points": 20 },
        })),
        "nothing feasible",
    );
    let r = d.resize.expect("a resizing");
    assert!(r.intervals.is_empty() && r.nearest.is_none() && r.problem.is_some(), "{r:?}");
    // Two unknowns the measurements cannot tell apart: a uniform beam's EI and its mass per
    // length move every frequency only through EI/m, so the fit is singular; it says so.
    let doc = json!({
        "left": "pinned", "right": "pinned", "modes": 2,
        "segments": [{ "length": 2, "flexural_rigidity": "3e4 N*m^2", "mass_per_length": "8 kg/m" }],
        "measured": [{ "mode": 1, "frequency": "30 Hz" }, { "mode": 2, "frequency": "120 Hz" }],
        "calibrate": [
            { "field": "segments[0].flexural_rigidity", "from": "1e3 N*m^2", "to": "1e6 N*m^2" },
            { "field": "segments[0].mass_per_length", "from": "1 kg/m", "to": "100 kg/m" },
        ],
    });
    let c = check(&doc, "singular").calibration.expect("a calibration");
    assert!(c.notes.iter().any(|n| n.contains("cannot tell them apart")), "{c:?}");
    assert!(c.residuals.iter().all(|r| r.is_finite()));
}
