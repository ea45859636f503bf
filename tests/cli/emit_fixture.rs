//! A small hand-built artwork for the emit tests (invented data): 40 × 30 mm front
//! glass with a 6 mm ledge at the bottom, one square segment `S1` with lead and pad,
//! one back-plate common `COM1` shaped as a square ring (a polygon with a hole) whose
//! lead runs right to a transfer dot, alignment marks left of the seal, two pins and one
//! finding. Every shape touches its neighbours at most along edges (no overlaps).


use segmask::artwork::*;
use segmask::emit::EmitOptions;
use segmask::finding::{Finding, Rule, Severity};
use segmask::geom::{Polygon, Pt, area, circle, pt, rect};
use segmask::layout::{Drive, LayerMap, PlateId, Resist, Rules};

/// A polygon from an outer ring and holes given as corner lists.
pub fn poly(outer: &[(f64, f64)], holes: &[&[(f64, f64)]]) -> Polygon {
    let ring = |v: &[(f64, f64)]| {
        let mut p: Vec<Pt> = v.iter().map(|&(x, y)| pt(x, y)).collect();
        p.push(p[0]);
        geo::LineString::from(p)
    };
    Polygon::new(ring(outer), holes.iter().map(|h| ring(h)).collect())
}

/// The square ring of `COM1`: 12 × 12 mm with a 4 × 4 mm hole (area 128 mm²).
pub fn com_ring() -> Polygon {
    poly(
        &[(8.0, 12.0), (20.0, 12.0), (20.0, 24.0), (8.0, 24.0)],
        &[&[(12.0, 16.0), (12.0, 20.0), (16.0, 20.0), (16.0, 16.0)]],
    )
}

/// A plus-shaped front mark centred at (3, 20): arms 2 mm long, 0.4 mm wide.
pub fn cross() -> Polygon {
    let (c, a, w) = ((3.0, 20.0), 1.0, 0.2);
    poly(
        &[
            (c.0 - w, c.1 - a),
            (c.0 + w, c.1 - a),
            (c.0 + w, c.1 - w),
            (c.0 + a, c.1 - w),
            (c.0 + a, c.1 + w),
            (c.0 + w, c.1 + w),
            (c.0 + w, c.1 + a),
            (c.0 - w, c.1 + a),
            (c.0 - w, c.1 + w),
            (c.0 - a, c.1 + w),
            (c.0 - a, c.1 - w),
            (c.0 - w, c.1 - w),
        ],
        &[],
    )
}

fn shape(layer: Layer, role: Role, net: Option<&str>, polygon: Polygon) -> Shape {
    Shape { layer, role, net: net.map(str::to_string), polygon }
}

/// Rules of the fixture (invented, plausible).
pub fn rules() -> Rules {
    Rules {
        min_width: 0.1,
        min_gap: 0.05,
        undercut: 0.01,
        compensate: false,
        film_min_feature: 0.1,
        backplane_overlap: 0.3,
        edge_clearance: 1.5,
        lead_width: 0.15,
        registration: 0.0,
    }
}

/// The artwork.
pub fn artwork() -> Artwork {
    use Layer::*;
    let seg = rect(10.0, 14.0, 18.0, 22.0);
    let pad1 = rect(12.0, 1.0, 16.0, 3.0);
    let pad2 = rect(29.0, 1.0, 33.0, 3.0);
    let dot = circle(pt(31.0, 9.5), 0.5, 1e-3);
    let mut seal = rect(6.0, 9.0, 34.0, 28.0);
    seal.interiors_push(rect(7.0, 10.0, 33.0, 27.0).exterior().clone());
    let back_marks = [(2.3, 19.3), (3.7, 19.3), (3.7, 20.7), (2.3, 20.7)]
        .map(|(x, y)| shape(BackMarks, Role::Mark, None, rect(x - 0.2, y - 0.2, x + 0.2, y + 0.2)));
    let mut shapes = vec![
        shape(FrontIto, Role::Segment, Some("S1"), seg.clone()),
        shape(FrontIto, Role::Lead, Some("S1"), rect(13.5, 3.0, 14.5, 14.0)),
        shape(FrontIto, Role::Pad, Some("S1"), pad1.clone()),
        shape(FrontIto, Role::TransferPad, Some("COM1"), rect(30.0, 8.5, 32.0, 10.5)),
        shape(FrontIto, Role::Lead, Some("COM1"), rect(30.5, 3.0, 31.5, 8.5)),
        shape(FrontIto, Role::Pad, Some("COM1"), pad2.clone()),
        shape(BackIto, Role::Common, Some("COM1"), com_ring()),
        shape(BackIto, Role::Lead, Some("COM1"), rect(20.0, 17.0, 30.5, 18.0)),
        shape(BackIto, Role::Lead, Some("COM1"), rect(30.5, 10.5, 31.5, 18.0)),
        shape(BackIto, Role::TransferPad, Some("COM1"), rect(30.0, 8.5, 32.0, 10.5)),
        shape(FrontMarks, Role::Mark, None, cross()),
        shape(Seal, Role::Outline, None, seal),
        shape(TransferDots, Role::Outline, None, dot.clone()),
    ];
    shapes.extend(back_marks);
    Artwork {
        name: "fixture".into(),
        shapes,
        nets: vec![
            Net {
                name: "S1".into(),
                plate: PlateId::Front,
                kind: NetKind::Segment,
                index: 0,
                drives: "square S1".into(),
            },
            Net {
                name: "COM1".into(),
                plate: PlateId::Back,
                kind: NetKind::Common,
                index: 0,
                drives: "common electrode 1".into(),
            },
        ],
        pins: vec![Pin { number: 2, net: "COM1".into(), pad: pad2 }, Pin { number: 1, net: "S1".into(), pad: pad1 }],
        pixels: vec![Pixel {
            element: "S1".into(),
            drives: "S1".into(),
            seg_net: "S1".into(),
            com_net: "COM1".into(),
            region: geo::MultiPolygon(vec![seg]),
        }],
        digits: vec![],
        cell: segmask::layout::Cell::with_gap(0.007),
        transfer_dots: vec![TransferDot { at: pt(31.0, 9.5), dot }],
        lc_region: rect(7.0, 10.0, 33.0, 27.0),
        window: rect(8.0, 11.0, 32.0, 26.0),
        ledge: geo::MultiPolygon(vec![rect(0.0, 0.0, 40.0, 6.0)]),
        front_glass: rect(0.0, 0.0, 40.0, 30.0),
        back_glass: rect(0.0, 6.0, 40.0, 30.0),
        labels: vec![Label { plate: PlateId::Back, text: "B1".into(), at: pt(36.0, 27.0), height: 1.5 }],
        rules: rules(),
        layers: LayerMap::defaults(),
        resist: Resist::Positive,
        masks: segmask::layout::MaskOptions::default(),
        drive: Drive { commons: 1, bias: None },
        film_shapes: vec![],
        generation_findings: vec![],
        panel: None,
    }
}

/// A warning in the middle of the segment.
pub fn warning() -> Finding {
    Finding {
        rule: Rule::Gap,
        severity: Severity::Warning,
        plate: Some(PlateId::Front),
        nets: vec!["S1".into(), "COM1".into()],
        location: pt(14.0, 18.0),
        measured: Some(0.04),
        required: Some(0.05),
        message: "gap 0.040 mm < 0.050 mm".into(),
    }
}

/// An error finding.
pub fn error() -> Finding {
    Finding {
        rule: Rule::Short,
        severity: Severity::Error,
        measured: None,
        required: None,
        message: "S1 touches COM1".into(),
        ..warning()
    }
}

/// Options with a fixed date.
pub fn opts() -> EmitOptions {
    EmitOptions { date: "2025-03-14".into(), masks_despite_errors: false, png_dpi: 100.0 }
}

/// Sum of the areas of the shapes on some layers, mm².
pub fn layer_area(art: &Artwork, layers: &[Layer]) -> f64 {
    art.shapes.iter().filter(|s| layers.contains(&s.layer)).map(|s| area(&s.polygon)).sum()
}

/// Sum of the perimeters (outer rings and holes) of the shapes on some layers, mm.
pub fn layer_perimeter(art: &Artwork, layers: &[Layer]) -> f64 {
    use geo::{Euclidean, Length};
    art.shapes
        .iter()
        .filter(|s| layers.contains(&s.layer))
        .map(|s| {
            Euclidean.length(s.polygon.exterior())
                + s.polygon.interiors().iter().map(|h| Euclidean.length(h)).sum::<f64>()
        })
        .sum()
}

/// The bytes of the output named `NAME.suffix`.
pub fn output<'a>(files: &'a [segmask::emit::OutputFile], suffix: &str) -> &'a [u8] {
    let name = format!("fixture.{suffix}");
    &files.iter().find(|f| f.name == name).unwrap_or_else(|| panic!("no {name}")).bytes
}
