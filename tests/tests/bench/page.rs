//! The worked page's recording (`site/assets/boom-taps.wav`): a synthetic tap test of the camera
//! boom of `docs/scenarios/sensor-boom.json`, made here from the model's own modes as a real boom
//! might differ from it (its bolted root plate a little soft: every mode a few per cent low),
//! heard by a microphone that barely hears under 30 Hz. The file is rebuilt and compared byte for
//! byte (`MODEBENCH_BLESS=1` rewrites it), and its analysis is checked against what the page
//! says: the modes matched and the frequencies it quotes, mode 1 flagged as under the
//! microphone's hearing, and the small deflections at the head that would hide modes 3 and 4
//! from a tap there.

use modebench::bench::{analyse_wav, BenchOptions, Predicted};
use modebench_tests::random::Rng;
use modebench_tests::ringdown::{self, Mode};

/// Where the boom is tapped and the tablet held, m from the wall.
const TAP_M: f64 = 1.0;
/// How much lower each mode of the real boom is than the model's (the soft root plate), and its
/// damping ratio: our own invented figures.
const REAL: [(f64, f64); 4] = [(0.955, 0.012), (0.965, 0.006), (0.975, 0.004), (0.98, 0.005)];

fn root() -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).parent().unwrap().to_path_buf()
}

fn predicted() -> Predicted {
    let text = std::fs::read_to_string(root().join("docs/scenarios/sensor-boom.json")).unwrap();
    let report = modebench::solve_json(&text).unwrap();
    Predicted::from_report(&report, Some(TAP_M), Some(TAP_M))
}

fn recording() -> Vec<u8> {
    let p = predicted();
    let modes: Vec<Mode> = p
        .modes
        .iter()
        .zip(REAL)
        .map(|(m, (scale, zeta))| {
            // Excited in proportion to the mode's deflection at the tap, heard in proportion to it
            // at the tablet; a microphone's response falling as f² under 30 Hz.
            let heard = (m.hz * scale / 30.0).min(1.0).powi(2);
            Mode { hz: m.hz * scale, zeta, amplitude: 0.5 * m.at_tap * m.at_sensor * heard, phase: 0.0 }
        })
        .collect();
    let taps = [(0.4, 1.0), (1.9, 0.85), (3.4, 0.95)];
    let r = ringdown::record(&mut Rng::new(40), 22_050.0, 4.8, &modes, &taps, 2e-4, true);
    ringdown::wav(&r.samples, 1, 22_050, false)
}

#[test]
fn the_worked_pages_recording_is_current_and_reads_as_the_page_says() {
    let path = root().join("site/assets/boom-taps.wav");
    let bytes = recording();
    if std::env::var("MODEBENCH_BLESS").is_ok_and(|v| v == "1") {
        std::fs::write(&path, &bytes).unwrap();
    }
    let shipped =
        std::fs::read(&path).expect("site/assets/boom-taps.wav: run with MODEBENCH_BLESS=1 to write it");
    assert!(shipped == bytes, "site/assets/boom-taps.wav is out of date: run with MODEBENCH_BLESS=1");
    let options = BenchOptions { predicted: Some(predicted()), ..BenchOptions::default() };
    let report = analyse_wav(&bytes, &options).unwrap();
    let page = std::fs::read_to_string(root().join("site/pages/40-tap-testing-the-boom.md")).unwrap();
    assert_eq!(report.taps.iter().filter(|t| t.used).count(), 3);
    for m in &report.modes {
        eprintln!(
            "mode {}: predicted {:.1} Hz, measured {:?}, {:?}, {:?}",
            m.mode, m.predicted_hz, m.measured_hz, m.difference_percent, m.note
        );
    }
    for p in &report.peaks {
        eprintln!(
            "peak {:.2} Hz ζ fit {:?} half-power {:?} mode {:?}",
            p.frequency_hz, p.damping_fit, p.damping_half_power, p.mode
        );
    }
    // Mode 1 lies under the microphone's hearing: flagged, and the page says so. The warning
    // names the peak by the figure the panel's table of peaks shows (five significant figures).
    let low = report.warnings.iter().find(|w| w.kind == "low-frequency");
    let Some(low) = low else { panic!("no low-frequency warning: {:?}", report.warnings) };
    let shown = modebench::units::significant(report.peaks[0].frequency_hz, 5);
    assert!(low.message.starts_with(&format!("{shown} Hz ")), "{} (the table shows {shown})", low.message);
    // Tapped at the head, modes 3 and 4 would barely ring: their deflection there, as quoted.
    let at_head = Predicted::from_report(
        &modebench::solve_json(
            &std::fs::read_to_string(root().join("docs/scenarios/sensor-boom.json")).unwrap(),
        )
        .unwrap(),
        Some(1.45),
        Some(1.45),
    );
    for m in &at_head.modes[2..4] {
        let quoted = format!("{:.0} %", m.at_tap * 100.0);
        assert!(
            page.contains(&quoted),
            "the page should quote mode {}'s deflection at the head, {quoted}",
            m.number
        );
    }
    for m in &report.modes {
        let measured = m.measured_hz.unwrap_or_else(|| panic!("mode {} not matched: {:?}", m.mode, m.note));
        let diff = m.difference_percent.unwrap();
        assert!((1.0..5.5).contains(&diff), "mode {}: {diff} %", m.mode);
        let quoted = format!("{measured:.1} Hz");
        assert!(page.contains(&quoted), "the page should quote mode {}'s measured {quoted}", m.mode);
        let predicted = format!("{:.1} Hz", m.predicted_hz);
        assert!(page.contains(&predicted), "the page should quote mode {}'s predicted {predicted}", m.mode);
    }
}

#[test]
fn a_tablet_fixed_to_the_head_lowers_mode_1_as_its_modal_mass_says() {
    // Mode 1 of the boom is nearly a mass on a spring at the tip, where its shape is largest
    // (1): adding ΔM there gives f' ≈ f·√(M/(M + ΔM)) with M the mode's generalized mass
    // normalised to that point (the single-degree-of-freedom equivalent; first order in the
    // shape's change, so within 1 % for a tablet of 0.5 kg on 3.6 kg here).
    let text = std::fs::read_to_string(root().join("docs/scenarios/sensor-boom.json")).unwrap();
    let value: serde_json::Value = serde_json::from_str(&text).unwrap();
    let before = modebench::solve_json(&text).unwrap();
    let with = modebench::bench::added_mass::with_sensor_mass(&value, 0.5, 1.45).unwrap();
    let after = modebench::solve_json(&with.to_string()).unwrap();
    let (f, m) = (before.modes[0].frequency_hz, before.modes[0].generalized_mass);
    let expected = f * (m / (m + 0.5)).sqrt();
    modebench_tests::check(
        "boom mode 1 with a 0.5 kg tablet at the head",
        "single-degree-of-freedom equivalent at the tip (Rayleigh's quotient, first order)",
        expected,
        after.modes[0].frequency_hz,
        0.01,
    );
    assert!(after.modes[0].frequency_hz < f);
    let e = modebench::bench::added_mass::with_sensor_mass(&value, -1.0, 1.0).unwrap_err().to_string();
    assert!(e.contains("sensor_mass") && e.contains("above 0 kg"), "{e}");
}
