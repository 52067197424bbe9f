//! The mode plot drawn from shapes cut to fewer samples (what the calculator's worker sends the
//! page) is the plot drawn from the whole shapes: every sample left out lies on the drawn line,
//! to the plot's tolerance and its tenth-of-a-unit coordinates, and a long model's shapes come
//! down to a few dozen samples.
#![cfg(not(target_arch = "wasm32"))]

use modebench::Report;
use modebench_ui::doc;
use modebench_ui::render::{plot_svg, thin_shapes, THIN_TOLERANCE};

const SCENARIOS: [&str; 4] = [
    include_str!("../../docs/scenarios/sensor-boom.json"),
    include_str!("../../docs/scenarios/fan-floor-beam-us.json"),
    include_str!("../../docs/scenarios/absorber-on-platform-beam.json"),
    include_str!("../../docs/scenarios/fan-set-on-mounts.json"),
];

fn solved(json: &str) -> Report {
    let Ok(report) = doc::read(json).and_then(|d| doc::solve(&d)) else { panic!("the scenario solves") };
    report
}

/// The camera boom with 400 cable clips of 5 g along it, 10 modes: a long model whose shapes
/// carry a sample at every clip and several between.
fn long_boom() -> Report {
    let clips: Vec<String> = (1..=400)
        .map(|i| {
            format!(
                "{{\"type\": \"mass\", \"position\": \"{:.1} mm\", \"mass\": \"5 g\"}}",
                f64::from(i) * 3.6
            )
        })
        .collect();
    let json = SCENARIOS[0]
        .replace("\"modes\": 4", "\"modes\": 10")
        .replace("\"attachments\": [", &format!("\"attachments\": [{},", clips.join(",")));
    solved(&json)
}

/// The points of the plot's deflected shape, in the plot's units.
fn drawn_line(svg: &str) -> Vec<(f64, f64)> {
    let line = svg.split("class=\"mb-shape\" points=\"").nth(1).expect("a drawn shape");
    let points = &line[..line.find('"').expect("the attribute ends")];
    points
        .split(' ')
        .map(|p| {
            let (x, y) = p.split_once(',').expect("x,y");
            (x.parse().expect("a number"), y.parse().expect("a number"))
        })
        .collect()
}

/// The height of a polyline at `x` (its points in increasing x), by linear interpolation, and
/// the size of its slope there.
fn height_at(line: &[(f64, f64)], x: f64) -> (f64, f64) {
    let i = line.partition_point(|p| p.0 < x).clamp(1, line.len() - 1);
    let ((x0, y0), (x1, y1)) = (line[i - 1], line[i]);
    if x1 > x0 {
        let slope = (y1 - y0) / (x1 - x0);
        (y0 + slope * (x - x0), slope.abs())
    } else {
        (y1, 0.0)
    }
}

/// Each point of the plot drawn from the whole shape lies on the plot drawn from the cut one,
/// vertically within the tolerance plus what the two drawings' rounding to a twentieth either
/// way can add (a fact of geometry: the cut keeps every sample farther than the tolerance from
/// the chord between the kept ones; a height rounded moves the line by up to 0.05 and a position
/// rounded by 0.05 times its slope); and nothing else in the plot moves by more than that.
fn assert_same_drawing(name: &str, whole: &Report) {
    let mut cut = whole.clone();
    thin_shapes(&mut cut);
    for (a, b) in whole.modes.iter().zip(&cut.modes) {
        let (full, thin) = (plot_svg(whole, a.number), plot_svg(&cut, b.number));
        let (full_line, thin_line) = (drawn_line(&full), drawn_line(&thin));
        assert!(thin_line.len() <= full_line.len(), "{name}, mode {}", a.number);
        assert_eq!(
            (full_line[0], full_line[full_line.len() - 1]),
            (thin_line[0], thin_line[thin_line.len() - 1])
        );
        for &(x, y) in &full_line {
            let (height, slope) = height_at(&thin_line, x);
            let off = (height - y).abs();
            let bound = THIN_TOLERANCE + 0.1 + 0.1 * slope + 1e-9;
            assert!(off <= bound, "{name}, mode {}: {off} from the line at x = {x}, over {bound}", a.number);
        }
        // The rest of the plot (supports, attachments placed on the shape, nodes) is drawn from
        // the same values, to one tenth: the same elements, the same count of numbers.
        let rest = |svg: &str| {
            svg.split_once("stroke-linecap=\"round\"/>").map(|(_, r)| r.to_string()).expect("shape")
        };
        let numbers = |s: &str| -> Vec<f64> {
            s.split(|c: char| !(c.is_ascii_digit() || c == '.' || c == '-'))
                .filter_map(|t| t.parse().ok())
                .collect()
        };
        let (r1, r2) = (numbers(&rest(&full)), numbers(&rest(&thin)));
        assert_eq!(r1.len(), r2.len(), "{name}, mode {}", a.number);
        for (u, v) in r1.iter().zip(&r2) {
            assert!(
                (u - v).abs() <= THIN_TOLERANCE + 0.1 + 1e-9,
                "{name}, mode {}: {u} drawn as {v}",
                a.number
            );
        }
    }
}

#[test]
fn a_plot_from_the_cut_shapes_is_the_plot_from_the_whole_ones() {
    for json in SCENARIOS {
        let report = solved(json);
        assert_same_drawing(&report.title, &report);
    }
    assert_same_drawing("long boom", &long_boom());
}

/// A mode drawn with a largest deflection of 58 units needs some 27 samples for each half-wave
/// of its shape, not the hundreds a long model carries: along a sine of amplitude A, a chord over
/// a fraction h of a half-wave departs from it by at most A(πh)²/8, so a tolerance t takes
/// π√(A/8t) chords a half-wave (a fact of calculus), 27 at t = 0.1; and mode n of a cantilever
/// has fewer than n half-waves.
#[test]
fn a_long_models_shapes_come_down_to_some_samples_a_half_wave() {
    let whole = long_boom();
    let mut cut = whole.clone();
    thin_shapes(&mut cut);
    for (a, b) in whole.modes.iter().zip(&cut.modes) {
        let (kept, all) = (b.shape.x.len(), a.shape.x.len());
        assert!(all > 800, "mode {}: {all} samples whole", a.number);
        assert!(kept <= 27 * a.number + 3, "mode {}: {kept} of {all} kept", a.number);
    }
}
