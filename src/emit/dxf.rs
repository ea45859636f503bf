//! The panel's cut lines as DXF, in millimetres: `NAME.panel.cuts.dxf`.
//!
//! Takes the artwork's panel; gives a DXF drawing (read and written by the dxf crate) with
//! `$INSUNITS` = 4, millimetres (the DXF header variable), holding one LINE per cut line
//! on the layer `FRONT_CUTS` or `BACK_CUTS` and the substrate outline as four LINEs on
//! `SUBSTRATE`. Each plate's lines are drawn as that plate's panel film shows it (the back
//! plate mirrored about the substrate's centre, docs/outputs.md, *Panels*): the plate as
//! seen from its outer face, the face a scribing wheel runs on once the cell is
//! assembled. Dates and identifiers the format carries are fixed by `--date`, so the same
//! input gives the same file.

use super::mask::bbox;
use super::panel::{cut_lines, panel_of};
use crate::artwork::Artwork;
use crate::layout::PlateId;
use crate::{Error, Result};
use dxf::entities::{Entity, EntityType, Line};
use dxf::enums::{AcadVersion, Units};
use dxf::tables::Layer;
use dxf::{Drawing, Point};

/// Layer of a plate's cut lines.
pub fn cut_layer(plate: PlateId) -> &'static str {
    match plate {
        PlateId::Front => "FRONT_CUTS",
        PlateId::Back => "BACK_CUTS",
    }
}

/// Layer of the substrate outline.
pub const SUBSTRATE_LAYER: &str = "SUBSTRATE";

fn line(layer: &str, a: (f64, f64), b: (f64, f64)) -> Entity {
    let mut e = Entity::new(EntityType::Line(Line::new(Point::new(a.0, a.1, 0.0), Point::new(b.0, b.1, 0.0))));
    e.common.layer = layer.to_string();
    e
}

/// The DXF bytes of the panel's cut lines, dated `date`.
pub fn render_cuts_dxf(art: &Artwork, date: chrono::NaiveDateTime) -> Result<Vec<u8>> {
    let pa = panel_of(art)?;
    let mut d = Drawing::new();
    // R2000 is the first version with $INSUNITS (dxf crate's header specification).
    d.header.version = AcadVersion::R2000;
    d.header.default_drawing_units = Units::Millimeters;
    let local = chrono::TimeZone::from_utc_datetime(&chrono::Local, &date);
    let utc = chrono::TimeZone::from_utc_datetime(&chrono::Utc, &date);
    d.header.creation_date = local;
    d.header.update_date = local;
    d.header.creation_date_universal = utc;
    d.header.update_date_universal = utc;
    // Fixed identifiers instead of random ones: the same input gives the same bytes.
    d.header.fingerprint_guid = uuid::Uuid::from_u128(0);
    d.header.version_guid = uuid::Uuid::from_u128(0);
    let (x0, y0, x1, y1) = bbox(&pa.substrate);
    for name in [cut_layer(PlateId::Front), cut_layer(PlateId::Back), SUBSTRATE_LAYER] {
        d.add_layer(Layer { name: name.to_string(), ..Default::default() });
    }
    for plate in [PlateId::Front, PlateId::Back] {
        for [a, b] in cut_lines(pa, plate, super::mask::contact_mirrored(plate)) {
            d.add_entity(line(cut_layer(plate), (a.x, a.y), (b.x, b.y)));
        }
    }
    for (a, b) in [((x0, y0), (x1, y0)), ((x1, y0), (x1, y1)), ((x1, y1), (x0, y1)), ((x0, y1), (x0, y0))] {
        d.add_entity(line(SUBSTRATE_LAYER, a, b));
    }
    let mut bytes = Vec::new();
    d.save(&mut bytes).map_err(|e| Error::Bug(format!("DXF writer failed: {e}")))?;
    Ok(bytes)
}
