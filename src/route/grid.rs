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

/// An owner as the grid stores it: 16 bits, `BLOCKED` as the top value. Half the
/// memory of the grid's cells stored one by one (the 64-digit benchmark's grid kept 73 MB
/// of them); no layout has near 65 535 nets (segmask's limits allow a few thousand).
#[inline]
fn packed(owner: u32) -> u16 {
    if owner == BLOCKED {
        u16::MAX
    } else {
        debug_assert!(owner < u32::from(u16::MAX), "net id {owner} beyond the grid's 16-bit owners");
        owner as u16
    }
}

/// The owner a stored value stands for ([`packed`] undone).
#[inline]
fn unpacked(v: u16) -> u32 {
    if v == u16::MAX { BLOCKED } else { u32::from(v) }
}

/// Whether a lead of `owner` may use a cell held by `cell_owner` at extra cost `extra`:
/// the cell is free or its own, and not forbidden (infinite cost). One answer for a cell
/// and for a page whose cells all hold the same pair.
#[inline]
pub fn usable_by(cell_owner: u32, extra: f32, owner: u32) -> bool {
    (cell_owner == FREE || cell_owner == owner) && !extra.is_infinite()
}

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
    /// Owner per cell: `FREE`, `BLOCKED`, or net id + 1, [`packed`].
    owner: PagedCells<u16>,
    /// Extra cost of entering a cell (0 = none; `f32::INFINITY` = forbidden).
    cost: PagedCells<f32>,
}

impl Grid {
    /// A free grid covering `[xa, xb] × [ya, yb]` with cells of size `h`.
    pub fn new(xa: f64, ya: f64, xb: f64, yb: f64, h: f64) -> Grid {
        let nx = ((xb - xa) / h).ceil() as usize + 1;
        let ny = ((yb - ya) / h).ceil() as usize + 1;
        let pages = PageGeom::of(nx, ny);
        Grid { x0: xa, y0: ya, h, nx, ny, owner: PagedCells::new(pages, packed(FREE)), cost: PagedCells::new(pages, 0.0) }
    }

    /// Owner of cell `i`: `FREE`, `BLOCKED`, or net id + 1.
    #[inline]
    pub fn owner(&self, i: usize) -> u32 {
        unpacked(self.owner.get(i))
    }

    /// Owner of the cell at column `x`, row `y`.
    #[inline]
    pub fn owner_xy(&self, x: usize, y: usize) -> u32 {
        unpacked(self.owner.get_xy(x, y))
    }

    /// Whether a lead of `owner` may lie in the cell at column `x`, row `y` as far as
    /// owners go: the cell is free or already its own (its cost aside).
    #[inline]
    pub fn open_to(&self, x: usize, y: usize, owner: u32) -> bool {
        let o = self.owner_xy(x, y);
        o == FREE || o == owner
    }

    /// Whether a diagonal step of `owner` from (`cx`, `cy`) to (`x`, `y`) cuts no corner:
    /// both cells it passes between are open to it ([`Grid::open_to`]).
    #[inline]
    pub fn corner_open(&self, cx: usize, cy: usize, x: usize, y: usize, owner: u32) -> bool {
        self.open_to(cx, y, owner) && self.open_to(x, cy, owner)
    }

    /// Whether a lead of `owner` may use the cell at column `x`, row `y`: free or its own,
    /// at a finite cost ([`usable_by`]).
    #[inline]
    pub fn usable_xy(&self, x: usize, y: usize, owner: u32) -> bool {
        usable_by(self.owner_xy(x, y), self.cost_xy(x, y), owner)
    }

    /// The owner and extra cost shared by every cell of the page (a square of
    /// [`super::pages::SIDE`] cells) holding column `x`, row `y`, when the page stores
    /// each as one value: a question about a block of cells inside one page is then
    /// answered once, not cell by cell.
    #[inline]
    pub fn uniform_page_xy(&self, x: usize, y: usize) -> Option<(u32, f32)> {
        Some((unpacked(self.owner.uniform_xy(x, y)?), self.cost.uniform_xy(x, y)?))
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
    /// centres lie inside `region` (even-odd over all rings). Edges are taken up row by
    /// row as the scan reaches them and dropped when it passes them, so each row costs
    /// the edges it crosses, not every edge of the region (a common electrode has tens
    /// of thousands).
    pub fn for_spans_in(&self, region: &Region, mut f: impl FnMut(usize, usize, usize)) {
        let mut edges: Vec<(Pt, Pt)> = Vec::new();
        for p in &region.0 {
            push_ring_edges(p, &mut edges);
        }
        if edges.is_empty() {
            return;
        }
        // The first row whose centre line lies at or above an edge's lower end, per edge.
        let first_row = |e: &(Pt, Pt)| (((e.0.y.min(e.1.y) - self.y0) / self.h).ceil().max(0.0)) as usize;
        edges.sort_by_key(first_row);
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
        let mut active: Vec<(Pt, Pt)> = Vec::new();
        let mut next = 0;
        for r in r0..=r1 {
            let y = self.y0 + r as f64 * self.h;
            while next < edges.len() && first_row(&edges[next]) <= r {
                active.push(edges[next]);
                next += 1;
            }
            active.retain(|(p, q)| p.y.max(q.y) >= y);
            xs.clear();
            for (p, q) in &active {
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
        let mut spans = Vec::new();
        self.for_spans_in(region, |r, c0, c1| spans.push((r, c0, c1)));
        self.claim_spans(&spans, owner);
    }

    /// Claims the runs of cells `spans` (row, first column, last column) for `owner`:
    /// free cells become its, another owner's become `BLOCKED` (claiming a cell twice for
    /// one owner changes nothing, so runs may overlap).
    pub fn claim_spans(&mut self, spans: &[(usize, usize, usize)], owner: u32) {
        let claimed = |o: u32| if o == FREE || o == owner { owner } else { BLOCKED };
        for &(r, c0, c1) in spans {
            self.owner.update_run(r, c0, c1, |o| packed(claimed(unpacked(o))));
        }
    }

    /// Calls `f` with every cell whose centre lies within `d` of `region` (inside it, or
    /// at most `d` from its boundary): the cells of the region grown by a disc of radius
    /// `d`, exactly, without building the grown polygon. That grown region is the region
    /// itself together with the capsule of radius `d` around each of its edges, so this
    /// scans the region's spans and then each edge's capsule, row by row. A cell may be
    /// visited more than once.
    pub fn for_cells_near(&self, region: &Region, d: f64, mut f: impl FnMut(usize)) {
        let nx = self.nx;
        self.for_spans_near(region, d, |r, c0, c1| (c0..=c1).for_each(|c| f(r * nx + c)));
    }

    /// Calls `f`, row by row and left to right, with every cell whose centre lies inside
    /// `region` and more than `d` from its boundary: the cells of the region shrunk by a
    /// disc of radius `d`, exactly, without building the shrunk polygon (an offset with
    /// round joins and a boolean per piece). The region's cells are marked in a bitmap
    /// over their own box, and each edge's capsule of radius `d` unmarks its cells, so the
    /// work follows the region's cells and its perimeter, not the glass.
    pub fn for_cells_inward(&self, region: &Region, d: f64, mut f: impl FnMut(usize)) {
        let mut spans = Vec::new();
        self.for_spans_in(region, |r, c0, c1| spans.push((r, c0, c1)));
        let Some(&(r_lo, _, _)) = spans.first() else { return };
        let r_hi = spans.iter().map(|s| s.0).max().unwrap_or(r_lo);
        let c_lo = spans.iter().map(|s| s.1).min().unwrap_or(0);
        let c_hi = spans.iter().map(|s| s.2).max().unwrap_or(c_lo);
        let w = c_hi - c_lo + 1;
        let mut inside = vec![false; (r_hi - r_lo + 1) * w];
        for &(r, c0, c1) in &spans {
            inside[(r - r_lo) * w + c0 - c_lo..=(r - r_lo) * w + c1 - c_lo].fill(true);
        }
        let mut clear = |r: usize, c0: usize, c1: usize| {
            if r < r_lo || r > r_hi || c1 < c_lo || c0 > c_hi {
                return;
            }
            let row = (r - r_lo) * w;
            inside[row + c0.max(c_lo) - c_lo..=row + c1.min(c_hi) - c_lo].fill(false);
        };
        for p in &region.0 {
            for ring in std::iter::once(p.exterior()).chain(p.interiors()) {
                for e in ring.0.windows(2) {
                    self.for_capsule_spans(e[0], e[1], d, &mut clear);
                }
            }
        }
        for (k, _) in inside.iter().enumerate().filter(|(_, v)| **v) {
            f((r_lo + k / w) * self.nx + c_lo + k % w);
        }
    }

    /// [`Grid::for_cells_near`] by runs of cells in a row (row, first column, last
    /// column); runs may overlap.
    pub fn for_spans_near(&self, region: &Region, d: f64, mut f: impl FnMut(usize, usize, usize)) {
        self.for_spans_in(region, &mut f);
        for p in &region.0 {
            for ring in std::iter::once(p.exterior()).chain(p.interiors()) {
                for w in ring.0.windows(2) {
                    self.for_capsule_spans(w[0], w[1], d, &mut f);
                }
            }
        }
    }

    /// Runs of cells whose centres lie within `d` of the segment `a`–`b`, row by row.
    fn for_capsule_spans(&self, a: Pt, b: Pt, d: f64, mut f: impl FnMut(usize, usize, usize)) {
        let row = |y: f64| (y - self.y0) / self.h;
        let r0 = row(a.y.min(b.y) - d).ceil().max(0.0) as usize;
        let r1 = row(a.y.max(b.y) + d).floor();
        if r1 < 0.0 {
            return;
        }
        let r1 = (r1 as usize).min(self.ny - 1);
        let (dx, dy) = (b.x - a.x, b.y - a.y);
        let len = dx.hypot(dy);
        for r in r0..=r1 {
            let y = self.y0 + r as f64 * self.h;
            // The capsule is convex: its cut along the row is the hull of the cuts of its
            // two end discs and of the band between them.
            let mut lo = f64::INFINITY;
            let mut hi = f64::NEG_INFINITY;
            for c in [a, b] {
                let e = d * d - (y - c.y) * (y - c.y);
                if e >= 0.0 {
                    let s = e.sqrt();
                    lo = lo.min(c.x - s);
                    hi = hi.max(c.x + s);
                }
            }
            if len > 0.0 && dy != 0.0 {
                // Along the segment t = ((x − a.x)·dx + (y − a.y)·dy) / len in [0, len];
                // across it n = ((y − a.y)·dx − (x − a.x)·dy) / len in [−d, d]; both
                // linear in x.
                let (ux, uy) = (dx / len, dy / len);
                let mut band = (f64::NEG_INFINITY, f64::INFINITY);
                let mut clamp = |k: f64, c0: f64, lo_v: f64, hi_v: f64| {
                    // k·x + c0 in [lo_v, hi_v]
                    if k.abs() < 1e-15 {
                        if c0 < lo_v || c0 > hi_v {
                            band = (1.0, 0.0);
                        }
                    } else {
                        let (x0, x1) = ((lo_v - c0) / k, (hi_v - c0) / k);
                        band = (band.0.max(x0.min(x1)), band.1.min(x0.max(x1)));
                    }
                };
                clamp(ux, -a.x * ux + (y - a.y) * uy, 0.0, len);
                clamp(-uy, a.x * uy + (y - a.y) * ux, -d, d);
                if band.0 <= band.1 {
                    lo = lo.min(band.0);
                    hi = hi.max(band.1);
                }
            } else if len > 0.0 && (y - a.y).abs() <= d {
                lo = lo.min(a.x.min(b.x));
                hi = hi.max(a.x.max(b.x));
            }
            if lo > hi {
                continue;
            }
            let c0 = ((lo - self.x0) / self.h).ceil().max(0.0) as usize;
            let c1 = ((hi - self.x0) / self.h).floor();
            if c1 < 0.0 {
                continue;
            }
            let c1 = (c1 as usize).min(self.nx - 1);
            if c0 <= c1 {
                f(r, c0, c1);
            }
        }
    }

    /// [`Grid::claim`] of `region` grown by `d` ([`Grid::for_cells_near`]).
    pub fn claim_near(&mut self, region: &Region, d: f64, owner: u32) {
        let spans = self.spans_near(region, d);
        self.claim_spans(&spans, owner);
    }

    /// The runs of cells (row, first column, last column) of `region` grown by `d`, as
    /// [`Grid::claim_near`] claims them: worked out apart from the claiming, they can be
    /// found for many regions at once on all cores and claimed after in a fixed order.
    pub fn spans_near(&self, region: &Region, d: f64) -> Vec<(usize, usize, usize)> {
        let mut spans = Vec::new();
        self.for_spans_near(region, d, |r, c0, c1| spans.push((r, c0, c1)));
        spans
    }

    /// Blocks every cell inside `region`.
    pub fn block(&mut self, region: &Region) {
        let mut spans = Vec::new();
        self.for_spans_in(region, |r, c0, c1| spans.push((r, c0, c1)));
        for (r, c0, c1) in spans {
            self.owner.update_run(r, c0, c1, |_| packed(BLOCKED));
        }
    }

    /// Blocks every cell outside `region`: what lies outside the box of its spans at once,
    /// page by page ([`PagedCells::fill_rect`]), then row by row between the spans.
    pub fn block_outside(&mut self, region: &Region) {
        let mut spans: Vec<Vec<(usize, usize)>> = vec![Vec::new(); self.ny];
        self.for_spans_in(region, |r, c0, c1| spans[r].push((c0, c1)));
        let rows: Vec<usize> = (0..self.ny).filter(|&r| !spans[r].is_empty()).collect();
        let (Some(&r0), Some(&r1)) = (rows.first(), rows.last()) else {
            self.owner.fill_rect(0, 0, self.nx - 1, self.ny - 1, packed(BLOCKED));
            return;
        };
        let c0 = rows.iter().flat_map(|&r| spans[r].iter().map(|s| s.0)).min().unwrap_or(0);
        let c1 = rows.iter().flat_map(|&r| spans[r].iter().map(|s| s.1)).max().unwrap_or(self.nx - 1);
        let last = (self.nx - 1, self.ny - 1);
        if r0 > 0 {
            self.owner.fill_rect(0, 0, last.0, r0 - 1, packed(BLOCKED));
        }
        self.owner.fill_rect(0, r1 + 1, last.0, last.1, packed(BLOCKED));
        if c0 > 0 {
            self.owner.fill_rect(0, r0, c0 - 1, r1, packed(BLOCKED));
        }
        self.owner.fill_rect(c1 + 1, r0, last.0, r1, packed(BLOCKED));
        for (r, row) in spans.iter_mut().enumerate().take(r1 + 1).skip(r0) {
            row.sort_unstable();
            let mut next = c0;
            for &(a, b) in row.iter() {
                if a > next {
                    self.owner.update_run(r, next, a - 1, |_| packed(BLOCKED));
                }
                next = next.max(b + 1);
            }
            if next <= c1 {
                self.owner.update_run(r, next, c1, |_| packed(BLOCKED));
            }
        }
    }

    /// Raises the cost of every cell of the runs `spans` (row, first column, last column)
    /// to at least `at_least` (a forbidden cell stays forbidden; runs may overlap).
    pub fn raise_cost_spans(&mut self, spans: &[(usize, usize, usize)], at_least: f32) {
        for &(r, c0, c1) in spans {
            self.cost.update_run(r, c0, c1, |c| c.max(at_least));
        }
    }

    /// Adds `extra` to the cost of every cell inside `region`.
    pub fn add_cost(&mut self, region: &Region, extra: f32) {
        let mut spans = Vec::new();
        self.for_spans_in(region, |r, c0, c1| spans.push((r, c0, c1)));
        for (r, c0, c1) in spans {
            self.cost.update_run(r, c0, c1, |c| c + extra);
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

    /// The spans of a comb with a hole and of a ring agree with a test of every cell
    /// centre by geo's `Contains` (boundary excluded; no centre lies on a boundary here).
    #[test]
    fn spans_agree_with_point_in_polygon() {
        use geo::Contains;
        let g = Grid::new(-1.0, -1.0, 21.0, 9.0, 0.1);
        let teeth = crate::geom::union_all((0..8).map(|i| rect(i as f64 * 2.5 + 0.03, 0.03, i as f64 * 2.5 + 1.23, 6.03)).chain([rect(0.03, 5.03, 19.03, 7.03)]));
        let comb = crate::geom::difference(&teeth, &region_of([rect(5.03, 5.53, 9.03, 6.53)]));
        let shapes = crate::geom::union(&comb, &region_of([ring(pt(10.0, 3.0), 1.0, 0.55, 1e-3)]));
        let mut got = vec![false; g.nx * g.ny];
        g.for_cells_in(&shapes, |i| got[i] = true);
        for (i, &inside) in got.iter().enumerate() {
            let c = g.centre(i);
            assert_eq!(inside, shapes.contains(&geo::Point(c)), "cell at {c:?}");
        }
    }

    /// Blocking outside a region leaves open exactly the cells whose centres lie inside
    /// it (geo's `Contains`), for a comb with a hole away from the grid's edges and for
    /// one that runs off them, and the blocked pages far from the region stay one value.
    #[test]
    fn blocking_outside_leaves_open_the_cells_inside() {
        use geo::Contains;
        let teeth = crate::geom::union_all((0..4).map(|i| rect(i as f64 * 2.5 + 2.03, 1.03, i as f64 * 2.5 + 3.23, 6.03)).chain([rect(2.03, 5.03, 12.03, 7.03)]));
        let comb = crate::geom::difference(&teeth, &region_of([rect(5.03, 5.53, 9.03, 6.53)]));
        let off_edges = crate::geom::union(&comb, &region_of([rect(-5.0, 3.03, 50.03, 3.53)]));
        for shape in [comb, off_edges] {
            let mut g = Grid::new(-1.0, -1.0, 41.0, 29.0, 0.05);
            g.block_outside(&shape);
            for i in 0..g.nx * g.ny {
                let c = g.centre(i);
                assert_eq!(g.owner(i) == FREE, shape.contains(&geo::Point(c)), "cell at {c:?}");
            }
            assert!(g.dense_cells() < g.nx * g.ny / 2, "{} of {} cells stored one by one", g.dense_cells(), g.nx * g.ny);
        }
        let mut none = Grid::new(0.0, 0.0, 5.0, 5.0, 0.1);
        none.block_outside(&Region::new(vec![]));
        assert!((0..none.nx * none.ny).all(|i| none.owner(i) == BLOCKED));
    }

    /// An L-shape with a slanted edge and a square hole, 4 × 5 mm.
    fn l_shape_with_hole() -> geo::Polygon {
        geo::Polygon::new(
            geo::LineString::from(vec![(0.0, 0.0), (4.0, 0.0), (4.0, 1.3), (1.7, 2.9), (1.2, 5.0), (0.0, 5.0), (0.0, 0.0)]),
            vec![geo::LineString::from(vec![(0.5, 0.5), (0.5, 1.0), (1.5, 1.0), (1.5, 0.5), (0.5, 0.5)])],
        )
    }

    /// Cells near a region are those whose centres lie within `d` of it: against geo's
    /// Euclidean distance from every cell centre to the polygons (zero inside), for an
    /// L-shape with a slanted edge and a hole, away from the exact distance `d` by more
    /// than 1e-9.
    #[test]
    fn cells_near_are_those_within_the_distance() {
        use geo::{Distance, Euclidean};
        let g = Grid::new(-2.0, -2.0, 8.0, 8.0, 0.05);
        let l = l_shape_with_hole();
        let region = region_of([l.clone()]);
        let d = 0.37;
        let mut got = vec![false; g.nx * g.ny];
        g.for_cells_near(&region, d, |i| got[i] = true);
        let mut checked = 0;
        for (i, &near) in got.iter().enumerate() {
            let c = geo::Point(g.centre(i));
            let dist = Euclidean.distance(&c, &l);
            if (dist - d).abs() > 1e-9 {
                assert_eq!(near, dist <= d, "cell at {c:?}, distance {dist}");
                checked += 1;
            }
        }
        assert!(checked > 10_000);
    }

    /// Cells inward of a region are those whose centres lie inside it and more than `d`
    /// from its boundary: against geo's `Contains` and Euclidean distance from every cell
    /// centre to the polygon's rings, for the L-shape with a slanted edge and a hole,
    /// away from the exact distance `d` by more than 1e-9; they come in row-major order.
    #[test]
    fn cells_inward_are_those_inside_beyond_the_distance() {
        use geo::{Contains, Distance, Euclidean};
        let g = Grid::new(-2.0, -2.0, 8.0, 8.0, 0.05);
        let l = l_shape_with_hole();
        let region = region_of([l.clone()]);
        let d = 0.37;
        let mut got = vec![false; g.nx * g.ny];
        let mut order = Vec::new();
        g.for_cells_inward(&region, d, |i| {
            got[i] = true;
            order.push(i);
        });
        assert!(order.windows(2).all(|w| w[0] < w[1]));
        let rings: Vec<geo::LineString> = std::iter::once(l.exterior().clone()).chain(l.interiors().iter().cloned()).collect();
        let (mut checked, mut kept) = (0, 0);
        for (i, &inward) in got.iter().enumerate() {
            let c = geo::Point(g.centre(i));
            let dist = rings.iter().map(|r| Euclidean.distance(&c, r)).fold(f64::INFINITY, f64::min);
            if (dist - d).abs() > 1e-9 {
                assert_eq!(inward, l.contains(&c) && dist > d, "cell at {c:?}, distance {dist}");
                checked += 1;
                kept += usize::from(inward);
            }
        }
        assert!(checked > 10_000 && kept > 500, "{checked} checked, {kept} inward");
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

    /// Owners kept in 16 bits read back as claimed: net ids up to the largest that fits,
    /// a second net's claim over the first's makes the cell `BLOCKED`, and the free glass
    /// stays `FREE`. Fails if `BLOCKED` were stored as an ordinary id (the top id would
    /// then read as blocked, or blocked cells as a net).
    #[test]
    fn owners_in_sixteen_bits_read_back_as_claimed() {
        use crate::geom::{rect, region_of};
        let mut g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        let top = u32::from(u16::MAX) - 1;
        g.claim(&region_of([rect(1.0, 1.0, 3.0, 3.0)]), top);
        g.claim(&region_of([rect(6.0, 6.0, 8.0, 8.0)]), 7);
        g.claim(&region_of([rect(7.0, 7.0, 9.0, 9.0)]), 8);
        let at = |x: f64, y: f64| g.owner(g.index_of(crate::geom::pt(x, y)).unwrap());
        assert_eq!(at(2.0, 2.0), top);
        assert_eq!(at(6.5, 6.5), 7);
        assert_eq!(at(7.5, 7.5), BLOCKED);
        assert_eq!(at(8.5, 8.5), 8);
        assert_eq!(at(5.0, 1.0), FREE);
    }
}
