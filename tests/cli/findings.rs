//! A layout with one design mistake makes `segmask check` exit 1 and name the rule, the
//! nets and the place; the same layout without the mistake checks clean (exit 0), so each
//! test would fail if the mistake went unnoticed or the base layout were dirty.

use std::path::PathBuf;
use std::process::Command;

fn layout(gap_x: f64, extra: &str) -> (tempfile::TempDir, PathBuf) {
    let base = std::fs::read_to_string(PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/findings/base.yaml")).unwrap();
    let text = base.replace("GAP_X", &gap_x.to_string()).replace("EXTRA", extra);
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("two-squares.yaml");
    std::fs::write(&path, text).unwrap();
    (dir, path)
}

fn check(path: &PathBuf) -> (Option<i32>, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(path).output().unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

#[test]
fn base_layout_checks_clean() {
    let (_d, p) = layout(16.0, "");
    let (code, err) = check(&p);
    assert_eq!(code, Some(0), "{err}");
}

/// Squares 0.03 mm apart, below the 0.05 mm minimum gap.
#[test]
fn gap_below_minimum_is_an_error_naming_both_nets() {
    let (_d, p) = layout(12.03, "");
    let (code, err) = check(&p);
    assert_eq!(code, Some(1), "{err}");
    let line = err.lines().find(|l| l.contains("error[gap]")).unwrap_or_else(|| panic!("no gap finding:\n{err}"));
    assert!(line.contains("two-squares.yaml"), "{line}");
    assert!(err.contains("LEFT") && err.contains("RIGHT"), "{err}");
    assert!(err.contains("at: (12.0"), "the place is between the squares:\n{err}");
    assert!(err.contains("measured 0.03"), "{err}");
}

/// A bus of LEFT drawn onto RIGHT joins the two nets.
#[test]
fn bus_touching_another_net_is_a_short() {
    let (_d, p) = layout(16.0, "buses:\n  - {net: LEFT, plate: front, width: 0.2, points: [[11, 14], [17, 14]]}\n");
    let (code, err) = check(&p);
    assert_eq!(code, Some(1), "{err}");
    assert!(err.contains("error[short]"), "{err}");
    assert!(err.contains("LEFT") && err.contains("RIGHT"), "{err}");
}

/// A back-plate bus of the common drawn across a front bus inside the window makes front
/// and back ITO overlap where no pixel is designed.
#[test]
fn common_bus_over_a_front_lead_in_the_window_is_a_ghost() {
    let extra = "buses:\n  - {net: LEFT, plate: front, width: 0.2, points: [[10, 12], [10, 10], [14, 10]]}\n  - {net: COM1, plate: back, width: 0.2, points: [[13, 9], [13, 11]]}\n";
    let (_d, p) = layout(16.0, extra);
    let (code, err) = check(&p);
    assert_eq!(code, Some(1), "{err}");
    let line = err.lines().find(|l| l.contains("error[ghost]")).unwrap_or_else(|| panic!("no ghost finding:\n{err}"));
    assert!(line.contains("LEFT") && line.contains("COM1"), "{line}");
    assert!(err.contains("at: (13.0"), "the place is the crossing:\n{err}");
}

/// The band between the seal's inner edge (2.5 mm in from the back glass) and the window
/// (4 mm in) is 1.5 mm wide all round: a 1.5 mm mark plus the 0.051 mm gap on each side
/// fits in no corner even with nothing routed (1.5 − 2 × 0.051 = 1.398 mm beside the
/// window), so the layout is refused before anything is built — exit 2 at `seal.width`,
/// with that room — rather than built into four `mark-room` errors; the base layout's
/// 1 mm marks fit (base_layout_checks_clean). Marks that the routed ITO crowds out are
/// still placed corner by corner (src/plate/mark_place.rs, its unit tests).
#[test]
fn no_room_for_alignment_marks_is_refused_before_building() {
    let (_d, p) = layout(16.0, "marks: {size: 1.5}");
    let (code, err) = check(&p);
    assert_eq!(code, Some(2), "{err}");
    let line = err.lines().find(|l| l.contains("two-squares.yaml:") && l.contains("error in `seal.width`")).unwrap_or_else(|| panic!("{err}"));
    assert!(line.contains("1.5 mm square") && line.contains("1.398 mm on the left"), "{line}");
    assert!(!err.contains("error[mark-room]"), "{err}");
}
