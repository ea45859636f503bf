//! Rule `open`: a net whose ITO falls apart, or does not reach a pad of it.
//!
//! Takes the artwork and its [`Extraction`]; gives one error per piece of a net that has
//! no pad of that net (pieces are joined across the plates by transfer dots), located at
//! the centroid of the piece. A net of the net list with no ITO at all is one error too.

use super::connectivity::{Extraction, Piece};
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, Pt};
use geo::Centroid;
use std::collections::BTreeSet;

/// Reports every open.
pub fn check_opens(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let names: BTreeSet<&str> =
        art.nets.iter().map(|n| n.name.as_str()).chain(ex.pieces.iter().map(|p| p.net.as_str())).collect();
    let mut out = Vec::new();
    for net in names {
        let pieces: Vec<&Piece> = ex.pieces.iter().filter(|p| p.net == net).collect();
        let pins: Vec<u32> = art.pins.iter().filter(|p| p.net == net).map(|p| p.number).collect();
        if pieces.is_empty() {
            out.push(open(None, net, nowhere(art, net), format!("net {net} is in the net list but has no ITO")));
            continue;
        }
        let reached = pieces.iter().any(|p| !p.pins.is_empty());
        for p in pieces.iter().filter(|p| p.pins.is_empty()) {
            let message = if reached {
                format!("a piece of net {net} is cut off from its pad")
            } else if let Some(first) = pins.first() {
                format!("net {net} has no ITO path to its pad (pin {first})")
            } else {
                format!("net {net} has no pad on the ledge")
            };
            out.push(open(piece_plate(art, p), net, piece_centroid(art, p), message));
        }
    }
    out
}

fn open(plate: Option<crate::layout::PlateId>, net: &str, location: Pt, message: String) -> Finding {
    Finding {
        rule: Rule::Open,
        severity: Severity::Error,
        plate,
        nets: vec![net.to_string()],
        location,
        measured: None,
        required: None,
        message,
    }
}

fn piece_plate(art: &Artwork, p: &Piece) -> Option<crate::layout::PlateId> {
    let plates: BTreeSet<_> = p.shapes.iter().filter_map(|&i| art.shapes[i].layer.plate()).collect();
    if plates.len() == 1 { plates.into_iter().next() } else { None }
}

/// Centroid of the united shapes of a piece.
fn piece_centroid(art: &Artwork, p: &Piece) -> Pt {
    let u = super::connectivity::unite(p.shapes.iter().map(|&i| art.shapes[i].polygon.clone()));
    u.centroid().map(|c| c.0).unwrap_or_else(|| super::index::any_point(&art.shapes[p.shapes[0]].polygon))
}

/// Somewhere to point at for a net without ITO: its pad, else its pixel, else the origin.
fn nowhere(art: &Artwork, net: &str) -> Pt {
    let pad = art.pins.iter().find(|p| p.net == net).and_then(|p| p.pad.centroid());
    let pixel = art.pixels.iter().find(|p| p.seg_net == net || p.com_net == net).and_then(|p| p.region.centroid());
    pad.or(pixel).map(|c| c.0).unwrap_or(geom::pt(0.0, 0.0))
}

#[cfg(test)]
mod tests {
    use crate::artwork::{Layer, Role};
    use crate::check::fixture::{self, show};
    use crate::check::{check_artwork, Extraction};
    use crate::finding::Rule;
    use crate::geom::rect;
    use crate::layout::PlateId;

    /// A segment whose lead stops 0.5 mm short of its pad is open. Expected centroid of
    /// segment ∪ lead from shapely 2.2 (`unary_union([box(10,15,14,20),
    /// box(11.9,4.5,12.1,15)]).centroid`, run offline): (12, 16.763574660633488).
    /// The same-net pad nearby is no `gap`.
    #[test]
    fn lead_stopping_short_of_its_pad_is_open() {
        let mut art = fixture::clean();
        fixture::set(&mut art, Layer::FrontIto, Role::Lead, "S1", rect(11.9, 4.5, 12.1, 15.0));
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].nets.clone(), f[0].plate), (Rule::Open, vec!["S1".to_string()], Some(PlateId::Front)));
        assert!((f[0].location.x - 12.0).abs() < 1e-9 && (f[0].location.y - 16.763574660633488).abs() < 1e-9, "{:?}", f[0].location);
    }

    /// The transfer dot is what links the back common electrode to its front pad: the
    /// clean fixture has no open, and the same artwork without the dot has exactly one,
    /// at the centroid of the back COM1 ITO (shapely 2.2, offline:
    /// (15.84081569596787, 17.50972887378341)).
    #[test]
    fn transfer_dot_links_back_common_to_front_pad() {
        let art = fixture::clean();
        let ex = Extraction::extract(&art);
        let com_groups: Vec<_> = ex.groups.iter().filter(|g| g.nets == vec!["COM1".to_string()]).collect();
        assert_eq!(com_groups.len(), 1);
        assert_eq!(com_groups[0].pins, vec![3]);
        assert_eq!(com_groups[0].dots.len(), 1);

        let mut cut = art.clone();
        cut.transfer_dots.clear();
        fixture::remove(&mut cut, Layer::TransferDots, Role::Outline, None);
        let f = check_artwork(&cut);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].plate), (Rule::Open, Some(PlateId::Back)));
        assert!((f[0].location.x - 15.84081569596787).abs() < 1e-9, "{:?}", f[0].location);
        assert!((f[0].location.y - 17.50972887378341).abs() < 1e-9, "{:?}", f[0].location);
    }

    /// A net whose shapes are bridged only through another net is still open once the
    /// short is mended: S1's lead is cut and both halves touch S2's ITO.
    #[test]
    fn a_net_joined_only_through_another_net_is_open_and_shorted() {
        let mut art = fixture::clean();
        fixture::set(&mut art, Layer::FrontIto, Role::Lead, "S1", rect(11.9, 6.0, 12.1, 15.0));
        fixture::add(&mut art, Layer::FrontIto, Role::Lead, Some("S1"), rect(11.9, 2.0, 12.1, 5.0));
        fixture::add(&mut art, Layer::FrontIto, Role::Lead, Some("S2"), rect(12.0, 4.8, 18.0, 6.2));
        let f = check_artwork(&art);
        assert_eq!(fixture::of_rule(&f, Rule::Open).len(), 1, "{}", show(&f));
        assert_eq!(fixture::of_rule(&f, Rule::Short).len(), 1, "{}", show(&f));
    }
}
