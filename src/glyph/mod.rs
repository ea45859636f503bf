//! Stage `glyph`: resolved layout + stroke fonts → element outlines.
//!
//! Takes the digits, legends, icons and bar graphs of a `Layout` and the stroke fonts in
//! `fonts-strokes/` (compiled in) plus any the layout adds; gives one [`Element`] per
//! switchable thing (one per part of a gauge, one per step of a bar graph), with its
//! electrode outline and its gap-free body (from which common electrodes are grown,
//! docs/crate-notes.md, *Backplanes from gap-free shapes*). The font format is described in
//! `fonts-strokes/README.md`, the constructions in `docs/glyphs.md`.

pub mod bar;
pub mod body;
pub mod charset;
pub mod digit;
pub mod font;
pub mod fonts;
pub mod gauge;
pub mod group;
pub mod icon;
pub mod ink;
pub mod legend;
pub mod outline;
pub mod patterns;
#[cfg(test)]
mod preview;
#[cfg(test)]
pub(crate) mod testkit;
#[cfg(test)]
mod tests;

pub use fonts::Fonts;
pub use legend::set_text;
pub use patterns::seven_segment_pattern;

use crate::geom::Region;
use crate::layout::Layout;
use crate::{Error, Result};

/// What kind of thing an element is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ElementKind {
    /// A segment of a digit (including decimal points and colons).
    Segment,
    /// A fixed legend.
    Legend,
    /// An icon, or one part of a gauge.
    Icon,
    /// A step of a bar graph.
    Step,
}

/// One switchable element.
#[derive(Debug, Clone)]
pub struct Element {
    /// Unique name, also its net name under static drive (`D1.a`, `D2.dp`, `D2.col`).
    pub name: String,
    /// Segment, legend, icon or bar-graph step.
    pub kind: ElementKind,
    /// Electrode outline (one or more pieces), mm, front-plate frame.
    pub outline: Region,
    /// Gap-free body: the outline drawn with zero segment gap, so the bodies of one
    /// digit's segments tile the whole digit. Equal to `outline` for legends, icons and
    /// bar-graph steps.
    pub body: Region,
    /// Digit this element belongs to (`D1`), if any.
    pub digit: Option<String>,
    /// What it is, for people ("digit 1 segment a").
    pub drives: String,
    /// Key path of the layout entry it comes from.
    pub key: String,
}

/// Builds every element of the layout: digit groups in order (each digit's segments in
/// the style's order, then its decimal point and colon), then legends, then icons (a
/// gauge's parts in order), then bar graphs (steps in order). Every input problem found
/// is reported together.
pub fn build_elements(layout: &Layout) -> Result<Vec<Element>> {
    if !(layout.tolerance > 0.0 && layout.tolerance.is_finite()) {
        let msg = format!("tolerance {} mm", layout.tolerance);
        return Err(Error::input(layout.problem("tolerance", msg, Some("a length above 0, e.g. 0.001 mm".into()))));
    }
    let fonts = Fonts::with_extra(&layout.extra_fonts)?;
    let mut out = Vec::new();
    let mut problems = Vec::new();
    let mut keep = |r: Result<Vec<Element>>, out: &mut Vec<Element>| -> Result<()> {
        match r {
            Ok(v) => out.extend(v),
            Err(Error::Input(p)) => problems.extend(p),
            Err(e) => return Err(e),
        }
        Ok(())
    };
    for g in &layout.digits {
        keep(group::build_group(layout, &fonts, g), &mut out)?;
    }
    for l in &layout.legends {
        keep(build_legend(layout, &fonts, l).map(|e| vec![e]), &mut out)?;
    }
    for i in &layout.icons {
        if matches!(i.shape, crate::layout::IconShape::Gauge { .. }) {
            keep(gauge::build_gauge(layout, &fonts, i), &mut out)?;
        } else {
            keep(build_icon(layout, &fonts, i).map(|e| vec![e]), &mut out)?;
        }
    }
    for b in &layout.bars {
        keep(bar::build_bar(layout, b), &mut out)?;
    }
    if problems.is_empty() { Ok(out) } else { Err(Error::Input(problems)) }
}

fn finished(name: &str, r: &Region) -> Result<Region> {
    outline::finish(r).map_err(|e| Error::Bug(format!("{name}: {e}")))
}

fn build_legend(layout: &Layout, fonts: &Fonts, l: &crate::layout::Legend) -> Result<Element> {
    let key = |k: &str| format!("{}.{k}", l.key);
    if !(l.stroke > 0.0 && l.stroke < l.height) {
        let allowed = format!("more than 0 and less than the height, {} mm", l.height);
        return Err(Error::input(layout.problem(&key("stroke"), format!("stroke {} mm", l.stroke), Some(allowed))));
    }
    let region = set_text(fonts, &l.text, l.at, l.height, l.stroke, l.align, layout.tolerance).map_err(|missing| {
        let list: Vec<String> = missing.iter().map(|c| font::char_label(*c)).collect();
        let msg = format!(
            "the legend font has no {} {}",
            if list.len() == 1 { "character" } else { "characters" },
            list.join(", ")
        );
        Error::input(layout.problem(&key("text"), msg, Some(fonts.glyph_list())))
    })?;
    if region.0.is_empty() {
        return Err(Error::input(layout.problem(&key("text"), "the text draws nothing", None)));
    }
    let outline = finished(&l.name, &region)?;
    Ok(Element {
        name: l.name.clone(),
        kind: ElementKind::Legend,
        body: outline.clone(),
        outline,
        digit: None,
        drives: format!("legend \"{}\"", l.text),
        key: l.key.clone(),
    })
}

fn build_icon(layout: &Layout, fonts: &Fonts, i: &crate::layout::Icon) -> Result<Element> {
    let region = icon::build_icon(fonts, &i.shape, layout.tolerance)
        .map_err(|p| Error::input(layout.problem(&format!("{}.{}", i.key, p.field), p.message, p.allowed)))?;
    let outline = finished(&i.name, &region)?;
    Ok(Element {
        name: i.name.clone(),
        kind: ElementKind::Icon,
        body: outline.clone(),
        outline,
        digit: None,
        drives: icon::describe(&i.shape),
        key: i.key.clone(),
    })
}
