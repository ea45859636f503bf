//! Final clean-up every element outline goes through: snapped to the 1 nm grid, repeated
//! points removed, exteriors counter-clockwise and holes clockwise, validity checked.

use crate::geom::{Polygon, Region, area, orient_ccw, snap, union_all};
use geo::{RemoveRepeatedPoints, Validation};

/// Cleans a region; an error (a bug, not the user's fault) names what is invalid.
pub fn finish(r: &Region) -> Result<Region, String> {
    let cleaned = clean(r);
    if cleaned.is_valid() {
        return Ok(cleaned);
    }
    // Snapping can make two pieces touch along an edge; uniting them again on the grid
    // repairs that.
    let again = clean(&union_all(cleaned.0.iter().cloned()));
    match again.check_validation() {
        Ok(()) => Ok(again),
        Err(e) => Err(format!("outline is not valid after snapping: {e}")),
    }
}

fn clean(r: &Region) -> Region {
    let polys: Vec<Polygon> = snap(r)
        .remove_repeated_points()
        .0
        .into_iter()
        .filter(|p| p.exterior().0.len() >= 4 && area(p) > 1e-12)
        .map(|p| orient_ccw(&p))
        .collect();
    geo::MultiPolygon(polys)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, rect, region_of};
    use geo::Winding;

    #[test]
    fn orients_and_snaps() {
        let mut p = rect(0.0, 0.0, 1.0000000004, 1.0);
        p.exterior_mut(|e| e.0.reverse());
        let r = finish(&region_of([p])).unwrap();
        assert!(r.0[0].exterior().is_ccw());
        assert!(r.0[0].exterior().0.iter().all(|c| c.x == 0.0 || c.x == 1.0));
        let _ = pt(0.0, 0.0);
    }
}
