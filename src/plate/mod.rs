//! Stage `plate`: electrodes + routes → `Artwork`.
//!
//! Takes the electrodes, the leads, pads and transfer dots; adds the glass outlines, the
//! seal ring with its fill port, the alignment marks (placed where the routed ITO leaves
//! room) and the plate labels; unites each
//! net's ITO into non-overlapping polygons; gives the `Artwork` every check and writer
//! reads.

mod mark_place;
mod marks;
mod panel;
mod seal;

use crate::artwork::{Artwork, DigitSlot, Label, Layer, Net, NetKind, Pin, Pixel, Role, Shape, TransferDot};
use crate::electrode::Electrodes;
use crate::geom::{circle, difference, region_of, union_all, Polygon, Region};
use crate::layout::{Layout, PlateId};
use crate::route::Routes;
use crate::Result;

/// Assembles the artwork of both plates.
pub fn build_artwork(layout: &Layout, el: &Electrodes, routes: &Routes) -> Result<Artwork> {
    let mut shapes = Vec::new();
    for s in &el.segs {
        let mut parts: Vec<Polygon> = s.outline.0.clone();
        parts.extend(front_net_parts(layout, routes, &s.net));
        push_united(&mut shapes, Layer::FrontIto, Role::Segment, &s.net, parts);
    }
    for c in &el.coms {
        let mut parts: Vec<Polygon> =
            routes.common_pieces.iter().filter(|(n, _)| n == &c.net).flat_map(|(_, r)| r.0.clone()).collect();
        parts.extend(routes.leads.iter().filter(|l| l.plate == PlateId::Back && l.net == c.net).flat_map(|l| l.outline.0.clone()));
        parts.extend(routes.transfers.iter().filter(|t| t.net == c.net).map(|t| t.pad.clone()));
        push_united(&mut shapes, Layer::BackIto, Role::Common, &c.net, parts);
        // The common's front-plate side: transfer pad, lead and pad on the ledge.
        let mut front: Vec<Polygon> = routes.transfers.iter().filter(|t| t.net == c.net).map(|t| t.pad.clone()).collect();
        front.extend(front_net_parts(layout, routes, &c.net));
        push_united(&mut shapes, Layer::FrontIto, Role::Lead, &c.net, front);
    }
    let dots: Vec<TransferDot> = routes
        .transfers
        .iter()
        .map(|t| TransferDot { at: t.at, dot: circle(t.at, layout.transfer.diameter / 2.0, layout.tolerance) })
        .collect();
    for d in &dots {
        shapes.push(Shape { layer: Layer::TransferDots, role: Role::Outline, net: None, polygon: d.dot.clone() });
    }
    for p in seal::seal_ring(layout) {
        shapes.push(Shape { layer: Layer::Seal, role: Role::Outline, net: None, polygon: p });
    }
    let places = mark_place::place_marks(layout, &shapes);
    for (layer, p) in marks::alignment_marks(layout, &places.centres) {
        shapes.push(Shape { layer, role: Role::Mark, net: None, polygon: p });
    }
    let front_glass = layout.glass.front.polygon();
    let back_glass = layout.glass.back.polygon();
    let window = layout.window.polygon();
    shapes.push(Shape { layer: Layer::FrontGlass, role: Role::Outline, net: None, polygon: front_glass.clone() });
    shapes.push(Shape { layer: Layer::BackGlass, role: Role::Outline, net: None, polygon: back_glass.clone() });
    shapes.push(Shape { layer: Layer::Window, role: Role::Outline, net: None, polygon: window.clone() });
    let shapes_for_film = shapes.clone();
    let ledge = difference(&region_of([front_glass.clone()]), &region_of([back_glass.clone()]));
    Ok(Artwork {
        name: layout.name.clone(),
        shapes,
        nets: nets(el),
        pins: routes.pads.iter().map(|p| Pin { number: p.pin, net: p.net.clone(), pad: p.outline.clone() }).collect(),
        pixels: pixels(el),
        digits: digit_slots(layout),
        cell: layout.cell.clone(),
        transfer_dots: dots,
        lc_region: layout.glass.back.inset(layout.seal.inset + layout.seal.width).polygon(),
        window,
        ledge,
        front_glass,
        back_glass,
        labels: labels(layout),
        rules: layout.rules.clone(),
        resist: layout.resist,
        masks: layout.masks,
        drive: layout.drive,
        layers: layout.layers.clone(),
        film_shapes: film_shapes(layout, &shapes_for_film),
        generation_findings: el.findings.iter().chain(&routes.findings).chain(&places.findings).cloned().collect(),
        panel: panel::panel_art(layout),
    })
}

/// When compensating, every net's etched ITO grown by the undercut with mitred corners
/// (so the etched result comes back to the drawing); nothing otherwise.
fn film_shapes(layout: &Layout, shapes: &[Shape]) -> Vec<Shape> {
    let bias = layout.rules.film_bias();
    if bias <= 0.0 {
        return Vec::new();
    }
    let mut groups: std::collections::BTreeMap<(Layer, Option<String>), (Role, Vec<Polygon>)> = Default::default();
    for s in shapes.iter().filter(|s| s.layer.is_etched()) {
        let e = groups.entry((s.layer, s.net.clone())).or_insert((s.role, Vec::new()));
        e.1.push(s.polygon.clone());
    }
    let mut out = Vec::new();
    for ((layer, net), (role, polys)) in groups {
        let grown = crate::geom::offset_mitre(&union_all(polys), bias);
        out.extend(grown.0.into_iter().map(|p| Shape { layer, role, net: net.clone(), polygon: p }));
    }
    out
}

/// Every digit position of the layout with the elements of its segments, point and colon.
fn digit_slots(layout: &Layout) -> Vec<DigitSlot> {
    use crate::layout::{COLON, COLON_DOTS, DECIMAL_POINT, segment_net};
    let mut out = Vec::new();
    for g in &layout.digits {
        for d in 1..=g.count {
            let names = crate::spec::digit_segments(g, d, layout.drive.commons > 1);
            let el = |s: &str| names.contains(&s).then(|| segment_net(&g.name, d, s));
            out.push(DigitSlot {
                group: g.name.clone(),
                position: d,
                style: g.style,
                segments: g.style.segment_names().iter().filter_map(|s| el(s).map(|e| (s.to_string(), e))).collect(),
                point: el(DECIMAL_POINT),
                colon: std::iter::once(COLON).chain(COLON_DOTS).filter_map(el).collect(),
            });
        }
    }
    out
}

/// A net's front leads and pads. A lead segmask routed is drawn with its ends outside
/// their circles ([`crate::geom::stroke_lead_drawn`]): an escape lead may end on an edge
/// or corner of its segment, where the two sides of a round end flattened inside its
/// circle stay outside the segment and face each other closer than the lead's width
/// (0.1617 mm for a 0.17 mm lead, an `etched-width` error under laser-film rules). The
/// router kept the round end (its claims leave a grid cell of slack, far more than the
/// end's reach of about one tolerance further); back leads end half a lead inside their
/// islands and dots, their ends covered.
fn front_net_parts(layout: &Layout, routes: &Routes, net: &str) -> Vec<Polygon> {
    let drawn = |l: &crate::route::Lead| {
        if l.user_bus {
            l.outline.0.clone()
        } else {
            crate::geom::stroke_lead_drawn(&l.path, layout.rules.lead_width, layout.tolerance).0
        }
    };
    let leads = routes.leads.iter().filter(|l| l.plate == PlateId::Front && l.net == net).flat_map(drawn);
    let pads = routes.pads.iter().filter(|p| p.net == net).map(|p| p.outline.clone());
    leads.chain(pads).collect()
}

fn push_united(shapes: &mut Vec<Shape>, layer: Layer, role: Role, net: &str, parts: Vec<Polygon>) {
    let united: Region = union_all(parts);
    for p in united.0 {
        shapes.push(Shape { layer, role, net: Some(net.to_string()), polygon: p });
    }
}

fn nets(el: &Electrodes) -> Vec<Net> {
    let mut out: Vec<Net> = el
        .segs
        .iter()
        .map(|s| Net { name: s.net.clone(), plate: PlateId::Front, kind: NetKind::Segment, index: s.index, drives: s.drives.clone() })
        .collect();
    out.extend(el.coms.iter().map(|c| Net {
        name: c.net.clone(),
        plate: PlateId::Back,
        kind: NetKind::Common,
        index: c.index,
        drives: format!("common electrode {}", c.index + 1),
    }));
    out
}

fn pixels(el: &Electrodes) -> Vec<Pixel> {
    el.elements
        .iter()
        .enumerate()
        .map(|(i, e)| {
            let (seg, com) = el.nets_of(i);
            Pixel { element: e.name.clone(), drives: e.drives.clone(), seg_net: seg.to_string(), com_net: com.to_string(), region: e.outline.clone() }
        })
        .collect()
}

/// How far a plate label starts right of the glass's left edge, mm (mirrored on the back
/// film, where it ends as far left of the right edge).
const LABEL_INSET: f64 = 1.0;

/// How far a plate label's baseline lies above the glass's top edge, mm: outside the
/// glass, so a label never becomes ITO on the plate, and above the ends of the film's
/// corner marks, which run from 1 to 2.5 mm beyond each corner (docs/outputs.md,
/// *Films*), so that the label never meets them however narrow the glass — the panel's
/// label sits the same way above its cut-line ticks.
const LABEL_ABOVE: f64 = 3.0;

/// The plate labels: the layout name and plate, above each glass.
fn labels(layout: &Layout) -> Vec<Label> {
    let f = layout.glass.front;
    let b = layout.glass.back;
    vec![
        Label { plate: PlateId::Front, text: format!("{} FRONT", layout.name), at: crate::geom::pt(f.x + LABEL_INSET, f.y1() + LABEL_ABOVE), height: 1.5 },
        Label { plate: PlateId::Back, text: format!("{} BACK", layout.name), at: crate::geom::pt(b.x + LABEL_INSET, b.y1() + LABEL_ABOVE), height: 1.5 },
    ]
}
