//! Stage `check`: `Artwork` → findings.
//!
//! Takes only the artwork; re-derives nets by connectivity from the polygons
//! ([`connectivity`]) and compares them with the intended net list; reports every
//! finding, never just the first (rule codes and methods: docs/checks.md).

pub mod causes;
pub mod connectivity;
pub mod disjoint;
pub mod drive_truth;
pub mod edge;
pub mod gap;
pub mod ghost;
pub mod near;
pub mod index;
pub mod opens;
pub mod pads;
pub mod registration;
pub mod shorts;
pub mod width;

#[cfg(test)]
pub(crate) mod fixture;

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
    out.extend(drive_truth::check_drive_truth(art, ex));
    out.extend(registration::check_registration(art, ex));
    out
}

#[cfg(test)]
mod tests {
    use super::fixture::{self, show};
    use super::*;

    /// The clean fixture breaks no rule: every check must stay silent on it.
    #[test]
    fn clean_fixture_gives_no_findings() {
        let f = check_artwork(&fixture::clean());
        assert!(f.is_empty(), "{}", show(&f));
    }

    /// Three independent problems in one artwork — a narrow lead, a covered pad and a
    /// ghost in the window — are all reported, not just the first.
    #[test]
    fn all_findings_are_reported() {
        use crate::artwork::{Layer, Role};
        use crate::finding::Rule;
        use crate::geom::rect;
        let mut art = fixture::clean();
        fixture::set(&mut art, Layer::FrontIto, Role::Lead, "S1", rect(11.98, 2.0, 12.02, 15.0));
        let pad = rect(17.0, 1.0, 19.0, 7.0);
        fixture::set(&mut art, Layer::FrontIto, Role::Pad, "S2", pad.clone());
        art.pins[1].pad = pad;
        fixture::add(&mut art, Layer::BackIto, Role::Lead, Some("COM1"), rect(15.0, 12.0, 30.0, 12.5));
        let f = check_artwork(&art);
        let mut rules: Vec<Rule> = f.iter().map(|f| f.rule).collect();
        rules.sort();
        assert_eq!(rules, vec![Rule::Width, Rule::Ghost, Rule::PadCovered, Rule::DriveTruth], "{}", show(&f));
    }
}

