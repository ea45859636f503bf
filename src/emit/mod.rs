//! Stage `emit`: `Artwork` + findings → output files.
//!
//! Takes the artwork and the findings, gives the bytes of every output file (films,
//! preview, GDSII, pin map, segment map, report) and writes them atomically. Writers never compute
//! geometry; they transform coordinates (mirror, flip y, snap) and nothing else — the
//! one exception is cutting polygons into hole-free GDSII pieces ([`split`]), which the
//! format demands. docs/outputs.md describes every file.

mod csv;
mod drive_info;
mod files;
mod film;
pub mod firmware_c;
mod firmware_json;
pub mod gds;
mod gdsii;
mod page;
mod pins;
mod preview;
mod report;
mod ruler;
pub mod segmap;
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
}

/// Renders every output of a build, in this order: `NAME.front.svg`, `NAME.back.svg`,
/// `NAME.preview.svg`, `NAME.gds`, `NAME.pins.csv`, `NAME.segmap.csv`,
/// `NAME.segmap.json`, `NAME.firmware.h`, `NAME.firmware.json`, `NAME.report.json`.
///
/// While any finding is an error and `masks_despite_errors` is off, the mask files
/// (films and GDSII) are withheld and only preview, pin map, segment map and report are
/// given.
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
    let date = gds::parse_date(&opts.date).ok_or_else(|| bad_date(&opts.date))?;
    let errors = crate::finding::count(findings, Severity::Error);
    let masks = errors == 0 || opts.masks_despite_errors;
    let name = file_stem(&art.name);
    let file = |suffix: &str, bytes| OutputFile { name: format!("{name}.{suffix}"), bytes };
    let mut out = Vec::new();
    if masks {
        out.push(file("front.svg", film::render_film(art, PlateId::Front, &opts.date, errors)?));
        out.push(file("back.svg", film::render_film(art, PlateId::Back, &opts.date, errors)?));
    }
    out.push(file("preview.svg", preview::render_preview(art, findings)?));
    if masks {
        out.push(file("gds", gdsii::render_gds(art, date)?));
    }
    out.push(file("pins.csv", pins::render_pins(art)));
    let rows = segmap::segment_rows(art);
    out.push(file("segmap.csv", segmap::csv_of(&rows)));
    out.push(file("segmap.json", segmap::json_of(art, rows.clone())?));
    out.push(file("firmware.h", firmware_c::render_firmware_header(art)));
    out.push(file("firmware.json", firmware_json::render_firmware_json(art)?));
    out.push(file("report.json", report::render_report(art, findings, rows, plan)?));
    Ok(out)
}

/// True when `render_outputs` would withhold the mask files for these findings.
pub fn masks_withheld(findings: &[Finding], opts: &EmitOptions) -> bool {
    !opts.masks_despite_errors && findings.iter().any(|f| f.severity == Severity::Error)
}

/// Writes files into `dir` (created if needed), each through a temporary file
/// (`.NAME.tmp-PID`) renamed into place once all are written, so no half-written file
/// is ever left; on failure the temporaries are removed and the error names the path.
pub fn write_atomically(dir: &Path, files: &[OutputFile]) -> Result<()> {
    files::write_files(dir, files)
}

/// The input problem of a date that is not `YYYY-MM-DD`.
fn bad_date(date: &str) -> Error {
    Error::input(InputProblem {
        file: "command line".into(),
        line: None,
        column: None,
        key: "--date".into(),
        message: format!("`{date}` is not a calendar date"),
        allowed: Some("YYYY-MM-DD, for example 2025-03-14".into()),
    })
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
