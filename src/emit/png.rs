//! PNG films: `NAME.front.png` and `NAME.back.png`, the SVG films rasterised at a chosen
//! resolution, for printers and services that take pictures rather than vector files.
//!
//! Takes a film's SVG bytes (the drawing [`super::film`] makes, 1 user unit = 1 mm) and a
//! resolution in dots per inch; gives an 8-bit greyscale PNG (W3C *Portable Network
//! Graphics (PNG) Specification*, second edition) whose `pHYs` chunk states that
//! resolution in pixels per metre, so that software that honours it prints the film at
//! its size. Rasterised by resvg on a white page (SVG's 96 user pixels to the inch: W3C
//! CSS Values and Units; usvg turns the page's mm into those pixels). Nothing is computed
//! here but pixels; the drawing is the film's.

use crate::{Error, Result};

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

/// A film parsed and sized for rasterising at one resolution.
struct Page {
    tree: resvg::usvg::Tree,
    width: u32,
    height: u32,
    scale: f32,
}

impl Page {
    fn of(svg: &[u8], dpi: f32) -> Result<Page> {
        let tree = resvg::usvg::Tree::from_data(svg, &resvg::usvg::Options::default())
            .map_err(|e| Error::Bug(format!("film SVG does not parse: {e}")))?;
        let size = tree.size();
        // usvg keeps the page in f32 CSS pixels; back to mm, rounded to 1 µm, so that a
        // whole number of pixels is not rounded up to one more.
        let mm = |px: f32| (px as f64 * MM_PER_INCH / 96.0 * 1e3).round() / 1e3;
        let (w, h) = pixel_size(mm(size.width()), mm(size.height()), dpi);
        if w as u64 * h as u64 > MAX_PIXELS {
            return Err(Error::input(crate::error::InputProblem::on_command_line(
                "--png-dpi",
                format!("{dpi} dots per inch makes a film of {w} × {h} pixels, more than the {MAX_PIXELS} drawn"),
                "a lower resolution (the PDF films are exact at any size)",
            )));
        }
        Ok(Page { tree, width: w.max(1), height: h.max(1), scale: dpi / 96.0 })
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
            let mut pixmap = resvg::tiny_skia::Pixmap::new(w, n).ok_or_else(|| Error::Bug(format!("no {w}×{n} pixmap")))?;
            pixmap.fill(resvg::tiny_skia::Color::WHITE);
            let at = resvg::tiny_skia::Transform::from_scale(self.scale, self.scale).post_translate(0.0, -(y0 as f32));
            resvg::render(&self.tree, at, &mut pixmap.as_mut());
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
pub fn rasterise(svg: &[u8], dpi: f32) -> Result<(u32, u32, Vec<u8>)> {
    let page = Page::of(svg, dpi)?;
    let mut grey = Vec::with_capacity(page.width as usize * page.height as usize);
    page.bands(BAND_ROWS, |rows| {
        grey.extend_from_slice(rows);
        Ok(())
    })?;
    Ok((page.width, page.height, grey))
}

/// The PNG bytes of a film at `dpi`, drawn and compressed band by band.
pub fn film_png(svg: &[u8], dpi: f32) -> Result<Vec<u8>> {
    let page = Page::of(svg, dpi)?;
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

    /// A 10 × 5 mm page with its left half inked, at 254 dpi (10 pixels a millimetre):
    /// 100 × 50 pixels, ink on the left and clear on the right, and a `pHYs` chunk of
    /// 10 000 pixels per metre (PNG specification, 11.3.5.3 pHYs).
    #[test]
    fn page_rasterises_at_its_size() {
        let svg = br##"<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="5mm" viewBox="0 0 10 5"><path d="M0 0H5V5H0Z" fill="#000000"/></svg>"##;
        let (w, h, g) = rasterise(svg, 254.0).unwrap();
        assert_eq!((w, h), (100, 50));
        assert_eq!((g[10 * 100 + 20], g[10 * 100 + 80]), (0, 255));
        let png = film_png(svg, 254.0).unwrap();
        let at = png.windows(4).position(|c| c == b"pHYs").unwrap() + 4;
        assert_eq!(u32::from_be_bytes(png[at..at + 4].try_into().unwrap()), 10_000);
        assert_eq!(png[at + 8], 1, "unit: metre");
    }

    /// Drawing in bands gives the picture of drawing at once: a slanted stroke and a
    /// circle crossing band edges at odd heights, bands of 7 rows against one band
    /// (resvg draws both). Shifting the drawing by whole pixels moves its coordinates
    /// by a float subtraction, so the anti-aliased edge pixels may differ by a few of
    /// tiny-skia's 16 coverage steps (its supersampling, 4 × 4 per pixel); pixels wholly
    /// inked or clear never differ, and the ink in all agrees within 0.1 %. The streamed
    /// PNG decodes (png crate) to the pixels of `rasterise`.
    #[test]
    fn bands_give_the_pixels_of_one_drawing() {
        let svg = br##"<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="6mm" viewBox="0 0 10 6"><path d="M1 0.3L9 5.7L8.6 5.9L0.6 0.5Z" fill="#000000"/><circle cx="5" cy="3" r="1.77" fill="#000000"/></svg>"##;
        let page = Page::of(svg, 300.0).unwrap();
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
        for (i, (&a, &b)) in small.iter().zip(&whole).enumerate() {
            let edge = (a > 0 && a < 255) || (b > 0 && b < 255);
            assert!(a == b || (edge && a.abs_diff(b) <= 3 * 16), "pixel {i}: {a} in bands, {b} at once");
        }
        let ink = |g: &[u8]| g.iter().map(|&v| 255 - v as u64).sum::<u64>() as f64;
        assert!((ink(&small) - ink(&whole)).abs() <= 1e-3 * ink(&whole), "ink {} against {}", ink(&small), ink(&whole));
        let png = film_png(svg, 300.0).unwrap();
        let mut reader = png::Decoder::new(std::io::Cursor::new(png)).read_info().unwrap();
        let mut buf = vec![0; reader.output_buffer_size().unwrap()];
        reader.next_frame(&mut buf).unwrap();
        assert_eq!(buf, rasterise(svg, 300.0).unwrap().2);
    }
}
