//! Common electrodes that share the back plate: each grown from its own pixels, split
//! where two meet, and kept the minimum gap apart.
//!
//! Each common takes the points nearer its pixels' gap-free bodies than any other
//! common's (a Voronoi cell, built as a union of growth steps), out to the overlap margin
//! plus half the gap; the cell is then shrunk by half the gap. Two shrunk cells are at
//! least the gap apart (each point keeps a disc of half the gap inside its own cell), and
//! where the bodies of two commons touch — the middle of a segment gap — each common
//! stops half the back gap short of the middle, so a segment gap at least as wide as the
//! back gap leaves every pixel fully covered.
//!
//! The growth never reaches further than the overlap margin plus half the gap, so bodies
//! further apart than twice that cannot meet: the split is made cluster by cluster (the
//! bodies whose boxes, grown by that reach, touch one another: a digit, an icon, a bar
//! graph), each with booleans over its own few polygons, and the clusters' cells are
//! simply put together. The work grows with the number of elements, not with the glass
//! (on the 40-digit benchmark the growth over the whole glass was the electrode stage's
//! time). A cluster equal to an earlier one but for a shift (a row of equal digits) takes
//! that one's cells, shifted; a cluster of one common alone is grown in one offset.

use crate::geom::{difference, offset_round, snap, translate, union_all, Polygon, Region};
use geo::BoundingRect;

/// Back-plate outline of every common, from the bodies of its pixels (one region per
/// common, in common order; the bodies of one common may touch or overlap, they are
/// united cluster by cluster).
pub fn split_commons(bodies: &[Region], margin: f64, gap: f64, tol: f64) -> Vec<Region> {
    if bodies.len() == 1 {
        return vec![offset_round(&union_all(bodies[0].0.iter().cloned()), margin, tol)];
    }
    let reach = margin + gap / 2.0;
    let mut out: Vec<Vec<Polygon>> = vec![Vec::new(); bodies.len()];
    // Clusters are split on their own (rayon spreads them over the cores) and joined in
    // cluster order, so the commons are the same as one cluster after another.
    use rayon::prelude::*;
    let locals: Vec<Vec<Region>> = clusters(bodies, reach + tol)
        .par_iter()
        .map(|cluster| {
            (0..bodies.len()).map(|k| union_all(cluster.iter().filter(|(c, _)| *c == k).map(|(_, i)| bodies[k].0[*i].clone()))).collect()
        })
        .collect();
    // A cluster alike another but for a shift (a row of equal digits on the same
    // commons) is split once and the cells shifted: the germination demo's 140 clusters
    // are 19 shapes.
    let (model, shift) = crate::geom::alike(&locals);
    let once: Vec<Option<Vec<Region>>> =
        (0..locals.len()).into_par_iter().map(|i| (model[i] == i).then(|| split_cluster(&locals[i], reach, gap, tol))).collect();
    let split: Vec<Vec<Region>> = (0..locals.len())
        .map(|i| match &once[i] {
            Some(cells) => cells.clone(),
            None => {
                let (dx, dy) = shift[i];
                once[model[i]].iter().flatten().map(|c| snap(&translate(c, dx, dy))).collect()
            }
        })
        .collect();
    for cells in split {
        for (k, cell) in cells.into_iter().enumerate() {
            out[k].extend(cell.0);
        }
    }
    out.into_iter().map(Region::new).collect()
}

/// The bodies' polygons (common, index within that common's region) grouped so that two
/// polygons whose boxes grown by `reach` overlap are in one group (a sweep along x with
/// union–find; boxes are a safe over-estimate of where the growth reaches).
fn clusters(bodies: &[Region], reach: f64) -> Vec<Vec<(usize, usize)>> {
    let mut items: Vec<((usize, usize), [f64; 4])> = Vec::new();
    for (k, r) in bodies.iter().enumerate() {
        for (i, p) in r.0.iter().enumerate() {
            if let Some(b) = p.bounding_rect() {
                items.push(((k, i), [b.min().x - reach, b.min().y - reach, b.max().x + reach, b.max().y + reach]));
            }
        }
    }
    items.sort_by(|a, b| a.1[0].total_cmp(&b.1[0]));
    let mut parent: Vec<usize> = (0..items.len()).collect();
    fn root(p: &mut [usize], mut i: usize) -> usize {
        while p[i] != i {
            p[i] = p[p[i]];
            i = p[i];
        }
        i
    }
    let mut open: Vec<usize> = Vec::new();
    for j in 0..items.len() {
        let b = items[j].1;
        open.retain(|&i| items[i].1[2] >= b[0]);
        for &i in &open {
            let a = items[i].1;
            if a[1] <= b[3] && b[1] <= a[3] {
                let (ri, rj) = (root(&mut parent, i), root(&mut parent, j));
                parent[ri] = rj;
            }
        }
        open.push(j);
    }
    let mut groups: std::collections::BTreeMap<usize, Vec<(usize, usize)>> = Default::default();
    for j in 0..items.len() {
        let r = root(&mut parent, j);
        groups.entry(r).or_default().push(items[j].0);
    }
    groups.into_values().collect()
}

/// The split of one cluster (every common's bodies in it, some empty).
fn split_cluster(bodies: &[Region], reach: f64, gap: f64, tol: f64) -> Vec<Region> {
    // A cluster of one common's bodies alone (an icon, a legend, a bar graph's steps on
    // one line) meets no other: its cell is its bodies grown by the whole reach (each
    // growth step lies inside the next), shrunk as every cell is. The steps were a third
    // of the two-row benchmark's split, an icon of round parts 40–60 ms.
    let mut used = bodies.iter().enumerate().filter(|(_, b)| !b.0.is_empty());
    if let (Some((k, only)), None) = (used.next(), used.next()) {
        let mut cells = vec![Region::new(vec![]); bodies.len()];
        cells[k] = offset_round(&offset_round(only, reach, tol), -(gap / 2.0 + tol), tol);
        return cells;
    }
    let steps = ((reach / (gap / 2.0).max(1e-3)).ceil() as usize).clamp(2, 8);
    // Each body grown by each step once: growing the union of the other commons' bodies
    // is the union of their growths (a Minkowski sum distributes over a union), so the
    // rings of every common come from the same few offsets instead of each common growing
    // all the others again.
    let grown: Vec<Vec<Region>> = (1..=steps)
        .map(|i| {
            let t = reach * i as f64 / steps as f64;
            bodies.iter().map(|b| if b.0.is_empty() { Region::new(vec![]) } else { offset_round(b, t, tol) }).collect()
        })
        .collect();
    let cells: Vec<Region> = (0..bodies.len())
        .map(|k| {
            if bodies[k].0.is_empty() {
                return Region::new(vec![]);
            }
            let mut parts: Vec<crate::geom::Polygon> = bodies[k].0.clone();
            for step in &grown {
                let others = union_all(step.iter().enumerate().filter(|(l, _)| *l != k).flat_map(|(_, g)| g.0.iter().cloned()));
                parts.extend(difference(&step[k], &others).0);
            }
            union_all(parts)
        })
        .collect();
    // Flattened arcs of the shrink may cut a chord inside the exact offset: a little more.
    cells.iter().map(|c| offset_round(c, -(gap / 2.0 + tol), tol)).collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, distance, intersection, rect, region_of};

    /// Two squares 0.4 mm apart on different commons, margin 0.3, gap 0.05: the commons
    /// keep the gap (measured with geo's polygon distance), each still covers its square,
    /// and the free sides keep the whole margin (area ≥ that of the square grown by it on
    /// three sides; plane geometry).
    #[test]
    fn two_commons_meet_in_the_middle_and_keep_the_gap() {
        let a = region_of([rect(0.0, 0.0, 1.0, 1.0)]);
        let b = region_of([rect(1.4, 0.0, 2.4, 1.0)]);
        let out = split_commons(&[a.clone(), b.clone()], 0.3, 0.05, 1e-4);
        let d = distance(&out[0].0[0], &out[1].0[0]);
        assert!(d >= 0.05 - 1e-6, "gap {d}");
        assert!(d <= 0.05 + 0.1, "the split leaves no wide strip: {d}");
        for (sq, c) in [(&a, &out[0]), (&b, &out[1])] {
            assert!((area(&intersection(sq, c)) - 1.0).abs() < 1e-6, "square not covered");
        }
        assert!(area(&out[0]) > 1.0 + 3.0 * 0.3 - 1e-3);
    }

    /// Touching bodies (a gap-free digit) split at their common edge with the gap centred
    /// on it.
    #[test]
    fn touching_bodies_split_on_their_edge() {
        let a = region_of([rect(0.0, 0.0, 1.0, 1.0)]);
        let b = region_of([rect(1.0, 0.0, 2.0, 1.0)]);
        let out = split_commons(&[a, b], 0.2, 0.06, 1e-4);
        let xa = out[0].0[0].exterior().0.iter().map(|c| c.x).fold(f64::MIN, f64::max);
        let xb = out[1].0[0].exterior().0.iter().map(|c| c.x).fold(f64::MAX, f64::min);
        assert!((xa - 0.97).abs() < 2e-4 && (xb - 1.03).abs() < 2e-4, "{xa} {xb}");
    }

    /// One common: the bodies grown by the margin, as under static drive.
    #[test]
    fn one_common_is_the_grown_bodies() {
        let a = region_of([rect(0.0, 0.0, 1.0, 1.0)]);
        let out = split_commons(&[a], 0.2, 0.05, 1e-4);
        assert!((area(&out[0]) - (1.0 + 0.8 + std::f64::consts::PI * 0.04)).abs() < 2e-3);
    }

    /// Two commons whose bodies lie far apart (each its own cluster, met by no other)
    /// get each its bodies grown by the margin, as one common alone does (the area of a
    /// square grown by `m`: 1 + 4m + πm², plane geometry), and a common whose cluster
    /// holds another's is split from it.
    #[test]
    fn a_cluster_of_one_common_is_its_grown_bodies() {
        let (m, gap, tol) = (0.2, 0.05, 1e-4);
        let grown = 1.0 + 4.0 * m + std::f64::consts::PI * m * m;
        let a = region_of([rect(0.0, 0.0, 1.0, 1.0)]);
        let b = region_of([rect(5.0, 0.0, 6.0, 1.0), rect(7.2, 0.0, 8.2, 1.0)]);
        let c = region_of([rect(8.3, 0.0, 9.3, 1.0)]);
        let out = split_commons(&[a, b, c], m, gap, tol);
        assert!((area(&out[0]) - grown).abs() < 2e-3, "{}", area(&out[0]));
        assert_eq!(out[1].0.len(), 2, "two pieces of the second common");
        // The piece met by no other is the larger; the other gives up half the space to
        // the third common.
        let (alone, split) = (out[1].0.iter().map(area).fold(0.0, f64::max), out[1].0.iter().map(area).fold(f64::MAX, f64::min));
        assert!((alone - grown).abs() < 2e-3, "{alone}");
        assert!(split < grown - 0.2, "{split}");
        assert!(distance(&out[1].0[1], &out[2].0[0]).min(distance(&out[1].0[0], &out[2].0[0])) >= gap - 1e-6);
    }

    /// Two pairs of touching bodies (two commons) alike but for a shift, and a third pair
    /// set differently: the first two share a model, the third is its own; the shifted
    /// pair's cells, taken from the first, are those its own split gives (the area of
    /// their symmetric difference below a square nanometre per millimetre of outline).
    #[test]
    fn clusters_alike_but_for_a_shift_are_split_once() {
        let (m, gap, tol) = (0.2, 0.06, 1e-4);
        let pair = |x: f64, w: f64| (region_of([rect(x, 0.0, x + 1.0, 1.0)]), region_of([rect(x + 1.0, 0.0, x + 1.0 + w, 1.3)]));
        let (a0, b0) = pair(0.0, 1.0);
        let (a1, b1) = pair(7.37, 1.0);
        let (a2, b2) = pair(15.0, 0.6);
        let bodies = [region_of(a0.0.iter().chain(&a1.0).chain(&a2.0).cloned()), region_of(b0.0.iter().chain(&b1.0).chain(&b2.0).cloned())];
        let reach = m + gap / 2.0;
        let locals: Vec<Vec<Region>> = [(&a0, &b0), (&a1, &b1), (&a2, &b2)].iter().map(|(a, b)| vec![(*a).clone(), (*b).clone()]).collect();
        let (model, shift) = crate::geom::alike(&locals);
        assert_eq!(model, [0, 0, 2]);
        assert!((shift[1].0 - 7.37).abs() < 1e-9 && shift[1].1.abs() < 1e-9, "{:?}", shift[1]);
        let out = split_commons(&bodies, m, gap, tol);
        let own = split_cluster(&locals[1], reach, gap, tol);
        for k in 0..2 {
            let shifted = region_of(out[k].0.iter().filter(|p| p.exterior().0.iter().all(|c| c.x > 5.0 && c.x < 13.0)).cloned());
            let xor = area(&difference(&shifted, &own[k])) + area(&difference(&own[k], &shifted));
            assert!(area(&own[k]) > 1.0 && xor < 1e-6 * 10.0, "common {k}: {xor}");
        }
    }

    /// The premise of growing each body once: the union of two grown bodies, one an
    /// L overlapping a square, is the grown union (a Minkowski sum distributes over a
    /// union; plane geometry): their symmetric difference is below the flattening of the
    /// round joins, 1 µm chords along some 20 mm of outline.
    #[test]
    fn growing_each_body_gives_the_grown_union() {
        let l = crate::geom::union_all([rect(0.0, 0.0, 3.0, 1.0), rect(0.0, 0.0, 1.0, 3.0)]);
        let sq = region_of([rect(2.5, 0.5, 4.0, 2.0)]);
        let (t, tol) = (0.3, 1e-3);
        let apart = union_all(offset_round(&l, t, tol).0.into_iter().chain(offset_round(&sq, t, tol).0));
        let together = offset_round(&union_all(l.0.iter().cloned().chain(sq.0.iter().cloned())), t, tol);
        let xor = area(&difference(&apart, &together)) + area(&difference(&together, &apart));
        assert!(xor < 20.0 * tol, "{xor}");
        assert!(area(&apart) > 12.0, "{}", area(&apart));
    }
}
