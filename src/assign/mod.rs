//! Stage `assign`: elements → the COM electrode and SEG line of every element.
//!
//! Takes the layout (duty, choices fixed by hand in `drive.fixed`) and the elements from
//! `glyph`; gives each element a common (0-based) and a SEG line (0-based), and the places
//! that front leads must leave free so back leads can pass. Under static drive every
//! element is its own SEG line on the one common.
//!
//! Multiplexed, in this order:
//! 1. elements fixed by hand keep their COM and SEG;
//! 2. seven- and fourteen-segment digits take their template (`template.rs`), one set of
//!    SEG lines per digit, so each line's segments lie together and both plates can be
//!    routed;
//! 3. every other element (legends, icons, colon dots, other digit styles, elements fixed
//!    in one number only) takes a free common on the nearest line that has one and a
//!    member within one and a half digit heights, so that no front join crosses the
//!    glass (a colon dot the common its digit's template names for it, if any); when no
//!    line has room it opens a new line, on the common of its height in the row of
//!    digits it stands level with, else in the window (top band → COM1); beside digits whose template keeps its lines closed (fourteen
//!    segments), on the nearest common those digits leave free. Filling free places
//!    first keeps the pin count at N + ⌈S/N⌉
//!    (docs/background.md, *Drive and pin count*) whenever the templates leave their
//!    places free to others. The steps of a bar graph and the parts of a gauge all take
//!    the common the first of them took, each on its own line: side by side in a row (or nested in a shell), neighbours on different
//!    commons would leave commons that interleave along the row, and interleaved commons
//!    cannot all reach their dots on the back plate without crossing (or facing the
//!    front leads that leave the row on the other side).
//!
//! A (COM, SEG) pair is never given twice; the pins are N + the number of lines.

pub mod lines;
pub mod pin_note;
pub mod template;
pub mod tiers;

use crate::geom::{circle, Polygon, Pt};
use crate::glyph::Element;
use crate::layout::{DigitStyle, Layout};
use crate::Result;
use lines::{nearest_free, Line};

/// The COM and SEG line of every element.
#[derive(Debug, Clone, PartialEq)]
pub struct Assignment {
    /// Common (0-based) of each element, in element order.
    pub com: Vec<u32>,
    /// SEG line (0-based) of each element, in element order.
    pub line: Vec<u32>,
    /// Number of SEG lines.
    pub lines: u32,
    /// Places kept free of front-plate leads so back-plate leads can pass.
    pub passages: Vec<Polygon>,
    /// Per element, whether it is in the far tier (`tiers.rs`), whose leads leave on the
    /// side opposite the pads.
    pub far: Vec<bool>,
    /// SEG lines (0-based) whose front nets the router leads before all others, in this
    /// order (`Template::route_first`).
    pub route_first: Vec<u32>,
}

impl Assignment {
    /// Elements (indices) on SEG line `j`.
    pub fn on_line(&self, j: u32) -> impl Iterator<Item = usize> + '_ {
        self.line.iter().enumerate().filter(move |(_, l)| **l == j).map(|(i, _)| i)
    }

    /// Whether SEG line `j` belongs to the far tier (`tiers.rs`).
    pub fn far_line(&self, j: u32) -> bool {
        self.on_line(j).any(|i| self.far.get(i).copied().unwrap_or(false))
    }
}

/// Assigns every element a common and a SEG line.
pub fn assign(layout: &Layout, elements: &[Element]) -> Result<Assignment> {
    let n = layout.drive.commons.max(1);
    if n == 1 {
        let k = elements.len();
        return Ok(Assignment { com: vec![0; k], line: (0..k as u32).collect(), lines: k as u32, passages: Vec::new(), far: vec![false; k], route_first: Vec::new() });
    }
    let centres: Vec<Pt> = elements.iter().map(centre).collect();
    let far = tiers::far_tier(layout, elements);
    let rows = digit_rows(elements);
    let mut lines: Vec<Line> = Vec::new();
    let mut placed = vec![false; elements.len()];
    let mut problems = Vec::new();

    // 1. Fixed by hand, both numbers.
    for (i, e) in elements.iter().enumerate() {
        let Some(f) = layout.fixed_lines.get(&e.name) else { continue };
        if let (Some(c), Some(s)) = (f.com, f.seg) {
            let l = line_numbered(&mut lines, s - 1);
            if !lines[l].is_free(c - 1) {
                problems.push(layout.problem(&format!("drive.fixed.{}", e.name), format!("COM{c} of SEG{s} is already taken"), Some("each (com, seg) pair once".into())));
                continue;
            }
            lines[l].add(i, c - 1, centres[i]);
            placed[i] = true;
        }
    }
    // 2. Templates, digit by digit.
    let mut passages = Vec::new();
    let mut digit_slots: Vec<(String, u32, usize)> = Vec::new();
    let mut first: Vec<(usize, usize)> = Vec::new();
    let with_points: std::collections::BTreeSet<&str> =
        elements.iter().filter(|e| e.name.rsplit('.').next() == Some("dp")).filter_map(|e| e.digit.as_deref()).collect();
    for (i, e) in elements.iter().enumerate() {
        if placed[i] || layout.fixed_lines.contains_key(&e.name) {
            continue;
        }
        let (Some(digit), Some(t)) = (&e.digit, digit_template(layout, e)) else { continue };
        let seg = e.name.rsplit('.').next().unwrap_or("");
        let Some((com, slot)) = t.place_for(seg, exit_of(layout, far[i]), with_points.contains(digit.as_str())) else { continue };
        let com = if far[i] { n - 1 - com } else { com };
        let l = match digit_slots.iter().find(|(d, s, _)| d == digit && *s == slot) {
            Some(x) => x.2,
            None => {
                let mut line = Line::new(None);
                line.far = far[i];
                line.closed = !t.lends_free_places;
                lines.push(line);
                digit_slots.push((digit.clone(), slot, lines.len() - 1));
                lines.len() - 1
            }
        };
        lines[l].add(i, com, centres[i]);
        placed[i] = true;
        if let Some(rank) = t.route_first.iter().position(|s| *s == seg) {
            first.push((rank, l));
        }
        for (s, end) in t.passages {
            if *s == seg {
                passages.push(passage(layout, e, *end));
            }
        }
    }
    // 3. Everything else: free places on the nearest line first; one common for the
    // members of a bar graph or gauge (the first common fixed by hand for one of them,
    // else the first one placed here, decides).
    let mut entry_com: std::collections::BTreeMap<&str, u32> = std::collections::BTreeMap::new();
    for e in elements {
        let hand = layout.fixed_lines.get(&e.name).and_then(|f| f.com);
        if let (true, Some(c)) = (one_common(layout, e), hand) {
            entry_com.entry(e.key.as_str()).or_insert(c - 1);
        }
    }
    for (i, e) in elements.iter().enumerate() {
        if placed[i] {
            continue;
        }
        let mut fixed = layout.fixed_lines.get(&e.name).copied().unwrap_or_default();
        if fixed.com.is_none() && one_common(layout, e) {
            fixed.com = entry_com.get(e.key.as_str()).map(|c| c + 1);
        }
        if fixed.com.is_none() {
            fixed.com = colon_dot_common(layout, e).map(|c| if far[i] { n - c } else { c + 1 });
        }
        let height = band(layout, &rows, centres[i], n);
        let mut want = fixed.com.map(|c| c - 1).unwrap_or(if far[i] { n - 1 - height } else { height });
        if fixed.com.is_none() {
            // Beside digits whose template keeps its lines closed (fourteen segments), a
            // common those digits use could only reach the element through them: take
            // the open common nearest the wanted one, if there is one.
            let shut = shut_commons(layout, &lines, &centres, centres[i], n);
            if let Some(c) = (0..n).filter(|c| !shut[*c as usize]).min_by_key(|c| (c.abs_diff(want), *c)) {
                if shut.iter().any(|s| *s) {
                    want = c;
                    fixed.com = Some(c + 1);
                }
            }
        }
        let l = match fixed.seg {
            Some(s) => line_numbered(&mut lines, s - 1),
            None => nearest_line_with_room(&lines, centres[i], fixed.com.map(|c| c - 1), n, far[i])
                .filter(|&l| within_reach(layout, &lines[l], &centres, centres[i]))
                .unwrap_or_else(|| {
                lines.push(Line::new(None));
                lines.last_mut().expect("just pushed").far = far[i];
                lines.len() - 1
            }),
        };
        let com = match fixed.com {
            Some(c) if lines[l].is_free(c - 1) => Some(c - 1),
            Some(_) => None,
            None => nearest_free(&lines[l], n, want),
        };
        match com {
            Some(c) => {
                lines[l].add(i, c, centres[i]);
                if one_common(layout, e) {
                    entry_com.entry(e.key.as_str()).or_insert(c);
                }
            }
            None => problems.push(layout.problem(
                &format!("drive.fixed.{}", e.name),
                format!("SEG line {} has no free common left for `{}`", l + 1, e.name),
                Some(format!("at most {n} elements on one SEG line, each on its own common")),
            )),
        }
    }
    if !problems.is_empty() {
        return Err(crate::Error::Input(problems));
    }
    let numbers = number_lines(layout, &lines, &mut problems);
    if !problems.is_empty() {
        return Err(crate::Error::Input(problems));
    }
    let mut com = vec![0; elements.len()];
    let mut line = vec![0; elements.len()];
    for (l, ln) in lines.iter().enumerate() {
        for &(e, c) in &ln.members {
            com[e] = c;
            line[e] = numbers[l];
        }
    }
    first.sort_by_key(|&(rank, l)| (rank, numbers[l]));
    let route_first = first.iter().map(|&(_, l)| numbers[l]).collect();
    Ok(Assignment { com, line, lines: lines.iter().filter(|l| !l.members.is_empty()).count() as u32, passages, far, route_first })
}

/// The common the template gives a colon dot of a seven-segment digit, if any.
fn colon_dot_common(layout: &Layout, e: &Element) -> Option<u32> {
    let dot = crate::layout::COLON_DOTS.iter().position(|d| e.name.rsplit('.').next() == Some(*d))?;
    digit_template(layout, e)?.colon.map(|c| c[dot])
}

/// True for the members of a bar graph or a gauge, which share one common.
fn one_common(layout: &Layout, e: &Element) -> bool {
    e.kind == crate::glyph::ElementKind::Step
        || layout.icons.iter().any(|i| i.key == e.key && matches!(i.shape, crate::layout::IconShape::Gauge { .. }))
}

fn centre(e: &Element) -> Pt {
    use geo::Centroid;
    e.outline.centroid().map(|p| p.0).unwrap_or_else(|| crate::geom::pt(0.0, 0.0))
}

/// Which way a digit's leads leave: towards the pads, or away from them in the far tier
/// (`tiers.rs`).
fn exit_of(layout: &Layout, far: bool) -> template::Exit {
    let top = layout.pads.side == crate::layout::Side::Top;
    if top != far { template::Exit::Up } else { template::Exit::Down }
}

/// The template of a digit element's style at this duty, if it has one.
fn digit_template(layout: &Layout, e: &Element) -> Option<&'static template::Template> {
    let g = layout.digits.iter().find(|g| g.key == e.key)?;
    match g.style {
        DigitStyle::Seven => template::seven_segment(layout.drive.commons),
        DigitStyle::Fourteen => template::fourteen_segment(layout.drive.commons),
        DigitStyle::Sixteen => None,
    }
}

/// A place kept free of front leads beside one end of a segment: a band one and a half
/// digit gaps wide from the segment's tip out past the outer edge of the digit (a stroke
/// and two gaps long), along the segment.
fn passage(layout: &Layout, e: &Element, end: template::End) -> Polygon {
    let g = layout.digits.iter().find(|g| g.key == e.key);
    let gap = g.map(|g| g.gap).unwrap_or(layout.rules.min_gap);
    let stroke = g.map(|g| g.stroke).unwrap_or(1.0);
    let pts = e.outline.0.iter().flat_map(|p| p.exterior().0.iter().copied());
    let tip = match end {
        template::End::Left => pts.min_by(|a, b| a.x.total_cmp(&b.x)),
        template::End::Right => pts.max_by(|a, b| a.x.total_cmp(&b.x)),
    }
    .unwrap_or_else(|| centre(e));
    let out = if end == template::End::Left { -1.0 } else { 1.0 };
    let from = crate::geom::pt(tip.x - out * gap / 2.0, tip.y);
    let to = crate::geom::pt(tip.x + out * (stroke + 2.0 * gap), tip.y);
    let band = crate::geom::stroke_polyline(&[from, to], 1.5 * gap, layout.tolerance);
    band.0.into_iter().next().unwrap_or_else(|| circle(tip, gap, layout.tolerance))
}

/// The box of each digit group's bodies: (x range, y range).
fn digit_rows(elements: &[Element]) -> Vec<((f64, f64), (f64, f64))> {
    let mut rows: Vec<(&str, (f64, f64), (f64, f64))> = Vec::new();
    for e in elements.iter().filter(|e| e.digit.is_some()) {
        for p in e.body.0.iter().flat_map(|p| p.exterior().0.iter()) {
            match rows.iter_mut().find(|r| r.0 == e.key) {
                Some(r) => {
                    r.1 = (r.1 .0.min(p.x), r.1 .1.max(p.x));
                    r.2 = (r.2 .0.min(p.y), r.2 .1.max(p.y));
                }
                None => rows.push((&e.key, (p.x, p.x), (p.y, p.y))),
            }
        }
    }
    rows.into_iter().map(|r| (r.1, r.2)).collect()
}

/// Common of an element's height: level with a row of digits (within one and a half of
/// its heights along it), its height in that row, so that an icon stacked beside the
/// digits takes the common they have at its height and joins it there; elsewhere its
/// height in the window. The top band is COM1 (index 0).
fn band(layout: &Layout, rows: &[((f64, f64), (f64, f64))], at: Pt, n: u32) -> u32 {
    let beside = rows
        .iter()
        .filter(|(_, y)| (y.0..=y.1).contains(&at.y))
        .map(|(x, y)| ((x.0 - at.x).max(at.x - x.1).max(0.0), *y))
        .filter(|(d, y)| *d <= 1.5 * (y.1 - y.0))
        .min_by(|a, b| a.0.total_cmp(&b.0));
    let (top, height) = match beside {
        Some((_, y)) => (y.1, y.1 - y.0),
        None => (layout.window.y1(), layout.window.height),
    };
    let t = ((top - at.y) / height.max(1e-9) * n as f64).floor();
    t.clamp(0.0, (n - 1) as f64) as u32
}

/// The line numbered `j` by hand, made if it does not exist yet.
fn line_numbered(lines: &mut Vec<Line>, j: u32) -> usize {
    if let Some(l) = lines.iter().position(|l| l.fixed == Some(j)) {
        return l;
    }
    lines.push(Line::new(Some(j)));
    lines.len() - 1
}

/// The non-empty line nearest to `at` with a free common (`com` if given).
/// Whether an element at `at` may join `line`: some member lies within one and a half
/// digit heights (the tallest digit group; 10 mm without digits). A line whose members
/// are all farther away would be joined on the front plate by a lead across whatever
/// lies between — across a digit, it cuts that digit's commons (two legends at either
/// end of a row once shared a line that way and cut four commons off).
fn within_reach(layout: &Layout, line: &Line, centres: &[Pt], at: Pt) -> bool {
    let reach = 1.5 * layout.digits.iter().map(|g| g.height).fold(f64::NAN, f64::max);
    let reach = if reach.is_nan() { 10.0 } else { reach };
    line.members.iter().any(|&(e, _)| {
        let c = centres[e];
        (c.x - at.x).hypot(c.y - at.y) <= reach
    })
}

/// Per common, whether closed digit lines (`Line::closed`) within reach of `at` use it.
fn shut_commons(layout: &Layout, lines: &[Line], centres: &[Pt], at: Pt, n: u32) -> Vec<bool> {
    let mut shut = vec![false; n as usize];
    for l in lines.iter().filter(|l| l.closed && within_reach(layout, l, centres, at)) {
        for &(_, c) in &l.members {
            shut[c as usize] = true;
        }
    }
    shut
}

fn nearest_line_with_room(lines: &[Line], at: Pt, com: Option<u32>, n: u32, far: bool) -> Option<usize> {
    let d2 = |p: Pt| (p.x - at.x).powi(2) + (p.y - at.y).powi(2);
    lines
        .iter()
        .enumerate()
        .filter(|(_, l)| !l.members.is_empty() && l.fixed.is_none() && !l.closed && l.far == far)
        .filter(|(_, l)| match com {
            Some(c) => l.is_free(c),
            None => (0..n).any(|c| l.is_free(c)),
        })
        .min_by(|a, b| d2(a.1.centre()).total_cmp(&d2(b.1.centre())))
        .map(|(i, _)| i)
}

/// Final SEG numbers: lines fixed by hand keep theirs; the others take the free numbers
/// from the left of the glass to the right.
fn number_lines(layout: &Layout, lines: &[Line], problems: &mut Vec<crate::error::InputProblem>) -> Vec<u32> {
    let count = lines.len() as u32;
    let mut numbers = vec![u32::MAX; lines.len()];
    let mut taken = vec![false; lines.len()];
    for (l, ln) in lines.iter().enumerate() {
        if let Some(j) = ln.fixed {
            if j >= count {
                problems.push(layout.problem(
                    "drive.fixed",
                    format!("SEG{} is fixed but the layout makes only {count} SEG lines", j + 1),
                    Some(format!("SEG1 … SEG{count}")),
                ));
                continue;
            }
            numbers[l] = j;
            taken[j as usize] = true;
        }
    }
    let mut free = (0..count).filter(|j| !taken[*j as usize]);
    let mut auto: Vec<usize> = (0..lines.len()).filter(|l| lines[*l].fixed.is_none()).collect();
    auto.sort_by(|&a, &b| {
        let (p, q) = (lines[a].centre(), lines[b].centre());
        p.x.total_cmp(&q.x).then(q.y.total_cmp(&p.y))
    });
    for l in auto {
        numbers[l] = free.next().unwrap_or(u32::MAX);
    }
    numbers
}

#[cfg(test)]
mod tests;
