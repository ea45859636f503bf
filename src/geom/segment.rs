//! Closest points between points and straight segments, and segment crossing tests.
//!
//! Takes segment end points in mm, gives closest point pairs and distances. These are
//! the textbook constructions (clamped projection; for two segments the minimum over the
//! four end-point-to-segment distances when they do not cross — Ericson, *Real-Time
//! Collision Detection*, 2005, §5.1.2 and §5.1.9), written out here because geo's
//! `ClosestPoint` answers "closest point to a point", not "closest pair".

use super::{pt, Pt};

/// Squared Euclidean distance between two points.
pub fn dist2(a: Pt, b: Pt) -> f64 {
    (a.x - b.x).powi(2) + (a.y - b.y).powi(2)
}

/// Euclidean distance between two points.
pub fn dist(a: Pt, b: Pt) -> f64 {
    dist2(a, b).sqrt()
}

/// The point of segment `a`–`b` nearest to `p` (clamped projection).
///
/// ```
/// use segmask::geom::{pt, point_segment_closest};
/// let q = point_segment_closest(pt(1.0, 5.0), pt(0.0, 0.0), pt(4.0, 0.0));
/// assert_eq!((q.x, q.y), (1.0, 0.0));
/// ```
pub fn point_segment_closest(p: Pt, a: Pt, b: Pt) -> Pt {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let len2 = dx * dx + dy * dy;
    if len2 == 0.0 {
        return a;
    }
    let t = (((p.x - a.x) * dx + (p.y - a.y) * dy) / len2).clamp(0.0, 1.0);
    pt(a.x + t * dx, a.y + t * dy)
}

/// Twice the signed area of triangle `a b c` (positive when counter-clockwise).
pub fn cross3(a: Pt, b: Pt, c: Pt) -> f64 {
    (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x)
}

fn on_segment(a: Pt, b: Pt, p: Pt) -> bool {
    p.x >= a.x.min(b.x) && p.x <= a.x.max(b.x) && p.y >= a.y.min(b.y) && p.y <= a.y.max(b.y)
}

/// A point where segments `a0`–`a1` and `b0`–`b1` meet (cross or touch), if they do.
///
/// ```
/// use segmask::geom::{pt, segment_intersection};
/// let x = segment_intersection(pt(0.0, 0.0), pt(2.0, 2.0), pt(0.0, 2.0), pt(2.0, 0.0)).unwrap();
/// assert!((x.x - 1.0).abs() < 1e-12 && (x.y - 1.0).abs() < 1e-12);
/// assert!(segment_intersection(pt(0.0, 0.0), pt(1.0, 0.0), pt(0.0, 1.0), pt(1.0, 1.0)).is_none());
/// ```
pub fn segment_intersection(a0: Pt, a1: Pt, b0: Pt, b1: Pt) -> Option<Pt> {
    let d1 = cross3(b0, b1, a0);
    let d2 = cross3(b0, b1, a1);
    let d3 = cross3(a0, a1, b0);
    let d4 = cross3(a0, a1, b1);
    if ((d1 > 0.0 && d2 < 0.0) || (d1 < 0.0 && d2 > 0.0)) && ((d3 > 0.0 && d4 < 0.0) || (d3 < 0.0 && d4 > 0.0)) {
        let t = d1 / (d1 - d2);
        return Some(pt(a0.x + t * (a1.x - a0.x), a0.y + t * (a1.y - a0.y)));
    }
    // Touching or collinear: some end point lies on the other segment.
    [(d1, b0, b1, a0), (d2, b0, b1, a1), (d3, a0, a1, b0), (d4, a0, a1, b1)]
        .into_iter()
        .find(|&(d, s0, s1, p)| d == 0.0 && on_segment(s0, s1, p))
        .map(|(_, _, _, p)| p)
}

/// The closest pair of points between segments `a0`–`a1` and `b0`–`b1`, with their
/// distance (0 and the meeting point twice when they cross or touch).
///
/// ```
/// use segmask::geom::{pt, segment_closest_points};
/// // Two parallel segments 0.5 apart, overlapping in x over [1, 2].
/// let (p, q, d) = segment_closest_points(pt(0.0, 0.0), pt(2.0, 0.0), pt(1.0, 0.5), pt(3.0, 0.5));
/// assert!((d - 0.5).abs() < 1e-12);
/// assert!((p.y - 0.0).abs() < 1e-12 && (q.y - 0.5).abs() < 1e-12);
/// ```
pub fn segment_closest_points(a0: Pt, a1: Pt, b0: Pt, b1: Pt) -> (Pt, Pt, f64) {
    if let Some(x) = segment_intersection(a0, a1, b0, b1) {
        return (x, x, 0.0);
    }
    let candidates = [
        (a0, point_segment_closest(a0, b0, b1)),
        (a1, point_segment_closest(a1, b0, b1)),
        (point_segment_closest(b0, a0, a1), b0),
        (point_segment_closest(b1, a0, a1), b1),
    ];
    let (p, q) = candidates
        .into_iter()
        .min_by(|x, y| dist2(x.0, x.1).total_cmp(&dist2(y.0, y.1)))
        .expect("four candidates");
    (p, q, dist(p, q))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Skew segments: reference values from shapely 2.2 (GEOS), `LineString.distance`
    /// and `shapely.ops.nearest_points`, run offline:
    /// `a = LineString([(0,0),(3,1)]); b = LineString([(1,2),(2,4)])` →
    /// distance 1.5811388300841898, nearest points (1.5, 0.5) and (1, 2).
    #[test]
    fn skew_segments_match_geos() {
        let (p, q, d) = segment_closest_points(pt(0.0, 0.0), pt(3.0, 1.0), pt(1.0, 2.0), pt(2.0, 4.0));
        assert!((d - 1.5811388300841898).abs() < 1e-12, "{d}");
        assert!((p.x - 1.5).abs() < 1e-12 && (p.y - 0.5).abs() < 1e-12, "{p:?}");
        assert!((q.x - 1.0).abs() < 1e-12 && (q.y - 2.0).abs() < 1e-12, "{q:?}");
    }

    /// An end point resting on the other segment is a touch (distance 0), as GEOS
    /// `intersects` treats boundary contact.
    #[test]
    fn touching_end_point_is_distance_zero() {
        let (p, _, d) = segment_closest_points(pt(0.0, 0.0), pt(2.0, 0.0), pt(1.0, 0.0), pt(1.0, 3.0));
        assert_eq!(d, 0.0);
        assert_eq!((p.x, p.y), (1.0, 0.0));
    }

    /// Collinear segments [0, 1] and [1.5, 3] on one line are 0.5 apart (hand-computed;
    /// shapely gives the same for these LineStrings).
    #[test]
    fn collinear_disjoint_segments() {
        let (_, _, d) = segment_closest_points(pt(0.0, 0.0), pt(1.0, 0.0), pt(1.5, 0.0), pt(3.0, 0.0));
        assert!((d - 0.5).abs() < 1e-12);
    }
}
