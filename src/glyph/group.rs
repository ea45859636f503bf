//! A digit group → its segment, decimal-point and colon elements.
//!
//! Takes one [`DigitGroup`] and the font set; gives the elements of every digit in order
//! (segments in the style's order, then `dp`, then `col`), or the input problems found
//! (a cell too small for its stroke, dots that do not fit between the digits).

use super::body::build_bodies;
use super::digit::{Cell, build_segments, colon, decimal_point};
use super::fonts::Fonts;
use super::outline::finish;
use super::{Element, ElementKind};
use crate::geom::{Polygon, distance, region_of};
use crate::layout::{COLON, COLON_DOTS, DECIMAL_POINT, DigitGroup, Layout, segment_net};
use crate::{Error, Result};

/// The half-digit segments (a leading "1").
pub const HALF_DIGIT_SEGMENTS: [&str; 2] = ["b", "c"];

/// Builds every element of one group.
pub fn build_group(layout: &Layout, fonts: &Fonts, g: &DigitGroup) -> Result<Vec<Element>> {
    let skel = fonts.style(g.style);
    let bad = |field: &str, msg: String, allowed: Option<String>| {
        Error::input(layout.problem(&format!("{}.{field}", g.key), msg, allowed))
    };
    if !(g.stroke > 0.0 && 2.0 * g.stroke < g.width.min(g.height)) {
        return Err(bad(
            "stroke",
            format!("stroke {} mm is too wide for a {} × {} mm digit", g.stroke, g.width, g.height),
            Some(format!("more than 0 and less than {} mm", g.width.min(g.height) / 2.0)),
        ));
    }
    if !(g.gap >= 0.0 && g.gap < g.stroke) {
        return Err(bad(
            "gap",
            format!("gap {} mm", g.gap),
            Some(format!("0 to less than the stroke, {} mm", g.stroke)),
        ));
    }
    if g.slant.abs() >= 45.0 {
        return Err(bad("slant", format!("slant {}°", g.slant), Some("between -45° and 45°".into())));
    }
    for (field, list) in [("decimal_points", &g.decimal_points), ("colons", &g.colons), ("half_digits", &g.half_digits)]
    {
        if let Some(n) = list.iter().find(|n| **n < 1 || **n > g.count) {
            return Err(bad(field, format!("there is no digit {n}"), Some(format!("digit numbers 1 to {}", g.count))));
        }
    }
    let tol = layout.tolerance;
    let cell_of = |i: u32| Cell {
        origin: crate::geom::pt(g.origin.x + f64::from(i - 1) * g.pitch, g.origin.y),
        width: g.width,
        height: g.height,
        stroke: g.stroke,
        slant: g.slant,
    };
    let segs_of = |i: u32, gap: f64| build_segments(skel, &cell_of(i), gap);
    let mut out = Vec::new();
    let mut problems = Vec::new();
    for i in 1..=g.count {
        let cell = cell_of(i);
        let (outlines, bodies) = match (segs_of(i, g.gap), build_bodies(skel, &cell_of(i), g.gap)) {
            (Ok(o), Ok(b)) => (o, b),
            (Err(e), _) | (_, Err(e)) => return Err(bad("stroke", e, None)),
        };
        let half = g.half_digits.contains(&i);
        for ((name, outline), (_, body)) in outlines.iter().zip(&bodies) {
            if half && !HALF_DIGIT_SEGMENTS.contains(&name.as_str()) {
                continue;
            }
            let drives = format!("digit {i} segment {name}");
            out.push(element(g, i, name, vec![outline.clone()], Some(body.clone()), drives)?);
        }
        // Dots must keep the gap from this digit, the next one and each other.
        let (has_dp, has_colon) = (g.decimal_points.contains(&i), g.colons.contains(&i));
        let mut near: Vec<Polygon> = Vec::new();
        let mut next_digit: Vec<Polygon> = Vec::new();
        if has_dp || has_colon {
            near.extend(outlines.iter().map(|s| s.1.clone()));
            if i < g.count
                && let Ok(next) = segs_of(i + 1, g.gap)
            {
                next_digit.extend(next.into_iter().map(|s| s.1));
            }
        }
        let own: Vec<Polygon> = near.clone();
        near.extend(next_digit.iter().cloned());
        let mut dots: Vec<Polygon> = Vec::new();
        if has_dp {
            let dp = decimal_point(skel, &cell, tol);
            if let Some(d) = too_close(&dp, &near, g.gap) {
                // The point stands a fixed number of strokes right of its own digit, so a
                // wider gap needs a thicker stroke there; the next digit needs more pitch.
                let fix = if too_close(&dp, &own, g.gap).is_some() {
                    format!(
                        "a thicker stroke (the point stands {} strokes right of its digit: a stroke of at least {:.3} mm), or a smaller gap",
                        skel.dp.space,
                        g.gap / skel.dp.space.max(1e-9)
                    )
                } else {
                    "a larger pitch, or a thinner stroke".to_string()
                };
                problems.push(layout.problem(
                    &format!("{}.decimal_points", g.key),
                    format!(
                        "the decimal point after digit {i} comes within {d:.3} mm of a segment; the gap is {:.3} mm",
                        g.gap
                    ),
                    Some(fix),
                ));
            }
            dots.push(dp.clone());
            out.push(element(g, i, DECIMAL_POINT, vec![dp], None, format!("digit {i} decimal point"))?);
        }
        if has_colon {
            let pieces = colon(skel, &cell, g.pitch, tol);
            let clash = pieces.iter().filter_map(|p| too_close(p, &near, g.gap).or(too_close(p, &dots, g.gap))).next();
            if let Some(d) = clash {
                problems.push(layout.problem(
                    &format!("{}.colons", g.key),
                    format!(
                        "the colon after digit {i} comes within {d:.3} mm of a segment or dot; the gap is {:.3} mm",
                        g.gap
                    ),
                    Some("a larger pitch, or a thinner stroke".into()),
                ));
            }
            if layout.drive.commons > 1 {
                // Multiplexed: each dot its own element (see `COLON_DOTS`), upper first.
                let [low, high] = pieces;
                for (name, piece, which) in [(COLON_DOTS[0], high, "upper"), (COLON_DOTS[1], low, "lower")] {
                    out.push(element(g, i, name, vec![piece], None, format!("{which} dot of the colon after digit {i}"))?);
                }
            } else {
                out.push(element(g, i, COLON, pieces.to_vec(), None, format!("colon after digit {i}"))?);
            }
        }
    }
    if problems.is_empty() { Ok(out) } else { Err(Error::Input(problems)) }
}

fn too_close(p: &Polygon, others: &[Polygon], gap: f64) -> Option<f64> {
    let d = others.iter().map(|o| distance(p, o)).fold(f64::INFINITY, f64::min);
    (d < gap - 1e-9).then_some(d)
}

fn element(
    g: &DigitGroup,
    i: u32,
    name: &str,
    outline: Vec<Polygon>,
    body: Option<Vec<Polygon>>,
    drives: String,
) -> Result<Element> {
    let net = segment_net(&g.name, i, name);
    let bug = |e: String| Error::Bug(format!("{net}: {e}"));
    let outline = finish(&region_of(outline)).map_err(bug)?;
    let body = match body {
        Some(b) => finish(&region_of(b)).map_err(bug)?,
        None => outline.clone(),
    };
    let digit = Some(format!("{}{}", g.name, i));
    Ok(Element { name: net, kind: ElementKind::Segment, outline, body, digit, drives, key: g.key.clone() })
}
