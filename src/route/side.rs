//! A local frame for the pad side: `u` runs along the side, `v` runs from the front glass
//! edge into the glass. The fan-out is planned in this frame so one piece of code serves
//! all four sides.

use crate::geom::{pt, Pt};
use crate::layout::{Layout, Rect, Side};

/// The pad side's local frame and the distances the fan-out needs, all in mm.
#[derive(Debug, Clone, Copy)]
pub struct SideFrame {
    /// Which side.
    pub side: Side,
    /// Front glass width and height.
    front: (f64, f64),
    /// `v` of the back glass edge (where the ledge ends).
    pub v_back: f64,
    /// `v` of the seal's inner edge (where the liquid crystal starts).
    pub v_lc: f64,
    /// `v` of the seal's centre line.
    pub v_seal: f64,
    /// `u` range of the seal's inner edge along this side.
    pub u_lc: (f64, f64),
    /// `u` range of the back glass along this side.
    pub u_back: (f64, f64),
    /// `v` of the back glass edge on the opposite side.
    pub v_back_far: f64,
}

impl SideFrame {
    /// The frame of the layout's pad side.
    pub fn of(layout: &Layout) -> SideFrame {
        SideFrame::of_side(layout, layout.pads.side)
    }

    /// The frame of the side opposite the pads, where the far tier's leads leave
    /// (`assign::tiers`).
    pub fn opposite(layout: &Layout) -> SideFrame {
        SideFrame::of_side(layout, layout.pads.side.opposite())
    }

    /// The frame of one side of the glass.
    pub fn of_side(layout: &Layout, side: Side) -> SideFrame {
        let f = layout.glass.front;
        let b = layout.glass.back;
        let mut frame = SideFrame { side, front: (f.width, f.height), v_back: 0.0, v_lc: 0.0, v_seal: 0.0, u_lc: (0.0, 0.0), u_back: (0.0, 0.0), v_back_far: 0.0 };
        let (lo, hi) = frame.rect_local(&b);
        frame.v_back = lo.y;
        let s = &layout.seal;
        frame.v_seal = lo.y + s.inset + s.width / 2.0;
        frame.v_lc = lo.y + s.inset + s.width;
        frame.u_back = (lo.x, hi.x);
        frame.v_back_far = hi.y;
        frame.u_lc = (lo.x + s.inset + s.width, hi.x - s.inset - s.width);
        frame
    }

    /// Length of the pad side of the front glass (the range of `u`).
    pub fn side_length(&self) -> f64 {
        match self.side {
            Side::Bottom | Side::Top => self.front.0,
            Side::Left | Side::Right => self.front.1,
        }
    }

    /// Front-frame point → local (u, v).
    pub fn to_local(&self, p: Pt) -> Pt {
        let (w, h) = self.front;
        match self.side {
            Side::Bottom => pt(p.x, p.y),
            Side::Top => pt(p.x, h - p.y),
            Side::Left => pt(p.y, p.x),
            Side::Right => pt(p.y, w - p.x),
        }
    }

    /// Local (u, v) → front-frame point.
    pub fn to_global(&self, q: Pt) -> Pt {
        let (w, h) = self.front;
        match self.side {
            Side::Bottom => pt(q.x, q.y),
            Side::Top => pt(q.x, h - q.y),
            Side::Left => pt(q.y, q.x),
            Side::Right => pt(w - q.y, q.x),
        }
    }

    /// A rectangle's corners in the local frame (min, max).
    pub fn rect_local(&self, r: &Rect) -> (Pt, Pt) {
        let a = self.to_local(pt(r.x, r.y));
        let b = self.to_local(pt(r.x1(), r.y1()));
        (pt(a.x.min(b.x), a.y.min(b.y)), pt(a.x.max(b.x), a.y.max(b.y)))
    }

    /// A local-frame rectangle as a front-frame polygon.
    pub fn rect_global(&self, u0: f64, v0: f64, u1: f64, v1: f64) -> crate::geom::Polygon {
        let a = self.to_global(pt(u0, v0));
        let b = self.to_global(pt(u1, v1));
        crate::geom::rect(a.x, a.y, b.x, b.y)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn round_trip_every_side() {
        for side in [Side::Bottom, Side::Top, Side::Left, Side::Right] {
            let f = SideFrame { side, front: (60.0, 40.0), v_back: 0.0, v_lc: 0.0, v_seal: 0.0, u_lc: (0.0, 0.0), u_back: (0.0, 0.0), v_back_far: 0.0 };
            let p = pt(12.5, 7.25);
            let q = f.to_global(f.to_local(p));
            assert!((p.x - q.x).abs() < 1e-12 && (p.y - q.y).abs() < 1e-12, "{side:?}");
        }
    }
}
