//! Exact-scale photomask films, one per plate: `NAME.front.svg`, `NAME.back.svg`.
//!
//! Takes the artwork and a plate, gives an SVG page (1 user unit = 1 mm) holding that
//! plate's etched layers (ITO and marks), its labels, its glass outline as a thin line,
//! a title, a scale ruler and a side note. Coordinates are only transformed: y flipped,
//! and for the back plate x mirrored about the plate centre (docs/outputs.md works out
//! why). Tone follows the resist (docs/background.md, *Tone*): positive resist →
//! clear-field film,
//! black where ITO stays; negative resist → dark-field film, black inside the glass
//! except where ITO stays (one path, glass ring plus ITO rings, even-odd fill).

use super::page::{self, TextPlace};
use super::report::resist_name;
use super::ruler;
use super::svg_path::{PageMap, push_polygon, push_ring};
use super::text::{fit_height, stroke_width, text_strokes};
use crate::artwork::{Artwork, Label, Layer};
use crate::geom::{Polygon, pt};
use crate::layout::{PlateId, Resist};
use crate::{Error, Result};

/// Clear margin on every side of the glass, mm.
const MARGIN: f64 = 12.0;
/// Space above the glass for the title, mm.
const TOP: f64 = 13.0;
/// Space below the glass for the ruler, the side note and the cell's notes, mm.
const BOTTOM: f64 = 23.0;
/// Line width of the glass outline, mm.
pub const OUTLINE: f64 = 0.1;
/// Ink.
const BLACK: &str = "#000000";
/// No ink (used for what must stay clear inside a dark field).
const WHITE: &str = "#ffffff";

/// Bounding box (x0, y0, x1, y1) of a polygon's outer ring.
fn bbox(p: &Polygon) -> Option<(f64, f64, f64, f64)> {
    let pts = &p.exterior().0;
    if pts.is_empty() {
        return None;
    }
    Some(pts.iter().fold((f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY), |b, q| {
        (b.0.min(q.x), b.1.min(q.y), b.2.max(q.x), b.3.max(q.y))
    }))
}

/// The etched layers of a plate.
fn etched_layers(plate: PlateId) -> [Layer; 2] {
    match plate {
        PlateId::Front => [Layer::FrontIto, Layer::FrontMarks],
        PlateId::Back => [Layer::BackIto, Layer::BackMarks],
    }
}

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
    width: f64,
    height: f64,
    glass_bottom: f64,
    ruler: f64,
}

fn frame(glass: &Polygon, mirrored: bool) -> Result<Frame> {
    let (x0, y0, x1, y1) = bbox(glass).ok_or_else(|| Error::Bug("film: empty glass outline".into()))?;
    let (gw, gh) = (x1 - x0, y1 - y0);
    let ruler = ruler::length_for(gw);
    let content = gw.max(ruler);
    let width = content + 2.0 * MARGIN;
    let left = MARGIN + (content - gw) / 2.0;
    let map = if mirrored { PageMap::mirrored(x1, y1, left, TOP) } else { PageMap::upright(x0, y1, left, TOP) };
    Ok(Frame { map, width, height: TOP + gh + BOTTOM, glass_bottom: TOP + gh, ruler })
}

/// Path data of every etched polygon of the plate.
fn etched_d(art: &Artwork, plate: PlateId, map: &PageMap) -> String {
    let mut d = String::new();
    for layer in etched_layers(plate) {
        for s in art.film_layer(layer) {
            push_polygon(&mut d, &s.polygon, map);
        }
    }
    d
}

/// The etched content in the plate's tone.
fn content(art: &Artwork, plate: PlateId, map: &PageMap) -> svg::node::element::Path {
    let ito = etched_d(art, plate, map);
    match art.resist {
        // Clear-field: ink where ITO stays; non-zero rule with holes wound against their
        // outer rings, so shapes that merely touch never cancel.
        Resist::Positive => page::fill(ito, BLACK, "nonzero"),
        // Dark-field: the glass and every ITO ring in one path; even-odd leaves the ITO
        // clear (and an island inside an ITO hole dark again).
        Resist::Negative => {
            let mut d = String::new();
            push_ring(&mut d, &art.glass(plate).exterior().0, map, true);
            if !ito.is_empty() {
                d.push(' ');
                d.push_str(&ito);
            }
            page::fill(d, BLACK, "evenodd")
        }
    }
}

/// A plate label as stroke text, placed and mirrored like the plate's geometry.
fn label(l: &Label, map: &PageMap, colour: &str) -> svg::node::element::Path {
    let lines: Vec<Vec<(f64, f64)>> = text_strokes(&l.text, l.height)
        .into_iter()
        .map(|s| s.into_iter().map(|(u, v)| map.apply(pt(l.at.x + u, l.at.y + v))).collect())
        .collect();
    page::stroke(page::polylines_d(&lines), colour, stroke_width(l.height))
}

/// The title lines (they read normally on the printed side).
fn title_lines(art: &Artwork, plate: PlateId, date: &str, errors: usize) -> Vec<String> {
    let tone = match art.resist {
        Resist::Positive => "CLEAR-FIELD",
        Resist::Negative => "DARK-FIELD",
    };
    let reading = match plate {
        PlateId::Front => "PRINTED AS THE VIEWER SEES IT",
        PlateId::Back => "PRINTED MIRRORED",
    };
    let grown = if art.film_shapes.is_empty() {
        String::new()
    } else {
        format!(" - GROWN {:.1} UM PER EDGE FOR ETCH", art.rules.film_bias() * 1000.0)
    };
    let mut lines = vec![
        format!("{} - {} FILM", art.name, plate_words(plate)),
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

/// Renders the film of one plate. `errors` is the number of rule errors standing
/// (printed on the film when masks are made despite them).
pub fn render_film(art: &Artwork, plate: PlateId, date: &str, errors: usize) -> Result<Vec<u8>> {
    let f = frame(art.glass(plate), plate == PlateId::Back)?;
    let title = format!("{} {} film", art.name, plate.name());
    let mut doc = page::document(f.width, f.height, &title).add(content(art, plate, &f.map));
    let label_colour = if art.resist == Resist::Positive { BLACK } else { WHITE };
    for l in art.labels.iter().filter(|l| l.plate == plate) {
        doc = doc.add(label(l, &f.map, label_colour));
    }
    let mut outline = String::new();
    push_ring(&mut outline, &art.glass(plate).exterior().0, &f.map, true);
    doc = doc.add(page::stroke(outline, BLACK, OUTLINE));

    let avail = f.width - 2.0 * MARGIN;
    let heights = [2.5, 1.8, 1.8];
    for (i, line) in title_lines(art, plate, date, errors).iter().enumerate() {
        let h = fit_height(line, heights[i], avail);
        let at = TextPlace { left: MARGIN, baseline: 4.5 + 3.2 * i as f64, height: h, mirrored: false };
        doc = doc.add(page::text(line, at, BLACK));
    }
    let ruler_top = f.glass_bottom + 3.0;
    doc = doc.add(ruler::ruler(MARGIN, ruler_top, f.ruler));
    for (i, line) in note_lines(plate).iter().enumerate() {
        let h = fit_height(line, 1.6, avail);
        let baseline = ruler_top + ruler::DEPTH + 3.0 + 2.8 * i as f64;
        doc = doc.add(page::text(line, TextPlace { left: MARGIN, baseline, height: h, mirrored: true }, BLACK));
    }
    // The cell the plates are for (gap, spacers, rubbing, polarizers), readable as printed.
    for (i, line) in crate::plan::optics::note_lines(&art.cell).iter().enumerate() {
        let h = fit_height(line, 1.6, avail);
        let baseline = ruler_top + ruler::DEPTH + 3.0 + 2.8 * (2 + i) as f64;
        doc = doc.add(page::text(line, TextPlace { left: MARGIN, baseline, height: h, mirrored: false }, BLACK));
    }
    Ok(page::bytes(&doc))
}
