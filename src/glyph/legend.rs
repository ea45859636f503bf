//! Legends: text set in the legend stroke font.
//!
//! Takes a text, an anchor, a cap height, a stroke width and an alignment; gives the
//! united ink of all its glyphs (round caps and joins), or the characters the font lacks.
//!
//! Metrics: the *ink* of a capital spans exactly `height` (baseline to cap line), so the
//! centre lines are scaled to `height − stroke` and raised by half a stroke. Each glyph
//! advances the pen by its advance (scaled the same way) plus one stroke width, which
//! keeps the designed space between the inks of neighbouring letters at any stroke. The
//! text is aligned by its ink: `left` puts the leftmost ink on the anchor, `right` the
//! rightmost, `centre` the middle; the anchor's y is the baseline (bottom of the ink of
//! capitals).

use super::fonts::Fonts;
use super::ink::{Pen, ink};
use crate::geom::{Pt, Region, pt, translate, union_all};
use crate::layout::Align;
use geo::BoundingRect;

/// Sets `text`; the error lists the characters the font lacks, in order of appearance.
pub fn set_text(
    fonts: &Fonts,
    text: &str,
    at: Pt,
    height: f64,
    stroke: f64,
    align: Align,
    tol: f64,
) -> Result<Region, Vec<char>> {
    let missing: Vec<char> = text.chars().filter(|c| fonts.glyph(*c).is_none()).fold(Vec::new(), |mut v, c| {
        if !v.contains(&c) {
            v.push(c);
        }
        v
    });
    if !missing.is_empty() {
        return Err(missing);
    }
    let k = height - stroke;
    let mut pen_x = 0.0;
    let mut polys = Vec::new();
    for c in text.chars() {
        let Some(g) = fonts.glyph(c) else { continue };
        let pen = Pen { scale: k, origin: pt(pen_x + stroke / 2.0, stroke / 2.0), stroke, tol };
        polys.extend(ink(&g.marks, &pen).0);
        pen_x += k * g.advance + stroke;
    }
    let region = union_all(polys);
    let Some(bb) = region.bounding_rect() else { return Ok(region) };
    let dx = match align {
        Align::Left => at.x - bb.min().x,
        Align::Right => at.x - bb.max().x,
        Align::Centre => at.x - (bb.min().x + bb.max().x) / 2.0,
    };
    Ok(translate(&region, dx, at.y))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::area;
    use std::f64::consts::PI;

    fn set(text: &str, height: f64, stroke: f64, align: Align) -> Region {
        set_text(Fonts::builtin().unwrap(), text, pt(10.0, 5.0), height, stroke, align, 1e-4).unwrap()
    }

    /// Reference area by sampling: the ink of a stroke drawing is by definition the set
    /// of points within w/2 of the centre lines (the Minkowski sum with a disc), so a
    /// midpoint-rule count over a fine grid measures it independently of the buffer and
    /// union code; the error is below perimeter × cell size. `dist` is the distance from
    /// a point to the centre lines.
    fn sampled_area(dist: impl Fn(Pt) -> f64, w: f64, bb: (Pt, Pt), cell: f64) -> f64 {
        let (nx, ny) = (((bb.1.x - bb.0.x) / cell).ceil() as usize, ((bb.1.y - bb.0.y) / cell).ceil() as usize);
        let mut n = 0usize;
        for i in 0..nx {
            for j in 0..ny {
                let p = pt(bb.0.x + (i as f64 + 0.5) * cell, bb.0.y + (j as f64 + 0.5) * cell);
                if dist(p) <= w / 2.0 {
                    n += 1;
                }
            }
        }
        n as f64 * cell * cell
    }

    /// "8" is two stroked circles touching (legend.strokes: radii 2.4 and 2.6 of a cap of
    /// 10). The stroke-length estimate L·w (closed strokes have no caps) overcounts only
    /// where the strokes meet, and the sampled Minkowski area agrees within 0.5 %.
    #[test]
    fn eight_area() {
        let (h, w) = (10.0, 0.6);
        let r = set("8", h, w, Align::Left);
        let k = (h - w) / 10.0;
        let a = area(&r);
        let length = 2.0 * PI * (2.4 + 2.6) * k;
        assert!(a < length * w && a > 0.93 * length * w, "{a} vs {}", length * w);
        // Centre lines of the two circles, placed as set_text places them: the leftmost
        // ink is the lower circle's.
        let bb = r.bounding_rect().unwrap();
        let x0 = bb.min().x + w / 2.0 + (2.6 - 2.5) * k;
        let y0 = 5.0 + w / 2.0;
        let circles = [(2.5, 7.6, 2.4), (2.5, 2.6, 2.6)].map(|(x, y, r)| (pt(x0 + x * k, y0 + y * k), r * k));
        let dist = |p: Pt| {
            circles
                .iter()
                .map(|(c, r)| (((p.x - c.x).powi(2) + (p.y - c.y).powi(2)).sqrt() - r).abs())
                .fold(f64::MAX, f64::min)
        };
        let s = sampled_area(dist, w, (bb.min(), bb.max()), 0.005);
        assert!((a - s).abs() / s < 0.005, "{a} vs sampled {s}");
    }

    /// "-" is one straight stroke: a stadium of area L·w + π(w/2)² exactly.
    #[test]
    fn minus_is_a_stadium() {
        let (h, w) = (5.0, 0.5);
        let a = area(&set("-", h, w, Align::Left));
        let k = (h - w) / 10.0;
        let exact = 4.0 * k * w + PI * w * w / 4.0;
        assert!((a - exact).abs() < 1e-3, "{a} vs {exact}");
    }

    #[test]
    fn every_required_char_renders_inside_its_cap_box() {
        use geo::Validation;
        let f = Fonts::builtin().unwrap();
        let required = "ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789°%.,:-+/()µΩ";
        for c in required.chars() {
            assert!(f.glyph(c).is_some(), "{c} missing");
        }
        for c in f.chars().filter(|c| *c != ' ') {
            let r = set(&c.to_string(), 4.0, 0.4, Align::Left);
            assert!(!r.0.is_empty() && r.is_valid(), "{c}");
            let bb = r.bounding_rect().unwrap();
            // Ink between 40 % of the cap height below the baseline and 15 % above the cap
            // line (descenders, parentheses), and the left ink edge on the anchor.
            assert!(bb.min().y >= 5.0 - 1.6 - 1e-6 && bb.max().y <= 9.0 + 0.6 + 1e-6, "{c}: {bb:?}");
            assert!((bb.min().x - 10.0).abs() < 1e-6, "{c}");
        }
    }

    #[test]
    fn capitals_span_the_cap_height() {
        let r = set("E", 3.0, 0.3, Align::Left);
        let bb = r.bounding_rect().unwrap();
        assert!((bb.min().y - 5.0).abs() < 1e-6 && (bb.max().y - 8.0).abs() < 1e-6, "{bb:?}");
    }

    #[test]
    fn alignment() {
        let l = set("kPa", 3.0, 0.3, Align::Left).bounding_rect().unwrap();
        let r = set("kPa", 3.0, 0.3, Align::Right).bounding_rect().unwrap();
        let c = set("kPa", 3.0, 0.3, Align::Centre).bounding_rect().unwrap();
        assert!((l.min().x - 10.0).abs() < 1e-6);
        assert!((r.max().x - 10.0).abs() < 1e-6);
        assert!(((c.min().x + c.max().x) / 2.0 - 10.0).abs() < 1e-6);
        assert!((l.width() - r.width()).abs() < 1e-6);
    }

    #[test]
    fn missing_characters_are_listed() {
        let e = set_text(Fonts::builtin().unwrap(), "A€B€¥", pt(0.0, 0.0), 3.0, 0.3, Align::Left, 1e-3).unwrap_err();
        assert_eq!(e, vec!['€', '¥']);
    }
}
