//! Rules `gap` and `film-feature` (spaces): different ITO too close on one plate.
//!
//! Takes the [`Extraction`]; gives one finding per pair of components (after union, so
//! touching same-net pieces are one component and never count) whose distance is below
//! the minimum gap as drawn, or whose gap on the film is below what the film holds.
//! Pairs that bridging could not harm are skipped: components of one group (already
//! joined through the dots), components carrying exactly the same nets, and two net-less
//! pieces (marks). Candidates come from an R-tree of component boxes grown by the limit;
//! the distance is the exact polygon distance below the limit (`near::distance_below`,
//! GEOS semantics: 0 when touching) and the location is midway between the closest
//! points.

use super::connectivity::{Component, Extraction};
use super::index::{bbox_of_region, expand, EdgeIndex};
use super::near::Prepared;
use super::shorts::list;
use super::width::SLACK_MM;
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom;

/// Reports every gap that is too small.
pub fn check_gap(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let r = &art.rules;
    // film_gap is affine with slope 1: film_gap(g) < film_min_feature ⇔ g < film_below.
    let film_below = r.film_min_feature - r.film_gap(0.0);
    let limit = r.min_gap.max(film_below);
    let mut edges: Vec<Option<EdgeIndex>> = ex.components.iter().map(|_| None).collect();
    // A common meets the box of every component near it: its edges are indexed once.
    let prepared: Vec<Vec<Prepared>> = ex.components.iter().map(|c| c.region.0.iter().map(Prepared::indexed).collect()).collect();
    let mut out = Vec::new();
    for (i, a) in ex.components.iter().enumerate() {
        let Some(b) = bbox_of_region(&a.region) else { continue };
        for j in ex.components_near(a.plate, &expand(&b, limit)) {
            let c = &ex.components[j];
            if j <= i || harmless(a, c) {
                continue;
            }
            let d = region_distance(&prepared[i], &prepared[j], limit);
            if d >= limit - SLACK_MM {
                continue;
            }
            let ei = edges[i].take().unwrap_or_else(|| EdgeIndex::of_region(&a.region));
            let ej = edges[j].take().unwrap_or_else(|| EdgeIndex::of_region(&c.region));
            let at = ei.closest(&ej).map(|cl| cl.midpoint()).unwrap_or(geom::pt(0.0, 0.0));
            edges[i] = Some(ei);
            edges[j] = Some(ej);
            let nets: Vec<String> = a.nets.iter().chain(c.nets.iter()).cloned().collect();
            let who = who(a, c);
            let finding = |rule, measured: f64, required: f64, message: String| Finding {
                rule,
                severity: Severity::Error,
                plate: Some(a.plate),
                nets: nets.clone(),
                location: at,
                measured: Some(measured),
                required: Some(required),
                message,
            };
            if d < r.min_gap - SLACK_MM {
                let m = format!("{who} are {d:.4} mm apart, below the minimum gap of {:.4} mm", r.min_gap);
                out.push(finding(Rule::Gap, d, r.min_gap, m));
            }
            let fg = r.film_gap(d);
            if fg < r.film_min_feature - SLACK_MM {
                let m = format!("the {d:.4} mm gap between {who} becomes {fg:.4} mm on the film, below the {:.4} mm the film holds", r.film_min_feature);
                out.push(finding(Rule::FilmFeature, fg, r.film_min_feature, m));
            }
        }
    }
    out
}

fn harmless(a: &Component, b: &Component) -> bool {
    a.group == b.group || a.nets == b.nets
}

fn who(a: &Component, b: &Component) -> String {
    let name = |c: &Component| if c.nets.is_empty() { "a mark".to_string() } else { format!("net {}", list(&c.nets)) };
    format!("{} and {}", name(a), name(b))
}

/// Smallest distance between the polygons of two regions whose boxes come within `limit`.
fn region_distance(a: &[Prepared], b: &[Prepared], limit: f64) -> f64 {
    let mut best = f64::INFINITY;
    for pa in a {
        let Some(ba) = pa.bbox() else { continue };
        let grown = expand(&ba, limit);
        for pb in b {
            let near = pb.bbox().is_some_and(|bb| rstar::Envelope::intersects(&grown, &bb));
            if near {
                best = best.min(super::near::distance_below_prepared(pa, pb, limit));
            }
        }
    }
    best
}

#[cfg(test)]
mod tests {
    use crate::artwork::{Layer, Role};
    use crate::check::check_artwork;
    use crate::check::fixture::{self, show};
    use crate::finding::Rule;
    use crate::geom::rect;

    /// S2 0.04 mm from S1 (min gap 0.05): one `gap` naming both, measured 0.04 (the
    /// polygon distance, GEOS semantics), located midway at x = 14.02.
    #[test]
    fn segments_too_close_break_gap() {
        let mut art = fixture::clean();
        fixture::move_s2(&mut art, 14.04);
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].nets.clone()), (Rule::Gap, vec!["S1".to_string(), "S2".to_string()]));
        assert!((f[0].measured.unwrap() - 0.04).abs() < 1e-9, "{:?}", f[0].measured);
        assert!((f[0].location.x - 14.02).abs() < 1e-9, "{:?}", f[0].location);
    }

    /// With pre-compensation (undercut 0.02) a 0.1 mm drawn gap is 0.06 mm on the film
    /// (docs/background.md, *Etching and undercut*: features grow by the undercut),
    /// below a 0.08 mm film.
    #[test]
    fn compensated_gap_below_the_film_feature() {
        let mut art = fixture::clean();
        art.rules.compensate = true;
        art.rules.undercut = 0.02;
        art.rules.film_min_feature = 0.08;
        fixture::move_s2(&mut art, 14.1);
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!(f[0].rule, Rule::FilmFeature);
        assert!((f[0].measured.unwrap() - 0.06).abs() < 1e-9, "{:?}", f[0].measured);
    }

    /// Pieces of the same net never make a gap finding, however close (here 0.01 mm,
    /// which is an open instead).
    #[test]
    fn same_net_pieces_are_no_gap() {
        let mut art = fixture::clean();
        fixture::set(&mut art, Layer::FrontIto, Role::Lead, "S1", rect(11.9, 4.01, 12.1, 15.0));
        let f = check_artwork(&art);
        assert!(fixture::of_rule(&f, Rule::Gap).is_empty(), "{}", show(&f));
        assert_eq!(fixture::of_rule(&f, Rule::Open).len(), 1, "{}", show(&f));
    }
}
