//! The report, pin map and preview of the emit stage, which files are withheld, and
//! atomic writing.

use crate::emit_fixture;

use emit_fixture::*;
use segmask::emit::{EmitOptions, OutputFile, render_outputs, write_atomically};

fn names(files: &[OutputFile]) -> Vec<&str> {
    files.iter().map(|f| f.name.as_str()).collect()
}

#[test]
fn clean_build_gives_every_file() {
    let files = render_outputs(&artwork(), &[warning()], &opts()).unwrap();
    assert_eq!(
        names(&files),
        [
            "fixture.front.svg",
            "fixture.back.svg",
            "fixture.front.png",
            "fixture.back.png",
            "fixture.films.pdf",
            "fixture.sheet.pdf",
            "fixture.front.gbr",
            "fixture.back.gbr",
            "fixture.preview.svg",
            "fixture.gds",
            "fixture.masks.json",
            "fixture.masks.txt",
            "fixture.pins.csv",
            "fixture.segmap.csv",
            "fixture.segmap.json",
            "fixture.firmware.h",
            "fixture.firmware.json",
            "fixture.report.json"
        ]
    );
}

#[test]
fn errors_withhold_every_mask_file() {
    let findings = [warning(), error()];
    let files = render_outputs(&artwork(), &findings, &opts()).unwrap();
    let always = ["preview.svg", "pins.csv", "segmap.csv", "segmap.json", "firmware.h", "firmware.json", "report.json"].map(|s| format!("fixture.{s}"));
    assert_eq!(names(&files), always);
    let forced = EmitOptions { masks_despite_errors: true, ..opts() };
    let files = render_outputs(&artwork(), &findings, &forced).unwrap();
    assert_eq!(files.len(), 18);
    // A film made despite errors says so on its face (stroke text, so look for the
    // title element instead): the title line count grows by one.
    let clean = render_outputs(&artwork(), &[], &opts()).unwrap();
    assert!(output(&files, "front.svg").len() > output(&clean, "front.svg").len());
}

#[test]
fn bad_date_is_an_input_error() {
    let bad = EmitOptions { date: "2025-02-30".into(), ..opts() };
    match render_outputs(&artwork(), &[], &bad) {
        Err(segmask::Error::Input(p)) => assert_eq!(p[0].key, "--date"),
        other => panic!("{other:?}"),
    }
}

#[test]
fn report_holds_rules_nets_findings_and_summary() {
    let files = render_outputs(&artwork(), &[warning(), error()], &opts()).unwrap();
    let v: serde_json::Value = serde_json::from_slice(output(&files, "report.json")).unwrap();
    assert_eq!(v["layout"], "fixture");
    let r = &v["rules"];
    assert_eq!(r["min_gap_mm"], 0.05);
    assert_eq!(r["min_width_mm"], 0.1);
    assert_eq!(r["undercut_mm"], 0.01);
    assert_eq!(r["compensate"], false);
    for k in ["film_min_feature_mm", "backplane_overlap_mm", "edge_clearance_mm", "lead_width_mm"] {
        assert!(r[k].is_f64(), "{k}");
    }
    let layers = v["layers"].as_array().unwrap();
    assert_eq!(layers.len(), 9);
    assert_eq!(layers[0]["name"], "front_ito");
    assert_eq!(layers[0]["gds_layer"], 10);
    assert_eq!(layers[4]["plate"], serde_json::Value::Null);
    // S1: 8 × 8 square + 1 × 11 lead + 4 × 2 pad = 83 mm² (arithmetic on the fixture).
    let s1 = v["nets"].as_array().unwrap().iter().find(|n| n["name"] == "S1").unwrap();
    assert!((s1["area_mm2"].as_f64().unwrap() - 83.0).abs() < 1e-9);
    assert_eq!(s1["pin"], 1);
    assert_eq!(s1["kind"], "segment");
    let f = &v["findings"][0];
    assert_eq!(f["rule"], "gap");
    assert_eq!(f["severity"], "warning");
    assert_eq!(f["location_mm"], serde_json::json!([14.0, 18.0]));
    assert_eq!(v["findings"][1]["measured"], serde_json::Value::Null);
    assert_eq!(v["summary"], serde_json::json!({"errors": 1, "warnings": 1}));
}

#[test]
fn pin_map_is_sorted_by_pin() {
    let files = render_outputs(&artwork(), &[], &opts()).unwrap();
    let csv = std::str::from_utf8(output(&files, "pins.csv")).unwrap();
    assert_eq!(csv, "pin,net,plate,role,index,drives,side\n1,S1,front,SEG,1,square S1,bottom\n2,COM1,back,COM,1,common electrode 1,bottom\n");
}

#[test]
fn preview_marks_findings_and_pins() {
    let files = render_outputs(&artwork(), &[warning()], &opts()).unwrap();
    let svg = std::str::from_utf8(output(&files, "preview.svg")).unwrap();
    // Parsed by resvg's tree builder: a well-formed SVG in mm.
    let tree = resvg::usvg::Tree::from_str(svg, &resvg::usvg::Options::default()).unwrap();
    assert!(tree.size().width() > 0.0);
    let texts: Vec<&str> = svg.split("</text>").filter_map(|t| t.rsplit('>').next()).map(str::trim).collect();
    assert!(texts.contains(&"gap"), "finding's rule code in {texts:?}");
    assert!(texts.contains(&"1") && texts.contains(&"2"), "pin numbers in {texts:?}");
    assert!(svg.contains("id=\"findings\"") && svg.contains("id=\"legend\""));
    assert!(svg.contains("stroke-dasharray"), "window outline is dashed");
}

#[test]
fn files_are_written_and_no_temporary_is_left() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let files = render_outputs(&artwork(), &[], &opts()).unwrap();
    write_atomically(&out, &files).unwrap();
    let mut on_disk: Vec<String> =
        std::fs::read_dir(&out).unwrap().map(|e| e.unwrap().file_name().into_string().unwrap()).collect();
    on_disk.sort();
    let mut want: Vec<String> = files.iter().map(|f| f.name.clone()).collect();
    want.sort();
    assert_eq!(on_disk, want);
    assert_eq!(std::fs::read(out.join("fixture.gds")).unwrap(), output(&files, "gds"));
}

/// A rename onto an existing folder fails: the error names that path and the
/// temporaries are cleaned up.
#[test]
fn failed_write_leaves_no_temporary() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::create_dir(dir.path().join("b.txt")).unwrap();
    std::fs::write(dir.path().join("b.txt").join("keep"), b"x").unwrap();
    let files = [
        OutputFile { name: "a.txt".into(), bytes: b"a".to_vec() },
        OutputFile { name: "b.txt".into(), bytes: b"b".to_vec() },
    ];
    match write_atomically(dir.path(), &files) {
        Err(segmask::Error::Io { path, .. }) => assert_eq!(path, dir.path().join("b.txt")),
        other => panic!("{other:?}"),
    }
    let left: Vec<String> = std::fs::read_dir(dir.path())
        .unwrap()
        .map(|e| e.unwrap().file_name().into_string().unwrap())
        .filter(|n| n.contains(".tmp-"))
        .collect();
    assert!(left.is_empty(), "{left:?}");
}

/// Writes the fixture outputs to $SEGMASK_DUMP for looking at by eye (does nothing
/// unless set). resvg is built without its text feature (fonts and shaping were a
/// sixth of a clean build's time), so the PNGs leave out the preview's text labels;
/// the SVGs beside them have them.
#[test]
fn dump_for_review() {
    if let Ok(dir) = std::env::var("SEGMASK_DUMP") {
        let files = render_outputs(&artwork(), &[warning()], &opts()).unwrap();
        write_atomically(std::path::Path::new(&dir), &files).unwrap();
        for f in files.iter().filter(|f| f.name.ends_with(".svg")) {
            let opt = resvg::usvg::Options { dpi: 400.0, ..Default::default() };
            let tree = resvg::usvg::Tree::from_data(&f.bytes, &opt).unwrap();
            let s = tree.size();
            let mut pm = resvg::tiny_skia::Pixmap::new(s.width().ceil() as u32, s.height().ceil() as u32).unwrap();
            pm.fill(resvg::tiny_skia::Color::WHITE);
            resvg::render(&tree, resvg::tiny_skia::Transform::identity(), &mut pm.as_mut());
            pm.save_png(std::path::Path::new(&dir).join(format!("{}.png", f.name))).unwrap();
        }
    }
}
