//! Memory that grows with the model stays linear in it: Dunkerley's sum over 10,000 point
//! masses needs one flexibility per mass, not one dense vector per mass (which took 2.9 GB).
//! Read from the process's peak resident size, which this test binary has to itself.

use modebench::{bounds, Attachment};
use modebench_tests::{check, models};

/// The process's peak resident set, kB (Linux).
fn peak_kb() -> Option<u64> {
    let status = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = status.lines().find(|l| l.starts_with("VmHWM:"))?;
    line.split_whitespace().nth(1)?.parse().ok()
}

#[test]
fn dunkerley_over_ten_thousand_masses_stays_small() {
    let before = peak_kb();
    // 10,000 masses of 1e-4 with rotary inertias of 1e-8, together as heavy as the span.
    let model = models::pinned_span_with_equal_masses(10_000, 1.0, 1e-4);
    let d = bounds::dunkerley(&model).expect("solves").expect("restrained");
    // Dunkerley's sum by hand on a pinned span (EI = m = L = 1): 1/ω² = 1/ω_b² + Σ Mᵢ·δᵢ +
    // Σ Jᵢ·δθᵢ, with ω_b = π² the bare span's fundamental (Euler–Bernoulli, any vibration text),
    // δ = a²b²/(3EIL) under a point load at a (Roark's Formulas for Stress and Strain, simply
    // supported beam) and δθ = (a³ + b³)/(3EIL²) under a couple there (the unit-load method:
    // ∫M²/EI dx with the couple's moment diagram −x/L, then 1 − x/L).
    let mut inverse = 1.0 / std::f64::consts::PI.powi(4);
    for mass in model.attachments() {
        if let Attachment::Mass { position: a, mass, rotary_inertia } = *mass {
            let b = 1.0 - a;
            inverse += mass * a * a * b * b / 3.0 + rotary_inertia * (a.powi(3) + b.powi(3)) / 3.0;
        }
    }
    let expected = 1.0 / inverse.sqrt();
    check("Dunkerley's sum, 10,000 masses on a pinned span", "Roark; unit-load method", expected, d, 1e-9);
    // And it lies below the fundamental: with the masses spread like the beam's own mass the
    // fundamental is near π²·√(EI/2m) ≈ 6.979 rad/s (a uniform beam of doubled mass).
    assert!(d < 6.98, "{d}");
    if let (Some(before), Some(after)) = (before, peak_kb()) {
        // About 3 MB as measured by the `masses` bench (docs/performance.md); one dense vector
        // per mass took 2.9 GB.
        assert!(after - before < 20_000, "peak grew by {} kB", after - before);
    }
}
