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
        let covered = geom::snap(&geom::difference(&geom::region_of([pin.pad.clone()]), &art.ledge));
        let area = geom::area(&covered);
        if area <= MIN_COVERED_MM2 {
            continue;
        }
        let biggest = covered.0.iter().max_by(|a, b| geom::area(*a).total_cmp(&geom::area(*b)));
        let at = biggest.and_then(|p| p.interior_point()).map(|p| p.0).unwrap_or_else(|| crate::check::index::any_point(&pin.pad));
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

#[cfg(test)]
mod tests {
    use crate::artwork::{Layer, Role};
    use crate::check::check_artwork;
    use crate::check::fixture::{self, show};
    use crate::finding::Rule;
    use crate::geom::rect;

    /// S1's pad reaches 1 mm under the back glass (ledge ends at y 6): 2 × 1 mm² covered.
    #[test]
    fn pad_under_the_back_glass_is_covered() {
        let mut art = fixture::clean();
        let pad = rect(11.0, 1.0, 13.0, 7.0);
        fixture::set(&mut art, Layer::FrontIto, Role::Pad, "S1", pad.clone());
        art.pins[0].pad = pad;
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].nets.clone()), (Rule::PadCovered, vec!["S1".to_string()]));
        assert!((f[0].measured.unwrap() - 2.0).abs() < 1e-9, "{:?}", f[0].measured);
        assert!(f[0].location.y > 6.0 && f[0].location.y < 7.0);
    }
}
