//! The panel's mask files: several cells on one substrate (`panel:` in the layout).
//!
//! Takes the artwork and its [`PanelArt`]; gives each plate's panel mask — the cell's
//! mask ([`super::mask`]: compensated when the rules ask) placed at every cell position,
//! the panel's alignment marks, the substrate as the glass — and the files made from it:
//! films (SVG, one PDF with both plates), Gerber and GDSII. Mirroring follows the cell's
//! rules, about the substrate's centre: films always as contact printing needs (the back
//! plate mirrored), Gerber and GDSII as `masks.mirror` says. Mirroring a whole panel about
//! the substrate's centre is the same as mirroring each cell about its own centre and
//! swapping the columns, so a panel's back plate still lies over its front plate cell for
//! cell. Placing only translates coordinates; nothing is computed here.

use super::drawing::Drawing;
use super::gds::{Cell, library_bytes};
use super::gdsii::{mask_cell, mask_mirrored, mask_structure};
use super::mask::{MaskLabel, MaskPlate, bbox, contact_mirrored, etched_layers, mask_plate, mirror_mask};
use crate::artwork::{Artwork, Layer, PanelArt};
use crate::geom::{Polygon, Pt, pt};
use crate::layout::PlateId;
use crate::{Error, Result};
use geo::Translate;

/// Height of the panel label, mm (as a cell's plate label).
const LABEL_HEIGHT: f64 = 1.5;

/// The artwork's panel, or a bug error when a panel file is asked for without one.
pub fn panel_of(art: &Artwork) -> Result<&PanelArt> {
    art.panel.as_ref().ok_or_else(|| Error::Bug("panel output without a panel".into()))
}

/// Words naming the panel: `NAME PANEL 2 X 3` (rows × columns).
pub fn panel_name(art: &Artwork, pa: &PanelArt) -> String {
    format!("{} PANEL {} X {}", art.name, pa.panel.rows, pa.panel.columns)
}

/// Name of a plate's panel structure in the panel GDSII.
pub fn panel_structure(plate: PlateId) -> &'static str {
    match plate {
        PlateId::Front => "FRONT_PANEL",
        PlateId::Back => "BACK_PANEL",
    }
}

/// The panel's alignment marks on one plate, as its mask carries them (panel frame).
fn plate_marks(pa: &PanelArt, plate: PlateId) -> impl Iterator<Item = &Polygon> {
    let layer = etched_layers(plate)[1];
    pa.film_marks.iter().filter(move |(l, _)| *l == layer).map(|(_, p)| p)
}

/// One plate's panel mask, mirrored about the substrate's centre when `mirror`.
pub fn panel_mask(art: &Artwork, pa: &PanelArt, plate: PlateId, mirror: bool) -> MaskPlate {
    let cell = mask_plate(art, plate, false);
    let mut etched: Vec<Polygon> =
        pa.offsets.iter().flat_map(|o| cell.etched.iter().map(move |p| p.translate(o.x, o.y))).collect();
    etched.extend(plate_marks(pa, plate).cloned());
    let glass_box = bbox(&pa.substrate);
    let label = MaskLabel {
        text: format!("{} {}", panel_name(art, pa), plate.name().to_uppercase()),
        // Above the cut-line ticks, which end 2.5 mm above the substrate.
        at: pt(glass_box.0 + 1.0, glass_box.3 + 3.0),
        height: LABEL_HEIGHT,
        mirrored: false,
    };
    let m = MaskPlate {
        plate,
        mirrored: false,
        compensated: cell.compensated,
        bias: cell.bias,
        etched,
        glass: pa.substrate.clone(),
        glass_box,
        labels: vec![label],
    };
    if mirror { mirror_mask(m) } else { m }
}

/// A plate's cut lines, mirrored about the substrate's centre when `mirror` (panel frame).
pub fn cut_lines(pa: &PanelArt, plate: PlateId, mirror: bool) -> Vec<[Pt; 2]> {
    let (x0, _, x1, _) = bbox(&pa.substrate);
    let flip = |p: Pt| if mirror { pt(x0 + x1 - p.x, p.y) } else { p };
    pa.cuts(plate).iter().map(|[a, b]| [flip(*a), flip(*b)]).collect()
}

/// Where each cut line leaves the substrate, marked on the film like the corner marks:
/// a short line continuing the cut outward at both ends ([`super::film::CORNER_MARK`]).
fn cut_ticks(pa: &PanelArt, plate: PlateId, mirror: bool) -> Vec<[Pt; 2]> {
    let (x0, y0, x1, y1) = bbox(&pa.substrate);
    let (a, b) = super::film::CORNER_MARK;
    let mut out = Vec::new();
    for [p, q] in cut_lines(pa, plate, mirror) {
        if (p.x - q.x).abs() < 1e-9 {
            out.push([pt(p.x, y0 - a), pt(p.x, y0 - b)]);
            out.push([pt(p.x, y1 + a), pt(p.x, y1 + b)]);
        } else {
            out.push([pt(x0 - a, p.y), pt(x0 - b, p.y)]);
            out.push([pt(x1 + a, p.y), pt(x1 + b, p.y)]);
        }
    }
    out
}

/// One plate's panel film (always as contact printing needs it).
pub fn panel_film(art: &Artwork, plate: PlateId, date: &str, errors: usize) -> Result<Drawing> {
    let pa = panel_of(art)?;
    let mirror = contact_mirrored(plate);
    let m = panel_mask(art, pa, plate, mirror);
    super::film::film_page(art, &m, &cut_ticks(pa, plate, mirror), &panel_name(art, pa), date, errors)
}

/// Both plates' panel films.
pub fn panel_films(art: &Artwork, date: &str, errors: usize) -> Result<Vec<Drawing>> {
    [PlateId::Front, PlateId::Back].into_iter().map(|p| panel_film(art, p, date, errors)).collect()
}

/// One plate's panel Gerber file (mirrored as `masks.mirror` says).
pub fn panel_gerber(art: &Artwork, plate: PlateId, date: chrono::NaiveDateTime) -> Result<Vec<u8>> {
    let pa = panel_of(art)?;
    let m = panel_mask(art, pa, plate, mask_mirrored(art, plate));
    let words = format!("{} plate ITO panel {}x{}", if plate == PlateId::Front { "Front" } else { "Back" }, pa.panel.rows, pa.panel.columns);
    super::gerber::gerber_of_mask(art, &m, &words, date)
}

/// The panel GDSII: the cell's two mask structures and, per plate, a panel structure
/// that references its cell mask at every cell position (mirrored placement when the
/// mask is mirrored) and holds the panel's alignment marks on the plate's ITO layer and
/// the substrate on its glass layer.
pub fn panel_gds(art: &Artwork, date: chrono::NaiveDateTime) -> Result<Vec<u8>> {
    let pa = panel_of(art)?;
    let (sx0, _, sx1, _) = bbox(&pa.substrate);
    let mut cells = vec![mask_cell(art, PlateId::Front, None)?, mask_cell(art, PlateId::Back, None)?];
    for plate in [PlateId::Front, PlateId::Back] {
        let mirror = mask_mirrored(art, plate);
        let (gx0, _, gx1, _) = bbox(art.glass(plate));
        let mut cell = Cell::new(panel_structure(plate));
        for o in &pa.offsets {
            // The mask structure is already mirrored about its own glass centre; its
            // cell lands where the panel mirrored about the substrate centre puts it.
            let x = if mirror { sx0 + sx1 - o.x - (gx0 + gx1) } else { o.x };
            cell.reference_at(mask_structure(plate), pt(x, o.y));
        }
        let m = panel_mask(art, pa, plate, mirror);
        let ito = art.gds_layer(Layer::ito(plate));
        let n = m.etched.len();
        let marks = plate_marks(pa, plate).count();
        for p in &m.etched[n - marks..] {
            cell.polygon(ito, p)?;
        }
        let glass = match plate {
            PlateId::Front => Layer::FrontGlass,
            PlateId::Back => Layer::BackGlass,
        };
        cell.polygon(art.gds_layer(glass), &m.glass)?;
        cells.push(cell);
    }
    library_bytes(&format!("{}_PANEL", art.name), date, cells)
}
