//! Finding the taps in a record's envelope: where the energy rises well over both the noise
//! floor and what was ringing just before, each with its ring-down's extent; a second impact's
//! click within 50 ms marks a double hit.
//!
//! The thresholds are common practice, no source, set on synthetic records (`tests/tests/bench`):
//! a tap rises 12 dB over the held level of what rang before it and 14 dB over the floor;
//! the floor is the 10th percentile of the blocks' mean squares, which a record ringing most
//! of the time still reads near its quiet stretches.

use super::envelope::Envelope;

/// A tap rises this far over what was ringing just before it, dB.
pub const RISE_DB: f64 = 12.0;
/// ... and this far over the noise floor, dB.
pub const TRIGGER_DB: f64 = 14.0;
/// A tap whose first moments stand less than this over the floor is weak, dB.
pub const WEAK_DB: f64 = 30.0;
/// A second impact this soon after a tap is a double hit, s.
pub const DOUBLE_HIT_S: f64 = 0.05;
/// A second impact's click rises this far over the moments just before it, dB.
const CLICK_DB: f64 = 10.0;
/// At most this many taps are analysed.
pub const MAX_TAPS: usize = 64;

/// One tap: where it struck and how far its ring-down is kept, in samples.
#[derive(Clone, Debug, PartialEq)]
pub struct Tap {
    /// The block where the rise was seen; the ring started in it or just before.
    pub onset_block: usize,
    /// First sample of the ring-down.
    pub onset: usize,
    /// One past its last sample.
    pub end: usize,
    /// The first moments' energy over the floor, dB.
    pub level_db: f64,
    /// Seconds after the onset of a second impact, when one came within [`DOUBLE_HIT_S`].
    pub double_hit: Option<f64>,
    /// Whether the next tap came while this one still rang 20 dB over the floor.
    pub cut_short: bool,
}

/// The taps, the noise floor and the quietest stretch of a record.
#[derive(Clone, Debug)]
pub struct Plan {
    /// Taps in time order.
    pub taps: Vec<Tap>,
    /// Taps beyond [`MAX_TAPS`] left out.
    pub left_out: usize,
    /// Mean square of the noise floor (per sample).
    pub floor: f64,
    /// The loudest block over the floor, dB.
    pub loudest_db: f64,
    /// The quietest stretch: first sample and length.
    pub quiet: (usize, usize),
}

/// How the detector scales with the lowest frequency searched.
#[derive(Clone, Copy, Debug)]
pub struct Timing {
    /// Samples per second.
    pub rate_hz: f64,
    /// The lowest frequency searched, Hz.
    pub low_hz: f64,
}

/// Finds the taps. `max_segment` caps each ring-down's length in samples.
pub fn detect(env: &Envelope, timing: Timing, max_segment: usize) -> Plan {
    let n = env.energy.len();
    let block_s = env.block as f64 / timing.rate_hz;
    let blocks = |s: f64| ((s / block_s).ceil() as usize).max(1);
    // A ring at the lowest frequency reaches its first crest within a quarter period, and its
    // block energies dip to zero every half period: the detector waits and holds that long.
    let refractory = blocks((0.25 / timing.low_hz).max(0.01));
    let hold = blocks((1.0 / timing.low_hz).max(0.05));
    let half_period = blocks((0.5 / timing.low_hz).max(0.01));
    let floor = percentile(&env.energy, 0.10).max(env.peak as f64 * env.peak as f64 * 1e-14).max(1e-30);
    let burst_floor = percentile(&env.burst, 0.10).max(1e-30);
    let loudest = env.energy.iter().cloned().fold(0.0f32, f32::max) as f64;
    let rise = db_ratio(RISE_DB);
    let trigger = floor * db_ratio(TRIGGER_DB);
    // Held level: the largest recent energy, released by 20 dB over `hold` blocks.
    let release = db_ratio(-20.0 / hold as f64);
    let mut held = 0.0f64;
    let mut onsets: Vec<usize> = Vec::new();
    let mut next_allowed = 0;
    for k in 0..n {
        let e = env.energy[k] as f64;
        if k >= next_allowed && e >= trigger && e >= rise * held {
            onsets.push(k);
            next_allowed = k + refractory;
        }
        held = (held * release).max(e);
    }
    let pre = 1usize;
    let mut taps: Vec<Tap> = Vec::new();
    for (i, &k) in onsets.iter().enumerate() {
        // A rise within the double-hit window of the last tap is that tap's second impact.
        if let Some(last) = taps.last_mut() {
            if (k - last.onset_block) as f64 * block_s < DOUBLE_HIT_S {
                last.double_hit.get_or_insert((k - last.onset_block) as f64 * block_s);
                continue;
            }
        }
        let next = onsets.get(i + 1).copied().unwrap_or(n);
        let first = env.energy[k..(k + refractory).min(n)].iter().cloned().fold(0.0f32, f32::max) as f64;
        // The ring ends where the energy has stayed under 6 dB over the floor for half a period
        // of the lowest frequency, or where the next tap begins.
        let quiet_level = floor * db_ratio(6.0);
        let mut end_block = next.saturating_sub(pre).max(k + 1);
        let mut run = 0;
        for m in (k + refractory).min(n)..next.min(n) {
            if (env.energy[m] as f64) < quiet_level {
                run += 1;
                if run >= half_period {
                    end_block = m + 1;
                    break;
                }
            } else {
                run = 0;
            }
        }
        let still = env.energy[end_block.saturating_sub(half_period)..end_block.min(n)]
            .iter()
            .cloned()
            .fold(0.0f32, f32::max) as f64;
        let onset = env.start_of(k.saturating_sub(pre));
        let end = env.start_of(end_block).min(env.samples).min(onset + max_segment);
        taps.push(Tap {
            onset_block: k,
            onset,
            end,
            level_db: 10.0 * (first / floor).log10(),
            double_hit: click_after(env, k, block_s, burst_floor),
            cut_short: end_block == next.saturating_sub(pre) && next < n && still > floor * db_ratio(20.0),
        });
    }
    let left_out = taps.len().saturating_sub(MAX_TAPS);
    taps.truncate(MAX_TAPS);
    Plan {
        taps,
        left_out,
        floor,
        loudest_db: 10.0 * (loudest / floor).max(1e-300).log10(),
        quiet: quietest(env, timing),
    }
}

/// The time after the onset at `k` of a second impact's click: the Teager–Kaiser energy rising
/// [`CLICK_DB`] over the 10 ms before it, from 3 ms after the onset to [`DOUBLE_HIT_S`].
fn click_after(env: &Envelope, k: usize, block_s: f64, burst_floor: f64) -> Option<f64> {
    let n = env.burst.len();
    let first = k + (0.003 / block_s).ceil() as usize;
    let last = (k + (DOUBLE_HIT_S / block_s).floor() as usize).min(n.saturating_sub(1));
    let back = ((0.010 / block_s).ceil() as usize).max(1);
    for m in first..=last {
        let lo = (m.saturating_sub(back)).max(k + 2);
        if lo >= m {
            continue;
        }
        let before = env.burst[lo..m].iter().cloned().fold(0.0f32, f32::max) as f64;
        let now = env.burst[m] as f64;
        if now >= db_ratio(CLICK_DB) * before.max(burst_floor) && now >= burst_floor * db_ratio(TRIGGER_DB) {
            return Some((m - k) as f64 * block_s);
        }
    }
    None
}

/// The quietest stretch of the record, as long as an eighth of it but between 0.05 s (and
/// 256 samples) and 0.5 s: where the noise floor's spectrum is measured.
fn quietest(env: &Envelope, timing: Timing) -> (usize, usize) {
    let n = env.energy.len();
    let want = ((env.samples as f64 / 8.0).clamp(0.05 * timing.rate_hz, 0.5 * timing.rate_hz) as usize)
        .max(256)
        .min(env.samples);
    let w = (want / env.block).clamp(1, n.max(1));
    if n == 0 {
        return (0, env.samples);
    }
    let mut sum: f64 = env.energy[..w].iter().map(|&e| e as f64).sum();
    let (mut best, mut at) = (sum, 0);
    for k in w..n {
        sum += env.energy[k] as f64 - env.energy[k - w] as f64;
        if sum < best {
            best = sum;
            at = k + 1 - w;
        }
    }
    let start = env.start_of(at).min(env.samples.saturating_sub(want));
    (start, want)
}

/// The `q`-quantile of `values` (0 when empty).
fn percentile(values: &[f32], q: f64) -> f64 {
    if values.is_empty() {
        return 0.0;
    }
    let mut v = values.to_vec();
    let i = ((v.len() - 1) as f64 * q) as usize;
    v.select_nth_unstable_by(i, f32::total_cmp);
    v[i] as f64
}

/// The power ratio of `db` decibels.
pub(crate) fn db_ratio(db: f64) -> f64 {
    10f64.powf(db / 10.0)
}
