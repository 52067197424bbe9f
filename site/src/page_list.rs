//! A ```` ```modebench-pages ```` block becomes the list of every other page with its summary,
//! so the home page never falls behind the pages that exist.

use anyhow::{bail, Result};
use modebench_ui::render::escape;

use crate::page::Page;

/// The list, linking each page by its relative file name.
pub(crate) fn render(block: &str, pages: &[Page]) -> Result<String> {
    if !block.trim().is_empty() {
        bail!("the modebench-pages block takes no content; it lists the pages in site/pages");
    }
    let items: String = pages
        .iter()
        .filter(|p| p.slug != "index")
        .map(|p| {
            format!(
                "<li><a href=\"{href}\">{title}</a><p>{summary}</p></li>",
                href = p.file_name(),
                title = escape(&p.title),
                summary = escape(&p.summary)
            )
        })
        .collect();
    Ok(format!("<ul class=\"page-list\">{items}</ul>"))
}
