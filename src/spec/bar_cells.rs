//! The cell each bar-graph step claims for the placement checks, known before the glyph
//! stage runs: a rectangular step is its own rectangle; a wedge claims its whole annular
//! sector without the gaps, so the cells of one arc tile it and every step lies inside
//! its cell.

use crate::geom::{Polygon, arc_points, ring_polygon};
use crate::layout::{BarGraph, BarPath, StepShape};

/// The cell of step `k` (0-based), arcs flattened with chords within `tol`.
pub fn step_cell(b: &BarGraph, k: u32, tol: f64) -> Polygon {
    match (&b.path, b.shape) {
        (BarPath::Arc { centre, radius, .. }, StepShape::Wedge) => {
            let (a0, a1) = b.step_angles(k).unwrap_or((0.0, 0.0));
            let (lo, hi) = b.across(k);
            let mut v = arc_points(*centre, radius + hi, a0, a1 - a0, tol);
            v.extend(arc_points(*centre, radius + lo, a1, a0 - a1, tol));
            ring_polygon(v)
        }
        _ => ring_polygon(b.rect_corners(k).to_vec()),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, pt};
    use crate::layout::StepSide;

    /// A quarter annulus between radii 2 and 3 has area (π/2)/2 · (3² − 2²) = 5π/4
    /// (area of an annular sector, θ/2 · (r2² − r1²), standard plane geometry). With the
    /// vertices on the arcs, the outer chords lose and the inner chords gain at most
    /// arc length × tolerance each.
    #[test]
    fn a_wedge_cell_is_its_annular_sector() {
        let b = BarGraph {
            name: "A".into(),
            count: 4,
            path: BarPath::Arc { centre: pt(1.0, 1.0), radius: 2.0, start: 0.0, end: 360.0 },
            shape: StepShape::Wedge,
            side: StepSide::Outside,
            length: 1.0,
            last_length: 1.0,
            gap: 0.2,
            key: "bars[0]".into(),
        };
        let tol = 1e-4;
        let a = area(&step_cell(&b, 1, tol));
        let exact = std::f64::consts::FRAC_PI_2 / 2.0 * (9.0 - 4.0);
        let slack = std::f64::consts::FRAC_PI_2 * (2.0 + 3.0) * tol;
        assert!((a - exact).abs() <= slack, "{a} vs {exact}");
    }
}
