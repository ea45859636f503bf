//! Tests of the segment map on hand-built artworks (invented for segmask).

use super::*;
use crate::artwork::{Net, NetKind, Pin};
use crate::geom::{rect, region_of};
use crate::layout::{Drive, PlateId};

fn net(name: &str, plate: PlateId, kind: NetKind, index: u32, drives: &str) -> Net {
    Net { name: name.into(), plate, kind, index, drives: drives.into() }
}

fn pixel(element: &str, seg: &str, com: &str, region: crate::geom::Region) -> Pixel {
    Pixel { element: element.into(), drives: element.into(), seg_net: seg.into(), com_net: com.into(), region }
}

/// 1/2 duty at 1/2 bias, two commons, two SEG lines, three elements:
///
/// ```text
/// B  SEG1 × COM1  10..14 × 15..20          area 20, centre (12, 17.5)
/// A  SEG1 × COM2  16..20 × 15..20          area 20, centre (18, 17.5)
/// C  SEG2 × COM1  L: 22..26 × 15..16 + 22..23 × 16..20   area 8, centre (23.25, 16.75)
/// pins: SEG1 1, COM1 3, COM2 4; SEG2 has no pad
/// ```
/// C's centre: parts of area 4 at (24, 15.5) and 4 at (22.5, 18), mean (23.25, 16.75).
fn two_commons() -> Artwork {
    let mut art = crate::check::fixture::clean();
    art.drive = Drive { commons: 2, bias: Some(2) };
    art.nets = vec![
        net("SEG1", PlateId::Front, NetKind::Segment, 0, "SEG line 1"),
        net("SEG2", PlateId::Front, NetKind::Segment, 1, "the \"C\" bar, alone"),
        net("COM1", PlateId::Back, NetKind::Common, 0, "common electrode 1"),
        net("COM2", PlateId::Back, NetKind::Common, 1, "common electrode 2"),
    ];
    let pad = rect(0.0, 0.0, 1.0, 1.0);
    art.pins = [(4, "COM2"), (1, "SEG1"), (3, "COM1")]
        .map(|(number, n)| Pin { number, net: n.into(), pad: pad.clone() })
        .to_vec();
    art.pixels = vec![
        pixel("C", "SEG2", "COM1", region_of([rect(22.0, 15.0, 26.0, 16.0), rect(22.0, 16.0, 23.0, 20.0)])),
        pixel("A", "SEG1", "COM2", region_of([rect(16.0, 15.0, 20.0, 20.0)])),
        pixel("B", "SEG1", "COM1", region_of([rect(10.0, 15.0, 14.0, 20.0)])),
    ];
    art.pixels[0].drives = "the \"C\" bar, alone".into();
    art
}

/// Sorted by COM, then SEG, then name; a shared SEG line names the element, a SEG line
/// of one element gives its net's words, quoted per RFC 4180 §2.6–2.7; a net without a
/// pad leaves its cell empty (RFC 4180 §2.4: the same number of fields in every record).
/// Areas and centres by hand, from the composite-area rule (any statics handbook).
#[test]
fn csv_rows_by_hand() {
    let csv = String::from_utf8(render_segmap_csv(&two_commons())).unwrap();
    let want = concat!(
        "element,drives,com,com_net,com_pin,seg,seg_net,seg_pin,area_mm2,centroid_x_mm,centroid_y_mm,coverage\n",
        // Coverage: the fixture's COM1 covers B; only a 0.2 mm² lead end faces C's 8 mm²;
        // there is no COM2 ITO in the fixture (plane geometry).
        "B,B,1,COM1,3,1,SEG1,1,20.0000,12.0000,17.5000,1.0000\n",
        "C,\"the \"\"C\"\" bar, alone\",1,COM1,3,2,SEG2,,8.0000,23.2500,16.7500,0.0250\n",
        "A,A,2,COM2,4,1,SEG1,1,20.0000,18.0000,17.5000,0.0000\n",
    );
    assert_eq!(csv, want);
}

/// The JSON parses back (RFC 8259, via serde_json) with the same fields, `null` for
/// the missing pad, and the drive written as in layouts.
#[test]
fn json_parses_back() {
    let bytes = render_segmap_json(&two_commons()).unwrap();
    let v: serde_json::Value = serde_json::from_slice(&bytes).unwrap();
    assert_eq!(v["name"], "fixture");
    assert_eq!(v["duty"], "1/2");
    assert_eq!(v["bias"], "1/2");
    let e = v["elements"].as_array().unwrap();
    let names: Vec<&str> = e.iter().map(|r| r["element"].as_str().unwrap()).collect();
    assert_eq!(names, ["B", "C", "A"]);
    assert_eq!(e[1]["seg_pin"], serde_json::Value::Null);
    assert_eq!(e[1]["drives"], "the \"C\" bar, alone");
    assert_eq!(e[2]["com"], 2);
    assert_eq!(e[2]["com_pin"], 4);
    assert_eq!(e[0]["area_mm2"], 20.0);
    assert_eq!(e[1]["centroid_x_mm"], 23.25);
    assert_eq!(e[1]["centroid_y_mm"], 16.75);
}

/// Static drive: every element on COM 1, each on its own SEG line, described by its net;
/// no bias.
#[test]
fn static_rows_are_all_on_com_one() {
    let art = crate::check::fixture::clean();
    let rows = segment_rows(&art);
    assert_eq!(rows.len(), 2);
    assert!(rows.iter().all(|r| r.com == Some(1) && r.com_pin == Some(3)));
    assert_eq!((rows[0].seg, rows[1].seg), (Some(1), Some(2)));
    assert_eq!((rows[0].seg_pin, rows[1].seg_pin), (Some(1), Some(2)));
    assert_eq!(rows[0].drives, "fixture S1");
    let v: serde_json::Value = serde_json::from_slice(&render_segmap_json(&art).unwrap()).unwrap();
    assert_eq!((v["duty"].as_str(), &v["bias"]), (Some("static"), &serde_json::Value::Null));
}

/// A pixel on an unknown net and an empty pixel keep their rows, with empty cells,
/// and sort last.
#[test]
fn unknown_nets_and_empty_pixels_keep_a_row() {
    let mut art = two_commons();
    art.pixels.push(pixel("Z", "nowhere", "COM9", region_of([])));
    let csv = String::from_utf8(render_segmap_csv(&art)).unwrap();
    assert_eq!(csv.lines().last(), Some("Z,Z,,COM9,,,nowhere,,0.0000,,,"));
}

/// Two elements on one (COM, SEG) pair always switch together: reported once each.
#[test]
fn shared_pairs_are_found() {
    let mut art = two_commons();
    assert!(crate::check::drive_truth::shared_pairs(&art).is_empty());
    let b = art.pixels[2].clone();
    art.pixels.push(Pixel { element: "B2".into(), ..b.clone() });
    art.pixels.push(Pixel { element: "B3".into(), ..b });
    assert_eq!(crate::check::drive_truth::shared_pairs(&art), [("COM1".to_string(), "SEG1".to_string())]);
}
