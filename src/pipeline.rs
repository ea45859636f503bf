//! Runs the stages in order: layout file → `Artwork` and its findings.

use crate::artwork::Artwork;
use crate::finding::Finding;
use crate::layout::Layout;
use crate::Result;
use std::path::Path;

/// Everything one run produces before writing.
#[derive(Debug)]
pub struct Built {
    /// The resolved layout.
    pub layout: Layout,
    /// The artwork of both plates.
    pub artwork: Artwork,
    /// Generation and check findings together.
    pub findings: Vec<Finding>,
}

/// Reads, resolves, builds and checks a layout.
pub fn build_layout_file(path: &Path) -> Result<Built> {
    let layout = crate::spec::load_layout(path)?;
    build_layout(layout)
}

/// Builds and checks an already resolved layout.
pub fn build_layout(layout: Layout) -> Result<Built> {
    let elements = crate::glyph::build_elements(&layout)?;
    let electrodes = crate::electrode::build_electrodes(&layout, &elements)?;
    let routes = crate::route::route_leads(&layout, &electrodes)?;
    let artwork = crate::plate::build_artwork(&layout, &electrodes, &routes)?;
    let mut findings = artwork.generation_findings.clone();
    findings.extend(crate::check::check_artwork(&artwork));
    Ok(Built { layout, artwork, findings })
}
