//! TeX math to MathML Core at build time, so that pages need no script to show equations and
//! browsers with MathML Core (Chromium, Firefox, Safari) lay them out natively.

use anyhow::{bail, Result};
use pulldown_latex::config::DisplayMode;
use pulldown_latex::{push_mathml, Parser, RenderConfig, Storage};

/// Renders one formula. `display` is true for `$$…$$` blocks.
///
/// Errors in the TeX fail the build instead of showing a red box on the page. Formulas that
/// would need an inline `style` attribute (colour, negative space) are refused too, because the
/// site's content security policy blocks inline styles and the browser would drop them silently.
pub(crate) fn to_mathml(tex: &str, display: bool) -> Result<String> {
    let storage = Storage::new();
    let mut events = Vec::new();
    for event in Parser::new(tex, &storage) {
        match event {
            Ok(event) => events.push(event),
            Err(error) => bail!("TeX error in `{}`: {error}", tex.trim()),
        }
    }
    let config = RenderConfig {
        display_mode: if display { DisplayMode::Block } else { DisplayMode::Inline },
        annotation: Some(tex.trim()),
        ..RenderConfig::default()
    };
    let mut out = String::new();
    let events = events.into_iter().map(Ok::<_, std::io::Error>);
    if let Err(error) = push_mathml(&mut out, events, config) {
        bail!("could not write MathML for `{}`: {error}", tex.trim());
    }
    // The renderer writes the TeX control space `\ ` as an escaped `&nbsp;` entity, which
    // would show as text; a numeric character reference is what it means.
    let out = out.replace("&amp;nbsp;", "&#160;");
    if out.contains(" style=\"") {
        bail!(
            "`{}` needs an inline style (colour or negative space), which the content security \
             policy forbids; write it without",
            tex.trim()
        );
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fractions_and_roots_become_mathml_core() {
        let out = to_mathml(r"f = \frac{1}{2\pi}\sqrt{\frac{k}{m}}", true).unwrap();
        assert!(out.starts_with("<math display=\"block\""), "{out}");
        assert!(out.contains("<mfrac>") && out.contains("<msqrt>"), "{out}");
        assert!(!out.contains("mfenced"), "mfenced is not MathML Core: {out}");
    }

    #[test]
    fn text_style_fractions_are_not_mistaken_for_inline_styles() {
        let out = to_mathml(r"\tfrac{33}{140}\,mL", false).unwrap();
        assert!(out.contains("displaystyle=\"false\""), "{out}");
    }

    #[test]
    fn a_control_space_is_a_space_not_an_entity_name() {
        let out = to_mathml(r"68.9\ \text{GPa}", false).unwrap();
        assert!(out.contains("&#160;") && !out.contains("&amp;"), "{out}");
    }

    #[test]
    fn the_tex_source_travels_as_an_annotation() {
        let out = to_mathml(r"\omega^2", false).unwrap();
        assert!(out.contains("application/x-tex"), "{out}");
        assert!(out.contains("\\omega^2"), "{out}");
    }

    #[test]
    fn bad_tex_and_inline_styles_fail_with_the_formula() {
        let message = to_mathml(r"\frac{1}{", false).unwrap_err().to_string();
        assert!(message.contains(r"\frac{1}{"), "{message}");
        assert!(to_mathml(r"\color{red} x", false).is_err());
    }
}
