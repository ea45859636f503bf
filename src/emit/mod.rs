//! Stage `emit`: `Artwork` + findings → output files.
//!
//! Takes the artwork and the findings, gives the bytes of every output file (films,
//! preview, GDSII, pin map, report) and writes them atomically. Writers never compute
//! geometry; they transform coordinates (mirror, flip y, snap) and nothing else.

use crate::artwork::Artwork;
use crate::finding::Finding;
use crate::Result;
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

/// Renders every output of a build.
pub fn render_outputs(_art: &Artwork, _findings: &[Finding], _opts: &EmitOptions) -> Result<Vec<OutputFile>> {
    Err(crate::Error::Bug("emit stage not written yet".into()))
}

/// Writes files into `dir` (created if needed), each through a temporary file renamed
/// into place, so no half-written file is ever left.
pub fn write_atomically(_dir: &Path, _files: &[OutputFile]) -> Result<()> {
    Err(crate::Error::Bug("emit stage not written yet".into()))
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
