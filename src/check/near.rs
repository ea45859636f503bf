//! Distance between two polygons when only small distances matter.
//!
//! The checks ask "do these two come within `limit`?" of polygons that may be hundreds
//! of millimetres long with thousands of edges (a common electrode along a row of
//! digits). Only edges near the other polygon's box can be that close, so only those are
//! compared — pairwise when few, through an R-tree when many. One polygon inside the
//! other is distance 0 (GEOS semantics, as `geom::distance`).

use crate::geom::{self, Polygon, Pt};
use geo::{BoundingRect, Contains};
use rstar::primitives::{GeomWithData, Rectangle};

/// The distance between `a` and `b` if it is below `limit`, else `limit` (or more).
///
/// ```
/// use segmask::check::near::distance_below;
/// use segmask::geom::rect;
/// let a = rect(0.0, 0.0, 1.0, 1.0);
/// let b = rect(1.3, 0.0, 2.0, 1.0);
/// assert!((distance_below(&a, &b, 0.5) - 0.3).abs() < 1e-12);
/// assert!(distance_below(&a, &b, 0.1) >= 0.1);
/// assert_eq!(distance_below(&rect(0.2, 0.2, 0.4, 0.4), &a, 0.1), 0.0);
/// ```
pub fn distance_below(a: &Polygon, b: &Polygon, limit: f64) -> f64 {
    let (Some(ba), Some(bb)) = (a.bounding_rect(), b.bounding_rect()) else { return limit };
    let first = |p: &Polygon| p.exterior().0.first().copied();
    if first(b).is_some_and(|v| a.contains(&v)) || first(a).is_some_and(|v| b.contains(&v)) {
        return 0.0;
    }
    let ea = edges_near(a, &bb, limit);
    let eb = edges_near(b, &ba, limit);
    let d = |(p0, p1): (Pt, Pt), (q0, q1): (Pt, Pt)| geom::segment_closest_points(p0, p1, q0, q1).2;
    let mut best = limit;
    if ea.len() * eb.len() <= 4096 {
        for &e in &ea {
            for &f in &eb {
                best = best.min(d(e, f));
            }
        }
        return best;
    }
    let boxed = |(p, q): (Pt, Pt)| {
        Rectangle::from_corners([p.x.min(q.x) - limit, p.y.min(q.y) - limit], [p.x.max(q.x) + limit, p.y.max(q.y) + limit])
    };
    let tree = rstar::RTree::bulk_load(eb.iter().map(|&f| GeomWithData::new(boxed(f), f)).collect());
    for &e in &ea {
        let env = rstar::RTreeObject::envelope(&boxed(e));
        for f in tree.locate_in_envelope_intersecting(&env) {
            best = best.min(d(e, f.data));
        }
    }
    best
}

/// The edges of `p` whose boxes come within `limit` of `r`.
fn edges_near(p: &Polygon, r: &geo::Rect<f64>, limit: f64) -> Vec<(Pt, Pt)> {
    let (lo, hi) = (r.min(), r.max());
    let near = |a: Pt, b: Pt| {
        a.x.max(b.x) >= lo.x - limit && a.x.min(b.x) <= hi.x + limit && a.y.max(b.y) >= lo.y - limit && a.y.min(b.y) <= hi.y + limit
    };
    std::iter::once(p.exterior())
        .chain(p.interiors())
        .flat_map(|ring| ring.0.windows(2).map(|w| (w[0], w[1])))
        .filter(|&(a, b)| near(a, b))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{circle, pt, rect, ring};

    /// Against geo's exact polygon distance on curved shapes with many edges, on both the
    /// pairwise and the indexed path: same value below the limit.
    #[test]
    fn agrees_with_the_exact_distance() {
        let a = ring(pt(0.0, 0.0), 10.0, 9.0, 1e-5);
        let b = circle(pt(0.0, 0.0), 8.95, 1e-5);
        assert!(a.exterior().0.len() * b.exterior().0.len() > 4096);
        let exact = geom::distance(&a, &b);
        assert!((distance_below(&a, &b, 0.2) - exact).abs() < 1e-9, "{exact}");
        let c = rect(9.5, -0.2, 12.0, 0.2);
        assert_eq!(distance_below(&a, &c, 0.1), 0.0, "overlapping");
        let d = rect(10.04, -0.2, 12.0, 0.2);
        assert!((distance_below(&a, &d, 0.1) - geom::distance(&a, &d)).abs() < 1e-9);
    }

    /// Inside a hole is not inside the polygon.
    #[test]
    fn a_polygon_in_a_hole_is_apart() {
        let a = ring(pt(0.0, 0.0), 5.0, 3.0, 1e-3);
        let b = circle(pt(0.0, 0.0), 2.9, 1e-3);
        assert!((distance_below(&a, &b, 0.5) - geom::distance(&a, &b)).abs() < 1e-9);
    }
}
