//! A gap written in the layout that leaves a lead no room at the layout's rules: the
//! `unroutable` finding names the digit group or bar graph, its gap and the gap the rules
//! give (a lead, a gap on each side and four grid cells, docs/layout-format.md), and the
//! demo with that gap checks clean, so the fix the message gives is one that works.

use std::path::PathBuf;
use std::process::Command;

/// `segmask check` of a demo changed by `edits` (each text must be in it): exit code and
/// the console.
fn check_changed(demo: &str, edits: &[(&str, &str)]) -> (Option<i32>, String) {
    let mut text = std::fs::read_to_string(PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(demo)).unwrap();
    for (from, to) in edits {
        assert!(text.contains(from), "{demo} changed: {from}");
        text = text.replacen(from, to, 1);
    }
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join(demo);
    std::fs::write(&path, text).unwrap();
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(&path).output().unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

/// The one `unroutable` line of a failed check (it must be the only error).
fn the_unroutable_line((code, err): (Option<i32>, String)) -> String {
    assert_eq!(code, Some(1), "{err}");
    let lines: Vec<&str> = err.lines().filter(|l| l.contains("error[")).collect();
    assert!(!lines.is_empty() && lines.iter().all(|l| l.contains("error[unroutable]")), "{err}");
    lines[0].to_string()
}

fn assert_clean((code, err): (Option<i32>, String)) {
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");
}

/// The demo changed by `edit` fails with one `unroutable` line that names `stuck`, says
/// the segments of `digits[0]` are 0.350 mm apart and asks to widen its gap to `needed`
/// mm; with the gap written as `gap_line` changed to that width it checks clean.
fn names_the_gap_that_routes(demo: &str, edit: (&str, &str), stuck: &str, gap_line: &str, needed: &str) {
    let line = the_unroutable_line(check_changed(demo, &[edit]));
    assert!(line.contains(stuck), "{line}");
    assert!(line.contains("the segments of `digits[0]` are 0.350 mm apart (line"), "{line}");
    assert!(line.contains(&format!("widen `digits[0].gap` to {needed} mm")), "{line}");
    let widened = gap_line.replace("0.35", needed.trim_end_matches('0'));
    assert_clean(check_changed(demo, &[edit, (gap_line, &widened)]));
}

/// Multiplexed: the kiln demo under 0.12/0.1 mm rules with 8 µm undercut keeps its own
/// 0.35 mm gap; the commons' leads find no room through the digits' junctions and COM1
/// is cut off. The rules' gap is 0.136 + 2 × 0.1 + 4 × 0.05 = 0.536 mm.
#[test]
fn a_common_cut_off_behind_narrow_junctions_names_the_gap_that_routes() {
    let rules = ("  min_width: 0.1\n  min_gap: 0.05\n  undercut: 5um\n", "  min_width: 0.12\n  min_gap: 0.1\n  undercut: 8um\n");
    names_the_gap_that_routes("kiln-controller.yaml", rules, "common electrode COM1", "    gap: 0.35\n", "0.536");
}

/// Static drive: the irrigation-timer demo with 0.2 mm leads keeps its 0.35 mm gap; each
/// digit's middle bar has no way out between the others. The rules' gap is
/// 0.2 + 2 × 0.05 + 4 × 0.025 = 0.4 mm.
#[test]
fn a_segment_shut_in_by_its_neighbours_names_the_gap_that_routes() {
    let lead = ("  min_gap: 0.05\n", "  min_gap: 0.05\n  lead_width: 0.2\n");
    names_the_gap_that_routes("irrigation-timer.yaml", lead, "net D1.g cannot be routed", "  gap: 0.35\n", "0.400");
}
