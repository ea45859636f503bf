//! Rule `drive-truth`: every designed pixel lights, and only with its own pair.
//!
//! For each pixel assigned to (COM k, SEG j) the region that switches when that pair is
//! driven — front ITO connected to SEG j ∩ back ITO connected to COM k ∩ the liquid
//! crystal, all re-derived from the polygons by extraction — must cover the whole pixel,
//! and no other common may face it; no pair may be given to two elements; and no pair
//! may light anything inside the window beyond its own elements (the same overlap the
//! `ghost` rule reports, here named by the (COM, SEG) pair that would light it).

use super::connectivity::Extraction;
use super::ghost::MIN_GHOST_MM2;
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, region_of, Region};
use crate::layout::PlateId;
use std::collections::BTreeMap;

/// ITO of one plate's components whose nets include `net` (or exclude it).
fn ito_of(ex: &Extraction, plate: PlateId, net: &str, with: bool) -> Region {
    let polys = ex
        .components
        .iter()
        .filter(|c| c.plate == plate && c.nets.iter().any(|n| n == net) == with)
        .flat_map(|c| c.region.0.iter().cloned());
    region_of(polys)
}

fn finding(part: &Region, nets: Vec<String>, message: String) -> Finding {
    use geo::Centroid;
    Finding {
        rule: Rule::DriveTruth,
        severity: Severity::Error,
        plate: None,
        nets,
        location: part.centroid().map(|c| c.0).unwrap_or_default(),
        measured: Some(geom::area(part)),
        required: Some(0.0),
        message,
    }
}

/// The (COM net, SEG net) pairs that more than one pixel uses, sorted, each once. Every
/// pair must switch at most one element — two on one pair always switch together — so
/// anything here is a fault of net assignment. Empty when all is well.
pub fn shared_pairs(art: &Artwork) -> Vec<(String, String)> {
    let mut uses: BTreeMap<(&str, &str), usize> = BTreeMap::new();
    for p in &art.pixels {
        *uses.entry((p.com_net.as_str(), p.seg_net.as_str())).or_default() += 1;
    }
    uses.into_iter().filter(|&(_, n)| n > 1).map(|((c, s), _)| (c.to_string(), s.to_string())).collect()
}

/// The parts of `r` near a pixel whose box is `bbox` (`geom::cut_to_box`): a common
/// spans the glass with thousands of vertices, and a boolean with all of it for every
/// pixel costs the whole electrode each time.
fn near(r: &geom::bands::Banded, bbox: &geo::Rect<f64>) -> Region {
    r.near(bbox)
}

/// Compares what each (COM, SEG) pair lights with the pixels assigned to it.
pub fn check_drive_truth(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let lc = region_of([art.lc_region.clone()]);
    let mut out = Vec::new();
    for (com, seg) in shared_pairs(art) {
        let names: Vec<&str> = art.pixels.iter().filter(|p| p.com_net == com && p.seg_net == seg).map(|p| p.element.as_str()).collect();
        let first = art.pixels.iter().find(|p| p.com_net == com && p.seg_net == seg).map(|p| p.region.clone()).unwrap_or_else(|| region_of([]));
        out.push(finding(&first, vec![seg.clone(), com.clone()], format!("{} share the pair ({com}, {seg}) and would always switch together", names.join(", "))));
    }
    // Each net's ITO once, then per pixel only the polygons whose boxes meet it.
    use geom::bands::Banded;
    let mut front: std::collections::HashMap<&str, Banded> = Default::default();
    let mut back: std::collections::HashMap<&str, Banded> = Default::default();
    let mut not_back: std::collections::HashMap<&str, Banded> = Default::default();
    for p in &art.pixels {
        use geo::BoundingRect;
        let Some(bbox) = p.region.bounding_rect() else { continue };
        let designed = geom::intersection(&p.region, &lc);
        let seg = near(front.entry(&p.seg_net).or_insert_with(|| Banded::of(&ito_of(ex, PlateId::Front, &p.seg_net, true))), &bbox);
        let com = near(back.entry(&p.com_net).or_insert_with(|| Banded::of(&ito_of(ex, PlateId::Back, &p.com_net, true))), &bbox);
        let lit = geom::intersection(&geom::intersection(&designed, &seg), &com);
        let dark = geom::difference(&designed, &lit);
        if geom::area(&dark) > MIN_GHOST_MM2 {
            out.push(finding(
                &dark,
                vec![p.seg_net.clone(), p.com_net.clone()],
                format!(
                    "{:.4} mm² of {} does not light when {} and {} are driven",
                    geom::area(&dark),
                    p.element,
                    p.com_net,
                    p.seg_net
                ),
            ));
        }
        let others = near(not_back.entry(&p.com_net).or_insert_with(|| Banded::of(&ito_of(ex, PlateId::Back, &p.com_net, false))), &bbox);
        let wrong = geom::intersection(&designed, &others);
        if geom::area(&wrong) > MIN_GHOST_MM2 {
            let who = ex.nets_of(&ex.components_meeting(PlateId::Back, &wrong.0[0]));
            let mut nets = vec![p.seg_net.clone()];
            nets.extend(who.iter().cloned());
            out.push(finding(
                &wrong,
                nets,
                format!(
                    "{:.4} mm² of {} also faces back ITO of {}: driving ({}, {}) would light it with the wrong common",
                    geom::area(&wrong),
                    p.element,
                    who.join(", "),
                    who.join("/"),
                    p.seg_net
                ),
            ));
        }
    }
    for piece in &super::ghost::ghost_region(art, ex).0 {
        use geo::{InteriorPoint, Intersects};
        if geom::area(piece) <= MIN_GHOST_MM2 || !piece.intersects(&art.window) {
            continue;
        }
        let at = piece.interior_point().map(|p| p.0).unwrap_or_default();
        let segs = super::ghost::nets_under(ex, PlateId::Front, piece, at);
        let coms = super::ghost::nets_under(ex, PlateId::Back, piece, at);
        let pairs: Vec<String> = coms.iter().flat_map(|c| segs.iter().map(move |s| format!("({c}, {s})"))).collect();
        let mut nets = segs.clone();
        nets.extend(coms.iter().cloned());
        out.push(finding(
            &region_of([piece.clone()]),
            nets,
            format!(
                "driving {} lights {:.4} mm² inside the window where no element is assigned to it",
                if pairs.is_empty() { "no pair".to_string() } else { pairs.join(" or ") },
                geom::area(piece)
            ),
        ));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::super::fixture::{self, show};
    use super::*;
    use crate::artwork::{Layer, Role};
    use crate::geom::rect;

    /// The clean fixture: both pixels are fully faced by COM1.
    #[test]
    fn clean_pixels_light_fully() {
        let art = fixture::clean();
        let f = check_drive_truth(&art, &Extraction::extract(&art));
        assert!(f.is_empty(), "{}", show(&f));
    }

    /// Shrinking the common so it misses the last 1 mm of S2 (1 × 5 mm²), except where a
    /// 0.2 mm lead still crosses it (1 × 0.2 mm²), leaves 4.8 mm² of S2 dark (plane
    /// geometry): one finding naming S2 and COM1 with that area.
    #[test]
    fn uncovered_part_of_a_pixel_is_reported_with_its_area() {
        let mut art = fixture::clean();
        fixture::set(&mut art, Layer::BackIto, Role::Common, "COM1", rect(9.5, 15.0, 19.0, 20.5));
        fixture::add(&mut art, Layer::BackIto, Role::Common, Some("COM1"), rect(18.9, 17.0, 20.5, 17.2));
        let f = check_drive_truth(&art, &Extraction::extract(&art));
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!(f[0].nets, vec!["S2".to_string(), "COM1".to_string()]);
        let m = f[0].measured.unwrap();
        assert!((m - 4.8).abs() < 1e-6, "{m}");
    }
}
