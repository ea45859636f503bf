//! A point guaranteed to lie inside a polygon (for placing names on shapes).

use super::{Polygon, Pt};
use geo::InteriorPoint;

/// A point inside `p` (not on its boundary when `p` has area), or `None` for an empty
/// polygon. Uses geo's interior-point algorithm (a horizontal scan line through the
/// middle of the widest interior run).
///
/// ```
/// use segmask::geom::{interior_point, ring, pt};
/// let r = ring(pt(0.0, 0.0), 2.0, 1.0, 1e-3);
/// let p = interior_point(&r).unwrap();
/// let d = (p.x * p.x + p.y * p.y).sqrt();
/// assert!(d > 1.0 && d < 2.0);
/// ```
pub fn interior_point(p: &Polygon) -> Option<Pt> {
    p.interior_point().map(|q| q.0)
}
