//! `segmask check --format json`: one JSON document on standard output, read back with
//! serde_json (an independent JSON reader, RFC 8259). A known finding must name the
//! layout line of the element it concerns, and that line of the file must hold the
//! element's entry; input problems come out as JSON too, with exit 2.

use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::Command;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn check_json(path: &Path) -> (Option<i32>, Value, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(path).args(["--format", "json"]).output().unwrap();
    let text = String::from_utf8_lossy(&o.stdout).into_owned();
    let doc: Value = serde_json::from_str(&text).unwrap_or_else(|e| panic!("not JSON ({e}):\n{text}"));
    (o.status.code(), doc, String::from_utf8_lossy(&o.stderr).into_owned())
}

/// Line `n` (1-based) of `text`.
fn line(text: &str, n: u64) -> &str {
    text.lines().nth(n as usize - 1).unwrap_or("")
}

/// Two squares 0.03 mm apart (tests/fixtures/findings/base.yaml, as findings.rs uses it):
/// a gap error between LEFT and RIGHT, each named with the line of its icon entry.
#[test]
fn a_gap_finding_names_the_lines_of_both_icons() {
    let base = std::fs::read_to_string(root().join("tests/fixtures/findings/base.yaml")).unwrap();
    let text = base.replace("GAP_X", "12.03").replace("EXTRA", "");
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("two-squares.yaml");
    std::fs::write(&path, &text).unwrap();
    let (code, doc, err) = check_json(&path);
    assert_eq!(code, Some(1), "{doc}\n{err}");
    assert_eq!(doc["status"], "checked");
    assert_eq!(doc["layout"], "two-squares");
    assert!(doc["errors"].as_u64().unwrap() >= 1, "{doc}");
    let gap = doc["findings"].as_array().unwrap().iter().find(|f| f["rule"] == "gap").unwrap_or_else(|| panic!("{doc}"));
    assert_eq!(gap["severity"], "error");
    assert_eq!(gap["plate"], "front");
    assert!((gap["measured"].as_f64().unwrap() - 0.03).abs() < 0.005, "{gap}");
    assert_eq!(gap["required"].as_f64(), Some(0.05));
    assert!((gap["location_mm"][0].as_f64().unwrap() - 12.0).abs() < 0.1, "{gap}");
    for (name, key) in [("LEFT", "icons[0]"), ("RIGHT", "icons[1]")] {
        let e = gap["elements"].as_array().unwrap().iter().find(|e| e["element"] == name).unwrap_or_else(|| panic!("{gap}"));
        assert_eq!(e["key"], key);
        let n = e["line"].as_u64().unwrap();
        assert!(line(&text, n).contains(&format!("name: {name}")), "line {n} of the layout is {:?}", line(&text, n));
    }
}

/// The same squares 4 mm apart check clean (as findings.rs has it): exit 0, no errors.
#[test]
fn a_clean_layout_has_no_errors() {
    let base = std::fs::read_to_string(root().join("tests/fixtures/findings/base.yaml")).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("two-squares.yaml");
    std::fs::write(&path, base.replace("GAP_X", "16").replace("EXTRA", "")).unwrap();
    let (code, doc, err) = check_json(&path);
    assert_eq!(code, Some(0), "{doc}\n{err}");
    assert_eq!(doc["errors"].as_u64(), Some(0), "{doc}");
    assert_eq!(err, "", "nothing on standard error with --format json");
}

/// A misspelt key (tests/fixtures/bad/unknown-key.yaml): exit 2, the problem as JSON with
/// file, line, key, message and what is allowed; the line holds the misspelt key.
#[test]
fn input_problems_come_out_as_json() {
    let path = root().join("tests/fixtures/bad/unknown-key.yaml");
    let (code, doc, _) = check_json(&path);
    assert_eq!(code, Some(2), "{doc}");
    assert_eq!(doc["status"], "bad-input");
    let p = &doc["input_problems"][0];
    assert_eq!(p["key"], "digits[0].heigth");
    assert!(p["file"].as_str().unwrap().ends_with("unknown-key.yaml"), "{p}");
    assert!(p["message"].as_str().unwrap().contains("unknown key"), "{p}");
    let text = std::fs::read_to_string(&path).unwrap();
    assert!(line(&text, p["line"].as_u64().unwrap()).contains("heigth"), "{p}");
    // A missing file is a failure, still one JSON document.
    let dir = tempfile::tempdir().unwrap();
    let (code, doc, _) = check_json(&dir.path().join("none.yaml"));
    assert_eq!((code, doc["status"].as_str()), (Some(2), Some("failed")), "{doc}");
}
