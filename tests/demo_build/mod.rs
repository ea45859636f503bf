//! Shared by the integration tests: builds a demo layout through the real `segmask build`
//! into a fresh folder, with a fixed date so the outputs are byte-for-byte repeatable.

use std::path::{Path, PathBuf};
use std::process::Command;

/// Builds `demo-layouts/NAME.yaml`; gives the folder (kept alive while the value lives)
/// and the output folder in it. Panics with segmask's messages unless it exits 0.
pub fn build_demo(name: &str) -> (tempfile::TempDir, PathBuf) {
    let layout = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(format!("{name}.yaml"));
    build_layout(&layout, name)
}

/// Builds any layout file like [`build_demo`]; `name` is for messages.
#[allow(dead_code)]
pub fn build_layout(layout: &Path, name: &str) -> (tempfile::TempDir, PathBuf) {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let o = Command::new(env!("CARGO_BIN_EXE_segmask"))
        .arg("build")
        .arg(&layout)
        .arg("--out")
        .arg(&out)
        .args(["--date", "2026-12-01"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{name} must build clean:\n{}", String::from_utf8_lossy(&o.stderr));
    (dir, out)
}

/// The segment map `NAME.segmap.csv` of a build as element → column → value, read per
/// RFC 4180 §2 (quoted fields may hold commas and doubled quotes), written here
/// independently of segmask's writer.
#[allow(dead_code)]
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
