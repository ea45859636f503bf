//! Films rasterised by an independent renderer (resvg 0.49) at 2400 dpi, compared with
//! the artwork's polygon areas and positions.
//!
//! Units: W3C SVG and CSS Values and Units — 1 in = 25.4 mm = 96 px; a renderer set to
//! 2400 dpi makes `width="74mm"` 74 / 25.4 × 2400 px wide. Page layout as documented in
//! docs/outputs.md: page width = max(glass width, ruler length ≥ 50 mm) + 2 × 12 mm, the
//! glass centred across it and 16 mm below the top edge, the ruler zero 12 mm from the
//! left edge and 4.5 mm below the glass.

use crate::emit_fixture;

use emit_fixture::*;
use resvg::{tiny_skia, usvg};
use segmask::artwork::{Artwork, Layer};
use segmask::emit::render_outputs;
use segmask::layout::Resist;

const DPI: f32 = 2400.0;

/// Page position of the fixture glass: left edge and top edge, mm (docs/outputs.md).
const GLASS_LEFT: f64 = 12.0 + (50.0 - 40.0) / 2.0;
const GLASS_TOP: f64 = 16.0;

struct Raster {
    size: usvg::Size,
    pixmap: tiny_skia::Pixmap,
    px_per_mm: f64,
}

fn rasterise(svg: &[u8], dpi: f32) -> Raster {
    let opt = usvg::Options { dpi, ..Default::default() };
    let tree = usvg::Tree::from_data(svg, &opt).expect("resvg parses the film");
    let size = tree.size();
    let mut pixmap = tiny_skia::Pixmap::new(size.width().ceil() as u32, size.height().ceil() as u32).unwrap();
    resvg::render(&tree, tiny_skia::Transform::identity(), &mut pixmap.as_mut());
    Raster { size, pixmap, px_per_mm: dpi as f64 / 25.4 }
}

impl Raster {
    /// Ink of a pixel, 0 (clear or white) … 1 (opaque black), from premultiplied RGBA.
    fn ink(&self, x: u32, y: u32) -> f64 {
        let p = self.pixmap.pixel(x, y).unwrap();
        let lum = (p.red() as f64 + p.green() as f64 + p.blue() as f64) / 3.0;
        (p.alpha() as f64 - lum) / 255.0
    }

    /// Inked area (pixels more than half inked) inside a page rectangle, mm².
    fn inked_area(&self, x0: f64, y0: f64, x1: f64, y1: f64) -> f64 {
        let k = self.px_per_mm;
        let mut n = 0u64;
        for y in (y0 * k).ceil() as u32..(y1 * k).floor() as u32 {
            for x in (x0 * k).ceil() as u32..(x1 * k).floor() as u32 {
                if self.ink(x, y) > 0.5 {
                    n += 1;
                }
            }
        }
        n as f64 / (k * k)
    }

    /// Ink at a page point in mm.
    fn ink_at(&self, x: f64, y: f64) -> f64 {
        self.ink((x * self.px_per_mm) as u32, (y * self.px_per_mm) as u32)
    }
}

fn film(art: &Artwork, suffix: &str) -> Vec<u8> {
    let files = render_outputs(art, &[warning()], &opts()).unwrap();
    output(&files, suffix).to_vec()
}

/// The fixture without its label (label strokes are ink that is not polygon area).
fn unlabelled(resist: Resist) -> Artwork {
    Artwork { labels: vec![], resist, ..artwork() }
}

/// Inked area inside the glass, away from the outline line, and the one-pixel band
/// allowed around every edge (perimeter × pixel size).
fn check_inked(r: &Raster, glass: (f64, f64, f64, f64), want: f64, perimeter: f64) {
    let pad = 0.1 / 2.0 + 2.0 / r.px_per_mm;
    let (x0, y0, x1, y1) = (glass.0 + pad, glass.1 + pad, glass.2 - pad, glass.3 - pad);
    let got = r.inked_area(x0, y0, x1, y1);
    let tol = perimeter / r.px_per_mm;
    assert!((got - want).abs() <= tol, "inked {got:.4} mm², want {want:.4} ± {tol:.4}");
}

#[test]
fn page_is_exact_size_in_millimetres() {
    let r = rasterise(&film(&artwork(), "front.svg"), DPI);
    // W3C SVG / CSS: mm → px at the renderer's resolution is mm / 25.4 × dpi.
    // Height: 16 mm + glass 30 mm + 52.3 mm below it (docs/outputs.md, *Page layout*).
    let (w, h) = (74.0f32 / 25.4 * DPI, 98.3f32 / 25.4 * DPI);
    assert!((r.size.width() - w).abs() < 0.5 && (r.size.height() - h).abs() < 0.5, "{:?}", r.size);
}

#[test]
fn clear_field_ink_is_the_ito_area() {
    let art = unlabelled(Resist::Positive);
    let layers = [Layer::FrontIto, Layer::FrontMarks];
    let r = rasterise(&film(&art, "front.svg"), DPI);
    let glass = (GLASS_LEFT, GLASS_TOP, GLASS_LEFT + 40.0, GLASS_TOP + 30.0);
    check_inked(&r, glass, layer_area(&art, &layers), layer_perimeter(&art, &layers));
}

/// The back ITO includes a ring with a hole: the hole must print clear.
#[test]
fn clear_field_back_film_keeps_the_hole() {
    let art = unlabelled(Resist::Positive);
    let layers = [Layer::BackIto, Layer::BackMarks];
    let r = rasterise(&film(&art, "back.svg"), DPI);
    let glass = (GLASS_LEFT, GLASS_TOP, GLASS_LEFT + 40.0, GLASS_TOP + 24.0);
    check_inked(&r, glass, layer_area(&art, &layers), layer_perimeter(&art, &layers));
}

/// Dark-field: black everywhere inside the glass except where ITO stays.
#[test]
fn dark_field_ink_is_glass_minus_ito() {
    let art = unlabelled(Resist::Negative);
    let layers = [Layer::FrontIto, Layer::FrontMarks];
    let r = rasterise(&film(&art, "front.svg"), DPI);
    let pad = 0.1 / 2.0 + 2.0 / r.px_per_mm;
    let inner = (40.0 - 2.0 * pad) * (30.0 - 2.0 * pad);
    let glass = (GLASS_LEFT, GLASS_TOP, GLASS_LEFT + 40.0, GLASS_TOP + 30.0);
    let want = inner - layer_area(&art, &layers);
    let band = layer_perimeter(&art, &layers) + 2.0 * (40.0 + 30.0);
    check_inked(&r, glass, want, band);
}

/// docs/background.md, *Mirroring*: the front film is printed as the viewer sees the
/// layout, the back film
/// mirrored about the plate centre. The fixture is asymmetric: the common ring lies left
/// of centre (x 8–20 of 40 mm), so on the back film it must appear right of centre.
#[test]
fn back_film_is_mirrored_and_front_is_not() {
    let art = unlabelled(Resist::Positive);
    let back = rasterise(&film(&art, "back.svg"), 600.0);
    // Artwork (10, 22) lies in the ring's left band; back glass top is y = 30.
    let y = GLASS_TOP + (30.0 - 22.0);
    assert!(back.ink_at(GLASS_LEFT + (40.0 - 10.0), y) > 0.9, "ring not at the mirrored place");
    assert!(back.ink_at(GLASS_LEFT + 10.0, y) < 0.1, "ring at the unmirrored place");
    // The hole centre (14, 18) stays clear, mirrored.
    assert!(back.ink_at(GLASS_LEFT + 26.0, GLASS_TOP + 12.0) < 0.1);
    let front = rasterise(&film(&art, "front.svg"), 600.0);
    // Artwork (11, 15) lies in the segment square; front glass top is y = 30.
    let y = GLASS_TOP + (30.0 - 15.0);
    assert!(front.ink_at(GLASS_LEFT + 11.0, y) > 0.9);
    assert!(front.ink_at(GLASS_LEFT + 29.0, y) < 0.1);
}

/// The ruler has a tick every millimetre, 12 mm from the left page edge onwards; a row
/// through the short ticks meets 51 of them on a 50 mm ruler, each within a pixel of
/// its place.
#[test]
fn ruler_ticks_are_one_millimetre_apart() {
    let r = rasterise(&film(&artwork(), "front.svg"), DPI);
    let row = ((GLASS_TOP + 30.0 + 4.5 + 0.5) * r.px_per_mm) as u32;
    let mut centres = Vec::new();
    let mut start = None;
    for x in 0..r.pixmap.width() {
        match (r.ink(x, row) > 0.5, start) {
            (true, None) => start = Some(x),
            (false, Some(s)) => {
                centres.push(((s + x - 1) as f64 / 2.0 + 0.5) / r.px_per_mm);
                start = None;
            }
            _ => {}
        }
    }
    // The vertical ruler's base line, 7.5 mm from the page edge, crosses this row too.
    centres.retain(|&c| c > 10.0);
    assert_eq!(centres.len(), 51, "{centres:?}");
    for (i, c) in centres.iter().enumerate() {
        assert!((c - (12.0 + i as f64)).abs() < 1.0 / r.px_per_mm + 1e-9, "tick {i} at {c} mm");
    }
}

/// The vertical ruler has a tick every millimetre too: a column through its short ticks
/// (base line 7.5 mm from the left page edge, ticks 1 mm long to its left) meets 51
/// ticks, the first at the glass top, each within a pixel of its place.
#[test]
fn vertical_ruler_ticks_are_one_millimetre_apart() {
    let r = rasterise(&film(&artwork(), "front.svg"), DPI);
    let col = ((7.5 - 0.5) * r.px_per_mm) as u32;
    let mut centres = Vec::new();
    let mut start = None;
    for y in 0..r.pixmap.height() {
        match (r.ink(col, y) > 0.5, start) {
            (true, None) => start = Some(y),
            (false, Some(s)) => {
                centres.push(((s + y - 1) as f64 / 2.0 + 0.5) / r.px_per_mm);
                start = None;
            }
            _ => {}
        }
    }
    assert_eq!(centres.len(), 51, "{centres:?}");
    for (i, c) in centres.iter().enumerate() {
        assert!((c - (GLASS_TOP + i as f64)).abs() < 1.0 / r.px_per_mm + 1e-9, "tick {i} at {c} mm");
    }
}

/// Ink in a page rectangle that is not ITO of the given layers there, mm², and the
/// one-pixel band allowed around the ITO edges in it.
fn extra_ink(r: &Raster, art: &Artwork, layers: &[Layer], page: (f64, f64, f64, f64), glass_top_y: f64) -> (f64, f64) {
    use geo::{Area, BooleanOps, Euclidean, Length};
    let (x0, y0, x1, y1) = page;
    let got = r.inked_area(x0, y0, x1, y1);
    // page → artwork (front film unmirrored): x − GLASS_LEFT, glass_top_y − (y − GLASS_TOP)
    let clip = geo::MultiPolygon(vec![segmask::geom::rect(
        x0 - GLASS_LEFT,
        glass_top_y - (y1 - GLASS_TOP),
        x1 - GLASS_LEFT,
        glass_top_y - (y0 - GLASS_TOP),
    )]);
    let (mut want, mut band) = (0.0, 0.0);
    for l in layers {
        for s in art.on_layer(*l) {
            let part = geo::MultiPolygon(vec![s.polygon.clone()]).intersection(&clip);
            want += part.unsigned_area();
            band += part.0.iter().map(|p| Euclidean.length(p.exterior())).sum::<f64>();
        }
    }
    (got - want, (band + 2.0 * (x1 - x0 + y1 - y0)) / r.px_per_mm)
}

/// docs/outputs.md, *Films*: on a clear-field film nothing but ITO is inked on the glass
/// or within 0.8 mm outside it — no outline on the glass edge (ink there would leave an
/// ITO line along the edge, inside the edge clearance); the glass is marked by corner
/// marks that start 1 mm beyond each corner. Checked on bands 1.5 mm (the fixture's
/// edge clearance) inside and 0.8 mm outside each glass edge of the front film.
#[test]
fn clear_field_has_no_ink_at_the_glass_edge_but_ito() {
    let art = unlabelled(Resist::Positive);
    let layers = [Layer::FrontIto, Layer::FrontMarks];
    let r = rasterise(&film(&art, "front.svg"), DPI);
    let (l, t, w, h) = (GLASS_LEFT, GLASS_TOP, 40.0, 30.0);
    let (inside, outside) = (1.5, 0.8);
    let bands = [
        (l - outside, t - outside, l + w + outside, t + inside),
        (l - outside, t + h - inside, l + w + outside, t + h + outside),
        (l - outside, t + inside, l + inside, t + h - inside),
        (l + w - inside, t + inside, l + w + outside, t + h - inside),
    ];
    for b in bands {
        let (extra, tol) = extra_ink(&r, &art, &layers, b, 30.0);
        assert!(extra.abs() <= tol, "band {b:?}: {extra:.4} mm² of ink that is not ITO (allowed {tol:.4})");
    }
    // The corner marks are there: ink on the line continuing the top edge, 1.75 mm left
    // of the top-left corner.
    assert!(r.ink_at(l - 1.75, t) > 0.5, "no corner mark");
}

/// docs/outputs.md, *Tone*: a dark-field film is black a margin past the glass (here
/// halfway into the 3 mm margin, all round), and the plate label prints clear inside the
/// dark, so it stays readable (the fixture's label "B1" is on the back plate at (36, 27),
/// printed mirrored like the back plate).
#[test]
fn dark_field_reaches_past_the_glass_and_keeps_the_label() {
    let art = Artwork { resist: Resist::Negative, ..artwork() };
    let r = rasterise(&film(&art, "back.svg"), 600.0);
    let (l, t, w, h) = (GLASS_LEFT, GLASS_TOP, 40.0, 24.0);
    for (x, y) in [(l + w / 2.0, t - 1.5), (l + w / 2.0, t + h + 1.5), (l - 1.5, t + h / 2.0), (l + w + 1.5, t + h / 2.0)] {
        assert!(r.ink_at(x, y) > 0.9, "no dark field at ({x}, {y})");
    }
    let label = &art.labels[0];
    let wl = segmask::emit::text::text_width(&label.text, label.height);
    let (lx, ly) = (GLASS_LEFT + (40.0 - label.at.x - wl), GLASS_TOP + (30.0 - label.at.y));
    let dark = r.inked_area(lx, ly - label.height, lx + wl, ly) / (wl * label.height);
    assert!(dark > 0.3 && dark < 0.95, "label box {dark:.2} dark: the label is not printed clear in the field");
}
