//! Distance between two polygons when only small distances matter.
//!
//! The checks ask "do these two come within `limit`?" of polygons that may be hundreds
//! of millimetres long with thousands of edges (a common electrode along a row of
//! digits). Only edges near the other polygon's box can be that close, so only those are
//! compared — pairwise when few, through an R-tree when many. A polygon asked about many
//! times ([`Prepared::indexed`]) keeps its edges in an R-tree, which each edge of the
//! other polygon asks for the edges within reach of it. One polygon inside the other is
//! distance 0 (GEOS semantics, as `geom::distance`).

use super::index::{region_edges, Bbox, EdgeIndex};
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
    distance_below_prepared(&Prepared::plain(a), &Prepared::plain(b), limit)
}

/// Polygons with more edges than this get an index of their edges when prepared.
const INDEX_ABOVE: usize = 256;

/// A polygon ready to be asked about many times: a large one (a common along a row of
/// digits, met by the box of every shape near it and of every long lead) keeps its edges
/// in an R-tree ([`EdgeIndex`]), so that a question costs the edges near the other
/// shape's own edges, not a pass over all of its own.
pub struct Prepared<'a> {
    polygon: &'a Polygon,
    bbox: Option<geo::Rect<f64>>,
    /// The same box as the check's indexes keep it.
    abox: Option<Bbox>,
    /// Number of edges.
    count: usize,
    /// Every edge (large polygons only).
    index: Option<EdgeIndex>,
}

impl<'a> Prepared<'a> {
    /// The polygon as it is: every question scans its edges.
    pub fn plain(polygon: &'a Polygon) -> Prepared<'a> {
        let bbox = polygon.bounding_rect();
        let abox = bbox.map(|b| rstar::AABB::from_corners([b.min().x, b.min().y], [b.max().x, b.max().y]));
        Prepared { polygon, bbox, abox, count: ring_edges(polygon).count(), index: None }
    }

    /// The polygon with its edges indexed when it has many.
    pub fn indexed(polygon: &'a Polygon) -> Prepared<'a> {
        let mut p = Prepared::plain(polygon);
        if p.count > INDEX_ABOVE {
            p.index = Some(EdgeIndex::new(region_edges(&geom::region_of([polygon.clone()]))));
        }
        p
    }

    /// The polygon's box as the check's indexes keep boxes.
    pub fn bbox(&self) -> Option<Bbox> {
        self.abox
    }

    /// The edges whose boxes come within `limit` of `r`.
    fn edges_near(&self, r: &geo::Rect<f64>, limit: f64) -> Vec<(Pt, Pt)> {
        let (lo, hi) = (r.min(), r.max());
        let near = |a: Pt, b: Pt| a.x.max(b.x) >= lo.x - limit && a.x.min(b.x) <= hi.x + limit && a.y.max(b.y) >= lo.y - limit && a.y.min(b.y) <= hi.y + limit;
        ring_edges(self.polygon).filter(|&(a, b)| near(a, b)).collect()
    }

    /// Whether `v` lies inside the polygon. Indexed: the crossing rule (a ray from `v`
    /// towards +x crosses the boundary an odd number of times, an edge counting when its
    /// ends lie on either side of the ray's line, half-open in y; Shimrat 1962) over the
    /// edges the index finds along the ray. A point on the boundary may come out either
    /// way; the edges are measured next, and meet there at distance 0.
    fn contains(&self, v: Pt) -> bool {
        let Some(index) = &self.index else { return self.polygon.contains(&v) };
        let Some(b) = self.bbox else { return false };
        if v.x < b.min().x || v.x > b.max().x || v.y < b.min().y || v.y > b.max().y {
            return false;
        }
        let ray = rstar::AABB::from_corners([v.x, v.y], [b.max().x, v.y]);
        let crossings = index
            .near(&ray)
            .filter(|&j| {
                let (p, q) = (index.edges[j].a, index.edges[j].b);
                (p.y > v.y) != (q.y > v.y) && v.x < p.x + (v.y - p.y) / (q.y - p.y) * (q.x - p.x)
            })
            .count();
        crossings % 2 == 1
    }
}

/// The box of edge `e` grown by `by`.
fn edge_box((p, q): (Pt, Pt), by: f64) -> Rectangle<[f64; 2]> {
    Rectangle::from_corners([p.x.min(q.x) - by, p.y.min(q.y) - by], [p.x.max(q.x) + by, p.y.max(q.y) + by])
}

/// As [`distance_below`], for prepared polygons. Where one of the two keeps an index, each
/// edge of the other that comes near its box asks the index for the edges within `limit`
/// of it (the smaller of two indexed polygons asks the larger); else the edges of each
/// near the other's box are compared, pairwise when few, through an R-tree when many.
pub fn distance_below_prepared(a: &Prepared, b: &Prepared, limit: f64) -> f64 {
    let (Some(ba), Some(bb)) = (a.bbox, b.bbox) else { return limit };
    let first = |p: &Prepared| p.polygon.exterior().0.first().copied();
    if first(b).is_some_and(|v| a.contains(v)) || first(a).is_some_and(|v| b.contains(v)) {
        return 0.0;
    }
    let d = |(p0, p1): (Pt, Pt), (q0, q1): (Pt, Pt)| geom::segment_closest_points(p0, p1, q0, q1).2;
    let mut best = limit;
    let asked = match (&a.index, &b.index) {
        (Some(_), Some(_)) if a.count <= b.count => Some((a, bb, b)),
        (Some(_), Some(_)) | (Some(_), None) => Some((b, ba, a)),
        (None, Some(_)) => Some((a, bb, b)),
        (None, None) => None,
    };
    if let Some((asker, other_box, indexed)) = asked {
        let index = indexed.index.as_ref().unwrap_or_else(|| unreachable!());
        for e in asker.edges_near(&other_box, limit) {
            for j in index.near(&rstar::RTreeObject::envelope(&edge_box(e, limit))) {
                best = best.min(d(e, (index.edges[j].a, index.edges[j].b)));
            }
        }
        return best;
    }
    let ea = a.edges_near(&bb, limit);
    let eb = b.edges_near(&ba, limit);
    if ea.len() * eb.len() <= 4096 {
        for &e in &ea {
            for &f in &eb {
                best = best.min(d(e, f));
            }
        }
        return best;
    }
    let tree = rstar::RTree::bulk_load(eb.iter().map(|&f| GeomWithData::new(edge_box(f, limit), f)).collect());
    for &e in &ea {
        let env = rstar::RTreeObject::envelope(&edge_box(e, limit));
        for f in tree.locate_in_envelope_intersecting(&env) {
            best = best.min(d(e, f.data));
        }
    }
    best
}

/// Every edge of every ring of `p`, as (start, end).
fn ring_edges(p: &Polygon) -> impl Iterator<Item = (Pt, Pt)> + '_ {
    std::iter::once(p.exterior()).chain(p.interiors()).flat_map(|ring| ring.0.windows(2).map(|w| (w[0], w[1])))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{circle, pt, rect, ring};

    /// An indexed polygon answers as the plain one (geo's `contains` and a scan of every
    /// edge): a ring of 4 000 edges against squares inside its band, inside its hole,
    /// across its edges, just outside and far away, against a disc that holds it, and
    /// against a second indexed ring just outside it.
    #[test]
    fn an_indexed_polygon_answers_as_the_plain_one() {
        let band = ring(pt(0.0, 0.0), 10.0, 9.0, 1e-5);
        assert!(band.exterior().0.len() > INDEX_ABOVE);
        let indexed = Prepared::indexed(&band);
        assert!(indexed.index.is_some());
        let probes = [
            rect(9.2, -0.2, 9.6, 0.2),
            rect(-0.5, -0.5, 0.5, 0.5),
            rect(8.9, 3.0, 9.1, 3.2),
            rect(10.02, -0.1, 10.1, 0.1),
            rect(-9.5, 0.0, -9.4, 0.1),
            rect(30.0, 30.0, 31.0, 31.0),
            circle(pt(0.0, 0.0), 12.0, 1e-3),
            ring(pt(0.0, 0.0), 11.0, 10.3, 1e-5),
        ];
        for q in &probes {
            let plain = distance_below(&band, q, 0.5);
            for (x, y) in [(&indexed, &Prepared::indexed(q)), (&Prepared::plain(q), &indexed)] {
                let fast = distance_below_prepared(x, y, 0.5);
                assert!((plain - fast).abs() < 1e-12, "{q:?}: {plain} vs {fast}");
            }
        }
        assert_eq!(distance_below(&band, &probes[0], 0.5), 0.0, "inside the band");
        assert!(distance_below(&band, &probes[1], 0.5) >= 0.5, "inside the hole");
        assert!((distance_below(&band, &probes[7], 0.5) - 0.3).abs() < 1e-4, "between the rings");
    }

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
