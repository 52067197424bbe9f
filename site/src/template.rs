//! The HTML around every page: head with the content security policy, the site header and
//! navigation, the page itself, and the footer. Every URL it writes is relative.

use modebench_ui::render::escape;

use crate::page::Page;

/// The content security policy of every page, also sent as a header by `serve`. It allows
/// only the site's own files, WebAssembly compilation, and nothing inline.
pub(crate) const CSP: &str = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; \
     img-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'";

/// What a rendered page needs from the rest of the site.
pub(crate) struct Frame<'a> {
    /// Every page, in navigation order.
    pub(crate) pages: &'a [Page],
    /// Whether `assets/widget.css` exists and should be linked.
    pub(crate) widget_css: bool,
    /// Whether the browser engine was copied into `assets/`; without it pages keep their
    /// prerendered results and load no script at all.
    pub(crate) engine: bool,
}

/// The whole HTML document of `page` with its rendered `body`.
pub(crate) fn document(page: &Page, body: &str, frame: &Frame<'_>) -> String {
    let title = escape(&page.title);
    let head_title =
        if page.slug == "index" { "Modebench".to_string() } else { format!("{title} · Modebench") };
    let widget_css =
        if frame.widget_css { "<link rel=\"stylesheet\" href=\"assets/widget.css\">\n" } else { "" };
    // Only pages that carry a calculator load the engine.
    // The engine's files are announced up front so the browser fetches them while it is
    // still reading the page, instead of one after the other as each import is discovered.
    // The solver's are not: the calculator's worker fetches them once the page is live, and a
    // page's preloads do not serve a worker's requests.
    let boot = if frame.engine && body.contains("class=\"mb-calc\"") {
        "<link rel=\"modulepreload\" href=\"assets/modebench_page.js\">\n\
         <link rel=\"preload\" href=\"assets/modebench_page_bg.wasm\" as=\"fetch\" type=\"application/wasm\" crossorigin>\n\
         <script type=\"module\" src=\"assets/boot.js\"></script>\n\
         <script src=\"assets/from-disk.js\" defer></script>\n"
    } else {
        ""
    };
    // A page with a calculator offers a jump to it under its title: on a tablet at the bench
    // the calculator is what the reader came for, and it may sit below several screens of text.
    let (body, jump) = match body.find("<div class=\"mb-calc\"") {
        Some(at) => (
            format!("{}<div id=\"calculator\" class=\"mb-calc\"{}", &body[..at], &body[at + 20..]),
            "<p class=\"jump\"><a href=\"#calculator\">Go to the calculator</a></p>\n",
        ),
        None => (body.to_string(), ""),
    };
    let summary = if page.summary.is_empty() {
        String::new()
    } else {
        format!("<meta name=\"description\" content=\"{}\">\n", escape(&page.summary))
    };
    format!(
        "{head}{summary}<link rel=\"icon\" href=\"assets/mark.svg\" type=\"image/svg+xml\">
<link rel=\"manifest\" href=\"assets/manifest.webmanifest\">
<link rel=\"stylesheet\" href=\"assets/site.css\">
{widget_css}<link rel=\"stylesheet\" href=\"assets/print.css\" media=\"print\">
{boot}<script type=\"module\" src=\"assets/offline.js\"></script>
</head>
<body>
<a class=\"skip\" href=\"#content\">Skip to the page</a>
<header class=\"site-head\">
<a class=\"brand\" href=\"index.html\">{mark}<span>Modebench</span></a>
<nav class=\"site-nav\" aria-label=\"Pages\"><ul>
{nav}</ul></nav>
</header>
<main id=\"content\" class=\"page page-{slug}\">
<p class=\"sheet-head\">Modebench calculation sheet</p>
<h1>{title}</h1>
{jump}{body}</main>
<footer class=\"site-foot\">
<p>Modebench gives estimates. Resonance cracks welds and breaks brackets: confirm the frequencies \
that matter by test, and follow the codes that apply and a qualified engineer.</p>
</footer>
</body>
</html>
",
        head = head(CSP, &head_title),
        nav = navigation(page, frame.pages),
        slug = page.slug,
        mark = brand_mark(),
    )
}

/// The opening of every HTML document the site writes, up to its title: the policy it runs
/// under (as a `meta` element, which a page opened from disk obeys too) and the title, escaped
/// by the caller.
pub(crate) fn head(policy: &str, title: &str) -> String {
    format!(
        "<!doctype html>
<html lang=\"en\">
<head>
<meta charset=\"utf-8\">
<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">
<meta http-equiv=\"Content-Security-Policy\" content=\"{policy}\">
<title>{title}</title>
"
    )
}

/// The site's mark, drawn inline in the header: as an image it would be a separate SVG document
/// for the browser to load and lay out before the first paint. The same file is the page icon.
fn brand_mark() -> String {
    include_str!("../assets/mark.svg").trim().replacen(
        "<svg ",
        "<svg aria-hidden=\"true\" focusable=\"false\" ",
        1,
    )
}

/// One link per page; the current one is marked for assistive technology and for the styles.
fn navigation(current: &Page, pages: &[Page]) -> String {
    pages
        .iter()
        .map(|p| {
            let here = if p.slug == current.slug { " aria-current=\"page\"" } else { "" };
            format!("<li><a href=\"{}\"{here}>{}</a></li>\n", p.file_name(), escape(&p.nav))
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn page(slug: &str, title: &str) -> Page {
        Page {
            slug: slug.into(),
            title: title.into(),
            summary: String::new(),
            nav: title.into(),
            source: Default::default(),
            body: String::new(),
        }
    }

    #[test]
    fn every_page_carries_the_policy_and_relative_links() {
        let pages = [page("index", "Home"), page("boom", "Boom <tube>")];
        let html = document(&pages[1], "<p>x</p>", &Frame { pages: &pages, widget_css: false, engine: true });
        assert!(html.contains("http-equiv=\"Content-Security-Policy\""));
        assert!(html.contains("<a href=\"boom.html\" aria-current=\"page\">Boom &lt;tube&gt;</a>"), "{html}");
        assert!(!html.contains("href=\"/") && !html.contains("src=\"/"), "{html}");
        assert!(!html.contains("boot.js"), "a page without a calculator loads no engine");
        assert!(!html.contains("widget.css"));
        assert!(html.contains("<a class=\"brand\" href=\"index.html\"><svg aria-hidden=\"true\""), "{html}");
        assert!(!html.contains("<img"), "the mark is drawn inline, not loaded as an image");
    }

    #[test]
    fn the_readme_gives_hosts_the_policy_the_pages_carry() {
        // Firms that host `dist/` themselves copy the header's value from the README.
        let readme = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/../README.md")).unwrap();
        assert!(readme.contains(CSP), "README.md must show the policy exactly as in template.rs:\n{CSP}");
    }
}
