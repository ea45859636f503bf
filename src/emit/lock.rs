//! The lock that keeps two runs from writing into one output folder at once.
//!
//! Takes the folder that holds the output folder; gives an exclusive advisory lock on it
//! (`flock` through `std::fs::File::try_lock`), held until dropped, or a clear error
//! once `wait` has passed. The folder itself is locked rather than a lock file beside
//! the output: nothing is left behind, and a lock file inside the output folder would
//! be swapped away with the old set. Runs that write into different folders of one
//! parent also wait for each other, but only for the few milliseconds of a swap.

use crate::{Error, Result};
use std::path::Path;
use std::time::{Duration, Instant};

/// A held lock; released when dropped (or when the process ends, however it ends).
pub struct FolderLock {
    _file: std::fs::File,
}

impl FolderLock {
    /// Locks `parent` for writing into `target`, waiting up to `wait`.
    pub fn acquire(parent: &Path, target: &Path, wait: Duration) -> Result<FolderLock> {
        let file = std::fs::File::open(parent).map_err(|e| Error::io(parent, e))?;
        let start = Instant::now();
        loop {
            match file.try_lock() {
                Ok(()) => return Ok(FolderLock { _file: file }),
                Err(std::fs::TryLockError::WouldBlock) if start.elapsed() < wait => {
                    std::thread::sleep(Duration::from_millis(50));
                }
                Err(std::fs::TryLockError::WouldBlock) => {
                    return Err(Error::io(
                        target,
                        std::io::Error::new(
                            std::io::ErrorKind::WouldBlock,
                            format!(
                                "another segmask run is writing into this folder; gave up after waiting {} s \
                                 (run again when it has finished, or give --lock-wait more seconds)",
                                wait.as_secs()
                            ),
                        ),
                    ));
                }
                Err(std::fs::TryLockError::Error(e)) => return Err(Error::io(parent, e)),
            }
        }
    }
}
