//! Segment bodies: the pieces that tile a digit without gaps, one a segment, whose
//! shared edges run along the middle of every slot between two segments.
//!
//! Takes a style's skeleton, a digit's cell and the segment gap; gives each segment's
//! body as convex polygons. The electrode stage grows each common's back electrode from
//! the bodies of its pixels and splits two commons where their bodies meet
//! (`electrode/split.rs`), stopping half the back gap short of that line. So a body's
//! edge must lie in the middle of the slot: there each side keeps `gap / 2` of room and
//! a pixel is covered whenever the segment gap is at least the back gap.
//!
//! Where segments meet at a common node the cuts are mitres on the bisectors, and the
//! gap-free construction (gap 0) already puts the body edge in the middle of the slot.
//! Where a segment gives way — it ends on the middle of another (a T junction), or it is
//! a minor diagonal meeting a major segment — the whole slot lies on its side: its
//! outline stops `gap` short of the other's edge. Its body then stops at the middle of
//! the slot, `gap / 2` short, and the strip between goes to the body of the segment it
//! gives way to. Where one end gives way to two segments (a diagonal in the corner
//! between two majors), the strip is split between them by which edge is nearer.

use super::digit::{Cell, Cut, Half, clip, clip_band, end_cuts, ring_area, ring_to_polygon};
use super::font::{SegmentDef, SkeletonDef};
use crate::geom::{Polygon, Pt};

/// Strips thinner than this (mm²) are rounding, not area.
const SLIVER: f64 = 1e-12;

/// Every segment's body, in the skeleton's order: its own convex piece and the strips
/// of the slots of the segments that give way to it.
pub fn build_bodies(skel: &SkeletonDef, cell: &Cell, gap: f64) -> Result<Vec<(String, Vec<Polygon>)>, String> {
    let segs = &skel.segments;
    let mut own: Vec<Vec<Pt>> = Vec::with_capacity(segs.len());
    let mut strips: Vec<Vec<Vec<Pt>>> = vec![Vec::new(); segs.len()];
    for (i, s) in segs.iter().enumerate() {
        let (p0, p1) = (cell.map(s.from), cell.map(s.to));
        let cuts = cuts_of(segs, cell, i, s)?;
        // The gap-free piece: parallel cuts on the other segment's edge.
        let full = clip_band(p0, p1, cell, &cuts.iter().map(|c| c.half).collect::<Vec<_>>());
        // The body proper: parallel cuts moved to the middle of the slot.
        let moved: Vec<Half> = cuts
            .iter()
            .map(|c| match c.gives_way_to {
                Some(_) => Half { n: c.half.n, c: c.half.c + gap / 2.0 },
                None => c.half,
            })
            .collect();
        let body = clip_band(p0, p1, cell, &moved);
        if body.len() < 3 || ring_area(&body) < SLIVER {
            return Err(format!("segment `{}` vanishes: the stroke is too wide for the cell", s.name));
        }
        own.push(body);
        // A T junction cuts twice along the same edge (the segment passing through is
        // both neighbours): one strip per edge.
        let mut parallel: Vec<&Cut> = Vec::new();
        for c in cuts.iter().filter(|c| c.gives_way_to.is_some()) {
            if !parallel.iter().any(|d| d.gives_way_to == c.gives_way_to && same_line(d.half, c.half)) {
                parallel.push(c);
            }
        }
        for (k, c) in parallel.iter().enumerate() {
            // Within half the gap of this edge …
            let mut strip = clip(&full, Half { n: neg(c.half.n), c: -(c.half.c + gap / 2.0) });
            // … and nearer this edge than any other the segment gives way to.
            for (l, d) in parallel.iter().enumerate() {
                if l != k && !strip.is_empty() {
                    strip = clip(&strip, Half { n: sub(d.half.n, c.half.n), c: d.half.c - c.half.c });
                }
            }
            if strip.len() >= 3 && ring_area(&strip) > SLIVER {
                strips[c.gives_way_to.expect("filtered")].push(strip);
            }
        }
    }
    Ok(segs
        .iter()
        .zip(own)
        .zip(strips)
        .map(|((s, body), extra)| (s.name.clone(), std::iter::once(body).chain(extra).map(ring_to_polygon).collect()))
        .collect())
}

/// Both ends' cuts of segment `i` built gap-free: mitres on the bisectors, parallel cuts
/// on the edge of the segment given way to.
fn cuts_of(segs: &[SegmentDef], cell: &Cell, i: usize, s: &SegmentDef) -> Result<Vec<Cut>, String> {
    let mut cuts = end_cuts(segs, cell, i, s.from, 0.0)?;
    cuts.extend(end_cuts(segs, cell, i, s.to, 0.0)?);
    Ok(cuts)
}

fn same_line(a: Half, b: Half) -> bool {
    (a.n.x - b.n.x).abs() < 1e-9 && (a.n.y - b.n.y).abs() < 1e-9 && (a.c - b.c).abs() < 1e-9
}

fn neg(a: Pt) -> Pt {
    crate::geom::pt(-a.x, -a.y)
}

fn sub(a: Pt, b: Pt) -> Pt {
    crate::geom::pt(a.x - b.x, a.y - b.y)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, region_of, union_all};

    fn fourteen() -> SkeletonDef {
        crate::glyph::fonts::Fonts::builtin().expect("built-in fonts").style(crate::layout::DigitStyle::Fourteen).clone()
    }

    /// Every slot's middle is a body edge: each segment's outline keeps at least
    /// `gap / 2` from the bodies of all other segments (measured with geo's polygon
    /// distance). With the bodies built gap-free instead, the inner vertical `i` of the
    /// fourteen-segment style touches the body of `a` (distance 0): that is what left
    /// `a` covered 99.6 % by its common when `i` was on another.
    #[test]
    fn outlines_keep_half_the_gap_from_other_bodies() {
        let skel = fourteen();
        let gap = 0.4;
        for slant in [0.0, 8.0] {
            let cell = Cell { origin: crate::geom::pt(0.0, 0.0), width: 8.0, height: 12.0, stroke: 1.0, slant };
            let outlines = super::super::digit::build_segments(&skel, &cell, gap).unwrap();
            let bodies = build_bodies(&skel, &cell, gap).unwrap();
            for (i, (name, outline)) in outlines.iter().enumerate() {
                for (j, (other, body)) in bodies.iter().enumerate() {
                    if i == j {
                        continue;
                    }
                    for piece in body {
                        let d = crate::geom::distance(outline, piece);
                        assert!(d >= gap / 2.0 - 1e-6, "{slant}°: {name} is {d:.4} mm from the body of {other}");
                    }
                }
            }
            let all = union_all(bodies.iter().flat_map(|b| b.1.iter().cloned()));
            let sum: f64 = bodies.iter().flat_map(|b| b.1.iter()).map(|p| area(&region_of([p.clone()]))).sum();
            // Snapping to the 1 nm grid moves slanted edges: a few µm² over the digit.
            assert!((area(&all) - sum).abs() < 1e-5, "{slant}°: bodies overlap by {}", sum - area(&all));
        }
    }

    #[test]
    fn a_negated_normal_keeps_the_other_side() {
        use super::super::digit::dot;
        let h = Half { n: neg(crate::geom::pt(1.0, 0.0)), c: -1.0 };
        assert!(dot(h.n, crate::geom::pt(0.5, 0.0)) >= h.c);
        assert!(dot(h.n, crate::geom::pt(1.5, 0.0)) < h.c);
    }
}
