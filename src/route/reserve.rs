//! Ways kept for a common's cut-off islands (negotiated in the spirit of PathFinder,
//! McMurchie & Ebeling 1995, but one common and one island at a time).
//!
//! When every order of the commons leaves some island cut off, each such island is asked
//! for once more on a grid where the other commons' leads of that attempt cost extra
//! instead of blocking ([`soft_grid`]). The way found, and the keep-out of its lead, is
//! then held for that common from the start of the next attempt ([`Reservation`]), as if
//! its lead had been laid before any other: the other commons' leads go round it, and
//! the island joins through it.
//!
//! Takes the back plate's grid before the commons' leads and one attempt's leads; gives
//! the grid on which the island is asked for, and the runs of cells to hold.

use super::grid::Grid;
use super::Lead;
use crate::layout::Layout;

/// Runs of grid cells (row, first column, last column), as [`Grid::claim_spans`] takes them.
pub type Spans = Vec<(usize, usize, usize)>;

/// Extra cost per cell of a lead crossing the keep-out of another common's lead on the
/// soft grid: a crossing (a keep-out some 20–30 cells across) costs as much as several
/// millimetres of detour, so a way round is taken where there is one.
pub const CROSSING_COST: f32 = 200.0;

/// The cells kept for one common's lead from the start of an attempt.
#[derive(Debug, Clone)]
pub struct Reservation {
    /// The common's owner value on the grid.
    pub owner: u32,
    /// The cells of its lead's keep-out.
    pub spans: Spans,
}

/// The distance from a lead's outline within which a cell is its keep-out: the gap, half
/// a lead and a cell (the claims of the back plate's leads).
pub fn keep_out(layout: &Layout, h: f64) -> f64 {
    layout.rules.min_gap + layout.rules.lead_width / 2.0 + h
}

/// Claims every reservation on `grid`, in the order made.
pub fn hold(grid: &mut Grid, reserved: &[Reservation]) {
    for r in reserved {
        grid.claim_spans(&r.spans, r.owner);
    }
}

/// The grid on which a cut-off island of common `owner` (net `net`) is asked for again:
/// `base` with the reservations held, `owner`'s own leads of the attempt claimed as in
/// the attempt, and the keep-outs of the other commons' leads left open at
/// [`CROSSING_COST`] a cell. The other commons' islands and the front leads keep
/// blocking, as they do in every attempt.
pub fn soft_grid(layout: &Layout, base: &Grid, reserved: &[Reservation], leads: &[Lead], owner: u32, net: &str) -> Grid {
    let mut g = base.clone();
    hold(&mut g, reserved);
    let reach = keep_out(layout, g.h);
    for lead in leads {
        let spans = g.spans_near(&lead.outline, reach);
        if lead.net == net {
            g.claim_spans(&spans, owner);
        } else {
            g.raise_cost_spans(&spans, CROSSING_COST);
        }
    }
    g
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, stroke_lead};
    use crate::layout::PlateId;

    /// Another common's lead becomes a costly band on the soft grid, open to the common
    /// asking; its own lead is claimed for it; a reservation is held for its owner.
    #[test]
    fn other_commons_leads_cost_own_leads_and_reservations_are_claimed() {
        let layout = crate::layout::fixture::tiny_layout();
        let base = Grid::new(0.0, 0.0, 10.0, 10.0, 0.05);
        let lead = |net: &str, y: f64| Lead {
            net: net.into(),
            plate: PlateId::Back,
            path: vec![pt(1.0, y), pt(9.0, y)],
            outline: stroke_lead(&[pt(1.0, y), pt(9.0, y)], 0.1, 1e-3),
            user_bus: false,
        };
        let reserved = vec![Reservation { owner: 3, spans: vec![(10, 5, 7)] }];
        let g = soft_grid(&layout, &base, &reserved, &[lead("COM2", 2.0), lead("COM1", 6.0)], 1, "COM1");
        let at = |x: f64, y: f64| g.index_of(pt(x, y)).unwrap();
        assert_eq!(g.owner(at(5.0, 2.0)), super::super::grid::FREE, "the other common's lead is open");
        assert_eq!(g.cost(at(5.0, 2.0)), CROSSING_COST, "and costly");
        assert_eq!(g.owner(at(5.0, 6.0)), 1, "its own lead is claimed for it");
        assert_eq!(g.cost(at(5.0, 6.0)), 0.0);
        assert_eq!(g.cost(at(5.0, 4.0)), 0.0, "between them the glass is as it was");
        assert_eq!(g.owner(10 * g.nx + 6), 3, "the reservation is held");
    }
}
