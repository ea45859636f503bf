//! Rules `gap` and `film-feature` (spaces): different ITO too close on one plate.
//!
//! Takes the [`Extraction`]; gives one finding per pair of components (after union, so
//! touching same-net pieces are one component and never count) whose distance is below
//! the minimum gap as drawn, or whose gap on the film is below what the film holds.
//! Pairs that bridging could not harm are skipped: components of one group (already
//! joined through the dots), components carrying exactly the same nets, and two net-less
//! pieces (marks). Candidates come from an R-tree of component boxes grown by the limit;
//! the distance is the exact polygon distance (`geom::distance`, GEOS semantics: 0 when
//! touching) and the location is midway between the closest points.

use super::connectivity::{Component, Extraction};
use super::index::{bbox_of_region, expand, EdgeIndex};
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
    let mut out = Vec::new();
    for (i, a) in ex.components.iter().enumerate() {
        let Some(b) = bbox_of_region(&a.region) else { continue };
        for j in ex.components_near(a.plate, &expand(&b, limit)) {
            let c = &ex.components[j];
            if j <= i || harmless(a, c) {
                continue;
            }
            let d = region_distance(&a.region, &c.region, limit);
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
fn region_distance(a: &geom::Region, b: &geom::Region, limit: f64) -> f64 {
    let mut best = f64::INFINITY;
    for pa in &a.0 {
        let Some(ba) = super::index::bbox_of_polygon(pa) else { continue };
        let grown = expand(&ba, limit);
        for pb in &b.0 {
            let near = super::index::bbox_of_polygon(pb).is_some_and(|bb| rstar::Envelope::intersects(&grown, &bb));
            if near {
                best = best.min(geom::distance(pa, pb));
            }
        }
    }
    best
}
