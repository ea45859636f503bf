//! Centroid (centre of area) of a region, for reports that say where an element sits.
//!
//! Takes a region, gives the area-weighted mean of its polygons' centroids (holes
//! subtracted), computed by geo's `Centroid`.

use super::{Pt, Region};
use geo::Centroid;

/// Centre of area of a region; `None` for an empty region.
///
/// ```
/// use segmask::geom::{centroid, rect, region_of};
/// // Two unit squares side by side, 0..1 and 2..3 in x: centre at (1.5, 0.5).
/// let c = centroid(&region_of([rect(0.0, 0.0, 1.0, 1.0), rect(2.0, 0.0, 3.0, 1.0)])).unwrap();
/// assert!((c.x - 1.5).abs() < 1e-12 && (c.y - 0.5).abs() < 1e-12);
/// ```
pub fn centroid(r: &Region) -> Option<Pt> {
    r.centroid().map(|p| p.0)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, region_of};

    /// An L of a 2 × 1 bar and a 1 × 1 square on its left end: the centre of area of
    /// composite figures is the area-weighted mean of the parts' centres (any statics
    /// handbook): ((1·2 + 0.5·1)/3, (0.5·2 + 1.5·1)/3) = (5/6, 5/6).
    #[test]
    fn l_shape_is_area_weighted() {
        let c = centroid(&region_of([rect(0.0, 0.0, 2.0, 1.0), rect(0.0, 1.0, 1.0, 2.0)])).unwrap();
        assert!((c.x - 5.0 / 6.0).abs() < 1e-12 && (c.y - 5.0 / 6.0).abs() < 1e-12, "{c:?}");
    }

    #[test]
    fn empty_region_has_none() {
        assert!(centroid(&region_of([])).is_none());
    }
}
