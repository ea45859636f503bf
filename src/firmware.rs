//! What firmware sets to show something: the (COM, SEG) bit of every element, and the
//! elements that show a text on the digits.
//!
//! Takes the artwork (its pixels, nets and digit positions) and the character tables of
//! `fonts-strokes/characters.table`; gives bits and element lists. The firmware tables
//! (`NAME.firmware.h`, `NAME.firmware.json`) and `segmask show` both read from here, so
//! the C code, the JSON and the picture agree on how a text is placed.
//!
//! How a text is placed (docs/outputs.md, *Firmware tables*): characters fill the digit
//! positions in layout order, one each; a `.` lights the decimal point of the position
//! just filled and a `:` its colon, when it has one; every other character takes the
//! next position and lights the segments its style's table gives it.

use crate::artwork::{Artwork, DigitSlot};
use crate::glyph::charset::charset;

/// The (COM, SEG) pair of an element, both 1-based, as the segment map gives them.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct Bit {
    /// COM electrode, 1…N.
    pub com: u32,
    /// SEG line, 1…S.
    pub seg: u32,
}

/// The bit of an element: its pixel's COM and SEG nets' indices plus one; `None` for an
/// element the artwork has no pixel or net for.
pub fn bit_of(art: &Artwork, element: &str) -> Option<Bit> {
    let p = art.pixels.iter().find(|p| p.element == element)?;
    Some(Bit { com: art.net(&p.com_net)?.index + 1, seg: art.net(&p.seg_net)?.index + 1 })
}

/// Number of commons and of SEG lines of the artwork.
pub fn frame_size(art: &Artwork) -> (u32, u32) {
    let max = |kind| art.nets.iter().filter(|n| n.kind == kind).map(|n| n.index + 1).max().unwrap_or(0);
    (max(crate::artwork::NetKind::Common).max(1), max(crate::artwork::NetKind::Segment))
}

/// The characters a digit position can show: those of its style's table whose segments
/// it all has (a half digit shows only what `b` and `c` draw), with their elements.
pub fn characters(slot: &DigitSlot) -> Vec<(char, Vec<String>)> {
    charset(slot.style)
        .chars
        .iter()
        .filter_map(|(c, segs)| elements_of(slot, segs).map(|e| (*c, e)))
        .collect()
}

fn elements_of(slot: &DigitSlot, segs: &[&str]) -> Option<Vec<String>> {
    segs.iter().map(|s| slot.segments.iter().find(|(n, _)| n == s).map(|(_, e)| e.clone())).collect()
}

/// Elements that show `text` on the digits, and the characters that could not be shown
/// (no position left, no such character in the style, a segment the position lacks, a
/// `.` or `:` after a position without one), each with its 0-based index in the text.
pub fn text_elements(art: &Artwork, text: &str) -> (Vec<String>, Vec<(usize, char)>) {
    let mut on = Vec::new();
    let mut missed = Vec::new();
    let mut next = 0usize;
    // What the last filled position still takes: its point, its colon (one element, or
    // two dots under multiplexed drive).
    let mut last: Option<(Option<&String>, Option<&Vec<String>>)> = None;
    for (i, c) in text.chars().enumerate() {
        if let Some((point, colon)) = last.as_mut() {
            let taken: Option<Vec<String>> = match c {
                '.' => point.take().map(|e| vec![e.clone()]),
                ':' => colon.take().cloned(),
                _ => None,
            };
            if let Some(e) = taken {
                on.extend(e);
                continue;
            }
        }
        if matches!(c, '.' | ':') {
            // Marks only: they never take a position of their own.
            missed.push((i, c));
            continue;
        }
        let Some(slot) = art.digits.get(next) else {
            missed.push((i, c));
            continue;
        };
        next += 1;
        last = Some((slot.point.as_ref(), (!slot.colon.is_empty()).then_some(&slot.colon)));
        match charset(slot.style).lookup(c).and_then(|segs| elements_of(slot, segs)) {
            Some(e) => on.extend(e),
            None => missed.push((i, c)),
        }
    }
    (on, missed)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::layout::DigitStyle;

    fn slot(pos: u32, segs: &[&str], point: bool, colon: bool) -> DigitSlot {
        DigitSlot {
            group: "D".into(),
            position: pos,
            style: DigitStyle::Seven,
            segments: segs.iter().map(|s| (s.to_string(), format!("D{pos}.{s}"))).collect(),
            point: point.then(|| format!("D{pos}.dp")),
            colon: if colon { vec![format!("D{pos}.col")] } else { Vec::new() },
        }
    }

    /// A half digit then a full one with a point and a colon: "1.8:" lights b c of the
    /// half digit, all seven of the second and its colon; the `.` after the half digit
    /// has nowhere to go (seven-segment shapes: docs/background.md, *Seven-segment
    /// patterns*).
    #[test]
    fn points_and_colons_attach_to_the_position_before() {
        let mut art = crate::check::fixture::clean();
        art.digits = vec![slot(1, &["b", "c"], false, false), slot(2, &["a", "b", "c", "d", "e", "f", "g"], true, true)];
        let (on, missed) = text_elements(&art, "1.8:");
        assert_eq!(missed, vec![(1, '.')]);
        let want: Vec<String> =
            ["D1.b", "D1.c", "D2.a", "D2.b", "D2.c", "D2.d", "D2.e", "D2.f", "D2.g", "D2.col"].map(String::from).to_vec();
        assert_eq!(on, want);
        // The half digit shows only characters drawn with b and c: "1" and the space.
        let shown: String = characters(&art.digits[0]).iter().map(|(c, _)| *c).collect();
        assert_eq!(shown, "1 ");
        // A third character has no position.
        assert_eq!(text_elements(&art, "188").1, vec![(2, '8')]);
    }
}
