//! Hand-made layouts for the glyph tests (the spec stage is written in parallel).

use crate::geom::pt;
use crate::layout::*;

/// A 60 × 40 mm display with nothing on it; tests push digits, legends and icons.
/// Built on the shared hand-made layout (`layout::fixture`), resized.
pub fn empty_layout() -> Layout {
    let r = |x, y, w, h| Rect { x, y, width: w, height: h };
    let mut l = crate::layout::fixture::tiny_layout();
    l.name = "test".into();
    l.source = "test.yaml".into();
    l.glass = Glass { front: r(0.0, 0.0, 60.0, 40.0), back: r(0.0, 4.0, 60.0, 36.0) };
    l.window = r(4.0, 8.0, 52.0, 28.0);
    l.rules.undercut = 0.01;
    l.rules.backplane_overlap = 0.1;
    l.rules.lead_width = 0.1;
    l.seal.inset = 1.0;
    l.seal.port_at = 30.0;
    l
}

/// A seven-segment group of `count` digits, 6 × 10 mm at 9 mm pitch.
pub fn seven_group(count: u32, slant: f64) -> DigitGroup {
    DigitGroup {
        name: "D".into(),
        style: DigitStyle::Seven,
        count,
        origin: pt(8.0, 12.0),
        height: 10.0,
        width: 6.0,
        pitch: 9.0,
        slant,
        stroke: 1.0,
        gap: 0.15,
        decimal_points: vec![],
        colons: vec![],
        half_digits: vec![],
        key: "digits[0]".into(),
    }
}
