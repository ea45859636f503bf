//! The colour preview `NAME.preview.svg`: both plates overlaid as the viewer sees them.
//!
//! Takes the artwork and the findings, gives an SVG page in mm (viewer's frame, y
//! flipped, nothing mirrored): back glass and front glass outlines, back ITO and front
//! ITO half-transparent in two hues, marks, seal, transfer dots, the viewing window
//! dashed, pads with their pin numbers, plate labels, and every finding circled with its
//! rule code, plus a legend. It is for people, not for printing masks, so its words are
//! SVG text in a generic sans-serif font. Colours are ours.

use super::layer_polygons;
use super::page;
use super::svg_path::{PageMap, num, push_polygon};
use crate::Result;
use crate::artwork::{Artwork, Layer};
use crate::finding::{Finding, Severity, count};
use crate::geom::Polygon;
use svg::node::element::{Circle, Group, Rectangle, Text};

/// Margin around the drawing, mm.
const MARGIN: f64 = 8.0;
/// Width of the legend column, mm.
const LEGEND_W: f64 = 46.0;

/// How one layer is drawn: fill colour and opacity, outline colour, dashed outline.
struct Style {
    fill: Option<(&'static str, f64)>,
    line: &'static str,
    dash: bool,
    text: &'static str,
}

/// Our colours, one per layer, in drawing order (bottom first).
fn style(layer: Layer) -> Style {
    let s = |fill, line, dash, text| Style { fill, line, dash, text };
    match layer {
        Layer::BackGlass => s(Some(("#eef1f4", 1.0)), "#8a96a3", true, "back glass"),
        Layer::FrontGlass => s(None, "#4d5965", false, "front glass"),
        Layer::BackIto => s(Some(("#e0892b", 0.45)), "#a35a10", false, "back ITO (commons)"),
        Layer::FrontIto => s(Some(("#2f7fc1", 0.45)), "#1b4f7a", false, "front ITO (segments)"),
        Layer::BackMarks => s(Some(("#a35a10", 0.9)), "#a35a10", false, "back marks"),
        Layer::FrontMarks => s(Some(("#1b4f7a", 0.9)), "#1b4f7a", false, "front marks"),
        Layer::Seal => s(Some(("#7d9a3a", 0.5)), "#55701f", false, "seal"),
        Layer::TransferDots => s(Some(("#8e44ad", 0.8)), "#5e2a75", false, "transfer dots"),
        Layer::Window => s(None, "#222222", true, "viewing window"),
    }
}

/// Drawing order, bottom first.
const ORDER: [Layer; 9] = [
    Layer::BackGlass,
    Layer::FrontGlass,
    Layer::BackIto,
    Layer::FrontIto,
    Layer::BackMarks,
    Layer::FrontMarks,
    Layer::Seal,
    Layer::TransferDots,
    Layer::Window,
];

/// Colour of a finding's marker.
fn severity_colour(s: Severity) -> &'static str {
    match s {
        Severity::Error => "#d0021b",
        Severity::Warning => "#f5a623",
        Severity::Note => "#4a90e2",
    }
}

/// Bounding box of some polygons.
fn bbox<'a>(polys: impl Iterator<Item = &'a Polygon>) -> Option<(f64, f64, f64, f64)> {
    let b = polys
        .flat_map(|p| p.exterior().0.iter())
        .fold((f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY), |b, q| {
            (b.0.min(q.x), b.1.min(q.y), b.2.max(q.x), b.3.max(q.y))
        });
    (b.0 <= b.2 && b.1 <= b.3).then_some(b)
}

/// One layer as a group of paths.
fn layer_group(art: &Artwork, layer: Layer, map: &PageMap, line: f64) -> Group {
    let st = style(layer);
    let mut d = String::new();
    for p in layer_polygons(art, layer) {
        push_polygon(&mut d, p, map);
    }
    let mut path = svg::node::element::Path::new()
        .set("d", d)
        .set("fill-rule", "nonzero")
        .set("stroke", st.line)
        .set("stroke-width", num(line));
    path = match st.fill {
        Some((c, o)) => path.set("fill", c).set("fill-opacity", num(o)),
        None => path.set("fill", "none"),
    };
    if st.dash {
        path = path.set("stroke-dasharray", format!("{} {}", num(4.0 * line), num(2.5 * line)));
    }
    Group::new().set("id", layer.name()).add(path)
}

/// Plain text centred at a page point.
fn label(x: f64, y: f64, size: f64, colour: &str, s: &str) -> Text {
    Text::new(s)
        .set("x", num(x))
        .set("y", num(y))
        .set("font-family", "sans-serif")
        .set("font-size", num(size))
        .set("text-anchor", "middle")
        .set("dominant-baseline", "central")
        .set("fill", colour)
}

/// Pads outlined, with pin numbers.
fn pads(art: &Artwork, map: &PageMap, line: f64) -> Group {
    let mut g = Group::new().set("id", "pins");
    for pin in &art.pins {
        let mut d = String::new();
        push_polygon(&mut d, &pin.pad, map);
        g = g.add(page::stroke(d, "#000000", line));
        if let Some((x0, y0, x1, y1)) = bbox(std::iter::once(&pin.pad)) {
            let (cx, cy) = map.apply(crate::geom::pt((x0 + x1) / 2.0, (y0 + y1) / 2.0));
            let size = ((x1 - x0).min(y1 - y0) * 0.6).clamp(0.3, 2.0);
            g = g.add(label(cx, cy, size, "#000000", &pin.number.to_string()));
        }
    }
    g
}

/// How wide a line of sans-serif text is taken to be, in font sizes per character: a
/// little more than the average advance of common sans faces (about 0.55 em, from
/// memory), so that labels kept apart by it stay apart in any of them.
const TEXT_WIDTH_EM: f64 = 0.65;

/// A page box (x0, y0, x1, y1), y down.
type PageBox = (f64, f64, f64, f64);

fn boxes_meet(a: &PageBox, b: &PageBox) -> bool {
    a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3
}

/// Every finding circled where it is, with its rule code above the circle, or below it
/// where above it would print over a plate's label (`taken`): a note at the top left
/// corner of the glass put its code on the back plate's name.
fn findings_group(findings: &[Finding], map: &PageMap, r: f64, taken: &[PageBox]) -> Group {
    let mut g = Group::new().set("id", "findings");
    for f in findings {
        let (x, y) = map.apply(f.location);
        let c = severity_colour(f.severity);
        g = g.add(
            Circle::new()
                .set("cx", num(x))
                .set("cy", num(y))
                .set("r", num(r))
                .set("fill", "none")
                .set("stroke", c)
                .set("stroke-width", num(r / 5.0)),
        );
        let code = f.rule.code();
        let half = TEXT_WIDTH_EM * r * code.chars().count() as f64 / 2.0;
        let at = |ly: f64| (x - half, ly - 0.6 * r, x + half, ly + 0.6 * r);
        let above = y - 1.6 * r;
        let ly = if taken.iter().any(|t| boxes_meet(&at(above), t)) { y + 1.6 * r } else { above };
        g = g.add(label(x, ly, r, c, code));
    }
    g
}

/// The legend box: one swatch per layer and the finding counts.
fn legend(x: f64, y: f64, findings: &[Finding]) -> Group {
    let row = 5.0;
    let rows: Vec<(String, &str, f64)> = ORDER
        .iter()
        .map(|&l| {
            let st = style(l);
            let (c, o) = st.fill.unwrap_or(("none", 1.0));
            (st.text.to_string(), if c == "none" { st.line } else { c }, if c == "none" { 0.0 } else { o })
        })
        .chain(
            [Severity::Error, Severity::Warning, Severity::Note]
                .map(|s| (format!("{}s: {}", s.name(), count(findings, s)), severity_colour(s), -1.0)),
        )
        .collect();
    let h = row * (rows.len() as f64 + 1.0);
    let mut g = Group::new().set("id", "legend").add(
        Rectangle::new()
            .set("x", num(x))
            .set("y", num(y))
            .set("width", num(LEGEND_W - 4.0))
            .set("height", num(h))
            .set("fill", "#ffffff")
            .set("stroke", "#444444")
            .set("stroke-width", "0.2"),
    );
    g = g.add(label(x + (LEGEND_W - 4.0) / 2.0, y + row * 0.6, 2.2, "#000000", "legend"));
    for (i, (text, colour, opacity)) in rows.iter().enumerate() {
        let cy = y + row * (i as f64 + 1.5);
        let sw = if *opacity < 0.0 {
            Group::new().add(
                Circle::new()
                    .set("cx", num(x + 5.0))
                    .set("cy", num(cy))
                    .set("r", "1.5")
                    .set("fill", "none")
                    .set("stroke", *colour)
                    .set("stroke-width", "0.3"),
            )
        } else {
            Group::new().add(
                Rectangle::new()
                    .set("x", num(x + 3.0))
                    .set("y", num(cy - 1.5))
                    .set("width", "4")
                    .set("height", "3")
                    .set("fill", *colour)
                    .set("fill-opacity", num(*opacity))
                    .set("stroke", *colour)
                    .set("stroke-width", "0.2"),
            )
        };
        g = g.add(sw);
        g = g.add(
            Text::new(text.as_str())
                .set("x", num(x + 9.0))
                .set("y", num(cy))
                .set("font-family", "sans-serif")
                .set("font-size", "2.2")
                .set("dominant-baseline", "central")
                .set("fill", "#000000"),
        );
    }
    g
}

/// Renders the preview.
pub fn render_preview(art: &Artwork, findings: &[Finding]) -> Result<Vec<u8>> {
    let all = [&art.front_glass, &art.back_glass];
    let (x0, y0, x1, y1) = bbox(all.into_iter()).unwrap_or((0.0, 0.0, 10.0, 10.0));
    let (w, h) = (x1 - x0, y1 - y0);
    let map = PageMap::upright(x0, y1, MARGIN, MARGIN);
    let line = (w.max(h) / 400.0).clamp(0.02, 0.2);
    let page_w = w + 2.0 * MARGIN + LEGEND_W;
    let legend_h = 5.0 * 14.0;
    let page_h = (h + 2.0 * MARGIN).max(legend_h + 2.0 * MARGIN);
    let mut doc = page::document(page_w, page_h, &format!("{} preview (viewer's side)", art.name));
    for layer in ORDER {
        doc = doc.add(layer_group(art, layer, &map, line));
    }
    doc = doc.add(pads(art, &map, line));
    // The plates' labels stand above their glasses, at the same place when the glasses
    // share a corner and a few millimetres apart when the ledge is on the left; overlaid
    // here, a label whose text would meet one already placed moves up a line.
    let mut taken: Vec<PageBox> = Vec::new();
    for l in &art.labels {
        let (x, mut y) = map.apply(l.at);
        let width = TEXT_WIDTH_EM * l.height * l.text.chars().count() as f64;
        let text_box = |y: f64| (x, y - l.height, x + width, y + 0.25 * l.height);
        while taken.iter().any(|b| boxes_meet(&text_box(y), b)) {
            y -= 1.4 * l.height;
        }
        taken.push(text_box(y));
        doc = doc.add(
            Text::new(l.text.as_str())
                .set("x", num(x))
                .set("y", num(y))
                .set("font-family", "sans-serif")
                .set("font-size", num(l.height))
                .set("fill", "#555555"),
        );
    }
    doc = doc.add(findings_group(findings, &map, (w.max(h) / 60.0).clamp(0.5, 3.0), &taken));
    doc = doc.add(legend(w + 2.0 * MARGIN, MARGIN, findings));
    Ok(page::bytes(&doc))
}
