//! Rule `short`: ITO that joins shapes meant for different nets.
//!
//! Takes the artwork and its [`Extraction`]; gives one error per pair of nets that touch
//! directly (located inside their overlap, or where their outlines touch), and one per
//! place where net-less ITO (a mark) or a transfer dot joins pieces of different nets.

use super::connectivity::{Extraction, Link, Node};
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::layout::PlateId;
use std::collections::BTreeSet;

/// Reports every short.
pub fn check_shorts(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let mut reported: BTreeSet<(String, String)> = BTreeSet::new();
    let mut out = Vec::new();
    for b in &ex.bridges {
        let via = match (b.link.a, b.link.b) {
            (Node::Dot(_), _) | (_, Node::Dot(_)) => "a transfer dot",
            _ => "ITO without a net (a mark)",
        };
        out.push(short(art, ex, &b.link, b.nets.clone(), via));
        for (i, x) in b.nets.iter().enumerate() {
            for y in &b.nets[i + 1..] {
                reported.insert((x.clone(), y.clone()));
            }
        }
    }
    for &li in &ex.cross_links {
        let l = ex.links[li];
        let (Node::Shape(a), Node::Shape(b)) = (l.a, l.b) else { continue };
        let (Some(na), Some(nb)) = (&art.shapes[a].net, &art.shapes[b].net) else { continue };
        let pair = if na < nb { (na.clone(), nb.clone()) } else { (nb.clone(), na.clone()) };
        if reported.insert(pair.clone()) {
            out.push(short(art, ex, &l, vec![pair.0, pair.1], "ITO"));
        }
    }
    out
}

fn link_plate(art: &Artwork, l: &Link) -> Option<PlateId> {
    match (l.a, l.b) {
        (Node::Shape(a), Node::Shape(_)) => art.shapes[a].layer.plate(),
        _ => None,
    }
}

fn short(art: &Artwork, ex: &Extraction, l: &Link, nets: Vec<String>, via: &str) -> Finding {
    let message = format!("{via} joins nets {}, which are meant to be separate", list(&nets));
    Finding {
        rule: Rule::Short,
        severity: Severity::Error,
        plate: link_plate(art, l),
        location: ex.link_point(art, l),
        nets,
        measured: None,
        required: None,
        message,
    }
}

/// "A and B", "A, B and C".
pub(crate) fn list(nets: &[String]) -> String {
    match nets {
        [] => String::new(),
        [one] => one.clone(),
        [init @ .., last] => format!("{} and {last}", init.join(", ")),
    }
}

#[cfg(test)]
mod tests {
    use crate::artwork::{Layer, Role};
    use crate::check::check_artwork;
    use crate::check::fixture::{self, show};
    use crate::finding::Rule;
    use crate::geom::rect;

    /// Two nets whose ITO touches along an edge are one conductor (a short), as GEOS
    /// `intersects` counts boundary contact; the finding names both and sits on the
    /// shared edge x = 14.
    #[test]
    fn touching_nets_give_one_short_naming_both() {
        let mut art = fixture::clean();
        fixture::move_s2(&mut art, 14.0);
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!(f[0].rule, Rule::Short);
        assert_eq!(f[0].nets, vec!["S1".to_string(), "S2".to_string()]);
        assert!((f[0].location.x - 14.0).abs() < 1e-9 && (15.0..=20.0).contains(&f[0].location.y), "{:?}", f[0].location);
    }

    /// Overlapping nets: the location lies inside the overlap 13.9..14 × 15..20.
    #[test]
    fn overlapping_nets_short_inside_the_overlap() {
        let mut art = fixture::clean();
        fixture::move_s2(&mut art, 13.9);
        let f = check_artwork(&art);
        let shorts = fixture::of_rule(&f, Rule::Short);
        assert_eq!(shorts.len(), 1, "{}", show(&f));
        let p = shorts[0].location;
        assert!(p.x > 13.9 && p.x < 14.0 && p.y > 15.0 && p.y < 20.0, "{p:?}");
    }

    /// A net-less mark bar laid across both leads joins them: one short, both nets.
    #[test]
    fn a_mark_bridging_two_leads_is_a_short() {
        let mut art = fixture::clean();
        fixture::add(&mut art, Layer::FrontMarks, Role::Mark, None, rect(12.0, 5.0, 18.0, 5.1));
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].nets.clone()), (Rule::Short, vec!["S1".to_string(), "S2".to_string()]));
        assert!(f[0].message.contains("mark"), "{}", f[0].message);
    }

    /// A transfer dot conducts between the plates (docs/background.md, *The two plates*):
    /// one dropped on S2's
    /// segment, under the COM1 backplane, joins S2 and COM1 — one short between the plates.
    #[test]
    fn a_stray_transfer_dot_shorts_across_the_plates() {
        let mut art = fixture::clean();
        let dot = crate::geom::circle(crate::geom::pt(18.0, 17.5), 0.3, 1e-3);
        fixture::add(&mut art, Layer::TransferDots, Role::Outline, None, dot);
        let f = check_artwork(&art);
        assert_eq!(f.len(), 1, "{}", show(&f));
        assert_eq!((f[0].rule, f[0].plate), (Rule::Short, None));
        assert_eq!(f[0].nets, vec!["COM1".to_string(), "S2".to_string()]);
        assert!(crate::geom::dist(f[0].location, crate::geom::pt(18.0, 17.5)) < 0.3, "{:?}", f[0].location);
    }
}
