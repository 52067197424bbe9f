//! Axial force against independent computations: the beam-column characteristic determinant in
//! mpmath (`tests/python/beam_column.py`), finite elements converging to the exact method at
//! the fourth order, and the fundamental falling to zero as compression reaches the critical
//! load.

use modebench::fe::{self, Mesh};
use modebench::{axial, exact, End, Model, ModelParts, Segment, Theory};
use modebench_tests::{check, reference};
use serde_json::{json, Value};

fn column(left: End, right: End, force: f64) -> Model {
    Model::new(ModelParts {
        segments: vec![Segment::slender(1.8, 2.5e4, 12.0)],
        left,
        right,
        attachments: vec![],
        theory: Theory::EulerBernoulli,
    })
    .expect("valid model")
    .with_axial_forces(vec![force])
    .expect("valid force")
}

fn end_name(e: End) -> &'static str {
    match e {
        End::Clamped => "clamped",
        End::Pinned => "pinned",
        End::Free => "free",
        _ => unreachable!("only classical ends here"),
    }
}

#[test]
fn beam_column_frequencies_match_the_characteristic_determinant() {
    let cases = [
        (End::Clamped, End::Free, -4.0e3),
        (End::Clamped, End::Free, 2.0e4),
        (End::Clamped, End::Clamped, -1.5e5),
        (End::Clamped, End::Clamped, 3.0e5),
        (End::Pinned, End::Clamped, -5.0e4),
    ];
    let mut input = Vec::new();
    let mut engine = Vec::new();
    for (i, (left, right, p)) in cases.iter().enumerate() {
        let omegas = exact::frequencies(&column(*left, *right, *p), 4).expect("solves");
        input.push(json!({
            "id": format!("c{i}"), "length": 1.8, "ei": 2.5e4, "m": 12.0, "p": p,
            "left": end_name(*left), "right": end_name(*right), "omegas": omegas,
        }));
        engine.push(omegas);
    }
    let Some(out) = reference::run("beam_column.py", &["mpmath"], &json!({ "cases": input }).to_string())
    else {
        return;
    };
    let out: Value = serde_json::from_str(&out).expect("JSON");
    for (i, ((left, right, p), omegas)) in cases.iter().zip(&engine).enumerate() {
        // The reference scans the determinant on its own, so a frequency the engine skipped or
        // gave twice would pair every later one with the wrong root.
        let roots = out[format!("c{i}")].as_array().expect("roots");
        assert!(roots.len() >= omegas.len(), "{left:?}–{right:?}, P = {p} N: the reference found {roots:?}");
        for (k, (got, want)) in omegas.iter().zip(roots).enumerate() {
            let want: f64 = want.as_str().and_then(|s| s.parse().ok()).unwrap_or(f64::NAN);
            check(
                &format!("{left:?}–{right:?}, P = {p} N, mode {}", k + 1),
                "beam-column characteristic determinant in mpmath (tests/python/beam_column.py)",
                want,
                *got,
                1e-9,
            );
        }
    }
}

#[test]
fn finite_elements_converge_to_the_exact_beam_column_at_the_fourth_order() {
    // Hermite elements with consistent mass and geometric stiffness: halving the elements cuts
    // the error about sixteenfold (the element's order of convergence, a fact of the method).
    let model = column(End::Clamped, End::Pinned, -6.0e4);
    let exact = exact::frequencies(&model, 3).expect("solves")[2];
    let error = |n| {
        let fe = fe::frequencies(&model, 3, Mesh::PerSpan(n)).expect("solves").omegas[2];
        (fe - exact) / exact
    };
    let (coarse, fine) = (error(6), error(12));
    assert!(coarse > 0.0 && fine > 0.0, "consistent elements lie above: {coarse:e}, {fine:e}");
    let order = (coarse / fine).log2();
    assert!((3.5..4.6).contains(&order), "observed order {order} ({coarse:e}, {fine:e})");
}

#[test]
fn the_fundamental_falls_to_zero_as_compression_reaches_the_critical_load() {
    // ω₁² ∝ 1 − P/P_cr on a pinned–pinned beam (the beam-column formula at n = 1), so at 99.99 %
    // of the Euler load the fundamental is 1 % of the unloaded one.
    let p_cr = std::f64::consts::PI.powi(2) * 2.5e4 / 1.8f64.powi(2);
    let free = exact::frequencies(&column(End::Pinned, End::Pinned, 0.0), 1).expect("solves")[0];
    for fraction in [0.5, 0.99, 0.9999] {
        let model = column(End::Pinned, End::Pinned, -fraction * p_cr);
        let got = exact::frequencies(&model, 1).expect("solves")[0];
        check(
            &format!("pinned–pinned at {fraction} of the Euler load"),
            "ω₁ = ω₀·√(1 − P/P_cr) (beam-column formula, n = 1)",
            free * (1.0 - fraction).sqrt(),
            got,
            1e-8,
        );
        let mu = axial::critical_load_factor(&model).expect("solves").expect("compressed");
        check("critical load factor", "Euler's load π²EI/L²", 1.0 / fraction, mu, 1e-9);
    }
}

#[test]
fn bounds_and_checks_hold_under_axial_force() {
    // Rayleigh's quotient stays an upper bound and Dunkerley's sum a lower one with the force's
    // work in both (the static stiffness with its geometric part is still positive definite
    // below the critical load); the finite-element check stays within its own estimate.
    use modebench::{analyse, Attachment, Options};
    for force in [-0.6 * std::f64::consts::PI.powi(2) * 2.5e4 / 1.8f64.powi(2), 1.0e4, 5.0e6] {
        let model = column(End::Clamped, End::Pinned, force)
            .with_attachments(vec![Attachment::Mass { position: 1.1, mass: 15.0, rotary_inertia: 0.05 }])
            .expect("valid");
        let a = analyse(&model, &Options::with_modes(4)).expect("solves");
        let f = a.fundamental.expect("restrained");
        let (r, d) = (f.rayleigh.expect("Rayleigh"), f.dunkerley.expect("Dunkerley"));
        assert!(r >= f.omega * (1.0 - 1e-12), "P = {force}: Rayleigh {r} below {}", f.omega);
        assert!(d <= f.omega * (1.0 + 1e-12), "P = {force}: Dunkerley {d} above {}", f.omega);
        for m in &a.modes {
            let (diff, est) = (m.fe_difference().unwrap_or(0.0), m.fe_error.unwrap_or(0.0));
            assert!(diff.abs() <= 10.0 * est + 1e-9, "P = {force}, mode {}: {diff:e} vs {est:e}", m.number);
            assert!(
                m.accuracy.is_some_and(|x| x < 1e-11),
                "P = {force}, mode {}: {:?}",
                m.number,
                m.accuracy
            );
        }
    }
}

#[test]
fn a_buckled_beam_is_refused_and_one_near_buckling_is_warned() {
    use modebench::{analyse, Options};
    let p_cr = std::f64::consts::PI.powi(2) * 2.5e4 / 1.8f64.powi(2);
    let buckled = analyse(&column(End::Pinned, End::Pinned, -1.01 * p_cr), &Options::with_modes(3));
    assert!(buckled.is_err_and(|e| e.message.contains("buckled")));
    let exactly = analyse(&column(End::Pinned, End::Pinned, -p_cr), &Options::with_modes(3));
    assert!(exactly.is_err(), "at the critical load the fundamental is zero and the beam is refused");
    let near =
        analyse(&column(End::Pinned, End::Pinned, -0.8 * p_cr), &Options::with_modes(3)).expect("solves");
    assert!(near.warnings.iter().any(|w| w.code.id() == "near-buckling"));
    assert!((near.critical_load_factor.expect("compressed") - 1.25).abs() < 1e-9);
    // Huge tension: a taut string with a little bending stiffness, still solved. The string's
    // ω₁ = (π/L)·√(P/m) dominates; bending raises it by about ½(π)²EI/(PL²) ≈ 4e-5.
    let taut = analyse(&column(End::Pinned, End::Pinned, 1e9), &Options::with_modes(3)).expect("solves");
    let string = std::f64::consts::PI / 1.8 * (1e9f64 / 12.0).sqrt();
    let shift = (taut.modes[0].omega - string) / string;
    assert!(shift > 0.0 && shift < 1e-4, "{} vs {string}", taut.modes[0].omega);
}

#[test]
fn mode_shapes_under_axial_force_give_back_their_frequencies() {
    // Rayleigh's quotient of an exact mode shape is its frequency (Rayleigh's principle, a fact
    // of the theory), with the force's work P·w′² in the strain energy; every classical end pair,
    // the bare clamped–clamped beam included, whose stations are all held.
    use modebench::{analyse, Options};
    let p_cr = std::f64::consts::PI.powi(2) * 2.5e4 / 1.8f64.powi(2);
    for (left, right) in [
        (End::Clamped, End::Clamped),
        (End::Pinned, End::Pinned),
        (End::Clamped, End::Pinned),
        (End::Clamped, End::Free),
    ] {
        for fraction in [0.0, -0.2, 0.1, 3.0] {
            let a = analyse(&column(left, right, fraction * p_cr), &Options::with_modes(3)).expect("solves");
            for m in &a.modes {
                let accuracy = m.accuracy.expect("restrained");
                assert!(
                    accuracy < 1e-10,
                    "{left:?}–{right:?} at {fraction} P_cr, mode {}: {accuracy:e}",
                    m.number
                );
            }
        }
    }
}

#[test]
fn the_finite_element_check_s_estimate_covers_its_error_under_axial_force() {
    // A model the fuzz run found, four segments in compression and tension: the elements' error
    // is that of the beam-column's shorter wave, not of the bending wave alone, and the estimate
    // the report gives (the element's (kh)⁴/1440, a fact of the Hermite element) must cover what
    // the check differs from the exact method by, within the report's own factor of 10.
    let scenario = json!({
        "left": "guided", "right": "clamped", "modes": 16,
        "attachments": [{ "type": "mass", "mass": "54.09194304116241 kg", "position": 1.6727716306011078 }],
        "segments": [
            { "length": "0.17123767164920597 m", "material": "titanium-ti6al4v", "axial_force": -133.36101687399025,
              "section": { "shape": "tube", "outer_diameter": 0.007477985519552176, "wall": "0.03607595173473664 cm" },
              "extra_mass": { "lining": "0.29418658639519574 kg/m" } },
            { "length": "147.65310453735557 cm", "flexural_rigidity": "26.296194213332768 N·m²",
              "mass_per_length": "103.87608163619461 lb/ft", "axial_force": "-5.426313921878453 lbf" },
            { "length": 0.2106811369331756, "flexural_rigidity": 3.726339173742247,
              "mass_per_length": 0.1507893206456771, "axial_force": 192.47363979848325 },
            { "length": "0.08246135497415687 m", "flexural_rigidity": "60.87501257709297 N·m²",
              "mass_per_length": "423.0464843899195 kg/m" }
        ]
    });
    let report = modebench::solve_value(&scenario).expect("solves");
    modebench_tests::assert_fe_within_its_estimate(&report);
}

#[test]
fn the_check_s_estimate_grows_as_compression_nears_buckling() {
    // A generated model: a pinned–pinned beam of stainless steel then aluminium with a sprung
    // mass, the first segment at 99 % of the load that buckles the beam. The elements' error is
    // an error of the bending energy, and near buckling the compression cancels all but a
    // percent of that energy: what is left, ω²T, carries the same absolute error, so the
    // relative error of ω² is the Hermite element's (kh)⁴/1440 times U_bending/(ω²T), about
    // 1/(1 − P/P_cr) here (Rayleigh's quotient with the axial work, ω² = (U − P·∫w′²/2)/T, a fact
    // of the theory). The estimate once left that factor out and fell 15 times short of the
    // check's actual difference, 1.05e-4.
    let scenario = json!({
        "left": "pinned", "right": "pinned",
        "excitations": [{ "frequency": "208.72922296616485 Hz", "harmonics": 4 }],
        "attachments": [{ "type": "sprung-mass", "mass": 6.713541224535572,
                          "position": "17.946340661843653 ft", "stiffness": 1757.8566422703414 }],
        "segments": [
            { "length": "1.2641072888535583 m", "material": "stainless-304", "axial_force": "-0.5053988638468239 kN",
              "section": { "shape": "custom", "area": 0.00007814572691760813, "second_moment": 1.3570565856625297e-9 },
              "extra_mass": { "lining": "1.021057841811189 kg/m" } },
            { "length": "274.877752405147 in", "material": "aluminium-6061-t6",
              "section": { "shape": "round", "diameter": "5.476300133612598 cm" } }
        ]
    });
    let report = modebench::solve_value(&scenario).expect("solves");
    assert!(
        report.warnings.iter().any(|w| w.code.id() == "near-buckling"),
        "the premise, a beam near buckling, no longer holds: {:?}",
        report.warnings
    );
    assert!(report.warnings.iter().all(|w| w.code.id() != "fe-disagrees"), "{:?}", report.warnings);
    modebench_tests::assert_fe_within_its_estimate(&report);
}
