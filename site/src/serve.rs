//! `serve`: a small static file server for a built site, on 127.0.0.1 only. It sends the right
//! types for `.wasm` and `.js` (browsers refuse to stream-compile or import otherwise) and the
//! site's content security policy as a header. It never builds anything.

use std::io::{BufRead, BufReader, Write};
use std::net::{Ipv4Addr, TcpListener, TcpStream};
use std::path::{Path, PathBuf};
use std::time::Duration;

use anyhow::{bail, Context, Result};

use crate::args::ServeOptions;
use crate::template::CSP;

/// Serves `options.dir` until the process is stopped.
pub(crate) fn serve(options: &ServeOptions) -> Result<()> {
    let dir = options
        .dir
        .canonicalize()
        .with_context(|| format!("{} does not exist: build the site first", options.dir.display()))?;
    if !dir.join("index.html").is_file() {
        bail!("{} has no index.html: build the site first (`cargo xtask build`)", dir.display());
    }
    let listener = TcpListener::bind((Ipv4Addr::LOCALHOST, options.port))
        .with_context(|| format!("listening on 127.0.0.1:{}", options.port))?;
    let address = listener.local_addr()?;
    // Tests read this line to learn the port when they ask for port 0.
    println!("Serving {} at http://{address}/ (Ctrl-C stops)", dir.display());
    std::io::stdout().flush()?;
    for stream in listener.incoming() {
        let Ok(stream) = stream else { continue };
        let dir = dir.clone();
        std::thread::spawn(move || {
            if let Err(error) = answer(stream, &dir) {
                eprintln!("serve: {error:#}");
            }
        });
    }
    Ok(())
}

/// Reads one request and answers it; the connection is closed after each answer.
fn answer(stream: TcpStream, dir: &Path) -> Result<()> {
    stream.set_read_timeout(Some(Duration::from_secs(10)))?;
    let mut reader = BufReader::new(stream.try_clone()?);
    let mut request_line = String::new();
    reader.read_line(&mut request_line)?;
    // Drain the headers; nothing in them changes the answer.
    let mut line = String::new();
    let mut header_bytes = 0;
    while reader.read_line(&mut line)? > 2 && header_bytes < 65_536 {
        header_bytes += line.len();
        line.clear();
    }
    let mut parts = request_line.split_whitespace();
    let (method, target) = (parts.next().unwrap_or(""), parts.next().unwrap_or(""));
    let response = match method {
        "GET" | "HEAD" => respond(dir, target),
        _ => Response::text(405, "Method Not Allowed", "Only GET and HEAD are served.\n"),
    };
    response.write(stream, method == "HEAD")
}

/// One answer.
struct Response {
    status: u16,
    reason: &'static str,
    headers: Vec<(&'static str, String)>,
    body: Vec<u8>,
}

impl Response {
    fn text(status: u16, reason: &'static str, body: &str) -> Response {
        Response {
            status,
            reason,
            headers: vec![("Content-Type", "text/plain; charset=utf-8".into())],
            body: body.as_bytes().to_vec(),
        }
    }

    fn write(self, mut stream: TcpStream, head_only: bool) -> Result<()> {
        let mut head = format!("HTTP/1.1 {} {}\r\n", self.status, self.reason);
        for (name, value) in &self.headers {
            head.push_str(&format!("{name}: {value}\r\n"));
        }
        head.push_str(&format!(
            "Content-Length: {}\r\nContent-Security-Policy: {CSP}\r\nX-Content-Type-Options: nosniff\r\n\
             Cache-Control: no-cache\r\nConnection: close\r\n\r\n",
            self.body.len()
        ));
        // One write per answer: a head and a body written separately meet delayed
        // acknowledgement and Nagle's algorithm, which stall each request by tens of
        // milliseconds even on loopback.
        let mut bytes = head.into_bytes();
        if !head_only {
            bytes.extend_from_slice(&self.body);
        }
        stream.set_nodelay(true)?;
        stream.write_all(&bytes)?;
        stream.flush()?;
        Ok(())
    }
}

/// The answer for a request target such as `/sensor-boom.html?x=1`.
fn respond(dir: &Path, target: &str) -> Response {
    let path = target.split(['?', '#']).next().unwrap_or("");
    let Some(relative) = safe_path(path) else {
        return Response::text(400, "Bad Request", "That path is not allowed.\n");
    };
    let mut file = dir.join(&relative);
    if file.is_dir() {
        if !path.ends_with('/') {
            // Relative links inside the folder only work with the trailing slash.
            let mut response = Response::text(301, "Moved Permanently", "Moved.\n");
            response.headers.push(("Location", format!("{path}/")));
            return response;
        }
        file = file.join("index.html");
    }
    match std::fs::read(&file) {
        Ok(body) => Response {
            status: 200,
            reason: "OK",
            headers: vec![("Content-Type", content_type(&file).into())],
            body,
        },
        Err(_) => Response::text(404, "Not Found", "Not found.\n"),
    }
}

/// The URL path as a path inside the site, or `None` if it tries to leave it.
fn safe_path(path: &str) -> Option<PathBuf> {
    let decoded = percent_decode(path.strip_prefix('/')?)?;
    let mut relative = PathBuf::new();
    for part in decoded.split('/') {
        match part {
            "" | "." => {}
            ".." => return None,
            part if part.contains(['\\', '\0']) => return None,
            part => relative.push(part),
        }
    }
    Some(relative)
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

/// The media type by file extension; `.wasm` must be `application/wasm` for streaming
/// compilation and module scripts must have a JavaScript type.
fn content_type(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()).unwrap_or_default() {
        "html" => "text/html; charset=utf-8",
        "css" => "text/css; charset=utf-8",
        "js" | "mjs" => "text/javascript; charset=utf-8",
        "wasm" => "application/wasm",
        "svg" => "image/svg+xml",
        "json" => "application/json",
        "png" => "image/png",
        "txt" => "text/plain; charset=utf-8",
        _ => "application/octet-stream",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_stay_inside_the_site() {
        assert_eq!(safe_path("/assets/boot.js"), Some(PathBuf::from("assets/boot.js")));
        assert_eq!(safe_path("/a%20b.html"), Some(PathBuf::from("a b.html")));
        assert_eq!(safe_path("/"), Some(PathBuf::new()));
        assert_eq!(safe_path("/../etc/passwd"), None);
        assert_eq!(safe_path("/%2e%2e/etc/passwd"), None);
        assert_eq!(safe_path("/a%2"), None);
        assert_eq!(safe_path("relative"), None);
    }

    #[test]
    fn engine_files_get_the_types_browsers_insist_on() {
        assert_eq!(content_type(Path::new("x/modebench_web_bg.wasm")), "application/wasm");
        assert!(content_type(Path::new("boot.js")).starts_with("text/javascript"));
    }

    #[test]
    fn a_folder_without_its_slash_is_redirected_and_files_are_typed() {
        let dir = std::env::temp_dir().join(format!("modebench-serve-test-{}", std::process::id()));
        std::fs::create_dir_all(dir.join("sub")).unwrap();
        std::fs::write(dir.join("sub/index.html"), "<p>hi</p>").unwrap();
        let redirect = respond(&dir, "/sub");
        assert_eq!(redirect.status, 301);
        let page = respond(&dir, "/sub/?q=1");
        assert_eq!((page.status, page.body.as_slice()), (200, b"<p>hi</p>".as_slice()));
        assert_eq!(respond(&dir, "/nothing.html").status, 404);
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
