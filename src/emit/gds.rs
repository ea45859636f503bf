//! The one small wrapper around gds21.
//!
//! Takes structures of polygons (mm), texts and references, gives the bytes of a GDSII
//! stream that is the same for the same input: gds21's defaults are replaced where
//! docs/crate-notes.md (*gds21*) finds them wanting — the version is 600 (release 6.0)
//! instead of 3, the
//! dates are the build date instead of "now", rings are closed, deduplicated, made
//! hole-free and kept below the point limit ([`super::split`]).

use super::split::{boundary_rings, NmRing};
use crate::geom::{Polygon, Pt};
use crate::{Error, Result};
use gds21::{
    GdsBoundary, GdsDateTimes, GdsElement, GdsLibrary, GdsPoint, GdsStruct, GdsStructRef, GdsTextElem, GdsUnits,
};

/// Stream format version written in HEADER (release 6.0 writes 600).
const VERSION: i16 = 600;

/// Size of a database unit in user units: 1 nm in a 1 µm user unit.
const DB_IN_USER: f64 = 1e-3;
/// Size of a database unit in metres: 1 nm.
const DB_IN_METRES: f64 = 1e-9;

/// A GDSII layer number and datatype (or texttype).
pub type LayerSpec = (i16, i16);

/// One structure being filled.
#[derive(Debug)]
pub struct Cell {
    name: String,
    elems: Vec<GdsElement>,
}

impl Cell {
    /// An empty structure; the name is sanitised like every GDSII name.
    pub fn new(name: &str) -> Cell {
        Cell { name: gds_name(name), elems: Vec::new() }
    }

    /// Adds a polygon as one or more hole-free BOUNDARY elements.
    pub fn polygon(&mut self, spec: LayerSpec, p: &Polygon) -> Result<()> {
        self.rings(spec, &boundary_rings(p)?);
        Ok(())
    }

    /// Adds rings already made hole-free and below the point limit ([`boundary_rings`]),
    /// one BOUNDARY element each.
    pub fn rings(&mut self, (layer, datatype): LayerSpec, rings: &[NmRing]) {
        for ring in rings {
            let xy = ring.iter().map(|&(x, y)| GdsPoint::new(x, y)).collect();
            self.elems.push(GdsBoundary { layer, datatype, xy, ..Default::default() }.into());
        }
    }

    /// Adds a TEXT element at `at` (snapped to 1 nm); characters outside printable ASCII
    /// become `?` and the string is cut at 512 characters (the format's limit).
    pub fn text(&mut self, (layer, texttype): LayerSpec, at: Pt, s: &str) {
        let string: String =
            s.chars().map(|c| if c.is_ascii_graphic() || c == ' ' { c } else { '?' }).take(512).collect();
        let xy = GdsPoint::new(nm(at.x), nm(at.y));
        self.elems.push(GdsTextElem { string, layer, texttype, xy, ..Default::default() }.into());
    }

    /// Adds a reference to another structure, placed at the origin, unrotated.
    pub fn reference(&mut self, name: &str) {
        self.reference_at(name, crate::geom::pt(0.0, 0.0));
    }

    /// Adds a reference to another structure with its origin at `at` (mm, snapped to
    /// 1 nm), unrotated and unreflected.
    pub fn reference_at(&mut self, name: &str, at: Pt) {
        let r = GdsStructRef { name: gds_name(name), xy: GdsPoint::new(nm(at.x), nm(at.y)), ..Default::default() };
        self.elems.push(r.into());
    }
}

/// Millimetres to whole nanometres.
fn nm(mm: f64) -> i32 {
    (mm * 1e6).round() as i32
}

/// A GDSII name: letters, digits, `_`, `?` and `$` only, at most 32 characters
/// (docs/background.md, *GDSII*); anything else becomes `_`, and an empty name becomes `SEGMASK`.
///
/// ```
/// use segmask::emit::gds::gds_name;
/// assert_eq!(gds_name("clock 7-seg"), "clock_7_seg");
/// assert_eq!(gds_name(""), "SEGMASK");
/// ```
pub fn gds_name(s: &str) -> String {
    let n: String = s
        .chars()
        .map(|c| if c.is_ascii_alphanumeric() || matches!(c, '_' | '?' | '$') { c } else { '_' })
        .take(32)
        .collect();
    if n.is_empty() { "SEGMASK".into() } else { n }
}

/// Midnight of a `YYYY-MM-DD` date, or `None` when it is not a calendar date.
pub fn parse_date(date: &str) -> Option<chrono::NaiveDateTime> {
    chrono::NaiveDate::parse_from_str(date, "%Y-%m-%d").ok()?.and_hms_opt(0, 0, 0)
}

/// Encodes a library holding `cells` (in order) with 1 µm user units and 1 nm database
/// units; every date is `date`.
pub fn library_bytes(name: &str, date: chrono::NaiveDateTime, cells: Vec<Cell>) -> Result<Vec<u8>> {
    let dates = GdsDateTimes { modified: date, accessed: date };
    let structs = cells.into_iter().map(|c| GdsStruct { name: c.name, dates: dates.clone(), elems: c.elems }).collect();
    let lib = GdsLibrary {
        name: gds_name(name),
        version: VERSION,
        dates: dates.clone(),
        units: GdsUnits::new(DB_IN_USER, DB_IN_METRES),
        structs,
        ..Default::default()
    };
    let mut bytes = Vec::new();
    lib.write(&mut bytes).map_err(|e| Error::Bug(format!("GDSII writer failed: {e}")))?;
    Ok(bytes)
}
