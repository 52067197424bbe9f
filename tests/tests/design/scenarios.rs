//! The design study through the scenario format and the report: signed separations by hand
//! arithmetic, sensitivities against the beam equation's scaling laws, calibration round trips
//! and a published frequency parameter, resizing against re-solves of the scenario at the edges
//! it reports, and a tolerance band against a seeded Monte Carlo of whole scenarios.

use modebench::design::Design;
use modebench::Report;
use modebench_tests::random::Rng;
use serde_json::{json, Value};
use std::f64::consts::TAU;

fn solve(doc: &Value) -> Report {
    match modebench::solve_value(doc) {
        Ok(report) => report,
        Err(e) => panic!("{e} for {doc}"),
    }
}

fn elastic_hz(report: &Report) -> Vec<f64> {
    report.modes.iter().filter(|m| !m.rigid_body).map(|m| m.frequency_hz).collect()
}

/// The sensitivity of mode `mode` to the input at `path`.
fn sensitivity(d: &Design, mode: usize, path: &str) -> f64 {
    let j = d.inputs.iter().position(|i| i.path == path).unwrap_or_else(|| panic!("no input {path}"));
    let row = d.sensitivities.iter().find(|s| s.mode == mode).unwrap_or_else(|| panic!("no mode {mode}"));
    row.per_input[j].unwrap_or_else(|| panic!("no sensitivity of mode {mode} to {path}"))
}

#[test]
fn separations_are_signed_and_measured_from_the_nearer_end_of_a_speed_range() {
    // A pinned–pinned beam of L = 1 m, EI = 1, m = 1 has f₁ = π/2 Hz (f = (nπ)²/(2πL²)·√(EI/m),
    // the beam equation's closed form). A drive at 1 Hz puts it (π/2 − 1)/1 = +57 % above; a range
    // of 2 to 3 Hz puts it (π/2 − 2)/2 = −21 % below its bottom.
    let base = json!({
        "left": "pinned", "right": "pinned", "modes": 1,
        "segments": [{ "length": 1, "flexural_rigidity": 1, "mass_per_length": 1 }],
    });
    let f1 = std::f64::consts::PI / 2.0;
    let mut doc = base.clone();
    doc["excitations"] = json!([{ "frequency": "1 Hz" }]);
    let s = solve(&doc).modes[0].nearest_excitation.clone().expect("an excitation");
    assert!((s.separation - (f1 - 1.0)).abs() < 1e-12 && !s.too_close, "{s:?}");
    doc["excitations"] = json!([{ "frequency": "120 rpm", "up_to": "180 rpm" }]);
    let s = solve(&doc).modes[0].nearest_excitation.clone().expect("an excitation");
    assert!((s.separation - (f1 - 2.0) / 2.0).abs() < 1e-12 && s.up_to_hz == Some(3.0), "{s:?}");
    assert!(!s.too_close, "21 % clears the default 20 %");
    // Orders: 0.5 Hz × (1, 3) drives 0.5 and 1.5 Hz; π/2 lies 4.7 % above 1.5 Hz.
    doc["excitations"] = json!([{ "frequency": "0.5 Hz", "orders": "1, 3" }]);
    let s = solve(&doc).modes[0].nearest_excitation.clone().expect("an excitation");
    assert_eq!(s.order, 3.0);
    assert!((s.separation - (f1 - 1.5) / 1.5).abs() < 1e-12 && s.too_close, "{s:?}");
}

#[test]
fn sensitivities_of_a_uniform_pinned_beam_follow_its_scaling_laws() {
    // f = (nπ/L)²·√(EI/m)/(2π) for every mode n (the beam equation's closed form): ∂ln f/∂ln EI =
    // ½, ∂ln f/∂ln m = −½, ∂ln f/∂ln L = −2.
    let doc = json!({
        "left": "pinned", "right": "pinned", "modes": 6,
        "segments": [{ "length": "2.4 m", "flexural_rigidity": "3e4 N*m^2", "mass_per_length": "8 kg/m" }],
    });
    let d = solve(&doc).design;
    for mode in 1..=6 {
        for (path, want) in [
            ("segments[0].flexural_rigidity", 0.5),
            ("segments[0].mass_per_length", -0.5),
            ("segments[0].length", -2.0),
        ] {
            let got = sensitivity(&d, mode, path);
            assert!((got - want).abs() < 1e-7, "mode {mode}, {path}: {got} against {want}");
        }
    }
    // Through a section and a preset material: f ∝ √E for every mode, and a tube's frequencies
    // scale as the outer diameter at a fixed ratio of wall to diameter (√(I/A) ∝ D) — so the
    // diameter's and the wall's sensitivities add up to 1 when nothing else is attached.
    let doc = json!({
        "left": "clamped", "right": "free", "modes": 3,
        "segments": [{ "length": "1.2 m", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "4 mm" },
                       "material": "steel" }],
    });
    let d = solve(&doc).design;
    for mode in 1..=3 {
        let e = sensitivity(&d, mode, "segments[0].material.youngs_modulus");
        let rho = sensitivity(&d, mode, "segments[0].material.density");
        let sum = sensitivity(&d, mode, "segments[0].section.outer_diameter")
            + sensitivity(&d, mode, "segments[0].section.wall");
        assert!(
            (e - 0.5).abs() < 1e-7 && (rho + 0.5).abs() < 1e-7 && (sum - 1.0).abs() < 1e-6,
            "mode {mode}"
        );
    }
}

/// A cantilever of an elastic root carrying a tip mass, the root's rotational stiffness `kr`.
fn boom(kr: &str, tip: &str) -> Value {
    json!({
        "units": "si-mm", "modes": 3,
        "left": { "type": "elastic", "translational": "rigid", "rotational": kr },
        "right": "free",
        "segments": [{ "length": "1450 mm", "section": { "shape": "tube", "outer_diameter": "60 mm", "wall": "4 mm" },
                       "material": "aluminium-6061-t6" }],
        "attachments": [{ "type": "mass", "position": "1450 mm", "mass": tip }],
    })
}

#[test]
fn calibration_recovers_the_inputs_a_scenario_was_solved_with() {
    let truth = elastic_hz(&solve(&boom("2.5e4 N*m/rad", "2.8 kg")));
    // One unknown from mode 1, starting from a root ten times too stiff.
    let mut doc = boom("2.5e5 N*m/rad", "2.8 kg");
    doc["measured"] = json!([{ "mode": 1, "frequency": format!("{} Hz", truth[0]) }]);
    doc["calibrate"] = json!([{ "field": "left.rotational", "from": "1e3 N*m/rad", "to": "1e7 N*m/rad" }]);
    let c = solve(&doc).design.calibration.expect("a calibration");
    assert!(c.problem.is_none(), "{c:?}");
    assert!((c.fitted[0] / 2.5e4 - 1.0).abs() < 1e-7, "{c:?}");
    // Two unknowns from modes 1 and 2: the root and the tip mass, from a wrong start.
    let mut doc = boom("1e5 N*m/rad", "1.5 kg");
    doc["measured"] = json!([{ "mode": 1, "frequency": truth[0] }, { "mode": 2, "frequency": truth[1] }]);
    doc["calibrate"] = json!([
        { "field": "left.rotational", "from": "1e3 N*m/rad", "to": "1e7 N*m/rad" },
        { "field": "attachments[0].mass", "from": "0.5 kg", "to": "10 kg" },
    ]);
    let c = solve(&doc).design.calibration.expect("a calibration");
    assert!((c.fitted[0] / 2.5e4 - 1.0).abs() < 1e-5 && (c.fitted[1] / 2.8 - 1.0).abs() < 1e-5, "{c:?}");
    assert!(c.residuals.iter().all(|r| r.abs() < 1e-9) && c.condition.is_some_and(|k| k < 1e4), "{c:?}");
    assert!((c.fitted_hz[1] / truth[1] - 1.0).abs() < 1e-9);
}

#[test]
fn calibration_recovers_a_published_tip_mass_ratio() {
    // A uniform cantilever with a tip mass M = μ·mL: for μ = 1, λ₁ = 1.2479 (Blevins, Formulas for
    // Natural Frequency and Mode Shape, table 8-8 — from memory; mpmath on its frequency equation
    // gives 1.247917). With L = 1 m, EI = 1 N·m², m = 1 kg/m, f₁ = λ₁²/(2π). The four published
    // decimals hold λ to 4e-5 relative, which holds μ to about 3e-4.
    let lambda: f64 = 1.2479;
    let doc = json!({
        "left": "clamped", "right": "free", "modes": 2,
        "segments": [{ "length": 1, "flexural_rigidity": 1, "mass_per_length": 1 }],
        "attachments": [{ "type": "mass", "position": 1, "mass": "0.3 kg" }],
        "measured": [{ "mode": 1, "frequency": lambda * lambda / TAU }],
        "calibrate": [{ "field": "attachments[0].mass", "from": "0.01 kg", "to": "100 kg" }],
    });
    let c = solve(&doc).design.calibration.expect("a calibration");
    assert!((c.fitted[0] - 1.0).abs() < 1e-3, "μ = {:?}", c.fitted);
}

/// The fan floor beam (US customary) on a drive from 600 to 900 rpm, with the motor's pull at
/// twice line frequency, to be kept 15 % clear: mode 1 must stay above the fan, mode 2 off
/// 120 Hz, so two ranges of depth are feasible.
fn fan_on_its_drives() -> Value {
    let mut doc: Value =
        serde_json::from_str(include_str!("../../../docs/scenarios/fan-floor-beam-us.json")).expect("JSON");
    doc["excitations"] = json!([
        { "label": "fan", "frequency": "600 rpm", "up_to": "900 rpm" },
        { "label": "motor, twice line frequency", "frequency": "60 Hz", "orders": [2] },
    ]);
    doc["margin"] = json!("15 %");
    doc
}

#[test]
fn a_range_that_takes_the_model_where_it_cannot_be_solved_says_so_with_the_field_it_broke() {
    // The camera boom's length calibrated or resized from a quarter of it: the head at 1450 mm
    // is then off the beam. The answer says the range is the trouble and names what broke,
    // for a calibration and a resizing alike.
    let mut doc: Value =
        serde_json::from_str(include_str!("../../../docs/scenarios/sensor-boom.json")).expect("JSON");
    doc["measured"] = json!([{ "mode": 1, "frequency": "10.6 Hz" }]);
    doc["calibrate"] = json!([{ "field": "segments[0].length", "from": "362.5 mm", "to": "5800 mm" }]);
    doc["resize"] = json!({ "field": "segments[0].length", "from": "362.5 mm", "to": "5800 mm" });
    let design = solve(&doc).design;
    let problems = [
        design.calibration.and_then(|c| c.problem).map(|p| p.message),
        design.resize.and_then(|r| r.problem).map(|p| p.message),
    ];
    for problem in problems {
        let problem = problem.expect("a problem");
        assert!(
            problem.starts_with(
                "at some values in this range the model cannot be solved (Attachment 1, position: "
            ) && problem.ends_with("; narrow the range or choose another input"),
            "{problem}"
        );
    }
}

/// Whether every mode of a report clears every excitation, judged as the report judges it.
fn clear(doc: &Value) -> bool {
    solve(doc).modes.iter().all(|m| m.nearest_excitation.as_ref().is_none_or(|s| !s.too_close))
}

#[test]
fn resizing_a_floor_beam_reports_intervals_whose_edges_re_solve_as_it_says() {
    let mut doc = fan_on_its_drives();
    doc["resize"] =
        json!({ "field": "segments[0].section.depth", "from": "6 in", "to": "20 in", "points": 60 });
    let r = solve(&doc).design.resize.expect("a resizing");
    assert!(r.problem.is_none() && r.intervals.len() >= 2, "{:?}", r.intervals);
    let at = |depth: f64| {
        let mut d = doc.clone();
        d["segments"][0]["section"]["depth"] = json!(depth);
        d
    };
    let nudge = 1e-4 * (r.high - r.low);
    for &(a, b) in &r.intervals {
        assert!(clear(&at(a)) && clear(&at(b)) && clear(&at(0.5 * (a + b))), "[{a}, {b}]");
        if a > r.low {
            assert!(!clear(&at(a - nudge)), "just below {a} a margin must fail");
        }
        if b < r.high {
            assert!(!clear(&at(b + nudge)), "just above {b} a margin must fail");
        }
    }
    let nearest = r.nearest.expect("a feasible value");
    assert!(clear(&at(nearest)));
    assert_eq!(r.x.len(), 60);
    assert!(r.hz.iter().all(|f| f.len() == 4));
}

#[test]
fn a_tolerance_band_holds_a_seeded_monte_carlo_of_whole_scenarios() {
    // The wall ± 12.5 % (a pipe schedule's mill tolerance, common practice), the modulus ± 5 %
    // and the tip mass anywhere from 2.5 to 3 kg: every seeded draw lies inside every band.
    let mut doc = boom("2.5e4 N*m/rad", "2.8 kg");
    doc["tolerances"] = json!([
        { "field": "segments[0].section.wall", "plus_minus": "12.5 %" },
        { "field": "segments[0].material.youngs_modulus", "plus_minus": 0.05 },
        { "field": "attachments[0].mass", "from": "2.5 kg", "to": "3 kg" },
    ]);
    let d = solve(&doc).design;
    assert_eq!(d.bands.len(), 3);
    let Some(aluminium) = modebench::material::preset("aluminium-6061-t6") else { panic!("a preset") };
    let (e0, rho) = (aluminium.youngs_modulus, aluminium.density);
    let mut rng = Rng::new(0xBA_4D);
    for draw in 0..60 {
        let mut trial = boom("2.5e4 N*m/rad", "2.8 kg");
        trial["segments"][0]["section"]["wall"] = json!(0.004 * rng.range(0.875, 1.125));
        trial["segments"][0]["material"] =
            json!({ "youngs_modulus": e0 * rng.range(0.95, 1.05), "density": rho });
        trial["attachments"][0]["mass"] = json!(rng.range(2.5, 3.0));
        for (k, hz) in elastic_hz(&solve(&trial)).iter().enumerate() {
            let b = d.bands[k];
            assert!(
                *hz >= b.low_hz * (1.0 - 1e-9) && *hz <= b.high_hz * (1.0 + 1e-9),
                "draw {draw}, mode {}",
                k + 1
            );
        }
    }
}

#[test]
fn sensitivities_through_the_shapes_agree_with_central_differences_on_the_solver() {
    // What every solve reports (through the mode shapes, central differences on the solver only
    // for lengths and positions) against central differences on the exact solver alone, each
    // input written into the scenario and solved again: sections, presets, contents, masses,
    // springs, sprung masses, a temperature change and the other theory of the documented
    // scenarios. Both are good to about 1e-8 where
    // the step is central, 1e-5 where an input at the edge of its range allows only one side.
    use modebench::design::{inputs, sensitivity};
    for (case, text) in [
        ("sensor-boom", include_str!("../../../docs/scenarios/sensor-boom.json")),
        ("fan-floor-beam-us", include_str!("../../../docs/scenarios/fan-floor-beam-us.json")),
        ("filled-pipe-span", include_str!("../../../docs/scenarios/filled-pipe-span.json")),
        ("absorber-on-platform-beam", include_str!("../../../docs/scenarios/absorber-on-platform-beam.json")),
        ("fan-set-on-mounts", include_str!("../../../docs/scenarios/fan-set-on-mounts.json")),
        ("hot-line-between-anchors", include_str!("../../../docs/scenarios/hot-line-between-anchors.json")),
        ("pump-discharge-valve-us", include_str!("../../../docs/scenarios/pump-discharge-valve-us.json")),
        ("stub-shaft-timoshenko", include_str!("../../../docs/scenarios/stub-shaft-timoshenko.json")),
    ] {
        let doc: Value = serde_json::from_str(text).expect("JSON");
        let d = solve(&doc).design;
        assert!(!d.inputs.is_empty(), "{case}");
        let paths: Vec<modebench::FieldPath> =
            d.inputs.iter().map(|i| modebench::FieldPath::parse(&i.path).expect("a path")).collect();
        let values: Vec<f64> = d.inputs.iter().map(|i| i.value.expect("finite")).collect();
        let evaluator = inputs::Evaluator::new(&doc, &paths);
        let central =
            sensitivity::sensitivities(&|p: &[f64]| evaluator.frequencies(p), &values).expect("solves");
        for (k, row) in d.sensitivities.iter().enumerate() {
            for (j, got) in row.per_input.iter().enumerate() {
                let (Some(got), Some(want)) = (got, central[k][j]) else {
                    assert_eq!(
                        got.is_some(),
                        central[k][j].is_some(),
                        "{case}, mode {}, {}",
                        row.mode,
                        d.inputs[j].path
                    );
                    continue;
                };
                assert!(
                    (got - want).abs() < 1e-5 * (1.0 + want.abs()),
                    "{case}, mode {}, {}: {got} against {want}",
                    row.mode,
                    d.inputs[j].path
                );
            }
        }
    }
}

#[test]
fn a_tolerance_typed_with_its_value_is_the_tolerance_written_apart() {
    // "4 mm ± 12.5 %" and "2.8 ± 0.2 kg" in the fields mean what the same tolerances mean under
    // `tolerances` (the format's definition): the same echo, the same bands, bit for bit.
    let mut apart = boom("2.5e4 N*m/rad", "2.8 kg");
    // (Those typed are listed in the order of the scenario's keys: attachments before segments.)
    apart["tolerances"] = json!([
        { "field": "attachments[0].mass", "plus_minus": 0.2 / 2.8 },
        { "field": "segments[0].section.wall", "plus_minus": "12.5 %" },
    ]);
    let mut typed = boom("2.5e4 N*m/rad", "2.8 ± 0.2 kg");
    typed["segments"][0]["section"]["wall"] = json!("4 mm ± 12.5 %");
    let (a, t) = (solve(&apart), solve(&typed));
    assert_eq!(elastic_hz(&a), elastic_hz(&t));
    assert_eq!(a.design.bands, t.design.bands);
    assert_eq!(a.design.tolerances, t.design.tolerances);
    assert_eq!(t.design.tolerances.len(), 2);
    // The mass's band edges are the ends of 2.6 to 3.0 kg.
    let mass = &t.design.tolerances[0];
    assert!(
        mass.low.is_some_and(|v| (v - 2.6).abs() < 1e-12)
            && mass.high.is_some_and(|v| (v - 3.0).abs() < 1e-12)
    );
}

#[test]
fn resizing_within_tolerance_bands_reports_intervals_whose_edges_re_solve_on_the_bands() {
    // The floor beam and drives above, with the steel's modulus ± 5 %, the fan's mass ± 10 % and
    // the depth ± 2 % (which moves with the depth tried): the intervals are where every mode's
    // band keeps the margin, judged as the report judges a band (on its nearer edge). So at each
    // interval's ends and middle the scenario re-solved with its tolerances clears every margin,
    // and just outside an end a margin fails; and each interval lies inside one found without
    // the tolerances (a band holds its nominal frequency).
    let mut doc = fan_on_its_drives();
    doc["tolerances"] = json!([
        { "field": "segments[0].material.youngs_modulus", "plus_minus": "5 %" },
        { "field": "attachments[0].mass", "plus_minus": "10 %" },
        { "field": "segments[0].section.depth", "plus_minus": "2 %" },
    ]);
    let tolerant = doc.clone();
    let at = |depth: f64| {
        let mut d = tolerant.clone();
        d["segments"][0]["section"]["depth"] = json!(depth);
        d
    };
    doc["resize"] =
        json!({ "field": "segments[0].section.depth", "from": "6 in", "to": "20 in", "points": 60 });
    let r = solve(&doc).design.resize.expect("a resizing");
    assert!(r.problem.is_none() && !r.intervals.is_empty(), "{r:?}");
    let nudge = 1e-4 * (r.high - r.low);
    for &(a, b) in &r.intervals {
        assert!(clear(&at(a)) && clear(&at(b)) && clear(&at(0.5 * (a + b))), "[{a}, {b}]");
        if a > r.low {
            assert!(!clear(&at(a - nudge)), "just below {a} a margin must fail");
        }
        if b < r.high {
            assert!(!clear(&at(b + nudge)), "just above {b} a margin must fail");
        }
    }
    assert!(clear(&at(r.nearest.expect("a feasible value"))));
    let mut nominal = doc.clone();
    nominal.as_object_mut().map(|m| m.remove("tolerances"));
    let without = solve(&nominal).design.resize.expect("a resizing").intervals;
    for &(a, b) in &r.intervals {
        assert!(without.iter().any(|&(c, d)| c <= a && b <= d), "[{a}, {b}] is not within {without:?}");
    }
    assert!(r.intervals != without, "the bands must narrow what is feasible");
}
