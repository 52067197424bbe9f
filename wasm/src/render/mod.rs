//! HTML and SVG for a calculator: the same markup prerendered by the site builder and drawn live.

/// The whole calculator for a scenario given as JSON text: editor and results.
pub fn widget_html(scenario_json: &str) -> String {
    let attr = escape(scenario_json);
    let body = match modebench::solve_json(scenario_json) {
        Ok(report) => {
            let rows: String = report
                .modes
                .iter()
                .map(|m| format!("<tr><td>{}</td><td>{:.4}</td></tr>", m.number, m.frequency_hz))
                .collect();
            format!("<table class=\"mb-modes\"><tbody>{rows}</tbody></table>")
        }
        Err(e) => format!("<p class=\"mb-error\">{}</p>", escape(&e.to_string())),
    };
    format!("<div class=\"mb-calc\" data-modebench=\"{attr}\">{body}</div>")
}

/// Escapes text for HTML content and double-quoted attributes.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}
