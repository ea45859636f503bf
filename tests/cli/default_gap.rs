//! The default segment gap routes at every duty: the demos' digit groups with their `gap`
//! key removed build without errors through the real binary at 1/4, 1/3 and 1/2 duty.
//! Before the multiplexed default gained two grid cells of slack each side
//! (`Rules::passing_gap`), all three came out with commons cut off from their dots.

use std::path::PathBuf;
use std::process::Command;

fn check(name: &str) -> (Option<i32>, String) {
    let layout = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/default-gap").join(name);
    let text = std::fs::read_to_string(&layout).unwrap();
    assert!(!text.contains("    gap:"), "{name} must leave the segment gap to its default");
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(&layout).output().unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

#[test]
fn default_gap_routes_at_quarter_duty() {
    let (code, err) = check("quarter-duty.yaml");
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");
}

#[test]
fn default_gap_routes_at_third_duty() {
    let (code, err) = check("third-duty.yaml");
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");
}

/// At 1/2 duty some back leads cross front leads under the bezel (allowed, reported as
/// warnings); no errors.
#[test]
fn default_gap_routes_at_half_duty() {
    let (code, err) = check("half-duty.yaml");
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains(" 0 error(s)"), "{err}");
}
