//! A film page drawn once, for every page format that prints it (SVG and PDF).
//!
//! Takes nothing but what the film composer puts in: filled rings and stroked polylines
//! in page millimetres (origin top-left, y down), each in ink or clear. Gives the SVG
//! bytes of the page ([`svg_bytes`]); the PDF writer (`super::pdf`) reads the same
//! items, so both formats carry the same drawing by construction.

use super::page;

/// What a filled or stroked item leaves on the film.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Paint {
    /// Opaque (black).
    Ink,
    /// Transparent (white on the page): what must stay clear inside a dark field.
    Clear,
}

/// A point on the page, mm, y down.
pub type PagePt = (f64, f64);

/// One item of a page, drawn in order (later items cover earlier ones).
#[derive(Debug, Clone, PartialEq)]
pub enum Item {
    /// Closed rings filled together, under the even-odd rule when `even_odd`, else
    /// non-zero.
    Fill {
        /// Rings (not repeating their first point).
        rings: Vec<Vec<PagePt>>,
        /// Fill rule.
        even_odd: bool,
        /// Ink or clear.
        paint: Paint,
    },
    /// Open polylines stroked with round caps and joins.
    Stroke {
        /// Polylines.
        lines: Vec<Vec<PagePt>>,
        /// Line width, mm.
        width: f64,
        /// Ink or clear.
        paint: Paint,
    },
}

/// A page of `width` × `height` mm.
#[derive(Debug, Clone, PartialEq)]
pub struct Drawing {
    /// Page width, mm.
    pub width: f64,
    /// Page height, mm.
    pub height: f64,
    /// Title (SVG `<title>`, PDF document title).
    pub title: String,
    /// Items in drawing order.
    pub items: Vec<Item>,
}

impl Item {
    /// The same item moved by (`dx`, `dy`) mm.
    pub fn moved(&self, dx: f64, dy: f64) -> Item {
        let mv = |ls: &Vec<Vec<PagePt>>| ls.iter().map(|l| l.iter().map(|&(x, y)| (x + dx, y + dy)).collect()).collect();
        match self {
            Item::Fill { rings, even_odd, paint } => Item::Fill { rings: mv(rings), even_odd: *even_odd, paint: *paint },
            Item::Stroke { lines, width, paint } => Item::Stroke { lines: mv(lines), width: *width, paint: *paint },
        }
    }
}

/// SVG colour of a paint.
fn colour(p: Paint) -> &'static str {
    match p {
        Paint::Ink => "#000000",
        Paint::Clear => "#ffffff",
    }
}

/// Path data of closed rings (`M … L … Z`).
pub fn rings_d(rings: &[Vec<PagePt>]) -> String {
    let mut d = String::new();
    for r in rings {
        if r.len() < 3 {
            continue;
        }
        super::svg_path::push_page_polyline(&mut d, r);
        d.push('Z');
    }
    d
}

/// The SVG bytes of a page: `width`/`height` in mm and a `viewBox` of the same numbers.
pub fn svg_bytes(drawing: &Drawing) -> Vec<u8> {
    let mut doc = page::document(drawing.width, drawing.height, &drawing.title);
    for item in &drawing.items {
        match item {
            Item::Fill { rings, even_odd, paint } => {
                let d = rings_d(rings);
                if !d.is_empty() {
                    doc = doc.add(page::fill(d, colour(*paint), if *even_odd { "evenodd" } else { "nonzero" }));
                }
            }
            Item::Stroke { lines, width, paint } => {
                let d = page::polylines_d(lines);
                if !d.is_empty() {
                    doc = doc.add(page::stroke(d, colour(*paint), *width));
                }
            }
        }
    }
    page::bytes(&doc)
}
