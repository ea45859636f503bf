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
