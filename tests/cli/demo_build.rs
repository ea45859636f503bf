//! Shared by the integration tests: builds a demo layout through the real `segmask build`
//! once per layout into a folder kept for the whole run, with a fixed date so the
//! outputs are byte-for-byte repeatable.

use std::collections::HashMap;
use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::atomic::{AtomicUsize, Ordering};
use std::sync::{Arc, Mutex, OnceLock};

/// Builds `demo-layouts/NAME.yaml` once for the whole test run; gives a fresh scratch
/// folder for the caller's own files (kept while the value lives) and the shared output
/// folder, which callers only read. Panics with segmask's messages unless it exits 0.
pub fn build_demo(name: &str) -> (tempfile::TempDir, PathBuf) {
    let layout = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(format!("{name}.yaml"));
    build_layout(&layout, name)
}

/// Builds any layout file like [`build_demo`], once per path; `name` is for messages.
pub fn build_layout(layout: &Path, name: &str) -> (tempfile::TempDir, PathBuf) {
    // One slot per layout: the first test to ask builds, the others wait for that build
    // rather than routing the same glass again (the suite's time is mostly routing).
    static BUILT: OnceLock<Mutex<HashMap<PathBuf, Arc<OnceLock<PathBuf>>>>> = OnceLock::new();
    static KEEP: OnceLock<tempfile::TempDir> = OnceLock::new();
    let slot = BUILT.get_or_init(Default::default).lock().unwrap().entry(layout.to_path_buf()).or_default().clone();
    let out = slot.get_or_init(|| {
        let root = KEEP.get_or_init(|| tempfile::tempdir().unwrap());
        static NEXT: AtomicUsize = AtomicUsize::new(0);
        let out = root.path().join(format!("{name}-{}", NEXT.fetch_add(1, Ordering::Relaxed)));
        build_into(layout, &out, name);
        out
    });
    (tempfile::tempdir().unwrap(), out.clone())
}

/// Runs the real `segmask build` of `layout` into `out` with a fixed date.
fn build_into(layout: &Path, out: &Path, name: &str) {
    let o = Command::new(env!("CARGO_BIN_EXE_segmask"))
        .arg("build")
        .arg(layout)
        .arg("--out")
        .arg(out)
        .args(["--date", "2026-12-01"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{name} must build clean:\n{}", String::from_utf8_lossy(&o.stderr));
}

/// The segment map `NAME.segmap.csv` of a build as element → column → value, read per
/// RFC 4180 §2 (quoted fields may hold commas and doubled quotes), written here
/// independently of segmask's writer.
pub fn segmap(out: &Path, name: &str) -> std::collections::BTreeMap<String, std::collections::BTreeMap<String, String>> {
    let text = std::fs::read_to_string(out.join(format!("{name}.segmap.csv"))).unwrap();
    let mut rows = text.lines().map(|l| {
        let (mut cells, mut cell, mut quoted) = (vec![], String::new(), false);
        let mut it = l.chars().peekable();
        while let Some(c) = it.next() {
            match (c, quoted) {
                ('"', true) if it.peek() == Some(&'"') => {
                    it.next();
                    cell.push('"');
                }
                ('"', _) => quoted = !quoted,
                (',', false) => cells.push(std::mem::take(&mut cell)),
                _ => cell.push(c),
            }
        }
        cells.push(cell);
        cells
    });
    let header = rows.next().unwrap();
    rows.map(|r| (r[0].clone(), header.iter().cloned().zip(r).collect())).collect()
}
