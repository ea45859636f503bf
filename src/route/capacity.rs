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
//! 1. *Rows in the way* (multiplexed drive): a row of digits that lies between another
//!    row and the pad side, their spans along the side overlapping. The far row's SEG
//!    leads would pass between the near row's digits or around its ends, across the
//!    commons that leave the near row there, and with the pads on one side those commons
//!    have no other way out. Measured: two rows (5 digits over 3, 1/4 duty) gave 23 cut-off
//!    common pieces after a minute of routing, 39 when the far row's leads were steered
//!    around the near row.
//! 2. *Room for the transfer dots* beside the pad row in the seal on the pad side, by the
//!    spacing `dots::place_transfer_dots` uses.

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
    let mut out = Vec::new();
    for far in &rows {
        let near = rows.iter().find(|n| n.key != far.key && n.v.1 < far.v.0 && n.u.0 < far.u.1 && far.u.0 < n.u.1);
        if let Some(near) = near {
            let line = layout.key_lines.get(&near.key).map(|l| format!(" (line {l})")).unwrap_or_default();
            out.push(layout.problem(
                &far.key,
                format!(
                    "digits `{}` lie behind digits `{}`{line} as seen from the pads on the {} side: at 1/{} duty the SEG leads of `{}` would have to cross the commons that leave `{}` on their way to the pads, and segmask routes no lead across another row's commons",
                    far.name,
                    near.name,
                    layout.pads.side.name(),
                    el.coms.len(),
                    far.name,
                    near.name
                ),
                Some("multiplexed rows side by side along the pad side, or a single row".into()),
            ));
        }
    }
    out
}

/// Check 2: the transfer dots fit in the seal beside the pad row, spaced as
/// `dots::place_transfer_dots` spaces them, whatever the row's position.
fn dot_room(layout: &Layout, el: &Electrodes, frame: &SideFrame) -> Option<InputProblem> {
    let commons = el.coms.len();
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

/// Pads the row holds: every net (SEG lines and commons), or the count the layout fixes.
fn pad_count(layout: &Layout, el: &Electrodes) -> usize {
    let nets = el.segs.len() + el.coms.len();
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

    /// Two multiplexed rows, one behind the other as seen from the bottom pads, are
    /// refused at the far row's key with both rows named; side by side (the lower row
    /// moved right of the upper one, pads spanning both) they pass.
    #[test]
    fn a_row_behind_another_is_refused_and_side_by_side_passes() {
        let text = include_str!("../../tests/fixtures/capacity/two-rows.yaml");
        let p = problems(&layout(text, "two-rows.yaml"));
        assert_eq!(p.len(), 1, "{p:?}");
        assert_eq!(p[0].key, "digits[0]");
        assert!(p[0].line.is_some());
        assert!(p[0].message.contains("`R` lie behind digits `P` (line 39)"), "{}", p[0].message);
        let mut apart = layout(text, "two-rows.yaml");
        apart.digits[1].origin.x = apart.digits[0].origin.x + 5.0 * apart.digits[0].pitch;
        apart.digits[1].origin.y = apart.digits[0].origin.y;
        apart.glass.front.width += 20.0;
        apart.glass.back.width += 20.0;
        apart.window.width += 20.0;
        assert!(problems(&apart).is_empty(), "{:?}", problems(&apart));
    }
}
