//! Rule `drive-truth`: every designed pixel lights, and only with its own pair.
//!
//! For each pixel assigned to (COM k, SEG j) the region that switches when that pair is
//! driven — front ITO connected to SEG j ∩ back ITO connected to COM k ∩ the liquid
//! crystal, all re-derived from the polygons by extraction — must cover the whole pixel,
//! and no other common may face it. Light where no pixel is designed is the `ghost` rule.

use super::connectivity::Extraction;
use super::ghost::MIN_GHOST_MM2;
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, region_of, Region};
use crate::layout::PlateId;

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

/// Compares what each (COM, SEG) pair lights with the pixels assigned to it.
pub fn check_drive_truth(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let lc = region_of([art.lc_region.clone()]);
    let mut out = Vec::new();
    for p in &art.pixels {
        let designed = geom::intersection(&p.region, &lc);
        let seg = ito_of(ex, PlateId::Front, &p.seg_net, true);
        let com = ito_of(ex, PlateId::Back, &p.com_net, true);
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
        let others = ito_of(ex, PlateId::Back, &p.com_net, false);
        let wrong = geom::intersection(&designed, &others);
        if geom::area(&wrong) > MIN_GHOST_MM2 {
            let who = ex.nets_of(&ex.components_meeting(PlateId::Back, &wrong.0[0]));
            let mut nets = vec![p.seg_net.clone()];
            nets.extend(who.iter().cloned());
            out.push(finding(
                &wrong,
                nets,
                format!("{} also faces back ITO of {} and would light with the wrong common", p.element, who.join(", ")),
            ));
        }
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
