//! Curves to polygons: SVG path data (W3C SVG 1.1 §8.3, "Path data"), circular arcs and
//! rounded rectangles, flattened with `lyon_geom`'s `f64` curve types to a chord tolerance.
//!
//! Takes path text or curve parameters in millimetres (y up), gives polylines whose
//! vertices lie on the true curve, so a flattened convex curve lies inside the true one
//! (docs/crate-notes.md, *Arc flattening*). `lyon_path` is not used: it stores `f32`.

use super::{Polygon, Pt, Region, pt};
use geo::algorithm::bool_ops::FillRule;
use geo::{BooleanOps, LineString};
use lyon_geom::{Angle, ArcFlags, CubicBezierSegment, QuadraticBezierSegment, SvgArc, point, vector};

/// One drawing command of a sub-path, in absolute coordinates.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum PathSegment {
    /// Straight line to a point.
    Line(Pt),
    /// Quadratic Bézier: control point, end point.
    Quad(Pt, Pt),
    /// Cubic Bézier: two control points, end point.
    Cubic(Pt, Pt, Pt),
    /// Elliptical arc in SVG end-point form.
    Arc {
        /// Radii (x, y), non-negative.
        radii: (f64, f64),
        /// Rotation of the ellipse's x axis, degrees.
        rotation: f64,
        /// Take the larger of the two possible arcs.
        large: bool,
        /// Run in the positive-angle direction (counter-clockwise with y up).
        sweep: bool,
        /// End point.
        to: Pt,
    },
}

impl PathSegment {
    fn end(&self) -> Pt {
        match *self {
            PathSegment::Line(p) | PathSegment::Quad(_, p) | PathSegment::Cubic(_, _, p) => p,
            PathSegment::Arc { to, .. } => to,
        }
    }
}

/// A sub-path: a start point and the segments drawn from it.
#[derive(Debug, Clone, PartialEq)]
pub struct SubPath {
    /// First point (from the `M` command).
    pub start: Pt,
    /// Segments in drawing order.
    pub segments: Vec<PathSegment>,
    /// Whether it ended with `Z`.
    pub closed: bool,
}

/// A problem in path data.
#[derive(Debug, Clone, PartialEq)]
pub struct PathError {
    /// 1-based character position where the problem was found.
    pub position: usize,
    /// What is wrong.
    pub message: String,
}

impl std::fmt::Display for PathError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "path data, character {}: {}", self.position, self.message)
    }
}

/// The path commands understood, for messages.
pub const PATH_COMMANDS: &str = "M L H V C S Q T A Z, upper case absolute, lower case relative";

impl SubPath {
    /// The same sub-path scaled by `k` about the origin and then moved by (dx, dy).
    pub fn mapped(&self, k: f64, dx: f64, dy: f64) -> SubPath {
        let m = |p: Pt| pt(p.x * k + dx, p.y * k + dy);
        let segments = self
            .segments
            .iter()
            .map(|s| match *s {
                PathSegment::Line(p) => PathSegment::Line(m(p)),
                PathSegment::Quad(c, p) => PathSegment::Quad(m(c), m(p)),
                PathSegment::Cubic(a, b, p) => PathSegment::Cubic(m(a), m(b), m(p)),
                PathSegment::Arc { radii, rotation, large, sweep, to } => PathSegment::Arc {
                    radii: (radii.0 * k.abs(), radii.1 * k.abs()),
                    rotation,
                    large,
                    sweep: if k < 0.0 { !sweep } else { sweep },
                    to: m(to),
                },
            })
            .collect();
        SubPath { start: m(self.start), segments, closed: self.closed }
    }

    /// The sub-path as a polyline whose chords stay within `tol` of the curves; the
    /// first point is the start, and a closed sub-path does not repeat it at the end.
    pub fn flatten(&self, tol: f64) -> Vec<Pt> {
        let mut out = vec![self.start];
        let mut cur = self.start;
        for s in &self.segments {
            flatten_segment(cur, s, tol, &mut out);
            cur = s.end();
        }
        if self.closed && out.len() > 1 && out.last() == out.first() {
            out.pop();
        }
        out
    }
}

fn lp(p: Pt) -> lyon_geom::Point<f64> {
    point(p.x, p.y)
}

fn flatten_segment(from: Pt, s: &PathSegment, tol: f64, out: &mut Vec<Pt>) {
    let mut push = |q: lyon_geom::Point<f64>| out.push(pt(q.x, q.y));
    match *s {
        PathSegment::Line(p) => push(lp(p)),
        PathSegment::Quad(c, p) => {
            let q = QuadraticBezierSegment { from: lp(from), ctrl: lp(c), to: lp(p) };
            q.for_each_flattened(tol, &mut |l| push(l.to));
        }
        PathSegment::Cubic(a, b, p) => {
            let c = CubicBezierSegment { from: lp(from), ctrl1: lp(a), ctrl2: lp(b), to: lp(p) };
            c.for_each_flattened(tol, &mut |l| push(l.to));
        }
        PathSegment::Arc { radii, rotation, large, sweep, to } => {
            let arc = SvgArc {
                from: lp(from),
                to: lp(to),
                radii: vector(radii.0.abs(), radii.1.abs()),
                x_rotation: Angle::degrees(rotation),
                flags: ArcFlags { large_arc: large, sweep },
            };
            // SVG 1.1 F.6.2: zero radius or equal end points draw a straight line (or
            // nothing); lyon asserts against converting such arcs, so test first.
            if arc.is_straight_line() {
                push(lp(to));
            } else {
                arc.to_arc().for_each_flattened(tol, &mut |l| push(l.to));
            }
        }
    }
}

/// Points of a circular arc around `centre` from `start_deg`, turning `sweep_deg`
/// (positive counter-clockwise), with chords within `tol` of the arc; both end points
/// included.
///
/// ```
/// use segmask::geom::{arc_points, pt};
/// let p = arc_points(pt(0.0, 0.0), 1.0, 0.0, 90.0, 1e-3);
/// assert!((p[0].x - 1.0).abs() < 1e-12 && (p.last().unwrap().y - 1.0).abs() < 1e-12);
/// assert!(p.iter().all(|q| ((q.x * q.x + q.y * q.y).sqrt() - 1.0).abs() < 1e-9));
/// ```
pub fn arc_points(centre: Pt, radius: f64, start_deg: f64, sweep_deg: f64, tol: f64) -> Vec<Pt> {
    let a0 = start_deg.to_radians();
    let mut out = vec![pt(centre.x + radius * a0.cos(), centre.y + radius * a0.sin())];
    if radius <= 0.0 || sweep_deg == 0.0 {
        return out;
    }
    let arc = lyon_geom::Arc {
        center: lp(centre),
        radii: vector(radius, radius),
        start_angle: Angle::radians(a0),
        sweep_angle: Angle::radians(sweep_deg.to_radians()),
        x_rotation: Angle::zero(),
    };
    arc.for_each_flattened(tol, &mut |l| out.push(pt(l.to.x, l.to.y)));
    out
}

/// Rectangle from two corners with corners rounded to radius `r` (0 = sharp), arcs
/// within `tol`, counter-clockwise. `r` is limited to half the shorter side.
///
/// ```
/// use segmask::geom::{rounded_rect, area};
/// let a = area(&rounded_rect(0.0, 0.0, 4.0, 2.0, 1.0, 1e-5));
/// let exact = 8.0 - (4.0 - std::f64::consts::PI); // four corners lose r²(1 − π/4)
/// assert!((a - exact).abs() < 1e-3);
/// ```
pub fn rounded_rect(x0: f64, y0: f64, x1: f64, y1: f64, r: f64, tol: f64) -> Polygon {
    let (xa, xb) = (x0.min(x1), x0.max(x1));
    let (ya, yb) = (y0.min(y1), y0.max(y1));
    let r = r.min((xb - xa) / 2.0).min((yb - ya) / 2.0);
    if r <= 0.0 {
        return super::rect(xa, ya, xb, yb);
    }
    let mut v = Vec::new();
    v.extend(arc_points(pt(xb - r, ya + r), r, -90.0, 90.0, tol));
    v.extend(arc_points(pt(xb - r, yb - r), r, 0.0, 90.0, tol));
    v.extend(arc_points(pt(xa + r, yb - r), r, 90.0, 90.0, tol));
    v.extend(arc_points(pt(xa + r, ya + r), r, 180.0, 90.0, tol));
    v.dedup();
    ring_polygon(v)
}

/// A polygon from a ring of points (closed for you).
pub fn ring_polygon(mut v: Vec<Pt>) -> Polygon {
    if v.first() != v.last() {
        v.push(v[0]);
    }
    Polygon::new(LineString::from(v), vec![])
}

/// Fills closed rings with the even-odd rule (SVG `fill-rule="evenodd"`): a point is
/// inside when a ray from it crosses the rings an odd number of times.
///
/// ```
/// use segmask::geom::{fill_even_odd, area, pt};
/// let sq = |a: f64| vec![pt(-a, -a), pt(a, -a), pt(a, a), pt(-a, a)];
/// let r = fill_even_odd(&[sq(2.0), sq(1.0)]); // a square frame
/// assert!((area(&r) - 12.0).abs() < 1e-9);
/// ```
pub fn fill_even_odd(rings: &[Vec<Pt>]) -> Region {
    let polys: Vec<Polygon> =
        rings.iter().filter(|r| r.len() >= 3).map(|r| super::snap(&ring_polygon(r.clone()))).collect();
    if polys.is_empty() {
        return Region::new(vec![]);
    }
    geo::MultiPolygon(polys).union_with_fill_rule(&Region::new(vec![]), FillRule::EvenOdd)
}

/// Parses SVG path data (SVG 1.1 §8.3: `M L H V C S Q T A Z`, absolute and relative,
/// implicit repeats, compact numbers such as `1.5.5` and `1-2`).
///
/// ```
/// use segmask::geom::parse_svg_path;
/// let p = parse_svg_path("M0 0 h2 v1 H0 z").unwrap();
/// assert_eq!(p.len(), 1);
/// assert!(p[0].closed && p[0].segments.len() == 3);
/// assert!(parse_svg_path("L 1 1").is_err());
/// ```
pub fn parse_svg_path(d: &str) -> Result<Vec<SubPath>, PathError> {
    PathParser::new(d).run()
}

struct PathParser<'a> {
    s: &'a [u8],
    i: usize,
    subs: Vec<SubPath>,
    cur: Pt,
    start: Pt,
    /// Reflection source for S/T: the last control point and whether it was cubic.
    last_ctrl: Option<(Pt, bool)>,
}

impl<'a> PathParser<'a> {
    fn new(d: &'a str) -> Self {
        PathParser { s: d.as_bytes(), i: 0, subs: Vec::new(), cur: pt(0.0, 0.0), start: pt(0.0, 0.0), last_ctrl: None }
    }

    fn err<T>(&self, message: impl Into<String>) -> Result<T, PathError> {
        // Positions count characters; the parser only steps over ASCII, so `i` is
        // always on a character boundary.
        let position = std::str::from_utf8(&self.s[..self.i]).map(|t| t.chars().count()).unwrap_or(self.i) + 1;
        Err(PathError { position, message: message.into() })
    }

    fn skip_separators(&mut self) {
        while self.i < self.s.len() && (self.s[self.i].is_ascii_whitespace() || self.s[self.i] == b',') {
            self.i += 1;
        }
    }

    fn at_number(&mut self) -> bool {
        self.skip_separators();
        matches!(self.s.get(self.i), Some(c) if c.is_ascii_digit() || matches!(c, b'+' | b'-' | b'.'))
    }

    fn number(&mut self) -> Result<f64, PathError> {
        self.skip_separators();
        let begin = self.i;
        let s = self.s;
        let mut j = self.i;
        if j < s.len() && (s[j] == b'+' || s[j] == b'-') {
            j += 1;
        }
        let int_start = j;
        while j < s.len() && s[j].is_ascii_digit() {
            j += 1;
        }
        let mut digits = j > int_start;
        if j < s.len() && s[j] == b'.' {
            j += 1;
            let frac = j;
            while j < s.len() && s[j].is_ascii_digit() {
                j += 1;
            }
            digits |= j > frac;
        }
        if !digits {
            return self.err("expected a number");
        }
        if j < s.len() && (s[j] == b'e' || s[j] == b'E') {
            let mut k = j + 1;
            if k < s.len() && (s[k] == b'+' || s[k] == b'-') {
                k += 1;
            }
            let e = k;
            while k < s.len() && s[k].is_ascii_digit() {
                k += 1;
            }
            if k > e {
                j = k;
            }
        }
        self.i = j;
        let text = std::str::from_utf8(&s[begin..j]).unwrap_or("");
        match text.parse::<f64>() {
            Ok(v) if v.is_finite() => Ok(v),
            _ => {
                self.i = begin;
                self.err(format!("`{text}` is not a finite number"))
            }
        }
    }

    fn flag(&mut self) -> Result<bool, PathError> {
        self.skip_separators();
        match self.s.get(self.i) {
            Some(b'0') => {
                self.i += 1;
                Ok(false)
            }
            Some(b'1') => {
                self.i += 1;
                Ok(true)
            }
            _ => self.err("expected an arc flag, 0 or 1"),
        }
    }

    fn point(&mut self, rel: bool) -> Result<Pt, PathError> {
        let x = self.number()?;
        let y = self.number()?;
        Ok(if rel { pt(self.cur.x + x, self.cur.y + y) } else { pt(x, y) })
    }

    fn push(&mut self, seg: PathSegment) -> Result<(), PathError> {
        match self.subs.last_mut() {
            Some(sub) if !sub.closed => sub.segments.push(seg),
            Some(_) => {
                // A drawing command right after Z starts a new sub-path at the start point
                // of the closed one (SVG 1.1 §8.3.3).
                self.subs.push(SubPath { start: self.start, segments: vec![seg], closed: false });
            }
            None => return self.err("path data must begin with M or m"),
        }
        self.cur = seg.end();
        Ok(())
    }

    fn run(mut self) -> Result<Vec<SubPath>, PathError> {
        let mut cmd: Option<u8> = None;
        loop {
            self.skip_separators();
            if self.i >= self.s.len() {
                break;
            }
            let c = self.s[self.i];
            if c.is_ascii_alphabetic() {
                if !b"MmLlHhVvCcSsQqTtAaZz".contains(&c) {
                    let ch = std::str::from_utf8(&self.s[self.i..]).ok().and_then(|t| t.chars().next()).unwrap_or('?');
                    return self.err(format!("unknown command `{ch}` (allowed: {PATH_COMMANDS})"));
                }
                self.i += 1;
                cmd = Some(c);
            } else if cmd.is_none() {
                return self.err("path data must begin with M or m");
            } else if cmd == Some(b'Z') || cmd == Some(b'z') {
                return self.err("a number cannot follow Z; start a new sub-path with M");
            }
            let c = cmd.unwrap_or(b'M');
            if self.subs.is_empty() && c != b'M' && c != b'm' {
                return self.err("path data must begin with M or m");
            }
            self.command(c)?;
            // After M the implicit repeat is L (SVG 1.1 §8.3.2).
            cmd = match c {
                b'M' => Some(b'L'),
                b'm' => Some(b'l'),
                other => Some(other),
            };
            if (c == b'Z' || c == b'z') && self.at_number() {
                return self.err("a number cannot follow Z; start a new sub-path with M");
            }
        }
        if self.subs.is_empty() {
            return Err(PathError { position: 1, message: "path data is empty".into() });
        }
        Ok(self.subs)
    }

    fn command(&mut self, c: u8) -> Result<(), PathError> {
        let rel = c.is_ascii_lowercase();
        let upper = c.to_ascii_uppercase();
        let mut ctrl: Option<(Pt, bool)> = None;
        match upper {
            b'M' => {
                // A leading `m` is absolute (SVG 1.1 §8.3.3); the current point is then the
                // origin, so treating it as relative gives the same point.
                let p = self.point(rel)?;
                self.subs.push(SubPath { start: p, segments: vec![], closed: false });
                self.cur = p;
                self.start = p;
            }
            b'L' => {
                let p = self.point(rel)?;
                self.push(PathSegment::Line(p))?;
            }
            b'H' => {
                let x = self.number()?;
                let p = pt(if rel { self.cur.x + x } else { x }, self.cur.y);
                self.push(PathSegment::Line(p))?;
            }
            b'V' => {
                let y = self.number()?;
                let p = pt(self.cur.x, if rel { self.cur.y + y } else { y });
                self.push(PathSegment::Line(p))?;
            }
            b'C' => {
                let a = self.point(rel)?;
                let b = self.point(rel)?;
                let p = self.point(rel)?;
                self.push(PathSegment::Cubic(a, b, p))?;
                ctrl = Some((b, true));
            }
            b'S' => {
                let a = self.reflected(true);
                let b = self.point(rel)?;
                let p = self.point(rel)?;
                self.push(PathSegment::Cubic(a, b, p))?;
                ctrl = Some((b, true));
            }
            b'Q' => {
                let a = self.point(rel)?;
                let p = self.point(rel)?;
                self.push(PathSegment::Quad(a, p))?;
                ctrl = Some((a, false));
            }
            b'T' => {
                let a = self.reflected(false);
                let p = self.point(rel)?;
                self.push(PathSegment::Quad(a, p))?;
                ctrl = Some((a, false));
            }
            b'A' => {
                let rx = self.number()?;
                let ry = self.number()?;
                let rotation = self.number()?;
                let large = self.flag()?;
                let sweep = self.flag()?;
                let to = self.point(rel)?;
                self.push(PathSegment::Arc { radii: (rx.abs(), ry.abs()), rotation, large, sweep, to })?;
            }
            b'Z' => {
                if let Some(sub) = self.subs.last_mut() {
                    sub.closed = true;
                }
                self.cur = self.start;
            }
            _ => return self.err("unknown command"),
        }
        self.last_ctrl = ctrl;
        Ok(())
    }

    /// First control point of S/T: the previous control point of the same kind of curve
    /// reflected about the current point, else the current point (SVG 1.1 §8.3.6, §8.3.7).
    fn reflected(&self, cubic: bool) -> Pt {
        match self.last_ctrl {
            Some((c, was_cubic)) if was_cubic == cubic => pt(2.0 * self.cur.x - c.x, 2.0 * self.cur.y - c.y),
            _ => self.cur,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::area;
    use std::f64::consts::PI;

    fn filled(d: &str, tol: f64) -> Region {
        let subs = parse_svg_path(d).unwrap();
        let rings: Vec<Vec<Pt>> = subs.iter().map(|s| s.flatten(tol)).collect();
        fill_even_odd(&rings)
    }

    /// SVG 1.1 §8.3.8 and F.6: an arc of radius 1 from (0,0) to (2,0) is a half circle;
    /// closed, a half disc of area π/2. Flattened chords lie inside, so the deficit is at
    /// most the perimeter times the tolerance (2·tol·π for this arc, as the brief bounds).
    #[test]
    fn half_disc_arc_area() {
        for tol in [1e-2, 1e-3, 1e-4] {
            let a = area(&filled("M 0 0 A 1 1 0 0 1 2 0 Z", tol));
            assert!(a <= PI / 2.0 + 1e-9, "{a}");
            assert!(PI / 2.0 - a <= 2.0 * tol * PI, "tol {tol}: area {a}");
        }
    }

    /// SVG 1.1 §8.3.8: with sweep-flag 1 the arc runs in the positive-angle direction;
    /// with y up that is counter-clockwise, so from (0,0) to (2,0) around centre (1,0) it
    /// passes below the x axis.
    #[test]
    fn arc_sweep_direction_with_y_up() {
        let p = parse_svg_path("M 0 0 A 1 1 0 0 1 2 0").unwrap()[0].flatten(1e-3);
        assert!(p.iter().all(|q| q.y <= 1e-9));
        let p = parse_svg_path("M 0 0 A 1 1 0 0 0 2 0").unwrap()[0].flatten(1e-3);
        assert!(p.iter().all(|q| q.y >= -1e-9));
    }

    /// SVG 1.1 F.6.6: radii too small to reach the end point are scaled up until they do.
    #[test]
    fn arc_radii_scaled_up() {
        let a = area(&filled("M 0 0 A 0.1 0.1 0 0 1 2 0 Z", 1e-4));
        assert!((a - PI / 2.0).abs() < 2.0 * 1e-4 * PI, "{a}");
    }

    /// SVG 1.1 §8.3.2: relative commands, implicit repeats, H/V and compact numbers.
    #[test]
    fn relative_and_compact_numbers() {
        // A 2 × 1 rectangle written four ways.
        for d in ["M0 0 L2 0 L2 1 L0 1 Z", "m0,0 h2 v1 h-2 z", "M0 0 2 0 2 1 0 1z", "M0,0l2,0,0,1-2,0z"] {
            assert!((area(&filled(d, 1e-3)) - 2.0).abs() < 1e-9, "{d}");
        }
        let p = parse_svg_path("M.5.5l.5.5").unwrap();
        assert_eq!(p[0].start, pt(0.5, 0.5));
        assert_eq!(p[0].segments[0], PathSegment::Line(pt(1.0, 1.0)));
        let p = parse_svg_path("M1e1-2e-1").unwrap();
        assert_eq!(p[0].start, pt(10.0, -0.2));
    }

    /// A cubic approximating a quarter circle with the usual constant
    /// k = 4(√2 − 1)/3 ≈ 0.5523 (common practice) stays within 3e-4 of the circle.
    #[test]
    fn cubic_and_smooth_cubic() {
        let k = 4.0 * (2f64.sqrt() - 1.0) / 3.0;
        let d = format!("M 1 0 C 1 {k} {k} 1 0 1 S -1 {k} -1 0 S {mk} -1 0 -1 S 1 {mk} 1 0 Z", mk = -k);
        let a = area(&filled(&d, 1e-5));
        assert!((a - PI).abs() < 2e-3, "{a}");
    }

    /// Quadratic and smooth quadratic: M0 0 Q1 1 2 0 T4 0 closed by the x axis encloses
    /// two parabolic humps of height 1/2 and −1/2 (area of a parabolic segment is 2/3 of
    /// base × height, Archimedes), which even-odd keeps both of: 2·(2/3)·2·0.5.
    #[test]
    fn quadratic_and_smooth_quadratic() {
        let a = area(&filled("M0 0 Q1 1 2 0 T4 0 Z", 1e-5));
        assert!((a - 4.0 / 3.0).abs() < 1e-3, "{a}");
    }

    /// SVG fill-rule evenodd: a square inside a square is a hole, whatever the direction.
    #[test]
    fn even_odd_hole() {
        let a = area(&filled("M0 0H4V4H0Z M1 1H3V3H1Z", 1e-3));
        assert!((a - 12.0).abs() < 1e-9);
        let a = area(&filled("M0 0H4V4H0Z M1 1V3H3V1Z", 1e-3));
        assert!((a - 12.0).abs() < 1e-9);
    }

    #[test]
    fn errors_name_position() {
        let e = parse_svg_path("M 0 0 X 1").unwrap_err();
        assert_eq!(e.position, 7);
        assert!(e.message.contains("unknown command `X`"));
        let e = parse_svg_path("M 0 0 L 1").unwrap_err();
        assert_eq!(e.position, 10);
        assert!(parse_svg_path("").is_err());
        assert!(parse_svg_path("M 0 0 A 1 1 0 2 1 1 1").unwrap_err().message.contains("flag"));
        assert!(parse_svg_path("M0 0 L1 1 Z 3 4").is_err());
    }

    /// Degenerate curves (all points equal, zero radii) flatten to their end point
    /// without hanging; non-ASCII input is reported by character position.
    #[test]
    fn degenerate_curves_and_unicode() {
        for d in
            ["M0 0 Q0 0 0 0", "M0 0 C0 0 0 0 0 0", "M0 0 A0 0 0 0 1 1 1", "M0 0 A1 1 0 0 1 0 0", "M1 1 T1 1 S1 1 1 1"]
        {
            let subs = parse_svg_path(d).unwrap();
            let p = subs[0].flatten(1e-3);
            assert!(p.len() < 10 && p.iter().all(|q| q.x.is_finite() && q.y.is_finite()), "{d}: {p:?}");
        }
        let e = parse_svg_path("M 0 0 L 1 é").unwrap_err();
        assert_eq!(e.position, 11);
    }

    #[test]
    fn arc_points_within_tolerance() {
        // Every chord midpoint is within tol of the circle (sagitta bound).
        let tol = 1e-3;
        let p = arc_points(pt(0.0, 0.0), 2.0, 10.0, 300.0, tol);
        for w in p.windows(2) {
            let m = pt((w[0].x + w[1].x) / 2.0, (w[0].y + w[1].y) / 2.0);
            let r = (m.x * m.x + m.y * m.y).sqrt();
            assert!(2.0 - r <= tol + 1e-12 && r <= 2.0 + 1e-12);
        }
    }
}
