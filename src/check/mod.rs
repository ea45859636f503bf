//! Stage `check`: `Artwork` → findings.
//!
//! Takes only the artwork; re-derives nets by connectivity from the polygons
//! ([`connectivity`]) and compares them with the intended net list; reports every
//! finding, never just the first (rule codes and methods: docs/checks.md).

pub mod connectivity;
pub mod disjoint;
pub mod edge;
pub mod gap;
pub mod ghost;
pub mod index;
pub mod opens;
pub mod pads;
pub mod shorts;
pub mod width;

#[cfg(test)]
mod fixture;

pub use connectivity::Extraction;

use crate::artwork::Artwork;
use crate::finding::Finding;

/// Runs every rule on the artwork.
pub fn check_artwork(art: &Artwork) -> Vec<Finding> {
    check_extracted(art, &Extraction::extract(art))
}

/// Runs every rule on an artwork whose connectivity is already extracted.
pub fn check_extracted(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let mut out = shorts::check_shorts(art, ex);
    out.extend(opens::check_opens(art, ex));
    out.extend(width::check_width(art, ex));
    out.extend(gap::check_gap(art, ex));
    out.extend(ghost::check_ghosts(art, ex));
    out.extend(pads::check_pads(art));
    out.extend(edge::check_edge(art, ex));
    out
}
