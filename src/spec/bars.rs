//! Resolution of `bars:`: each raw bar graph → a [`BarGraph`], every value checked on
//! its own and the steps checked to be drawable (at least the minimum line width across
//! and along a line, and at the inner radius of an arc; first and last step apart on a
//! nearly closed arc). Where the steps sit relative to the window and the other elements is
//! checked in `placement.rs`.

use super::elements::element_name;
use super::problems::Problems;
use super::raw::{RawBar, RawBarArc, RawBarLine};
use super::read::{Sign, mm};
use crate::geom::pt;
use crate::layout::{BarGraph, BarPath, MAX_STEPS, Rules, StepShape, StepSide};

/// Sides a step may stand on along a straight line.
const LINE_SIDES: [(&str, StepSide); 4] =
    [("centre", StepSide::Centre), ("center", StepSide::Centre), ("left", StepSide::Left), ("right", StepSide::Right)];
/// Sides a step may stand on along an arc.
const ARC_SIDES: [(&str, StepSide); 4] = [
    ("centre", StepSide::Centre),
    ("center", StepSide::Centre),
    ("inside", StepSide::Inside),
    ("outside", StepSide::Outside),
];
/// Step shapes.
const SHAPES: [(&str, StepShape); 2] = [("rectangle", StepShape::Rectangle), ("wedge", StepShape::Wedge)];

/// `bars:`; the gap defaults to the digits' segment gap, `lead_width + 2·min_gap`, so a
/// lead fits between two steps, and may not be below `min_gap`.
pub fn bars(p: &mut Problems, raw: &[RawBar], rules: &Rules) -> Vec<BarGraph> {
    raw.iter().enumerate().map(|(i, b)| bar(p, b, &format!("bars[{i}]"), rules)).collect()
}

fn bar(p: &mut Problems, b: &RawBar, key: &str, rules: &Rules) -> BarGraph {
    let k = |f: &str| format!("{key}.{f}");
    let name = element_name(p, b.name.as_ref(), &k("name"));
    let mut count = p.int(b.count.as_ref(), &k("count"), None, 1);
    if count > i64::from(MAX_STEPS) {
        p.bad(
            &k("count"),
            format!("{count} steps in one bar graph is more than segment glass carries"),
            &format!("1 to {MAX_STEPS}"),
        );
        count = 1;
    }
    let count = count as u32;
    let length = p.length(b.length.as_ref(), &k("length"), None, Sign::Positive);
    let last_length = p.length(b.last_length.as_ref(), &k("last_length"), Some(length), Sign::Positive);
    let gap_default = rules.lead_width + 2.0 * rules.min_gap;
    let gap = p.length(b.gap.as_ref(), &k("gap"), Some(gap_default), Sign::Positive);
    if p.clean(&[&k("gap")]) && gap < rules.min_gap - 1e-12 {
        p.bad(
            &k("gap"),
            format!("gap {} is below the minimum gap", mm(gap)),
            &format!("at least rules.min_gap, {}", mm(rules.min_gap)),
        );
    }
    let path = match (&b.line, &b.arc) {
        (Some(l), None) => line(p, l, b, key, count, gap),
        (None, Some(a)) => arc(p, a, b, key),
        (l, _) => {
            let m = if l.is_some() { "both `line` and `arc` given" } else { "no `line` or `arc` given" };
            p.bad(key, m, "exactly one of line, arc");
            BarPath::Line { from: pt(0.0, 0.0), angle: 0.0, thickness: 1.0 }
        }
    };
    let on_arc = matches!(path, BarPath::Arc { .. });
    let sides: &[(&str, StepSide)] = if on_arc { &ARC_SIDES } else { &LINE_SIDES };
    let side = p.word(b.side.as_ref(), &k("side"), sides, Some(StepSide::Centre));
    let default_shape = if on_arc { StepShape::Wedge } else { StepShape::Rectangle };
    let shape = p.word(b.shape.as_ref(), &k("shape"), &SHAPES, Some(default_shape));
    if shape == StepShape::Wedge && !on_arc && p.clean(&[key]) {
        p.bad(&k("shape"), "a wedge needs an arc", "rectangle along a line; rectangle or wedge on an arc");
    }
    let g = BarGraph { name, count, path, shape, side, length, last_length, gap, key: key.to_string() };
    if p.clean(&[key]) {
        wide_enough(p, &g, b, rules.min_width);
    }
    if p.clean(&[key]) {
        drawable(p, &g, rules.min_width);
    }
    g
}

/// Steps narrower than the minimum line width would not survive the etch.
fn wide_enough(p: &mut Problems, g: &BarGraph, b: &RawBar, min_width: f64) {
    let thickness = match (&g.path, &b.line) {
        (BarPath::Line { thickness, .. }, Some(l)) => {
            Some((*thickness, if l.to.is_some() { "line.to" } else { "thickness" }))
        }
        _ => None,
    };
    let sizes = [(g.length, "length"), (g.last_length, "last_length")].into_iter().chain(thickness);
    for (v, field) in sizes {
        if v < min_width - 1e-12 {
            p.bad(
                &format!("{}.{field}", g.key),
                format!("steps {} wide are narrower than the minimum line width", mm(v)),
                &format!("at least rules.min_width, {}", mm(min_width)),
            );
        }
    }
}

/// `line: {from, angle | to}`; with `to` the thickness follows from the run.
fn line(p: &mut Problems, l: &RawBarLine, b: &RawBar, key: &str, count: u32, gap: f64) -> BarPath {
    let k = |f: &str| format!("{key}.line.{f}");
    let from = p.point(l.from.as_ref(), &k("from"), None);
    let Some(to) = &l.to else {
        let angle = p.angle(l.angle.as_ref(), &k("angle"), 0.0);
        let thickness = p.length(b.thickness.as_ref(), &format!("{key}.thickness"), None, Sign::Positive);
        return BarPath::Line { from, angle, thickness };
    };
    if l.angle.is_some() {
        p.bad(&k("angle"), "`angle` and `to` both given", "one of them: the direction, or the end point");
    }
    if b.thickness.is_some() {
        p.bad(
            &format!("{key}.thickness"),
            "`thickness` given with `line.to`",
            "no thickness: with `to` the steps share the run from `from` to `to`",
        );
    }
    let to = p.point(Some(to), &k("to"), None);
    let run = ((to.x - from.x).powi(2) + (to.y - from.y).powi(2)).sqrt();
    let angle = (to.y - from.y).atan2(to.x - from.x).to_degrees();
    let n = f64::from(count.max(1));
    let thickness = (run - (n - 1.0) * gap) / n;
    if p.clean(&[&k("from"), &k("to"), &format!("{key}.count"), &format!("{key}.gap")]) && thickness <= 0.0 {
        p.bad(
            &k("to"),
            format!("a run of {} leaves no room for {count} steps with gaps of {}", mm(run), mm(gap)),
            &format!("a run longer than (count − 1) × gap, {}", mm((n - 1.0) * gap)),
        );
        return BarPath::Line { from, angle, thickness: 1.0 };
    }
    BarPath::Line { from, angle, thickness }
}

/// `arc: {centre, radius, start, end}`; the thickness follows from the angles.
fn arc(p: &mut Problems, a: &RawBarArc, b: &RawBar, key: &str) -> BarPath {
    let k = |f: &str| format!("{key}.arc.{f}");
    let centre = p.point(a.centre.as_ref(), &k("centre"), None);
    let radius = p.length(a.radius.as_ref(), &k("radius"), None, Sign::Positive);
    let start = required_angle(p, a.start.as_ref(), &k("start"));
    let end = required_angle(p, a.end.as_ref(), &k("end"));
    if b.thickness.is_some() {
        p.bad(
            &format!("{key}.thickness"),
            "`thickness` given with `arc`",
            "no thickness: on an arc the steps share the angle from `start` to `end`",
        );
    }
    let sweep = (end - start).abs();
    if p.clean(&[&k("start"), &k("end")]) && !(sweep > 0.0 && sweep < 360.0) {
        p.bad(
            &k("end"),
            format!("the arc from {start}° to {end}° turns {sweep}°"),
            "an end angle that differs from the start by more than 0° and less than 360°",
        );
    }
    BarPath::Arc { centre, radius, start, end }
}

fn required_angle(p: &mut Problems, v: Option<&super::scalar::Scalar>, key: &str) -> f64 {
    if v.is_none() {
        p.missing(key, "an angle in degrees, counter-clockwise from +x");
    }
    p.angle(v, key, 0.0)
}

/// Checks that every step keeps the minimum line width and the steps keep the gap: on an
/// arc the inner radius must stay above 0 and leave room for the gaps, and a nearly
/// closed arc must leave the gap between its last step and its first.
fn drawable(p: &mut Problems, g: &BarGraph, min_width: f64) {
    let BarPath::Arc { radius, .. } = g.path else { return };
    let key = &g.key;
    let r_in = g.inner_radius().unwrap_or(radius);
    if r_in <= 0.0 {
        p.bad(
            &format!("{key}.length"),
            format!(
                "steps {} long on the {} side of radius {} reach past the centre",
                mm(g.length.max(g.last_length)),
                side_name(g.side),
                mm(radius)
            ),
            &format!("steps reaching less than the radius, {}, towards the centre", mm(radius)),
        );
        return;
    }
    let (a, b) = g.step_angles(0).unwrap_or((0.0, 0.0));
    let pitch = (b - a).abs();
    let allowed = "fewer steps, a smaller gap, or a larger radius";
    match g.shape {
        StepShape::Wedge if g.count > 1 => {
            // A middle step loses asin(gap / 2r) at each side at radius r (the cut's edge
            // is a chord parallel to the radius through the gap's middle).
            // What is left is measured as the chord across it at the inner radius.
            let half_gap = g.gap / (2.0 * r_in);
            let left = pitch.to_radians() - 2.0 * half_gap.min(1.0).asin();
            let width = if half_gap >= 1.0 || left <= 0.0 { 0.0 } else { 2.0 * r_in * (left / 2.0).sin() };
            if width < min_width {
                p.bad(
                    &format!("{key}.count"),
                    format!(
                        "{} steps of {pitch:.3}° leave {} of width at the inner radius {} with gaps of {}",
                        g.count,
                        mm(width),
                        mm(r_in),
                        mm(g.gap)
                    ),
                    &format!("{allowed}; at least rules.min_width, {}, at the inner radius", mm(min_width)),
                );
                return;
            }
        }
        StepShape::Rectangle => {
            let w = g.arc_rect_width().unwrap_or(0.0);
            if pitch > 90.0 || w < min_width {
                p.bad(
                    &format!("{key}.count"),
                    format!(
                        "{} rectangles of {pitch:.3}° each leave {} of width at the inner radius {} with gaps of {}",
                        g.count,
                        mm(w.max(0.0)),
                        mm(r_in),
                        mm(g.gap)
                    ),
                    &format!("{allowed}; at most 90° a step and at least rules.min_width, {}, wide", mm(min_width)),
                );
                return;
            }
        }
        StepShape::Wedge => {}
    }
    // The space left of the full turn lies between the last step and the first; its
    // narrowest place is the chord at the inner radius.
    let rest = 360.0 - pitch * f64::from(g.count);
    if rest < 180.0 && 2.0 * r_in * (rest / 2.0).to_radians().sin() < g.gap - 1e-9 {
        p.bad(
            &format!("{key}.arc.end"),
            format!("the last step comes within {} of the first", mm(2.0 * r_in * (rest / 2.0).to_radians().sin())),
            &format!("an arc leaving at least the gap, {}, between its ends at the inner radius", mm(g.gap)),
        );
    }
}

fn side_name(s: StepSide) -> &'static str {
    match s {
        StepSide::Centre => "centre",
        StepSide::Left => "left",
        StepSide::Right => "right",
        StepSide::Inside => "inside",
        StepSide::Outside => "outside",
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::path::Path;

    fn problems() -> Problems {
        Problems::new(Path::new("t.yaml"), Default::default(), Default::default())
    }

    fn rules() -> Rules {
        crate::layout::fixture::tiny_layout().rules
    }

    fn raw(text: &str) -> RawBar {
        serde_yaml::from_str(text).unwrap()
    }

    #[test]
    fn a_run_is_shared_by_the_steps_and_their_gaps() {
        let mut p = problems();
        let g = bar(
            &mut p,
            &raw("{name: L, count: 4, line: {from: [0, 0], to: [0, 10]}, length: 2, gap: 0.4}"),
            "bars[0]",
            &rules(),
        );
        assert!(p.is_empty());
        let BarPath::Line { angle, thickness, .. } = g.path else { panic!() };
        assert!((angle - 90.0).abs() < 1e-12);
        // 4 t + 3 × 0.4 = 10.
        assert!((thickness - 2.2).abs() < 1e-12);
        assert_eq!((g.shape, g.side), (StepShape::Rectangle, StepSide::Centre));
    }

    #[test]
    fn defaults_follow_the_rules_and_the_path() {
        let mut p = problems();
        let g = bar(
            &mut p,
            &raw("{name: D, count: 3, arc: {centre: [0, 0], radius: 5, start: 180, end: 0}, length: 1}"),
            "bars[0]",
            &rules(),
        );
        assert!(p.is_empty(), "{:?}", p.into_sorted());
        assert_eq!((g.shape, g.side, g.last_length), (StepShape::Wedge, StepSide::Centre, 1.0));
        assert!((g.gap - 0.21).abs() < 1e-12);
    }

    #[test]
    fn bad_bars_are_refused_at_their_keys() {
        let cases = [
            (
                "{name: L, count: 101, line: {from: [0, 0]}, thickness: 1, length: 1}",
                "bars[0].count",
                "more than segment glass carries",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0]}, thickness: 1, length: 1, gap: 0.01}",
                "bars[0].gap",
                "below the minimum gap",
            ),
            ("{name: L, count: 3, length: 1}", "bars[0]", "no `line` or `arc` given"),
            (
                "{name: L, count: 3, line: {from: [0, 0], to: [0.3, 0]}, length: 1}",
                "bars[0].line.to",
                "leaves no room for 3 steps",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0], to: [9, 0]}, thickness: 1, length: 1}",
                "bars[0].thickness",
                "given with `line.to`",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0]}, thickness: 1, length: 1, shape: wedge}",
                "bars[0].shape",
                "a wedge needs an arc",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0]}, thickness: 1, length: 1, side: inside}",
                "bars[0].side",
                "unknown side `inside`",
            ),
            (
                "{name: L, count: 3, arc: {centre: [0, 0], radius: 1, start: 0, end: 360}, length: 1}",
                "bars[0].arc.end",
                "turns 360°",
            ),
            (
                "{name: L, count: 3, arc: {centre: [0, 0], radius: 1, start: 0, end: 90}, length: 3, side: inside}",
                "bars[0].length",
                "reach past the centre",
            ),
            (
                "{name: L, count: 60, arc: {centre: [0, 0], radius: 1, start: 0, end: 90}, length: 1, side: outside}",
                "bars[0].count",
                "leave 0 mm of width",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0]}, thickness: 0.05, length: 1}",
                "bars[0].thickness",
                "narrower than the minimum line width",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0]}, thickness: 1, length: 1, last_length: 1e-7}",
                "bars[0].last_length",
                "narrower than the minimum line width",
            ),
            (
                "{name: L, count: 5, arc: {centre: [0, 0], radius: 5, start: 0, end: 359.9}, length: 1, side: outside}",
                "bars[0].arc.end",
                "comes within",
            ),
            (
                "{name: L, count: 3, line: {from: [0, 0]}, thickness: 0, length: 1}",
                "bars[0].thickness",
                "greater than 0",
            ),
        ];
        for (text, key, fragment) in cases {
            let mut p = problems();
            bar(&mut p, &raw(text), "bars[0]", &rules());
            let v = p.into_sorted();
            assert!(v.iter().any(|q| q.key == key && q.message.contains(fragment)), "{text}: {v:?}");
        }
    }
}
