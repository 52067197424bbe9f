//! Memory that grows with the model stays linear in it: Dunkerley's sum over 10,000 point
//! masses needs one flexibility per mass, not one dense vector per mass (which took 2.9 GB).
//! Read from the process's peak resident size, which this test binary has to itself.

use modebench::{bounds, Attachment, End, Model, ModelParts, Segment, Theory};

/// The process's peak resident set, kB (Linux).
fn peak_kb() -> Option<u64> {
    let status = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = status.lines().find(|l| l.starts_with("VmHWM:"))?;
    line.split_whitespace().nth(1)?.parse().ok()
}

#[test]
fn dunkerley_over_ten_thousand_masses_stays_small() {
    let before = peak_kb();
    let masses: Vec<Attachment> = (0..10_000)
        .map(|i| Attachment::Mass { position: (i as f64 + 0.5) / 10_000.0, mass: 1e-4, rotary_inertia: 1e-8 })
        .collect();
    let model = Model::new(ModelParts {
        segments: vec![Segment {
            length: 1.0,
            flexural_rigidity: 1.0,
            mass_per_length: 1.0,
            shear_rigidity: None,
            rotary_inertia_per_length: 0.0,
        }],
        left: End::Pinned,
        right: End::Pinned,
        attachments: masses,
        theory: Theory::EulerBernoulli,
    })
    .expect("valid model");
    let d = bounds::dunkerley(&model).expect("solves").expect("restrained");
    // Dunkerley's sum is below the fundamental: with the masses spread like the beam's own mass
    // (ratio 1) the fundamental is π²·√(EI/2m) ≈ 6.979 rad/s (a uniform beam of doubled mass).
    assert!(d > 0.0 && d < 6.98, "{d}");
    if let (Some(before), Some(after)) = (before, peak_kb()) {
        assert!(after - before < 100_000, "peak grew by {} kB", after - before);
    }
}
