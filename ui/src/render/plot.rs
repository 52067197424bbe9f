//! The mode plot: the beam at rest, its supports and attachments, and one mode's deflected shape
//! with its nodes, as SVG.

use super::escape::escape;
use super::number::{hz, quantity, rpm};
use super::symbols::{self, INK};
use modebench::report::{AttachmentKind, ModeReport};
use modebench::units::Kind;
use modebench::Report;

const WIDTH: f64 = 720.0;
const HEIGHT: f64 = 290.0;
const LEFT: f64 = 70.0;
const RIGHT: f64 = 650.0;
/// The beam's line at rest.
const AXIS: f64 = 140.0;
/// The largest deflection drawn, px.
const AMPLITUDE: f64 = 58.0;
/// The colour of the deflected shape.
const SHAPE: &str = "#c4572e";

/// Coordinates in SVG with one decimal, and never "NaN": a value that is not finite (not
/// expected from core) is drawn at 0.
fn n(v: f64) -> String {
    if v.is_finite() {
        format!("{v:.1}")
    } else {
        "0".to_string()
    }
}

/// The plot of mode `number` (or of the first mode, if there is no such mode).
pub fn plot_svg(report: &Report, number: usize) -> String {
    let mode = report.modes.iter().find(|m| m.number == number).or(report.modes.first());
    let length = report.beam.length;
    let scale = if length > 0.0 && length.is_finite() { (RIGHT - LEFT) / length } else { 0.0 };
    let px = |x: f64| LEFT + x * scale;
    let caption = match mode {
        Some(m) if m.rigid_body => format!("Mode {}: rigid-body motion, 0 Hz", m.number),
        Some(m) => format!("Mode {}: {} ({})", m.number, hz(m.frequency_hz), rpm(m.rpm)),
        None => "No mode to draw".to_string(),
    };
    let mut out = format!(
        "<svg class=\"mb-plot\" viewBox=\"0 0 {WIDTH} {HEIGHT}\" role=\"img\" aria-label=\"{0}\" \
         font-family=\"system-ui, sans-serif\"><title>{0}</title>\
         <text class=\"mb-plot-caption\" x=\"{LEFT}\" y=\"22\" font-size=\"15\" font-weight=\"700\" fill=\"{INK}\">{0}</text>",
        escape(&caption)
    );
    out.push_str(&rest_line(report, &px));
    if let Some(m) = mode {
        out.push_str(&shape_line(m, &px));
    }
    // Ends that move (free and sprung ones) are drawn where the mode takes them.
    let beam = &report.beam;
    for (end, x, at, direction) in [(&beam.left, LEFT, 0.0, 1.0), (&beam.right, RIGHT, length, -1.0)] {
        let y = AXIS - AMPLITUDE * deflection(mode, at);
        out.push_str(&symbols::end(end.kind.id(), x, y, direction, end.rotational != Some(0.0)));
    }
    out.push_str(&attachments(report, mode, &px));
    if let Some(m) = mode {
        for x in &m.nodes {
            out.push_str(&format!(
                "<circle class=\"mb-node\" cx=\"{}\" cy=\"{AXIS}\" r=\"5\" fill=\"#fff\" stroke=\"{SHAPE}\" \
                 stroke-width=\"2.2\"/>",
                n(px(*x))
            ));
        }
    }
    out.push_str(&ruler(report));
    out.push_str("</svg>");
    out
}

/// The beam at rest, segment by segment, thicker where the bending stiffness is higher.
fn rest_line(report: &Report, px: &dyn Fn(f64) -> f64) -> String {
    let stiffest = report.beam.segments.iter().map(|s| s.flexural_rigidity).fold(0.0, f64::max);
    let mut out = String::new();
    for (i, s) in report.beam.segments.iter().enumerate() {
        // The fourth root keeps a 100-fold change in EI readable (1 to 3.2 times as thick).
        let ratio = if stiffest > 0.0 { (s.flexural_rigidity / stiffest).max(0.0).powf(0.25) } else { 1.0 };
        let width = 2.0 + 5.0 * ratio;
        out.push_str(&format!(
            "<line class=\"mb-beam-rest\" x1=\"{}\" y1=\"{AXIS}\" x2=\"{}\" y2=\"{AXIS}\" stroke=\"#9aa8b6\" \
             stroke-width=\"{}\" stroke-dasharray=\"7 5\"/>",
            n(px(s.start)),
            n(px(s.end)),
            n(width)
        ));
        if i > 0 {
            out.push_str(&format!(
                "<line class=\"mb-joint\" x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" y2=\"{2}\" stroke=\"#9aa8b6\" stroke-width=\"1.5\"/>",
                n(px(s.start)),
                n(AXIS - 9.0),
                n(AXIS + 9.0)
            ));
        }
    }
    out
}

fn shape_line(mode: &ModeReport, px: &dyn Fn(f64) -> f64) -> String {
    let points: Vec<String> = mode
        .shape
        .x
        .iter()
        .zip(&mode.shape.w)
        .filter(|(x, w)| x.is_finite() && w.is_finite())
        .map(|(x, w)| format!("{},{}", n(px(*x)), n(AXIS - AMPLITUDE * w.clamp(-1.5, 1.5))))
        .collect();
    if points.is_empty() {
        return String::new();
    }
    format!(
        "<polyline class=\"mb-shape\" points=\"{}\" fill=\"none\" stroke=\"{SHAPE}\" stroke-width=\"3.2\" \
         stroke-linejoin=\"round\" stroke-linecap=\"round\"/>",
        points.join(" ")
    )
}

/// How far, in the plot's units, a thinned shape may pass from any sample it leaves out: the
/// plot writes its coordinates to a tenth of a unit (its 720 units are drawn some 700 pixels
/// wide), so the drawing is the same to the eye.
pub const THIN_TOLERANCE: f64 = 0.1;

/// Every mode's shape cut to the samples that draw it, within [`THIN_TOLERANCE`] of every
/// sample left out, in this plot (its width and the largest deflection it draws): what the
/// calculator's worker sends the page for drawing. A long model's shapes have a sample at every
/// attachment and several between (1,605 a mode with 800 masses) and a smooth mode needs a few
/// dozen; the page reads, keeps and draws the fewer. The deflection at an attachment,
/// interpolated between the samples kept, is within the same distance of the full shape's.
pub fn thin_shapes(report: &mut Report) {
    let length = report.beam.length;
    let scale = if length > 0.0 && length.is_finite() { (RIGHT - LEFT) / length } else { 0.0 };
    for mode in &mut report.modes {
        let shape = &mut mode.shape;
        let keep = kept_samples(&shape.x, &shape.w, scale);
        for (k, &i) in keep.iter().enumerate() {
            shape.x[k] = shape.x[i];
            shape.w[k] = shape.w[i];
        }
        shape.x.truncate(keep.len());
        shape.w.truncate(keep.len());
    }
}

/// The indices of the samples to keep, the two ends always: from each sample kept, the chord
/// runs as far along as it can while every sample it passes lies within [`THIN_TOLERANCE`] of it
/// vertically in plot units, which bounds both the drawn line's departure and the error of a
/// deflection interpolated between the kept samples. Every sample is finite, as in every
/// report (`Report::is_finite` is checked before a report leaves the solve). Written for its
/// size in the solver's engine, one loop and no sorting: its cost, a few passes over each
/// chord's samples, is far below the solve's.
fn kept_samples(x: &[f64], w: &[f64], scale: f64) -> Vec<usize> {
    let n = x.len().min(w.len());
    let y = |i: usize| AMPLITUDE * w[i].clamp(-1.5, 1.5);
    let off = |a: usize, b: usize, i: usize| {
        let run = (x[b] - x[a]) * scale;
        let t = if run > 0.0 { (x[i] - x[a]) * scale / run } else { 0.0 };
        (y(i) - y(a) - t * (y(b) - y(a))).abs()
    };
    let mut keep = Vec::new();
    let mut a = 0;
    for b in 0..n {
        // The chord from the last sample kept to `b` would leave a sample too far: the one
        // before `b` is kept, and the next chord starts there.
        if b > a + 1 && (a + 1..b).any(|i| off(a, b, i) > THIN_TOLERANCE) {
            keep.push(a);
            a = b - 1;
        }
    }
    if n > 0 {
        keep.push(a);
    }
    if n > 1 {
        keep.push(n - 1);
    }
    keep
}

/// The deflection of a mode at `x`, interpolated between samples; 0 without a shape.
fn deflection(mode: Option<&ModeReport>, x: f64) -> f64 {
    let Some(m) = mode else { return 0.0 };
    let (xs, ws) = (&m.shape.x, &m.shape.w);
    let i = xs.partition_point(|v| *v < x);
    let w = match (i.checked_sub(1).and_then(|j| xs.get(j).zip(ws.get(j))), xs.get(i).zip(ws.get(i))) {
        (Some((x0, w0)), Some((x1, w1))) if x1 > x0 => w0 + (w1 - w0) * (x - x0) / (x1 - x0),
        (_, Some((_, w))) | (Some((_, w)), None) => *w,
        _ => 0.0,
    };
    if w.is_finite() {
        w.clamp(-1.5, 1.5)
    } else {
        0.0
    }
}

/// The attachments' symbols and labels. The masses are drawn in one path, so that a model with
/// hundreds of them (cable clips, say) adds one element to the page, not hundreds.
fn attachments(report: &Report, mode: Option<&ModeReport>, px: &dyn Fn(f64) -> f64) -> String {
    let mut masses = String::new();
    let mut others = String::new();
    let ground = AXIS + AMPLITUDE + 22.0;
    for (i, a) in report.beam.attachments.iter().enumerate() {
        let x = px(a.position);
        let y = AXIS - AMPLITUDE * deflection(mode, a.position);
        match a.kind {
            AttachmentKind::Mass => masses.push_str(&symbols::mass_d(x, y)),
            AttachmentKind::SprungMass => {
                let amplitude =
                    mode.and_then(|m| m.sprung.iter().find(|s| s.attachment == i)).map_or(0.0, |s| {
                        if s.amplitude.is_finite() {
                            s.amplitude.clamp(-1.2, 1.2)
                        } else {
                            0.0
                        }
                    });
                // The mass rests well above the beam; however the two move, its spring is drawn
                // at least 22 px long so the mass never seems to pass through the beam.
                let top = (AXIS - 64.0 - AMPLITUDE * amplitude).max(34.0).min(y - 30.0);
                others.push_str(&symbols::springs(&symbols::zigzag_d(x, top + 8.0, y)));
                masses.push_str(&symbols::mass_d(x, top));
            }
            AttachmentKind::Spring => {
                others.push_str(&symbols::springs(&symbols::zigzag_d(x, y, ground)));
                others.push_str(&symbols::ground(x, ground, 24.0));
            }
            AttachmentKind::RotationalSpring => others.push_str(&symbols::coil(x, y)),
            AttachmentKind::Support => others.push_str(&symbols::pin(x, AXIS)),
        }
        if !a.label.trim().is_empty() {
            let short: String = a.label.trim().chars().take(28).collect();
            others.push_str(&symbols::label(x, HEIGHT - 44.0, &escape(&short)));
        }
    }
    let mut out = others;
    if !masses.is_empty() {
        out.push_str(&format!(
            "<path class=\"mb-mass\" d=\"{masses}\" stroke=\"{INK}\" stroke-width=\"8\" stroke-linejoin=\"round\"/>"
        ));
    }
    out
}

/// A dimension line under the beam with the total length in the chosen units.
fn ruler(report: &Report) -> String {
    let y = HEIGHT - 14.0;
    format!(
        "<g class=\"mb-ruler\" stroke=\"{INK}\" stroke-width=\"1\"><line x1=\"{LEFT}\" y1=\"{y}\" x2=\"{RIGHT}\" y2=\"{y}\"/>\
         <line x1=\"{LEFT}\" y1=\"{0}\" x2=\"{LEFT}\" y2=\"{1}\"/><line x1=\"{RIGHT}\" y1=\"{0}\" x2=\"{RIGHT}\" y2=\"{1}\"/></g>\
         <text x=\"{2}\" y=\"{3}\" text-anchor=\"middle\" font-size=\"13\" fill=\"{INK}\" class=\"mb-ruler-text\">{4}</text>",
        n(y - 5.0),
        n(y + 5.0),
        n((LEFT + RIGHT) / 2.0),
        n(y - 4.0),
        escape(&quantity(report.beam.length, Kind::Length, report.units))
    )
}
