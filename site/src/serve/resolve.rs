//! Turns a request target into a file inside the served folder, a redirect to the same folder
//! with its trailing slash, or a refusal. Two rules keep every answer inside the site: the path
//! may not climb out (`..`, backslashes, NUL), and the file it names, once every symbolic link is
//! followed, must still lie inside the served folder. Links that stay inside work; links that
//! leave it are answered as if the file did not exist.

use std::path::{Path, PathBuf};

/// Where a request target leads.
#[derive(Debug, PartialEq)]
pub(super) enum Resolved {
    /// A regular file, by its canonical path (no links left in it).
    File(PathBuf),
    /// A folder asked for without its trailing slash: send the client to this same-origin path.
    Redirect(String),
    /// Nothing to serve there, or something outside the served folder.
    NotFound,
    /// A path that tries to leave the site or cannot be decoded.
    BadRequest,
}

/// Resolves `target` (such as `/assets/boot.js?v=1`) against `root`, which must be canonical.
pub(super) fn resolve(root: &Path, target: &str) -> Resolved {
    let (path, query) = match target.split_once('?') {
        Some((path, query)) => (path, Some(query)),
        None => (target, None),
    };
    let Some(segments) = segments(path) else {
        return Resolved::BadRequest;
    };
    let named = segments.iter().fold(root.to_path_buf(), |path, segment| path.join(segment));
    let Some(found) = inside(root, &named) else {
        return Resolved::NotFound;
    };
    if found.is_dir() {
        if !path.ends_with('/') {
            // Relative links inside the folder only work with the trailing slash.
            return Resolved::Redirect(location(&segments, query));
        }
        return match inside(root, &found.join("index.html")) {
            Some(index) if index.is_file() => Resolved::File(index),
            _ => Resolved::NotFound,
        };
    }
    if found.is_file() {
        Resolved::File(found)
    } else {
        Resolved::NotFound
    }
}

/// The canonical form of `path` if it exists and lies inside `root`, links followed. The file is
/// then opened by this canonical path, which has no link left in it for anyone to swap.
fn inside(root: &Path, path: &Path) -> Option<PathBuf> {
    let canonical = path.canonicalize().ok()?;
    canonical.starts_with(root).then_some(canonical)
}

/// The decoded, non-empty segments of a URL path, or `None` if the path is not absolute, does not
/// decode, or tries to leave the site. Empty segments and `.` are dropped, which also collapses
/// repeated slashes.
fn segments(path: &str) -> Option<Vec<String>> {
    let decoded = percent_decode(path.strip_prefix('/')?)?;
    let mut segments = Vec::new();
    for segment in decoded.split('/') {
        match segment {
            "" | "." => {}
            ".." => return None,
            segment if segment.contains(['\\', '\0']) => return None,
            segment => segments.push(segment.to_string()),
        }
    }
    Some(segments)
}

/// The redirect for a folder: built from the cleaned segments rather than from what the client
/// sent, so it always starts with exactly one slash followed by an encoded segment. It can never
/// start with `//` or `/\` (which a browser reads as another host) nor carry a scheme.
fn location(segments: &[String], query: Option<&str>) -> String {
    let mut location = String::from("/");
    for segment in segments {
        percent_encode(segment, &mut location);
        location.push('/');
    }
    if let Some(query) = query {
        // The head reader lets only visible ASCII through, so the query cannot break the header.
        location.push('?');
        location.push_str(query);
    }
    location
}

/// Appends `text` with every byte outside RFC 3986's unreserved set written as `%XX`.
fn percent_encode(text: &str, out: &mut String) {
    for byte in text.bytes() {
        if byte.is_ascii_alphanumeric() || matches!(byte, b'-' | b'.' | b'_' | b'~') {
            out.push(char::from(byte));
        } else {
            out.push_str(&format!("%{byte:02X}"));
        }
    }
}

/// Decodes `%20` and friends; `None` for broken escapes or text that is not UTF-8.
fn percent_decode(text: &str) -> Option<String> {
    let bytes = text.as_bytes();
    let mut out = Vec::with_capacity(bytes.len());
    let mut i = 0;
    while i < bytes.len() {
        if bytes[i] == b'%' {
            let hex = std::str::from_utf8(bytes.get(i + 1..i + 3)?).ok()?;
            out.push(u8::from_str_radix(hex, 16).ok()?);
            i += 3;
        } else {
            out.push(bytes[i]);
            i += 1;
        }
    }
    String::from_utf8(out).ok()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_stay_inside_the_site() {
        let path = |text| segments(text).map(|s| s.join("/"));
        assert_eq!(path("/assets/boot.js").as_deref(), Some("assets/boot.js"));
        assert_eq!(path("/a%20b.html").as_deref(), Some("a b.html"));
        assert_eq!(path("//assets//./x").as_deref(), Some("assets/x"));
        assert_eq!(path("/").as_deref(), Some(""));
        assert_eq!(path("/../etc/passwd"), None);
        assert_eq!(path("/%2e%2e/etc/passwd"), None);
        assert_eq!(path("/\\evil"), None);
        assert_eq!(path("/%5Cevil"), None);
        assert_eq!(path("/a%2"), None);
        assert_eq!(path("relative"), None);
    }

    #[test]
    fn redirects_never_leave_the_origin() {
        let to = |path: &str, query| location(&segments(path).unwrap(), query);
        assert_eq!(to("//assets", None), "/assets/");
        assert_eq!(to("/%2F%2Fevil.example", None), "/evil.example/");
        assert_eq!(to("/.", None), "/");
        assert_eq!(to("/https:%2F%2Fevil.example", Some("a=1")), "/https%3A/evil.example/?a=1");
        assert_eq!(to("/a b/c", None), "/a%20b/c/");
    }
}
