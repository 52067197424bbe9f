//! The standing fuzz run: a seeded, structure-aware generator of scenarios (random ends,
//! segments by properties or by section and material, axial forces and temperature changes,
//! every attachment kind at ordinary, close, coincident and joint-hugging stations, unit strings
//! of every system, extreme values, and perturbed copies of the documented example files), and
//! the checks every answer must pass.
//!
//! The test command runs a short slice of it (`tests/tests/fuzz.rs`), the benchmark command a
//! long one (`tests/benches/fuzz.rs`); both print their counts. The generator is
//! `fuzz/generate.rs`; the run and the checks are here.

mod generate;

pub use generate::{examples, generate};

use crate::random::Rng;
use serde_json::Value;
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

/// The processor time this thread has used, from Linux's `/proc/thread-self/stat` (user and
/// system time, fields 14 and 15, in ticks of 1/100 s, the fixed unit of that file; proc(5)),
/// or `None` where it cannot be read. A case's time is the processor time it took: on a machine
/// that several builds share, the wall clock measures the scheduler as much as the engine (a
/// case of 0.4 s took 1.3 s by the clock under a load of six on two cores).
fn thread_cpu() -> Option<Duration> {
    let stat = std::fs::read_to_string("/proc/thread-self/stat").ok()?;
    // The command name, in parentheses, may hold spaces; the fields after it are plain numbers.
    let fields: Vec<&str> = stat.rsplit_once(')')?.1.split_whitespace().collect();
    let ticks = |i: usize| fields.get(i).and_then(|f| f.parse::<u64>().ok());
    Some(Duration::from_millis(10 * (ticks(11)? + ticks(12)?)))
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
        let timed = || {
            let (started, cpu) = (Instant::now(), thread_cpu());
            let outcome = std::panic::catch_unwind(|| modebench::solve_value(&case.scenario));
            let took = match (cpu, thread_cpu()) {
                (Some(before), Some(after)) => after.saturating_sub(before),
                _ => started.elapsed(),
            };
            (outcome, took)
        };
        let (outcome, mut took) = timed();
        if took > time_limit {
            // Where the thread's own processor time cannot be read, the time is the wall clock's,
            // and on a machine shared with other builds the scheduler can hold a case up for
            // longer than it computes: a case over the limit is timed once more, and the faster
            // of the two is its time. One that is slow in itself is slow both times.
            took = took.min(timed().1);
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
