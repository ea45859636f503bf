//! Room for the alignment marks on the empty glass: the plate stage places a mark near
//! each corner of the liquid crystal, outside the window, where the routed ITO leaves room
//! (`plate::mark_place`); this asks, before anything is built, whether the glass leaves
//! room for two marks on opposite corners even with nothing routed. When it does not, no
//! routing can help, and the layout is refused at once with the room there is and what to
//! change — not after the whole build with a `mark-room` error.
//!
//! Takes the resolved layout; gives a problem at `seal.width` when neither diagonal pair of
//! corners has room.

use super::problems::Problems;
use super::read::mm;
use crate::layout::Layout;

/// Where a mark's box may lie (x0, y0, x1, y1): inside the liquid crystal, the marks' gap
/// ([`crate::layout::Rules::mark_gap`]) clear of the seal's inner edge, and the edge
/// clearance inside both glass outlines.
pub fn mark_room(l: &Layout) -> (f64, f64, f64, f64) {
    let gap = l.rules.mark_gap();
    let ec = l.rules.edge_clearance;
    let lc = super::liquid_crystal_region(l).inset(gap);
    let (f, b) = (l.glass.front.inset(ec), l.glass.back.inset(ec));
    (lc.x.max(f.x).max(b.x), lc.y.max(f.y).max(b.y), lc.x1().min(f.x1()).min(b.x1()), lc.y1().min(f.y1()).min(b.y1()))
}

/// Whether a mark fits in the quarter of the room at corner (`sx`, `sy`) (each −1 or +1)
/// with nothing routed: its box inside the room, reaching no further from the corner than
/// the middle of the room less a mark and a gap (as the plate stage searches), and the gap
/// clear of the window. Measured over every position, not the plate stage's candidate
/// steps, so it never says no where the plate stage would place a mark.
fn fits_at_corner(l: &Layout, sx: f64, sy: f64) -> bool {
    const EPS: f64 = 1e-9;
    let size = l.marks.size;
    let gap = l.rules.mark_gap();
    let room = mark_room(l);
    let w = &l.window;
    // The range of the box's low edge along one axis, from the corner towards the middle.
    let range = |lo: f64, hi: f64, toward_low: bool| -> Option<(f64, f64)> {
        let reach = (hi - lo) / 2.0 - size - gap;
        if hi - lo < size - EPS || reach < -EPS {
            return None;
        }
        let reach = reach.max(0.0);
        Some(if toward_low { (lo, lo + reach) } else { (hi - size - reach, hi - size) })
    };
    let (Some(x), Some(y)) = (range(room.0, room.2, sx < 0.0), range(room.1, room.3, sy < 0.0)) else { return false };
    x.0 + size + gap <= w.x + EPS || x.1 >= w.x1() + gap - EPS || y.0 + size + gap <= w.y + EPS || y.1 >= w.y1() + gap - EPS
}

/// Whether two opposite corners of the liquid crystal have room for a mark on the empty
/// glass. Aligning two plates takes two marks far apart, on a diagonal, to fix both
/// shifts and the rotation (common practice, from memory; the plate stage asks the same).
pub fn has_mark_room(l: &Layout) -> bool {
    let fits = |sx: f64, sy: f64| fits_at_corner(l, sx, sy);
    (fits(-1.0, -1.0) && fits(1.0, 1.0)) || (fits(1.0, -1.0) && fits(-1.0, 1.0))
}

/// Refuses a layout where no two opposite corners of the liquid crystal have room for a
/// mark on the empty glass (see the module comment).
pub fn marks_fit(p: &mut Problems, l: &Layout) {
    if has_mark_room(l) {
        return;
    }
    let gap = l.rules.mark_gap();
    let room = mark_room(l);
    let w = &l.window;
    // What lies between the window and the room's edge on each side, less the gap a
    // mark keeps from the window: a mark's square must fit into one of them.
    let beside = [w.x - room.0 - gap, room.2 - w.x1() - gap, w.y - room.1 - gap, room.3 - w.y1() - gap].map(|v| mm(v.max(0.0)));
    p.bad(
        "seal.width",
        format!(
            "no two opposite corners of the liquid crystal have room for an alignment mark, even with nothing routed: a mark is a \
             {} square (`marks.size`) kept {} from the window, from other ITO and from the seal's inner edge, and {} from the \
             glass edges; beside the window there is {} on the left, {} on the right, {} below and {} above",
            mm(l.marks.size),
            mm(gap),
            mm(l.rules.edge_clearance),
            beside[0],
            beside[1],
            beside[2],
            beside[3]
        ),
        &format!(
            "a narrower seal or a smaller seal inset (seal width {}, inset {}), a window further from the seal, or smaller marks \
             (`marks.size`)",
            mm(l.seal.width),
            mm(l.seal.inset)
        ),
    );
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::layout::fixture::tiny_layout;
    use std::collections::BTreeMap;

    fn problems(l: &Layout) -> Vec<crate::error::InputProblem> {
        let mut p = Problems::new(std::path::Path::new("tiny.yaml"), BTreeMap::new(), BTreeMap::new());
        marks_fit(&mut p, l);
        p.into_sorted()
    }

    /// The fixture's liquid crystal is x 2.5..27.5, y 6.5..21.5 (back glass x 0..30,
    /// y 4..24, seal inset 1.5 + width 1), its window x 4..26, y 8..20: 1.5 mm beside the
    /// window on every side, room for a 1 mm mark and its gaps.
    #[test]
    fn the_fixture_has_room() {
        assert!(problems(&tiny_layout()).is_empty());
    }

    /// A seal 0.6 mm wider leaves 1.5 − 0.6 = 0.9 mm between the liquid crystal's edge and
    /// the window, 0.9 − 2 × 0.051 = 0.798 mm beside the window after the mark's gap from
    /// both (plane geometry): a 1 mm mark fits in no corner, and the layout is refused at
    /// `seal.width` with that room on every side.
    #[test]
    fn a_seal_that_leaves_no_room_is_refused_at_the_seal() {
        let mut l = tiny_layout();
        l.seal.width += 0.6;
        let found = problems(&l);
        assert_eq!(found.len(), 1, "{found:?}");
        assert_eq!(found[0].key, "seal.width");
        assert!(found[0].message.contains("0.798 mm on the left, 0.798 mm on the right, 0.798 mm below and 0.798 mm above"), "{}", found[0].message);
        // A mark of 0.79 mm fits again.
        l.marks.size = 0.79;
        assert!(problems(&l).is_empty());
    }

    /// Marks go on a diagonal: with the seal 0.6 mm wider (0.798 mm beside the window
    /// on every side, as above), a window moved 1 mm left leaves 1.798 mm on the right,
    /// room for both right-hand corners but neither left one — refused; a window 1 mm
    /// lower and 1 mm shorter holds the two lower corners and neither upper one — refused;
    /// a window 1 mm narrower on each side holds all four corners and passes.
    #[test]
    fn a_diagonal_pair_is_needed() {
        let narrow = || {
            let mut l = tiny_layout();
            l.seal.width += 0.6;
            l
        };
        let mut l = narrow();
        l.window.x -= 1.0;
        assert_eq!(problems(&l).len(), 1);
        assert!(problems(&l)[0].message.contains("0 mm on the left, 1.798 mm on the right"), "{}", problems(&l)[0].message);
        let mut l = narrow();
        l.window.y += 1.0;
        l.window.height -= 1.0;
        assert_eq!(problems(&l).len(), 1);
        let mut l = narrow();
        l.window.x += 1.0;
        l.window.width -= 2.0;
        assert!(problems(&l).is_empty());
    }
}
