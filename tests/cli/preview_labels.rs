//! The preview overlays both plates, and each plate's name label stands above its own
//! glass at the same inset (src/plate/mod.rs): where the two glasses share their top
//! edge the labels would print over each other. In every demo's preview no two labels
//! share a line: two `<text>` labels at the same x lie at least one font size apart in y;
//! and no finding's rule code prints over a plate label.

use crate::demo_build::{build_demo, demo_names};

/// (x, y, font size, text) of each plate label in a preview SVG: the `<text>` elements
/// whose text ends in ` FRONT` or ` BACK`.
pub fn plate_labels(svg: &str) -> Vec<(f64, f64, f64, String)> {
    texts(svg).into_iter().filter(|t| t.3.ends_with(" FRONT") || t.3.ends_with(" BACK")).collect()
}

/// (x, y, font size, text) of each `<text>` element in `svg`.
fn texts(svg: &str) -> Vec<(f64, f64, f64, String)> {
    let attr = |tag: &str, k: &str| -> f64 { tag.split(&format!(" {k}=\"")).nth(1).unwrap().split('"').next().unwrap().parse().unwrap() };
    svg.split("<text")
        .skip(1)
        .filter_map(|t| {
            let (tag, rest) = t.split_once('>')?;
            let text = rest.split("</text>").next()?.trim().to_string();
            Some((attr(tag, "x"), attr(tag, "y"), attr(tag, "font-size"), text))
        })
        .collect()
}

#[test]
fn plate_labels_never_print_over_each_other_in_a_preview() {
    let mut shared_top = 0;
    for name in demo_names() {
        let (_dir, out) = build_demo(&name);
        let svg = std::fs::read_to_string(out.join(format!("{name}.preview.svg"))).unwrap();
        let labels = plate_labels(&svg);
        assert_eq!(labels.len(), 2, "{name}: {labels:?}");
        let (a, b) = (&labels[0], &labels[1]);
        shared_top += usize::from((a.0 - b.0).abs() < 1e-9);
        assert!(!labels_meet(a, b), "{name}: {a:?} and {b:?} print over each other");
    }
    assert!(shared_top > 0, "no demo puts both labels at one x: the test would not see an overlap");
}

/// A plate label's (x, baseline y, height, text) box (x0, y0, x1, y1), estimated as
/// `finding_codes_never_print_over_plate_labels` below says: from its baseline up one
/// font size, 0.55 font sizes per character.
fn label_box(l: &(f64, f64, f64, String)) -> (f64, f64, f64, f64) {
    (l.0, l.1 - l.2, l.0 + 0.55 * l.2 * l.3.chars().count() as f64, l.1)
}

/// Whether two boxes (x0, y0, x1, y1) overlap.
fn boxes_meet(a: (f64, f64, f64, f64), b: (f64, f64, f64, f64)) -> bool {
    a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3
}

/// Whether two plate labels print over each other: their text boxes meet.
pub fn labels_meet(a: &(f64, f64, f64, String), b: &(f64, f64, f64, String)) -> bool {
    boxes_meet(label_box(a), label_box(b))
}

/// A finding's rule code, printed centred above its circle, never prints over a plate's
/// label in any demo's preview. Text boxes are estimated with an average advance of
/// 0.55 font sizes per character for a sans face (a typographer's rule of thumb, from
/// memory) and a height of one font size: a plate label from its baseline up, a code
/// centred on its point. The germination demo's pin-count note sits at the top left
/// corner of the glass, under the back plate's name: its code goes below the circle.
#[test]
fn finding_codes_never_print_over_plate_labels() {
    let mut moved_below = 0;
    for name in demo_names() {
        let (_dir, out) = build_demo(&name);
        let svg = std::fs::read_to_string(out.join(format!("{name}.preview.svg"))).unwrap();
        let plates: Vec<(f64, f64, f64, f64)> = plate_labels(&svg).iter().map(label_box).collect();
        let Some(group) = svg.split("<g id=\"findings\">").nth(1).map(|g| g.split("</g>").next().unwrap().to_string()) else { continue };
        let circles: Vec<(f64, f64)> = group
            .split("<circle")
            .skip(1)
            .map(|c| {
                let a = |k: &str| -> f64 { c.split(&format!(" {k}=\"")).nth(1).unwrap().split('"').next().unwrap().parse().unwrap() };
                (a("cx"), a("cy"))
            })
            .collect();
        let codes = texts(&group);
        assert_eq!(codes.len(), circles.len(), "{name}: one code per finding");
        for ((x, y, h, code), (_, cy)) in codes.iter().zip(&circles) {
            moved_below += usize::from(y > cy);
            let half = 0.55 * h * code.chars().count() as f64 / 2.0;
            let b = (x - half, y - h / 2.0, x + half, y + h / 2.0);
            for p in &plates {
                assert!(!boxes_meet(b, *p), "{name}: `{code}` at ({x:.2}, {y:.2}) prints over a plate label {p:?}");
            }
        }
    }
    assert!(moved_below > 0, "no demo puts a finding's code below its circle: the test would not see the overlap it guards against");
}
