//! Spatial indexes for the checks (rstar 0.12, the version geo 0.33 uses): boxes that
//! carry an id, and the straight edges of polygons.
//!
//! Takes polygons, gives candidate pairs and closest points, so that no check loops over
//! all pairs of polygons or edges: every pair is first found through an R-tree query.

use crate::geom::{dist, point_segment_closest, segment_intersection, Polygon, Pt, Region};
use rstar::primitives::{GeomWithData, Line, Rectangle};
use rstar::{RTree, AABB};

/// An axis-aligned box in mm.
pub type Bbox = AABB<[f64; 2]>;

/// The box around a set of points (`None` when there are none, or when a coordinate is
/// not finite — such a polygon is a generator bug, and the R-tree must not see it).
pub fn bbox_of_points(points: impl IntoIterator<Item = Pt>) -> Option<Bbox> {
    let mut it = points.into_iter();
    let first = it.next()?;
    let (mut lo, mut hi) = ([first.x, first.y], [first.x, first.y]);
    for p in it {
        lo = [lo[0].min(p.x), lo[1].min(p.y)];
        hi = [hi[0].max(p.x), hi[1].max(p.y)];
    }
    lo.iter().chain(hi.iter()).all(|v| v.is_finite()).then(|| AABB::from_corners(lo, hi))
}

/// Some point of a polygon (its first vertex), or the origin for an empty one.
pub fn any_point(p: &Polygon) -> Pt {
    p.exterior().0.first().copied().unwrap_or(crate::geom::pt(0.0, 0.0))
}

/// The box around a polygon's outer ring.
pub fn bbox_of_polygon(p: &Polygon) -> Option<Bbox> {
    bbox_of_points(p.exterior().coords().copied())
}

/// The box around a region.
pub fn bbox_of_region(r: &Region) -> Option<Bbox> {
    bbox_of_points(r.0.iter().flat_map(|p| p.exterior().coords().copied()))
}

/// The box grown by `d` on every side.
pub fn expand(b: &Bbox, d: f64) -> Bbox {
    let (lo, hi) = (b.lower(), b.upper());
    AABB::from_corners([lo[0] - d, lo[1] - d], [hi[0] + d, hi[1] + d])
}

/// An R-tree of boxes, each carrying a value (an index into the caller's list).
#[derive(Debug, Clone)]
pub struct BoxIndex<T> {
    tree: RTree<GeomWithData<Rectangle<[f64; 2]>, T>>,
}

impl<T> BoxIndex<T> {
    /// Bulk-loads the boxes.
    pub fn new(items: impl IntoIterator<Item = (Bbox, T)>) -> Self {
        let objects = items
            .into_iter()
            .map(|(b, v)| GeomWithData::new(Rectangle::from_aabb(b), v))
            .collect();
        BoxIndex { tree: RTree::bulk_load(objects) }
    }

    /// Values whose boxes meet `b`.
    pub fn near<'a>(&'a self, b: &Bbox) -> impl Iterator<Item = &'a T> + 'a {
        self.tree.locate_in_envelope_intersecting(b).map(|o| &o.data)
    }
}

/// One straight edge of a polygon ring and where it comes from.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Edge {
    /// Start point.
    pub a: Pt,
    /// End point.
    pub b: Pt,
    /// Polygon number within its region.
    pub poly: usize,
    /// Ring number within the polygon: 0 the outer ring, then the holes.
    pub ring: usize,
    /// Edge number within the ring (edge `i` runs from vertex `i` to vertex `i + 1`).
    pub index: usize,
    /// Number of edges in the ring.
    pub ring_edges: usize,
}

impl Edge {
    /// Length, mm.
    pub fn length(&self) -> f64 {
        dist(self.a, self.b)
    }

    /// True when `other` is this edge's neighbour on the same ring (they share a vertex
    /// by construction).
    pub fn is_adjacent(&self, other: &Edge) -> bool {
        if self.poly != other.poly || self.ring != other.ring {
            return false;
        }
        let n = self.ring_edges;
        (self.index + 1) % n == other.index || (other.index + 1) % n == self.index
    }

    fn bbox(&self) -> Bbox {
        AABB::from_corners([self.a.x.min(self.b.x), self.a.y.min(self.b.y)], [self.a.x.max(self.b.x), self.a.y.max(self.b.y)])
    }
}

/// The edges of every ring of a region, in ring order, zero-length edges left out
/// (closing point not repeated).
pub fn region_edges(region: &Region) -> Vec<Edge> {
    let mut out = Vec::new();
    for (pi, poly) in region.0.iter().enumerate() {
        let rings = std::iter::once(poly.exterior()).chain(poly.interiors().iter());
        for (ri, ring) in rings.enumerate() {
            let mut pts: Vec<Pt> = ring.coords().copied().collect();
            pts.dedup();
            if pts.len() > 1 && pts.first() == pts.last() {
                pts.pop();
            }
            let n = pts.len();
            if n < 3 {
                continue;
            }
            if pts.iter().any(|p| !p.x.is_finite() || !p.y.is_finite()) {
                continue;
            }
            for i in 0..n {
                out.push(Edge { a: pts[i], b: pts[(i + 1) % n], poly: pi, ring: ri, index: i, ring_edges: n });
            }
        }
    }
    out
}

/// The closest pair of points between two edge sets, and their distance.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Closest {
    /// Point on the first set.
    pub p: Pt,
    /// Point on the second set.
    pub q: Pt,
    /// Distance `|p q|`, mm (0 when the sets cross or touch).
    pub distance: f64,
}

impl Closest {
    /// The point midway between `p` and `q`.
    pub fn midpoint(&self) -> Pt {
        crate::geom::pt((self.p.x + self.q.x) / 2.0, (self.p.y + self.q.y) / 2.0)
    }
}

/// An R-tree over the edges of one region (or ring set).
#[derive(Debug, Clone)]
pub struct EdgeIndex {
    /// The edges, in ring order.
    pub edges: Vec<Edge>,
    tree: RTree<GeomWithData<Line<[f64; 2]>, usize>>,
}

impl EdgeIndex {
    /// Indexes the given edges.
    pub fn new(edges: Vec<Edge>) -> Self {
        let objects = edges
            .iter()
            .enumerate()
            .map(|(i, e)| GeomWithData::new(Line::new([e.a.x, e.a.y], [e.b.x, e.b.y]), i))
            .collect();
        EdgeIndex { edges, tree: RTree::bulk_load(objects) }
    }

    /// Indexes every edge of a region.
    pub fn of_region(region: &Region) -> Self {
        Self::new(region_edges(region))
    }

    /// Numbers of the edges whose boxes meet `b`.
    pub fn near<'a>(&'a self, b: &Bbox) -> impl Iterator<Item = usize> + 'a {
        self.tree.locate_in_envelope_intersecting(b).map(|o| o.data)
    }

    /// The edge nearest to `p` and the nearest point on it.
    pub fn nearest(&self, p: Pt) -> Option<(usize, Pt)> {
        let o = self.tree.nearest_neighbor(&[p.x, p.y])?;
        let e = &self.edges[o.data];
        Some((o.data, point_segment_closest(p, e.a, e.b)))
    }

    /// A point where some edge of `self` crosses or touches some edge of `other`.
    pub fn meeting_point(&self, other: &EdgeIndex) -> Option<Pt> {
        meeting_point(&self.edges, other)
    }

    /// The closest pair of points between the edges of `self` and those of `other`.
    ///
    /// When no edges cross, the minimum distance between two sets of segments is reached
    /// at an end point of one of them (Ericson, *Real-Time Collision Detection*, §5.1.9),
    /// so a nearest-edge query from every vertex of each set is exact.
    pub fn closest(&self, other: &EdgeIndex) -> Option<Closest> {
        if let Some(x) = self.meeting_point(other) {
            return Some(Closest { p: x, q: x, distance: 0.0 });
        }
        let forward = self.edges.iter().filter_map(|e| other.nearest(e.a).map(|(_, q)| (e.a, q)));
        let backward = other.edges.iter().filter_map(|e| self.nearest(e.a).map(|(_, p)| (p, e.a)));
        forward
            .chain(backward)
            .map(|(p, q)| Closest { p, q, distance: dist(p, q) })
            .min_by(|x, y| x.distance.total_cmp(&y.distance))
    }
}

/// [`EdgeIndex::closest`] between a large set of edges, scanned as they are, and a small
/// indexed one (a piece of ITO and its glass outline): no index of the large set is built,
/// as its vertices are asked of the small index and the small set's few vertices are
/// measured against every large edge in one pass each.
pub fn closest_to_small(edges: &[Edge], small: &EdgeIndex) -> Option<Closest> {
    if let Some(x) = meeting_point(edges, small) {
        return Some(Closest { p: x, q: x, distance: 0.0 });
    }
    let forward = edges.iter().filter_map(|e| small.nearest(e.a).map(|(_, q)| (e.a, q)));
    let backward = small.edges.iter().filter_map(|f| {
        edges
            .iter()
            .map(|e| point_segment_closest(f.a, e.a, e.b))
            .min_by(|p, q| dist(*p, f.a).total_cmp(&dist(*q, f.a)))
            .map(|p| (p, f.a))
    });
    forward
        .chain(backward)
        .map(|(p, q)| Closest { p, q, distance: dist(p, q) })
        .min_by(|x, y| x.distance.total_cmp(&y.distance))
}

/// A point where one of `edges` crosses or touches an edge of `other`.
pub fn meeting_point(edges: &[Edge], other: &EdgeIndex) -> Option<Pt> {
    edges.iter().find_map(|e| {
        other.near(&e.bbox()).find_map(|j| {
            let f = &other.edges[j];
            segment_intersection(e.a, e.b, f.a, f.b)
        })
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, region_of};

    /// The closest pair between a plain edge list and a small index is the one the two
    /// indexes give: apart, crossing, and one inside the other (nearest wall 0.4 away).
    #[test]
    fn closest_to_a_small_set_matches_the_indexed_search() {
        let glass = EdgeIndex::of_region(&region_of([rect(0.0, 0.0, 10.0, 6.0)]));
        for r in [rect(1.0, 0.4, 3.0, 2.0), rect(9.0, 1.0, 11.0, 2.0), rect(12.0, 1.0, 13.0, 2.0)] {
            let ito = EdgeIndex::of_region(&region_of([r]));
            let (want, got) = (ito.closest(&glass).unwrap(), closest_to_small(&ito.edges, &glass).unwrap());
            assert!((want.distance - got.distance).abs() < 1e-12, "{want:?} {got:?}");
        }
        let inside = region_edges(&region_of([rect(1.0, 0.4, 3.0, 2.0)]));
        assert!((closest_to_small(&inside, &glass).unwrap().distance - 0.4).abs() < 1e-12);
    }

    /// Two unit squares 0.5 apart: shapely 2.2 `box(0,0,1,1).distance(box(1.5,0.2,2.5,1.2))`
    /// is 0.5 and `nearest_points` gives x = 1 and x = 1.5 (GEOS semantics).
    #[test]
    fn closest_between_boxes_matches_geos() {
        let a = EdgeIndex::of_region(&region_of([rect(0.0, 0.0, 1.0, 1.0)]));
        let b = EdgeIndex::of_region(&region_of([rect(1.5, 0.2, 2.5, 1.2)]));
        let c = a.closest(&b).unwrap();
        assert!((c.distance - 0.5).abs() < 1e-12);
        assert!((c.p.x - 1.0).abs() < 1e-12 && (c.q.x - 1.5).abs() < 1e-12);
        // And it agrees with geo's polygon distance.
        let d = crate::geom::distance(&rect(0.0, 0.0, 1.0, 1.0), &rect(1.5, 0.2, 2.5, 1.2));
        assert!((d - c.distance).abs() < 1e-12);
    }

    /// Overlapping squares: GEOS `distance` is 0 for intersecting geometries.
    #[test]
    fn crossing_edges_give_zero() {
        let a = EdgeIndex::of_region(&region_of([rect(0.0, 0.0, 1.0, 1.0)]));
        let b = EdgeIndex::of_region(&region_of([rect(0.5, 0.5, 2.0, 2.0)]));
        assert_eq!(a.closest(&b).unwrap().distance, 0.0);
    }

    /// A closed ring's last edge is adjacent to its first (the closing vertex is shared).
    #[test]
    fn adjacency_wraps_around_the_ring() {
        let e = region_edges(&region_of([rect(0.0, 0.0, 1.0, 1.0)]));
        assert_eq!(e.len(), 4);
        assert!(e[0].is_adjacent(&e[3]) && e[0].is_adjacent(&e[1]) && !e[0].is_adjacent(&e[2]));
    }

    /// Boxes 0.2 mm apart meet once one is grown by 0.3 mm; the far box does not
    /// (hand-computed).
    #[test]
    fn box_index_finds_only_overlapping_boxes() {
        let idx = BoxIndex::new([(bbox_of_polygon(&rect(0.0, 0.0, 1.0, 1.0)).unwrap(), 0usize), (bbox_of_polygon(&rect(5.0, 5.0, 6.0, 6.0)).unwrap(), 1)]);
        let q = expand(&bbox_of_polygon(&rect(1.2, 0.0, 2.0, 1.0)).unwrap(), 0.3);
        let hits: Vec<_> = idx.near(&q).copied().collect();
        assert_eq!(hits, vec![0]);
    }
}
