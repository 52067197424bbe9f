//! The frequency map: on one logarithmic frequency axis, every order of every excitation as a
//! line (a single speed) or a band (a speed range) inside the zone its margin forbids, and every
//! elastic mode as a mark with its tolerance band and, when measured, the measured value. A mode
//! that lies in a forbidden zone is drawn in the warning colour, so a collision shows at a
//! glance, on screen and on the printed sheet.

use super::escape::escape;
use super::number::{hz, sig};
use super::symbols::INK;
use modebench::Report;

const WIDTH: f64 = 720.0;
const LEFT: f64 = 150.0;
const RIGHT: f64 = 700.0;
const TOP: f64 = 34.0;
const ROW: f64 = 22.0;
/// The colour of a mode that clears every margin, and of one that does not.
const CLEAR: &str = "#2d6a8f";
const CLOSE: &str = "#b3261e";
/// Drives and the zones their margins forbid.
const DRIVE: &str = "#7a5a00";
const ZONE: &str = "#f4e2b8";

fn n(v: f64) -> String {
    if v.is_finite() {
        format!("{v:.1}")
    } else {
        "0".to_string()
    }
}

/// The frequencies the map must show: every mode with its band and measurement, every drive with
/// its zone; `None` when there is nothing positive to draw.
fn span(report: &Report) -> Option<(f64, f64)> {
    let d = &report.design;
    let values = report
        .modes
        .iter()
        .filter(|m| !m.rigid_body)
        .map(|m| m.frequency_hz)
        .chain(d.bands.iter().flat_map(|b| [b.low_hz, b.high_hz]))
        .chain(d.measured.iter().map(|m| m.measured_hz))
        .chain(d.drives.iter().flat_map(|z| [z.forbidden_low_hz, z.forbidden_high_hz]))
        .filter(|v| v.is_finite() && *v > 0.0);
    let (low, high) = values.fold((f64::INFINITY, 0.0f64), |(a, b), v| (a.min(v), b.max(v)));
    (low.is_finite() && high > 0.0).then(|| (low / 1.25, high * 1.25))
}

/// Ticks at 1, 2 and 5 times the powers of ten within the span.
fn ticks(low: f64, high: f64) -> Vec<f64> {
    let mut out = Vec::new();
    let mut decade = 10f64.powf(low.log10().floor());
    while decade <= high && out.len() < 40 {
        for m in [1.0, 2.0, 5.0] {
            let t = decade * m;
            if t >= low && t <= high {
                out.push(t);
            }
        }
        decade *= 10.0;
    }
    out
}

/// The frequency map as SVG, or nothing when the report has no elastic mode to place.
pub(crate) fn map_svg(report: &Report) -> String {
    let d = &report.design;
    let Some((low, high)) = span(report) else { return String::new() };
    let elastic: Vec<_> = report.modes.iter().filter(|m| !m.rigid_body).collect();
    if elastic.is_empty() {
        return String::new();
    }
    let (l0, l1) = (low.log10(), high.log10());
    let x = |f: f64| LEFT + (RIGHT - LEFT) * ((f.max(low).log10() - l0) / (l1 - l0).max(1e-9));
    let rows = d.drives.len() + elastic.len();
    let bottom = TOP + ROW * rows as f64 + 8.0;
    let height = bottom + 34.0;
    let label =
        "Frequency map: modes with their bands and measurements against the excitations and the zones their \
                 margins forbid";
    let mut out = format!(
        "<svg class=\"mb-map\" viewBox=\"0 0 {WIDTH} {}\" role=\"img\" aria-label=\"{label}\" \
         font-family=\"system-ui, sans-serif\" font-size=\"12\"><title>{label}</title>\
         <text x=\"{LEFT}\" y=\"18\" font-size=\"14\" font-weight=\"700\" fill=\"{INK}\">Frequency map (log scale)</text>",
        n(height)
    );
    // The forbidden zones run down through every mode's row, so a mode inside one sits on it.
    for z in &d.drives {
        let (a, b) = (x(z.forbidden_low_hz), x(z.forbidden_high_hz));
        out.push_str(&format!(
            "<rect class=\"mb-map-zone\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{ZONE}\" opacity=\"0.55\"/>",
            n(a),
            n(TOP - 4.0),
            n((b - a).max(1.0)),
            n(bottom - TOP + 4.0)
        ));
    }
    for t in ticks(low, high) {
        out.push_str(&format!(
            "<line x1=\"{0}\" x2=\"{0}\" y1=\"{1}\" y2=\"{2}\" stroke=\"#c9d3da\" stroke-width=\"1\"/>\
             <text x=\"{0}\" y=\"{3}\" text-anchor=\"middle\" fill=\"{INK}\">{4}</text>",
            n(x(t)),
            n(TOP - 4.0),
            n(bottom + 4.0),
            n(bottom + 18.0),
            sig(t, 3)
        ));
    }
    out.push_str(&format!(
        "<text x=\"{}\" y=\"{}\" text-anchor=\"end\" fill=\"{INK}\">Hz</text>",
        n(RIGHT),
        n(bottom + 32.0)
    ));
    let mut y = TOP;
    for z in &d.drives {
        let name = report
            .excitations
            .get(z.excitation)
            .map(|e| e.label.trim())
            .filter(|l| !l.is_empty())
            .map_or(format!("Excitation {}", z.excitation + 1), str::to_string);
        let name = if z.order == 1.0 { name } else { format!("{name} × {}", sig(z.order, 4)) };
        // The full name is in the title; the row's label is cut to fit left of the axis.
        let full = name.clone();
        let name = if name.chars().count() > 22 {
            format!("{}…", name.chars().take(21).collect::<String>().trim_end())
        } else {
            name
        };
        let (a, b) = (x(z.low_hz), x(z.high_hz));
        let driven = if z.high_hz > z.low_hz {
            format!("{} to {}", hz(z.low_hz), hz(z.high_hz))
        } else {
            hz(z.low_hz)
        };
        out.push_str(&format!(
            "<g class=\"mb-map-drive\"><title>{8}: {driven}; the margin keeps modes out of {1} to {2}</title>\
             <text x=\"{3}\" y=\"{4}\" text-anchor=\"end\" fill=\"{DRIVE}\">{0}</text>\
             <rect x=\"{5}\" y=\"{6}\" width=\"{7}\" height=\"10\" fill=\"{DRIVE}\"/></g>",
            escape(&name),
            hz(z.forbidden_low_hz),
            hz(z.forbidden_high_hz),
            n(LEFT - 8.0),
            n(y + 13.0),
            n(a - 1.0),
            n(y + 5.0),
            n((b - a).max(2.0)),
            escape(&full)
        ));
        y += ROW;
    }
    for m in elastic {
        let close = m.nearest_excitation.as_ref().is_some_and(|s| s.too_close);
        let colour = if close { CLOSE } else { CLEAR };
        let mid = y + 11.0;
        let mut title = format!("Mode {}: {}", m.number, hz(m.frequency_hz));
        let mut marks = String::new();
        if let Some(b) = d.bands.iter().find(|b| b.mode == m.number) {
            title.push_str(&format!(", band {} to {}", hz(b.low_hz), hz(b.high_hz)));
            marks.push_str(&format!(
                "<rect class=\"mb-map-band\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"6\" rx=\"3\" fill=\"{colour}\" \
                 opacity=\"0.35\"/>",
                n(x(b.low_hz)),
                n(mid - 3.0),
                n((x(b.high_hz) - x(b.low_hz)).max(1.0))
            ));
        }
        marks.push_str(&format!(
            "<circle class=\"mb-map-mode{}\" cx=\"{}\" cy=\"{}\" r=\"5\" fill=\"{colour}\"/>",
            if close { " mb-map-close" } else { "" },
            n(x(m.frequency_hz)),
            n(mid)
        ));
        if let Some(meas) = d.measured.iter().find(|e| e.mode == m.number) {
            title.push_str(&format!(", measured {}", hz(meas.measured_hz)));
            let c = x(meas.measured_hz);
            marks.push_str(&format!(
                "<path class=\"mb-map-measured\" d=\"M{} {}l10 10m0 -10l-10 10\" stroke=\"{INK}\" stroke-width=\"2\"/>",
                n(c - 5.0),
                n(mid - 5.0)
            ));
        }
        if close {
            title.push_str(" — too close to an excitation");
        }
        out.push_str(&format!(
            "<g class=\"mb-map-row\" data-map-mode=\"{}\"><title>{}</title><text x=\"{}\" y=\"{}\" text-anchor=\"end\" \
             fill=\"{colour}\" font-weight=\"600\">Mode {}</text>{marks}</g>",
            m.number,
            escape(&title),
            n(LEFT - 8.0),
            n(mid + 4.0),
            m.number
        ));
        y += ROW;
    }
    out.push_str("</svg>");
    out
}

/// The map with its key, as a section of the results.
pub(crate) fn map_section(report: &Report) -> String {
    let svg = map_svg(report);
    if svg.is_empty() || (report.design.drives.is_empty() && report.design.measured.is_empty()) {
        return String::new();
    }
    format!(
        "<section class=\"mb-map-area\"><h4 class=\"mb-results-title\">Frequency map</h4>{svg}<p class=\"mb-plot-key\">\
         Brown bars are the frequencies each excitation drives (a speed range is a wide bar); the shaded zone around \
         each is what the margin keeps modes out of. Dots are the modes, blue when clear and red when inside a zone; \
         pale bars are their tolerance bands; a cross is a measured frequency.</p></section>"
    )
}
