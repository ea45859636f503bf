//! Prints the lead pieces the plan counts for one net, with their squares, and writes
//! them as an SVG over the net's ITO: `cargo run --release --example lead_pieces --
//! LAYOUT NET OUT.svg`. For reviewing the plan's resistance figures.

use segmask::layout::PlateId;

fn main() {
    let a: Vec<String> = std::env::args().collect();
    if a.len() < 4 {
        eprintln!("usage: lead_pieces LAYOUT NET OUT.svg");
        std::process::exit(2);
    }
    let built = segmask::pipeline::build_layout_file(std::path::Path::new(&a[1])).expect("build");
    let art = &built.artwork;
    let ex = segmask::check::Extraction::extract(art);
    let mut svg = String::from("<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 -40 60 40\" width=\"1200\" height=\"800\">\n");
    let path = |p: &segmask::geom::Polygon, fill: &str| {
        let d: String = p.exterior().0.iter().enumerate().map(|(i, c)| format!("{}{:.4},{:.4} ", if i == 0 { "M" } else { "L" }, c.x, -c.y)).collect();
        format!("<path d=\"{d}Z\" fill=\"{fill}\" stroke=\"none\"/>\n")
    };
    for plate in [PlateId::Front, PlateId::Back] {
        let ito = segmask::plan::electrical::ito_of_net(&ex, plate, &a[2]);
        for p in &ito.0 {
            svg.push_str(&path(p, "#bbbbbb"));
        }
        for (p, s) in segmask::plan::electrical::lead_pieces(art, &ito, &a[2]).leads {
            let c = p.exterior().0[0];
            println!("{} piece at ({:.2}, {:.2}): area {:.4} mm², {:.1} squares", plate.name(), c.x, c.y, segmask::geom::area(&p), s);
            svg.push_str(&path(&p, "#d0021b"));
        }
    }
    svg.push_str("</svg>\n");
    std::fs::write(&a[3], svg).expect("write");
}
