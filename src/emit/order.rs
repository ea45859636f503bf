//! The mask-order summary: what a mask shop or photoplotting service must be told, per
//! plate (`NAME.masks.json` and `NAME.masks.txt`).
//!
//! Takes the artwork and the build date, gives the summary that docs/background.md
//! (*Films, photoplots and chrome*, "Ordering a mask") lists: file and structure, layer
//! and datatype, tone, reading, whether mirroring and etch compensation are applied, the
//! critical dimensions as drawn and on the mask, the plate size and where the plate sits
//! in the structure. Everything is read from the artwork and the same [`super::mask`]
//! decisions the mask writers use; the critical dimensions are the smallest line and space
//! the checks let through (no error stands when masks are written), not measurements.

use super::file_stem;
use super::gdsii::{mask_mirrored, mask_structure};
use super::mask::{bbox, contact_mirrored, mask_plate};
use super::report::resist_name;
use crate::artwork::{Artwork, Layer};
use crate::layout::{PlateId, Resist};
use crate::{Error, Result};
use serde::Serialize;

/// Smallest line and space, mm.
#[derive(Debug, Serialize)]
struct Dimensions {
    line_drawn_mm: f64,
    space_drawn_mm: f64,
    line_on_mask_mm: f64,
    space_on_mask_mm: f64,
    process_limit_mm: f64,
}

/// One plate's entry.
#[derive(Debug, Serialize)]
struct PlateOrder {
    plate: &'static str,
    gdsii_file: String,
    gdsii_structure: &'static str,
    gds_layer: i16,
    gds_datatype: i16,
    glass_layer: [i16; 2],
    gerber_file: String,
    film_svg: String,
    film_pdf: String,
    film_pdf_page: usize,
    tone: &'static str,
    dark_means: &'static str,
    reading: String,
    mirrored: bool,
    compensated: bool,
    etch_bias_per_edge_um: f64,
    critical_dimensions: Dimensions,
    plate_size_mm: [f64; 2],
    glass_box_in_structure_mm: [f64; 4],
}

/// The panel's entry, when the layout has `panel:`.
#[derive(Debug, Serialize)]
struct PanelOrder {
    gdsii_file: String,
    gdsii_structures: [&'static str; 2],
    gerber_files: [String; 2],
    film_svgs: [String; 2],
    film_pdf: String,
    cut_lines_dxf: String,
    rows: u32,
    columns: u32,
    cell_pitch_mm: [f64; 2],
    spacing_mm: f64,
    scribe_lane_mm: f64,
    substrate_mm: [f64; 2],
    cell_origins_mm: Vec<[f64; 2]>,
    reading: &'static str,
}

/// The whole summary.
#[derive(Debug, Serialize)]
struct Order {
    layout: String,
    date: String,
    process: &'static str,
    resist: &'static str,
    units: &'static str,
    plates: Vec<PlateOrder>,
    #[serde(skip_serializing_if = "Option::is_none")]
    panel: Option<PanelOrder>,
    notes: Vec<String>,
}

fn panel_order(art: &Artwork, stem: &str) -> Option<PanelOrder> {
    let pa = art.panel.as_ref()?;
    let p = pa.panel;
    let (x0, y0, x1, y1) = art.glass_footprint();
    let plates = [PlateId::Front, PlateId::Back];
    Some(PanelOrder {
        gdsii_file: format!("{stem}.panel.gds"),
        gdsii_structures: plates.map(super::panel::panel_structure),
        gerber_files: plates.map(|pl| format!("{stem}.panel.{}.gbr", pl.name())),
        film_svgs: plates.map(|pl| format!("{stem}.panel.{}.svg", pl.name())),
        film_pdf: format!("{stem}.panel.pdf"),
        cut_lines_dxf: format!("{stem}.panel.cuts.dxf"),
        rows: p.rows,
        columns: p.columns,
        cell_pitch_mm: [r6(x1 - x0 + p.spacing), r6(y1 - y0 + p.spacing)],
        spacing_mm: r6(p.spacing),
        scribe_lane_mm: r6(p.scribe_lane),
        substrate_mm: [r6(p.width), r6(p.height)],
        cell_origins_mm: pa.offsets.iter().map(|o| [r6(o.x), r6(o.y)]).collect(),
        reading: "each panel structure references its plate's mask structure once per cell and holds the panel's \
                  alignment marks on the mask layer and the substrate on the glass layer; mirrored about the substrate \
                  centre exactly when the plate's mask structure is mirrored; cell origins are the front-plate frame \
                  origin of each cell on the substrate as the viewer sees it, rows from the bottom",
    })
}

/// Rounds to 1 nm for printing.
fn r6(v: f64) -> f64 {
    (v * 1e6).round() / 1e6
}

fn plate_order(art: &Artwork, plate: PlateId, stem: &str) -> PlateOrder {
    let mirrored = mask_mirrored(art, plate);
    let m = mask_plate(art, plate, mirrored);
    let r = &art.rules;
    let (line, space) = (r.min_width + 2.0 * (r.undercut - r.film_bias()), r.min_gap);
    let (x0, y0, x1, y1) = bbox(&m.glass);
    let ito = art.gds_layer(Layer::ito(plate));
    let glass = art.gds_layer(match plate {
        PlateId::Front => Layer::FrontGlass,
        PlateId::Back => Layer::BackGlass,
    });
    let (tone, dark_means) = match art.resist {
        Resist::Positive => ("clear-field", "chrome or emulsion where ITO stays"),
        Resist::Negative => ("dark-field", "chrome or emulsion where ITO is etched away"),
    };
    let reading = if art.masks.mirror {
        "the data reads correctly looking at the chrome (emulsion) side; expose with that side down on the resist; \
         mirroring is already applied, write the data as it is"
            .to_string()
    } else {
        format!(
            "the data is as the viewer sees the display; {} (chrome or emulsion side down)",
            if contact_mirrored(plate) { "the mask shop must mirror this plate" } else { "write it as it is" }
        )
    };
    PlateOrder {
        plate: plate.name(),
        gdsii_file: format!("{stem}.gds"),
        gdsii_structure: mask_structure(plate),
        gds_layer: ito.0,
        gds_datatype: ito.1,
        glass_layer: [glass.0, glass.1],
        gerber_file: format!("{stem}.{}.gbr", plate.name()),
        film_svg: format!("{stem}.{}.svg", plate.name()),
        film_pdf: format!("{stem}.films.pdf"),
        film_pdf_page: if plate == PlateId::Front { 1 } else { 2 },
        tone,
        dark_means,
        reading,
        mirrored,
        compensated: m.compensated,
        etch_bias_per_edge_um: r6(m.bias * 1000.0),
        critical_dimensions: Dimensions {
            line_drawn_mm: r6(line),
            space_drawn_mm: r6(space),
            line_on_mask_mm: r6(r.film_width(line)),
            space_on_mask_mm: r6(r.film_gap(space)),
            process_limit_mm: art.masks.process.mask_limit(),
        },
        plate_size_mm: [r6(x1 - x0), r6(y1 - y0)],
        glass_box_in_structure_mm: [r6(x0), r6(y0), r6(x1), r6(y1)],
    }
}

fn order(art: &Artwork, date: &str) -> Order {
    let stem = file_stem(&art.name);
    Order {
        layout: art.name.clone(),
        date: date.to_string(),
        process: art.masks.process.name(),
        resist: resist_name(art.resist),
        units: "mm; GDSII user unit 1 um, database unit 1 nm; Gerber FSLAX46Y46 in mm",
        plates: [PlateId::Front, PlateId::Back].into_iter().map(|p| plate_order(art, p, &stem)).collect(),
        panel: panel_order(art, &stem),
        notes: vec![
            "One mask per plate: write only the listed layer of the listed structure; the glass layer marks the plate edge and is not to be written.".into(),
            "Place each plate's glass box centred on the mask plate; the mask carries no other cell.".into(),
            "Critical dimensions are the smallest line and space the design rules allow (the checks found no error), not measured values.".into(),
            "Ask for a check plot before the mask is made.".into(),
        ],
    }
}

/// `NAME.masks.json`.
pub fn render_order_json(art: &Artwork, date: &str) -> Result<Vec<u8>> {
    let mut s = serde_json::to_string_pretty(&order(art, date)).map_err(|e| Error::Bug(format!("mask order: {e}")))?;
    s.push('\n');
    Ok(s.into_bytes())
}

/// `NAME.masks.txt`: the same, for an e-mail or a form.
pub fn render_order_text(art: &Artwork, date: &str) -> Vec<u8> {
    let o = order(art, date);
    let mut s = format!("MASK ORDER - {} - {}\nprocess: {}\nresist: {}\nunits: {}\n", o.layout, o.date, o.process, o.resist, o.units);
    for p in &o.plates {
        let c = &p.critical_dimensions;
        s.push_str(&format!(
            "\n{} plate\n  GDSII: {} structure {} layer {} datatype {} (glass outline on layer {} datatype {}, not to be written)\n  \
             Gerber: {}\n  films: {}, {} page {}\n  tone: {} ({})\n  reading: {}\n  mirrored: {}\n  \
             etch compensation: {}\n  smallest line: {} mm drawn, {} mm on the mask\n  smallest space: {} mm drawn, {} mm on the mask\n  \
             process limit: {} mm\n  plate size: {} x {} mm\n  glass box in the structure: ({}, {}) to ({}, {}) mm\n",
            p.plate,
            p.gdsii_file,
            p.gdsii_structure,
            p.gds_layer,
            p.gds_datatype,
            p.glass_layer[0],
            p.glass_layer[1],
            p.gerber_file,
            p.film_svg,
            p.film_pdf,
            p.film_pdf_page,
            p.tone,
            p.dark_means,
            p.reading,
            if p.mirrored { "yes, about the glass centre" } else { "no" },
            if p.compensated { format!("applied, {} um per edge", p.etch_bias_per_edge_um) } else { "not applied".into() },
            c.line_drawn_mm,
            c.line_on_mask_mm,
            c.space_drawn_mm,
            c.space_on_mask_mm,
            c.process_limit_mm,
            p.plate_size_mm[0],
            p.plate_size_mm[1],
            p.glass_box_in_structure_mm[0],
            p.glass_box_in_structure_mm[1],
            p.glass_box_in_structure_mm[2],
            p.glass_box_in_structure_mm[3],
        ));
    }
    if let Some(p) = &o.panel {
        s.push_str(&format!(
            "\npanel: {} rows x {} columns on a {} x {} mm substrate, cell pitch {} x {} mm, spacing {} mm, scribe lane {} mm\n  \
             GDSII: {} structures {} and {}\n  Gerber: {}, {}\n  films: {}, {}, {}\n  cut lines: {} (mm)\n  reading: {}\n  cell origins (mm):",
            p.rows, p.columns, p.substrate_mm[0], p.substrate_mm[1], p.cell_pitch_mm[0], p.cell_pitch_mm[1], p.spacing_mm,
            p.scribe_lane_mm, p.gdsii_file, p.gdsii_structures[0], p.gdsii_structures[1], p.gerber_files[0], p.gerber_files[1],
            p.film_svgs[0], p.film_svgs[1], p.film_pdf, p.cut_lines_dxf, p.reading,
        ));
        for c in &p.cell_origins_mm {
            s.push_str(&format!(" ({}, {})", c[0], c[1]));
        }
        s.push('\n');
    }
    s.push('\n');
    for n in &o.notes {
        s.push_str(&format!("- {n}\n"));
    }
    s.into_bytes()
}
