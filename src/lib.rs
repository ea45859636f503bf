//! segmask turns a YAML description of a custom segment liquid-crystal display into the
//! ITO electrode patterns of both glass plates, checks them against the design rules and
//! writes exact-scale SVG films, GDSII and the pin map.
//!
//! The library is a pipeline of plain data (docs/architecture.md):
//!
//! ```text
//! layout.yaml ─spec→ Layout ─glyph→ Elements ─electrode→ Electrodes ─route→ Routes
//!             ─plate→ Artwork ─check→ Findings ─emit→ files
//! ```
//!
//! Dependencies point one way: `layout`, `artwork`, `finding` and `error` are the data
//! contracts; `geom` wraps the geometry crates; each stage only uses earlier ones.

pub mod artwork;
pub mod assign;
pub mod check;
pub mod drive;
pub mod electrode;
pub mod emit;
pub mod error;
pub mod finding;
pub mod finding_lines;
pub mod firmware;
pub mod geom;
pub mod glyph;
pub mod layout;
pub mod memory;
pub mod pipeline;
pub mod pipeline_moves;
pub mod plan;
pub mod plate;
pub mod route;
pub mod show;
pub mod spec;

pub use error::{Error, Result};
