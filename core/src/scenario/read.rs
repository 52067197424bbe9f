//! Reading a scenario into a validated model: every value with its unit, every field checked,
//! every conversion recorded for display.
//!
//! Longer than 400 lines on purpose: each part of the scenario is read by one function here, and
//! they share the reader's conversion log and path handling, which are easier to keep consistent
//! in one place.

use super::derived::{self, SectionOrigin};
use super::{AttachmentInput, EndInput, ExcitationInput, Scenario, SegmentInput};
use crate::error::{Error, ErrorKind, Result};
use crate::extra_mass::{self, MassBreakdown};
use crate::material;
use crate::model::{self, Attachment, End, Model, ModelParts, Options, Segment};
use crate::path::{FieldPath, Step};
use crate::schema;
use crate::section;
use crate::units::{self, Conversion, Kind, Quantity};

/// A scenario read and checked: the model, the options, and what the inputs were in SI.
#[derive(Clone, Debug, PartialEq)]
pub struct Inputs {
    /// The validated model.
    pub model: Model,
    /// Analysis options.
    pub options: Options,
    /// Per segment: how its properties came about.
    pub segments: Vec<SegmentEcho>,
    /// Per attachment: its label (empty when none was given).
    pub labels: Vec<String>,
    /// Per attachment: its kind, as the scenario names it.
    pub kinds: Vec<crate::model::AttachmentKind>,
    /// Excitations, in Hz.
    pub excitations: Vec<ExcitationRead>,
    /// Separation margin as a ratio.
    pub margin: f64,
    /// Every unit conversion applied: (field path, record).
    pub conversions: Vec<(FieldPath, Conversion)>,
}

/// An excitation read: a single speed or a range, and the orders that drive the beam.
#[derive(Clone, Debug, PartialEq)]
pub struct ExcitationRead {
    /// What it is; empty when the scenario gave no label.
    pub label: String,
    /// The frequency, or the bottom of a variable speed's range, Hz.
    pub low_hz: f64,
    /// The top of a variable speed's range, Hz.
    pub high_hz: Option<f64>,
    /// The multiples that drive the beam, ascending.
    pub orders: Vec<f64>,
}

/// How a segment's properties came about.
#[derive(Clone, Debug, Default, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SegmentEcho {
    /// The section's shape name, when given by section.
    pub section: Option<String>,
    /// The material's name, when given by material.
    pub material: Option<String>,
    /// Where the mass per length comes from, when given by section.
    pub mass: Option<MassBreakdown>,
    /// Depth in the plane of vibration, m, when known.
    pub depth: Option<f64>,
    /// Squared radius of gyration I/A, m², when known.
    pub gyration_squared: Option<f64>,
    /// The axial force in the segment, N, tension positive, when it carries one: the force
    /// typed plus that of the temperature change.
    pub axial_force: Option<f64>,
    /// The part of `axial_force` from the temperature change with the ends held, −E·A·α·ΔT, N.
    pub thermal_force: Option<f64>,
}

#[derive(Default)]
struct Reader<'a> {
    /// Whether only the model and the options are wanted ([`Scenario::to_model_lean`]): no
    /// conversion records, values as written or section origins kept, the echo left bare.
    lean: bool,
    conversions: Vec<(FieldPath, Conversion)>,
    /// Every value read, as written, by path: model checks see SI numbers, but an error should
    /// show what the user typed ("-3 kg", not "-3"). Kept as the scenario's own values, written
    /// out only for an error: the design study reads scenarios thousands of times a solve.
    written: Vec<(FieldPath, &'a Quantity)>,
}

// Not inlined, like the JSON reader's methods (`json.rs` says why): each is called at a dozen
// places or more.
impl<'a> Reader<'a> {
    #[inline(never)]
    fn read(&mut self, q: &'a Quantity, kind: Kind, path: &FieldPath) -> Result<f64> {
        if self.lean {
            return units::convert(q, kind).map(|c| c.si).map_err(|e| e.at(path));
        }
        self.written.push((path.clone(), q));
        units::convert_field(q, kind, path, &mut self.conversions)
    }

    /// [`Reader::read`] of the field `key` of `parent`, its path made only where it is kept or
    /// an error needs it: a lean reading makes none.
    #[inline(never)]
    fn read_key(&mut self, q: &'a Quantity, kind: Kind, parent: &FieldPath, key: &str) -> Result<f64> {
        if self.lean {
            return units::convert(q, kind).map(|c| c.si).map_err(|e| e.at(parent.key(key)));
        }
        self.read(q, kind, &parent.key(key))
    }

    /// A stiffness that may also be written "rigid", the field `key` of `parent`.
    #[inline(never)]
    fn spring(&mut self, q: &'a Quantity, kind: Kind, parent: &FieldPath, key: &str) -> Result<f64> {
        if let Quantity::Text(t) = q {
            if matches!(t.trim().to_ascii_lowercase().as_str(), "rigid" | "infinite" | "inf") {
                if !self.lean {
                    self.written.push((parent.key(key), q));
                }
                return Ok(f64::INFINITY);
            }
        }
        self.read_key(q, kind, parent, key)
    }

    /// Adds what the user typed to an error about a value read here, found by its path.
    #[inline(never)]
    fn typed(&self, e: Error) -> Error {
        match self.written.iter().find(|(path, _)| *path == e.path) {
            Some((_, typed)) => e.with_value(typed),
            None => e,
        }
    }

    #[inline(never)]
    fn keep(&mut self, parent: &FieldPath, key: &str, conversions: &[(FieldPath, Conversion)]) {
        if self.lean {
            return;
        }
        let path = parent.key(key);
        self.conversions.extend(conversions.iter().map(|(field, c)| (path.join(field), c.clone())));
    }
}

impl Scenario {
    /// Reads every value, checks the model, and returns it with the options and an echo.
    pub fn to_model(&self) -> Result<Inputs> {
        self.read_model(false)
    }

    /// [`Scenario::to_model`] for the design study's trials, which use the model and the options
    /// only: every value is read and every check made, but the echo is left bare (no unit
    /// conversions recorded, the segments' echoes holding only their axial forces) and nothing
    /// is kept to word an error with. An error is therefore the full reading's, read again.
    pub(crate) fn to_model_lean(&self) -> Result<Inputs> {
        self.read_model(true).or_else(|_| self.to_model())
    }

    /// Never inlined: the solve and the design study's trials both call it, and the worker's
    /// engine, built for speed, would otherwise carry the whole reader twice.
    #[inline(never)]
    fn read_model(&self, lean: bool) -> Result<Inputs> {
        let mut r = Reader { lean, ..Reader::default() };
        let mut segments = Vec::with_capacity(self.segments.len());
        let mut echoes = Vec::with_capacity(self.segments.len());
        let mut origins = Vec::with_capacity(self.segments.len());
        for (i, s) in self.segments.iter().enumerate() {
            let (segment, echo, origin) = read_segment(&mut r, s, &FieldPath::item("segments", i))?;
            segments.push(segment);
            echoes.push(echo);
            origins.push(origin);
        }
        let left = read_end(&mut r, &self.left, "left")?;
        let right = read_end(&mut r, &self.right, "right")?;
        let mut attachments = Vec::with_capacity(self.attachments.len());
        for (i, a) in self.attachments.iter().enumerate() {
            attachments.push(read_attachment(&mut r, a, &FieldPath::item("attachments", i))?);
        }
        let labels = self.attachments.iter().map(|a| a.label.clone().unwrap_or_default()).collect();
        let kinds = self.attachments.iter().map(|a| a.kind).collect();
        let model = Model::new(ModelParts { segments, left, right, attachments, theory: self.theory })
            .map_err(|e| {
                let e = match segment_of(&e.path).and_then(|i| Some((i, origins.get(i)?.as_ref()?))) {
                    Some((i, origin)) => derived::explain(e, &FieldPath::item("segments", i), origin),
                    None => e,
                };
                r.typed(e)
            })?;
        let forces: Vec<f64> = echoes.iter().map(|e: &SegmentEcho| e.axial_force.unwrap_or(0.0)).collect();
        let model = model
            .with_axial_forces(forces)
            .and_then(|m| crate::axial::check_taut(&m).map(|()| m))
            .map_err(|e| self.at_typed_force(r.typed(e)))?;
        let report_point = match &self.report_point {
            Some(q) => Some(r.read(q, schema::REPORT_POINT.kind, &schema::REPORT_POINT.name.into())?),
            None => None,
        };
        let options = Options { modes: self.modes, elements: self.elements, report_point };
        let options = options.checked(&model).map_err(|e| r.typed(e))?;
        let mut excitations = Vec::with_capacity(self.excitations.len());
        for (i, e) in self.excitations.iter().enumerate() {
            excitations.push(read_excitation(&mut r, e, &FieldPath::item("excitations", i))?);
        }
        let margin = match &self.margin {
            None => schema::DEFAULT_MARGIN,
            Some(q) => read_ratio(q)?,
        };
        Ok(Inputs {
            model,
            options,
            segments: echoes,
            labels,
            kinds,
            excitations,
            margin,
            conversions: r.conversions,
        })
    }
}

/// The index of the segment a path lies in: 2 for `segments[2].length`.
impl Scenario {
    /// An error placed on a segment's axial force, placed instead on its temperature change when
    /// that alone gave the force, and given the value as typed: the field the reader wrote.
    pub(crate) fn at_typed_force(&self, mut e: Error) -> Error {
        let Some(i) = segment_of(&e.path) else { return e };
        let segment = FieldPath::item("segments", i);
        if e.path != segment.key(schema::AXIAL_FORCE.name) {
            return e;
        }
        match self.segments.get(i).map(|s| (&s.axial_force, &s.temperature_change)) {
            Some((Some(force), _)) => e.with_value(force),
            Some((None, Some(change))) => {
                e.path = segment.key(schema::TEMPERATURE_CHANGE.name);
                e.with_value(change)
            }
            _ => e,
        }
    }
}

fn segment_of(path: &FieldPath) -> Option<usize> {
    match path.steps() {
        [Step::Key(list), Step::Index(i), ..] if list == "segments" => Some(*i),
        _ => None,
    }
}

/// A segment, how it was described, and what its section and material were made of.
type ReadSegment = (Segment, SegmentEcho, Option<SectionOrigin>);

fn read_segment<'a>(r: &mut Reader<'a>, s: &'a SegmentInput, path: &FieldPath) -> Result<ReadSegment> {
    let at = |field: &str| path.key(field);
    let length = match &s.length {
        Some(q) => r.read_key(q, Kind::Length, path, "length")?,
        None => return Err(Error::new(ErrorKind::Missing, "a segment needs a length").at(at("length"))),
    };
    let direct = s.flexural_rigidity.is_some() || s.mass_per_length.is_some();
    let by_section = s.section.is_some() || s.material.is_some();
    if direct && by_section {
        return Err(Error::new(
            ErrorKind::Conflict,
            "give either flexural_rigidity and mass_per_length, or section and material, not both",
        )
        .at(path));
    }
    if s.extra_mass.is_some() && !by_section {
        return Err(Error::new(
            ErrorKind::Conflict,
            "extra_mass needs a section and material (the bore and outer diameter come from the section); \
             otherwise include it in mass_per_length",
        )
        .at(at("extra_mass")));
    }
    if by_section {
        let (Some(section_input), Some(material_input)) = (&s.section, &s.material) else {
            let missing = if s.section.is_none() { "section" } else { "material" };
            return Err(Error::new(
                ErrorKind::Missing,
                "a segment given by section also needs a material, and the reverse",
            )
            .at(at(missing)));
        };
        if s.shear_rigidity.is_some() || s.rotary_inertia_per_length.is_some() {
            return Err(Error::new(
                ErrorKind::Conflict,
                "shear rigidity and rotary inertia come from the section and material; remove these fields",
            )
            .at(at(if s.shear_rigidity.is_some() {
                "shear_rigidity"
            } else {
                "rotary_inertia_per_length"
            })));
        }
        let mat = material::resolve(material_input).map_err(|e| e.at(at("material")))?;
        r.keep(path, "material", &mat.conversions);
        let props = section::properties(section_input, mat.poisson).map_err(|e| e.at(at("section")))?;
        r.keep(path, "section", &props.conversions);
        let extra = s.extra_mass.clone().unwrap_or_default();
        let mass = extra_mass::breakdown(&props, mat.density, &extra).map_err(|e| e.at(at("extra_mass")))?;
        r.keep(path, "extra_mass", &mass.conversions);
        let segment = Segment {
            length,
            flexural_rigidity: mat.youngs_modulus * props.second_moment,
            mass_per_length: mass.total(),
            shear_rigidity: Some(props.shear_coefficient * mat.shear_modulus * props.area),
            // Only the beam's own material turns with the section; contents and water are
            // taken to translate only (the usual assumption).
            rotary_inertia_per_length: mat.density * props.second_moment,
        };
        let thermal = match &s.temperature_change {
            Some(q) => {
                let field = at(schema::TEMPERATURE_CHANGE.name);
                let dt = r.read(q, schema::TEMPERATURE_CHANGE.kind, &field)?;
                model::value(&schema::TEMPERATURE_CHANGE, dt).map_err(|e| e.at(path).with_value(q))?;
                let Some(alpha) = mat.thermal_expansion else {
                    return Err(Error::new(
                        ErrorKind::Conflict,
                        "a temperature change needs the material's thermal expansion α: type it under the \
                         material (as in 12e-6 /K; a preset material fills it in), or give the force −E·A·α·ΔT \
                         as the axial force instead",
                    )
                    .at(field)
                    .with_value(q));
                };
                // Held at both ends, the segment cannot grow: the force is what squeezes the
                // free thermal strain α·ΔT back out, −E·A·α·ΔT (compression when heated).
                Some(-mat.youngs_modulus * props.area * alpha * dt)
            }
            None => None,
        };
        if r.lean {
            let axial_force = axial_force(r, s, path, thermal)?;
            return Ok((segment, SegmentEcho { axial_force, ..SegmentEcho::default() }, None));
        }
        let echo = SegmentEcho {
            section: Some(section_name(section_input)),
            material: Some(mat.name.clone()),
            mass: Some(mass.clone()),
            depth: Some(props.depth),
            gyration_squared: Some(props.second_moment / props.area),
            axial_force: axial_force(r, s, path, thermal)?,
            thermal_force: thermal,
        };
        let origin = SectionOrigin {
            section_input: section_input.clone(),
            material_input: material_input.clone(),
            extra_input: extra,
            material: mat,
            props,
            mass,
        };
        return Ok((segment, echo, Some(origin)));
    }
    let (Some(ei), Some(m)) = (&s.flexural_rigidity, &s.mass_per_length) else {
        let missing = if s.flexural_rigidity.is_none() { "flexural_rigidity" } else { "mass_per_length" };
        return Err(Error::new(
            ErrorKind::Missing,
            "a segment needs flexural_rigidity and mass_per_length, or a section and a material",
        )
        .at(at(missing)));
    };
    let flexural_rigidity = r.read_key(ei, Kind::FlexuralRigidity, path, "flexural_rigidity")?;
    let mass_per_length = r.read_key(m, Kind::MassPerLength, path, "mass_per_length")?;
    let shear_rigidity = match &s.shear_rigidity {
        Some(q) => Some(r.read_key(q, Kind::ShearRigidity, path, "shear_rigidity")?),
        None => None,
    };
    let rotary_inertia_per_length = match &s.rotary_inertia_per_length {
        Some(q) => r.read_key(q, Kind::RotaryInertiaPerLength, path, "rotary_inertia_per_length")?,
        None => 0.0,
    };
    let gyration_squared =
        (rotary_inertia_per_length > 0.0).then(|| rotary_inertia_per_length / mass_per_length);
    let segment =
        Segment { length, flexural_rigidity, mass_per_length, shear_rigidity, rotary_inertia_per_length };
    if let Some(q) = &s.temperature_change {
        return Err(Error::new(
            ErrorKind::Conflict,
            "a temperature change needs a section and a preset material (for E, A and α); for a segment given \
             by its properties, give the force −E·A·α·ΔT as the axial force",
        )
        .at(at(schema::TEMPERATURE_CHANGE.name))
        .with_value(q));
    }
    let axial_force = axial_force(r, s, path, None)?;
    Ok((segment, SegmentEcho { gyration_squared, axial_force, ..SegmentEcho::default() }, None))
}

/// The segment's axial force, N: the force typed plus the thermal one; `None` when neither.
fn axial_force<'a>(
    r: &mut Reader<'a>,
    s: &'a SegmentInput,
    path: &FieldPath,
    thermal: Option<f64>,
) -> Result<Option<f64>> {
    let typed = match &s.axial_force {
        Some(q) => {
            let at = path.key(schema::AXIAL_FORCE.name);
            let p = r.read(q, schema::AXIAL_FORCE.kind, &at)?;
            model::value(&schema::AXIAL_FORCE, p).map_err(|e| e.at(path).with_value(q))?;
            Some(p)
        }
        None => None,
    };
    let total = match (typed, thermal) {
        (None, None) => return Ok(None),
        (a, b) => a.unwrap_or(0.0) + b.unwrap_or(0.0),
    };
    if total.abs() > schema::AXIAL_FORCE_LIMIT {
        let at = path.key(if thermal.is_some() {
            schema::TEMPERATURE_CHANGE.name
        } else {
            schema::AXIAL_FORCE.name
        });
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "the axial force this gives, {} N, is beyond any beam's strength (at most {} N); check the units",
                crate::error::number(total),
                crate::error::number(schema::AXIAL_FORCE_LIMIT)
            ),
        )
        .at(at));
    }
    Ok(Some(total))
}

fn section_name(s: &section::SectionInput) -> String {
    if let section::SectionInput::Pipe { nominal_size, schedule, .. } = s {
        return format!("steel pipe {} in, schedule {}", nominal_size.trim(), schedule.trim());
    }
    let name = match s {
        section::SectionInput::Rectangle { .. } => "solid rectangle",
        section::SectionInput::Round { .. } => "solid round",
        section::SectionInput::Tube { .. } => "round tube",
        section::SectionInput::RectangularTube { .. } => "rectangular tube",
        section::SectionInput::IBeam { .. } => "I-section",
        _ => "custom section",
    };
    name.to_string()
}

#[inline(never)]
fn read_end<'a>(r: &mut Reader<'a>, end: &'a EndInput, side: &str) -> Result<End> {
    Ok(match end {
        EndInput::Free => End::Free,
        EndInput::Pinned => End::Pinned,
        EndInput::Clamped => End::Clamped,
        EndInput::Guided => End::Guided,
        EndInput::Elastic { translational, rotational } => {
            let path = &FieldPath::root().key(side);
            let mut spring = |q: &'a Option<Quantity>, kind, field: &str| match q {
                Some(q) => r.spring(q, kind, path, field),
                None => Ok(0.0),
            };
            End::Elastic {
                translational: spring(translational, Kind::Stiffness, "translational")?,
                rotational: spring(rotational, Kind::RotationalStiffness, "rotational")?,
            }
        }
    })
}

/// An attachment: its position, then each field the schema gives its type, in its kind
/// (stiffnesses may be written "rigid"; an optional field left out is 0), made into the model's
/// attachment by its kind.
fn read_attachment<'a>(r: &mut Reader<'a>, a: &'a AttachmentInput, path: &FieldPath) -> Result<Attachment> {
    let position = r.read_key(&a.position, schema::POSITION.kind, path, schema::POSITION.name)?;
    let own = schema::find(&schema::ATTACHMENTS, a.kind.id()).map_or(&[][..], |c| c.fields);
    let mut values = Vec::with_capacity(own.len());
    for field in own {
        let value = match a.value(field.name) {
            Some(q) if matches!(field.kind, Kind::Stiffness | Kind::RotationalStiffness) => {
                r.spring(q, field.kind, path, field.name)?
            }
            Some(q) => r.read_key(q, field.kind, path, field.name)?,
            None => 0.0,
        };
        values.push((field.name, value));
    }
    let value = |key: &str| values.iter().find(|(k, _)| *k == key).map_or(0.0, |(_, v)| *v);
    a.kind.model(position, &value).map_err(|e| r.typed(e.at(path)))
}

fn read_excitation<'a>(
    r: &mut Reader<'a>,
    e: &'a ExcitationInput,
    path: &FieldPath,
) -> Result<ExcitationRead> {
    let at = |field: &str| path.key(field);
    let f = r.read(&e.frequency, schema::FREQUENCY.kind, &at(schema::FREQUENCY.name))?;
    model::value(&schema::FREQUENCY, f).map_err(|err| err.at(path).with_value(&e.frequency))?;
    let high_hz = match &e.up_to {
        Some(q) => {
            let top = r.read(q, schema::UP_TO.kind, &at(schema::UP_TO.name))?;
            model::value(&schema::UP_TO, top).map_err(|err| err.at(path).with_value(q))?;
            if top < f {
                return Err(Error::new(
                    ErrorKind::OutOfRange,
                    "the top of the speed range must not lie below its bottom (`frequency`)",
                )
                .at(at(schema::UP_TO.name))
                .with_value(q));
            }
            Some(top)
        }
        None => None,
    };
    let orders = match (&e.orders, e.harmonics) {
        (Some(_), Some(_)) => {
            return Err(Error::new(
                ErrorKind::Conflict,
                "give either orders or harmonics, not both (orders [1, 2, 3] are harmonics 3)",
            )
            .at(at(schema::HARMONICS.name)))
        }
        (Some(orders), None) => {
            let mut orders = orders.clone();
            crate::sort::floats(&mut orders);
            orders.dedup();
            orders
        }
        (None, harmonics) => {
            let harmonics = harmonics.unwrap_or(schema::DEFAULT_HARMONICS);
            model::whole(&schema::HARMONICS, harmonics).map_err(|err| err.at(path))?;
            (1..=harmonics).map(|h| h as f64).collect()
        }
    };
    // The drives and the bands a margin forbids around them must stay within the numbers the
    // engine computes with (a margin is below 100 %, so twice the top is the widest band).
    let top = high_hz.unwrap_or(f) * orders.iter().copied().fold(1.0, f64::max) * 2.0;
    if !top.is_finite() {
        let (key, q) = match &e.up_to {
            Some(q) => (schema::UP_TO.name, q),
            None => (schema::FREQUENCY.name, &e.frequency),
        };
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "this frequency times its highest order is too large to compute with; check the unit and the exponent",
        )
        .at(at(key))
        .with_value(q));
    }
    Ok(ExcitationRead { label: e.label.clone(), low_hz: f, high_hz, orders })
}

/// The margin, a ratio written as a number (0.2) or a percentage ("20 %").
fn read_ratio(q: &Quantity) -> Result<f64> {
    let at_margin = |e: Error| e.at(schema::MARGIN.name);
    let value = match q {
        Quantity::Number(v) => *v,
        Quantity::Text(t) => {
            let t = t.trim();
            match t.strip_suffix('%') {
                Some(number) => units::decimal(number.trim())
                    .map(|v| v / 100.0)
                    .ok_or_else(|| {
                        Error::new(
                            ErrorKind::Syntax,
                            "write the margin as a ratio (0.2) or a percentage (\"20 %\")",
                        )
                        .with_value(t)
                    })
                    .map_err(at_margin)?,
                None => {
                    units::parse(t, Kind::Ratio)
                        .map_err(|mut e| {
                            // The ratio's reader names only a plain number; the margin takes a
                            // percentage too, read above.
                            if e.kind == ErrorKind::UnknownUnit {
                                e.message.push_str(", or as a percentage, as in 20 %");
                            }
                            at_margin(e)
                        })?
                        .si
                }
            }
        }
    };
    model::value(&schema::MARGIN, value).map_err(|e| e.with_value(q))?;
    Ok(value)
}
