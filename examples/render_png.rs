//! Renders an SVG (a film or the preview) to PNG with resvg, to look at it as a picture:
//! `cargo run --example render_png --features preview-text -- out/NAME.preview.svg out/NAME.preview.png [DPI]`
//! (the feature brings resvg's fonts, for the preview's labels).

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if args.len() < 3 {
        eprintln!("usage: render_png IN.svg OUT.png [dpi, default 300]");
        std::process::exit(2);
    }
    let dpi: f32 = args.get(3).and_then(|s| s.parse().ok()).unwrap_or(300.0);
    let data = std::fs::read(&args[1]).expect("read svg");
    let mut opt = resvg::usvg::Options::default();
    let db = opt.fontdb_mut();
    db.load_system_fonts();
    // fontdb maps the generic `sans-serif` to Arial, which many Linux machines lack; the
    // preview's words (legend, pin numbers) are then left out. Any sans face will do.
    let has = |db: &resvg::usvg::fontdb::Database, name: &str| db.faces().any(|f| f.families.iter().any(|(n, _)| n == name));
    if !has(db, "Arial") {
        let sans = db
            .faces()
            .flat_map(|f| f.families.iter().map(|(n, _)| n.clone()))
            .find(|n| n.contains("Sans") && !n.contains("Mono"));
        if let Some(name) = sans {
            db.set_sans_serif_family(name);
        }
    }
    let tree = resvg::usvg::Tree::from_data(&data, &opt).expect("parse svg");
    // usvg sizes are in CSS px (96 per inch).
    let scale = dpi / 96.0;
    let size = tree.size();
    let (w, h) = ((size.width() * scale).ceil() as u32, (size.height() * scale).ceil() as u32);
    let mut pixmap = resvg::tiny_skia::Pixmap::new(w, h).expect("pixmap");
    pixmap.fill(resvg::tiny_skia::Color::WHITE);
    resvg::render(&tree, resvg::tiny_skia::Transform::from_scale(scale, scale), &mut pixmap.as_mut());
    pixmap.save_png(&args[2]).expect("write png");
    eprintln!("{}x{} px at {dpi} dpi", w, h);
}
