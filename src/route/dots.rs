//! Where the transfer dots go: in the seal on the pad side, beside the pad row, one per
//! common electrode.
//!
//! With one common the dot goes left of every lead and pad if there is room, else right.
//! With several, the top and bottom commons go right (the top one outermost) and the
//! commons in between go left (the upper one outermost): a row of digits brings its
//! middle commons out at its left end one above the other, while the top common comes
//! down the right side around the bottom one (see `assign::template`). With the pads on
//! top the order is mirrored: the bottom common outermost on the right, the lower middle
//! one outermost on the left.

use super::side::SideFrame;
use crate::geom::{pt, Pt};
use crate::layout::Layout;

/// Local (u, v) centre of each common's dot (`commons` of them, none beside a second
/// pad row), in common order, then of each extra dot in
/// `extra` order; `None` when they do not fit in the seal on the pad side. `us` are the
/// `u` of every lead arrival and pad that comes straight from the window; `reach` is how
/// far the ring's lanes (`ring.rs`) come in from each end of the side, which the dots
/// keep a pitch clear of. `extra` are second dots for commons of the far tier, each
/// `(common, at the low-u end)`, placed outermost (see [`far_tier_dots`]).
pub fn place_transfer_dots(layout: &Layout, frame: &SideFrame, pad_width: f64, us: &[f64], pitch: f64, commons: usize, reach: (f64, f64), extra: &[(usize, bool)]) -> Option<Vec<Pt>> {
    let tpad = layout.transfer.pad;
    let (lo, hi) = us.iter().fold((f64::MAX, f64::MIN), |(a, b), u| (a.min(*u), b.max(*u)));
    let clear = tpad / 2.0 + pitch + pad_width / 2.0;
    let min_u = (frame.u_back.0 + layout.seal.inset).max(reach.0 + pitch) + tpad / 2.0;
    let max_u = (frame.u_back.1 - layout.seal.inset).min(reach.1 - pitch) - tpad / 2.0;
    let step = tpad + pitch;
    // With the pads on top every row sends its leads up (`assign::template::Exit::Up`):
    // the commons leave the row mirrored top to bottom, so the bottom common is the one
    // that comes round outermost on the right and the lower middle one outermost on the
    // left.
    let top = frame.side == crate::layout::Side::Top;
    let mirror = |c: usize| if top { commons - 1 - c } else { c };
    // Each side's dots, innermost first.
    let (mut left, mut right): (Vec<usize>, Vec<usize>) = if commons == 0 {
        // A second pad row: only the far tier's own dots (`extra`) go beside it.
        (vec![], vec![])
    } else if commons == 1 {
        (vec![0], vec![])
    } else {
        let right = vec![mirror(commons - 1), mirror(0)];
        (((1..commons - 1).rev()).map(mirror).collect(), right)
    };
    for (j, &(_, low)) in extra.iter().enumerate() {
        if low { left.push(commons + j) } else { right.push(commons + j) }
    }
    let fits = |left: &[usize], right: &[usize]| {
        let l_ok = left.is_empty() || lo - clear - step * (left.len() - 1) as f64 >= min_u;
        let r_ok = right.is_empty() || hi + clear + step * (right.len() - 1) as f64 <= max_u;
        l_ok && r_ok
    };
    let all: Vec<usize> = (0..commons).rev().map(mirror).chain(commons..commons + extra.len()).collect();
    let choice = [(left, right), (all.clone(), vec![]), (vec![], all)]
    .into_iter()
    .find(|(l, r)| fits(l, r))?;
    let mut at = vec![pt(0.0, 0.0); commons + extra.len()];
    for (i, &c) in choice.0.iter().enumerate() {
        at[c] = pt(lo - clear - step * i as f64, frame.v_seal);
    }
    for (i, &c) in choice.1.iter().enumerate() {
        at[c] = pt(hi + clear + step * i as f64, frame.v_seal);
    }
    Some(at)
}

/// The commons of the far tier that take a second transfer dot of their own, as
/// `(common, at the low-u end)`, when some elements are in the far tier.
///
/// Counted from the near tier outwards (`assign::tiers`), the far tier's first common
/// meets the near tier's across the space between the rows, and its second (at four or
/// more commons) comes down the low end beside the near tier's middle commons and joins
/// them where they leave the near row. The rest — the far row's upper middle common and
/// the one along its outer edge, which runs in the seal band on the far side — cannot
/// join their near halves without crossing the near tier's commons on their way to the
/// dots, so they come round the seal band to a dot of their own, outermost among the
/// dots: each of them is on two pins.
///
/// The commons are numbered down the glass, so counted from the near tier outwards
/// they run COM1, COM2, … with the pads at the bottom (`pads_side`) and the other way
/// with the pads on top. Taking the bottom's numbers with the pads on top gave the
/// second dots to the far row's commons nearest the near row: the cold-store demo
/// mirrored top to bottom left four parts of its commons cut off; counted from the
/// near tier it builds clean at all 49 positions of its sweep.
pub fn far_tier_dots(commons: usize, any_far: bool, pads_side: crate::layout::Side) -> Vec<(usize, bool)> {
    if !any_far || commons < 2 {
        return Vec::new();
    }
    let pads_on_top = pads_side == crate::layout::Side::Top;
    let outwards = |k: usize| if pads_on_top { commons - 1 - k } else { k };
    (2..commons).chain((commons == 2).then_some(1)).map(|k| (outwards(k), k + 1 < commons)).collect()
}

/// How far the dots and a pad row of centre span `span` overrun the room for them, by
/// the spacing [`place_transfer_dots`] uses (zero or less: they fit). Dot centres lie
/// within the seal on the pad side, pad centres within the front glass's side less the
/// edge margin; the best of the three placements counts: all dots right of the row, all
/// left, or the usual split (the two outer commons right, the rest left).
pub fn room_shortfall(layout: &Layout, frame: &SideFrame, pitch: f64, commons: usize, span: f64) -> f64 {
    let tpad = layout.transfer.pad;
    let clear = tpad / 2.0 + pitch + layout.pads.width / 2.0;
    let step = tpad + pitch;
    let min_u = frame.u_back.0 + layout.seal.inset + tpad / 2.0;
    let max_u = frame.u_back.1 - layout.seal.inset - tpad / 2.0;
    let edge = layout.pads.edge_margin + layout.pads.width / 2.0;
    let (first_min, last_max) = (edge, frame.side_length() - edge);
    let k = commons.max(1) as f64;
    let right = first_min + span + clear + step * (k - 1.0) - max_u;
    let left = min_u + clear + step * (k - 1.0) + span - last_max;
    let split = if commons >= 3 { min_u + span + 2.0 * clear + step * (k - 2.0) - max_u } else { f64::INFINITY };
    right.min(left).min(split)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Four commons: COM1 outermost right, COM4 inner right, COM2 outer left, COM3 inner
    /// left; neighbouring dots one pad plus one lead pitch apart.
    #[test]
    fn four_dots_take_their_sides() {
        let layout = crate::layout::fixture::tiny_layout();
        let frame = SideFrame::of(&layout);
        let us = [12.0, 18.0];
        let at = place_transfer_dots(&layout, &frame, layout.pads.width, &us, 0.3, 4, frame.u_back, &[]).unwrap();
        assert!(at[0].x > at[3].x && at[3].x > 18.0);
        assert!(at[1].x < at[2].x && at[2].x < 12.0);
        assert!((at[0].x - at[3].x - (layout.transfer.pad + 0.3)).abs() < 1e-9);
        let one = place_transfer_dots(&layout, &frame, layout.pads.width, &us, 0.3, 1, frame.u_back, &[]).unwrap();
        assert!(one[0].x < 12.0);
    }

    /// The second dots go to the far row's two outer commons, counted from the near
    /// row: COM3 at the low end and COM4 at the high end with the pads at the bottom,
    /// COM2 and COM1 with the pads on top (commons are numbered down the glass); none
    /// without a far tier.
    #[test]
    fn second_dots_take_the_far_rows_outer_commons() {
        use crate::layout::Side::{Bottom, Top};
        assert_eq!(far_tier_dots(4, true, Bottom), vec![(2, true), (3, false)]);
        assert_eq!(far_tier_dots(4, true, Top), vec![(1, true), (0, false)]);
        assert_eq!(far_tier_dots(3, true, Top), vec![(0, false)]);
        assert_eq!(far_tier_dots(2, true, Top), vec![(0, false)]);
        assert!(far_tier_dots(4, false, Top).is_empty());
    }

    /// `room_shortfall` is exact for the placement: with the pad span a hair under the
    /// limit some position of the row places every dot, a hair over it none does, at 1
    /// to 5 commons.
    #[test]
    fn room_shortfall_agrees_with_the_placement() {
        let layout = crate::layout::fixture::tiny_layout();
        let frame = SideFrame::of(&layout);
        let edge = layout.pads.edge_margin + layout.pads.width / 2.0;
        for commons in 1..=5 {
            // The span at which the shortfall is zero (it grows one for one with the span).
            let limit = -room_shortfall(&layout, &frame, 0.3, commons, 0.0);
            assert!(limit > 0.0, "{commons} commons must fit with a one-pad row");
            for (slack, fits) in [(1e-6, true), (-1e-6, false)] {
                let span = limit - slack;
                let (first_min, last_max) = (edge, frame.side_length() - edge - span);
                let placed = (0..=400).any(|i| {
                    let lo = first_min + (last_max - first_min) * i as f64 / 400.0;
                    place_transfer_dots(&layout, &frame, layout.pads.width, &[lo, lo + span], 0.3, commons, frame.u_back, &[]).is_some()
                }) || [first_min, last_max]
                    .into_iter()
                    .chain(tight_starts(&layout, &frame, commons))
                    .filter(|lo| (first_min..=last_max).contains(lo))
                    .any(|lo| place_transfer_dots(&layout, &frame, layout.pads.width, &[lo, lo + span], 0.3, commons, frame.u_back, &[]).is_some());
                assert_eq!(placed, fits, "{commons} commons, span {span}");
            }
        }
    }

    /// Row starts at which the left or split placement is just possible.
    fn tight_starts(layout: &Layout, frame: &SideFrame, commons: usize) -> Vec<f64> {
        let tpad = layout.transfer.pad;
        let min_u = frame.u_back.0 + layout.seal.inset + tpad / 2.0;
        let (clear, step) = (tpad / 2.0 + 0.3 + layout.pads.width / 2.0, tpad + 0.3);
        let k = commons as f64;
        vec![min_u + clear + step * (k - 1.0), min_u + clear + step * (k - 3.0).max(0.0)]
    }
}
