//! Model checks on a property that a section and material give (EI, m, κGA, ρI), traced back
//! to the field the user wrote: such a segment has no `flexural_rigidity` or `shear_rigidity`
//! field for an error to name.

use crate::error::{number, roughly, Error};
use crate::extra_mass::{ExtraMassInput, MassBreakdown};
use crate::material::{MaterialInput, ResolvedMaterial};
use crate::model::SHEAR_RATIO;
use crate::path::FieldPath;
use crate::schema::{FLEXURAL_RIGIDITY, MASS_PER_LENGTH, SHEAR_RIGIDITY};
use crate::section::{SectionInput, SectionProps};
use crate::units::Quantity;

/// What a segment given by section and material was made of, kept to explain a model error.
#[derive(Clone, Debug)]
pub(super) struct SectionOrigin {
    pub(super) section_input: SectionInput,
    pub(super) material_input: MaterialInput,
    pub(super) extra_input: ExtraMassInput,
    pub(super) material: ResolvedMaterial,
    pub(super) props: SectionProps,
    pub(super) mass: MassBreakdown,
}

/// Rewrites a model error at `segment` (`segments[2]`) about a derived property so that it
/// names the section, the material or the extra mass, whichever decides that property.
/// Errors about fields the user wrote are returned unchanged.
pub(super) fn explain(e: Error, segment: &FieldPath, origin: &SectionOrigin) -> Error {
    let own_field = e.path.parent().as_ref() == Some(segment);
    let Some(field) = e.path.last_key().filter(|_| own_field) else { return e };
    let (mat, props, mass) = (&origin.material, &origin.props, &origin.mass);
    let at = |place: &str| segment.key(place);
    // Where the error stands, what was typed there when one field decides it, the message and
    // the derived value in SI.
    let (place, typed, message, si): (_, Option<&Quantity>, _, _) = match field {
        "flexural_rigidity" => {
            let ei = mat.youngs_modulus * props.second_moment;
            (
                at("section"),
                None,
                format!(
                    "the bending stiffness EI = E·I of this section in this material must lie {}; check \
                     the section's dimensions and the material's Young's modulus",
                    FLEXURAL_RIGIDITY.allowed()
                ),
                (ei, "N·m²"),
            )
        }
        "mass_per_length" => {
            let (place, typed) = heaviest(segment, origin);
            (
                place,
                typed,
                format!(
                    "the mass per length of this section in this material, with its extra mass, must lie {}; \
                     check the units of the density, the dimensions and the extra mass",
                    MASS_PER_LENGTH.allowed()
                ),
                (mass.total(), "kg/m"),
            )
        }
        "shear_rigidity" if e.message.contains("implausible") => {
            return implausible_shear(e, segment, origin)
        }
        "shear_rigidity" => {
            let kga = props.shear_coefficient * mat.shear_modulus * props.area;
            // κ is at most 1, so a κGA too small whose G·A alone is in range was made so by a
            // shear coefficient typed too small: name it, as typed.
            let ga_in_range = SHEAR_RIGIDITY.range.contains(mat.shear_modulus * props.area, false);
            let (place, typed) = match &origin.section_input {
                SectionInput::Custom { shear_coefficient: Some(kappa), .. } if ga_in_range => {
                    (at("section").key("shear_coefficient"), Some(kappa))
                }
                _ => (at("section"), None),
            };
            (
                place,
                typed,
                format!(
                    "the shear rigidity κGA of this section in this material must lie {}; check the \
                     section's dimensions and the material's shear modulus",
                    SHEAR_RIGIDITY.allowed()
                ),
                (kga, "N"),
            )
        }
        "rotary_inertia_per_length" => (
            at("section"),
            None,
            "the rotary inertia ρI of this section in this material cannot be computed; check the \
             section's dimensions and the material's density"
                .to_string(),
            (f64::NAN, ""),
        ),
        _ => return e,
    };
    let error = Error::new(e.kind, message).at(place);
    match typed {
        Some(typed) => error.with_value(typed),
        None => error,
    }
    .with_si(si.0, si.1)
}

/// Where the mass of a segment given by section lies: the section (with its material's density)
/// when that outweighs the extra mass, else the heaviest part of the extra mass, at the field
/// that gives it and with its value as typed.
fn heaviest<'a>(segment: &FieldPath, origin: &'a SectionOrigin) -> (FieldPath, Option<&'a Quantity>) {
    let (mass, extra) = (&origin.mass, &origin.extra_input);
    let parts = [mass.structural, mass.contents, mass.lining, mass.added_water];
    let heaviest = (1..parts.len()).fold(0, |best, i| if parts[i] > parts[best] { i } else { best });
    let extra_mass = segment.key("extra_mass");
    match heaviest {
        1 if extra.contents_density.is_some() => {
            (extra_mass.key("contents_density"), extra.contents_density.as_ref())
        }
        1 if extra.contents.is_some() => (extra_mass.key("contents"), None),
        1 => (extra_mass, None),
        2 => (extra_mass.key("lining"), extra.lining.as_ref()),
        3 => (extra_mass.key("submerged"), None),
        _ => (segment.key("section"), None),
    }
}

/// The plausibility check of κGA fails for a section segment when E/G, the shear coefficient
/// κ, or the share of extra mass in m is far from what real beams have: EI/κGA ÷ ρI/m equals
/// (E/G)·(1/κ)·(m/ρA). Name the factor to blame.
fn implausible_shear(e: Error, segment: &FieldPath, origin: &SectionOrigin) -> Error {
    let (mat, props, mass) = (&origin.material, &origin.props, &origin.mass);
    let e_over_g = mat.youngs_modulus / mat.shear_modulus;
    let extra = mass.total() / mass.structural;
    let inverse_kappa = 1.0 / props.shear_coefficient;
    let ratio = e_over_g * inverse_kappa * extra;
    let check = format!(
        "so EI/κGA is {} times ρI/m, outside the {} to {} accepted",
        roughly(ratio),
        number(SHEAR_RATIO.0),
        number(SHEAR_RATIO.1)
    );
    // Real materials have E/G from about 2.5 (metals) to 50 (wood, composites across the grain).
    if !(1.0..=50.0).contains(&e_over_g) {
        let given_g = matches!(&origin.material_input, MaterialInput::Custom { shear_modulus: Some(_), .. });
        let material = segment.key("material");
        let place = if given_g { material.key("shear_modulus") } else { material };
        let message = format!(
            "E/G is {}, but real materials give about 2.5 (metals) to 50 (wood, composites); check the units \
             of the shear modulus and Young's modulus",
            roughly(e_over_g)
        );
        let mut error = Error::new(e.kind, message).at(place);
        if let MaterialInput::Custom { shear_modulus: Some(g), .. } = &origin.material_input {
            error = error.with_value(g).with_si(mat.shear_modulus, "Pa");
        }
        return error;
    }
    if extra > inverse_kappa {
        let message = format!(
            "the extra mass (contents, lining, water) is {} times the section's own, {check}; check its units",
            roughly(extra - 1.0)
        );
        return Error::new(e.kind, message).at(segment.key("extra_mass"));
    }
    let message = format!(
        "this section's shear coefficient κ is only {}, {check}; check its dimensions",
        roughly(props.shear_coefficient)
    );
    Error::new(e.kind, message).at(segment.key("section"))
}
