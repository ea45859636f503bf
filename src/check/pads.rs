//! Rule `pad-covered`: a pad not fully exposed on the ledge.
//!
//! Takes the artwork; gives one error per pin whose pad polygon reaches outside the
//! ledge (under the back glass, or off the front glass), with the covered area.

use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom;
use crate::layout::PlateId;
use geo::InteriorPoint;

/// Covered areas at or below this (1 µm²) are boolean noise.
pub const MIN_COVERED_MM2: f64 = 1e-6;

/// Reports every pad that is not wholly on the ledge.
pub fn check_pads(art: &Artwork) -> Vec<Finding> {
    let mut out = Vec::new();
    for pin in &art.pins {
        let covered = geom::difference(&geom::region_of([pin.pad.clone()]), &art.ledge);
        let area = geom::area(&covered);
        if area <= MIN_COVERED_MM2 {
            continue;
        }
        let biggest = covered.0.iter().max_by(|a, b| geom::area(*a).total_cmp(&geom::area(*b)));
        let at = biggest.and_then(|p| p.interior_point()).map(|p| p.0).unwrap_or(pin.pad.exterior().0[0]);
        out.push(Finding {
            rule: Rule::PadCovered,
            severity: Severity::Error,
            plate: Some(PlateId::Front),
            nets: vec![pin.net.clone()],
            location: at,
            measured: Some(area),
            required: Some(0.0),
            message: format!(
                "the pad of pin {} (net {}) has {area:.4} mm² off the ledge, under the back glass or off the front glass",
                pin.number, pin.net
            ),
        });
    }
    out
}
