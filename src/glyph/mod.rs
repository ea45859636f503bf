//! Stage `glyph`: resolved layout + stroke fonts → element outlines.
//!
//! Takes the digits, legends and icons of a `Layout` and the stroke fonts in
//! `fonts-strokes/` (compiled in) plus any the layout adds; gives one [`Element`] per
//! switchable thing, with its electrode outline and its gap-free body (from which common
//! electrodes are grown, DESIGN.md §7).

use crate::geom::Region;
use crate::layout::Layout;
use crate::Result;

/// What kind of thing an element is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ElementKind {
    /// A segment of a digit (including decimal points and colons).
    Segment,
    /// A fixed legend.
    Legend,
    /// An icon.
    Icon,
}

/// One switchable element.
#[derive(Debug, Clone)]
pub struct Element {
    /// Unique name, also its net name under static drive (`D1.a`, `D2.dp`, `D2.col`).
    pub name: String,
    /// Segment, legend or icon.
    pub kind: ElementKind,
    /// Electrode outline (one or more pieces), mm, front-plate frame.
    pub outline: Region,
    /// Gap-free body: the outline drawn with zero segment gap, so the bodies of one
    /// digit's segments tile the whole digit. Equal to `outline` for legends and icons.
    pub body: Region,
    /// Digit this element belongs to (`D1`), if any.
    pub digit: Option<String>,
    /// What it is, for people ("digit 1 segment a").
    pub drives: String,
    /// Key path of the layout entry it comes from.
    pub key: String,
}

/// Builds every element of the layout.
pub fn build_elements(_layout: &Layout) -> Result<Vec<Element>> {
    Err(crate::Error::Bug("glyph stage not written yet".into()))
}
