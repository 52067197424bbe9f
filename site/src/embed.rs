//! The embed page, `embed.html`: one live calculator and nothing else, for another page to show
//! in a frame. The case comes in the page's fragment, as in a link made by a calculator
//! (`embed.html#calc=1&case=…`); without one it shows the camera boom's example. It is part of
//! the site, so the service worker keeps it and it works offline like every page.

use std::path::Path;

use anyhow::Result;
use modebench_ui::render::escape;

use crate::calculator;
use crate::template::{self, CSP};

/// The file the embed page is written to.
pub(crate) const FILE: &str = "embed.html";

/// The example shown when the fragment carries no case (here and in the single file).
pub(crate) const EXAMPLE: &str = "file: docs/scenarios/sensor-boom.json";

/// The whole embed page; `engine` as for every page (without it the calculator stays fixed).
pub(crate) fn document(root: &Path, engine: bool) -> Result<String> {
    let calculator = calculator::render(EXAMPLE, root)?;
    let title = escape("Modebench calculator");
    let boot = if engine {
        "<link rel=\"modulepreload\" href=\"assets/modebench_page.js\">\n\
         <script type=\"module\" src=\"assets/boot.js\"></script>\n\
         <script src=\"assets/from-disk.js\" defer></script>\n"
    } else {
        ""
    };
    Ok(format!(
        "{head}<link rel=\"icon\" href=\"assets/mark.svg\" type=\"image/svg+xml\">
<link rel=\"stylesheet\" href=\"assets/site.css\">
<link rel=\"stylesheet\" href=\"assets/widget.css\">
<link rel=\"stylesheet\" href=\"assets/print.css\" media=\"print\">
{boot}<script type=\"module\" src=\"assets/offline.js\"></script>
</head>
<body class=\"embed\">
{sheet}{calculator}
<p class=\"embed-foot\"><a href=\"index.html\" target=\"_blank\">Modebench</a>: how the results are computed, \
and the worked cases.</p>
</main>
</body>
</html>
",
        head = template::head(CSP, &title),
        sheet = sheet_head(&title),
    ))
}

/// The top of the calculation sheet that the embed page and the single file show: the sheet's
/// heading and its title, escaped by the caller. It opens the page's `main` element.
pub(crate) fn sheet_head(title: &str) -> String {
    format!(
        "<main id=\"content\" class=\"page page-embed\">
<p class=\"sheet-head\">Modebench calculation sheet</p>
<h1 class=\"embed-title\">{title}</h1>
"
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_embed_page_is_one_calculator_under_the_sites_policy() {
        let root = Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/.."));
        let html = document(root, true).unwrap();
        assert_eq!(html.matches("class=\"mb-calc\"").count(), 1);
        assert!(html.contains(&format!("content=\"{CSP}\"")));
        assert!(html.contains("src=\"assets/boot.js\"") && !html.contains("site-nav"));
        assert!(!document(root, false).unwrap().contains("boot.js"));
    }
}
