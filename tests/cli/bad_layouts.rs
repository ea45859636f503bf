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
    Case("fourteen-gap-too-narrow", "digits[0].gap", 23, "three leads cross the centre of each digit side by side"),
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
    // 0.7 mm between the seal's inner edge and the window, less the 0.051 mm mark gap
    // from each: a 1 mm mark fits in no corner (plane geometry).
    Case("no-mark-room", "seal.width", 8, "beside the window there is 0.598 mm on the left"),
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
    Case("lead-finer-than-film", "rules.min_width", 14, "leads drawn 0.136 mm wide are finer than the 0.15 mm the film holds"),
    Case("gap-finer-than-film", "rules.min_gap", 14, "gaps drawn 0.1 mm wide are finer than the 0.15 mm the film holds (`rules.film_min_feature`) (allowed: at least 0.15 mm"),
    Case(
        "default-gap-wider-than-stroke",
        "digits[0].stroke",
        24,
        "stroke 1.2 mm is not wider than the gap these rules give the segments by default, 1.53 mm (three 0.16 mm leads",
    ),
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
    // Limits (docs/layout-format.md, *Limits*), non-finite numbers and hostile files:
    // each refused in the spec stage with its line, key and the limit.
    Case("glass-1e20", "glass.front.width", 4, "1e20 mm is beyond the largest length segmask takes (allowed: at most 1000 mm"),
    Case("glass-1e308", "glass.front.height", 4, "1e308 mm is beyond the largest length"),
    Case("glass-over-a-metre", "glass.front.width", 4, "1001 mm is beyond the largest length"),
    Case("glass-grid-too-big", "glass.front", 4, "needs 1296 million grid cells (allowed: at most 64 million cells"),
    Case("glass-huge-integer", "glass.front.width", 4, "1e26 mm is beyond the largest length"),
    Case("origin-1e300", "digits[0].origin[0]", 18, "1e300 mm is beyond the largest length"),
    Case("ring-centre-1e300", "icons[1].ring.centre[1]", 28, "1e300 mm is beyond the largest length"),
    Case("bus-point-1e300", "buses[0].points[0][0]", 30, "1e300 mm is beyond the largest length"),
    Case("seal-width-nan", "seal.width", 8, "`NaN` is not a length"),
    Case("window-x-minus-inf", "window.x", 6, "`-inf` is not a length"),
    Case("pitch-inf-text", "pads.pitch", 11, "`inf mm` is not a length"),
    Case("rectangle-width-inf", "icons[1].rectangle.width", 28, "`inf` is not a length"),
    Case("cell-gap-nan", "cell_gap", 7, "`NaN` is not a length"),
    Case("tolerance-inf", "tolerance", 8, "`inf` is not a length"),
    Case("marks-size-5-m", "marks.size", 8, "5000 mm is beyond the largest length"),
    Case("slant-1e300", "digits[0].slant", 22, "1e300° is more than two turns (allowed: -720 to 720 degrees)"),
    Case("slant-nan", "digits[0].slant", 22, "`NaN` is not an angle"),
    Case("voltage-nan", "electrical.voltage", 8, "`NaN` is not a number with a known unit"),
    Case("birefringence-inf", "mixture.birefringence", 8, "`inf` is not a number with a known unit"),
    Case("wavelength-1e308", "optics.wavelength", 8, "1e308 is outside the plausible range"),
    Case("bar-arc-start-1e9", "bars[0].arc.start", 31, "1e9° is more than two turns"),
    Case("bar-count-nan", "bars[0].count", 28, "`NaN` is not a whole number"),
    Case("first-pin-near-2-32", "pads.first_pin", 13, "4294967290 is more than segmask counts to (allowed: a whole number from 0 to 1000000)"),
    Case("fixed-pin-huge", "pads.fixed.COM1", 13, "99999999999 is more than segmask counts to"),
    Case("pads-count-1e9", "pads.count", 13, "1000000000 is more than segmask counts to"),
    Case("pads-count-1500", "pads.count", 13, "1500 pads are more than one pad row takes (allowed: 1 to 1000)"),
    Case("first-pin-text-huge", "pads.first_pin", 13, "`99999999999999999999999` is not a whole number"),
    Case("copies-1e12", "masks.copies", 8, "1000000000000 is more than segmask counts to"),
    Case("gds-layer-1e12", "gds_layers.seal", 8, "1000000000000 is more than segmask counts to"),
    Case("fixed-seg-huge", "drive.fixed.D1.a.seg", 15, "10000000000 is more than segmask counts to"),
    Case("digit-count-1e9", "digits", 14, "1000000000 digits over all groups are more than segmask lays out (allowed: at most 200 digits in all)"),
    Case("digits-over-200", "digits", 14, "304 digits over all groups"),
    Case("digit-groups-21", "digits", 14, "22 digit groups are more than segmask takes here (allowed: at most 20 digit groups)"),
    Case("legends-201", "legends", 24, "202 legends are more than segmask takes here (allowed: at most 200 legends)"),
    Case("legend-65-chars", "legends[0].text", 25, "65 characters are more than one legend holds (allowed: at most 64 characters"),
    Case("legend-5000-chars", "legends[0].text", 25, "5000 characters are more than one legend holds"),
    Case("legend-wider-than-window", "legends[0].text", 25, "legend `UNIT_MV` of 40 characters is at least 56 mm wide (one stroke a character), wider than the window"),
    Case("icons-401", "icons", 26, "403 icons are more than segmask takes here (allowed: at most 400 icons)"),
    Case("polygon-1001-points", "icons[1].polygon", 29, "1001 points are more than segmask takes here (allowed: at most 1000 points)"),
    Case("path-10001-chars", "icons[1].path.d", 29, "characters are more than one icon's path data takes (allowed: at most 10000 characters)"),
    Case("bus-1001-points", "buses[0].points", 30, "1001 points are more than segmask takes here"),
    Case("buses-201", "buses", 29, "202 buses are more than segmask takes here"),
    Case("bars-51", "bars", 31, "51 bar graphs are more than segmask takes here"),
    Case("fonts-17", "fonts", 31, "17 font files are more than segmask takes here"),
    Case("name-231-chars", "name", 2, "231 characters are more than an output file name takes (allowed: at most 64 characters"),
    Case("name-255-chars", "name", 2, "255 characters are more than an output file name takes"),
    Case("net-name-too-long", "legends[0].name", 25, "a name of 70 characters is longer than segmask takes (allowed: at most 64 characters)"),
    Case("group-name-too-long", "digits[0].name", 15, "a name of 70 characters is longer than segmask takes"),
    Case("nesting-flow-40", "", 31, "lists and mappings nest deeper than 32 levels here"),
    Case("nesting-block-40", "", 32, "lists and mappings nest deeper than 32 levels here"),
    Case("merge-key", "glass.back.<<", 5, "YAML merge keys (`<<`) are not supported"),
    Case("second-document", "", 31, "a second YAML document starts here"),
    Case("invalid-utf8", "", 25, "the layout file is not valid UTF-8 (the first bad byte is byte 537 of the file)"),
    Case("tab-indentation", "", 10, "found character that cannot start any token"),
    Case("font-outside-folder", "fonts[0]", 31, "`/etc/hostname` lies outside the layout's folder"),
    Case("font-climbs-out", "fonts[0]", 31, "`../../../Cargo.toml` lies outside the layout's folder"),
    Case("font-dev-zero", "fonts[0]", 31, "`/dev/zero` lies outside the layout's folder"),
    Case("font-is-folder", "fonts[0]", 31, "the font file `.` is a folder, not a regular file"),
    Case("pads-needed-over-1000", "pads", 9, "1398 pads are needed, more than one pad row takes (allowed: at most 1000 pads)"),
    Case("alias-bomb", "legends[0].text", 25, "a list is not a single value"),

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
    assert!(table.len() >= 100);
}

#[test]
fn a_missing_file_is_an_io_error_not_a_panic() {
    let (code, stderr) = run("build", &fixture("no-such-layout"));
    assert_eq!(code, Some(2));
    assert!(stderr.contains("no-such-layout.yaml"), "{stderr}");
}
