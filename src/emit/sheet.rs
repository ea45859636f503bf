//! The print sheet: every plate's film, in as many copies as asked, stepped and repeated
//! on A4 or Letter pages with cut marks (`NAME.sheet.pdf`).
//!
//! Takes the film drawings of the plates, the sheet size and the copy count, gives the
//! sheet pages as drawings. Films are placed whole (title, rulers, calibration square
//! and all, so every copy can be checked alone) in rows from the top left, `GUTTER` mm
//! apart; each film's corners get short cut lines continuing its edges into the gutter.
//! A film larger than the sheet gets a page of its own, as large as it needs.

use super::drawing::{Drawing, Item, Paint};
use super::page::{TextPlace, text_lines};
use super::text::{fit_height, stroke_width};
use crate::layout::Sheet;

/// Page margin, mm: most printers cannot print within about 5 mm of the paper edge
/// (*common practice*).
pub const SHEET_MARGIN: f64 = 10.0;
/// Room at the top of each page for its heading, mm.
const HEADING: f64 = 6.0;
/// Space between films, mm; the cut lines run in it.
pub const GUTTER: f64 = 6.0;
/// Cut lines start and end this far from the film corner, mm.
const CUT: (f64, f64) = (1.0, 4.0);
/// Line width of the cut lines, mm.
const CUT_LINE: f64 = 0.1;

/// Where one film goes: page index and top-left corner, mm.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Placement {
    /// Page, from 0.
    pub page: usize,
    /// Left edge of the film on the page, mm.
    pub x: f64,
    /// Top edge of the film on the page, mm.
    pub y: f64,
}

/// Places films of the given sizes (in order) on pages of `sheet` size, rows from the top
/// left; gives each film's place and each page's size.
pub fn place(sizes: &[(f64, f64)], sheet: (f64, f64)) -> (Vec<Placement>, Vec<(f64, f64)>) {
    let (sw, sh) = sheet;
    let top = SHEET_MARGIN + HEADING;
    let mut pages: Vec<(f64, f64)> = Vec::new();
    let mut out = Vec::new();
    let (mut x, mut y, mut row_h) = (SHEET_MARGIN, top, 0.0f64);
    for &(w, h) in sizes {
        let oversize = w > sw - 2.0 * SHEET_MARGIN || h > sh - top - SHEET_MARGIN;
        if oversize {
            pages.push((sw.max(w + 2.0 * SHEET_MARGIN), sh.max(h + top + SHEET_MARGIN)));
            out.push(Placement { page: pages.len() - 1, x: SHEET_MARGIN, y: top });
            (x, y, row_h) = (sw, sh, 0.0); // the next film starts a new page
            continue;
        }
        if pages.is_empty() || x + w > sw - SHEET_MARGIN {
            // next row
            (x, y) = (SHEET_MARGIN, y + row_h + GUTTER);
            row_h = 0.0;
        }
        if pages.is_empty() || y + h > sh - SHEET_MARGIN || pages.last() != Some(&(sw, sh)) {
            pages.push((sw, sh));
            (x, y, row_h) = (SHEET_MARGIN, top, 0.0);
        }
        out.push(Placement { page: pages.len() - 1, x, y });
        x += w + GUTTER;
        row_h = row_h.max(h);
    }
    (out, pages)
}

/// Cut lines at the four corners of a film placed at (`x`, `y`), `w` × `h` mm.
fn cut_lines(x: f64, y: f64, w: f64, h: f64) -> Vec<Vec<(f64, f64)>> {
    let (a, b) = CUT;
    let mut out = Vec::new();
    for (cx, sx) in [(x, -1.0), (x + w, 1.0)] {
        for (cy, sy) in [(y, -1.0), (y + h, 1.0)] {
            out.push(vec![(cx + sx * a, cy), (cx + sx * b, cy)]);
            out.push(vec![(cx, cy + sy * a), (cx, cy + sy * b)]);
        }
    }
    out
}

/// The sheet pages holding `copies` of each film.
pub fn sheet_pages(films: &[Drawing], sheet: Sheet, copies: u32, name: &str) -> Vec<Drawing> {
    let tiles: Vec<&Drawing> = (0..copies).flat_map(|_| films.iter()).collect();
    let sizes: Vec<(f64, f64)> = tiles.iter().map(|d| (d.width, d.height)).collect();
    let (places, page_sizes) = place(&sizes, sheet.size());
    let n = page_sizes.len();
    let mut pages: Vec<Drawing> = page_sizes
        .iter()
        .enumerate()
        .map(|(i, &(w, h))| {
            let line = format!("{name} FILMS - PRINT AT 100 PERCENT (ACTUAL SIZE), NO SCALING - CUT ON THE MARKS - PAGE {} OF {n}", i + 1);
            let height = fit_height(&line, 2.0, w - 2.0 * SHEET_MARGIN);
            let at = TextPlace { left: SHEET_MARGIN, baseline: SHEET_MARGIN + 2.5, height, mirrored: false };
            let items = vec![Item::Stroke { lines: text_lines(&line, at), width: stroke_width(height), paint: Paint::Ink }];
            Drawing { width: w, height: h, title: format!("{name} print sheet"), items }
        })
        .collect();
    for (d, p) in tiles.iter().zip(&places) {
        let page = &mut pages[p.page];
        // A film's clear parts are drawn white; over plain paper that is the same.
        page.items.extend(d.items.iter().map(|it| it.moved(p.x, p.y)));
        page.items.push(Item::Stroke { lines: cut_lines(p.x, p.y, d.width, d.height), width: CUT_LINE, paint: Paint::Ink });
    }
    pages
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Four 80 × 60 mm films fit two by two on A4 (210 × 297 mm) and stay inside the
    /// margins; a 250 mm film gets a page of its own, large enough.
    #[test]
    fn films_step_and_repeat_inside_the_margins() {
        let (pl, pages) = place(&[(80.0, 60.0); 4], Sheet::A4.size());
        assert_eq!(pages.len(), 1);
        assert_eq!((pl[1].x, pl[1].y), (SHEET_MARGIN + 80.0 + GUTTER, SHEET_MARGIN + HEADING));
        assert_eq!(pl[2].x, SHEET_MARGIN);
        for p in &pl {
            assert!(p.x + 80.0 <= 210.0 - SHEET_MARGIN && p.y + 60.0 <= 297.0 - SHEET_MARGIN);
        }
        let (pl, pages) = place(&[(80.0, 60.0), (250.0, 60.0), (80.0, 60.0)], Sheet::A4.size());
        assert_eq!(pages.len(), 3);
        assert_eq!(pl.iter().map(|p| p.page).collect::<Vec<_>>(), [0, 1, 2]);
        assert!(pages[1].0 >= 250.0 + 2.0 * SHEET_MARGIN);
    }
}
