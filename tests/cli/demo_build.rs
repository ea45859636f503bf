//! Shared by the integration tests: builds a demo layout through the real `segmask build`
//! once per layout into a folder kept for the whole run, with a fixed date so the
//! outputs are byte-for-byte repeatable.

use std::collections::{BTreeMap, HashMap};
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

/// The names of every demo layout (`demo-layouts/*.yaml`), sorted.
pub fn demo_names() -> Vec<String> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts");
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .filter_map(|e| {
            let p = e.ok()?.path();
            (p.extension()? == "yaml").then(|| p.file_stem().unwrap().to_string_lossy().into_owned())
        })
        .collect();
    v.sort();
    assert!(v.len() >= 3, "the demo layouts are missing");
    v
}

/// Every demo layout and the negative-resist mask fixture (the other tone of every film
/// and mask writer), as (name, path), the demos first.
pub fn demos_and_negative() -> Vec<(String, PathBuf)> {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut v: Vec<(String, PathBuf)> =
        demo_names().into_iter().map(|n| (n.clone(), root.join("demo-layouts").join(format!("{n}.yaml")))).collect();
    v.push(("etch-negative".into(), root.join("tests/fixtures/masks/etch-negative.yaml")));
    v
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

/// The segment map `NAME.segmap.csv` of a build as element → column → value.
pub fn segmap(out: &Path, name: &str) -> BTreeMap<String, BTreeMap<String, String>> {
    let (header, rows) = read_csv(&out.join(format!("{name}.segmap.csv")));
    rows.into_iter().map(|r| (r[&header[0]].clone(), r)).collect()
}

/// Reads a CSV table per RFC 4180 §2 (written here independently of the writer): fields
/// split at commas outside quotes, `""` inside quotes is one quote, records end at a line
/// break outside quotes. Gives the header and the records as name → value maps.
pub fn read_csv(path: &Path) -> (Vec<String>, Vec<BTreeMap<String, String>>) {
    let text = std::fs::read_to_string(path).unwrap();
    let mut records: Vec<Vec<String>> = vec![];
    let (mut rec, mut cell, mut quoted) = (vec![], String::new(), false);
    let mut chars = text.chars().peekable();
    while let Some(c) = chars.next() {
        match (c, quoted) {
            ('"', true) if chars.peek() == Some(&'"') => {
                chars.next();
                cell.push('"');
            }
            ('"', _) => quoted = !quoted,
            (',', false) => rec.push(std::mem::take(&mut cell)),
            ('\n', false) => {
                rec.push(std::mem::take(&mut cell));
                records.push(std::mem::take(&mut rec));
            }
            _ => cell.push(c),
        }
    }
    assert!(cell.is_empty() && rec.is_empty() && !quoted, "{}: last record must end in a line break", path.display());
    let header = records.remove(0);
    for r in &records {
        // RFC 4180 §2.4: every record has as many fields as the header.
        assert_eq!(r.len(), header.len(), "{}: {r:?}", path.display());
    }
    let rows = records.into_iter().map(|r| header.iter().cloned().zip(r).collect()).collect();
    (header, rows)
}

