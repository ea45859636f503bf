//! Stage `emit`: `Artwork` + findings → output files.
//!
//! Takes the artwork and the findings, gives the bytes of every output file (films as
//! SVG, PDF and PNG, the print sheet, Gerber, preview, GDSII, the mask order, the panel's
//! files and its cut lines as DXF, pin map, segment map, report) and writes them as one
//! set (`files.rs`). Every output is one row of [`OUTPUTS`]: its file suffix, whether it
//! is a mask (withheld while rule errors stand, decided once in [`render_outputs`]),
//! whether it belongs to a panel (written only when the layout has one) and its writer.
//! What a mask carries — mirrored or not, compensated
//! or not — is decided once in [`mask`] for every mask writer. Writers never compute
//! geometry; they transform coordinates (mirror, flip y, snap) and nothing else — the one
//! exception is cutting polygons into hole-free pieces ([`split`]), which GDSII and Gerber
//! regions demand. docs/outputs.md describes every file.

pub mod check_json;
mod csv;
pub mod drawing;
mod drive_info;
mod dxf;
mod fault;
mod files;
pub mod film;
pub mod firmware_c;
mod firmware_json;
pub mod gds;
mod gdsii;
mod gerber;
mod lock;
pub mod mask;
mod order;
mod page;
pub mod panel;
pub mod pdf;
pub mod png;
mod pins;
mod preview;
mod report;
mod ruler;
pub mod segmap;
pub mod sheet;
pub mod show_svg;
mod split;
pub mod svg_path;
pub mod text;

pub use split::MAX_POINTS as MAX_BOUNDARY_POINTS;

use crate::artwork::{Artwork, Layer};
use crate::error::InputProblem;
use crate::finding::{Finding, Severity};
use crate::geom::Polygon;
use crate::layout::PlateId;
use crate::{Error, Result};
use std::path::Path;

/// One output file, in memory.
#[derive(Debug, Clone)]
pub struct OutputFile {
    /// File name (no directory).
    pub name: String,
    /// Contents.
    pub bytes: Vec<u8>,
}

/// Options for writing.
#[derive(Debug, Clone)]
pub struct EmitOptions {
    /// Date printed on films and stored in GDSII, `YYYY-MM-DD`.
    pub date: String,
    /// Write films and GDSII even though findings include errors.
    pub masks_despite_errors: bool,
    /// Resolution of the PNG films, dots per inch.
    pub png_dpi: f32,
}

/// Resolution of the PNG films when none is asked for, dots per inch: a common laser
/// printer's (*common practice*), and small enough to write quickly.
pub const DEFAULT_PNG_DPI: f32 = 600.0;

/// Everything a writer may read: the artwork, the findings and the build date.
pub struct Ctx<'a> {
    /// The artwork.
    pub art: &'a Artwork,
    /// Every finding.
    pub findings: &'a [Finding],
    /// Build date as given, `YYYY-MM-DD`.
    pub date: &'a str,
    /// The same date at midnight.
    pub datetime: chrono::NaiveDateTime,
    /// Rule errors standing (printed on films made despite them).
    pub errors: usize,
    /// The electrical and optical plan (for the report).
    pub plan: &'a crate::plan::Plan,
    /// Resolution of the PNG films, dots per inch.
    pub png_dpi: f32,
    /// The segment map's rows, measured once for the segment map and the report.
    pub rows: std::sync::OnceLock<Vec<segmap::SegmentRow>>,
    /// Per plate, the boundary rings of its etched polygons as drawn, made once for the
    /// GDSII file and the Gerber files ([`Ctx::drawn_rings`]).
    pub drawn: [std::sync::OnceLock<Option<DrawnRings>>; 2],
}

/// A plate's etched polygons as drawn (unmirrored, uncompensated), each cut into
/// hole-free boundary rings below the point limit ([`split::boundary_rings`]), in the
/// order of [`mask::etched_layers`] and of the artwork's shapes on each layer.
pub type DrawnRings = [Vec<Vec<split::NmRing>>; 2];

impl Ctx<'_> {
    /// The segment map's rows ([`segmap::segment_rows`], made on first use).
    pub fn segment_rows(&self) -> Vec<segmap::SegmentRow> {
        self.rows.get_or_init(|| segmap::segment_rows(self.art)).clone()
    }

    /// The rings of `plate`'s etched polygons as drawn, made on first use: cutting a
    /// common with hundreds of holes into hole-free pieces was done for the plate's
    /// GDSII structure, its GDSII mask structure and its Gerber file, once each. `None`
    /// when a polygon cannot be cut (each writer then cuts its own and reports why).
    pub fn drawn_rings(&self, plate: PlateId) -> Option<&DrawnRings> {
        let slot = match plate {
            PlateId::Front => 0,
            PlateId::Back => 1,
        };
        self.drawn[slot]
            .get_or_init(|| {
                let [a, b] = mask::etched_layers(plate)
                    .map(|l| self.art.on_layer(l).map(|s| split::boundary_rings(&s.polygon).ok()).collect::<Option<Vec<_>>>());
                Some([a?, b?])
            })
            .as_ref()
    }
}

/// One output file: its suffix after `NAME.`, whether it is a mask (something a plate is
/// made from, withheld while rule errors stand), and its writer.
pub struct Output {
    /// File-name suffix after `NAME.`.
    pub suffix: &'static str,
    /// True for the files plates are made from.
    pub mask: bool,
    /// True for the files of a panel, written only when the layout has `panel:`.
    pub panel: bool,
    /// The writer.
    pub render: fn(&Ctx) -> Result<Vec<u8>>,
}

/// The date as (year, month, day).
fn ymd(c: &Ctx) -> (i32, u32, u32) {
    use chrono::Datelike;
    (c.datetime.year(), c.datetime.month(), c.datetime.day())
}

/// Both plates' film drawings.
fn films(c: &Ctx) -> Result<Vec<drawing::Drawing>> {
    [PlateId::Front, PlateId::Back].into_iter().map(|p| film::film_drawing(c.art, p, c.date, c.errors)).collect()
}

/// Every output, in the order they are rendered and listed.
pub const OUTPUTS: &[Output] = &[
    Output { suffix: "front.svg", mask: true, panel: false, render: |c| film::render_film(c.art, PlateId::Front, c.date, c.errors) },
    Output { suffix: "back.svg", mask: true, panel: false, render: |c| film::render_film(c.art, PlateId::Back, c.date, c.errors) },
    Output { suffix: "front.png", mask: true, panel: false, render: |c| png::film_png(&film::film_drawing(c.art, PlateId::Front, c.date, c.errors)?, c.png_dpi) },
    Output { suffix: "back.png", mask: true, panel: false, render: |c| png::film_png(&film::film_drawing(c.art, PlateId::Back, c.date, c.errors)?, c.png_dpi) },
    Output {
        suffix: "films.pdf",
        mask: true,
        panel: false,
        render: |c| Ok(pdf::pdf_bytes(&films(c)?, &format!("{} films", c.art.name), ymd(c))),
    },
    Output {
        suffix: "sheet.pdf",
        mask: true,
        panel: false,
        render: |c| {
            let pages = sheet::sheet_pages(&films(c)?, c.art.masks.sheet, c.art.masks.copies, &c.art.name);
            Ok(pdf::pdf_bytes(&pages, &format!("{} print sheet", c.art.name), ymd(c)))
        },
    },
    Output { suffix: "front.gbr", mask: true, panel: false, render: |c| gerber::render_gerber(c.art, PlateId::Front, c.datetime, c.drawn_rings(PlateId::Front)) },
    Output { suffix: "back.gbr", mask: true, panel: false, render: |c| gerber::render_gerber(c.art, PlateId::Back, c.datetime, c.drawn_rings(PlateId::Back)) },
    Output { suffix: "preview.svg", mask: false, panel: false, render: |c| preview::render_preview(c.art, c.findings) },
    Output { suffix: "gds", mask: true, panel: false, render: |c| gdsii::render_gds(c.art, c.datetime, [c.drawn_rings(PlateId::Front), c.drawn_rings(PlateId::Back)]) },
    Output { suffix: "masks.json", mask: true, panel: false, render: |c| order::render_order_json(c.art, c.date) },
    Output { suffix: "masks.txt", mask: true, panel: false, render: |c| Ok(order::render_order_text(c.art, c.date)) },
    Output { suffix: "pins.csv", mask: false, panel: false, render: |c| Ok(pins::render_pins(c.art)) },
    Output { suffix: "segmap.csv", mask: false, panel: false, render: |c| Ok(segmap::csv_of(&c.segment_rows())) },
    Output { suffix: "segmap.json", mask: false, panel: false, render: |c| segmap::json_of(c.art, c.segment_rows()) },
    Output { suffix: "firmware.h", mask: false, panel: false, render: |c| Ok(firmware_c::render_firmware_header(c.art)) },
    Output { suffix: "firmware.json", mask: false, panel: false, render: |c| firmware_json::render_firmware_json(c.art) },
    Output { suffix: "panel.front.svg", mask: true, panel: true, render: |c| Ok(drawing::svg_bytes(&panel::panel_film(c.art, PlateId::Front, c.date, c.errors)?)) },
    Output { suffix: "panel.back.svg", mask: true, panel: true, render: |c| Ok(drawing::svg_bytes(&panel::panel_film(c.art, PlateId::Back, c.date, c.errors)?)) },
    Output {
        suffix: "panel.pdf",
        mask: true,
        panel: true,
        render: |c| Ok(pdf::pdf_bytes(&panel::panel_films(c.art, c.date, c.errors)?, &format!("{} panel films", c.art.name), ymd(c))),
    },
    Output { suffix: "panel.front.gbr", mask: true, panel: true, render: |c| panel::panel_gerber(c.art, PlateId::Front, c.datetime) },
    Output { suffix: "panel.back.gbr", mask: true, panel: true, render: |c| panel::panel_gerber(c.art, PlateId::Back, c.datetime) },
    Output { suffix: "panel.gds", mask: true, panel: true, render: |c| panel::panel_gds(c.art, c.datetime) },
    Output { suffix: "panel.cuts.dxf", mask: true, panel: true, render: |c| dxf::render_cuts_dxf(c.art, c.datetime) },
    Output {
        suffix: "report.json",
        mask: false,
        panel: false,
        render: |c| report::render_report(c.art, c.findings, c.segment_rows(), c.plan),
    },
];

/// Renders every output of a build, in the order of [`OUTPUTS`].
///
/// While any finding is an error and `masks_despite_errors` is off, the mask files
/// (films, print sheet, Gerber, GDSII, mask order) are withheld and only preview, pin map,
/// segment map and report are given.
///
/// The report's plan is worked out here from the artwork; [`render_outputs_planned`]
/// takes one already made (the pipeline's).
pub fn render_outputs(art: &Artwork, findings: &[Finding], opts: &EmitOptions) -> Result<Vec<OutputFile>> {
    render_outputs_planned(art, findings, &crate::plan::plan_artwork(art), opts)
}

/// [`render_outputs`] with the plan already made.
pub fn render_outputs_planned(
    art: &Artwork,
    findings: &[Finding],
    plan: &crate::plan::Plan,
    opts: &EmitOptions,
) -> Result<Vec<OutputFile>> {
    let datetime = gds::parse_date(&opts.date).ok_or_else(|| bad_date(&opts.date))?;
    let errors = crate::finding::count(findings, Severity::Error);
    let masks = errors == 0 || opts.masks_despite_errors;
    let name = file_stem(&art.name);
    let ctx = Ctx { art, findings, date: &opts.date, datetime, errors, plan, png_dpi: opts.png_dpi, rows: Default::default(), drawn: Default::default() };
    // Each output is rendered on its own (rayon spreads them over the cores); collected in
    // the table's order, and the first failure in that order is the one reported, so the
    // files and messages are the same as one after another.
    use rayon::prelude::*;
    let chosen: Vec<&Output> = OUTPUTS.iter().filter(|o| (masks || !o.mask) && (!o.panel || art.panel.is_some())).collect();
    let rendered: Vec<Result<OutputFile>> =
        chosen.par_iter().map(|o| Ok(OutputFile { name: format!("{name}.{}", o.suffix), bytes: (o.render)(&ctx)? })).collect();
    rendered.into_iter().collect()
}

/// True when `render_outputs` would withhold the mask files for these findings.
pub fn masks_withheld(findings: &[Finding], opts: &EmitOptions) -> bool {
    !opts.masks_despite_errors && findings.iter().any(|f| f.severity == Severity::Error)
}

pub use files::WriteOptions;

/// Writes files into `dir` (created if needed) as one set, replacing files of the same
/// names and keeping every other file (`files.rs`: staged in a fresh folder beside
/// `dir` and swapped in, so any failure or kill leaves the old folder or the new one).
pub fn write_atomically(dir: &Path, files: &[OutputFile]) -> Result<()> {
    files::write_set(dir, files, &|_| false, &WriteOptions::default())
}

/// Writes the outputs of one build of the layout whose file stem is `stem` into `dir`
/// as one set: every file of an earlier build of that stem (any suffix of [`OUTPUTS`])
/// goes, so that masks withheld this time do not stay behind from an older design;
/// other files (`show` drawings, the user's) are kept.
pub fn write_build_set(dir: &Path, stem: &str, files: &[OutputFile], opts: &WriteOptions) -> Result<()> {
    let ours = |name: &str| OUTPUTS.iter().any(|o| name.strip_prefix(stem).and_then(|r| r.strip_prefix('.')) == Some(o.suffix));
    files::write_set(dir, files, &ours, opts)
}

/// Writes `files` into `dir` as one set, replacing files of the same names and keeping
/// every other file, with the given options.
pub fn write_set(dir: &Path, files: &[OutputFile], opts: &WriteOptions) -> Result<()> {
    files::write_set(dir, files, &|_| false, opts)
}

/// Checks a `--date` before any work: `YYYY-MM-DD`, a real calendar day.
pub fn check_date(date: &str) -> Result<()> {
    gds::parse_date(date).map(|_| ()).ok_or_else(|| bad_date(date))
}

/// The input problem of a date that is not `YYYY-MM-DD`.
fn bad_date(date: &str) -> Error {
    Error::input(InputProblem::on_command_line(
        "--date",
        format!("`{date}` is not a calendar date"),
        "YYYY-MM-DD, for example 2025-03-14",
    ))
}

/// The layout name made safe as a file-name stem: path separators, control characters
/// and a leading dot are replaced by `_`.
pub fn file_stem(name: &str) -> String {
    let s: String = name.chars().map(|c| if c == '/' || c == '\\' || c.is_control() { '_' } else { c }).collect();
    let s = s.trim().to_string();
    match s.strip_prefix('.') {
        Some(rest) => format!("_{rest}"),
        None if s.is_empty() => "layout".into(),
        None => s,
    }
}

/// The polygons drawn on a layer: its shapes, or — for the glass, window and transfer-dot
/// layers, when the artwork holds no shape there — the outline the artwork keeps beside
/// the shapes (`front_glass`, `back_glass`, `window`, `transfer_dots`).
pub(crate) fn layer_polygons(art: &Artwork, layer: Layer) -> Vec<&Polygon> {
    let shapes: Vec<&Polygon> = art.on_layer(layer).map(|s| &s.polygon).collect();
    if !shapes.is_empty() {
        return shapes;
    }
    match layer {
        Layer::FrontGlass => vec![&art.front_glass],
        Layer::BackGlass => vec![&art.back_glass],
        Layer::Window => vec![&art.window],
        Layer::TransferDots => art.transfer_dots.iter().map(|t| &t.dot).collect(),
        _ => shapes,
    }
}

/// Formats a finding like a compiler diagnostic:
/// `layout.yaml: error[gap]: front plate, D1.a / D1.b: gap 0.031 mm < 0.050 mm at (12.400, 8.100) mm`.
pub fn diagnostic(layout: &Path, f: &Finding) -> String {
    let mut s = format!("{}: {}[{}]: {}", layout.display(), f.severity.name(), f.rule.code(), f.message);
    if let Some(p) = f.plate {
        s.push_str(&format!("\n  plate: {}", p.name()));
    }
    if !f.nets.is_empty() {
        s.push_str(&format!("\n  nets: {}", f.nets.join(", ")));
    }
    s.push_str(&format!("\n  at: ({:.3}, {:.3}) mm", f.location.x, f.location.y));
    if let (Some(m), Some(r)) = (f.measured, f.required) {
        s.push_str(&format!("\n  measured {m:.4}, required {r:.4}, short by {:.4}", r - m));
    }
    s
}
