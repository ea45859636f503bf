//! PNG films: the shared build of the panel demo (`coupons`, positive resist,
//! compensated) writes each plate's film as an 8-bit greyscale PNG at the default
//! resolution, sized and tagged by the PNG specification; and the film, rasterised at
//! 2400 dpi by resvg, has no ink within the edge clearance of the glass edge except the
//! pads and the alignment marks (which sit in the glass corners by design, outside the
//! seal: src/plate/marks.rs; the edge rule only keeps them off the edge). Only the four edge strips are rasterised at 2400 dpi (a whole film would be
//! about 7000 × 8000 pixels).
//!
//! Page layout from docs/outputs.md (*Page layout*): the glass is centred across the page
//! with its top edge 16 mm below the page top. Units: W3C CSS Values and Units,
//! 1 in = 25.4 mm = 96 px.

use crate::demo_build::build_demo;
use resvg::{tiny_skia, usvg};

const NAME: &str = "coupons";
/// The demo's glass, mm (demo-layouts/coupons.yaml): front 24 × 18, back 24 × 15.
const GLASS: [(&str, f64, f64); 2] = [("front", 24.0, 18.0), ("back", 24.0, 15.0)];
/// Its pads, mm wide (same file), and the film bias: grown 5 µm per edge.
const PAD_WIDTH: f64 = 0.8 + 2.0 * 0.005;
/// Its alignment marks: centred `seal.inset / 2` = 0.75 mm in from each corner of the
/// back glass (0, 3)–(24, 18), `marks.size` 0.8 mm across, grown 5 µm (same file).
const MARK_CENTRES: [(f64, f64); 4] = [(0.75, 3.75), (23.25, 3.75), (0.75, 17.25), (23.25, 17.25)];
const MARK_HALF: f64 = 0.4 + 0.005;
const DPI: f64 = 2400.0;

/// The page size in mm from the SVG film's `width="…mm" height="…mm"`.
fn page_mm(svg: &str) -> (f64, f64) {
    let get = |k: &str| svg.split(&format!("{k}=\"")).nth(1).unwrap().split("mm").next().unwrap().parse::<f64>().unwrap();
    (get("width"), get("height"))
}

/// The film's SVG rasterised by resvg at `DPI` over the page rectangle (x, y, w, h) in
/// mm: rows of grey values, 0 = ink, 255 = clear.
fn strip(svg: &[u8], (x, y, w, h): (f64, f64, f64, f64)) -> Vec<Vec<u8>> {
    let tree = usvg::Tree::from_data(svg, &usvg::Options::default()).unwrap();
    let k = (DPI / 25.4) as f32; // pixels per mm
    let s = k * 25.4 / 96.0; // pixels per SVG px
    let (pw, ph) = ((w * k as f64).floor() as u32, (h * k as f64).floor() as u32);
    let mut pm = tiny_skia::Pixmap::new(pw, ph).unwrap();
    pm.fill(tiny_skia::Color::WHITE);
    let t = tiny_skia::Transform::from_row(s, 0.0, 0.0, s, -(x as f32) * k, -(y as f32) * k);
    resvg::render(&tree, t, &mut pm.as_mut());
    (0..ph).map(|r| (0..pw).map(|c| pm.pixel(c, r).unwrap().red()).collect()).collect()
}

/// Runs of ink along one row: (first, last) column.
fn runs(row: &[u8]) -> Vec<(usize, usize)> {
    let mut out: Vec<(usize, usize)> = Vec::new();
    for (i, &v) in row.iter().enumerate() {
        if v < 255 {
            match out.last_mut() {
                Some(r) if r.1 + 1 == i => r.1 = i,
                _ => out.push((i, i)),
            }
        }
    }
    out
}

/// A resolution outside the range drawn is an input error naming the option, and
/// nothing is written (the layout is not even read).
#[test]
fn png_dpi_out_of_range_is_refused() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let layout = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(format!("{NAME}.yaml"));
    let o = std::process::Command::new(env!("CARGO_BIN_EXE_segmask"))
        .arg("build")
        .arg(layout)
        .arg("--out")
        .arg(&out)
        .args(["--png-dpi", "5"])
        .output()
        .unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(2), "{err}");
    assert!(err.contains("--png-dpi") && err.contains("10 to 4800"), "{err}");
    assert!(!out.exists());
}

#[test]
fn png_films_are_sized_and_the_glass_edge_is_clear_but_pads() {
    let (_dir, out) = build_demo(NAME);
    let report = std::fs::read_to_string(out.join(format!("{NAME}.report.json"))).unwrap();
    let clearance: f64 = report.split("\"edge_clearance_mm\": ").nth(1).unwrap().split([',', '\n']).next().unwrap().parse().unwrap();
    let pins = std::fs::read_to_string(out.join(format!("{NAME}.pins.csv"))).unwrap().lines().count() - 1;
    let px = 25.4 / DPI;
    for (plate, gw, gh) in GLASS {
        let svg = std::fs::read(out.join(format!("{NAME}.{plate}.svg"))).unwrap();
        let (w, h) = page_mm(&String::from_utf8_lossy(&svg));

        // The PNG at the default 600 dpi, decoded by the png crate: 8-bit greyscale,
        // ceil(mm × dpi / 25.4) pixels, and pHYs = dpi / 0.0254 pixels per metre (PNG
        // specification, 11.3.5.3), so that it prints at size.
        let png = std::fs::File::open(out.join(format!("{NAME}.{plate}.png"))).unwrap();
        let reader = png::Decoder::new(std::io::BufReader::new(png)).read_info().unwrap();
        let info = reader.info();
        assert_eq!((info.color_type, info.bit_depth), (png::ColorType::Grayscale, png::BitDepth::Eight));
        assert_eq!((info.width, info.height), ((w * 600.0 / 25.4).ceil() as u32, (h * 600.0 / 25.4).ceil() as u32), "{plate}");
        let dims = info.pixel_dims.unwrap();
        assert_eq!((dims.xppu, dims.yppu, dims.unit), (23622, 23622, png::Unit::Meter));

        // 2400 dpi: the strips inside the glass within the edge clearance, less two
        // pixels (anti-aliasing touches one pixel past an edge; the film grows ITO 5 µm).
        let (gx, gy) = ((w - gw) / 2.0, 16.0);
        let d = clearance - 2.0 * px;
        let sides = [
            ("top", (gx, gy, gw, d)),
            ("left", (gx, gy, d, gh)),
            ("right", (gx + gw - d, gy, d, gh)),
            ("bottom", (gx, gy + gh - d, gw, d)),
        ];
        // Glass frame → page: the front film is upright, the back film mirrored about
        // the glass centre, which leaves these symmetric mark positions where they are;
        // y flips from the glass top (front y1 = 18, back y1 = 18).
        let on_mark = |x: f64, y: f64| {
            MARK_CENTRES.iter().any(|&(cx, cy)| {
                let (mx, my) = (gx + cx, gy + (18.0 - cy));
                (x - mx).abs() <= MARK_HALF + 2.0 * px && (y - my).abs() <= MARK_HALF + 2.0 * px
            })
        };
        for (side, rect) in sides {
            let rows = strip(&svg, rect);
            let mut stray = 0;
            for (r, row) in rows.iter().enumerate() {
                for (c, &v) in row.iter().enumerate() {
                    let (x, y) = (rect.0 + (c as f64 + 0.5) * px, rect.1 + (r as f64 + 0.5) * px);
                    if v < 255 && !on_mark(x, y) && !(plate == "front" && side == "bottom") {
                        stray += 1;
                    }
                }
            }
            assert_eq!(stray, 0, "{plate} film: {stray} inked pixels within {clearance} mm of the {side} glass edge, off the marks");
            if plate == "back" || side != "bottom" {
                continue;
            }
            let inked: usize = rows.iter().map(|r| r.iter().filter(|&&v| v < 255).count()).sum();
            // The front plate's pad side: the ink is the pads and nothing else. On the
            // strip's innermost row there is one run per pad, each a pad wide; every other
            // row inks only columns inside those runs.
            let pads = runs(&rows[0]);
            assert_eq!(pads.len(), pins, "front pad side: {pads:?}");
            for &(a, b) in &pads {
                let wide = (b - a + 1) as f64 * px;
                assert!((wide - PAD_WIDTH).abs() <= 3.0 * px, "a run of {wide:.4} mm is not a {PAD_WIDTH} mm pad");
            }
            for (i, row) in rows.iter().enumerate() {
                for (a, b) in runs(row) {
                    let y = rect.1 + (i as f64 + 0.5) * px;
                    let mark = (a..=b).all(|c| on_mark(rect.0 + (c as f64 + 0.5) * px, y));
                    assert!(mark || pads.iter().any(|&(p, q)| p <= a && b <= q), "row {i}: ink at columns {a}..{b} off the pads and marks");
                }
            }
            assert!(inked > 0, "the pads must reach the strip");
        }
    }
}
