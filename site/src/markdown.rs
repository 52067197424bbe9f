//! Markdown to HTML with the site's three additions: TeX math becomes MathML, and fenced blocks
//! `modebench`, `modebench-checks` and `modebench-pages` become a calculator, the published
//! checks and the list of pages.

use std::path::Path;

use anyhow::{bail, Context, Result};
use pulldown_cmark::{CodeBlockKind, CowStr, Event, Options, Parser, Tag, TagEnd};

use crate::page::Page;
use crate::{calculator, checks, math, page_list};

/// What a page may refer to while it is rendered.
pub(crate) struct Scope<'a> {
    /// The repository root, for `file:` scenarios and the published checks.
    pub(crate) root: &'a Path,
    /// Every page, for the list of pages.
    pub(crate) pages: &'a [Page],
}

/// Renders a page body. Errors name the block or formula that failed; the caller adds the file.
pub(crate) fn to_html(markdown: &str, context: &Scope<'_>) -> Result<String> {
    let options = Options::ENABLE_MATH
        | Options::ENABLE_TABLES
        | Options::ENABLE_GFM
        | Options::ENABLE_SMART_PUNCTUATION
        | Options::ENABLE_HEADING_ATTRIBUTES;
    let mut events = Vec::new();
    let mut block: Option<(String, String)> = None;
    let mut calculators = 0;
    for event in Parser::new_ext(markdown, options) {
        if let Some((kind, body)) = block.as_mut() {
            match event {
                Event::Text(text) => body.push_str(&text),
                Event::End(TagEnd::CodeBlock) => {
                    let (kind, body) = (std::mem::take(kind), std::mem::take(body));
                    block = None;
                    let html = match kind.as_str() {
                        "modebench" => {
                            calculators += 1;
                            calculator::render(&body, context.root)
                                .with_context(|| format!("calculator block {calculators}"))?
                        }
                        "modebench-checks" => checks::render(&body)?,
                        _ => page_list::render(&body, context.pages)?,
                    };
                    events.push(Event::Html(CowStr::from(format!("{html}\n"))));
                }
                other => bail!("unexpected {other:?} inside a {kind} block"),
            }
            continue;
        }
        match event {
            Event::Start(Tag::CodeBlock(CodeBlockKind::Fenced(info)))
                if matches!(info.trim(), "modebench" | "modebench-checks" | "modebench-pages") =>
            {
                block = Some((info.trim().to_string(), String::new()));
            }
            Event::InlineMath(tex) => events.push(Event::InlineHtml(math::to_mathml(&tex, false)?.into())),
            Event::DisplayMath(tex) => events.push(Event::Html(math::to_mathml(&tex, true)?.into())),
            other => events.push(other),
        }
    }
    let mut html = String::new();
    pulldown_cmark::html::push_html(&mut html, events.into_iter());
    Ok(html)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn render(markdown: &str) -> Result<String> {
        let root = Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/.."));
        to_html(markdown, &Scope { root, pages: &[] })
    }

    #[test]
    fn math_becomes_mathml() {
        let html = render("Mass $m$ and\n\n$$\\omega^2 = k/m$$\n").unwrap();
        assert!(html.contains("<math display=\"inline\""), "{html}");
        assert!(html.contains("<math display=\"block\""), "{html}");
        assert!(!html.contains('$'), "{html}");
    }

    #[test]
    fn a_modebench_block_becomes_a_calculator_and_other_code_stays_code() {
        let html =
            render("```modebench\nfile: docs/scenarios/sensor-boom.json\n```\n\n```json\n{}\n```\n").unwrap();
        assert!(html.contains("<div class=\"mb-calc\""), "{html}");
        assert!(html.contains("<code class=\"language-json\">"), "{html}");
    }

    #[test]
    fn a_bad_block_says_which_one() {
        let message = format!("{:#}", render("```modebench\n{\"left\": \"welded\"}\n```\n").unwrap_err());
        assert!(message.contains("calculator block 1"), "{message}");
        assert!(message.contains("left"), "{message}");
    }
}
