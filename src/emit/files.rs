//! Writing a set of output files into a folder as one step.
//!
//! Takes in-memory files, the output folder and which old files the new set replaces;
//! gives the folder holding the complete new set, or — on any failure, or when the
//! process is killed at any moment — the complete old one. The whole set is written into
//! a fresh *staging* folder beside the target (`.OUT.new-PID-N`, created exclusively,
//! every file created exclusively, so nothing planted there is followed), together with
//! hard links to the files of the old folder that the new set does not replace (another
//! command's outputs, the user's notes); then the staging folder and the target are
//! exchanged in one step (`renameat2` with `RENAME_EXCHANGE` on Linux). Where the
//! exchange is not available the target is renamed aside (`.OUT.old-PID-N`) and the
//! staging folder renamed into its place; a run killed between those two renames leaves
//! the old set aside, and the next run puts it back before it does anything else.
//!
//! Writers into one folder are serialised by a lock on the folder that holds the target
//! (see `lock.rs`): a second run waits for the first, then finds no stale staging
//! folder of a live run. Stale staging folders of killed runs are removed under the lock.

use super::OutputFile;
use super::fault;
use crate::{Error, Result};
use std::io::Write as _;
use std::path::{Path, PathBuf};
use std::time::Duration;

/// How to write a set.
#[derive(Debug, Clone)]
pub struct WriteOptions {
    /// How long to wait for another run writing into the same folder.
    pub lock_wait: Duration,
}

impl Default for WriteOptions {
    fn default() -> WriteOptions {
        WriteOptions { lock_wait: Duration::from_secs(60) }
    }
}

/// Rejects names that would escape the folder or hide in it.
fn check_name(dir: &Path, name: &str) -> Result<()> {
    let plain = !name.is_empty()
        && !name.starts_with('.')
        && !name.contains(['/', '\\'])
        && name.len() <= 255
        && Path::new(name).file_name().is_some_and(|n| n == name);
    if plain {
        Ok(())
    } else {
        Err(Error::Bug(format!("output name `{name}` for {} is not a plain file name", dir.display())))
    }
}

fn io_err(path: &Path, what: &str) -> Error {
    Error::io(path, std::io::Error::other(what.to_string()))
}

/// The target folder as (folder that holds it, its name), with `.`, `..` and a symbolic
/// link at the target resolved, so that the swap happens where the files really live.
fn split_target(dir: &Path) -> Result<(PathBuf, String)> {
    let meta = std::fs::symlink_metadata(dir);
    let resolved = match &meta {
        Ok(m) if m.file_type().is_symlink() || dir.file_name().is_none() => {
            std::fs::canonicalize(dir).map_err(|e| Error::io(dir, e))?
        }
        _ => dir.to_path_buf(),
    };
    if let Ok(m) = std::fs::metadata(&resolved)
        && !m.is_dir()
    {
        return Err(io_err(dir, "exists and is not a folder"));
    }
    let name = resolved.file_name().and_then(|n| n.to_str()).map(str::to_string);
    let parent = resolved.parent().map(|p| if p.as_os_str().is_empty() { Path::new(".") } else { p });
    match (parent, name) {
        (Some(p), Some(n)) => Ok((p.to_path_buf(), n)),
        _ => Err(io_err(dir, "cannot be replaced as a whole (give --out a folder of its own)")),
    }
}

/// Writes `files` into `dir` (created if needed) as one set. Files already in `dir`
/// for which `replaced` is true are dropped (the old set); every other file is kept.
pub fn write_set(dir: &Path, files: &[OutputFile], replaced: &dyn Fn(&str) -> bool, opts: &WriteOptions) -> Result<()> {
    for f in files {
        check_name(dir, &f.name)?;
    }
    let (parent, base) = split_target(dir)?;
    std::fs::create_dir_all(&parent).map_err(|e| Error::io(&parent, e))?;
    let target = parent.join(&base);
    let _lock = super::lock::FolderLock::acquire(&parent, &target, opts.lock_wait)?;
    recover_and_clean(&parent, &base, &target)?;
    let keep = carried_over(&target, files, replaced)?;
    let staging = make_staging(&parent, &base)?;
    let staged = (|| {
        for (i, f) in files.iter().enumerate() {
            fault::point(&format!("file-{}", i + 1))?;
            write_new(&staging.join(&f.name), &f.bytes)?;
        }
        for name in &keep {
            carry(&target.join(name), &staging.join(name))?;
        }
        sync_dir(&staging);
        fault::point("staged")
    })();
    if let Err(e) = staged {
        let _ = std::fs::remove_dir_all(&staging);
        return Err(e);
    }
    swap_in(&parent, &base, &staging, &target)
}

/// Names of the entries of the old folder that the new set keeps. A folder inside the
/// target is refused: only files are carried over, and a user's folder must not vanish.
fn carried_over(target: &Path, files: &[OutputFile], replaced: &dyn Fn(&str) -> bool) -> Result<Vec<String>> {
    let entries = match std::fs::read_dir(target) {
        Ok(e) => e,
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Ok(Vec::new()),
        Err(e) => return Err(Error::io(target, e)),
    };
    let mut keep = Vec::new();
    for entry in entries {
        let entry = entry.map_err(|e| Error::io(target, e))?;
        let path = entry.path();
        let kind = entry.file_type().map_err(|e| Error::io(&path, e))?;
        if kind.is_dir() {
            return Err(io_err(
                &path,
                "is a folder inside the output folder; segmask replaces its outputs by swapping the whole output \
                 folder and carries over only files: move that folder or give --out a folder of its own",
            ));
        }
        let Some(name) = entry.file_name().to_str().map(str::to_string) else {
            return Err(io_err(&path, "has a name that is not UTF-8 and cannot be carried over"));
        };
        if !files.iter().any(|f| f.name == name) && !replaced(&name) {
            keep.push(name);
        }
    }
    keep.sort();
    Ok(keep)
}

/// A fresh staging folder `.BASE.new-PID-N`, created exclusively.
fn make_staging(parent: &Path, base: &str) -> Result<PathBuf> {
    for n in 0..1000 {
        let p = parent.join(format!(".{base}.new-{}-{n}", std::process::id()));
        match std::fs::create_dir(&p) {
            Ok(()) => return Ok(p),
            Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => continue,
            Err(e) => return Err(Error::io(&p, e)),
        }
    }
    Err(io_err(parent, "no free name for a staging folder"))
}

/// Creates `path` exclusively (never through a link planted there) and writes it in full.
fn write_new(path: &Path, bytes: &[u8]) -> Result<()> {
    let mut f = open_new(path)?;
    f.write_all(bytes).map_err(|e| Error::io(path, e))?;
    f.sync_all().map_err(|e| Error::io(path, e))
}

fn open_new(path: &Path) -> Result<std::fs::File> {
    let mut o = std::fs::OpenOptions::new();
    o.write(true).create_new(true);
    #[cfg(unix)]
    {
        use std::os::unix::fs::OpenOptionsExt as _;
        o.custom_flags(libc::O_NOFOLLOW);
    }
    o.open(path).map_err(|e| Error::io(path, e))
}

/// Puts a kept file of the old folder into the staging folder: a hard link (same file
/// system, no copy), else a copy; a symbolic link is recreated, never followed.
fn carry(from: &Path, to: &Path) -> Result<()> {
    let meta = std::fs::symlink_metadata(from).map_err(|e| Error::io(from, e))?;
    #[cfg(unix)]
    if meta.file_type().is_symlink() {
        let t = std::fs::read_link(from).map_err(|e| Error::io(from, e))?;
        return std::os::unix::fs::symlink(t, to).map_err(|e| Error::io(to, e));
    }
    if meta.is_file() && std::fs::hard_link(from, to).is_ok() {
        return Ok(());
    }
    let bytes = std::fs::read(from).map_err(|e| Error::io(from, e))?;
    write_new(to, &bytes)
}

/// Best effort: makes the names in `dir` durable (the files themselves are synced).
fn sync_dir(dir: &Path) {
    if let Ok(d) = std::fs::File::open(dir) {
        let _ = d.sync_all();
    }
}

/// Exchanges the staging folder with the target (or renames it into place when there
/// is no target yet), then removes what was the target.
fn swap_in(parent: &Path, base: &str, staging: &Path, target: &Path) -> Result<()> {
    if let Err(e) = fault::point("swap") {
        let _ = std::fs::remove_dir_all(staging);
        return Err(e);
    }
    let exists = std::fs::symlink_metadata(target).is_ok();
    if !exists {
        let r = std::fs::rename(staging, target).map_err(|e| Error::io(target, e));
        if r.is_err() {
            let _ = std::fs::remove_dir_all(staging);
        }
        sync_dir(parent);
        return r;
    }
    if !fault::active("no-exchange") && exchange(staging, target).is_ok() {
        sync_dir(parent);
        fault::point("swapped")?;
        // `staging` now holds the old set.
        let _ = std::fs::remove_dir_all(staging);
        return Ok(());
    }
    let aside = parent.join(format!(".{base}.old-{}-0", std::process::id()));
    if let Err(e) = std::fs::rename(target, &aside) {
        let _ = std::fs::remove_dir_all(staging);
        return Err(Error::io(target, e));
    }
    fault::point("between")?;
    if let Err(e) = std::fs::rename(staging, target) {
        let _ = std::fs::rename(&aside, target);
        let _ = std::fs::remove_dir_all(staging);
        return Err(Error::io(target, e));
    }
    sync_dir(parent);
    fault::point("swapped")?;
    let _ = std::fs::remove_dir_all(&aside);
    Ok(())
}

/// Exchanges two paths in one step (Linux `renameat2(RENAME_EXCHANGE)`).
#[cfg(target_os = "linux")]
fn exchange(a: &Path, b: &Path) -> std::io::Result<()> {
    use std::os::unix::ffi::OsStrExt as _;
    let ca = std::ffi::CString::new(a.as_os_str().as_bytes())?;
    let cb = std::ffi::CString::new(b.as_os_str().as_bytes())?;
    // SAFETY: both are valid NUL-terminated paths; the call only renames.
    let r = unsafe {
        libc::syscall(libc::SYS_renameat2, libc::AT_FDCWD, ca.as_ptr(), libc::AT_FDCWD, cb.as_ptr(), libc::RENAME_EXCHANGE)
    };
    if r == 0 { Ok(()) } else { Err(std::io::Error::last_os_error()) }
}

#[cfg(not(target_os = "linux"))]
fn exchange(_a: &Path, _b: &Path) -> std::io::Result<()> {
    Err(std::io::Error::from(std::io::ErrorKind::Unsupported))
}

/// Under the lock: puts back an old set a killed run left aside (the target is missing
/// and `.BASE.old-*` exists), then removes every other staging or aside folder of
/// `base` — no live run can own one, since every run holds the lock while it has one.
fn recover_and_clean(parent: &Path, base: &str, target: &Path) -> Result<()> {
    let (new, old) = (format!(".{base}.new-"), format!(".{base}.old-"));
    let mut stale: Vec<(bool, PathBuf)> = Vec::new();
    for entry in std::fs::read_dir(parent).map_err(|e| Error::io(parent, e))?.flatten() {
        let Some(name) = entry.file_name().to_str().map(str::to_string) else { continue };
        for (is_old, prefix) in [(false, &new), (true, &old)] {
            if let Some(rest) = name.strip_prefix(prefix.as_str())
                && rest.split('-').count() == 2
                && rest.split('-').all(|n| !n.is_empty() && n.bytes().all(|b| b.is_ascii_digit()))
            {
                stale.push((is_old, entry.path()));
            }
        }
    }
    if std::fs::symlink_metadata(target).is_err()
        && let Some((_, old)) = stale.iter().find(|(is_old, p)| *is_old && is_real_dir(p))
    {
        std::fs::rename(old, target).map_err(|e| Error::io(target, e))?;
    }
    for (_, p) in stale {
        match std::fs::symlink_metadata(&p) {
            Ok(m) if m.is_dir() => {
                let _ = std::fs::remove_dir_all(&p);
            }
            Ok(_) => {
                let _ = std::fs::remove_file(&p);
            }
            Err(_) => {}
        }
    }
    Ok(())
}

/// A folder, not a symbolic link to one.
fn is_real_dir(p: &Path) -> bool {
    std::fs::symlink_metadata(p).is_ok_and(|m| m.is_dir())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn file(name: &str, bytes: &[u8]) -> OutputFile {
        OutputFile { name: name.into(), bytes: bytes.to_vec() }
    }

    fn listing(dir: &Path) -> Vec<String> {
        let mut v: Vec<String> =
            std::fs::read_dir(dir).unwrap().map(|e| e.unwrap().file_name().into_string().unwrap()).collect();
        v.sort();
        v
    }

    #[test]
    fn names_with_folders_are_refused() {
        let d = Path::new("out");
        assert!(check_name(d, "a.svg").is_ok());
        for bad in ["", "../a.svg", "a/b.svg", ".hidden", ".."] {
            assert!(check_name(d, bad).is_err(), "{bad}");
        }
        assert!(check_name(d, &"a".repeat(256)).is_err());
    }

    #[test]
    fn a_new_set_replaces_the_old_and_keeps_other_files() {
        let tmp = tempfile::tempdir().unwrap();
        let out = tmp.path().join("out");
        let opts = WriteOptions::default();
        let is_ours = |n: &str| n.starts_with("x.");
        write_set(&out, &[file("x.a", b"1"), file("x.b", b"1")], &is_ours, &opts).unwrap();
        std::fs::write(out.join("notes.txt"), b"mine").unwrap();
        write_set(&out, &[file("x.a", b"2")], &is_ours, &opts).unwrap();
        assert_eq!(listing(&out), ["notes.txt", "x.a"]);
        assert_eq!(std::fs::read(out.join("x.a")).unwrap(), b"2");
        assert_eq!(std::fs::read(out.join("notes.txt")).unwrap(), b"mine");
        assert_eq!(listing(tmp.path()), ["out"], "no staging folder left beside the target");
    }

    #[test]
    fn stale_staging_is_removed_and_an_old_set_left_aside_is_restored() {
        let tmp = tempfile::tempdir().unwrap();
        let out = tmp.path().join("out");
        // A killed run left its staging folder, and another was killed between the
        // two renames of the fallback swap: the old set lies aside, the target is gone.
        std::fs::create_dir(tmp.path().join(".out.new-7-0")).unwrap();
        std::fs::create_dir(tmp.path().join(".out.old-8-0")).unwrap();
        std::fs::write(tmp.path().join(".out.old-8-0/keep.txt"), b"old").unwrap();
        // Not ours: another target's staging, and a name that only looks similar.
        std::fs::create_dir(tmp.path().join(".other.new-7-0")).unwrap();
        std::fs::create_dir(tmp.path().join(".out.new-x")).unwrap();
        write_set(&out, &[file("x.a", b"1")], &|_| false, &WriteOptions::default()).unwrap();
        assert_eq!(listing(&out), ["keep.txt", "x.a"]);
        assert_eq!(listing(tmp.path()), [".other.new-7-0", ".out.new-x", "out"]);
    }
}
