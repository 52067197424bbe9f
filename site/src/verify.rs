//! Checks a built site before anyone serves it: every page carries the content security
//! policy, nothing inline that the policy would block, and every link and asset is a relative
//! URL to a file that exists — so the folder works from any host, under any sub-path, offline.

use std::path::Path;

use anyhow::{bail, Context, Result};

use crate::template::CSP;

/// Checks every HTML and CSS file in `dist` (not in sub-folders' sub-folders).
pub(crate) fn site(dist: &Path) -> Result<()> {
    let mut problems = Vec::new();
    for (dir, prefix) in [(dist.to_path_buf(), ""), (dist.join("assets"), "assets/")] {
        for entry in std::fs::read_dir(&dir).with_context(|| format!("reading {}", dir.display()))? {
            let path = entry?.path();
            let name = format!("{prefix}{}", path.file_name().and_then(|n| n.to_str()).unwrap_or_default());
            let extension = path.extension().and_then(|e| e.to_str()).unwrap_or_default();
            if !matches!(extension, "html" | "css") {
                continue;
            }
            let text =
                std::fs::read_to_string(&path).with_context(|| format!("reading {}", path.display()))?;
            let found = if extension == "html" { page(&text) } else { stylesheet(&text) };
            for problem in found {
                let target = problem.strip_prefix("missing ").map(|t| resolve(prefix, t));
                match target {
                    Some(target) if dist.join(&target).is_file() => {}
                    _ => problems.push(format!("{name}: {problem}")),
                }
            }
        }
    }
    if !problems.is_empty() {
        bail!("the built site has problems:\n  {}", problems.join("\n  "));
    }
    Ok(())
}

/// Problems in one page. Relative targets come back as `missing <url>` for the caller to look up.
fn page(html: &str) -> Vec<String> {
    let mut problems = Vec::new();
    if !html.contains(&format!("<meta http-equiv=\"Content-Security-Policy\" content=\"{CSP}\">")) {
        problems.push("no content security policy".to_string());
    }
    if html.contains("<style") || html.contains(" style=\"") {
        problems.push("an inline style, which the policy blocks".to_string());
    }
    if html
        .match_indices("<script")
        .any(|(i, _)| !html[i..].split('>').next().unwrap_or("").contains(" src=\""))
    {
        problems.push("an inline script, which the policy blocks".to_string());
    }
    if html.match_indices(" on").any(|(i, _)| {
        let rest = &html[i + 3..];
        let name_end = rest.find(|c: char| !c.is_ascii_lowercase()).unwrap_or(0);
        name_end > 0 && rest[name_end..].starts_with("=\"")
    }) {
        problems.push("an inline event handler, which the policy blocks".to_string());
    }
    for attribute in [" href=\"", " src=\""] {
        for (i, _) in html.match_indices(attribute) {
            let value = html[i + attribute.len()..].split('"').next().unwrap_or("");
            problems.extend(url(value));
        }
    }
    problems
}

/// Problems in one stylesheet: `url(…)` must be relative and `@import` is not used.
fn stylesheet(css: &str) -> Vec<String> {
    let mut problems = Vec::new();
    if css.contains("@import") {
        problems.push("@import (keep every stylesheet linked from the page)".to_string());
    }
    for (i, _) in css.match_indices("url(") {
        let value = css[i + 4..].split(')').next().unwrap_or("").trim_matches(['"', '\'', ' ']);
        problems.extend(url(value));
    }
    problems
}

/// Nothing for a fragment; a problem for an absolute or external URL; `missing <path>` for a
/// relative one, to be checked against the files.
fn url(value: &str) -> Option<String> {
    if value.starts_with('#') {
        return None;
    }
    if value.is_empty() || value.starts_with('/') || value.contains(':') {
        return Some(format!("{value:?} is not a relative URL"));
    }
    let path = value.split(['#', '?']).next().unwrap_or(value);
    Some(format!("missing {path}"))
}

/// A relative URL seen in a file under `prefix`, as a path from the site root.
fn resolve(prefix: &str, target: &str) -> String {
    let mut parts: Vec<&str> = prefix.split('/').filter(|p| !p.is_empty()).collect();
    for part in target.split('/') {
        match part {
            "." | "" => {}
            ".." => {
                parts.pop();
            }
            part => parts.push(part),
        }
    }
    parts.join("/")
}

#[cfg(test)]
mod tests {
    use super::*;

    fn head() -> String {
        format!("<meta http-equiv=\"Content-Security-Policy\" content=\"{CSP}\">")
    }

    #[test]
    fn a_clean_page_only_asks_for_its_relative_files() {
        let html = format!("{}<a href=\"boom.html#top\">x</a><script type=\"module\" src=\"assets/boot.js\"></script><a href=\"#content\">", head());
        assert_eq!(page(&html), ["missing boom.html", "missing assets/boot.js"]);
    }

    #[test]
    fn external_urls_inline_code_and_a_missing_policy_are_found() {
        let html = "<a href=\"https://example.org/\">x</a><img src=\"/logo.png\"><p style=\"color: red\" onclick=\"go()\"><script>alert(1)</script>";
        let problems = page(html).join("\n");
        for expected in ["policy", "inline style", "inline script", "event handler", "https://", "/logo.png"]
        {
            assert!(problems.contains(expected), "{expected} not found in:\n{problems}");
        }
        assert!(page(&format!("{}<p data-one=\"1\">Sits on the beam</p>", head())).is_empty());
    }

    #[test]
    fn stylesheet_urls_resolve_from_their_folder() {
        assert_eq!(stylesheet("a { background: url(\"mark.svg\") }"), ["missing mark.svg"]);
        assert_eq!(resolve("assets/", "mark.svg"), "assets/mark.svg");
        assert_eq!(resolve("assets/", "../index.html"), "index.html");
        assert!(!stylesheet("@import url(http://x/y.css);").is_empty());
    }
}
