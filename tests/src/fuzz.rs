//! The standing fuzz run: a seeded, structure-aware generator of scenarios (random ends,
//! segments by properties or by section and material, every attachment kind at ordinary, close,
//! coincident and joint-hugging stations, unit strings of every system, extreme values, and
//! perturbed copies of the documented example files), and the checks every answer must pass.
//!
//! The test command runs a short slice of it (`tests/tests/fuzz.rs`), the benchmark command a
//! long one (`tests/benches/fuzz.rs`); both print their counts.

use crate::random::Rng;
use serde_json::{json, Map, Value};
use std::time::{Duration, Instant};

/// One generated case: the scenario and what kind of input it is.
#[derive(Clone, Debug)]
pub struct Case {
    /// The scenario, as a JSON value.
    pub scenario: Value,
    /// Whether every value was drawn from an engineering range (not an extreme one) and no two
    /// stations are closer than a thousandth of the beam: on such a case, of either theory and
    /// with any number of attachments the generator makes, every mode of the finite-element
    /// check must agree with the exact result within its own error estimate.
    pub ordinary: bool,
}

/// Counts of one run.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct Counts {
    /// Cases run.
    pub cases: usize,
    /// Cases that gave a report.
    pub solved: usize,
    /// Cases refused with a message.
    pub refused: usize,
    /// Ordinary cases whose every mode was compared with the finite-element check.
    pub compared: usize,
    /// Modes compared exact against FE.
    pub modes_compared: usize,
    /// Slowest case, µs.
    pub slowest_us: u128,
}

impl Counts {
    /// Adds another run's counts.
    pub fn add(&mut self, other: &Counts) {
        self.cases += other.cases;
        self.solved += other.solved;
        self.refused += other.refused;
        self.compared += other.compared;
        self.modes_compared += other.modes_compared;
        self.slowest_us = self.slowest_us.max(other.slowest_us);
    }
}

/// Common practice, no source: a message read beside a field fits in a few lines.
const LONGEST_MESSAGE: usize = 300;

/// Runs cases `first..first + count` of the seeded sequence, checking each; the first failure
/// is returned with the case's scenario so that it can be replayed.
pub fn run(seed: u64, first: u64, count: u64, time_limit: Duration) -> Result<Counts, String> {
    let examples = examples();
    let mut counts = Counts::default();
    for i in first..first + count {
        let mut rng = Rng::new(seed ^ i.wrapping_mul(0x9E37_79B9_7F4A_7C15));
        let case = generate(&mut rng, &examples);
        let text = case.scenario.to_string();
        let started = Instant::now();
        let outcome = std::panic::catch_unwind(|| modebench::solve_value(&case.scenario));
        let mut took = started.elapsed();
        if took > time_limit {
            // On a machine shared with other builds the scheduler can hold a case up for longer
            // than it computes: a case over the limit is timed once more, and the faster of the
            // two is its time. One that is slow in itself is slow both times.
            let again = Instant::now();
            let _ = std::panic::catch_unwind(|| modebench::solve_value(&case.scenario));
            took = took.min(again.elapsed());
        }
        counts.cases += 1;
        counts.slowest_us = counts.slowest_us.max(took.as_micros());
        let fail = |why: String| format!("case {i} (seed {seed:#x}): {why}\n  scenario: {text}");
        if took > time_limit {
            return Err(fail(format!("took {took:?}, over the limit of {time_limit:?}")));
        }
        match outcome {
            Err(_) => return Err(fail("panicked".into())),
            Ok(Err(e)) => {
                counts.refused += 1;
                let shown = e.to_string();
                if shown.is_empty() || shown.chars().count() >= LONGEST_MESSAGE {
                    return Err(fail(format!("a message of {} characters: {shown:.400}", shown.len())));
                }
            }
            Ok(Ok(report)) => {
                counts.solved += 1;
                check_report(&report, &case, &mut counts).map_err(fail)?;
            }
        }
    }
    Ok(counts)
}

/// The checks on a solved report: finite, ordered, bounds that hold, and on ordinary cases the
/// finite-element check within its own error estimate of the exact result.
fn check_report(report: &modebench::Report, case: &Case, counts: &mut Counts) -> Result<(), String> {
    if !report.is_finite() {
        return Err("a non-finite number in the report".into());
    }
    let f: Vec<f64> = report.modes.iter().map(|m| m.frequency_hz).collect();
    // Repeated frequencies may differ in their last digit.
    if f.windows(2).any(|w| w[0] > w[1] * (1.0 + 1e-12)) || f.iter().any(|&v| v < 0.0) {
        return Err(format!("frequencies out of order or negative: {f:?}"));
    }
    let fe: Vec<f64> = report.modes.iter().filter_map(|m| m.fe_frequency_hz).collect();
    if fe.windows(2).any(|w| w[0] > w[1] * (1.0 + 1e-12)) {
        return Err(format!("finite-element frequencies out of order: {fe:?}"));
    }
    if let Some(fundamental) = report.fundamental {
        let exact = fundamental.exact_hz;
        // Rayleigh's quotient is an upper bound and Dunkerley's sum a lower one (Rayleigh's
        // principle; Dunkerley's inequality, e.g. Thomson & Dahleh, *Theory of Vibration with
        // Applications*, from memory); the report shows them only where they are guaranteed.
        if let Some(r) = fundamental.rayleigh_hz {
            if r < exact * (1.0 - 1e-9) {
                return Err(format!("Rayleigh's bound {r} is below the exact {exact}"));
            }
        }
        if let Some(d) = fundamental.dunkerley_hz {
            if d > exact * (1.0 + 1e-9) {
                return Err(format!("Dunkerley's bound {d} is above the exact {exact}"));
            }
        }
    }
    if case.ordinary && moderate_contrast(report) {
        let mut compared = 0;
        for m in report.modes.iter().filter(|m| !m.rigid_body) {
            let (Some(d), Some(e), Some(a)) = (m.fe_difference, m.fe_error, m.accuracy) else { continue };
            compared += 1;
            // On a model of engineering proportions the two methods must agree within the FE
            // check's own error estimate and the exact value's, with a factor of 10 because both
            // are estimates of order (the margin the report itself allows before it warns);
            // a warning does not excuse a disagreement on such a model.
            if d.abs() > 10.0 * (e + a) + 1e-9 {
                return Err(format!(
                    "mode {}: FE differs by {d:e}; its estimate is {e:e} and the exact value's {a:e}",
                    m.number
                ));
            }
        }
        if compared > 0 {
            counts.compared += 1;
            counts.modes_compared += compared;
        }
    }
    Ok(())
}

/// Whether neighbouring segments differ in EI by at most 10⁸ and in mass per length by at most
/// 10⁴: past that the model is a chain of near-rigid and near-hinged pieces, whose low modes
/// double precision resolves poorly in either method (the report then says which column it
/// doubts).
pub fn moderate_contrast(report: &modebench::Report) -> bool {
    report.beam.segments.windows(2).all(|w| {
        let ratio = |a: f64, b: f64| a.max(b) / a.min(b);
        ratio(w[0].flexural_rigidity, w[1].flexural_rigidity) <= 1e8
            && ratio(w[0].mass_per_length, w[1].mass_per_length) <= 1e4
    })
}

/// The documented example scenarios, perturbed by the generator.
pub fn examples() -> Vec<Value> {
    let dir = concat!(env!("CARGO_MANIFEST_DIR"), "/../docs/scenarios");
    let mut paths: Vec<_> = std::fs::read_dir(dir)
        .expect("docs/scenarios exists")
        .map(|e| e.expect("a directory entry").path())
        .filter(|p| p.extension().is_some_and(|x| x == "json"))
        .collect();
    paths.sort();
    paths
        .iter()
        .map(|p| serde_json::from_str(&std::fs::read_to_string(p).expect("readable")).expect("valid JSON"))
        .collect()
}

/// One case of the sequence.
pub fn generate(rng: &mut Rng, examples: &[Value]) -> Case {
    if !examples.is_empty() && rng.below(5) == 0 {
        let mut scenario = examples[rng.below(examples.len())].clone();
        perturb(&mut scenario, rng);
        return Case { scenario, ordinary: false };
    }
    let extreme = rng.below(6) == 0;
    let mut g = Generator { rng, extreme, close: false };
    let scenario = g.scenario();
    let ordinary = !g.extreme && !g.close;
    Case { scenario, ordinary }
}

/// Scales a random number of numeric leaves of an example by up to a factor of 1000 either way,
/// and sometimes swaps its unit system.
fn perturb(v: &mut Value, rng: &mut Rng) {
    fn leaves(v: &Value) -> usize {
        match v {
            Value::Object(map) => map.values().map(leaves).sum(),
            Value::Array(items) => items.iter().map(leaves).sum(),
            _ => 1,
        }
    }
    let found = leaves(v);
    for _ in 0..1 + rng.below(4) {
        let pick = rng.below(found);
        scale_nth(v, pick, &mut 0, rng);
    }
    if rng.below(4) == 0 {
        if let Value::Object(map) = v {
            map.insert("units".into(), json!(*rng.pick(&["si", "si-mm", "us-inch", "us-foot"])));
        }
    }
}

/// Scales the `target`-th leaf (in traversal order) of `v`.
fn scale_nth(v: &mut Value, target: usize, index: &mut usize, rng: &mut Rng) -> bool {
    match v {
        Value::Object(map) => map.values_mut().any(|i| scale_nth(i, target, index, rng)),
        Value::Array(items) => items.iter_mut().any(|i| scale_nth(i, target, index, rng)),
        leaf => {
            if *index != target {
                *index += 1;
                return false;
            }
            let factor = rng.log_range(1e-3, 1e3);
            let scaled = match &*leaf {
                Value::Number(n) => Some(json!(n.as_f64().unwrap_or(1.0) * factor)),
                Value::String(t) => t.split_once(' ').and_then(|(number, unit)| {
                    Some(json!(format!("{} {unit}", number.parse::<f64>().ok()? * factor)))
                }),
                _ => None,
            };
            if let Some(v) = scaled {
                *leaf = v;
            }
            true
        }
    }
}

/// Draws the parts of one scenario.
struct Generator<'a> {
    rng: &'a mut Rng,
    /// Values from extreme ranges.
    extreme: bool,
    /// Set when two stations were placed closer than a thousandth of the beam.
    close: bool,
}

impl Generator<'_> {
    /// A value log-uniform in [lo, hi], widened by six decades either way on an extreme case.
    fn value(&mut self, lo: f64, hi: f64) -> f64 {
        match self.extreme && self.rng.below(3) == 0 {
            true => self.rng.log_range(lo * 1e-6, hi * 1e6),
            false => self.rng.log_range(lo, hi),
        }
    }

    /// A quantity in SI written as a bare number or with one of the units given as (name, size
    /// of one unit in SI).
    fn quantity(&mut self, si: f64, units: &[(&str, f64)]) -> Value {
        if self.rng.below(4) == 0 || units.is_empty() {
            return json!(si);
        }
        let (name, one) = *self.rng.pick(units);
        json!(format!("{} {name}", si / one))
    }

    fn length(&mut self, si: f64) -> Value {
        self.quantity(si, &[("m", 1.0), ("mm", 1e-3), ("cm", 1e-2), ("in", 0.0254), ("ft", 0.3048)])
    }

    fn stiffness(&mut self, si: f64) -> Value {
        if self.rng.below(12) == 0 {
            return json!("rigid");
        }
        self.quantity(si, &[("N/m", 1.0), ("kN/m", 1e3), ("lbf/in", 175.126_835_246_476_8)])
    }

    fn rotational(&mut self, si: f64) -> Value {
        if self.rng.below(12) == 0 {
            return json!("rigid");
        }
        self.quantity(si, &[("N*m/rad", 1.0), ("kN*m/rad", 1e3)])
    }

    fn mass(&mut self, si: f64) -> Value {
        self.quantity(si, &[("kg", 1.0), ("g", 1e-3), ("lb", 0.453_592_37), ("t", 1e3)])
    }

    fn end(&mut self, length: f64, ei: f64) -> Value {
        match self.rng.below(6) {
            0 => json!("free"),
            1 => json!("pinned"),
            2 => json!("clamped"),
            3 => json!("guided"),
            _ => {
                let k = ei / length.powi(3);
                let (t, r) = (self.value(1e-2, 1e4), self.value(1e-2, 1e4));
                let translational = self.stiffness(k * t);
                let rotational = self.rotational(k * length * length * r);
                json!({ "type": "elastic", "translational": translational, "rotational": rotational })
            }
        }
    }

    fn section(&mut self, length: f64) -> Value {
        let d = length * self.value(0.005, 0.2);
        let shape = self.rng.below(6);
        // Ratios of the section's other dimensions to its depth, each within a range that makes
        // an ordinary section of its shape.
        let r: Vec<f64> = (0..3).map(|_| self.rng.unit()).collect();
        let within = |i: usize, lo: f64, hi: f64| d * (lo + (hi - lo) * r[i]);
        let depth = self.length(d);
        match shape {
            0 => {
                json!({ "shape": "tube", "outer_diameter": depth, "wall": self.length(within(0, 0.02, 0.45)) })
            }
            1 => json!({ "shape": "round", "diameter": depth }),
            2 => json!({ "shape": "rectangle", "width": self.length(within(0, 0.2, 3.0)), "depth": depth }),
            3 => {
                let (width, wall) = (self.length(within(0, 0.3, 2.0)), self.length(within(1, 0.02, 0.3)));
                json!({ "shape": "rectangular-tube", "width": width, "depth": depth, "wall": wall })
            }
            4 => {
                let flange_width = self.length(within(0, 0.3, 1.0));
                let (flange, web) = (self.length(within(1, 0.03, 0.1)), self.length(within(2, 0.02, 0.06)));
                json!({ "shape": "i-beam", "depth": depth, "flange_width": flange_width,
                        "flange_thickness": flange, "web_thickness": web })
            }
            _ => json!({ "shape": "custom", "area": d * d * 0.3, "second_moment": d.powi(4) * 0.02 }),
        }
    }

    fn material(&mut self) -> Value {
        let presets = [
            "steel",
            "stainless-304",
            "aluminium-6061-t6",
            "titanium-ti6al4v",
            "brass-c36000",
            "gfrp-pultruded",
            "douglas-fir",
        ];
        match self.rng.below(4) {
            0 => {
                let (e, rho) = (self.value(5.0, 400.0), self.value(400.0, 20_000.0));
                json!({ "youngs_modulus": format!("{e} GPa"), "density": format!("{rho} kg/m^3") })
            }
            _ => json!(*self.rng.pick(&presets)),
        }
    }

    fn segment(&mut self, length: f64) -> (Value, f64) {
        let mut s = Map::new();
        s.insert("length".into(), self.length(length));
        if self.rng.below(2) == 0 {
            let ei = self.value(1.0, 1e7);
            s.insert("flexural_rigidity".into(), self.quantity(ei, &[("N*m^2", 1.0), ("N·m²", 1.0)]));
            let m = self.value(0.1, 500.0);
            s.insert("mass_per_length".into(), self.quantity(m, &[("kg/m", 1.0), ("lb/ft", 1.488_163_94)]));
            (Value::Object(s), ei)
        } else {
            let section = self.section(length);
            s.insert("section".into(), section);
            s.insert("material".into(), self.material());
            if self.rng.below(4) == 0 {
                let lining = self.value(0.1, 50.0);
                let lining = self.quantity(lining, &[("kg/m", 1.0)]);
                s.insert("extra_mass".into(), json!({ "lining": lining }));
            }
            (Value::Object(s), 1e4)
        }
    }

    /// A station for an attachment: anywhere, beside an earlier station, on a segment joint or
    /// just past one, or at an end.
    fn position(&mut self, total: f64, joints: &[f64], taken: &[f64]) -> f64 {
        let x = match self.rng.below(10) {
            0 | 1 if !taken.is_empty() => {
                let at = *self.rng.pick(taken);
                let gap = [0.0, 1e-12, 1e-9, 1e-6, 1e-4, 1e-2][self.rng.below(6)] * total;
                at + if self.rng.below(2) == 0 { gap } else { -gap }
            }
            2 if !joints.is_empty() => {
                let at = *self.rng.pick(joints);
                at + [0.0, 1e-9, 1e-4, -1e-6][self.rng.below(4)] * total
            }
            3 => [0.0, total][self.rng.below(2)],
            _ => self.rng.range(0.0, 1.0) * total,
        };
        let x = x.clamp(0.0, total);
        if taken.iter().chain(joints).any(|t| (t - x).abs() < 1e-3 * total) {
            self.close = true;
        }
        x
    }

    fn scenario(&mut self) -> Value {
        let most = if self.rng.below(10) == 0 { 12 } else { 4 };
        let count = 1 + self.rng.below(most);
        let mut segments = Vec::new();
        let mut joints = Vec::new();
        let mut total = 0.0;
        let mut ei = 1.0;
        for i in 0..count {
            let length = self.value(0.05, 20.0) / count as f64;
            let (segment, e) = self.segment(length);
            segments.push(segment);
            ei = e;
            total += length;
            if i + 1 < count {
                joints.push(total);
            }
        }
        let mut s = Map::new();
        if self.rng.below(3) == 0 {
            s.insert("units".into(), json!(*self.rng.pick(&["si", "si-mm", "us-inch", "us-foot"])));
        }
        if self.rng.below(5) == 0 {
            s.insert("theory".into(), json!("timoshenko"));
        }
        if self.rng.below(3) == 0 {
            s.insert("modes".into(), json!(1 + self.rng.below(20)));
        }
        if self.rng.below(8) == 0 {
            s.insert("elements".into(), json!(1 + self.rng.below(400)));
        }
        s.insert("left".into(), self.end(total, ei));
        s.insert("right".into(), self.end(total, ei));
        s.insert("segments".into(), Value::Array(segments));
        let many = self.rng.below(20) == 0;
        let n = if many { 10 + self.rng.below(60) } else { self.rng.below(6) };
        let mut taken: Vec<f64> = Vec::new();
        let mut attachments = Vec::new();
        let beam_mass = total * 10.0;
        let k = ei / total.powi(3);
        for _ in 0..n {
            let x = self.position(total, &joints, &taken);
            taken.push(x);
            let mut a = Map::new();
            let kind =
                *self.rng.pick(&["mass", "mass", "sprung-mass", "spring", "rotational-spring", "support"]);
            a.insert("type".into(), json!(kind));
            a.insert("position".into(), self.length(x));
            match kind {
                "mass" => {
                    let m = beam_mass * self.value(1e-3, 5.0);
                    a.insert("mass".into(), self.mass(m));
                    if self.rng.below(3) == 0 {
                        let j = m * (total * self.value(1e-3, 0.1)).powi(2);
                        a.insert(
                            "rotary_inertia".into(),
                            self.quantity(j, &[("kg*m^2", 1.0), ("lb*in^2", 2.926_397e-4)]),
                        );
                    }
                }
                "sprung-mass" => {
                    let (m, c) = (self.value(1e-3, 2.0), self.value(1e-2, 1e4));
                    let mass = self.mass(beam_mass * m);
                    a.insert("mass".into(), mass);
                    let stiffness = self.quantity(k * c, &[("N/m", 1.0)]);
                    a.insert("stiffness".into(), stiffness);
                }
                "spring" => {
                    let c = self.value(1e-2, 1e4);
                    let stiffness = self.stiffness(k * c);
                    a.insert("stiffness".into(), stiffness);
                }
                "rotational-spring" => {
                    let c = self.value(1e-2, 1e4);
                    let stiffness = self.rotational(k * total * total * c);
                    a.insert("stiffness".into(), stiffness);
                }
                _ => {}
            }
            attachments.push(Value::Object(a));
        }
        if !attachments.is_empty() {
            s.insert("attachments".into(), Value::Array(attachments));
        }
        if self.rng.below(2) == 0 {
            let excitations: Vec<Value> = (0..1 + self.rng.below(3))
                .map(|_| {
                    let hz = self.value(0.5, 500.0);
                    let frequency = match self.rng.below(3) {
                        0 => json!(hz),
                        1 => json!(format!("{} Hz", hz)),
                        _ => json!(format!("{} rpm", hz * 60.0)),
                    };
                    json!({ "frequency": frequency, "harmonics": 1 + self.rng.below(4) })
                })
                .collect();
            s.insert("excitations".into(), Value::Array(excitations));
        }
        Value::Object(s)
    }
}
