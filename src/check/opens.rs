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
    let u = geom::union_all(p.shapes.iter().map(|&i| art.shapes[i].polygon.clone()));
    u.centroid().map(|c| c.0).unwrap_or_else(|| art.shapes[p.shapes[0]].polygon.exterior().0[0])
}

/// Somewhere to point at for a net without ITO: its pad, else its pixel, else the origin.
fn nowhere(art: &Artwork, net: &str) -> Pt {
    let pad = art.pins.iter().find(|p| p.net == net).and_then(|p| p.pad.centroid());
    let pixel = art.pixels.iter().find(|p| p.seg_net == net || p.com_net == net).and_then(|p| p.region.centroid());
    pad.or(pixel).map(|c| c.0).unwrap_or(geom::pt(0.0, 0.0))
}
