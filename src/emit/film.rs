//! Exact-scale photomask films, one per plate: the page every film format prints.
//!
//! Takes the artwork and a plate, gives a [`Drawing`] (1 unit = 1 mm) holding the
//! plate's mask ([`super::mask`]: etched layers, compensated and mirrored there), its
//! labels, corner marks outside the glass, a title, a ruler along each axis, a
//! calibration square and a side note; `NAME.front.svg`/`NAME.back.svg` and the pages of
//! `NAME.films.pdf` are this drawing. Coordinates are only transformed here (y flipped);
//! tone follows the resist (docs/background.md, *Tone*): positive resist → clear-field
//! film, ink where ITO stays and nothing on or near the glass edge; negative resist →
//! dark-field film, ink over the glass and a margin around it except where ITO stays
//! (one path, field rectangle plus ITO rings, even-odd fill).

use super::drawing::{Drawing, Item, Paint, PagePt};
use super::mask::{MaskLabel, MaskPlate, bbox, contact_mirrored, mask_plate};
use super::page::{TextPlace, text_lines};
use super::report::resist_name;
use super::ruler::{self, Axis};
use super::svg_path::{PageMap, page_ring};
use super::text::{fit_height, stroke_width, text_width};
use crate::artwork::Artwork;
use crate::geom::{Polygon, Pt, pt};
use crate::layout::{PlateId, Resist};
use crate::{Error, Result};

/// Baselines of the title lines, mm below the page top: the third (errors standing) ends
/// above 10.5 mm, where a dark field grown around a plate label 3 mm above the glass may
/// begin (the label's top 4.5 mm and 1 mm around it, below [`TOP`]).
const TITLE_BASELINES: [f64; 3] = [4.0, 7.0, 10.0];
/// Clear margin on the left and right of the content, mm.
pub const MARGIN: f64 = 12.0;
/// Space above the glass for the title (and the dark field's margin), mm.
pub const TOP: f64 = 16.0;
/// How far the dark field of a negative-resist film reaches past the glass, mm: the
/// glass edge then lies in the dark, and a film laid a little off still darkens it.
pub const FIELD_MARGIN: f64 = 3.0;
/// Where the corner marks start and end, measured outward from the glass corner, mm.
pub const CORNER_MARK: (f64, f64) = (1.0, 2.5);
/// Line width of the corner marks, mm.
pub const CORNER_LINE: f64 = 0.15;
/// Side of the calibration square, mm.
pub const CALIBRATION: f64 = 20.0;
/// Gap between the glass (or its dark field) and the horizontal ruler, mm.
const RULER_GAP: f64 = FIELD_MARGIN + 1.5;
/// x of the vertical ruler's base line: left of everything else on the page, mm.
const VRULER_X: f64 = MARGIN - 4.5;
/// Space below the glass for ruler, side note, the cell's notes and calibration square, mm
/// (the side note and the cell's two notes take 2.8 mm a line).
pub const BOTTOM: f64 = RULER_GAP + ruler::DEPTH + 9.6 + 5.6 + CALIBRATION + 8.0;

/// Upper-case words for the plate.
fn plate_words(plate: PlateId) -> &'static str {
    match plate {
        PlateId::Front => "FRONT PLATE (SEGMENTS)",
        PlateId::Back => "BACK PLATE (COMMONS)",
    }
}

/// Where the page puts things.
struct Frame {
    map: PageMap,
    /// The content's span across the page (inside the margins), in mask-frame x.
    span: (f64, f64),
    width: f64,
    height: f64,
    glass_bottom: f64,
    ruler: f64,
    vruler: f64,
}

fn frame(glass: &Polygon) -> Result<Frame> {
    if glass.exterior().0.is_empty() {
        return Err(Error::Bug("film: empty glass outline".into()));
    }
    let (x0, y0, x1, y1) = bbox(glass);
    let (gw, gh) = (x1 - x0, y1 - y0);
    let ruler = ruler::length_for(gw);
    let vruler = ruler::length_for(gh);
    let content = gw.max(ruler);
    let width = content + 2.0 * MARGIN;
    let left = MARGIN + (content - gw) / 2.0;
    let map = PageMap::upright(x0, y1, left, TOP);
    let height = TOP + (gh + BOTTOM).max(vruler + 4.0);
    let span = (x0 - (left - MARGIN), x0 - (left - MARGIN) + content);
    Ok(Frame { map, span, width, height, glass_bottom: TOP + gh, ruler, vruler })
}

/// Page rings of polygons (outer rings counter-clockwise, holes clockwise in the mask
/// frame, so the non-zero rule keeps holes open).
fn rings(polys: &[Polygon], map: &PageMap) -> Vec<Vec<PagePt>> {
    let mut out = Vec::new();
    for p in polys {
        out.extend(page_ring(&p.exterior().0, map, true));
        for h in p.interiors() {
            out.extend(page_ring(&h.0, map, false));
        }
    }
    out
}

/// The dark field of a negative film, in the mask frame: the glass grown by
/// [`FIELD_MARGIN`], and grown further to hold every label with 1 mm to spare.
pub fn dark_field(m: &MaskPlate) -> (f64, f64, f64, f64) {
    let (x0, y0, x1, y1) = bbox(&m.glass);
    let mut f = (x0 - FIELD_MARGIN, y0 - FIELD_MARGIN, x1 + FIELD_MARGIN, y1 + FIELD_MARGIN);
    for l in &m.labels {
        let w = text_width(&l.text, l.height);
        f = (f.0.min(l.at.x - 1.0), f.1.min(l.at.y - 1.0), f.2.max(l.at.x + w + 1.0), f.3.max(l.at.y + l.height + 1.0));
    }
    f
}

/// The mask with every label that would run past the content's span (`span`, mask-frame
/// x) made smaller to fit it, its anchored end kept (the left end of an upright label,
/// the right end of a mirrored one, as [`super::mask::mask_plate`] anchors them at the
/// glass edges) and its baseline too, so it stays clear of the corner marks; `None` when
/// every label fits as it is.
fn fit_labels(m: &MaskPlate, span: (f64, f64)) -> Option<MaskPlate> {
    let fits = |l: &MaskLabel| l.at.x >= span.0 - 1e-9 && l.at.x + text_width(&l.text, l.height) <= span.1 + 1e-9;
    if m.labels.iter().all(fits) {
        return None;
    }
    let labels = m
        .labels
        .iter()
        .map(|l| {
            let end = l.at.x + text_width(&l.text, l.height);
            let room = if l.mirrored { end - span.0 } else { span.1 - l.at.x };
            let height = fit_height(&l.text, l.height, room);
            let x = if l.mirrored { end - text_width(&l.text, height) } else { l.at.x };
            MaskLabel { at: pt(x, l.at.y), height, ..l.clone() }
        })
        .collect();
    Some(MaskPlate { labels, ..m.clone() })
}

/// The corner marks: at each glass corner, two short lines continuing the glass edges
/// outward, starting [`CORNER_MARK`]`.0` beyond the corner (mask frame).
pub fn corner_marks(glass: &Polygon) -> Vec<[Pt; 2]> {
    let (x0, y0, x1, y1) = bbox(glass);
    let (a, b) = CORNER_MARK;
    let mut out = Vec::new();
    for (cx, sx) in [(x0, -1.0), (x1, 1.0)] {
        for (cy, sy) in [(y0, -1.0), (y1, 1.0)] {
            out.push([pt(cx + sx * a, cy), pt(cx + sx * b, cy)]);
            out.push([pt(cx, cy + sy * a), pt(cx, cy + sy * b)]);
        }
    }
    out
}

/// The mask content in the plate's tone: etched shapes, corner marks (and any other
/// marks outside the glass, `ticks`) and labels.
fn content(art: &Artwork, m: &MaskPlate, ticks: &[[Pt; 2]], map: &PageMap) -> Vec<Item> {
    let ito = rings(&m.etched, map);
    let marks: Vec<Vec<PagePt>> =
        corner_marks(&m.glass).iter().chain(ticks).map(|s| s.iter().map(|p| map.apply(*p)).collect()).collect();
    let (fill, mark_paint) = match art.resist {
        // Clear-field: ink where ITO stays; non-zero rule with holes wound against their
        // outer rings, so shapes that merely touch never cancel.
        Resist::Positive => (Item::Fill { rings: ito, even_odd: false, paint: Paint::Ink }, Paint::Ink),
        // Dark-field: the field and every ITO ring in one path; even-odd leaves the ITO
        // clear (and an island inside an ITO hole dark again).
        Resist::Negative => {
            let (x0, y0, x1, y1) = dark_field(m);
            let field = [pt(x0, y0), pt(x1, y0), pt(x1, y1), pt(x0, y1)];
            let mut all = page_ring(&field, map, true).into_iter().collect::<Vec<_>>();
            all.extend(ito);
            (Item::Fill { rings: all, even_odd: true, paint: Paint::Ink }, Paint::Clear)
        }
    };
    let mut items = vec![fill, Item::Stroke { lines: marks, width: CORNER_LINE, paint: mark_paint }];
    for l in &m.labels {
        let lines = l.strokes().into_iter().map(|s| s.into_iter().map(|p| map.apply(p)).collect()).collect();
        items.push(Item::Stroke { lines, width: stroke_width(l.height), paint: mark_paint });
    }
    items
}

/// The title lines (they read normally on the printed side); `name` is what the film is
/// of (the layout's name, or its panel).
fn title_lines(art: &Artwork, m: &MaskPlate, name: &str, date: &str, errors: usize) -> Vec<String> {
    let tone = match art.resist {
        Resist::Positive => "CLEAR-FIELD",
        Resist::Negative => "DARK-FIELD",
    };
    let reading = if m.mirrored { "PRINTED MIRRORED" } else { "PRINTED AS THE VIEWER SEES IT" };
    let grown = if m.compensated { format!(" - GROWN {:.1} UM PER EDGE FOR ETCH", m.bias * 1000.0) } else { String::new() };
    let mut lines = vec![
        format!("{name} - {} FILM", plate_words(m.plate)),
        format!("{tone} FOR {} RESIST - {reading} - 1:1{grown} - {date}", resist_name(art.resist)),
    ];
    if errors > 0 {
        lines.push(format!("NOT CHECKED CLEAN: {errors} RULE ERROR(S) - SEE REPORT"));
    }
    lines
}

/// The side note, printed mirrored so that it reads correctly only through the back of
/// the film, that is when the printed side lies on the resist.
fn note_lines(plate: PlateId) -> [String; 2] {
    [
        format!("{}: LAY THIS FILM PRINTED SIDE DOWN ON THE RESIST", plate_words(plate)),
        "THIS NOTE READS CORRECTLY ONLY WHEN THE FILM LIES THE RIGHT WAY".to_string(),
    ]
}

/// A line of stroke text as one item.
fn words(s: &str, at: TextPlace) -> Item {
    Item::Stroke { lines: text_lines(s, at), width: stroke_width(at.height), paint: Paint::Ink }
}

/// The film of one plate as a drawing. `errors` is the number of rule errors standing
/// (printed on the film when masks are made despite them).
pub fn film_drawing(art: &Artwork, plate: PlateId, date: &str, errors: usize) -> Result<Drawing> {
    film_page(art, &mask_plate(art, plate, contact_mirrored(plate)), &[], &art.name, date, errors)
}

/// The film page of a mask (a cell's or a panel's): `ticks` are further marks outside
/// the glass drawn like the corner marks (a panel's cut-line ends), `name` heads the
/// title.
pub fn film_page(art: &Artwork, m: &MaskPlate, ticks: &[[Pt; 2]], name: &str, date: &str, errors: usize) -> Result<Drawing> {
    let plate = m.plate;
    let f = frame(&m.glass)?;
    let fitted = fit_labels(m, f.span);
    let m = fitted.as_ref().unwrap_or(m);
    let mut items = content(art, m, ticks, &f.map);

    let avail = f.width - 2.0 * MARGIN;
    let heights = [2.5, 1.8, 1.8];
    for (i, line) in title_lines(art, m, name, date, errors).iter().enumerate() {
        let h = fit_height(line, heights[i], avail);
        items.push(words(line, TextPlace { left: MARGIN, baseline: TITLE_BASELINES[i], height: h, mirrored: false }));
    }
    let ruler_top = f.glass_bottom + RULER_GAP;
    items.extend(ruler::ruler(MARGIN, ruler_top, f.ruler, Axis::Across));
    items.extend(ruler::ruler(VRULER_X, TOP, f.vruler, Axis::Down));
    let mut y = ruler_top + ruler::DEPTH + 3.0;
    for line in note_lines(plate) {
        let h = fit_height(&line, 1.6, avail);
        items.push(words(&line, TextPlace { left: MARGIN, baseline: y, height: h, mirrored: true }));
        y += 2.8;
    }
    // The cell the plates are for (gap, spacers, rubbing, polarizers), readable as printed.
    for line in crate::plan::optics::note_lines(&art.cell) {
        let h = fit_height(&line, 1.6, avail);
        items.push(words(&line, TextPlace { left: MARGIN, baseline: y, height: h, mirrored: false }));
        y += 2.8;
    }
    let (sx, sy) = (MARGIN, y + 1.0);
    let square = vec![(sx, sy), (sx + CALIBRATION, sy), (sx + CALIBRATION, sy + CALIBRATION), (sx, sy + CALIBRATION)];
    items.push(Item::Fill { rings: vec![square], even_odd: false, paint: Paint::Ink });
    let calib = [
        format!("CALIBRATION SQUARE {CALIBRATION:.2} X {CALIBRATION:.2} MM"),
        "MEASURE BOTH AXES AND BOTH RULERS BEFORE EXPOSURE".to_string(),
    ];
    let mut by = sy + CALIBRATION + 3.0;
    for line in calib {
        let h = fit_height(&line, 1.6, avail);
        items.push(words(&line, TextPlace { left: MARGIN, baseline: by, height: h, mirrored: false }));
        by += 2.8;
    }
    Ok(Drawing { width: f.width, height: f.height, title: format!("{name} {} film", plate.name()), items })
}

/// The SVG film of one plate.
pub fn render_film(art: &Artwork, plate: PlateId, date: &str, errors: usize) -> Result<Vec<u8>> {
    Ok(super::drawing::svg_bytes(&film_drawing(art, plate, date, errors)?))
}
