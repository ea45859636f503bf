//! Alignment marks: a cross on the front plate and four squares around a clear cross on
//! the back plate, at the centres [`super::mark_place`] finds (in the corners of the
//! liquid crystal, inside the seal and outside the window, where both plates overlap and
//! the edge clearance holds). When the plates are aligned the front cross sits centred in
//! the back's clear channel, so any offset shows as an uneven channel.

use crate::artwork::Layer;
use crate::geom::{rect, Polygon, Pt};
use crate::layout::Layout;

/// Clear space on each side of the front cross inside the back mark's channel, as a share
/// of the mark's line width.
const CHANNEL_CLEARANCE: f64 = 0.5;

/// Every alignment mark polygon with its layer, a mark at each of `centres`.
pub fn alignment_marks(layout: &Layout, centres: &[Pt]) -> Vec<(Layer, Polygon)> {
    let mut out = Vec::new();
    for &c in centres {
        out.extend(front_cross(c, layout.marks.size, layout.marks.line).into_iter().map(|p| (Layer::FrontMarks, p)));
        out.extend(back_squares(c, layout.marks.size, layout.marks.line).into_iter().map(|p| (Layer::BackMarks, p)));
    }
    out
}

pub(super) fn front_cross(c: Pt, size: f64, line: f64) -> Vec<Polygon> {
    let (s, l) = (size / 2.0, line / 2.0);
    let u = crate::geom::union_all([rect(c.x - s, c.y - l, c.x + s, c.y + l), rect(c.x - l, c.y - s, c.x + l, c.y + s)]);
    u.0
}

pub(super) fn back_squares(c: Pt, size: f64, line: f64) -> Vec<Polygon> {
    let half_channel = line / 2.0 + CHANNEL_CLEARANCE * line;
    let s = size / 2.0;
    [(1.0, 1.0), (-1.0, 1.0), (-1.0, -1.0), (1.0, -1.0)]
        .iter()
        .map(|(sx, sy)| rect(c.x + sx * half_channel, c.y + sy * half_channel, c.x + sx * s, c.y + sy * s))
        .collect()
}
