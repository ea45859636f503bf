//! A point guaranteed to lie inside a polygon (for placing names on shapes).
//!
//! A common electrode is one polygon across the glass with hundreds of holes; a general
//! interior-point routine that tests candidates against the whole polygon spent over a
//! second on the four commons of a 40-digit layout. This one crosses the polygon with a
//! single horizontal line, in one pass over its edges.

use super::{Polygon, Pt};

/// A point inside `p` (not on its boundary when `p` has area), or `None` for a polygon
/// without area: the middle of the widest inside run along a horizontal line near the
/// middle of `p`'s height, the line chosen between two vertex heights so that it passes
/// through no vertex. Inside runs are read by the even–odd rule, holes included.
///
/// ```
/// use segmask::geom::{interior_point, ring, pt};
/// let r = ring(pt(0.0, 0.0), 2.0, 1.0, 1e-3);
/// let p = interior_point(&r).unwrap();
/// let d = (p.x * p.x + p.y * p.y).sqrt();
/// assert!(d > 1.0 && d < 2.0);
/// ```
pub fn interior_point(p: &Polygon) -> Option<Pt> {
    let rings: Vec<&geo::LineString<f64>> = std::iter::once(p.exterior()).chain(p.interiors()).collect();
    let mut ys: Vec<f64> = rings.iter().flat_map(|r| r.0.iter().map(|c| c.y)).collect();
    ys.sort_by(f64::total_cmp);
    ys.dedup();
    if ys.len() < 2 {
        return None;
    }
    let middle = (ys[0] + ys[ys.len() - 1]) / 2.0;
    // The gap between neighbouring vertex heights nearest the middle, then the others
    // outward from it, until a line through one crosses an inside run of some width.
    let k = ys.partition_point(|&y| y < middle).clamp(1, ys.len() - 1);
    let mut order: Vec<usize> = (1..ys.len()).collect();
    order.sort_by_key(|&i| (i as i64 - k as i64).unsigned_abs());
    for i in order.into_iter().take(64) {
        let y = (ys[i - 1] + ys[i]) / 2.0;
        if let Some(x) = widest_run(&rings, y) {
            return Some(super::pt(x, y));
        }
    }
    None
}

/// The middle of the widest inside run of the rings along the line at height `y`.
fn widest_run(rings: &[&geo::LineString<f64>], y: f64) -> Option<f64> {
    let mut xs: Vec<f64> = Vec::new();
    for r in rings {
        for w in r.0.windows(2) {
            let (a, b) = (w[0], w[1]);
            if (a.y < y) != (b.y < y) {
                xs.push(a.x + (y - a.y) * (b.x - a.x) / (b.y - a.y));
            }
        }
    }
    xs.sort_by(f64::total_cmp);
    xs.chunks_exact(2).filter(|c| c[1] > c[0]).max_by(|a, b| (a[1] - a[0]).total_cmp(&(b[1] - b[0]))).map(|c| (c[0] + c[1]) / 2.0)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, rect};
    use geo::{Contains, Point};

    /// The point lies strictly inside (geo's `Contains`, boundary excluded) for a
    /// rectangle, a ring, a comb with its teeth down and a square with many holes, and
    /// in the middle of its run: on a tooth of the comb, half-way across it.
    #[test]
    fn lies_inside_every_shape() {
        let comb = crate::geom::union_all((0..10).map(|i| rect(i as f64 * 2.0, 0.0, i as f64 * 2.0 + 1.0, 5.0)).chain([rect(0.0, 4.0, 19.0, 6.0)]));
        let mut holes = Vec::new();
        for i in 0..20 {
            for j in 0..20 {
                let (x, y) = (i as f64 * 5.0 + 1.0, j as f64 * 5.0 + 1.0);
                holes.push(geo::LineString::from(vec![(x, y), (x, y + 3.0), (x + 3.0, y + 3.0), (x + 3.0, y), (x, y)]));
            }
        }
        let sieve = Polygon::new(rect(0.0, 0.0, 100.0, 100.0).exterior().clone(), holes);
        let shapes = [rect(0.0, 0.0, 3.0, 1.0), crate::geom::ring(pt(5.0, 5.0), 2.0, 1.5, 1e-3), comb.0[0].clone(), sieve];
        for s in &shapes {
            let q = interior_point(s).expect("a point");
            assert!(s.contains(&Point(q)), "{q:?} not inside");
        }
        let on_comb = interior_point(&comb.0[0]).unwrap();
        assert!((on_comb.x.rem_euclid(2.0) - 0.5).abs() < 1e-9 && on_comb.y < 4.0, "{on_comb:?}");
    }

    /// A polygon without area has no interior point.
    #[test]
    fn a_flat_polygon_has_none() {
        let flat = Polygon::new(geo::LineString::from(vec![(0.0, 0.0), (5.0, 0.0), (0.0, 0.0)]), vec![]);
        assert!(interior_point(&flat).is_none());
    }
}
