//! Every demo's films, rasterised by an independent renderer (resvg) at 2400 dpi: the
//! page has the stated size in mm, and the ink on the glass and up to 0.8 mm outside it
//! equals the etched polygon area within a one-pixel band around every outline — so no
//! ink lies on or near the glass edge but ITO (the pads and their leads reach the edge on
//! purpose; an outline there would be ITO left along the edge of a positive-resist plate).
//!
//! Units: W3C SVG / CSS Values and Units, 1 in = 25.4 mm = 96 px. Page layout as in
//! docs/outputs.md: for glass at least 50 mm wide, the glass sits 12 mm from the left and
//! 16 mm from the top of the page (docs/outputs.md, *Page layout*).

use geo::{Area, BooleanOps, Euclidean, Length};
use resvg::{tiny_skia, usvg};
use segmask::artwork::Layer;
use segmask::layout::PlateId;

const DPI: f32 = 2400.0;

fn demo(name: &str) -> std::path::PathBuf {
    std::path::PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(format!("{name}.yaml"))
}

#[test]
fn demo_films_print_at_size_with_the_right_ink() {
    for name in ["irrigation-timer", "conductivity-meter", "etch-test-plate", "tank-level-dial"] {
        let built = segmask::pipeline::build_layout_file(&demo(name)).unwrap();
        let opts = segmask::emit::EmitOptions { date: "2026-12-01".into(), masks_despite_errors: false, png_dpi: 100.0 };
        let files = segmask::emit::render_outputs(&built.artwork, &built.findings, &opts).unwrap();
        for plate in [PlateId::Front, PlateId::Back] {
            let file = files.iter().find(|f| f.name == format!("{name}.{}.svg", plate.name())).expect("film written");
            let opt = usvg::Options { dpi: DPI, ..Default::default() };
            let tree = usvg::Tree::from_data(&file.bytes, &opt).unwrap();
            let size = tree.size();
            let text = String::from_utf8_lossy(&file.bytes);
            let w_mm: f64 = text.split("width=\"").nth(1).unwrap().split("mm").next().unwrap().parse().unwrap();
            // usvg converts the page's mm to px at the dpi it is given.
            assert!((size.width() as f64 - w_mm / 25.4 * DPI as f64).abs() < 0.05, "{name} {plate:?} page width {}", size.width());
            let k = DPI as f64 / 25.4;
            let mut pm = tiny_skia::Pixmap::new(size.width().ceil() as u32, size.height().ceil() as u32).unwrap();
            resvg::render(&tree, tiny_skia::Transform::identity(), &mut pm.as_mut());
            let art = &built.artwork;
            let glass = art.glass(plate);
            let b = geo::BoundingRect::bounding_rect(glass).unwrap();
            // Negative: 0.8 mm outside the glass. The corner marks start 1 mm out.
            let inset = -0.8;
            let (gw, gh) = (b.width(), b.height());
            // count inked pixels over the glass and a band around it
            let (px0, py0) = (12.0 + inset, 16.0 + inset);
            let (px1, py1) = (12.0 + gw - inset, 16.0 + gh - inset);
            let mut n = 0u64;
            for y in (py0 * k).ceil() as u32..(py1 * k).floor() as u32 {
                for x in (px0 * k).ceil() as u32..(px1 * k).floor() as u32 {
                    let p = pm.pixel(x, y).unwrap();
                    let lum = (p.red() as f64 + p.green() as f64 + p.blue() as f64) / 3.0;
                    if (p.alpha() as f64 - lum) / 255.0 > 0.5 {
                        n += 1;
                    }
                }
            }
            let inked = n as f64 / (k * k);
            let clip = geo::MultiPolygon(vec![segmask::geom::rect(b.min().x + inset, b.min().y + inset, b.max().x - inset, b.max().y - inset)]);
            let (ito, marks) = match plate {
                PlateId::Front => (Layer::FrontIto, Layer::FrontMarks),
                PlateId::Back => (Layer::BackIto, Layer::BackMarks),
            };
            let mut want = 0.0;
            let mut perimeter = 0.0;
            for s in art.film_layer(ito).chain(art.film_layer(marks)) {
                let part = geo::MultiPolygon(vec![s.polygon.clone()]).intersection(&clip);
                want += part.unsigned_area();
                for p in &part.0 {
                    perimeter += Euclidean.length(p.exterior()) + p.interiors().iter().map(|r| Euclidean.length(r)).sum::<f64>();
                }
            }
            let tol = perimeter / k;
            assert!((inked - want).abs() <= tol, "{name} {plate:?}: inked {inked:.4} mm² vs ITO {want:.4} mm² (allowed ±{tol:.4})");
            println!("{name} {}: inked {inked:.4} mm², ITO {want:.4} mm², band ±{tol:.4}", plate.name());
        }
    }
}
