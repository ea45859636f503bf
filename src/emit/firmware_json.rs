//! The firmware table `NAME.firmware.json`: for every digit position and every
//! character it can show, the (COM, SEG) bits to set; and the bit of every element that
//! is not a digit segment (legends, icons, gauge parts, bar-graph steps).
//!
//! Takes the artwork, gives pretty-printed JSON (RFC 8259). Bits are `[com, seg]`, both
//! 1-based as in the segment map. Characters are in the order of the style's table
//! (`fonts-strokes/characters.table`).

use super::drive_info::{bias_name, duty_name};
use crate::artwork::Artwork;
use crate::firmware::{Bit, bit_of, characters, frame_size};
use crate::{Error, Result};
use serde::Serialize;

#[derive(Serialize)]
struct Doc<'a> {
    name: &'a str,
    duty: String,
    bias: Option<String>,
    commons: u32,
    seg_lines: u32,
    digits: Vec<Digit<'a>>,
    elements: Vec<Element<'a>>,
}

#[derive(Serialize)]
struct Digit<'a> {
    group: &'a str,
    position: u32,
    style: &'static str,
    segments: Vec<Segment<'a>>,
    point: Option<[u32; 2]>,
    /// The colon's bits: one (static drive) or two (multiplexed: upper dot, lower dot);
    /// empty without a colon.
    colon: Vec<[u32; 2]>,
    characters: Vec<Character>,
}

#[derive(Serialize)]
struct Segment<'a> {
    segment: &'a str,
    element: &'a str,
    bit: Option<[u32; 2]>,
}

#[derive(Serialize)]
struct Character {
    char: String,
    bits: Vec<[u32; 2]>,
}

#[derive(Serialize)]
struct Element<'a> {
    element: &'a str,
    drives: &'a str,
    bit: Option<[u32; 2]>,
}

fn pair(b: Bit) -> [u32; 2] {
    [b.com, b.seg]
}

/// `NAME.firmware.json`.
pub fn render_firmware_json(art: &Artwork) -> Result<Vec<u8>> {
    let bit = |e: &str| bit_of(art, e).map(pair);
    let digits = art
        .digits
        .iter()
        .map(|d| Digit {
            group: &d.group,
            position: d.position,
            style: d.style.name(),
            segments: d.segments.iter().map(|(s, e)| Segment { segment: s, element: e, bit: bit(e) }).collect(),
            point: d.point.as_deref().and_then(bit),
            colon: d.colon.iter().filter_map(|e| bit(e)).collect(),
            characters: characters(d)
                .into_iter()
                .map(|(c, els)| {
                    let mut bits: Vec<[u32; 2]> = els.iter().filter_map(|e| bit(e)).collect();
                    bits.sort();
                    Character { char: c.to_string(), bits }
                })
                .collect(),
        })
        .collect();
    let in_digits = |name: &str| {
        art.digits.iter().any(|d| {
            d.segments.iter().any(|(_, e)| e == name) || d.point.as_deref() == Some(name) || d.colon.iter().any(|e| e == name)
        })
    };
    let elements = art
        .pixels
        .iter()
        .filter(|p| !in_digits(&p.element))
        .map(|p| Element { element: &p.element, drives: &p.drives, bit: bit(&p.element) })
        .collect();
    let (commons, seg_lines) = frame_size(art);
    let doc = Doc {
        name: &art.name,
        duty: duty_name(art.drive),
        bias: bias_name(art.drive),
        commons,
        seg_lines,
        digits,
        elements,
    };
    let mut bytes = serde_json::to_vec_pretty(&doc).map_err(|e| Error::Bug(format!("firmware JSON: {e}")))?;
    bytes.push(b'\n');
    Ok(bytes)
}
