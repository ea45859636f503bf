//! The cells a join search may end in (the tree a net has grown so far), with a lower
//! bound on the distance to them for A*.
//!
//! A join search runs from a new piece of a net to any cell already joined. Without a
//! heuristic it is Dijkstra's search and floods the glass around the piece until it meets
//! the tree; with the distance to the nearest tree cell as heuristic it heads for the tree.
//! The tree is kept as square tiles of `TILE` cells in an R-tree, and the heuristic is the
//! Euclidean distance from the cell's tile to the nearest tile box, less half a tile's
//! diagonal: never more than the true distance to a tree cell (each tile box holds all the
//! centres of its tree cells), so it is admissible for the search's step costs (every step
//! costs at least its length; Hart, Nilsson & Raphael, 1968). One R-tree query per tile,
//! remembered until the tree grows, serves all its cells.
//!
//! Membership is kept by page for the cells of the tree only ([`Scratch`]), reused for
//! every net: starting a new tree is O(1), not a clear of the whole grid, and the memory
//! held is that of the tree's pages.

use super::grid::Grid;
use super::pages::{PageGeom, Scratch};
use rstar::primitives::Rectangle;
use rstar::{PointDistance, RTree};
use std::cell::RefCell;
use super::TileSet;

use super::corridor::{Goal, TileGeom, TILE};

/// A lower bound on the distance from a cell to a goal, worked out once per tile: the
/// distance from the centre of the cell's tile to the nearest goal shape, less half the
/// tile's diagonal, remembered until the goal changes (its version).
pub struct TileBound {
    nx: usize,
    ntx: usize,
    /// Per tile: (the key it was worked out under — a version of the goal, or what the
    /// goal's owner says keeps it true —, distance from its centre); key 0 = not yet.
    memo: RefCell<Vec<(u32, f32)>>,
}

impl TileBound {
    /// Bounds for the cells of `grid`.
    pub fn new(grid: &Grid) -> TileBound {
        let tiles = TileGeom::of(grid);
        TileBound { nx: grid.nx, ntx: tiles.ntx, memo: RefCell::new(vec![(0, 0.0); tiles.ntx * tiles.nty]) }
    }

    /// Forgets every tile's distance (before versions start over).
    pub fn forget(&self) {
        self.memo.borrow_mut().iter_mut().for_each(|m| m.0 = 0);
    }

    /// The bound at cell `c` for goal version `version` (never 0), with `nearest` giving
    /// the distance in cells from a point (cell coordinates) to the nearest goal shape.
    pub fn at(&self, c: usize, version: u32, nearest: impl Fn([f64; 2]) -> f32) -> f32 {
        self.at_while(c, |key| key == version, |p| (nearest(p), version))
    }

    /// The bound at cell `c` as last worked out, whatever it was worked out under (for a
    /// goal that only shrinks this stays a lower bound); none before the first time.
    pub fn kept(&self, c: usize) -> Option<f32> {
        let (tx, ty) = ((c % self.nx) / TILE, (c / self.nx) / TILE);
        let (key, d) = self.memo.borrow()[ty * self.ntx + tx];
        let half_diagonal = (TILE - 1) as f32 * std::f32::consts::FRAC_1_SQRT_2;
        (key != 0).then(|| (d - half_diagonal).max(0.0))
    }

    /// The bound at cell `c`, worked out again only when `valid` says the key remembered
    /// with its tile's distance no longer holds; `nearest` gives the distance and the key
    /// (never 0) under which it holds.
    pub fn at_while(&self, c: usize, valid: impl Fn(u32) -> bool, nearest: impl Fn([f64; 2]) -> (f32, u32)) -> f32 {
        let (tx, ty) = ((c % self.nx) / TILE, (c / self.nx) / TILE);
        let t = ty * self.ntx + tx;
        let mut memo = self.memo.borrow_mut();
        if memo[t].0 == 0 || !valid(memo[t].0) {
            let half = (TILE - 1) as f64 / 2.0;
            let (d, key) = nearest([(tx * TILE) as f64 + half, (ty * TILE) as f64 + half]);
            memo[t] = (key, d);
        }
        let half_diagonal = (TILE - 1) as f32 * std::f32::consts::FRAC_1_SQRT_2;
        (memo[t].1 - half_diagonal).max(0.0)
    }
}

/// The cells joined to one net so far.
pub struct Targets {
    nx: usize,
    /// Distances to the nearest member tile, one R-tree query per tile.
    bound: TileBound,
    version: u32,
    mark: Scratch<()>,
    /// Every cell of the set, in the order added (the goal's cells, [`Goal::cells`]).
    members: Vec<usize>,
    tiles: TileSet<(usize, usize)>,
    /// The tile of the last cell added: cells come in rows and runs, most in the tile of
    /// the one before, which then needs no hashing.
    last_tile: Option<(usize, usize)>,
    index: RTree<Rectangle<[f64; 2]>>,
}

impl Targets {
    /// An empty set for cells of `grid` (or any grid of the same size).
    pub fn new(grid: &Grid) -> Targets {
        Targets {
            nx: grid.nx,
            bound: TileBound::new(grid),
            version: 1,
            mark: Scratch::new(PageGeom::of(grid.nx, grid.ny), ()),
            members: Vec::new(),
            tiles: TileSet::default(),
            last_tile: None,
            index: RTree::new(),
        }
    }

    /// Empties the set (O(number of tiles), not O(grid)).
    pub fn clear(&mut self) {
        self.mark.next_search();
        self.members.clear();
        self.tiles.clear();
        self.last_tile = None;
        self.index = RTree::new();
        self.bump_version();
    }

    fn bump_version(&mut self) {
        self.version += 1;
        if self.version == u32::MAX {
            self.bound.forget();
            self.version = 1;
        }
    }

    /// Adds cell `c`.
    pub fn add(&mut self, c: usize) {
        let (x, y) = (c % self.nx, c / self.nx);
        if self.mark.get(x, y).is_some() {
            return;
        }
        if !self.mark.set(x, y, ()) {
            // Over the page budget (a tree spread over more than 8 M cells' pages):
            // the cell stays out of the set, and searches for the tree end short of it.
            return;
        }
        self.members.push(c);
        let (tx, ty) = (x / TILE, y / TILE);
        if self.last_tile == Some((tx, ty)) {
            return;
        }
        self.last_tile = Some((tx, ty));
        if self.tiles.insert((tx, ty)) {
            let (x0, y0) = ((tx * TILE) as f64, (ty * TILE) as f64);
            let span = (TILE - 1) as f64;
            self.index.insert(Rectangle::from_corners([x0, y0], [x0 + span, y0 + span]));
            self.bump_version();
        }
    }

    /// Whether cell `c` is in the set.
    pub fn contains(&self, c: usize) -> bool {
        self.mark.get(c % self.nx, c / self.nx).is_some()
    }

    /// Whether tile (column, row) of `TILE` cells holds a cell of the set.
    pub fn has_tile(&self, tile: (usize, usize)) -> bool {
        self.tiles.contains(&tile)
    }

    /// Whether the set is empty.
    pub fn is_empty(&self) -> bool {
        self.tiles.is_empty()
    }

    /// A lower bound, in cells, on the distance from cell `c` to the nearest cell of the
    /// set (0 when the set is empty): the distance from the centre of `c`'s tile to the
    /// nearest member tile, less half the tile's diagonal. Admissible; not consistent
    /// across tile borders, which the search allows for by reopening cells.
    pub fn lower_bound(&self, c: usize) -> f32 {
        self.bound.at(c, self.version, |p| self.index.nearest_neighbor(&p).map(|r| r.distance_2(&p).sqrt() as f32).unwrap_or(0.0))
    }
}

/// A join search ends on any cell of the tree.
impl Goal for Targets {
    fn is_goal(&self, c: usize) -> bool {
        self.contains(c)
    }
    fn is_goal_tile(&self, tiles: &TileGeom, t: usize) -> bool {
        self.has_tile(tiles.column_row(t))
    }
    fn bound(&self, c: usize) -> f32 {
        self.lower_bound(c)
    }
    fn cells(&self) -> Option<Vec<usize>> {
        Some(self.members.clone())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The bound never exceeds the true (Euclidean) distance to the nearest member, and is
    /// exact for a cell in line with a lone member's tile edge.
    #[test]
    fn bound_is_below_true_distance() {
        let g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.25);
        let mut t = Targets::new(&g);
        let members = [g.index_of(crate::geom::pt(3.0, 4.0)).unwrap(), g.index_of(crate::geom::pt(15.0, 9.0)).unwrap()];
        for &m in &members {
            t.add(m);
        }
        for c in (0..g.nx * g.ny).step_by(37) {
            let (cx, cy) = ((c % g.nx) as f64, (c / g.nx) as f64);
            let truth = members
                .iter()
                .map(|&m| ((m % g.nx) as f64 - cx).hypot((m / g.nx) as f64 - cy))
                .fold(f64::MAX, f64::min);
            assert!(t.lower_bound(c) as f64 <= truth + 1e-4, "cell {c}: bound {} > {truth}", t.lower_bound(c));
        }
        assert!(t.contains(members[0]) && !t.contains(members[0] + 1));
        t.clear();
        assert!(t.is_empty() && !t.contains(members[0]));
        assert_eq!(t.lower_bound(0), 0.0);
    }
}
