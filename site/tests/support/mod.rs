//! Starts the built `modebench-site serve` on a small temporary site and talks to it over raw
//! TCP, so that the tests see exactly the bytes a client would. Each test file uses part of it.
#![allow(dead_code)]

use std::io::{BufRead, BufReader, Read, Write};
use std::net::{SocketAddr, TcpStream};
use std::path::PathBuf;
use std::process::{Child, ChildStdout, Command, Stdio};
use std::time::Duration;

/// A server process on its own temporary site; stopped and cleaned up when dropped.
pub(crate) struct Server {
    child: Child,
    // Kept open so that the server's standard output never closes under it.
    _stdout: BufReader<ChildStdout>,
    /// Where it listens.
    pub(crate) address: SocketAddr,
    /// The served folder.
    pub(crate) dir: PathBuf,
}

impl Server {
    /// Writes a small site to a fresh temporary folder named after `name` and serves it.
    pub(crate) fn start(name: &str) -> Server {
        let dir = scratch(name);
        let files: [(&str, &str); 8] = [
            ("index.html", "<!doctype html><title>home</title>"),
            ("sub/index.html", "<p>sub</p>"),
            ("assets/boot.js", "export {};"),
            ("assets/engine.wasm", "\0asm"),
            ("assets/site.css", "body{}"),
            ("assets/mark.svg", "<svg xmlns=\"http://www.w3.org/2000/svg\"/>"),
            ("site.webmanifest", "{}"),
            ("sw.js", "self;"),
        ];
        for (path, text) in files {
            let path = dir.join(path);
            std::fs::create_dir_all(path.parent().unwrap()).unwrap();
            std::fs::write(path, text).unwrap();
        }
        let mut child = Command::new(env!("CARGO_BIN_EXE_modebench-site"))
            .args(["serve", "--dir", dir.to_str().unwrap(), "--port", "0"])
            .stdout(Stdio::piped())
            .spawn()
            .expect("starting modebench-site serve");
        let mut stdout = BufReader::new(child.stdout.take().unwrap());
        let mut line = String::new();
        stdout.read_line(&mut line).unwrap();
        let address = line
            .split("http://")
            .nth(1)
            .and_then(|rest| rest.split('/').next())
            .and_then(|address| address.parse().ok())
            .unwrap_or_else(|| panic!("the server did not say where it listens: {line:?}"));
        Server { child, _stdout: stdout, address, dir }
    }

    /// A new connection to the server.
    pub(crate) fn connect(&self) -> TcpStream {
        TcpStream::connect(self.address).unwrap()
    }

    /// Sends `raw` on a new connection and reads the answer until the server closes.
    pub(crate) fn send(&self, raw: &[u8]) -> Answer {
        let mut stream = self.connect();
        stream.write_all(raw).unwrap();
        read_answer(&mut stream)
    }

    /// `GET target` as a browser would send it.
    pub(crate) fn get(&self, target: &str) -> Answer {
        self.send(format!("GET {target} HTTP/1.1\r\nHost: {}\r\n\r\n", self.address).as_bytes())
    }

    /// A field of the server's `/proc/<pid>/status` (`Threads`, or `VmHWM` in kB).
    pub(crate) fn status_field(&self, name: &str) -> u64 {
        let status = std::fs::read_to_string(format!("/proc/{}/status", self.child.id())).unwrap();
        let line = status.lines().find(|line| line.starts_with(&format!("{name}:"))).unwrap();
        line.split_whitespace().nth(1).unwrap().parse().unwrap()
    }
}

impl Drop for Server {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
        let _ = std::fs::remove_dir_all(&self.dir);
    }
}

/// A fresh, empty temporary folder for this test process.
pub(crate) fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("modebench-serve-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Reads from `stream` until the server closes it (or resets it, or ten seconds pass) and parses
/// what came as an answer.
pub(crate) fn read_answer(stream: &mut TcpStream) -> Answer {
    stream.set_read_timeout(Some(Duration::from_secs(10))).unwrap();
    let mut bytes = Vec::new();
    let mut buffer = [0; 8192];
    // A reset after the answer (the server closing with request bytes unread) ends the answer.
    while let Ok(n @ 1..) = stream.read(&mut buffer) {
        bytes.extend_from_slice(&buffer[..n]);
    }
    Answer::parse(&bytes)
}

/// One answer as received; `status` is 0 when nothing that reads as an answer came.
#[derive(Debug)]
pub(crate) struct Answer {
    pub(crate) status: u16,
    pub(crate) head: String,
    pub(crate) body: Vec<u8>,
}

impl Answer {
    fn parse(bytes: &[u8]) -> Answer {
        let split = bytes.windows(4).position(|w| w == b"\r\n\r\n");
        let Some(split) = split else {
            return Answer { status: 0, head: String::from_utf8_lossy(bytes).into(), body: Vec::new() };
        };
        let head = String::from_utf8_lossy(&bytes[..split]).into_owned();
        let status = head.split(' ').nth(1).and_then(|s| s.parse().ok()).unwrap_or(0);
        Answer { status, head, body: bytes[split + 4..].to_vec() }
    }

    /// The value of header `name`, matched without regard to case.
    pub(crate) fn header(&self, name: &str) -> Option<&str> {
        self.head.lines().skip(1).find_map(|line| {
            let (key, value) = line.split_once(':')?;
            key.eq_ignore_ascii_case(name).then(|| value.trim())
        })
    }
}
