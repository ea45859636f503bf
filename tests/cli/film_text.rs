//! Nothing on a film overprints anything else: on every demo's films, the negative-resist
//! fixture's, the coupons panel's, and a coupon's with a name far longer than its 24 mm
//! glass, the boxes of the plate label, the title,
//! the notes, the rulers, the calibration square and each corner mark line, read back
//! from the SVG, neither overlap one another nor reach onto the glass or off the page.
//!
//! Each `<path>` of the SVG is one thing drawn (docs/outputs.md, *Films*); its box is its
//! points' box grown by half its stroke width (SVG 1.1, 11.4: a stroke is centred on the
//! path). The path of the corner marks (the 0.15 mm stroke) is split into its lines, one
//! per `M`, since together they surround the glass. The etched layers (the one fill that
//! meets the glass: ITO, or a dark field with the ITO cut out) are the mask itself and
//! are left out. The glass is where docs/outputs.md (*Page layout*) puts it: centred
//! across the page, its top 16 mm below the page top.

use crate::demo_build::{build_demo, build_layout, demos_and_negative};

/// A box (x0, y0, x1, y1) on the page, mm, y down.
type Bbox = (f64, f64, f64, f64);

/// Boxes that merely touch do not overlap: a tenth of a micrometre of slack for the
/// six-decimal numbers of the SVG.
const SLACK: f64 = 1e-4;

fn overlap(a: Bbox, b: Bbox) -> bool {
    a.0 < b.2 - SLACK && b.0 < a.2 - SLACK && a.1 < b.3 - SLACK && b.1 < a.3 - SLACK
}

fn attr<'a>(tag: &'a str, key: &str) -> Option<&'a str> {
    tag.split(&format!(" {key}=\"")).nth(1).map(|r| r.split('"').next().unwrap())
}

/// The points of each subpath of path data made of `M`, `L`, `Z` and coordinate pairs.
fn subpaths(d: &str) -> Vec<Vec<(f64, f64)>> {
    let mut out: Vec<Vec<f64>> = Vec::new();
    let mut num = String::new();
    let flush = |num: &mut String, out: &mut Vec<Vec<f64>>| {
        if !num.is_empty() {
            out.last_mut().expect("path data starts with M").push(num.parse().unwrap());
            num.clear();
        }
    };
    for c in d.chars() {
        match c {
            'M' => {
                flush(&mut num, &mut out);
                out.push(Vec::new());
            }
            'L' | 'Z' | ' ' | ',' => flush(&mut num, &mut out),
            _ => num.push(c),
        }
    }
    flush(&mut num, &mut out);
    out.into_iter().map(|v| v.chunks(2).map(|p| (p[0], p[1])).collect()).collect()
}

fn bbox(points: impl IntoIterator<Item = (f64, f64)>, grow: f64) -> Bbox {
    let b = points.into_iter().fold((f64::MAX, f64::MAX, f64::MIN, f64::MIN), |b, (x, y)| (b.0.min(x), b.1.min(y), b.2.max(x), b.3.max(y)));
    (b.0 - grow, b.1 - grow, b.2 + grow, b.3 + grow)
}

/// The things drawn on a film as (what, box), the etched layers left out.
fn drawn(svg: &str, glass: Bbox) -> Vec<(String, Bbox)> {
    let mut out = Vec::new();
    for (i, tag) in svg.split("<path").skip(1).enumerate() {
        let tag = tag.split("/>").next().unwrap();
        let d = attr(tag, "d").unwrap();
        let half = attr(tag, "stroke-width").map(|w| w.parse::<f64>().unwrap() / 2.0).unwrap_or(0.0);
        let parts = subpaths(d);
        let whole = bbox(parts.iter().flatten().copied(), half);
        if attr(tag, "fill") != Some("none") && overlap(whole, glass) {
            continue; // the etched layers
        }
        // Corner marks: short axis-parallel strokes 0.15 mm wide, each checked on its own
        // (they sit in pairs near the glass corners). Stroke text whose height gives the
        // same width is one item, like any other label: its letters' strokes touch.
        let axis_parallel = |p: &Vec<(f64, f64)>| p.len() == 2 && ((p[0].0 - p[1].0).abs() < 1e-9 || (p[0].1 - p[1].1).abs() < 1e-9);
        if attr(tag, "stroke-width") == Some("0.15") && parts.iter().all(axis_parallel) {
            out.extend(parts.into_iter().enumerate().map(|(j, p)| (format!("corner mark line {j}"), bbox(p, half))));
        } else {
            out.push((format!("path {i}"), whole));
        }
    }
    out
}

/// Checks one film; gives the number of things checked.
fn check_film(svg: &str, glass_size: (f64, f64), what: &str) -> usize {
    let get = |k: &str| attr(svg, k).unwrap().trim_end_matches("mm").parse::<f64>().unwrap();
    let (w, h) = (get("width"), get("height"));
    let gx = (w - glass_size.0) / 2.0;
    let glass = (gx, 16.0, gx + glass_size.0, 16.0 + glass_size.1);
    let items = drawn(svg, glass);
    for (i, (a, ba)) in items.iter().enumerate() {
        assert!(!overlap(*ba, glass), "{what}: {a} {ba:?} reaches onto the glass {glass:?}");
        assert!(ba.0 >= 0.0 && ba.1 >= 0.0 && ba.2 <= w && ba.3 <= h, "{what}: {a} {ba:?} runs off the {w} × {h} mm page");
        for (b, bb) in &items[i + 1..] {
            assert!(!overlap(*ba, *bb), "{what}: {a} {ba:?} overprints {b} {bb:?}");
        }
    }
    items.len()
}

fn glass_size(layout: &std::path::Path, plate: &str) -> (f64, f64) {
    let y: serde_yaml::Value = serde_yaml::from_str(&std::fs::read_to_string(layout).unwrap()).unwrap();
    (y["glass"][plate]["width"].as_f64().unwrap(), y["glass"][plate]["height"].as_f64().unwrap())
}

#[test]
fn film_labels_marks_rulers_and_notes_never_overprint() {
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
    let layouts = demos_and_negative();
    for (name, layout) in &layouts {
        let (_dir, out) = build_layout(layout, name);
        for plate in ["front", "back"] {
            let svg = std::fs::read_to_string(out.join(format!("{name}.{plate}.svg"))).unwrap();
            // Title (2 lines), label, 2 rulers of ticks and numbers, 4 note lines, the
            // square and its 2 lines: 14 paths; and 8 corner mark lines (two a corner).
            let n = check_film(&svg, glass_size(layout, plate), &format!("{name} {plate} film"));
            assert!(n >= 22, "{name} {plate}: only {n} things found on the film");
        }
    }
    // The panel films: the substrate takes the glass's place (docs/outputs.md, *Panels*),
    // and the cut-line ticks are drawn like the corner marks.
    let (_dir, out) = build_demo("coupons");
    let y: serde_yaml::Value = serde_yaml::from_str(&std::fs::read_to_string(root.join("demo-layouts/coupons.yaml")).unwrap()).unwrap();
    let substrate = (y["panel"]["substrate"]["width"].as_f64().unwrap(), y["panel"]["substrate"]["height"].as_f64().unwrap());
    for plate in ["front", "back"] {
        let svg = std::fs::read_to_string(out.join(format!("coupons.panel.{plate}.svg"))).unwrap();
        check_film(&svg, substrate, &format!("coupons panel {plate} film"));
    }
    // A name of 40 characters: its label (about 68 mm at 1.5 mm) is far wider than the
    // 24 mm glass, so a label beside the corner marks would run into them.
    let dir = tempfile::tempdir().unwrap();
    let long = "coupons-with-a-name-far-wider-than-glass";
    let text = std::fs::read_to_string(root.join("demo-layouts/coupons.yaml")).unwrap().replace("name: coupons", &format!("name: {long}"));
    let layout = dir.path().join("long.yaml");
    std::fs::write(&layout, text).unwrap();
    let (_d, out) = build_layout(&layout, long);
    for plate in ["front", "back"] {
        let svg = std::fs::read_to_string(out.join(format!("{long}.{plate}.svg"))).unwrap();
        check_film(&svg, glass_size(&layout, plate), &format!("{long} {plate} film"));
    }
}
