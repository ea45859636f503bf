//! A small resolved layout, built by hand, for unit tests of the stages after `spec`.

use super::*;

/// A 30 × 24 mm front plate with a 4 mm ledge at the bottom, no elements.
pub fn tiny_layout() -> Layout {
    Layout {
        name: "tiny".into(),
        source: "tiny.yaml".into(),
        glass: Glass {
            front: Rect { x: 0.0, y: 0.0, width: 30.0, height: 24.0 },
            back: Rect { x: 0.0, y: 4.0, width: 30.0, height: 20.0 },
        },
        window: Rect { x: 4.0, y: 8.0, width: 22.0, height: 12.0 },
        cell_gap: 0.007,
        resist: Resist::Positive,
        masks: crate::layout::MaskOptions::default(),
        rules: Rules {
            min_width: 0.1,
            min_gap: 0.05,
            undercut: 0.005,
            compensate: false,
            film_min_feature: 0.03,
            backplane_overlap: 0.15,
            edge_clearance: 1.5,
            lead_width: 0.11,
            registration: 0.0,
        },
        seal: Seal { width: 1.0, inset: 1.5, port_side: Side::Top, port_at: 15.0, port_width: 3.0 },
        transfer: Transfer { diameter: 0.8, pad: 1.2 },
        pads: Pads {
            side: Side::Bottom,
            pitch: 1.0,
            width: 0.6,
            length: 3.0,
            edge_margin: 0.3,
            first_pin: 1,
            pins_follow: false,
            start: None,
            count: None,
            fixed: BTreeMap::new(),
            second_row: None,
        },
        drive: Drive { commons: 1, bias: None },
        fixed_lines: BTreeMap::new(),
        marks: Marks { size: 1.0, line: 0.15 },
        digits: vec![],
        legends: vec![],
        icons: vec![],
        bars: vec![],
        buses: vec![],
        layers: LayerMap::defaults(),
        tolerance: 0.001,
        extra_fonts: vec![],
        cell: Cell::with_gap(0.007),
        key_lines: BTreeMap::new(),
    }
}
