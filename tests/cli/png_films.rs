//! PNG films: the shared build of the panel demo (`coupons`, positive resist,
//! compensated) writes each plate's film as an 8-bit greyscale PNG at the default
//! resolution, sized and tagged by the PNG specification; and every demo's films (and
//! the negative-resist mask fixture's), front and back, rasterised at 2400 dpi by resvg,
//! have no ITO within the edge clearance of the glass edge except the pads — the
//! alignment marks included, which lie inside the seal (src/plate/mark_place.rs). Only
//! the four edge strips are rasterised at 2400 dpi (a whole film would be about
//! 7000 × 8000 pixels). And every PNG film is its SVG film as resvg draws it at the
//! PNG's resolution (segmask draws the PNG itself, from the same drawing).
//!
//! Page layout from docs/outputs.md (*Page layout*): the glass is centred across the page
//! with its top edge 16 mm below the page top. Units: W3C CSS Values and Units,
//! 1 in = 25.4 mm = 96 px.

use crate::demo_build::{build_demo, build_layout, demos_and_negative};
use resvg::{tiny_skia, usvg};

const NAME: &str = "coupons";
const DPI: f64 = 2400.0;

/// The page size in mm from the SVG film's `width="…mm" height="…mm"`.
fn page_mm(svg: &str) -> (f64, f64) {
    let get = |k: &str| svg.split(&format!("{k}=\"")).nth(1).unwrap().split("mm").next().unwrap().parse::<f64>().unwrap();
    (get("width"), get("height"))
}

/// The film's SVG rasterised by resvg at `DPI` over the page rectangle (x, y, w, h) in
/// mm: rows of grey values, 0 = ink, 255 = clear.
fn strip(tree: &usvg::Tree, (x, y, w, h): (f64, f64, f64, f64)) -> Vec<Vec<u8>> {
    let k = (DPI / 25.4) as f32; // pixels per mm
    let s = k * 25.4 / 96.0; // pixels per SVG px
    let (pw, ph) = ((w * k as f64).floor() as u32, (h * k as f64).floor() as u32);
    let mut pm = tiny_skia::Pixmap::new(pw, ph).unwrap();
    pm.fill(tiny_skia::Color::WHITE);
    let t = tiny_skia::Transform::from_row(s, 0.0, 0.0, s, -(x as f32) * k, -(y as f32) * k);
    resvg::render(tree, t, &mut pm.as_mut());
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

/// The default PNG of each coupons film, decoded by the png crate: 8-bit greyscale,
/// ceil(mm × dpi / 25.4) pixels, and pHYs = dpi / 0.0254 pixels per metre (PNG
/// specification, 11.3.5.3), so that it prints at size.
#[test]
fn png_films_are_sized_and_tagged() {
    let (_dir, out) = build_demo(NAME);
    for plate in ["front", "back"] {
        let svg = std::fs::read(out.join(format!("{NAME}.{plate}.svg"))).unwrap();
        let (w, h) = page_mm(&String::from_utf8_lossy(&svg));
        let png = std::fs::File::open(out.join(format!("{NAME}.{plate}.png"))).unwrap();
        let reader = png::Decoder::new(std::io::BufReader::new(png)).read_info().unwrap();
        let info = reader.info();
        assert_eq!((info.color_type, info.bit_depth), (png::ColorType::Grayscale, png::BitDepth::Eight));
        assert_eq!((info.width, info.height), ((w * 600.0 / 25.4).ceil() as u32, (h * 600.0 / 25.4).ceil() as u32), "{plate}");
        let dims = info.pixel_dims.unwrap();
        assert_eq!((dims.xppu, dims.yppu, dims.unit), (23622, 23622, png::Unit::Meter));
    }
}

/// What the edge test needs of a layout, read from its YAML (not from segmask's
/// outputs): each plate's glass size, the pad side and the pad width.
struct Glass {
    size: [(f64, f64); 2],
    pad_side: String,
    pad_width: f64,
}

fn glass_of(layout: &std::path::Path) -> Glass {
    let y: serde_yaml::Value = serde_yaml::from_str(&std::fs::read_to_string(layout).unwrap()).unwrap();
    let num = |v: &serde_yaml::Value| v.as_f64().unwrap_or_else(|| panic!("{}: a plain number in mm expected, not {v:?}", layout.display()));
    let size = ["front", "back"].map(|p| (num(&y["glass"][p]["width"]), num(&y["glass"][p]["height"])));
    Glass { size, pad_side: y["pads"]["side"].as_str().unwrap().to_string(), pad_width: num(&y["pads"]["width"]) }
}

/// A strip's pixels as lines parallel to the glass edge, the innermost line first.
fn lines_from_inside(rows: Vec<Vec<u8>>, side: &str) -> Vec<Vec<u8>> {
    let cols = |rows: &Vec<Vec<u8>>| (0..rows[0].len()).map(|c| rows.iter().map(|r| r[c]).collect()).collect::<Vec<Vec<u8>>>();
    match side {
        "bottom" => rows,
        "top" => rows.into_iter().rev().collect(),
        "left" => cols(&rows).into_iter().rev().collect(),
        _ => cols(&rows),
    }
}

/// Every demo's films and the negative-resist fixture's, at 2400 dpi: within the edge
/// clearance of each glass edge (the report's `edge_clearance_mm`) there is no ITO —
/// ink on a clear-field film, clear on a dark-field one — except on the front film's pad
/// side (each side with pins, by the pin map), where the ITO is the pads and nothing
/// else: on the line nearest the inside, one run per pin, each a pad wide (`pads.width`, grown by the undercut when compensating);
/// every other line has ITO only inside those runs. The alignment marks are not exempt.
#[test]
fn films_have_no_ito_within_the_edge_clearance_but_pads() {
    let layouts = demos_and_negative();
    let px = 25.4 / DPI;
    let mut negative = 0;
    for (name, layout) in layouts {
        let (_dir, out) = build_layout(&layout, &name);
        let g = glass_of(&layout);
        let report: serde_json::Value = serde_json::from_str(&std::fs::read_to_string(out.join(format!("{name}.report.json"))).unwrap()).unwrap();
        let rules = &report["rules"];
        let clearance = rules["edge_clearance_mm"].as_f64().unwrap();
        let bias = if rules["compensate"].as_bool().unwrap() { rules["undercut_mm"].as_f64().unwrap() } else { 0.0 };
        let dark = report["resist"] == "negative";
        negative += dark as usize;
        // Pins per ledge side, from the pin map's `side` column (two pad rows: two sides).
        let mut pins: std::collections::BTreeMap<String, usize> = std::collections::BTreeMap::new();
        for row in std::fs::read_to_string(out.join(format!("{name}.pins.csv"))).unwrap().lines().skip(1) {
            *pins.entry(row.rsplit(',').next().unwrap().to_string()).or_default() += 1;
        }
        assert!(pins.contains_key(&g.pad_side), "{name}: no pins on the pad side {}: {pins:?}", g.pad_side);
        for (plate, (gw, gh)) in ["front", "back"].into_iter().zip(g.size) {
            let svg = std::fs::read(out.join(format!("{name}.{plate}.svg"))).unwrap();
            let (w, _) = page_mm(&String::from_utf8_lossy(&svg));
            let tree = usvg::Tree::from_data(&svg, &usvg::Options::default()).unwrap();
            // The strips inside the glass within the edge clearance, less two pixels
            // (anti-aliasing touches one pixel past an edge; the film grows ITO by the bias).
            let (gx, gy) = ((w - gw) / 2.0, 16.0);
            let d = clearance - 2.0 * px;
            let sides = [
                ("top", (gx, gy, gw, d)),
                ("left", (gx, gy, d, gh)),
                ("right", (gx + gw - d, gy, d, gh)),
                ("bottom", (gx, gy + gh - d, gw, d)),
            ];
            for (side, rect) in sides {
                // ITO: ink on a clear-field film; on a dark-field film, any pixel not
                // fully dark (a clear ITO edge anti-aliases to grey).
                let ito: Vec<Vec<u8>> =
                    strip(&tree, rect).into_iter().map(|r| r.into_iter().map(|v| if (v < 255) != dark { 0 } else { 255 }).collect()).collect();
                let lines = lines_from_inside(ito, side);
                let here = format!("{name} {plate} film, {side} edge");
                if plate == "back" || !pins.contains_key(side) {
                    let stray: usize = lines.iter().map(|l| l.iter().filter(|&&v| v < 255).count()).sum();
                    assert_eq!(stray, 0, "{here}: {stray} pixels of ITO within {clearance} mm of the glass edge");
                    continue;
                }
                let pads = runs(&lines[0]);
                assert_eq!(pads.len(), pins[side], "{here}: runs on the inner line {pads:?}");
                let pad_width = g.pad_width + 2.0 * bias;
                for &(a, b) in &pads {
                    let wide = (b - a + 1) as f64 * px;
                    assert!((wide - pad_width).abs() <= 3.0 * px, "{here}: a run of {wide:.4} mm is not a {pad_width} mm pad");
                }
                for (i, line) in lines.iter().enumerate() {
                    for (a, b) in runs(line) {
                        assert!(pads.iter().any(|&(p, q)| p <= a && b <= q), "{here}: line {i}: ITO at {a}..{b} off the pads");
                    }
                }
            }
        }
    }
    assert_eq!(negative, 1, "the dark-field branch must be exercised by the negative-resist fixture");
}

/// Every demo's PNG films (and the negative-resist fixture's) are its SVG films as an
/// independent renderer draws them: each SVG rasterised whole by resvg 0.49 at the PNG's
/// 600 dpi agrees with the decoded PNG (png crate) pixel for pixel up to anti-aliasing:
/// no pixel wholly inked in one is wholly clear in the other, at most one pixel in a
/// thousand differs at all (edge pixels, where the two flatten round caps and joins a
/// little differently), and the ink in all agrees within 0.1 %.
#[test]
fn png_films_are_the_svg_films_as_resvg_draws_them() {
    for (name, layout) in demos_and_negative() {
        let (_dir, out) = build_layout(&layout, &name);
        for plate in ["front", "back"] {
            let png = std::fs::File::open(out.join(format!("{name}.{plate}.png"))).unwrap();
            let mut reader = png::Decoder::new(std::io::BufReader::new(png)).read_info().unwrap();
            let mut ours = vec![0; reader.output_buffer_size().unwrap()];
            let info = reader.next_frame(&mut ours).unwrap();
            let (w, h) = (info.width, info.height);
            let svg = std::fs::read(out.join(format!("{name}.{plate}.svg"))).unwrap();
            let tree = usvg::Tree::from_data(&svg, &usvg::Options::default()).unwrap();
            let mut pm = tiny_skia::Pixmap::new(w, h).unwrap();
            pm.fill(tiny_skia::Color::WHITE);
            let s = 600.0 / 96.0;
            resvg::render(&tree, tiny_skia::Transform::from_scale(s, s), &mut pm.as_mut());
            let mut differ = 0usize;
            for (i, (p, &a)) in pm.pixels().iter().zip(&ours).enumerate() {
                let b = p.red();
                assert!(a.abs_diff(b) < 255, "{name} {plate}: pixel ({}, {}) is {a} in the PNG, {b} drawn by resvg", i as u32 % w, i as u32 / w);
                differ += usize::from(a != b);
            }
            let ink = |g: &mut dyn Iterator<Item = u8>| g.map(|v| 255 - v as u64).sum::<u64>() as f64;
            let (a, b) = (ink(&mut ours.iter().copied()), ink(&mut pm.pixels().iter().map(|p| p.red())));
            assert!((a - b).abs() <= 1e-3 * b.max(1.0), "{name} {plate}: ink {a} against {b}");
            assert!(differ * 1000 < (w * h) as usize, "{name} {plate}: {differ} pixels differ");
        }
    }
}
