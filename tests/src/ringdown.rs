//! Synthetic tap-test records with known answers: the ring-downs of a few modes after each of a
//! few taps, each tap opening with a short broadband click, in Gaussian noise; and a small WAV
//! writer of its own (16-bit PCM or 32-bit float), independent of the reader under test.

use crate::random::Rng;

/// One mode of a synthetic record.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Mode {
    /// Undamped natural frequency, Hz.
    pub hz: f64,
    /// Damping ratio.
    pub zeta: f64,
    /// Amplitude of its ring-down at the tap (before the tap's own gain).
    pub amplitude: f64,
    /// Phase at the tap, rad.
    pub phase: f64,
}

impl Mode {
    /// The damped natural frequency f·√(1 − ζ²), Hz: what the record rings at.
    pub fn damped_hz(&self) -> f64 {
        self.hz * (1.0 - self.zeta * self.zeta).sqrt()
    }
    /// Decay rate σ = ζω, 1/s.
    pub fn sigma(&self) -> f64 {
        self.zeta * 2.0 * std::f64::consts::PI * self.hz
    }
}

/// A synthetic record and what went into it.
#[derive(Clone, Debug)]
pub struct Record {
    /// Samples per second.
    pub rate_hz: f64,
    /// The samples.
    pub samples: Vec<f32>,
    /// Its modes.
    pub modes: Vec<Mode>,
    /// Tap times, s, and their gains.
    pub taps: Vec<(f64, f64)>,
    /// Noise standard deviation.
    pub noise: f64,
}

/// A standard normal deviate (Box–Muller).
pub fn gaussian(rng: &mut Rng) -> f64 {
    (-2.0 * rng.unit().max(1e-300).ln()).sqrt() * (2.0 * std::f64::consts::PI * rng.unit()).cos()
}

/// The record of `modes` struck at each of `taps` (time s, gain), `seconds` long at `rate_hz`,
/// in Gaussian noise of standard deviation `noise`; each tap opens with a 0.3 ms click of half
/// the largest mode amplitude (times its gain) when `click`.
pub fn record(
    rng: &mut Rng,
    rate_hz: f64,
    seconds: f64,
    modes: &[Mode],
    taps: &[(f64, f64)],
    noise: f64,
    click: bool,
) -> Record {
    let n = (seconds * rate_hz).round() as usize;
    let mut x = vec![0.0f64; n];
    let top = modes.iter().map(|m| m.amplitude).fold(0.0, f64::max);
    for &(t0, gain) in taps {
        let start = (t0 * rate_hz).ceil() as usize;
        for m in modes {
            let (s, w) = (m.sigma(), 2.0 * std::f64::consts::PI * m.damped_hz());
            for (i, v) in x.iter_mut().enumerate().skip(start) {
                let t = i as f64 / rate_hz - t0;
                let e = (-s * t).exp();
                if e < 1e-9 {
                    break;
                }
                *v += gain * m.amplitude * e * (w * t + m.phase).cos();
            }
        }
        if click {
            let len = ((0.0003 * rate_hz).round() as usize).max(2);
            for j in 0..len.min(n.saturating_sub(start)) {
                let hann = 0.5 - 0.5 * (2.0 * std::f64::consts::PI * (j as f64 + 0.5) / len as f64).cos();
                x[start + j] += 0.5 * top * gain * hann * gaussian(rng);
            }
        }
    }
    let samples = x.iter().map(|v| (v + noise * gaussian(rng)) as f32).collect();
    Record { rate_hz, samples, modes: modes.to_vec(), taps: taps.to_vec(), noise }
}

/// What a random case may hold.
#[derive(Clone, Copy, Debug)]
pub struct Limits {
    /// Modes, at most.
    pub modes: usize,
    /// Taps asked for, at most (fewer when the record is too short for them to ring down).
    pub taps: usize,
    /// Damping ratios, log-uniform between.
    pub zeta: (f64, f64),
    /// Signal-to-noise ratio, dB (the strongest mode's amplitude over the noise's standard
    /// deviation), uniform between.
    pub snr_db: (f64, f64),
    /// Record length, s, uniform between.
    pub seconds: (f64, f64),
}

/// A random record within `limits`: modes 25 % or more apart (more when heavily damped) between 150 Hz and 30 % of the
/// rate (44.1 or 48 kHz), amplitudes 0.3–1, random phases; the first tap after 0.1–0.2 s of
/// noise, later ones once the slowest mode has decayed 30 dB (at least 0.3 s apart), gains
/// 0.7–1.
pub fn random(rng: &mut Rng, limits: Limits) -> Record {
    let rate = *rng.pick(&[44_100.0, 48_000.0]);
    let count = 1 + rng.below(limits.modes);
    let mut modes: Vec<Mode> = Vec::new();
    while modes.len() < count {
        let hz = rng.log_range(150.0, 0.3 * rate);
        let zeta = rng.log_range(limits.zeta.0, limits.zeta.1);
        // Apart by 25 % and by eight times the sum of their damping ratios (some four half-power
        // bandwidths each): peaks that overlap more are another test's business.
        if modes.iter().all(|m| (m.hz / hz).ln().abs() > 1.25f64.ln().max(8.0 * (m.zeta + zeta))) {
            modes.push(Mode {
                hz,
                zeta,
                amplitude: rng.range(0.3, 1.0),
                phase: rng.range(-std::f64::consts::PI, std::f64::consts::PI),
            });
        }
    }
    modes.sort_by(|a, b| a.hz.total_cmp(&b.hz));
    let seconds = rng.range(limits.seconds.0, limits.seconds.1);
    let slowest = modes.iter().map(Mode::sigma).fold(f64::INFINITY, f64::min);
    let spacing = (30.0 / 20.0 * 10f64.ln() / slowest).max(0.3);
    let first = rng.range(0.1, 0.2);
    let wanted = 1 + rng.below(limits.taps);
    let taps: Vec<(f64, f64)> = (0..wanted)
        .map(|i| (first + i as f64 * spacing, rng.range(0.7, 1.0)))
        .filter(|(t, _)| *t < seconds - 0.25)
        .collect();
    let snr = rng.range(limits.snr_db.0, limits.snr_db.1);
    let noise = 10f64.powf(-snr / 20.0) * modes.iter().map(|m| m.amplitude).fold(0.0, f64::max);
    record(rng, rate, seconds, &modes, &taps, noise, true)
}

/// A WAV file of `samples` (mono or interleaved `channels`) at `rate`: 16-bit PCM, or 32-bit
/// float when `float`.
pub fn wav(samples: &[f32], channels: u16, rate: u32, float: bool) -> Vec<u8> {
    let bytes_per = if float { 4 } else { 2 };
    let data_len = (samples.len() * bytes_per) as u32;
    let mut out = Vec::with_capacity(44 + data_len as usize);
    out.extend_from_slice(b"RIFF");
    out.extend_from_slice(&(36 + data_len).to_le_bytes());
    out.extend_from_slice(b"WAVEfmt ");
    out.extend_from_slice(&16u32.to_le_bytes());
    out.extend_from_slice(&(if float { 3u16 } else { 1u16 }).to_le_bytes());
    out.extend_from_slice(&channels.to_le_bytes());
    out.extend_from_slice(&rate.to_le_bytes());
    out.extend_from_slice(&(rate * channels as u32 * bytes_per as u32).to_le_bytes());
    out.extend_from_slice(&(channels * bytes_per as u16).to_le_bytes());
    out.extend_from_slice(&(8 * bytes_per as u16).to_le_bytes());
    out.extend_from_slice(b"data");
    out.extend_from_slice(&data_len.to_le_bytes());
    for &s in samples {
        if float {
            out.extend_from_slice(&s.to_le_bytes());
        } else {
            out.extend_from_slice(&((s.clamp(-1.0, 1.0) * 32767.0).round() as i16).to_le_bytes());
        }
    }
    out
}

/// A WAV file of integer PCM of `bits` (8, 16, 24 or 32) bits: 8-bit unsigned, the others
/// signed little-endian, as the format has it.
pub fn wav_int(samples: &[f32], channels: u16, rate: u32, bits: u16) -> Vec<u8> {
    let bytes_per = (bits / 8) as usize;
    let data_len = (samples.len() * bytes_per) as u32;
    let mut out = Vec::with_capacity(44 + data_len as usize);
    out.extend_from_slice(b"RIFF");
    out.extend_from_slice(&(36 + data_len).to_le_bytes());
    out.extend_from_slice(b"WAVEfmt ");
    out.extend_from_slice(&16u32.to_le_bytes());
    out.extend_from_slice(&1u16.to_le_bytes());
    out.extend_from_slice(&channels.to_le_bytes());
    out.extend_from_slice(&rate.to_le_bytes());
    out.extend_from_slice(&(rate * channels as u32 * bytes_per as u32).to_le_bytes());
    out.extend_from_slice(&(channels * bytes_per as u16).to_le_bytes());
    out.extend_from_slice(&bits.to_le_bytes());
    out.extend_from_slice(b"data");
    out.extend_from_slice(&data_len.to_le_bytes());
    let full = (1i64 << (bits - 1)) - 1;
    for &s in samples {
        let v = (s.clamp(-1.0, 1.0) as f64 * full as f64).round() as i64;
        if bits == 8 {
            out.push((v + 128) as u8);
        } else {
            out.extend_from_slice(&v.to_le_bytes()[..bytes_per]);
        }
    }
    out
}
