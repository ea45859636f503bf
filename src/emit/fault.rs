//! Fault points for testing how outputs survive failures and kills.
//!
//! Takes the environment variable `SEGMASK_FAULT` (unset in normal use: every point is
//! then a no-op), gives at a named point of the output writer either an error
//! (`fail:POINT`) or a stop (`hold:POINT:MARKER`: the marker file is created, then the
//! process sleeps until it is killed), and switches off the one-step folder exchange
//! (`no-exchange`, to test the two-rename fallback). Several are joined with `,`.
//! Points: `file-K` (before the K-th file of the set is written), `staged` (the new set
//! is complete beside the target), `swap` (the rename or exchange that puts the new set
//! in place, failing as a rename can fail), `between` (fallback only: the old set is renamed
//! aside, the new one not yet in place), `swapped` (the new set is in place, the old one
//! not yet removed). docs/outputs.md, *Testing failures*.

use crate::{Error, Result};

fn spec() -> Option<String> {
    std::env::var("SEGMASK_FAULT").ok().filter(|s| !s.is_empty())
}

/// True when the word `what` is among the faults asked for.
pub fn active(what: &str) -> bool {
    spec().is_some_and(|s| s.split(',').any(|f| f == what))
}

/// Fails or holds at `point` when asked to.
pub fn point(point: &str) -> Result<()> {
    let Some(s) = spec() else { return Ok(()) };
    for f in s.split(',') {
        let mut parts = f.splitn(3, ':');
        match (parts.next(), parts.next(), parts.next()) {
            (Some("fail"), Some(p), None) if p == point => {
                return Err(Error::io(point, std::io::Error::other("fault injected by SEGMASK_FAULT")));
            }
            (Some("hold"), Some(p), Some(marker)) if p == point => {
                let _ = std::fs::write(marker, std::process::id().to_string());
                loop {
                    std::thread::sleep(std::time::Duration::from_secs(1));
                }
            }
            _ => {}
        }
    }
    Ok(())
}
