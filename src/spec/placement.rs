//! Where the elements sit: every digit and bar-graph step inside the window, no digit
//! overlapping another (within a group or across groups), an icon or a bar graph, icons
//! inside the window, legend anchors inside the window, bus points on their glass. Uses
//! outlines that are cheap to know before the glyph stage runs: a digit's slanted cell
//! (plus room for its decimal point or colon), an icon's shape or box (a gauge's box
//! holds all its parts, so they are one entry and never overlap each other), a step's
//! cell (`bar_cells.rs`). Legend extents need the font and are left to the glyph stage.

use super::problems::Problems;
use super::read::mm;
use crate::geom::{self, Polygon, pt};
use crate::layout::{DigitGroup, IconShape, Layout, Rect};

/// Room to the right of a digit for its decimal point or colon, in strokes.
pub const POINT_ROOM_STROKES: f64 = 1.5;

/// The outline a digit claims: its cell slanted by `height·tan(slant)` at the top, widened
/// on the right by room for a decimal point or colon when it has one. `digit` is 1-based.
pub fn digit_cell(g: &DigitGroup, digit: u32) -> Polygon {
    let x0 = g.origin.x + f64::from(digit - 1) * g.pitch;
    let y0 = g.origin.y;
    let dx = g.height * g.slant.to_radians().tan();
    let has_point = g.decimal_points.contains(&digit) || g.colons.contains(&digit);
    let w = g.width + if has_point { POINT_ROOM_STROKES * g.stroke } else { 0.0 };
    Polygon::new(
        vec![pt(x0, y0), pt(x0 + w, y0), pt(x0 + w + dx, y0 + g.height), pt(x0 + dx, y0 + g.height)].into(),
        vec![],
    )
}

/// Outline of an icon for overlap tests, or `None` when only the glyph stage knows it.
fn icon_outline(shape: &IconShape, tol: f64) -> Option<Polygon> {
    Some(match shape {
        IconShape::Named { at, size, .. } | IconShape::Gauge { at, size, .. } => {
            geom::rect(at.x, at.y, at.x + size, at.y + size)
        }
        IconShape::Rectangle { at, width, height, .. } => geom::rect(at.x, at.y, at.x + width, at.y + height),
        IconShape::Circle { centre, radius } => geom::circle(*centre, *radius, tol),
        IconShape::Ring { centre, outer, inner } => geom::ring(*centre, *outer, *inner, tol),
        IconShape::Polygon { points } => Polygon::new(points.clone().into(), vec![]),
        IconShape::Path { .. } => return None,
    })
}

/// Axis-aligned bounds of an outline.
fn bounds(p: &Polygon) -> Rect {
    let (mut x0, mut y0, mut x1, mut y1) = (f64::MAX, f64::MAX, f64::MIN, f64::MIN);
    for c in p.exterior().coords() {
        x0 = x0.min(c.x);
        y0 = y0.min(c.y);
        x1 = x1.max(c.x);
        y1 = y1.max(c.y);
    }
    Rect { x: x0, y: y0, width: x1 - x0, height: y1 - y0 }
}

/// True when two outlines share more than a sliver of area (touching is fine).
fn overlap(a: &Polygon, b: &Polygon) -> bool {
    let (ba, bb) = (bounds(a), bounds(b));
    if ba.x1() <= bb.x || bb.x1() <= ba.x || ba.y1() <= bb.y || bb.y1() <= ba.y {
        return false;
    }
    let i = geom::intersection(&geom::region_of([a.clone()]), &geom::region_of([b.clone()]));
    geom::area(&i) > 1e-6
}

/// A placed outline and how to name it in messages.
struct Placed {
    outline: Polygon,
    /// Key to report at.
    key: String,
    /// Key of the entry, for "also here" references.
    entry: String,
    /// `digit 2 of `D``, `icon `BATT``.
    what: String,
    /// Digit group index, for overlaps within a group.
    group: Option<usize>,
}

/// Runs the placement checks on every element read without problems.
pub fn check_placement(p: &mut Problems, l: &Layout) {
    if !p.clean(&["window"]) {
        return;
    }
    let mut placed = Vec::new();
    for (gi, g) in l.digits.iter().enumerate() {
        if p.clean(&[&g.key]) {
            digits_in_window(p, l, g);
            for d in 1..=g.count {
                placed.push(Placed {
                    outline: digit_cell(g, d),
                    key: format!("{}.origin", g.key),
                    entry: g.key.clone(),
                    what: format!("digit {d} of `{}`", g.name),
                    group: Some(gi),
                });
            }
        }
    }
    for i in &l.icons {
        if !p.clean(&[&i.key]) {
            continue;
        }
        if let Some(outline) = icon_outline(&i.shape, l.tolerance) {
            if !l.window.contains_rect(&bounds(&outline)) {
                p.bad(&i.key, format!("icon `{}` reaches outside the window", i.name), &window_text(&l.window));
            }
            placed.push(Placed {
                outline,
                key: i.key.clone(),
                entry: i.key.clone(),
                what: format!("icon `{}`", i.name),
                group: None,
            });
        }
    }
    for b in &l.bars {
        if !p.clean(&[&b.key]) {
            continue;
        }
        let cells: Vec<Polygon> = (0..b.count).map(|k| super::bar_cells::step_cell(b, k, l.tolerance)).collect();
        if let Some(k) = cells.iter().position(|c| !l.window.contains_rect(&bounds(c))) {
            let m =
                format!("step {} of bar graph `{}` ({}) reaches outside the window", k + 1, b.name, extent(&cells[k]));
            p.bad(&b.key, m, &window_text(&l.window));
        }
        for (k, outline) in cells.into_iter().enumerate() {
            placed.push(Placed {
                outline,
                key: b.key.clone(),
                entry: b.key.clone(),
                what: format!("step {} of bar graph `{}`", k + 1, b.name),
                group: None,
            });
        }
    }
    for lg in &l.legends {
        let key = format!("{}.at", lg.key);
        let top = pt(lg.at.x, lg.at.y + lg.height);
        if p.clean(&[&lg.key]) && !(inside(&l.window, lg.at) && inside(&l.window, top)) {
            p.bad(&key, format!("legend `{}` starts outside the window", lg.name), &window_text(&l.window));
        }
        // Every character's ink is at least a stroke wide and the pen moves on by at
        // least a stroke (glyph/legend.rs), so n characters are at least n strokes wide.
        let chars = lg.text.chars().count() as f64;
        if p.clean(&[&lg.key]) && chars * lg.stroke > l.window.width {
            p.bad(
                &format!("{}.text", lg.key),
                format!(
                    "legend `{}` of {chars} characters is at least {} wide (one stroke a character), wider than the window",
                    lg.name,
                    super::read::mm(chars * lg.stroke)
                ),
                &format!("a text that fits the window's {}", super::read::mm(l.window.width)),
            );
        }
    }
    overlaps(p, &placed);
    if p.clean(&["glass"]) {
        buses_on_glass(p, l);
    }
}

/// Every bus point must lie on the glass of its plate.
fn buses_on_glass(p: &mut Problems, l: &Layout) {
    for b in &l.buses {
        let glass = match b.plate {
            crate::layout::PlateId::Front => &l.glass.front,
            crate::layout::PlateId::Back => &l.glass.back,
        };
        if let Some(j) = b.points.iter().position(|q| !inside(glass, *q)) {
            let key = format!("{}.points[{j}]", b.key);
            if p.clean(&[&b.key]) {
                p.bad(
                    &key,
                    format!("point ({}, {}) is off the {} glass", mm(b.points[j].x), mm(b.points[j].y), b.plate.name()),
                    &format!("x {} to {}, y {} to {}", mm(glass.x), mm(glass.x1()), mm(glass.y), mm(glass.y1())),
                );
            }
        }
    }
}

/// `x 1 mm to 2 mm, y 3 mm to 4 mm`: the bounds of an outline, for messages.
fn extent(o: &Polygon) -> String {
    let b = bounds(o);
    format!("x {} to {}, y {} to {}", mm(b.x), mm(b.x1()), mm(b.y), mm(b.y1()))
}

fn window_text(w: &Rect) -> String {
    format!("inside the window, x {} to {}, y {} to {}", mm(w.x), mm(w.x1()), mm(w.y), mm(w.y1()))
}

fn inside(r: &Rect, q: crate::geom::Pt) -> bool {
    q.x >= r.x - 1e-9 && q.x <= r.x1() + 1e-9 && q.y >= r.y - 1e-9 && q.y <= r.y1() + 1e-9
}

/// Reports the first digit of a group that leaves the window.
fn digits_in_window(p: &mut Problems, l: &Layout, g: &DigitGroup) {
    for d in 1..=g.count {
        let cell = digit_cell(g, d);
        if !cell.exterior().coords().all(|c| inside(&l.window, *c)) {
            let m = format!(
                "digit {d} of `{}` ({}, slant and point room included) reaches outside the window",
                g.name,
                extent(&cell)
            );
            p.bad(&format!("{}.origin", g.key), m, &window_text(&l.window));
            return;
        }
    }
}

/// Reports overlapping outlines, once per pair of entries.
fn overlaps(p: &mut Problems, placed: &[Placed]) {
    // Sweep along x over boxes computed once, so that a layout of hundreds of elements
    // costs pairs that are near each other, not all pairs; and stop after
    // `MAX_OVERLAPS` reports (400 icons stacked on one spot made 80 000 polygon
    // intersections and took minutes before).
    let boxes: Vec<Rect> = placed.iter().map(|q| bounds(&q.outline)).collect();
    let mut order: Vec<usize> = (0..placed.len()).collect();
    order.sort_by(|&i, &j| boxes[i].x.total_cmp(&boxes[j].x).then(i.cmp(&j)));
    let mut pairs: Vec<(usize, usize)> = Vec::new();
    for (k, &i) in order.iter().enumerate() {
        for &j in &order[k + 1..] {
            if boxes[j].x >= boxes[i].x1() {
                break;
            }
            pairs.push((i.min(j), i.max(j)));
        }
    }
    // Report in the order of the file, as the all-pairs loop did.
    pairs.sort_by_key(|&(a, b)| (b, a));
    let mut reported: std::collections::HashSet<(&str, &str)> = std::collections::HashSet::new();
    for (ia, ib) in pairs {
        let (a, b) = (&placed[ia], &placed[ib]);
        // The steps of one bar graph keep their gap by construction (`bars.rs`); their
        // cells may touch.
        let same_bar = a.entry == b.entry && a.entry.starts_with("bars[");
        let pair = (a.entry.as_str(), b.entry.as_str());
        if same_bar || reported.contains(&pair) || !overlap(&a.outline, &b.outline) {
            continue;
        }
        if reported.len() == MAX_OVERLAPS {
            p.bad(&b.key, format!("more than {MAX_OVERLAPS} overlaps; the rest are not listed"), "elements that do not overlap");
            return;
        }
        reported.insert(pair);
        if a.group.is_some() && a.group == b.group {
            p.bad(
                &b.key.replace(".origin", ".pitch"),
                format!("{} overlaps {}: the pitch is too small for the width, slant and point room", b.what, a.what),
                "a pitch of at least the width plus room for decimal points or colons",
            );
        } else {
            let m = format!("{} overlaps {} of {}", b.what, a.what, p.place(&a.entry));
            p.bad(&b.key, m, "elements that do not overlap");
        }
    }
}

/// Most overlaps reported; one more says that there are more.
const MAX_OVERLAPS: usize = 20;

#[cfg(test)]
mod tests {
    use super::*;
    use crate::layout::DigitStyle;

    fn group(slant: f64) -> DigitGroup {
        DigitGroup {
            name: "D".into(),
            style: DigitStyle::Seven,
            count: 2,
            origin: pt(0.0, 0.0),
            height: 10.0,
            width: 5.0,
            pitch: 7.0,
            slant,
            stroke: 1.0,
            gap: 0.2,
            decimal_points: vec![2],
            colons: vec![],
            half_digits: vec![],
            key: "digits[0]".into(),
        }
    }

    #[test]
    fn slanted_cell_leans_by_height_tan_slant() {
        // tan 45° = 1: the top edge moves right by the full height.
        let c = digit_cell(&group(45.0), 1);
        let b = bounds(&c);
        assert!((b.x1() - 15.0).abs() < 1e-9);
        // Digit 2 has a decimal point: 1.5 strokes more on the right.
        let c2 = bounds(&digit_cell(&group(0.0), 2));
        assert!((c2.x - 7.0).abs() < 1e-12 && (c2.x1() - 13.5).abs() < 1e-12);
    }

    #[test]
    fn touching_cells_do_not_overlap() {
        let a = geom::rect(0.0, 0.0, 1.0, 1.0);
        assert!(!overlap(&a, &geom::rect(1.0, 0.0, 2.0, 1.0)));
        assert!(overlap(&a, &geom::rect(0.5, 0.5, 2.0, 2.0)));
        // Slanted neighbours at pitch = width only touch along the slanted edge.
        let mut g = group(10.0);
        g.pitch = 5.0;
        g.decimal_points.clear();
        assert!(!overlap(&digit_cell(&g, 1), &digit_cell(&g, 2)));
        g.pitch = 4.9;
        assert!(overlap(&digit_cell(&g, 1), &digit_cell(&g, 2)));
    }
}
