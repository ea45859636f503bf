//! The scale rulers printed on every film, one along each axis.
//!
//! Takes a place on the page, a length and a direction, gives the ruler's strokes: a
//! base line, a tick every millimetre, longer ticks every 5 mm and longest every 10 mm,
//! numbered in mm. Printers and viewers rescale pages, and not always alike in x and y
//! (docs/background.md, *Scale ruler*), so both rulers are measured with a good steel rule
//! before a film is used.

use super::drawing::{Item, Paint};
use super::page::{TextPlace, text_lines};
use super::text::{stroke_width, text_width};

/// Shortest ruler, mm.
pub const MIN_LENGTH: f64 = 50.0;
/// Tick lengths at 1, 5 and 10 mm, mm.
const TICKS: [f64; 3] = [1.0, 1.6, 2.4];
/// Line width of the ruler, mm.
const LINE: f64 = 0.1;
/// Cap height of the numbers, mm.
const NUMBER_HEIGHT: f64 = 1.4;
/// Room the ruler takes beside its base line, numbers included, mm.
pub const DEPTH: f64 = 4.6;

/// Ruler length for a plate side `size` mm long: rounded down to whole centimetres, but
/// never shorter than [`MIN_LENGTH`].
pub fn length_for(size: f64) -> f64 {
    ((size / 10.0).floor() * 10.0).max(MIN_LENGTH)
}

/// Which way a ruler runs.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Axis {
    /// Left to right, ticks hanging down, numbers below.
    Across,
    /// Top to bottom, ticks pointing left, numbers to their left.
    Down,
}

/// Tick length at millimetre `i`.
fn tick(i: i64) -> f64 {
    if i % 10 == 0 {
        TICKS[2]
    } else if i % 5 == 0 {
        TICKS[1]
    } else {
        TICKS[0]
    }
}

/// A ruler of whole-mm `length` whose zero is at page point (`x`, `y`).
pub fn ruler(x: f64, y: f64, length: f64, axis: Axis) -> Vec<Item> {
    let n = length.round() as i64;
    // Page point at distance `along` from zero and `off` towards the ticks' side.
    let at = |along: f64, off: f64| match axis {
        Axis::Across => (x + along, y + off),
        Axis::Down => (x - off, y + along),
    };
    let mut lines = vec![vec![at(0.0, 0.0), at(n as f64, 0.0)]];
    for i in 0..=n {
        lines.push(vec![at(i as f64, 0.0), at(i as f64, tick(i))]);
    }
    let mut items = vec![Item::Stroke { lines, width: LINE, paint: Paint::Ink }];
    let mut numbers = Vec::new();
    for i in (0..=n).step_by(10) {
        let s = i.to_string();
        let w = text_width(&s, NUMBER_HEIGHT);
        let place = match axis {
            Axis::Across => {
                let label = if i == n - n % 10 { format!("{i} MM") } else { s };
                let p = TextPlace { left: x + i as f64 - w / 2.0, baseline: y + TICKS[2] + 0.6 + NUMBER_HEIGHT, height: NUMBER_HEIGHT, mirrored: false };
                (label, p)
            }
            Axis::Down => {
                let p = TextPlace { left: x - TICKS[2] - 0.6 - w, baseline: y + i as f64 + NUMBER_HEIGHT / 2.0, height: NUMBER_HEIGHT, mirrored: false };
                (s, p)
            }
        };
        numbers.extend(text_lines(&place.0, place.1));
    }
    items.push(Item::Stroke { lines: numbers, width: stroke_width(NUMBER_HEIGHT), paint: Paint::Ink });
    items
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn length_is_at_least_fifty_millimetres() {
        assert_eq!(length_for(20.0), 50.0);
        assert_eq!(length_for(87.3), 80.0);
    }

    /// One tick per millimetre plus the base line: 51 ticks on a 50 mm ruler, on both
    /// axes; the vertical ruler's ticks are horizontal and one millimetre apart.
    #[test]
    fn one_tick_per_millimetre() {
        for axis in [Axis::Across, Axis::Down] {
            let Item::Stroke { lines, .. } = &ruler(0.0, 0.0, 50.0, axis)[0] else { panic!() };
            assert_eq!(lines.len(), 52);
            if axis == Axis::Down {
                assert_eq!(lines[2][0].1 - lines[1][0].1, 1.0);
                assert_eq!(lines[1][0].1, lines[1][1].1);
            }
        }
    }
}
