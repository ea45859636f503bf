//! The ring: carries the far tier's leads (`assign::tiers`) from the seal band on the side
//! opposite the pads, round the corners and down the seal bands of the two ends, to the
//! seal band on the pad side, where the fan-out takes them on to the pads.
//!
//! Takes the far tier's escape paths, each ending in the far seal band; gives each path
//! carried on, ending on the pad side's seal edge, and how far the lanes reach in from
//! each end of the pad side (the transfer dots stay clear of them). Under the seal no
//! liquid crystal switches, so these front leads may pass over the back leads and
//! commons there; they only keep their own lead pitch from each other. The lanes are
//! planar by construction: the leftmost arrival goes left on the innermost lane, so every
//! lane turns its corners inside the lanes of the arrivals further out (both ends the
//! same way, mirrored).

use super::side::SideFrame;
use crate::geom::{pt, Pt};
use crate::layout::Layout;

/// The far tier's leads carried to the pad side.
#[derive(Debug, Clone, Default)]
pub struct Carried {
    /// Per net, its escape path carried on; the last point lies on the pad side's seal
    /// edge (local `v` = `v_lc` of the pad side's frame).
    pub arrivals: Vec<(String, Vec<Pt>)>,
    /// Local `u` the lanes occupy from each end of the pad side, lead edges included
    /// (low end, high end); `(u_min, u_max)` of the pad side when there are none.
    pub reach: (f64, f64),
}

/// Why the ring cannot carry the far tier's leads.
#[derive(Debug, Clone, PartialEq)]
pub struct NoRoom {
    /// Lanes one end would need.
    pub lanes: usize,
    /// Lanes the seal band holds.
    pub room: usize,
}

/// Lane pitch and the offset of the outermost lane's centre from the seal's outer edge.
fn lane_geometry(layout: &Layout) -> (f64, f64) {
    let pitch = super::lead_pitch(layout);
    (pitch, layout.rules.lead_width / 2.0 + super::grid_step(layout))
}

/// How many lanes the seal band holds at one end.
pub fn lanes_that_fit(layout: &Layout) -> usize {
    let (pitch, first) = lane_geometry(layout);
    let usable = layout.seal.width - first - layout.rules.lead_width / 2.0;
    if usable < 0.0 { 0 } else { (usable / pitch).floor() as usize + 1 }
}

/// Carries the far arrivals (front-frame paths) round the seal to the pad side `frame`.
pub fn carry(layout: &Layout, frame: &SideFrame, far: &[(String, Vec<Pt>)]) -> Result<Carried, NoRoom> {
    let (pitch, first) = lane_geometry(layout);
    let s = &layout.seal;
    // Pad-side frame: the far band's outer edge, and the two ends' outer edges.
    let v_out = frame.v_back_far - s.inset;
    let (u_lo_out, u_hi_out) = (frame.u_back.0 + s.inset, frame.u_back.1 - s.inset);
    let mut idx: Vec<usize> = (0..far.len()).collect();
    let u_of = |i: usize| frame.to_local(*far[i].1.last().expect("escape paths are never empty")).x;
    idx.sort_by(|&a, &b| u_of(a).total_cmp(&u_of(b)));
    let n_lo = far.len().div_ceil(2);
    let (lo, hi) = idx.split_at(n_lo);
    let room = lanes_that_fit(layout);
    if lo.len() > room || hi.len() > room {
        return Err(NoRoom { lanes: lo.len().max(hi.len()), room });
    }
    let mut out = vec![(String::new(), Vec::new()); far.len()];
    // Low end: the lowest-u arrival takes the innermost lane.
    for (k, &i) in lo.iter().enumerate() {
        let d = first + (lo.len() - 1 - k) as f64 * pitch;
        out[i] = (far[i].0.clone(), lane(frame, &far[i].1, v_out - d, u_lo_out + d));
    }
    // High end, mirrored: the highest-u arrival takes the innermost lane.
    for (k, &i) in hi.iter().rev().enumerate() {
        let d = first + (hi.len() - 1 - k) as f64 * pitch;
        out[i] = (far[i].0.clone(), lane(frame, &far[i].1, v_out - d, u_hi_out - d));
    }
    let half = layout.rules.lead_width / 2.0;
    let reach = (
        if lo.is_empty() { frame.u_back.0 } else { u_lo_out + first + (lo.len() - 1) as f64 * pitch + half },
        if hi.is_empty() { frame.u_back.1 } else { u_hi_out - first - (hi.len() - 1) as f64 * pitch - half },
    );
    Ok(Carried { arrivals: out, reach })
}

/// One lane: out to `v_lane` in the far band, along it to `u_lane`, and down that end's
/// band to the pad side's seal edge.
fn lane(frame: &SideFrame, path: &[Pt], v_lane: f64, u_lane: f64) -> Vec<Pt> {
    let end = frame.to_local(*path.last().expect("escape paths are never empty"));
    let mut p = path.to_vec();
    for q in [pt(end.x, v_lane), pt(u_lane, v_lane), pt(u_lane, frame.v_lc)] {
        p.push(frame.to_global(q));
    }
    p
}

#[cfg(test)]
mod tests {
    use super::*;
    use geo::Intersects;

    /// Far arrivals at the top seal edge of the tiny layout (pads at the bottom), at `us`.
    fn arrivals(layout: &Layout, us: &[f64]) -> Vec<(String, Vec<Pt>)> {
        let far = SideFrame::opposite(layout);
        us.iter().enumerate().map(|(i, &x)| (format!("SEG{}", i + 1), vec![pt(x, 14.0), far.to_global(pt(x, far.v_lc - 0.01))])).collect()
    }

    /// Every lane ends on the pad side's seal edge, stays inside the seal band where it
    /// runs round (between the band's outer edge and the liquid crystal), and no two
    /// lanes cross or come closer than the lead pitch less a lead width: the ring is
    /// planar by construction.
    #[test]
    fn lanes_are_planar_and_end_on_the_pad_side() {
        let layout = crate::layout::fixture::tiny_layout();
        let frame = SideFrame::of(&layout);
        let far = arrivals(&layout, &[9.0, 11.0, 13.0, 17.0, 19.0]);
        let c = carry(&layout, &frame, &far).unwrap();
        let lw = layout.rules.lead_width;
        let mut strokes = Vec::new();
        for (net, path) in &c.arrivals {
            let end = frame.to_local(*path.last().unwrap());
            assert!((end.y - frame.v_lc).abs() < 1e-9, "{net} ends at v {}", end.y);
            let seal = &layout.seal;
            assert!(end.x >= frame.u_back.0 + seal.inset && end.x <= frame.u_back.1 - seal.inset, "{net} at u {}", end.x);
            assert!(end.x <= frame.u_lc.0 || end.x >= frame.u_lc.1, "{net} runs down inside the seal band, not the window");
            // The lane itself (after the escape path's two points).
            let lane: Vec<Pt> = path[1..].to_vec();
            strokes.push((net.clone(), crate::geom::stroke_polyline(&lane, lw, 1e-4)));
        }
        for i in 0..strokes.len() {
            for j in i + 1..strokes.len() {
                assert!(!strokes[i].1.intersects(&strokes[j].1), "{} and {} touch", strokes[i].0, strokes[j].0);
            }
        }
        // Three lanes go to the low end, two to the high end; the dots stay inside them.
        assert!(c.reach.0 > frame.u_back.0 + layout.seal.inset && c.reach.1 < frame.u_back.1 - layout.seal.inset);
    }

    /// More lanes than the seal band holds at one end are refused with both counts.
    #[test]
    fn too_many_lanes_are_refused() {
        let layout = crate::layout::fixture::tiny_layout();
        let frame = SideFrame::of(&layout);
        let room = lanes_that_fit(&layout);
        assert!(room >= 2);
        let us: Vec<f64> = (0..2 * room + 1).map(|i| 6.0 + 0.5 * i as f64).collect();
        let e = carry(&layout, &frame, &arrivals(&layout, &us)).unwrap_err();
        assert_eq!(e, NoRoom { lanes: room + 1, room });
        let us: Vec<f64> = (0..2 * room).map(|i| 6.0 + 0.5 * i as f64).collect();
        assert!(carry(&layout, &frame, &arrivals(&layout, &us)).is_ok());
    }
}
