//! `segmask show` on the irrigation-timer demo (static drive, four digits, a colon after
//! digit 2): the picture, rasterised independently by resvg, is dark exactly where the
//! segment map's elements for "88:88" are.

use crate::demo_build;

use std::path::Path;
use std::process::Command;

/// Pixels per mm of the raster (about 508 dpi): a 0.35 mm segment gap is 7 pixels.
const PX: f32 = 20.0;
/// The demo's window (demo-layouts/irrigation-timer.yaml: x 4, y 8, 48 × 22 mm) and the
/// bezel margin the picture draws around it (docs/outputs.md, *Show*).
const WINDOW: (f32, f32, f32, f32) = (4.0, 8.0, 48.0, 22.0);
const MARGIN: f32 = 3.0;

fn show(dir: &Path, text: &str) -> resvg::tiny_skia::Pixmap {
    let out = dir.join(format!("show-{}", text.len()));
    let layout = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts/irrigation-timer.yaml");
    let o = Command::new(env!("CARGO_BIN_EXE_segmask"))
        .args(["show"])
        .arg(&layout)
        .args(["--text", text, "--out"])
        .arg(&out)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", String::from_utf8_lossy(&o.stderr));
    assert!(out.join("irrigation-timer.show.png").exists());
    let svg = std::fs::read(out.join("irrigation-timer.show.svg")).unwrap();
    let tree = resvg::usvg::Tree::from_data(&svg, &resvg::usvg::Options::default()).unwrap();
    // usvg gives the page size in CSS px, 96 to the inch (CSS Values and Units), and the
    // page is in mm (docs/outputs.md): PX pixels per mm is PX·25.4/96 per CSS px.
    let scale = PX * 25.4 / 96.0;
    let size = tree.size();
    let mut pix =
        resvg::tiny_skia::Pixmap::new((size.width() * scale).ceil() as u32, (size.height() * scale).ceil() as u32).unwrap();
    resvg::render(&tree, resvg::tiny_skia::Transform::from_scale(scale, scale), &mut pix.as_mut());
    pix
}

/// True when the pixel at artwork point (x, y) mm is dark: luminance below the middle
/// of the glass and lit colours (anti-aliased edges split evenly, so counts give areas).
fn dark_at(pix: &resvg::tiny_skia::Pixmap, x: f32, y: f32) -> bool {
    let px = ((x - WINDOW.0 + MARGIN) * PX) as u32;
    let py = ((WINDOW.1 + WINDOW.3 + MARGIN - y) * PX) as u32;
    dark(pix, px, py)
}

fn dark(pix: &resvg::tiny_skia::Pixmap, px: u32, py: u32) -> bool {
    let c = pix.pixel(px, py).unwrap();
    let lum = 0.299 * c.red() as f32 + 0.587 * c.green() as f32 + 0.114 * c.blue() as f32;
    // Glass #c8d2bd ≈ 204, lit #1c211e ≈ 31: the middle is about 118.
    lum < 118.0
}

/// Every pixel inside the window: its artwork position (mm) and whether it is dark.
fn window_pixels(pix: &resvg::tiny_skia::Pixmap) -> Vec<((f32, f32), bool)> {
    let (x0, y0) = ((MARGIN * PX) as u32, (MARGIN * PX) as u32);
    let (x1, y1) = (((MARGIN + WINDOW.2) * PX) as u32, ((MARGIN + WINDOW.3) * PX) as u32);
    let mut out = vec![];
    for py in y0..y1 {
        for px in x0..x1 {
            let x = (px as f32 + 0.5) / PX - MARGIN + WINDOW.0;
            let y = WINDOW.1 + WINDOW.3 + MARGIN - (py as f32 + 0.5) / PX;
            out.push(((x, y), dark(pix, px, py)));
        }
    }
    out
}

/// "88:88" lights all seven segments of the four digits and the colon and nothing else:
/// the dark area equals the sum of their areas in the segment map (within 1.5 %, the
/// raster's edge error at 20 px/mm), every segment's centre of area is dark, and the
/// difference from "8888" is the colon alone — its area, around its centre.
#[test]
fn eighty_eight_colon_eighty_eight() {
    let (dir, out) = demo_build::build_demo("irrigation-timer");
    let map = demo_build::segmap(&out, "irrigation-timer");
    let f = |e: &str, k: &str| -> f32 { map[e][k].parse().unwrap() };
    let segments: Vec<String> =
        (1..=4).flat_map(|d| ["a", "b", "c", "d", "e", "f", "g"].map(|s| format!("D{d}.{s}"))).collect();
    let colon = "D2.col";
    let want: f32 = segments.iter().map(|e| f(e, "area_mm2")).sum::<f32>() + f(colon, "area_mm2");
    // The demo has nothing else to light, so "nothing else" is about ITO that is not a
    // pixel: the sum of every element's area must be what the segments and colon give.
    assert_eq!(map.len(), segments.len() + 1, "{:?}", map.keys());

    let with = show(dir.path(), "88:88");
    let lit = window_pixels(&with);
    let count = |v: &[((f32, f32), bool)]| v.iter().filter(|p| p.1).count();
    let got = count(&lit) as f32 / (PX * PX);
    assert!((got - want).abs() / want < 0.015, "dark {got} mm², segment map {want} mm²");
    for e in &segments {
        assert!(dark_at(&with, f(e, "centroid_x_mm"), f(e, "centroid_y_mm")), "{e} is not lit");
    }

    let without = show(dir.path(), "8888");
    let lit_without = window_pixels(&without);
    let colon_area = f(colon, "area_mm2");
    assert!(lit.iter().zip(&lit_without).all(|(a, b)| a.1 || !b.1), "\"8888\" lights something \"88:88\" does not");
    let only: Vec<(f32, f32)> = lit.iter().zip(&lit_without).filter(|(a, b)| a.1 && !b.1).map(|(a, _)| a.0).collect();
    let extra = only.len() as f32 / (PX * PX);
    assert!((extra - colon_area).abs() / colon_area < 0.05, "colon {extra} mm² against {colon_area} mm²");
    let (cx, cy) = (f(colon, "centroid_x_mm"), f(colon, "centroid_y_mm"));
    for (x, y) in only {
        // The colon's two dots sit within a third of the 14 mm digit height of its centre.
        assert!((x - cx).abs() < 2.0 && (y - cy).abs() < 14.0 / 3.0, "({x}, {y}) lit by the colon");
    }
}

/// A character the digits cannot show, and an element that does not exist, are input
/// errors (exit code 2) that name the option; nothing is written.
#[test]
fn bad_text_and_names_are_refused() {
    let dir = tempfile::tempdir().unwrap();
    let layout = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts/irrigation-timer.yaml");
    for (args, key) in [(vec!["--text", "88.88"], "--text"), (vec!["--on", "NOPE"], "--on")] {
        let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("show").arg(&layout).args(&args).arg("--out").arg(dir.path()).output().unwrap();
        assert_eq!(o.status.code(), Some(2));
        assert!(String::from_utf8_lossy(&o.stderr).contains(key), "{}", String::from_utf8_lossy(&o.stderr));
        assert!(std::fs::read_dir(dir.path()).unwrap().next().is_none());
    }
}
