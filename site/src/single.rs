//! The single-file build: one HTML file holding one live calculator, its styles, its scripts and
//! both engines, which works opened from disk (`file://`), where a browser runs no service worker
//! and loads no module or engine from beside the page. Made by `cargo xtask build --single-file`.
//!
//! The calculator is the embed page's (the camera boom's example, with the reader's own cases,
//! links and files); a case in the address's fragment opens as on the site. The engines come from
//! wasm-bindgen's `no-modules` output, whose glue defines one global and can sit inside an inline
//! script: the page's engine is decoded from base64 on the page; the solver's runs in a Web
//! Worker made from a Blob, so the page's main thread still never solves. The policy allows
//! nothing from outside the file: scripts and styles only by the SHA-256 of their text, workers
//! only from `blob:` addresses, WebAssembly compilation, and no network request at all.

mod digest;

use std::path::Path;

use anyhow::{bail, Context, Result};
use modebench_ui::render::escape;

use crate::calculator;
use crate::css;
use crate::embed;
use crate::template;

/// The no-modules engine files `xtask` binds into the folder given to `single`.
pub(crate) const ENGINE_FILES: [&str; 4] =
    ["modebench_page.js", "modebench_page_bg.wasm", "modebench_solver.js", "modebench_solver_bg.wasm"];

/// Writes the single file to `out` from the repository at `root` and the no-modules engines in
/// `wasm`; returns its size in bytes.
pub(crate) fn write(root: &Path, wasm: &Path, out: &Path) -> Result<u64> {
    let read = |dir: &Path, name: &str| {
        std::fs::read(dir.join(name)).with_context(|| format!("reading {}", dir.join(name).display()))
    };
    let text = |dir: &Path, name: &str| -> Result<String> {
        String::from_utf8(read(dir, name)?).with_context(|| format!("{name} is not UTF-8"))
    };
    let sheet = |dir: &Path, name: &str| text(dir, name).map(|t| css::without_comments(&t));
    let assets = root.join("site").join("assets");
    let parts = Parts {
        calculator: calculator::render(embed::EXAMPLE, root)?,
        styles: [sheet(&assets, "site.css")?, sheet(&assets, "widget.css")?],
        print: sheet(&assets, "print.css")?,
        page_glue: text(wasm, ENGINE_FILES[0])?,
        page_engine: read(wasm, ENGINE_FILES[1])?,
        solver_glue: text(wasm, ENGINE_FILES[2])?,
        solver_engine: read(wasm, ENGINE_FILES[3])?,
        case_io: text(&assets, "case-io.js")?,
    };
    let html = document(&parts)?;
    if let Some(dir) = out.parent() {
        std::fs::create_dir_all(dir).with_context(|| format!("creating {}", dir.display()))?;
    }
    std::fs::write(out, &html).with_context(|| format!("writing {}", out.display()))?;
    Ok(html.len() as u64)
}

/// What the file is made of.
struct Parts {
    calculator: String,
    styles: [String; 2],
    print: String,
    page_glue: String,
    page_engine: Vec<u8>,
    solver_glue: String,
    solver_engine: Vec<u8>,
    case_io: String,
}

/// The whole file.
fn document(parts: &Parts) -> Result<String> {
    let script = format!(
        "{glue}\nconst io = (() => {{\n{io}\nreturn {{ incomingCase, caseIo }};\n}})();\n{boot}",
        glue = parts.page_glue,
        io = module_functions(&parts.case_io)?,
        boot = include_str!("../single/boot.js"),
    );
    let worker = format!(
        "const SOLVER_BASE64 = \"{}\";\n{}\n{}",
        digest::base64(&parts.solver_engine),
        parts.solver_glue,
        include_str!("../single/worker.js")
    );
    for (what, text) in [
        ("the page's script", &script),
        ("the worker's script", &worker),
        ("site.css", &parts.styles[0]),
        ("widget.css", &parts.styles[1]),
        ("print.css", &parts.print),
    ] {
        raw_text(what, text)?;
    }
    let policy = policy(&script, &parts.styles, &parts.print);
    let title = escape("Modebench calculator");
    Ok(format!(
        "{head}<style>{site}</style>
<style>{widget}</style>
<style media=\"print\">{print}</style>
<script type=\"module\">{script}</script>
</head>
<body class=\"embed single\">
{sheet}<p class=\"single-note\">One file that holds the whole calculator and its engine: it works opened \
from disk, with no network. Your cases stay in this browser on this device; send one as a link or \
a scenario file from the calculator's menu.</p>
{calculator}
<p class=\"embed-foot\">Modebench gives estimates. Resonance cracks welds and breaks brackets: \
confirm the frequencies that matter by test, and follow the codes that apply and a qualified \
engineer.</p>
</main>
<script type=\"application/octet-stream\" id=\"mb-page-engine\">{page_engine}</script>
<script type=\"text/plain\" id=\"mb-solver-code\">{worker}</script>
</body>
</html>
",
        site = parts.styles[0],
        widget = parts.styles[1],
        print = parts.print,
        calculator = parts.calculator,
        page_engine = digest::base64(&parts.page_engine),
        head = template::head(&policy, &title),
        sheet = embed::sheet_head(&title),
    ))
}

/// The file's policy: what `template::CSP` allows the site, with the file's own scripts and
/// styles named by hash instead of `'self'`, workers from `blob:` only, and nothing else loaded.
fn policy(script: &str, styles: &[String; 2], print: &str) -> String {
    format!(
        "default-src 'none'; script-src {} 'wasm-unsafe-eval'; style-src {} {} {}; worker-src blob:; \
         img-src data:; object-src 'none'; base-uri 'none'; form-action 'none'",
        digest::csp_hash(script),
        digest::csp_hash(&styles[0]),
        digest::csp_hash(&styles[1]),
        digest::csp_hash(print),
    )
}

/// The functions of a script module of ours (`case-io.js`) as plain declarations, to be placed
/// inside a function: each `export function` or `export async function` loses its `export`.
/// Anything else the module might export or import would not survive that, so it is refused.
fn module_functions(module: &str) -> Result<String> {
    let mut out = String::with_capacity(module.len());
    for line in module.lines() {
        let plain = line.strip_prefix("export ").unwrap_or(line);
        if line.starts_with("export ")
            && !(plain.starts_with("function ") || plain.starts_with("async function "))
            || line.starts_with("import ")
            || line.starts_with("export{")
        {
            bail!(
                "case-io.js: the single-file build takes only `export function` declarations, not `{line}`"
            );
        }
        out.push_str(plain);
        out.push('\n');
    }
    Ok(out)
}

/// Refuses text that would end its `<script>` or `<style>` element early or change how the
/// HTML parser reads it.
fn raw_text(what: &str, text: &str) -> Result<()> {
    let lower = text.to_ascii_lowercase();
    for bad in ["</script", "</style", "<!--", "<script"] {
        if lower.contains(bad) {
            bail!("{what} contains {bad:?}, which cannot stand inside an inline element");
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn parts() -> Parts {
        let root = Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/.."));
        let assets = root.join("site/assets");
        let css = |name: &str| std::fs::read_to_string(assets.join(name)).unwrap();
        Parts {
            calculator: calculator::render(embed::EXAMPLE, root).unwrap(),
            styles: [css("site.css"), css("widget.css")],
            print: css("print.css"),
            page_glue: "let wasm_bindgen; (function () { wasm_bindgen = () => {}; })();".into(),
            page_engine: b"\0asm page".to_vec(),
            solver_glue: "let wasm_bindgen;".into(),
            solver_engine: b"\0asm solver".to_vec(),
            case_io: css("case-io.js"),
        }
    }

    #[test]
    fn the_policy_names_each_inline_script_and_style_by_its_hash() {
        let html = document(&parts()).unwrap();
        let policy =
            html.split("Content-Security-Policy\" content=\"").nth(1).unwrap().split('"').next().unwrap();
        assert!(policy.starts_with("default-src 'none'; script-src 'sha256-"), "{policy}");
        assert!(!policy.contains("'self'") && !policy.contains("unsafe-inline"), "{policy}");
        // Every element the policy must admit is admitted by the hash of its exact text.
        let mut admitted = 0;
        for tag in ["<script type=\"module\">", "<style>", "<style media=\"print\">"] {
            for (at, _) in html.match_indices(tag) {
                let body = &html[at + tag.len()..];
                let end = if tag.starts_with("<script") { "</script>" } else { "</style>" };
                let text = &body[..body.find(end).unwrap()];
                assert!(policy.contains(&digest::csp_hash(text)), "{tag} is not admitted");
                admitted += 1;
            }
        }
        assert_eq!(admitted, 4, "one script and three styles");
        // The engines ride as data; nothing is loaded from beside the file.
        assert!(!html.contains(" src=\"") && !html.contains("<link "), "nothing loaded from outside");
        assert!(html.contains(&format!("id=\"mb-page-engine\">{}<", digest::base64(b"\0asm page"))));
        assert!(html.contains(&format!("const SOLVER_BASE64 = \"{}\";", digest::base64(b"\0asm solver"))));
        assert_eq!(html.matches("class=\"mb-calc\"").count(), 1);
    }

    #[test]
    fn only_exported_functions_are_taken_from_a_module() {
        let taken =
            module_functions("export async function a() {}\nfunction b() {}\nexport function c() {}\n");
        assert_eq!(taken.unwrap(), "async function a() {}\nfunction b() {}\nfunction c() {}\n");
        for refused in ["export const a = 1;", "import { b } from \"./b.js\";", "export default a;"] {
            let message = module_functions(refused).unwrap_err().to_string();
            assert!(message.contains(refused), "{message}");
        }
    }

    #[test]
    fn text_that_would_end_its_element_early_is_refused() {
        assert!(raw_text("x", "const a = \"</SCRIPT>\";").is_err());
        assert!(raw_text("x", "a { content: \"<!--\"; }").is_err());
        assert!(raw_text("x", "const a = 1 < 2;").is_ok());
    }
}
