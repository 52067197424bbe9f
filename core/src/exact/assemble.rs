//! The global dynamic stiffness K(ω) assembled from the members' closed-form stiffness: the
//! banded matrix the station sweep eliminates without forming, kept as the reference its count,
//! determinant and solves are tested against.

use super::System;
use crate::band::SymBand;
use crate::error::{Error, ErrorKind, Result};
use crate::member::reference::Evaluated;
use crate::member::Member;

impl System {
    /// K(ω) with held degrees of freedom removed. Callers use it only at frequencies the count
    /// has already reached, where every member can be evaluated.
    pub(crate) fn assemble(&self, omega: f64) -> SymBand {
        self.assemble_with_poles(omega)
            .map_or_else(|_| SymBand::zeros(self.layout.dofs(), self.layout.bandwidth()), |k| k.0)
    }

    /// K(ω) and J₀(ω), the members' clamped–clamped frequencies below ω.
    pub(crate) fn assemble_with_poles(&self, omega: f64) -> Result<(SymBand, usize)> {
        let layout = &self.layout;
        let mut k = SymBand::zeros(layout.dofs(), layout.bandwidth());
        let mut poles: usize = 0;
        let w2 = omega * omega;
        // Layouts cut members into equal pieces, so neighbouring members are often identical;
        // their stiffness is computed once.
        let mut previous: Option<(&Member, Evaluated)> = None;
        for (span, member) in layout.spans.iter().zip(&self.members) {
            let evaluated = match previous {
                Some((m, value)) if m == member => Some(value),
                _ => member.stiffness_and_count(omega),
            };
            if let Some(value) = evaluated {
                previous = Some((member, value));
            }
            let Some((local, count)) = evaluated else {
                return Err(Error::new(
                    ErrorKind::Model,
                    format!(
                        "near {:.4e} Hz this segment's shear rigidity κGA is too low for its bending stiffness \
                         and rotary inertia to be computed as a Timoshenko beam; check κGA and ρI (or the section)",
                        omega / std::f64::consts::TAU
                    ),
                )
                .at(crate::path::FieldPath::item("segments", span.segment)));
            };
            poles = poles.saturating_add(count);
            k.scatter(&layout.span_dofs(span), &local);
        }
        for s in &layout.stations {
            if let Some(w) = s.w {
                k.add(w, w, s.spring - w2 * s.mass);
            }
            if let Some(t) = s.theta {
                k.add(t, t, s.rotational_spring - w2 * s.rotary_inertia);
            }
            for d in &s.sprung {
                k.add(d.dof, d.dof, d.stiffness - w2 * d.mass);
                if let Some(w) = s.w {
                    k.add(w, w, d.stiffness);
                    k.add(w, d.dof, -d.stiffness);
                }
            }
        }
        Ok((k, poles))
    }
}
