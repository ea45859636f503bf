//! What segmask does when a common's piece cannot reach its transfer dot in any order of
//! the commons. A common fenced in by the others' leads routes once a way is held for
//! it (`route::reserve`): the coupons demo at 1/3 duty, whose three test lines lie side by
//! side on three commons, came out with COM3's line cut off from its dot in all three
//! orders the router tried. Through the real binary: no errors — drive truth, opens and
//! shorts re-derived by the check from the drawn plates — and no warning but a back lead
//! crossing a front lead under the bezel (allowed outside the window, reported).

//! An icon whose common is shut in by SEG leads is moved to another common
//! (`pipeline_moves`): the etch-test plate at 1/2 duty, whose 0.15 mm line's COM2 piece
//! was cut off, checks clean with a `reassigned` note naming the line, its layout entry
//! and the `drive.fixed` entry that keeps the choice. The two dots of a colon shut in
//! together are moved together: the irrigation timer at 1/3 duty checks clean with both
//! on COM2 (each moved alone left `ghost` warnings; the binary before left an
//! `unroutable` error).

use std::path::PathBuf;
use std::process::Command;

fn check(name: &str) -> (Option<i32>, String) {
    let layout = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/reserve").join(name);
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(&layout).output().unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

#[test]
fn an_icon_shut_in_on_its_common_is_moved_to_one_that_routes() {
    let (code, err) = check("etch-test-half-duty.yaml");
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");
    let note = err.lines().find(|l| l.contains("note[reassigned]")).unwrap_or_else(|| panic!("no reassigned note: {err}"));
    assert!(note.contains("LINE_150 (`icons[7]` line 41) put on COM1") && note.contains("`LINE_150: {com: 1}` under `drive.fixed`"), "{note}");
}

#[test]
fn a_colon_shut_in_on_its_common_is_moved_whole() {
    let (code, err) = check("irrigation-colon-third-duty.yaml");
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");
    let notes: Vec<&str> = err.lines().filter(|l| l.contains("note[reassigned]")).collect();
    assert_eq!(notes.len(), 2, "{err}");
    for dot in ["D2.col_top", "D2.col_bottom"] {
        assert!(notes.iter().any(|n| n.contains(&format!("{dot} (`digits[0]` line 32) put on COM2")) && n.contains(&format!("`{dot}: {{com: 2}}` under `drive.fixed`"))), "{dot}: {notes:?}");
    }
}

#[test]
fn a_line_fenced_in_every_order_routes_through_a_held_way() {
    let layout = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/reserve/coupons-third-duty.yaml");
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(&layout).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(0), "{err}");
    assert!(err.contains(" 0 error(s)"), "{err}");
    for line in err.lines().filter(|l| l.contains("warning[")) {
        assert!(line.contains("warning[ghost]") && line.contains("outside the viewing window but in the liquid crystal"), "{line}");
    }
}
