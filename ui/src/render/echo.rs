//! The inputs as modelled, in the chosen unit system, and every unit conversion applied: what
//! lets a reader check that the calculator read what they meant.

use super::escape::escape;
use super::number::{hz, percent, quantity, rpm, MISSING};
use modebench::report::{AttachmentKind, EndEcho, EndKind, SegmentReport};
use modebench::units::{Kind, UnitSystem};
use modebench::{schema, FieldPath, Report};

/// A fold-out section, open if the reader left it open.
fn fold(part: &str, summary: &str, body: &str, open: &[String]) -> String {
    let is_open = if open.iter().any(|p| p == part) { " open" } else { "" };
    format!(
        "<details class=\"mb-fold\" data-part=\"{part}\"{is_open}><summary>{}</summary>{body}</details>",
        escape(summary)
    )
}

/// The echo of the inputs and the conversions, as two fold-out sections.
pub(crate) fn echo(report: &Report, open: &[String]) -> String {
    let mut out = fold("model", "The beam as modelled", &model(report), open);
    if !report.conversions.is_empty() {
        let items: String = report
            .conversions
            .iter()
            .map(|c| {
                // The field in words ("Segment 1, wall"); its path stays a machine's key.
                let place = FieldPath::parse(&c.path).map_or_else(|| c.path.clone(), |p| schema::words(&p));
                format!(
                    "<li data-path=\"{}\"><span class=\"mb-conversion-field\">{}</span>: {}</li>",
                    escape(&c.path),
                    escape(&place),
                    escape(&c.text)
                )
            })
            .collect();
        let summary = format!("Unit conversions applied ({})", report.conversions.len());
        out.push_str(&fold(
            "conversions",
            &summary,
            &format!("<ul class=\"mb-conversions\">{items}</ul>"),
            open,
        ));
    }
    out
}

fn end_text(end: &EndEcho, system: UnitSystem) -> String {
    match end.kind {
        EndKind::Elastic => {
            let spring = |v: Option<f64>, kind| v.map_or("rigid".to_string(), |v| quantity(v, kind, system));
            format!(
                "on springs: {} and {}",
                spring(end.translational, Kind::Stiffness),
                spring(end.rotational, Kind::RotationalStiffness)
            )
        }
        other => other.id().to_string(),
    }
}

fn model(report: &Report) -> String {
    let s = report.units;
    let beam = &report.beam;
    let mut out = format!(
        "<p>Length {}; left end {}; right end {}. Finite-element check with {} elements ({} unknowns).</p>",
        quantity(beam.length, Kind::Length, s),
        escape(&end_text(&beam.left, s)),
        escape(&end_text(&beam.right, s)),
        report.fe.elements,
        report.fe.dofs
    );
    out.push_str(
        "<div class=\"mb-table-wrap\" tabindex=\"0\" role=\"region\" aria-label=\"Segments as modelled\">\
         <table class=\"mb-echo\"><thead><tr><th scope=\"col\">Segment</th>\
         <th scope=\"col\">From – to</th><th scope=\"col\">EI</th><th scope=\"col\">Mass per length</th>\
         <th scope=\"col\">κGA</th><th scope=\"col\">Made of</th></tr></thead><tbody>",
    );
    for (i, seg) in beam.segments.iter().enumerate() {
        out.push_str(&segment_row(i, seg, s));
    }
    out.push_str("</tbody></table></div>");
    if !beam.attachments.is_empty() {
        out.push_str(
            "<div class=\"mb-table-wrap\" tabindex=\"0\" role=\"region\" aria-label=\"Attachments as modelled\">\
             <table class=\"mb-echo\"><thead><tr><th scope=\"col\">Attachment</th>\
             <th scope=\"col\">At</th><th scope=\"col\">Mass</th><th scope=\"col\">Rotary inertia</th>\
             <th scope=\"col\">Stiffness</th></tr></thead><tbody>",
        );
        for (i, a) in beam.attachments.iter().enumerate() {
            let name = if a.label.trim().is_empty() {
                format!("{} {}", i + 1, a.kind.id())
            } else {
                format!("{} {} ({})", i + 1, a.kind.id(), a.label.trim())
            };
            let stiffness_kind = if a.kind == AttachmentKind::RotationalSpring {
                Kind::RotationalStiffness
            } else {
                Kind::Stiffness
            };
            let stiffness = match (a.stiffness, a.rigid) {
                (_, true) => "rigid".to_string(),
                (Some(k), false) => quantity(k, stiffness_kind, s),
                (None, false) => MISSING.to_string(),
            };
            out.push_str(&format!(
                "<tr><th scope=\"row\">{}</th><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
                escape(&name),
                quantity(a.position, Kind::Length, s),
                a.mass.map_or(MISSING.to_string(), |m| quantity(m, Kind::Mass, s)),
                a.rotary_inertia.map_or(MISSING.to_string(), |j| quantity(j, Kind::RotaryInertia, s)),
                stiffness
            ));
        }
        out.push_str("</tbody></table></div>");
    }
    if !report.excitations.is_empty() {
        let items: String = report
            .excitations
            .iter()
            .map(|e| {
                let label = if e.label.trim().is_empty() { "excitation" } else { e.label.trim() };
                let orders: Vec<String> = e.orders.iter().map(|o| super::number::order(*o)).collect();
                let speed = match e.up_to_hz {
                    Some(top) => format!(
                        "{} to {} ({} to {})",
                        hz(e.frequency_hz),
                        hz(top),
                        rpm(e.frequency_hz * 60.0),
                        rpm(top * 60.0)
                    ),
                    None => format!("{} ({})", hz(e.frequency_hz), rpm(e.frequency_hz * 60.0)),
                };
                format!("<li>{}: {speed}, orders {}</li>", escape(label), orders.join(", "))
            })
            .collect();
        out.push_str(&format!(
            "<p>Excitations, checked for a separation of at least {}:</p><ul>{items}</ul>",
            percent(report.margin, 3)
        ));
    }
    out
}

fn segment_row(i: usize, seg: &SegmentReport, s: UnitSystem) -> String {
    let echo = &seg.echo;
    let mut made_of = match (&echo.section, &echo.material) {
        (Some(section), Some(material)) => format!("{section}, {material}"),
        _ => "given EI and mass".to_string(),
    };
    if let Some(mass) = &echo.mass {
        let mut parts = vec![format!("structure {}", quantity(mass.structural, Kind::MassPerLength, s))];
        for (value, words) in
            [(mass.contents, "contents"), (mass.lining, "lining"), (mass.added_water, "water carried")]
        {
            if value > 0.0 {
                parts.push(format!("{words} {}", quantity(value, Kind::MassPerLength, s)));
            }
        }
        made_of.push_str(&format!("; {}", parts.join(" + ")));
    }
    made_of.push_str(&axial_text(seg, s));
    format!(
        "<tr><th scope=\"row\">{}</th><td>{} – {}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
        i + 1,
        quantity(seg.start, Kind::Length, s),
        quantity(seg.end, Kind::Length, s),
        quantity(seg.flexural_rigidity, Kind::FlexuralRigidity, s),
        quantity(seg.mass_per_length, Kind::MassPerLength, s),
        seg.shear_rigidity.map_or(MISSING.to_string(), |k| quantity(k, Kind::ShearRigidity, s)),
        escape(&made_of)
    )
}

/// The segment's axial force in words, empty without one: "; axial force −12.3 kN (compression;
/// −12.3 kN of it from the temperature change)".
fn axial_text(seg: &SegmentReport, s: UnitSystem) -> String {
    let Some(p) = seg.echo.axial_force else { return String::new() };
    let sense = if p < 0.0 {
        "compression"
    } else if p > 0.0 {
        "tension"
    } else {
        "none"
    };
    let thermal = match seg.echo.thermal_force {
        Some(t) => format!("; {} of it from the temperature change", quantity(t, Kind::Force, s)),
        None => String::new(),
    };
    format!("; axial force {} ({sense}{thermal})", quantity(p, Kind::Force, s))
}
