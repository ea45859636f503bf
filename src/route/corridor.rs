//! Corridors: a coarse search over tiles bounds where the fine search may run.
//!
//! Takes the routing grid, a net, its source cells and its goal; gives a set of tiles — the
//! cheapest coarse path grown by a margin — inside which the fine A* search looks for the
//! lead. This is global routing followed by detailed routing inside each net's corridor, as
//! taught for VLSI routing (Kahng, Lienig, Markov & Hu, *VLSI Physical Design*, ch. 5–6),
//! reduced to one net at a time: the coarse graph has one node per tile of `TILE` × `TILE`
//! cells, so its search touches about 1/64 of the cells the fine search would, and the fine
//! search then explores only the corridor instead of flooding around every obstacle.
//!
//! A tile is passable when it has at least one cell the net may use; its cost per cell is
//! the mean cost of those cells, so costly zones (bodies, hidden crossings) steer the coarse
//! path as they steer the fine one. The coarse graph is optimistic — a tile passable on its
//! own may not let a lead through — so a fine search that fails inside its corridor is run
//! again in the corridor of a stricter coarse graph (a step between two tiles only where
//! usable cells face each other across their edge), then without one; the corridor only
//! saves time, it never loses a route.
//!
//! Every buffer is allocated once per router and reset by stamp, never per search.

use super::open_list::OpenList;
use super::grid::{usable_by, Grid};
use super::search::{neighbours, Blocked, Open, Search};
use super::source_tiles::SourceTiles;

/// Where a coarse search starts.
pub enum Sources<'a> {
    /// Cells, each standing for its tile.
    Cells(&'a [usize]),
    /// The tiles of a growing tree, taken in as the search reaches them.
    Tiles(&'a mut SourceTiles),
}

/// Side of a tile, in grid cells.
pub const TILE: usize = 8;

/// The tile (column, row) of cell `c` of a grid `nx` cells wide.
pub fn tile_of(nx: usize, c: usize) -> (usize, usize) {
    ((c % nx) / TILE, (c / nx) / TILE)
}

/// How a grid divides into tiles.
#[derive(Debug, Clone, Copy)]
pub struct TileGeom {
    /// Tiles across.
    pub ntx: usize,
    /// Tiles down.
    pub nty: usize,
    nx: usize,
    ny: usize,
}

impl TileGeom {
    /// The tiles of `grid`.
    pub fn of(grid: &Grid) -> TileGeom {
        TileGeom { ntx: grid.nx.div_ceil(TILE), nty: grid.ny.div_ceil(TILE), nx: grid.nx, ny: grid.ny }
    }

    /// The tile index of cell `c`.
    pub fn tile_index(&self, c: usize) -> usize {
        let (tx, ty) = tile_of(self.nx, c);
        ty * self.ntx + tx
    }

    /// The (column, row) of tile `t`.
    pub fn column_row(&self, t: usize) -> (usize, usize) {
        (t % self.ntx, t / self.ntx)
    }

    /// The centre cell of tile `t` (clamped to the grid).
    pub fn centre_cell(&self, t: usize) -> usize {
        let (tx, ty) = self.column_row(t);
        let x = (tx * TILE + TILE / 2).min(self.nx - 1);
        let y = (ty * TILE + TILE / 2).min(self.ny - 1);
        y * self.nx + x
    }

    /// The cells at the corners of tile `t` (clamped to the grid).
    pub fn corner_cells(&self, t: usize) -> [usize; 4] {
        let (tx, ty) = self.column_row(t);
        let (x0, y0) = (tx * TILE, ty * TILE);
        let (x1, y1) = ((x0 + TILE - 1).min(self.nx - 1), (y0 + TILE - 1).min(self.ny - 1));
        [y0 * self.nx + x0, y0 * self.nx + x1, y1 * self.nx + x0, y1 * self.nx + x1]
    }
}

/// Coarse search state and the corridor it found last.
pub struct Corridors {
    tiles: TileGeom,
    ntx: usize,
    nty: usize,
    generation: u32,
    /// The coarse search's open list, kept between searches.
    open: OpenList,
    stamp: Vec<u32>,
    g: Vec<f32>,
    h: Vec<f32>,
    /// Per tile, the generation in which its `h` was worked out exactly (a source may
    /// start from a kept bound, [`Goal::kept_bound`]).
    exact: Vec<u32>,
    factor: Vec<f32>,
    parent: Vec<u32>,
    mask: Vec<u32>,
    /// The tiles of the last corridor, each once.
    marked: Vec<u32>,
    /// Per tile, (generation, hops): the fewest steps between 8-neighbouring tiles of the
    /// last corridor from it to a goal tile ([`Corridors::count_hops`]).
    hops: Vec<(u32, u32)>,
    /// Breadth-first queue of [`Corridors::count_hops`], kept between searches.
    queue: std::collections::VecDeque<u32>,
    /// Tile factors kept across searches for one owner while the grid does not change
    /// for it (a common joining its own islands: its own claims leave every tile's usable
    /// cells as they were): (owner, stamp of the keeping), and per tile the stamp it was
    /// worked out under and the factor.
    kept: Option<(u32, u32)>,
    kept_factor: Vec<(u32, f32)>,
    /// Per tile, while factors are kept: (stamp of the keeping, whether its edge with the
    /// tile east of it and with the tile north of it is open ([`edge_open`]), each as
    /// 0 = not worked out, 1 = shut, 2 = open).
    kept_edges: Vec<(u32, [u8; 2])>,
    keepings: u32,
    /// Whether `plan` steps between tiles only where usable cells face each other across
    /// their shared edge ([`edge_open`]).
    strict: bool,
    /// While one owner's factors are kept: its lenient corridor turned out too narrow
    /// once, so its next searches plan the strict one first (see [`find_guided`]).
    strict_first: bool,
}


impl Corridors {
    /// State for the tiles of `grid`.
    pub fn new(grid: &Grid) -> Corridors {
        let tiles = TileGeom::of(grid);
        let (ntx, nty) = (tiles.ntx, tiles.nty);
        let n = ntx * nty;
        Corridors {
            tiles,
            ntx,
            nty,
            generation: 0,
            open: OpenList::new(),
            stamp: vec![0; n],
            g: vec![0.0; n],
            h: vec![0.0; n],
            exact: vec![0; n],
            factor: vec![0.0; n],
            parent: vec![0; n],
            mask: vec![0; n],
            marked: Vec::new(),
            hops: vec![(0, 0); n],
            queue: std::collections::VecDeque::new(),
            kept: None,
            kept_factor: Vec::new(),
            kept_edges: Vec::new(),
            keepings: 0,
            strict: false,
            strict_first: false,
        }
    }

    /// How the grid divides into tiles.
    pub fn tiles(&self) -> TileGeom {
        self.tiles
    }

    fn tile_index(&self, _grid: &Grid, c: usize) -> usize {
        self.tiles.tile_index(c)
    }

    /// From now until [`Corridors::forget`], the caller promises that the cells `owner`
    /// may use and their costs stay as they are, so each tile's factor is worked out once.
    pub fn keep_factors_for(&mut self, owner: u32) {
        self.keepings = self.keepings.wrapping_add(1).max(1);
        if self.kept_factor.is_empty() {
            self.kept_factor = vec![(0, 0.0); self.ntx * self.nty];
            self.kept_edges = vec![(0, [0; 2]); self.ntx * self.nty];
        }
        self.kept = Some((owner, self.keepings));
        self.strict_first = false;
    }

    /// Ends [`Corridors::keep_factors_for`].
    pub fn forget(&mut self) {
        self.kept = None;
        self.strict_first = false;
    }

    fn tile_factor(&mut self, grid: &Grid, owner: u32, t: usize) -> f32 {
        match self.kept {
            Some((o, k)) if o == owner => {
                if self.kept_factor[t].0 != k {
                    self.kept_factor[t] = (k, self.work_out_factor(grid, owner, t));
                }
                self.kept_factor[t].1
            }
            _ => self.work_out_factor(grid, owner, t),
        }
    }

    /// Mean step factor (1 + extra cost) over the cells of tile `t` that `owner` may use,
    /// or infinity when it may use none.
    fn work_out_factor(&self, grid: &Grid, owner: u32, t: usize) -> f32 {
        let (x0, y0, x1, y1) = self.cell_span(grid, t);
        // A tile lies inside one page; where the page holds one owner and one cost, every
        // cell adds the same step factor: summed as `factor_cell_by_cell` sums it, so the
        // factor is the same to the bit, without reading each cell twice (the coarse
        // searches work out the factor of every tile they reach once per common).
        const _: () = assert!(super::pages::SIDE % TILE == 0, "a tile must lie inside one page");
        match grid.uniform_page_xy(x0, y0) {
            Some(page) => mean_factor((x1 - x0) * (y1 - y0), |_| usable_by(page.0, page.1, owner).then_some(page.1)),
            None => self.factor_cell_by_cell(grid, owner, t),
        }
    }

    /// [`Corridors::work_out_factor`], reading every cell.
    fn factor_cell_by_cell(&self, grid: &Grid, owner: u32, t: usize) -> f32 {
        let (x0, y0, x1, y1) = self.cell_span(grid, t);
        let w = x1 - x0;
        mean_factor(w * (y1 - y0), |k| {
            let (x, y) = (x0 + k % w, y0 + k / w);
            grid.usable_xy(x, y, owner).then(|| grid.cost_xy(x, y))
        })
    }

    /// The cells of tile `t`: columns `x0..x1`, rows `y0..y1`.
    fn cell_span(&self, grid: &Grid, t: usize) -> (usize, usize, usize, usize) {
        let (x0, y0) = ((t % self.ntx) * TILE, (t / self.ntx) * TILE);
        (x0, y0, (x0 + TILE).min(grid.nx), (y0 + TILE).min(grid.ny))
    }

    /// Whether a lead of `owner` can step from tile `t` to its neighbour `n` (direction
    /// `d`, odd for a diagonal): two cells it may use face each other across their shared
    /// edge; a diagonal step needs such a way through one of the two tiles beside it.
    fn step_open(&mut self, grid: &Grid, owner: u32, t: usize, n: usize, d: usize) -> bool {
        if d % 2 == 0 {
            return self.edge(grid, owner, t, n);
        }
        let (tx, ty) = (t % self.ntx, t / self.ntx);
        let (nx, ny) = (n % self.ntx, n / self.ntx);
        [ty * self.ntx + nx, ny * self.ntx + tx].into_iter().any(|m| {
            self.tile_factor(grid, owner, m).is_finite() && self.edge(grid, owner, t, m) && self.edge(grid, owner, m, n)
        })
    }

    /// [`edge_open`] between orthogonal neighbours `t` and `n`, kept like the factors while
    /// one owner's are ([`Corridors::keep_factors_for`]): a common's strict corridors
    /// scanned the same tile edges search after search.
    fn edge(&mut self, grid: &Grid, owner: u32, t: usize, n: usize) -> bool {
        let Some((_, k)) = self.kept.filter(|(o, _)| *o == owner) else { return edge_open(grid, owner, self.ntx, t, n) };
        // The edge is kept with the lower-numbered tile of the two: its east edge when
        // both lie in one row, else its north edge.
        let (low, side) = (t.min(n), usize::from(t / self.ntx != n / self.ntx));
        let entry = &mut self.kept_edges[low];
        if entry.0 != k {
            *entry = (k, [0; 2]);
        }
        if entry.1[side] == 0 {
            let open = edge_open(grid, owner, self.ntx, t, n);
            self.kept_edges[low].1[side] = if open { 2 } else { 1 };
        }
        self.kept_edges[low].1[side] == 2
    }

    /// Searches the tiles from those of `sources` to one where `goal` holds (a tile index),
    /// with `heuristic` a lower bound in cells from a tile to the goal and `kept` a lower
    /// one at no cost where one is at hand (for the sources, [`Goal::kept_bound`]); on
    /// success marks the path's tiles grown by `margin` tiles as the corridor and returns
    /// true. The other sources' tiles stay out: a search for the next island of a
    /// common starts from its whole tree, and with every tree tile in the corridor a fine
    /// search that failed flooded the tree (1.6 M of the two-row benchmark's 6.2 M pops).
    pub fn plan(
        &mut self,
        grid: &Grid,
        owner: u32,
        sources: &[usize],
        goal: impl Fn(usize) -> bool,
        heuristic: impl Fn(usize) -> f32,
        kept: impl Fn(usize) -> Option<f32>,
        margin: usize,
    ) -> bool {
        self.plan_from(grid, owner, Sources::Cells(sources), goal, heuristic, kept, margin)
    }

    /// [`Corridors::plan`] from `sources` given as cells, or as the tiles of a growing
    /// tree waiting in their own heap ([`SourceTiles`]), taken in only as the search
    /// reaches their keys: the corridor is the same either way.
    #[allow(clippy::too_many_arguments)]
    pub fn plan_from(
        &mut self,
        grid: &Grid,
        owner: u32,
        mut sources: Sources<'_>,
        goal: impl Fn(usize) -> bool,
        heuristic: impl Fn(usize) -> f32,
        kept: impl Fn(usize) -> Option<f32>,
        margin: usize,
    ) -> bool {
        self.generation += 1;
        let now = self.generation;
        let mut open = std::mem::take(&mut self.open);
        open.clear();
        // A source starts from a kept bound where there is one, and gets its exact bound
        // when it is first taken from the heap, going back in if that is higher: tiles are
        // then taken in the same order as with exact bounds from the start, but a common's
        // tree of thousands of tiles no longer has every bound worked out for every
        // search (the bound of a tile changes whenever the island nearest it is joined).
        if let Sources::Cells(cells) = sources {
            for &s in cells {
                let t = self.tile_index(grid, s);
                if self.stamp[t] != now {
                    let h = self.start_source(grid, owner, t, &heuristic, &kept);
                    open.push_unordered(Open::new(h, t as u32));
                }
            }
            open.order();
        }
        let step = TILE as f32;
        let found = loop {
            if let Sources::Tiles(tiles) = &mut sources {
                self.take_in(grid, owner, tiles, &mut open, &heuristic, &kept);
            }
            let Some(entry) = open.pop() else { break None };
            let (f, tile) = (entry.f(), entry.cell());
            let t = tile as usize;
            if f - self.h[t] > self.g[t] + 1e-3 {
                continue;
            }
            if self.exact[t] != now {
                self.exact[t] = now;
                let h = heuristic(t);
                if h > self.h[t] {
                    self.h[t] = h;
                    open.push(Open::new(self.g[t] + h, tile));
                    continue;
                }
            }
            if goal(t) {
                break Some(t);
            }
            for (d, _, _, n) in neighbours(t, self.ntx, self.nty) {
                if self.strict && !self.step_open(grid, owner, t, n, d) {
                    continue;
                }
                let fresh = self.stamp[n] != now;
                // A source tile not taken in yet starts now, as it would have at the
                // start: a source is never reached from another tile.
                if fresh && matches!(&sources, Sources::Tiles(tiles) if tiles.contains(n)) {
                    let h = self.start_source(grid, owner, n, &heuristic, &kept);
                    open.push(Open::new(h, n as u32));
                    continue;
                }
                if fresh {
                    self.factor[n] = self.tile_factor(grid, owner, n);
                }
                let fac = self.factor[n];
                if fac.is_infinite() {
                    self.stamp[n] = now;
                    self.g[n] = f32::INFINITY;
                    continue;
                }
                let len = if d % 2 == 1 { step * std::f32::consts::SQRT_2 } else { step };
                let ng = self.g[t] + len * (self.factor[t] + fac) / 2.0;
                if fresh || ng < self.g[n] {
                    if fresh {
                        self.stamp[n] = now;
                        self.h[n] = heuristic(n);
                        self.exact[n] = now;
                    }
                    self.g[n] = ng;
                    self.parent[n] = t as u32;
                    open.push(Open::new(ng + self.h[n], n as u32));
                }
            }
        };
        self.open = open;
        if let Sources::Tiles(tiles) = sources {
            // What this search worked out stays as the tiles' keys for the next one.
            tiles.put_back(|t| kept(t).unwrap_or(0.0));
        }
        match found {
            Some(t) => {
                self.mark(t, margin);
                true
            }
            None => false,
        }
    }

    /// Starts source tile `t` of the current search: no cost so far, its own parent, the
    /// kept bound where there is one (else the exact one); returns its bound.
    fn start_source(&mut self, grid: &Grid, owner: u32, t: usize, heuristic: &impl Fn(usize) -> f32, kept: &impl Fn(usize) -> Option<f32>) -> f32 {
        let now = self.generation;
        self.stamp[t] = now;
        self.g[t] = 0.0;
        match kept(t) {
            Some(h) => self.h[t] = h,
            None => {
                self.h[t] = heuristic(t);
                self.exact[t] = now;
            }
        }
        self.factor[t] = self.tile_factor(grid, owner, t).min(1.0e6);
        self.parent[t] = t as u32;
        self.h[t]
    }

    /// Takes in the waiting source tiles whose keys the open list has reached (all of
    /// them up to its lowest entry, or the lowest when it is empty): each starts at the
    /// key it would have started at had it been laid in at the start, or waits again
    /// under that key when it is higher than the one it waited under.
    fn take_in(
        &mut self,
        grid: &Grid,
        owner: u32,
        tiles: &mut SourceTiles,
        open: &mut OpenList,
        heuristic: &impl Fn(usize) -> f32,
        kept: &impl Fn(usize) -> Option<f32>,
    ) {
        let now = self.generation;
        while let Some(entry) = tiles.take_up_to(open.peek().map(Open::key)) {
            let t = entry.cell() as usize;
            if self.stamp[t] == now {
                continue;
            }
            if let Some(h) = kept(t) {
                if Open::new(h, t as u32).key() > entry.key() {
                    tiles.defer(t, h);
                    continue;
                }
            }
            let h = self.start_source(grid, owner, t, heuristic, kept);
            open.push(Open::new(h, t as u32));
        }
    }

    fn mark(&mut self, mut t: usize, margin: usize) {
        let now = self.generation;
        let m = margin as i64;
        self.marked.clear();
        let grow = |mask: &mut Vec<u32>, marked: &mut Vec<u32>, t: usize| {
            let (tx, ty) = ((t % self.ntx) as i64, (t / self.ntx) as i64);
            for y in (ty - m).max(0)..=(ty + m).min(self.nty as i64 - 1) {
                for x in (tx - m).max(0)..=(tx + m).min(self.ntx as i64 - 1) {
                    let i = (y * self.ntx as i64 + x) as usize;
                    if mask[i] != now {
                        mask[i] = now;
                        marked.push(i as u32);
                    }
                }
            }
        };
        loop {
            grow(&mut self.mask, &mut self.marked, t);
            let p = self.parent[t] as usize;
            if p == t {
                break;
            }
            t = p;
        }
    }

    /// Counts, breadth first over the tiles of the last corridor, the fewest steps between
    /// 8-neighbouring tiles from each to a tile where `goal` holds.
    pub fn count_hops(&mut self, goal: impl Fn(usize) -> bool) {
        let now = self.generation;
        self.queue.clear();
        for &t in &self.marked {
            if goal(t as usize) {
                self.hops[t as usize] = (now, 0);
                self.queue.push_back(t);
            }
        }
        while let Some(t) = self.queue.pop_front() {
            let next = self.hops[t as usize].1 + 1;
            for (_, _, _, n) in neighbours(t as usize, self.ntx, self.nty) {
                if self.mask[n] == now && self.hops[n].0 != now {
                    self.hops[n] = (now, next);
                    self.queue.push_back(n as u32);
                }
            }
        }
    }

    /// A lower bound, in cells, on the length of any path inside the last corridor from
    /// cell `c` to a goal cell, from [`Corridors::count_hops`]: along a path of `S` steps
    /// the cells every `TILE` steps lie in 8-neighbouring corridor tiles, so `S ≥ (hops −
    /// 1)·TILE`, and every step costs at least its length of one cell. Infinite where no
    /// corridor tile leads to the goal.
    pub fn hop_bound(&self, c: usize) -> f32 {
        let (stamp, hops) = self.hops[self.tiles.tile_index(c)];
        if stamp != self.generation {
            return f32::INFINITY;
        }
        (hops.saturating_sub(1) as usize * TILE) as f32
    }

    /// Whether cell `c` lies in the corridor of the last successful `plan`.
    pub fn allows(&self, grid: &Grid, c: usize) -> bool {
        self.mask[self.tile_index(grid, c)] == self.generation
    }

    /// [`Corridors::allows`] for the cell at column `x`, row `y`.
    #[inline]
    pub fn allows_xy(&self, x: usize, y: usize) -> bool {
        self.mask[(y / TILE) * self.ntx + x / TILE] == self.generation
    }
}

/// The mean of `1 + extra` over the first `cells` of a tile, where `extra_of` gives the
/// extra cost of each cell `owner` may use (`None` for the others); infinity when fewer
/// than a tile's width of cells are usable.
fn mean_factor(cells: usize, extra_of: impl Fn(usize) -> Option<f32>) -> f32 {
    let (mut sum, mut n) = (0.0f32, 0u32);
    for extra in (0..cells).filter_map(extra_of) {
        sum += 1.0 + extra;
        n += 1;
    }
    if (n as usize) < TILE { f32::INFINITY } else { sum / n as f32 }
}

/// Whether `owner` may use the cells of the pages holding cells `a` and `b` (column,
/// row), when each page stores one owner and one cost (every cell of a tile edge then
/// answers alike); `None` when either page stores its cells one by one.
fn uniform_pages_open(grid: &Grid, owner: u32, a: (usize, usize), b: (usize, usize)) -> Option<bool> {
    let open = |(x, y): (usize, usize)| grid.uniform_page_xy(x, y).map(|(o, extra)| usable_by(o, extra, owner));
    Some(open(a)? && open(b)?)
}

/// Whether some cell of tile `t` next to its shared edge with the orthogonal neighbour
/// `n` and the cell facing it in `n` are both usable by `owner`.
fn edge_open(grid: &Grid, owner: u32, ntx: usize, t: usize, n: usize) -> bool {
    let Some(((xa, ya), (xb, yb))) = edge_cells(grid, ntx, t, n) else { return false };
    // Each of the two columns (rows) of facing cells lies inside one page.
    uniform_pages_open(grid, owner, (xa, ya), (xb, yb)).unwrap_or_else(|| edge_open_cell_by_cell(grid, owner, ntx, t, n))
}

/// The first pair of facing cells (column, row) across the edge between tile `t` and its
/// orthogonal neighbour `n`, the one in `t` first; the others follow along the edge.
/// `None` when the edge is the grid's.
fn edge_cells(grid: &Grid, ntx: usize, t: usize, n: usize) -> Option<((usize, usize), (usize, usize))> {
    let (tx, ty) = (t % ntx, t / ntx);
    let (nx, ny) = (n % ntx, n / ntx);
    if ty == ny {
        let (xa, xb) = if nx > tx { ((tx + 1) * TILE - 1, nx * TILE) } else { (tx * TILE, (nx + 1) * TILE - 1) };
        (xa < grid.nx && xb < grid.nx).then_some(((xa, ty * TILE), (xb, ty * TILE)))
    } else {
        let (ya, yb) = if ny > ty { ((ty + 1) * TILE - 1, ny * TILE) } else { (ty * TILE, (ny + 1) * TILE - 1) };
        (ya < grid.ny && yb < grid.ny).then_some(((tx * TILE, ya), (tx * TILE, yb)))
    }
}

/// [`edge_open`], reading every pair of facing cells.
fn edge_open_cell_by_cell(grid: &Grid, owner: u32, ntx: usize, t: usize, n: usize) -> bool {
    let Some(((xa, ya), (xb, yb))) = edge_cells(grid, ntx, t, n) else { return false };
    if ya == yb {
        (ya..(ya + TILE).min(grid.ny)).any(|y| grid.usable_xy(xa, y, owner) && grid.usable_xy(xb, y, owner))
    } else {
        (xa..(xa + TILE).min(grid.nx)).any(|x| grid.usable_xy(x, ya, owner) && grid.usable_xy(x, yb, owner))
    }
}

/// Tiles of margin on each side of the coarse path.
const MARGIN: usize = 2;

/// A goal for a guided search: which cells end it, which tiles may hold such cells, and
/// lower bounds (in cells) on the cost to reach it from a cell and from a tile.
pub trait Goal {
    /// Whether cell `c` ends the search.
    fn is_goal(&self, c: usize) -> bool;
    /// Whether tile `t` may hold a goal cell.
    fn is_goal_tile(&self, tiles: &TileGeom, t: usize) -> bool;
    /// A lower bound on the cost from cell `c` to the goal.
    fn bound(&self, c: usize) -> f32;
    /// A lower bound at cell `c` that costs nothing to give, if one is at hand (one worked
    /// out earlier that still bounds the cost, though it may be lower than
    /// [`Goal::bound`] now). The coarse search starts its sources from it and works out
    /// the exact bound only for the sources it reaches.
    fn kept_bound(&self, _c: usize) -> Option<f32> {
        None
    }
    /// Every cell where [`Goal::is_goal`] holds, if the goal can list them (a flood may
    /// then run back from them too, [`Search::reaches`]).
    fn cells(&self) -> Option<Vec<usize>> {
        None
    }
}

/// Finds the lead from `sources` to `goal`: a coarse path over the tiles first, then the
/// fine search inside its corridor; when the first corridor fails, the floods of
/// [`Search::fence`] before the second; when there is no coarse path or both corridors
/// turn out too narrow, the fine search over the whole grid, so that a failure always
/// reports what blocks the net on the whole grid. The floods are there for the failures:
/// the stricter coarse search and the costed search over the grid, finding no way, visit
/// every tile and cell they can reach, and the escape of a layout whose SEG lines were
/// shut in (a seven-segment template at 1/3 duty on a 180 mm glass, some 25 nets stuck in
/// each of eight orders) ran some 300 such searches of 0.2–0.5 s; the floods run from both
/// ends at once and stop when the smaller side runs out.
pub fn find_guided(search: &mut Search, corridors: &mut Corridors, ask: &Ask<'_, impl Goal>) -> Result<Vec<usize>, Blocked> {
    if let Some(path) = find_in_corridors(search, corridors, ask, None, true)? {
        return Ok(path);
    }
    let Ask { grid, owner, sources, goal } = *ask;
    search.find(grid, owner, sources, |i| goal.is_goal(i), |i| goal.bound(i))
}

/// The floods of [`Search::fence`] for `ask`: what blocks it when they find no way.
fn fence(search: &mut Search, ask: &Ask<'_, impl Goal>) -> Result<(), Blocked> {
    let Ask { grid, owner, sources, goal } = *ask;
    match search.fence(grid, owner, sources, goal.cells().as_deref(), |i| goal.is_goal(i), |i| goal.bound(i)) {
        Some(blocked) => Err(blocked),
        None => Ok(()),
    }
}

/// [`find_guided`] for a search that often has no way and whose failure is read only for
/// what blocks it: first the floods of [`Search::fence`] from the sources and back from the
/// goal's cells, which give the failure's report without any costed search; only when they
/// find a way, the corridors and, failing them, the costed search over the whole grid, so
/// the lead found is the one [`find_guided`] finds.
pub fn find_guided_or_fence(search: &mut Search, corridors: &mut Corridors, ask: &Ask<'_, impl Goal>) -> Result<Vec<usize>, Blocked> {
    fence(search, ask)?;
    if let Some(path) = find_in_corridors(search, corridors, ask, None, false)? {
        return Ok(path);
    }
    let Ask { grid, owner, sources, goal } = *ask;
    search.find(grid, owner, sources, |i| goal.is_goal(i), |i| goal.bound(i))
}

/// What one search asks for: a lead of `owner` on `grid` from any of `sources` to `goal`.
pub struct Ask<'a, G: Goal> {
    /// The routing grid.
    pub grid: &'a Grid,
    /// The net (id + 1) whose cells the lead may cross.
    pub owner: u32,
    /// Cells the lead may start from.
    pub sources: &'a [usize],
    /// Where it may end.
    pub goal: &'a G,
}

impl<G: Goal> Clone for Ask<'_, G> {
    fn clone(&self) -> Self {
        *self
    }
}
impl<G: Goal> Copy for Ask<'_, G> {}

/// The fine search in the corridor of the coarse graph, then in the stricter one's; none
/// when neither plans a corridor or holds a way. The coarse searches start from `waiting`
/// where given (the tiles of the sources, [`Corridors::plan_from`]). With `fence_between`,
/// the floods of [`Search::fence`] run when the first corridor fails, and what blocks the
/// search is returned when they find no way.
fn find_in_corridors(search: &mut Search, corridors: &mut Corridors, ask: &Ask<'_, impl Goal>, mut waiting: Option<&mut SourceTiles>, fence_between: bool) -> Result<Option<Vec<usize>>, Blocked> {
    let Ask { grid, owner, sources, goal } = *ask;
    let half_diagonal = TILE as f32 * std::f32::consts::FRAC_1_SQRT_2;
    let tiles = corridors.tiles();
    // First the coarse graph that counts each tile's usable cells; when the corridor it
    // gives turns out too narrow, the stricter one that steps between tiles only where
    // usable cells face each other across their edge (the first can step over a claimed
    // lead lying on a tile edge, and the search then flooded the whole glass: three such
    // searches made 85 % of the two-row demo's 5.5 M heap pops). Searches whose first
    // corridor holds are left as they were: routing order is fragile to path choice.
    // While a common grows its tree (factors kept), once its lenient corridor has failed
    // the strict one goes first: a failing fine search floods the whole corridor, which
    // holds every tile of the tree, so each such failure grew with the tree (forty digits
    // in two rows: 20 searches of 80–120 ms each for one common, 4 s of 6.5).
    let order = if corridors.strict_first { [true, false] } else { [false, true] };
    for (k, strict) in order.into_iter().enumerate() {
        if k == 1 && fence_between {
            fence(search, ask)?;
        }
        corridors.strict = strict;
        let from = match waiting.as_deref_mut() {
            Some(w) => Sources::Tiles(w),
            None => Sources::Cells(sources),
        };
        let planned = corridors.plan_from(
            grid,
            owner,
            from,
            |t| goal.is_goal_tile(&tiles, t),
            |t| (goal.bound(tiles.centre_cell(t)) - half_diagonal).max(0.0),
            |t| goal.kept_bound(tiles.centre_cell(t)).map(|b| (b - half_diagonal).max(0.0)),
            MARGIN,
        );
        corridors.strict = false;
        if planned {
            // The bound by the way through the corridor, not by air: a lead that must go
            // round (a common joining its next island under the seal, past the front
            // leads between the digits) was bounded by the straight distance and each
            // such search popped about 120 000 cells.
            corridors.count_hops(|t| goal.is_goal_tile(&tiles, t));
            let c = &*corridors;
            // The fine search starts from the sources in the corridor only (the tile the
            // coarse path starts from is one of them).
            let inside: Vec<usize> = sources.iter().copied().filter(|&s| c.allows(grid, s)).collect();
            if let Ok(path) = search.find_within(grid, owner, &inside, |i| goal.is_goal(i), |i| goal.bound(i).max(c.hop_bound(i)), |x, y| c.allows_xy(x, y)) {
                return Ok(Some(path));
            }
            if !strict && corridors.kept.is_some() {
                corridors.strict_first = true;
            }
        }
    }
    Ok(None)
}

/// [`find_guided`] for a caller that needs no report of what blocks a failed search: when
/// neither corridor holds a way, a plain breadth-first flood of the cells the net may
/// enter ([`Search::reaches`]) decides first whether the whole grid holds one, and the
/// costed search over the whole grid runs only when it does. Where no way exists the
/// result is the same failure, found about ten times faster: a common growing its tree
/// toward islands shut off from it flooded the glass with A* (the germination demo:
/// one such search of 10 M heap pops took 1.8 s of its 3.4 s of routing), and the flood
/// runs from the goal's side as well, which is the small one when the goal is shut in.
/// `tiles` holds the tiles of `ask.sources`, each once: a growing tree's, kept between
/// its searches ([`SourceTiles`]).
pub fn find_guided_or_give_up(search: &mut Search, corridors: &mut Corridors, ask: &Ask<'_, impl Goal>, tiles: &mut SourceTiles) -> Result<Vec<usize>, ()> {
    if let Ok(Some(path)) = find_in_corridors(search, corridors, ask, Some(tiles), false) {
        return Ok(path);
    }
    let Ask { grid, owner, sources, goal } = *ask;
    if search.reaches(grid, owner, sources, goal.cells().as_deref(), |i| goal.is_goal(i)) == Some(false) {
        return Err(());
    }
    search.find(grid, owner, sources, |i| goal.is_goal(i), |i| goal.bound(i)).map_err(|_| ())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, rect, region_of};

    /// The shortcut for tiles in pages that hold one owner and one cost gives every
    /// tile's factor to the bit, and every edge's answer, that reading each cell gives:
    /// on a grid with untouched pages, pages filled whole, pages half claimed, costly and
    /// forbidden areas, and part tiles and part pages along its far edges (the shortcut
    /// must never see a cell outside its page).
    #[test]
    fn pages_of_one_value_answer_as_their_cells_do() {
        // 30.05 mm at 0.1 mm: 302 cells, 4 whole pages of 64 and a part one, 37 whole
        // tiles of 8 and a part one.
        let mut g = Grid::new(0.0, 0.0, 30.05, 30.05, 0.1);
        g.claim(&region_of([rect(0.0, 0.0, 12.75, 30.05)]), 2); // pages 0 and 1 whole, 2 in part
        g.add_cost(&region_of([rect(14.0, 14.0, 25.0, 20.0)]), 0.3);
        g.add_cost(&region_of([rect(26.0, 2.0, 30.05, 4.0)]), f32::INFINITY);
        g.block(&region_of([rect(3.0, 27.0, 9.0, 28.0)]));
        g.compact();
        let c = Corridors::new(&g);
        let (ntx, nty) = (c.ntx, c.nty);
        let mut uniform = 0;
        for owner in [1, 2] {
            for t in 0..ntx * nty {
                let (x0, y0, _, _) = c.cell_span(&g, t);
                uniform += usize::from(g.uniform_page_xy(x0, y0).is_some());
                assert_eq!(c.work_out_factor(&g, owner, t).to_bits(), c.factor_cell_by_cell(&g, owner, t).to_bits(), "tile {t}, owner {owner}");
                for (d, _, _, n) in neighbours(t, ntx, nty).filter(|(d, ..)| d % 2 == 0) {
                    assert_eq!(edge_open(&g, owner, ntx, t, n), edge_open_cell_by_cell(&g, owner, ntx, t, n), "tiles {t} and {n} ({d}), owner {owner}");
                }
            }
        }
        assert!(uniform > ntx * nty, "the shortcut is taken: {uniform} tiles in pages of one value");
        assert!(uniform < 2 * ntx * nty, "and the cell-by-cell reading too");
    }

    /// A wall 14 cells thick lying across the edge between two columns of tiles, leaving
    /// each of them one free column: counting usable cells, both tiles are passable and
    /// the coarse path steps across the wall; the stricter graph finds no two usable cells
    /// facing each other across that edge and no way through.
    #[test]
    fn the_stricter_graph_does_not_step_over_a_wall_on_a_tile_edge() {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.1);
        // Cells 73 to 86 across (centres at multiples of 0.1 mm), the whole height; tiles
        // 9 (cells 72-79) and 10 (80-87) keep 72 and 87.
        g.block(&region_of([rect(7.25, -1.0, 8.65, 21.0)]));
        let mut c = Corridors::new(&g);
        let start = g.index_of(pt(2.0, 10.0)).unwrap();
        let goal_tile = c.tile_index(&g, g.index_of(pt(18.0, 10.0)).unwrap());
        assert!(c.plan(&g, 1, &[start], |t| t == goal_tile, |_| 0.0, |_| None, 1), "the lenient graph leaks");
        c.strict = true;
        assert!(!c.plan(&g, 1, &[start], |t| t == goal_tile, |_| 0.0, |_| None, 1), "the strict graph holds");
    }

    /// A 20 mm glass at 0.1 mm cells with a wall up the middle, open above 17 mm; the
    /// start and goal cells low on either side of it, and the goal's tile.
    fn wall_with_a_gap_at_its_top() -> (Grid, Corridors, usize, usize, usize) {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.1);
        g.block(&region_of([rect(9.5, 0.0, 10.5, 17.0)]));
        let c = Corridors::new(&g);
        let start = g.index_of(pt(2.0, 2.0)).unwrap();
        let goal_cell = g.index_of(pt(18.0, 2.0)).unwrap();
        let goal_tile = c.tile_index(&g, goal_cell);
        (g, c, start, goal_cell, goal_tile)
    }

    /// A wall with a gap at its top: the corridor goes through the gap, not through the
    /// wall, and leaves out the far side of the glass.
    #[test]
    fn corridor_follows_the_gap() {
        let (g, mut c, start, _, goal_tile) = wall_with_a_gap_at_its_top();
        assert!(c.plan(&g, 1, &[start], |t| t == goal_tile, |_| 0.0, |_| None, 1));
        assert!(c.allows(&g, g.index_of(pt(10.0, 18.0)).unwrap()), "through the gap above the wall");
        assert!(!c.allows(&g, g.index_of(pt(10.0, 5.0)).unwrap()), "not through the wall");
        // Corners no cheapest path passes near stay out.
        assert!(!c.allows(&g, g.index_of(pt(1.0, 19.5)).unwrap()));
        assert!(!c.allows(&g, g.index_of(pt(19.5, 19.5)).unwrap()));
    }

    /// Round a wall the hop bound exceeds the straight distance, and it never exceeds
    /// the cost of the cheapest path the fine search finds in the corridor (it is a lower
    /// bound at every cell of that path).
    #[test]
    fn the_hop_bound_goes_round_the_wall_and_stays_below_the_path() {
        let (g, mut c, start, goal_cell, goal_tile) = wall_with_a_gap_at_its_top();
        assert!(c.plan(&g, 1, &[start], |t| t == goal_tile, |_| 0.0, |_| None, MARGIN));
        c.count_hops(|t| t == goal_tile);
        let straight = 160.0;
        assert!(c.hop_bound(start) > 1.3 * straight, "{} cells", c.hop_bound(start));
        let mut search = Search::new(&g);
        let path = search.find_within(&g, 1, &[start], |i| i == goal_cell, |_| 0.0, |x, y| c.allows_xy(x, y)).unwrap();
        // Walking the path back from the goal, the cost still to go (at least the steps
        // left) is never below the bound.
        for (k, &cell) in path.iter().enumerate() {
            let steps_left = (path.len() - 1 - k) as f32;
            assert!(c.hop_bound(cell) <= steps_left + 1e-3, "cell {k}: bound {} over {steps_left} steps", c.hop_bound(cell));
        }
        assert_eq!(c.hop_bound(g.index_of(pt(1.0, 19.5)).unwrap()), f32::INFINITY, "outside the corridor");
    }

    /// Sources started from a lower kept bound give the corridor that exact bounds give:
    /// each source's exact bound is worked out when the heap first yields it.
    #[test]
    fn sources_from_kept_bounds_give_the_same_corridor() {
        let (g, mut c, _, goal_cell, goal_tile) = wall_with_a_gap_at_its_top();
        let sources: Vec<usize> = [(1.0, 1.0), (3.0, 12.0), (6.0, 18.0), (8.0, 3.0)].iter().map(|&(x, y)| g.index_of(pt(x, y)).unwrap()).collect();
        let tiles = c.tiles();
        let exact = |t: usize| {
            let (tx, ty) = tiles.column_row(t);
            let (gx, gy) = ((goal_cell % g.nx) / TILE, (goal_cell / g.nx) / TILE);
            (((tx as f32 - gx as f32).powi(2) + (ty as f32 - gy as f32).powi(2)).sqrt() - 1.5).max(0.0) * TILE as f32
        };
        let all: Vec<usize> = (0..g.nx * g.ny).step_by(7).collect();
        assert!(c.plan(&g, 1, &sources, |t| t == goal_tile, exact, |_| None, MARGIN));
        let with_exact: Vec<bool> = all.iter().map(|&i| c.allows(&g, i)).collect();
        assert!(c.plan(&g, 1, &sources, |t| t == goal_tile, exact, |_| Some(0.0), MARGIN));
        let with_kept: Vec<bool> = all.iter().map(|&i| c.allows(&g, i)).collect();
        assert_eq!(with_exact, with_kept);
        assert!(with_exact.iter().any(|a| *a) && !with_exact.iter().all(|a| *a));
    }

    /// A column of source tiles with a wall beside its lower part, and a goal low on the
    /// wall's far side: the sources nearest the goal by the bound are shut in, the way
    /// starts from the top of the column, and the search reaches each higher source from
    /// the one below before its key comes up. Taken in from their heap, with their bounds
    /// known from a first search, the sources give the coarse path (no margin) that
    /// sources laid in at the start give — fails when a source so reached is not started
    /// at no cost, as it would have been at the start.
    #[test]
    fn sources_reached_before_their_key_start_as_sources() {
        for (column, goal_y) in [(1.0, 1.0), (1.4, 1.0), (1.0, 3.3), (1.4, 6.1)] {
            let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.1);
            g.block(&region_of([rect(column + 0.9, 0.0, column + 3.3, 14.0)]));
            let sources: Vec<usize> = (0..70).map(|k| g.index_of(pt(column, 1.0 + k as f64 * 0.2)).unwrap()).collect();
            let mut eager = Corridors::new(&g);
            let mut lazy = Corridors::new(&g);
            let tiles = eager.tiles();
            let goal = tiles.tile_index(g.index_of(pt(18.0, goal_y)).unwrap());
            let exact = |t: usize| {
                let ((tx, ty), (gx, gy)) = (tiles.column_row(t), tiles.column_row(goal));
                (((tx as f32 - gx as f32).powi(2) + (ty as f32 - gy as f32).powi(2)).sqrt() - 1.5).max(0.0) * TILE as f32
            };
            let mut waiting = SourceTiles::new(tiles.ntx * tiles.nty);
            for &s in &sources {
                waiting.add(tiles.tile_index(s));
            }
            let all: Vec<usize> = (0..g.nx * g.ny).step_by(3).collect();
            // The first search works the bounds out; the second starts from them.
            for round in 0..2 {
                assert!(eager.plan(&g, 1, &sources, |t| t == goal, exact, |t| Some(exact(t)), 0));
                assert!(lazy.plan_from(&g, 1, Sources::Tiles(&mut waiting), |t| t == goal, exact, |t| (round > 0).then(|| exact(t)), 0));
                let path = |c: &Corridors| all.iter().map(|&i| c.allows(&g, i)).collect::<Vec<bool>>();
                assert_eq!(path(&eager), path(&lazy), "column at {column}, goal at {goal_y}, round {round}");
                let on_path = |y: f64| lazy.allows(&g, g.index_of(pt(column, y)).unwrap());
                assert!(!on_path(1.0) && [13.5, 14.0, 14.5].into_iter().any(on_path), "from the top of the column");
            }
        }
    }

    /// A closed box around the start: no coarse path.
    #[test]
    fn no_corridor_out_of_a_closed_box() {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.1);
        let ring = crate::geom::difference(&region_of([rect(4.0, 4.0, 12.0, 12.0)]), &region_of([rect(6.0, 6.0, 10.0, 10.0)]));
        g.block(&ring);
        let mut c = Corridors::new(&g);
        let start = g.index_of(pt(8.0, 8.0)).unwrap();
        let goal_tile = c.tile_index(&g, g.index_of(pt(18.0, 18.0)).unwrap());
        assert!(!c.plan(&g, 1, &[start], |t| t == goal_tile, |_| 0.0, |_| None, 1));
    }

    /// A source shut in a ring of another net's claimed cells: [`find_guided`] gives up
    /// on the floods of [`Search::fence`] once the first corridor fails (their report
    /// lists the cells shut in, which the costed search's does not) and names the ring.
    #[test]
    fn a_shut_in_search_is_given_up_by_the_floods() {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.1);
        let ring = crate::geom::difference(&region_of([rect(4.0, 4.0, 12.0, 12.0)]), &region_of([rect(6.0, 6.0, 10.0, 10.0)]));
        g.claim(&ring, 2);
        let mut search = Search::new(&g);
        let mut corridors = Corridors::new(&g);
        let start = g.index_of(pt(8.0, 8.0)).unwrap();
        let mut goal = crate::route::target::Targets::new(&g);
        goal.add(g.index_of(pt(18.0, 18.0)).unwrap());
        let blocked = find_guided(&mut search, &mut corridors, &Ask { grid: &g, owner: 1, sources: &[start], goal: &goal }).unwrap_err();
        assert_eq!(blocked.blockers, [2]);
        assert!(blocked.shut_in.binary_search(&(start as u32)).is_ok(), "the floods' report: the cells shut in with the source");
        // Out of the ring, the same search finds its way.
        let outside = g.index_of(pt(2.0, 2.0)).unwrap();
        assert!(find_guided(&mut search, &mut corridors, &Ask { grid: &g, owner: 1, sources: &[outside], goal: &goal }).is_ok());
    }
}
