//! A common fenced in by the others' leads in every order routes once a way is held for
//! it (`route::reserve`): the coupons demo at 1/3 duty, whose three test lines lie side by
//! side on three commons, came out with COM3's line cut off from its dot in all three
//! orders the router tried. Through the real binary: no errors — drive truth, opens and
//! shorts re-derived by the check from the drawn plates — and no warning but a back lead
//! crossing a front lead under the bezel (allowed outside the window, reported).

use std::path::PathBuf;
use std::process::Command;

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
