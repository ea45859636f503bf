//! GDSII output read back record by record with a reader written here from the format
//! description (Calma, *GDSII Stream Format Manual*, release 6.0, 1987; record codes as
//! listed in docs/background.md, *GDSII*), not with the library that wrote it.

use crate::emit_fixture;

use emit_fixture::*;
use geo::{Contains, Validation};
use segmask::artwork::Layer;
use segmask::emit::{MAX_BOUNDARY_POINTS, render_outputs};

/// One record: type code (record type << 8 | data type) and data bytes.
struct Record {
    code: u16,
    data: Vec<u8>,
}

/// Splits a stream into records. Stream Format Manual: a 2-byte big-endian length that
/// counts the 4 header bytes, then record type and data type, then data.
fn records(bytes: &[u8]) -> Vec<Record> {
    let mut out = Vec::new();
    let mut i = 0;
    while i < bytes.len() {
        let len = u16::from_be_bytes([bytes[i], bytes[i + 1]]) as usize;
        assert!(len >= 4, "record length {len} at byte {i}");
        // Stream Format Manual: record lengths are always even.
        assert_eq!(len % 2, 0, "odd record length {len} at byte {i}");
        let code = u16::from_be_bytes([bytes[i + 2], bytes[i + 3]]);
        out.push(Record { code, data: bytes[i + 4..i + len].to_vec() });
        i += len;
    }
    assert_eq!(i, bytes.len(), "stream ends inside a record");
    out
}

fn i16s(d: &[u8]) -> Vec<i16> {
    d.chunks(2).map(|c| i16::from_be_bytes([c[0], c[1]])).collect()
}

fn i32s(d: &[u8]) -> Vec<i32> {
    d.chunks(4).map(|c| i32::from_be_bytes([c[0], c[1], c[2], c[3]])).collect()
}

fn string(d: &[u8]) -> String {
    String::from_utf8(d.iter().copied().take_while(|&b| b != 0).collect()).unwrap()
}

/// 8-byte real, Stream Format Manual: sign bit, 7-bit exponent in excess 64 (base 16),
/// 56-bit mantissa read as a fraction, value = mantissa × 16^(exponent − 64).
fn real8(d: &[u8]) -> f64 {
    let sign = if d[0] & 0x80 != 0 { -1.0 } else { 1.0 };
    let exp = (d[0] & 0x7f) as i32 - 64;
    let mant = d[1..8].iter().fold(0u64, |m, &b| m << 8 | b as u64) as f64 / 2f64.powi(56);
    sign * mant * 16f64.powi(exp)
}

const HEADER: u16 = 0x0002;
const BGNLIB: u16 = 0x0102;
const LIBNAME: u16 = 0x0206;
const UNITS: u16 = 0x0305;
const ENDLIB: u16 = 0x0400;
const BGNSTR: u16 = 0x0502;
const STRNAME: u16 = 0x0606;
const BOUNDARY: u16 = 0x0800;
const TEXT: u16 = 0x0C00;
const LAYER: u16 = 0x0D02;
const XY: u16 = 0x1003;
const STRING: u16 = 0x1906;

/// Boundaries as (layer, ring of integer points).
fn boundaries(recs: &[Record]) -> Vec<(i16, Vec<(i32, i32)>)> {
    boundaries_in(recs, None)
}

/// Boundaries of one structure (or of all), as (layer, ring of integer points).
fn boundaries_in(recs: &[Record], structure: Option<&str>) -> Vec<(i16, Vec<(i32, i32)>)> {
    let mut out = Vec::new();
    let mut current = String::new();
    for (i, r) in recs.iter().enumerate() {
        if r.code == STRNAME {
            current = string(&r.data);
        }
        if r.code == BOUNDARY && structure.is_none_or(|s| s == current) {
            let layer = recs[i + 1..].iter().find(|r| r.code == LAYER).map(|r| i16s(&r.data)[0]).unwrap();
            let xy = recs[i + 1..].iter().find(|r| r.code == XY).map(|r| i32s(&r.data)).unwrap();
            out.push((layer, xy.chunks(2).map(|c| (c[0], c[1])).collect()));
        }
    }
    out
}

/// Twice the signed area by the shoelace formula, in exact integer arithmetic.
fn shoelace2(r: &[(i64, i64)]) -> i128 {
    (0..r.len())
        .map(|i| {
            let (a, b) = (r[i], r[(i + 1) % r.len()]);
            a.0 as i128 * b.1 as i128 - b.0 as i128 * a.1 as i128
        })
        .sum()
}

fn gds() -> Vec<u8> {
    let files = render_outputs(&artwork(), &[warning()], &opts()).unwrap();
    output(&files, "gds").to_vec()
}

#[test]
fn header_library_and_units_follow_release_6() {
    let bytes = gds();
    let recs = records(&bytes);
    // Stream Format Manual: HEADER first, holding the version (600 for release 6.0).
    assert_eq!(recs[0].code, HEADER);
    assert_eq!(i16s(&recs[0].data), vec![600]);
    // BGNLIB: modification and access dates, 6 two-byte integers each; ours are the
    // build date at midnight.
    assert_eq!(recs[1].code, BGNLIB);
    assert_eq!(i16s(&recs[1].data), vec![2025, 3, 14, 0, 0, 0, 2025, 3, 14, 0, 0, 0]);
    assert_eq!(recs[2].code, LIBNAME);
    assert_eq!(string(&recs[2].data), "fixture");
    assert_eq!(recs[3].code, UNITS);
    let (user, metres) = (real8(&recs[3].data[..8]), real8(&recs[3].data[8..]));
    // 1 nm database unit = 1e-3 of a 1 µm user unit, and 1e-9 m.
    assert!((user - 1e-3).abs() < 1e-15 * 1e-3, "{user:e}");
    assert!((metres - 1e-9).abs() < 1e-15 * 1e-9, "{metres:e}");
    // docs/background.md, *GDSII*: 1e-3 encodes as 3E 41 89 37 4B C6 A7 EF or F0; the
    // last byte depends on the rounding rule, so only the first seven are compared.
    assert_eq!(&recs[3].data[..7], &[0x3E, 0x41, 0x89, 0x37, 0x4B, 0xC6, 0xA7]);
    assert_eq!(recs.last().unwrap().code, ENDLIB);
    let names: Vec<String> =
        recs.windows(2).filter(|w| w[0].code == BGNSTR && w[1].code == STRNAME).map(|w| string(&w[1].data)).collect();
    assert_eq!(names, ["FRONT", "BACK", "CELL", "TOP", "FRONT_MASK", "BACK_MASK"]);
}

#[test]
fn boundaries_are_closed_and_short() {
    let recs = records(&gds());
    let bs = boundaries(&recs);
    assert!(bs.len() >= 15, "{} boundaries", bs.len());
    for (layer, ring) in &bs {
        // Stream Format Manual: a BOUNDARY repeats its first point at the end, has at
        // least 4 points, and one XY record holds at most 8191 points.
        assert_eq!(ring.first(), ring.last(), "open ring on layer {layer}");
        assert!(ring.len() >= 4 && ring.len() <= 8191 && ring.len() <= MAX_BOUNDARY_POINTS);
        assert!(ring.windows(2).all(|w| w[0] != w[1]), "duplicate point on layer {layer}");
    }
}

#[test]
fn output_is_byte_identical_between_runs() {
    assert_eq!(gds(), gds());
}

/// The back ITO (a ring with a hole and three rectangles) keeps its area to the square
/// nanometre and every piece is a valid polygon without holes (validity as geo defines
/// it, after OGC Simple Features: no self-intersection, no self-touching ring).
#[test]
fn hole_is_split_keeping_area_exactly() {
    let recs = records(&gds());
    let (back_ito, _) = artwork().gds_layer(Layer::BackIto);
    let pieces: Vec<_> = boundaries_in(&recs, Some("BACK")).into_iter().filter(|(l, _)| *l == back_ito).collect();
    let got: i128 = pieces
        .iter()
        .map(|(_, r)| shoelace2(&r.iter().map(|&(x, y)| (x as i64, y as i64)).collect::<Vec<_>>()).abs())
        .sum();
    let nm = |c: &geo::Coord<f64>| ((c.x * 1e6).round() as i64, (c.y * 1e6).round() as i64);
    let want: i128 = artwork()
        .on_layer(Layer::BackIto)
        .map(|s| {
            let outer = shoelace2(&s.polygon.exterior().0.iter().map(nm).collect::<Vec<_>>()).abs();
            let holes: i128 =
                s.polygon.interiors().iter().map(|h| shoelace2(&h.0.iter().map(nm).collect::<Vec<_>>()).abs()).sum();
            outer - holes
        })
        .sum();
    assert_eq!(want, 2 * 150_000_000_000_000, "fixture back ITO should be 150 mm²");
    assert_eq!(got, want);
    assert!(pieces.len() >= 5, "the ring must be cut into at least two pieces");
    for (_, r) in &pieces {
        let p = geo::Polygon::new(r.iter().map(|&(x, y)| geo::coord! {x: x as f64, y: y as f64}).collect(), vec![]);
        assert!(p.is_valid(), "{:?}", p.validation_errors());
    }
}

/// Each net's name is a TEXT placed on one of its ITO polygons; labels are TEXT too.
#[test]
fn net_names_sit_on_their_ito() {
    let recs = records(&gds());
    let mut texts = Vec::new();
    for (i, r) in recs.iter().enumerate() {
        if r.code == TEXT {
            let xy = recs[i..].iter().find(|r| r.code == XY).map(|r| i32s(&r.data)).unwrap();
            let s = recs[i..].iter().find(|r| r.code == STRING).map(|r| string(&r.data)).unwrap();
            texts.push((s, geo::coord! {x: xy[0] as f64 / 1e6, y: xy[1] as f64 / 1e6}));
        }
    }
    let art = artwork();
    for (net, layer) in [("S1", Layer::FrontIto), ("COM1", Layer::BackIto)] {
        let at = texts.iter().find(|t| t.0 == net).unwrap_or_else(|| panic!("no TEXT {net}")).1;
        let on = art.on_layer(layer).filter(|s| s.net.as_deref() == Some(net)).any(|s| s.polygon.contains(&at));
        assert!(on, "{net} at {at:?}");
    }
    assert!(texts.iter().any(|t| t.0 == "B1"));
}

/// The back plate's mask structure holds only its ITO layer (ITO and marks) and its
/// glass layer; its ITO is the back ITO and marks mirrored about the glass centre
/// (x → 40 mm − x, docs/outputs.md, *Which way round*), area kept to the square
/// nanometre: the ring at x 8–20 mm lies at 20–32 mm.
#[test]
fn back_mask_is_mirrored_ito_and_marks_only() {
    let recs = records(&gds());
    let art = artwork();
    let (back_ito, _) = art.gds_layer(Layer::BackIto);
    let (back_glass, _) = art.gds_layer(Layer::BackGlass);
    let mask = boundaries_in(&recs, Some("BACK_MASK"));
    assert!(mask.iter().all(|(l, _)| *l == back_ito || *l == back_glass), "other layers in BACK_MASK");
    let area = |rings: &[(i16, Vec<(i32, i32)>)]| -> i128 {
        rings.iter().map(|(_, r)| shoelace2(&r.iter().map(|&(x, y)| (x as i64, y as i64)).collect::<Vec<_>>()).abs()).sum()
    };
    let ito: Vec<_> = mask.iter().filter(|(l, _)| *l == back_ito).cloned().collect();
    let (marks, _) = art.gds_layer(Layer::BackMarks);
    let drawn: Vec<_> = boundaries_in(&recs, Some("BACK")).into_iter().filter(|(l, _)| *l == back_ito || *l == marks).collect();
    assert_eq!(area(&ito), area(&drawn));
    let xs: Vec<i32> = ito.iter().flat_map(|(_, r)| r.iter().map(|p| p.0)).collect();
    // The ring's edges 8, 20 and its hole's 12, 16 mirror to 32, 20, 28, 24; no mirrored
    // back shape has an edge at 12 or 16.
    for x in [32_000_000, 28_000_000, 24_000_000] {
        assert!(xs.contains(&x), "ring not mirrored: no edge at {x} nm");
    }
    assert!(!xs.contains(&12_000_000) && !xs.contains(&16_000_000), "unmirrored ring in BACK_MASK");
    // The front mask is not mirrored: the segment square stays at x 10–18 mm.
    let (front_ito, _) = art.gds_layer(Layer::FrontIto);
    let fx: Vec<i32> = boundaries_in(&recs, Some("FRONT_MASK")).iter().filter(|(l, _)| *l == front_ito).flat_map(|(_, r)| r.iter().map(|p| p.0).collect::<Vec<_>>()).collect();
    assert!(fx.contains(&10_000_000) && fx.contains(&18_000_000));
}
