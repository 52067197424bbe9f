//! The calculator's drawings of supports, springs and masses, shared by the editor's small
//! support pictures and the mode plot.
//!
//! Each symbol is drawn around a point with the beam running to the right of it; a right-hand
//! end is the same drawing mirrored. Colours come from classes in `widget.css`, with
//! presentation attributes as a fallback so the drawing reads even without the stylesheet.

use super::number::sig;

/// Ink for supports and the ground.
pub(crate) const INK: &str = "#2b3a4a";
/// Fill of the ground pads and clamps.
pub(crate) const GROUND: &str = "#cdd6df";

/// Coordinates in SVG, kept short.
fn n(v: f64) -> String {
    if v.is_finite() {
        sig(v, 5)
    } else {
        "0".to_string()
    }
}

/// A ground pad centred under `x` with its top at `y`.
pub(crate) fn ground(x: f64, y: f64, width: f64) -> String {
    format!(
        "<rect class=\"mb-ground\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"6\" rx=\"3\" fill=\"{GROUND}\"/>",
        n(x - width / 2.0),
        n(y),
        n(width)
    )
}

/// Springs drawn along the path data `d` (from [`zigzag_d`]).
pub(crate) fn springs(d: &str) -> String {
    format!("<path class=\"mb-spring\" d=\"{d}\" fill=\"none\" stroke=\"{INK}\" stroke-width=\"1.6\"/>")
}

/// A zig-zag spring from (x, y1) to (x, y2), as path data: the mode plot draws every spring in
/// one path.
pub(crate) fn zigzag_d(x: f64, y1: f64, y2: f64) -> String {
    let turns = 6;
    let lead = (y2 - y1) * 0.15;
    let step = (y2 - y1 - 2.0 * lead) / turns as f64;
    let mut d = format!("M{} {}L{} {}", n(x), n(y1), n(x), n(y1 + lead));
    for i in 0..turns {
        let side = if i % 2 == 0 { 6.0 } else { -6.0 };
        d.push_str(&format!("L{} {}", n(x + side), n(y1 + lead + step * (i as f64 + 0.5))));
    }
    d.push_str(&format!("L{} {}L{} {}", n(x), n(y2 - lead), n(x), n(y2)));
    d
}

/// A coiled rotational spring around (x, y).
pub(crate) fn coil(x: f64, y: f64) -> String {
    format!(
        "<path class=\"mb-coil\" d=\"M{} {} a5 5 0 1 1 5 5 a9 9 0 1 1 9 -9\" fill=\"none\" stroke=\"{INK}\" \
         stroke-width=\"1.6\"/>",
        n(x),
        n(y - 5.0)
    )
}

/// A hinge and a wedge down to a ground pad: a point held in place but free to turn.
pub(crate) fn pin(x: f64, y: f64) -> String {
    format!(
        "<path class=\"mb-support\" d=\"M{} {} L{} {} L{} {} Z\" fill=\"{GROUND}\" stroke=\"{INK}\" \
         stroke-width=\"1.6\" stroke-linejoin=\"round\"/>{}<circle cx=\"{}\" cy=\"{}\" r=\"3.5\" fill=\"#fff\" \
         stroke=\"{INK}\" stroke-width=\"1.6\"/>",
        n(x),
        n(y),
        n(x - 9.0),
        n(y + 18.0),
        n(x + 9.0),
        n(y + 18.0),
        ground(x, y + 19.0, 26.0),
        n(x),
        n(y)
    )
}

/// One end support at (x, y), the beam running towards `+direction`.
pub(crate) fn end(kind: &str, x: f64, y: f64, direction: f64, has_rotational: bool) -> String {
    let d = direction;
    match kind {
        "clamped" => format!(
            "<rect class=\"mb-support\" x=\"{}\" y=\"{}\" width=\"10\" height=\"44\" rx=\"2\" fill=\"{GROUND}\" \
             stroke=\"{INK}\" stroke-width=\"1.6\"/>",
            n(if d > 0.0 { x - 10.0 } else { x }),
            n(y - 22.0)
        ),
        "pinned" => pin(x, y),
        "guided" => {
            // A plate on the beam end rolls on a wall: it slides up and down but cannot turn.
            let wall = x - 16.0 * d;
            let rollers = x - 5.5 * d;
            format!(
                "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{INK}\" stroke-width=\"3\" \
                 stroke-linecap=\"round\"/><circle cx=\"{}\" cy=\"{}\" r=\"3.5\" fill=\"#fff\" stroke=\"{INK}\" \
                 stroke-width=\"1.4\"/><circle cx=\"{}\" cy=\"{}\" r=\"3.5\" fill=\"#fff\" stroke=\"{INK}\" \
                 stroke-width=\"1.4\"/><rect class=\"mb-support\" x=\"{}\" y=\"{}\" width=\"7\" height=\"44\" \
                 rx=\"2\" fill=\"{GROUND}\" stroke=\"{INK}\" stroke-width=\"1.6\"/>",
                n(x),
                n(y - 12.0),
                n(x),
                n(y + 12.0),
                n(rollers),
                n(y - 7.0),
                n(rollers),
                n(y + 7.0),
                n(if d > 0.0 { wall - 7.0 } else { wall }),
                n(y - 22.0)
            )
        }
        "elastic" => {
            let mut out = springs(&zigzag_d(x, y + 2.0, y + 30.0));
            out.push_str(&ground(x, y + 30.0, 24.0));
            if has_rotational {
                out.push_str(&coil(x, y));
            }
            out
        }
        // A free end needs no support; a small cap shows where the beam stops.
        _ => format!(
            "<circle class=\"mb-free-end\" cx=\"{}\" cy=\"{}\" r=\"2.5\" fill=\"{INK}\"/>",
            n(x),
            n(y)
        ),
    }
}

/// A small picture of an end support for the editor, beside the select.
pub(crate) fn end_icon(kind: &str, right: bool, has_rotational: bool) -> String {
    let (x, d, beam) = if right { (44.0, -1.0, "M4 24 H44") } else { (16.0, 1.0, "M16 24 H56") };
    format!(
        "<svg class=\"mb-support-icon\" viewBox=\"0 0 60 60\" width=\"60\" height=\"60\" aria-hidden=\"true\" \
         focusable=\"false\"><path d=\"{beam}\" stroke=\"{INK}\" stroke-width=\"4\" stroke-linecap=\"round\"/>{}</svg>",
        end(kind, x, 24.0, d, has_rotational)
    )
}

/// A mass as path data: a square 8 wide centred on (x, y), which the mode plot strokes 8 wide
/// with round joins, so that it shows as a block 16 wide with corners rounded to 4 (the stroke
/// covers the inside, whatever its fill). The plot
/// draws every mass in one path, since a model may carry hundreds of them.
pub(crate) fn mass_d(x: f64, y: f64) -> String {
    format!("M{} {}h8v8h-8z", n(x - 4.0), n(y - 4.0))
}

/// A text label, already escaped by the caller.
pub(crate) fn label(x: f64, y: f64, escaped: &str) -> String {
    format!(
        "<text class=\"mb-plot-label\" x=\"{}\" y=\"{}\" text-anchor=\"middle\" font-size=\"13\" fill=\"{INK}\">{escaped}</text>",
        n(x),
        n(y)
    )
}
