//! The console of the `segmask` command: standard output and standard error written so
//! that a closed pipe (`segmask dump layout x.yaml | head -1`) or a full stream never
//! stops a run with a panic, as `println!` and `eprintln!` would.
//!
//! A broken pipe on either stream ends writing to that stream quietly and the run goes
//! on to its usual exit code (a build still writes its files). Any other failure of
//! standard output (a full disk behind `> file`) is an error for the commands whose
//! product is that output (`dump`); standard error is best effort, since there is
//! nowhere left to report its failure.

use std::io::Write as _;
use std::sync::atomic::{AtomicBool, Ordering};

static OUT_CLOSED: AtomicBool = AtomicBool::new(false);
static ERR_CLOSED: AtomicBool = AtomicBool::new(false);

/// Writes `text` and a newline to standard output. A closed pipe is not an error (the
/// reader has what it wanted); other failures are.
pub fn out(text: &str) -> std::io::Result<()> {
    if OUT_CLOSED.load(Ordering::Relaxed) {
        return Ok(());
    }
    let mut s = std::io::stdout().lock();
    let r = s.write_all(text.as_bytes()).and_then(|_| s.write_all(b"\n")).and_then(|_| s.flush());
    match r {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => {
            OUT_CLOSED.store(true, Ordering::Relaxed);
            Ok(())
        }
        r => r,
    }
}

/// Writes `text` and a newline to standard error; gives up on the stream at its first
/// failure.
pub fn err(text: &str) {
    if ERR_CLOSED.load(Ordering::Relaxed) {
        return;
    }
    let mut s = std::io::stderr().lock();
    if s.write_all(text.as_bytes()).and_then(|_| s.write_all(b"\n")).and_then(|_| s.flush()).is_err() {
        ERR_CLOSED.store(true, Ordering::Relaxed);
    }
}
