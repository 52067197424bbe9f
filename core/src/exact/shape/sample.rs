//! A mode shape made readable: sampled along the beam for plotting, scaled so that its largest
//! translation is +1, and its nodes (the points where the deflection changes sign) found.

use super::ModeShape;

/// Points sampled along the beam for plotting (at least).
const SAMPLES: usize = 160;
/// Deflections below this fraction of the largest count as zero when looking for nodes.
const ZERO: f64 = 1e-9;

impl ModeShape {
    fn scale(&mut self, factor: f64) {
        for v in &mut self.deflection {
            *v *= factor;
        }
        for (_, v) in &mut self.sprung {
            *v *= factor;
        }
        for p in &mut self.pieces {
            p.state.iter_mut().for_each(|v| *v *= factor);
        }
        self.generalized_mass *= factor * factor;
    }
}

/// Samples the deflection for plotting: at least [`SAMPLES`] points, each piece's ends included.
pub(super) fn resample(s: &mut ModeShape) {
    let per_piece = SAMPLES.div_ceil(s.pieces.len().max(1)).max(2);
    s.x.clear();
    s.deflection.clear();
    for p in &s.pieces {
        for j in 0..per_piece {
            let local = p.length * j as f64 / per_piece as f64;
            s.x.push(p.x0 + local);
            s.deflection.push(p.member.propagate(s.omega, p.state, local).0);
        }
    }
    if let Some(p) = s.pieces.last() {
        s.x.push(p.x0 + p.length);
        s.deflection.push(p.member.propagate(s.omega, p.state, p.length).0);
    }
}

pub(super) fn normalise(s: &mut ModeShape) {
    let mut largest = 0.0f64;
    for v in s.deflection.iter().chain(s.sprung.iter().map(|(_, a)| a)) {
        if v.abs() > largest.abs() {
            largest = *v;
        }
    }
    if largest != 0.0 && largest.is_finite() {
        s.scale(1.0 / largest);
    }
    s.nodes = nodes(s);
}

/// Points where the deflection changes sign, found from the samples and refined by bisection on
/// the exact shape. A run of zero samples between opposite signs (a support) counts once, at
/// its middle.
fn nodes(s: &ModeShape) -> Vec<f64> {
    let mut out = Vec::new();
    let mut last: Option<(usize, f64)> = None;
    for (i, &v) in s.deflection.iter().enumerate() {
        if v.abs() <= ZERO {
            continue;
        }
        if let Some((j, u)) = last {
            if u.signum() != v.signum() {
                if i > j + 1 {
                    // Zero samples in between: the crossing is the middle of that run.
                    out.push(0.5 * (s.x[j + 1] + s.x[i - 1]));
                } else {
                    out.push(bisect(s, s.x[j], s.x[i], u));
                }
            }
        }
        last = Some((i, v));
    }
    out
}

fn bisect(s: &ModeShape, mut a: f64, mut b: f64, value_at_a: f64) -> f64 {
    // 44 halvings take a sample interval below a billionth of a micrometre on any real beam.
    for _ in 0..44 {
        let m = 0.5 * (a + b);
        if m <= a || m >= b {
            break;
        }
        if s.at(m).0.signum() == value_at_a.signum() {
            a = m;
        } else {
            b = m;
        }
    }
    0.5 * (a + b)
}
