//! Stage tests of `assign` on hand-made layouts.

use super::*;
use crate::glyph::build_elements;
use crate::glyph::testkit::{empty_layout, seven_group};
use crate::layout::{Drive, FixedLine, Icon, IconShape};
use std::collections::BTreeSet;

fn layout(digits: u32, commons: u32, dps: Vec<u32>) -> Layout {
    let mut l = empty_layout();
    let mut g = seven_group(digits, 0.0);
    g.decimal_points = dps;
    l.digits.push(g);
    l.drive = Drive { commons, bias: Some(3) };
    l
}

fn icon(l: &mut Layout, name: &str, x: f64, y: f64) {
    let i = l.icons.len();
    l.icons.push(Icon { name: name.into(), shape: IconShape::Circle { centre: crate::geom::pt(x, y), radius: 0.6 }, key: format!("icons[{i}]") });
}

/// Every (COM, SEG) pair is used by one element at most, and the commons are in range.
fn assert_pairs_once(a: &Assignment, n: u32) {
    let mut seen = BTreeSet::new();
    for (c, l) in a.com.iter().zip(&a.line) {
        assert!(*c < n);
        assert!(*l < a.lines);
        assert!(seen.insert((*c, *l)), "pair (COM{}, SEG{}) used twice", c + 1, l + 1);
    }
}

/// Pin count N + ⌈S/N⌉ (docs/background.md, *Drive and pin count*): four
/// digits with decimal points at 1/4 duty need 8 SEG lines (32 elements); at 1/2 duty 16.
#[test]
fn seven_segment_digits_take_the_fewest_lines() {
    for (n, want) in [(4, 8), (2, 16)] {
        let l = layout(4, n, vec![1, 2, 3, 4]);
        let e = build_elements(&l).unwrap();
        let a = assign(&l, &e).unwrap();
        assert_eq!(a.lines, want, "1/{n}");
        assert_eq!(a.lines, (e.len() as u32).div_ceil(n));
        assert_pairs_once(&a, n);
    }
}

/// At 1/3 duty a digit with its point takes three lines with one place free; icons fill
/// the free places, so four digits and four icons (36 elements) need exactly 12 lines.
#[test]
fn icons_fill_the_places_digits_leave_free() {
    let mut l = layout(4, 3, vec![1, 2, 3, 4]);
    for k in 0..4 {
        icon(&mut l, &format!("I{k}"), 10.0 + 9.0 * k as f64, 33.0);
    }
    let e = build_elements(&l).unwrap();
    let a = assign(&l, &e).unwrap();
    assert_eq!(e.len(), 36);
    assert_eq!(a.lines, 12);
    assert_pairs_once(&a, 3);
    // Each icon shares a line with segments of the digit below it.
    for k in 0..4 {
        let i = e.iter().position(|x| x.name == format!("I{k}")).unwrap();
        let digit = format!("D{}", k + 1);
        assert!(a.on_line(a.line[i]).any(|j| e[j].digit.as_deref() == Some(digit.as_str())), "I{k}");
    }
}

/// The 1/4 template puts the top bar on COM1 and the bottom bar on COM4, and keeps one
/// passage per digit free for the back plate.
#[test]
fn commons_run_from_the_top_down() {
    let l = layout(2, 4, vec![]);
    let e = build_elements(&l).unwrap();
    let a = assign(&l, &e).unwrap();
    let com_of = |name: &str| a.com[e.iter().position(|x| x.name == name).unwrap()];
    assert_eq!(com_of("D1.a"), 0);
    assert_eq!(com_of("D1.d"), 3);
    assert_eq!(com_of("D2.g"), 1);
    assert_eq!(a.passages.len(), 2);
    // Lines are numbered from the left: digit 1's lines come first.
    assert!(a.line[e.iter().position(|x| x.name == "D1.f").unwrap()] < 2);
}

/// Choices fixed by hand are kept; the rest is assigned around them.
#[test]
fn fixed_choices_are_kept() {
    let mut l = layout(2, 4, vec![1, 2]);
    l.fixed_lines.insert("D2.a".into(), FixedLine { com: Some(3), seg: Some(1) });
    l.fixed_lines.insert("D1.g".into(), FixedLine { com: Some(4), seg: None });
    let e = build_elements(&l).unwrap();
    let a = assign(&l, &e).unwrap();
    let at = |name: &str| e.iter().position(|x| x.name == name).unwrap();
    assert_eq!((a.com[at("D2.a")], a.line[at("D2.a")]), (2, 0));
    assert_eq!(a.com[at("D1.g")], 3);
    assert_pairs_once(&a, 4);
}

/// A SEG number beyond the lines the layout makes is an input problem at `drive.fixed`.
#[test]
fn a_seg_number_out_of_range_is_reported() {
    let mut l = layout(1, 4, vec![]);
    l.fixed_lines.insert("D1.a".into(), FixedLine { com: Some(1), seg: Some(9) });
    let e = build_elements(&l).unwrap();
    match assign(&l, &e) {
        Err(crate::Error::Input(p)) => {
            assert_eq!(p[0].key, "drive.fixed");
            assert!(p[0].message.contains("SEG9"), "{}", p[0].message);
        }
        other => panic!("expected an input problem, got {other:?}"),
    }
}

/// Static drive: every element its own line on COM1.
#[test]
fn static_drive_is_one_line_per_element() {
    let l = layout(2, 1, vec![]);
    let e = build_elements(&l).unwrap();
    let a = assign(&l, &e).unwrap();
    assert_eq!(a.lines, 14);
    assert!(a.com.iter().all(|c| *c == 0));
    assert_pairs_once(&a, 1);
}

/// The steps of a bar graph and the parts of a gauge each keep to one common, every one
/// on its own line; a step fixed by hand on a common takes the rest of its bar with it.
/// Before this rule, neighbouring steps took neighbouring commons and the commons
/// interleaved along the row, which no back-plate routing can join without crossing.
#[test]
fn bar_steps_and_gauge_parts_keep_one_common() {
    use crate::layout::{BarGraph, BarPath, StepShape, StepSide};
    let mut l = layout(2, 4, vec![]);
    l.bars.push(BarGraph {
        name: "LVL".into(),
        count: 7,
        path: BarPath::Line { from: crate::geom::pt(8.0, 9.0), angle: 0.0, thickness: 1.0 },
        shape: StepShape::Rectangle,
        side: StepSide::Left,
        length: 1.5,
        last_length: 1.5,
        gap: 0.3,
        key: "bars[0]".into(),
    });
    let parts = ["1", "2", "3", "4"]
        .iter()
        .map(|s| crate::layout::GaugePart { suffix: s.to_string(), icon: format!("signal-bar-{s}") })
        .collect();
    let at = crate::geom::pt(40.0, 28.0);
    let shape = IconShape::Gauge { gauge: "signal".into(), parts, at, size: 4.0, stroke: 0.3 };
    l.icons.push(Icon { name: "RF".into(), shape, key: "icons[0]".into() });
    l.fixed_lines.insert("LVL.4".into(), FixedLine { com: Some(2), seg: None });
    let e = build_elements(&l).unwrap();
    let a = assign(&l, &e).unwrap();
    assert_pairs_once(&a, 4);
    for (prefix, want) in [("LVL.", Some(1)), ("RF.", None)] {
        let members: Vec<usize> = (0..e.len()).filter(|&i| e[i].name.starts_with(prefix)).collect();
        let coms: BTreeSet<u32> = members.iter().map(|&i| a.com[i]).collect();
        let lines: BTreeSet<u32> = members.iter().map(|&i| a.line[i]).collect();
        assert_eq!(coms.len(), 1, "{prefix}: {coms:?}");
        assert_eq!(lines.len(), members.len(), "{prefix}: two members on one line");
        if let Some(c) = want {
            assert_eq!(coms.first(), Some(&c), "LVL.4 is fixed on COM2");
        }
    }
}

/// Fourteen-segment digits at 1/3 duty: eight lines a digit on COM1 and COM3 only; an
/// icon beside them opens a line of its own rather than take a free COM2 place on a
/// digit's line (those places are shut in by the digit), on COM2, the common the digits
/// leave free (its height alone would give COM3); the router is told to lead the
/// lines of `g2`, `f`, `h`, `i` and `j` first, each kind for every digit before the next.
#[test]
fn fourteen_segment_digits_keep_to_the_outer_commons_and_their_own_lines() {
    let mut l = layout(2, 3, vec![]);
    l.digits[0].style = DigitStyle::Fourteen;
    l.digits[0].gap = 0.6;
    icon(&mut l, "I0", 30.0, 17.0);
    let e = build_elements(&l).unwrap();
    let a = assign(&l, &e).unwrap();
    assert_pairs_once(&a, 3);
    assert_eq!(a.lines, 2 * 8 + 1);
    let icon_at = e.iter().position(|x| x.name == "I0").unwrap();
    assert!((0..e.len()).all(|i| i == icon_at || a.line[i] != a.line[icon_at]), "the icon shares a digit's line");
    assert_eq!(a.com[icon_at], 1, "the icon takes the common the digits leave free");
    for (i, x) in e.iter().enumerate().filter(|(i, _)| *i != icon_at) {
        assert!(a.com[i] == 0 || a.com[i] == 2, "{} on COM{}", x.name, a.com[i] + 1);
    }
    let line_of = |name: &str| a.line[e.iter().position(|x| x.name == name).unwrap()];
    let want: Vec<u32> = ["g2", "f", "h", "i", "j"].iter().flat_map(|s| [line_of(&format!("D1.{s}")), line_of(&format!("D2.{s}"))]).collect();
    assert_eq!(a.route_first, want);
}
