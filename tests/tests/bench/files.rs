//! Files: every WAV encoding the reader takes, a chosen channel, CSV layouts, and the malformed
//! files a recorder or a hand edit leaves behind, each refused with a clear message (the
//! messages' general checks are the robustness suite's).

use modebench::bench::{
    analyse_csv, analyse_file, analyse_timed, analyse_wav, BenchOptions, BenchReport, SourceKind,
};
use modebench_tests::random::Rng;
use modebench_tests::ringdown::{self, Mode, Record};

/// Two modes, three taps, 1.5 s at 8 kHz, 50 dB under full scale noise.
fn two_modes() -> Record {
    let modes = [
        Mode { hz: 220.0, zeta: 0.008, amplitude: 0.4, phase: 0.3 },
        Mode { hz: 1130.0, zeta: 0.004, amplitude: 0.25, phase: -1.1 },
    ];
    ringdown::record(
        &mut Rng::new(11),
        8000.0,
        1.5,
        &modes,
        &[(0.1, 1.0), (0.6, 0.9), (1.1, 0.8)],
        0.0015,
        true,
    )
}

/// The record's two modes found within 0.05 % (8-bit samples: 0.2 %, their rounding noise being
/// 20 dB over the record's own).
fn finds_both(report: &BenchReport, record: &Record, tolerance: f64, case: &str) {
    for m in &record.modes {
        let p = report.peaks.iter().find(|p| (p.frequency_hz / m.damped_hz() - 1.0).abs() < tolerance);
        assert!(
            p.is_some(),
            "{case}: no peak at {} Hz in {:?}",
            m.damped_hz(),
            report.peaks.iter().map(|p| p.frequency_hz).collect::<Vec<_>>()
        );
    }
    assert_eq!(
        report.peaks.len(),
        record.modes.len(),
        "{case}: {:?}",
        report.peaks.iter().map(|p| p.frequency_hz).collect::<Vec<_>>()
    );
}

#[test]
fn every_wav_encoding_reads_the_same_modes() {
    let r = two_modes();
    let o = BenchOptions::default();
    for bits in [8u16, 16, 24, 32] {
        let report = analyse_wav(&ringdown::wav_int(&r.samples, 1, 8000, bits), &o).unwrap();
        finds_both(&report, &r, if bits == 8 { 2e-3 } else { 5e-4 }, &format!("{bits}-bit"));
        assert_eq!(report.taps.len(), 3, "{bits}-bit");
    }
    let report = analyse_wav(&ringdown::wav(&r.samples, 1, 8000, true), &o).unwrap();
    finds_both(&report, &r, 5e-4, "float");
}

#[test]
fn the_chosen_channel_is_the_one_analysed() {
    let r = two_modes();
    let quiet: Vec<f32> = {
        let mut rng = Rng::new(3);
        (0..r.samples.len()).map(|_| (1e-4 * ringdown::gaussian(&mut rng)) as f32).collect()
    };
    let stereo: Vec<f32> = quiet.iter().zip(&r.samples).flat_map(|(a, b)| [*a, *b]).collect();
    let bytes = ringdown::wav(&stereo, 2, 8000, false);
    let report = analyse_wav(&bytes, &BenchOptions { channel: 1, ..BenchOptions::default() }).unwrap();
    finds_both(&report, &r, 5e-4, "channel 2");
    assert_eq!(report.channels, 2);
    let e = analyse_wav(&bytes, &BenchOptions::default()).unwrap_err().to_string();
    assert!(e.contains("no tap found"), "{e}");
    let e =
        analyse_wav(&bytes, &BenchOptions { channel: 2, ..BenchOptions::default() }).unwrap_err().to_string();
    assert!(e.contains("channel 3") && e.contains("2 channel"), "{e}");
}

#[test]
fn csv_layouts_read_the_same_modes() {
    let r = two_modes();
    let o = BenchOptions::default();
    let mut time = String::from("time_s,accel\n");
    let mut rate = String::from("# sample rate: 8000 Hz\nsignal\n");
    let mut semi = String::new();
    // A logger whose clock wanders by up to ±0.2 % of a step: uniform within 1 %.
    let mut jitter = Rng::new(5);
    for (i, v) in r.samples.iter().enumerate() {
        let t = i as f64 / 8000.0 + (jitter.unit() - 0.5) * 0.0000005;
        time.push_str(&format!("{t:.9},{v}\n"));
        rate.push_str(&format!("{v}\n"));
        semi.push_str(&format!(
            "{};{}\n",
            format!("{t:.9}").replace('.', ","),
            format!("{v}").replace('.', ",")
        ));
    }
    for (name, text) in
        [("time column", &time), ("rate line", &rate), ("semicolons and decimal commas", &semi)]
    {
        let report = analyse_csv(text, &o).unwrap_or_else(|e| panic!("{name}: {e}"));
        finds_both(&report, &r, 5e-4, name);
        // The median step of a wandering clock: within 10⁻⁴.
        assert!((report.sample_rate_hz / 8000.0 - 1.0).abs() < 1e-4, "{name}: {}", report.sample_rate_hz);
        assert!(!report.warnings.iter().any(|w| w.kind == "resampled"), "{name}");
    }
    // Every tenth step 30 % long: resampled, and said so.
    let mut uneven = String::from("t,a\n");
    let mut t = 0.0;
    for (i, v) in r.samples.iter().enumerate() {
        uneven.push_str(&format!("{t:.9},{v}\n"));
        t += if i % 10 == 9 { 1.3 } else { 1.0 } / 8000.0;
    }
    let report = analyse_csv(&uneven, &o).unwrap();
    assert!(report.warnings.iter().any(|w| w.kind == "resampled"), "{:?}", report.warnings);
}

#[test]
fn malformed_files_are_refused_with_a_clear_message() {
    let r = two_modes();
    let o = BenchOptions::default();
    let good = ringdown::wav(&r.samples, 1, 8000, false);
    let mut cases: Vec<(&str, Vec<u8>, &str)> = vec![
        ("truncated header", good[..20].to_vec(), "WAV"),
        ("no data", good[..44].to_vec(), "at least 256"),
    ];
    let mut odd = good.clone();
    odd[40..44].copy_from_slice(&3u32.to_le_bytes());
    cases.push(("data length not a whole sample", odd, "malformed"));
    let mut fmt = good.clone();
    fmt[16..20].copy_from_slice(&0x7fff_fff0u32.to_le_bytes());
    cases.push(("fmt chunk longer than the file", fmt, "WAV"));
    let mut zero = good.clone();
    zero[24..32].copy_from_slice(&[0; 8]);
    cases.push(("zero sample rate", zero, "rate"));
    let mut wrong = good.clone();
    wrong[28..32].copy_from_slice(&1u32.to_le_bytes());
    cases.push(("byte rate disagreeing", wrong, "disagree"));
    cases.push(("single sample", ringdown::wav(&[0.5], 1, 8000, false), "at least 256"));
    cases.push(("all zero", ringdown::wav(&vec![0.0; 8000], 1, 8000, false), "silent"));
    cases.push(("NaN in a CSV", b"t,a\n0,0.1\n0.001,NaN\n".to_vec(), "NaN"));
    cases.push(("text in a CSV", b"# rate: 100\n0.1\n0.2\nabc\n".to_vec(), "abc"));
    cases.push(("one CSV line", b"t,a\n0,1\n".to_vec(), "at least"));
    cases.push(("not text", vec![0xff, 0xfe, 0x00, 0x41], "neither WAV nor CSV"));
    for (case, bytes, words) in cases {
        let e = analyse_file(&bytes, &o).err().unwrap_or_else(|| panic!("{case}: accepted"));
        let shown = e.to_string();
        assert!(shown.contains(words), "{case}: {shown:?} lacks {words:?}");
    }
    // A data chunk cut short (a recorder stopped mid-write): read as far as it goes, and said so.
    let cut = good[..good.len() - 4000].to_vec();
    let report = analyse_file(&cut, &o).unwrap();
    assert!(report.warnings.iter().any(|w| w.kind == "truncated-file"), "{:?}", report.warnings);
}

#[test]
fn long_silence_is_refused_and_an_overlong_record_is_too() {
    // 25 minutes of faint noise at 1 kHz, 8-bit: no tap, said so, in bounded memory.
    let mut rng = Rng::new(9);
    let n = 25 * 60 * 1000;
    let hiss: Vec<f32> = (0..n).map(|_| (0.01 * ringdown::gaussian(&mut rng)) as f32).collect();
    let e = analyse_file(&ringdown::wav_int(&hiss, 1, 1000, 8), &BenchOptions::default())
        .unwrap_err()
        .to_string();
    assert!(e.contains("no tap found"), "{e}");
    // Three hours: refused before reading a sample.
    let mut header = ringdown::wav_int(&[0.0; 4], 1, 1000, 8);
    let long = 3 * 3600 * 1000u32;
    header[40..44].copy_from_slice(&long.to_le_bytes());
    header[4..8].copy_from_slice(&(36 + long).to_le_bytes());
    let e = analyse_file(&header, &BenchOptions::default()).unwrap_err().to_string();
    assert!(e.contains("30 minutes"), "{e}");
}

#[test]
fn motion_sensor_events_are_resampled_by_their_timestamps() {
    // A tablet fixed to a slow part: events about 60 a second, their times wandering by up to
    // 20 % of a step, a 4.2 Hz mode (ζ 2 %) struck twice.
    let mode = Mode { hz: 4.2, zeta: 0.02, amplitude: 3.0, phase: 0.0 };
    let mut rng = Rng::new(21);
    let (mut times, mut values) = (Vec::new(), Vec::new());
    let mut t = 0.0;
    while t < 30.0 {
        let mut v = 0.02 * ringdown::gaussian(&mut rng);
        for t0 in [3.0, 16.0] {
            if t >= t0 {
                let tt = t - t0;
                v += mode.amplitude
                    * (-mode.sigma() * tt).exp()
                    * (2.0 * std::f64::consts::PI * mode.damped_hz() * tt).cos();
            }
        }
        times.push(t);
        values.push(v as f32);
        t += (1.0 + 0.2 * (rng.unit() - 0.5)) / 60.0;
    }
    let options = BenchOptions { source: SourceKind::Motion, ..BenchOptions::default() };
    let report = analyse_timed(&times, &values, &options).unwrap();
    assert!(report.warnings.iter().any(|w| w.kind == "resampled"), "{:?}", report.warnings);
    assert!(report.notes.iter().any(|n| n.contains("modes up to about")), "{:?}", report.notes);
    assert_eq!(report.peaks.len(), 1, "{:?}", report.peaks);
    // Linear interpolation of a wandering clock: within 0.5 % here.
    assert!((report.peaks[0].frequency_hz / mode.damped_hz() - 1.0).abs() < 5e-3, "{:?}", report.peaks);
    let e = analyse_timed(&[0.0, 0.1, 0.1], &[0.0; 3], &options).unwrap_err().to_string();
    assert!(e.contains("do not increase"), "{e}");
}
