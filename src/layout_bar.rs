//! Bar graphs in the resolved layout: a row of steps along a straight line or an arc,
//! each step its own element, plus the plain numbers every later stage derives the
//! steps from (where step `k` starts and ends along the line, how far it reaches across).
//!
//! Steps are numbered from 0 here and from 1 in net names (`LVL.1` is step 0).

use crate::geom::{Pt, pt};

/// A bar graph: `count` steps along `path`, each its own element `{name}.{k}`.
#[derive(Debug, Clone, PartialEq)]
pub struct BarGraph {
    /// Name; step `k` (1-based) is net `{name}.{k}`.
    pub name: String,
    /// Number of steps.
    pub count: u32,
    /// The line the steps follow.
    pub path: BarPath,
    /// Shape of every step.
    pub shape: StepShape,
    /// Which side of the line the steps stand on.
    pub side: StepSide,
    /// Size of the first step across the line, mm.
    pub length: f64,
    /// Size of the last step across the line, mm (the steps between grow linearly).
    pub last_length: f64,
    /// Gap between neighbouring steps, mm.
    pub gap: f64,
    /// Key path in the layout, for messages.
    pub key: String,
}

/// The line a bar graph's steps follow.
#[derive(Debug, Clone, PartialEq)]
pub enum BarPath {
    /// A straight line from `from` in direction `angle`; step `k` covers
    /// `k·(thickness + gap)` to `k·(thickness + gap) + thickness` along it.
    Line {
        /// Where the first step starts.
        from: Pt,
        /// Direction, degrees counter-clockwise from +x.
        angle: f64,
        /// Size of every step along the line, mm.
        thickness: f64,
    },
    /// A circular arc from `start` to `end` (degrees counter-clockwise from +x; the arc
    /// runs clockwise when `end < start`), cut into `count` equal angles.
    Arc {
        /// Centre of the arc.
        centre: Pt,
        /// Radius of the line the steps stand on, mm.
        radius: f64,
        /// Angle where the first step starts, degrees.
        start: f64,
        /// Angle where the last step ends, degrees.
        end: f64,
    },
}

/// Shape of a step.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StepShape {
    /// A rectangle: along a line its sides are parallel and square to the line; on an
    /// arc it stands on the radius through the middle of its angle.
    Rectangle,
    /// An annular sector (arcs only); neighbours are cut apart by strips exactly `gap`
    /// wide with parallel edges.
    Wedge,
}

/// Which side of its line a step stands on.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StepSide {
    /// Centred on the line.
    Centre,
    /// Left of the line, seen travelling from the first step to the last (lines only).
    Left,
    /// Right of the line (lines only).
    Right,
    /// Towards the centre of the arc (arcs only).
    Inside,
    /// Away from the centre of the arc (arcs only).
    Outside,
}

/// Most steps in one bar graph (a guard against typos such as `count: 1000`).
pub const MAX_STEPS: u32 = 100;

/// Net name of step `k` (1-based) of bar graph `name`: `LVL.3`.
pub fn step_net(name: &str, k: u32) -> String {
    format!("{name}.{k}")
}

impl BarGraph {
    /// Size across the line of step `k` (0-based): `length` for the first, `last_length`
    /// for the last, linear in between.
    pub fn step_length(&self, k: u32) -> f64 {
        if self.count <= 1 {
            return self.length;
        }
        let t = f64::from(k) / f64::from(self.count - 1);
        self.length + (self.last_length - self.length) * t
    }

    /// How far step `k` reaches across its line: `(low, high)` offsets, mm, positive to
    /// the left of a line or away from the centre of an arc.
    pub fn across(&self, k: u32) -> (f64, f64) {
        let l = self.step_length(k);
        match self.side {
            StepSide::Centre => (-l / 2.0, l / 2.0),
            StepSide::Left | StepSide::Outside => (0.0, l),
            StepSide::Right | StepSide::Inside => (-l, 0.0),
        }
    }

    /// Angles (degrees) where step `k` starts and ends on an arc, without the gaps: the
    /// sweep cut into `count` equal parts. `None` on a line.
    pub fn step_angles(&self, k: u32) -> Option<(f64, f64)> {
        let BarPath::Arc { start, end, .. } = self.path else { return None };
        let pitch = (end - start) / f64::from(self.count.max(1));
        Some((start + f64::from(k) * pitch, start + f64::from(k + 1) * pitch))
    }

    /// Smallest inner radius of any step on an arc (`None` on a line).
    pub fn inner_radius(&self) -> Option<f64> {
        let BarPath::Arc { radius, .. } = self.path else { return None };
        Some((0..self.count).map(|k| radius + self.across(k).0).fold(f64::INFINITY, f64::min))
    }

    /// Width of rectangular steps on an arc: neighbours standing on radii `Δ` apart are
    /// nearest at their inner corners, `2·(r·sin(Δ/2) − (w/2)·cos(Δ/2))` apart for inner
    /// radius `r` (their facing sides diverge outwards); this is the `w` that makes that
    /// distance the gap at the smallest inner radius. `None` on a line.
    pub fn arc_rect_width(&self) -> Option<f64> {
        let r = self.inner_radius()?;
        let (a, b) = self.step_angles(0)?;
        let half = ((b - a).abs() / 2.0).to_radians();
        Some((2.0 * r * half.sin() - self.gap) / half.cos())
    }

    /// Corners of rectangular step `k`, in order around it (counter-clockwise for a
    /// line running left to right).
    pub fn rect_corners(&self, k: u32) -> [Pt; 4] {
        let (lo, hi) = self.across(k);
        match self.path {
            BarPath::Line { from, angle, thickness } => {
                let (s, c) = angle.to_radians().sin_cos();
                let at = |along: f64, off: f64| pt(from.x + c * along - s * off, from.y + s * along + c * off);
                let s0 = f64::from(k) * (thickness + self.gap);
                let s1 = s0 + thickness;
                [at(s0, lo), at(s1, lo), at(s1, hi), at(s0, hi)]
            }
            BarPath::Arc { centre, radius, .. } => {
                let (a, b) = self.step_angles(k).unwrap_or((0.0, 0.0));
                let (s, c) = ((a + b) / 2.0).to_radians().sin_cos();
                let half = self.arc_rect_width().unwrap_or(0.0) / 2.0;
                let at = |r: f64, off: f64| pt(centre.x + c * r - s * off, centre.y + s * r + c * off);
                let (r0, r1) = (radius + lo, radius + hi);
                [at(r0, -half), at(r1, -half), at(r1, half), at(r0, half)]
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn bar(path: BarPath, side: StepSide) -> BarGraph {
        BarGraph {
            name: "LVL".into(),
            count: 5,
            path,
            shape: StepShape::Rectangle,
            side,
            length: 2.0,
            last_length: 6.0,
            gap: 0.5,
            key: "bars[0]".into(),
        }
    }

    #[test]
    fn lengths_grow_linearly_from_first_to_last() {
        let b = bar(BarPath::Line { from: pt(0.0, 0.0), angle: 0.0, thickness: 1.0 }, StepSide::Left);
        let l: Vec<f64> = (0..5).map(|k| b.step_length(k)).collect();
        assert_eq!(l, vec![2.0, 3.0, 4.0, 5.0, 6.0]);
        assert_eq!(b.across(4), (0.0, 6.0));
        assert_eq!(step_net("LVL", 3), "LVL.3");
    }

    #[test]
    fn line_steps_sit_at_thickness_plus_gap() {
        let b = bar(BarPath::Line { from: pt(1.0, 2.0), angle: 0.0, thickness: 1.0 }, StepSide::Left);
        // Step 2 (0-based) starts at 2 × (1 + 0.5) = 3 along the line and stands 4 mm tall.
        assert_eq!(b.rect_corners(2), [pt(4.0, 2.0), pt(5.0, 2.0), pt(5.0, 6.0), pt(4.0, 6.0)]);
        // Running straight up, `left` is towards −x.
        let up = bar(BarPath::Line { from: pt(0.0, 0.0), angle: 90.0, thickness: 1.0 }, StepSide::Left);
        let c = up.rect_corners(0);
        assert!((c[2].x + 2.0).abs() < 1e-12 && (c[2].y - 1.0).abs() < 1e-12, "{c:?}");
    }

    /// Neighbouring rectangles on an arc keep exactly the gap at their inner corners.
    #[test]
    fn arc_rectangles_keep_the_gap_at_the_inner_corners() {
        let mut b = bar(BarPath::Arc { centre: pt(0.0, 0.0), radius: 10.0, start: 0.0, end: 90.0 }, StepSide::Outside);
        b.last_length = 2.0;
        let (p, q) = (b.rect_corners(0), b.rect_corners(1));
        // Step 0's corner on its far side from the start meets step 1's near corner.
        let d = ((p[3].x - q[0].x).powi(2) + (p[3].y - q[0].y).powi(2)).sqrt();
        assert!((d - 0.5).abs() < 1e-9, "{d}");
    }
}
