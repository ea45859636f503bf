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

/// What a build reports of an artwork: the findings made while generating it and every
/// rule's, with the opens a blocked place explains folded into it.
pub fn build_findings(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let mut findings = art.generation_findings.clone();
    findings.extend(check_extracted(art, ex));
    causes::fold_opens_into_causes(findings)
}

/// Runs every rule on an artwork whose connectivity is already extracted.
pub fn check_extracted(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    // The rules read the same geometry and nothing else: each runs on its own (rayon
    // spreads them over the cores), and their findings are joined in this order, so the
    // report is the same as one rule after another.
    type Rule = fn(&Artwork, &Extraction) -> Vec<Finding>;
    const RULES: [Rule; 9] = [
        shorts::check_shorts,
        opens::check_opens,
        width::check_width,
        gap::check_gap,
        ghost::check_ghosts,
        |art, _| pads::check_pads(art),
        edge::check_edge,
        drive_truth::check_drive_truth,
        registration::check_registration,
    ];
    use rayon::prelude::*;
    let found: Vec<Vec<Finding>> = RULES.par_iter().map(|rule| rule(art, ex)).collect();
    found.into_iter().flatten().collect()
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

