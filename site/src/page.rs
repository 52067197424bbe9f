//! A page as written: a Markdown file in `site/pages/` with a title, a one-line summary and a
//! place in the navigation taken from its file name (`20-fan-floor-beam.md`).

use std::path::{Path, PathBuf};

use anyhow::{bail, Context, Result};

/// One page, read but not yet rendered.
#[derive(Debug)]
pub(crate) struct Page {
    /// The output file name without `.html`; `index` for the home page.
    pub(crate) slug: String,
    /// The page title, for `<title>`, the heading and the navigation.
    pub(crate) title: String,
    /// One sentence for the list of pages; may be empty.
    pub(crate) summary: String,
    /// A short label for the navigation; the title when empty.
    pub(crate) nav: String,
    /// The Markdown file, for error messages.
    pub(crate) source: PathBuf,
    /// The Markdown after the front matter or title line.
    pub(crate) body: String,
}

impl Page {
    /// The file the page is written to, relative to the site root.
    pub(crate) fn file_name(&self) -> String {
        format!("{}.html", self.slug)
    }
}

/// Reads every `*.md` file in `dir`, in file-name order. The order of the names is the order of
/// the navigation, which is why the names start with a number.
pub(crate) fn read_pages(dir: &Path) -> Result<Vec<Page>> {
    let mut paths = Vec::new();
    for entry in std::fs::read_dir(dir).with_context(|| format!("reading {}", dir.display()))? {
        let path = entry?.path();
        if path.extension().is_some_and(|e| e == "md") {
            paths.push(path);
        }
    }
    paths.sort();
    let mut pages = Vec::new();
    for path in paths {
        let text = std::fs::read_to_string(&path).with_context(|| format!("reading {}", path.display()))?;
        let page = parse(&path, &text).with_context(|| format!("in {}", path.display()))?;
        if let Some(other) = pages.iter().find(|p: &&Page| p.slug == page.slug) {
            bail!(
                "{} and {} would both be written to {}",
                other.source.display(),
                path.display(),
                page.file_name()
            );
        }
        pages.push(page);
    }
    if !pages.iter().any(|p| p.slug == "index") {
        bail!("{} has no home page: name one file NN-index.md", dir.display());
    }
    Ok(pages)
}

/// Reads one page from its text. The title comes from front matter between `---` lines
/// (`title:`, `summary:` and a short `nav:` label), or else from a first line `# Title`.
fn parse(path: &Path, text: &str) -> Result<Page> {
    let slug = slug(path)?;
    let text = text.trim_start_matches('\u{feff}');
    let (mut title, mut summary, mut nav, body) = (String::new(), String::new(), String::new(), text);
    let body = if let Some(rest) = text.strip_prefix("---\n") {
        let end = rest.find("\n---\n").context("front matter opened with --- is never closed")?;
        for line in rest[..end].lines().filter(|l| !l.trim().is_empty()) {
            let (key, value) = line
                .split_once(':')
                .with_context(|| format!("front matter line {line:?} is not `key: value`"))?;
            match key.trim() {
                "title" => title = value.trim().to_string(),
                "summary" => summary = value.trim().to_string(),
                "nav" => nav = value.trim().to_string(),
                other => bail!("front matter knows title, summary and nav, not {other:?}"),
            }
        }
        &rest[end + "\n---\n".len()..]
    } else if let Some(rest) = body.strip_prefix("# ") {
        let (line, rest) = rest.split_once('\n').unwrap_or((rest, ""));
        title = line.trim().to_string();
        rest
    } else {
        body
    };
    if title.is_empty() {
        bail!("the page has no title: start it with `# Title` or front matter with `title:`");
    }
    if nav.is_empty() {
        nav = if slug == "index" { "Home".to_string() } else { title.clone() };
    }
    Ok(Page { slug, title, summary, nav, source: path.to_path_buf(), body: body.to_string() })
}

/// `20-fan-floor-beam.md` → `fan-floor-beam`. Only lower-case letters, digits and dashes are
/// allowed so that every link works on every static host, case-sensitive or not.
fn slug(path: &Path) -> Result<String> {
    let stem = path.file_stem().and_then(|s| s.to_str()).context("file name is not UTF-8")?;
    let slug = stem.trim_start_matches(|c: char| c.is_ascii_digit()).trim_start_matches('-');
    if slug.is_empty() || !slug.chars().all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-') {
        bail!("page file names are NN-name.md with a lower-case name of letters, digits and dashes (got {stem:?})");
    }
    Ok(slug.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn front_matter_gives_title_and_summary() {
        let page = parse(
            Path::new("10-boom.md"),
            "---\ntitle: A boom\nsummary: Short: with a colon.\nnav: Boom\n---\nText.\n",
        )
        .unwrap();
        assert_eq!(page.slug, "boom");
        assert_eq!(page.title, "A boom");
        assert_eq!(page.summary, "Short: with a colon.");
        assert_eq!(page.nav, "Boom");
        assert_eq!(page.body, "Text.\n");
    }

    #[test]
    fn a_first_line_heading_is_the_title() {
        let page = parse(Path::new("00-index.md"), "# Home\n\nHello.\n").unwrap();
        assert_eq!((page.slug.as_str(), page.title.as_str(), page.nav.as_str()), ("index", "Home", "Home"));
        assert_eq!(page.body, "\nHello.\n");
    }

    #[test]
    fn pages_without_a_title_or_with_odd_names_are_refused() {
        assert!(parse(Path::new("10-x.md"), "Just text.\n").is_err());
        assert!(parse(Path::new("10-Fan Beam.md"), "# T\n").is_err());
        assert!(parse(Path::new("10-x.md"), "---\ntitle: T\n").is_err());
        assert!(parse(Path::new("10-x.md"), "---\ntitel: T\n---\n").is_err());
    }
}
