//! Runs the library pipeline on one layout file K times: file → stage times (min and
//! median over the runs) and what was built (elements, nets, pins, findings).
//!
//! Each run is `segmask::pipeline::build_layout_file` (spec, glyph, electrode, route,
//! plate, check, plan, timed by the pipeline itself) followed by
//! `segmask::emit::render_outputs_planned` with the build's plan, as `segmask build` does,
//! into memory (timed here as `emit`); nothing is written.

use segmask::finding::Severity;
use std::path::Path;
use std::time::{Duration, Instant};

/// Times of one stage over all runs.
#[derive(Debug, Clone)]
pub struct StageTimes {
    /// Stage name, as the pipeline names it.
    pub stage: &'static str,
    /// One time per run.
    pub runs: Vec<Duration>,
}

impl StageTimes {
    /// Shortest run.
    pub fn min(&self) -> Duration {
        self.runs.iter().copied().min().unwrap_or_default()
    }

    /// Median run (the mean of the middle two for an even count).
    pub fn median(&self) -> Duration {
        median(&self.runs)
    }
}

/// The median of some durations (zero for none).
pub fn median(runs: &[Duration]) -> Duration {
    let mut v = runs.to_vec();
    v.sort();
    match v.len() {
        0 => Duration::ZERO,
        n if n % 2 == 1 => v[n / 2],
        n => (v[n / 2 - 1] + v[n / 2]) / 2,
    }
}

/// What the last run built.
#[derive(Debug, Clone, Copy, Default)]
pub struct Counts {
    /// Switchable elements (segments, points, icons).
    pub elements: usize,
    /// Nets in the artwork (SEG and COM).
    pub nets: usize,
    /// Pins on the pad row.
    pub pins: usize,
    /// Polygons in the artwork.
    pub shapes: usize,
    /// Routing grid cells (front glass area over the grid step squared).
    pub grid_cells: u64,
    /// Error findings.
    pub errors: usize,
    /// Warning findings.
    pub warnings: usize,
    /// All findings.
    pub findings: usize,
}

/// Stage times and counts of `repeat` runs.
#[derive(Debug, Clone)]
pub struct Measured {
    /// Per stage, in pipeline order, `emit` last.
    pub stages: Vec<StageTimes>,
    /// Total of each run.
    pub totals: Vec<Duration>,
    /// What was built.
    pub counts: Counts,
}

/// Builds `layout` `repeat` times (at least once) and collects the times.
pub fn measure(layout: &Path, repeat: u32) -> segmask::Result<Measured> {
    let opts = segmask::emit::EmitOptions { date: "2000-01-01".into(), masks_despite_errors: true, png_dpi: segmask::emit::DEFAULT_PNG_DPI };
    let mut stages: Vec<StageTimes> = Vec::new();
    let mut totals = Vec::new();
    let mut counts = Counts::default();
    for _ in 0..repeat.max(1) {
        let built = segmask::pipeline::build_layout_file(layout)?;
        let t = Instant::now();
        let files = segmask::emit::render_outputs_planned(&built.artwork, &built.findings, &built.plan, &opts)?;
        let emit = t.elapsed();
        std::hint::black_box(&files);
        let mut run = built.timings.clone();
        run.push(("emit", emit));
        for (i, (stage, d)) in run.iter().enumerate() {
            match stages.get_mut(i) {
                Some(s) => s.runs.push(*d),
                None => stages.push(StageTimes { stage, runs: vec![*d] }),
            }
        }
        totals.push(run.iter().map(|(_, d)| *d).sum());
        counts = count(&built);
    }
    Ok(Measured { stages, totals, counts })
}

fn count(b: &segmask::pipeline::Built) -> Counts {
    let art = &b.artwork;
    let h = segmask::route::grid_step(&b.layout);
    let g = &b.layout.glass.front;
    Counts {
        elements: segmask::spec::element_nets(&b.layout).len(),
        nets: art.nets.len(),
        pins: art.pins.len(),
        shapes: art.shapes.len(),
        grid_cells: ((g.width / h).ceil() as u64 + 1) * ((g.height / h).ceil() as u64 + 1),
        errors: segmask::finding::count(&b.findings, Severity::Error),
        warnings: segmask::finding::count(&b.findings, Severity::Warning),
        findings: b.findings.len(),
    }
}
