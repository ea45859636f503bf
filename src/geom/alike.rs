//! Groups of shapes equal but for a shift: work done on one (a split, an opening) is then
//! the other's shifted, as a row of equal digits repeats it.

use super::Region;

/// For each group of regions (a cluster's bodies per common; a piece with what lies
/// around it), the first group it equals but for a shift, itself where none before does,
/// and that shift. Alike means the same regions, polygons, rings and vertices in the same
/// order, each vertex at the same place, to the nanometre, from the lowest corner of the
/// group's exteriors.
pub fn alike(locals: &[Vec<Region>]) -> (Vec<usize>, Vec<(f64, f64)>) {
    let mut first: std::collections::HashMap<Vec<i64>, usize> = Default::default();
    let mut model = Vec::with_capacity(locals.len());
    let mut shift = Vec::with_capacity(locals.len());
    let corners: Vec<(f64, f64)> = locals
        .iter()
        .map(|cells| {
            let points = cells.iter().flat_map(|r| r.0.iter()).flat_map(|p| p.exterior().0.iter());
            points.fold((f64::INFINITY, f64::INFINITY), |(x, y), c| (x.min(c.x), y.min(c.y)))
        })
        .collect();
    for (i, cells) in locals.iter().enumerate() {
        let (x0, y0) = corners[i];
        let nm = |v: f64| (v / super::SNAP_MM).round() as i64;
        let mut key = Vec::new();
        for r in cells {
            key.push(r.0.len() as i64);
            for p in &r.0 {
                for ring in std::iter::once(p.exterior()).chain(p.interiors()) {
                    key.push(ring.0.len() as i64);
                    key.extend(ring.0.iter().flat_map(|c| [nm(c.x - x0), nm(c.y - y0)]));
                }
            }
        }
        let m = *first.entry(key).or_insert(i);
        model.push(m);
        shift.push((x0 - corners[m].0, y0 - corners[m].1));
    }
    (model, shift)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, region_of};

    /// A group shifted whole is alike its first; one vertex moved by 2 nm is not, and
    /// neither is the same shape with the other region in front.
    #[test]
    fn groups_equal_but_for_a_shift_share_the_first() {
        let group = |x: f64, y: f64, w: f64| vec![region_of([rect(x, y, x + 1.0, y + 1.0)]), region_of([rect(x + 2.0, y, x + 2.0 + w, y + 0.5)])];
        let swapped = {
            let mut g = group(40.0, 0.0, 1.0);
            g.reverse();
            g
        };
        let locals = vec![group(0.0, 0.0, 1.0), group(12.5, -3.25, 1.0), group(25.0, 0.0, 1.0 + 2e-6), swapped];
        let (model, shift) = alike(&locals);
        assert_eq!(model, [0, 0, 2, 3]);
        assert!((shift[1].0 - 12.5).abs() < 1e-12 && (shift[1].1 + 3.25).abs() < 1e-12, "{:?}", shift[1]);
        assert_eq!(shift[0], (0.0, 0.0));
    }
}
