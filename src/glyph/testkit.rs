//! Hand-made layouts for the glyph tests (the spec stage is written in parallel).

use crate::geom::pt;
use crate::layout::*;
use std::collections::BTreeMap;

/// A 60 × 40 mm display with nothing on it; tests push digits, legends and icons.
pub fn empty_layout() -> Layout {
    let r = |x, y, w, h| Rect { x, y, width: w, height: h };
    Layout {
        name: "test".into(),
        source: "test.yaml".into(),
        glass: Glass { front: r(0.0, 0.0, 60.0, 40.0), back: r(0.0, 4.0, 60.0, 36.0) },
        window: r(4.0, 8.0, 52.0, 28.0),
        cell_gap: 0.007,
        resist: Resist::Positive,
        rules: Rules {
            min_width: 0.1,
            min_gap: 0.05,
            undercut: 0.01,
            compensate: false,
            film_min_feature: 0.03,
            backplane_overlap: 0.1,
            edge_clearance: 1.5,
            lead_width: 0.1,
        },
        seal: Seal { width: 1.0, inset: 1.0, port_side: Side::Top, port_at: 30.0, port_width: 3.0 },
        transfer: Transfer { diameter: 0.8, pad: 1.2 },
        pads: Pads {
            side: Side::Bottom,
            pitch: 1.8,
            width: 1.0,
            length: 3.0,
            edge_margin: 0.2,
            first_pin: 1,
            start: None,
            count: None,
            fixed: BTreeMap::new(),
        },
        drive: Drive { commons: 1, bias: None },
        marks: Marks { size: 1.0, line: 0.1 },
        digits: vec![],
        legends: vec![],
        icons: vec![],
        buses: vec![],
        layers: LayerMap::defaults(),
        tolerance: 1e-3,
        extra_fonts: vec![],
        key_lines: BTreeMap::new(),
    }
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
