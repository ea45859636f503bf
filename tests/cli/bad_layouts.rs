//! Bad layouts through the real binary: each file in tests/fixtures/bad/ breaks one thing
//! (its first line says what). `segmask build` must exit with 2, name the file and line
//! (`file:LINE:`), the key path and the problem, and create no output folder.

use std::path::{Path, PathBuf};
use std::process::Command;

/// One bad layout: file stem, key path reported (empty for syntax errors), line, and a
/// fragment of the message.
struct Case(&'static str, &'static str, usize, &'static str);

const CASES: &[Case] = &[
    Case("syntax-error", "", 7, "while parsing a flow mapping at line 6"),
    Case("missing-key", "digits[0].height", 15, "missing (this key is required)"),
    Case("unknown-key", "digits[0].heigth", 19, "unknown key `heigth` (did you mean `height`?)"),
    Case("wrong-type", "glass", 3, "invalid type: integer `60`"),
    Case("duplicate-key", "pads.pitch", 12, "key `pitch` appears twice"),
    Case("wrong-unit", "cell_gap", 7, "unit `cm` not known (allowed: mm, um, µm, mil, in)"),
    Case("implausible-cell-gap", "cell_gap", 7, "7 mm is not a plausible cell gap"),
    Case("negative-width", "pads.width", 12, "must be greater than 0 (got -0.6 mm)"),
    Case("unknown-style", "digits[0].style", 16, "unknown style `nine` (allowed: seven, fourteen, sixteen)"),
    Case("bad-point", "digits[0].origin", 18, "a point needs 2 coordinates, got 1"),
    Case("digit-outside-window", "digits[0].origin", 18, "digit 1 of `D`"),
    Case("overlapping-digits", "digits[0].pitch", 21, "digit 2 of `D` overlaps digit 1 of `D`"),
    Case(
        "overlapping-groups",
        "digits[1].origin",
        24,
        "digit 1 of `E` overlaps digit 1 of `D` of `digits[0]` (line 15)",
    ),
    Case("digit-over-icon", "icons[0]", 27, "icon `BATT` overlaps digit 1 of `D`"),
    Case("slant-too-steep", "digits[0].slant", 22, "too steep (allowed: -20 to 20 degrees)"),
    Case("stroke-too-heavy", "digits[0].stroke", 23, "too heavy for a 7 mm × 12 mm digit"),
    Case("negative-gap", "digits[0].gap", 23, "must not be negative"),
    Case("thin-marks", "marks.line", 9, "a mark line drawn 0.15 mm wide etches to 0.13 mm, below min_width 0.15 mm"),
    Case("decimal-point-index", "digits[0].decimal_points[1]", 23, "digit 5 does not exist (the group has 4)"),
    Case("ring-inner", "icons[1].ring.inner", 28, "inner radius 2.5 mm is not less than outer 2 mm"),
    Case("icon-two-shapes", "icons[1]", 28, "several shapes given: circle, ring"),
    Case("reserved-net-name", "icons[0].name", 27, "`COM2` is reserved for a common electrode"),
    Case("duplicate-net", "legends[0].name", 25, "net `D2.b` is also made by `digits[0].name` (line 15)"),
    Case("bad-name", "name", 2, "`bad base!` has characters a file name should not have"),
    Case("window-outside-seal", "window", 6, "reaches outside the liquid-crystal region"),
    Case("back-outside-front", "glass.back", 5, "reaches outside the front glass"),
    Case(
        "no-ledge",
        "pads.side",
        10,
        "pads need a ledge of 3.3 mm (length 3 mm + edge_margin 0.3 mm) (allowed: bottom)",
    ),
    Case("pads-dont-fit", "pads.pitch", 11, "35 pads are needed (34 elements + 1 common) but only 30 fit"),
    Case("pads-count-too-small", "pads.count", 13, "10 pads given but 35 are needed"),
    Case("bad-fixed-pin", "pads.fixed.D9.a", 13, "unknown net `D9.a`"),
    Case("fixed-pin-twice", "pads.fixed.D1.a", 15, "pin 1 is already fixed for `COM1`"),
    Case("fixed-pin-off-row", "pads.fixed.COM1", 13, "pin 99 is not on the pad row (allowed: 1 to 35)"),
    Case("bus-unknown-net", "buses[0].net", 30, "unknown net `D7.a`"),
    Case("bus-one-point", "buses[0].points", 30, "do not make a trace"),
    Case("fill-port-on-pad-side", "seal.fill_port.side", 8, "cannot open onto the pad side (bottom)"),
    Case("fill-port-in-corner", "seal.fill_port.at", 8, "runs into the corner of the seal"),
    Case("bad-drive", "drive.duty", 13, "duty `1/5` not supported"),
    Case("bad-bias", "drive.bias", 13, "bias 1/2 with duty 1/4"),
    Case("film-below-process", "rules.film_min_feature", 14, "0.05 mm is finer than laser-film holds reliably"),
    Case("unknown-process", "masks.process", 13, "`inkjet-film`"),
    Case("fixed-com-beyond-duty", "drive.fixed.D1.b.com", 16, "COM5 does not exist at duty 1/4"),
    Case("fixed-unknown-element", "drive.fixed.D9.a", 16, "unknown element `D9.a` (did you mean `D1.a`?)"),
    Case("unknown-gds-layer", "gds_layers.front_itto", 29, "unknown layer `front_itto` (did you mean `front_ito`?)"),
    Case("gds-layer-range", "gds_layers.seal[0]", 30, "300 is above 255"),
    Case("missing-font", "fonts[0]", 29, "cannot read"),
    Case(
        "panel-substrate-small",
        "panel.substrate.width",
        37,
        "150 mm is too small: 3 columns of 60 mm cells with 2 mm spacing take 184 mm, plus 5 mm on each side",
    ),
    Case("panel-lane-wide", "panel.scribe_lane", 36, "a 4 mm lane reaches 2 mm into each cell, deeper than rules.edge_clearance 1.5 mm"),
    Case(
        "bar-too-many-steps",
        "bars[0].count",
        28,
        "101 steps in one bar graph is more than segment glass carries (allowed: 1 to 100)",
    ),
    Case("bar-no-path", "bars[0]", 27, "no `line` or `arc` given (allowed: exactly one of line, arc)"),
    Case(
        "bar-outside-window",
        "bars[0]",
        27,
        "step 9 of bar graph `LVL` (x 55.68 mm to 56.68 mm, y 27 mm to 29 mm) reaches outside the window",
    ),
    Case("bar-over-digit", "bars[0]", 27, "step 2 of bar graph `LVL` overlaps digit 1 of `D` of `digits[0]` (line 15)"),
    Case(
        "bar-gap-below-rule",
        "bars[0].gap",
        32,
        "gap 0.02 mm is below the minimum gap (allowed: at least rules.min_gap, 0.05 mm)",
    ),
    Case("bar-wedge-on-line", "bars[0].shape", 32, "a wedge needs an arc"),
    Case("bar-negative-length", "bars[0].length", 31, "must be greater than 0 (got -2 mm)"),
    Case("bar-infinite-thickness", "bars[0].thickness", 30, "`inf` is not a length"),
    Case("bar-arc-too-tight", "bars[0].count", 28, "40 steps of 4.500° leave 0 mm of width at the inner radius 2 mm"),
    Case("bar-step-net-twice", "bars[0].name", 28, "net `LVL.3` is also made by `legends[1].name` (line 26)"),
    Case(
        "gauge-unknown",
        "icons[0].gauge",
        27,
        "there is no gauge `batery` (did you mean `battery`?) (allowed: a gauge of the fonts: battery, signal)",
    ),
    Case("saturation-below-threshold", "mixture.saturation", 8, "saturation 2 V is not above threshold 2.5 V"),
    Case("frame-rate-unit", "electrical.frame_rate", 8, "`64kHz` is not a number with a known unit (allowed: hertz"),
    Case("wavelength-out-of-range", "optics.wavelength", 8, "5000 is outside the plausible range (allowed: a wavelength from 300nm"),
    Case("negative-registration", "rules.registration", 8, "must not be negative"),
    Case(
        "gauge-parts-touch",
        "icons[0].stroke",
        27,
        "parts `battery-shell` and `battery-bar-1` of gauge `battery` touch",
    ),
];

fn fixture(stem: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/bad").join(format!("{stem}.yaml"))
}

/// Runs `segmask <command> <file> [--out <fresh dir>/out]`; gives exit code and stderr,
/// and asserts that no output folder appeared.
fn run(command: &str, file: &Path) -> (Option<i32>, String) {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let mut cmd = Command::new(env!("CARGO_BIN_EXE_segmask"));
    cmd.arg(command).arg(file);
    if command == "build" {
        cmd.arg("--out").arg(&out);
    }
    let o = cmd.output().unwrap();
    assert!(!out.exists(), "{}: output folder was created", file.display());
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

fn assert_reported(case: &Case, code: Option<i32>, stderr: &str) {
    let Case(stem, key, line, fragment) = case;
    let place = format!("{}:{line}:", fixture(stem).display());
    assert_eq!(code, Some(2), "{stem}: exit code; stderr:\n{stderr}");
    assert!(stderr.contains(&place), "{stem}: `{place}` not in:\n{stderr}");
    if !key.is_empty() {
        assert!(stderr.contains(&format!("error in `{key}`")), "{stem}: key `{key}` not in:\n{stderr}");
    }
    assert!(stderr.contains(fragment), "{stem}: `{fragment}` not in:\n{stderr}");
    assert!(!stderr.contains("internal error") && !stderr.contains("panicked"), "{stem}:\n{stderr}");
}

#[test]
fn every_bad_layout_is_refused_by_build() {
    for case in CASES {
        let (code, stderr) = run("build", &fixture(case.0));
        assert_reported(case, code, &stderr);
    }
}

#[test]
fn check_refuses_bad_layouts_too() {
    for case in CASES.iter().filter(|c| ["unknown-style", "pads-dont-fit"].contains(&c.0)) {
        let (code, stderr) = run("check", &fixture(case.0));
        assert_reported(case, code, &stderr);
    }
}

#[test]
fn every_fixture_is_in_the_table() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/bad");
    let mut stems: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .filter_map(|e| e.ok()?.path().file_stem()?.to_str().map(String::from))
        .collect();
    stems.sort();
    let mut table: Vec<String> = CASES.iter().map(|c| c.0.to_string()).collect();
    table.sort();
    assert_eq!(stems, table);
    assert!(table.len() >= 24);
}

#[test]
fn a_missing_file_is_an_io_error_not_a_panic() {
    let (code, stderr) = run("build", &fixture("no-such-layout"));
    assert_eq!(code, Some(2));
    assert!(stderr.contains("no-such-layout.yaml"), "{stderr}");
}
