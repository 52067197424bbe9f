//! One answer: its status, its headers (the same safety headers on every answer) and its body,
//! written within a deadline. Files are streamed in fixed chunks, so a worker holds at most one
//! chunk of any file however large it is.

use std::fs::File;
use std::io::{self, Read, Write};
use std::net::TcpStream;
use std::path::Path;
use std::time::{Duration, Instant};

use super::timed::Timed;
use crate::template::CSP;

/// How long one write may wait for the client to take more.
const WRITE_TIMEOUT: Duration = Duration::from_secs(10);
/// How long a whole answer may take to send: the engine (the largest file, budgeted at 350 kB)
/// crosses even a slow workshop Wi-Fi in a few seconds.
const SEND_DEADLINE: Duration = Duration::from_secs(60);
/// The size of the pieces a file is sent in.
const CHUNK: usize = 64 * 1024;

/// What follows the head.
enum Body {
    Text(&'static str),
    File { file: File, length: u64 },
}

/// One answer.
pub(super) struct Response {
    status: u16,
    reason: &'static str,
    content_type: &'static str,
    extra: Option<(&'static str, String)>,
    body: Body,
}

impl Response {
    /// A short plain-text answer such as a 404.
    pub(super) fn text(status: u16, reason: &'static str, body: &'static str) -> Response {
        let content_type = "text/plain; charset=utf-8";
        Response { status, reason, content_type, extra: None, body: Body::Text(body) }
    }

    /// `405`, naming the methods that are served.
    pub(super) fn method_not_allowed() -> Response {
        let mut response = Response::text(405, "Method Not Allowed", "Only GET and HEAD are served.\n");
        response.extra = Some(("Allow", "GET, HEAD".into()));
        response
    }

    /// `301` to a same-origin path.
    pub(super) fn redirect(location: String) -> Response {
        let mut response = Response::text(301, "Moved Permanently", "Moved.\n");
        response.extra = Some(("Location", location));
        response
    }

    /// `503` for a connection that finds every worker busy and the queue full.
    pub(super) fn busy() -> Response {
        let mut response = Response::text(503, "Service Unavailable", "Busy; try again.\n");
        response.extra = Some(("Retry-After", "1".into()));
        response
    }

    /// `200` with the file at `path`, or `404` if it cannot be opened.
    pub(super) fn file(path: &Path) -> Response {
        let opened = File::open(path).and_then(|file| Ok((file.metadata()?.len(), file)));
        let Ok((length, file)) = opened else {
            return Response::text(404, "Not Found", "Not found.\n");
        };
        let content_type = content_type(path);
        Response { status: 200, reason: "OK", content_type, extra: None, body: Body::File { file, length } }
    }

    fn head(&self, length: u64) -> String {
        let mut head =
            format!("HTTP/1.1 {} {}\r\nContent-Type: {}\r\n", self.status, self.reason, self.content_type);
        if let Some((name, value)) = &self.extra {
            head.push_str(&format!("{name}: {value}\r\n"));
        }
        // Every answer is revalidated: pages must never be stale, a future service worker's
        // `sw.js` must be fetched fresh for its updates to be seen, and the assets' names carry
        // no content hash, so a cached copy could outlive a rebuild.
        head.push_str(&format!(
            "Content-Length: {length}\r\nContent-Security-Policy: {CSP}\r\nX-Content-Type-Options: nosniff\r\n\
             Cache-Control: no-cache\r\nConnection: close\r\n\r\n"
        ));
        head
    }

    fn length(&self) -> u64 {
        match &self.body {
            Body::Text(text) => text.len() as u64,
            Body::File { length, .. } => *length,
        }
    }

    /// The whole answer as bytes, for the acceptor's `503`, which must not block.
    pub(super) fn into_bytes(self) -> Vec<u8> {
        let mut bytes = self.head(self.length()).into_bytes();
        if let Body::Text(text) = self.body {
            bytes.extend_from_slice(text.as_bytes());
        }
        bytes
    }

    /// Sends the answer; `head_only` for `HEAD`, which gets the same head and no body.
    pub(super) fn send(self, stream: &TcpStream, head_only: bool) -> io::Result<()> {
        // With Nagle's algorithm off a short answer leaves at once instead of waiting for the
        // client's delayed acknowledgement, which on loopback stalls each request by tens of
        // milliseconds. The head and the start of the body still go out in one write.
        stream.set_nodelay(true)?;
        let mut out = Timed::new(stream, WRITE_TIMEOUT, Instant::now() + SEND_DEADLINE);
        let length = self.length();
        let mut bytes = self.head(length).into_bytes();
        match self.body {
            _ if head_only => {}
            Body::Text(text) => bytes.extend_from_slice(text.as_bytes()),
            Body::File { file, .. } => return send_file(&mut out, bytes, &file, length),
        }
        out.write_all(&bytes)?;
        out.flush()
    }
}

/// Sends `head` followed by the `length` bytes of `file`, one chunk at a time.
fn send_file(out: &mut Timed<'_>, mut head: Vec<u8>, file: &File, length: u64) -> io::Result<()> {
    // Never more than the length announced, even if the file grows meanwhile.
    let mut rest = file.take(length);
    let mut chunk = vec![0; CHUNK];
    let mut sent = 0;
    loop {
        let n = rest.read(&mut chunk)?;
        if n == 0 {
            break;
        }
        // The first chunk shares the head's write; `head` is empty after that.
        head.extend_from_slice(&chunk[..n]);
        out.write_all(&head)?;
        head.clear();
        sent += n as u64;
    }
    if sent < length {
        // The file shrank while it was sent; closing the connection short of the announced
        // length tells the client that the body is incomplete.
        return Err(io::Error::other(format!("a file shrank while it was sent ({sent} of {length} bytes)")));
    }
    out.write_all(&head)?;
    out.flush()
}

/// The media type by file extension. `.wasm` must be `application/wasm` for streaming
/// compilation, module scripts must have a JavaScript type, and a web app manifest has its own.
pub(super) fn content_type(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()).unwrap_or_default() {
        "html" | "htm" => "text/html; charset=utf-8",
        "css" => "text/css; charset=utf-8",
        "js" | "mjs" => "text/javascript; charset=utf-8",
        "wasm" => "application/wasm",
        "webmanifest" => "application/manifest+json",
        "json" | "map" => "application/json",
        "svg" => "image/svg+xml",
        "png" => "image/png",
        "jpg" | "jpeg" => "image/jpeg",
        "webp" => "image/webp",
        "ico" => "image/x-icon",
        "woff2" => "font/woff2",
        "txt" => "text/plain; charset=utf-8",
        _ => "application/octet-stream",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn engine_files_get_the_types_browsers_insist_on() {
        assert_eq!(content_type(Path::new("x/modebench_web_bg.wasm")), "application/wasm");
        assert!(content_type(Path::new("boot.js")).starts_with("text/javascript"));
        assert_eq!(content_type(Path::new("site.webmanifest")), "application/manifest+json");
    }

    #[test]
    fn every_answer_carries_the_safety_headers() {
        let head = String::from_utf8(Response::busy().into_bytes()).unwrap();
        assert!(head.starts_with("HTTP/1.1 503 "), "{head}");
        for header in
            [format!("Content-Security-Policy: {CSP}\r\n"), "X-Content-Type-Options: nosniff\r\n".into()]
        {
            assert!(head.contains(&header), "{head}");
        }
    }
}
