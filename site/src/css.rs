//! Style sheets as the site ships them: without their comments. The comments are written for the
//! people who maintain the sheets (`site/assets/`), and every calculator page would otherwise
//! carry them, some 4 KB of the 200 KB a page may weigh gzipped. Nothing else changes: the rules
//! keep their lines and indentation, so a shipped sheet still reads as written.

/// `text` without its comments, and without the lines that held nothing else. A `/*` inside a
/// quoted string is not a comment; a comment between two tokens leaves a space between them,
/// so that it still separates them.
pub(crate) fn without_comments(text: &str) -> String {
    let bytes = text.as_bytes();
    let mut kept = String::with_capacity(text.len());
    let (mut at, mut from) = (0, 0);
    let mut quote = None;
    while at < bytes.len() {
        let byte = bytes[at];
        match quote {
            // A backslash takes the next character into the string, a quote mark included.
            Some(_) if byte == b'\\' => at += 2,
            Some(mark) => {
                if byte == mark {
                    quote = None;
                }
                at += 1;
            }
            None if byte == b'"' || byte == b'\'' => {
                quote = Some(byte);
                at += 1;
            }
            None if bytes[at..].starts_with(b"/*") => {
                kept.push_str(&text[from..at]);
                // A comment left open runs to the end of the sheet.
                let end = text[at + 2..].find("*/").map_or(text.len(), |e| at + 2 + e + 2);
                let before = kept.chars().next_back().is_some_and(|c| !c.is_whitespace());
                let after = text[end..].chars().next().is_some_and(|c| !c.is_whitespace());
                if before && after {
                    kept.push(' ');
                }
                (at, from) = (end, end);
            }
            None => at += 1,
        }
    }
    kept.push_str(&text[from..]);
    let mut shipped = String::with_capacity(kept.len());
    for line in kept.lines().map(str::trim_end).filter(|line| !line.is_empty()) {
        shipped.push_str(line);
        shipped.push('\n');
    }
    shipped
}

#[cfg(test)]
mod tests {
    use super::without_comments;
    use std::path::Path;

    #[test]
    fn comments_and_the_lines_they_leave_empty_go() {
        let sheet = "/* The header.\n * Two lines. */\n\n.a {\n  color: red; /* why */\n  /* alone */\n  margin: 0;\n}\n";
        assert_eq!(without_comments(sheet), ".a {\n  color: red;\n  margin: 0;\n}\n");
    }

    #[test]
    fn a_comment_inside_a_string_is_kept() {
        for sheet in [
            ".a::before { content: \"/* not a comment */\"; }\n",
            ".a::before { content: '/* nor */'; }\n",
            ".a::before { content: \"a \\\" /* still in the string */\"; }\n",
        ] {
            assert_eq!(without_comments(sheet), sheet);
        }
    }

    #[test]
    fn a_comment_between_two_tokens_still_separates_them() {
        assert_eq!(without_comments(".a { margin: 0/**/auto; }\n"), ".a { margin: 0 auto; }\n");
        assert_eq!(without_comments(".a { margin: 0 /* x */ auto; }\n"), ".a { margin: 0  auto; }\n");
    }

    #[test]
    fn a_comment_left_open_runs_to_the_end() {
        assert_eq!(
            without_comments(".a { color: red; }\n/* open\n.b { color: blue; }\n"),
            ".a { color: red; }\n"
        );
    }

    /// The site's own sheets: no comment left, each smaller, and every brace and semicolon
    /// outside the comments kept (the comments found here by a plain split, which the sheets
    /// allow: none has `/*` in a string).
    #[test]
    fn the_site_sheets_keep_every_rule() {
        let assets = Path::new(concat!(env!("CARGO_MANIFEST_DIR"), "/assets"));
        let mut sheets = 0;
        for entry in std::fs::read_dir(assets).unwrap() {
            let path = entry.unwrap().path();
            if path.extension().is_none_or(|e| e != "css") {
                continue;
            }
            let source = std::fs::read_to_string(&path).unwrap();
            let shipped = without_comments(&source);
            let comments: String =
                source.split("/*").skip(1).map(|part| part.split("*/").next().unwrap_or(part)).collect();
            assert!(!comments.is_empty() && shipped.len() < source.len(), "{}", path.display());
            assert!(!shipped.contains("/*") && !shipped.contains("*/"), "{}", path.display());
            for c in ['{', '}', ';', ':'] {
                let count = |text: &str| text.matches(c).count();
                assert_eq!(count(&shipped), count(&source) - count(&comments), "{c} in {}", path.display());
            }
            sheets += 1;
        }
        assert!(sheets >= 3);
    }
}
