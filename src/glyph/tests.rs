//! Stage tests of `build_elements` on hand-made layouts.

use super::testkit::{empty_layout, seven_group};
use super::*;
use crate::geom::{area, pt, union_all};
use crate::layout::{Align, DigitStyle, FontSource, Icon, IconShape, Legend};
use geo::{Centroid, Contains, Validation, Winding};

fn elements(l: &Layout) -> Vec<Element> {
    build_elements(l).unwrap()
}

fn problems(l: &Layout) -> Vec<crate::error::InputProblem> {
    match build_elements(l) {
        Err(Error::Input(p)) => p,
        other => panic!("expected input problems, got {other:?}"),
    }
}

/// Every outline and body: valid (OGC simple features, via geo), exteriors CCW, holes
/// CW, every coordinate on the 1 nm grid.
fn assert_clean(e: &Element) {
    for r in [&e.outline, &e.body] {
        assert!(r.is_valid(), "{}: {:?}", e.name, r.validation_errors());
        for p in &r.0 {
            assert!(p.exterior().is_ccw(), "{}", e.name);
            assert!(p.interiors().iter().all(|h| h.is_cw()), "{}", e.name);
            for c in p.exterior().0.iter().chain(p.interiors().iter().flat_map(|h| h.0.iter())) {
                for v in [c.x, c.y] {
                    assert!((v * 1e6 - (v * 1e6).round()).abs() < 1e-6, "{}: {v} off grid", e.name);
                }
            }
        }
    }
}

#[test]
fn seven_segment_group_names_and_order() {
    let mut l = empty_layout();
    let mut g = seven_group(3, 8.0);
    g.decimal_points = vec![2];
    g.colons = vec![1];
    g.half_digits = vec![1];
    l.digits.push(g);
    let e = elements(&l);
    let names: Vec<&str> = e.iter().map(|e| e.name.as_str()).collect();
    assert_eq!(
        names,
        [
            "D1.b", "D1.c", "D1.col", "D2.a", "D2.b", "D2.c", "D2.d", "D2.e", "D2.f", "D2.g", "D2.dp", "D3.a", "D3.b",
            "D3.c", "D3.d", "D3.e", "D3.f", "D3.g"
        ]
    );
    let a = &e[3];
    assert_eq!(a.drives, "digit 2 segment a");
    assert_eq!(a.digit.as_deref(), Some("D2"));
    assert_eq!(a.key, "digits[0]");
    assert_eq!(a.kind, ElementKind::Segment);
    let col = &e[2];
    assert_eq!(col.outline.0.len(), 2, "a colon is one element of two pieces");
    assert_eq!(col.body, col.outline);
    for x in &e {
        assert_clean(x);
    }
}

/// Under multiplexed drive the colon is two elements, its upper dot first, each one piece
/// (so each dot can take the common of its own height); the static colon above is one.
#[test]
fn multiplexed_colon_is_two_dots_upper_first() {
    let mut l = empty_layout();
    l.drive.commons = 4;
    let mut g = seven_group(2, 8.0);
    g.colons = vec![1];
    l.digits.push(g);
    let e = elements(&l);
    let dots: Vec<&Element> = e.iter().filter(|x| x.name.starts_with("D1.col")).collect();
    let names: Vec<&str> = dots.iter().map(|x| x.name.as_str()).collect();
    assert_eq!(names, ["D1.col_top", "D1.col_bottom"]);
    assert!(dots.iter().all(|d| d.outline.0.len() == 1));
    let y = |d: &Element| d.outline.centroid().unwrap().y();
    assert!(y(dots[0]) > y(dots[1]) + 1.0, "the upper dot is named first");
    assert_eq!(dots[0].drives, "upper dot of the colon after digit 1");
}

/// The segments lit for '1' by the truth table (common practice; docs/background.md,
/// *Seven-segment patterns*) are
/// exactly those on the right of the built digit, for '7' those plus the top bar, for
/// '-' only the middle bar: checked on the segment centroids of a slanted digit, in the
/// upright frame.
#[test]
fn truth_table_matches_geometry() {
    let mut l = empty_layout();
    let g = seven_group(1, 8.0);
    let (ox, oy, w, h, tan) = (g.origin.x, g.origin.y, g.width, g.height, g.slant.to_radians().tan());
    l.digits.push(g);
    let e = elements(&l);
    let pos = |x: &Element| {
        let c = x.outline.centroid().unwrap();
        let y = c.y() - oy;
        ((c.x() - ox - y * tan) / w, y / h)
    };
    let set = |pred: &dyn Fn(f64, f64) -> bool| -> Vec<&str> {
        let mut v: Vec<&str> = e
            .iter()
            .filter(|x| {
                let (u, v) = pos(x);
                pred(u, v)
            })
            .map(|x| &x.name[3..])
            .collect();
        v.sort();
        v
    };
    let right = set(&|u, _| u > 0.75);
    let top = set(&|_, v| v > 0.9);
    let middle = set(&|u, v| (v - 0.5).abs() < 0.1 && (u - 0.5).abs() < 0.2);
    assert_eq!(seven_segment_pattern('1').unwrap(), right.as_slice());
    let mut seven = [right.clone(), top].concat();
    seven.sort();
    assert_eq!(seven_segment_pattern('7').unwrap(), seven.as_slice());
    assert_eq!(seven_segment_pattern('-').unwrap(), middle.as_slice());
}

/// Bodies (gap 0) of one digit unite to one polygon — gap-free — that contains every
/// outline (backplanes are grown from the gap-free digit: docs/crate-notes.md,
/// *Backplanes from gap-free shapes*).
#[test]
fn bodies_tile_the_digit() {
    for style in [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen] {
        for slant in [0.0, 8.0] {
            let mut l = empty_layout();
            let mut g = seven_group(1, slant);
            g.style = style;
            g.width = 7.0;
            l.digits.push(g);
            let e = elements(&l);
            let bodies = union_all(e.iter().flat_map(|x| x.body.0.iter().cloned()));
            assert_eq!(bodies.0.len(), 1, "{style:?} {slant}°: {} pieces", bodies.0.len());
            let body_area: f64 = e.iter().map(|x| area(&x.body)).sum();
            assert!((area(&bodies) - body_area).abs() < 1e-6, "bodies overlap");
            for x in &e {
                assert_clean(x);
                // Outlines share their long edges with the bodies; snapping both to the
                // 1 nm grid moves slanted edges by up to 0.71 nm, so compare with the
                // bodies grown by 10 nm.
                let grown = crate::geom::offset_mitre(&bodies, 1e-5);
                assert!(grown.contains(&x.outline), "{style:?} {slant}°: {} not inside", x.name);
                assert!(area(&x.outline) < area(&x.body), "{}", x.name);
                assert!(area(&crate::geom::difference(&x.outline, &x.body)) < 1e-5, "{}", x.name);
            }
        }
    }
}

#[test]
fn half_digit_is_b_and_c_only() {
    let mut l = empty_layout();
    let mut g = seven_group(2, 0.0);
    g.half_digits = vec![1];
    l.digits.push(g);
    let e = elements(&l);
    let d1: Vec<&str> = e.iter().filter(|x| x.digit.as_deref() == Some("D1")).map(|x| x.name.as_str()).collect();
    assert_eq!(d1, ["D1.b", "D1.c"]);
    let bodies = union_all(e[..2].iter().flat_map(|x| x.body.0.iter().cloned()));
    assert_eq!(bodies.0.len(), 1);
}

#[test]
fn dots_keep_the_gap_or_the_pitch_is_reported() {
    let mut l = empty_layout();
    let mut g = seven_group(2, 8.0);
    g.decimal_points = vec![1];
    g.colons = vec![1];
    l.digits.push(g.clone());
    let e = elements(&l);
    let dp = e.iter().find(|x| x.name == "D1.dp").unwrap();
    let col = e.iter().find(|x| x.name == "D1.col").unwrap();
    for other in e.iter().filter(|x| x.name != dp.name && x.name != col.name) {
        for dot in [dp, col] {
            for p in &dot.outline.0 {
                for q in &other.outline.0 {
                    assert!(crate::geom::distance(p, q) >= g.gap - 2e-6, "{} – {}", dot.name, other.name);
                }
            }
        }
    }
    // Digits nearly touching: no room for the dots; the point's message asks for pitch.
    l.digits[0].pitch = 6.6;
    let p = problems(&l);
    let dp = p.iter().find(|p| p.key == "digits[0].decimal_points").unwrap_or_else(|| panic!("{p:?}"));
    assert!(dp.allowed.as_deref().is_some_and(|a| a.contains("a larger pitch")), "{dp:?}");
    assert!(p.iter().any(|p| p.key == "digits[0].colons"), "{p:?}");
    // A gap wider than the point stands from its own digit (0.75 stroke: 0.75 mm): the
    // message asks for the stroke that keeps the gap, gap / 0.75.
    l.digits[0].pitch = 9.0;
    l.digits[0].colons.clear();
    l.digits[0].gap = 0.9;
    let p = problems(&l);
    let dp = p.iter().find(|p| p.key == "digits[0].decimal_points").unwrap_or_else(|| panic!("{p:?}"));
    assert!(dp.allowed.as_deref().is_some_and(|a| a.contains("a thicker stroke") && a.contains("at least 1.200 mm")), "{dp:?}");
}

fn legend(text: &str) -> Legend {
    Legend {
        name: "UNIT".into(),
        text: text.into(),
        at: pt(30.0, 5.0),
        height: 3.0,
        stroke: 0.3,
        align: Align::Centre,
        key: "legends[0]".into(),
    }
}

#[test]
fn legend_is_one_element() {
    let mut l = empty_layout();
    l.legends.push(legend("°C"));
    let e = elements(&l);
    assert_eq!(e.len(), 1);
    assert_eq!(e[0].name, "UNIT");
    assert_eq!(e[0].kind, ElementKind::Legend);
    assert_eq!(e[0].digit, None);
    assert_eq!(e[0].drives, "legend \"°C\"");
    assert_eq!(e[0].body, e[0].outline);
    assert_clean(&e[0]);
}

#[test]
fn unknown_character_names_it_and_lists_the_font() {
    let mut l = empty_layout();
    l.key_lines.insert("legends[0].text".into(), 17);
    l.legends.push(legend("5 €"));
    let p = problems(&l);
    assert_eq!(p.len(), 1);
    assert_eq!(p[0].key, "legends[0].text");
    assert_eq!(p[0].line, Some(17));
    assert!(p[0].message.contains("'€' (U+20AC)"), "{}", p[0].message);
    let allowed = p[0].allowed.as_deref().unwrap();
    assert!(allowed.contains("A") && allowed.contains("µ") && allowed.contains("space"), "{allowed}");
}

#[test]
fn icons_of_every_kind() {
    let mut l = empty_layout();
    let shapes = [
        IconShape::Named { icon: "battery".into(), at: pt(5.0, 30.0), size: 6.0, stroke: 0.3 },
        IconShape::Rectangle { at: pt(15.0, 30.0), width: 4.0, height: 2.0, corner: 0.5 },
        IconShape::Circle { centre: pt(25.0, 31.0), radius: 1.0 },
        IconShape::Ring { centre: pt(30.0, 31.0), outer: 1.0, inner: 0.6 },
        IconShape::Polygon { points: vec![pt(35.0, 30.0), pt(38.0, 30.0), pt(36.5, 33.0)] },
        IconShape::Path { d: "M 0 0 A 1 1 0 0 1 2 0 Z".into(), at: pt(42.0, 32.0) },
    ];
    for (i, s) in shapes.into_iter().enumerate() {
        l.icons.push(Icon { name: format!("I{i}"), shape: s, key: format!("icons[{i}]") });
    }
    let e = elements(&l);
    assert_eq!(e.len(), 6);
    let drives: Vec<&str> = e.iter().map(|x| x.drives.as_str()).collect();
    assert_eq!(drives, ["icon battery", "rectangle icon", "circle icon", "ring icon", "polygon icon", "path icon"]);
    for x in &e {
        assert_eq!(x.kind, ElementKind::Icon);
        assert_clean(x);
    }
}

#[test]
fn unknown_icon_lists_the_names() {
    let mut l = empty_layout();
    let shape = IconShape::Named { icon: "kettle".into(), at: pt(5.0, 30.0), size: 6.0, stroke: 0.3 };
    l.icons.push(Icon { name: "K".into(), shape, key: "icons[0]".into() });
    l.legends.push(legend("€"));
    let p = problems(&l);
    assert_eq!(p.len(), 2, "all problems are reported together");
    let icon = p.iter().find(|p| p.key == "icons[0].icon").unwrap();
    assert!(icon.message.contains("kettle"));
    assert!(icon.allowed.as_deref().unwrap().contains("thermometer"));
}

#[test]
fn layout_fonts_add_icons_and_report_their_lines() {
    let mut l = empty_layout();
    l.extra_fonts.push(FontSource {
        path: "mine.strokes".into(),
        text: "strokes 1\nicon flag 10\n  line 0 0 0 10 8 8 0 6\n".into(),
    });
    let shape = IconShape::Named { icon: "flag".into(), at: pt(5.0, 30.0), size: 6.0, stroke: 0.3 };
    l.icons.push(Icon { name: "F".into(), shape, key: "icons[0]".into() });
    assert_eq!(elements(&l)[0].drives, "icon flag");
    l.extra_fonts[0].text.push_str("  curve 1 2\n");
    let p = problems(&l);
    assert_eq!(p[0].file, std::path::PathBuf::from("mine.strokes"));
    assert_eq!(p[0].line, Some(4));
}

#[test]
fn bad_stroke_is_an_input_problem() {
    let mut l = empty_layout();
    let mut g = seven_group(1, 0.0);
    g.stroke = 4.0;
    l.digits.push(g);
    let p = problems(&l);
    assert_eq!(p[0].key, "digits[0].stroke");
    l.digits[0].stroke = 1.0;
    l.digits[0].decimal_points = vec![2];
    let p = problems(&l);
    assert_eq!(p[0].key, "digits[0].decimal_points");
    assert!(p[0].message.contains("no digit 2"));
}

/// The brief's gap check on the finished (snapped) outlines of whole digits: neighbours
/// exactly `gap` apart, no pair closer. Snapping moves each vertex by at most √2/2 nm, so
/// a distance can move by at most √2 nm; the observed spread is printed.
#[test]
fn snapped_outlines_keep_the_gap() {
    for slant in [0.0, 8.0] {
        let mut l = empty_layout();
        l.digits.push(seven_group(1, slant));
        let gap = l.digits[0].gap;
        let e = elements(&l);
        let neighbours = ["ab", "af", "bc", "bg", "cd", "cg", "de", "ef", "eg", "fg"];
        let mut worst: f64 = 0.0;
        for x in &e {
            for y in &e {
                let pair: String = [&x.name[3..], &y.name[3..]].concat();
                if x.name >= y.name {
                    continue;
                }
                let d = crate::geom::distance(&x.outline.0[0], &y.outline.0[0]);
                assert!(d >= gap - 1.5e-6, "{slant}°: {pair} at {d}");
                if neighbours.contains(&pair.as_str()) {
                    worst = worst.max((d - gap).abs());
                    assert!((d - gap).abs() < 1.5e-6, "{slant}°: {pair} at {d}");
                }
            }
        }
        println!("slant {slant}: worst |d − gap| = {worst:e}");
    }
}
