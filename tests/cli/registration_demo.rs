//! Registration on the 1/4-duty kiln-controller demo: as written (registration off) it
//! checks clean; with `rules.registration: 0.1` the real `segmask check` warns of the
//! stray lit area a 0.1 mm misalignment makes, with its area and place, and nothing is an
//! error.

use std::path::Path;
use std::process::Command;

fn check(layout: &Path) -> (Option<i32>, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(layout).output().unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

/// The kiln's leads leave each common through a cut one `min_gap` (0.05 mm) wide
/// (docs/architecture.md, *Routing*), so moving the back plate by 0.1 mm brings common
/// ITO over front leads: a stray area inside the window, reported per (COM, SEG) pair
/// with the place of its largest piece, inside the window (demo-layouts/kiln-controller.yaml:
/// x 4–52, y 8–32 mm). Where a lead leaves a segment the common's cut reaches the
/// segment's edge, so a shift towards it may also uncover a little of the pixel; those
/// warnings give their place too.
#[test]
fn a_tenth_of_a_millimetre_on_the_kiln() {
    let demo = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts/kiln-controller.yaml");
    let (code, err) = check(&demo);
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");

    let text = std::fs::read_to_string(&demo).unwrap().replace("  edge_clearance: 1.5\n", "  edge_clearance: 1.5\n  registration: 0.1\n");
    assert!(text.contains("registration: 0.1"));
    let dir = tempfile::tempdir().unwrap();
    let layout = dir.path().join("kiln-controller.yaml");
    std::fs::write(&layout, text).unwrap();
    let (code, err) = check(&layout);
    assert_eq!(code, Some(0), "warnings only:\n{err}");
    let warnings: Vec<&str> = err.split("warning[registration]: ").skip(1).collect();
    assert!(!warnings.is_empty(), "{err}");
    assert!(!err.contains("error["), "{err}");
    let mut stray = 0;
    for w in &warnings {
        let line = w.lines().next().unwrap();
        // Stray: "… newly faces back ITO of COMk over A mm² in the window (n piece(s), the
        // largest a mm² at (x, y) mm)"; lost: "A mm² of E (p %) at (x, y) mm is no longer …".
        if let Some(rest) = line.split_once(" over ").map(|(_, r)| r) {
            let area: f64 = rest.split(' ').next().unwrap().parse().unwrap();
            assert!(area > 1e-4, "{line}");
            stray += 1;
        }
        let at = line.split(" at (").nth(1).unwrap_or_else(|| panic!("no place: {line}"));
        let (x, y) = at.split_once(')').unwrap().0.split_once(", ").unwrap();
        let (x, y): (f64, f64) = (x.parse().unwrap(), y.parse().unwrap());
        assert!((4.0..=52.0).contains(&x) && (8.0..=32.0).contains(&y), "{line}");
    }
    assert!(stray > 0, "{err}");
}
