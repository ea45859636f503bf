//! PNG films: `NAME.front.png` and `NAME.back.png`, the film drawings rasterised at a
//! chosen resolution, for printers and services that take pictures rather than vector
//! files.
//!
//! Takes a film's drawing (the items [`super::film`] composes, in page millimetres, the
//! same items the SVG and PDF films are written from) and a resolution in dots per inch;
//! gives an 8-bit greyscale PNG (W3C *Portable Network Graphics (PNG) Specification*,
//! second edition) whose `pHYs` chunk states that resolution in pixels per metre, so that
//! software that honours it prints the film at its size. Drawn by tiny-skia (the
//! rasteriser under resvg) on a white page, band by band; each band draws only the rings
//! and lines whose boxes reach into it. (Rasterising the SVG with resvg drew the whole
//! film again for every band: on a 32-digit film of 11 bands, 60 ms a film; 41 ms now.)
//! Nothing is computed here but pixels; the drawing is the film's.

use super::drawing::{Drawing, Item, PagePt, Paint};
use crate::{Error, Result};
use resvg::tiny_skia;

/// Largest film raster, pixels (a bound on time and on the size of the file: 250 M
/// pixels is a 660 mm square page at 600 dpi); a larger one is refused with an error
/// naming `--png-dpi`. Memory does not grow with it: the page is drawn in bands.
pub const MAX_PIXELS: u64 = 250_000_000;

/// Rows drawn at a time. A band of the widest page allowed (about 16 000 pixels at the
/// limit above) holds 16 000 × 256 × 4 bytes = 16 MB, however tall the page.
const BAND_ROWS: u32 = 256;

/// Millimetres in an inch.
const MM_PER_INCH: f64 = 25.4;

/// The size in pixels of a page `width_mm` × `height_mm` at `dpi` (whole pixels, rounded up
/// so that nothing of the page is cut).
pub fn pixel_size(width_mm: f64, height_mm: f64, dpi: f32) -> (u32, u32) {
    let k = dpi as f64 / MM_PER_INCH;
    ((width_mm * k).ceil() as u32, (height_mm * k).ceil() as u32)
}

/// One ring or polyline of an item as a tiny-skia path in page mm, with the rows (top
/// and bottom page y, mm) its ink may reach.
struct Piece {
    path: tiny_skia::Path,
    top: f64,
    bottom: f64,
}

/// One item of the drawing, ready to draw.
struct Prepared {
    pieces: Vec<Piece>,
    /// `None` for a fill (with its rule), the stroke for a stroked item.
    stroke: Option<tiny_skia::Stroke>,
    rule: tiny_skia::FillRule,
    paint: Paint,
}

/// A film drawing prepared and sized for rasterising at one resolution.
struct Page {
    items: Vec<Prepared>,
    width: u32,
    height: u32,
    /// Pixels per mm.
    scale: f32,
}

/// The path through `points`, closed when `close`; none for fewer than two points.
fn path_of(points: &[PagePt], close: bool) -> Option<tiny_skia::Path> {
    let (first, rest) = points.split_first()?;
    let mut b = tiny_skia::PathBuilder::with_capacity(points.len() + 1, points.len());
    b.move_to(first.0 as f32, first.1 as f32);
    for p in rest {
        b.line_to(p.0 as f32, p.1 as f32);
    }
    if close {
        b.close();
    }
    b.finish()
}

/// The piece of `points` (reaching `reach` mm beyond its vertices), if it draws anything.
fn piece(points: &[PagePt], close: bool, reach: f64) -> Option<Piece> {
    let path = path_of(points, close)?;
    let (top, bottom) = points.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| (a.min(p.1), b.max(p.1)));
    Some(Piece { path, top: top - reach, bottom: bottom + reach })
}

impl Page {
    fn of(drawing: &Drawing, dpi: f32) -> Result<Page> {
        // Rounded to 1 µm, so that a whole number of pixels is not rounded up to one more.
        let mm = |v: f64| (v * 1e3).round() / 1e3;
        let (w, h) = pixel_size(mm(drawing.width), mm(drawing.height), dpi);
        if w as u64 * h as u64 > MAX_PIXELS {
            return Err(Error::input(crate::error::InputProblem::on_command_line(
                "--png-dpi",
                format!("{dpi} dots per inch makes a film of {w} × {h} pixels, more than the {MAX_PIXELS} drawn"),
                "a lower resolution (the PDF films are exact at any size)",
            )));
        }
        let items = drawing
            .items
            .iter()
            .map(|item| match item {
                // Rings of fewer than three points are left out, as in the SVG film.
                Item::Fill { rings, even_odd, paint } => Prepared {
                    pieces: rings.iter().filter(|r| r.len() >= 3).filter_map(|r| piece(r, true, 0.0)).collect(),
                    stroke: None,
                    rule: if *even_odd { tiny_skia::FillRule::EvenOdd } else { tiny_skia::FillRule::Winding },
                    paint: *paint,
                },
                Item::Stroke { lines, width, paint } => {
                    let stroke = tiny_skia::Stroke { width: *width as f32, line_cap: tiny_skia::LineCap::Round, line_join: tiny_skia::LineJoin::Round, ..Default::default() };
                    Prepared {
                        pieces: lines.iter().filter_map(|l| piece(l, false, width / 2.0)).collect(),
                        stroke: Some(stroke),
                        rule: tiny_skia::FillRule::Winding,
                        paint: *paint,
                    }
                }
            })
            .collect();
        Ok(Page { items, width: w.max(1), height: h.max(1), scale: (dpi as f64 / MM_PER_INCH) as f32 })
    }

    /// Draws the rows `y0 .. y0 + n` of the page into `pixmap` (white first).
    fn draw_band(&self, y0: u32, pixmap: &mut tiny_skia::Pixmap) {
        pixmap.fill(tiny_skia::Color::WHITE);
        let at = tiny_skia::Transform::from_scale(self.scale, self.scale).post_translate(0.0, -(y0 as f32));
        // The band's rows in page mm, a pixel wider on each side for anti-aliasing.
        let k = self.scale as f64;
        let (top, bottom) = ((y0 as f64 - 1.0) / k, ((y0 + pixmap.height()) as f64 + 1.0) / k);
        let mut builder = tiny_skia::PathBuilder::new();
        for item in &self.items {
            let mut inside = item.pieces.iter().filter(|p| p.bottom >= top && p.top <= bottom);
            let Some(first) = inside.next() else { continue };
            // Rings of one item are filled together (a hole is a ring of the same item).
            let joined;
            let path = match inside.next() {
                None => &first.path,
                Some(second) => {
                    builder.push_path(&first.path);
                    builder.push_path(&second.path);
                    for p in inside {
                        builder.push_path(&p.path);
                    }
                    let Some(path) = std::mem::take(&mut builder).finish() else { continue };
                    joined = path;
                    &joined
                }
            };
            let mut paint = tiny_skia::Paint::default();
            match item.paint {
                Paint::Ink => paint.set_color_rgba8(0, 0, 0, 255),
                Paint::Clear => paint.set_color_rgba8(255, 255, 255, 255),
            }
            paint.anti_alias = true;
            match &item.stroke {
                None => pixmap.fill_path(path, &paint, item.rule, at, None),
                Some(stroke) => pixmap.stroke_path(path, &paint, stroke, at, None),
            }
        }
    }

    /// Draws the page band by band and hands each band's grey rows to `rows`, top first.
    /// Each band is the whole drawing shifted up by a whole number of pixels, so its
    /// pixels are those of the page drawn at once (the unit test compares the two).
    fn bands(&self, band_rows: u32, mut rows: impl FnMut(&[u8]) -> Result<()>) -> Result<()> {
        let w = self.width;
        let mut y0 = 0;
        let mut grey = Vec::with_capacity(w as usize * band_rows.min(self.height) as usize);
        while y0 < self.height {
            let n = band_rows.min(self.height - y0);
            let mut pixmap = tiny_skia::Pixmap::new(w, n).ok_or_else(|| Error::Bug(format!("no {w}×{n} pixmap")))?;
            self.draw_band(y0, &mut pixmap);
            // The page is opaque white under black and white paint, so red alone is the grey.
            grey.clear();
            grey.extend(pixmap.pixels().iter().map(|p| p.red()));
            rows(&grey)?;
            y0 += n;
        }
        Ok(())
    }
}

/// The film rasterised: width, height and one grey byte per pixel (0 = ink, 255 = clear),
/// row by row from the top (the whole page in memory: for tests and small pages; the
/// writer streams, [`film_png`]).
pub fn rasterise(drawing: &Drawing, dpi: f32) -> Result<(u32, u32, Vec<u8>)> {
    let page = Page::of(drawing, dpi)?;
    let mut grey = Vec::with_capacity(page.width as usize * page.height as usize);
    page.bands(BAND_ROWS, |rows| {
        grey.extend_from_slice(rows);
        Ok(())
    })?;
    Ok((page.width, page.height, grey))
}

/// The PNG bytes of a film at `dpi`, drawn and compressed band by band.
pub fn film_png(drawing: &Drawing, dpi: f32) -> Result<Vec<u8>> {
    let page = Page::of(drawing, dpi)?;
    let png_err = |e: png::EncodingError| Error::Bug(format!("PNG: {e}"));
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, page.width, page.height);
        enc.set_color(png::ColorType::Grayscale);
        enc.set_depth(png::BitDepth::Eight);
        // Deflate at level 1 on rows filtered against the row above: a film is long runs
        // of ink and clear, and most rows repeat the one above. At the default level
        // (6, adaptive filters) compression took 40 % of the writer's time; this takes a
        // fraction of it for about twice the bytes (a 40-digit film: 390 KB, not 205 KB).
        enc.set_deflate_compression(png::DeflateCompression::Level(1));
        enc.set_filter(png::Filter::Up);
        let ppm = (dpi as f64 / MM_PER_INCH * 1000.0).round() as u32;
        enc.set_pixel_dims(Some(png::PixelDimensions { xppu: ppm, yppu: ppm, unit: png::Unit::Meter }));
        let mut writer = enc.write_header().map_err(png_err)?;
        let mut stream = writer.stream_writer().map_err(png_err)?;
        page.bands(BAND_ROWS, |rows| {
            use std::io::Write;
            stream.write_all(rows).map_err(|e| Error::Bug(format!("PNG: {e}")))
        })?;
        stream.finish().map_err(png_err)?;
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::emit::drawing::svg_bytes;

    fn fill(rings: Vec<Vec<PagePt>>, paint: Paint) -> Item {
        Item::Fill { rings, even_odd: false, paint }
    }

    /// A closed ring of `n` points round (cx, cy).
    fn round(cx: f64, cy: f64, r: f64, n: usize) -> Vec<PagePt> {
        (0..n).map(|k| std::f64::consts::TAU * k as f64 / n as f64).map(|a| (cx + r * a.cos(), cy + r * a.sin())).collect()
    }

    /// A 10 × 6 mm page: a slanted bar, a disc with a clear hole painted over it, a
    /// stroked zigzag and a ring with a hole under the even-odd rule, crossing band edges.
    fn sample() -> Drawing {
        Drawing {
            width: 10.0,
            height: 6.0,
            title: "sample".into(),
            items: vec![
                fill(vec![vec![(1.0, 0.3), (9.0, 5.7), (8.6, 5.9), (0.6, 0.5)]], Paint::Ink),
                fill(vec![round(5.0, 3.0, 1.77, 90)], Paint::Ink),
                fill(vec![round(5.0, 3.0, 0.5, 40)], Paint::Clear),
                Item::Stroke { lines: vec![vec![(0.5, 5.5), (2.0, 4.0), (3.5, 5.5)]], width: 0.3, paint: Paint::Ink },
                Item::Fill { rings: vec![round(8.0, 1.5, 1.2, 60), round(8.0, 1.5, 0.6, 30)], even_odd: true, paint: Paint::Ink },
            ],
        }
    }

    /// A 10 × 5 mm page with its left half inked, at 254 dpi (10 pixels a millimetre):
    /// 100 × 50 pixels, ink on the left and clear on the right, and a `pHYs` chunk of
    /// 10 000 pixels per metre (PNG specification, 11.3.5.3 pHYs).
    #[test]
    fn page_rasterises_at_its_size() {
        let d = Drawing { width: 10.0, height: 5.0, title: "half".into(), items: vec![fill(vec![vec![(0.0, 0.0), (5.0, 0.0), (5.0, 5.0), (0.0, 5.0)]], Paint::Ink)] };
        let (w, h, g) = rasterise(&d, 254.0).unwrap();
        assert_eq!((w, h), (100, 50));
        assert_eq!((g[10 * 100 + 20], g[10 * 100 + 80]), (0, 255));
        let png = film_png(&d, 254.0).unwrap();
        let at = png.windows(4).position(|c| c == b"pHYs").unwrap() + 4;
        assert_eq!(u32::from_be_bytes(png[at..at + 4].try_into().unwrap()), 10_000);
        assert_eq!(png[at + 8], 1, "unit: metre");
    }

    /// Drawing in bands gives the picture of drawing at once: bands of 7 rows against
    /// one band. Shifting the drawing by whole pixels moves its coordinates by a float
    /// subtraction, so the anti-aliased edge pixels may differ by a few of tiny-skia's
    /// 16 coverage steps (its supersampling, 4 × 4 per pixel); pixels wholly inked or
    /// clear never differ, and the ink in all agrees within 0.1 %. The streamed PNG
    /// decodes (png crate) to the pixels of `rasterise`.
    #[test]
    fn bands_give_the_pixels_of_one_drawing() {
        let d = sample();
        let page = Page::of(&d, 300.0).unwrap();
        let collect = |band| {
            let mut all = Vec::new();
            page.bands(band, |r| {
                all.extend_from_slice(r);
                Ok(())
            })
            .unwrap();
            all
        };
        let (small, whole) = (collect(7), collect(page.height));
        assert_eq!(small.len(), (page.width * page.height) as usize);
        assert!(small.iter().any(|&g| g > 0 && g < 255), "anti-aliased edges are drawn");
        agree(&small, &whole);
        let png = film_png(&d, 300.0).unwrap();
        let mut reader = png::Decoder::new(std::io::Cursor::new(png)).read_info().unwrap();
        let mut buf = vec![0; reader.output_buffer_size().unwrap()];
        reader.next_frame(&mut buf).unwrap();
        assert_eq!(buf, rasterise(&d, 300.0).unwrap().2);
    }

    /// Two pictures of one drawing agree: wholly inked or clear pixels alike, edge pixels
    /// within three coverage steps, the ink within 0.1 %.
    fn agree(a: &[u8], b: &[u8]) {
        assert_eq!(a.len(), b.len());
        for (i, (&x, &y)) in a.iter().zip(b).enumerate() {
            let edge = (x > 0 && x < 255) || (y > 0 && y < 255);
            assert!(x == y || (edge && x.abs_diff(y) <= 3 * 16), "pixel {i}: {x} against {y}");
        }
        let ink = |g: &[u8]| g.iter().map(|&v| 255 - v as u64).sum::<u64>() as f64;
        assert!((ink(a) - ink(b)).abs() <= 1e-3 * ink(b), "ink {} against {}", ink(a), ink(b));
    }

    /// The PNG film is the picture of the SVG film: the drawing rasterised here and its
    /// SVG (`svg_bytes`, the `NAME.*.svg` film) rasterised by resvg 0.49, an independent
    /// SVG renderer, agree pixel for pixel up to anti-aliasing (ours drawn in bands of 7
    /// rows, so that every item crosses band edges).
    #[test]
    fn the_png_is_the_svg_film_rasterised_by_resvg() {
        let d = sample();
        let dpi = 300.0;
        let page = Page::of(&d, dpi).unwrap();
        let (w, h) = (page.width, page.height);
        let mut ours = Vec::new();
        page.bands(7, |r| {
            ours.extend_from_slice(r);
            Ok(())
        })
        .unwrap();
        let tree = resvg::usvg::Tree::from_data(&svg_bytes(&d), &resvg::usvg::Options::default()).unwrap();
        let mut pm = tiny_skia::Pixmap::new(w, h).unwrap();
        pm.fill(tiny_skia::Color::WHITE);
        resvg::render(&tree, tiny_skia::Transform::from_scale(dpi / 96.0, dpi / 96.0), &mut pm.as_mut());
        let theirs: Vec<u8> = pm.pixels().iter().map(|p| p.red()).collect();
        agree(&ours, &theirs);
        // The clear hole in the disc and the even-odd ring's hole stay clear.
        let k = dpi as f64 / MM_PER_INCH;
        let at = |x: f64, y: f64| ours[(y * k) as usize * w as usize + (x * k) as usize];
        assert_eq!((at(5.0, 3.0), at(5.0, 2.0), at(8.0, 1.5), at(8.0, 0.5)), (255, 0, 255, 0));
    }
}
