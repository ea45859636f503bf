//! A tiny built-in stroke alphabet for the words printed on films.
//!
//! Takes a string and a cap height, gives polylines in a local frame (mm, origin at the
//! left end of the baseline, y up). Films must not depend on installed fonts, so their
//! titles, ruler numbers and side notes are drawn with these strokes. The alphabet is
//! ours: capitals A–Z, digits 0–9 and a few symbols on a 4 × 6 grid; lower case prints as
//! upper case and anything else as `?`.

/// Glyph cell width in grid units.
const CELL_W: f64 = 4.0;
/// Cap height in grid units.
const CELL_H: f64 = 6.0;
/// Advance from one glyph to the next, grid units.
const ADVANCE: f64 = 6.0;

/// Strokes of one glyph: point pairs `xy` (grid digits) separated by spaces, strokes by `;`.
fn glyph(c: char) -> &'static str {
    match c.to_ascii_uppercase() {
        'A' => "00 05 16 36 45 40;03 43",
        'B' => "00 06 36 45 44 33 03;33 42 41 30 00",
        'C' => "45 36 16 05 01 10 30 41",
        'D' => "00 06 26 44 42 20 00",
        'E' => "40 00 06 46;03 33",
        'F' => "00 06 46;03 33",
        'G' => "45 36 16 05 01 10 30 41 43 23",
        'H' => "00 06;40 46;03 43",
        'I' => "10 30;20 26;16 36",
        'J' => "46 41 30 10 01 02",
        'K' => "00 06;46 02;13 40",
        'L' => "06 00 40",
        'M' => "00 06 23 46 40",
        'N' => "00 06 40 46",
        'O' => "10 01 05 16 36 45 41 30 10",
        'P' => "00 06 36 45 44 33 03",
        'Q' => "10 01 05 16 36 45 41 30 10;22 40",
        'R' => "00 06 36 45 44 33 03;23 40",
        'S' => "45 36 16 05 04 13 33 42 41 30 10 01",
        'T' => "06 46;20 26",
        'U' => "06 01 10 30 41 46",
        'V' => "06 20 46",
        'W' => "06 10 23 30 46",
        'X' => "00 46;06 40",
        'Y' => "06 23 46;23 20",
        'Z' => "06 46 00 40",
        '0' => "10 01 05 16 36 45 41 30 10;11 35",
        '1' => "15 26 20;10 30",
        '2' => "05 16 36 45 44 00 40",
        '3' => "05 16 36 45 44 33 13;33 42 41 30 10 01",
        '4' => "30 36 02 42",
        '5' => "46 06 04 34 43 41 30 10 01",
        '6' => "45 36 16 05 01 10 30 41 42 33 03",
        '7' => "06 46 10",
        '8' => "13 04 05 16 36 45 44 33 13 02 01 10 30 41 42 33",
        '9' => "01 10 30 41 45 36 16 05 04 13 43",
        ' ' => "",
        '-' => "13 33",
        '_' => "00 40",
        '.' => "20 21",
        ',' => "21 10",
        ':' => "21 22;24 25",
        '/' => "00 46",
        '(' => "26 15 11 20",
        ')' => "26 35 31 20",
        '+' => "03 43;21 25",
        '=' => "02 42;04 44",
        '\'' => "25 26",
        _ => "05 16 36 45 44 23 22;20 21",
    }
}

/// Stroke width for text of cap height `height` (mm).
pub fn stroke_width(height: f64) -> f64 {
    height / 8.0
}

/// Width of `text` set at cap height `height`, from the left of the first glyph to the
/// right of the last (mm).
pub fn text_width(text: &str, height: f64) -> f64 {
    let n = text.chars().count();
    if n == 0 {
        return 0.0;
    }
    let unit = height / CELL_H;
    ((n - 1) as f64 * ADVANCE + CELL_W) * unit
}

/// Polylines of `text` at cap height `height` (mm), origin at the left end of the
/// baseline, y up.
///
/// ```
/// use segmask::emit::text::text_strokes;
/// let s = text_strokes("L", 6.0);
/// assert_eq!(s, vec![vec![(0.0, 6.0), (0.0, 0.0), (4.0, 0.0)]]);
/// ```
pub fn text_strokes(text: &str, height: f64) -> Vec<Vec<(f64, f64)>> {
    let unit = height / CELL_H;
    let mut out = Vec::new();
    for (i, c) in text.chars().enumerate() {
        let x0 = i as f64 * ADVANCE;
        for stroke in glyph(c).split(';').filter(|s| !s.is_empty()) {
            let pts = stroke
                .split(' ')
                .filter_map(|p| {
                    let mut d = p.chars().filter_map(|c| c.to_digit(10));
                    Some(((x0 + d.next()? as f64) * unit, d.next()? as f64 * unit))
                })
                .collect();
            out.push(pts);
        }
    }
    out
}

/// Largest cap height, at most `height`, at which `text` fits in `width` mm.
pub fn fit_height(text: &str, height: f64, width: f64) -> f64 {
    let w = text_width(text, height);
    if w > width && w > 0.0 { height * width / w } else { height }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every glyph stays inside its 4 × 6 cell (a glyph outside it would collide with its
    /// neighbours).
    #[test]
    fn glyphs_stay_in_their_cell() {
        let all = "ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789 -_.,:/()+='?";
        for c in all.chars() {
            for s in text_strokes(&c.to_string(), CELL_H) {
                assert!(!s.is_empty(), "{c}");
                for (x, y) in s {
                    assert!((0.0..=CELL_W).contains(&x) && (0.0..=CELL_H).contains(&y), "{c}: {x},{y}");
                }
            }
        }
    }

    #[test]
    fn width_counts_advances() {
        assert_eq!(text_width("AB", 6.0), 10.0);
        // "ABCDE" at cap height 6 is 4 advances of 6 plus one cell of 4 = 28 wide.
        assert!((fit_height("ABCDE", 6.0, 14.0) - 3.0).abs() < 1e-12);
    }
}
