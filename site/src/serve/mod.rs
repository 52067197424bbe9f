//! `serve`: a small static file server for a built site, on 127.0.0.1, for a laptop, a bench or a
//! small internal host. It sends the right types for `.wasm` and `.js` (browsers refuse to
//! stream-compile or import otherwise) and the site's content security policy as a header. It
//! never builds anything.
//!
//! It stays small whatever clients do: a fixed pool of workers behind a bounded queue (`pool`),
//! request heads read within byte limits and a deadline (`head`), files only from inside the
//! served folder and redirects only to the same origin (`resolve`), answers sent in chunks within
//! a deadline (`response`).

mod head;
mod pool;
mod resolve;
mod response;
mod timed;

use std::io::{Read, Write};
use std::net::{Ipv4Addr, Shutdown, TcpListener, TcpStream};
use std::path::Path;
use std::time::{Duration, Instant};

use anyhow::{bail, Context, Result};

use crate::args::ServeOptions;
use head::Refusal;
use pool::{Job, Pool};
use resolve::Resolved;
use response::Response;
use timed::{is_client_gone, Timed};

/// Workers answering requests. A browser opens at most six connections to one host, so this
/// serves a few readers at once; each worker holds at most a request head and one file chunk.
const WORKERS: usize = 16;
/// Connections that may wait for a worker; more are answered 503 at once.
const QUEUE: usize = 64;
/// How long a client has, from the moment its connection is accepted, to send its whole head.
/// A browser sends it at once; a client still sending after this is trickling on purpose.
const HEAD_DEADLINE: Duration = Duration::from_secs(5);
/// What a connection that waited in the queue past its deadline still gets, so that a head which
/// arrived while it waited is read rather than dropped.
const QUEUED_GRACE: Duration = Duration::from_millis(200);
/// How long, and for how many bytes, the rest of a refused request is read and dropped after the
/// refusal is sent, so that the client reads the refusal before the connection closes.
const LINGER: Duration = Duration::from_millis(500);
const LINGER_BYTES: usize = 256 * 1024;

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
    let root = dir.clone();
    let pool = Pool::start(WORKERS, QUEUE, move |job| connection(job, &root))?;
    // Tests read this line to learn the port when they ask for port 0. Nothing else goes to
    // standard output: a caller may stop reading it after this line.
    println!("Serving {} at http://{address}/ (Ctrl-C stops)", dir.display());
    std::io::stdout().flush()?;
    loop {
        match listener.accept() {
            Ok((stream, _)) => {
                if let Err((stream, _)) = pool.offer((stream, Instant::now())) {
                    turn_away(stream);
                }
            }
            // Out of file descriptors, most likely: wait for some connections to end rather
            // than spin on the same error.
            Err(_) => std::thread::sleep(Duration::from_millis(50)),
        }
    }
}

/// Answers 503 to a connection that finds the queue full, without ever blocking the acceptor:
/// the answer fits in a fresh connection's send buffer, and if it does not it is dropped.
fn turn_away(mut stream: TcpStream) {
    if stream.set_nonblocking(true).is_ok() {
        let _ = stream.write(&Response::busy().into_bytes());
        let _ = stream.shutdown(Shutdown::Write);
    }
}

/// Reads one request and answers it; the connection is closed after each answer.
fn connection((stream, accepted): Job, root: &Path) {
    let deadline = (accepted + HEAD_DEADLINE).max(Instant::now() + QUEUED_GRACE);
    let result = match head::read_head(&stream, deadline) {
        Ok(request) => {
            let head_only = request.method == "HEAD";
            answer(root, &request.method, &request.target).send(&stream, head_only)
        }
        Err(Refusal::Failed(error)) => Err(error),
        Err(refusal) => match refusal.status() {
            Some((status, reason)) => {
                let sent = Response::text(status, reason, "The request was refused.\n").send(&stream, false);
                // A client that was too slow is not sending much; one refused for its size or
                // form may still be, and its unread bytes would reset the connection.
                if !matches!(refusal, Refusal::TooSlow) {
                    linger(&stream);
                }
                sent
            }
            None => Ok(()),
        },
    };
    if let Err(error) = result {
        if !is_client_gone(&error) {
            eprintln!("serve: {error}");
        }
    }
}

/// The answer to `method target`.
fn answer(root: &Path, method: &str, target: &str) -> Response {
    if !matches!(method, "GET" | "HEAD") {
        return Response::method_not_allowed();
    }
    match resolve::resolve(root, target) {
        Resolved::File(path) => Response::file(&path),
        Resolved::Redirect(location) => Response::redirect(location),
        Resolved::NotFound => Response::text(404, "Not Found", "Not found.\n"),
        Resolved::BadRequest => Response::text(400, "Bad Request", "That path is not allowed.\n"),
    }
}

/// After a refusal, reads and drops what the client is still sending, for a bounded time and
/// amount, so that closing with unread data does not reset the connection before the client has
/// read the refusal.
fn linger(stream: &TcpStream) {
    let _ = stream.shutdown(Shutdown::Write);
    let mut rest = Timed::new(stream, LINGER, Instant::now() + LINGER);
    let mut sink = [0; 4096];
    let mut drained = 0;
    while drained < LINGER_BYTES {
        match rest.read(&mut sink) {
            Ok(0) | Err(_) => return,
            Ok(n) => drained += n,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_folder_without_its_slash_is_redirected_and_files_are_found() {
        let dir = std::env::temp_dir().join(format!("modebench-serve-test-{}", std::process::id()));
        std::fs::create_dir_all(dir.join("sub")).unwrap();
        std::fs::write(dir.join("sub/index.html"), "<p>hi</p>").unwrap();
        let dir = dir.canonicalize().unwrap();
        assert!(answer(&dir, "GET", "/sub").into_bytes().starts_with(b"HTTP/1.1 301 "));
        assert_eq!(resolve::resolve(&dir, "//sub"), Resolved::Redirect("/sub/".into()));
        assert_eq!(resolve::resolve(&dir, "/sub/?q=1"), Resolved::File(dir.join("sub/index.html")));
        assert_eq!(resolve::resolve(&dir, "/nothing.html"), Resolved::NotFound);
        assert_eq!(resolve::resolve(&dir, "/../x"), Resolved::BadRequest);
        assert!(answer(&dir, "POST", "/").into_bytes().starts_with(b"HTTP/1.1 405 "));
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
