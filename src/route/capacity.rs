//! Capacity, checked before any search: what the glass has no room for is refused in
//! milliseconds with what to change, instead of after minutes of routing with dozens of
//! cut-off pieces.
//!
//! Takes the layout and the electrodes; gives nothing when routing may go ahead, else
//! located input problems (exit 2, no file written). Each check is a *necessary*
//! condition of the router that follows, derived from the same numbers it uses, so a
//! layout refused here could not have routed; a layout that passes may still fail in
//! the search, with findings that say where.
//!
//! 1. *Rows in the way* (multiplexed drive): with the pads on the top or bottom, the row
//!    nearest the pads leads down to them and a row behind it leads out on the far side
//!    and round the seal (`assign::tiers`, `ring.rs`); a third row, behind both, has no
//!    way out, its leads and the middle row's commons would cross. With the pads on the
//!    left or right, no row may lie behind another. Measured before the far side was
//!    used: two rows (5 digits over 3, 1/4 duty) gave 23 cut-off common pieces after a
//!    minute of routing, 39 when the far row's leads were steered around the near row.
//! 2. *Room for the transfer dots* beside the pad row in the seal on the pad side, by the
//!    spacing `dots::place_transfer_dots` uses.
//! 3. *Room in the ring*: the far tier's SEG lines, half round each end of the glass,
//!    fit the seal band at the lead pitch (`ring::lanes_that_fit`, what `ring::carry`
//!    places). With a second pad row on the far side (`pads.second_row`) they go to it
//!    instead and there is no ring.

use super::side::SideFrame;
use crate::electrode::Electrodes;
use crate::error::{Error, InputProblem};
use crate::geom::Pt;
use crate::layout::Layout;
use crate::Result;

/// Refuses, with every problem found, a layout whose routing cannot succeed.
pub fn check_capacity(layout: &Layout, el: &Electrodes, frame: &SideFrame) -> Result<()> {
    let mut problems = rows_in_the_way(layout, el, frame);
    problems.extend(dot_room(layout, el, frame));
    problems.extend(ring_room(layout, el));
    if problems.is_empty() { Ok(()) } else { Err(Error::Input(problems)) }
}

/// One row of digits as seen from the pad side: its key, name and the box of its
/// digits' bodies in the side's frame (`u` along the side, `v` away from it).
struct Row {
    key: String,
    name: String,
    u: (f64, f64),
    v: (f64, f64),
}

fn rows(layout: &Layout, el: &Electrodes, frame: &SideFrame) -> Vec<Row> {
    let mut rows: Vec<Row> = Vec::new();
    for e in el.elements.iter().filter(|e| e.digit.is_some()) {
        let pts = e.body.0.iter().flat_map(|p| p.exterior().0.iter()).map(|c| frame.to_local(*c));
        let (u, v) = span_of(pts);
        match rows.iter_mut().find(|r| r.key == e.key) {
            Some(r) => {
                r.u = (r.u.0.min(u.0), r.u.1.max(u.1));
                r.v = (r.v.0.min(v.0), r.v.1.max(v.1));
            }
            None => {
                let name = layout.digits.iter().find(|g| g.key == e.key).map(|g| g.name.clone()).unwrap_or_default();
                rows.push(Row { key: e.key.clone(), name, u, v });
            }
        }
    }
    rows
}

fn span_of(pts: impl Iterator<Item = Pt>) -> ((f64, f64), (f64, f64)) {
    pts.fold(((f64::MAX, f64::MIN), (f64::MAX, f64::MIN)), |(u, v), p| ((u.0.min(p.x), u.1.max(p.x)), (v.0.min(p.y), v.1.max(p.y))))
}

/// Check 1: under multiplexed drive, no row of digits may lie behind another as seen
/// from the pads.
fn rows_in_the_way(layout: &Layout, el: &Electrodes, frame: &SideFrame) -> Vec<InputProblem> {
    if el.coms.len() < 2 {
        return Vec::new();
    }
    let rows = rows(layout, el, frame);
    let behind = |far: &Row, near: &Row| near.key != far.key && near.v.1 < far.v.0 && near.u.0 < far.u.1 && far.u.0 < near.u.1;
    // Pads on the top or bottom: a second row behind the first leads out on the other
    // side and round the seal (`assign::tiers`, `ring.rs`); a third has no way out.
    let tiers = matches!(layout.pads.side, crate::layout::Side::Top | crate::layout::Side::Bottom);
    let is_far = |r: &Row| rows.iter().any(|n| behind(r, n));
    let mut out = Vec::new();
    for far in &rows {
        let near = rows.iter().find(|n| behind(far, n) && (!tiers || is_far(n)));
        if let Some(near) = near {
            let line = layout.key_lines.get(&near.key).map(|l| format!(" (line {l})")).unwrap_or_default();
            let (why, fix) = if tiers {
                (
                    format!(
                        "which lies behind another row itself: the row nearest the pads leads to them and the next one leads out on the far side and round the seal, but the SEG leads of `{}` would have to cross the commons of `{}`",
                        far.name, near.name
                    ),
                    "at most two rows one behind the other as seen from the pads, or rows side by side".to_string(),
                )
            } else {
                (
                    format!(
                        "at 1/{} duty the SEG leads of `{}` would have to cross the commons that leave `{}` on their way to the pads, and segmask routes no lead across another row's commons",
                        el.coms.len(),
                        far.name,
                        near.name
                    ),
                    "multiplexed rows side by side along the pad side, or the pads on the top or bottom side".to_string(),
                )
            };
            out.push(layout.problem(
                &far.key,
                format!("digits `{}` lie behind digits `{}`{line} as seen from the pads on the {} side, {why}", far.name, near.name, layout.pads.side.name()),
                Some(fix),
            ));
        }
    }
    out
}

/// Check 3: the far tier's SEG lines fit the seal band round each end, as
/// `ring::carry` splits and places them.
fn ring_room(layout: &Layout, el: &Electrodes) -> Option<InputProblem> {
    if layout.pads.second_row.is_some() {
        return None;
    }
    let a = &el.assignment;
    let far_lines = el.segs.iter().filter(|s| a.far_line(s.index)).count();
    let lanes = far_lines.div_ceil(2);
    let room = super::ring::lanes_that_fit(layout);
    (lanes > room).then(|| {
        layout.problem(
            "seal.width",
            format!(
                "the digits behind another row as seen from the pads lead {far_lines} SEG lines out on the far side and round the seal, {lanes} round each end, but the seal band holds {room} at lead width {} and gap {}",
                fmt_mm(layout.rules.lead_width),
                fmt_mm(layout.rules.min_gap)
            ),
            Some(format!(
                "a seal at least {} wide, a smaller lead width and gap, or fewer lines behind the front row",
                fmt_mm(layout.seal.width + (lanes - room) as f64 * super::lead_pitch(layout))
            )),
        )
    })
}

/// Check 2: the transfer dots fit in the seal beside the pad row, spaced as
/// `dots::place_transfer_dots` spaces them, whatever the row's position.
fn dot_room(layout: &Layout, el: &Electrodes, frame: &SideFrame) -> Option<InputProblem> {
    // With a second pad row the far tier's own dots go beside it, on the far side.
    let any_far = el.assignment.far.iter().any(|f| *f) && layout.pads.second_row.is_none();
    let commons = el.coms.len() + super::dots::far_tier_dots(el.coms.len(), any_far, layout.pads.side).len();
    if commons == 0 {
        return None;
    }
    let pitch = super::lead_pitch(layout);
    let short = super::dots::room_shortfall(layout, frame, pitch, commons, pad_span(layout, el));
    if short <= 1e-9 {
        return None;
    }
    let n = pad_count(layout, el);
    let pitch_max = layout.pads.pitch - short / n.saturating_sub(1).max(1) as f64;
    Some(layout.problem(
        "pads.pitch",
        format!(
            "the {commons} transfer dot(s) ({} pads) do not fit beside the {n} pads at pitch {} in the seal along the {} side: {} short",
            fmt_mm(layout.transfer.pad),
            fmt_mm(layout.pads.pitch),
            layout.pads.side.name(),
            fmt_mm(short)
        ),
        Some(format!(
            "a pitch of at most {}, smaller dots (`transfer.pad`), fewer pins or a longer {} side",
            fmt_mm(pitch_max.max(0.0)),
            layout.pads.side.name()
        )),
    ))
}

fn fmt_mm(v: f64) -> String {
    format!("{v:.3} mm")
}

/// Pads the row holds: every net (SEG lines and commons; with a second row, not the far
/// tier's lines), or the count the layout fixes.
fn pad_count(layout: &Layout, el: &Electrodes) -> usize {
    let second = layout.pads.second_row.is_some();
    let segs = el.segs.iter().filter(|s| !(second && el.assignment.far_line(s.index))).count();
    let nets = segs + el.coms.len();
    layout.pads.count.map(|c| (c as usize).max(nets)).unwrap_or(nets)
}

/// Distance between the centres of the first and last pad.
fn pad_span(layout: &Layout, el: &Electrodes) -> f64 {
    pad_count(layout, el).saturating_sub(1) as f64 * layout.pads.pitch
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::path::Path;

    fn layout(text: &str, name: &str) -> Layout {
        crate::spec::parse_layout(text, Path::new(name)).unwrap()
    }

    fn build(layout: &Layout) -> Electrodes {
        let elements = crate::glyph::build_elements(layout).unwrap();
        let assignment = crate::assign::assign(layout, &elements).unwrap();
        crate::electrode::build_electrodes(layout, &elements, &assignment).unwrap()
    }

    fn problems(layout: &Layout) -> Vec<InputProblem> {
        match check_capacity(layout, &build(layout), &SideFrame::of(layout)) {
            Ok(()) => Vec::new(),
            Err(Error::Input(p)) => p,
            Err(e) => panic!("{e}"),
        }
    }

    /// The darkroom demo (one row, four commons) passes; with transfer-dot pads of 12 mm
    /// its four dots no longer fit beside the 13 pads in 60 mm of seal, refused at
    /// `pads.pitch` with the shortfall.
    #[test]
    fn dots_that_do_not_fit_are_refused_before_routing() {
        let demo = layout(include_str!("../../demo-layouts/darkroom-timer.yaml"), "darkroom-timer.yaml");
        assert!(problems(&demo).is_empty());
        let mut big = demo.clone();
        big.transfer.pad = 12.0;
        let p = problems(&big);
        assert_eq!(p.len(), 1, "{p:?}");
        assert_eq!(p[0].key, "pads.pitch");
        assert!(p[0].line.is_some());
        assert!(p[0].message.contains("4 transfer dot(s)") && p[0].message.contains("short"), "{}", p[0].message);
    }

    /// The two-row demo passes; with a seal of 0.5 mm, whose band holds two lanes at its
    /// lead pitch, the far row's 10 SEG lines (5 round each end) are refused at
    /// `seal.width` with the width that would do.
    #[test]
    fn a_far_row_with_more_lines_than_the_seal_holds_is_refused() {
        let text = include_str!("../../demo-layouts/cold-store-monitor.yaml");
        let mut l = layout(text, "cold-store-monitor.yaml");
        assert!(problems(&l).is_empty(), "{:?}", problems(&l));
        l.seal.width = 0.5;
        assert_eq!(super::super::ring::lanes_that_fit(&l), 2);
        let p = problems(&l);
        assert_eq!(p.len(), 1, "{p:?}");
        assert_eq!(p[0].key, "seal.width");
        assert!(p[0].message.contains("10 SEG lines out on the far side and round the seal, 5 round each end, but the seal band holds 2"), "{}", p[0].message);
    }

    /// Three multiplexed rows, one behind another as seen from the bottom pads, are
    /// refused at the farthest row's key with the row in its way named; without the
    /// middle row the far row leads out on the far side and passes. With the pads on the
    /// left, one row behind another is refused at once.
    #[test]
    fn a_third_row_behind_two_is_refused_and_two_rows_pass() {
        let text = include_str!("../../tests/fixtures/capacity/three-rows.yaml");
        // (The two far rows' lines would not fit round the seal either: `seal.width`.)
        let p: Vec<InputProblem> = problems(&layout(text, "three-rows.yaml")).into_iter().filter(|p| p.key.starts_with("digits")).collect();
        assert_eq!(p.len(), 1, "{p:?}");
        assert_eq!(p[0].key, "digits[0]");
        assert!(p[0].line.is_some());
        assert!(p[0].message.contains("`R` lie behind digits `E` (line 48)"), "{}", p[0].message);
        // Without the middle row, the far row leads out on the far side.
        let mut two = layout(text, "three-rows.yaml");
        two.digits.remove(2);
        assert!(problems(&two).is_empty(), "{:?}", problems(&two));
        // With the pads on the left, `E` moved beside `P` lies behind it; the far tier
        // exists only for pads on the top or bottom.
        let mut left = layout(text, "three-rows.yaml");
        left.pads.side = crate::layout::Side::Left;
        left.digits[2].origin = crate::geom::pt(50.0, 14.0);
        let p = problems(&left);
        assert_eq!(p.len(), 1, "{p:?}");
        assert!(p[0].message.contains("`E` lie behind digits `P` (line 39) as seen from the pads on the left side"), "{}", p[0].message);
    }
}
