//! A fixed number of worker threads fed by a bounded queue of connections. However many clients
//! connect, the server runs the same number of threads and holds at most the queue's worth of
//! waiting connections; whoever comes when the queue is full is turned away at once by the
//! caller. Plain std threads suffice: each connection is one short request and one answer.

use std::net::TcpStream;
use std::panic::{catch_unwind, AssertUnwindSafe};
use std::sync::mpsc::{sync_channel, Receiver, SyncSender, TrySendError};
use std::sync::{Arc, Mutex, PoisonError};
use std::time::Instant;

use anyhow::{Context, Result};

/// A connection and the moment it was accepted, from which its deadline counts.
pub(super) type Job = (TcpStream, Instant);

/// The workers and the queue in front of them.
pub(super) struct Pool {
    queue: SyncSender<Job>,
}

impl Pool {
    /// Starts `workers` threads that each run `handle` on one queued connection after another;
    /// at most `queue` connections wait for a free worker.
    pub(super) fn start(
        workers: usize,
        queue: usize,
        handle: impl Fn(Job) + Send + Sync + 'static,
    ) -> Result<Pool> {
        let (sender, receiver) = sync_channel::<Job>(queue);
        let receiver = Arc::new(Mutex::new(receiver));
        let handle = Arc::new(handle);
        for index in 0..workers {
            let receiver = Arc::clone(&receiver);
            let handle = Arc::clone(&handle);
            std::thread::Builder::new()
                .name(format!("serve-{index}"))
                .spawn(move || work(&receiver, &*handle))
                .context("starting the server's workers")?;
        }
        Ok(Pool { queue: sender })
    }

    /// Queues `job`, or hands it back when every worker is busy and the queue is full.
    pub(super) fn offer(&self, job: Job) -> Result<(), Job> {
        self.queue.try_send(job).map_err(|error| match error {
            TrySendError::Full(job) | TrySendError::Disconnected(job) => job,
        })
    }
}

/// One worker's life: take the next connection and answer it, until the queue is gone.
fn work(receiver: &Mutex<Receiver<Job>>, handle: &dyn Fn(Job)) {
    loop {
        // The lock is held only while waiting for a connection, never while answering one.
        let job = receiver.lock().unwrap_or_else(PoisonError::into_inner).recv();
        let Ok(job) = job else { return };
        // A mistake in answering one request must not cost the server a worker for good.
        if catch_unwind(AssertUnwindSafe(|| handle(job))).is_err() {
            eprintln!("serve: a worker recovered from a panic while answering a request");
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::net::TcpListener;
    use std::sync::atomic::{AtomicUsize, Ordering};
    use std::time::Duration;

    #[test]
    fn a_full_queue_hands_the_connection_back() {
        let listener = TcpListener::bind("127.0.0.1:0").unwrap();
        let address = listener.local_addr().unwrap();
        let connect = || {
            let _client = TcpStream::connect(address).unwrap();
            (listener.accept().unwrap().0, Instant::now())
        };
        let answered = Arc::new(AtomicUsize::new(0));
        let counter = Arc::clone(&answered);
        // One worker that stays busy with its first connection, and room for one more.
        let pool = Pool::start(1, 1, move |_job| {
            counter.fetch_add(1, Ordering::SeqCst);
            std::thread::sleep(Duration::from_secs(60));
        })
        .unwrap();
        assert!(pool.offer(connect()).is_ok());
        while answered.load(Ordering::SeqCst) == 0 {
            std::thread::sleep(Duration::from_millis(5));
        }
        assert!(pool.offer(connect()).is_ok(), "the queue should take one connection");
        assert!(pool.offer(connect()).is_err(), "a full queue must refuse");
    }
}
