//! What the display shows for a text and a set of elements switched on.
//!
//! Takes the artwork, a text for the digits and element names; gives the (COM, SEG)
//! pairs the firmware drives (through `crate::firmware`, the same placement as the
//! firmware tables) and the region that lights. The region is re-derived from the
//! polygons, not from the designed pixels: wherever front ITO electrically joined to a
//! driven SEG net faces back ITO joined to its driven COM net inside the liquid crystal
//! (docs/background.md, *The twisted-nematic cell*, "What makes a pixel"), so a ghost or
//! a pixel the common does not cover shows as it would on the glass.

use crate::artwork::Artwork;
use crate::check::Extraction;
use crate::check::index::bbox_of_region;
use crate::error::InputProblem;
use crate::geom::{self, Region};
use crate::layout::PlateId;
use crate::{Error, Result};
use std::collections::BTreeSet;

/// A (COM net, SEG net) pair driven on.
pub type Pair = (String, String);

/// What to show, resolved against the artwork.
#[derive(Debug, Clone)]
pub struct Shown {
    /// Elements switched on: the text's, then the named ones.
    pub elements: Vec<String>,
    /// The pairs the firmware drives for them.
    pub pairs: BTreeSet<Pair>,
    /// Where the display goes dark, mm, front-plate frame, inside the liquid crystal.
    pub lit: Region,
    /// The part of `lit` the viewer sees: inside the window.
    pub visible: Region,
}

/// Resolves a text and element names into driven pairs and the lit region. A character
/// that cannot be shown or a name that is no element is an input error naming the
/// option, what is wrong and what is allowed.
pub fn show(art: &Artwork, text: &str, on: &[String]) -> Result<Shown> {
    let (mut elements, missed) = crate::firmware::text_elements(art, text);
    let mut problems = Vec::new();
    if !missed.is_empty() {
        let list: Vec<String> = missed.iter().map(|(i, c)| format!("`{c}` (character {})", i + 1)).collect();
        problems.push(problem(
            "--text",
            format!("cannot show {} on the {} digit position(s)", list.join(", "), art.digits.len()),
            "one character a position from the digits' character table (fonts-strokes/characters.table); `.` and `:` only after a position with a point or colon",
        ));
    }
    for name in on {
        if art.pixels.iter().any(|p| &p.element == name) {
            elements.push(name.clone());
        } else {
            let others: Vec<&str> = art.pixels.iter().map(|p| p.element.as_str()).take(40).collect();
            problems.push(problem("--on", format!("`{name}` is not an element of this layout"), &others.join(", ")));
        }
    }
    if !problems.is_empty() {
        return Err(Error::Input(problems));
    }
    let pairs: BTreeSet<Pair> = elements
        .iter()
        .filter_map(|e| art.pixels.iter().find(|p| &p.element == e))
        .map(|p| (p.com_net.clone(), p.seg_net.clone()))
        .collect();
    let lit = lit_region(art, &Extraction::extract(art), &pairs);
    let visible = geom::snap(&geom::intersection(&lit, &geom::region_of([art.window.clone()])));
    Ok(Shown { elements, pairs, lit, visible })
}

fn problem(key: &str, message: String, allowed: &str) -> InputProblem {
    InputProblem::on_command_line(key, message, allowed)
}

/// Where front ITO of a driven SEG net faces back ITO of its driven COM net in the
/// liquid crystal. Nets are those of the electrical group each ITO component belongs to
/// (joined through transfer dots), so a short lights what it would really light.
pub fn lit_region(art: &Artwork, ex: &Extraction, pairs: &BTreeSet<Pair>) -> Region {
    let lc = geom::region_of([art.lc_region.clone()]);
    let mut parts = Vec::new();
    for front in ex.components.iter().filter(|c| c.plate == PlateId::Front) {
        let seg_nets = &ex.groups[front.group].nets;
        if !pairs.iter().any(|(_, s)| seg_nets.contains(s)) {
            continue;
        }
        let Some(b) = bbox_of_region(&front.region) else { continue };
        for bi in ex.components_near(PlateId::Back, &b) {
            let back = &ex.components[bi];
            let com_nets = &ex.groups[back.group].nets;
            if pairs.iter().any(|(c, s)| com_nets.contains(c) && seg_nets.contains(s)) {
                let overlap = geom::intersection(&front.region, &back.region);
                parts.extend(geom::intersection(&overlap, &lc).0);
            }
        }
    }
    geom::snap(&geom::union_all(parts))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The clean fixture (two 4 × 5 mm squares S1, S2 over one common): S1 on lights its
    /// 20 mm² and nothing of S2 (plane geometry); an unknown name is an input error.
    #[test]
    fn one_element_lights_its_overlap() {
        let art = crate::check::fixture::clean();
        let s = show(&art, "", &["S1".to_string()]).unwrap();
        assert!((geom::area(&s.lit) - 20.0).abs() < 1e-6, "{}", geom::area(&s.lit));
        use geo::Contains;
        assert!(s.lit.contains(&geom::pt(12.0, 17.5)) && !s.lit.contains(&geom::pt(18.0, 17.5)));
        match show(&art, "", &["S9".to_string()]) {
            Err(Error::Input(p)) => assert_eq!(p[0].key, "--on"),
            other => panic!("{other:?}"),
        }
    }

    /// A front stub of S2 reaching past its square (20..21 × 17..17.5) over COM1's ITO —
    /// the common's edge at x = 20.5 and its lead 20.4..30.1 × 17..17.2 — lights with S2
    /// though no pixel is designed there: 0.5 × 0.5 + 0.5 × 0.2 = 0.35 mm² more than the
    /// 20 mm² square (plane geometry).
    #[test]
    fn geometry_not_intent_decides() {
        use crate::artwork::{Layer, Role};
        let mut art = crate::check::fixture::clean();
        crate::check::fixture::add(&mut art, Layer::FrontIto, Role::Lead, Some("S2"), crate::geom::rect(20.0, 17.0, 21.0, 17.5));
        let s = show(&art, "", &["S2".to_string()]).unwrap();
        assert!((geom::area(&s.lit) - 20.35).abs() < 1e-6, "{}", geom::area(&s.lit));
    }
}
