//! `segmask watch`: build, then build again whenever the layout (or a font file it
//! reads) is saved, until the process is ended (Ctrl-C).
//!
//! Takes the files to watch and a build to run; gives nothing back, it runs until
//! killed. Files are polled every 100 ms for their modification time and size rather
//! than watched through the operating system's notification API: a poll needs no
//! dependency, sees a save whether the editor writes the file in place or writes a new
//! file and renames it over the old one (which an inode watch loses), and 100 ms is far
//! inside the second a designer waits. A change is built once it has held still for one
//! poll, so a save written in several pieces is read once, whole. A killed build leaves
//! the output folder as it was: builds replace their files as one set
//! (docs/outputs.md, *One set*).

use std::path::PathBuf;
use std::time::{Duration, SystemTime};

/// How often the files are looked at.
const POLL: Duration = Duration::from_millis(100);

/// What a file looks like from outside: modification time and size, `None` while it is
/// missing (between an editor's delete and its rename).
type Signature = Option<(SystemTime, u64)>;

fn signature(p: &PathBuf) -> Signature {
    let m = std::fs::metadata(p).ok()?;
    Some((m.modified().ok()?, m.len()))
}

fn signatures(files: &[PathBuf]) -> Vec<Signature> {
    files.iter().map(signature).collect()
}

/// Runs `build` now and after every change to the files `watched` returns (asked again
/// after each build, since a save may add or drop a font file). Never returns.
pub fn watch(mut watched: impl FnMut() -> Vec<PathBuf>, mut build: impl FnMut()) -> ! {
    let mut files = watched();
    let mut seen = signatures(&files);
    build();
    loop {
        let now_files = watched();
        if now_files != files {
            // The last build read other font files: compare them from now on.
            files = now_files;
            seen = signatures(&files);
        }
        std::thread::sleep(POLL);
        let now = signatures(&files);
        if now == seen || now.iter().any(Option::is_none) {
            continue;
        }
        // Changed: build once it has held still for one poll.
        std::thread::sleep(POLL);
        let settled = signatures(&files);
        if settled != now {
            continue;
        }
        seen = settled;
        build();
    }
}
