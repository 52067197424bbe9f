//! Mode 1 between its bounds: Dunkerley's lower and Rayleigh's upper estimate drawn as a bar
//! with the exact value marked, and the equivalent single-degree-of-freedom system.

use super::number::{self, hz, quantity};
use super::symbols::INK;
use modebench::units::Kind;
use modebench::Report;

/// The mode 1 section, or nothing when there is no elastic mode 1.
pub(crate) fn fundamental(report: &Report) -> String {
    let Some(f) = report.fundamental else { return String::new() };
    let system = report.units;
    let mut out = String::from(
        "<section class=\"mb-fundamental\"><h4 class=\"mb-results-title\">First elastic mode by three methods</h4>",
    );
    out.push_str(&bar(f.dunkerley_hz, f.exact_hz, f.rayleigh_hz));
    out.push_str("<dl class=\"mb-bounds\">");
    let item = |term: &str, attribute: &str, value: Option<f64>| -> String {
        match value.and_then(|v| number::exact(v).map(|text| (v, text))) {
            Some((v, text)) => {
                let attr =
                    if attribute.is_empty() { String::new() } else { format!(" {attribute}=\"{text}\"") };
                format!("<div><dt>{term}</dt><dd{attr}>{}</dd></div>", hz(v))
            }
            None => format!("<div><dt>{term}</dt><dd>not available here</dd></div>"),
        }
    };
    out.push_str(&item("Lower bound (Dunkerley)", "data-dunkerley-hz", f.dunkerley_hz));
    out.push_str(&item("Exact", "", Some(f.exact_hz)));
    out.push_str(&item("Upper bound (Rayleigh, static deflection shape)", "data-rayleigh-hz", f.rayleigh_hz));
    out.push_str("</dl>");
    if let Some(e) = f.equivalent {
        out.push_str(&format!(
            "<p class=\"mb-equivalent\">Mode 1 as a single mass on a spring, seen at {}: mass {}, stiffness {}. \
             Together they give mode 1's frequency; the mass is a figure of the mode at that point, not the weight \
             the beam carries.</p>",
            quantity(e.position, Kind::Length, system),
            quantity(e.mass, Kind::Mass, system),
            quantity(e.stiffness, Kind::Stiffness, system)
        ));
        // A mass on a spring (it has both) moves against the beam in mode 1, and the point seen
        // then moves little for the energy the mode holds: the figure can far exceed every mass
        // on the beam, which reads as a mistake unless said.
        if report.beam.attachments.iter().any(|a| a.mass.is_some() && a.stiffness.is_some()) {
            out.push_str(
                "<p class=\"mb-equivalent-note\">This case has a mass on a spring. In mode 1 that mass and the \
                 beam move against each other, so the equivalent mass above can be many times what everything \
                 on the beam weighs. That is expected, not an error: use it only with the stiffness beside it \
                 (for instance to size an absorber for this mode), never as a weight.</p>",
            );
        }
    }
    out.push_str("</section>");
    out
}

/// The bar: a track, the band between the bounds, and a mark at the exact value.
fn bar(lower: Option<f64>, exact: f64, upper: Option<f64>) -> String {
    let values: Vec<f64> =
        [lower, Some(exact), upper].into_iter().flatten().filter(|v| v.is_finite()).collect();
    let low = values.iter().copied().fold(f64::INFINITY, f64::min);
    let high = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    if !(low.is_finite() && high.is_finite()) {
        return String::new();
    }
    // Leave a margin either side so that the marks are not on the edge; a band too narrow to
    // see gets a minimum width of 1 % of the value.
    let span = (high - low).max(high.abs() * 0.01).max(f64::MIN_POSITIVE);
    let (from, to) = (low - 0.25 * span, high + 0.25 * span);
    let x = |v: f64| 12.0 + 296.0 * (v - from) / (to - from);
    let mut out = String::from(
        "<svg class=\"mb-band\" viewBox=\"0 0 320 44\" role=\"img\" aria-label=\"Exact mode 1 frequency between its \
         lower and upper bounds\"><rect class=\"mb-band-track\" x=\"12\" y=\"16\" width=\"296\" height=\"10\" rx=\"5\" \
         fill=\"#e7ecf1\"/>"
    );
    if let (Some(l), Some(u)) = (lower, upper) {
        out.push_str(&format!(
            "<rect class=\"mb-band-range\" x=\"{:.1}\" y=\"16\" width=\"{:.1}\" height=\"10\" rx=\"5\" fill=\"#8fc1b5\"/>",
            x(l),
            (x(u) - x(l)).max(2.0)
        ));
    }
    for (v, words) in [(lower, "lower"), (upper, "upper")] {
        if let Some(v) = v {
            out.push_str(&format!(
                "<text x=\"{:.1}\" y=\"40\" text-anchor=\"middle\" font-size=\"10\" fill=\"{INK}\">{words}</text>",
                x(v)
            ));
        }
    }
    out.push_str(&format!(
        "<rect class=\"mb-band-exact\" x=\"{:.1}\" y=\"8\" width=\"4\" height=\"26\" rx=\"2\" fill=\"{INK}\"/>\
         <text x=\"{:.1}\" y=\"7\" text-anchor=\"middle\" font-size=\"10\" fill=\"{INK}\">exact</text></svg>",
        x(exact) - 2.0,
        x(exact)
    ));
    out
}
