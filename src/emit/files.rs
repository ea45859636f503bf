//! Atomic writing of output files.
//!
//! Takes in-memory files and a folder, gives files on disk or none: every file is first
//! written in full to a hidden temporary beside its final name, and only when all of them
//! are written are they renamed into place (a rename within one folder replaces the old
//! file in one step on POSIX file systems). On any failure the temporaries are removed.

use super::OutputFile;
use crate::{Error, Result};
use std::io::Write as _;
use std::path::{Path, PathBuf};

/// Temporary name for `name` in `dir`: `.NAME.tmp-PID`.
fn temp_path(dir: &Path, name: &str) -> PathBuf {
    dir.join(format!(".{name}.tmp-{}", std::process::id()))
}

/// Rejects names that would escape the folder or hide in it.
fn check_name(dir: &Path, name: &str) -> Result<()> {
    let plain = !name.is_empty()
        && !name.starts_with('.')
        && !name.contains(['/', '\\'])
        && Path::new(name).file_name().is_some_and(|n| n == name);
    if plain {
        Ok(())
    } else {
        Err(Error::Bug(format!("output name `{name}` for {} is not a plain file name", dir.display())))
    }
}

/// Writes one temporary file completely and flushes it to disk.
fn write_temp(path: &Path, bytes: &[u8]) -> Result<()> {
    let mut f = std::fs::File::create(path).map_err(|e| Error::io(path, e))?;
    f.write_all(bytes).map_err(|e| Error::io(path, e))?;
    f.sync_all().map_err(|e| Error::io(path, e))
}

/// Writes every file into `dir` (created if needed) through temporaries renamed into
/// place; on failure no temporary is left behind.
pub fn write_files(dir: &Path, files: &[OutputFile]) -> Result<()> {
    for f in files {
        check_name(dir, &f.name)?;
    }
    std::fs::create_dir_all(dir).map_err(|e| Error::io(dir, e))?;
    let mut temps: Vec<PathBuf> = Vec::new();
    let result = (|| {
        for f in files {
            let tmp = temp_path(dir, &f.name);
            temps.push(tmp.clone());
            write_temp(&tmp, &f.bytes)?;
        }
        for f in files {
            let (tmp, dest) = (temp_path(dir, &f.name), dir.join(&f.name));
            std::fs::rename(&tmp, &dest).map_err(|e| Error::io(&dest, e))?;
        }
        Ok(())
    })();
    if result.is_err() {
        for t in &temps {
            let _ = std::fs::remove_file(t);
        }
    }
    result
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_with_folders_are_refused() {
        let d = Path::new("out");
        assert!(check_name(d, "a.svg").is_ok());
        for bad in ["", "../a.svg", "a/b.svg", ".hidden", ".."] {
            assert!(check_name(d, bad).is_err(), "{bad}");
        }
    }
}
