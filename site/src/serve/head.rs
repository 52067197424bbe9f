//! Reads a request's head (the request line and the header lines) within fixed byte limits and a
//! fixed time. Every line is read through a reader that stops at its limit, so the server never
//! holds more than a few kilobytes of any request, however long the client's line is.

use std::io::{self, BufRead, BufReader, Read};
use std::net::TcpStream;
use std::time::{Duration, Instant};

use super::timed::Timed;

/// The longest request line accepted, line end included. Common servers take about 8 KiB; the
/// site's own URLs are well under a hundred bytes.
pub(super) const MAX_REQUEST_LINE: u64 = 8 * 1024;
/// The longest single header line accepted, line end included.
pub(super) const MAX_HEADER_LINE: u64 = 8 * 1024;
/// The most bytes accepted for all header lines together, the closing blank line included.
pub(super) const MAX_HEADERS: u64 = 32 * 1024;
/// How long one read may wait for the client.
pub(super) const READ_TIMEOUT: Duration = Duration::from_secs(3);

/// What a client asked for; headers are read and checked but change nothing in the answer.
#[derive(Debug)]
pub(super) struct Request {
    /// `GET`, `HEAD` or whatever else the client sent.
    pub(super) method: String,
    /// The request target as sent, such as `/sensor-boom.html?x=1`.
    pub(super) target: String,
}

/// Why no request came out of a connection.
#[derive(Debug)]
pub(super) enum Refusal {
    /// The client closed the connection before its head was complete: nobody to answer.
    Closed,
    /// The client sent nothing before the deadline, as a browser's spare connection may not:
    /// closed without an answer.
    Idle,
    /// The head arrived but does not read as an HTTP/1 request (400).
    Malformed,
    /// The head did not arrive before the deadline (408).
    TooSlow,
    /// The request line is longer than `MAX_REQUEST_LINE` (414).
    LineTooLong,
    /// A header line is longer than `MAX_HEADER_LINE`, or all of them than `MAX_HEADERS` (431).
    HeadersTooLarge,
    /// The connection failed for another reason.
    Failed(io::Error),
}

impl Refusal {
    /// The status that tells the client why, or `None` when there is nobody to tell.
    pub(super) fn status(&self) -> Option<(u16, &'static str)> {
        match self {
            Refusal::Closed | Refusal::Idle | Refusal::Failed(_) => None,
            Refusal::Malformed => Some((400, "Bad Request")),
            Refusal::TooSlow => Some((408, "Request Timeout")),
            Refusal::LineTooLong => Some((414, "URI Too Long")),
            Refusal::HeadersTooLarge => Some((431, "Request Header Fields Too Large")),
        }
    }

    fn from_io(error: io::Error) -> Refusal {
        match error.kind() {
            io::ErrorKind::TimedOut | io::ErrorKind::WouldBlock => Refusal::TooSlow,
            io::ErrorKind::UnexpectedEof => Refusal::Closed,
            _ => Refusal::Failed(error),
        }
    }
}

/// Reads the head from `stream`, giving up at `deadline`.
pub(super) fn read_head(stream: &TcpStream, deadline: Instant) -> Result<Request, Refusal> {
    read_head_from(Timed::new(stream, READ_TIMEOUT, deadline))
}

/// Reads a head from any source; split out so that the limits can be checked without a socket.
fn read_head_from(source: impl Read) -> Result<Request, Refusal> {
    // A small fixed buffer: together with the limits below it bounds what one connection holds.
    let mut reader = BufReader::with_capacity(4096, source);
    let mut line = Vec::new();
    // A client may send a blank line before the request line (RFC 9112, section 2.2); skip one.
    match read_line(&mut reader, MAX_REQUEST_LINE, &mut line, Refusal::LineTooLong) {
        // What was read before a failed read stays in `line`; nothing at all means idle.
        Err(Refusal::TooSlow) if line.is_empty() => return Err(Refusal::Idle),
        result => result?,
    }
    if is_blank(&line) {
        read_line(&mut reader, MAX_REQUEST_LINE, &mut line, Refusal::LineTooLong)?;
    }
    let request = parse_request_line(&line).ok_or(Refusal::Malformed)?;
    let mut header_bytes = 0;
    loop {
        let limit = MAX_HEADER_LINE.min(MAX_HEADERS - header_bytes);
        if limit == 0 {
            return Err(Refusal::HeadersTooLarge);
        }
        read_line(&mut reader, limit, &mut line, Refusal::HeadersTooLarge)?;
        header_bytes += line.len() as u64;
        if is_blank(&line) {
            return Ok(request);
        }
        if !line[0].is_ascii_graphic() || !line.contains(&b':') {
            // A header line needs a name before its colon; a leading space would be the obsolete
            // line folding that RFC 9112 lets a server refuse.
            return Err(Refusal::Malformed);
        }
    }
}

/// Reads one line into `line`, never taking more than `limit` bytes from the client.
fn read_line(
    reader: &mut impl BufRead,
    limit: u64,
    line: &mut Vec<u8>,
    too_long: Refusal,
) -> Result<(), Refusal> {
    line.clear();
    reader.by_ref().take(limit).read_until(b'\n', line).map_err(Refusal::from_io)?;
    if line.ends_with(b"\n") {
        Ok(())
    } else if line.len() as u64 == limit {
        Err(too_long)
    } else {
        Err(Refusal::Closed)
    }
}

fn is_blank(line: &[u8]) -> bool {
    line == b"\r\n" || line == b"\n"
}

/// `GET /path HTTP/1.1` as a request, or `None` when it is not one. The target must be visible
/// ASCII, as URLs on the wire are (RFC 3986), so nothing the server echoes can break a header.
fn parse_request_line(line: &[u8]) -> Option<Request> {
    let line = line.strip_suffix(b"\n")?;
    let line = line.strip_suffix(b"\r").unwrap_or(line);
    let text = std::str::from_utf8(line).ok()?;
    let mut parts = text.split(' ');
    let (method, target, version) = (parts.next()?, parts.next()?, parts.next()?);
    let valid = parts.next().is_none()
        && !method.is_empty()
        && method.bytes().all(|b| b.is_ascii_alphabetic())
        && !target.is_empty()
        && target.bytes().all(|b| b.is_ascii_graphic())
        && matches!(version, "HTTP/1.0" | "HTTP/1.1");
    valid.then(|| Request { method: method.into(), target: target.into() })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn read(text: &[u8]) -> Result<Request, Refusal> {
        read_head_from(text)
    }

    #[test]
    fn a_plain_request_is_read() {
        let request = read(b"GET /a.html?x=1 HTTP/1.1\r\nHost: h\r\n\r\n").unwrap();
        assert_eq!((request.method.as_str(), request.target.as_str()), ("GET", "/a.html?x=1"));
        let request = read(b"\r\nHEAD / HTTP/1.0\n\n").unwrap();
        assert_eq!((request.method.as_str(), request.target.as_str()), ("HEAD", "/"));
    }

    #[test]
    fn each_limit_has_its_own_status() {
        let long_target = "a".repeat(MAX_REQUEST_LINE as usize);
        let request = format!("GET /{long_target} HTTP/1.1\r\n\r\n");
        assert!(matches!(read(request.as_bytes()), Err(Refusal::LineTooLong)));
        let long_header = format!("GET / HTTP/1.1\r\nX: {}\r\n\r\n", "a".repeat(MAX_HEADER_LINE as usize));
        assert!(matches!(read(long_header.as_bytes()), Err(Refusal::HeadersTooLarge)));
        // Each line within its own limit, but together over the total.
        let line = format!("X: {}\r\n", "a".repeat(1000));
        let many = format!("GET / HTTP/1.1\r\n{}\r\n", line.repeat(40));
        assert!(matches!(read(many.as_bytes()), Err(Refusal::HeadersTooLarge)));
    }

    #[test]
    fn what_is_not_a_request_is_malformed_or_unfinished() {
        for text in [&b"GET /\r\n\r\n"[..], b"GET / HTTP/2.0\r\n\r\n", b"GET  / HTTP/1.1\r\n\r\n"] {
            assert!(matches!(read(text), Err(Refusal::Malformed)), "{text:?}");
        }
        assert!(matches!(read(b"GET /\x01 HTTP/1.1\r\n\r\n"), Err(Refusal::Malformed)));
        assert!(matches!(read(b"GET / HTTP/1.1\r\n folded\r\n\r\n"), Err(Refusal::Malformed)));
        assert!(matches!(read(b"GET / HTTP/1.1\r\nHost: h\r\n"), Err(Refusal::Closed)));
    }

    /// Gives its bytes, then times out as a socket past its deadline does.
    struct Stalls(&'static [u8]);

    impl Read for Stalls {
        fn read(&mut self, buf: &mut [u8]) -> io::Result<usize> {
            if self.0.is_empty() {
                return Err(io::ErrorKind::TimedOut.into());
            }
            let n = self.0.read(buf)?;
            Ok(n)
        }
    }

    #[test]
    fn a_silent_client_is_idle_and_a_stalled_one_too_slow() {
        assert!(matches!(read_head_from(Stalls(b"")), Err(Refusal::Idle)));
        assert!(matches!(read_head_from(Stalls(b"GE")), Err(Refusal::TooSlow)));
        assert!(matches!(read_head_from(Stalls(b"GET / HTTP/1.1\r\nX: y")), Err(Refusal::TooSlow)));
        assert_eq!(Refusal::Idle.status(), None);
        assert_eq!(Refusal::TooSlow.status().map(|s| s.0), Some(408));
    }
}
