//! An SVG page measured in millimetres, and the few kinds of element drawn on it.
//!
//! Takes a page size and path data, gives SVG bytes whose `width`/`height` are in `mm`
//! and whose `viewBox` has the same numbers, so that one user unit is one millimetre
//! and the page prints at exact size (W3C SVG; CSS Values and Units: 1 in = 25.4 mm =
//! 96 px). Built on the svg crate, with path data written by [`super::svg_path`].

use super::svg_path::{num, push_page_polyline};
use super::text::{text_strokes, text_width};
use svg::Document;
use svg::node::element::{Path, Title};

/// A page of `width` × `height` mm with a `<title>`.
pub fn document(width: f64, height: f64, title: &str) -> Document {
    Document::new()
        .set("version", "1.1")
        .set("width", format!("{}mm", num(width)))
        .set("height", format!("{}mm", num(height)))
        .set("viewBox", format!("0 0 {} {}", num(width), num(height)))
        .add(Title::new(title))
}

/// The bytes of a finished page, with an XML declaration.
pub fn bytes(doc: &Document) -> Vec<u8> {
    format!("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n{doc}\n").into_bytes()
}

/// A filled path.
pub fn fill(d: String, colour: &str, rule: &str) -> Path {
    Path::new().set("d", d).set("fill", colour).set("fill-rule", rule).set("stroke", "none")
}

/// A stroked, unfilled path with round caps and joins.
pub fn stroke(d: String, colour: &str, width: f64) -> Path {
    Path::new()
        .set("d", d)
        .set("fill", "none")
        .set("stroke", colour)
        .set("stroke-width", num(width))
        .set("stroke-linecap", "round")
        .set("stroke-linejoin", "round")
}

/// Path data of polylines already in page coordinates.
pub fn polylines_d(lines: &[Vec<(f64, f64)>]) -> String {
    let mut d = String::new();
    for l in lines {
        push_page_polyline(&mut d, l);
    }
    d
}

/// Where and how a line of stroke text goes on the page.
#[derive(Debug, Clone, Copy)]
pub struct TextPlace {
    /// Page x of the left end of the line, mm.
    pub left: f64,
    /// Page y of the baseline, mm (y grows downwards).
    pub baseline: f64,
    /// Cap height, mm.
    pub height: f64,
    /// Print the line mirrored left–right, so that it reads correctly through the
    /// back of the film.
    pub mirrored: bool,
}

/// A line of text as polylines in page coordinates (no fonts needed).
pub fn text_lines(s: &str, at: TextPlace) -> Vec<Vec<(f64, f64)>> {
    let w = text_width(s, at.height);
    text_strokes(s, at.height)
        .into_iter()
        .map(|l| {
            l.into_iter()
                .map(|(u, v)| (if at.mirrored { at.left + w - u } else { at.left + u }, at.baseline - v))
                .collect()
        })
        .collect()
}
