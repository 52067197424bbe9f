//! The tap test from samples to report: the readers' entry points, the two passes over the
//! record, the spectral and fitted estimates per peak, the match with the prediction, and the
//! warnings. It runs in bounded memory: the envelope (a few numbers per millisecond) and the
//! kept ring-downs (at most [`MAX_KEPT`] samples) with one FFT buffer at a time.
//!
//! The file runs past 400 lines on purpose: the pipeline reads best as one function in the
//! order it works, with the readers' entry points before it and its per-peak helpers after; the
//! warnings, which only read its results, are in `analysis/warnings.rs`.

mod warnings;

use super::envelope::Envelope;
use super::fit::{self, Band};
use super::source::{Memory, Source};
use super::spectrum::{self, falling_window, fft_length, Transformer};
use super::taps::{self, Timing};
use super::types::{BenchOptions, BenchReport, MeasuredPeak, SpectrumCurve, TapReport};
use super::wav::WavSource;
use super::{damping, delimited, matching, peaks, resample, MAX_SECONDS, MIN_SAMPLES};
use crate::error::number;
use crate::{Error, ErrorKind, FieldPath};

/// The longest ring-down kept per tap, samples (about 22 s at 48 kHz).
pub const MAX_SEGMENT: usize = 1 << 20;
/// The most samples kept across all taps (some 32 MB).
pub const MAX_KEPT: usize = 1 << 23;
/// A peak's fitted sinusoid must carry this many times the noise's power per bin of its band
/// (summed over the taps), and reduce the band's residual by this many times what is left per
/// degree of freedom (averaged over the taps): 20 dB. A decaying sinusoid fitted to noise
/// alone explains a few bins' worth of it (its four parameters, and the best frequency it could
/// pick), a ripple of noise on a neighbour's skirt no more; a mode standing 20 dB over the floor
/// in the tapered spectrum carries more in its one bin at the peak than this asks for the band.
/// A candidate no fit could be made for is kept only when it stands 30 dB over the floor and
/// 10 dB over its surroundings.
const STANDS_OUT: f64 = 100.0;
/// Points per tap's spectrum kept for the consistency figure.
const CONSISTENCY_POINTS: usize = 512;

/// Analyses samples at a uniform rate (the microphone's blocks, or any samples at hand).
pub fn analyse_samples(samples: &[f32], rate_hz: f64, options: &BenchOptions) -> Result<BenchReport, Error> {
    check_rate(rate_hz)?;
    let mut source = Memory { samples, rate_hz };
    run(&mut source, 1, Vec::new(), options)
}

/// Analyses values taken at the given times (s, increasing): the motion sensor's events,
/// resampled to a uniform rate by their timestamps.
pub fn analyse_timed(times: &[f64], values: &[f32], options: &BenchOptions) -> Result<BenchReport, Error> {
    if let Some(i) = times.windows(2).position(|w| w[1] <= w[0] || !w[1].is_finite() || !w[0].is_finite()) {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!("the sample times do not increase at sample {}", i + 2),
        ));
    }
    let u = resample::uniform(times, values, "sensor timestamps")?;
    check_rate(u.rate_hz)?;
    let mut source = Memory { samples: &u.samples, rate_hz: u.rate_hz };
    run(&mut source, 1, u.note.into_iter().collect(), options)
}

/// Analyses a WAV file's bytes.
pub fn analyse_wav(bytes: &[u8], options: &BenchOptions) -> Result<BenchReport, Error> {
    let mut source = WavSource::open(bytes, options.channel)?;
    let channels = source.channels();
    let notes = vec![source.describe()];
    let mut report = run(&mut source, channels, notes, options)?;
    if source.truncated() {
        report.warnings.push(super::Warning {
            kind: "truncated-file",
            message: format!(
                "the file ends early: {} of the {} samples its header promises were read; the rest is missing",
                source.read, source.frames
            ),
        });
    }
    Ok(report)
}

/// Analyses a CSV file's text.
pub fn analyse_csv(text: &str, options: &BenchOptions) -> Result<BenchReport, Error> {
    let table = delimited::read(text, options.channel)?;
    check_rate(table.rate_hz)?;
    let mut source = Memory { samples: &table.samples, rate_hz: table.rate_hz };
    run(&mut source, table.channels, table.notes, options)
}

/// Analyses a file by its contents: a WAV file starts with `RIFF`; anything else is read as CSV
/// text.
pub fn analyse_file(bytes: &[u8], options: &BenchOptions) -> Result<BenchReport, Error> {
    if bytes.starts_with(b"RIFF") {
        return analyse_wav(bytes, options);
    }
    if bytes.len() >= 4
        && (bytes.starts_with(b"RIFX")
            || bytes.starts_with(b"RF64")
            || bytes.starts_with(b"OggS")
            || bytes.starts_with(b"ID3")
            || bytes.starts_with(b"fLaC"))
    {
        return Err(Error::new(ErrorKind::UnknownOption, "this is an audio file other than RIFF WAV (or a big-endian or 64-bit WAV): save the recording as WAV (PCM or 32-bit float)"));
    }
    let text = std::str::from_utf8(bytes).map_err(|e| {
        Error::new(
            ErrorKind::Syntax,
            format!("the file is neither WAV nor CSV text (not UTF-8 after byte {})", e.valid_up_to()),
        )
    })?;
    analyse_csv(text, options)
}

fn check_rate(rate_hz: f64) -> Result<(), Error> {
    if rate_hz.is_finite() && rate_hz > 0.0 && rate_hz <= 1e6 {
        Ok(())
    } else {
        Err(Error::new(ErrorKind::OutOfRange, "the sample rate must be above 0 Hz and at most 1 MHz")
            .with_number(rate_hz)
            .at(FieldPath::root().key("sample_rate")))
    }
}

/// The range searched: as asked (checked), or the default.
fn range(options: &BenchOptions, rate_hz: f64, notes: &mut Vec<String>) -> Result<[f64; 2], Error> {
    let nyquist = 0.5 * rate_hz;
    let Some((lo, hi)) = options.range_hz else {
        return Ok([if rate_hz >= 1000.0 { 5.0 } else { 0.5 }, 0.45 * rate_hz]);
    };
    let at = FieldPath::root().key("range");
    if !(lo.is_finite() && hi.is_finite() && lo >= 0.0 && lo < hi) {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            "the range needs a low end of 0 Hz or more below its high end",
        )
        .with_value(format!("{}:{}", number(lo), number(hi)))
        .at(at));
    }
    if lo >= nyquist {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "the range starts at or above half the sample rate ({} Hz), where nothing can be measured",
                number(nyquist)
            ),
        )
        .with_number(lo)
        .at(at));
    }
    let top = hi.min(0.49 * rate_hz);
    if top < hi {
        notes.push(format!(
            "range: the high end was lowered to {} Hz, just under half the sample rate",
            number(top)
        ));
    }
    Ok([lo.max(1e-3), top])
}

/// One pass collecting the samples of each of `ranges` (start, end).
fn gather(source: &mut dyn Source, ranges: &[(usize, usize)]) -> Result<Vec<Vec<f32>>, Error> {
    let mut out: Vec<Vec<f32>> = ranges.iter().map(|(a, b)| Vec::with_capacity(b - a)).collect();
    let mut pos = 0usize;
    source.scan(&mut |chunk: &[f32]| {
        let end = pos + chunk.len();
        for (slot, &(a, b)) in out.iter_mut().zip(ranges) {
            let (from, to) = (a.max(pos), b.min(end));
            if from < to {
                slot.extend(chunk[from - pos..to - pos].iter().map(|v| if v.is_finite() { *v } else { 0.0 }));
            }
        }
        pos = end;
    })?;
    Ok(out)
}

/// One peak's fits across taps: (fit, weight, samples fitted).
type Fits = Vec<(fit::Fit, f64, usize)>;

fn run(
    source: &mut dyn Source,
    channels: usize,
    mut notes: Vec<String>,
    options: &BenchOptions,
) -> Result<BenchReport, Error> {
    let rate = source.rate_hz();
    let range_hz = range(options, rate, &mut notes)?;
    if options.source == super::SourceKind::Motion {
        notes.push(format!(
            "the motion sensor delivered {} samples a second: modes up to about {} Hz can be read from it",
            number(rate.round()),
            number((warnings::NEAR_NYQUIST * rate).round())
        ));
    }
    let mut env = Envelope::new(rate);
    let frames = source.scan(&mut |chunk: &[f32]| env.push(chunk))?;
    env.finish();
    let hits = source.full_scale_hits();
    let duration = frames as f64 / rate;
    if frames < MIN_SAMPLES {
        return Err(Error::new(
            ErrorKind::Missing,
            format!("the recording holds {frames} sample(s); at least {MIN_SAMPLES} are needed"),
        ));
    }
    if duration > MAX_SECONDS {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "the recording lasts {} minutes; at most 30 minutes are analysed: cut it to the taps",
                number((duration / 60.0).round())
            ),
        ));
    }
    if env.peak == 0.0 {
        return Err(Error::new(ErrorKind::Missing, "the recording is silent: every sample is zero"));
    }
    let plan = taps::detect(&env, Timing { rate_hz: rate, low_hz: range_hz[0].max(0.1) }, MAX_SEGMENT);
    if plan.taps.is_empty() {
        return Err(Error::new(
            ErrorKind::Missing,
            format!(
                "no tap found: the loudest moment stands {} dB over the noise floor, and a tap must rise {} dB over it \
                 and {} dB over what rang before; tap harder, or bring the sensor closer",
                number(plan.loudest_db.max(0.0).round()),
                taps::TRIGGER_DB,
                taps::RISE_DB
            ),
        ));
    }
    // The taps whose ring-down enters the average: those without a double hit, unless every
    // tap has one; and no more than the memory bound allows.
    let clean = plan.taps.iter().any(|t| t.double_hit.is_none());
    let mut kept = 0usize;
    let mut dropped = 0usize;
    let used: Vec<bool> = plan
        .taps
        .iter()
        .map(|t| {
            let ok = !clean || t.double_hit.is_none();
            if ok && kept + (t.end - t.onset) > MAX_KEPT {
                dropped += 1;
                return false;
            }
            if ok {
                kept += t.end - t.onset;
            }
            ok
        })
        .collect();
    let chosen: Vec<&taps::Tap> = plan.taps.iter().zip(&used).filter(|(_, u)| **u).map(|(t, _)| t).collect();
    let mut ranges: Vec<(usize, usize)> = chosen.iter().map(|t| (t.onset, t.end)).collect();
    ranges.push((plan.quiet.0, plan.quiet.0 + plan.quiet.1));
    let mut segments = gather(source, &ranges)?;
    let quiet = segments.pop().unwrap_or_default();
    let longest = segments.iter().map(Vec::len).max().unwrap_or(0);
    let m = fft_length(longest);
    let bin_hz = rate / m as f64;
    let lo_b = ((range_hz[0] / bin_hz).ceil() as usize).max(1);
    let hi_b = ((range_hz[1] / bin_hz).floor() as usize).min(m / 2 - 1);
    if hi_b < lo_b + 3 {
        return Err(Error::new(
            ErrorKind::OutOfRange,
            format!(
                "the range {}–{} Hz is narrower than four bins of this record's spectrum ({} Hz apart): widen it",
                number(range_hz[0]),
                number(range_hz[1]),
                number(bin_hz)
            ),
        )
        .at(FieldPath::root().key("range")));
    }
    let width = hi_b - lo_b + 1;

    // The averaged, tapered power spectrum; each tap's, coarsely, for the consistency figure.
    let mut t = Transformer::new(m);
    let mut power = vec![0.0f64; width];
    let (mut sum_w, mut sum_w2) = (0.0, 0.0);
    let mut per_tap: Vec<Vec<f64>> = Vec::new();
    for seg in &segments {
        let w = falling_window(seg.len());
        sum_w += w.iter().sum::<f64>();
        sum_w2 += w.iter().map(|v| v * v).sum::<f64>();
        let spec = t.forward(seg, Some(&w));
        let tap_power: Vec<f64> = spec[lo_b..=hi_b].iter().map(spectrum::power).collect();
        for (p, q) in power.iter_mut().zip(&tap_power) {
            *p += q;
        }
        // Decimated first, in power: the largest bin of each stretch is the largest in dB too,
        // and the logarithm is then taken of 512 values instead of every bin.
        let top = spectrum::decimate(&tap_power, &tap_power, 0, 1.0, CONSISTENCY_POINTS).1;
        per_tap.push(top.iter().map(|p| 10.0 * p.max(1e-300).log10()).collect());
    }
    let count = segments.len().max(1) as f64;
    let scale = (2.0 * count / sum_w.max(1e-300)).powi(2);
    let db: Vec<f64> = power.iter().map(|p| 10.0 * (p / count * scale).max(1e-30).log10()).collect();
    // The noise's power per sample at each bin of the range (dB), and on the spectrum's scale.
    let noise_db = spectrum::noise_floor_db(&quiet, m, lo_b..hi_b + 1);
    let shift = 10.0 * (sum_w2 / count * scale).max(1e-300).log10();
    let floor: Vec<f64> = noise_db.iter().map(|f| (f + shift).max(-300.0)).collect();
    let mut found = peaks::find(&db, &floor, 0..width);

    // The fits, tap by tap, and the rectangular power average for the half-power cross-check.
    let bands: Vec<(usize, usize)> = found
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let kc = lo_b + p.bin;
            let gap = [i.checked_sub(1).map(|j| found[j].position), found.get(i + 1).map(|q| q.position)]
                .into_iter()
                .flatten()
                .map(|q| (q - p.position).abs())
                .fold(f64::INFINITY, f64::min);
            let k =
                (6.0 * p.half_width.max(1.0)).round().clamp(6.0, 1000.0).min((0.45 * gap).floor()).max(3.0)
                    as usize;
            (kc.saturating_sub(k).max(1), (kc + k).min(m / 2 - 1))
        })
        .collect();
    let mut fits: Vec<Fits> = vec![Vec::new(); found.len()];
    let mut rect = vec![0.0f64; m / 2 + 1];
    let mut fitted_length = 0.0;
    for (seg, tap) in segments.iter().zip(&chosen) {
        let skip = fit_start(seg, tap, &env, rate);
        if seg.len() < skip + 64 {
            continue;
        }
        let ring = &seg[skip..];
        fitted_length += ring.len() as f64;
        let spec = t.forward(ring, None);
        for (r, c) in rect.iter_mut().zip(spec) {
            *r += spectrum::power(c);
        }
        for (i, p) in found.iter().enumerate() {
            let band = Band { spectrum: spec, m, n: ring.len(), lo: bands[i].0, hi: bands[i].1 };
            let omega0 = 2.0 * std::f64::consts::PI * (lo_b as f64 + p.position) / m as f64;
            let sigma0 = 2.0 * std::f64::consts::PI * p.half_width.max(0.5) / m as f64;
            if let Some(f) = fit::fit(&band, omega0, sigma0) {
                fits[i].push((f, f.amplitude * f.amplitude / f.sigma, ring.len()));
            }
        }
    }
    // A candidate is kept when its fitted ring-down stands out of the noise (see
    // `STANDS_OUT`), or, where no fit could be made, by its height and prominence alone.
    let keep: Vec<bool> = found
        .iter()
        .zip(&fits)
        .map(|(p, f)| {
            if f.is_empty() {
                return p.over_floor_db >= 30.0 && p.prominence_db >= 10.0;
            }
            let explained: f64 = f.iter().map(|(g, _, _)| g.energy).sum();
            let noise = 10f64.powf(noise_db[p.bin] / 10.0);
            let per_bin: f64 = f.iter().map(|(_, _, n)| noise * *n as f64).sum();
            let significance = f.iter().map(|(g, _, _)| g.significance).sum::<f64>() / f.len() as f64;
            explained >= STANDS_OUT * per_bin && significance >= STANDS_OUT
        })
        .collect();
    let mut index = 0;
    found.retain(|_| {
        index += 1;
        keep[index - 1]
    });
    let mut index = 0;
    fits.retain(|_| {
        index += 1;
        keep[index - 1]
    });
    let bands: Vec<(usize, usize)> = bands.iter().zip(&keep).filter(|(_, k)| **k).map(|(b, _)| *b).collect();
    let fitted_taps =
        segments.iter().zip(&chosen).filter(|(s, t)| s.len() >= fit_start(s, t, &env, rate) + 64).count();
    let mean_fit_s = if fitted_taps > 0 { fitted_length / fitted_taps as f64 / rate } else { 0.0 };

    let mut measured: Vec<MeasuredPeak> = found
        .iter()
        .enumerate()
        .map(|(i, p)| peak_report(p, &fits[i], &rect, bands[i], lo_b, bin_hz, rate, mean_fit_s))
        .collect();
    let modes = match &options.predicted {
        Some(predicted) => matching::pair(&mut measured, predicted, range_hz),
        None => Vec::new(),
    };
    let consistency = consistency(&per_tap, &db, &floor);
    let (hz, sdb, sfl) = spectrum::decimate(&db, &floor, lo_b, bin_hz, options.spectrum_points);
    let tap_reports: Vec<TapReport> = plan
        .taps
        .iter()
        .zip(&used)
        .enumerate()
        .map(|(k, (t, &u))| TapReport {
            time_s: t.onset as f64 / rate,
            level_db: t.level_db,
            kept_s: (t.end - t.onset) as f64 / rate,
            used: u,
            // A tap's `cut_short` says the next one struck while it still rang: the note goes
            // on the tap that struck, as the warning counts it.
            note: if let Some(d) = t.double_hit {
                Some(format!(
                    "double hit: a second impact {} ms after the first",
                    number((d * 1000.0).round())
                ))
            } else if k > 0 && plan.taps[k - 1].cut_short {
                Some("struck while the part still rang from the tap before".to_string())
            } else {
                None
            },
        })
        .collect();
    let context = warnings::Context {
        rate_hz: rate,
        source: options.source,
        flat_tops: env.flat_tops,
        full_scale_hits: hits,
        taps: &plan.taps,
        used: &used,
        left_out: plan.left_out + dropped,
        peaks: &found,
        bands: &bands,
        notes: &notes,
    };
    let warnings = warnings::collect(&context, &measured);
    let report = BenchReport {
        sample_rate_hz: rate,
        duration_s: duration,
        channels,
        channel: options.channel,
        source: options.source,
        range_hz,
        resolution_hz: bin_hz,
        taps: tap_reports,
        consistency,
        peaks: measured,
        modes,
        spectrum: SpectrumCurve { hz, db: sdb, floor_db: sfl },
        notes,
        warnings,
    };
    if report.is_finite() {
        Ok(report)
    } else {
        Err(Error::new(
            ErrorKind::NoConvergence,
            "the analysis produced a number that is not finite; this is a defect worth reporting",
        ))
    }
}

/// Where a tap's fitted ring-down starts in its kept segment: 1 ms (the impact's contact, common
/// practice, no source) after the first sample that reaches 30 % of the largest magnitude of the
/// tap's first moments (its rise block and 5 ms after). The tap's rise outweighs what rang
/// before it by 12 dB, so that sample belongs to the new tap.
fn fit_start(seg: &[f32], tap: &taps::Tap, env: &Envelope, rate: f64) -> usize {
    let early = (env.start_of(tap.onset_block + 1) + (0.005 * rate) as usize)
        .saturating_sub(tap.onset)
        .min(seg.len());
    let top = seg[..early].iter().fold(0.0f32, |a, v| a.max(v.abs()));
    let first = seg[..early].iter().position(|v| v.abs() >= 0.3 * top).unwrap_or(0);
    first + (0.001 * rate).round() as usize
}

/// One peak's report from its spectral estimate, its fits and the half-power cross-check.
#[allow(clippy::too_many_arguments)]
fn peak_report(
    p: &peaks::Peak,
    fits: &Fits,
    rect: &[f64],
    band: (usize, usize),
    lo_b: usize,
    bin_hz: f64,
    rate: f64,
    fit_s: f64,
) -> MeasuredPeak {
    let spectral_hz = (lo_b as f64 + p.position) * bin_hz;
    let total: f64 = fits.iter().map(|f| f.1).sum();
    let mean = |g: &dyn Fn(&fit::Fit) -> f64| fits.iter().map(|(f, w, _)| g(f) * w).sum::<f64>() / total;
    let fitted = !fits.is_empty() && total > 0.0 && total.is_finite();
    let (frequency_hz, damping_fit, quality, spread) = if fitted {
        let f = mean(&|f| f.omega * rate / (2.0 * std::f64::consts::PI));
        let spread = (fits.len() >= 2).then(|| {
            let var = mean(&|g| (g.omega * rate / (2.0 * std::f64::consts::PI) - f).powi(2));
            var.max(0.0).sqrt() / f * 100.0
        });
        (f, Some(mean(&|f| f.damping())), mean(&|f| f.quality), spread)
    } else {
        (spectral_hz, None, 0.0, None)
    };
    let kc = lo_b + p.bin;
    let (mut hp, mut note) = (None, None);
    match damping::half_power_bins(rect, kc, band.0, band.1) {
        Some((l, r, top)) => {
            hp = damping::half_power(l * bin_hz, r * bin_hz, top * bin_hz);
            let zeta = damping_fit.or(hp).unwrap_or(0.0);
            let decays = fit_s * zeta * 2.0 * std::f64::consts::PI * frequency_hz;
            let apart = match (damping_fit, hp) {
                (Some(a), Some(b)) => (a / b).max(b / a),
                _ => 1.0,
            };
            if apart > 2.0 {
                note = Some(format!(
                    "the half-power reading is {} times the fit's the other way: noise or a neighbour upsets it; trust the fit",
                    number((apart * 10.0).round() / 10.0)
                ));
            } else if decays < damping::SHORT_RECORD_DECAYS {
                note = Some(format!(
                    "the ring-down kept is {} decay times long (under {}): the half-power bandwidth over-reads the damping",
                    number((decays * 10.0).round() / 10.0),
                    damping::SHORT_RECORD_DECAYS
                ));
            }
        }
        None => note = Some(
            "the peak does not fall to half power before its band ends (a neighbouring peak or the range)"
                .to_string(),
        ),
    }
    let zeta = damping_fit.or(hp).unwrap_or(0.0).clamp(0.0, 0.99);
    MeasuredPeak {
        frequency_hz,
        spectral_hz,
        undamped_hz: frequency_hz / (1.0 - zeta * zeta).sqrt(),
        damping_fit,
        damping_half_power: hp,
        half_power_note: note,
        quality,
        over_floor_db: p.over_floor_db,
        prominence_db: p.prominence_db,
        tap_spread_percent: spread,
        taps_fitted: fits.len(),
        mode: None,
        predicted_hz: None,
        difference_percent: None,
    }
}

/// The mean correlation of each tap's spectrum (dB) with the average's, over the points where
/// the average stands 10 dB over the floor; `None` with fewer than two taps or such points.
fn consistency(per_tap: &[Vec<f64>], db: &[f64], floor: &[f64]) -> Option<f64> {
    if per_tap.len() < 2 {
        return None;
    }
    let (_, avg, fl) = spectrum::decimate(db, floor, 0, 1.0, CONSISTENCY_POINTS);
    let keep: Vec<usize> = (0..avg.len()).filter(|&i| avg[i] > fl[i] + 10.0).collect();
    if keep.len() < 4 {
        return None;
    }
    let corr = |a: &[f64]| -> f64 {
        let n = keep.len() as f64;
        let ma = keep.iter().map(|&i| a[i]).sum::<f64>() / n;
        let mb = keep.iter().map(|&i| avg[i]).sum::<f64>() / n;
        let (mut sab, mut saa, mut sbb) = (0.0, 0.0, 0.0);
        for &i in &keep {
            let (x, y) = (a[i] - ma, avg[i] - mb);
            sab += x * y;
            saa += x * x;
            sbb += y * y;
        }
        if saa > 0.0 && sbb > 0.0 {
            (sab / (saa * sbb).sqrt()).clamp(-1.0, 1.0)
        } else {
            1.0
        }
    };
    let c =
        per_tap.iter().filter(|t| t.len() == avg.len()).map(|t| corr(t)).sum::<f64>() / per_tap.len() as f64;
    Some(c.max(0.0))
}
