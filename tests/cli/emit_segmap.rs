//! The segment map, pin map and drive summary as the real `segmask build` writes them
//! for a demo layout (static drive).

use crate::demo_build;

use serde_json::Value;
use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

const DEMO: &str = "conductivity-meter";

/// Builds the demo into a fresh folder; gives the folder (kept alive) and the output dir.
fn build() -> (tempfile::TempDir, PathBuf) {
    demo_build::build_demo(DEMO)
}

fn json(path: &Path) -> Value {
    // RFC 8259, via serde_json.
    serde_json::from_slice(&std::fs::read(path).unwrap()).unwrap()
}

#[test]
fn segment_map_pin_map_and_drive_summary_agree() {
    let (_dir, out) = build();
    let (pin_header, pins) = demo_build::read_csv(&out.join(format!("{DEMO}.pins.csv")));
    assert_eq!(pin_header, ["pin", "net", "plate", "role", "index", "drives", "side"]);
    let pin_of: BTreeMap<&str, &str> = pins.iter().map(|p| (p["net"].as_str(), p["pin"].as_str())).collect();
    assert!(pins.iter().all(|p| p["side"] == "bottom"), "one pad row, on the bottom ledge: {pins:?}");
    assert_eq!(pin_of.len(), pins.len(), "one pin per net");

    let (seg_header, rows) = demo_build::read_csv(&out.join(format!("{DEMO}.segmap.csv")));
    assert_eq!(seg_header[..3], ["element", "drives", "com"]);
    let s = rows.len();
    assert!(s > 20, "a 3½-digit panel with legends and icons has more than 20 elements: {s}");
    let mut seg_lines: Vec<u32> = vec![];
    for r in &rows {
        // Static drive: one common, COM 1 (docs/background.md, *Drive and pin count*).
        assert_eq!((r["com"].as_str(), r["com_net"].as_str()), ("1", "COM1"), "{r:?}");
        assert_eq!(Some(&r["com_pin"].as_str()), pin_of.get("COM1"), "{r:?}");
        assert_eq!(Some(&r["seg_pin"].as_str()), pin_of.get(r["seg_net"].as_str()), "{r:?}");
        seg_lines.push(r["seg"].parse().unwrap());
        // Every pixel lies in the viewing window (x 4..66, y 9..35 in the layout).
        let (x, y): (f64, f64) = (r["centroid_x_mm"].parse().unwrap(), r["centroid_y_mm"].parse().unwrap());
        assert!((4.0..66.0).contains(&x) && (9.0..35.0).contains(&y), "{r:?}");
        assert!(r["area_mm2"].parse::<f64>().unwrap() > 0.0, "{r:?}");
    }
    seg_lines.sort();
    seg_lines.dedup();
    assert_eq!(seg_lines.len(), s, "static: each element on its own SEG line");

    let map = json(&out.join(format!("{DEMO}.segmap.json")));
    assert_eq!((map["name"].as_str(), map["duty"].as_str(), &map["bias"]), (Some(DEMO), Some("static"), &Value::Null));
    let elements = map["elements"].as_array().unwrap();
    let csv_names: Vec<&str> = rows.iter().map(|r| r["element"].as_str()).collect();
    let json_names: Vec<&str> = elements.iter().map(|e| e["element"].as_str().unwrap()).collect();
    assert_eq!(json_names, csv_names);

    let report = json(&out.join(format!("{DEMO}.report.json")));
    assert_eq!(report["segments"].as_array().unwrap(), elements);
    let d = &report["drive"];
    assert_eq!((d["duty"].as_str(), d["commons"].as_u64(), &d["bias"]), (Some("static"), Some(1), &Value::Null));
    assert_eq!(d["pin_count"].as_u64(), Some(pins.len() as u64));
    // N + ⌈S/N⌉ (Alt & Pleshko 1974; common practice); static N = 1 gives 1 + S, and a
    // static panel has exactly that many pins: one per element plus the common.
    assert_eq!(d["pin_count_formula"].as_u64(), Some(1 + s as u64));
    assert_eq!(pins.len(), 1 + s);
    // Static drive selects nothing, so there is no selection ratio and no best bias.
    for k in ["selection_ratio", "best_bias", "best_selection_ratio"] {
        assert_eq!(d[k], Value::Null, "{k}");
    }
}
