//! What one plate's mask carries, in the mask's own frame: the one place where mirroring
//! and etch compensation are decided for every mask writer (SVG and PDF films, Gerber,
//! the GDSII mask structures).
//!
//! Takes the artwork, a plate and whether the plate is to be mirrored, gives the plate's
//! etched polygons (ITO and alignment marks — grown by the undercut when the rules ask
//! for compensation, [`Artwork::film_layer`]), its glass outline and its labels, all in
//! millimetres, y up, mirrored about the centre of the plate's glass when asked. Mirroring
//! only moves coordinates (x → x0 + x1 − x) and reverses each ring so that outer rings
//! stay counter-clockwise; nothing else is computed here.

use crate::artwork::{Artwork, Layer};
use crate::geom::{Polygon, Pt, orient_ccw, pt};
use crate::layout::PlateId;

/// Whether a mask for contact printing must carry this plate mirrored relative to the
/// viewer's frame: the back plate yes, the front plate no (docs/outputs.md, *Which way
/// round (mirroring), worked out*; docs/background.md, *Mirroring*).
pub fn contact_mirrored(plate: PlateId) -> bool {
    plate == PlateId::Back
}

/// The etched layers of a plate: ITO and its alignment marks.
pub fn etched_layers(plate: PlateId) -> [Layer; 2] {
    match plate {
        PlateId::Front => [Layer::FrontIto, Layer::FrontMarks],
        PlateId::Back => [Layer::BackIto, Layer::BackMarks],
    }
}

/// A plate label placed in the mask frame.
#[derive(Debug, Clone)]
pub struct MaskLabel {
    /// Text.
    pub text: String,
    /// Lower-left of the text as drawn, mm (after mirroring: see `mirrored`).
    pub at: Pt,
    /// Cap height, mm.
    pub height: f64,
    /// True when the label is drawn mirrored (its strokes run right to left).
    pub mirrored: bool,
}

/// One plate as its mask carries it.
#[derive(Debug, Clone)]
pub struct MaskPlate {
    /// The plate.
    pub plate: PlateId,
    /// True when mirrored about the glass centre (x → x0 + x1 − x).
    pub mirrored: bool,
    /// True when the etched polygons are grown by the undercut (etch compensation).
    pub compensated: bool,
    /// Etch bias per edge applied to the etched polygons, mm (0 when not compensated).
    pub bias: f64,
    /// Etched polygons (ITO and marks), outer rings counter-clockwise.
    pub etched: Vec<Polygon>,
    /// The glass outline.
    pub glass: Polygon,
    /// Bounding box of the glass (x0, y0, x1, y1).
    pub glass_box: (f64, f64, f64, f64),
    /// Plate labels.
    pub labels: Vec<MaskLabel>,
}

/// Bounding box of a polygon's outer ring.
pub fn bbox(p: &Polygon) -> (f64, f64, f64, f64) {
    p.exterior().0.iter().fold((f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY), |b, q| {
        (b.0.min(q.x), b.1.min(q.y), b.2.max(q.x), b.3.max(q.y))
    })
}

/// `p` mirrored about the vertical line `x = axis / 2` (x → axis − x), outer ring
/// counter-clockwise again.
pub(crate) fn mirror_polygon(p: &Polygon, axis: f64) -> Polygon {
    let flip = |r: &geo::LineString<f64>| geo::LineString::from(r.0.iter().map(|q| pt(axis - q.x, q.y)).collect::<Vec<_>>());
    orient_ccw(&Polygon::new(flip(p.exterior()), p.interiors().iter().map(flip).collect()))
}

/// The mask of `plate`, mirrored when `mirror` is true.
pub fn mask_plate(art: &Artwork, plate: PlateId, mirror: bool) -> MaskPlate {
    let glass = art.glass(plate);
    let glass_box = bbox(glass);
    let axis = glass_box.0 + glass_box.2;
    let place = |p: &Polygon| if mirror { mirror_polygon(p, axis) } else { p.clone() };
    let etched = etched_layers(plate).into_iter().flat_map(|l| art.film_layer(l)).map(|s| place(&s.polygon)).collect();
    let labels = art
        .labels
        .iter()
        .filter(|l| l.plate == plate)
        .map(|l| {
            let w = super::text::text_width(&l.text, l.height);
            let x = if mirror { axis - l.at.x - w } else { l.at.x };
            MaskLabel { text: l.text.clone(), at: pt(x, l.at.y), height: l.height, mirrored: mirror }
        })
        .collect();
    let compensated = !art.film_shapes.is_empty();
    MaskPlate {
        plate,
        mirrored: mirror,
        compensated,
        bias: if compensated { art.rules.film_bias() } else { 0.0 },
        etched,
        glass: place(glass),
        glass_box,
        labels,
    }
}

/// The whole mask mirrored about the centre of its glass box (x → x0 + x1 − x): etched
/// polygons, glass and labels, each label's strokes reversed too.
pub fn mirror_mask(m: MaskPlate) -> MaskPlate {
    let axis = m.glass_box.0 + m.glass_box.2;
    let labels = m
        .labels
        .into_iter()
        .map(|l| {
            let w = super::text::text_width(&l.text, l.height);
            MaskLabel { at: pt(axis - l.at.x - w, l.at.y), mirrored: !l.mirrored, ..l }
        })
        .collect();
    MaskPlate {
        mirrored: !m.mirrored,
        etched: m.etched.iter().map(|p| mirror_polygon(p, axis)).collect(),
        glass: mirror_polygon(&m.glass, axis),
        labels,
        ..m
    }
}

impl MaskPlate {
    /// The mirror axis in whole nanometres: x0 + x1 of the glass box (mirroring is
    /// x → x0 + x1 − x).
    pub fn axis_nm(&self) -> i64 {
        ((self.glass_box.0 + self.glass_box.2) * 1e6).round() as i64
    }

    /// The boundary rings of this mask's etched polygons taken from the plate's rings as
    /// drawn ([`super::Ctx::drawn_rings`]), mirrored in whole nanometres when the mask is:
    /// a mask without etch compensation carries the drawn polygons, so no writer need cut
    /// them again. `None` when compensated or when no rings are at hand.
    pub fn rings_from(&self, drawn: Option<&super::DrawnRings>) -> Option<Vec<super::split::NmRing>> {
        let all: Vec<super::split::NmRing> = drawn.filter(|_| !self.compensated)?.iter().flatten().flatten().cloned().collect();
        Some(if self.mirrored { super::split::mirror_rings(&all, self.axis_nm()) } else { all })
    }
}

impl MaskLabel {
    /// The label's strokes in the mask frame (mm, y up), mirrored when the label is.
    pub fn strokes(&self) -> Vec<Vec<Pt>> {
        let w = super::text::text_width(&self.text, self.height);
        super::text::text_strokes(&self.text, self.height)
            .into_iter()
            .map(|s| {
                s.into_iter()
                    .map(|(u, v)| pt(if self.mirrored { self.at.x + w - u } else { self.at.x + u }, self.at.y + v))
                    .collect()
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, rect};

    /// Mirroring keeps the area and the glass box, and swaps left and right.
    #[test]
    fn mirror_keeps_area_and_swaps_sides() {
        let p = rect(1.0, 2.0, 3.0, 5.0);
        let m = mirror_polygon(&p, 10.0);
        assert!((area(&m) - area(&p)).abs() < 1e-12);
        assert_eq!(bbox(&m), (7.0, 2.0, 9.0, 5.0));
        assert!(crate::emit::svg_path::signed_area2(&m.exterior().0) > 0.0);
    }
}
