//! The GDSII file of an artwork: which structure holds what.
//!
//! Takes the artwork, gives `NAME.gds`. Four structures, all in the viewer's frame (the
//! artwork's frame, nothing mirrored, in nm): `FRONT` (front ITO, front marks, front
//! glass, front labels, net names of front nets), `BACK` (the same for the back plate),
//! `CELL` (seal, transfer dots, window: the layers between the plates) and `TOP`, which
//! places the three at the origin. A mask shop can take one plate's structure alone;
//! a viewer opening `TOP` sees the plates overlaid as the display's viewer does.

use super::gds::{Cell, library_bytes};
use super::layer_polygons;
use crate::Result;
use crate::artwork::{Artwork, Layer};
use crate::geom::interior_point;
use crate::layout::PlateId;

/// Structure names.
const FRONT: &str = "FRONT";
const BACK: &str = "BACK";
const CELL: &str = "CELL";
const TOP: &str = "TOP";

/// Encodes the artwork as a GDSII stream dated `date`.
pub fn render_gds(art: &Artwork, date: chrono::NaiveDateTime) -> Result<Vec<u8>> {
    let mut cells = [Cell::new(FRONT), Cell::new(BACK), Cell::new(CELL)];
    let slot = |layer: Layer| match layer.plate() {
        Some(PlateId::Front) => 0,
        Some(PlateId::Back) => 1,
        None => 2,
    };
    for layer in Layer::ALL {
        let spec = art.gds_layer(layer);
        for p in layer_polygons(art, layer) {
            cells[slot(layer)].polygon(spec, p)?;
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
    library_bytes(&art.name, date, vec![front, back, cell, top])
}
