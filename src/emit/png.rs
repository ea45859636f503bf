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

/// Largest film raster, pixels: about 1 GB while it is drawn (four bytes a pixel); a
/// larger one is refused with an error naming `--png-dpi` instead of running out of memory.
pub const MAX_PIXELS: u64 = 250_000_000;

/// Millimetres in an inch.
const MM_PER_INCH: f64 = 25.4;

/// The size in pixels of a page `width_mm` × `height_mm` at `dpi` (whole pixels, rounded up
/// so that nothing of the page is cut).
pub fn pixel_size(width_mm: f64, height_mm: f64, dpi: f32) -> (u32, u32) {
    let k = dpi as f64 / MM_PER_INCH;
    ((width_mm * k).ceil() as u32, (height_mm * k).ceil() as u32)
}

/// The film rasterised: width, height and one grey byte per pixel (0 = ink, 255 = clear),
/// row by row from the top.
pub fn rasterise(svg: &[u8], dpi: f32) -> Result<(u32, u32, Vec<u8>)> {
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
    let mut pixmap =
        resvg::tiny_skia::Pixmap::new(w.max(1), h.max(1)).ok_or_else(|| Error::Bug(format!("no {w}×{h} pixmap")))?;
    pixmap.fill(resvg::tiny_skia::Color::WHITE);
    let scale = dpi / 96.0;
    resvg::render(&tree, resvg::tiny_skia::Transform::from_scale(scale, scale), &mut pixmap.as_mut());
    // The page is opaque white under black and white paint, so red alone is the grey.
    let grey = pixmap.pixels().iter().map(|p| p.red()).collect();
    Ok((w.max(1), h.max(1), grey))
}

/// The PNG bytes of a film at `dpi`.
pub fn film_png(svg: &[u8], dpi: f32) -> Result<Vec<u8>> {
    let (w, h, grey) = rasterise(svg, dpi)?;
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, w, h);
        enc.set_color(png::ColorType::Grayscale);
        enc.set_depth(png::BitDepth::Eight);
        let ppm = (dpi as f64 / MM_PER_INCH * 1000.0).round() as u32;
        enc.set_pixel_dims(Some(png::PixelDimensions { xppu: ppm, yppu: ppm, unit: png::Unit::Meter }));
        let mut writer = enc.write_header().map_err(|e| Error::Bug(format!("PNG: {e}")))?;
        writer.write_image_data(&grey).map_err(|e| Error::Bug(format!("PNG: {e}")))?;
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
}
