//! The seal ring: a glue line inset from the back glass edge, open at the fill port.

use crate::geom::{difference, region_of, Polygon};
use crate::layout::{Layout, Side};

/// The seal as hole-free polygons: the ring between the inset rectangle and the inner
/// edge, with the fill port cut through it.
pub fn seal_ring(layout: &Layout) -> Vec<Polygon> {
    let s = &layout.seal;
    let b = layout.glass.back;
    let outer = b.inset(s.inset);
    let inner = b.inset(s.inset + s.width);
    let ring = difference(&region_of([outer.polygon()]), &region_of([inner.polygon()]));
    let half = s.port_width / 2.0;
    let port = match s.port_side {
        Side::Bottom => crate::geom::rect(b.x + s.port_at - half, outer.y - 1.0, b.x + s.port_at + half, inner.y + 1e-3),
        Side::Top => crate::geom::rect(b.x + s.port_at - half, inner.y1() - 1e-3, b.x + s.port_at + half, outer.y1() + 1.0),
        Side::Left => crate::geom::rect(outer.x - 1.0, b.y + s.port_at - half, inner.x + 1e-3, b.y + s.port_at + half),
        Side::Right => crate::geom::rect(inner.x1() - 1e-3, b.y + s.port_at - half, outer.x1() + 1.0, b.y + s.port_at + half),
    };
    difference(&ring, &region_of([port])).0
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::area;

    /// Area of the open ring = full ring − port opening (plane geometry).
    #[test]
    fn port_opens_the_ring() {
        let layout = crate::layout::fixture::tiny_layout();
        let parts = seal_ring(&layout);
        assert_eq!(parts.len(), 1, "an open ring is one piece");
        assert!(parts[0].interiors().is_empty(), "an open ring has no hole");
        let s = &layout.seal;
        let o = layout.glass.back.inset(s.inset);
        let i = layout.glass.back.inset(s.inset + s.width);
        let full = o.width * o.height - i.width * i.height;
        let a: f64 = parts.iter().map(area).sum();
        assert!((a - (full - s.port_width * s.width)).abs() < 1e-6, "{a}");
    }
}
