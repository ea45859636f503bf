//! Ink of a stroke drawing: glyph or icon marks → one region.
//!
//! Takes marks in normalised units and a [`Pen`] (scale, offset, stroke width, chord
//! tolerance); gives the united ink. Every primitive is inked the same way: its centre
//! geometry, scaled and moved, swept by a disc of the stroke's diameter (round caps and
//! joins). For filled primitives this is the filled shape grown by half a stroke, so a
//! `block` and a `box` with the same corners have the same outer edge at every stroke
//! width. `cut` marks are inked alike and removed after the others are united.

use super::font::{Mark, Prim};
use crate::geom::{
    Polygon, Pt, Region, arc_points, circle, difference, fill_even_odd, offset_round, pt, region_of, ring,
    rounded_rect, snap, stroke_polyline, union_all,
};
use geo::LineString;

/// How normalised marks land on the glass.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Pen {
    /// Millimetres per unit.
    pub scale: f64,
    /// Where the unit origin goes.
    pub origin: Pt,
    /// Stroke width, mm.
    pub stroke: f64,
    /// Chord tolerance, mm.
    pub tol: f64,
}

impl Pen {
    fn at(&self, p: Pt) -> Pt {
        pt(self.origin.x + p.x * self.scale, self.origin.y + p.y * self.scale)
    }
    fn len(&self, r: f64) -> f64 {
        r * self.scale
    }
}

/// The united ink of `marks`.
pub fn ink(marks: &[Mark], pen: &Pen) -> Region {
    let mut add = Vec::new();
    let mut cut = Vec::new();
    for m in marks {
        let polys = prim_ink(&m.prim, pen);
        if m.cut { cut.extend(polys) } else { add.extend(polys) }
    }
    let r = union_all(add);
    if cut.is_empty() { r } else { difference(&r, &region_of(cut)) }
}

fn stroked(points: &[Pt], pen: &Pen) -> Vec<Polygon> {
    let mut pts = points.to_vec();
    pts.dedup();
    stroke_polyline(&pts, pen.stroke, pen.tol).0
}

fn closed(mut points: Vec<Pt>) -> Vec<Pt> {
    if points.first() != points.last() {
        // The round caps meeting at the start make the same corner as a round join.
        points.push(points[0]);
    }
    points
}

fn prim_ink(prim: &Prim, pen: &Pen) -> Vec<Polygon> {
    let h = pen.stroke / 2.0;
    match prim {
        Prim::Line(p) => stroked(&p.iter().map(|q| pen.at(*q)).collect::<Vec<_>>(), pen),
        Prim::Loop(p) => stroked(&closed(p.iter().map(|q| pen.at(*q)).collect()), pen),
        Prim::Arc(c, r, a0, a1) => stroked(&arc_points(pen.at(*c), pen.len(*r), *a0, a1 - a0, pen.tol), pen),
        Prim::Circle(c, r) => {
            let (c, r) = (pen.at(*c), pen.len(*r));
            if r > h { vec![ring(c, r + h, r - h, pen.tol)] } else { vec![circle(c, r + h, pen.tol)] }
        }
        Prim::Disc(c, r) => vec![circle(pen.at(*c), pen.len(*r) + h, pen.tol)],
        Prim::Fill(p) => {
            let poly = Polygon::new(LineString::from(closed_ring(p.iter().map(|q| pen.at(*q)).collect())), vec![]);
            offset_round(&union_all([poly]), h, pen.tol).0
        }
        Prim::Block(a, b, r) => {
            let (a, b) = (pen.at(*a), pen.at(*b));
            let (x0, x1, y0, y1) = (a.x.min(b.x), a.x.max(b.x), a.y.min(b.y), a.y.max(b.y));
            vec![rounded_rect(x0 - h, y0 - h, x1 + h, y1 + h, pen.len(*r) + h, pen.tol)]
        }
        Prim::Frame(a, b, r) => {
            let (a, b) = (pen.at(*a), pen.at(*b));
            let (x0, x1, y0, y1) = (a.x.min(b.x), a.x.max(b.x), a.y.min(b.y), a.y.max(b.y));
            let r = pen.len(*r);
            let outer = rounded_rect(x0 - h, y0 - h, x1 + h, y1 + h, r + h, pen.tol);
            if x1 - x0 <= pen.stroke || y1 - y0 <= pen.stroke {
                return vec![outer];
            }
            // The inner edge of a stroked rounded rectangle has radius r − h (sharp when
            // the stroke is wider than the corner).
            let inner = rounded_rect(x0 + h, y0 + h, x1 - h, y1 - h, (r - h).max(0.0), pen.tol);
            let mut hole: Vec<Pt> = inner.exterior().0.clone();
            hole.reverse();
            vec![Polygon::new(outer.exterior().clone(), vec![LineString::from(hole)])]
        }
        Prim::Path(subs) => {
            let mut out = Vec::new();
            for s in subs {
                let m = s.mapped(pen.scale, pen.origin.x, pen.origin.y);
                let pts = m.flatten(pen.tol);
                out.extend(stroked(&if m.closed { closed(pts) } else { pts }, pen));
            }
            out
        }
        Prim::FillPath(subs) => {
            let rings: Vec<Vec<Pt>> =
                subs.iter().map(|s| s.mapped(pen.scale, pen.origin.x, pen.origin.y).flatten(pen.tol)).collect();
            offset_round(&snap(&fill_even_odd(&rings)), h, pen.tol).0
        }
    }
}

fn closed_ring(mut v: Vec<Pt>) -> Vec<Pt> {
    if v.first() != v.last() {
        v.push(v[0]);
    }
    v
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::area;
    use std::f64::consts::PI;

    fn pen(stroke: f64) -> Pen {
        Pen { scale: 10.0, origin: pt(1.0, 2.0), stroke, tol: 1e-4 }
    }
    fn one(prim: Prim, p: &Pen) -> f64 {
        area(&ink(&[Mark { prim, cut: false }], p))
    }

    /// A straight stroke of length L with round caps is a stadium: L·w + π(w/2)²
    /// (elementary geometry).
    #[test]
    fn line_is_a_stadium() {
        let a = one(Prim::Line(vec![pt(0.0, 0.0), pt(0.5, 0.0)]), &pen(0.4));
        let exact = 5.0 * 0.4 + PI * 0.04;
        assert!((a - exact).abs() < 1e-3, "{a} vs {exact}");
    }

    /// A stroked circle is an annulus π((r+w/2)² − (r−w/2)²) = 2πrw; a disc grows by
    /// half the stroke.
    #[test]
    fn circle_and_disc() {
        let a = one(Prim::Circle(pt(0.5, 0.5), 0.3), &pen(0.4));
        assert!((a - 2.0 * PI * 3.0 * 0.4).abs() < 2e-3, "{a}");
        let a = one(Prim::Disc(pt(0.5, 0.5), 0.3), &pen(0.4));
        assert!((a - PI * 3.2 * 3.2).abs() < 3e-3, "{a}");
    }

    /// A stroked rectangle with corner radius r ≥ w/2: outer rounded rectangle (radius
    /// r + w/2) minus inner (radius r − w/2).
    #[test]
    fn frame_and_block() {
        let p = pen(0.4);
        let rr = |w: f64, h: f64, r: f64| w * h - (4.0 - PI) * r * r;
        let a = one(Prim::Frame(pt(0.0, 0.0), pt(0.6, 0.4), 0.05), &p);
        let exact = rr(6.4, 4.4, 0.7) - rr(5.6, 3.6, 0.3);
        assert!((a - exact).abs() < 2e-3, "{a} vs {exact}");
        let a = one(Prim::Block(pt(0.0, 0.0), pt(0.6, 0.4), 0.05), &p);
        assert!((a - rr(6.4, 4.4, 0.7)).abs() < 2e-3, "{a}");
    }

    #[test]
    fn cut_removes_ink() {
        let p = pen(0.2);
        let marks = [
            Mark { prim: Prim::Block(pt(0.0, 0.0), pt(1.0, 1.0), 0.0), cut: false },
            Mark { prim: Prim::Disc(pt(0.5, 0.5), 0.2), cut: true },
        ];
        let a = area(&ink(&marks, &p));
        let block = 10.2 * 10.2 - (4.0 - PI) * 0.01;
        assert!((a - (block - PI * 2.1 * 2.1)).abs() < 3e-3, "{a}");
    }
}
