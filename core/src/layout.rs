//! Stations along the beam, the members between them, and the numbering of degrees of freedom.
//!
//! A station is a point where the solvers keep a deflection w and a rotation θ: the ends, every
//! segment boundary, every attachment, and any extra points a solver asks for (finite-element
//! nodes, points that resolve a mode shape). Attachments at one point share a station. Held
//! deflections and rotations get no degree of freedom; each sprung mass gets one, numbered right
//! after its station's so that the matrices stay narrowly banded.

use crate::error::{Error, ErrorKind, Result};
use crate::model::{Attachment, Model, SAME_POINT};

/// What is attached at one station, summed over the attachments there.
#[derive(Clone, Debug, Default, PartialEq)]
pub(crate) struct Station {
    /// Position from the left end, m.
    pub(crate) x: f64,
    /// Degree of freedom of the deflection, `None` when held.
    pub(crate) w: Option<usize>,
    /// Degree of freedom of the rotation, `None` when held.
    pub(crate) theta: Option<usize>,
    /// Grounded translational stiffness (finite part), N/m.
    pub(crate) spring: f64,
    /// Grounded rotational stiffness (finite part), N·m/rad.
    pub(crate) rotational_spring: f64,
    /// Point mass, kg.
    pub(crate) mass: f64,
    /// Point rotary inertia, kg·m².
    pub(crate) rotary_inertia: f64,
    /// Sprung masses here: (degree of freedom, mass, stiffness, index into the model's attachments).
    pub(crate) sprung: Vec<SprungDof>,
}

/// A sprung mass's own degree of freedom.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct SprungDof {
    pub(crate) dof: usize,
    pub(crate) mass: f64,
    pub(crate) stiffness: f64,
    /// Index of the attachment in the model.
    pub(crate) attachment: usize,
}

/// Most stations one layout may have. Real models need a few hundred at most; more means
/// segments so different in stiffness or mass that one of them holds thousands of waves at the
/// frequencies asked for.
pub(crate) const MAX_STATIONS: usize = 20_000;

/// A uniform piece of beam between two neighbouring stations.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Span {
    /// Index of the left station; the right one is `left + 1`. (When a `pieces` callback of
    /// [`Layout::with_points`] sees a span, this is the index of the natural span instead.)
    pub(crate) left: usize,
    /// Index of the model segment the span lies in.
    pub(crate) segment: usize,
    /// Length, m.
    pub(crate) length: f64,
}

/// Stations and spans for one discretisation of a model.
#[derive(Clone, Debug)]
pub(crate) struct Layout {
    pub(crate) stations: Vec<Station>,
    pub(crate) spans: Vec<Span>,
}

impl Layout {
    /// The natural stations of the model (ends, segment boundaries, attachments), with each
    /// natural span cut into `pieces(span)` equal pieces.
    pub(crate) fn new(model: &Model, pieces: &dyn Fn(&Span) -> usize) -> Result<Layout> {
        Layout::with_points(model, &[], pieces)
    }

    /// As [`Layout::new`], with extra station positions added first.
    pub(crate) fn with_points(
        model: &Model,
        extra: &[f64],
        // A trait object, not a generic: one copy of this function serves every caller.
        pieces: &dyn Fn(&Span) -> usize,
    ) -> Result<Layout> {
        let length = model.length();
        let tolerance = SAME_POINT * length;
        let mut xs = vec![0.0, length];
        let mut x = 0.0;
        for s in &model.segments()[..model.segments().len() - 1] {
            x += s.length;
            xs.push(x);
        }
        xs.extend(model.attachments().iter().map(Attachment::position));
        xs.extend(extra.iter().copied().filter(|x| x.is_finite() && *x > 0.0 && *x < length));
        let natural = merge_points(xs, tolerance);

        // Cut natural spans into pieces.
        let mut points = Vec::with_capacity(natural.len());
        for (index, w) in natural.windows(2).enumerate() {
            let (a, b) = (w[0], w[1]);
            let span = Span { left: index, segment: model.segment_at(0.5 * (a + b)), length: b - a };
            let n = pieces(&span).max(1);
            if points.len() + n > MAX_STATIONS {
                return Err(Error::new(
                    ErrorKind::Model,
                    format!(
                        "this segment would need more than {MAX_STATIONS} computation points at the frequencies \
                         asked for: its stiffness and mass differ from the rest of the beam by too many orders of \
                         magnitude (check the units), or ask for fewer modes"
                    ),
                )
                .at(crate::path::FieldPath::item("segments", span.segment)));
            }
            for p in 0..n {
                points.push(a + (b - a) * p as f64 / n as f64);
            }
        }
        points.push(length);

        let mut stations: Vec<Station> =
            points.iter().map(|&x| Station { x, ..Station::default() }).collect();
        let nearest = |x: f64| -> usize {
            // Attachments sit exactly on natural stations, which are in `points` unchanged.
            points.partition_point(|p| *p < x - tolerance).min(points.len() - 1)
        };
        let mut held_w = vec![false; stations.len()];
        let mut held_theta = vec![false; stations.len()];
        let last = stations.len() - 1;
        for (i, end) in [(0, model.left()), (last, model.right())] {
            let (kt, kr) = end.springs();
            add_restraint(&mut stations[i], &mut held_w[i], &mut held_theta[i], kt, kr);
        }
        let mut sprung_at: Vec<Vec<(usize, f64, f64)>> = vec![Vec::new(); stations.len()];
        for (index, a) in model.attachments().iter().enumerate() {
            let i = nearest(a.position());
            let s = &mut stations[i];
            match *a {
                Attachment::Mass { mass, rotary_inertia, .. } => {
                    s.mass += mass;
                    s.rotary_inertia += rotary_inertia;
                }
                Attachment::Spring { stiffness, .. } => {
                    add_restraint(s, &mut held_w[i], &mut held_theta[i], stiffness, 0.0);
                }
                Attachment::RotationalSpring { stiffness, .. } => {
                    add_restraint(s, &mut held_w[i], &mut held_theta[i], 0.0, stiffness);
                }
                Attachment::Support { .. } => held_w[i] = true,
                Attachment::SprungMass { mass, stiffness, .. } => sprung_at[i].push((index, mass, stiffness)),
            }
        }
        let mut count = 0;
        let mut next = || {
            count += 1;
            count - 1
        };
        for (i, s) in stations.iter_mut().enumerate() {
            s.w = (!held_w[i]).then(&mut next);
            s.theta = (!held_theta[i]).then(&mut next);
            for &(attachment, mass, stiffness) in &sprung_at[i] {
                s.sprung.push(SprungDof { dof: next(), mass, stiffness, attachment });
            }
        }
        let spans: Vec<Span> = stations
            .windows(2)
            .enumerate()
            .map(|(i, w)| Span {
                left: i,
                segment: model.segment_at(0.5 * (w[0].x + w[1].x)),
                length: w[1].x - w[0].x,
            })
            .collect();
        Ok(Layout { stations, spans })
    }
}

/// What the assembled reference matrices of the tests need: the unknowns' count, the band and
/// each span's unknowns.
#[cfg(test)]
impl Layout {
    /// Number of unknowns (degrees of freedom).
    pub(crate) fn dofs(&self) -> usize {
        self.stations
            .iter()
            .flat_map(|s| [s.w, s.theta].into_iter().flatten().chain(s.sprung.iter().map(|d| d.dof)))
            .max()
            .map_or(0, |d| d + 1)
    }

    /// Half-bandwidth of the assembled matrices.
    pub(crate) fn bandwidth(&self) -> usize {
        let mut bandwidth = 0;
        for span in &self.spans {
            let present: Vec<usize> = self.span_dofs(span).iter().flatten().copied().collect();
            if let (Some(lo), Some(hi)) = (present.iter().min(), present.iter().max()) {
                bandwidth = bandwidth.max(hi - lo);
            }
        }
        for s in &self.stations {
            for d in &s.sprung {
                if let Some(w) = s.w {
                    bandwidth = bandwidth.max(d.dof - w);
                }
            }
        }
        bandwidth
    }

    /// The degree-of-freedom numbers of a span's ends, [w₁, θ₁, w₂, θ₂], `None` where held.
    pub(crate) fn span_dofs(&self, span: &Span) -> [Option<usize>; 4] {
        let (a, b) = (&self.stations[span.left], &self.stations[span.left + 1]);
        [a.w, a.theta, b.w, b.theta]
    }
}

fn add_restraint(s: &mut Station, held_w: &mut bool, held_theta: &mut bool, kt: f64, kr: f64) {
    if kt == f64::INFINITY {
        *held_w = true;
    } else {
        s.spring += kt;
    }
    if kr == f64::INFINITY {
        *held_theta = true;
    } else {
        s.rotational_spring += kr;
    }
}

/// Sorts positions and merges those closer than `tolerance`, keeping the first of each group (the
/// caller ends the last span at the beam's length, whichever of its group was kept).
fn merge_points(mut xs: Vec<f64>, tolerance: f64) -> Vec<f64> {
    crate::sort::floats(&mut xs);
    let mut out: Vec<f64> = Vec::with_capacity(xs.len());
    for x in xs {
        match out.last() {
            Some(&last) if x - last <= tolerance => {}
            _ => out.push(x),
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::tests::two_spans as model;

    #[test]
    fn stations_merge_and_dofs_skip_held_values() {
        let m = model(vec![
            Attachment::Support { position: 1.5 },
            Attachment::Mass { position: 1.5, mass: 2.0, rotary_inertia: 0.0 },
            Attachment::SprungMass { position: 2.5, mass: 1.0, stiffness: 10.0 },
            Attachment::Mass { position: 1.0, mass: 1.0, rotary_inertia: 0.1 },
        ]);
        let l = Layout::new(&m, &|_| 1).unwrap();
        let xs: Vec<f64> = l.stations.iter().map(|s| s.x).collect();
        assert_eq!(xs, vec![0.0, 1.0, 1.5, 2.5, 3.0]);
        // Clamped left: nothing; x=1: w, θ; x=1.5 supported: θ; x=2.5: w, θ, sprung; right pinned: θ.
        assert_eq!(l.dofs(), 7);
        assert_eq!(l.stations[0].w, None);
        assert_eq!(l.stations[2].w, None);
        assert_eq!(l.stations[2].mass, 2.0);
        assert_eq!(l.stations[3].sprung[0].dof, 5);
        assert_eq!(l.spans.iter().map(|s| s.segment).collect::<Vec<_>>(), vec![0, 1, 1, 1]);
        let fine = Layout::new(&m, &|_| 3).unwrap();
        assert_eq!(fine.stations.len(), 13);
        assert!(fine.bandwidth() >= 3);
    }
}
