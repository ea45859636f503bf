//! The command against hostile surroundings: closed and full console streams, special
//! files as layout or font, files over the size cap, a byte-order mark, arguments
//! checked before any work. Every case must end with the documented exit code
//! (src/cli.rs: 0, 1 or 2), never a panic (101) or an abort (134), and never hang.

use std::os::fd::{FromRawFd as _, OwnedFd};
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};

fn segmask() -> Command {
    Command::new(env!("CARGO_BIN_EXE_segmask"))
}

fn fixture(rel: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures").join(rel)
}

/// A pipe whose reading end is already closed: every write to the other end fails
/// with EPIPE (POSIX write(2)), as when `head` has exited.
fn closed_pipe() -> Stdio {
    let mut fds = [0; 2];
    // SAFETY: pipe(2) fills two fresh descriptors; each is owned exactly once below.
    assert_eq!(unsafe { libc::pipe(fds.as_mut_ptr()) }, 0);
    drop(unsafe { OwnedFd::from_raw_fd(fds[0]) });
    Stdio::from(unsafe { OwnedFd::from_raw_fd(fds[1]) })
}

/// /dev/full: every write fails with ENOSPC (Linux null(4)).
fn full() -> Stdio {
    Stdio::from(std::fs::OpenOptions::new().write(true).open("/dev/full").unwrap())
}

fn no_panic(o: &Output, what: &str) {
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(!err.contains("panicked") && !err.contains("internal error"), "{what}: {err}");
    assert!(matches!(o.status.code(), Some(0..=2)), "{what}: {:?}\n{err}", o.status);
}

#[test]
fn closed_and_full_console_streams_end_quietly() {
    let good = fixture("good/minimal.yaml");
    let bad = fixture("bad/wrong-unit.yaml");
    // `segmask dump layout x | head -1` after head has gone: quiet, exit 0.
    let o = segmask().args(["dump", "layout"]).arg(&good).stdout(closed_pipe()).output().unwrap();
    no_panic(&o, "dump into a closed pipe");
    assert_eq!(o.status.code(), Some(0));
    assert!(o.stderr.is_empty(), "{}", String::from_utf8_lossy(&o.stderr));
    // The product of `dump` cannot be written: an error, exit 2, named on stderr.
    let o = segmask().args(["dump", "layout"]).arg(&good).stdout(full()).output().unwrap();
    no_panic(&o, "dump into a full stream");
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("standard output"));
    // Diagnostics into a closed or full stderr: the exit code is the same as always.
    for (stderr, what) in [(closed_pipe(), "closed"), (full(), "full")] {
        let o = segmask().arg("check").arg(&bad).stderr(stderr).output().unwrap();
        no_panic(&o, what);
        assert_eq!(o.status.code(), Some(2), "bad layout, {what} stderr");
    }
    let o = segmask().arg("check").arg(&good).stderr(closed_pipe()).output().unwrap();
    no_panic(&o, "check, closed stderr");
    let normal = segmask().arg("check").arg(&good).output().unwrap();
    assert_eq!(o.status.code(), normal.status.code());
}

#[test]
fn special_files_are_refused_without_reading_them() {
    let tmp = tempfile::tempdir().unwrap();
    let fifo = tmp.path().join("layout.yaml");
    let c = std::ffi::CString::new(fifo.to_str().unwrap()).unwrap();
    // SAFETY: a valid path; mkfifo(3) only creates the FIFO.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o600) }, 0);
    // Nobody ever writes to the FIFO: reading it would wait forever.
    for (file, word) in [(fifo.as_path(), "FIFO"), (Path::new("/dev/zero"), "a device"), (tmp.path(), "a folder")] {
        let o = segmask().arg("check").arg(file).output().unwrap();
        let err = String::from_utf8_lossy(&o.stderr);
        assert_eq!(o.status.code(), Some(2), "{err}");
        assert!(err.contains(word) && err.contains("not a regular file"), "{err}");
    }
    // Fonts: /dev/zero is refused as outside the layout's folder, and with that folder
    // allowed (--fonts-from) as a device; a FIFO beside the layout as a FIFO.
    let layout = tmp.path().join("fonts.yaml");
    let base = std::fs::read_to_string(fixture("good/minimal.yaml")).unwrap();
    std::fs::write(&layout, format!("{base}fonts: [/dev/zero, layout.yaml]\n")).unwrap();
    let o = segmask().arg("check").arg(&layout).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(2), "{err}");
    assert!(err.contains("error in `fonts[0]`: `/dev/zero` lies outside the layout's folder"), "{err}");
    assert!(err.contains("error in `fonts[1]`: the font file") && err.contains("FIFO"), "{err}");
    let o = segmask().arg("check").arg(&layout).arg("--fonts-from").arg("/dev").output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(err.contains("`/dev/zero` is a device, not a regular file"), "{err}");
}

#[test]
fn size_caps_bom_and_arguments() {
    let tmp = tempfile::tempdir().unwrap();
    // One byte over the 1 MiB cap (docs/layout-format.md, *Limits*).
    let big = tmp.path().join("big.yaml");
    std::fs::write(&big, vec![b'#'; (1 << 20) + 1]).unwrap();
    let o = segmask().arg("check").arg(&big).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(2));
    assert!(err.contains("1048577 bytes or more, larger than a layout file may be (allowed: at most 1048576 bytes)"), "{err}");
    // A byte-order mark (EF BB BF, Unicode 23.8) is not content: the same problem is
    // found on the same line as without it.
    let src = fixture("bad/wrong-unit.yaml");
    let bom = tmp.path().join("wrong-unit.yaml");
    let mut bytes = b"\xEF\xBB\xBF".to_vec();
    bytes.extend(std::fs::read(&src).unwrap());
    std::fs::write(&bom, bytes).unwrap();
    let o = segmask().arg("check").arg(&bom).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(err.contains(&format!("{}:7: error in `cell_gap`: unit `cm` not known", bom.display())), "{err}");
    // Arguments are checked before the layout is read: a bad date is reported even
    // though the layout does not exist, and nothing is created.
    let out = tmp.path().join("out");
    let o = segmask().args(["build", "no-such.yaml", "--date", "2025-02-30", "--out"]).arg(&out).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(2));
    assert!(err.contains("error in `--date`") && !err.contains("no-such.yaml"), "{err}");
    assert!(!out.exists());
    std::fs::write(&out, b"a file").unwrap();
    let o = segmask().arg("build").arg(fixture("good/minimal.yaml")).arg("--out").arg(&out).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(err.contains("error in `--out`") && err.contains("is not a folder"), "{err}");
    let o = segmask().arg("check").arg(&src).args(["--fonts-from", "no-such-folder"]).output().unwrap();
    assert!(String::from_utf8_lossy(&o.stderr).contains("error in `--fonts-from`"));
}
