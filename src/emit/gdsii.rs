//! The GDSII file of an artwork: which structure holds what.
//!
//! Takes the artwork, gives `NAME.gds`. Four structures, all in the viewer's frame (the
//! artwork's frame, nothing mirrored, in nm): `FRONT` (front ITO, front marks, front
//! glass, front labels, net names of front nets), `BACK` (the same for the back plate),
//! `CELL` (seal, transfer dots, window: the layers between the plates) and `TOP`, which
//! places the three at the origin; a viewer opening `TOP` sees the plates overlaid as the
//! display's viewer does. Beside them, one mask structure per plate for the mask shop,
//! `FRONT_MASK` and `BACK_MASK` ([`mask_structure`]): what that plate's mask carries
//! ([`super::mask`]: ITO and marks on the plate's ITO layer, compensated and mirrored as
//! the other mask files are) and its glass outline on the glass layer, nothing else.

use super::gds::{Cell, library_bytes};
use super::layer_polygons;
use super::mask::{contact_mirrored, etched_layers, mask_plate};
use super::DrawnRings;
use crate::Result;
use crate::artwork::{Artwork, Layer};
use crate::geom::interior_point;
use crate::layout::PlateId;

/// Structure names.
const FRONT: &str = "FRONT";
const BACK: &str = "BACK";
const CELL: &str = "CELL";
const TOP: &str = "TOP";

/// Name of a plate's mask structure.
pub fn mask_structure(plate: PlateId) -> &'static str {
    match plate {
        PlateId::Front => "FRONT_MASK",
        PlateId::Back => "BACK_MASK",
    }
}

/// Whether the GDSII mask structure (and the Gerber file) of `plate` is mirrored.
pub fn mask_mirrored(art: &Artwork, plate: PlateId) -> bool {
    art.masks.mirror && contact_mirrored(plate)
}

/// The mask structure of one plate: its etched polygons on its ITO layer and its glass
/// outline on its glass layer. `drawn` gives the plate's etched polygons already cut into
/// rings when at hand ([`super::Ctx::drawn_rings`]), taken when the mask is not
/// compensated ([`super::mask::MaskPlate::rings_from`]).
pub(super) fn mask_cell(art: &Artwork, plate: PlateId, drawn: Option<&DrawnRings>) -> Result<Cell> {
    let m = mask_plate(art, plate, mask_mirrored(art, plate));
    let mut cell = Cell::new(mask_structure(plate));
    let ito = art.gds_layer(Layer::ito(plate));
    match m.rings_from(drawn) {
        Some(rings) => cell.rings(ito, &rings),
        None => {
            for p in &m.etched {
                cell.polygon(ito, p)?;
            }
        }
    }
    let glass = match plate {
        PlateId::Front => Layer::FrontGlass,
        PlateId::Back => Layer::BackGlass,
    };
    cell.polygon(art.gds_layer(glass), &m.glass)?;
    Ok(cell)
}

/// Encodes the artwork as a GDSII stream dated `date`; `drawn` gives each plate's etched
/// polygons already cut into rings when at hand ([`super::Ctx::drawn_rings`]).
pub fn render_gds(art: &Artwork, date: chrono::NaiveDateTime, drawn: [Option<&DrawnRings>; 2]) -> Result<Vec<u8>> {
    let mut cells = [Cell::new(FRONT), Cell::new(BACK), Cell::new(CELL)];
    let slot = |layer: Layer| match layer.plate() {
        Some(PlateId::Front) => 0,
        Some(PlateId::Back) => 1,
        None => 2,
    };
    for layer in Layer::ALL {
        let spec = art.gds_layer(layer);
        // An etched layer's rings, when at hand.
        let made = [PlateId::Front, PlateId::Back].into_iter().enumerate().find_map(|(k, plate)| {
            let j = etched_layers(plate).iter().position(|l| *l == layer)?;
            drawn[k].map(|d| &d[j])
        });
        match made {
            Some(rings) => rings.iter().for_each(|r| cells[slot(layer)].rings(spec, r)),
            None => {
                for p in layer_polygons(art, layer) {
                    cells[slot(layer)].polygon(spec, p)?;
                }
            }
        }
    }
    for net in &art.nets {
        let ito = Layer::ito(net.plate);
        let first = art.on_layer(ito).find(|s| s.net.as_deref() == Some(net.name.as_str()));
        if let Some(at) = first.and_then(|s| interior_point(&s.polygon)) {
            cells[slot(ito)].text(art.gds_layer(ito), at, &net.name);
        }
    }
    for label in &art.labels {
        let marks = match label.plate {
            PlateId::Front => Layer::FrontMarks,
            PlateId::Back => Layer::BackMarks,
        };
        cells[slot(marks)].text(art.gds_layer(marks), label.at, &label.text);
    }
    let mut top = Cell::new(TOP);
    for name in [FRONT, BACK, CELL] {
        top.reference(name);
    }
    let [front, back, cell] = cells;
    let masks = [mask_cell(art, PlateId::Front, drawn[0])?, mask_cell(art, PlateId::Back, drawn[1])?];
    let [front_mask, back_mask] = masks;
    library_bytes(&art.name, date, vec![front, back, cell, top, front_mask, back_mask])
}
