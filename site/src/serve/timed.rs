//! A connection whose every read and write waits at most a fixed time, and all of them together
//! no later than one deadline, so that a client that trickles bytes cannot hold a worker longer
//! than the deadline by sending just often enough to beat the per-call timeout.

use std::io::{self, Read, Write};
use std::net::TcpStream;
use std::time::{Duration, Instant};

/// A borrowed connection with a per-call timeout and an overall deadline.
pub(super) struct Timed<'a> {
    stream: &'a TcpStream,
    per_call: Duration,
    deadline: Instant,
}

impl<'a> Timed<'a> {
    /// Reads and writes on `stream` wait at most `per_call` each, and fail once `deadline` has
    /// passed.
    pub(super) fn new(stream: &'a TcpStream, per_call: Duration, deadline: Instant) -> Timed<'a> {
        Timed { stream, per_call, deadline }
    }

    /// How long the next call may wait, or a `TimedOut` error when the deadline has passed.
    fn wait(&self) -> io::Result<Duration> {
        let left = self.deadline.saturating_duration_since(Instant::now());
        if left.is_zero() {
            return Err(io::Error::new(io::ErrorKind::TimedOut, "the connection's deadline passed"));
        }
        Ok(left.min(self.per_call))
    }
}

impl Read for Timed<'_> {
    fn read(&mut self, buf: &mut [u8]) -> io::Result<usize> {
        self.stream.set_read_timeout(Some(self.wait()?))?;
        let mut stream = self.stream;
        stream.read(buf)
    }
}

impl Write for Timed<'_> {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        self.stream.set_write_timeout(Some(self.wait()?))?;
        let mut stream = self.stream;
        stream.write(buf)
    }

    fn flush(&mut self) -> io::Result<()> {
        let mut stream = self.stream;
        stream.flush()
    }
}

/// Whether an error only means that the client was too slow or went away, which is the client's
/// business and not worth a line on the server's console.
pub(super) fn is_client_gone(error: &io::Error) -> bool {
    use io::ErrorKind::*;
    matches!(error.kind(), TimedOut | WouldBlock | BrokenPipe | ConnectionReset | ConnectionAborted)
}
