//! The design tools, as functions of input values, against results known in closed form or
//! computed independently:
//! sensitivities against scaling laws and the first-order perturbation of a point mass,
//! calibration round trips and a published frequency equation, resizing against re-solves at
//! its edges, tolerance bands against a seeded Monte Carlo, and refusals of impossible requests.

use modebench::design::calibrate::{calibrate, Measured, Unknown};
use modebench::design::margin::Drive;
use modebench::design::resize::resize;
use modebench::design::sensitivity::sensitivities;
use modebench::design::tolerance::{bands, Spread};
use modebench::{exact, Attachment, End, Model, ModelParts, Result, Segment, Theory};
use modebench_tests::random::Rng;
use std::f64::consts::TAU;

/// A uniform beam of EI = p[0], m = p[1] with the given ends and attachments.
fn beam(p: &[f64], left: End, right: End, attachments: Vec<Attachment>) -> Result<Model> {
    Model::new(ModelParts {
        segments: vec![Segment::slender(1.2, p[0], p[1])],
        left,
        right,
        attachments,
        theory: Theory::EulerBernoulli,
    })
}

fn hz(model: &Model, modes: usize) -> Result<Vec<f64>> {
    Ok(exact::frequencies(model, modes)?.into_iter().map(|w| w / TAU).collect())
}

#[test]
fn sensitivities_follow_the_scaling_laws_and_the_point_mass_perturbation() {
    // Every frequency of a uniform beam with classical ends goes as √(EI/m): ∂ln f/∂ln EI = ½,
    // ∂ln f/∂ln m = −½, for every mode (a fact of the beam equation).
    let f = |p: &[f64]| hz(&beam(p, End::Pinned, End::Pinned, vec![])?, 5);
    let s = sensitivities(&f, &[3.0e4, 8.0]).unwrap();
    for row in &s {
        assert!((row[0].unwrap() - 0.5).abs() < 1e-7 && (row[1].unwrap() + 0.5).abs() < 1e-7, "{row:?}");
    }
    // A point mass M at x: ∂(ω²)/∂M = −ω²·φ(x)²/(φᵀMφ) for a mode φ (the first-order eigenvalue
    // perturbation; e.g. Meirovitch, Fundamentals of Vibrations, or Fox & Kapoor, AIAA J. 6,
    // 1968 — from memory), so ∂ln f/∂ln M = −M·φ(x)²/(2·φᵀMφ), with the engine's own shapes.
    let (x, mass) = (0.45, 3.0);
    let with = |p: &[f64]| {
        beam(
            &[3.0e4, 8.0],
            End::Clamped,
            End::Pinned,
            vec![Attachment::Mass { position: x, mass: p[0], rotary_inertia: 0.0 }],
        )
    };
    let f = |p: &[f64]| hz(&with(p)?, 4);
    let s = sensitivities(&f, &[mass]).unwrap();
    let modes = exact::modes(&with(&[mass]).unwrap(), 4).unwrap();
    for (k, m) in modes.iter().enumerate() {
        let phi = m.shape.at(x).0;
        let want = -mass * phi * phi / (2.0 * m.shape.generalized_mass);
        assert!(
            (s[k][0].unwrap() - want).abs() < 1e-6 * want.abs().max(1e-3),
            "mode {}: {:?} vs {want}",
            k + 1,
            s[k][0]
        );
    }
}

#[test]
fn calibration_recovers_inputs_the_engine_was_given() {
    // A cantilever with an elastic root (rotational stiffness kr) and a tip mass M: compute its
    // frequencies for known values, then recover them from a wrong start.
    let model = |kr: f64, tip: f64| {
        beam(
            &[2.0e4, 6.0],
            End::Elastic { translational: f64::INFINITY, rotational: kr },
            End::Free,
            vec![Attachment::Mass { position: 1.2, mass: tip, rotary_inertia: 0.0 }],
        )
    };
    let (kr, tip) = (3.5e4, 2.2);
    let truth = hz(&model(kr, tip).unwrap(), 3).unwrap();
    let f = |p: &[f64]| hz(&model(p[0], p[1])?, 3);
    // One unknown from mode 1.
    let fit = calibrate(
        &f,
        &[1.0e4, tip],
        &[Unknown { input: 0, low: 1e3, high: 1e6 }],
        &[Measured { mode: 0, hz: truth[0] }],
    )
    .unwrap();
    assert!((fit.values[0] - kr).abs() < 1e-7 * kr, "{:?}", fit);
    // Two unknowns from modes 1 and 2.
    let fit = calibrate(
        &f,
        &[1.0e4, 1.0],
        &[Unknown { input: 0, low: 1e3, high: 1e6 }, Unknown { input: 1, low: 0.1, high: 10.0 }],
        &[Measured { mode: 0, hz: truth[0] }, Measured { mode: 1, hz: truth[1] }],
    )
    .unwrap();
    assert!((fit.values[0] - kr).abs() < 1e-5 * kr && (fit.values[1] - tip).abs() < 1e-5 * tip, "{fit:?}");
    assert!(fit.residuals.iter().all(|r| r.abs() < 1e-10), "{fit:?}");
    assert!(fit.condition.is_some_and(|c| c < 1e4), "{fit:?}");
}

#[test]
fn calibration_finds_the_tip_mass_of_a_published_frequency_equation() {
    // A cantilever with tip mass ratio μ = M/(mL): 1 + cos λ cosh λ + μλ(cos λ sinh λ − sin λ cosh λ)
    // = 0 (Blevins, Formulas for Natural Frequency and Mode Shape, table 8-8 — from memory). Solve
    // it for μ = 0.7 by bisection, turn λ₁ into a frequency, and recover μ from it.
    let mu = 0.7;
    let g = |l: f64| 1.0 + l.cos() * l.cosh() + mu * l * (l.cos() * l.sinh() - l.sin() * l.cosh());
    let (mut a, mut b) = (0.5, 1.875);
    for _ in 0..200 {
        let m = 0.5 * (a + b);
        if g(a).signum() == g(m).signum() {
            a = m;
        } else {
            b = m;
        }
    }
    let lambda = 0.5 * (a + b);
    let (ei, m, l): (f64, f64, f64) = (2.0e4, 6.0, 1.2);
    let measured = lambda * lambda / (l * l) * (ei / m).sqrt() / TAU;
    let f = |p: &[f64]| {
        hz(
            &beam(
                &[ei, m],
                End::Clamped,
                End::Free,
                vec![Attachment::Mass { position: l, mass: p[0], rotary_inertia: 0.0 }],
            )?,
            2,
        )
    };
    let fit = calibrate(
        &f,
        &[1.0],
        &[Unknown { input: 0, low: 0.01, high: 100.0 }],
        &[Measured { mode: 0, hz: measured }],
    )
    .unwrap();
    let ratio = fit.values[0] / (m * l);
    assert!((ratio - mu).abs() < 1e-8, "μ = {ratio}");
}

#[test]
fn resizing_finds_intervals_whose_edges_are_where_a_margin_fails() {
    // A pinned–pinned beam whose EI is the design input, near a 30 Hz drive and its second
    // harmonic: every margin holds inside the intervals and one fails just outside each edge.
    let f = |p: &[f64]| hz(&beam(&[p[0], 8.0], End::Pinned, End::Pinned, vec![])?, 3);
    let drives =
        [Drive::Line { hz: 30.0 }, Drive::Line { hz: 60.0 }, Drive::Band { low_hz: 100.0, high_hz: 130.0 }];
    let margin = 0.15;
    let (low, high) = (2.0e3, 4.0e5);
    let r = resize(&f, &[5.0e4], 0, (low, high), &drives, margin, 200).unwrap();
    assert!(!r.intervals.is_empty());
    let clear = |ei: f64| f(&[ei]).unwrap().iter().all(|hz| drives.iter().all(|d| !d.too_close(*hz, margin)));
    let nudge = 1e-4 * (high - low);
    for &(a, b) in &r.intervals {
        assert!(clear(a) && clear(b) && clear(0.5 * (a + b)), "[{a}, {b}]");
        if a > low {
            assert!(!clear(a - nudge), "below {a} should fail");
        }
        if b < high {
            assert!(!clear(b + nudge), "above {b} should fail");
        }
    }
    let nearest = r.nearest.expect("feasible");
    assert!(clear(nearest));
    // A drive band over every frequency leaves nothing: an empty answer, not an error.
    let all = [Drive::Band { low_hz: 0.01, high_hz: 1e6 }];
    let none = resize(&f, &[5.0e4], 0, (low, high), &all, margin, 20).unwrap();
    assert!(none.intervals.is_empty() && none.nearest.is_none());
}

#[test]
fn tolerance_bands_hold_every_monte_carlo_sample() {
    // EI ± 5 %, m ± 2 %, a tip mass ± 10 %, and the root's rotational stiffness anywhere between
    // pinned and clamped: 400 seeded random draws within those must all fall inside the bands.
    let model = |p: &[f64]| {
        beam(
            &[p[0], p[1]],
            End::Elastic { translational: f64::INFINITY, rotational: p[3] },
            End::Pinned,
            vec![Attachment::Mass { position: 0.7, mass: p[2], rotary_inertia: 0.0 }],
        )
    };
    let f = |p: &[f64]| hz(&model(p)?, 3);
    let p0 = [2.0e4, 6.0, 1.5, 5.0e3];
    let spreads = [
        Some(Spread::Relative { fraction: 0.05 }),
        Some(Spread::Relative { fraction: 0.02 }),
        Some(Spread::Relative { fraction: 0.10 }),
        Some(Spread::Between { low: 0.0, high: f64::INFINITY }),
    ];
    let b = bands(&f, &p0, &spreads).unwrap();
    let mut rng = Rng::new(0x70_1E);
    for i in 0..400 {
        let kr = if rng.below(8) == 0 { [0.0, f64::INFINITY][rng.below(2)] } else { rng.log_range(1.0, 1e9) };
        let p =
            [p0[0] * rng.range(0.95, 1.05), p0[1] * rng.range(0.98, 1.02), p0[2] * rng.range(0.9, 1.1), kr];
        for (k, hz) in f(&p).unwrap().iter().enumerate() {
            assert!(
                *hz >= b[k].low * (1.0 - 1e-9) && *hz <= b[k].high * (1.0 + 1e-9),
                "draw {i}, mode {}: {hz} outside {:?}",
                k + 1,
                b[k]
            );
        }
    }
}

#[test]
fn impossible_requests_get_clear_messages() {
    let f = |p: &[f64]| hz(&beam(&[p[0], 8.0], End::Pinned, End::Pinned, vec![])?, 2);
    // A target no stiffness in range reaches.
    let e = calibrate(
        &f,
        &[5.0e4],
        &[Unknown { input: 0, low: 1e3, high: 1e6 }],
        &[Measured { mode: 0, hz: 1e6 }],
    )
    .unwrap_err();
    assert!(e.message.contains("no value in the range"), "{e}");
    // A range that crosses zero.
    let e = calibrate(
        &f,
        &[5.0e4],
        &[Unknown { input: 0, low: -1.0, high: 1e6 }],
        &[Measured { mode: 0, hz: 10.0 }],
    )
    .unwrap_err();
    assert!(e.message.contains("cross zero"), "{e}");
    assert!(resize(&f, &[5.0e4], 0, (-5.0, 5.0), &[Drive::Line { hz: 10.0 }], 0.1, 20).is_err());
    // Two unknowns of which one moves nothing: the fit says it cannot tell them apart.
    let g = |p: &[f64]| {
        hz(&beam(&[p[0], 8.0], End::Pinned, End::Pinned, vec![])?, 2)
            .map(|v| v.iter().map(|x| x * (1.0 + 0.0 * p[1])).collect())
    };
    let truth = f(&[6.0e4]).unwrap();
    let fit = calibrate(
        &g,
        &[5.0e4, 1.0],
        &[Unknown { input: 0, low: 1e3, high: 1e6 }, Unknown { input: 1, low: 0.5, high: 2.0 }],
        &[Measured { mode: 0, hz: truth[0] }, Measured { mode: 1, hz: truth[1] }],
    );
    assert!(fit.is_err() || fit.as_ref().is_ok_and(|f| !f.notes.is_empty()), "{fit:?}");
    assert!(fit.map(|f| f.residuals).unwrap_or_default().iter().all(|v| v.is_finite()));
}
