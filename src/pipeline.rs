//! Runs the stages in order: layout file → `Artwork` and its findings.

use crate::artwork::Artwork;
use crate::finding::Finding;
use crate::layout::Layout;
use crate::Result;
use std::path::Path;
use std::time::Instant;

/// Everything one run produces before writing.
#[derive(Debug)]
pub struct Built {
    /// The resolved layout.
    pub layout: Layout,
    /// The artwork of both plates.
    pub artwork: Artwork,
    /// Generation, check and plan findings together.
    pub findings: Vec<Finding>,
    /// The electrical and optical plan.
    pub plan: crate::plan::Plan,
    /// Wall-clock time of each stage, in pipeline order.
    pub timings: Vec<(&'static str, std::time::Duration)>,
    /// Key path of the layout entry each element comes from, by element name (`D1.a` →
    /// `digits[0]`), so a finding can name the layout lines it concerns.
    pub element_keys: std::collections::BTreeMap<String, String>,
}

/// Reads, resolves, builds and checks a layout.
pub fn build_layout_file(path: &Path) -> Result<Built> {
    build_layout_file_with(path, &crate::spec::InputOptions::default())
}

/// [`build_layout_file`] with the given input options.
pub fn build_layout_file_with(path: &Path, opts: &crate::spec::InputOptions) -> Result<Built> {
    let start = Instant::now();
    let layout = crate::spec::load_layout_with(path, opts)?;
    let spec_time = start.elapsed();
    let mut built = build_layout(layout)?;
    built.timings.insert(0, ("spec", spec_time));
    Ok(built)
}

/// Builds and checks an already resolved layout.
pub fn build_layout(layout: Layout) -> Result<Built> {
    let mut timings = Vec::new();
    let mut t = Instant::now();
    // A stage's lap runs from the end of the one before to `until` (now when `None`).
    let mut lap = |name: &'static str, t: &mut Instant, until: Option<Instant>| {
        let end = until.unwrap_or_else(Instant::now);
        timings.push((name, end.duration_since(*t)));
        *t = end;
    };
    let elements = crate::glyph::build_elements(&layout)?;
    let element_keys = elements.iter().map(|e| (e.name.clone(), e.key.clone())).collect();
    lap("glyph", &mut t, None);
    let assignment = crate::assign::assign(&layout, &elements)?;
    lap("assign", &mut t, None);
    let electrodes = crate::electrode::build_electrodes(&layout, &elements, &assignment)?;
    lap("electrode", &mut t, None);
    let routes = crate::route::route_leads(&layout, &electrodes)?;
    let routed = crate::pipeline_moves::Routed { layout, assignment, electrodes, routes };
    let crate::pipeline_moves::Routed { layout, electrodes, routes, .. } = crate::pipeline_moves::move_cut_off(routed, &elements)?;
    // The routing grids' and searches' pages are small blocks scattered through the
    // heap, and the stages after routing allocated on top of them: the two-row benchmark
    // held 114 MB after routing of which 19 MB were live, and its peak came in the check
    // and plan stages (136–141 MiB; 126 MiB with this, the route stage's own peak).
    crate::memory::release_freed();
    lap("route", &mut t, None);
    let artwork = crate::plate::build_artwork(&layout, &electrodes, &routes)?;
    lap("plate", &mut t, None);
    let ex = crate::check::Extraction::extract(&artwork);
    // The plan reads the artwork and its connectivity, as the rules do, and nothing the
    // rules give: it runs beside them (rayon), on the core the longest rule leaves idle. The check's lap ends when its rules are done; the plan's lap is what
    // it takes after that, so the laps still add up to the time of the build.
    let check = || {
        (crate::check::build_findings(&artwork, &ex), Instant::now())
    };
    let ((mut findings, check_done), plan) = rayon::join(check, || crate::plan::plan(&artwork, &ex));
    lap("check", &mut t, Some(check_done));
    findings.extend(crate::plan::findings(&artwork, &plan));
    lap("plan", &mut t, None);
    Ok(Built { layout, artwork, findings, plan, timings, element_keys })
}
