//! The derivative of each natural frequency through its mode shape (`ModeShape::gradient`, the
//! first-order perturbation of the eigenproblem) against central differences on the exact solver
//! over seeded random models, and against the closed form of a pinned beam-column.

use modebench::exact::{self, Gradient};
use modebench::{Attachment, End, Model, ModelParts, Segment, Theory};
use modebench_tests::random::{self, Kinds, Rng};

/// The parts with the `slot`-th stiffness or mass scaled by `factor`; `None` past the last slot.
/// Slots: per segment EI, m, κGA and ρI; the ends' finite springs; each attachment's values.
fn scaled(parts: &ModelParts, slot: usize, factor: f64) -> Option<ModelParts> {
    let mut p = parts.clone();
    let mut values: Vec<&mut f64> = Vec::new();
    for s in &mut p.segments {
        values.push(&mut s.flexural_rigidity);
        values.push(&mut s.mass_per_length);
        let shear_flexible = parts.theory == Theory::Timoshenko && s.shear_rigidity.is_some();
        if let Some(k) = s.shear_rigidity.as_mut() {
            values.push(k);
        }
        if shear_flexible {
            values.push(&mut s.rotary_inertia_per_length);
        }
    }
    for end in [&mut p.left, &mut p.right] {
        if let End::Elastic { translational, rotational } = end {
            values.extend([translational, rotational].into_iter().filter(|v| v.is_finite() && **v > 0.0));
        }
    }
    for a in &mut p.attachments {
        match a {
            Attachment::Mass { mass, rotary_inertia, .. } => {
                values.push(mass);
                if *rotary_inertia > 0.0 {
                    values.push(rotary_inertia);
                }
            }
            Attachment::Spring { stiffness, .. } | Attachment::RotationalSpring { stiffness, .. } => {
                if stiffness.is_finite() {
                    values.push(stiffness);
                }
            }
            Attachment::SprungMass { mass, stiffness, .. } => {
                values.push(mass);
                values.push(stiffness);
            }
            Attachment::Support { .. } => {}
        }
    }
    let v = values.into_iter().nth(slot)?;
    *v *= factor;
    Some(p)
}

fn omegas(model: &Model, modes: usize) -> Vec<f64> {
    exact::frequencies(model, modes).unwrap_or_else(|e| panic!("{e}"))
}

#[test]
fn the_gradient_through_the_shapes_matches_central_differences_on_random_models() {
    // ∂(ω²)/∂q = φᵀ(∂K/∂q − ω²∂M/∂q)φ/φᵀMφ (Fox & Kapoor, AIAA J. 6, 1968 — from memory) against
    // (ω²(q(1+h)) − ω²(q(1−h)))/2h on the exact solver, as d ln ω²/d ln q. The exact
    // frequencies are good to about 1e-13, so with h = 1e-5 the difference carries about 1e-8
    // of rounding and 1e-10 of truncation; the shapes from inverse iteration are good to far
    // better than the 1e-6 allowed.
    const H: f64 = 1e-5;
    let mut rng = Rng::new(0x06AD_1E47);
    let mut compared = 0;
    for case in 0..40 {
        let kinds = Kinds { unrestrained: false, sprung: true, supports: true, timoshenko: case % 3 == 2 };
        let model = random::model(&mut rng, kinds);
        let modes = exact::modes(&model, 4).unwrap_or_else(|e| panic!("case {case}: {e}"));
        let elastic: Vec<&exact::ExactMode> = modes.iter().filter(|m| !m.rigid_body).collect();
        let gradients: Vec<Gradient> = elastic.iter().map(|m| m.shape.gradient(&model)).collect();
        for slot in 0.. {
            let (Some(up), Some(down)) =
                (scaled(model.parts(), slot, 1.0 + H), scaled(model.parts(), slot, 1.0 - H))
            else {
                break;
            };
            let (Ok(up), Ok(down)) = (Model::new(up), Model::new(down)) else { continue };
            let (wu, wd) = (omegas(&up, elastic.len()), omegas(&down, elastic.len()));
            for (k, m) in elastic.iter().enumerate() {
                // A frequency close to another is left out: the step may carry it past its
                // neighbour, and a repeated one has no derivative of its own.
                let apart =
                    elastic.iter().enumerate().all(|(i, o)| i == k || (o.omega / m.omega - 1.0).abs() > 1e-3);
                if m.multiplicity != 1 || !apart {
                    continue;
                }
                let w2 = m.omega * m.omega;
                let central = (wu[k] * wu[k] - wd[k] * wd[k]) / (2.0 * H * w2);
                let Some(change) = gradients[k].change(&down, &up) else {
                    panic!("case {case}, slot {slot}: only a stiffness or mass changed")
                };
                let through = change / (2.0 * H * w2);
                assert!(
                    (through - central).abs() < 1e-6 * (1.0 + central.abs()),
                    "case {case}, slot {slot}, mode {}: through the shape {through}, central difference {central}\n{model:?}",
                    k + 1
                );
                compared += 1;
            }
        }
        // A moved length is not a change the gradient covers.
        let mut longer = model.parts().clone();
        longer.segments[0].length *= 1.0 + H;
        if let (Ok(longer), Some(g)) = (Model::new(longer), gradients.first()) {
            assert_eq!(g.change(&model, &longer), None, "case {case}");
        }
    }
    assert!(compared > 400, "only {compared} derivatives compared");
}

#[test]
fn the_gradient_of_a_pinned_beam_column_is_its_closed_form() {
    // A pinned–pinned uniform beam under tension P: ωₙ² = ((nπ/L)⁴·EI + (nπ/L)²·P)/m (the
    // beam-column's frequency equation; e.g. Timoshenko, Vibration Problems in Engineering —
    // from memory), so ∂ωₙ²/∂EI = (nπ/L)⁴/m, ∂ωₙ²/∂P = (nπ/L)²/m and ∂ωₙ²/∂m = −ωₙ²/m.
    let (length, ei, m, p) = (2.0, 3.0e4, 8.0, 5.0e4);
    let model = Model::new(ModelParts {
        segments: vec![Segment::slender(length, ei, m)],
        left: End::Pinned,
        right: End::Pinned,
        attachments: vec![],
        theory: Theory::EulerBernoulli,
    })
    .and_then(|model| model.with_axial_forces(vec![p]))
    .unwrap_or_else(|e| panic!("{e}"));
    for (n, mode) in exact::modes(&model, 4).unwrap_or_else(|e| panic!("{e}")).iter().enumerate() {
        let k = (n + 1) as f64 * std::f64::consts::PI / length;
        let g = mode.shape.gradient(&model).segments[0];
        let w2 = mode.omega * mode.omega;
        for (got, want) in
            [(g.flexural_rigidity, k.powi(4) / m), (g.axial_force, k * k / m), (g.mass_per_length, -w2 / m)]
        {
            assert!((got / want - 1.0).abs() < 1e-8, "mode {}: {got} against {want}", n + 1);
        }
    }
}
