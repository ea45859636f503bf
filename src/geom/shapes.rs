//! Primitive shapes: rectangles, circles, rings and stroked polylines.

use super::{pt, Polygon, Pt, Region};
use geo::algorithm::buffer::{BufferStyle, LineCap, LineJoin};
use geo::{Buffer, LineString};

/// The angular step (radians) that keeps chords of an arc of radius `r` within `tol` of
/// the arc: `2·acos(1 − tol/r)` (docs/crate-notes.md, *Arc flattening*).
///
/// ```
/// let step = segmask::geom::regular_arc_step(1.0, 1e-3);
/// assert!((step - 2.0 * (1.0f64 - 1e-3).acos()).abs() < 1e-12);
/// ```
pub fn regular_arc_step(r: f64, tol: f64) -> f64 {
    if r <= tol {
        return std::f64::consts::FRAC_PI_2;
    }
    (2.0 * (1.0 - tol / r).acos()).min(std::f64::consts::FRAC_PI_4)
}

/// Axis-aligned rectangle from two corners, counter-clockwise.
pub fn rect(x0: f64, y0: f64, x1: f64, y1: f64) -> Polygon {
    let (xa, xb) = (x0.min(x1), x0.max(x1));
    let (ya, yb) = (y0.min(y1), y0.max(y1));
    Polygon::new(
        LineString::from(vec![pt(xa, ya), pt(xb, ya), pt(xb, yb), pt(xa, yb), pt(xa, ya)]),
        vec![],
    )
}

fn circle_ring(c: Pt, r: f64, tol: f64) -> Vec<Pt> {
    let step = regular_arc_step(r, tol);
    let n = ((std::f64::consts::TAU / step).ceil() as usize).max(8);
    let mut v: Vec<Pt> = (0..n)
        .map(|i| {
            let a = std::f64::consts::TAU * i as f64 / n as f64;
            pt(c.x + r * a.cos(), c.y + r * a.sin())
        })
        .collect();
    v.push(v[0]);
    v
}

/// Circle of radius `r`, flattened so that chords stay within `tol` of the true circle
/// (vertices on the circle, so the polygon lies inside it).
pub fn circle(c: Pt, r: f64, tol: f64) -> Polygon {
    Polygon::new(LineString::from(circle_ring(c, r, tol)), vec![])
}

/// Annulus between radii `r_in` and `r_out`.
pub fn ring(c: Pt, r_out: f64, r_in: f64, tol: f64) -> Polygon {
    let mut hole = circle_ring(c, r_in, tol);
    hole.reverse();
    Polygon::new(LineString::from(circle_ring(c, r_out, tol)), vec![LineString::from(hole)])
}

/// A lead: a polyline of orthogonal and 45° segments stroked to exactly `width`, with
/// mitred joins (bends of 90° or less keep their full width through the corner; sharper
/// turns are bevelled) and round ends (chord tolerance `tol`). Round joins would draw each
/// bend as chords inside the true arc, a fraction of a µm narrower than `width` — enough
/// to fail a width rule set at exactly the lead width.
pub fn stroke_lead(points: &[Pt], width: f64, tol: f64) -> Region {
    if points.len() == 1 {
        return geo::MultiPolygon(vec![circle(points[0], width / 2.0, tol)]);
    }
    let step = regular_arc_step(width / 2.0, tol);
    let style = BufferStyle::new(width / 2.0).line_join(LineJoin::Miter(MITRE_LIMIT)).line_cap(LineCap::Round(step));
    super::snap(&LineString::from(points.to_vec()).buffer_with_style(style))
}

/// A lead as drawn on the glass: [`stroke_lead`] with each round end drawn *outside* its
/// circle, every edge of the end tangent to the circle (a regular polygon about the
/// circle, vertices at `(w/2) / cos(s/2)` for an angular step `s`), so that no chord
/// through the end is shorter than `width`. An end flattened inside its circle has its
/// chords inside: where a lead ends on the corner of a segment, the chords of the two
/// sides of its end that stay outside the segment face each other, tilted by one step,
/// closer than `width` (0.1617 mm for a 0.17 mm lead at the default 1 µm tolerance,
/// `check::width`'s test). The ends reach at most about `tol` further than a round end.
///
/// ```
/// use segmask::geom::{pt, stroke_lead_drawn};
/// // A 1 mm lead 2 mm long: every edge of its outline keeps at least 0.5 mm from the
/// // centre line, the end's edges from the end points (plane geometry: a point's
/// // distance to a segment), so no chord across an end is shorter than 1 mm.
/// let lead = stroke_lead_drawn(&[pt(0.0, 0.0), pt(2.0, 0.0)], 1.0, 0.01);
/// let ring = &lead.0[0].exterior().0;
/// for e in ring.windows(2) {
///     let (a, b) = (e[0], e[1]);
///     let end = if a.x + b.x < 2.0 { pt(0.0, 0.0) } else { pt(2.0, 0.0) };
///     let d = b - a;
///     let t = (((end - a).x * d.x + (end - a).y * d.y) / (d.x * d.x + d.y * d.y)).clamp(0.0, 1.0);
///     let near = a + d * t;
///     let from_end = (near - end).x.hypot((near - end).y);
///     let from_line = if near.x < 0.0 || near.x > 2.0 { from_end } else { near.y.abs() };
///     assert!(from_line > 0.5 - 2e-6, "edge {a:?}–{b:?} at {from_line}");
/// }
/// ```
pub fn stroke_lead_drawn(points: &[Pt], width: f64, tol: f64) -> Region {
    let r = width / 2.0;
    // As many steps over the half turn as a round end of this tolerance takes.
    let steps = (std::f64::consts::PI / regular_arc_step(r, tol)).ceil().max(2.0) as usize;
    let s = std::f64::consts::PI / steps as f64;
    let out = 1.0 / (s / 2.0).cos();
    // The end's vertices between the lead's two sides, in the frame the stroke's ends
    // are built in: x along the lead past its end, from (0, -1) round to (0, 1), radius 1.
    let corners: Vec<Pt> = (0..steps)
        .map(|k| {
            let a = -std::f64::consts::FRAC_PI_2 + (k as f64 + 0.5) * s;
            pt(out * a.cos(), out * a.sin())
        })
        .collect();
    if points.len() == 1 {
        let ring: Vec<Pt> = (0..2 * steps)
            .map(|k| {
                let a = (k as f64 + 0.5) * s;
                pt(points[0].x + r * out * a.cos(), points[0].y + r * out * a.sin())
            })
            .collect();
        return super::snap(&geo::MultiPolygon(vec![Polygon::new(LineString::from(ring), vec![])]));
    }
    // geo's coordinate type for i_overlay's templates is named only by inference.
    let template = corners.into_iter().map(Into::into).collect::<Vec<_>>();
    let style = BufferStyle::new(r).line_join(LineJoin::Miter(MITRE_LIMIT)).line_cap(LineCap::Custom(template.into()));
    super::snap(&LineString::from(points.to_vec()).buffer_with_style(style))
}

/// Mitre limit of lead bends, in half widths: a 90° bend needs √2.
const MITRE_LIMIT: f64 = 1.5;

/// A polyline stroked to `width` with round caps and joins (chord tolerance `tol`).
pub fn stroke_polyline(points: &[Pt], width: f64, tol: f64) -> Region {
    if points.len() == 1 {
        return geo::MultiPolygon(vec![circle(points[0], width / 2.0, tol)]);
    }
    let step = regular_arc_step(width / 2.0, tol);
    let style = BufferStyle::new(width / 2.0)
        .line_join(LineJoin::Round(step))
        .line_cap(LineCap::Round(step));
    super::snap(&LineString::from(points.to_vec()).buffer_with_style(style))
}
