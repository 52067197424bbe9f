//! An input's SI value written into the scenario as read (the typed [`Scenario`]) instead of its
//! JSON, so that a trial of the design tools costs a model's reading and not the scenario
//! reader's too.
//!
//! The writing is [`super::set`]'s, made on the typed scenario: a preset material becomes a
//! custom one of the preset's values (α too, and the shear modulus where it is not E/2(1+ν)), a
//! named end becomes an elastic end of its springs ("rigid" for infinite), an absent extra mass,
//! submerged part or optional field is created, and a value is a number in SI ("rigid" when
//! infinite). Anything else (a path this writer does not know, or one the JSON writer refuses)
//! leaves the evaluator on the JSON. The tests hold the typed copy to the JSON written with the
//! same values, read ([`prepare`]), for every documented scenario and the cases beside them.

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
/// `paths` made writable, when each path is one this writer knows and the JSON writer takes too
/// (it refuses, for one, to create an extra mass where the scenario holds a null).
///
/// The tests also read the JSON written with values of its own and hold the typed copy, written
/// with the same values, to be the scenario read from it; the solver's engine is spared that
/// check's code (a comparison of whole scenarios, 12 KB of it).
#[inline(never)]
pub(super) fn prepare<'p>(doc: &Value, paths: &'p [FieldPath]) -> Option<Typed<'p>> {
    let mut scenario = Scenario::from_ready_value(doc).ok()?;
    let mut places = Vec::with_capacity(paths.len());
    for path in paths {
        let place = place(path)?;
        target(&mut scenario, &place)?;
        places.push(place);
    }
    // Distinct values, so that a value written to the wrong place shows.
    let probe: Vec<f64> = (0..paths.len()).map(|k| 1.25 + k as f64).collect();
    let mut json = doc.clone();
    for (path, v) in paths.iter().zip(&probe) {
        super::set(&mut json, path, *v).ok()?;
    }
    let typed = Typed { scenario, places };
    same(&typed, &probe, &json).then_some(typed)
}

/// Whether the typed copy written with `probe` is the scenario read from `json`, written so.
#[cfg(test)]
fn same(typed: &Typed<'_>, probe: &[f64], json: &Value) -> bool {
    let mut written = Typed { scenario: typed.scenario.clone(), places: typed.places.clone() };
    written.write(probe).is_some() && Scenario::from_ready_value(json).ok() == Some(written.scenario)
}

#[cfg(not(test))]
fn same(_: &Typed<'_>, _: &[f64], _: &Value) -> bool {
    true
}

/// The typed copy of a scenario, and the places of the inputs written into it, their paths'
/// steps matched with the writer's keys once.
pub(super) struct Typed<'p> {
    /// The scenario, with the values last written.
    pub(super) scenario: Scenario,
    places: Vec<Place<'p>>,
}

impl Typed<'_> {
    /// Writes `values` (SI, none NaN) at the inputs' places, in order.
    #[inline(never)]
    pub(super) fn write(&mut self, values: &[f64]) -> Option<()> {
        for (place, v) in self.places.iter().zip(values) {
            let q = quantity(*v);
            match target(&mut self.scenario, place)? {
                Target::Value(at) => *at = q,
                Target::Optional(at) => *at = Some(q),
            }
        }
        Some(())
    }
}

/// A value as [`super::set`] writes it and the scenario reader reads it back.
fn quantity(v: f64) -> Quantity {
    if v.is_infinite() {
        Quantity::Text("rigid".into())
    } else {
        Quantity::Number(v)
    }
}

/// The keys the writer knows, matched with a path's steps once, when an evaluator is made: one
/// table, not a comparison of text at every arm (the solver's engine carries this code).
#[derive(Clone, Copy, PartialEq)]
enum K {
    Left,
    Right,
    Attachments,
    Segments,
    Position,
    Section,
    Material,
    ExtraMass,
    Submerged,
    Length,
    FlexuralRigidity,
    MassPerLength,
    ShearRigidity,
    RotaryInertiaPerLength,
    AxialForce,
    TemperatureChange,
    Width,
    Depth,
    Diameter,
    OuterDiameter,
    Wall,
    FlangeWidth,
    FlangeThickness,
    WebThickness,
    Area,
    SecondMoment,
    ShearCoefficient,
    YoungsModulus,
    Density,
    Poisson,
    ShearModulus,
    ThermalExpansion,
    ContentsDensity,
    Lining,
    WaterDensity,
    AddedMassCoefficient,
    Translational,
    Rotational,
}

const KEYS: [(&str, K); 38] = [
    ("left", K::Left),
    ("right", K::Right),
    ("attachments", K::Attachments),
    ("segments", K::Segments),
    ("position", K::Position),
    ("section", K::Section),
    ("material", K::Material),
    ("extra_mass", K::ExtraMass),
    ("submerged", K::Submerged),
    ("length", K::Length),
    ("flexural_rigidity", K::FlexuralRigidity),
    ("mass_per_length", K::MassPerLength),
    ("shear_rigidity", K::ShearRigidity),
    ("rotary_inertia_per_length", K::RotaryInertiaPerLength),
    ("axial_force", K::AxialForce),
    ("temperature_change", K::TemperatureChange),
    ("width", K::Width),
    ("depth", K::Depth),
    ("diameter", K::Diameter),
    ("outer_diameter", K::OuterDiameter),
    ("wall", K::Wall),
    ("flange_width", K::FlangeWidth),
    ("flange_thickness", K::FlangeThickness),
    ("web_thickness", K::WebThickness),
    ("area", K::Area),
    ("second_moment", K::SecondMoment),
    ("shear_coefficient", K::ShearCoefficient),
    ("youngs_modulus", K::YoungsModulus),
    ("density", K::Density),
    ("poisson", K::Poisson),
    ("shear_modulus", K::ShearModulus),
    ("thermal_expansion", K::ThermalExpansion),
    ("contents_density", K::ContentsDensity),
    ("lining", K::Lining),
    ("water_density", K::WaterDensity),
    ("added_mass_coefficient", K::AddedMassCoefficient),
    ("translational", K::Translational),
    ("rotational", K::Rotational),
];

/// A step of a path: a key the writer knows, another key (an attachment's own field), an index.
#[derive(Clone, Copy)]
enum Part<'p> {
    Known(K),
    Name(&'p str),
    Index(usize),
}

fn part(step: &Step) -> Part<'_> {
    match step {
        Step::Index(i) => Part::Index(*i),
        Step::Key(k) => {
            KEYS.iter().find(|(name, _)| name == k).map_or(Part::Name(k), |(_, key)| Part::Known(*key))
        }
    }
}

/// A path's steps, matched with the writer's keys (five at most: the deepest input is an extra
/// mass's water).
#[derive(Clone, Copy)]
struct Place<'p> {
    parts: [Part<'p>; 5],
    len: usize,
}

fn place(path: &FieldPath) -> Option<Place<'_>> {
    let steps = path.steps();
    if steps.len() > 5 {
        return None;
    }
    let mut parts = [Part::Index(0); 5];
    for (p, step) in parts.iter_mut().zip(steps) {
        *p = part(step);
    }
    Some(Place { parts, len: steps.len() })
}

/// The place an input has in the typed scenario, turning a preset material or a named end into
/// its values and creating an absent extra mass or optional field on the way.
#[inline(never)]
fn target<'s>(s: &'s mut Scenario, place: &Place<'_>) -> Option<Target<'s>> {
    use Part::{Index, Known, Name};
    match place.parts[..place.len] {
        [Known(K::Left), Known(k)] => end_spring(&mut s.left, k),
        [Known(K::Right), Known(k)] => end_spring(&mut s.right, k),
        [Known(K::Attachments), Index(i), Known(K::Position)] => {
            Some(Target::Value(&mut s.attachments.get_mut(i)?.position))
        }
        [Known(K::Attachments), Index(i), Name(k)] => {
            let a = s.attachments.get_mut(i)?;
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
        [Known(K::Segments), Index(i), ref rest @ ..] => segment(s.segments.get_mut(i)?, rest),
        _ => None,
    }
}

fn segment<'s>(s: &'s mut SegmentInput, rest: &[Part<'_>]) -> Option<Target<'s>> {
    use Part::Known;
    let optional = Target::Optional;
    Some(match *rest {
        [Known(k)] => optional(match k {
            K::Length => &mut s.length,
            K::FlexuralRigidity => &mut s.flexural_rigidity,
            K::MassPerLength => &mut s.mass_per_length,
            K::ShearRigidity => &mut s.shear_rigidity,
            K::RotaryInertiaPerLength => &mut s.rotary_inertia_per_length,
            K::AxialForce => &mut s.axial_force,
            K::TemperatureChange => &mut s.temperature_change,
            _ => return None,
        }),
        [Known(K::Section), Known(k)] => section(s.section.as_mut()?, k)?,
        [Known(K::Material), Known(k)] => material(s.material.as_mut()?, k)?,
        [Known(K::ExtraMass), Known(k)] => {
            let extra = s.extra_mass.get_or_insert_with(Default::default);
            optional(match k {
                K::ContentsDensity => &mut extra.contents_density,
                K::Lining => &mut extra.lining,
                _ => return None,
            })
        }
        [Known(K::ExtraMass), Known(K::Submerged), Known(k)] => {
            let extra = s.extra_mass.get_or_insert_with(Default::default);
            let submerged = extra.submerged.get_or_insert_with(Default::default);
            optional(match k {
                K::WaterDensity => &mut submerged.water_density,
                K::AddedMassCoefficient => &mut submerged.added_mass_coefficient,
                _ => return None,
            })
        }
        _ => return None,
    })
}

fn section(s: &mut SectionInput, k: K) -> Option<Target<'_>> {
    use Target::{Optional, Value};
    Some(match (s, k) {
        (SectionInput::Rectangle { width, .. }, K::Width) => Value(width),
        (SectionInput::Rectangle { depth, .. }, K::Depth) => Value(depth),
        (SectionInput::Round { diameter }, K::Diameter) => Value(diameter),
        (SectionInput::Tube { outer_diameter, .. }, K::OuterDiameter) => Value(outer_diameter),
        (SectionInput::Tube { wall, .. }, K::Wall) => Value(wall),
        (SectionInput::Pipe { outer_diameter, .. }, K::OuterDiameter) => Optional(outer_diameter),
        (SectionInput::Pipe { wall, .. }, K::Wall) => Optional(wall),
        (SectionInput::RectangularTube { width, .. }, K::Width) => Value(width),
        (SectionInput::RectangularTube { depth, .. }, K::Depth) => Value(depth),
        (SectionInput::RectangularTube { wall, .. }, K::Wall) => Value(wall),
        (SectionInput::IBeam { depth, .. }, K::Depth) => Value(depth),
        (SectionInput::IBeam { flange_width, .. }, K::FlangeWidth) => Value(flange_width),
        (SectionInput::IBeam { flange_thickness, .. }, K::FlangeThickness) => Value(flange_thickness),
        (SectionInput::IBeam { web_thickness, .. }, K::WebThickness) => Value(web_thickness),
        (SectionInput::Custom { area, .. }, K::Area) => Value(area),
        (SectionInput::Custom { second_moment, .. }, K::SecondMoment) => Value(second_moment),
        (SectionInput::Custom { depth, .. }, K::Depth) => Optional(depth),
        (SectionInput::Custom { shear_coefficient, .. }, K::ShearCoefficient) => Optional(shear_coefficient),
        _ => return None,
    })
}

fn material(m: &mut MaterialInput, k: K) -> Option<Target<'_>> {
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
        K::YoungsModulus => Target::Value(youngs_modulus),
        K::Density => Target::Value(density),
        K::Poisson => Target::Optional(poisson),
        K::ShearModulus => Target::Optional(shear_modulus),
        K::ThermalExpansion => Target::Optional(thermal_expansion),
        _ => return None,
    })
}

fn end_spring(end: &mut EndInput, k: K) -> Option<Target<'_>> {
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
        K::Translational => translational,
        K::Rotational => rotational,
        _ => return None,
    }))
}
