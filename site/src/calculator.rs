//! A ```` ```modebench ```` block in a page becomes a live calculator, prerendered here with the
//! native engine so the page reads correctly before, or without, WebAssembly.
//!
//! The block holds a scenario as JSON, or one line `file: docs/scenarios/name.json` naming a
//! scenario file relative to the repository root.

use std::path::Path;

use anyhow::{bail, Context, Result};

/// The HTML of one calculator block. A scenario the engine rejects fails the build with the
/// engine's own message (field path, what is allowed, what was given).
pub(crate) fn render(block: &str, root: &Path) -> Result<String> {
    let json = scenario_text(block, root)?;
    if let Err(error) = modebench::solve_json(&json) {
        bail!("the scenario does not solve: {error}");
    }
    Ok(modebench_ui::render::widget_html(&json))
}

/// The scenario JSON of a block, read from a file when the block names one.
fn scenario_text(block: &str, root: &Path) -> Result<String> {
    let block = block.trim();
    let Some(name) = block.strip_prefix("file:") else {
        return Ok(block.to_string());
    };
    let name = name.trim();
    if name.is_empty() || Path::new(name).is_absolute() || name.contains("..") {
        bail!("`file:` takes a path inside the repository, like docs/scenarios/name.json (got {name:?})");
    }
    let path = root.join(name);
    std::fs::read_to_string(&path).with_context(|| format!("reading the scenario {}", path.display()))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn root() -> &'static Path {
        Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/.."))
    }

    const BARE: &str = r#"{"left": "clamped", "right": "free", "modes": 2,
        "segments": [{"length": "1 m", "flexural_rigidity": "1 N*m^2", "mass_per_length": "1 kg/m"}]}"#;

    #[test]
    fn a_scenario_becomes_the_calculator_root() {
        let html = render(BARE, root()).unwrap();
        assert!(html.starts_with("<div class=\"mb-calc\" data-modebench=\""), "{html}");
        assert!(html.contains("&quot;clamped&quot;"), "the scenario is escaped into the attribute");
    }

    #[test]
    fn a_named_file_is_read_from_the_repository() {
        let html = render("file: docs/scenarios/sensor-boom.json", root()).unwrap();
        assert!(html.contains("camera head"), "{html}");
    }

    #[test]
    fn a_bad_scenario_names_the_field() {
        let bad = BARE.replace("\"1 m\"", "\"-3 kg\"");
        let message = render(&bad, root()).unwrap_err().to_string();
        assert!(message.contains("segments[0].length"), "{message}");
        assert!(render("file: ../etc/passwd", root()).is_err());
        assert!(render("file: docs/scenarios/missing.json", root()).is_err());
    }
}
