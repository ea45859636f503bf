//! Small hand-built artworks for the check tests (invented for segmask).
//!
//! `clean()` is a 40 × 30 mm display with two segments `S1`, `S2` over one common
//! electrode `COM1` whose lead reaches the ledge through a transfer dot; it breaks no
//! rule. Every coordinate is a round number so that expected distances and areas can be
//! worked out by hand:
//!
//! ```text
//! front glass 0..40 × 0..30, back glass 0..40 × 6..30, ledge 0..40 × 0..6
//! seal 1.5..38.5 × 7.5..28.5 outside, liquid crystal 3..37 × 9..27, window 6..34 × 11..25
//! S1 10..14 × 15..20, lead x 11.9..12.1 from y 2 to 15, pad 11..13 × 1..4  (pin 1)
//! S2 16..20 × 15..20, lead x 17.9..18.1 from y 2 to 15, pad 17..19 × 1..4  (pin 2)
//! COM1 back: backplane 9.5..20.5 × 15..20.5, lead y 17..17.2 to x 30.1, lead x 29.9..30.1
//!   down to y 8.25, transfer pad 29.6..30.4 × 7.85..8.65 on both plates, dot r 0.3 at
//!   (30, 8.25); front lead x 29.9..30.1 from y 2 to 8.25, pad 29..31 × 1..4  (pin 3)
//! marks: a 0.15 mm cross on the front and four 0.3 mm squares on the back around (4.25, 25.75),
//!   in the liquid crystal outside the window
//! ```

use crate::artwork::{Artwork, Layer, Net, NetKind, Pin, Pixel, Role, Shape, TransferDot};
use crate::finding::{Finding, Rule};
use crate::geom::{circle, pt, rect, region_of, Polygon};
use crate::layout::{LayerMap, PlateId, Rules};

/// The rules of the clean fixture.
pub fn rules() -> Rules {
    Rules {
        min_width: 0.05,
        min_gap: 0.05,
        undercut: 0.005,
        compensate: false,
        film_min_feature: 0.03,
        backplane_overlap: 0.5,
        edge_clearance: 1.5,
        lead_width: 0.2,
        registration: 0.0,
    }
}

fn shape(layer: Layer, role: Role, net: Option<&str>, polygon: Polygon) -> Shape {
    Shape { layer, role, net: net.map(str::to_string), polygon }
}

/// Adds a polygon.
pub fn add(art: &mut Artwork, layer: Layer, role: Role, net: Option<&str>, polygon: Polygon) {
    art.shapes.push(shape(layer, role, net, polygon));
}

/// Replaces the polygon of the first shape on `layer` with this role and net.
pub fn set(art: &mut Artwork, layer: Layer, role: Role, net: &str, polygon: Polygon) {
    let s = art
        .shapes
        .iter_mut()
        .find(|s| s.layer == layer && s.role == role && s.net.as_deref() == Some(net))
        .expect("fixture shape exists");
    s.polygon = polygon;
}

/// Removes every shape on `layer` with this role and net.
pub fn remove(art: &mut Artwork, layer: Layer, role: Role, net: Option<&str>) {
    art.shapes.retain(|s| !(s.layer == layer && s.role == role && s.net.as_deref() == net));
}

/// The findings of one rule.
pub fn of_rule(findings: &[Finding], rule: Rule) -> Vec<&Finding> {
    findings.iter().filter(|f| f.rule == rule).collect()
}

/// Formats findings for assertion messages.
pub fn show(findings: &[Finding]) -> String {
    findings.iter().map(|f| format!("{} {:?} {:?} {:?} {}\n", f.rule.code(), f.nets, f.location, f.measured, f.message)).collect()
}

fn net(name: &str, plate: PlateId, kind: NetKind, index: u32) -> Net {
    Net { name: name.into(), plate, kind, index, drives: format!("fixture {name}") }
}

/// A small artwork that breaks no rule.
pub fn clean() -> Artwork {
    use Layer::*;
    let mut shapes = Vec::new();
    let mut push = |layer, role, net: Option<&str>, p| shapes.push(shape(layer, role, net, p));
    for (name, x) in [("S1", 10.0), ("S2", 16.0)] {
        push(FrontIto, Role::Segment, Some(name), rect(x, 15.0, x + 4.0, 20.0));
        push(FrontIto, Role::Lead, Some(name), rect(x + 1.9, 2.0, x + 2.1, 15.0));
        push(FrontIto, Role::Pad, Some(name), rect(x + 1.0, 1.0, x + 3.0, 4.0));
    }
    let com = Some("COM1");
    push(BackIto, Role::Common, com, rect(9.5, 15.0, 20.5, 20.5));
    push(BackIto, Role::Lead, com, rect(20.4, 17.0, 30.1, 17.2));
    push(BackIto, Role::Lead, com, rect(29.9, 8.25, 30.1, 17.2));
    push(BackIto, Role::TransferPad, com, rect(29.6, 7.85, 30.4, 8.65));
    push(FrontIto, Role::TransferPad, com, rect(29.6, 7.85, 30.4, 8.65));
    push(FrontIto, Role::Lead, com, rect(29.9, 2.0, 30.1, 8.25));
    push(FrontIto, Role::Pad, com, rect(29.0, 1.0, 31.0, 4.0));
    push(FrontMarks, Role::Mark, None, rect(3.85, 25.675, 4.65, 25.825));
    push(FrontMarks, Role::Mark, None, rect(4.175, 25.35, 4.325, 26.15));
    for (x, y) in [(3.75, 25.25), (4.45, 25.25), (3.75, 25.95), (4.45, 25.95)] {
        push(BackMarks, Role::Mark, None, rect(x, y, x + 0.3, y + 0.3));
    }
    let dot = circle(pt(30.0, 8.25), 0.3, 1e-3);
    push(TransferDots, Role::Outline, None, dot.clone());
    let seal = Polygon::new(
        rect(1.5, 7.5, 38.5, 28.5).exterior().clone(),
        vec![rect(3.0, 9.0, 37.0, 27.0).exterior().clone()],
    );
    push(Seal, Role::Outline, None, seal);
    push(FrontGlass, Role::Outline, None, rect(0.0, 0.0, 40.0, 30.0));
    push(BackGlass, Role::Outline, None, rect(0.0, 6.0, 40.0, 30.0));
    push(Window, Role::Outline, None, rect(6.0, 11.0, 34.0, 25.0));
    let pin = |number, net: &str, x: f64| Pin { number, net: net.into(), pad: rect(x, 1.0, x + 2.0, 4.0) };
    let pixel = |name: &str, x: f64| Pixel {
        element: name.into(),
        drives: format!("fixture {name}"),
        seg_net: name.into(),
        com_net: "COM1".into(),
        region: region_of([rect(x, 15.0, x + 4.0, 20.0)]),
    };
    Artwork {
        name: "fixture".into(),
        shapes,
        nets: vec![
            net("S1", PlateId::Front, NetKind::Segment, 0),
            net("S2", PlateId::Front, NetKind::Segment, 1),
            net("COM1", PlateId::Back, NetKind::Common, 0),
        ],
        pins: vec![pin(1, "S1", 11.0), pin(2, "S2", 17.0), pin(3, "COM1", 29.0)],
        pixels: vec![pixel("S1", 10.0), pixel("S2", 16.0)],
        digits: vec![],
        cell: crate::layout::Cell::with_gap(0.007),
        transfer_dots: vec![TransferDot { at: pt(30.0, 8.25), dot }],
        lc_region: rect(3.0, 9.0, 37.0, 27.0),
        window: rect(6.0, 11.0, 34.0, 25.0),
        ledge: region_of([rect(0.0, 0.0, 40.0, 6.0)]),
        front_glass: rect(0.0, 0.0, 40.0, 30.0),
        back_glass: rect(0.0, 6.0, 40.0, 30.0),
        labels: vec![],
        rules: rules(),
        resist: crate::layout::Resist::Positive,
        masks: crate::layout::MaskOptions::default(),
        drive: crate::layout::Drive { commons: 1, bias: None },
        film_shapes: vec![],
        layers: LayerMap::defaults(),
        generation_findings: vec![],
        panel: None,
    }
}

/// Moves segment S2 (with its lead, pad, pin and pixel) so that its left edge is at `x`.
pub fn move_s2(art: &mut Artwork, x: f64) {
    use Layer::FrontIto;
    set(art, FrontIto, Role::Segment, "S2", rect(x, 15.0, x + 4.0, 20.0));
    set(art, FrontIto, Role::Lead, "S2", rect(x + 1.9, 2.0, x + 2.1, 15.0));
    set(art, FrontIto, Role::Pad, "S2", rect(x + 1.0, 1.0, x + 3.0, 4.0));
    art.pins[1].pad = rect(x + 1.0, 1.0, x + 3.0, 4.0);
    art.pixels[1].region = region_of([rect(x, 15.0, x + 4.0, 20.0)]);
}
