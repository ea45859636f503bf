//! Stage `spec`: layout file text → resolved [`Layout`].
//!
//! Takes YAML (our own format, docs/layout-format.md), gives a `Layout` with every unit
//! resolved to mm and every default filled in, or every problem found, each with file,
//! line, key path, what is wrong and what is allowed.
//!
//! Steps: `locate` maps key paths to lines; serde reads the text into the `raw` structs
//! (syntax errors, unknown keys and wrong shapes stop here, with serde's line and
//! column); `resolve` and `elements` read every value, collecting all problems; `nets`,
//! `fit` and `placement` check how the parts go together, skipping checks whose inputs
//! were already found bad so that one mistake gives one message.

mod bar_cells;
mod bars;
mod cell;
mod elements;
mod fit;
mod gauges;
pub mod input;
pub mod limits;
mod locate;
mod mark_fit;
mod nets;
mod panel;
mod placement;
mod problems;
mod raw;
mod read;
mod resolve;
mod scalar;
mod schema;
mod starter;
pub mod units;

#[cfg(test)]
mod tests;

pub use fit::{ledge_depth, liquid_crystal_region};
pub use mark_fit::{has_mark_room, mark_room};
pub use locate::{key_lines, line_of};
pub use schema::layout_schema;
pub use starter::{StarterDrive, starter_layout};
pub use nets::{NetSource, common_nets, digit_segments, element_nets, pads_needed};
pub use placement::{POINT_ROOM_STROKES, digit_cell};

use crate::error::InputProblem;
use crate::layout::Layout;
use crate::{Error, Result};
use problems::Problems;
use std::path::Path;

/// Where input files may come from.
#[derive(Debug, Clone, Default)]
pub struct InputOptions {
    /// Folders font files may come from besides the layout's own folder (and the
    /// folders below it).
    pub font_dirs: Vec<std::path::PathBuf>,
}

/// Reads and resolves a layout file; fonts only from the layout's folder.
pub fn load_layout(path: &Path) -> Result<Layout> {
    load_layout_with(path, &InputOptions::default())
}

/// Reads and resolves a layout file with the given input options.
pub fn load_layout_with(path: &Path, opts: &InputOptions) -> Result<Layout> {
    let text = input::read_text(path, limits::MAX_LAYOUT_BYTES, "layout file").map_err(|e| match e {
        input::ReadProblem::Io(e) => crate::Error::io(path, e),
        input::ReadProblem::Bad { line, column, message, allowed } => Error::input(InputProblem {
            file: path.to_path_buf(),
            line,
            column,
            key: String::new(),
            message: format!("the layout file {message}"),
            allowed: Some(allowed),
        }),
    })?;
    parse_layout_with(&text, path, opts)
}

/// Resolves layout text; `path` is used for messages and for relative font files.
pub fn parse_layout(text: &str, path: &Path) -> Result<Layout> {
    parse_layout_with(text, path, &InputOptions::default())
}

/// [`parse_layout`] with the given input options.
pub fn parse_layout_with(text: &str, path: &Path, opts: &InputOptions) -> Result<Layout> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    if text.len() as u64 > limits::MAX_LAYOUT_BYTES {
        return Err(Error::input(InputProblem {
            file: path.to_path_buf(),
            line: None,
            column: None,
            key: String::new(),
            message: format!("the layout is {} bytes, larger than a layout file may be", text.len()),
            allowed: Some(format!("at most {} bytes", limits::MAX_LAYOUT_BYTES)),
        }));
    }
    if text.lines().all(|l| l.trim().is_empty() || l.trim_start().starts_with('#')) {
        return Err(Error::input(InputProblem {
            file: path.to_path_buf(),
            line: None,
            column: None,
            key: String::new(),
            message: "the layout file is empty".into(),
            allowed: Some("a layout mapping (see docs/layout-format.md)".into()),
        }));
    }
    if let Some((line, column)) = limits::too_deep(text) {
        return Err(Error::input(InputProblem {
            file: path.to_path_buf(),
            line: Some(line),
            column: Some(column),
            key: String::new(),
            message: format!("lists and mappings nest deeper than {} levels here", limits::MAX_DEPTH),
            allowed: Some(format!("at most {} levels (a layout needs five)", limits::MAX_DEPTH)),
        }));
    }
    let (lines, repeats) = locate::key_lines_and_repeats(text);
    let raw: raw::RawLayout = serde_yaml::from_str(text)
        .map_err(|e| Error::input(problems::from_yaml_error(path, text, &e, &repeats)))?;
    let mut p = Problems::new(path, lines, repeats);
    if !limits::counts(&mut p, &raw) {
        return Err(Error::Input(p.into_sorted()));
    }
    let layout = resolve_all(&mut p, &raw, path, opts);
    limits::grid(&mut p, &layout);
    if nets::nets_clean(&p, &layout) {
        limits::pads(&mut p, &layout);
    }
    if nets::nets_clean(&p, &layout) {
        nets::check_unique(&mut p, &layout);
        nets::check_fixed_pins(&mut p, &layout);
        nets::check_buses(&mut p, &layout);
        nets::check_fixed_lines(&mut p, &layout);
    }
    fit::check_fit(&mut p, &layout);
    placement::check_placement(&mut p, &layout);
    if p.is_empty() { Ok(layout) } else { Err(Error::Input(p.into_sorted())) }
}

/// Reads every part of the raw layout, in the order their defaults depend on each other.
fn resolve_all(p: &mut Problems, raw: &raw::RawLayout, path: &Path, opts: &InputOptions) -> Layout {
    let name = resolve::name(p, raw.name.as_ref());
    let glass = resolve::glass(p, raw.glass.as_ref());
    let window = resolve::window(p, raw.window.as_ref());
    let cell_gap = resolve::cell_gap(p, raw.cell_gap.as_ref());
    let tolerance = resolve::tolerance(p, raw.tolerance.as_ref());
    let mut masks = resolve::masks(p, raw.masks.as_ref());
    let rules = resolve::rules(p, raw.rules.as_ref(), masks.process);
    masks.panel = raw.panel.as_ref().and_then(|r| panel::panel(p, r, &glass, &rules));
    let pads = resolve::pads(p, raw.pads.as_ref());
    let seal = resolve::seal(p, raw.seal.as_ref(), &pads, &glass.back);
    let drive = resolve::drive(p, raw.drive.as_ref());
    let digits = elements::digit_groups(p, raw.digits.as_deref().unwrap_or(&[]), &rules, drive.commons);
    let legends = elements::legends(p, raw.legends.as_deref().unwrap_or(&[]));
    let extra_fonts = resolve::fonts(p, raw.fonts.as_ref(), path, &opts.font_dirs);
    let icons = elements::icons(p, raw.icons.as_deref().unwrap_or(&[]), &gauges::icon_names(&extra_fonts));
    let bars = bars::bars(p, raw.bars.as_deref().unwrap_or(&[]), &rules);
    let buses = elements::buses(p, raw.buses.as_deref().unwrap_or(&[]), &rules);
    Layout {
        name,
        source: path.to_path_buf(),
        glass,
        window,
        cell_gap,
        resist: resolve::resist(p, raw.resist.as_ref()),
        transfer: resolve::transfer(p, raw.transfer_dots.as_ref()),
        drive,
        fixed_lines: resolve::fixed_lines(p, raw.drive.as_ref()),
        marks: resolve::marks(p, raw.marks.as_ref(), &rules),
        layers: resolve::layers(p, raw.gds_layers.as_ref()),
        extra_fonts,
        rules,
        masks,
        seal,
        pads,
        digits,
        legends,
        icons,
        bars,
        buses,
        tolerance,
        cell: cell::cell(p, raw, cell_gap),
        key_lines: p.lines().clone(),
    }
}
