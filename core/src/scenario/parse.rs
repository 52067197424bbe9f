//! The scenario file format, read field by field from parsed JSON (see `docs/scenario-format.md`).

use super::json::Node;
use super::{AttachmentInput, EndInput, ExcitationInput, Scenario, SegmentInput};
use crate::error::{Error, ErrorKind, Result};
use crate::extra_mass::{ExtraMassInput, Submerged};
use crate::material::MaterialInput;
use crate::model::Theory;
use crate::section::{BendingAxis, SectionInput};
use crate::units::UnitSystem;

/// The most elastic modes one scenario may ask for.
const MODES: std::ops::RangeInclusive<usize> = 1..=crate::analysis::MAX_MODES;

pub(crate) fn scenario(n: &Node<'_>) -> Result<Scenario> {
    n.fields(
        "a scenario object",
        &[
            "title",
            "units",
            "theory",
            "modes",
            "elements",
            "report_point",
            "left",
            "right",
            "segments",
            "attachments",
            "excitations",
            "margin",
        ],
    )?;
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
        modes: n.get("modes").map(|m| m.count(MODES)).transpose()?.unwrap_or(6),
        elements: n.get("elements").map(|e| e.count(1..=crate::fe::MAX_ELEMENTS)).transpose()?,
        report_point: n.quantity_at("report_point")?,
        left: end(&n.require("left", "the support at the left end")?)?,
        right: end(&n.require("right", "the support at the right end")?)?,
        segments: n
            .require("segments", "a list of segments")?
            .items("a list of segments")?
            .iter()
            .map(segment)
            .collect::<Result<_>>()?,
        attachments: list("attachments", "a list of attachments")?
            .iter()
            .map(attachment)
            .collect::<Result<_>>()?,
        excitations: list("excitations", "a list of excitations")?
            .iter()
            .map(excitation)
            .collect::<Result<_>>()?,
        margin: n.quantity_at("margin")?,
    })
}

pub(crate) fn unit_system(n: &Node<'_>) -> Result<UnitSystem> {
    n.choice(
        "the unit system",
        &[
            ("si", UnitSystem::Si),
            ("si-mm", UnitSystem::SiMm),
            ("us-inch", UnitSystem::UsInch),
            ("us-foot", UnitSystem::UsFoot),
        ],
    )
}

pub(crate) fn theory(n: &Node<'_>) -> Result<Theory> {
    n.choice(
        "the beam theory",
        &[("euler-bernoulli", Theory::EulerBernoulli), ("timoshenko", Theory::Timoshenko)],
    )
}

const END_TYPES: [(&str, u8); 5] =
    [("free", 0), ("pinned", 1), ("clamped", 2), ("guided", 3), ("elastic", 4)];

pub(crate) fn end(n: &Node<'_>) -> Result<EndInput> {
    let (kind, fields) = if n.is_text() {
        (n.choice("an end", &END_TYPES)?, None)
    } else {
        let map = n.fields(
            "an end (a name, or an object with \"type\")",
            &["type", "translational", "rotational"],
        )?;
        let kind = n.require("type", "the kind of end")?.choice("an end", &END_TYPES)?;
        (kind, Some(map))
    };
    if kind != 4 {
        if let Some(extra) = fields.and_then(|m| m.keys().find(|k| *k != "type")) {
            let place = if n.path().is_empty() { extra.clone() } else { format!("{}.{extra}", n.path()) };
            return Err(Error::new(
                ErrorKind::Conflict,
                "only an \"elastic\" end takes springs; remove this field or make the end elastic",
            )
            .at(place));
        }
    }
    Ok(match kind {
        0 => EndInput::Free,
        1 => EndInput::Pinned,
        2 => EndInput::Clamped,
        3 => EndInput::Guided,
        _ => EndInput::Elastic {
            translational: n.quantity_at("translational")?,
            rotational: n.quantity_at("rotational")?,
        },
    })
}

pub(crate) fn segment(n: &Node<'_>) -> Result<SegmentInput> {
    n.fields(
        "a segment object",
        &[
            "length",
            "flexural_rigidity",
            "mass_per_length",
            "shear_rigidity",
            "rotary_inertia_per_length",
            "section",
            "material",
            "extra_mass",
        ],
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
    })
}

pub(crate) fn section(n: &Node<'_>) -> Result<SectionInput> {
    let shapes = [
        ("rectangle", 0u8),
        ("round", 1),
        ("tube", 2),
        ("rectangular-tube", 3),
        ("i-beam", 4),
        ("custom", 5),
    ];
    n.object("a section object, with its \"shape\"")?;
    let shape = n.require("shape", "the section's shape")?.choice("a section shape", &shapes)?;
    let q = |name: &str, what: &str| n.require_quantity(name, what);
    Ok(match shape {
        0 => {
            n.fields("a section", &["shape", "width", "depth"])?;
            SectionInput::Rectangle { width: q("width", "a width")?, depth: q("depth", "a depth")? }
        }
        1 => {
            n.fields("a section", &["shape", "diameter"])?;
            SectionInput::Round { diameter: q("diameter", "a diameter")? }
        }
        2 => {
            n.fields("a section", &["shape", "outer_diameter", "wall"])?;
            SectionInput::Tube {
                outer_diameter: q("outer_diameter", "an outer diameter")?,
                wall: q("wall", "a wall thickness")?,
            }
        }
        3 => {
            n.fields("a section", &["shape", "width", "depth", "wall"])?;
            SectionInput::RectangularTube {
                width: q("width", "a width")?,
                depth: q("depth", "a depth")?,
                wall: q("wall", "a wall thickness")?,
            }
        }
        4 => {
            n.fields(
                "a section",
                &["shape", "depth", "flange_width", "flange_thickness", "web_thickness", "axis"],
            )?;
            SectionInput::IBeam {
                depth: q("depth", "an overall depth")?,
                flange_width: q("flange_width", "a flange width")?,
                flange_thickness: q("flange_thickness", "a flange thickness")?,
                web_thickness: q("web_thickness", "a web thickness")?,
                axis: match n.get("axis") {
                    Some(a) => a.choice(
                        "the bending axis",
                        &[("strong", BendingAxis::Strong), ("weak", BendingAxis::Weak)],
                    )?,
                    None => BendingAxis::Strong,
                },
            }
        }
        _ => {
            n.fields("a section", &["shape", "area", "second_moment", "depth", "shear_coefficient"])?;
            SectionInput::Custom {
                area: q("area", "an area")?,
                second_moment: q("second_moment", "a second moment of area")?,
                depth: n.quantity_at("depth")?,
                shear_coefficient: n.quantity_at("shear_coefficient")?,
            }
        }
    })
}

pub(crate) fn material(n: &Node<'_>) -> Result<MaterialInput> {
    if n.is_text() {
        return Ok(MaterialInput::Preset(n.text("a material")?.to_string()));
    }
    n.fields(
        "a material (a preset name, or an object)",
        &["youngs_modulus", "density", "poisson", "shear_modulus"],
    )?;
    Ok(MaterialInput::Custom {
        youngs_modulus: n.require_quantity("youngs_modulus", "Young's modulus")?,
        density: n.require_quantity("density", "a density")?,
        poisson: n.quantity_at("poisson")?,
        shear_modulus: n.quantity_at("shear_modulus")?,
    })
}

pub(crate) fn extra_mass(n: &Node<'_>) -> Result<ExtraMassInput> {
    n.fields("an extra-mass object", &["contents_density", "lining", "submerged"])?;
    let submerged = match n.get("submerged") {
        Some(s) => {
            s.fields("a submerged object", &["water_density", "added_mass_coefficient"])?;
            Some(Submerged {
                water_density: s.quantity_at("water_density")?,
                added_mass_coefficient: s.quantity_at("added_mass_coefficient")?,
            })
        }
        None => None,
    };
    Ok(ExtraMassInput {
        contents_density: n.quantity_at("contents_density")?,
        lining: n.quantity_at("lining")?,
        submerged,
    })
}

pub(crate) fn attachment(n: &Node<'_>) -> Result<AttachmentInput> {
    let kinds = [("mass", 0u8), ("spring", 1), ("rotational-spring", 2), ("support", 3), ("sprung-mass", 4)];
    n.object("an attachment object, with its \"type\"")?;
    let kind = n.require("type", "the kind of attachment")?.choice("an attachment", &kinds)?;
    let position = || n.require_quantity("position", "a position from the left end");
    let label = || n.text_at("label");
    Ok(match kind {
        0 => {
            n.fields("a mass", &["type", "position", "mass", "rotary_inertia", "label"])?;
            AttachmentInput::Mass {
                position: position()?,
                mass: n.require_quantity("mass", "a mass")?,
                rotary_inertia: n.quantity_at("rotary_inertia")?,
                label: label()?,
            }
        }
        1 | 2 => {
            n.fields("a spring", &["type", "position", "stiffness", "label"])?;
            let (position, stiffness, label) =
                (position()?, n.require_quantity("stiffness", "a stiffness")?, label()?);
            if kind == 1 {
                AttachmentInput::Spring { position, stiffness, label }
            } else {
                AttachmentInput::RotationalSpring { position, stiffness, label }
            }
        }
        3 => {
            n.fields("a support", &["type", "position", "label"])?;
            AttachmentInput::Support { position: position()?, label: label()? }
        }
        _ => {
            n.fields("a sprung mass", &["type", "position", "mass", "stiffness", "label"])?;
            AttachmentInput::SprungMass {
                position: position()?,
                mass: n.require_quantity("mass", "a mass")?,
                stiffness: n.require_quantity("stiffness", "a spring stiffness")?,
                label: label()?,
            }
        }
    })
}

pub(crate) fn excitation(n: &Node<'_>) -> Result<ExcitationInput> {
    n.fields("an excitation", &["label", "frequency", "harmonics"])?;
    Ok(ExcitationInput {
        label: n.text_at("label")?.unwrap_or_default(),
        frequency: n.require_quantity("frequency", "a frequency, like \"1780 rpm\"")?,
        harmonics: n.get("harmonics").map(|h| h.count(1..=50)).transpose()?.unwrap_or(1),
    })
}
