//! `modebench-site serve` stays small whatever a client does: an endless request line or
//! oversized headers are refused without being buffered, a client trickling its request is cut
//! off after a few seconds in total, and hundreds of idle or trickling connections add neither
//! threads nor memory.

// The figures come from /proc, which is Linux's; the server itself builds anywhere.
#![cfg(target_os = "linux")]

mod support;

use std::io::Write;
use std::net::TcpStream;
use std::time::{Duration, Instant};

use support::{read_answer, Server};

/// The server's deadline for a whole request head (`HEAD_DEADLINE` in `serve/mod.rs`).
const HEAD_DEADLINE: Duration = Duration::from_secs(5);

#[test]
fn an_endless_request_line_gets_414_and_is_never_buffered() {
    let server = Server::start("long-line");
    // A first answer touches everything a worker needs, so that the peak below measures the
    // long line alone.
    assert_eq!(server.get("/").status, 200);
    let peak_before = server.status_field("VmHWM");
    let mut stream = server.connect();
    let mut writer = stream.try_clone().unwrap();
    // 100 MB without a newline, streamed from another thread while this one waits for the
    // answer; the writes fail as soon as the server has closed the connection.
    let streamer = std::thread::spawn(move || {
        let chunk = vec![b'a'; 1 << 20];
        let _ = writer.write_all(b"GET /");
        for _ in 0..100 {
            if writer.write_all(&chunk).is_err() {
                break;
            }
        }
    });
    let answer = read_answer(&mut stream);
    drop(stream);
    streamer.join().unwrap();
    assert_eq!(answer.status, 414, "{answer:?}");
    let grown_kb = server.status_field("VmHWM").saturating_sub(peak_before);
    println!("one 100 MB request line: the server's peak memory grew by {grown_kb} kB");
    assert!(grown_kb < 4096, "the server's peak memory grew by {grown_kb} kB for one long line");
}

#[test]
fn oversized_headers_get_431() {
    let server = Server::start("headers");
    // A 4 kB cookie is an ordinary header and passes.
    let cookie = format!("GET / HTTP/1.1\r\nCookie: {}\r\n\r\n", "c".repeat(4000));
    assert_eq!(server.send(cookie.as_bytes()).status, 200);
    let one_long = format!("GET / HTTP/1.1\r\nX-Long: {}\r\n\r\n", "a".repeat(10_000));
    assert_eq!(server.send(one_long.as_bytes()).status, 431, "one header line of 10 kB");
    let line = format!("X-Many: {}\r\n", "a".repeat(1000));
    let many = format!("GET / HTTP/1.1\r\n{}\r\n", line.repeat(40));
    assert_eq!(server.send(many.as_bytes()).status, 431, "40 header lines of 1 kB each");
}

#[test]
fn a_client_trickling_one_byte_a_second_is_cut_off_at_the_deadline() {
    let server = Server::start("slow");
    let started = Instant::now();
    let mut stream = server.connect();
    let mut reader = stream.try_clone().unwrap();
    let watcher = std::thread::spawn(move || (read_answer(&mut reader), started.elapsed()));
    // Each byte comes well within any per-read timeout; only a deadline for the whole head
    // stops this client.
    stream.write_all(b"GET / HTTP/1.1\r\nX-Slow: ").unwrap();
    while !watcher.is_finished() && started.elapsed() < HEAD_DEADLINE * 3 {
        std::thread::sleep(Duration::from_secs(1));
        if stream.write_all(b"a").is_err() {
            break;
        }
    }
    assert!(
        watcher.is_finished(),
        "the server still listened to the slow client after {:?}",
        started.elapsed()
    );
    let (answer, cut_off) = watcher.join().unwrap();
    assert!(cut_off <= HEAD_DEADLINE + Duration::from_secs(2), "the connection was open for {cut_off:?}");
    assert!(matches!(answer.status, 408 | 0), "{answer:?}");
}

#[test]
fn hundreds_of_idle_connections_add_no_threads_and_a_request_still_gets_through() {
    let server = Server::start("idle");
    let threads_before = server.status_field("Threads");
    assert!(threads_before < 64, "the server starts {threads_before} threads");
    let idle: Vec<TcpStream> = (0..500).map(|_| server.connect()).collect();
    std::thread::sleep(Duration::from_millis(500));
    let threads = server.status_field("Threads");
    assert!(
        threads <= threads_before + 2,
        "{threads} threads with 500 idle connections, {threads_before} before"
    );
    // While the idle connections fill the workers and the queue, a request is turned away at
    // once (503, or closed); it is answered as soon as they have had their time.
    let started = Instant::now();
    loop {
        let answer = server.get("/");
        if answer.status == 200 {
            break;
        }
        assert!(matches!(answer.status, 503 | 0), "{answer:?}");
        assert!(started.elapsed() < HEAD_DEADLINE * 2, "still no answer after {:?}", started.elapsed());
        std::thread::sleep(Duration::from_millis(200));
    }
    drop(idle);
}

#[test]
fn hundreds_of_trickling_clients_add_neither_threads_nor_memory() {
    let server = Server::start("trickling");
    assert_eq!(server.get("/").status, 200);
    let threads_before = server.status_field("Threads");
    let peak_before = server.status_field("VmHWM");
    // Each client starts a request and then sends one byte a second, well within any per-read
    // timeout, for twice the head deadline: only a deadline for the whole head, and a fixed
    // number of workers, keep the server's threads and memory where they were.
    let mut clients: Vec<TcpStream> = (0..300)
        .map(|_| {
            let mut stream = server.connect();
            let _ = stream.write_all(b"GET / HTTP/1.1\r\nX-Slow: ");
            stream
        })
        .collect();
    let started = Instant::now();
    let mut most_threads = threads_before;
    while started.elapsed() < HEAD_DEADLINE * 2 {
        std::thread::sleep(Duration::from_secs(1));
        for client in &mut clients {
            // A client the server has answered or turned away finds its connection closed.
            let _ = client.write_all(b"a");
        }
        most_threads = most_threads.max(server.status_field("Threads"));
    }
    assert!(
        most_threads <= threads_before + 2,
        "{most_threads} threads with 300 trickling clients, {threads_before} before"
    );
    // Each connection costs the kernel a socket, not the server a buffer that grows: 300 of them
    // (twice what 16 workers and a queue of 64 hold at once) stay within a few megabytes.
    let grown_kb = server.status_field("VmHWM").saturating_sub(peak_before);
    println!(
        "300 trickling clients: at most {most_threads} threads ({threads_before} before), peak memory \
         grew by {grown_kb} kB"
    );
    assert!(grown_kb < 8192, "the server's peak memory grew by {grown_kb} kB for 300 trickling clients");
    drop(clients);
    let started = Instant::now();
    loop {
        let answer = server.get("/");
        if answer.status == 200 {
            break;
        }
        assert!(
            started.elapsed() < HEAD_DEADLINE * 2,
            "still no answer after {:?}: {answer:?}",
            started.elapsed()
        );
        std::thread::sleep(Duration::from_millis(200));
    }
}
