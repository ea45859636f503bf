//! Panels through the real binary: the panel demo writes every panel file, the same
//! input and date give byte-identical panel files (the DXF carries dates and identifiers
//! of its own), the panel film's page follows docs/outputs.md (*Page layout*: the
//! substrate plus 12 mm each side when it is wider than the ruler), and a layout without
//! `panel:` writes none of them. The files themselves are read back by gdstk, gerbonara,
//! pypdf and ezdxf in tests/reference/check_masks.py.

use crate::demo_build::build_demo;
use std::path::Path;
use std::process::Command;

const NAME: &str = "coupons";
const PANEL_FILES: [&str; 7] =
    ["panel.front.svg", "panel.back.svg", "panel.pdf", "panel.front.gbr", "panel.back.gbr", "panel.gds", "panel.cuts.dxf"];

fn build(out: &Path) {
    let layout = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(format!("{NAME}.yaml"));
    let o = Command::new(env!("CARGO_BIN_EXE_segmask"))
        .args(["build"])
        .arg(layout)
        .arg("--out")
        .arg(out)
        .args(["--date", "2026-12-01", "--png-dpi", "50"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", String::from_utf8_lossy(&o.stderr));
}

#[test]
fn panel_files_are_written_repeatably_and_only_for_panels() {
    let (dir, shared) = build_demo(NAME);
    let again = dir.path().join("again");
    build(&again);
    for f in PANEL_FILES {
        let name = format!("{NAME}.{f}");
        let a = std::fs::read(shared.join(&name)).unwrap_or_else(|_| panic!("{name} not written"));
        let b = std::fs::read(again.join(&name)).unwrap();
        assert!(a == b, "{name} differs between two builds of the same input and date");
    }
    let svg = std::fs::read_to_string(shared.join(format!("{NAME}.panel.front.svg"))).unwrap();
    // The demo's substrate is 90 mm wide (demo-layouts/coupons.yaml).
    assert!(svg.contains("width=\"114mm\""), "panel film page width: {}", &svg[..300]);
    let (_d, plain) = build_demo("etch-test-plate");
    let stray: Vec<_> = std::fs::read_dir(plain).unwrap().filter_map(|e| {
        let n = e.ok()?.file_name().to_string_lossy().into_owned();
        n.contains(".panel.").then_some(n)
    }).collect();
    assert!(stray.is_empty(), "panel files without a panel: {stray:?}");
}
