//! Seeded synthetic ring-downs: 1–5 modes, ζ from 0.1 % to 5 %, SNR 20–60 dB, 44.1 and 48 kHz,
//! 0.5–10 s, 1–5 taps, random phases. What each record was made of is the answer:
//! - every mode whose own peak stands 20 dB over the noise is found: its peak in the tapered,
//!   averaged spectrum as its amplitude, decay and the taper make it, counted from 2 ms after
//!   each tap (the impact itself: a mode that has died away by then cannot be told from it);
//! - no peak is reported that is not one of the modes (no phantom);
//! - each found mode's damped frequency within 0.05 % (the aim is 0.01 %);
//! - each found mode's fitted damping ratio within 5 % when ζ ≥ 0.5 %;
//!
//! where the noise allows it. A weak, heavily damped mode carries too little information for
//! those figures: no estimator reads it better than the Cramér–Rao bound. There the tolerance is
//! six of the bound's standard deviations (the bound below leaves out the straight line under
//! the peak that the fit also estimates, which widens the spread: with 40 dB less noise the
//! same records read within 0.1 %), and the test counts how often that happened. Damping is
//! checked on the modes that must be found (own peak 20 dB over the noise).
//!
//! The bound (derived here, from memory of the standard result for an undamped sinusoid,
//! var(ω̂) = 12σ²/(A²N³) with its phase unknown, twice the variance with the phase known):
//! for A·e^(−σ'n)·cos(ω'n + φ) in white noise of variance s², the Fisher information on ω' is
//! (A²/2s²)·Σn²e^(−2σ'n), the same on σ'; the unknown phase and amplitude are allowed for by
//! halving it, and the taps' information adds.

use modebench::bench::{analyse_samples, BenchOptions, BenchReport};
use modebench_tests::random::Rng;
use modebench_tests::ringdown::{self, Limits, Record};

/// Mode `m`'s own peak over the noise in the averaged, tapered spectrum of `report`'s used taps,
/// dB: the falling half of the 4-term Blackman–Harris window over each tap's kept ring-down (as
/// the analysis documents it), the ring counted from 2 ms after the tap.
fn own_peak_db(record: &Record, report: &BenchReport, m: &ringdown::Mode) -> f64 {
    let rate = record.rate_hz;
    let s = m.sigma() / rate;
    let (mut peak, mut noise, mut count) = (0.0, 0.0, 0.0);
    for tap in report.taps.iter().filter(|t| t.used) {
        let Some(&(t0, gain)) =
            record.taps.iter().min_by(|a, b| (a.0 - tap.time_s).abs().total_cmp(&(b.0 - tap.time_s).abs()))
        else {
            continue;
        };
        let n = (tap.kept_s * rate) as usize;
        let w = |i: usize| {
            let x = 2.0 * std::f64::consts::PI * (n + i) as f64 / (2 * n) as f64;
            0.35875 - 0.48829 * x.cos() + 0.14128 * (2.0 * x).cos() - 0.01168 * (3.0 * x).cos()
        };
        let from = (((t0 + 0.002 - tap.time_s) * rate).max(0.0)) as usize;
        let a = gain * m.amplitude * (-m.sigma() * 0.002).exp();
        let sum: f64 = (from..n).map(|i| (-s * (i - from) as f64).exp() * w(i)).sum();
        peak += (0.5 * a * sum).powi(2);
        noise += record.noise * record.noise * (0..n).map(|i| w(i) * w(i)).sum::<f64>();
        count += 1.0;
    }
    if count == 0.0 {
        return f64::NEG_INFINITY;
    }
    10.0 * (peak / noise).log10()
}

fn analyse(record: &Record) -> BenchReport {
    let options = BenchOptions { spectrum_points: usize::MAX, ..BenchOptions::default() };
    analyse_samples(&record.samples, record.rate_hz, &options).unwrap_or_else(|e| panic!("{e}\n{record:?}"))
}

/// The Cramér–Rao standard deviation of ω' (rad per sample; the same for σ') of mode `m` in
/// `record`: each tap's ring from 2 ms after it (where the fit starts) to the next tap or the end.
fn bound(record: &Record, m: &ringdown::Mode) -> f64 {
    let rate = record.rate_hz;
    let s = m.sigma() / rate;
    let mut information = 0.0;
    for (i, &(t0, gain)) in record.taps.iter().enumerate() {
        let start = t0 + 0.002;
        let stop = record.taps.get(i + 1).map_or(record.samples.len() as f64 / rate, |t| t.0);
        let n = ((stop - start) * rate).max(0.0) as usize;
        let a = gain * m.amplitude * (-m.sigma() * 0.002).exp();
        let sum: f64 = (0..n).map(|k| (k as f64).powi(2) * (-2.0 * s * k as f64).exp()).sum();
        information += 0.5 * a * a / (2.0 * record.noise * record.noise) * sum;
    }
    1.0 / information.max(1e-300).sqrt()
}

/// Counts of checks held to the stated target and to the Cramér–Rao allowance instead.
#[derive(Default)]
struct Tally {
    target: usize,
    allowance: usize,
}

/// Checks one record; returns the worst relative frequency error and damping error seen.
fn check(case: &str, record: &Record, tally: &mut Tally) -> (f64, f64) {
    let report = analyse(record);
    let (mut worst_f, mut worst_z) = (0.0f64, 0.0f64);
    let describe = || {
        format!(
            "{case}: modes {:?}\n taps {:?} noise {:e} rate {}\n peaks {:#?}\n warnings {:?}",
            record.modes.iter().map(|m| (m.hz, m.zeta, m.amplitude)).collect::<Vec<_>>(),
            record.taps,
            record.noise,
            record.rate_hz,
            report.peaks.iter().map(|p| (p.frequency_hz, p.damping_fit, p.over_floor_db)).collect::<Vec<_>>(),
            report.warnings.iter().map(|w| &w.message).collect::<Vec<_>>()
        )
    };
    // No phantom: every peak is within 0.5 % (or three bins) of a mode.
    for p in &report.peaks {
        let near = record.modes.iter().any(|m| {
            (p.frequency_hz - m.damped_hz()).abs() <= (0.005 * m.hz).max(3.0 * report.resolution_hz)
        });
        assert!(near, "a phantom peak at {} Hz\n{}", p.frequency_hz, describe());
    }
    for m in &record.modes {
        let found = report.peaks.iter().find(|p| {
            (p.frequency_hz - m.damped_hz()).abs() <= (0.005 * m.hz).max(3.0 * report.resolution_hz)
        });
        let level = own_peak_db(record, &report, m);
        let Some(p) = found else {
            assert!(
                level < 20.0,
                "missed the mode at {} Hz standing {level} dB over the noise\n{}",
                m.hz,
                describe()
            );
            continue;
        };
        let sd = bound(record, m);
        let omega = 2.0 * std::f64::consts::PI * m.damped_hz() / record.rate_hz;
        let allow_f = 6.0 * sd / omega;
        let tol_f = allow_f.max(5e-4);
        let ef = (p.frequency_hz / m.damped_hz() - 1.0).abs();
        assert!(
            ef <= tol_f,
            "mode at {} Hz read as {} Hz ({:e} > {tol_f:e})\n{}",
            m.damped_hz(),
            p.frequency_hz,
            ef,
            describe()
        );
        if allow_f > 5e-4 {
            tally.allowance += 1
        } else {
            tally.target += 1;
            worst_f = worst_f.max(ef)
        }
        if m.zeta >= 0.005 && level >= 20.0 {
            let z =
                p.damping_fit.unwrap_or_else(|| panic!("no fitted damping at {} Hz\n{}", m.hz, describe()));
            let allow_z = 6.0 * sd / (m.sigma() / record.rate_hz);
            let tol_z = allow_z.max(0.05);
            let ez = (z / m.zeta - 1.0).abs();
            assert!(
                ez <= tol_z,
                "mode at {} Hz: ζ {} read as {z} ({ez:e} > {tol_z:e})\n{}",
                m.hz,
                m.zeta,
                describe()
            );
            if allow_z > 0.05 {
                tally.allowance += 1
            } else {
                tally.target += 1;
                worst_z = worst_z.max(ez)
            }
        }
    }
    (worst_f, worst_z)
}

#[test]
fn random_ring_downs_give_their_modes_frequencies_and_damping() {
    let mut rng = Rng::new(0x7a92026);
    let limits =
        Limits { modes: 5, taps: 5, zeta: (0.001, 0.05), snr_db: (20.0, 60.0), seconds: (0.5, 10.0) };
    let (mut wf, mut wz) = (0.0f64, 0.0f64);
    let mut tally = Tally::default();
    let cases = 40;
    for i in 0..cases {
        let record = ringdown::random(&mut rng, limits);
        let (f, z) = check(&format!("case {i}"), &record, &mut tally);
        wf = wf.max(f);
        wz = wz.max(z);
    }
    eprintln!(
        "{cases} records: {} checks held to 0.05 % / 5 % (worst {:.2e} / {:.2e}), {} to six Cramér–Rao deviations",
        tally.target, wf, wz, tally.allowance
    );
    // Most checks must be held to the stated targets, or the records would test little.
    assert!(
        tally.target >= 2 * tally.allowance,
        "{} held to the targets, {} to the bound",
        tally.target,
        tally.allowance
    );
}

#[test]
fn a_double_hit_is_found_and_left_out_of_the_average() {
    // Three taps; the second bounces back 20 ms later: a fresh ring-down and a sharp click (a
    // hard bounce, its click 10 dB and more over the ring in Teager–Kaiser energy, which is what
    // the detector looks for; a softer bounce goes unnoticed and its tap is kept).
    let modes = [ringdown::Mode { hz: 640.0, zeta: 0.01, amplitude: 0.5, phase: 0.4 }];
    let taps = [(0.2, 1.0), (0.9, 1.0), (0.92, 0.6), (1.6, 0.9)];
    let mut record = ringdown::record(&mut Rng::new(77), 16_000.0, 2.3, &modes, &taps, 2e-4, true);
    let mut rng = Rng::new(79);
    let at = (0.92 * 16_000.0f64).ceil() as usize;
    for j in 0..5 {
        record.samples[at + j] += (0.8 * ringdown::gaussian(&mut rng)) as f32;
    }
    let report = analyse(&record);
    let flagged: Vec<bool> =
        report.taps.iter().map(|t| t.note.as_deref().is_some_and(|n| n.contains("double hit"))).collect();
    assert_eq!(flagged, [false, true, false], "{:?}", report.taps);
    assert_eq!(report.taps.iter().filter(|t| t.used).count(), 2);
    assert!(report.warnings.iter().any(|w| w.kind == "double-hit"), "{:?}", report.warnings);
    let p = &report.peaks[0];
    assert!((p.frequency_hz / modes[0].damped_hz() - 1.0).abs() < 5e-4 && report.peaks.len() == 1);
}

#[test]
fn a_tap_struck_while_the_part_still_rings_is_the_one_named() {
    // 200 Hz at ζ = 0.002 decays by 1/e in 0.4 s (τ = 1/(ζω)). A light tap, then a hard one
    // 0.5 s later, when the first still rings some 45 dB over the noise (and 19 dB under the
    // new tap, so that it is told apart); the third comes 3 s after the second, which has died
    // away by then. The second tap is the one struck into a ring.
    let modes = [ringdown::Mode { hz: 200.0, zeta: 0.002, amplitude: 0.5, phase: 0.3 }];
    let taps = [(0.2, 0.4), (0.7, 1.0), (3.7, 1.0)];
    let record = ringdown::record(&mut Rng::new(81), 8_000.0, 5.5, &modes, &taps, 2e-4, true);
    let report = analyse(&record);
    let notes: Vec<Option<&str>> = report.taps.iter().map(|t| t.note.as_deref()).collect();
    assert_eq!(
        notes,
        [None, Some("struck while the part still rang from the tap before"), None],
        "{:?}",
        report.taps
    );
    let warned: Vec<&str> =
        report.warnings.iter().filter(|w| w.kind == "still-ringing").map(|w| w.message.as_str()).collect();
    assert!(warned.len() == 1 && warned[0].starts_with("one tap came"), "{:?}", report.warnings);
}

#[test]
fn a_clipped_record_is_flagged() {
    let modes = [ringdown::Mode { hz: 440.0, zeta: 0.005, amplitude: 1.6, phase: 0.0 }];
    let mut record = ringdown::record(&mut Rng::new(78), 16_000.0, 1.5, &modes, &[(0.2, 1.0)], 1e-3, true);
    for s in &mut record.samples {
        *s = s.clamp(-1.0, 1.0);
    }
    let report = analyse(&record);
    assert!(report.warnings.iter().any(|w| w.kind == "clipping"), "{:?}", report.warnings);
}
