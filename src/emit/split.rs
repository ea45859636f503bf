//! Polygons → GDSII boundary rings: snapped to 1 nm, hole-free, closed, deduplicated and
//! below the point limit.
//!
//! Takes an artwork polygon (mm, may have holes, any vertex count), gives rings of
//! integer nanometre points. A GDSII BOUNDARY cannot have holes (GDSII Stream Format
//! Manual, release 6.0), so every hole is opened by a vertical cut through it
//! (docs/crate-notes.md, *Holes in GDSII boundaries*: splitting gives valid pieces where
//! a keyhole would touch itself); a
//! ring above the point limit is cut into strips at quantiles of its vertices' x. Cuts go
//! through `geom::intersection`, whose inputs are already on the 1 nm grid; where a
//! cut crosses a slanted edge the new vertex is rounded to the grid, so the pieces may
//! differ from the polygon by less than half a nanometre along the cut.

use crate::geom::{Polygon, clip_to_rect, intersection, orient_ccw, rect, region_of, snap, snap_value};
use crate::{Error, Result};

/// Most points a boundary may hold, closing point included. The format allows 8191
/// (GDSII Stream Format Manual, release 6.0: one XY record of at most 64 KiB); many
/// readers want far fewer, so we keep to 1024.
pub const MAX_POINTS: usize = 1024;

/// Nanometres per millimetre (the database unit is 1 nm).
const NM_PER_MM: f64 = 1e6;

/// Deepest cut recursion before giving up (each cut halves a hole count or a point count).
const MAX_DEPTH: usize = 64;

/// A closed ring of integer nanometre points, first point repeated at the end.
pub type NmRing = Vec<(i32, i32)>;

/// The boundary rings that together cover `p` exactly (to the 1 nm grid).
pub fn boundary_rings(p: &Polygon) -> Result<Vec<NmRing>> {
    let mut out = Vec::new();
    // Holes wound like their outer ring would fill under the non-zero rule that
    // `geom::intersection` uses (docs/crate-notes.md, *Fill rule*), so orient first.
    for piece in hole_free(orient_ccw(&snap(p)), 0)? {
        limit_points(&piece, 0, &mut out)?;
    }
    Ok(out)
}

/// x-range of a ring.
fn x_range(pts: &[crate::geom::Pt]) -> (f64, f64) {
    pts.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| (a.min(p.x), b.max(p.x)))
}

/// Cuts `p` through its holes until no piece has one: by vertical lines through the
/// middle of every hole at once, so that no piece between two neighbouring lines holds a
/// whole hole. The polygon is cut into those strips ring by ring (Sutherland–Hodgman,
/// [`crate::geom::clip_to_rect`]), halving the range of strips each time (each halving a
/// linear pass over the vertices), and each strip is then made into proper polygons by
/// one boolean with its rectangle: the booleans see every vertex about once. (Cutting at
/// the median hole and recursing ran the booleans over every vertex once per level:
/// most of the GDSII and Gerber writers' time on a common along forty digits.)
fn hole_free(p: Polygon, depth: usize) -> Result<Vec<Polygon>> {
    if p.interiors().is_empty() {
        return Ok(vec![p]);
    }
    if depth > MAX_DEPTH {
        return Err(Error::Bug("GDSII: could not cut a polygon into hole-free pieces".into()));
    }
    let mut cuts: Vec<f64> = p.interiors().iter().map(|h| x_range(&h.0)).map(|(h0, h1)| snap_value((h0 + h1) / 2.0)).collect();
    cuts.sort_by(f64::total_cmp);
    cuts.dedup();
    let (x0, x1) = x_range(&p.exterior().0);
    let mut edges = vec![snap_value(x0 - 1.0)];
    edges.extend(cuts);
    edges.push(snap_value(x1 + 1.0));
    let mut out = Vec::new();
    for piece in pieces_between(p, &edges) {
        // A piece holds no hole (each hole's own line crosses it); should one, it is cut
        // again.
        out.extend(hole_free(piece, depth + 1)?);
    }
    Ok(out)
}

/// The proper polygons of `p` between consecutive vertical `edges` (x, ascending, the
/// first left of it and the last right of it), snapped and counter-clockwise: cut into
/// strips ring by ring ([`cut_strips`]), each strip made proper by one boolean with its
/// rectangle.
fn pieces_between(p: Polygon, edges: &[f64]) -> Vec<Polygon> {
    let ys = p.exterior().0.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), q| (a.min(q.y), b.max(q.y)));
    let (y0, y1) = (ys.0 - 1.0, ys.1 + 1.0);
    let mut strips = Vec::new();
    cut_strips(p, edges, &mut strips);
    strips
        .into_iter()
        .flat_map(|(strip, lo, hi)| intersection(&region_of([strip]), &region_of([rect(lo, y0, hi, y1)])).0)
        .map(|q| orient_ccw(&snap(&q)))
        .collect()
}

/// The parts of `p` between consecutive `edges` (x, ascending), each with its two edges;
/// rings clipped as they are, possibly running along the edges (see [`clip_to_rect`]).
fn cut_strips(p: Polygon, edges: &[f64], out: &mut Vec<(Polygon, f64, f64)>) {
    if edges.len() == 2 {
        out.push((p, edges[0], edges[1]));
        return;
    }
    let mid = edges.len() / 2;
    for range in [&edges[..=mid], &edges[mid..]] {
        if let Some(part) = clip_to_rect(&p, range[0], f64::MIN, range[range.len() - 1], f64::MAX) {
            cut_strips(part, range, out);
        }
    }
}

/// Integer ring of a hole-free polygon: rounded to nm, consecutive duplicates removed,
/// closed; `None` when nothing with area is left.
fn nm_ring(p: &Polygon) -> Option<NmRing> {
    let mut r: NmRing = Vec::new();
    for q in &p.exterior().0 {
        let pt = ((q.x * NM_PER_MM).round() as i32, (q.y * NM_PER_MM).round() as i32);
        if r.last() != Some(&pt) {
            r.push(pt);
        }
    }
    while r.len() > 1 && r.first() == r.last() {
        r.pop();
    }
    if r.len() < 3 || area2(&r) == 0 {
        return None;
    }
    r.push(r[0]);
    Some(r)
}

/// Rings mirrored about the vertical line `x = axis_nm / 2` (x → axis_nm − x, whole
/// nanometres), each reversed so that it winds as before: the rings of a mirrored
/// polygon without cutting it again (exact when the axis lies on the 1 nm grid, as the
/// glass does).
pub fn mirror_rings(rings: &[NmRing], axis_nm: i64) -> Vec<NmRing> {
    rings.iter().map(|r| r.iter().rev().map(|&(x, y)| ((axis_nm - x as i64) as i32, y)).collect()).collect()
}

/// Twice the signed area of an integer ring (exact).
pub fn area2(r: &[(i32, i32)]) -> i128 {
    let n = r.len();
    (0..n)
        .map(|i| {
            let (a, b) = (r[i], r[(i + 1) % n]);
            a.0 as i128 * b.1 as i128 - b.0 as i128 * a.1 as i128
        })
        .sum()
}

/// Pushes the rings of a hole-free polygon, cutting it while it has too many points:
/// into strips at once, by vertical lines at quantiles of its vertices' x so that each
/// strip holds about half the limit, each strip made proper by one boolean with its
/// rectangle ([`pieces_between`], as for holes). (Halving at the median x, each half with
/// its own booleans, ran the booleans over every vertex once per level: a third of the
/// GDSII and Gerber writers' time on a common along a row of digits.)
fn limit_points(p: &Polygon, depth: usize, out: &mut Vec<NmRing>) -> Result<()> {
    let Some(ring) = nm_ring(p) else {
        return Ok(());
    };
    if ring.len() <= MAX_POINTS {
        out.push(ring);
        return Ok(());
    }
    if depth > MAX_DEPTH {
        return Err(Error::Bug("GDSII: could not cut a polygon below the point limit".into()));
    }
    let mut xs: Vec<f64> = p.exterior().0.iter().map(|q| q.x).collect();
    xs.sort_by(f64::total_cmp);
    let strips = ring.len().div_ceil(MAX_POINTS / 2).max(2);
    let mut edges = vec![snap_value(xs[0] - 1.0)];
    edges.extend((1..strips).map(|k| snap_value(xs[k * xs.len() / strips])));
    edges.push(snap_value(xs[xs.len() - 1] + 1.0));
    edges.dedup();
    for piece in pieces_between(p.clone(), &edges) {
        for q in hole_free(piece, 0)? {
            limit_points(&q, depth + 1, out)?;
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{circle, pt, ring};

    fn total(rings: &[NmRing]) -> i128 {
        rings.iter().map(|r| area2(r).abs()).sum()
    }

    /// A square ring keeps its area to the square nanometre: the cut crosses only
    /// horizontal edges, so no vertex is rounded (shoelace formula on integers).
    /// A counter-clockwise L-shaped ring mirrored about x = 5 mm (axis 10 mm): every
    /// point moves to 10 − x, the ring still winds counter-clockwise (positive shoelace
    /// area, the same as before: mirroring keeps areas), and mirroring twice gives it back.
    #[test]
    fn mirrored_rings_keep_area_and_winding() {
        let l: NmRing = vec![(0, 0), (3_000_000, 0), (3_000_000, 1_000_000), (1_000_000, 1_000_000), (1_000_000, 2_000_000), (0, 2_000_000), (0, 0)];
        let m = mirror_rings(&[l.clone()], 10_000_000);
        assert_eq!(area2(&l), area2(&m[0]));
        assert!(area2(&m[0]) > 0);
        let xs: Vec<i32> = m[0].iter().map(|p| p.0).collect();
        assert!(xs.iter().all(|&x| (7_000_000..=10_000_000).contains(&x)), "{xs:?}");
        assert_eq!(mirror_rings(&m, 10_000_000), vec![l]);
    }

    #[test]
    fn square_ring_splits_exactly() {
        let mut p = rect(8.0, 12.0, 20.0, 24.0);
        p.interiors_push(rect(12.0, 16.0, 16.0, 20.0).exterior().clone());
        let rings = boundary_rings(&p).unwrap();
        assert!(rings.len() >= 2);
        assert_eq!(total(&rings), 2 * (144 - 16) * 1_000_000_000_000i128);
        for r in &rings {
            assert_eq!(r.first(), r.last());
        }
    }

    /// Two holes side by side both get opened.
    #[test]
    fn every_hole_is_opened() {
        let mut p = rect(0.0, 0.0, 10.0, 4.0);
        p.interiors_push(rect(1.0, 1.0, 3.0, 3.0).exterior().clone());
        p.interiors_push(rect(6.0, 1.0, 8.0, 3.0).exterior().clone());
        let rings = boundary_rings(&p).unwrap();
        assert_eq!(total(&rings), 2 * (40 - 8) * 1_000_000_000_000i128);
    }

    /// A finely flattened circle (thousands of vertices) is cut below the limit; its
    /// area changes only by the rounding of cut vertices (< 1 nm × cut length).
    #[test]
    fn many_points_are_cut_below_the_limit() {
        let c = circle(pt(0.0, 0.0), 10.0, 1e-6);
        assert!(c.exterior().0.len() > 4 * MAX_POINTS);
        let rings = boundary_rings(&c).unwrap();
        assert!(rings.iter().all(|r| r.len() <= MAX_POINTS));
        let want = crate::geom::area(&snap(&c)) * 1e12;
        let got = total(&rings) as f64 / 2.0;
        assert!((got - want).abs() < 8.0 * 20.0 * 1e6, "{got} vs {want}");
    }

    /// A circular ring (slanted edges at the cut) stays within half a nanometre times
    /// the cut length of its area.
    #[test]
    fn round_ring_keeps_area_to_the_grid() {
        let r = ring(pt(5.0, 5.0), 3.0, 2.0, 1e-3);
        let rings = boundary_rings(&r).unwrap();
        let want = crate::geom::area(&snap(&r)) * 1e12;
        let got = total(&rings) as f64 / 2.0;
        assert!((got - want).abs() < 4.0 * 1e6, "{got} vs {want}");
    }

    /// A U whose arms hold holes, one hole's x-range inside another's and one hole in
    /// each arm at the same x: every piece is hole-free (a GDSII boundary) and together
    /// they keep the area exactly (axis-parallel edges, integer shoelace), so they
    /// neither overlap nor leave a gap.
    #[test]
    fn holes_in_the_arms_of_a_u_are_opened() {
        let u = vec![(0.0, 0.0), (12.0, 0.0), (12.0, 10.0), (8.0, 10.0), (8.0, 3.0), (4.0, 3.0), (4.0, 10.0), (0.0, 10.0)];
        let mut p = Polygon::new(geo::LineString::from(u), vec![]);
        for (x0, y0, x1, y1) in [(1.0, 4.0, 3.0, 9.0), (1.5, 1.0, 2.5, 2.0), (9.0, 4.0, 11.0, 5.0), (9.0, 6.0, 11.0, 8.0), (5.0, 0.5, 7.0, 2.5)] {
            p.interiors_push(rect(x0, y0, x1, y1).exterior().clone());
        }
        let rings = boundary_rings(&p).unwrap();
        let holes = 10.0 + 1.0 + 2.0 + 4.0 + 4.0;
        let want = ((12.0 * 10.0 - 4.0 * 7.0 - holes) * 1e12) as i128;
        assert_eq!(total(&rings), 2 * want);
        // Cut at x = 2, 6 and 10 (the holes' middles): one piece per strip.
        assert_eq!(rings.len(), 4);
    }

    /// A strip with 300 holes in a row (more than the cut depth allows one at a time) is
    /// opened by cuts through every hole and keeps its area exactly (axis-parallel edges only).
    #[test]
    fn hundreds_of_holes_are_opened() {
        let mut p = rect(0.0, 0.0, 301.0, 3.0);
        for k in 0..300 {
            let x = 0.5 + k as f64;
            p.interiors_push(rect(x, 1.0, x + 0.5, 2.0).exterior().clone());
        }
        let rings = boundary_rings(&p).unwrap();
        assert_eq!(total(&rings), 2 * (903_000_000_000_000i128 - 300 * 500_000_000_000));
    }
}
