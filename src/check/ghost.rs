//! Rule `ghost`: front and back ITO overlapping in the liquid crystal where no pixel is
//! designed.
//!
//! Takes the artwork and its [`Extraction`]. A pixel exists wherever front and back ITO
//! overlap with liquid crystal between them (docs/background.md, *Ghost pixels*), so
//! `lit = front ITO ∩ back ITO ∩ LC region` and `ghost = lit − designed pixels`. Each
//! ghost piece above [`MIN_GHOST_MM2`] is one finding: an error when it meets the viewing
//! window, a warning when it lies only outside it (hidden by the bezel, but it still
//! switches). Overlaps under or outside the seal have no liquid crystal and never count.

use super::connectivity::Extraction;
use super::index::any_point;
use super::shorts::list;
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, Polygon, Region};
use crate::layout::PlateId;
use geo::{Contains, InteriorPoint, Intersects};

/// Ghost pieces smaller than this (10 µm square: a third of the finest line a film
/// holds, about 30 µm — common practice) cannot switch visibly and are the slivers that
/// boolean work leaves where a lead leaves its electrode, not pixels. A real crossing of
/// two leads at the minimum width is about 100 times larger.
pub const MIN_GHOST_MM2: f64 = 1e-4;

/// Where the two plates' ITO overlap in the liquid crystal outside the designed pixels
/// (`ex` extracted from `art`): worked out once, as the ghost and drive-truth rules both
/// read it.
pub fn ghost_region<'a>(art: &Artwork, ex: &'a Extraction) -> &'a Region {
    ex.ghosts.get_or_init(|| overlap_outside_pixels(art, ex))
}

fn overlap_outside_pixels(art: &Artwork, ex: &Extraction) -> Region {
    let (front, back) = (ex.ito_in_lc(art, PlateId::Front), ex.ito_in_lc(art, PlateId::Back));
    let lit = geom::snap(&geom::intersection(front, back));
    let pixels = geom::region_of(art.pixels.iter().flat_map(|p| p.region.0.iter().cloned()));
    // Boolean output is snapped back to the 1 nm grid (see `connectivity::unite`).
    geom::snap(&geom::difference(&lit, &pixels))
}

/// Reports every ghost pixel.
pub fn check_ghosts(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let mut out = Vec::new();
    for piece in &ghost_region(art, ex).0 {
        let area = geom::area(piece);
        if area <= MIN_GHOST_MM2 {
            continue;
        }
        let at = piece.interior_point().map(|p| p.0).unwrap_or_else(|| any_point(piece));
        let front = nets_under(ex, PlateId::Front, piece, at);
        let back = nets_under(ex, PlateId::Back, piece, at);
        let visible = piece.intersects(&art.window);
        let (severity, place) = if visible {
            (Severity::Error, "inside the viewing window")
        } else {
            (Severity::Warning, "outside the viewing window but in the liquid crystal (hidden by the bezel, yet it switches)")
        };
        let message = format!(
            "front ITO of {} and back ITO of {} overlap over {area:.4} mm² {place} where no pixel is designed",
            or_none(&front),
            or_none(&back)
        );
        let mut nets = front;
        nets.extend(back.into_iter().filter(|n| !nets.contains(n)).collect::<Vec<_>>());
        out.push(Finding {
            rule: Rule::Ghost,
            severity,
            plate: None,
            nets,
            location: at,
            measured: Some(area),
            required: Some(0.0),
            message,
        });
    }
    out
}

/// Nets of the component holding `at` (else of those meeting the piece).
pub(crate) fn nets_under(ex: &Extraction, plate: PlateId, piece: &Polygon, at: geom::Pt) -> Vec<String> {
    let meeting = ex.components_meeting(plate, piece);
    let holding: Vec<usize> = meeting.iter().copied().filter(|&c| ex.components[c].region.contains(&at)).collect();
    ex.nets_of(if holding.is_empty() { &meeting } else { &holding })
}

fn or_none(nets: &[String]) -> String {
    if nets.is_empty() { "no net".to_string() } else { list(nets) }
}

#[cfg(test)]
mod tests {
    use crate::artwork::{Layer, Role};
    use crate::check::check_artwork;
    use crate::check::fixture::{self, show};
    use crate::finding::{Rule, Severity};
    use crate::geom::rect;

    /// A back COM1 strip from x 15 to 30 (joined to the COM1 lead at x 30) crosses S2's
    /// 0.2 mm front lead; the crossing switches when liquid crystal is between them
    /// (docs/background.md, *Ghost pixels*).
    fn crossing_at(y0: f64, y1: f64) -> Vec<crate::finding::Finding> {
        let mut art = fixture::clean();
        fixture::add(&mut art, Layer::BackIto, Role::Lead, Some("COM1"), rect(15.0, y0, 30.0, y1));
        check_artwork(&art)
    }

    #[test]
    fn crossing_inside_the_window_is_a_ghost_error() {
        let all = crossing_at(12.0, 12.5);
        // In the window the same overlap is also a drive-truth error naming the pair.
        let truth: Vec<_> = all.iter().filter(|f| f.rule == Rule::DriveTruth).collect();
        assert_eq!(truth.len(), 1, "{}", show(&all));
        assert!(truth[0].message.contains("(COM1, S2)"), "{}", truth[0].message);
        let f: Vec<_> = all.into_iter().filter(|f| f.rule != Rule::DriveTruth).collect();
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].severity), (Rule::Ghost, Severity::Error));
        assert_eq!(f[0].nets, vec!["S2".to_string(), "COM1".to_string()]);
        assert!((f[0].measured.unwrap() - 0.1).abs() < 1e-9, "{:?}", f[0].measured);
    }

    #[test]
    fn crossing_outside_the_window_in_the_liquid_crystal_is_a_warning() {
        let f = crossing_at(9.5, 10.5);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].severity), (Rule::Ghost, Severity::Warning));
        assert!((f[0].measured.unwrap() - 0.2).abs() < 1e-9, "{:?}", f[0].measured);
    }

    #[test]
    fn crossing_under_the_seal_is_harmless() {
        let f = crossing_at(7.9, 8.3);
        assert!(f.is_empty(), "{}", show(&f));
    }
}
