//! Seeded random damage to tap-test recordings never makes the analysis panic: WAV files with
//! bytes overwritten, cut or lengthened; CSV text with cells replaced by garbage, NaN or
//! infinity; samples with NaN, infinity and extremes at hostile sample rates. What is accepted
//! reports only finite numbers; what is refused is refused with a short, plain message.

use super::assert_plain;
use modebench::bench::{analyse_file, analyse_samples, BenchOptions};
use modebench_tests::random::Rng;
use modebench_tests::ringdown::{self, Mode};

fn base(rng: &mut Rng) -> Vec<f32> {
    let modes = [Mode { hz: 310.0, zeta: 0.01, amplitude: 0.5, phase: 0.2 }];
    ringdown::record(rng, 4000.0, 0.6, &modes, &[(0.1, 1.0), (0.35, 0.8)], 0.002, true).samples
}

fn judge(result: Result<modebench::bench::BenchReport, modebench::Error>, case: &str) {
    match result {
        Ok(report) => assert!(report.is_finite(), "{case}: a non-finite number in the report"),
        Err(e) => assert_plain(&e, case),
    }
}

#[test]
fn damaged_wav_files_are_refused_or_read_never_panicking() {
    let mut rng = Rng::new(0xbe7c4);
    let samples = base(&mut rng);
    let good = ringdown::wav(&samples, 1, 4000, false);
    let options = BenchOptions::default();
    for i in 0..60 {
        let mut bytes = good.clone();
        match rng.below(4) {
            0 => {
                // A few bytes of the header overwritten.
                for _ in 0..1 + rng.below(4) {
                    let at = rng.below(48.min(bytes.len()));
                    bytes[at] = rng.next_u64() as u8;
                }
            }
            1 => bytes.truncate(rng.below(bytes.len())),
            2 => {
                let at = 4 * (1 + rng.below(10));
                let value = *rng.pick(&[0u32, 1, 3, 0xffff_ffff, 0x7fff_ffff, 44, 1 << 20]);
                bytes[at..at + 4].copy_from_slice(&value.to_le_bytes());
            }
            _ => {
                // Random bytes in the data.
                for _ in 0..50 {
                    let at = 44 + rng.below(bytes.len() - 44);
                    bytes[at] = rng.next_u64() as u8;
                }
            }
        }
        judge(analyse_file(&bytes, &options), &format!("wav case {i}"));
    }
}

#[test]
fn damaged_csv_text_is_refused_or_read_never_panicking() {
    let mut rng = Rng::new(0xc57);
    let samples = base(&mut rng);
    let garbage = ["NaN", "inf", "-inf", "1e400", "", "abc", "1,2,3", "\"", ";;", "1e-400", "0x10", "—"];
    let options = BenchOptions::default();
    for i in 0..60 {
        let mut text =
            if rng.below(2) == 0 { String::from("t,a\n") } else { String::from("# sample rate: 4000\n") };
        for (k, v) in samples.iter().enumerate() {
            let cell = if rng.below(400) == 0 { rng.pick(&garbage).to_string() } else { format!("{v}") };
            if text.starts_with('t') {
                let t = if rng.below(800) == 0 {
                    rng.pick(&garbage).to_string()
                } else {
                    format!("{}", k as f64 / 4000.0)
                };
                text.push_str(&format!("{t},{cell}\n"));
            } else {
                text.push_str(&format!("{cell}\n"));
            }
        }
        judge(analyse_file(text.as_bytes(), &options), &format!("csv case {i}"));
    }
}

#[test]
fn hostile_samples_and_rates_are_refused_or_read_never_panicking() {
    let mut rng = Rng::new(0x5a3);
    let clean = base(&mut rng);
    let hostile = [f32::NAN, f32::INFINITY, f32::NEG_INFINITY, f32::MAX, f32::MIN_POSITIVE, 0.0, -1.0, 1.0];
    let rates = [f64::NAN, 0.0, -8000.0, 1e-9, 1.0, 50.0, 4000.0, 4000.0, 4000.0, 1e7, f64::INFINITY];
    for i in 0..60 {
        let mut s = clean.clone();
        for _ in 0..rng.below(20) {
            let at = rng.below(s.len());
            s[at] = *rng.pick(&hostile);
        }
        if rng.below(5) == 0 {
            s.truncate(rng.below(s.len()));
        }
        let rate = *rng.pick(&rates);
        let range = match rng.below(4) {
            0 => Some((rng.range(-100.0, 3000.0), rng.range(-100.0, 3000.0))),
            1 => Some((f64::NAN, 100.0)),
            _ => None,
        };
        let options = BenchOptions { range_hz: range, ..BenchOptions::default() };
        judge(analyse_samples(&s, rate, &options), &format!("samples case {i}"));
    }
}
