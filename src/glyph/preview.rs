//! A review sheet, not a check: `cargo test --lib glyph::preview -- --ignored` writes
//! every glyph, icon and digit style to `target/glyph-preview.svg` and `.png` (rendered
//! by resvg) for people to look at.

use super::digit::{Cell, build_segments, colon, decimal_point};
use super::fonts::Fonts;
use super::icon::build_icon;
use super::legend::set_text;
use crate::geom::{Region, pt};
use crate::layout::{Align, DigitStyle, IconShape};
use std::fmt::Write;

fn path_d(r: &Region, h: f64) -> String {
    let mut d = String::new();
    for p in &r.0 {
        for ring in std::iter::once(p.exterior()).chain(p.interiors()) {
            for (i, c) in ring.0.iter().enumerate() {
                let _ = write!(d, "{}{:.4} {:.4} ", if i == 0 { "M" } else { "L" }, c.x, h - c.y);
            }
            d.push_str("Z ");
        }
    }
    d
}

#[test]
#[ignore = "writes a review picture; run by hand"]
fn write_preview() {
    let f = Fonts::builtin().unwrap();
    let (w, h) = (300.0, 200.0);
    let mut shapes: Vec<(Region, &str)> = Vec::new();
    let chars: Vec<char> = f.chars().collect();
    for (row, line) in chars.chunks(30).enumerate() {
        let text: String = line.iter().collect();
        let y = h - 12.0 - row as f64 * 9.0;
        shapes.push((set_text(f, &text, pt(5.0, y), 6.0, 0.5, Align::Left, 1e-3).unwrap(), "black"));
    }
    let s = set_text(f, "-12.5 °C  230 V~  4.7 kΩ  25 µA  75 %  1:30", pt(5.0, h - 50.0), 5.0, 0.45, Align::Left, 1e-3)
        .unwrap();
    shapes.push((s, "black"));
    for (i, name) in f.icon_names().into_iter().enumerate() {
        let at = pt(5.0 + (i % 16) as f64 * 18.0, h - 80.0 - (i / 16) as f64 * 18.0);
        let shape = IconShape::Named { icon: name.into(), at, size: 14.0, stroke: 0.8 };
        shapes.push((build_icon(f, &shape, 1e-3).unwrap(), "black"));
        shapes.push((crate::geom::region_of([crate::geom::rect(at.x, at.y - 2.0, at.x + 14.0, at.y - 1.9)]), "red"));
    }
    for (k, style) in [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen].into_iter().enumerate() {
        for (j, slant) in [0.0, 8.0].into_iter().enumerate() {
            let cell = Cell {
                origin: pt(5.0 + (k * 2 + j) as f64 * 45.0, 10.0),
                width: 18.0,
                height: 30.0,
                stroke: 2.5,
                slant,
            };
            let skel = f.style(style);
            let mut segs: Vec<_> = build_segments(skel, &cell, 0.4).unwrap().into_iter().map(|s| s.1).collect();
            segs.push(decimal_point(skel, &cell, 1e-3));
            segs.extend(colon(skel, &cell, 30.0, 1e-3));
            shapes.push((crate::geom::region_of(segs), "navy"));
        }
    }
    let mut svg = format!(
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{w}mm" height="{h}mm" viewBox="0 0 {w} {h}"><rect width="{w}" height="{h}" fill="white"/>"#
    );
    for (r, colour) in &shapes {
        let _ = write!(svg, r#"<path fill="{colour}" fill-rule="evenodd" d="{}"/>"#, path_d(r, h));
    }
    svg.push_str("</svg>");
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("target");
    std::fs::write(dir.join("glyph-preview.svg"), &svg).unwrap();
    render(&svg, 2.0, &dir.join("glyph-preview.png"));
    // The text rows alone, larger.
    let crop = svg.replacen(
        &format!(r#"width="{w}mm" height="{h}mm" viewBox="0 0 {w} {h}""#),
        r#"width="150mm" height="55mm" viewBox="0 0 150 55""#,
        1,
    );
    render(&crop, 3.0, &dir.join("glyph-preview-text.png"));
    let crop = svg.replacen(
        &format!(r#"width="{w}mm" height="{h}mm" viewBox="0 0 {w} {h}""#),
        r#"width="150mm" height="45mm" viewBox="0 155 150 45""#,
        1,
    );
    render(&crop, 3.0, &dir.join("glyph-preview-digits.png"));
    let crop = svg.replacen(
        &format!(r#"width="{w}mm" height="{h}mm" viewBox="0 0 {w} {h}""#),
        r#"width="150mm" height="45mm" viewBox="140 155 150 45""#,
        1,
    );
    render(&crop, 3.0, &dir.join("glyph-preview-digits-2.png"));
    let crop = svg.replacen(
        &format!(r#"width="{w}mm" height="{h}mm" viewBox="0 0 {w} {h}""#),
        r#"width="150mm" height="40mm" viewBox="0 60 150 40""#,
        1,
    );
    render(&crop, 3.0, &dir.join("glyph-preview-icons.png"));
}

fn render(svg: &str, scale: f32, to: &std::path::Path) {
    let tree = resvg::usvg::Tree::from_str(svg, &resvg::usvg::Options::default()).unwrap();
    let mut pix =
        resvg::tiny_skia::Pixmap::new((tree.size().width() * scale) as u32, (tree.size().height() * scale) as u32)
            .unwrap();
    resvg::render(&tree, resvg::tiny_skia::Transform::from_scale(scale, scale), &mut pix.as_mut());
    pix.save_png(to).unwrap();
}
