//! Rule `edge-clearance`: ITO too close to its own plate's glass edge.
//!
//! Takes the artwork and its [`Extraction`]. The rule protects the electrodes from
//! chipping at the cut edge and keeps ITO off the cut line; only the pads, which the
//! connector must reach at the ledge's edge, may come nearer than the clearance. So, per
//! component of each plate (marks included):
//!
//! * (a) no ITO may cross, touch or lie outside the glass outline (required: more than
//!   0 mm inside; measured 0 when crossing or touching, minus the distance when outside);
//! * (b) otherwise, the ITO less the pads (each pin's pad outline) must keep
//!   `rules.edge_clearance` from the glass edge.
//!
//! Distances are between outlines, through an R-tree of the glass edges; the pads a
//! component may hold come from an R-tree of pad boxes.

use super::connectivity::{Component, Extraction};
use super::index::{bbox_of_polygon, bbox_of_region, closest_to_small, meeting_point, region_edges, BoxIndex, EdgeIndex};
use super::shorts::list;
use super::width::SLACK_MM;
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, Pt, Region};
use crate::layout::PlateId;
use geo::Intersects;

/// Reports every piece of ITO too near its glass edge.
pub fn check_edge(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let glass_edges = [PlateId::Front, PlateId::Back].map(|p| EdgeIndex::of_region(&geom::region_of([art.glass(p).clone()])));
    let pads = BoxIndex::new(art.pins.iter().enumerate().filter_map(|(i, p)| bbox_of_polygon(&p.pad).map(|b| (b, i))));
    let mut out = Vec::new();
    for c in &ex.components {
        let glass = &glass_edges[if c.plate == PlateId::Front { 0 } else { 1 }];
        // The component's edges are scanned, not indexed: the glass outline has a
        // handful of edges, a common thousands.
        let ito = region_edges(&c.region);
        if let Some(x) = meeting_point(&ito, glass) {
            out.push(finding(c, x, 0.0, 0.0, format!("{} crosses or touches the {} glass edge", what(c), c.plate.name())));
            continue;
        } else if let Some(first) = ito.first().map(|e| e.a)
            && !art.glass(c.plate).intersects(&geo::Point(first))
        {
            let d = closest_to_small(&ito, glass).map(|cl| cl.distance).unwrap_or(0.0);
            out.push(finding(c, first, -d, 0.0, format!("{} lies outside the {} glass", what(c), c.plate.name())));
            continue;
        }
        let rest = off_pads(art, &pads, c);
        if rest.0.is_empty() {
            continue;
        }
        let Some(cl) = closest_to_small(&region_edges(&rest), glass) else { continue };
        let need = art.rules.edge_clearance;
        if cl.distance > 0.0 && cl.distance < need - SLACK_MM {
            let m = format!(
                "{} is {:.4} mm from the {} glass edge, below the edge clearance of {need:.4} mm (only pads may come nearer)",
                what(c),
                cl.distance,
                c.plate.name()
            );
            out.push(finding(c, cl.p, cl.distance, need, m));
        }
    }
    out
}

/// The component's ITO less the pads it holds. Each pad is grown by [`SLACK_MM`] first, so
/// that the boolean engine's slivers along a pad's sides (nm wide, reaching down to the
/// glass edge with the pad) do not count as ITO beside the pad.
fn off_pads(art: &Artwork, pads: &BoxIndex<usize>, c: &Component) -> Region {
    if c.plate != PlateId::Front {
        return c.region.clone();
    }
    let Some(b) = bbox_of_region(&c.region) else { return c.region.clone() };
    let held: Vec<_> = pads.near(&b).map(|&i| art.pins[i].pad.clone()).collect();
    if held.is_empty() {
        return c.region.clone();
    }
    let grown = geom::offset_mitre(&geom::union_all(held), SLACK_MM);
    geom::snap(&geom::difference(&c.region, &grown))
}

fn what(c: &Component) -> String {
    if c.nets.is_empty() { "ITO without a net (a mark)".to_string() } else { format!("ITO of {}", list(&c.nets)) }
}

fn finding(c: &Component, at: Pt, measured: f64, required: f64, message: String) -> Finding {
    Finding {
        rule: Rule::EdgeClearance,
        severity: Severity::Error,
        plate: Some(c.plate),
        nets: c.nets.clone(),
        location: at,
        measured: Some(measured),
        required: Some(required),
        message,
    }
}

#[cfg(test)]
mod tests {
    use crate::artwork::{Layer, Role};
    use crate::check::check_artwork;
    use crate::check::fixture::{self, show};
    use crate::finding::Rule;
    use crate::geom::rect;
    use crate::layout::PlateId;

    /// A mark bar running over the front glass edge at x = 0.
    #[test]
    fn ito_crossing_the_glass_edge() {
        let mut art = fixture::clean();
        let bar = art.shapes.iter_mut().find(|s| s.layer == Layer::FrontMarks).unwrap();
        bar.polygon = rect(-0.2, 29.175, 0.6, 29.325);
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].plate, f[0].measured), (Rule::EdgeClearance, Some(PlateId::Front), Some(0.0)));
        assert!(f[0].location.x.abs() < 1e-9, "{:?}", f[0].location);
    }

    /// The liquid crystal reaches x 39.2 and the back COM1 lead runs to x 38.7: 1.3 mm
    /// from the back glass edge at x 40, below the 1.5 mm clearance.
    #[test]
    fn lead_in_the_liquid_crystal_too_near_the_edge() {
        let mut art = fixture::clean();
        art.lc_region = rect(3.0, 9.0, 39.2, 27.0);
        let lead = art.shapes.iter_mut().find(|s| s.layer == Layer::BackIto && s.role == Role::Lead).unwrap();
        lead.polygon = rect(20.4, 17.0, 38.7, 17.2);
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].plate), (Rule::EdgeClearance, Some(PlateId::Back)));
        assert!((f[0].measured.unwrap() - 1.3).abs() < 1e-9, "{:?}", f[0].measured);
        assert!((f[0].location.x - 38.7).abs() < 1e-9, "{:?}", f[0].location);
    }

    /// A mark cross outside the seal, 0.35 mm from the front glass's left edge: marks
    /// are ITO like any other and only pads may come nearer than the clearance, inside
    /// the liquid crystal or not.
    #[test]
    fn a_mark_outside_the_seal_is_too_near_the_edge() {
        let mut art = fixture::clean();
        crate::check::fixture::add(&mut art, Layer::FrontMarks, Role::Mark, None, rect(0.35, 29.175, 1.15, 29.325));
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].plate), (Rule::EdgeClearance, Some(PlateId::Front)));
        assert!((f[0].measured.unwrap() - 0.35).abs() < 1e-9, "{:?}", f[0].measured);
        assert!((f[0].location.x - 0.35).abs() < 1e-9, "{:?}", f[0].location);
    }

    /// Pads 1 mm from the edge on the ledge, and transfer pads under the seal, are
    /// nearer the edge than 1.5 mm but outside the liquid crystal: allowed.
    #[test]
    fn pads_on_the_ledge_may_come_near_the_edge() {
        let art = fixture::clean();
        assert!(art.pins.iter().all(|p| crate::geom::distance(&p.pad, &rect(0.0, -1.0, 40.0, 0.0)) < 1.5));
        assert!(check_artwork(&art).is_empty());
    }
}
