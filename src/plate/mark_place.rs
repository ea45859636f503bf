//! Where the alignment marks go: inside the seal ring, in the liquid crystal outside the
//! viewing window, where the routed ITO of both plates and the transfer dots leave room.
//!
//! Takes the layout and the shapes already placed (ITO of both plates, transfer dots);
//! gives one centre per corner of the liquid-crystal region that has room, and a
//! `mark-room` finding for each corner that has none. A mark is isolated ITO: the front
//! cross sits in the back squares' clear channel, so front and back ITO of a mark never
//! overlap and nothing switches there; each mark keeps the gap rule's distance from every
//! other ITO on both plates (so it neither joins nor overlaps a lead or an electrode, on
//! its own plate or the other) and the edge clearance from both glass edges.
//!
//! Search: from each corner of the liquid-crystal region, candidate centres on a grid of
//! a quarter mark (at most 512 steps a side) inside that corner's quarter of the region,
//! nearest the corner first;
//! each candidate asks an R-tree of obstacle boxes for its neighbours and measures only
//! those, so the work per candidate does not grow with the glass.

use crate::artwork::{Layer, Shape};
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, pt, rect, Polygon, Pt};
use crate::layout::{Layout, Rect};
use rstar::primitives::{GeomWithData, Rectangle};
use rstar::{RTree, AABB};

/// The corners of the liquid-crystal region in the order marks are placed, with their
/// names: two diagonal pairs, (bottom-left, top-right) and (bottom-right, top-left).
const CORNERS: [(f64, f64, &str); 4] =
    [(-1.0, -1.0, "bottom-left"), (1.0, 1.0, "top-right"), (1.0, -1.0, "bottom-right"), (-1.0, 1.0, "top-left")];

/// Most candidate steps along each axis of a corner's quarter.
const MAX_STEPS: f64 = 512.0;

/// Where the marks go, and what could not be placed.
#[derive(Debug, Clone, PartialEq)]
pub struct MarkPlaces {
    /// Centres of the marks placed (front-plate frame, mm).
    pub centres: Vec<Pt>,
    /// A `mark-room` finding for each corner without a mark: a warning while a diagonal
    /// pair of marks stands, an error when none does.
    pub findings: Vec<Finding>,
}

/// An R-tree of obstacle boxes, each carrying its polygon's index.
struct Obstacles<'a> {
    polys: Vec<&'a Polygon>,
    tree: RTree<GeomWithData<Rectangle<[f64; 2]>, usize>>,
}

impl<'a> Obstacles<'a> {
    fn new(shapes: &'a [Shape]) -> Self {
        let polys: Vec<&Polygon> = shapes
            .iter()
            .filter(|s| matches!(s.layer, Layer::FrontIto | Layer::BackIto | Layer::TransferDots))
            .map(|s| &s.polygon)
            .collect();
        let items = polys
            .iter()
            .enumerate()
            .filter_map(|(i, p)| bounds(p).map(|(lo, hi)| GeomWithData::new(Rectangle::from_corners(lo, hi), i)))
            .collect();
        Obstacles { polys, tree: RTree::bulk_load(items) }
    }

    /// True when no obstacle comes within `gap` of the box `b` (x0, y0, x1, y1).
    fn free(&self, b: (f64, f64, f64, f64), gap: f64) -> bool {
        let env = AABB::from_corners([b.0 - gap, b.1 - gap], [b.2 + gap, b.3 + gap]);
        let boxp = rect(b.0, b.1, b.2, b.3);
        self.tree.locate_in_envelope_intersecting(&env).all(|o| geom::distance(&boxp, self.polys[o.data]) >= gap)
    }
}

/// The corners of a polygon's outer ring, or `None` for an empty or non-finite one.
fn bounds(p: &Polygon) -> Option<([f64; 2], [f64; 2])> {
    let mut it = p.exterior().0.iter();
    let f = it.next()?;
    let (mut lo, mut hi) = ([f.x, f.y], [f.x, f.y]);
    for c in it {
        lo = [lo[0].min(c.x), lo[1].min(c.y)];
        hi = [hi[0].max(c.x), hi[1].max(c.y)];
    }
    lo.iter().chain(&hi).all(|v| v.is_finite()).then_some((lo, hi))
}

/// True when the rectangles (x0, y0, x1, y1) overlap or come within `d` of each other.
fn near(a: (f64, f64, f64, f64), b: (f64, f64, f64, f64), d: f64) -> bool {
    a.0 < b.2 + d && b.0 < a.2 + d && a.1 < b.3 + d && b.1 < a.3 + d
}

fn corners(r: &Rect) -> (f64, f64, f64, f64) {
    (r.x, r.y, r.x1(), r.y1())
}

/// The box of a mark centred at `c`.
fn mark_box(c: Pt, half: f64) -> (f64, f64, f64, f64) {
    (c.x - half, c.y - half, c.x + half, c.y + half)
}

/// Places the marks (see the module comment) among `shapes`.
pub fn place_marks(layout: &Layout, shapes: &[Shape]) -> MarkPlaces {
    let half = layout.marks.size / 2.0;
    let gap = layout.rules.mark_gap();
    let room = crate::spec::mark_room(layout);
    let window = corners(&layout.window);
    let obstacles = Obstacles::new(shapes);
    let mid = ((room.0 + room.2) / 2.0, (room.1 + room.3) / 2.0);
    // A quarter mark, coarser only where a corner's quarter would hold more than
    // MAX_STEPS² candidates (tiny marks on large glass), to bound the work and memory.
    let quarter = ((room.2 - room.0) / 2.0).max((room.3 - room.1) / 2.0);
    let step = (layout.marks.size / 4.0).max(quarter / MAX_STEPS);
    let fits = room.2 - room.0 >= 2.0 * half && room.3 - room.1 >= 2.0 * half;
    let mut centres = Vec::new();
    let mut missing = Vec::new();
    for (sx, sy, name) in CORNERS {
        // The first centre: the mark in the very corner of the room.
        let start = pt(if sx < 0.0 { room.0 + half } else { room.2 - half }, if sy < 0.0 { room.1 + half } else { room.3 - half });
        // Candidates reach to the middle of the room less a mark and a gap, so that marks
        // of two corners never meet; none when the room is too small for that.
        let steps = |from: f64, to: f64| {
            let reach = (from - to).abs() - half - gap;
            if reach < 0.0 { None } else { Some((reach / step).floor() as usize) }
        };
        let mut cands: Vec<(f64, Pt)> = Vec::new();
        if let (true, Some(nx), Some(ny)) = (fits, steps(start.x, mid.0), steps(start.y, mid.1)) {
            for i in 0..=nx {
                for j in 0..=ny {
                    let (dx, dy) = (i as f64 * step, j as f64 * step);
                    let c = pt(start.x - sx * dx, start.y - sy * dy);
                    if !near(mark_box(c, half), window, gap) {
                        cands.push((dx * dx + dy * dy, c));
                    }
                }
            }
        }
        cands.sort_by(|a, b| a.0.total_cmp(&b.0));
        match cands.into_iter().map(|(_, c)| c).find(|&c| obstacles.free(mark_box(c, half), gap)) {
            Some(c) => centres.push(c),
            None => missing.push((name, start)),
        }
    }
    // Aligning two plates takes at least two marks far apart, one near each end of a
    // diagonal, to fix both shifts and the rotation (common practice, from memory).
    let severity = if pair_placed(&missing, 0, 1) || pair_placed(&missing, 2, 3) { Severity::Warning } else { Severity::Error };
    let findings = missing.iter().map(|&(name, at)| room_finding(layout, name, at, half, gap, severity)).collect();
    MarkPlaces { centres, findings }
}

/// True when neither corner `a` nor `b` of [`CORNERS`] is missing.
fn pair_placed(missing: &[(&str, Pt)], a: usize, b: usize) -> bool {
    !missing.iter().any(|(n, _)| *n == CORNERS[a].2 || *n == CORNERS[b].2)
}

fn room_finding(layout: &Layout, corner: &str, at: Pt, half: f64, gap: f64, severity: Severity) -> Finding {
    let need = 2.0 * half + 2.0 * gap;
    let consequence = match severity {
        Severity::Error => "no diagonal pair of marks is left to align the plates by",
        _ => "the plates are aligned by the diagonal pair that remains",
    };
    Finding {
        rule: Rule::MarkRoom,
        severity,
        plate: None,
        nets: Vec::new(),
        location: at,
        measured: None,
        required: Some(need),
        message: format!(
            "no room for the {corner} alignment mark (`marks`): it needs a free square of {need:.3} mm (marks.size {:.3} mm and the \
             {gap:.3} mm gap around it) inside the seal, outside the window and {:.3} mm from the glass edge, in that corner's quarter \
             of the liquid crystal; {consequence}. Fix: a smaller marks.size, more room between the window and the seal, or leads \
             kept off that corner",
            layout.marks.size, layout.rules.edge_clearance
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::artwork::Role;
    use crate::layout::fixture::tiny_layout;

    fn lead(p: Polygon) -> Shape {
        Shape { layer: Layer::BackIto, role: Role::Lead, net: Some("COM1".into()), polygon: p }
    }

    /// Each mark's square lies in the liquid crystal, clear of the window by the gap,
    /// and at least the edge clearance inside both glasses; and keeps the gap from every
    /// shape given (plane geometry, measured with the polygon distance).
    fn assert_placed_well(layout: &Layout, shapes: &[Shape], c: Pt) {
        let (half, gap) = (layout.marks.size / 2.0, layout.rules.mark_gap());
        let sq = rect(c.x - half, c.y - half, c.x + half, c.y + half);
        let lc = crate::spec::liquid_crystal_region(layout);
        assert!(lc.contains_rect(&Rect { x: c.x - half, y: c.y - half, width: 2.0 * half, height: 2.0 * half }), "{c:?}");
        assert!(geom::distance(&sq, &layout.window.polygon()) >= gap - 1e-9, "{c:?} too near the window");
        for g in [layout.glass.front, layout.glass.back] {
            let e = layout.rules.edge_clearance;
            assert!(c.x - half - g.x >= e && g.x1() - c.x - half >= e && c.y - half - g.y >= e && g.y1() - c.y - half >= e, "{c:?}");
        }
        for s in shapes {
            assert!(geom::distance(&sq, &s.polygon) >= layout.rules.min_gap, "{c:?} too near {:?}", s.polygon);
        }
    }

    /// With nothing routed, one mark sits in each corner of the liquid crystal
    /// (2.5..27.5 × 6.5..21.5 in the fixture), a gap in from the seal's inner edge.
    #[test]
    fn four_marks_in_the_corners_when_free() {
        let l = tiny_layout();
        let p = place_marks(&l, &[]);
        assert!(p.findings.is_empty(), "{:?}", p.findings);
        let d = l.rules.mark_gap() + 0.5;
        let want = [pt(2.5 + d, 6.5 + d), pt(27.5 - d, 21.5 - d), pt(27.5 - d, 6.5 + d), pt(2.5 + d, 21.5 - d)];
        for (c, w) in p.centres.iter().zip(want) {
            assert!(geom::dist(*c, w) < 1e-9, "{c:?} ≠ {w:?}");
            assert_placed_well(&l, &[], *c);
        }
    }

    /// A lead filling the bottom-left corner of the liquid crystal up to y = 7.7 moves
    /// that mark up the left edge to the first grid spot clear of it by the gap, and no
    /// further than one grid step beyond.
    #[test]
    fn a_lead_in_the_corner_moves_the_mark_along_the_edge() {
        let l = tiny_layout();
        let shapes = [lead(rect(2.5, 6.5, 6.0, 7.7))];
        let p = place_marks(&l, &shapes);
        assert!(p.findings.is_empty(), "{:?}", p.findings);
        let c = p.centres[0];
        assert_placed_well(&l, &shapes, c);
        let lowest = 7.7 + l.rules.mark_gap() + 0.5;
        assert!(c.y >= lowest - 1e-9 && c.y <= lowest + l.marks.size / 4.0 + 1e-9, "{c:?}");
        assert!((c.x - (2.5 + l.rules.mark_gap() + 0.5)).abs() < 1e-9, "{c:?} left the edge");
    }

    /// One corner filled: a warning, the other diagonal pair stands. The whole bottom
    /// band filled: no diagonal pair is left, an error for each empty corner.
    #[test]
    fn no_room_is_a_warning_or_an_error() {
        let l = tiny_layout();
        let corner = [lead(rect(2.5, 6.5, 15.0, 14.0))];
        let p = place_marks(&l, &corner);
        assert_eq!(p.centres.len(), 3);
        assert_eq!(p.findings.len(), 1, "{:?}", p.findings);
        let f = &p.findings[0];
        assert_eq!((f.rule, f.severity), (Rule::MarkRoom, Severity::Warning));
        assert!(f.message.contains("bottom-left") && f.message.contains("`marks`"), "{}", f.message);
        let band = [lead(rect(2.5, 6.5, 27.5, 14.0))];
        let p = place_marks(&l, &band);
        assert_eq!(p.centres.len(), 2);
        assert_eq!(p.findings.iter().map(|f| f.severity).collect::<Vec<_>>(), [Severity::Error, Severity::Error]);
    }

    /// The spec stage refuses a layout whose empty glass has no room for a diagonal pair
    /// of marks (`spec::has_mark_room`, measured over every position); it must never
    /// refuse one where this placement, with nothing routed, finds such a pair. The seal
    /// widened in 20 µm steps, the window moved sideways and made taller: each time
    /// the placement holds a pair, the spec stage agrees; and both say no once the seal
    /// leaves under a mark's width beside the window (seal 0.6 mm wider, as in the spec's
    /// own test).
    #[test]
    fn the_spec_never_refuses_what_the_empty_glass_holds() {
        let mut both_no = 0;
        for k in 0..40 {
            for (shift, taller) in [(-0.5, 0.0), (0.0, 0.0), (0.3, 0.0), (-0.2, 0.6), (0.0, 0.6), (0.3, 0.6)] {
                let mut l = tiny_layout();
                l.seal.width += k as f64 * 0.02;
                l.window.x += shift;
                // Taller by 0.6 mm at each end: only the strips beside it hold marks.
                l.window.y -= taller;
                l.window.height += 2.0 * taller;
                let placed = place_marks(&l, &[]);
                let pair = placed.findings.iter().all(|f| f.severity != Severity::Error);
                let room = crate::spec::has_mark_room(&l);
                assert!(room || !pair, "seal {} window x {}: refused though the empty glass holds a pair", l.seal.width, l.window.x);
                both_no += usize::from(!room && !pair);
            }
        }
        assert!(both_no > 0, "the sweep never reached a glass without room");
    }
}
