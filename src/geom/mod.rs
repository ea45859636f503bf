//! Planar geometry in `f64` millimetres: the one place that talks to geo / i_overlay
//! (boolean operations, offsets, areas, distances) and lyon_geom (curve flattening).
//!
//! Takes polygons, gives polygons. Every stage goes through these functions so that the
//! pitfalls described in docs/crate-notes.md are handled once: inputs are snapped to one 1 nm grid
//! before boolean work, unions use the non-zero fill rule, and round joins take their
//! angular step from a chord tolerance instead of geo's fixed 32 steps a circle.

mod alike;
mod centroid;
mod clip;
mod interior;
mod overlap;
mod segment;
mod shapes;
pub mod bands;
pub mod path;
pub use clip::{clip_to_rect, cut_to_box, CUT_MARGIN};
pub use path::{arc_points, fill_even_odd, parse_svg_path, ring_polygon, rounded_rect};

pub use alike::alike;
pub use centroid::centroid;
pub use interior::interior_point;
pub use overlap::overlap_area;
pub use segment::{cross3, dist, dist2, point_segment_closest, segment_closest_points, segment_intersection};
pub use shapes::{circle, rect, regular_arc_step, ring, stroke_lead, stroke_lead_drawn, stroke_polyline};

use geo::algorithm::bool_ops::FillRule;
use geo::algorithm::buffer::{BufferStyle, LineJoin};
use geo::{Area, BooleanOps, Buffer, MapCoords};

/// A point in millimetres.
pub type Pt = geo::Coord<f64>;
/// A simple polygon (outer ring and holes) in millimetres.
pub type Polygon = geo::Polygon<f64>;
/// A set of disjoint polygons in millimetres.
pub type Region = geo::MultiPolygon<f64>;

/// The grid every boolean input is snapped to: 1 nm, the GDSII database unit.
pub const SNAP_MM: f64 = 1e-6;

/// Default chord tolerance for arcs and round joins: 1 µm.
pub const DEFAULT_TOLERANCE_MM: f64 = 1e-3;

/// Builds a point.
pub fn pt(x: f64, y: f64) -> Pt {
    geo::coord! { x: x, y: y }
}

/// Rounds every coordinate to the 1 nm grid.
pub fn snap<G: MapCoords<f64, f64, Output = G>>(g: &G) -> G {
    g.map_coords(|c| pt(snap_value(c.x), snap_value(c.y)))
}

/// Rounds one length to the 1 nm grid.
pub fn snap_value(v: f64) -> f64 {
    (v / SNAP_MM).round() * SNAP_MM
}

/// Wraps polygons into a region without any boolean work.
pub fn region_of(polys: impl IntoIterator<Item = Polygon>) -> Region {
    geo::MultiPolygon(polys.into_iter().collect())
}

/// Unites any number of polygons with the non-zero rule, so overlapping inputs merge
/// instead of cancelling (docs/crate-notes.md, *Fill rule*).
///
/// ```
/// use segmask::geom::{rect, union_all, area};
/// let u = union_all([rect(0.0, 0.0, 2.0, 1.0), rect(1.0, 0.0, 3.0, 1.0)]);
/// assert!((area(&u) - 3.0).abs() < 1e-9);
/// ```
pub fn union_all(polys: impl IntoIterator<Item = Polygon>) -> Region {
    let mut subject: Vec<Polygon> = polys.into_iter().map(|p| orient_ccw(&snap(&p))).collect();
    if subject.is_empty() {
        return Region::new(vec![]);
    }
    let first = subject.remove(0);
    let rest = geo::MultiPolygon(subject);
    geo::MultiPolygon(vec![first]).union_with_fill_rule(&rest, FillRule::NonZero)
}

/// Unites two regions.
pub fn union(a: &Region, b: &Region) -> Region {
    union_all(a.0.iter().chain(b.0.iter()).cloned())
}

/// Removes `clip` from `subject`; the clip pieces are united first so that overlapping
/// clips do not cancel.
pub fn difference(subject: &Region, clip: &Region) -> Region {
    if clip.0.is_empty() || subject.0.is_empty() {
        return subject.clone();
    }
    let s = snap(subject);
    let c = union_all(clip.0.iter().cloned());
    s.difference_with_fill_rule(&c, FillRule::NonZero)
}

/// The part of `a` that is also in `b`.
pub fn intersection(a: &Region, b: &Region) -> Region {
    if a.0.is_empty() || b.0.is_empty() {
        return Region::new(vec![]);
    }
    snap(a).intersection_with_fill_rule(&snap(b), FillRule::NonZero)
}

/// Grows (positive `d`) or shrinks (negative `d`) a region with round joins whose
/// chords stay within `tol` of the true arc.
///
/// ```
/// use segmask::geom::{rect, region_of, offset_round, area};
/// let grown = offset_round(&region_of([rect(0.0, 0.0, 1.0, 1.0)]), 0.5, 1e-4);
/// let exact = 1.0 + 4.0 * 0.5 + std::f64::consts::PI * 0.25;
/// assert!((area(&grown) - exact).abs() < 1e-3);
/// ```
pub fn offset_round(r: &Region, d: f64, tol: f64) -> Region {
    if d == 0.0 || r.0.is_empty() {
        return r.clone();
    }
    let step = regular_arc_step(d.abs(), tol);
    let style = BufferStyle::new(d).line_join(LineJoin::Round(step));
    snap(&snap(r).buffer_with_style(style))
}

/// Grows or shrinks a region with mitred joins (sharp corners stay sharp, up to a mitre
/// limit of 4 widths).
pub fn offset_mitre(r: &Region, d: f64) -> Region {
    if d == 0.0 || r.0.is_empty() {
        return r.clone();
    }
    let style = BufferStyle::new(d).line_join(LineJoin::Miter(4.0));
    snap(&snap(r).buffer_with_style(style))
}

/// Unsigned area in mm².
pub fn area<G: Area<f64>>(g: &G) -> f64 {
    g.unsigned_area()
}

/// Returns the polygon with a counter-clockwise exterior and clockwise holes.
pub fn orient_ccw(p: &Polygon) -> Polygon {
    use geo::orient::{Direction, Orient};
    p.orient(Direction::Default)
}

/// Euclidean distance between two polygons (0 when they touch or overlap).
pub fn distance(a: &Polygon, b: &Polygon) -> f64 {
    use geo::{Distance, Euclidean};
    Euclidean.distance(a, b)
}

/// The region with every vertex dropped that lies within `eps` of the line its kept
/// neighbours span (Ramer–Douglas–Peucker, 1972–73, ring by ring, through geo's
/// `Simplify`): each ring moves by at most `eps`. Offsets with round joins add two
/// vertices a few nanometres apart at every corner of an already flattened curve, so a
/// region that went through several offsets carries several times the vertices its
/// curves need; for a measurement that works to a chord tolerance anyway, dropping them
/// first cuts the cost of every boolean that follows.
pub fn simplified(r: &Region, eps: f64) -> Region {
    use geo::Simplify;
    Region::new(r.0.iter().map(|p| p.simplify(eps)).collect())
}

/// Moves a region by (dx, dy).
pub fn translate(r: &Region, dx: f64, dy: f64) -> Region {
    r.map_coords(|c| pt(c.x + dx, c.y + dy))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// docs/crate-notes.md, *Fill rule*: the default even-odd rule drops pieces where
    /// clips overlap;
    /// `difference` must not.
    #[test]
    fn overlapping_clips_do_not_cancel() {
        let s = region_of([rect(0.0, 0.0, 10.0, 1.0)]);
        let c = region_of([rect(2.0, -1.0, 5.0, 2.0), rect(4.0, -1.0, 6.0, 2.0)]);
        let d = difference(&s, &c);
        assert!((area(&d) - 6.0).abs() < 1e-9, "area {}", area(&d));
    }

    #[test]
    fn offset_round_respects_tolerance() {
        // A 1 mm disc grown from a point-like square: the flattened arc lies inside the
        // true circle by at most `tol` (docs/crate-notes.md, *Arc flattening*).
        let r = offset_round(&region_of([rect(0.0, 0.0, 1e-3, 1e-3)]), 1.0, 1e-4);
        let a = area(&r);
        let exact = std::f64::consts::PI;
        assert!(a < exact + 0.01 && a > exact - 2.0 * std::f64::consts::PI * 1e-4 - 0.01, "{a}");
    }

    /// A 2 mm square with a vertex 0.2 µm off the middle of three sides and 2 µm off
    /// the fourth: simplified within 0.5 µm it drops the three and keeps the fourth,
    /// every dropped vertex lies within 0.5 µm of the kept ring (geo's point-to-line
    /// distance), and the area moves by less than 0.5 µm × perimeter.
    #[test]
    fn simplifying_moves_no_vertex_further_than_asked() {
        use geo::{Distance, Euclidean};
        let ring = vec![(0.0, 0.0), (1.0, -2e-4), (2.0, 0.0), (2.0002, 1.0), (2.0, 2.0), (1.0, 2.0002), (0.0, 2.0), (-2e-3, 1.0)];
        let opened = region_of([Polygon::new(geo::LineString::from(ring), vec![])]);
        let eps = 5e-4;
        let s = simplified(&opened, eps);
        let count = |r: &Region| r.0.iter().map(|p| p.exterior().0.len()).sum::<usize>();
        assert_eq!((count(&opened), count(&s)), (9, 6), "the closing point counted");
        let d = opened.0[0].exterior().points().map(|v| Euclidean.distance(&v, s.0[0].exterior())).fold(0.0, f64::max);
        assert!(d <= eps + 1e-12, "moved {d}");
        assert!((area(&s) - area(&opened)).abs() < eps * 8.0, "{} vs {}", area(&s), area(&opened));
    }
}
