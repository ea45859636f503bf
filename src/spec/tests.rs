//! Tests of the whole stage: text in, `Layout` or problems out.

use super::*;
use crate::error::InputProblem;
use crate::layout::*;
use std::path::Path;

const MINIMAL: &str = include_str!("../../tests/fixtures/good/minimal.yaml");

fn parse(text: &str) -> std::result::Result<Layout, Vec<InputProblem>> {
    match parse_layout(text, Path::new("t.yaml")) {
        Ok(l) => Ok(l),
        Err(Error::Input(v)) => Err(v),
        Err(e) => panic!("not an input error: {e}"),
    }
}

fn problems(text: &str) -> Vec<InputProblem> {
    parse(text).expect_err("layout should be rejected")
}

/// The minimal layout with `from` replaced by `to` (each must occur once).
fn edit(from: &str, to: &str) -> String {
    assert_eq!(MINIMAL.matches(from).count(), 1, "{from:?}");
    MINIMAL.replace(from, to)
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() < 1e-12
}

#[test]
fn minimal_layout_resolves_with_documented_defaults() {
    let l = parse(MINIMAL).unwrap();
    assert_eq!(l.name, "minimal");
    assert_eq!(l.glass.back, Rect { x: 0.0, y: 5.0, width: 30.0, height: 25.0 });
    assert!(close(l.cell_gap, 0.007));
    assert_eq!(l.resist, Resist::Positive);
    assert!(close(l.tolerance, 0.001));
    let r = &l.rules;
    assert_eq!((r.min_width, r.min_gap, r.undercut, r.compensate), (0.1, 0.05, 0.005, false));
    assert_eq!((r.film_min_feature, r.backplane_overlap, r.edge_clearance), (0.03, 0.15, 1.5));
    // Not compensating: a lead is drawn min_width + 2·undercut so it etches to min_width.
    assert!(close(r.lead_width, 0.11));
    assert!(close(r.etched_width(r.lead_width), r.min_width));
    assert_eq!(l.seal, Seal { width: 1.0, inset: 1.5, port_side: Side::Top, port_at: 15.0, port_width: 3.0 });
    assert_eq!(l.transfer, Transfer { diameter: 0.8, pad: 1.2 });
    assert_eq!(l.pads.side, Side::Bottom);
    assert!(close(l.pads.width, 0.6 * 1.8));
    assert_eq!((l.pads.length, l.pads.edge_margin, l.pads.first_pin), (3.0, 0.3, 1));
    assert_eq!((l.pads.start, l.pads.count), (None, None));
    assert_eq!(l.drive, Drive { commons: 1, bias: None });
    assert_eq!(l.marks, Marks { size: 1.0, line: 0.15 });
    assert_eq!(l.layers, LayerMap::defaults());
    let d = &l.digits[0];
    assert_eq!((d.style, d.count, d.origin), (DigitStyle::Seven, 1, crate::geom::pt(10.0, 12.0)));
    assert!(close(d.pitch, 9.8));
    assert!(close(d.stroke, 1.2));
    // Lead plus a gap each side, plus four 25 µm routing-grid cells (docs/layout-format.md).
    assert!(close(d.gap, 0.11 + 2.0 * 0.05 + 4.0 * 0.025));
    assert_eq!(d.slant, 0.0);
    assert_eq!(d.key, "digits[0]");
    assert!(l.legends.is_empty() && l.icons.is_empty() && l.buses.is_empty() && l.extra_fonts.is_empty());
    assert_eq!(l.key_lines["digits[0].height"], 14);
    assert_eq!(l.key_lines["pads.pitch"], 8);
    // One digit of seven segments and its common.
    assert_eq!(pads_needed(&l), 8);
}

#[test]
fn units_resolve_to_millimetres() {
    let t = format!("{MINIMAL}cell_gap: 6 µm\ntolerance: \"0.5um\"\nrules: {{min_gap: 2 mil, undercut: 0.0002in}}\n");
    let l = parse(&t).unwrap();
    assert!(close(l.cell_gap, 0.006));
    assert!(close(l.tolerance, 0.0005));
    // 1 mil = 25.4 µm, 1 in = 25.4 mm (NIST SP 811, B.8).
    assert!(close(l.rules.min_gap, 0.0508));
    assert!(close(l.rules.undercut, 0.00508));
}

#[test]
fn every_problem_is_reported_at_its_line() {
    let t = edit("    height: 12\n    width: 7\n", "    height: -12\n    width: 7cm\n    slant: 30\n");
    let t = t.replace("name: minimal", "name: my panel");
    let v = problems(&t);
    let keys: Vec<(&str, Option<usize>)> = v.iter().map(|p| (p.key.as_str(), p.line)).collect();
    assert_eq!(
        keys,
        [
            ("name", Some(3)),
            ("digits[0].height", Some(14)),
            ("digits[0].width", Some(15)),
            ("digits[0].slant", Some(16))
        ]
    );
    assert!(v[1].message.contains("greater than 0"));
    assert_eq!(v[2].message, "unit `cm` not known");
    assert_eq!(v[2].allowed.as_deref(), Some("mm, um, µm, mil, in"));
}

#[test]
fn unknown_keys_come_from_serde_with_line_and_column() {
    let v = problems(&edit("    width: 7\n", "    widht: 7\n"));
    assert_eq!(v.len(), 1);
    assert_eq!(v[0].key, "digits[0].widht");
    assert_eq!(v[0].line, Some(15));
    assert_eq!(v[0].column, Some(5));
    assert!(v[0].message.contains("did you mean `width`?"), "{}", v[0].message);
    assert!(v[0].allowed.as_deref().unwrap().contains("decimal_points"));
}

#[test]
fn syntax_errors_carry_a_line() {
    let v = problems(&edit("pads: {side: bottom, pitch: 1.8}", "pads: {side: bottom, pitch: 1.8"));
    assert_eq!(v.len(), 1);
    assert!(v[0].line.is_some_and(|l| l >= 8), "{:?}", v[0]);
}

#[test]
fn empty_file_is_an_input_problem() {
    let v = problems("# nothing here\n\n");
    assert_eq!(v[0].message, "the layout file is empty");
}

#[test]
fn bad_glass_does_not_pile_up_consequences() {
    // Only the bad width is reported, not the window, ledge or pad row it would upset.
    let v = problems(&edit("back: {width: 30,", "back: {width: zero,"));
    assert_eq!(v.len(), 1, "{v:?}");
    assert_eq!(v[0].key, "glass.back.width");
}

#[test]
fn multiplexed_drive_shares_pads() {
    let l = parse(&format!("{MINIMAL}drive: {{duty: 1/4, bias: 1/3}}\n")).unwrap();
    assert_eq!(l.drive, Drive { commons: 4, bias: Some(3) });
    // 4 commons + ⌈7 / 4⌉ SEG lines (docs/background.md, *Drive and pin count*).
    assert_eq!(pads_needed(&l), 6);
    assert_eq!(common_nets(&l), ["COM1", "COM2", "COM3", "COM4"]);
    let v = problems(&format!("{MINIMAL}drive: {{duty: 1/4, bias: 1/2}}\n"));
    assert_eq!(v[0].key, "drive.bias");
}

#[test]
fn nets_follow_the_contract_names() {
    let t = edit("    count: 1\n", "    count: 2\n    pitch: 9\n    decimal_points: [1]\n    half_digits: [1]\n")
        .replace("width: 20, height: 16", "width: 21.5, height: 16");
    let l = parse(&t).unwrap();
    let nets: Vec<String> = element_nets(&l).into_iter().map(|s| s.net).collect();
    assert_eq!(nets[..3], ["D1.b", "D1.c", "D1.dp"]);
    assert_eq!(nets.len(), 3 + 7);
}

#[test]
fn all_means_every_digit() {
    let t = edit("    count: 1\n", "    count: 2\n    pitch: 8.5\n    colons: all\n")
        .replace("    width: 7\n", "    width: 6\n")
        .replace("pitch: 1.8}", "pitch: 1.5}")
        .replace("width: 20, height: 16", "width: 21.5, height: 16");
    let l = parse(&t).unwrap();
    assert_eq!(l.digits[0].colons, [1, 2]);
    assert!(l.digits[0].decimal_points.is_empty());
}

#[test]
fn fonts_are_read_relative_to_the_layout() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("extra.strokes"), "icon x\n").unwrap();
    let file = dir.path().join("l.yaml");
    std::fs::write(&file, format!("{MINIMAL}fonts: [extra.strokes]\n")).unwrap();
    let l = load_layout(&file).unwrap();
    assert_eq!(l.extra_fonts[0].text, "icon x\n");
    std::fs::write(&file, format!("{MINIMAL}fonts: [missing.strokes]\n")).unwrap();
    match load_layout(&file) {
        Err(Error::Input(v)) => assert_eq!((v[0].key.as_str(), v[0].line), ("fonts[0]", Some(16))),
        other => panic!("{other:?}"),
    }
}

#[test]
fn icons_of_every_shape_resolve() {
    let t = format!(
        "{MINIMAL}icons:\n  - {{name: SQ, rectangle: {{at: [6, 11], width: 2, height: 2, corner: 0.5}}}}\n  \
         - {{name: DOT, circle: {{centre: [22, 14], radius: 1}}}}\n  \
         - {{name: RING, ring: {{centre: [22, 20], outer: 2, inner: 1.5}}}}\n  \
         - {{name: TRI, polygon: [[18, 11], [20, 11], [19, 12]]}}\n  \
         - {{name: LOGO, path: {{d: \"M 0 0 L 1 0 L 1 1 Z\", at: {{x: 6, y: 22}}}}}}\n  \
         - {{name: BATT, icon: battery, at: [6, 16], size: 3}}\n"
    );
    let l = parse(&t).unwrap();
    assert_eq!(l.icons.len(), 6);
    assert!(matches!(l.icons[2].shape, IconShape::Ring { outer: 2.0, inner: 1.5, .. }));
    assert!(matches!(&l.icons[5].shape, IconShape::Named { stroke, .. } if close(*stroke, 0.25)));
    assert!(matches!(&l.icons[4].shape, IconShape::Path { at, .. } if at.x == 6.0 && at.y == 22.0));
}

/// The complete example of docs/layout-format.md.
fn doc_example() -> String {
    let doc = include_str!("../../docs/layout-format.md");
    let start = doc.find("```yaml\n").expect("example") + 8;
    doc[start..][..doc[start..].find("```").unwrap()].to_string()
}

#[test]
fn the_documented_example_resolves() {
    let text = doc_example();
    let l = parse(&text).unwrap_or_else(|v| panic!("{v:#?}"));
    assert_eq!(l.name, "pump-panel");
    assert_eq!(l.icons.len(), 7);
    assert_eq!((l.bars[0].count, l.bars[0].last_length, l.bars[0].side), (8, 4.0, StepSide::Right));
    assert_eq!(l.pads.fixed["BATT"], 2);
    assert_eq!(l.layers.entries["seal"], (30, 0));
    assert_eq!(l.digits[0].half_digits, [1]);
    // The locator finds keys in flow mappings that span two lines and in list items.
    let line = |needle: &str| text.lines().position(|t| t.contains(needle)).unwrap() + 1;
    assert_eq!(l.key_lines["pads.fixed.BATT"], line("fixed: {COM1"));
    assert_eq!(l.key_lines["pads.first_pin"], line("first_pin"));
    assert_eq!(l.key_lines["icons[3].ring.inner"], line("RING1"));
    assert_eq!(l.key_lines["digits[0].half_digits"], line("half_digits"));
    assert_eq!(l.key_lines["buses[0].points[1]"], line("net: D2.a"));
    assert_eq!(l.key_lines["bars[0].last_length"], line("last_length"));
}

#[test]
fn the_documented_example_reports_many_problems_at_once() {
    let text = doc_example()
        .replace("slant: 8", "slant: 30")
        .replace("cell_gap: 7um", "cell_gap: 7cm")
        .replace("inner: 1.5", "inner: 2.5")
        .replace("net: D2.a", "net: D2.z");
    let v = problems(&text);
    let keys: Vec<&str> = v.iter().map(|p| p.key.as_str()).collect();
    assert_eq!(keys, ["cell_gap", "digits[0].slant", "icons[3].ring.inner", "buses[0].net"], "{v:#?}");
}

#[test]
fn bar_steps_and_gauge_parts_are_nets() {
    let t = format!(
        "{MINIMAL}icons:\n  - {{name: RF, gauge: signal, at: [19, 22], size: 3.5, stroke: 0.25}}\n\
         bars:\n  - name: LVL\n    count: 5\n    line: {{from: [6, 10.5], angle: 0}}\n    thickness: 0.6\n    length: 1\n\
         pads: {{side: bottom, pitch: 1.0, fixed: {{RF.2: 3, LVL.5: 4}}}}\n"
    )
    .replace("pads: {side: bottom, pitch: 1.8}\n", "");
    let l = parse(&t).unwrap_or_else(|v| panic!("{v:#?}"));
    let nets: Vec<String> = element_nets(&l).into_iter().map(|s| s.net).collect();
    assert_eq!(nets[7..], ["RF.1", "RF.2", "RF.3", "RF.4", "LVL.1", "LVL.2", "LVL.3", "LVL.4", "LVL.5"]);
    // 7 segments, 4 gauge parts, 5 steps and the common.
    assert_eq!(pads_needed(&l), 17);
    assert_eq!(l.key_lines["bars[0].line.from"], l.key_lines["bars[0].line"]);
    assert!(matches!(&l.icons[0].shape, IconShape::Gauge { parts, .. } if parts.len() == 4));
    // Multiplexed, drive.fixed may name a step.
    let m = parse(&t.replace("pads: {side: bottom, pitch: 1.0, fixed: {RF.2: 3, LVL.5: 4}}", "pads: {side: bottom, pitch: 1.0}\ndrive: {duty: 1/4, fixed: {LVL.3: {com: 2}}}")).unwrap();
    assert_eq!(m.fixed_lines["LVL.3"].com, Some(2));
    let v = problems(&t.replace("LVL.5: 4", "LVL.6: 4"));
    assert_eq!(v[0].key, "pads.fixed.LVL.6");
    assert!(v[0].message.starts_with("unknown net `LVL.6`"), "{}", v[0].message);
}

#[test]
fn a_gauge_the_fonts_lack_is_refused_with_the_list() {
    let v = problems(&format!("{MINIMAL}icons:\n  - {{name: B, gauge: batery, at: [19, 22], size: 3}}\n"));
    assert_eq!((v[0].key.as_str(), v[0].line), ("icons[0].gauge", Some(17)));
    assert_eq!(v[0].message, "there is no gauge `batery` (did you mean `battery`?)");
    assert_eq!(v[0].allowed.as_deref(), Some("a gauge of the fonts: battery, signal"));
}

/// A bar graph's step outside the window, or over a digit, is refused at the bar.
#[test]
fn bar_graphs_stay_in_the_window_and_off_other_elements() {
    let bar = |from: &str| format!("{MINIMAL}bars:\n  - {{name: L, count: 4, line: {{from: {from}}}, thickness: 1, length: 1}}\n");
    let v = problems(&bar("[22, 11]"));
    assert_eq!(v[0].key, "bars[0]");
    assert!(v[0].message.contains("step 3 of bar graph `L`"), "{}", v[0].message);
    let v = problems(&bar("[10.5, 16]"));
    assert!(v[0].message.contains("step 1 of bar graph `L` overlaps digit 1 of `D`"), "{}", v[0].message);
}

/// The default process (photoplotted film) and the default rules agree: the rules a
/// layout gets without writing any are the process's suggested ones, and the film rule
/// is the process's limit (about 30 µm for photoplotted film, *common practice*,
/// docs/background.md, *Films, photoplots and chrome*). Laser-printed film widens the
/// defaults to 0.15 mm (about 0.10–0.15 mm, same source) and refuses a finer film rule.
#[test]
fn process_profiles_set_the_default_rules() {
    let l = parse(MINIMAL).unwrap();
    assert_eq!(l.masks, MaskOptions::default());
    assert_eq!(l.masks.process, Process::PhotoplotFilm);
    assert_eq!((l.rules.min_width, l.rules.min_gap), Process::PhotoplotFilm.suggested_rules());
    assert!(close(l.rules.film_min_feature, Process::PhotoplotFilm.mask_limit()));
    assert!(l.rules.min_gap >= l.rules.film_min_feature, "default gap finer than the default film holds");

    let laser = parse(&edit("name: minimal\n", "name: minimal\nmasks: {process: laser-film, sheet: letter, copies: 2, mirror: false}\n")).unwrap();
    assert_eq!((laser.rules.min_width, laser.rules.min_gap, laser.rules.film_min_feature), (0.15, 0.15, 0.15));
    assert_eq!((laser.masks.sheet, laser.masks.copies, laser.masks.mirror), (Sheet::Letter, 2, false));

    let fine = problems(&edit("name: minimal\n", "name: minimal\nmasks: {process: laser-film}\nrules: {film_min_feature: 0.1}\n"));
    assert_eq!(fine[0].key, "rules.film_min_feature");
    let zero = problems(&edit("name: minimal\n", "name: minimal\nmasks: {copies: 0}\n"));
    assert_eq!(zero[0].key, "masks.copies");
}

/// The minimal layout with a 5 mm ledge on top as well, and `second_row` as given.
fn two_ledges(second: &str) -> String {
    edit("front: {width: 30, height: 30}", "front: {width: 30, height: 35}")
        .replace("pads: {side: bottom, pitch: 1.8}", &format!("pads: {{side: bottom, pitch: 1.8, first_pin: 3, {second}}}"))
}

/// `second_row: {}` takes the opposite side and the first row's sizes, numbers its pins
/// on from the first row's (in the route stage), and moves the fill port's default off
/// both pad sides (docs/layout-format.md, `pads`).
#[test]
fn second_pad_row_takes_the_opposite_side_and_the_first_rows_sizes() {
    let l = parse(&two_ledges("second_row: {}")).unwrap();
    let s = l.pads.second_row.as_deref().expect("a second row");
    assert_eq!(s.side, Side::Top);
    assert_eq!((s.pitch, s.width, s.length, s.edge_margin), (l.pads.pitch, l.pads.width, l.pads.length, l.pads.edge_margin));
    assert!(s.pins_follow && !l.pads.pins_follow);
    assert_eq!(l.seal.port_side, Side::Left);
    assert_eq!(l.pads.rows().count(), 2);
    // Its own pitch gives its own default width; its own first pin is kept.
    let own = parse(&two_ledges("second_row: {pitch: 1.0, first_pin: 40}")).unwrap();
    let s = own.pads.second_row.as_deref().unwrap();
    assert!(close(s.width, 0.6) && s.first_pin == 40 && !s.pins_follow);
}

/// A second row on any side but the opposite one, with fixed pins or a row of its own,
/// or without a ledge on its side, is refused at its key.
#[test]
fn second_pad_row_mistakes_are_refused_at_their_keys() {
    let keys = |text: &str| problems(text).into_iter().map(|p| p.key).collect::<Vec<_>>();
    assert_eq!(keys(&two_ledges("second_row: {side: left}")), ["pads.second_row.side"]);
    assert_eq!(keys(&two_ledges("second_row: {fixed: {COM1: 1}}")), ["pads.second_row.fixed"]);
    assert_eq!(keys(&two_ledges("second_row: {second_row: {}}")), ["pads.second_row.second_row"]);
    let no_ledge = MINIMAL.replace("pads: {side: bottom, pitch: 1.8}", "pads: {side: bottom, pitch: 1.8, second_row: {}}");
    let v = problems(&no_ledge);
    assert_eq!(v.len(), 1, "{v:?}");
    assert_eq!(v[0].key, "pads.second_row.side");
    assert!(v[0].message.contains("on the top side"), "{}", v[0].message);
    assert_eq!(keys(&two_ledges("second_row: {start: 500}")), ["pads.second_row.start"]);
    let port = two_ledges("second_row: {}").replace("name: minimal", "name: minimal\nseal: {fill_port: {side: top}}");
    assert_eq!(keys(&port), ["seal.fill_port.side"]);
}
