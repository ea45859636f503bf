//! Bar graphs: a [`BarGraph`] → one element per step, `{name}.1` … `{name}.N`.
//!
//! Rectangular steps are the rectangles of `BarGraph::rect_corners`. A wedge is the
//! annular sector of its angle, cut from its neighbours by strips exactly `gap` wide with
//! parallel edges (not by equal angles, which would leave the gap narrowest at the inner
//! radius): the cut's edge is the chord at distance `gap/2` from the radius through the
//! middle of the gap, met by a circle of radius r at `asin(gap / 2r)` from that radius.
//! Arcs are flattened with their vertices on the true arcs, chords within the layout's
//! tolerance. Like an icon, a step's body is its outline: the common electrode behind it
//! is the outline grown by the overlap margin.

use super::outline::finish;
use super::{Element, ElementKind};
use crate::geom::{Polygon, arc_points, distance, region_of, ring_polygon};
use crate::layout::{BarGraph, BarPath, Layout, StepShape, step_net};
use crate::{Error, Result};

/// The outline of step `k` (0-based), curves within `tol`.
pub fn step_outline(b: &BarGraph, k: u32, tol: f64) -> Polygon {
    match (&b.path, b.shape) {
        (BarPath::Arc { .. }, StepShape::Wedge) => wedge(b, k, tol),
        _ => ring_polygon(b.rect_corners(k).to_vec()),
    }
}

fn wedge(b: &BarGraph, k: u32, tol: f64) -> Polygon {
    let BarPath::Arc { centre, radius, .. } = b.path else { return ring_polygon(b.rect_corners(k).to_vec()) };
    let (a0, a1) = b.step_angles(k).unwrap_or((0.0, 0.0));
    let turn = (a1 - a0).signum();
    let (lo, hi) = b.across(k);
    // Angle of the cut edge at radius r, measured into the step from the boundary; the
    // outer ends of the arc have no neighbour and no cut.
    let cut = |r: f64, has_neighbour: bool| {
        if has_neighbour { turn * (b.gap / (2.0 * r)).min(1.0).asin().to_degrees() } else { 0.0 }
    };
    let (first, last) = (k == 0, k + 1 == b.count);
    let start = |r: f64| a0 + cut(r, !first);
    let end = |r: f64| a1 - cut(r, !last);
    let (r_in, r_out) = (radius + lo, radius + hi);
    let mut v = arc_points(centre, r_out, start(r_out), end(r_out) - start(r_out), tol);
    v.extend(arc_points(centre, r_in, end(r_in), start(r_in) - end(r_in), tol));
    ring_polygon(v)
}

/// Builds every step of one bar graph, checking that neighbours (and the last and the
/// first, on an arc) keep the gap.
pub fn build_bar(layout: &Layout, b: &BarGraph) -> Result<Vec<Element>> {
    let tol = layout.tolerance;
    let outlines: Vec<Polygon> = (0..b.count).map(|k| step_outline(b, k, tol)).collect();
    let mut pairs: Vec<(usize, usize)> = (1..outlines.len()).map(|k| (k - 1, k)).collect();
    if matches!(b.path, BarPath::Arc { .. }) && outlines.len() > 2 {
        pairs.push((outlines.len() - 1, 0));
    }
    // The snap to the 1 nm grid may move an edge by half a nanometre.
    if let Some((i, j, d)) =
        pairs.iter().map(|&(i, j)| (i, j, distance(&outlines[i], &outlines[j]))).find(|t| t.2 < b.gap - 2e-6)
    {
        return Err(Error::input(layout.problem(
            &format!("{}.gap", b.key),
            format!("steps {} and {} of bar graph `{}` come within {d:.4} mm of each other", i + 1, j + 1, b.name),
            Some(format!("steps at least the gap, {} mm, apart", b.gap)),
        )));
    }
    outlines
        .into_iter()
        .enumerate()
        .map(|(k, p)| {
            let net = step_net(&b.name, k as u32 + 1);
            let outline = finish(&region_of([p])).map_err(|e| Error::Bug(format!("{net}: {e}")))?;
            Ok(Element {
                name: net,
                kind: ElementKind::Step,
                body: outline.clone(),
                outline,
                digit: None,
                drives: format!("bar graph {} step {}", b.name, k + 1),
                key: b.key.clone(),
            })
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, pt};
    use crate::layout::StepSide;

    fn layout() -> Layout {
        crate::layout::fixture::tiny_layout()
    }

    fn line_bar(count: u32, thickness: f64, length: f64, last: f64) -> BarGraph {
        BarGraph {
            name: "LVL".into(),
            count,
            path: BarPath::Line { from: pt(5.0, 9.0), angle: 0.0, thickness },
            shape: StepShape::Rectangle,
            side: StepSide::Left,
            length,
            last_length: last,
            gap: 0.25,
            key: "bars[0]".into(),
        }
    }

    fn arc_bar(count: u32, shape: StepShape, start: f64, end: f64) -> BarGraph {
        BarGraph {
            name: "DIAL".into(),
            count,
            path: BarPath::Arc { centre: pt(15.0, 10.0), radius: 4.0, start, end },
            shape,
            side: StepSide::Outside,
            length: 1.5,
            last_length: 1.5,
            gap: 0.3,
            key: "bars[1]".into(),
        }
    }

    /// N steps give N elements named NAME.1 … NAME.N, each a rectangle of area
    /// thickness × length (rectangle area, exact: the corners lie on the 1 nm grid).
    #[test]
    fn line_steps_are_rectangles_of_thickness_by_length() {
        let b = line_bar(10, 0.75, 2.0, 2.0);
        let e = build_bar(&layout(), &b).unwrap();
        assert_eq!(e.len(), 10);
        for (k, x) in e.iter().enumerate() {
            assert_eq!(x.name, format!("LVL.{}", k + 1));
            assert_eq!(x.kind, ElementKind::Step);
            assert!((area(&x.outline) - 0.75 * 2.0).abs() < 1e-9, "{}", area(&x.outline));
            assert_eq!(area(&x.body), area(&x.outline));
        }
    }

    /// A level meter: lengths 1, 2, … 5 mm, so the areas are thickness × each length.
    #[test]
    fn growing_steps_rise_linearly() {
        let b = line_bar(5, 0.5, 1.0, 5.0);
        let e = build_bar(&layout(), &b).unwrap();
        for (k, x) in e.iter().enumerate() {
            assert!((area(&x.outline) - 0.5 * (k as f64 + 1.0)).abs() < 1e-9);
        }
    }

    /// One wedge with no neighbours is the annular sector: area θ/2 · (r2² − r1²)
    /// (standard plane geometry); vertices on the arcs make the outer chords lose and the
    /// inner chords gain at most arc length × tolerance.
    #[test]
    fn a_lone_wedge_is_an_annular_sector() {
        let tol = 1e-3;
        let b = arc_bar(1, StepShape::Wedge, 30.0, 150.0);
        let a = area(&build_bar(&layout(), &b).unwrap()[0].outline);
        let theta = 120f64.to_radians();
        let (r1, r2) = (4.0, 5.5);
        let exact = theta / 2.0 * (r2 * r2 - r1 * r1);
        assert!((a - exact).abs() <= theta * (r1 + r2) * tol, "{a} vs {exact}");
    }

    /// Wedges cut apart by parallel strips: the N steps cover the annular sector less
    /// N − 1 strips, each the part of the annulus within gap/2 of a ray from the centre,
    /// S(r2) − S(r1) with S(r) = ∫₋ₕʰ √(r² − y²) dy = h·√(r² − h²) + r²·asin(h/r)
    /// (the area under a circle, standard calculus).
    #[test]
    fn wedges_leave_strips_exactly_the_gap_wide() {
        let tol = 1e-4;
        let mut l = layout();
        l.tolerance = tol;
        for (start, end) in [(180.0, 0.0), (-60.0, 200.0)] {
            let b = arc_bar(12, StepShape::Wedge, start, end);
            let e = build_bar(&l, &b).unwrap();
            assert_eq!(e.len(), 12);
            let total: f64 = e.iter().map(|x| area(&x.outline)).sum();
            let theta = (end - start).abs().to_radians();
            let (r1, r2, h) = (4.0, 5.5, 0.15);
            let s = |r: f64| h * (r * r - h * h).sqrt() + r * r * (h / r).asin();
            let exact = theta / 2.0 * (r2 * r2 - r1 * r1) - 11.0 * (s(r2) - s(r1));
            assert!((total - exact).abs() <= theta * (r1 + r2) * tol, "{start}..{end}: {total} vs {exact}");
            // Neighbours are exactly the gap apart (to the 1 nm snap).
            let d = distance(&e[3].outline.0[0], &e[4].outline.0[0]);
            assert!((d - 0.3).abs() < 2e-6, "{d}");
        }
    }

    /// Rectangles on an arc: equal widths, nearest neighbours exactly the gap apart.
    #[test]
    fn rectangles_on_an_arc_keep_the_gap() {
        let b = arc_bar(9, StepShape::Rectangle, 0.0, 180.0);
        let e = build_bar(&layout(), &b).unwrap();
        let w = b.arc_rect_width().unwrap();
        for x in &e {
            assert!((area(&x.outline) - w * 1.5).abs() < 1e-6);
        }
        let d = distance(&e[0].outline.0[0], &e[1].outline.0[0]);
        assert!((d - 0.3).abs() < 2e-6, "{d}");
    }

    #[test]
    fn steps_closer_than_the_gap_are_refused() {
        // Built by hand past the spec stage's checks: a nearly full circle whose last
        // step runs into the first.
        let b = arc_bar(6, StepShape::Wedge, 0.0, 359.0);
        let Err(Error::Input(p)) = build_bar(&layout(), &b) else { panic!("accepted") };
        assert_eq!(p[0].key, "bars[1].gap");
        assert!(p[0].message.contains("steps 6 and 1"), "{}", p[0].message);
    }
}
