//! The machine-readable report `NAME.report.json`.
//!
//! Takes the artwork and the findings, gives pretty-printed JSON: the rules in effect,
//! the layer map, every net with its pin and ITO area, every element with its COM and
//! SEG (the segment map's rows), the drive summary, the electrical and optical plan,
//! every finding, and the counts of errors and warnings. Keys end in their unit (`_mm`, `_mm2`).

use super::drive_info::{DriveSummary, drive_summary};
use super::segmap::SegmentRow;
use crate::artwork::{Artwork, Layer, NetKind};
use crate::finding::{Finding, Severity, count};
use crate::layout::Resist;
use crate::{Error, Result};
use serde::Serialize;

#[derive(Serialize)]
struct Report<'a> {
    layout: &'a str,
    resist: &'static str,
    rules: Rules,
    layers: Vec<LayerRow>,
    nets: Vec<NetRow<'a>>,
    segments: Vec<SegmentRow>,
    drive: DriveSummary,
    plan: &'a crate::plan::Plan,
    findings: Vec<FindingRow<'a>>,
    summary: Summary,
}

#[derive(Serialize)]
struct Rules {
    min_width_mm: f64,
    min_gap_mm: f64,
    undercut_mm: f64,
    compensate: bool,
    film_min_feature_mm: f64,
    backplane_overlap_mm: f64,
    edge_clearance_mm: f64,
    lead_width_mm: f64,
    registration_mm: f64,
}

#[derive(Serialize)]
struct LayerRow {
    name: &'static str,
    plate: Option<&'static str>,
    gds_layer: i16,
    gds_datatype: i16,
}

#[derive(Serialize)]
struct NetRow<'a> {
    name: &'a str,
    plate: &'static str,
    kind: &'static str,
    pin: Option<u32>,
    /// Every pin of the net, lowest first: a common of the far tier may come out on two
    /// (its second transfer dot, `route::dots::far_tier_dots`).
    pins: Vec<u32>,
    area_mm2: f64,
}

/// A finding as the report (and `check --format json`) writes it.
#[derive(Serialize)]
pub(super) struct FindingRow<'a> {
    rule: &'static str,
    severity: &'static str,
    plate: Option<&'static str>,
    nets: &'a [String],
    location_mm: [f64; 2],
    measured: Option<f64>,
    required: Option<f64>,
    message: &'a str,
}

#[derive(Serialize)]
struct Summary {
    errors: usize,
    warnings: usize,
}

/// Name of a resist tone as written in the report.
pub fn resist_name(r: Resist) -> &'static str {
    match r {
        Resist::Positive => "positive",
        Resist::Negative => "negative",
    }
}

/// Area of a net: the sum of the areas of its ITO shapes on either plate (the artwork
/// holds non-overlapping polygons per net, so no union is needed).
fn net_area(art: &Artwork, net: &str) -> f64 {
    art.shapes
        .iter()
        .filter(|s| matches!(s.layer, Layer::FrontIto | Layer::BackIto) && s.net.as_deref() == Some(net))
        .map(|s| crate::geom::area(&s.polygon))
        .sum()
}

fn rules(art: &Artwork) -> Rules {
    let r = &art.rules;
    Rules {
        min_width_mm: r.min_width,
        min_gap_mm: r.min_gap,
        undercut_mm: r.undercut,
        compensate: r.compensate,
        film_min_feature_mm: r.film_min_feature,
        backplane_overlap_mm: r.backplane_overlap,
        edge_clearance_mm: r.edge_clearance,
        lead_width_mm: r.lead_width,
        registration_mm: r.registration,
    }
}

/// The row of one finding.
pub(super) fn finding_row(f: &Finding) -> FindingRow<'_> {
    FindingRow {
        rule: f.rule.code(),
        severity: f.severity.name(),
        plate: f.plate.map(|p| p.name()),
        nets: &f.nets,
        location_mm: [f.location.x, f.location.y],
        measured: f.measured,
        required: f.required,
        message: &f.message,
    }
}

/// The report of an artwork and its findings, with the segment-map rows already made
/// (`segmap::segment_rows`, which measures every pixel's coverage: made once per build).
/// The plan (`crate::plan`) is written as it is, under `plan`.
pub fn render_report(art: &Artwork, findings: &[Finding], segments: Vec<SegmentRow>, plan: &crate::plan::Plan) -> Result<Vec<u8>> {
    let layers = Layer::ALL
        .iter()
        .map(|&l| {
            let (gds_layer, gds_datatype) = art.gds_layer(l);
            LayerRow { name: l.name(), plate: l.plate().map(|p| p.name()), gds_layer, gds_datatype }
        })
        .collect();
    let nets = art
        .nets
        .iter()
        .map(|n| NetRow {
            name: &n.name,
            plate: n.plate.name(),
            kind: match n.kind {
                NetKind::Segment => "segment",
                NetKind::Common => "common",
            },
            pin: art.pins.iter().filter(|p| p.net == n.name).map(|p| p.number).min(),
            pins: { let mut v: Vec<u32> = art.pins.iter().filter(|p| p.net == n.name).map(|p| p.number).collect(); v.sort_unstable(); v },
            area_mm2: net_area(art, &n.name),
        })
        .collect();
    let report = Report {
        layout: &art.name,
        resist: resist_name(art.resist),
        rules: rules(art),
        layers,
        nets,
        segments,
        drive: drive_summary(art),
        plan,
        findings: findings.iter().map(finding_row).collect(),
        summary: Summary { errors: count(findings, Severity::Error), warnings: count(findings, Severity::Warning) },
    };
    let mut bytes = serde_json::to_vec_pretty(&report).map_err(|e| Error::Bug(format!("report JSON: {e}")))?;
    bytes.push(b'\n');
    Ok(bytes)
}
