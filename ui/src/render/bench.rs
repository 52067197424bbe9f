//! The tap-test panel's results as HTML: what was recorded, the spectrum (our own SVG: level in
//! dB over a logarithmic frequency axis, the noise floor beneath it, the predicted modes marked
//! on the same axis, the measured peaks circled), the table of peaks, the predicted modes that
//! found no peak and why, and the core's warnings and notes in words. Only presentation: every
//! number comes from the core's report.

use super::escape;
use modebench::bench::{shown_hz, BenchReport};
use modebench::units::significant;
use std::fmt::Write;

/// The plot's size in SVG units, and its margins for the axes' labels.
const WIDTH: f64 = 640.0;
const HEIGHT: f64 = 260.0;
const LEFT: f64 = 48.0;
const RIGHT: f64 = 12.0;
const TOP: f64 = 22.0;
const BOTTOM: f64 = 34.0;
/// The level axis spans at most this many dB below the highest point.
const SPAN_DB: f64 = 90.0;

/// Everything the panel shows after an analysis. `matched_at` says where the tap and the sensor
/// were taken to be when a prediction was at hand (`None` without one, so that an empty match
/// says why).
pub fn results_html(report: &BenchReport, matched_at: Option<&str>) -> String {
    let mut html = String::new();
    let used = report.taps.iter().filter(|t| t.used).count();
    let _ = write!(
        html,
        "<p class=\"mb-bench-summary\">{} tap{} found, {used} used; {} Hz sampling, {} s recorded; \
         peaks searched from {} to {} Hz at {} Hz resolution{}.</p>",
        report.taps.len(),
        if report.taps.len() == 1 { "" } else { "s" },
        significant(report.sample_rate_hz, 6),
        significant(report.duration_s, 3),
        significant(report.range_hz[0], 3),
        significant(report.range_hz[1], 4),
        significant(report.resolution_hz, 3),
        report.consistency.map_or(String::new(), |c| format!("; the taps agree to {}", significant(c, 2))),
    );
    html.push_str(&spectrum_svg(report));
    if let Some(words) = matched_at {
        let _ = write!(html, "<p class=\"mb-bench-where\">{}</p>", escape(words));
    }
    html.push_str(&peaks_table(report, matched_at.is_some()));
    html.push_str(&unmatched(report));
    html.push_str(&warnings(report));
    html
}

/// Where a frequency and a level fall on the plot.
struct Axes {
    lo: f64,
    hi: f64,
    top_db: f64,
    bottom_db: f64,
}

impl Axes {
    fn x(&self, hz: f64) -> f64 {
        let t = (hz.max(self.lo).ln() - self.lo.ln()) / (self.hi.ln() - self.lo.ln());
        LEFT + t.clamp(0.0, 1.0) * (WIDTH - LEFT - RIGHT)
    }
    fn y(&self, db: f64) -> f64 {
        let t = (self.top_db - db) / (self.top_db - self.bottom_db);
        TOP + t.clamp(0.0, 1.0) * (HEIGHT - TOP - BOTTOM)
    }
}

fn spectrum_svg(report: &BenchReport) -> String {
    let s = &report.spectrum;
    let lo = report.range_hz[0].max(s.hz.iter().copied().find(|h| *h > 0.0).unwrap_or(1.0)).max(1e-3);
    let hi = report.range_hz[1].max(lo * 1.01);
    let inside = |hz: f64| hz >= lo && hz <= hi;
    let levels = s.hz.iter().zip(s.db.iter().zip(&s.floor_db)).filter(|(h, _)| inside(**h));
    let (top, bottom) =
        levels.fold((f64::MIN, f64::MAX), |(t, b), (_, (d, f))| (t.max(*d), b.min(d.min(*f))));
    if top < bottom {
        return "<p class=\"mb-note\">The spectrum has no points in the range searched.</p>".to_string();
    }
    let top_db = (top / 10.0).ceil() * 10.0 + 5.0;
    let bottom_db = ((bottom / 10.0).floor() * 10.0).max(top_db - SPAN_DB);
    let axes = Axes { lo, hi, top_db, bottom_db };
    let line = |values: &[f64]| {
        let mut points = String::new();
        for (h, d) in s.hz.iter().zip(values).filter(|(h, _)| inside(**h)) {
            let _ = write!(points, "{:.1},{:.1} ", axes.x(*h), axes.y(*d));
        }
        points
    };
    let mut svg = format!(
        "<svg class=\"mb-bench-plot\" viewBox=\"0 0 {WIDTH} {HEIGHT}\" role=\"img\" aria-label=\"Spectrum of the \
         taps from {} to {} Hz: level in dB, the noise floor dashed, predicted modes as vertical lines, measured \
         peaks circled\">",
        significant(lo, 3),
        significant(hi, 4)
    );
    // The level's grid, every 10 dB (labelled every 20).
    let mut db = (bottom_db / 10.0).ceil() * 10.0;
    while db <= top_db {
        let y = axes.y(db);
        let _ = write!(
            svg,
            "<line class=\"mb-bench-grid\" x1=\"{LEFT}\" x2=\"{:.1}\" y1=\"{y:.1}\" y2=\"{y:.1}\"/>",
            WIDTH - RIGHT
        );
        if (db / 20.0).fract().abs() < 1e-9 {
            let _ = write!(
                svg,
                "<text class=\"mb-bench-tick\" x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"end\">{db}</text>",
                LEFT - 4.0,
                y + 4.0
            );
        }
        db += 10.0;
    }
    // The frequency's grid at 1, 2 and 5 of each decade.
    let mut decade = 10f64.powf(lo.log10().floor());
    while decade <= hi {
        for m in [1.0, 2.0, 5.0] {
            let hz = decade * m;
            if inside(hz) {
                let x = axes.x(hz);
                let _ = write!(
                    svg,
                    "<line class=\"mb-bench-grid\" x1=\"{x:.1}\" x2=\"{x:.1}\" y1=\"{TOP}\" y2=\"{:.1}\"/>\
                     <text class=\"mb-bench-tick\" x=\"{x:.1}\" y=\"{:.1}\" text-anchor=\"middle\">{}</text>",
                    HEIGHT - BOTTOM,
                    HEIGHT - BOTTOM + 14.0,
                    significant(hz, 3)
                );
            }
        }
        decade *= 10.0;
    }
    let _ = write!(
        svg,
        "<text class=\"mb-bench-axis\" x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"middle\">frequency, Hz (logarithmic)</text>\
         <text class=\"mb-bench-axis\" x=\"4\" y=\"12\">dB</text>",
        0.5 * (LEFT + WIDTH - RIGHT),
        HEIGHT - 4.0
    );
    for m in &report.modes {
        if inside(m.predicted_hz) {
            let x = axes.x(m.predicted_hz);
            let _ = write!(
                svg,
                "<line class=\"mb-bench-predicted\" x1=\"{x:.1}\" x2=\"{x:.1}\" y1=\"{TOP}\" y2=\"{:.1}\"/>\
                 <text class=\"mb-bench-mode\" x=\"{x:.1}\" y=\"{:.1}\" text-anchor=\"middle\">{}</text>",
                HEIGHT - BOTTOM,
                TOP - 6.0,
                m.mode
            );
        }
    }
    let _ = write!(
        svg,
        "<polyline class=\"mb-bench-floor\" points=\"{}\"/><polyline class=\"mb-bench-level\" points=\"{}\"/>",
        line(&s.floor_db),
        line(&s.db)
    );
    for (i, p) in report.peaks.iter().enumerate() {
        if !inside(p.frequency_hz) {
            continue;
        }
        let near =
            s.hz.iter()
                .zip(&s.db)
                .min_by(|a, b| (a.0 - p.spectral_hz).abs().total_cmp(&(b.0 - p.spectral_hz).abs()))
                .map_or(bottom_db, |(_, d)| *d);
        let _ = write!(
            svg,
            "<circle class=\"mb-bench-peak\" cx=\"{:.1}\" cy=\"{:.1}\" r=\"4\"><title>Peak {}: {} Hz</title></circle>",
            axes.x(p.frequency_hz),
            axes.y(near),
            i + 1,
            shown_hz(p.frequency_hz)
        );
    }
    svg.push_str("</svg>");
    svg
}

fn percent(ratio: Option<f64>) -> String {
    ratio.map_or("—".to_string(), |z| format!("{} %", significant(100.0 * z, 3)))
}

/// A difference already in percent, with a true minus sign and two decimals: "+0.42 %",
/// "−1.30 %", "0.00 %" (a hyphen would read as a dash in a table of figures).
fn signed_percent(d: f64) -> String {
    let text = format!("{:.2} %", d.abs());
    if text == "0.00 %" || !d.is_finite() {
        return if d.is_finite() { text } else { "—".to_string() };
    }
    if d > 0.0 {
        format!("+{text}")
    } else {
        format!("−{text}")
    }
}

/// The fit's quality on its 0–1 scale with two decimals, so that 0.996 reads "1.00" and is not
/// mistaken for a count, and a poor fit reads "0.43".
fn quality(q: f64) -> String {
    if q.is_finite() {
        format!("{q:.2}")
    } else {
        "—".to_string()
    }
}

fn peaks_table(report: &BenchReport, predicted: bool) -> String {
    if report.peaks.is_empty() {
        return "<p class=\"mb-bench-none\">No peak stands clear of the noise floor: tap harder, hold the tablet closer, \
                or record in a quieter place.</p>"
            .to_string();
    }
    let mut rows = String::new();
    for (i, p) in report.peaks.iter().enumerate() {
        let mode = match (p.mode, p.predicted_hz, p.difference_percent) {
            (Some(m), Some(hz), Some(d)) => {
                format!(
                    "<td>{m}</td><td>{}</td><td data-difference>{}</td>",
                    significant(hz, 5),
                    signed_percent(d)
                )
            }
            _ => "<td>—</td><td>—</td><td data-difference>—</td>".to_string(),
        };
        let half = match &p.half_power_note {
            Some(note) => {
                format!("<span title=\"{}\">{} *</span>", escape(note), percent(p.damping_half_power))
            }
            None => percent(p.damping_half_power),
        };
        let _ = write!(
            rows,
            "<tr data-peak=\"{}\"><td>{}</td><td data-hz=\"{}\">{}</td>{mode}<td>{}</td><td>{half}</td><td>{}</td><td>{}</td></tr>",
            i + 1,
            i + 1,
            p.frequency_hz,
            shown_hz(p.frequency_hz),
            percent(p.damping_fit),
            quality(p.quality),
            significant(p.over_floor_db, 3),
        );
    }
    let notes: Vec<String> = report
        .peaks
        .iter()
        .enumerate()
        .filter_map(|(i, p)| {
            p.half_power_note.as_ref().map(|n| format!("<li>Peak {}: {}</li>", i + 1, escape(n)))
        })
        .collect();
    let notes = if notes.is_empty() {
        String::new()
    } else {
        format!("<p class=\"mb-note\">* The half-power figure is less certain:</p><ul class=\"mb-bench-notes\">{}</ul>", notes.concat())
    };
    // What the comparison and "Use as measured" take: each matched peak's undamped frequency,
    // not the damped one listed.
    let undamped: Vec<String> = report
        .peaks
        .iter()
        .filter(|p| p.mode.is_some())
        .map(|p| format!("{} Hz", significant(p.undamped_hz, 5)))
        .collect();
    let lacking = if !predicted {
        "<p class=\"mb-note\">No predicted modes to match: the calculator has no results yet.</p>".to_string()
    } else if undamped.is_empty() {
        String::new()
    } else {
        format!(
            "<p class=\"mb-note\">The peaks are listed as they rang, damped. Each mode is compared with its \
             peak's undamped frequency, f/√(1 − ζ²) with ζ the fitted damping, which is what <b>Use as \
             measured</b> keeps: {}. Predicted − measured is a percentage of that measured frequency: \
             positive when the model is high.</p>",
            undamped.join(", ")
        )
    };
    format!(
        "<div class=\"mb-table-wrap\" tabindex=\"0\" role=\"region\" aria-label=\"Measured peaks\"><table class=\"mb-bench-peaks\"><caption>Measured peaks</caption><thead><tr>\
         <th scope=\"col\">Peak</th><th scope=\"col\">Frequency, Hz</th><th scope=\"col\">Mode</th>\
         <th scope=\"col\">Predicted, Hz</th><th scope=\"col\">Predicted − measured</th>\
         <th scope=\"col\">Damping (fit)</th><th scope=\"col\">Damping (half-power)</th>\
         <th scope=\"col\">Fit quality (0–1)</th><th scope=\"col\">Over floor, dB</th></tr></thead>\
         <tbody>{rows}</tbody></table></div>{lacking}{notes}"
    )
}

fn unmatched(report: &BenchReport) -> String {
    let items: Vec<String> = report
        .modes
        .iter()
        .filter(|m| m.peak.is_none())
        .map(|m| {
            let why = m.note.as_deref().unwrap_or("no peak near it");
            format!(
                "<li>Mode {} (predicted {} Hz): {}</li>",
                m.mode,
                significant(m.predicted_hz, 5),
                escape(why)
            )
        })
        .collect();
    if items.is_empty() {
        return String::new();
    }
    format!("<p class=\"mb-note\">Predicted modes without a measured peak:</p><ul class=\"mb-bench-notes\">{}</ul>", items.concat())
}

fn warnings(report: &BenchReport) -> String {
    let mut items: Vec<String> = report
        .warnings
        .iter()
        .map(|w| format!("<li data-warning=\"{}\">{}</li>", w.kind, escape(&w.message)))
        .collect();
    items.extend(report.notes.iter().map(|n| format!("<li data-note>{}</li>", escape(n))));
    items.extend(report.taps.iter().filter_map(|t| {
        t.note
            .as_ref()
            .map(|n| format!("<li data-note>Tap at {} s: {}</li>", significant(t.time_s, 3), escape(n)))
    }));
    if items.is_empty() {
        return String::new();
    }
    format!("<ul class=\"mb-bench-warnings\" aria-label=\"Warnings and notes\">{}</ul>", items.concat())
}

#[cfg(test)]
mod tests {
    use super::{quality, signed_percent};

    #[test]
    fn differences_carry_a_true_minus_and_two_decimals() {
        assert_eq!(signed_percent(0.4213), "+0.42 %");
        assert_eq!(signed_percent(-1.3), "−1.30 %");
        assert_eq!(signed_percent(-0.001), "0.00 %");
        assert_eq!(signed_percent(0.0), "0.00 %");
        assert_eq!(signed_percent(f64::NAN), "—");
    }

    #[test]
    fn quality_reads_on_its_scale() {
        assert_eq!(quality(0.996), "1.00");
        assert_eq!(quality(0.4321), "0.43");
        assert_eq!(quality(f64::INFINITY), "—");
    }
}
