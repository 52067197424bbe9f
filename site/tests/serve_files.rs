//! `modebench-site serve` answers only with files from inside the served folder and only
//! redirects to the same origin, and sends every file with the type and headers the site needs.
//!
//! Symbolic links are judged by where they lead: one whose target lies inside the served folder
//! is served like the file it names; one that leads outside is answered 404, as if absent.

// Symbolic links are tested on Linux, where the server is hosted; it builds anywhere.
#![cfg(target_os = "linux")]

mod support;

use std::os::unix::fs::symlink;

use support::{scratch, Server};

#[test]
fn a_link_that_leads_outside_the_folder_is_not_found() {
    let server = Server::start("links-out");
    let outside = scratch("links-out-secret");
    std::fs::write(outside.join("secret.txt"), "not for the site").unwrap();
    symlink(outside.join("secret.txt"), server.dir.join("leak.txt")).unwrap();
    symlink(&outside, server.dir.join("elsewhere")).unwrap();
    symlink("/etc/passwd", server.dir.join("passwd")).unwrap();
    for target in ["/leak.txt", "/elsewhere/secret.txt", "/elsewhere", "/elsewhere/", "/passwd"] {
        let answer = server.get(target);
        assert_eq!(answer.status, 404, "{target}: {answer:?}");
        assert!(answer.header("Location").is_none(), "{target}: a link outside must not redirect");
    }
    std::fs::remove_dir_all(&outside).unwrap();
}

#[test]
fn a_link_that_stays_inside_the_folder_is_served() {
    let server = Server::start("links-in");
    symlink("index.html", server.dir.join("home.html")).unwrap();
    symlink(server.dir.join("assets"), server.dir.join("static")).unwrap();
    // A link that climbs out and back in still ends inside.
    symlink("../sub/index.html", server.dir.join("assets/sub.html")).unwrap();
    let home = server.get("/home.html");
    assert_eq!((home.status, home.body.as_slice()), (200, b"<!doctype html><title>home</title>".as_slice()));
    assert_eq!(server.get("/static/boot.js").status, 200);
    assert_eq!(server.get("/assets/sub.html").body, b"<p>sub</p>");
}

#[test]
fn climbing_out_by_the_path_is_refused() {
    let server = Server::start("traversal");
    for target in ["/../../etc/passwd", "/%2e%2e/%2e%2e/etc/passwd", "/assets/..%2F..%2Fetc/passwd"] {
        let answer = server.get(target);
        assert!(matches!(answer.status, 400 | 404), "{target}: {answer:?}");
        assert!(!String::from_utf8_lossy(&answer.body).contains("root:"), "{target}");
    }
}

/// A `Location` a browser resolves on the same origin: one slash, then not a second slash or a
/// backslash, and no scheme anywhere in the path.
fn assert_same_origin(target: &str, location: &str) {
    let path = location.split('?').next().unwrap_or_default();
    let same_origin = path.starts_with('/')
        && !path.starts_with("//")
        && !path.starts_with("/\\")
        && !path.contains(':')
        && !path.contains('\\');
    assert!(same_origin, "{target} redirects to {location:?}");
}

#[test]
fn redirects_stay_on_the_origin() {
    let server = Server::start("redirects");
    std::fs::create_dir_all(server.dir.join("evil.example")).unwrap();
    std::fs::create_dir_all(server.dir.join("http:")).unwrap();
    let cases = [
        ("//assets", "/assets/"),
        ("///assets", "/assets/"),
        ("/%2F%2Fassets", "/assets/"),
        ("//evil.example", "/evil.example/"),
        ("/./evil.example?x=1", "/evil.example/?x=1"),
        ("/http:", "/http%3A/"),
        ("/assets", "/assets/"),
    ];
    for (target, expected) in cases {
        let answer = server.get(target);
        assert_eq!(answer.status, 301, "{target}: {answer:?}");
        let location = answer.header("Location").unwrap();
        assert_same_origin(target, location);
        assert_eq!(location, expected, "{target}");
    }
    for target in ["/\\evil", "/%5Cevil", "/\\\\evil.example"] {
        let answer = server.get(target);
        assert_eq!(answer.status, 400, "{target}: {answer:?}");
        assert!(answer.header("Location").is_none(), "{target}");
    }
}

#[test]
fn every_file_gets_its_type_and_the_site_headers() {
    let server = Server::start("types");
    let types = [
        ("/", "text/html; charset=utf-8"),
        ("/sub/", "text/html; charset=utf-8"),
        ("/assets/boot.js", "text/javascript; charset=utf-8"),
        ("/sw.js", "text/javascript; charset=utf-8"),
        ("/assets/engine.wasm", "application/wasm"),
        ("/assets/site.css", "text/css; charset=utf-8"),
        ("/assets/mark.svg", "image/svg+xml"),
        ("/site.webmanifest", "application/manifest+json"),
    ];
    for (target, content_type) in types {
        let answer = server.get(target);
        assert_eq!(answer.status, 200, "{target}: {answer:?}");
        assert_eq!(answer.header("Content-Type"), Some(content_type), "{target}");
        assert_eq!(answer.header("X-Content-Type-Options"), Some("nosniff"), "{target}");
        // The policy the pages carry in their meta tag (see `site/src/template.rs`).
        let policy = answer.header("Content-Security-Policy").unwrap_or_default();
        for directive in ["default-src 'self'", "script-src 'self' 'wasm-unsafe-eval'", "object-src 'none'"] {
            assert!(policy.contains(directive), "{target}: {policy}");
        }
        assert_eq!(answer.header("Content-Length"), Some(answer.body.len().to_string().as_str()), "{target}");
    }
    // Pages and a service worker's script must be revalidated on every load.
    for target in ["/", "/sub/", "/sw.js"] {
        assert_eq!(server.get(target).header("Cache-Control"), Some("no-cache"), "{target}");
    }
}

#[test]
fn only_get_and_head_are_served() {
    let server = Server::start("methods");
    let head = server.send(b"HEAD /assets/boot.js HTTP/1.1\r\n\r\n");
    assert_eq!((head.status, head.header("Content-Length")), (200, Some("10")));
    assert!(head.body.is_empty());
    let post = server.send(b"POST / HTTP/1.1\r\nContent-Length: 0\r\n\r\n");
    assert_eq!((post.status, post.header("Allow")), (405, Some("GET, HEAD")));
    assert_eq!(server.get("/missing.html").status, 404);
    assert_eq!(server.send(b"GET /\r\n\r\n").status, 400);
}
