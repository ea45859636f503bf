//! Rules `width`, `etched-width` and `film-feature` (lines): ITO too narrow as drawn,
//! after etch, or on the film.
//!
//! Takes the united ITO components of the [`Extraction`]; gives one error per narrow
//! place. Width is measured as an edge-pair *internal distance*: two non-adjacent edges
//! of the same polygon that face each other across its inside — nearly anti-parallel
//! (within 45°), each projecting onto the other, each on the other's inner side, with
//! nothing of the outline between them — are closer than the limit. Two exclusions keep
//! line ends out, which are not narrow lines:
//!
//! * adjacent edges never pair (a pointed tip);
//! * a pair whose outline on one side closes around within 0.75·d of the pair's midpoint
//!   while the other side does not is a line end, round or square (d is the distance
//!   measured). A feature closed on both sides, such as a dot smaller than the limit, is
//!   still reported.
//!
//! Neighbouring hits (within one limit of each other) merge into one finding, located
//! midway across the narrowest hit.

use super::connectivity::Extraction;
use super::disjoint::DisjointSets;
use super::index::{bbox_of_points, expand, BoxIndex, Edge, EdgeIndex};
use super::shorts::list;
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{dist, dist2, point_segment_closest, pt, segment_closest_points, segment_intersection, Pt, Region};
use crate::layout::{PlateId, Rules};

/// Measurements closer than this to a limit pass (floating-point slack, far below 1 nm).
pub const SLACK_MM: f64 = 1e-9;

/// Two edges count as facing when the angle between one and the reverse of the other is
/// below this (45°, as a cosine).
const FACING_COS: f64 = std::f64::consts::FRAC_1_SQRT_2;

/// A line end closes around within this many times half the measured distance.
const END_RADIUS: f64 = 1.5;

/// Points sampled along the overlap of each edge of a pair.
const SAMPLES: usize = 8;

/// One narrow place: the two points facing each other and their distance.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Hit {
    /// Point on one edge.
    pub p: Pt,
    /// Facing point on the other edge.
    pub q: Pt,
    /// Distance `|p q|`, mm.
    pub distance: f64,
}

impl Hit {
    /// Midway between the two edges.
    pub fn midpoint(&self) -> Pt {
        pt((self.p.x + self.q.x) / 2.0, (self.p.y + self.q.y) / 2.0)
    }
}

/// Every place where the region is narrower than `limit`, one hit per facing edge pair.
///
/// The region's polygons must have counter-clockwise exteriors and clockwise holes (the
/// inside on the left of every edge), as [`Extraction`] gives them.
pub fn narrow_places(region: &Region, limit: f64) -> Vec<Hit> {
    let idx = EdgeIndex::of_region(region);
    let mut hits = Vec::new();
    for (i, e) in idx.edges.iter().enumerate() {
        let Some(b) = bbox_of_points([e.a, e.b]) else { continue };
        let mut near: Vec<usize> = idx.near(&expand(&b, limit)).filter(|&j| j > i).collect();
        near.sort_unstable();
        for j in near {
            let f = &idx.edges[j];
            if f.poly != e.poly || e.is_adjacent(f) {
                continue;
            }
            if let Some(h) = facing_pair(&idx, i, j, limit) {
                hits.push(h);
            }
        }
    }
    hits
}

fn unit(e: &Edge) -> Option<(f64, f64)> {
    let l = e.length();
    (l > 0.0).then(|| ((e.b.x - e.a.x) / l, (e.b.y - e.a.y) / l))
}

/// The part `[lo, hi]` (arc length along `e`) onto which `f` projects, if not empty.
fn overlap(e: &Edge, u: (f64, f64), f: &Edge) -> Option<(f64, f64)> {
    let t = |p: Pt| (p.x - e.a.x) * u.0 + (p.y - e.a.y) * u.1;
    let (ta, tb) = (t(f.a), t(f.b));
    let (lo, hi) = (ta.min(tb).max(0.0), ta.max(tb).min(e.length()));
    (hi - lo > SLACK_MM).then_some((lo, hi))
}

fn facing_pair(idx: &EdgeIndex, i: usize, j: usize, limit: f64) -> Option<Hit> {
    let (e, f) = (&idx.edges[i], &idx.edges[j]);
    let (u, v) = (unit(e)?, unit(f)?);
    if u.0 * v.0 + u.1 * v.1 > -FACING_COS {
        return None;
    }
    let (oe, of) = (overlap(e, u, f)?, overlap(f, v, e)?);
    let along = |edge: Edge, w: (f64, f64), (lo, hi): (f64, f64)| {
        (0..=SAMPLES).map(move |k| {
            let t = lo + (hi - lo) * k as f64 / SAMPLES as f64;
            pt(edge.a.x + w.0 * t, edge.a.y + w.1 * t)
        })
    };
    let from_e = along(*e, u, oe).map(|p| (p, point_segment_closest(p, f.a, f.b)));
    let from_f = along(*f, v, of).map(|q| (point_segment_closest(q, e.a, e.b), q));
    let inner = |p: Pt, q: Pt, w: (f64, f64)| (q.x - p.x) * -w.1 + (q.y - p.y) * w.0 > 0.0;
    from_e
        .chain(from_f)
        .map(|(p, q)| Hit { p, q, distance: dist(p, q) })
        .filter(|h| h.distance < limit - SLACK_MM && h.distance > 0.0)
        .filter(|h| inner(h.p, h.q, u) && inner(h.q, h.p, v))
        .filter(|h| !is_line_end(idx, i, j, h))
        .filter(|h| !is_blocked(idx, i, j, h))
        .min_by(|a, b| a.distance.total_cmp(&b.distance))
}

/// True when the outline closes around the pair on exactly one side (a line end).
fn is_line_end(idx: &EdgeIndex, i: usize, j: usize, h: &Hit) -> bool {
    let (e, f) = (&idx.edges[i], &idx.edges[j]);
    if e.ring != f.ring {
        return false;
    }
    let (start, n) = (i - e.index, e.ring_edges);
    let m = h.midpoint();
    let r2 = (END_RADIUS * h.distance / 2.0).powi(2);
    let hugs = |from: usize, to: usize| {
        let mut k = from % n;
        loop {
            if dist2(idx.edges[start + k].a, m) > r2 {
                return false;
            }
            if k == to {
                return true;
            }
            k = (k + 1) % n;
        }
    };
    hugs(e.index + 1, f.index) != hugs(f.index + 1, e.index)
}

/// True when some other edge crosses the segment between the two facing points.
fn is_blocked(idx: &EdgeIndex, i: usize, j: usize, h: &Hit) -> bool {
    let Some(b) = bbox_of_points([h.p, h.q]) else { return false };
    idx.near(&b).filter(|&k| k != i && k != j).any(|k| {
        let g = &idx.edges[k];
        segment_intersection(h.p, h.q, g.a, g.b)
            .is_some_and(|x| dist(x, h.p) > SLACK_MM && dist(x, h.q) > SLACK_MM)
    })
}

/// Groups hits lying within `reach` of each other; gives the narrowest hit of each group.
pub fn merge_hits(hits: &[Hit], reach: f64) -> Vec<Hit> {
    let index = BoxIndex::new(hits.iter().enumerate().filter_map(|(k, h)| bbox_of_points([h.p, h.q]).map(|b| (b, k))));
    let mut sets = DisjointSets::new(hits.len());
    for (k, h) in hits.iter().enumerate() {
        let Some(b) = bbox_of_points([h.p, h.q]) else { continue };
        for &o in index.near(&expand(&b, reach)) {
            let g = &hits[o];
            if o > k && segment_closest_points(h.p, h.q, g.p, g.q).2 <= reach {
                sets.union(k, o);
            }
        }
    }
    let (labels, count) = sets.labels();
    let mut best: Vec<Option<Hit>> = vec![None; count];
    for (k, h) in hits.iter().enumerate() {
        let slot = &mut best[labels[k]];
        if slot.is_none_or(|b| h.distance < b.distance) {
            *slot = Some(*h);
        }
    }
    best.into_iter().flatten().collect()
}

/// One line rule: the drawn-width limit below which it fires, the value it reports for a
/// drawn width, and its finding text.
struct LineRule {
    rule: Rule,
    /// Drawn widths below this break the rule.
    below: f64,
    /// Drawn widths below this are left to an earlier rule.
    unless_below: f64,
    required: f64,
    measure: fn(&Rules, f64) -> f64,
}

fn line_rules(r: &Rules) -> Vec<LineRule> {
    let mut rules = vec![LineRule { rule: Rule::Width, below: r.min_width, unless_below: 0.0, required: r.min_width, measure: |_, w| w }];
    if r.etched_width(r.min_width) != r.min_width {
        // etched_width is affine with slope 1: solve etched_width(w) < min_width.
        let below = r.min_width + (r.min_width - r.etched_width(r.min_width));
        rules.push(LineRule { rule: Rule::EtchedWidth, below, unless_below: r.min_width, required: r.min_width, measure: Rules::etched_width });
    }
    let film_below = r.film_min_feature - (r.film_width(0.0));
    rules.push(LineRule { rule: Rule::FilmFeature, below: film_below, unless_below: 0.0, required: r.film_min_feature, measure: Rules::film_width });
    rules
}

/// Reports every narrow line on both plates.
pub fn check_width(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let rules = line_rules(&art.rules);
    let limit = rules.iter().map(|r| r.below).fold(0.0, f64::max);
    let mut out = Vec::new();
    if limit <= 0.0 {
        return out;
    }
    for c in &ex.components {
        let hits = narrow_places(&c.region, limit);
        if hits.is_empty() {
            continue;
        }
        for lr in &rules {
            let mine: Vec<Hit> = hits
                .iter()
                .filter(|h| h.distance < lr.below - SLACK_MM && h.distance >= lr.unless_below - SLACK_MM)
                .copied()
                .collect();
            for h in merge_hits(&mine, lr.below) {
                out.push(line_finding(&art.rules, lr, c.plate, &c.nets, &h));
            }
        }
    }
    out
}

fn line_finding(r: &Rules, lr: &LineRule, plate: PlateId, nets: &[String], h: &Hit) -> Finding {
    let measured = (lr.measure)(r, h.distance);
    let what = if nets.is_empty() { "ITO without a net (a mark)".to_string() } else { format!("ITO of {}", list(nets)) };
    let message = match lr.rule {
        Rule::Width => format!("{what} is {measured:.4} mm wide as drawn, below the minimum line width of {:.4} mm", lr.required),
        Rule::EtchedWidth => format!(
            "{what} is {:.4} mm wide as drawn but {measured:.4} mm after an etch undercut of {:.4} mm per edge, below the minimum line width of {:.4} mm",
            h.distance, r.undercut, lr.required
        ),
        _ => format!("{what} becomes a {measured:.4} mm line on the film, below the {:.4} mm the film holds", lr.required),
    };
    Finding {
        rule: lr.rule,
        severity: Severity::Error,
        plate: Some(plate),
        nets: nets.to_vec(),
        location: h.midpoint(),
        measured: Some(measured),
        required: Some(lr.required),
        message,
    }
}
