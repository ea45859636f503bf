//! Reading an input file (layout or font) safely: regular files only, size-capped,
//! UTF-8 with an optional byte-order mark.
//!
//! Takes a path and a size cap, gives the file's text or what is wrong with it. A FIFO,
//! a device such as `/dev/zero` or a folder is refused before a byte is read: the file
//! is opened without blocking (opening a FIFO for reading would wait for a writer
//! forever) and its type checked on the open handle, so a file swapped after a look at
//! its name cannot slip through. At most one byte more than the cap is ever read.

use std::io::Read as _;
use std::path::Path;

/// Why an input file cannot be used.
#[derive(Debug)]
pub enum ReadProblem {
    /// Opening or reading failed.
    Io(std::io::Error),
    /// The file is there but not usable: what is wrong, where (1-based line and column,
    /// when it is about the text) and what is allowed.
    Bad {
        /// 1-based line, when the problem is in the text.
        line: Option<usize>,
        /// 1-based column (characters), when the problem is in the text.
        column: Option<usize>,
        /// What is wrong.
        message: String,
        /// What is allowed.
        allowed: String,
    },
}

/// Reads the file at `path` as text; `cap` is the most bytes allowed, `what` names the
/// kind of file in messages ("layout file", "font file").
pub fn read_text(path: &Path, cap: u64, what: &str) -> Result<String, ReadProblem> {
    let mut file = open_nonblocking(path).map_err(ReadProblem::Io)?;
    let meta = file.metadata().map_err(ReadProblem::Io)?;
    if !meta.is_file() {
        return Err(bad(format!("is {}, not a regular file", kind(&meta)), format!("a {what} (a regular file)")));
    }
    if meta.len() > cap {
        return Err(too_large(meta.len(), cap, what));
    }
    let mut bytes = Vec::with_capacity(meta.len() as usize);
    // The length can grow while we read: never read more than one byte past the cap.
    (&mut file).take(cap + 1).read_to_end(&mut bytes).map_err(ReadProblem::Io)?;
    if bytes.len() as u64 > cap {
        return Err(too_large(bytes.len() as u64, cap, what));
    }
    text_of(bytes)
}

/// The text of `bytes`: UTF-8, a leading byte-order mark dropped; invalid UTF-8 is
/// located by line and column.
pub fn text_of(mut bytes: Vec<u8>) -> Result<String, ReadProblem> {
    if bytes.starts_with(b"\xEF\xBB\xBF") {
        bytes.drain(..3);
    }
    String::from_utf8(bytes).map_err(|e| {
        let good = &e.as_bytes()[..e.utf8_error().valid_up_to()];
        // `good` is valid UTF-8 by construction.
        let good = std::str::from_utf8(good).unwrap_or_default();
        let line = good.matches('\n').count() + 1;
        let column = good.rsplit('\n').next().unwrap_or("").chars().count() + 1;
        let byte = good.len() + 1;
        ReadProblem::Bad {
            line: Some(line),
            column: Some(column),
            message: format!("is not valid UTF-8 (the first bad byte is byte {byte} of the file)"),
            allowed: "text in UTF-8 (save the file as UTF-8)".into(),
        }
    })
}

fn bad(message: String, allowed: String) -> ReadProblem {
    ReadProblem::Bad { line: None, column: None, message, allowed }
}

fn too_large(len: u64, cap: u64, what: &str) -> ReadProblem {
    bad(format!("is {len} bytes or more, larger than a {what} may be"), format!("at most {cap} bytes"))
}

/// What a non-regular file is, for messages.
fn kind(meta: &std::fs::Metadata) -> &'static str {
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileTypeExt as _;
        let t = meta.file_type();
        if t.is_fifo() {
            return "a FIFO (named pipe)";
        }
        if t.is_char_device() || t.is_block_device() {
            return "a device";
        }
        if t.is_socket() {
            return "a socket";
        }
    }
    if meta.is_dir() { "a folder" } else { "not a plain file" }
}

/// Opens for reading without waiting for a FIFO's writer.
fn open_nonblocking(path: &Path) -> std::io::Result<std::fs::File> {
    let mut o = std::fs::OpenOptions::new();
    o.read(true);
    #[cfg(unix)]
    {
        use std::os::unix::fs::OpenOptionsExt as _;
        o.custom_flags(libc::O_NONBLOCK);
    }
    o.open(path)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn bad_at(r: Result<String, ReadProblem>) -> (Option<usize>, Option<usize>, String) {
        match r {
            Err(ReadProblem::Bad { line, column, message, .. }) => (line, column, message),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn bom_is_dropped_and_invalid_utf8_located() {
        // UTF-8 BOM is EF BB BF (Unicode Standard, 23.8 "Specials"; RFC 3629 section 6).
        assert_eq!(text_of(b"\xEF\xBB\xBFname: x\n".to_vec()).unwrap(), "name: x\n");
        // 0xFF never occurs in UTF-8 (RFC 3629 section 1).
        let (l, c, m) = bad_at(text_of(b"a: 1\nbc: \xC3\xA9\xFF\n".to_vec()));
        assert_eq!((l, c), (Some(2), Some(6)));
        assert!(m.contains("byte 12"), "{m}");
    }

    #[test]
    fn special_files_and_large_files_are_refused() {
        let dir = tempfile::tempdir().unwrap();
        let (_, _, m) = bad_at(read_text(dir.path(), 100, "layout file"));
        assert!(m.contains("a folder"), "{m}");
        #[cfg(unix)]
        {
            let (_, _, m) = bad_at(read_text(Path::new("/dev/zero"), 100, "layout file"));
            assert!(m.contains("a device"), "{m}");
            let fifo = dir.path().join("fifo");
            let c = std::ffi::CString::new(fifo.to_str().unwrap()).unwrap();
            // SAFETY: a valid NUL-terminated path; mkfifo only creates a file.
            assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o600) }, 0);
            let (_, _, m) = bad_at(read_text(&fifo, 100, "layout file"));
            assert!(m.contains("FIFO"), "{m}");
        }
        let big = dir.path().join("big.yaml");
        std::fs::write(&big, vec![b'#'; 101]).unwrap();
        let (_, _, m) = bad_at(read_text(&big, 100, "layout file"));
        assert!(m.contains("101 bytes"), "{m}");
        std::fs::write(&big, vec![b'#'; 100]).unwrap();
        assert_eq!(read_text(&big, 100, "layout file").unwrap().len(), 100);
    }
}
