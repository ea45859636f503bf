//! Page coordinates and SVG path data.
//!
//! Takes artwork points (mm, y up, viewer's frame) and gives SVG numbers (mm, y down,
//! 1 user unit = 1 mm), mirrored when asked. Only coordinates are transformed here —
//! flip y, mirror x, round to 6 decimals (1 nm) — never geometry (docs/crate-notes.md,
//! *svg*: the svg
//! crate's path `Data` is f32, so `d` is written here with full precision).

use crate::geom::{Polygon, Pt};
use std::fmt::Write as _;

/// An affine map from artwork mm (y up) to page mm (y down): `x' = sx·x + tx`,
/// `y' = ty − y`, with `sx = ±1` (−1 mirrors).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PageMap {
    sx: f64,
    tx: f64,
    ty: f64,
}

impl PageMap {
    /// Puts artwork point (`min_x`, `max_y`) at page point (`left`, `top`), unmirrored.
    pub fn upright(min_x: f64, max_y: f64, left: f64, top: f64) -> PageMap {
        PageMap { sx: 1.0, tx: left - min_x, ty: top + max_y }
    }

    /// Mirrors x: artwork `max_x` goes to page x = `left` (so a span [`min_x`, `max_x`]
    /// lands on `left` … `left + max_x − min_x`, mirrored about its centre); artwork
    /// `max_y` goes to page `top`.
    pub fn mirrored(max_x: f64, max_y: f64, left: f64, top: f64) -> PageMap {
        PageMap { sx: -1.0, tx: left + max_x, ty: top + max_y }
    }

    /// True when this map mirrors.
    pub fn is_mirrored(&self) -> bool {
        self.sx < 0.0
    }

    /// Page position of an artwork point.
    pub fn apply(&self, p: Pt) -> (f64, f64) {
        (self.sx * p.x + self.tx, self.ty - p.y)
    }
}

/// Formats a length in mm with 6 decimals (1 nm), trailing zeros trimmed, never `-0`.
///
/// ```
/// use segmask::emit::svg_path::num;
/// assert_eq!(num(12.5), "12.5");
/// assert_eq!(num(-0.0000001), "0");
/// assert_eq!(num(1.0 / 3.0), "0.333333");
/// ```
pub fn num(v: f64) -> String {
    let mut s = format!("{v:.6}");
    if s.contains('.') {
        while s.ends_with('0') {
            s.pop();
        }
        if s.ends_with('.') {
            s.pop();
        }
    }
    if s == "-0" {
        s = "0".into();
    }
    s
}

/// Twice the signed area of a ring (positive when counter-clockwise, y up).
pub fn signed_area2(ring: &[Pt]) -> f64 {
    let n = ring.len();
    (0..n)
        .map(|i| {
            let (a, b) = (ring[i], ring[(i + 1) % n]);
            a.x * b.y - b.x * a.y
        })
        .sum()
}

/// One closed ring in page coordinates (first point not repeated); `ccw` chooses the
/// winding in the artwork frame (the page map flips all rings alike, so the non-zero
/// rule still sees holes as holes). `None` for fewer than three points.
pub fn page_ring(ring: &[Pt], map: &PageMap, ccw: bool) -> Option<Vec<(f64, f64)>> {
    let mut pts: Vec<Pt> = ring.to_vec();
    if pts.len() > 1 && pts.first() == pts.last() {
        pts.pop();
    }
    if pts.len() < 3 {
        return None;
    }
    if (signed_area2(&pts) > 0.0) != ccw {
        pts.reverse();
    }
    Some(pts.iter().map(|p| map.apply(*p)).collect())
}

/// Appends one closed ring as `M … L … Z` in page coordinates, wound as [`page_ring`].
pub fn push_ring(d: &mut String, ring: &[Pt], map: &PageMap, ccw: bool) {
    if let Some(page) = page_ring(ring, map, ccw) {
        push_page_polyline(d, &page);
        d.push('Z');
    }
}

/// Appends a polygon: outer ring counter-clockwise, holes clockwise (artwork frame).
pub fn push_polygon(d: &mut String, p: &Polygon, map: &PageMap) {
    push_ring(d, &p.exterior().0, map, true);
    for hole in p.interiors() {
        push_ring(d, &hole.0, map, false);
    }
}

/// Appends an open polyline already in page coordinates (`M x y L x y …`).
pub fn push_page_polyline(d: &mut String, pts: &[(f64, f64)]) {
    for (i, (x, y)) in pts.iter().enumerate() {
        if !d.is_empty() {
            d.push(' ');
        }
        let cmd = match i {
            0 => "M",
            1 => "L",
            _ => "",
        };
        let _ = write!(d, "{cmd}{} {}", num(*x), num(*y));
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, rect};

    #[test]
    fn upright_map_flips_y_only() {
        let m = PageMap::upright(0.0, 30.0, 12.0, 15.0);
        assert_eq!(m.apply(pt(0.0, 30.0)), (12.0, 15.0));
        assert_eq!(m.apply(pt(10.0, 0.0)), (22.0, 45.0));
    }

    #[test]
    fn mirrored_map_swaps_left_and_right() {
        let m = PageMap::mirrored(40.0, 30.0, 12.0, 15.0);
        assert_eq!(m.apply(pt(0.0, 30.0)), (52.0, 15.0));
        assert_eq!(m.apply(pt(40.0, 30.0)), (12.0, 15.0));
        assert!(m.is_mirrored());
    }

    #[test]
    fn hole_winds_against_outer() {
        let mut p = rect(0.0, 0.0, 4.0, 4.0);
        p.interiors_push(rect(1.0, 1.0, 2.0, 2.0).exterior().clone());
        let mut d = String::new();
        push_polygon(&mut d, &p, &PageMap::upright(0.0, 4.0, 0.0, 0.0));
        assert_eq!(d, "M0 4 L4 4 4 0 0 0Z M1 2 L2 2 2 3 1 3Z");
    }
}
