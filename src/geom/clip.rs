//! Cutting a large polygon down to a window before a boolean with something small inside
//! that window.
//!
//! A common electrode spans the glass with thousands of vertices; measuring how much of
//! one pixel it covers by a full boolean costs the whole electrode for every pixel.
//! Clipping each ring to a rectangle around the pixel first (Sutherland–Hodgman, in one
//! linear pass per ring) leaves a few vertices for the boolean. A ring clipped this way
//! may run along the rectangle's edges where it left and re-entered; inside the
//! rectangle the clipped ring bounds exactly the part of the original there, so with
//! the rectangle grown a little past the small shape the boolean's result is the same.

use super::{pt, Polygon, Pt};
use geo::LineString;

/// The parts of `p` inside the axis-aligned rectangle `(x0, y0)`–`(x1, y1)`, as one
/// polygon whose rings may run along the rectangle's edges (see the module comment);
/// `None` when nothing of the exterior is left.
pub fn clip_to_rect(p: &Polygon, x0: f64, y0: f64, x1: f64, y1: f64) -> Option<Polygon> {
    let window = (x0, y0, x1, y1);
    let outer = clip_ring(p.exterior(), window);
    if outer.len() < 3 {
        return None;
    }
    let holes: Vec<LineString<f64>> = p.interiors().iter().map(|h| clip_ring(h, window)).filter(|h| h.len() >= 3).map(closed).collect();
    Some(Polygon::new(closed(outer), holes))
}

/// The points of a ring (without the closing repeat) clipped to the rectangle
/// `(x0, y0, x1, y1)`, as [`clip_ring_by_passes`] clips them.
fn clip_ring(l: &LineString<f64>, (x0, y0, x1, y1): (f64, f64, f64, f64)) -> Vec<Pt> {
    let v: &[Pt] = match l.0.as_slice() {
        [rest @ .., last] if rest.first() == Some(last) => rest,
        all => all,
    };
    // A ring wholly inside the rectangle comes through every pass unchanged, and one
    // wholly beyond a side is emptied by that side's pass: one look at its box answers
    // both, without a copy (most holes of a common that spans the glass are one or the
    // other for the small windows it is cut to).
    match ring_box(v) {
        Some((lx, ly, hx, hy)) if lx >= x0 && hx <= x1 && ly >= y0 && hy <= y1 => v.to_vec(),
        Some((lx, ly, hx, hy)) if hx < x0 || lx > x1 || hy < y0 || ly > y1 => Vec::new(),
        _ => clip_ring_by_passes(v.to_vec(), (x0, y0, x1, y1)),
    }
}

/// Sutherland–Hodgman: the ring's points clipped by each side of the rectangle in turn.
fn clip_ring_by_passes(mut v: Vec<Pt>, (x0, y0, x1, y1): (f64, f64, f64, f64)) -> Vec<Pt> {
    for (axis, lo, bound) in [(0, true, x0), (0, false, x1), (1, true, y0), (1, false, y1)] {
        v = clip_edge(&v, axis, lo, bound);
        if v.is_empty() {
            break;
        }
    }
    v
}

/// The box of a ring's points as (min x, min y, max x, max y); `None` for no points.
fn ring_box(v: &[Pt]) -> Option<(f64, f64, f64, f64)> {
    let first = v.first()?;
    Some(v.iter().fold((first.x, first.y, first.x, first.y), |(lx, ly, hx, hy), p| (lx.min(p.x), ly.min(p.y), hx.max(p.x), hy.max(p.y))))
}

/// How far past a small shape's box larger polygons are cut before a boolean with it
/// (mm): far enough that no edge of the cut lies on an edge of the small shape.
pub const CUT_MARGIN: f64 = 0.01;

/// The parts of `polys` that can meet a shape whose box is `bbox`: the polygons whose
/// boxes meet it, each cut to `bbox` grown by [`CUT_MARGIN`] ([`clip_to_rect`]). Inside
/// that box they bound exactly what the whole polygons do, so a boolean with the shape
/// gives the same result at the cost of the vertices near it.
pub fn cut_to_box<'a>(polys: impl IntoIterator<Item = &'a Polygon>, bbox: &geo::Rect<f64>) -> super::Region {
    use geo::{BoundingRect, Intersects};
    let (x0, y0, x1, y1) = cut_window(bbox);
    super::region_of(
        polys
            .into_iter()
            .filter(|p| p.bounding_rect().is_some_and(|b| b.intersects(bbox)))
            .filter_map(|p| clip_to_rect(p, x0, y0, x1, y1)),
    )
}

/// The rectangle larger polygons are cut to before a boolean with a shape whose box is
/// `bbox`: the box grown by [`CUT_MARGIN`], as (x0, y0, x1, y1).
pub(crate) fn cut_window(bbox: &geo::Rect<f64>) -> (f64, f64, f64, f64) {
    let (lo, hi) = (bbox.min(), bbox.max());
    (lo.x - CUT_MARGIN, lo.y - CUT_MARGIN, hi.x + CUT_MARGIN, hi.y + CUT_MARGIN)
}

fn closed(mut v: Vec<Pt>) -> LineString<f64> {
    v.push(v[0]);
    LineString::from(v)
}

/// One Sutherland–Hodgman pass: keeps the side of the line `coord[axis] = bound` where
/// the coordinate is at least (`lo`) or at most the bound.
fn clip_edge(v: &[Pt], axis: usize, lo: bool, bound: f64) -> Vec<Pt> {
    let c = |p: Pt| if axis == 0 { p.x } else { p.y };
    let inside = |p: Pt| if lo { c(p) >= bound } else { c(p) <= bound };
    let mut out = Vec::with_capacity(v.len());
    for i in 0..v.len() {
        let (a, b) = (v[i], v[(i + 1) % v.len()]);
        let (ia, ib) = (inside(a), inside(b));
        if ia {
            out.push(a);
        }
        if ia != ib {
            // On the line exactly (interpolating the cut coordinate itself can miss it by
            // an ulp), so that two clips either side of one line meet on it.
            let t = (bound - c(a)) / (c(b) - c(a));
            out.push(if axis == 0 { pt(bound, a.y + (b.y - a.y) * t) } else { pt(a.x + (b.x - a.x) * t, bound) });
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, intersection, rect, region_of};

    /// The look at a ring's box gives, point for point, what the four passes give: for
    /// rings wholly inside a window, wholly beyond each of its sides, across its edges,
    /// touching them and closed or not (a star of 9 points, moved over a grid of places).
    #[test]
    fn the_box_shortcut_clips_as_the_passes_do() {
        let window = (1.0, 0.0, 7.0, 5.0);
        let (mut inside, mut outside, mut across) = (0, 0, 0);
        for i in 0..15 {
            for j in 0..12 {
                let (cx, cy) = (-1.0 + 0.7 * i as f64, -1.5 + 0.65 * j as f64);
                let mut pts: Vec<Pt> = (0..9)
                    .map(|k| {
                        let a = k as f64 * std::f64::consts::TAU / 9.0;
                        let r = if k % 2 == 0 { 1.0 } else { 0.45 };
                        pt(cx + r * a.cos(), cy + r * a.sin())
                    })
                    .collect();
                if (i + j) % 2 == 0 {
                    pts.push(pts[0]);
                }
                let ring = LineString::from(pts.clone());
                let open: Vec<Pt> = if pts.first() == pts.last() { pts[..pts.len() - 1].to_vec() } else { pts };
                let want = clip_ring_by_passes(open.clone(), window);
                assert_eq!(clip_ring(&ring, window), want, "star at ({cx}, {cy})");
                match want.len() {
                    0 => outside += 1,
                    n if n == open.len() && want == open => inside += 1,
                    _ => across += 1,
                }
            }
        }
        assert!(inside > 5 && outside > 5 && across > 5, "every case met: {inside} inside, {outside} beyond, {across} across");
        // A ring touching the window's edge from outside is kept by the passes (a point
        // on the edge counts as inside), so the shortcut must not drop it.
        let touching = LineString::from(vec![pt(-1.0, 2.0), pt(1.0, 2.0), pt(0.0, 3.0), pt(-1.0, 2.0)]);
        assert_eq!(clip_ring(&touching, window), clip_ring_by_passes(touching.0[..3].to_vec(), window));
    }

    /// A comb (a long bar with teeth, with a hole) clipped to windows in many places:
    /// its intersection with a small square inside each window has the area of the
    /// boolean with the whole comb (i_overlay), to 1e-6 mm²: the boolean over the whole
    /// 100 mm comb itself rounds by about 1e-7 mm², the clipped one far less.
    #[test]
    fn clipped_then_intersected_equals_intersected() {
        let mut pts = vec![pt(0.0, 0.0), pt(100.0, 0.0), pt(100.0, 1.0)];
        for k in (0..50).rev() {
            let x = 2.0 * k as f64;
            pts.extend([pt(x + 1.5, 1.0), pt(x + 1.5, 3.0), pt(x + 0.5, 3.0), pt(x + 0.5, 1.0)]);
        }
        pts.push(pt(0.0, 1.0));
        let hole = LineString::from(vec![pt(40.2, 0.2), pt(60.0, 0.2), pt(60.0, 0.8), pt(40.2, 0.8), pt(40.2, 0.2)]);
        let comb = Polygon::new(closed(pts), vec![hole]);
        let whole = region_of([comb.clone()]);
        for i in 0..40 {
            let (x, y) = (i as f64 * 2.47 + 0.3, 0.1 + (i % 5) as f64 * 0.6);
            let small = region_of([rect(x, y, x + 1.1, y + 0.9)]);
            let want = area(&intersection(&small, &whole));
            let got = clip_to_rect(&comb, x - 0.01, y - 0.01, x + 1.11, y + 0.91)
                .map(|c| area(&intersection(&small, &region_of([c]))))
                .unwrap_or(0.0);
            assert!((want - got).abs() < 1e-6, "window {i}: {got} against {want}");
        }
    }
}
