//! Stage `electrode`: elements and their assignment → electrodes on both plates.
//!
//! Takes the elements from `glyph` and their COM and SEG line from `assign`; gives one
//! front-plate electrode per SEG net (its elements' outlines) and one back-plate common
//! electrode per COM, grown from the gap-free bodies of its pixels by the overlap margin
//! and split from its neighbours so that commons keep the minimum gap (`split.rs`,
//! docs/crate-notes.md, *Backplanes from gap-free shapes*). Pixels the split leaves
//! partly uncovered are `coverage` warnings.
//! Under static drive every element is its own SEG net, named after the element; when
//! multiplexed, SEG lines are `SEG1`, `SEG2`, …

pub mod split;

use crate::assign::Assignment;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{area, intersection, union_all, Region};
use crate::glyph::Element;
use crate::layout::{common_net, line_net, Layout, PlateId};
use crate::Result;

/// A front-plate SEG net and its element outlines.
#[derive(Debug, Clone)]
pub struct SegElectrode {
    /// Net name.
    pub net: String,
    /// SEG line index (0-based).
    pub index: u32,
    /// Outlines of its elements.
    pub outline: Region,
    /// Elements on it.
    pub elements: Vec<String>,
    /// What it drives, for people.
    pub drives: String,
}

/// A back-plate common electrode.
#[derive(Debug, Clone)]
pub struct ComElectrode {
    /// Net name (`COM1`, …).
    pub net: String,
    /// COM index (0-based).
    pub index: u32,
    /// Grown outline before leads are cut out of it.
    pub outline: Region,
    /// Elements whose pixels it faces.
    pub elements: Vec<String>,
}

/// Electrodes of both plates.
#[derive(Debug, Clone)]
pub struct Electrodes {
    /// The elements, as built.
    pub elements: Vec<Element>,
    /// COM and SEG line of every element.
    pub assignment: Assignment,
    /// SEG nets on the front plate.
    pub segs: Vec<SegElectrode>,
    /// Common electrodes on the back plate.
    pub coms: Vec<ComElectrode>,
    /// Pixels their common does not cover fully.
    pub findings: Vec<Finding>,
}

impl Electrodes {
    /// SEG net and COM net of element `i`.
    pub fn nets_of(&self, i: usize) -> (&str, &str) {
        let a = &self.assignment;
        let seg = self.segs.iter().find(|s| s.index == a.line[i]).map(|s| s.net.as_str()).unwrap_or("");
        let com = self.coms.get(a.com[i] as usize).map(|c| c.net.as_str()).unwrap_or("");
        (seg, com)
    }
}

/// Builds the electrodes of both plates.
pub fn build_electrodes(layout: &Layout, elements: &[Element], assignment: &Assignment) -> Result<Electrodes> {
    let multiplexed = layout.drive.commons > 1;
    let mut segs = Vec::new();
    for j in 0..assignment.lines {
        let members: Vec<&Element> = assignment.on_line(j).map(|i| &elements[i]).collect();
        let Some(first) = members.first() else { continue };
        let (net, drives) = if multiplexed {
            (line_net(j), members.iter().map(|e| e.name.as_str()).collect::<Vec<_>>().join(" "))
        } else {
            (first.name.clone(), first.drives.clone())
        };
        segs.push(SegElectrode {
            net,
            index: j,
            outline: union_all(members.iter().flat_map(|e| e.outline.0.iter().cloned())),
            elements: members.iter().map(|e| e.name.clone()).collect(),
            drives,
        });
    }
    let n = layout.drive.commons.max(1);
    // Not united here: the split unites each common's bodies cluster by cluster.
    let bodies: Vec<Region> = (0..n)
        .map(|k| {
            crate::geom::region_of(
                elements.iter().zip(&assignment.com).filter(|(_, c)| **c == k).flat_map(|(e, _)| e.body.0.iter().cloned()),
            )
        })
        .collect();
    let outlines = split::split_commons(&bodies, layout.rules.backplane_overlap, layout.rules.min_gap, layout.tolerance);
    let coms: Vec<ComElectrode> = outlines
        .into_iter()
        .enumerate()
        .map(|(k, outline)| ComElectrode {
            net: common_net(k as u32),
            index: k as u32,
            outline,
            elements: elements.iter().zip(&assignment.com).filter(|(_, c)| **c == k as u32).map(|(e, _)| e.name.clone()).collect(),
        })
        .collect();
    let mut findings = coverage(elements, assignment, &coms);
    findings.extend(crate::assign::pin_note::extra_lines_note(layout, elements, assignment));
    Ok(Electrodes { elements: elements.to_vec(), assignment: assignment.clone(), segs, coms, findings })
}

/// A `coverage` warning for every pixel its common covers less than fully.
fn coverage(elements: &[Element], a: &Assignment, coms: &[ComElectrode]) -> Vec<Finding> {
    let mut out = Vec::new();
    for (i, e) in elements.iter().enumerate() {
        let Some(c) = coms.get(a.com[i] as usize) else { continue };
        let whole = area(&e.outline);
        // Only the common's pieces near the pixel: a whole common spans the glass.
        let near = near_pieces(&c.outline, &e.outline);
        let covered = area(&intersection(&e.outline, &near));
        if whole > 0.0 && covered < whole * (1.0 - 1e-4) {
            use geo::Centroid;
            out.push(Finding {
                rule: Rule::Coverage,
                severity: Severity::Warning,
                plate: Some(PlateId::Back),
                nets: vec![e.name.clone(), c.net.clone()],
                location: e.outline.centroid().map(|p| p.0).unwrap_or_default(),
                measured: Some(covered / whole),
                required: Some(1.0),
                message: format!(
                    "{} is covered {:.1} % by {}: the commons meet inside the pixel; widen the segment gap to at least the minimum gap",
                    e.name,
                    100.0 * covered / whole,
                    c.net
                ),
            });
        }
    }
    out
}

/// The polygons of `r` whose bounding boxes meet that of `of`.
fn near_pieces(r: &Region, of: &Region) -> Region {
    use geo::BoundingRect;
    let Some(b) = of.bounding_rect() else { return Region::new(vec![]) };
    Region::new(
        r.0.iter()
            .filter(|p| {
                p.bounding_rect().is_some_and(|q| q.min().x <= b.max().x && b.min().x <= q.max().x && q.min().y <= b.max().y && b.min().y <= q.max().y)
            })
            .cloned()
            .collect(),
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, rect, region_of};
    use crate::glyph::ElementKind;

    fn element(name: &str, x: f64) -> Element {
        let r = region_of([rect(x, 0.0, x + 1.0, 1.0)]);
        Element { name: name.into(), kind: ElementKind::Icon, outline: r.clone(), body: r, digit: None, drives: name.into(), key: "icons".into() }
    }

    /// The common electrode covers every pixel with the overlap margin all round: its
    /// area is that of each square grown by the margin with round corners
    /// (a + 4·m·s + π·m² per square; plane geometry).
    #[test]
    fn common_covers_every_pixel_by_the_margin() {
        let mut layout = crate::layout::fixture::tiny_layout();
        layout.rules.backplane_overlap = 0.2;
        let els = [element("A", 0.0), element("B", 5.0)];
        let a = crate::assign::assign(&layout, &els).unwrap();
        let e = build_electrodes(&layout, &els, &a).unwrap();
        assert_eq!(e.segs.len(), 2);
        let expected = 2.0 * (1.0 + 4.0 * 0.2 + std::f64::consts::PI * 0.04);
        assert!((area(&e.coms[0].outline) - expected).abs() < 2e-3);
    }
}
