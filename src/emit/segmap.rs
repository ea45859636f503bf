//! The segment map `NAME.segmap.csv` / `NAME.segmap.json`: which (COM, SEG) pair
//! switches which element — the table firmware is written from.
//!
//! Takes the artwork's pixels, nets and pins, gives one row per pixel sorted by COM
//! index, then SEG line, then element name: the element, what it drives, its COM and SEG
//! (1-based index, net, pin), the area of the pixel and its centre of area in mm, front
//! plate, viewer's frame. CSV per RFC 4180, JSON per RFC 8259. Under static drive every
//! row has COM 1 and its own SEG line; under 1/N duty up to N rows share a SEG line.

use super::csv::{field, fixed4, opt_u32, round4};
use super::drive_info::{bias_name, duty_name};
use crate::artwork::{Artwork, Pixel};
use crate::geom::bands::Banded;
use std::collections::HashMap;
use crate::{Error, Result};
use serde::Serialize;

/// Header line of `NAME.segmap.csv`.
pub const HEADER: &str = "element,drives,com,com_net,com_pin,seg,seg_net,seg_pin,area_mm2,centroid_x_mm,centroid_y_mm,coverage\n";

/// One element of the segment map (a row of the CSV, an entry of the JSON).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SegmentRow {
    /// Element name (`D1.a`, `deg`, …).
    pub element: String,
    /// What it shows, for people (the element's own description).
    pub drives: String,
    /// 1-based COM index; `None` when the COM net is not in the net list.
    pub com: Option<u32>,
    /// COM net name.
    pub com_net: String,
    /// Lowest pin carrying the COM net; `None` without a pad.
    pub com_pin: Option<u32>,
    /// 1-based SEG line; `None` when the SEG net is not in the net list.
    pub seg: Option<u32>,
    /// SEG net name.
    pub seg_net: String,
    /// Lowest pin carrying the SEG net; `None` without a pad.
    pub seg_pin: Option<u32>,
    /// Area of the pixel region, mm², 4 decimals.
    pub area_mm2: f64,
    /// Centre of area, x, mm, 4 decimals; `None` for an empty pixel.
    pub centroid_x_mm: Option<f64>,
    /// Centre of area, y, mm, 4 decimals; `None` for an empty pixel.
    pub centroid_y_mm: Option<f64>,
    /// Share of the pixel its common's back ITO faces (1 = all of it), 4 decimals;
    /// `None` for an empty pixel.
    pub coverage: Option<f64>,
}

#[derive(Serialize)]
struct SegmapJson<'a> {
    name: &'a str,
    duty: String,
    bias: Option<String>,
    elements: Vec<SegmentRow>,
}

fn lowest_pin(art: &Artwork, net: &str) -> Option<u32> {
    art.pins.iter().filter(|p| p.net == net).map(|p| p.number).min()
}

fn row(art: &Artwork, p: &Pixel, back: &Banded) -> SegmentRow {
    let seg = art.net(&p.seg_net);
    let drives = p.drives.clone();
    let c = crate::geom::centroid(&p.region);
    SegmentRow {
        element: p.element.clone(),
        drives,
        com: art.net(&p.com_net).map(|n| n.index + 1),
        com_net: p.com_net.clone(),
        com_pin: lowest_pin(art, &p.com_net),
        seg: seg.map(|n| n.index + 1),
        seg_net: p.seg_net.clone(),
        seg_pin: lowest_pin(art, &p.seg_net),
        area_mm2: round4(crate::geom::area(&p.region)),
        centroid_x_mm: c.map(|c| round4(c.x)),
        centroid_y_mm: c.map(|c| round4(c.y)),
        coverage: coverage(p, back).map(round4),
    }
}

/// Area of the pixel faced by back ITO of its common (`back`, cut into bands), over the
/// pixel's area.
fn coverage(p: &Pixel, back: &Banded) -> Option<f64> {
    use geo::BoundingRect;
    let whole = crate::geom::area(&p.region);
    let bbox = p.region.bounding_rect()?;
    // The common cut down to the pixel's box (grown a little) from the band that holds
    // it: a common electrode spans the glass, and a boolean with all of it, or a cut of
    // all of it, for every pixel costs the whole electrode each time.
    let faced = crate::geom::area(&crate::geom::intersection(&p.region, &back.near(&bbox)));
    (whole > 0.0).then(|| (faced / whole).min(1.0))
}

/// The back ITO of each common, cut into bands once.
fn commons_banded(art: &Artwork) -> HashMap<&str, Banded> {
    let mut by_net: HashMap<&str, Vec<crate::geom::Polygon>> = HashMap::new();
    for p in &art.pixels {
        by_net.entry(p.com_net.as_str()).or_default();
    }
    for s in art.shapes.iter().filter(|s| s.layer == crate::artwork::Layer::BackIto) {
        if let Some(polys) = s.net.as_deref().and_then(|n| by_net.get_mut(n)) {
            polys.push(s.polygon.clone());
        }
    }
    by_net.into_iter().map(|(n, polys)| (n, Banded::of(&crate::geom::region_of(polys)))).collect()
}

/// Every pixel as a segment-map row, sorted by COM index, SEG line, element name (rows
/// whose net is unknown sort after the others).
pub fn segment_rows(art: &Artwork) -> Vec<SegmentRow> {
    let backs = commons_banded(art);
    let mut rows: Vec<SegmentRow> = art.pixels.iter().map(|p| row(art, p, &backs[p.com_net.as_str()])).collect();
    let key = |r: &SegmentRow| (r.com.unwrap_or(u32::MAX), r.seg.unwrap_or(u32::MAX));
    rows.sort_by(|a, b| key(a).cmp(&key(b)).then_with(|| a.element.cmp(&b.element)));
    rows
}

/// `NAME.segmap.csv`: the header and one row per pixel; absent values are empty cells.
pub fn render_segmap_csv(art: &Artwork) -> Vec<u8> {
    csv_of(&segment_rows(art))
}

/// The CSV of rows already made (`segment_rows`).
pub fn csv_of(rows: &[SegmentRow]) -> Vec<u8> {
    let mut out = String::from(HEADER);
    for r in rows.iter().cloned() {
        let cells = [
            field(&r.element),
            field(&r.drives),
            opt_u32(r.com),
            field(&r.com_net),
            opt_u32(r.com_pin),
            opt_u32(r.seg),
            field(&r.seg_net),
            opt_u32(r.seg_pin),
            fixed4(r.area_mm2),
            r.centroid_x_mm.map(fixed4).unwrap_or_default(),
            r.centroid_y_mm.map(fixed4).unwrap_or_default(),
            r.coverage.map(fixed4).unwrap_or_default(),
        ];
        out.push_str(&cells.join(","));
        out.push('\n');
    }
    out.into_bytes()
}

/// `NAME.segmap.json`: `{"name", "duty", "bias", "elements": [rows]}`, pretty-printed;
/// absent values are `null`.
pub fn render_segmap_json(art: &Artwork) -> Result<Vec<u8>> {
    json_of(art, segment_rows(art))
}

/// The JSON of rows already made (`segment_rows`).
pub fn json_of(art: &Artwork, rows: Vec<SegmentRow>) -> Result<Vec<u8>> {
    let doc = SegmapJson { name: &art.name, duty: duty_name(art.drive), bias: bias_name(art.drive), elements: rows };
    let mut bytes = serde_json::to_vec_pretty(&doc).map_err(|e| Error::Bug(format!("segment map JSON: {e}")))?;
    bytes.push(b'\n');
    Ok(bytes)
}

#[cfg(test)]
#[path = "segmap_tests.rs"]
mod tests;
