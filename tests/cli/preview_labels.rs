//! The preview overlays both plates, and each plate's name label stands above its own
//! glass at the same inset (src/plate/mod.rs): where the two glasses share their top
//! edge the labels would print over each other. In every demo's preview no two labels
//! share a line: two `<text>` labels at the same x lie at least one font size apart in y.

use crate::demo_build::{build_demo, demo_names};

/// (x, y, font size, text) of each plate label in a preview SVG: the `<text>` elements
/// whose text ends in ` FRONT` or ` BACK`.
fn plate_labels(svg: &str) -> Vec<(f64, f64, f64, String)> {
    let attr = |tag: &str, k: &str| -> f64 { tag.split(&format!(" {k}=\"")).nth(1).unwrap().split('"').next().unwrap().parse().unwrap() };
    svg.split("<text")
        .skip(1)
        .filter_map(|t| {
            let (tag, rest) = t.split_once('>')?;
            let text = rest.split("</text>").next()?.trim().to_string();
            (text.ends_with(" FRONT") || text.ends_with(" BACK")).then(|| (attr(tag, "x"), attr(tag, "y"), attr(tag, "font-size"), text))
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
        assert!((a.0 - b.0).abs() > 1e-9 || (a.1 - b.1).abs() >= a.2.max(b.2), "{name}: {a:?} and {b:?} print over each other");
    }
    assert!(shared_top > 0, "no demo puts both labels at one x: the test would not see an overlap");
}
