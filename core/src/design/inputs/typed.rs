//! An input's SI value written into the scenario as read (the typed [`Scenario`]) instead of its
//! JSON, so that a trial of the design tools costs a model's reading and not the scenario
//! reader's too.
//!
//! The writing is [`super::set`]'s, made on the typed scenario: a preset material becomes a
//! custom one of the preset's values (α too, and the shear modulus where it is not E/2(1+ν)), a
//! named end becomes an elastic end of its springs ("rigid" for infinite), an absent extra mass,
//! submerged part or optional field is created, and a value is a number in SI ("rigid" when
//! infinite). Anything else (a path this writer does not know) leaves the evaluator on the JSON,
//! and so does a scenario whose typed copy does not read as the JSON written with the same
//! values would: [`prepare`] checks that once, on values of its own.

use crate::material::MaterialInput;
use crate::path::{FieldPath, Step};
use crate::scenario::{EndInput, Scenario, SegmentInput};
use crate::schema;
use crate::section::SectionInput;
use crate::units::Quantity;
use serde_json::Value;

/// Where a value goes: a field that is always written, or an optional one.
enum Target<'s> {
    Value(&'s mut Quantity),
    Optional(&'s mut Option<Quantity>),
}

/// The typed copy of `doc` (a scenario made ready, its tolerances split off) with every input at
/// `paths` made writable, when each path is one this writer knows and the copy, written with
/// values of its own, reads as the JSON written with them does.
pub(super) fn prepare(doc: &Value, paths: &[FieldPath]) -> Option<Scenario> {
    let mut scenario = Scenario::from_ready_value(doc).ok()?;
    for path in paths {
        target(&mut scenario, path)?;
    }
    // Distinct values, so that a value written to the wrong place shows.
    let probe: Vec<f64> = (0..paths.len()).map(|k| 1.25 + k as f64).collect();
    let mut json = doc.clone();
    for (path, v) in paths.iter().zip(&probe) {
        super::set(&mut json, path, *v).ok()?;
    }
    let expected = Scenario::from_ready_value(&json).ok()?;
    let mut written = scenario.clone();
    write(&mut written, paths, &probe)?;
    (written == expected).then_some(scenario)
}

/// Writes `values` (SI, none NaN) at `paths` of a scenario that [`prepare`] made.
pub(super) fn write(scenario: &mut Scenario, paths: &[FieldPath], values: &[f64]) -> Option<()> {
    for (path, v) in paths.iter().zip(values) {
        let q = quantity(*v);
        match target(scenario, path)? {
            Target::Value(at) => *at = q,
            Target::Optional(at) => *at = Some(q),
        }
    }
    Some(())
}

/// A value as [`super::set`] writes it and the scenario reader reads it back.
fn quantity(v: f64) -> Quantity {
    if v.is_infinite() {
        Quantity::Text("rigid".into())
    } else {
        Quantity::Number(v)
    }
}

/// The place a path names in the typed scenario, turning a preset material or a named end into
/// its values and creating an absent extra mass or optional field on the way.
fn target<'s>(s: &'s mut Scenario, path: &FieldPath) -> Option<Target<'s>> {
    use Step::{Index, Key};
    let steps = path.steps();
    match steps {
        [Key(end), Key(k)] if end == "left" || end == "right" => {
            let end = if end == "left" { &mut s.left } else { &mut s.right };
            end_spring(end, k)
        }
        [Key(list), Index(i), Key(k)] if list == "attachments" => {
            let a = s.attachments.get_mut(*i)?;
            if k == schema::POSITION.name {
                return Some(Target::Value(&mut a.position));
            }
            let own = schema::find(&schema::ATTACHMENTS, a.kind.id())?.fields;
            let rank = |name: &str| own.iter().position(|f| f.name == name);
            let field = own.iter().find(|f| f.name == k && f.form == schema::Form::Quantity)?;
            let at = match a.values.iter().position(|(name, _)| *name == field.name) {
                Some(at) => at,
                None => {
                    // In the schema's order, as the reader lists them.
                    let later = a.values.iter().position(|(name, _)| rank(name) > rank(field.name));
                    let at = later.unwrap_or(a.values.len());
                    a.values.insert(at, (field.name, Quantity::Number(0.0)));
                    at
                }
            };
            Some(Target::Value(&mut a.values[at].1))
        }
        [Key(list), Index(i), rest @ ..] if list == "segments" => segment(s.segments.get_mut(*i)?, rest),
        _ => None,
    }
}

fn segment<'s>(s: &'s mut SegmentInput, rest: &[Step]) -> Option<Target<'s>> {
    use Step::Key;
    let optional = Target::Optional;
    Some(match rest {
        [Key(k)] => optional(match k.as_str() {
            "length" => &mut s.length,
            "flexural_rigidity" => &mut s.flexural_rigidity,
            "mass_per_length" => &mut s.mass_per_length,
            "shear_rigidity" => &mut s.shear_rigidity,
            "rotary_inertia_per_length" => &mut s.rotary_inertia_per_length,
            "axial_force" => &mut s.axial_force,
            "temperature_change" => &mut s.temperature_change,
            _ => return None,
        }),
        [Key(part), Key(k)] if part == "section" => section(s.section.as_mut()?, k)?,
        [Key(part), Key(k)] if part == "material" => material(s.material.as_mut()?, k)?,
        [Key(part), Key(k)] if part == "extra_mass" => {
            let extra = s.extra_mass.get_or_insert_with(Default::default);
            optional(match k.as_str() {
                "contents_density" => &mut extra.contents_density,
                "lining" => &mut extra.lining,
                _ => return None,
            })
        }
        [Key(part), Key(sub), Key(k)] if part == "extra_mass" && sub == "submerged" => {
            let extra = s.extra_mass.get_or_insert_with(Default::default);
            let submerged = extra.submerged.get_or_insert_with(Default::default);
            optional(match k.as_str() {
                "water_density" => &mut submerged.water_density,
                "added_mass_coefficient" => &mut submerged.added_mass_coefficient,
                _ => return None,
            })
        }
        _ => return None,
    })
}

fn section<'s>(s: &'s mut SectionInput, k: &str) -> Option<Target<'s>> {
    use Target::{Optional, Value};
    Some(match (s, k) {
        (SectionInput::Rectangle { width, .. }, "width") => Value(width),
        (SectionInput::Rectangle { depth, .. }, "depth") => Value(depth),
        (SectionInput::Round { diameter }, "diameter") => Value(diameter),
        (SectionInput::Tube { outer_diameter, .. }, "outer_diameter") => Value(outer_diameter),
        (SectionInput::Tube { wall, .. }, "wall") => Value(wall),
        (SectionInput::Pipe { outer_diameter, .. }, "outer_diameter") => Optional(outer_diameter),
        (SectionInput::Pipe { wall, .. }, "wall") => Optional(wall),
        (SectionInput::RectangularTube { width, .. }, "width") => Value(width),
        (SectionInput::RectangularTube { depth, .. }, "depth") => Value(depth),
        (SectionInput::RectangularTube { wall, .. }, "wall") => Value(wall),
        (SectionInput::IBeam { depth, .. }, "depth") => Value(depth),
        (SectionInput::IBeam { flange_width, .. }, "flange_width") => Value(flange_width),
        (SectionInput::IBeam { flange_thickness, .. }, "flange_thickness") => Value(flange_thickness),
        (SectionInput::IBeam { web_thickness, .. }, "web_thickness") => Value(web_thickness),
        (SectionInput::Custom { area, .. }, "area") => Value(area),
        (SectionInput::Custom { second_moment, .. }, "second_moment") => Value(second_moment),
        (SectionInput::Custom { depth, .. }, "depth") => Optional(depth),
        (SectionInput::Custom { shear_coefficient, .. }, "shear_coefficient") => Optional(shear_coefficient),
        _ => return None,
    })
}

fn material<'s>(m: &'s mut MaterialInput, k: &str) -> Option<Target<'s>> {
    if let MaterialInput::Preset(id) = m {
        let p = crate::material::preset(id.trim())?;
        let g = p.shear_modulus();
        *m = MaterialInput::Custom {
            youngs_modulus: Quantity::Number(p.youngs_modulus),
            density: Quantity::Number(p.density),
            poisson: Some(Quantity::Number(p.poisson)),
            shear_modulus: (g != p.youngs_modulus / (2.0 * (1.0 + p.poisson))).then_some(Quantity::Number(g)),
            preset: None,
            thermal_expansion: Some(Quantity::Number(p.thermal_expansion)),
        };
    }
    let MaterialInput::Custom { youngs_modulus, density, poisson, shear_modulus, thermal_expansion, .. } = m
    else {
        return None;
    };
    Some(match k {
        "youngs_modulus" => Target::Value(youngs_modulus),
        "density" => Target::Value(density),
        "poisson" => Target::Optional(poisson),
        "shear_modulus" => Target::Optional(shear_modulus),
        "thermal_expansion" => Target::Optional(thermal_expansion),
        _ => return None,
    })
}

fn end_spring<'s>(end: &'s mut EndInput, k: &str) -> Option<Target<'s>> {
    let springs = match end {
        EndInput::Free => Some((0.0, 0.0)),
        EndInput::Pinned => Some((f64::INFINITY, 0.0)),
        EndInput::Clamped => Some((f64::INFINITY, f64::INFINITY)),
        EndInput::Guided => Some((0.0, f64::INFINITY)),
        EndInput::Elastic { .. } => None,
    };
    if let Some((t, r)) = springs {
        *end = EndInput::Elastic { translational: Some(quantity(t)), rotational: Some(quantity(r)) };
    }
    let EndInput::Elastic { translational, rotational } = end else { return None };
    Some(Target::Optional(match k {
        "translational" => translational,
        "rotational" => rotational,
        _ => return None,
    }))
}
