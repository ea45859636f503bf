//! The picture of the display showing something: `NAME.show.svg` and `NAME.show.png`.
//!
//! Takes the artwork's window and a region already worked out by `crate::show` (where
//! the display goes dark, clipped to the window); gives an SVG page in mm, as the viewer
//! sees the glass: the bezel around the window, the window in the colour of the glass,
//! and the lit region dark on it. The page is the window's bounding box grown by
//! [`MARGIN`] on every side, y flipped, nothing mirrored. The PNG is that SVG rasterised
//! by resvg. Colours are ours.

use super::page;
use super::svg_path::{PageMap, push_polygon};
use crate::geom::{Polygon, Region};
use crate::{Error, Result};
use svg::node::element::Rectangle;

/// Bezel shown around the window, mm.
pub const MARGIN: f64 = 3.0;
/// Colour of the bezel.
pub const BEZEL: &str = "#5a5f66";
/// Colour of the glass where nothing is lit (a reflective grey-green).
pub const GLASS: &str = "#c8d2bd";
/// Colour of a lit segment.
pub const LIT: &str = "#1c211e";

/// Bounding box of the window's outer ring: (min x, min y, max x, max y).
fn bounds(window: &Polygon) -> (f64, f64, f64, f64) {
    window.exterior().0.iter().fold((f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY), |b, q| {
        (b.0.min(q.x), b.1.min(q.y), b.2.max(q.x), b.3.max(q.y))
    })
}

/// The SVG page: bezel, window, lit region.
pub fn render_show_svg(name: &str, window: &Polygon, lit: &Region, what: &str) -> Vec<u8> {
    let (x0, y0, x1, y1) = bounds(window);
    let (w, h) = (x1 - x0 + 2.0 * MARGIN, y1 - y0 + 2.0 * MARGIN);
    let map = PageMap::upright(x0, y1, MARGIN, MARGIN);
    let mut glass = String::new();
    push_polygon(&mut glass, window, &map);
    let mut dark = String::new();
    for p in &lit.0 {
        push_polygon(&mut dark, p, &map);
    }
    let doc = page::document(w, h, &format!("{name} showing {what}"))
        .add(Rectangle::new().set("x", 0).set("y", 0).set("width", super::svg_path::num(w)).set("height", super::svg_path::num(h)).set("fill", BEZEL))
        .add(page::fill(glass, GLASS, "evenodd"))
        .add(page::fill(dark, LIT, "nonzero"));
    page::bytes(&doc)
}

/// The SVG rasterised at `dpi` dots per inch (SVG's 96 user px to the inch: CSS Values
/// and Units), as PNG bytes.
pub fn render_png(svg: &[u8], dpi: f32) -> Result<Vec<u8>> {
    let tree = resvg::usvg::Tree::from_data(svg, &resvg::usvg::Options::default())
        .map_err(|e| Error::Bug(format!("show SVG does not parse: {e}")))?;
    let scale = dpi / 96.0;
    let size = tree.size();
    let (w, h) = ((size.width() * scale).ceil() as u32, (size.height() * scale).ceil() as u32);
    let mut pixmap = resvg::tiny_skia::Pixmap::new(w.max(1), h.max(1))
        .ok_or_else(|| Error::Bug(format!("no {w}×{h} pixmap")))?;
    resvg::render(&tree, resvg::tiny_skia::Transform::from_scale(scale, scale), &mut pixmap.as_mut());
    pixmap.encode_png().map_err(|e| Error::Bug(format!("PNG: {e}")))
}
