//! Multiplexed drive through the real CLI: the multiplexed demos route themselves, take
//! N + ⌈S/N⌉ pins and pass the drive truth check; a bus that makes a common face a SEG
//! lead in the window fails the check naming the pair; a digit whose junction gap is too
//! narrow for the back-plate passage is unroutable, naming the common; pins above the
//! fewest are explained in one note; the demos route with their pads on top too.

use std::collections::BTreeSet;
use std::path::{Path, PathBuf};
use std::process::Command;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn build(layout: &Path, out: &Path) -> (Option<i32>, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("build").arg(layout).arg("--out").arg(out).output().unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

/// Rows of a CSV file without its header (fields here hold no commas).
fn rows(path: &Path) -> Vec<Vec<String>> {
    let text = std::fs::read_to_string(path).unwrap();
    text.lines().skip(1).map(|l| l.split(',').map(str::to_string).collect()).collect()
}

/// Pin count N + ⌈S/N⌉ for N commons and S elements (Alt & Pleshko, IEEE Trans.
/// Electron Devices ED-21, 1974, on matrix addressing; the usual count for segment glass,
/// common practice), each (COM, SEG) pair used once, every pin on the ledge listed, and
/// drive truth clean (exit 0: no errors, no warnings counted as errors). Gives the folder
/// the outputs are in.
fn assert_multiplexed_demo(name: &str, commons: usize) -> PathBuf {
    assert_multiplexed_demo_with(name, commons, 0)
}

/// As [`assert_multiplexed_demo`], with `twice` commons out on a second pin each.
fn assert_multiplexed_demo_with(name: &str, commons: usize, twice: usize) -> PathBuf {
    let out = built_clean(name);
    let segmap = rows(&out.join(format!("{name}.segmap.csv")));
    let pins = rows(&out.join(format!("{name}.pins.csv")));
    let s = segmap.len();
    assert_eq!(pins.len(), commons + s.div_ceil(commons) + twice, "{name}: {} pins for {s} elements", pins.len());
    let com_pins = pins.iter().filter(|p| p[3] == "COM").count();
    assert_eq!(com_pins, commons + twice, "{name}: pins of the commons");
    let mut pairs = BTreeSet::new();
    for r in &segmap {
        // element, drives, com, com_net, com_pin, seg, seg_net, seg_pin, …
        assert!(pairs.insert((r[2].clone(), r[5].clone())), "{name}: pair COM{} SEG{} used twice", r[2], r[5]);
        assert!(!r[4].is_empty() && !r[7].is_empty(), "{name}: {} lacks a pin", r[0]);
    }
    let coms: BTreeSet<&str> = segmap.iter().map(|r| r[3].as_str()).collect();
    assert_eq!(coms.len(), commons, "{name}: every common drives something");
    out
}

/// The output folder of the demo's build, shared with the other tests of the run
/// (`demo_build`: each demo is routed once), after checking that its report counts no
/// error and no warning.
fn built_clean(name: &str) -> PathBuf {
    let (_, out) = crate::demo_build::build_demo(name);
    let summary = &report(&out, name)["summary"];
    assert_eq!((summary["errors"].as_u64(), summary["warnings"].as_u64()), (Some(0), Some(0)), "{name}: {summary}");
    out
}

/// The report of a build in `out`.
fn report(out: &Path, name: &str) -> serde_json::Value {
    let text = std::fs::read_to_string(out.join(format!("{name}.report.json"))).unwrap();
    serde_json::from_str(&text).unwrap()
}

/// Two rows with the pads on one side (large digits with points and a legend above, small
/// digits and a legend below): the SEG lines stay at ⌈S/N⌉ and the drive truth holds; the
/// upper row's two outer commons come out on a second pin each (their own transfer dots).
#[test]
fn two_rows_with_the_pads_on_one_side_route_themselves() {
    let out = assert_multiplexed_demo_with("cold-store-monitor", 4, 2);
    let pins = rows(&out.join("cold-store-monitor.pins.csv"));
    let twice: BTreeSet<&str> = pins.iter().filter(|p| pins.iter().filter(|q| q[1] == p[1]).count() == 2).map(|p| p[1].as_str()).collect();
    assert_eq!(twice, BTreeSet::from(["COM3", "COM4"]));
}

/// Forty digits with points in two rows and 60 icons at 1/4 duty, with a second pad row
/// on top: clean, at N + ⌈S/N⌉ pins plus the upper row's two outer commons (Alt &
/// Pleshko, as above); the upper row's lines and those two commons' second pins on the
/// top ledge, everything else on the bottom one, pins numbered on from the bottom row;
/// every icon stacked beside a row takes the common of its height in that row (its
/// neighbours in the digits), so each column of four icons is one SEG line.
#[test]
fn forty_digits_in_two_rows_route_to_two_pad_rows() {
    let out = assert_multiplexed_demo_with("germination-cabinet", 4, 2);
    let pins = rows(&out.join("germination-cabinet.pins.csv"));
    let segmap = rows(&out.join("germination-cabinet.segmap.csv"));
    let (top, bottom): (Vec<&Vec<String>>, Vec<&Vec<String>>) = pins.iter().partition(|p| p[6] == "top");
    assert!(bottom.iter().all(|p| p[6] == "bottom"), "{bottom:?}");
    let last_bottom = bottom.iter().map(|p| p[0].parse::<u32>().unwrap()).max().unwrap();
    let first_top = top.iter().map(|p| p[0].parse::<u32>().unwrap()).min().unwrap();
    assert_eq!(first_top, last_bottom + 1, "the top row's pins follow on");
    let upper = |element: &str| element.starts_with('T') || ["HEAT", "COOL", "HOLD", "FAULT"].iter().any(|n| element.ends_with(n));
    for r in &segmap {
        let side = &pins.iter().find(|p| p[1] == r[6]).unwrap()[6];
        assert_eq!(side, if upper(&r[0]) { "top" } else { "bottom" }, "{} on {}", r[0], r[6]);
    }
    let top_commons: BTreeSet<&str> = top.iter().filter(|p| p[3] == "COM").map(|p| p[1].as_str()).collect();
    assert_eq!(top_commons, BTreeSet::from(["COM3", "COM4"]));
    // Each icon column: four icons on one line, COM1 at the top in the lower row (pads
    // below) and COM4 at the top in the upper row (its commons numbered from the row
    // below outwards).
    for (column, top_com) in [(["MIST", "DRY", "FAN", "DOOR"], 1), (["HEAT", "COOL", "HOLD", "FAULT"], 4)] {
        for c in 1..=5 {
            let cells: Vec<&Vec<String>> = column.iter().map(|n| segmap.iter().find(|r| r[0] == format!("C{c}_{n}")).unwrap()).collect();
            assert!(cells.iter().all(|r| r[6] == cells[0][6]), "chamber {c}: {column:?} on one line");
            let coms: Vec<u32> = cells.iter().map(|r| r[2].parse().unwrap()).collect();
            let want: Vec<u32> = if top_com == 1 { vec![1, 2, 3, 4] } else { vec![4, 3, 2, 1] };
            assert_eq!(coms, want, "chamber {c}: {column:?}");
        }
    }
}

/// A second pad row on a layout with one row of digits would take no line: refused at
/// `pads.second_row` (exit 2, nothing written), saying what the row is for.
#[test]
fn a_second_pad_row_with_nothing_behind_the_front_row_is_refused() {
    let text = std::fs::read_to_string(root().join("demo-layouts/kiln-controller.yaml")).unwrap();
    let text = text.replace("front: {width: 56, height: 36}", "front: {width: 56, height: 40}").replace("  side: bottom\n", "  side: bottom\n  second_row: {}\n").replace("fill_port: {side: top, at: 28", "fill_port: {side: left, at: 18");
    assert!(text.contains("second_row"), "the demo's pads changed");
    let dir = tempfile::tempdir().unwrap();
    let layout = dir.path().join("kiln-two-pad-rows.yaml");
    std::fs::write(&layout, text).unwrap();
    let (code, err) = build(&layout, &dir.path().join("out"));
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("error in `pads.second_row`") && err.contains("no SEG line goes to the second pad row"), "{err}");
    assert!(!dir.path().join("out").exists() || std::fs::read_dir(dir.path().join("out")).unwrap().next().is_none(), "nothing written");
}

/// The cold-store demo with a ledge on top and a second pad row there: the upper row's
/// lines go to it; a line of the upper row fixed to a pin of the bottom row is reported
/// as `unroutable`, naming the pin it reached instead.
#[test]
fn a_pin_fixed_on_the_other_pad_row_is_reported() {
    let text = std::fs::read_to_string(root().join("demo-layouts/cold-store-monitor.yaml")).unwrap();
    let text = text
        .replace("front: {width: 72, height: 50}", "front: {width: 72, height: 55}")
        .replace("  fill_port: {side: top, at: 36, width: 3}\n", "")
        .replace("  edge_margin: 0.3\ndrive", "  edge_margin: 0.3\n  second_row: {}\n  fixed: {SEG1: 1}\ndrive");
    assert!(text.contains("second_row") && text.contains("SEG1: 1") && !text.contains("fill_port"), "the demo changed");
    let dir = tempfile::tempdir().unwrap();
    let layout = dir.path().join("cold-store-two-pad-rows.yaml");
    let build_with = |text: &str| {
        std::fs::write(&layout, text).unwrap();
        build(&layout, &dir.path().join("out"))
    };
    let (code, err) = build_with(&text.replace("  fixed: {SEG1: 1}\n", ""));
    assert_eq!(code, Some(0), "{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{err}");
    let (code, err) = build_with(&text);
    assert_eq!(code, Some(1), "{err}");
    assert!(err.contains("error[unroutable]") && err.contains("`SEG1` is fixed to pin 1 but its lead reaches pin"), "{err}");
}

/// Six fourteen-segment characters with points, a ten-step meter and two gauges at 1/3
/// duty: clean, drive truth holding, each (COM, SEG) pair once; the characters on COM1
/// (upper half) and COM3 (lower half) only, eight lines each, the meter and gauges on
/// COM2; the pins above N + ⌈S/N⌉ (Alt & Pleshko, as above) are explained in one note
/// that names the fourteen-segment template.
#[test]
fn fourteen_segments_at_third_duty_route_on_the_outer_commons() {
    let out = built_clean("borehole-pump");
    let segmap = rows(&out.join("borehole-pump.segmap.csv"));
    let pins = rows(&out.join("borehole-pump.pins.csv"));
    assert_eq!(segmap.len(), 6 * 15 + 10 + 4 + 4);
    let mut pairs = BTreeSet::new();
    for r in &segmap {
        assert!(pairs.insert((r[2].clone(), r[5].clone())), "pair COM{} SEG{} used twice", r[2], r[5]);
        let upper = ["a", "b", "f", "g1", "g2", "h", "i", "j"];
        let want = match r[0].split_once('.') {
            Some((d, seg)) if d.starts_with('T') => if upper.contains(&seg) { "1" } else { "3" },
            _ => "2",
        };
        assert_eq!(r[2], want, "{} on COM{}", r[0], r[2]);
    }
    let lines: BTreeSet<&str> = segmap.iter().filter(|r| r[0].starts_with('T')).map(|r| r[5].as_str()).collect();
    assert_eq!(lines.len(), 6 * 8, "eight SEG lines a character");
    assert_eq!(pins.len(), 3 + 48 + 18);
    let notes: Vec<String> = report(&out, "borehole-pump")["findings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|f| f["rule"] == "pin-count")
        .map(|f| f["message"].as_str().unwrap().to_string())
        .collect();
    assert_eq!(notes.len(), 1, "{notes:?}");
    assert!(notes[0].contains("69 pins (3 COM + 66 SEG) where 3 + ⌈108/3⌉ = 39 is the fewest"), "{}", notes[0]);
    assert!(notes[0].contains("the fourteen-segment template puts the upper half of each digit on COM1 and the lower half on COM3"), "{}", notes[0]);
}

/// A colon after a fourteen-segment character routes at 1/2, 1/3 and 1/4 duty: its upper
/// dot on the upper halves' common (COM1), its lower dot on the lower halves' (the last),
/// both on one SEG line of their own. On a middle common either dot would be shut in by
/// the leads that run down between the characters.
#[test]
fn colon_beside_fourteen_segments_routes_on_the_outer_commons() {
    let base = std::fs::read_to_string(root().join("tests/fixtures/fourteen/clock.yaml")).unwrap();
    for commons in [2, 3, 4] {
        let dir = tempfile::tempdir().unwrap();
        let layout = dir.path().join("fourteen-clock.yaml");
        std::fs::write(&layout, base.replace("DUTY", &format!("1/{commons}"))).unwrap();
        let (code, err) = build(&layout, dir.path());
        assert_eq!(code, Some(0), "1/{commons}: {err}");
        assert!(err.contains("0 error(s), 0 warning(s)"), "1/{commons}: {err}");
        let segmap = rows(&dir.path().join("fourteen-clock.segmap.csv"));
        let dot = |name: &str| segmap.iter().find(|r| r[0] == name).unwrap_or_else(|| panic!("{name} missing: {segmap:?}")).clone();
        let (top, bottom) = (dot("T2.col_top"), dot("T2.col_bottom"));
        assert_eq!((top[2].as_str(), bottom[2].clone()), ("1", commons.to_string()), "1/{commons}");
        assert_eq!(top[5], bottom[5], "1/{commons}: both dots on one SEG line");
        let others = segmap.iter().filter(|r| r[5] == top[5]).count();
        assert_eq!(others, 2, "1/{commons}: the colon's line carries nothing else");
    }
}

#[test]
fn four_digit_quarter_duty_demo_routes_itself() {
    assert_multiplexed_demo("kiln-controller", 4);
}

#[test]
fn six_digit_third_duty_demo_routes_itself() {
    assert_multiplexed_demo("rain-gauge", 3);
}

/// Four digits with a colon and three icons at 1/4 duty under laser-printed film rules
/// (0.15 mm lines and gaps, 10 µm undercut) build clean at the minimum pin count. The colon
/// is two elements on one SEG line: its upper dot on COM2 and its lower dot on COM3, the
/// commons that cross the gap between the digits at each dot's height.
#[test]
fn timer_with_a_colon_under_laser_rules_routes_itself() {
    let out = assert_multiplexed_demo("darkroom-timer", 4);
    let segmap = rows(&out.join("darkroom-timer.segmap.csv"));
    let dot = |name: &str| segmap.iter().find(|r| r[0] == name).unwrap_or_else(|| panic!("{name} missing: {segmap:?}")).clone();
    let (top, bottom) = (dot("T2.col_top"), dot("T2.col_bottom"));
    assert_eq!((top[3].as_str(), bottom[3].as_str()), ("COM2", "COM3"));
    assert_eq!(top[6], bottom[6], "both dots on one SEG line");
}

fn two_squares(extra: &str) -> (tempfile::TempDir, PathBuf) {
    let base = std::fs::read_to_string(root().join("tests/fixtures/findings/base.yaml")).unwrap();
    let text = base.replace("GAP_X", "16").replace("drive: static", "drive: {duty: 1/2, bias: 1/3}").replace("EXTRA", extra);
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("two-squares.yaml");
    std::fs::write(&path, text).unwrap();
    (dir, path)
}

/// The two squares share SEG1 on two commons and build clean; the base of the next test.
#[test]
fn two_squares_on_two_commons_build_clean() {
    let (d, p) = two_squares("");
    let (code, err) = build(&p, &d.path().join("out"));
    assert_eq!(code, Some(0), "{err}");
    let pins = rows(&d.path().join("out/two-squares.pins.csv"));
    assert_eq!(pins.len(), 3, "COM1, COM2 and SEG1: {pins:?}");
}

/// A back bus of COM2 drawn across a front bus of SEG1 inside the window: the crossing
/// lights when (COM2, SEG1) is driven, where no element is assigned (docs/background.md,
/// *Ghost pixels*).
#[test]
fn a_common_bus_across_a_seg_lead_fails_drive_truth_naming_the_pair() {
    let extra = "buses:\n  - {net: SEG1, plate: front, width: 0.2, points: [[10, 12], [10, 10], [14, 10]]}\n  - {net: COM2, plate: back, width: 0.2, points: [[13, 9], [13, 11]]}\n";
    let (d, p) = two_squares(extra);
    let (code, err) = build(&p, &d.path().join("out"));
    assert_eq!(code, Some(1), "{err}");
    let line = err.lines().find(|l| l.contains("error[drive-truth]")).unwrap_or_else(|| panic!("no drive-truth finding:\n{err}"));
    assert!(line.contains("(COM2, SEG1)"), "{line}");
    assert!(line.contains("inside the window"), "{line}");
}

/// Digit segment gaps of 0.2 mm leave no room at the left junction for the back lead that
/// joins the second common of each digit (lead 0.11 mm + 2 × 0.05 mm gap, plus the grid):
/// the build fails and names the common it cannot route — once for the one cause, with
/// the elements behind the cut-off parts named as the layout names them and the line of
/// their entry, and the check's opens folded into it.
#[test]
fn a_junction_too_narrow_for_the_back_lead_is_unroutable_naming_the_net() {
    let text = std::fs::read_to_string(root().join("demo-layouts/kiln-controller.yaml")).unwrap().replace("gap: 0.35", "gap: 0.2");
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("narrow.yaml");
    std::fs::write(&path, text).unwrap();
    let (code, err) = build(&path, &dir.path().join("out"));
    assert_eq!(code, Some(1), "{err}");
    let lines: Vec<&str> = err.lines().filter(|l| l.contains("error[unroutable]")).collect();
    assert_eq!(lines.len(), 1, "one finding for one cause:\n{err}");
    let line = lines[0];
    assert!(line.contains("parts of common electrode COM2 behind T1.b, T1.g,"), "{line}");
    assert!(line.contains("(`digits[0]` line 29)"), "{line}");
    assert!(line.contains("(the check confirms: 4 pieces of COM2 cut off from its pad)"), "{line}");
    assert!(!err.contains("error[open]"), "{err}");
}

/// The kiln demo with its pads on the left (glass and window moved to make the ledge
/// there): its four digits' SEG leads run along the row above the digits, COM1's top
/// pieces of the far digits are cut off, and the one finding says what to change
/// (docs/architecture.md, *Pads on the left or right of a row of multiplexed digits*).
#[test]
fn side_pads_at_a_row_of_four_digits_say_to_move_the_pads() {
    let text = std::fs::read_to_string(root().join("demo-layouts/kiln-controller.yaml")).unwrap();
    let mut moved = text.clone();
    for (from, to) in [
        ("front: {width: 56, height: 36}", "front: {width: 60, height: 32}"),
        ("back: {width: 56, height: 32, x: 0, y: 4}", "back: {width: 56, height: 32, x: 4, y: 0}"),
        ("window: {x: 4, y: 8,", "window: {x: 8, y: 4,"),
        ("side: bottom", "side: left"),
        ("at: 28, width: 3", "at: 32, width: 3"),
        ("origin: [6, 14.5]", "origin: [10, 10.5]"),
        ("at: [9.5, 9.8]", "at: [13.5, 5.8]"),
        ("at: [32.5, 9.8]", "at: [36.5, 5.8]"),
        ("at: [45.5, 10.7]", "at: [49.5, 6.7]"),
    ] {
        assert!(moved.contains(from), "the demo changed: {from}");
        moved = moved.replace(from, to);
    }
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("left.yaml");
    std::fs::write(&path, moved).unwrap();
    let (code, err) = build(&path, &dir.path().join("out"));
    assert_eq!(code, Some(1), "{err}");
    let lines: Vec<&str> = err.lines().filter(|l| l.contains("error[unroutable]")).collect();
    assert_eq!(lines.len(), 1, "{err}");
    assert!(lines[0].contains("COM1 behind T2.a"), "{}", lines[0]);
    assert!(lines[0].contains("put the pads on the top or bottom side (`pads.side`)"), "{}", lines[0]);
    // The preview is written all the same; with the back glass 4 mm right of the front
    // glass's edge, the two plates' names must still not print over each other.
    let svg = std::fs::read_to_string(dir.path().join("out/kiln-controller.preview.svg")).unwrap();
    let labels = crate::preview_labels::plate_labels(&svg);
    assert_eq!(labels.len(), 2, "{labels:?}");
    assert!(!crate::preview_labels::labels_meet(&labels[0], &labels[1]), "{labels:?}");
}

/// Three multiplexed rows, one behind another as seen from the pads, are refused by the
/// capacity check before any search: exit 2 (an input problem), the farthest row's entry
/// located by line and key, the row in its way named, and no output folder made. (Two
/// rows like these, before the far row led out on the far side, routed for about a
/// minute and ended with 23 cut-off common pieces.)
#[test]
fn a_third_row_behind_two_is_refused_before_routing() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let (code, err) = build(&root().join("tests/fixtures/capacity/three-rows.yaml"), &out);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("three-rows.yaml:30: error in `digits[0]`: digits `R` lie behind digits `E` (line 48)"), "{err}");
    assert!(!err.contains("unroutable"), "{err}");
    assert!(!out.exists(), "nothing may be written for a refused layout");
}

/// The pins of a built demo against the fewest, from its report: (`pin_count`,
/// `pin_count_formula`, the `pin-count` notes' messages).
fn pins_and_notes(name: &str) -> (u64, u64, Vec<String>) {
    let (_, out) = crate::demo_build::build_demo(name);
    let r = report(&out, name);
    let notes = r["findings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|f| f["rule"] == "pin-count")
        .map(|f| {
            assert_eq!(f["severity"], "note");
            f["message"].as_str().unwrap().to_string()
        })
        .collect();
    (r["drive"]["pin_count"].as_u64().unwrap(), r["drive"]["pin_count_formula"].as_u64().unwrap(), notes)
}

/// A layout with more pins than N + ⌈S/N⌉ (docs/background.md, *Drive and pin count*)
/// says so in one `pin-count` note whose figures are the report's own pin count and
/// formula (counted from the artwork's pins and pixels, apart from the note), naming
/// the bar graph and the gauge that hold the free places; a layout at the fewest pins
/// gets no note.
#[test]
fn pins_above_the_fewest_are_explained_once() {
    let (pins, fewest, notes) = pins_and_notes("greenhouse-humidity");
    assert!(pins > fewest);
    assert_eq!(notes.len(), 1, "{notes:?}");
    assert!(notes[0].starts_with(&format!("{pins} pins (")), "{}", notes[0]);
    assert!(notes[0].contains(&format!(" = {fewest} is the fewest")), "{}", notes[0]);
    assert!(notes[0].contains("`bars[0]` (LVL, line ") && notes[0].contains("`icons[0]` (BATT, line "), "{}", notes[0]);
    let (pins, fewest, notes) = pins_and_notes("kiln-controller");
    assert_eq!((pins, notes.len()), (fewest, 0), "{notes:?}");
}

/// The layout mirrored top to bottom with its pads moved to the top side: the back glass,
/// the window, the fill port, the digits, legends and icons all change sides; sizes stay.
fn with_pads_on_top(text: &str) -> String {
    use serde_yaml::Value;
    let mut v: Value = serde_yaml::from_str(text).unwrap();
    let num = |v: &Value| v.as_f64().unwrap();
    let h = num(&v["glass"]["front"]["height"]);
    let flip = |v: &mut Value, y: &str, size: f64| {
        let y0 = num(&v[y]);
        v[y] = Value::from(h - y0 - size);
    };
    let back_h = num(&v["glass"]["back"]["height"]);
    flip(&mut v["glass"]["back"], "y", back_h);
    let win_h = num(&v["window"]["height"]);
    flip(&mut v["window"], "y", win_h);
    if v["seal"]["fill_port"].is_mapping() {
        let port_side = if v["seal"]["fill_port"]["side"] == "top" { "bottom" } else { "top" };
        v["seal"]["fill_port"]["side"] = Value::from(port_side);
    }
    assert_eq!(v["pads"]["side"], "bottom");
    v["pads"]["side"] = Value::from("top");
    let flip_point = |item: &mut Value, key: &str, size: f64| {
        let y = num(&item[key][1]);
        item[key][1] = Value::from(h - y - size);
    };
    for d in v["digits"].as_sequence_mut().into_iter().flatten() {
        let size = num(&d["height"]);
        flip_point(d, "origin", size);
    }
    for l in v["legends"].as_sequence_mut().into_iter().flatten() {
        let size = num(&l["height"]);
        flip_point(l, "at", size);
    }
    for i in v["icons"].as_sequence_mut().into_iter().flatten() {
        if i["at"].is_sequence() {
            let size = num(&i["size"]);
            flip_point(i, "at", size);
        } else if i["rectangle"].is_mapping() {
            let size = num(&i["rectangle"]["height"]);
            flip_point(&mut i["rectangle"], "at", size);
        } else if i["circle"].is_mapping() {
            flip_point(&mut i["circle"], "centre", 0.0);
        } else {
            // A path drawn with absolute coordinates from `at`: its height is its
            // largest y (every second number).
            let d = i["path"]["d"].as_str().unwrap().to_string();
            let numbers: Vec<f64> = d.split(|c: char| c.is_whitespace() || c == ',').filter_map(|t| t.parse().ok()).collect();
            let size = numbers.iter().skip(1).step_by(2).copied().fold(0.0, f64::max);
            flip_point(&mut i["path"], "at", size);
        }
    }
    serde_yaml::to_string(&v).unwrap()
}

/// Pins on the top side route too: every multiplexed demo without a bar graph, mirrored
/// top to bottom with its pads on top, builds with no error and no warning at the fewest
/// pins, N + ⌈S/N⌉, as it does drawn. Before the digits' templates followed the lead
/// direction these three gave 3, 3 and 1 `unroutable` findings (middle commons cut off,
/// and the top common behind a legend).
#[test]
fn the_multiplexed_demos_route_with_their_pads_on_top() {
    for name in ["kiln-controller", "darkroom-timer", "rain-gauge"] {
        let text = std::fs::read_to_string(root().join("demo-layouts").join(format!("{name}.yaml"))).unwrap();
        let report = build_clean_with_pads_on_top(name, &with_pads_on_top(&text));
        // As drawn, each of these takes the fewest pins (`assert_multiplexed_demo`).
        assert_eq!(report["drive"]["pin_count"], report["drive"]["pin_count_formula"], "{name}");
    }
}

/// Two rows with the pads on top: the cold-store demo (one pad row; the upper row's
/// leads go round the seal) and the germination demo (its second pad row now below),
/// mirrored top to bottom, build with no error and no warning, and the far row's two
/// outer commons take the second pins — COM1 and COM2 now, the commons being numbered
/// down the glass (COM3 and COM4 as drawn, `two_rows_with_the_pads_on_one_side_route_themselves`).
/// Before the second dots were counted from the near row, both gave four `unroutable`
/// findings.
#[test]
fn two_rows_route_with_their_pads_on_top() {
    for name in ["cold-store-monitor", "germination-cabinet"] {
        let text = std::fs::read_to_string(root().join("demo-layouts").join(format!("{name}.yaml"))).unwrap();
        let report = build_clean_with_pads_on_top(name, &with_pads_on_top(&text));
        let twice: BTreeSet<&str> = report["nets"]
            .as_array()
            .unwrap()
            .iter()
            .filter(|n| n["kind"] == "common" && n["pins"].as_array().unwrap().len() == 2)
            .map(|n| n["name"].as_str().unwrap())
            .collect();
        assert_eq!(twice, BTreeSet::from(["COM1", "COM2"]), "{name}");
    }
}

/// Points on three of the kiln demo's four digits, pads on top: clean too. The two
/// legends at either end of the row no longer share a line (a lead between them crossed
/// a digit and cut four commons off), so one more pin than the fewest, with its note.
#[test]
fn points_on_most_digits_route_with_the_pads_on_top() {
    let text = std::fs::read_to_string(root().join("demo-layouts/kiln-controller.yaml")).unwrap();
    assert!(text.contains("decimal_points: [2]"));
    let report = build_clean_with_pads_on_top("kiln-controller", &with_pads_on_top(&text.replace("decimal_points: [2]", "decimal_points: [1, 2, 3]")));
    let (pins, fewest) = (report["drive"]["pin_count"].as_u64().unwrap(), report["drive"]["pin_count_formula"].as_u64().unwrap());
    assert_eq!(pins, fewest + 1);
    let notes = report["findings"].as_array().unwrap().iter().filter(|f| f["rule"] == "pin-count").count();
    assert_eq!(notes, 1);
}

/// Builds the layout text as `name.yaml`; asserts exit 0 with no error and no warning;
/// gives the report.
fn build_clean_with_pads_on_top(name: &str, text: &str) -> serde_json::Value {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join(format!("{name}.yaml"));
    std::fs::write(&path, text).unwrap();
    let (code, err) = build(&path, &dir.path().join("out"));
    assert_eq!(code, Some(0), "{name} with its pads on top:\n{err}");
    assert!(err.contains("0 error(s), 0 warning(s)"), "{name} with its pads on top:\n{err}");
    let report = std::fs::read_to_string(dir.path().join("out").join(format!("{name}.report.json"))).unwrap();
    serde_json::from_str(&report).unwrap()
}
