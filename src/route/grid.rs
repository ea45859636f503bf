//! The routing grid: square cells over the glass, each with an owner (which net's
//! keep-out covers it) and an extra cost.
//!
//! Both values are kept by page ([`PagedCells`]): a page where every cell is alike (open
//! glass, the inside of a keep-out, the blocked margin) holds one value, so the grid's
//! memory follows the drawing, not the glass.

use super::pages::{PageGeom, PagedCells};
use crate::geom::{Polygon, Pt, Region};

/// Owner value of a cell no net claims.
pub const FREE: u32 = 0;
/// Owner value of a cell claimed by two or more nets, or by the glass edge.
pub const BLOCKED: u32 = u32::MAX;

/// A grid of square cells in the front-plate frame.
#[derive(Debug, Clone)]
pub struct Grid {
    /// x of the centre of column 0.
    pub x0: f64,
    /// y of the centre of row 0.
    pub y0: f64,
    /// Cell size, mm.
    pub h: f64,
    /// Columns.
    pub nx: usize,
    /// Rows.
    pub ny: usize,
    /// Owner per cell: `FREE`, `BLOCKED`, or net id + 1.
    owner: PagedCells<u32>,
    /// Extra cost of entering a cell (0 = none; `f32::INFINITY` = forbidden).
    cost: PagedCells<f32>,
}

impl Grid {
    /// A free grid covering `[xa, xb] × [ya, yb]` with cells of size `h`.
    pub fn new(xa: f64, ya: f64, xb: f64, yb: f64, h: f64) -> Grid {
        let nx = ((xb - xa) / h).ceil() as usize + 1;
        let ny = ((yb - ya) / h).ceil() as usize + 1;
        let pages = PageGeom::of(nx, ny);
        Grid { x0: xa, y0: ya, h, nx, ny, owner: PagedCells::new(pages, FREE), cost: PagedCells::new(pages, 0.0) }
    }

    /// Owner of cell `i`: `FREE`, `BLOCKED`, or net id + 1.
    #[inline]
    pub fn owner(&self, i: usize) -> u32 {
        self.owner.get(i)
    }

    /// Owner of the cell at column `x`, row `y`.
    #[inline]
    pub fn owner_xy(&self, x: usize, y: usize) -> u32 {
        self.owner.get_xy(x, y)
    }

    /// Extra cost of entering cell `i` (0 = none; `f32::INFINITY` = forbidden).
    #[inline]
    pub fn cost(&self, i: usize) -> f32 {
        self.cost.get(i)
    }

    /// Extra cost of entering the cell at column `x`, row `y`.
    #[inline]
    pub fn cost_xy(&self, x: usize, y: usize) -> f32 {
        self.cost.get_xy(x, y)
    }

    /// Sets the extra cost of cell `i`.
    pub fn set_cost(&mut self, i: usize, extra: f32) {
        self.cost.set(i, extra);
    }

    /// Stores pages whose cells have all come out alike as one value (call when a
    /// grid is built: claims fill pages cell by cell).
    pub fn compact(&mut self) {
        self.owner.compact();
        self.cost.compact();
    }

    /// Cells stored one by one, of both values (for reports of memory use).
    pub fn dense_cells(&self) -> usize {
        self.owner.dense_cells() + self.cost.dense_cells()
    }

    /// Centre of cell `i`.
    pub fn centre(&self, i: usize) -> Pt {
        crate::geom::pt(self.x0 + (i % self.nx) as f64 * self.h, self.y0 + (i / self.nx) as f64 * self.h)
    }

    /// Index of the cell whose centre is nearest to `p`, if inside the grid.
    pub fn index_of(&self, p: Pt) -> Option<usize> {
        let c = ((p.x - self.x0) / self.h).round();
        let r = ((p.y - self.y0) / self.h).round();
        if c < 0.0 || r < 0.0 || c as usize >= self.nx || r as usize >= self.ny {
            return None;
        }
        Some(r as usize * self.nx + c as usize)
    }

    /// Calls `f` with every cell whose centre lies inside `region` (even-odd over all
    /// rings, so holes stay out).
    pub fn for_cells_in(&self, region: &Region, mut f: impl FnMut(usize)) {
        let nx = self.nx;
        self.for_spans_in(region, |r, c0, c1| (c0..=c1).for_each(|c| f(r * nx + c)));
    }

    /// Calls `f(row, first column, last column)` for every run of cells in a row whose
    /// centres lie inside `region` (even-odd over all rings).
    pub fn for_spans_in(&self, region: &Region, mut f: impl FnMut(usize, usize, usize)) {
        let mut edges: Vec<(Pt, Pt)> = Vec::new();
        for p in &region.0 {
            push_ring_edges(p, &mut edges);
        }
        if edges.is_empty() {
            return;
        }
        let (ymin, ymax) = edges.iter().fold((f64::MAX, f64::MIN), |(a, b), (p, q)| {
            (a.min(p.y).min(q.y), b.max(p.y).max(q.y))
        });
        let r0 = (((ymin - self.y0) / self.h).ceil().max(0.0)) as usize;
        let r1 = (((ymax - self.y0) / self.h).floor()) as i64;
        if r1 < 0 {
            return;
        }
        let r1 = (r1 as usize).min(self.ny - 1);
        let mut xs: Vec<f64> = Vec::new();
        for r in r0..=r1 {
            let y = self.y0 + r as f64 * self.h;
            xs.clear();
            for (p, q) in &edges {
                if (p.y <= y) != (q.y <= y) {
                    xs.push(p.x + (y - p.y) * (q.x - p.x) / (q.y - p.y));
                }
            }
            xs.sort_by(|a, b| a.total_cmp(b));
            for pair in xs.chunks(2) {
                if pair.len() < 2 {
                    break;
                }
                let c0 = (((pair[0] - self.x0) / self.h).ceil().max(0.0)) as usize;
                let c1 = ((pair[1] - self.x0) / self.h).floor();
                if c1 < 0.0 {
                    continue;
                }
                let c1 = (c1 as usize).min(self.nx - 1);
                if c0 <= c1 {
                    f(r, c0, c1);
                }
            }
        }
    }

    /// Claims every cell inside `region` for `owner` (id + 1); cells already claimed by
    /// another owner become `BLOCKED`.
    pub fn claim(&mut self, region: &Region, owner: u32) {
        let mut cells = Vec::new();
        self.for_cells_in(region, |i| cells.push(i));
        for i in cells {
            let o = self.owner.get(i);
            if o == FREE {
                self.owner.set(i, owner);
            } else if o != owner {
                self.owner.set(i, BLOCKED);
            }
        }
    }

    /// Blocks every cell inside `region`.
    pub fn block(&mut self, region: &Region) {
        let mut cells = Vec::new();
        self.for_cells_in(region, |i| cells.push(i));
        for i in cells {
            self.owner.set(i, BLOCKED);
        }
    }

    /// Blocks every cell outside `region`, row by row between the spans inside it.
    pub fn block_outside(&mut self, region: &Region) {
        let mut spans: Vec<Vec<(usize, usize)>> = vec![Vec::new(); self.ny];
        self.for_spans_in(region, |r, c0, c1| spans[r].push((c0, c1)));
        for (r, row) in spans.iter_mut().enumerate() {
            row.sort_unstable();
            let mut next = 0;
            for &(c0, c1) in row.iter() {
                for c in next..c0.max(next) {
                    self.owner.set(r * self.nx + c, BLOCKED);
                }
                next = next.max(c1 + 1);
            }
            for c in next..self.nx {
                self.owner.set(r * self.nx + c, BLOCKED);
            }
        }
    }

    /// Adds `extra` to the cost of every cell inside `region`.
    pub fn add_cost(&mut self, region: &Region, extra: f32) {
        let mut cells = Vec::new();
        self.for_cells_in(region, |i| cells.push(i));
        for i in cells {
            self.cost.set(i, self.cost.get(i) + extra);
        }
    }
}

fn push_ring_edges(p: &Polygon, edges: &mut Vec<(Pt, Pt)>) {
    for ring in std::iter::once(p.exterior()).chain(p.interiors()) {
        for w in ring.0.windows(2) {
            if w[0].y != w[1].y {
                edges.push((w[0], w[1]));
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, region_of, ring, pt};

    #[test]
    fn rasterises_rectangle_cell_count() {
        let g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        let mut n = 0;
        g.for_cells_in(&region_of([rect(1.1, 1.1, 3.1, 2.1)]), |_| n += 1);
        // centres at 1.5..3.0 (4 columns) × 1.5..2.0 (2 rows)
        assert_eq!(n, 8);
    }

    #[test]
    fn holes_stay_empty() {
        let g = Grid::new(-5.0, -5.0, 5.0, 5.0, 0.1);
        let mut hit_centre = false;
        let r = region_of([ring(pt(0.0, 0.0), 3.0, 1.0, 1e-3)]);
        g.for_cells_in(&r, |i| {
            let c = g.centre(i);
            if c.x.hypot(c.y) < 0.9 {
                hit_centre = true;
            }
        });
        assert!(!hit_centre);
    }
}
