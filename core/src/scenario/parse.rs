//! The scenario file format, read field by field from parsed JSON. Which keys each object
//! allows and what a missing field is called come from the schema (`crate::schema`); ranges are
//! checked later, in SI, by the model layer.

use super::json::Node;
use super::{AttachmentInput, EndInput, ExcitationInput, Scenario, SegmentInput};
use crate::error::{Error, ErrorKind, Result};
use crate::extra_mass::{ExtraMassInput, Submerged};
use crate::material::MaterialInput;
use crate::model::{AttachmentKind, EndKind, Theory};
use crate::schema::{self, Choice, Field};
use crate::section::{BendingAxis, SectionInput};
use crate::units::{Quantity, UnitSystem};

pub(crate) fn scenario(n: &Node<'_>) -> Result<Scenario> {
    n.fields("a scenario object", &schema::keys(&[&schema::SCENARIO]))?;
    let list = |name: &str, what: &str| -> Result<Vec<Node<'_>>> {
        Ok(match n.get(name) {
            Some(node) => node.items(what)?,
            None => Vec::new(),
        })
    };
    Ok(Scenario {
        title: n.text_at("title")?.unwrap_or_default(),
        units: n.get("units").map(|u| unit_system(&u)).transpose()?.unwrap_or_default(),
        theory: n.get("theory").map(|t| theory(&t)).transpose()?.unwrap_or_default(),
        modes: n.get("modes").map(|m| m.whole(&schema::MODES)).transpose()?.unwrap_or(schema::DEFAULT_MODES),
        elements: n.get("elements").map(|e| e.whole(&schema::ELEMENTS)).transpose()?,
        report_point: n.quantity_at("report_point")?,
        left: end(&n.require("left", "the support at the left end")?)?,
        right: end(&n.require("right", "the support at the right end")?)?,
        segments: each(&n.require("segments", "a list of segments")?.items("a list of segments")?, segment)?,
        attachments: each(&list("attachments", "a list of attachments")?, attachment)?,
        excitations: each(&list("excitations", "a list of excitations")?, excitation)?,
        margin: n.quantity_at("margin")?,
        tolerances: each(&list("tolerances", "a list of tolerances")?, super::design::tolerance)?,
        measured: each(&list("measured", "a list of measured frequencies")?, super::design::measured)?,
        calibrate: each(&list("calibrate", "a list of inputs to calibrate")?, super::design::range)?,
        resize: n.get("resize").map(|r| super::design::resize(&r)).transpose()?,
    })
}

/// Each item read, stopping at the first error. A plain loop: collecting an iterator of results
/// builds an adapter for each type of item, which the solver's engine, built for speed, carries
/// with the item's reader inlined into it.
fn each<T>(items: &[Node<'_>], read: fn(&Node<'_>) -> Result<T>) -> Result<Vec<T>> {
    let mut read_items = Vec::with_capacity(items.len());
    for item in items {
        read_items.push(read(item)?);
    }
    Ok(read_items)
}

pub(crate) fn unit_system(n: &Node<'_>) -> Result<UnitSystem> {
    let names = UnitSystem::ALL.map(|s| (s.id(), s));
    n.choice("the unit system", &names)
}

pub(crate) fn theory(n: &Node<'_>) -> Result<Theory> {
    n.choice("the beam theory", &Theory::ALL.map(|t| (t.id(), t)))
}

/// The fields a choice's object holds: its tag, what every such object has, and its own.
fn allowed(tag: &'static str, common: &[Field], choice: Option<&Choice>) -> Vec<&'static str> {
    let mut keys = vec![tag];
    keys.extend(common.iter().map(|f| f.name));
    keys.extend(choice.into_iter().flat_map(|c| c.fields.iter().map(|f| f.name)));
    keys
}

pub(crate) fn end(n: &Node<'_>) -> Result<EndInput> {
    let names = EndKind::ALL.map(|k| (k.id(), k));
    let elastic = schema::find(&schema::ENDS, EndKind::Elastic.id());
    let (kind, fields) = if n.is_text() {
        (n.choice("an end", &names)?, None)
    } else {
        let map = n.fields("an end (a name, or an object with \"type\")", &allowed("type", &[], elastic))?;
        (n.require("type", "the kind of end")?.choice("an end", &names)?, Some(map))
    };
    if kind != EndKind::Elastic {
        if let Some(extra) = fields.and_then(|m| m.keys().find(|k| *k != "type")) {
            let place = n.path().key(extra);
            return Err(Error::new(
                ErrorKind::Conflict,
                "only an \"elastic\" end takes springs; remove this field or make the end elastic",
            )
            .at(place));
        }
    }
    Ok(match kind {
        EndKind::Free => EndInput::Free,
        EndKind::Pinned => EndInput::Pinned,
        EndKind::Clamped => EndInput::Clamped,
        EndKind::Guided => EndInput::Guided,
        EndKind::Elastic => EndInput::Elastic {
            translational: n.quantity_at(schema::END_TRANSLATIONAL.name)?,
            rotational: n.quantity_at(schema::END_ROTATIONAL.name)?,
        },
    })
}

pub(crate) fn segment(n: &Node<'_>) -> Result<SegmentInput> {
    n.fields(
        "a segment object",
        &schema::keys(&[&schema::SEGMENT, &schema::PROPERTY_FIELDS, &schema::AXIAL_FIELDS]),
    )?;
    Ok(SegmentInput {
        length: n.quantity_at("length")?,
        flexural_rigidity: n.quantity_at("flexural_rigidity")?,
        mass_per_length: n.quantity_at("mass_per_length")?,
        shear_rigidity: n.quantity_at("shear_rigidity")?,
        rotary_inertia_per_length: n.quantity_at("rotary_inertia_per_length")?,
        section: n.get("section").map(|s| section(&s)).transpose()?,
        material: n.get("material").map(|m| material(&m)).transpose()?,
        extra_mass: n.get("extra_mass").map(|e| extra_mass(&e)).transpose()?,
        axial_force: n.quantity_at(schema::AXIAL_FORCE.name)?,
        temperature_change: n.quantity_at(schema::TEMPERATURE_CHANGE.name)?,
    })
}

/// A name that engineers also write as a number (a pipe size `4`, a schedule `40`), as text.
fn name_or_number(n: &Node<'_>, key: &str, what: &str) -> Result<String> {
    let value = n.require(key, what)?;
    if value.is_text() {
        return Ok(value.text(what)?.to_string());
    }
    match value.quantity()? {
        Quantity::Number(v) => Ok(crate::error::as_typed(v)),
        Quantity::Text(t) => Ok(t),
    }
}

pub(crate) fn section(n: &Node<'_>) -> Result<SectionInput> {
    n.object("a section object, with its \"shape\"")?;
    let shape = n.require("shape", "the section's shape")?.one_of("a section shape", &schema::SHAPES)?;
    n.fields("a section", &allowed("shape", &[], Some(shape)))?;
    // Each shape's fields are required unless the schema says otherwise.
    let q = |name: &str| {
        let field = shape.fields.iter().find(|f| f.name == name);
        n.require_quantity(name, field.map_or(name, |f| f.what))
    };
    Ok(match shape.id {
        "rectangle" => SectionInput::Rectangle { width: q("width")?, depth: q("depth")? },
        "round" => SectionInput::Round { diameter: q("diameter")? },
        "tube" => SectionInput::Tube { outer_diameter: q("outer_diameter")?, wall: q("wall")? },
        "pipe" => SectionInput::Pipe {
            nominal_size: name_or_number(n, "nominal_size", "a nominal pipe size")?,
            schedule: name_or_number(n, "schedule", "a pipe schedule")?,
            outer_diameter: n.quantity_at("outer_diameter")?,
            wall: n.quantity_at("wall")?,
        },
        "rectangular-tube" => {
            SectionInput::RectangularTube { width: q("width")?, depth: q("depth")?, wall: q("wall")? }
        }
        "i-beam" => SectionInput::IBeam {
            depth: q("depth")?,
            flange_width: q("flange_width")?,
            flange_thickness: q("flange_thickness")?,
            web_thickness: q("web_thickness")?,
            axis: match n.get("axis") {
                Some(a) => a.choice(
                    "the bending axis",
                    &[("strong", BendingAxis::Strong), ("weak", BendingAxis::Weak)],
                )?,
                None => BendingAxis::Strong,
            },
        },
        "custom" => SectionInput::Custom {
            area: q("area")?,
            second_moment: q("second_moment")?,
            depth: n.quantity_at("depth")?,
            shear_coefficient: n.quantity_at("shear_coefficient")?,
        },
        // Every shape the schema lists is read above; a test reads each one.
        other => {
            return Err(Error::new(
                ErrorKind::UnknownOption,
                format!("the shape \"{other}\" cannot be read yet"),
            )
            .at(n.path()))
        }
    })
}

pub(crate) fn material(n: &Node<'_>) -> Result<MaterialInput> {
    if n.is_text() {
        return Ok(MaterialInput::Preset(n.text("a material")?.to_string()));
    }
    n.fields(
        "a material (a preset name, or an object)",
        &schema::keys(&[&schema::MATERIAL_FIELDS, &schema::MATERIAL_RECORD_FIELDS]),
    )?;
    let [e, rho, nu, g] = &schema::MATERIAL_FIELDS;
    let [preset, alpha] = &schema::MATERIAL_RECORD_FIELDS;
    Ok(MaterialInput::Custom {
        youngs_modulus: n.require_quantity(e.name, e.what)?,
        density: n.require_quantity(rho.name, rho.what)?,
        poisson: n.quantity_at(nu.name)?,
        shear_modulus: n.quantity_at(g.name)?,
        preset: n.text_at(preset.name)?,
        thermal_expansion: n.quantity_at(alpha.name)?,
    })
}

pub(crate) fn extra_mass(n: &Node<'_>) -> Result<ExtraMassInput> {
    n.fields("an extra-mass object", &schema::keys(&[&schema::EXTRA_MASS_FIELDS]))?;
    let submerged = match n.get("submerged") {
        Some(s) => {
            s.fields("a submerged object", &schema::keys(&[&schema::SUBMERGED_FIELDS]))?;
            Some(Submerged {
                water_density: s.quantity_at("water_density")?,
                added_mass_coefficient: s.quantity_at("added_mass_coefficient")?,
            })
        }
        None => None,
    };
    Ok(ExtraMassInput {
        contents: n.text_at("contents")?,
        contents_density: n.quantity_at("contents_density")?,
        lining: n.quantity_at("lining")?,
        submerged,
    })
}

pub(crate) fn attachment(n: &Node<'_>) -> Result<AttachmentInput> {
    let names = AttachmentKind::ALL.map(|k| (k.id(), k));
    n.object("an attachment object, with its \"type\"")?;
    let kind = n.require("type", "the kind of attachment")?.choice("an attachment", &names)?;
    let own = schema::find(&schema::ATTACHMENTS, kind.id()).map_or(&[][..], |c| c.fields);
    let what = format!("a {}", kind.id().replace('-', " "));
    n.fields(
        &what,
        &allowed("type", &schema::ATTACHMENT_FIELDS, schema::find(&schema::ATTACHMENTS, kind.id())),
    )?;
    let mut values = Vec::with_capacity(own.len());
    for field in own {
        let value = if field.optional {
            n.quantity_at(field.name)?
        } else {
            Some(n.require_quantity(field.name, field.what)?)
        };
        values.extend(value.map(|q| (field.name, q)));
    }
    Ok(AttachmentInput {
        kind,
        position: n.require_quantity(schema::POSITION.name, schema::POSITION.what)?,
        values,
        label: n.text_at(schema::LABEL.name)?,
    })
}

pub(crate) fn excitation(n: &Node<'_>) -> Result<ExcitationInput> {
    n.fields("an excitation", &schema::keys(&[&schema::EXCITATION_FIELDS]))?;
    Ok(ExcitationInput {
        label: n.text_at("label")?.unwrap_or_default(),
        frequency: n.require_quantity(schema::FREQUENCY.name, "a frequency, like \"1780 rpm\"")?,
        up_to: n.quantity_at(schema::UP_TO.name)?,
        orders: n.get(schema::ORDERS.name).map(|o| super::design::orders(&o)).transpose()?,
        harmonics: n.get(schema::HARMONICS.name).map(|h| h.whole(&schema::HARMONICS)).transpose()?,
    })
}
