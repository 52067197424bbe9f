//! The table: every field of the scenario format, object by object. The editor's catalogue and
//! the format's documentation read the same entries, so the words here are shown to users.
//! Longer than 400 lines on purpose: it is one table, read top to bottom in the order of the
//! format's documentation, and a field is easier to find, and to add, where its neighbours are.

use super::{doc, Choice, Field, Form, Range};
use crate::units::{Kind, UnitSystem};

/// Most elastic modes one analysis reports (besides rigid-body modes).
pub const MAX_MODES: usize = 20;
/// Elastic modes computed when the scenario does not say.
pub const DEFAULT_MODES: usize = 6;
/// Harmonics checked when an excitation does not say (the frequency itself).
pub const DEFAULT_HARMONICS: usize = 1;
/// Most harmonics checked per excitation.
pub const MAX_HARMONICS: usize = 50;
/// The default separation margin between natural and excitation frequencies (common practice
/// keeps 10–20 %; the larger figure is the default — common practice, no single source).
pub const DEFAULT_MARGIN: f64 = 0.2;

/// Lengths and section dimensions, m: a nanometre to a thousand kilometres.
pub const DIMENSION: Range = Range::Between(1e-9, 1e6);
/// Areas, m²: the squares of [`DIMENSION`]'s ends.
pub const AREA: Range = Range::Between(1e-18, 1e12);
/// Second moments of area, m⁴: the fourth powers of [`DIMENSION`]'s ends.
pub const SECOND_MOMENT: Range = Range::Between(1e-36, 1e24);
/// Plausible moduli, Pa: wide enough for soft foams and for diamond, narrow enough to catch a
/// modulus typed without its unit ("200" is read as 200 Pa, not 200 GPa).
pub const MODULUS: Range = Range::Between(1e3, 1e13);
/// Plausible densities, kg/m³: from light foams to beyond the densest metals; it catches a
/// density typed without its unit ("0.283" is read as 0.283 kg/m³, not 0.283 lb/in³).
pub const DENSITY: Range = Range::Between(1.0, 1e5);
/// Masses on the beam, kg, and rotary inertias, kg·m².
const MASS_MAX: f64 = 1e12;
/// Spring stiffnesses, N/m or N·m/rad, below rigid.
const STIFFNESS: f64 = 1e20;

const fn length(name: &'static str, label: &'static str, what: &'static str) -> Field {
    Field::quantity(name, Kind::Length, DIMENSION).label(label).what(what).help(what)
}

/// The fields of the scenario object.
pub static SCENARIO: [Field; 16] = [
    Field::of("title", Form::Text).label("Title").what("a title").help("a title for the results").or("empty"),
    Field::of("units", Form::Name)
        .label("Units")
        .what("the unit system")
        .help("how results and inputs are shown: `\"si\"`, `\"si-mm\"`, `\"us-inch\"`, `\"us-foot\"`")
        .or("`\"si\"`"),
    Field::of("theory", Form::Name)
        .label("Beam theory")
        .what("the beam theory")
        .help("`\"euler-bernoulli\"` (bending only) or `\"timoshenko\"` (with shear deformation and rotary inertia)")
        .or("`\"euler-bernoulli\"`"),
    MODES,
    ELEMENTS,
    REPORT_POINT,
    Field::of("left", Form::Part).what("the support at the left end").help("how the left end is held (below)"),
    Field::of("right", Form::Part).what("the support at the right end").help("how the right end is held (below)"),
    Field::of("segments", Form::Part)
        .what("a list of segments")
        .help("uniform segments from left to right (below), at least one"),
    Field::of("attachments", Form::Part)
        .what("a list of attachments")
        .help("masses, springs, supports, sprung masses (below)")
        .or("none"),
    Field::of("excitations", Form::Part)
        .what("a list of excitations")
        .help("frequencies the beam will be driven at (below)")
        .or("none"),
    MARGIN,
    TOLERANCES,
    MEASURED,
    CALIBRATE,
    RESIZE,
];

/// Elastic modes to compute.
pub const MODES: Field =
    Field { range: Range::Whole(1, MAX_MODES), kind: Kind::Ratio, ..Field::of("modes", Form::Count) }
        .label("Modes")
        .what("the number of modes")
        .help("elastic modes to compute; rigid-body modes, if any, are listed in addition")
        .or("6");

/// Finite elements in all.
pub const ELEMENTS: Field =
    Field { range: Range::Whole(1, crate::fe::MAX_ELEMENTS), ..Field::of("elements", Form::Count) }
        .label("Finite elements")
        .what("the number of finite elements")
        .help("finite elements in all, for the check of the exact result")
        .or("sized so the last mode is within about 1e-4");

/// The point for mode 1's equivalent mass and stiffness.
pub const REPORT_POINT: Field = Field::quantity("report_point", Kind::Length, Range::OnTheBeam)
    .label("Report point")
    .what("the report point")
    .help("where to give mode 1's equivalent mass and stiffness (a length from the left end)")
    .or("the point of largest deflection");

/// The separation wanted between natural and excitation frequencies.
pub const MARGIN: Field = Field { range: Range::Fraction, ..Field::of("margin", Form::Percent) }
    .label("Margin")
    .what("the margin")
    .help("separation wanted between natural and excitation frequencies: `0.2` or `\"20 %\"`")
    .or("0.2 (common practice keeps 10–20 %; follow your code)");

/// The unit systems, with the editor's words for them.
pub static UNIT_SYSTEMS: [(UnitSystem, &str); 4] = [
    (UnitSystem::Si, "SI — m, kg, N"),
    (UnitSystem::SiMm, "SI — mm, kg, N"),
    (UnitSystem::UsInch, "US — in, lb, lbf"),
    (UnitSystem::UsFoot, "US — ft, lb, lbf"),
];

/// The beam theories, with the editor's words for them.
pub static THEORIES: [(&str, &str); 2] =
    [("euler-bernoulli", "Euler–Bernoulli (slender)"), ("timoshenko", "Timoshenko (deep beams)")];

/// An end spring: from 0 (absent) to rigid.
const fn end_spring(name: &'static str, kind: Kind, label: &'static str, what: &'static str) -> Field {
    Field::quantity(name, kind, Range::UpTo(STIFFNESS)).label(label).what(what).help(what).or("0").or_rigid()
}

/// An elastic end's translational spring.
pub const END_TRANSLATIONAL: Field =
    end_spring("translational", Kind::Stiffness, "Translational spring", "a translational end spring");
/// An elastic end's rotational spring.
pub const END_ROTATIONAL: Field =
    end_spring("rotational", Kind::RotationalStiffness, "Rotational spring", "a rotational end spring");

/// The end supports.
pub static ENDS: [Choice; 5] = [
    Choice { id: "clamped", name: "Clamped", fields: &[], help: doc("deflection and rotation held") },
    Choice { id: "pinned", name: "Pinned", fields: &[], help: doc("deflection held, free to rotate") },
    Choice { id: "free", name: "Free", fields: &[], help: doc("no restraint") },
    Choice {
        id: "guided",
        name: "Guided (slides, no turn)",
        fields: &[],
        help: doc("rotation held, free to slide"),
    },
    Choice {
        id: "elastic",
        name: "On springs",
        fields: &[END_TRANSLATIONAL, END_ROTATIONAL],
        help: doc("grounded springs, each from 0 (absent) to `\"rigid\"`"),
    },
];

/// A segment's length.
pub const LENGTH: Field = length("length", "Length", "a length").help("the segment's length");

/// The fields of a segment besides those of its properties, section, material and extra mass.
pub static SEGMENT: [Field; 4] = [
    LENGTH,
    Field::of("section", Form::Part).what("a section").help("the cross-section (with `material`)").or("none"),
    Field::of("material", Form::Part)
        .what("a material")
        .help("a preset id or custom properties (with `section`)")
        .or("none"),
    Field::of("extra_mass", Form::Part)
        .what("an extra mass")
        .help("contents, lining and surrounding water (with `section`)")
        .or("none"),
];

/// Bending stiffness EI.
pub const FLEXURAL_RIGIDITY: Field =
    Field::quantity("flexural_rigidity", Kind::FlexuralRigidity, Range::Between(1e-30, 1e20))
        .label("Bending stiffness EI")
        .what("a bending stiffness EI")
        .help("EI, e.g. `\"1.2e4 N*m^2\"`");
/// Mass per length, structural and not.
pub const MASS_PER_LENGTH: Field =
    Field::quantity("mass_per_length", Kind::MassPerLength, Range::Between(1e-20, 1e9))
        .label("Mass per length")
        .what("a mass per length")
        .help("everything that moves with the beam, e.g. `\"3.1 kg/m\"`");
/// Shear rigidity κGA.
pub const SHEAR_RIGIDITY: Field =
    Field::quantity("shear_rigidity", Kind::ShearRigidity, Range::Between(1e-20, 1e20))
        .label("Shear rigidity κGA (deep beams)")
        .what("a shear rigidity κGA")
        .help("κGA, needed for the Timoshenko theory")
        .or("rigid in shear");
/// Rotary inertia per length ρI.
pub const ROTARY_INERTIA_PER_LENGTH: Field =
    Field::quantity("rotary_inertia_per_length", Kind::RotaryInertiaPerLength, Range::UpTo(f64::INFINITY))
        .label("Rotary inertia per length (deep beams)")
        .what("a rotary inertia per length")
        .help("ρI, for the Timoshenko theory")
        .or("0");

/// The fields of a segment given by its properties.
pub static PROPERTY_FIELDS: [Field; 4] =
    [FLEXURAL_RIGIDITY, MASS_PER_LENGTH, SHEAR_RIGIDITY, ROTARY_INERTIA_PER_LENGTH];

const WIDTH: Field = length("width", "Width (across)", "a width");
const DEPTH: Field = length("depth", "Depth (in the plane of vibration)", "a depth");
const WALL: Field = length("wall", "Wall", "a wall thickness");

/// The section shapes, with their dimensions.
pub static SHAPES: [Choice; 7] = [
    Choice {
        id: "tube",
        name: "Round tube or pipe",
        fields: &[length("outer_diameter", "Outside diameter", "an outer diameter"), WALL],
        help: doc("a round tube or pipe"),
    },
    Choice {
        id: "pipe",
        name: "Steel pipe by size and schedule",
        fields: &PIPE_FIELDS,
        help: doc("a welded or seamless steel pipe by nominal size and schedule (ASME B36.10M dimensions, \
             ½ in to 24 in); the scenario records the outside diameter and wall the table gave"),
    },
    Choice {
        id: "round",
        name: "Round bar",
        fields: &[length("diameter", "Diameter", "a diameter")],
        help: doc("a solid round bar"),
    },
    Choice {
        id: "rectangle",
        name: "Flat or square bar",
        fields: &[WIDTH, DEPTH],
        help: doc("a solid rectangle"),
    },
    Choice {
        id: "rectangular-tube",
        name: "Box section",
        fields: &[WIDTH, DEPTH, WALL],
        help: doc("a rectangular tube of one wall thickness"),
    },
    Choice {
        id: "i-beam",
        name: "I-section",
        fields: &[
            length("depth", "Overall depth", "an overall depth"),
            length("flange_width", "Flange width", "a flange width"),
            length("flange_thickness", "Flange thickness", "a flange thickness"),
            length("web_thickness", "Web thickness", "a web thickness"),
            Field::of("axis", Form::Name)
                .label("Bending axis")
                .what("the bending axis")
                .help("`\"strong\"` or `\"weak\"`")
                .or("`\"strong\"`"),
        ],
        help: doc("an I-section bending about its strong or weak axis"),
    },
    Choice {
        id: "custom",
        name: "Other (area and second moment)",
        fields: &[
            Field::quantity("area", Kind::Area, AREA).label("Area").what("an area").help("the area"),
            Field::quantity("second_moment", Kind::SecondMoment, SECOND_MOMENT)
                .label("Second moment of area")
                .what("a second moment of area")
                .help("the second moment of area about the bending axis"),
            DEPTH.or("that of a solid rectangle of this area and second moment"),
            Field::quantity("shear_coefficient", Kind::Ratio, Range::AboveZero(1.0))
                .label("Shear coefficient κ")
                .what("the shear coefficient κ")
                .help("Timoshenko's shear coefficient")
                .or("a rectangle's"),
        ],
        help: doc("any other section, by its properties"),
    },
];

/// The fields of a custom material.
pub static MATERIAL_FIELDS: [Field; 4] = [
    Field::quantity("youngs_modulus", Kind::Pressure, MODULUS)
        .label("Young's modulus E")
        .what("Young's modulus")
        .help("Young's modulus E"),
    Field::quantity("density", Kind::Density, DENSITY).label("Density").what("a density").help("the density"),
    Field::quantity("poisson", Kind::Ratio, Range::Below(0.0, 0.5))
        .label("Poisson's ratio")
        .what("Poisson's ratio")
        .help("Poisson's ratio ν")
        .or("0.3"),
    Field::quantity("shear_modulus", Kind::Pressure, MODULUS)
        .label("Shear modulus G")
        .what("the shear modulus")
        .help("the shear modulus G; give it for wood and composites")
        .or("E/(2(1+ν))"),
];

/// The fields of the extra mass carried by a segment given by section.
pub static EXTRA_MASS_FIELDS: [Field; 4] = [
    Field::of("contents", Form::Name)
        .label("Contents")
        .what("the contents")
        .help(
            "what fills the bore, by name: `\"water\"`, `\"seawater\"`, `\"light-oil\"`, `\"glycol-mix\"`, \
             `\"air\"`; its density is recorded in `contents_density`, which wins when both are given",
        )
        .or("none (or `contents_density`)"),
    Field::quantity("contents_density", Kind::Density, Range::UpTo(f64::INFINITY))
        .label("Contents density (what fills the bore, e.g. water in the pipe)")
        .what("the contents density")
        .help("the density of what fills the bore")
        .or("0"),
    Field::quantity("lining", Kind::MassPerLength, Range::UpTo(f64::INFINITY))
        .label("Lining, insulation, cables (per length)")
        .what("the lining mass")
        .help("a lining mass per length (insulation, cables)")
        .or("0"),
    Field::of("submerged", Form::Part)
        .what("a submerged object")
        .help("the water around a round section (below)")
        .or("not submerged"),
];

/// The fields of the water around a submerged segment.
pub static SUBMERGED_FIELDS: [Field; 2] = [
    Field::quantity("water_density", Kind::Density, DENSITY)
        .label("Water density (seawater if empty)")
        .what("the water density")
        .help("the density of the water")
        .or("1025 kg/m³ (seawater)"),
    Field::quantity("added_mass_coefficient", Kind::Ratio, Range::UpTo(f64::INFINITY))
        .label("Added-mass coefficient (1 if empty)")
        .what("the added-mass coefficient")
        .help("the added-mass coefficient C_a")
        .or("1"),
];

/// Where an attachment is.
pub const POSITION: Field = Field::quantity("position", Kind::Length, Range::OnTheBeam)
    .label("Position")
    .what("a position from the left end")
    .help("distance from the left end");
/// A name to show.
pub const LABEL: Field =
    Field::of("label", Form::Text).label("Label").what("a label").help("a name to show").or("none");

/// The fields every attachment has besides its `type`.
pub static ATTACHMENT_FIELDS: [Field; 2] = [POSITION, LABEL];

/// A point mass's mass.
pub const MASS: Field =
    Field::quantity("mass", Kind::Mass, Range::UpTo(MASS_MAX)).label("Mass").what("a mass").help("the mass");
/// A point mass's rotary inertia.
pub const ROTARY_INERTIA: Field =
    Field::quantity("rotary_inertia", Kind::RotaryInertia, Range::UpTo(MASS_MAX))
        .label("Rotary inertia")
        .what("a rotary inertia")
        .help("about the bending axis, e.g. `\"0.011 kg*m^2\"`")
        .or("0");
/// A sprung mass's mass.
pub const SPRUNG_MASS: Field =
    Field { range: Range::Between(1e-20, MASS_MAX), what: "a sprung mass", ..MASS };
/// The stiffness of the spring that carries a sprung mass.
pub const SPRUNG_STIFFNESS: Field =
    Field::quantity("stiffness", Kind::Stiffness, Range::Between(1e-20, STIFFNESS))
        .label("Spring stiffness")
        .what("a spring stiffness")
        .help("the stiffness of the spring that carries it");
/// A grounded spring's stiffness.
pub const SPRING_STIFFNESS: Field =
    Field::quantity("stiffness", Kind::Stiffness, Range::AboveZero(STIFFNESS))
        .label("Stiffness")
        .what("a spring stiffness")
        .help("grounded, translational; `\"rigid\"` is a support")
        .or_rigid();
/// A grounded rotational spring's stiffness.
pub const ROTATIONAL_STIFFNESS: Field =
    Field::quantity("stiffness", Kind::RotationalStiffness, Range::AboveZero(STIFFNESS))
        .label("Stiffness")
        .what("a rotational spring stiffness")
        .help("grounded, e.g. `\"850 N*m/rad\"`")
        .or_rigid();

/// The attachment types, with their own fields (after the position).
pub static ATTACHMENTS: [Choice; 5] = [
    Choice {
        id: "mass",
        name: "Mass",
        fields: &[MASS, ROTARY_INERTIA],
        help: doc("a rigid body fixed to the beam"),
    },
    Choice {
        id: "sprung-mass",
        name: "Mass on a spring",
        fields: &[SPRUNG_MASS, SPRUNG_STIFFNESS],
        help: doc("equipment on isolators, a tuned absorber; it adds a mode of its own"),
    },
    Choice {
        id: "spring",
        name: "Spring to ground",
        fields: &[SPRING_STIFFNESS],
        help: doc("a grounded translational spring"),
    },
    Choice {
        id: "rotational-spring",
        name: "Rotational spring to ground",
        fields: &[ROTATIONAL_STIFFNESS],
        help: doc("a grounded rotational spring"),
    },
    Choice {
        id: "support",
        name: "Intermediate support",
        fields: &[],
        help: doc("a rigid intermediate support that lets the beam rotate"),
    },
];

/// How many multiples of an excitation to check.
pub const HARMONICS: Field =
    Field { range: Range::Whole(1, MAX_HARMONICS), ..Field::of("harmonics", Form::Count) }
        .label("Harmonics")
        .what("the number of harmonics")
        .help("how many multiples to check (1 = the frequency itself)")
        .or("1");

/// An excitation's frequency.
pub const FREQUENCY: Field = Field::quantity("frequency", Kind::Frequency, Range::AboveZero(f64::INFINITY))
    .label("Frequency")
    .what("an excitation frequency")
    .help("the frequency, e.g. `\"1780 rpm\"` or `\"60 Hz\"`");

/// The fields of an excitation.
pub static EXCITATION_FIELDS: [Field; 5] = [
    Field::of("label", Form::Text)
        .label("Label")
        .what("a label")
        .help("what it is (\"fan running speed\")")
        .or("none"),
    FREQUENCY,
    UP_TO,
    ORDERS,
    HARMONICS,
];

// Axial force and the pipe table. Kept together at the end of the table so that additions by
// other work stay apart from them.

/// Largest axial force accepted, N: far beyond any beam's strength, so that a larger one is a
/// unit slip, and small enough that every intermediate stays in range.
pub const AXIAL_FORCE_LIMIT: f64 = 1e12;

/// The axial force along a segment, tension positive.
pub const AXIAL_FORCE: Field =
    Field::quantity("axial_force", Kind::Force, Range::Magnitude(AXIAL_FORCE_LIMIT))
        .label("Axial force (tension +, compression −)")
        .what("an axial force")
        .help(
            "the force along the segment, tension positive and compression negative, e.g. `\"-12 kN\"`; \
         it changes the frequencies and may buckle the beam",
        )
        .or("0");

/// A temperature change of a segment held at both ends.
pub const TEMPERATURE_CHANGE: Field =
    Field::quantity("temperature_change", Kind::TemperatureChange, Range::Magnitude(1000.0))
        .label("Temperature rise, ends held (°C or °F change)")
        .what("a temperature change")
        .help(
            "a rise (positive) or fall since the ends were fixed, with both ends held axially, e.g. \
             `\"80 °C\"` or `\"144 °F\"` (a change, not a reading); adds −E·A·α·ΔT to the axial force; \
             needs a section and a material that gives α (a preset, or `thermal_expansion`)",
        )
        .or("0");

/// The fields of a segment that load it axially, whichever way it is described.
pub static AXIAL_FIELDS: [Field; 2] = [AXIAL_FORCE, TEMPERATURE_CHANGE];

/// The fields of a pipe given by nominal size and schedule.
pub static PIPE_FIELDS: [Field; 4] = [
    Field::of("nominal_size", Form::Name)
        .label("Nominal size (in)")
        .what("a nominal pipe size")
        .help("the nominal size in inches as written on the pipe: `\"1/2\"` to `\"24\"`, `\"1-1/2\"`"),
    Field::of("schedule", Form::Name)
        .label("Schedule")
        .what("a pipe schedule")
        .help("`\"10\"`, `\"40\"`, `\"80\"`, `\"160\"`, `\"STD\"`, `\"XS\"` or `\"XXS\"`, where defined for the size"),
    length("outer_diameter", "Outside diameter (from the table)", "an outer diameter")
        .help("the outside diameter the table gave, recorded so a saved case keeps it")
        .or("the table's"),
    length("wall", "Wall (from the table)", "a wall thickness")
        .help("the wall the table gave, recorded so a saved case keeps it")
        .or("the table's"),
];

// Design work on a solved model: speed ranges and orders of excitations, tolerances on inputs,
// measured frequencies, calibration to them and resizing to the margin.

/// Most orders listed for one excitation.
pub const MAX_ORDERS: usize = 20;
/// The largest order of an excitation (a blade or vane count, a gear's teeth).
pub const MAX_ORDER: f64 = 1000.0;
/// Most unknowns one calibration fits.
pub const MAX_UNKNOWNS: usize = 2;
/// Points of a resizing sweep when the scenario does not say.
pub const DEFAULT_POINTS: usize = 200;

/// The top of an excitation's speed range.
pub const UP_TO: Field = Field::quantity("up_to", Kind::Frequency, Range::AboveZero(f64::INFINITY))
    .label("Up to (variable speed)")
    .what("the top of the speed range")
    .help("for a variable speed: the range runs from `frequency` up to this, e.g. `\"1800 rpm\"`")
    .or("a single speed");

/// The multiples of an excitation's frequency that drive the beam.
pub const ORDERS: Field = Field { range: Range::AboveZero(MAX_ORDER), ..Field::of("orders", Form::Text) }
    .label("Orders (multiples)")
    .what("the orders")
    .help(
        "the multiples that drive the beam, as a list `[1, 2, 6]` or a text `\"1, 2, 6\"`: 1× and 2× running \
         speed, a blade or vane count ×; line frequency and twice line frequency are orders 1 and 2 of it",
    )
    .or("1 to `harmonics`");

/// A path naming one numeric input of the scenario.
pub const INPUT_FIELD: Field = Field::of("field", Form::Text)
    .label("Input")
    .what("the input's place in the scenario")
    .help("the input, as a path: `\"segments[0].section.wall\"`, `\"left.rotational\"`, `\"attachments[1].mass\"`");

/// The low end of an input's range.
pub const FROM: Field = Field::of("from", Form::Quantity)
    .label("From")
    .what("the low end of the range")
    .help("in the input's own kind of quantity (`\"4 mm\"`); for an end, `\"pinned\"` or `\"free\"`");

/// The high end of an input's range.
pub const TO: Field = Field::of("to", Form::Quantity)
    .label("To")
    .what("the high end of the range")
    .help("in the input's own kind of quantity, or `\"rigid\"` for a stiffness; for an end, `\"clamped\"` or `\"guided\"`");

/// Input tolerances.
pub const TOLERANCES: Field = Field::of("tolerances", Form::Part)
    .what("a list of tolerances")
    .help("how far inputs may stray from their values (below); each mode then gets a band")
    .or("none");

/// Measured frequencies.
pub const MEASURED: Field = Field::of("measured", Form::Part)
    .what("a list of measured frequencies")
    .help("frequencies measured on the part, by mode (below)")
    .or("none");

/// What to calibrate.
pub const CALIBRATE: Field = Field::of("calibrate", Form::Part)
    .what("a list of inputs to calibrate")
    .help("one or two uncertain inputs to fit to the measured frequencies (below)")
    .or("none");

/// What to resize.
pub const RESIZE: Field = Field::of("resize", Form::Part)
    .what("a resizing request")
    .help("a design input and its range, to find where every margin holds (below)")
    .or("none");

/// The fields of a tolerance.
pub static TOLERANCE_FIELDS: [Field; 4] = [
    INPUT_FIELD,
    Field { range: Range::Fraction, ..Field::of("plus_minus", Form::Percent) }
        .label("±")
        .what("a tolerance")
        .help("± this fraction of the value: `0.05` or `\"5 %\"`")
        .or("give `from` and `to` instead"),
    FROM.or("give `plus_minus` instead"),
    TO.or("give `plus_minus` instead"),
];

/// The fields of a measured frequency.
pub static MEASURED_FIELDS: [Field; 2] = [
    Field { range: Range::Whole(1, MAX_MODES + 6), ..Field::of("mode", Form::Count) }
        .label("Mode")
        .what("the mode's number")
        .help("the mode's number as the results list it (rigid-body modes first)"),
    Field::quantity("frequency", Kind::Frequency, Range::AboveZero(f64::INFINITY))
        .label("Measured")
        .what("a measured frequency")
        .help("the frequency measured, e.g. `\"14.2 Hz\"`"),
];

/// The fields of an input to calibrate.
pub static CALIBRATE_FIELDS: [Field; 3] = [INPUT_FIELD, FROM, TO];

/// The fields of a resizing request.
pub static RESIZE_FIELDS: [Field; 4] = [
    INPUT_FIELD,
    FROM,
    TO,
    Field { range: Range::Whole(20, 1000), ..Field::of("points", Form::Count) }
        .label("Points")
        .what("the number of points")
        .help("values of the input solved across the range")
        .or("200"),
];

/// What a material chosen as a preset records beside its properties, so that a saved case keeps
/// the values the preset gave (a material object holds these with the fields of a custom one).
pub static MATERIAL_RECORD_FIELDS: [Field; 2] = [
    Field::of("preset", Form::Name)
        .label("Recorded from")
        .what("the preset recorded")
        .help("the preset the properties were recorded from, as `\"steel\"`: its name is shown")
        .or("none (a custom material)"),
    Field::quantity("thermal_expansion", Kind::ThermalExpansion, Range::UpTo(1e-3))
        .label("Thermal expansion α")
        .what("a coefficient of thermal expansion")
        .help("α along the member, e.g. `\"12e-6 /K\"` or `\"6.5e-6 /°F\"`; needed for a temperature change")
        .or("none (no temperature change)"),
];
