//! A bar graph and a gauge through the real CLI: a 10-step level meter and a battery
//! gauge built at 1/4 duty and under static drive; every step and every part appears in
//! the written segment map with a COM and a SEG line and their pins.

use std::collections::BTreeSet;
use std::path::Path;
use std::process::Command;

/// A small panel: a level meter of 10 steps, 1 mm thick, rising from 2 mm to 6 mm, and
/// a battery gauge over its first steps. `DRIVE` is replaced by the drive.
const LAYOUT: &str = "name: meter
glass:
  front: {width: 40, height: 33}
  back: {width: 40, height: 26, x: 0, y: 7}
window: {x: 4, y: 11, width: 32, height: 18}
pads: {side: bottom, pitch: 1.27, width: 0.7}
drive: DRIVE
icons:
  - {name: BATT, gauge: battery, at: [7, 22], size: 6, stroke: 0.3}
bars:
  - name: LVL
    count: 10
    line: {from: [7, 14], angle: 0}
    thickness: 1
    length: 2
    last_length: 6
    side: left
    gap: 0.4
";

/// Builds the layout with `drive`; gives the segment map's and pin map's rows (without
/// headers), after checking that the build is clean.
fn build(drive: &str) -> (Vec<Vec<String>>, Vec<Vec<String>>) {
    let dir = tempfile::tempdir().unwrap();
    let file = dir.path().join("meter.yaml");
    std::fs::write(&file, LAYOUT.replace("DRIVE", drive)).unwrap();
    let out = dir.path().join("out");
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("build").arg(&file).arg("--out").arg(&out).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(0), "{drive}:\n{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{drive}:\n{err}");
    (rows(&out.join("meter.segmap.csv")), rows(&out.join("meter.pins.csv")))
}

/// Rows of a CSV file without its header (these fields hold no commas).
fn rows(path: &Path) -> Vec<Vec<String>> {
    let text = std::fs::read_to_string(path).unwrap();
    text.lines().skip(1).map(|l| l.split(',').map(str::to_string).collect()).collect()
}

fn elements() -> Vec<String> {
    let mut v: Vec<String> = ["BATT.shell", "BATT.1", "BATT.2", "BATT.3"].iter().map(|s| s.to_string()).collect();
    v.extend((1..=10).map(|k| format!("LVL.{k}")));
    v
}

/// Every element once, each with a COM and a SEG line and both pins; each (COM, SEG)
/// pair once; each step a rectangle of area thickness × its length (rectangle area;
/// lengths 2 + 4·(k − 1)/9 mm, the CSV's four decimals).
fn assert_segmap(segmap: &[Vec<String>]) {
    // element, drives, com, com_net, com_pin, seg, seg_net, seg_pin, area_mm2, …
    let names: BTreeSet<&str> = segmap.iter().map(|r| r[0].as_str()).collect();
    let want = elements();
    assert_eq!(names, want.iter().map(String::as_str).collect(), "{segmap:?}");
    assert_eq!(segmap.len(), want.len());
    let mut pairs = BTreeSet::new();
    for r in segmap {
        assert!(!r[2].is_empty() && !r[4].is_empty(), "{}: no COM or COM pin", r[0]);
        assert!(!r[5].is_empty() && !r[7].is_empty(), "{}: no SEG line or SEG pin", r[0]);
        assert!(pairs.insert((r[2].clone(), r[5].clone())), "pair COM{} SEG{} given twice", r[2], r[5]);
        if let Some(k) = r[0].strip_prefix("LVL.") {
            let k: f64 = k.parse().unwrap();
            let area: f64 = r[8].parse().unwrap();
            let exact = 1.0 * (2.0 + 4.0 * (k - 1.0) / 9.0);
            assert!((area - exact).abs() <= 5e-5, "LVL.{k}: area {area}, thickness × length {exact}");
        }
    }
}

/// At 1/4 duty the steps keep to the common fixed for LVL.1 (COM4), each on its own SEG
/// line; the gauge's parts keep to one common too. Pins: 4 commons + the 10 SEG lines
/// the steps need (the gauge's parts share the first four).
#[test]
fn a_level_meter_and_a_battery_gauge_build_at_quarter_duty() {
    let (segmap, pins) = build("{duty: 1/4, bias: 1/3, fixed: {LVL.1: {com: 4}}}");
    assert_segmap(&segmap);
    let com_of = |prefix: &str| -> BTreeSet<String> {
        segmap.iter().filter(|r| r[0].starts_with(prefix)).map(|r| r[3].clone()).collect()
    };
    assert_eq!(com_of("LVL."), BTreeSet::from(["COM4".to_string()]));
    assert_eq!(com_of("BATT.").len(), 1);
    let lines: BTreeSet<&str> = segmap.iter().filter(|r| r[0].starts_with("LVL.")).map(|r| r[6].as_str()).collect();
    assert_eq!(lines.len(), 10, "one SEG line a step");
    assert_eq!(pins.len(), 4 + 10);
}

/// Under static drive every step and part is its own SEG net named after it, on COM1:
/// one pin each plus the common.
#[test]
fn a_level_meter_and_a_battery_gauge_build_under_static_drive() {
    let (segmap, pins) = build("static");
    assert_segmap(&segmap);
    for r in &segmap {
        assert_eq!((r[3].as_str(), r[6].as_str()), ("COM1", r[0].as_str()));
    }
    assert_eq!(pins.len(), 14 + 1);
}
