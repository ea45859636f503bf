//! Digit segments: a style's skeleton and a digit's cell → one convex polygon a segment.
//!
//! Takes a [`SkeletonDef`] (centre lines in the unit cell) and a [`Cell`] (place, size,
//! slant, stroke); gives each segment's polygon built in the slanted frame, as
//! docs/crate-notes.md (*Slanted digits*) explains: the centre lines are mapped into the
//! cell and slanted first, each
//! segment is the band of width `stroke` around its slanted centre line, and its ends are
//! cut where it meets its neighbours:
//!
//! * where segments end at a common node, each is cut by the bisector of the angle to
//!   each of its two angular neighbours, moved `gap / 2` towards it (a 45° mitre for
//!   square junctions, the true bisector for slanted ones), so that two neighbours face
//!   each other along parallel edges exactly `gap` apart, measured perpendicular;
//! * where a segment ends on the middle of another (the inner verticals of the
//!   fourteen-segment style), it is cut parallel to that segment, `gap` clear of its
//!   edge;
//! * a *minor* segment (the diagonals of the alphanumeric styles) gives way: it is cut
//!   parallel to each segment it meets, `gap` clear of that segment's edge, and the
//!   others are mitred among themselves as if it were not there;
//! * a segment end with no neighbour is cut square at its node.
//!
//! The segment *bodies*, which tile the digit without gaps, are built from the same cuts
//! in `body.rs`.

use super::font::{DotShape, SegmentDef, SkeletonDef};
use crate::geom::{Polygon, Pt, pt};
use geo::LineString;
use std::f64::consts::TAU;

/// Where one digit goes and how it is drawn.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Cell {
    /// Lower-left corner of the upright cell.
    pub origin: Pt,
    /// Character width.
    pub width: f64,
    /// Character height.
    pub height: f64,
    /// Segment stroke width.
    pub stroke: f64,
    /// Slant angle, degrees, positive leans right.
    pub slant: f64,
}

impl Cell {
    fn tan(&self) -> f64 {
        self.slant.to_radians().tan()
    }

    /// Upright point (relative to the origin) → slanted point in the layout frame; the
    /// slant pivots on the baseline.
    pub fn slanted(&self, x: f64, y: f64) -> Pt {
        pt(self.origin.x + x + y * self.tan(), self.origin.y + y)
    }

    /// Unit-cell point → slanted point: (0,0) and (1,1) are the corners of the cell
    /// inset by half a stroke, so the centre lines' bands fill the cell exactly.
    pub fn map(&self, u: Pt) -> Pt {
        let h = self.stroke / 2.0;
        self.slanted(h + u.x * (self.width - self.stroke), h + u.y * (self.height - self.stroke))
    }
}

/// A half-plane `n·p ≥ c`.
#[derive(Debug, Clone, Copy)]
pub(super) struct Half {
    pub(super) n: Pt,
    pub(super) c: f64,
}

/// One cut at a segment's end, and the segment it gives way to when the cut runs
/// parallel to that segment's edge (a T junction, or a minor segment meeting a major).
#[derive(Debug, Clone, Copy)]
pub(super) struct Cut {
    pub(super) half: Half,
    pub(super) gives_way_to: Option<usize>,
}

/// A direction leaving a node along a segment.
#[derive(Debug, Clone, Copy)]
struct Ray {
    angle: f64,
    dir: Pt,
    seg: usize,
    /// The segment runs through the node instead of ending there.
    through: bool,
    /// The segment gives way at this node.
    minor: bool,
}

const EPS: f64 = 1e-9;

fn sub(a: Pt, b: Pt) -> Pt {
    pt(a.x - b.x, a.y - b.y)
}
pub(super) fn dot(a: Pt, b: Pt) -> f64 {
    a.x * b.x + a.y * b.y
}
fn unit(a: Pt) -> Pt {
    let l = dot(a, a).sqrt();
    pt(a.x / l, a.y / l)
}
fn rotate(a: Pt, ang: f64) -> Pt {
    let (s, c) = ang.sin_cos();
    pt(a.x * c - a.y * s, a.x * s + a.y * c)
}
fn close(a: Pt, b: Pt) -> bool {
    (a.x - b.x).abs() < EPS && (a.y - b.y).abs() < EPS
}

/// Builds every segment of one digit, in the skeleton's order, with `gap` between
/// neighbours. Errors (as text) when the skeleton cannot be built at this size.
pub fn build_segments(skel: &SkeletonDef, cell: &Cell, gap: f64) -> Result<Vec<(String, Polygon)>, String> {
    let segs = &skel.segments;
    let mut out = Vec::with_capacity(segs.len());
    for (i, SegmentDef { name, from, to, .. }) in segs.iter().enumerate() {
        let (p0, p1) = (cell.map(*from), cell.map(*to));
        let mut cuts = end_cuts(segs, cell, i, *from, gap)?;
        cuts.extend(end_cuts(segs, cell, i, *to, gap)?);
        let halves: Vec<Half> = cuts.iter().map(|c| c.half).collect();
        let poly = clip_band(p0, p1, cell, &halves);
        if poly.len() < 3 || ring_area(&poly) < 1e-12 {
            return Err(format!("segment `{name}` vanishes: the stroke is too wide for the cell"));
        }
        out.push((name.clone(), ring_to_polygon(poly)));
    }
    Ok(out)
}

/// The rays leaving the node at unit-cell point `at`, sorted by angle.
fn rays_at(segs: &[SegmentDef], cell: &Cell, at: Pt) -> Vec<Ray> {
    let node = cell.map(at);
    let mut rays = Vec::new();
    for (j, s) in segs.iter().enumerate() {
        let (a, b) = (s.from, s.to);
        let (pa, pb) = (cell.map(a), cell.map(b));
        if close(a, at) || close(b, at) {
            let other = if close(a, at) { pb } else { pa };
            let dir = unit(sub(other, node));
            rays.push(Ray { angle: dir.y.atan2(dir.x), dir, seg: j, through: false, minor: s.minor });
        } else if on_interior(a, b, at) {
            let dir = unit(sub(pb, pa));
            for d in [dir, pt(-dir.x, -dir.y)] {
                rays.push(Ray { angle: d.y.atan2(d.x), dir: d, seg: j, through: true, minor: false });
            }
        }
    }
    rays.sort_by(|p, q| p.angle.total_cmp(&q.angle));
    rays
}

fn on_interior(a: Pt, b: Pt, p: Pt) -> bool {
    let ab = sub(b, a);
    let t = dot(sub(p, a), ab) / dot(ab, ab);
    let cross = ab.x * (p.y - a.y) - ab.y * (p.x - a.x);
    t > EPS && t < 1.0 - EPS && cross.abs() < EPS
}

/// Counter-clockwise angle from `a` to `b` in (0, 2π].
fn ccw_gap(a: f64, b: f64) -> f64 {
    let g = (b - a).rem_euclid(TAU);
    if g <= 0.0 { TAU } else { g }
}

/// The cuts at segment `seg`'s end lying at unit-cell point `at`.
pub(super) fn end_cuts(segs: &[SegmentDef], cell: &Cell, seg: usize, at: Pt, gap: f64) -> Result<Vec<Cut>, String> {
    let node = cell.map(at);
    let mut rays = rays_at(segs, cell, at);
    let minor = segs[seg].minor;
    if !minor {
        // Major segments mitre among themselves; minor ones give way to them.
        rays.retain(|r| !r.minor);
    }
    let k = rays.iter().position(|r| r.seg == seg && !r.through).ok_or("skeleton node lookup failed")?;
    let me = rays[k];
    if rays.len() == 1 {
        return Ok(vec![Cut { half: Half { n: me.dir, c: dot(me.dir, node) }, gives_way_to: None }]);
    }
    let next = rays[(k + 1) % rays.len()];
    let prev = rays[(k + rays.len() - 1) % rays.len()];
    let mut cuts = Vec::with_capacity(2);
    for (other, is_next) in [(next, true), (prev, false)] {
        if other.through || (minor && !other.minor) {
            // Parallel to the segment given way to, clear of its edge by `gap`.
            let mut m = pt(-other.dir.y, other.dir.x);
            if dot(m, me.dir) < 0.0 {
                m = pt(-m.x, -m.y);
            }
            cuts.push(Cut { half: Half { n: m, c: dot(m, node) + cell.stroke / 2.0 + gap }, gives_way_to: Some(other.seg) });
            continue;
        }
        let delta = if is_next { ccw_gap(me.angle, other.angle) } else { ccw_gap(other.angle, me.angle) };
        if delta < 1e-6 {
            return Err("two segments leave one node in the same direction".into());
        }
        // The bisector b; the segment lies on its right (next) or left (previous) side.
        let n = if is_next {
            let b = rotate(me.dir, delta / 2.0);
            pt(b.y, -b.x)
        } else {
            let b = rotate(me.dir, -delta / 2.0);
            pt(-b.y, b.x)
        };
        cuts.push(Cut { half: Half { n, c: dot(n, node) + gap / 2.0 }, gives_way_to: None });
    }
    Ok(cuts)
}

/// The band of width `stroke` around p0–p1, long enough to be bounded only by the cuts,
/// clipped by every cut (Sutherland–Hodgman; the band is convex, so is the result).
pub(super) fn clip_band(p0: Pt, p1: Pt, cell: &Cell, cuts: &[Half]) -> Vec<Pt> {
    let d = unit(sub(p1, p0));
    let nn = pt(-d.y, d.x);
    let h = cell.stroke / 2.0;
    let l = 4.0 * (cell.width + cell.height + cell.stroke);
    let at = |p: Pt, s: f64, t: f64| pt(p.x + d.x * s + nn.x * t, p.y + d.y * s + nn.y * t);
    let mut poly = vec![at(p0, -l, -h), at(p1, l, -h), at(p1, l, h), at(p0, -l, h)];
    for cut in cuts {
        poly = clip(&poly, *cut);
    }
    poly
}

pub(super) fn clip(poly: &[Pt], h: Half) -> Vec<Pt> {
    let f = |p: Pt| dot(h.n, p) - h.c;
    let mut out = Vec::with_capacity(poly.len() + 1);
    for i in 0..poly.len() {
        let (a, b) = (poly[i], poly[(i + 1) % poly.len()]);
        let (fa, fb) = (f(a), f(b));
        if fa >= 0.0 {
            out.push(a);
        }
        if (fa >= 0.0) != (fb >= 0.0) {
            let t = fa / (fa - fb);
            out.push(pt(a.x + (b.x - a.x) * t, a.y + (b.y - a.y) * t));
        }
    }
    out.dedup_by(|p, q| close(*p, *q));
    while out.len() > 1 && close(out[0], out[out.len() - 1]) {
        out.pop();
    }
    out
}

pub(super) fn ring_area(p: &[Pt]) -> f64 {
    let mut a = 0.0;
    for i in 0..p.len() {
        let (u, v) = (p[i], p[(i + 1) % p.len()]);
        a += u.x * v.y - v.x * u.y;
    }
    a / 2.0
}

pub(super) fn ring_to_polygon(mut v: Vec<Pt>) -> Polygon {
    v.push(v[0]);
    Polygon::new(LineString::from(v), vec![])
}

/// A dot of `size` centred at upright point (x, y) of the cell (relative to its origin):
/// a square skewed with the slant, or a disc.
pub fn dot_piece(cell: &Cell, shape: DotShape, size: f64, x: f64, y: f64, tol: f64) -> Polygon {
    let h = size / 2.0;
    match shape {
        DotShape::Square => ring_to_polygon(vec![
            cell.slanted(x - h, y - h),
            cell.slanted(x + h, y - h),
            cell.slanted(x + h, y + h),
            cell.slanted(x - h, y + h),
        ]),
        DotShape::Round => crate::geom::circle(cell.slanted(x, y), h, tol),
    }
}

/// The decimal point after the digit: bottom on the baseline, `space` strokes right of
/// the cell.
pub fn decimal_point(skel: &SkeletonDef, cell: &Cell, tol: f64) -> Polygon {
    let size = skel.dp.size * cell.stroke;
    let x = cell.width + skel.dp.space * cell.stroke + size / 2.0;
    dot_piece(cell, skel.dp.shape, size, x, size / 2.0, tol)
}

/// The colon's two dots, centred in the space between this digit and the next one
/// `pitch` further on.
pub fn colon(skel: &SkeletonDef, cell: &Cell, pitch: f64, tol: f64) -> [Polygon; 2] {
    let c = skel.colon;
    let size = c.size * cell.stroke;
    let x = cell.width + (pitch - cell.width) / 2.0;
    [
        dot_piece(cell, c.shape, size, x, c.low * cell.height, tol),
        dot_piece(cell, c.shape, size, x, c.high * cell.height, tol),
    ]
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::distance;
    use crate::glyph::fonts::Fonts;
    use crate::layout::DigitStyle;

    fn cell(slant: f64) -> Cell {
        Cell { origin: pt(3.0, 2.0), width: 6.0, height: 10.0, stroke: 1.2, slant }
    }

    /// Pairs of segments that meet at a node of the skeleton (share an end point, or
    /// one ends on the other).
    fn neighbours(skel: &SkeletonDef) -> Vec<(usize, usize)> {
        let s = &skel.segments;
        let mut v = Vec::new();
        for i in 0..s.len() {
            for j in i + 1..s.len() {
                let (a, b) = ((s[i].from, s[i].to), (s[j].from, s[j].to));
                let shared = [a.0, a.1].iter().any(|p| close(*p, b.0) || close(*p, b.1));
                let t = [a.0, a.1].iter().any(|p| on_interior(b.0, b.1, *p))
                    || [b.0, b.1].iter().any(|p| on_interior(a.0, a.1, *p));
                if shared || t {
                    v.push((i, j));
                }
            }
        }
        v
    }

    /// The brief's gap rule, measured with geo's Euclidean distance on the raw
    /// (unsnapped) construction: neighbours are exactly `gap` apart within 1e-6 mm, and
    /// no pair of segments is closer. The angular neighbours share a node; for seven
    /// segments every pair sharing a node is an angular neighbour pair.
    #[test]
    fn neighbours_keep_exactly_the_gap() {
        let fonts = Fonts::builtin().unwrap();
        let gap = 0.15;
        for style in [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen] {
            let skel = fonts.style(style);
            let nb = neighbours(skel);
            for slant in [0.0, 8.0] {
                let segs = build_segments(skel, &cell(slant), gap).unwrap();
                for i in 0..segs.len() {
                    for j in i + 1..segs.len() {
                        let d = distance(&segs[i].1, &segs[j].1);
                        let (a, b) = (&segs[i].0, &segs[j].0);
                        assert!(d >= gap - 1e-6, "{style:?} {slant}°: {a}–{b} only {d}");
                        if nb.contains(&(i, j)) && style == DigitStyle::Seven {
                            assert!((d - gap).abs() < 1e-6, "{style:?} {slant}°: {a}–{b} at {d}");
                        }
                    }
                }
            }
        }
    }

    /// Angular neighbours in the alphanumeric styles are `gap` apart too (checked for the
    /// pairs that are adjacent around a node, which is every listed neighbour pair
    /// except the two bars of one corner that the diagonal separates).
    #[test]
    fn alphanumeric_neighbours_keep_the_gap() {
        let fonts = Fonts::builtin().unwrap();
        let gap = 0.1;
        for style in [DigitStyle::Fourteen, DigitStyle::Sixteen] {
            let skel = fonts.style(style);
            let segs = build_segments(skel, &cell(8.0), gap).unwrap();
            let idx = |n: &str| segs.iter().position(|s| s.0 == n).unwrap();
            let pairs: &[(&str, &str)] = if style == DigitStyle::Fourteen {
                &[
                    ("a", "h"),
                    ("h", "f"),
                    ("a", "i"),
                    ("i", "h"),
                    ("i", "j"),
                    ("g1", "h"),
                    ("g2", "k"),
                    ("l", "d"),
                    ("b", "c"),
                ]
            } else {
                &[
                    ("a1", "a2"),
                    ("a1", "i"),
                    ("a2", "i"),
                    ("h", "i"),
                    ("d1", "l"),
                    ("d1", "d2"),
                    ("m", "g1"),
                    ("a1", "h"),
                ]
            };
            for (a, b) in pairs {
                let d = distance(&segs[idx(a)].1, &segs[idx(b)].1);
                assert!((d - gap).abs() < 1e-6, "{style:?}: {a}–{b} at {d}");
            }
        }
    }

    #[test]
    fn segments_are_convex_ccw_and_inside_the_slanted_cell() {
        use geo::{Validation, Winding};
        let fonts = Fonts::builtin().unwrap();
        for style in [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen] {
            let c = cell(8.0);
            for (name, p) in build_segments(fonts.style(style), &c, 0.1).unwrap() {
                assert!(p.is_valid(), "{name}");
                assert!(p.exterior().is_ccw(), "{name}");
                for q in p.exterior().0.iter() {
                    let y = q.y - c.origin.y;
                    let x = q.x - c.origin.x - y * c.tan();
                    // The mitred corners stay within the slanted cell (upright frame,
                    // 1e-9 slack): the bands are inset by half a stroke.
                    assert!(y >= -1e-9 && y <= c.height + 1e-9, "{name} {q:?}");
                    assert!(x >= -0.2 && x <= c.width + 0.2, "{name} {q:?}");
                }
            }
        }
    }
}
