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
