//! Stage `electrode`: elements → electrodes on both plates, with COM/SEG assignment.
//!
//! Takes the elements from `glyph`; gives one front-plate electrode per SEG net and one
//! back-plate common electrode per COM, grown from the gap-free bodies of its pixels by
//! the overlap margin (DESIGN.md §7). Static drive: one COM, one SEG net per element.

use crate::glyph::Element;
use crate::geom::Region;
use crate::layout::Layout;
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
pub fn build_electrodes(_layout: &Layout, _elements: &[Element]) -> Result<Electrodes> {
    Err(crate::Error::Bug("electrode stage not written yet".into()))
}
