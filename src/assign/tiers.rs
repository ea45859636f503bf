//! Which elements lie behind a row of digits as seen from the pads.
//!
//! Takes the layout (pad side) and the elements; gives, per element, whether it is in the
//! *far tier*: a digit group with another digit group between it and the pad side (their
//! spans along the side overlapping), or any other element at least as far from the pad
//! side as the nearest edge of such a group. The far tier sends its SEG leads out on the
//! side opposite the pads and round the seal to the pads (`route::ring`), so its digits
//! take their template for leads leaving that way, with the commons numbered from the
//! other end: the far tier's common nearest the near tier is then the near tier's common
//! nearest the far tier, and the two join across the space between the rows, which no
//! front lead crosses.
//!
//! Only pads on the top or bottom side have tiers; on the left or right every element is
//! in the near tier.

use crate::glyph::Element;
use crate::layout::{Layout, Side};

/// Per element, true for the far tier (see the module comment).
pub fn far_tier(layout: &Layout, elements: &[Element]) -> Vec<bool> {
    let away = match layout.pads.side {
        Side::Bottom => 1.0,
        Side::Top => -1.0,
        Side::Left | Side::Right => return vec![false; elements.len()],
    };
    // Each digit group's span along the side (x) and away from it (`away * y`).
    let mut groups: Vec<(&str, (f64, f64), (f64, f64))> = Vec::new();
    for e in elements.iter().filter(|e| e.digit.is_some()) {
        let pts = e.body.0.iter().flat_map(|p| p.exterior().0.iter());
        for p in pts {
            let (x, v) = (p.x, away * p.y);
            match groups.iter_mut().find(|g| g.0 == e.key) {
                Some(g) => {
                    g.1 = (g.1 .0.min(x), g.1 .1.max(x));
                    g.2 = (g.2 .0.min(v), g.2 .1.max(v));
                }
                None => groups.push((&e.key, (x, x), (v, v))),
            }
        }
    }
    let far: Vec<&(&str, (f64, f64), (f64, f64))> = groups
        .iter()
        .filter(|f| groups.iter().any(|n| n.0 != f.0 && n.2 .1 < f.2 .0 && n.1 .0 < f.1 .1 && f.1 .0 < n.1 .1))
        .collect();
    let Some(edge) = far.iter().map(|f| f.2 .0).min_by(f64::total_cmp) else { return vec![false; elements.len()] };
    elements
        .iter()
        .map(|e| match e.digit {
            Some(_) => far.iter().any(|f| f.0 == e.key),
            None => away * super::centre(e).y >= edge,
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::path::Path;

    fn far_names(text: &str, side: Side) -> Vec<String> {
        let mut layout = crate::spec::parse_layout(text, Path::new("two-rows.yaml")).unwrap();
        layout.pads.side = side;
        let elements = crate::glyph::build_elements(&layout).unwrap();
        let far = far_tier(&layout, &elements);
        elements.iter().zip(far).filter(|(_, f)| *f).map(|(e, _)| e.name.clone()).collect()
    }

    /// In the two-row demo (large digits `T` with points and a legend above small digits
    /// `S`, pads at the bottom) the upper row and its legend are the far tier and the
    /// lower row's legend is not; with the pads on top the lower row is; on the left
    /// nothing is.
    #[test]
    fn the_row_behind_another_is_the_far_tier() {
        let text = include_str!("../../demo-layouts/cold-store-monitor.yaml");
        let bottom = far_names(text, Side::Bottom);
        assert_eq!(bottom.len(), 5 * 7 + 4 + 1, "{bottom:?}");
        assert!(bottom.iter().any(|n| n == "T1.dp") && bottom.iter().all(|n| n.starts_with('T') || n == "DEG"), "{bottom:?}");
        let top = far_names(text, Side::Top);
        assert_eq!(top.len(), 3 * 7 + 1, "{top:?}");
        assert!(top.iter().all(|n| n.starts_with('S') || n == "SET"), "{top:?}");
        assert!(far_names(text, Side::Left).is_empty());
    }
}
