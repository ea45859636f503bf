//! The panel's own geometry: where each cell sits on the substrate, the cut lines of
//! each plate, and the panel's alignment marks.
//!
//! Takes the layout (its `panel:` and the cell's glass, marks and rules); gives a
//! [`PanelArt`] in the *panel frame*: the viewer's frame of the whole substrate, origin at
//! its lower-left corner, mm. Cells are stepped by their footprint (both glass outlines)
//! plus the spacing, rows from the bottom, the array centred on the substrate. Cut lines
//! run straight across the whole substrate (glass is scored and broken edge to edge,
//! *common practice*) at every x and y where a cell's glass edge lies, per plate. The
//! alignment marks — the cell's own mark shapes (a cross on the front, four squares
//! around it on the back), [`PANEL_MARK`] across — sit in the substrate's four corners,
//! in the border no cut line reaches, in register on both plates.

use super::marks::{back_squares, front_cross};
use crate::artwork::{Layer, PanelArt};
use crate::geom::{Polygon, pt, rect};
use crate::layout::{Layout, Panel, PlateId};

/// Outer size of a panel alignment mark, mm.
pub const PANEL_MARK: f64 = Panel::MARK;

/// The panel of a layout that asks for one.
pub fn panel_art(layout: &Layout) -> Option<PanelArt> {
    let panel = layout.masks.panel?;
    let (fx0, fy0, fx1, fy1) = layout.glass.footprint();
    let (cw, ch) = (fx1 - fx0, fy1 - fy0);
    let array_w = panel.columns as f64 * cw + (panel.columns as f64 - 1.0) * panel.spacing;
    let array_h = panel.rows as f64 * ch + (panel.rows as f64 - 1.0) * panel.spacing;
    let (ax, ay) = ((panel.width - array_w) / 2.0, (panel.height - array_h) / 2.0);
    let mut offsets = Vec::new();
    for r in 0..panel.rows {
        for c in 0..panel.columns {
            offsets.push(pt(ax + c as f64 * (cw + panel.spacing) - fx0, ay + r as f64 * (ch + panel.spacing) - fy0));
        }
    }
    let cuts = |plate: PlateId| {
        let g = match plate {
            PlateId::Front => layout.glass.front,
            PlateId::Back => layout.glass.back,
        };
        let mut xs: Vec<f64> = offsets.iter().flat_map(|o| [o.x + g.x, o.x + g.x1()]).collect();
        let mut ys: Vec<f64> = offsets.iter().flat_map(|o| [o.y + g.y, o.y + g.y1()]).collect();
        for v in [&mut xs, &mut ys] {
            v.sort_by(f64::total_cmp);
            v.dedup_by(|a, b| (*a - *b).abs() < 1e-6);
        }
        let mut lines: Vec<[crate::geom::Pt; 2]> = xs.iter().map(|&x| [pt(x, 0.0), pt(x, panel.height)]).collect();
        lines.extend(ys.iter().map(|&y| [pt(0.0, y), pt(panel.width, y)]));
        lines
    };
    let d = Panel::BORDER / 2.0;
    let centres = [pt(d, d), pt(panel.width - d, d), pt(d, panel.height - d), pt(panel.width - d, panel.height - d)];
    let mut marks: Vec<(Layer, Polygon)> = Vec::new();
    for c in centres {
        marks.extend(front_cross(c, PANEL_MARK, layout.marks.line).into_iter().map(|p| (Layer::FrontMarks, p)));
        marks.extend(back_squares(c, PANEL_MARK, layout.marks.line).into_iter().map(|p| (Layer::BackMarks, p)));
    }
    let bias = layout.rules.film_bias();
    let film_marks = if bias > 0.0 {
        marks.iter().map(|(l, p)| (*l, crate::geom::offset_mitre(&crate::geom::region_of([p.clone()]), bias))).flat_map(|(l, r)| r.0.into_iter().map(move |p| (l, p))).collect()
    } else {
        marks.clone()
    };
    let (front_cuts, back_cuts) = (cuts(PlateId::Front), cuts(PlateId::Back));
    Some(PanelArt {
        panel,
        substrate: rect(0.0, 0.0, panel.width, panel.height),
        offsets,
        front_cuts,
        back_cuts,
        marks,
        film_marks,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Two columns of the fixture's cell, 2 mm apart, on a substrate with 10 mm to spare
    /// on each side: cells are one footprint plus the spacing apart and centred, every
    /// cut line spans the substrate, and the marks lie in the border.
    #[test]
    fn cells_step_by_footprint_and_cuts_span_the_substrate() {
        let mut layout = crate::layout::fixture::tiny_layout();
        let (fx0, fy0, fx1, fy1) = layout.glass.footprint();
        let (cw, ch) = (fx1 - fx0, fy1 - fy0);
        let panel = Panel { rows: 1, columns: 2, spacing: 2.0, scribe_lane: 0.2, width: 2.0 * cw + 22.0, height: ch + 20.0 };
        layout.masks.panel = Some(panel);
        let art = panel_art(&layout).unwrap();
        assert_eq!(art.offsets.len(), 2);
        assert!((art.offsets[1].x - art.offsets[0].x - (cw + 2.0)).abs() < 1e-9);
        assert!((art.offsets[0].x + fx0 - 10.0).abs() < 1e-9 && (art.offsets[0].y + fy0 - 10.0).abs() < 1e-9);
        for [a, b] in art.front_cuts.iter().chain(&art.back_cuts) {
            let len = ((b.x - a.x).powi(2) + (b.y - a.y).powi(2)).sqrt();
            assert!((len - panel.width).abs() < 1e-9 || (len - panel.height).abs() < 1e-9);
        }
        for (_, p) in &art.marks {
            for q in &p.exterior().0 {
                let inside_border = q.x < Panel::BORDER || q.x > panel.width - Panel::BORDER;
                assert!(inside_border, "mark point {q:?} outside the border");
            }
        }
    }
}
