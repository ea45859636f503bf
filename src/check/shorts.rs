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
