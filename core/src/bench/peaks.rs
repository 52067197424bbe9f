//! Peaks of the averaged spectrum: local maxima that stand over the noise floor and over the
//! valleys that separate them from higher peaks, with their frequency interpolated between bins.
//!
//! The frequency is the vertex of the parabola through the three bins around the maximum in dB
//! (J. O. Smith, *Spectral Audio Signal Processing*, "Quadratic interpolation of spectral
//! peaks"): p = ½(α − γ)/(α − 2β + γ) bins. Its bias depends on the shape of the peak; for a
//! ring-down seen through this module's taper with twice zero padding it stays under 0.05 bin,
//! plus, for heavier damping, the pull of the negative frequency's image (of order ζ²/2 of the
//! frequency): the test below. It is only the starting point of the least-squares fit, whose
//! frequency is reported where it succeeds.

/// A peak stands this far over the noise floor, dB: the largest of some 10⁵ bins of noise
/// (exponentially distributed power) stands about 11 dB over its mean.
pub const OVER_FLOOR_DB: f64 = 15.0;
/// ... and this far over the lowest point between it and any higher peak, dB: more than the
/// ripple that noise makes on the smooth tails of the taps' own onsets. A candidate is then
/// kept only if its fitted ring-down also stands out of the noise (`analysis`).
pub const PROMINENCE_DB: f64 = 6.0;
/// At most this many peaks are reported, the highest over the floor.
pub const MAX_PEAKS: usize = 24;

/// A peak found in a spectrum of bins `0..`, in bin units.
#[derive(Clone, Debug, PartialEq)]
pub struct Peak {
    /// Bin of the local maximum.
    pub bin: usize,
    /// Interpolated position, bins.
    pub position: f64,
    /// Interpolated level, dB.
    pub level_db: f64,
    /// Level over the floor there, dB.
    pub over_floor_db: f64,
    /// Topographic prominence, dB.
    pub prominence_db: f64,
    /// Half the width at half power, bins (interpolated), searched no further than 4096 bins.
    pub half_width: f64,
}

/// Finds the peaks of `db` (dB per bin) over `floor_db` among bins `range`, ascending.
pub fn find(db: &[f64], floor_db: &[f64], range: std::ops::Range<usize>) -> Vec<Peak> {
    let (lo, hi) = (range.start.max(1), range.end.min(db.len().saturating_sub(1)));
    let mut peaks = Vec::new();
    for k in lo..hi {
        let (a, b, c) = (db[k - 1], db[k], db[k + 1]);
        if !(b > a && b >= c) {
            continue;
        }
        let over = b - floor_db[k];
        if over < OVER_FLOOR_DB {
            continue;
        }
        let prominence = prominence(db, k, lo.saturating_sub(1), hi + 1);
        if prominence < PROMINENCE_DB {
            continue;
        }
        let denom = a - 2.0 * b + c;
        let p = if denom < 0.0 { (0.5 * (a - c) / denom).clamp(-0.5, 0.5) } else { 0.0 };
        let level = b - 0.25 * (a - c) * p;
        peaks.push(Peak {
            bin: k,
            position: k as f64 + p,
            level_db: level,
            over_floor_db: level - floor_db[k],
            prominence_db: prominence,
            half_width: half_width(db, k, level),
        });
    }
    if peaks.len() > MAX_PEAKS {
        peaks.sort_by(|x, y| y.over_floor_db.total_cmp(&x.over_floor_db));
        peaks.truncate(MAX_PEAKS);
        peaks.sort_by(|x, y| x.position.total_cmp(&y.position));
    }
    peaks
}

/// How far the prominence's search walks each way, bins.
const REACH: usize = 8192;

/// The height of bin `k` over the higher of the two lowest points between it and the nearest
/// higher bin on each side (or the ends `lo..hi`, or [`REACH`] bins away).
///
/// Both sides are walked a bin at a time together. Once one side has ended and lies less than
/// [`PROMINENCE_DB`] under the top, the prominence cannot reach it whatever the other side holds,
/// and that side's bound is returned as it stands (under the threshold, as the exact value would
/// be): a ripple on a strong peak's skirt ends at once toward the peak, where the walk away from
/// it would have gone on for thousands of bins (most of this module's time before).
fn prominence(db: &[f64], k: usize, lo: usize, hi: usize) -> f64 {
    let (lo, hi) = (lo.max(k.saturating_sub(REACH)), hi.min(k + REACH));
    let top = db[k];
    let (mut left, mut right) = (top, top);
    let (mut i, mut j) = (k, k);
    let (mut left_open, mut right_open) = (true, true);
    while left_open || right_open {
        if left_open {
            if i > lo && db[i - 1] <= top {
                i -= 1;
                left = left.min(db[i]);
            } else {
                left_open = false;
                if top - left < PROMINENCE_DB {
                    return top - left;
                }
            }
        }
        if right_open {
            if j + 1 < hi && db[j + 1] <= top {
                j += 1;
                right = right.min(db[j]);
            } else {
                right_open = false;
                if top - right < PROMINENCE_DB {
                    return top - right;
                }
            }
        }
    }
    top - left.max(right)
}

/// Half the width at half power (3 dB under `level`), bins, interpolated linearly in dB on each
/// side; a side that does not fall 3 dB within 4096 bins counts as 4096.
fn half_width(db: &[f64], k: usize, level: f64) -> f64 {
    let target = level - 10.0 * 2f64.log10();
    let side = |step: isize| -> f64 {
        let mut i = k as isize;
        for _ in 0..4096 {
            let j = i + step;
            if j < 0 || j as usize >= db.len() {
                break;
            }
            if db[j as usize] < target {
                let (a, b) = (db[i as usize], db[j as usize]);
                let frac = if a > b { (a - target) / (a - b) } else { 0.5 };
                return ((i - k as isize).abs() as f64) + frac;
            }
            i = j;
        }
        4096.0
    };
    0.5 * (side(-1) + side(1))
}

#[cfg(test)]
mod tests {
    use super::super::spectrum::{falling_window, fft_length, power, Transformer};
    use super::*;

    /// The definition walked plainly, each side to its end: the check of the walk that stops
    /// early.
    fn plain_prominence(db: &[f64], k: usize, lo: usize, hi: usize) -> f64 {
        let (lo, hi) = (lo.max(k.saturating_sub(super::REACH)), hi.min(k + super::REACH));
        let top = db[k];
        let left = db[lo..k].iter().rev().take_while(|v| **v <= top).fold(top, |a, v| a.min(*v));
        let right = db[k + 1..hi].iter().take_while(|v| **v <= top).fold(top, |a, v| a.min(*v));
        top - left.max(right)
    }

    #[test]
    fn the_early_stop_decides_and_measures_as_the_plain_walk() {
        // A strong peak on noise, whose skirt carries many small local maxima.
        let mut rng = modebench_tests::random::Rng::new(5);
        let db: Vec<f64> = (0..20_000)
            .map(|i| {
                let x = (i as f64 - 7000.0) / 40.0;
                10.0 * (1.0 / (1.0 + x * x) + 1e-6).log10() + 3.0 * rng.unit()
            })
            .collect();
        let mut kept = 0;
        for k in 1..db.len() - 1 {
            if !(db[k] > db[k - 1] && db[k] >= db[k + 1]) {
                continue;
            }
            let (fast, plain) =
                (super::prominence(&db, k, 0, db.len()), plain_prominence(&db, k, 0, db.len()));
            assert_eq!(
                fast >= super::PROMINENCE_DB,
                plain >= super::PROMINENCE_DB,
                "bin {k}: {fast} vs {plain}"
            );
            if plain >= super::PROMINENCE_DB {
                assert_eq!(fast, plain, "bin {k}");
                kept += 1;
            }
        }
        assert!(kept >= 1, "the peak itself stands out");
    }

    #[test]
    fn quadratic_interpolation_bias_stays_under_five_hundredths_of_a_bin() {
        // Ring-downs of several damping ratios at offsets across a bin: the interpolated peak
        // lies within 0.05 bin of the frequency (the damped one) of the ring-down.
        let n = 8192;
        let m = fft_length(n);
        let mut t = Transformer::new(m);
        let w = falling_window(n);
        for zeta in [0.0005, 0.002, 0.01, 0.05] {
            for offset in [0.0, 0.13, 0.29, 0.5, 0.71] {
                let bin = 700.0 + offset;
                let omega = 2.0 * std::f64::consts::PI * bin / m as f64;
                let sigma = zeta * omega;
                let x: Vec<f32> = (0..n)
                    .map(|i| ((-sigma * i as f64).exp() * (omega * i as f64 + 0.4).cos()) as f32)
                    .collect();
                let db: Vec<f64> =
                    t.forward(&x, Some(&w)).iter().map(|c| 10.0 * power(c).max(1e-300).log10()).collect();
                let floor = vec![-300.0; db.len()];
                let peaks = find(&db, &floor, 10..db.len() - 10);
                let p = peaks.iter().max_by(|a, b| a.level_db.total_cmp(&b.level_db)).unwrap();
                let damped = bin * (1.0 - zeta * zeta).sqrt();
                let tolerance = 0.05 + zeta * zeta * bin;
                assert!(
                    (p.position - damped).abs() < tolerance,
                    "ζ {zeta}, offset {offset}: {} vs {damped}",
                    p.position
                );
            }
        }
    }
}
