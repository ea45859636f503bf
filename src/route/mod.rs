//! Stage `route`: electrodes → leads, bus traces, pads and transfer dots.

use crate::electrode::Electrodes;
use crate::finding::Finding;
use crate::geom::{Polygon, Pt, Region};
use crate::layout::{Layout, PlateId};
use crate::Result;

/// One drawn lead or bus trace.
#[derive(Debug, Clone)]
pub struct Lead {
    /// Net.
    pub net: String,
    /// Plate.
    pub plate: PlateId,
    /// Centre line.
    pub path: Vec<Pt>,
    /// Outline.
    pub outline: Region,
    /// Drawn by the user (bus) or by segmask.
    pub user_bus: bool,
}

/// A pad and the net on it.
#[derive(Debug, Clone)]
pub struct PadSite {
    /// Pin number.
    pub pin: u32,
    /// Net.
    pub net: String,
    /// Pad outline.
    pub outline: Polygon,
}

/// A transfer dot site.
#[derive(Debug, Clone)]
pub struct TransferSite {
    /// Back-plate net it carries.
    pub net: String,
    /// Centre.
    pub at: Pt,
}

/// Everything routing adds.
#[derive(Debug, Clone)]
pub struct Routes {
    /// Leads and bus traces on both plates.
    pub leads: Vec<Lead>,
    /// Pads on the ledge.
    pub pads: Vec<PadSite>,
    /// Transfer dots.
    pub transfers: Vec<TransferSite>,
    /// Back-plate cut-outs made so front leads do not face common ITO.
    pub common_cuts: Region,
    /// Problems met while routing.
    pub findings: Vec<Finding>,
}

/// Routes every net to its pad.
pub fn route_leads(_layout: &Layout, _el: &Electrodes) -> Result<Routes> {
    Err(crate::Error::Bug("route stage not written yet".into()))
}
