//! The scale ruler printed on every film.
//!
//! Takes a place on the page and a length, gives the ruler's strokes: a base line, a
//! tick every millimetre, longer ticks every 5 mm and longest every 10 mm, numbered in
//! mm. Printers and viewers rescale pages (docs/background.md, *Scale ruler*), so the
//! ruler is measured with
//! a good steel rule before a film is used.

use super::page::{TextPlace, polylines_d, stroke, text};
use super::text::text_width;
use svg::node::element::Group;

/// Shortest ruler, mm.
pub const MIN_LENGTH: f64 = 50.0;
/// Tick lengths at 1, 5 and 10 mm, mm.
const TICKS: [f64; 3] = [1.0, 1.6, 2.4];
/// Line width of the ruler, mm.
const LINE: f64 = 0.1;
/// Cap height of the numbers, mm.
const NUMBER_HEIGHT: f64 = 1.4;
/// Height the ruler takes below its base line, numbers included, mm.
pub const DEPTH: f64 = 4.6;

/// Ruler length for a plate `width` mm wide: the plate width rounded down to whole
/// centimetres, but never shorter than [`MIN_LENGTH`].
pub fn length_for(width: f64) -> f64 {
    ((width / 10.0).floor() * 10.0).max(MIN_LENGTH)
}

/// A ruler of whole-mm `length` whose zero is at page (`left`, `top`), ticks hanging
/// down from the base line.
pub fn ruler(left: f64, top: f64, length: f64) -> Group {
    let n = length.round() as i64;
    let mut lines = vec![vec![(left, top), (left + n as f64, top)]];
    for i in 0..=n {
        let t = if i % 10 == 0 {
            TICKS[2]
        } else if i % 5 == 0 {
            TICKS[1]
        } else {
            TICKS[0]
        };
        lines.push(vec![(left + i as f64, top), (left + i as f64, top + t)]);
    }
    let mut g = Group::new().add(stroke(polylines_d(&lines), "#000000", LINE));
    let baseline = top + TICKS[2] + 0.6 + NUMBER_HEIGHT;
    for i in (0..=n).step_by(10) {
        let label = if i == n - n % 10 { format!("{i} MM") } else { i.to_string() };
        let w = text_width(&i.to_string(), NUMBER_HEIGHT);
        let at = TextPlace { left: left + i as f64 - w / 2.0, baseline, height: NUMBER_HEIGHT, mirrored: false };
        g = g.add(text(&label, at, "#000000"));
    }
    g
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn length_is_at_least_fifty_millimetres() {
        assert_eq!(length_for(20.0), 50.0);
        assert_eq!(length_for(87.3), 80.0);
    }

    /// One tick per millimetre plus the base line: 51 ticks on a 50 mm ruler.
    #[test]
    fn one_tick_per_millimetre() {
        let s = ruler(0.0, 0.0, 50.0).to_string();
        let first = s.split("d=\"").nth(1).unwrap();
        let moves = first.split('"').next().unwrap().matches('M').count();
        assert_eq!(moves, 52);
    }
}
