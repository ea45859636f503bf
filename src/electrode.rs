//! Stage `electrode`: elements → electrodes on both plates, with COM/SEG assignment.
//!
//! Takes the elements from `glyph`; gives one front-plate electrode per SEG net and one
//! back-plate common electrode per COM, grown from the gap-free bodies of its pixels by
//! the overlap margin (DESIGN.md §7). Static drive: one COM, one SEG net per element.

use crate::geom::{offset_round, union_all, Region};
use crate::glyph::Element;
use crate::layout::{common_net, Layout};
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
    /// SEG nets on the front plate.
    pub segs: Vec<SegElectrode>,
    /// Common electrodes on the back plate.
    pub coms: Vec<ComElectrode>,
}

/// Builds the electrodes of both plates.
///
/// Static drive only for now: every element is its own SEG net, and one common electrode
/// faces them all. Several commons are a layout error until multiplexing lands.
pub fn build_electrodes(layout: &Layout, elements: &[Element]) -> Result<Electrodes> {
    if layout.drive.commons != 1 {
        return Err(crate::Error::input(layout.problem(
            "drive",
            format!("1/{} duty needs the multiplexed back plate, which this version does not build yet", layout.drive.commons),
            Some("static".into()),
        )));
    }
    let segs = elements
        .iter()
        .enumerate()
        .map(|(i, e)| SegElectrode {
            net: e.name.clone(),
            index: i as u32,
            outline: e.outline.clone(),
            elements: vec![e.name.clone()],
            drives: e.drives.clone(),
        })
        .collect();
    let bodies = union_all(elements.iter().flat_map(|e| e.body.0.iter().cloned()));
    let outline = offset_round(&bodies, layout.rules.backplane_overlap, layout.tolerance);
    let com = ComElectrode {
        net: common_net(0),
        index: 0,
        outline,
        elements: elements.iter().map(|e| e.name.clone()).collect(),
    };
    Ok(Electrodes { elements: elements.to_vec(), segs, coms: vec![com] })
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
        let e = build_electrodes(&layout, &els).unwrap();
        assert_eq!(e.segs.len(), 2);
        let expected = 2.0 * (1.0 + 4.0 * 0.2 + std::f64::consts::PI * 0.04);
        assert!((area(&e.coms[0].outline) - expected).abs() < 2e-3);
    }
}
