//! Shear deformation and rotary inertia: the exact Timoshenko member against the closed-form
//! pinned–pinned frequency equation, its clamped–clamped count against finite elements, the
//! slender limit, and the warning that says when the slender-beam theory errs.

use modebench::fe::{self, Mesh};
use modebench::{exact, solve_json, End, Model, ModelParts, Segment, Theory};
use modebench_tests::random::{self, Kinds, Rng};
use modebench_tests::{check, relative_error};

/// A steel rectangle 50 mm wide with the given depth: E = 200 GPa, ν = 0.3, ρ = 7850 kg/m³,
/// κ = 10(1+ν)/(12+11ν) (Cowper 1966).
fn steel_rectangle(length: f64, depth: f64) -> Segment {
    let (e, nu, rho, width) = (200e9, 0.3, 7850.0, 0.05);
    let (area, second) = (width * depth, width * depth.powi(3) / 12.0);
    let kappa = 10.0 * (1.0 + nu) / (12.0 + 11.0 * nu);
    Segment {
        length,
        flexural_rigidity: e * second,
        mass_per_length: rho * area,
        shear_rigidity: Some(kappa * e / (2.0 * (1.0 + nu)) * area),
        rotary_inertia_per_length: rho * second,
    }
}

fn beam(segment: Segment, left: End, right: End, theory: Theory) -> Model {
    Model::new(ModelParts { segments: vec![segment], left, right, attachments: vec![], theory })
        .expect("valid")
}

#[test]
fn pinned_pinned_matches_the_closed_form_frequency_equation() {
    // ρA·ρI·ω⁴ − ω²[κGA·ρI·k² + ρA·EI·k² + ρA·κGA] + κGA·EI·k⁴ = 0, k = nπ/L, lower root: the
    // Timoshenko frequency equation of a simply supported beam (Han, Benaroya & Wei, J. Sound
    // Vib. 225(5), 1999 — from memory).
    for slenderness in [5.0, 10.0, 20.0] {
        let s = steel_rectangle(1.0, 1.0 / slenderness);
        let model = beam(s.clone(), End::Pinned, End::Pinned, Theory::Timoshenko);
        let got = exact::frequencies(&model, 6).expect("solves");
        let (ra, ri, ei, kga) =
            (s.mass_per_length, s.rotary_inertia_per_length, s.flexural_rigidity, s.shear_rigidity.unwrap());
        for (i, w) in got.iter().enumerate() {
            let k = (i + 1) as f64 * std::f64::consts::PI;
            let (a, b, c) = (ra * ri, kga * ri * k * k + ra * ei * k * k + ra * kga, kga * ei * k.powi(4));
            let expected = ((b - (b * b - 4.0 * a * c).sqrt()) / (2.0 * a)).sqrt();
            check(
                &format!("pinned–pinned Timoshenko, L/h = {slenderness}, mode {}", i + 1),
                "closed-form frequency equation (Han, Benaroya & Wei 1999, from memory)",
                expected,
                *w,
                1e-10,
            );
        }
    }
}

#[test]
fn clamped_clamped_count_agrees_with_fine_finite_elements() {
    // A clamped–clamped member has no free unknowns, so its exact frequencies come from the
    // member's own clamped–clamped count J₀ alone; a fine mesh of shear-flexible elements is an
    // independent way to the same frequencies (to its discretisation error).
    for slenderness in [4.0, 8.0, 25.0] {
        let model =
            beam(steel_rectangle(1.0, 1.0 / slenderness), End::Clamped, End::Clamped, Theory::Timoshenko);
        let exact = exact::frequencies(&model, 8).expect("solves");
        // The shear-flexible element converges as h² (measured: error ×¼ per halving), so a
        // fine mesh and a Richardson step (4·f_2n − f_n)/3 give an independent value to ~1e-7.
        let f1 = fe::frequencies(&model, 8, Mesh::Total(200)).expect("solves").omegas;
        let f2 = fe::frequencies(&model, 8, Mesh::Total(400)).expect("solves").omegas;
        for (i, e) in exact.iter().enumerate() {
            let extrapolated = (4.0 * f2[i] - f1[i]) / 3.0;
            check(
                &format!("clamped–clamped, L/h = {slenderness}, mode {}", i + 1),
                "finite elements, 200 and 400, extrapolated",
                *e,
                extrapolated,
                2e-6,
            );
        }
    }
}

#[test]
fn timoshenko_tends_to_euler_bernoulli_as_the_beam_gets_slender() {
    // The shear and rotary-inertia correction falls like (h/L)² (first-order expansion of the
    // pinned–pinned equation), so the gap must shrink about fourfold per doubling of L/h.
    let mut previous = f64::INFINITY;
    for slenderness in [10.0, 20.0, 40.0, 80.0, 160.0] {
        let s = steel_rectangle(1.0, 1.0 / slenderness);
        let t = exact::frequencies(&beam(s.clone(), End::Clamped, End::Free, Theory::Timoshenko), 3)
            .expect("solves");
        let e =
            exact::frequencies(&beam(s, End::Clamped, End::Free, Theory::EulerBernoulli), 3).expect("solves");
        let gap = 1.0 - t[2] / e[2];
        assert!(gap > 0.0, "Timoshenko must lie below Euler–Bernoulli");
        assert!(gap < previous / 3.0, "L/h = {slenderness}: gap {gap:e} after {previous:e}");
        previous = gap;
    }
    assert!(previous < 2e-3, "at L/h = 160 the third mode differs by {previous:e}");
}

#[test]
fn finite_elements_converge_to_the_exact_timoshenko_frequencies() {
    let mut rng = Rng::new(21);
    let kinds = Kinds { unrestrained: true, sprung: true, supports: true, timoshenko: true };
    for i in 0..12 {
        let model = random::model(&mut rng, kinds);
        let exact = exact::frequencies(&model, 5).expect("solves");
        let fe = fe::frequencies(&model, 5, Mesh::Total(200)).expect("solves").omegas;
        for (k, (e, f)) in exact.iter().zip(&fe).enumerate() {
            assert!(relative_error(*e, *f) < 1e-3, "model {i} mode {}: exact {e} FE {f}", k + 1);
            assert!(*f >= e * (1.0 - 1e-9), "FE must not fall below exact (Rayleigh–Ritz)");
        }
        // The default mesh is sized for about 1e-4 on the last mode.
        let a = modebench::analyse(&model, &modebench::Options::with_modes(5)).expect("solves");
        for m in a.modes.iter().filter(|m| !m.rigid_body) {
            let d = m.fe_difference().expect("FE frequency").abs();
            assert!(
                d < 2e-4,
                "model {i} mode {}: default mesh difference {d:e} with {} elements",
                m.number,
                a.fe_elements
            );
        }
    }
}

#[test]
fn the_slender_beam_theory_warns_when_shear_matters_and_shows_both() {
    let stocky = r#"{
        "left": "pinned", "right": "pinned", "modes": 3,
        "segments": [{ "length": "600 mm",
                       "section": { "shape": "rectangle", "width": "50 mm", "depth": "100 mm" },
                       "material": "steel" }]
    }"#;
    let report = solve_json(stocky).expect("solves");
    assert!(report.warnings.iter().any(|w| w.code.id() == "shear-matters"), "a 6:1 beam must warn");
    assert_eq!(report.comparison, Some(Theory::Timoshenko));
    for m in &report.modes {
        let other = m.other_theory_hz.expect("both theories shown");
        assert!(other < m.frequency_hz, "Timoshenko lies below Euler–Bernoulli");
    }
    let slender = stocky.replace("600 mm", "6000 mm");
    let report = solve_json(&slender).expect("solves");
    assert!(report.warnings.iter().all(|w| w.code.id() != "shear-matters"), "a 60:1 beam needs no warning");
    assert_eq!(report.comparison, None);
}

/// A thin stainless rod (0.9 mm, 94 mm long) guided at the left, nearly held at the right, with
/// a stiff rotational spring and a stiff spring near the left and heavy masses, one 0.44 mm
/// from the right end: the mass bounces on the shear compliance of that short stub of rod in a
/// mode of its own, 40 % below the slender theory's nearest mode.
const THIN_ROD: &str = r#"{"attachments":[
    {"position":"0.39319649236510335 in","stiffness":"5371.657249329486 kN*m/rad","type":"rotational-spring"},
    {"mass":"0.7412796971475398 kg","position":0.039849170996116054,"type":"mass"},
    {"mass":"2.0732507159639013 lb","position":"0.30853651956446904 ft","type":"mass"},
    {"mass":0.0033105659076659772,"position":"3.1015813976121596 in","type":"mass"},
    {"position":"1.6806204635047353 cm","stiffness":"691434766.7437052 N/m","type":"spring"}],
  "left":"guided",
  "right":{"rotational":"3.962699857093412 kN*m/rad","translational":"31915548.747179322 kN/m","type":"elastic"},
  "segments":[{"length":"3.7197022380838405 in","material":"stainless-304",
               "section":{"diameter":"0.03556050671764667 in","shape":"round"}}],
  "theory":"timoshenko","units":"us-inch"}"#;

#[test]
fn a_heavy_mass_on_a_short_stub_of_thin_rod_matches_the_transfer_matrix_reference() {
    let inputs = modebench::Scenario::from_json(THIN_ROD).and_then(|s| s.to_model()).expect("valid");
    let model = inputs.model;
    let omegas = exact::frequencies(&model, 6).expect("solves");
    // Both the engine's values and a shifted copy: the reference must accept the one and refuse
    // the other, or it proves nothing.
    let shifted: Vec<f64> = omegas.iter().map(|w| w * (1.0 + 1e-6)).collect();
    let input = serde_json::json!({ "models": [
        modebench_tests::reference::transfer_matrix_json("engine", &model, &omegas),
        modebench_tests::reference::transfer_matrix_json("shifted", &model, &shifted),
    ]});
    let Some(out) = modebench_tests::reference::run("timoshenko_roots.py", &["mpmath"], &input.to_string())
    else {
        return;
    };
    let out: serde_json::Value = serde_json::from_str(&out).expect("JSON");
    // The determinant of the transfer-matrix formulation at 40 digits changes sign within 1e-9
    // of every frequency and nowhere else below the sixth (tests/python/timoshenko_roots.py).
    assert_eq!(out["engine"]["problems"], serde_json::json!([]), "{out}");
    assert!(out["shifted"]["problems"].as_array().is_some_and(|p| !p.is_empty()), "{out}");
    // The finite-element check agrees within its own estimate, now that the heavy mass beside
    // the end has a node of its own, and says nothing against either method.
    let report = solve_json(THIN_ROD).expect("solves");
    assert!(report.warnings.iter().all(|w| w.code.id() != "fe-disagrees"), "{:?}", report.warnings);
    for m in &report.modes {
        let (d, e, a) = (m.fe_difference.unwrap(), m.fe_error.unwrap(), m.accuracy.unwrap());
        assert!(d >= -1e-9 && d <= 10.0 * (e + a) + 1e-9, "mode {}: {d:e} against {e:e} + {a:e}", m.number);
        assert!(d < 1e-3, "mode {}: the check is off by {d:e}", m.number);
    }
}
