//! Maze search on the routing grid: A* (Hart, Nilsson & Raphael, 1968) over the eight
//! neighbours of a cell, in the manner of Lee's maze router (Lee, 1961), with a penalty for
//! every change of direction so that leads come out as few straight and 45° runs.

use super::grid::{Grid, BLOCKED, FREE};
use super::open_list::OpenList;
use super::pages::{PageGeom, Scratch};
use std::cmp::Ordering;

const DIRS: [(i64, i64); 8] = [(1, 0), (1, 1), (0, 1), (-1, 1), (-1, 0), (-1, -1), (0, -1), (1, -1)];

/// The eight neighbours of node `i` of a `w` × `h` grid that lie inside it, as
/// (direction 0–7, counter-clockwise from +x with odd directions diagonal, column, row,
/// index).
pub(crate) fn neighbours(i: usize, w: usize, h: usize) -> impl Iterator<Item = (usize, i64, i64, usize)> {
    let (cx, cy) = ((i % w) as i64, (i / w) as i64);
    let (w, h) = (w as i64, h as i64);
    DIRS.iter().enumerate().filter_map(move |(d, (dx, dy))| {
        let (x, y) = (cx + dx, cy + dy);
        (x >= 0 && y >= 0 && x < w && y < h).then(|| (d, x, y, (y * w + x) as usize))
    })
}
const TURN_PENALTY: f32 = 3.0;

/// What a search knows of one cell it reached.
#[derive(Debug, Clone, Copy)]
struct Node {
    /// Cost from the sources.
    g: f32,
    /// The weighted heuristic, computed once per cell and search.
    h: f32,
    /// Cell it was reached from (itself for a source).
    parent: u32,
    /// Direction of the step into it (8 for a source).
    dir: u8,
    /// Expanded already by a weighted search, which never reopens it ([`Search::weighted`]).
    closed: bool,
}

const UNREACHED: Node = Node { g: f32::INFINITY, h: 0.0, parent: 0, dir: 8, closed: false };

/// The nets whose cells stopped a search, and how many of its steps each stopped. Few
/// nets ever stop one search: a short list beats hashing on every blocked step.
#[derive(Default)]
struct Tally(Vec<(u32, usize)>);

impl Tally {
    /// Counts a step stopped by a cell of owner `o` (the glass edge's blocked cells are
    /// no net and are not counted).
    fn count(&mut self, o: u32) {
        if o == BLOCKED {
            return;
        }
        match self.0.iter_mut().find(|b| b.0 == o) {
            Some(b) => b.1 += 1,
            None => self.0.push((o, 1)),
        }
    }

    /// The owners, the one that stopped most steps first (the lower on ties).
    fn ranked(mut self) -> Vec<u32> {
        self.0.sort_by(|x, y| y.1.cmp(&x.1).then(x.0.cmp(&y.0)));
        self.0.into_iter().map(|b| b.0).collect()
    }
}

/// How the floods of [`Search::reaches`] ended.
enum Floods {
    /// A way exists: the floods met, or the first took a goal cell.
    Way,
    /// No way: one side ran out; every cell it marked, and whether it was the sources'.
    NoWay { cells: Vec<u32>, sources_side: bool },
    /// The floods would lend more pages of state than one search may.
    OverBudget,
}

/// How one step of a reachability flood ended ([`Search::reaches`]).
enum Spread {
    /// Spread to the neighbours it may; the flood goes on.
    Going,
    /// Touched a cell the flood from the other end had marked.
    Met,
    /// Would lend more pages of state than one search may.
    OverBudget,
}

/// Reusable search state, kept by page for the cells one search reaches (so a search
/// neither clears nor holds millions of cells).
pub struct Search {
    nodes: Scratch<Node>,
    /// The reachability floods' marks ([`Search::reaches`], [`Search::fence`]): the side
    /// that took each cell. A byte per cell where a costed search keeps a node of 16
    /// bytes: a flood that ran out behind a wall of leads took 633 pages of the
    /// germination demo's glass, 52 MB as nodes, most of its peak memory.
    marks: Scratch<u8>,
    /// The open list, kept between searches.
    open: OpenList,
    nx: usize,
    /// The weight on the heuristic ([`Search::weighted`]; 1 for plain A*).
    weight: f32,
}

/// What a failed search learned.
#[derive(Debug, Clone)]
pub struct Blocked {
    /// Owners (net id + 1) of the cells that stopped the search, most often first.
    pub blockers: Vec<u32>,
    /// The explored cell nearest the goal.
    pub nearest: usize,
    /// The search stopped at its memory budget ([`MAX_OPEN`] entries or
    /// [`super::pages::MAX_PAGES_LENT`] pages), not because it ran out of cells.
    pub over_budget: bool,
    /// When the sources' own flood ran out ([`Search::fence`]): every cell it took,
    /// sorted. No flood leaves it (each of its cells was spread from), so sources that
    /// all lie in it are shut in there too; empty otherwise.
    pub shut_in: Vec<u32>,
}

/// Most entries one search keeps in its open list (16 M entries of 8 bytes): with the
/// page budget of the search state, this bounds the memory of any search whatever the
/// size of the glass (docs/performance.md, *Memory bound*).
pub const MAX_OPEN: usize = 16 << 20;

/// An entry of a search's open list: a node (cell or tile) and its estimated total cost
/// `f`; the heap pops the lowest `f` first, the lowest node on ties, so searches are
/// deterministic. Both are packed into one integer, `f`'s bits above the node's: costs
/// are never negative, and the bits of non-negative floats sort as the floats do (IEEE
/// 754), so one integer comparison orders the heap (the heap's comparisons were a good
/// part of every search's time).
#[derive(PartialEq, Eq, Clone, Copy)]
pub(crate) struct Open(u64);

impl Open {
    /// The entry of node `cell` at estimated total cost `f` (≥ 0).
    #[inline]
    pub fn new(f: f32, cell: u32) -> Open {
        debug_assert!(!(f < 0.0), "a negative cost {f}");
        // + 0.0 turns a negative zero into zero, whose bits sort first.
        Open(((f + 0.0).to_bits() as u64) << 32 | cell as u64)
    }

    /// Estimated total cost.
    #[inline]
    pub fn f(self) -> f32 {
        f32::from_bits((self.0 >> 32) as u32)
    }

    /// Node index.
    #[inline]
    pub fn cell(self) -> u32 {
        self.0 as u32
    }

    /// The packed key: lower keys are taken first.
    #[inline]
    pub fn key(self) -> u64 {
        self.0
    }

    /// The entry of a packed key ([`Open::key`]).
    #[inline]
    pub fn from_key(key: u64) -> Open {
        Open(key)
    }
}

impl PartialOrd for Open {
    fn partial_cmp(&self, o: &Self) -> Option<Ordering> {
        Some(self.cmp(o))
    }
}
impl Ord for Open {
    fn cmp(&self, o: &Self) -> Ordering {
        o.0.cmp(&self.0)
    }
}

impl Search {
    /// State for searches on grids of `grid`'s size.
    pub fn new(grid: &Grid) -> Search {
        let pages = PageGeom::of(grid.nx, grid.ny);
        Search { nodes: Scratch::new(pages, UNREACHED), marks: Scratch::new(pages, 0), open: OpenList::new(), nx: grid.nx, weight: 1.0 }
    }

    /// State whose searches weigh the heuristic by `weight` ≥ 1 (weighted A*, Pohl 1970):
    /// the open list is ordered by `g + weight·h`, and a path found costs at most `weight`
    /// times the cheapest while far fewer cells are expanded. The lower bounds at hand (by
    /// air, by the corridor's tile hops) leave out the turns and costly zones a lead
    /// meets, so a plain search pops nearly every cell of its corridor. A weighted search
    /// expands each cell once and never reopens it: the bounds are not consistent across
    /// tile borders, and weighted, reopening made one search of the germination demo
    /// moved 5 mm left run for minutes; without reopening the path still costs at most
    /// `weight` times the cheapest for a consistent bound (Likhachev, Gordon & Thrun,
    /// ARA*, 2003).
    pub fn weighted(grid: &Grid, weight: f32) -> Search {
        assert!(weight >= 1.0, "a heuristic weight below 1 ({weight}) only slows the search");
        Search { weight, ..Search::new(grid) }
    }

    /// Pages of state held (the most one search has needed).
    pub fn pages_held(&self) -> usize {
        self.nodes.pages_held()
    }

    /// Finds the cheapest path (within the search's weight, [`Search::weighted`]) from any
    /// of `sources` to a cell where `goal` holds, moving only through cells free or owned
    /// by `owner`; `heuristic` must never overestimate the remaining cost (in cells).
    /// Returns the path from source to goal.
    pub fn find(
        &mut self,
        grid: &Grid,
        owner: u32,
        sources: &[usize],
        goal: impl Fn(usize) -> bool,
        heuristic: impl Fn(usize) -> f32,
    ) -> Result<Vec<usize>, Blocked> {
        self.find_within(grid, owner, sources, goal, heuristic, |_, _| true)
    }

    /// As `find`, but never entering a cell (column, row) where `allowed` is false (the
    /// corridor of a coarse search; sources are always allowed). It takes the column and
    /// row, which the search has at hand, so that it need not divide the index again
    /// for each of the eight neighbours.
    pub fn find_within(
        &mut self,
        grid: &Grid,
        owner: u32,
        sources: &[usize],
        goal: impl Fn(usize) -> bool,
        heuristic: impl Fn(usize) -> f32,
        allowed: impl Fn(usize, usize) -> bool,
    ) -> Result<Vec<usize>, Blocked> {
        debug_assert_eq!(self.nx, grid.nx, "search state made for another grid");
        self.nodes.next_search();
        let mut open = std::mem::take(&mut self.open);
        open.clear();
        let mut blockers = Tally::default();
        let mut nearest = (f32::MAX, sources.first().copied().unwrap_or(0));
        for &s in sources {
            let (x, y) = (s % grid.nx, s / grid.nx);
            if self.nodes.get(x, y).is_none() {
                let h = self.weight * heuristic(s);
                if !self.nodes.set(x, y, Node { g: 0.0, h, parent: s as u32, dir: 8, closed: false }) {
                    self.open = open;
                    return Err(Blocked { blockers: Vec::new(), nearest: s, over_budget: true, shut_in: Vec::new() });
                }
                open.push_unordered(Open::new(h, s as u32));
            }
        }
        open.order();
        let mut over_budget = false;
        while let Some(entry) = open.pop() {
            let (f, cell) = (entry.f(), entry.cell());
            let c = cell as usize;
            let (cx, cy) = (c % grid.nx, c / grid.nx);
            let here = self.nodes.value(cx, cy);
            let (gc, hc) = (here.g, here.h);
            if f - hc > gc + 1e-3 {
                continue; // stale entry
            }
            if goal(c) {
                self.open = open;
                return Ok(self.path_to(c));
            }
            if hc < nearest.0 {
                nearest = (hc, c);
            }
            if self.weight > 1.0 {
                // The cell was set when it was pushed, so this write stays in its page.
                let _ = self.nodes.set(cx, cy, Node { closed: true, ..here });
            }
            for (d, x, y, n) in neighbours(c, grid.nx, grid.ny) {
                let (x, y) = (x as usize, y as usize);
                if !allowed(x, y) {
                    continue;
                }
                let o = grid.owner_xy(x, y);
                if o != FREE && o != owner {
                    blockers.count(o);
                    continue;
                }
                if d % 2 == 1 && !grid.corner_open(cx, cy, x, y, owner) {
                    continue; // no corner cutting past a blocked orthogonal neighbour
                }
                let extra = grid.cost_xy(x, y);
                if extra.is_infinite() {
                    continue;
                }
                let step = if d % 2 == 1 { std::f32::consts::SQRT_2 } else { 1.0 };
                let turn = if here.dir != 8 && here.dir as usize != d { TURN_PENALTY } else { 0.0 };
                let ng = gc + step * (1.0 + extra) + turn;
                let seen = self.nodes.get(x, y);
                if seen.is_none_or(|s| ng < s.g && !s.closed) {
                    let h = match seen {
                        Some(s) => s.h,
                        None => self.weight * heuristic(n),
                    };
                    if open.len() >= MAX_OPEN || !self.nodes.set(x, y, Node { g: ng, h, parent: c as u32, dir: d as u8, closed: false }) {
                        over_budget = true;
                        break;
                    }
                    open.push(Open::new(ng + h, n as u32));
                }
            }
            if over_budget {
                break;
            }
        }
        self.open = open;
        Err(Blocked { blockers: blockers.ranked(), nearest: nearest.1, over_budget, shut_in: Vec::new() })
    }

    /// Whether a cell where `goal` holds can be reached from `sources` by the moves
    /// [`Search::find`] makes (into cells free or owned by `owner` at a finite cost, no
    /// corner cut past another net's cell), found by a breadth-first flood without costs
    /// or heap; `None` when the flood would lend more pages of state than one search may
    /// ([`super::pages::MAX_PAGES_LENT`]), where `find` would stop over its budget too.
    ///
    /// Given `goal_cells`, every cell where `goal` holds, a second flood runs back from
    /// them, a cell each in turn with the first, and the answer is known as soon as the
    /// two meet or either runs out: the work is about twice the smaller side's. A common
    /// growing toward an island shut in behind other commons flooded the whole glass from
    /// its tree before (the germination demo: 0.86 s of its routing), where the island's
    /// side holds a few thousand cells.
    pub fn reaches(&mut self, grid: &Grid, owner: u32, sources: &[usize], goal_cells: Option<&[usize]>, goal: impl Fn(usize) -> bool) -> Option<bool> {
        match self.floods(grid, owner, sources, goal_cells, goal, |_| {}) {
            Floods::Way => Some(true),
            Floods::NoWay { .. } => Some(false),
            Floods::OverBudget => None,
        }
    }

    /// What a failing search from `sources` would report, found by the floods of
    /// [`Search::reaches`] in place of the costed search; `None` when they find a way
    /// (only the costed search can say which).
    ///
    /// The blockers are the nets whose cells close in the side that ran out — the
    /// sources', or the goal's when `goal_cells` are given and that side is the smaller —
    /// counted as [`Search::find`] counts them around the cells it expands, most often
    /// first; the nearest cell is the cell the sources' flood reached with the least
    /// `heuristic` (the lowest on ties). A common whose tree was shut in near its dot ran
    /// one costed search over the rest of the glass per island it could not reach before
    /// (a two-row layout with its pads on top: 13 islands of about 1.4 s each); the floods
    /// stop when the tree's side runs out.
    pub fn fence(&mut self, grid: &Grid, owner: u32, sources: &[usize], goal_cells: Option<&[usize]>, goal: impl Fn(usize) -> bool, heuristic: impl Fn(usize) -> f32) -> Option<Blocked> {
        let mut nearest = (f32::MAX, sources.first().copied().unwrap_or(0));
        let visit = |c: usize| {
            let h = heuristic(c);
            if h < nearest.0 || (h == nearest.0 && c < nearest.1) {
                nearest = (h, c);
            }
        };
        let (cells, sources_side) = match self.floods(grid, owner, sources, goal_cells, goal, visit) {
            Floods::Way => return None,
            Floods::OverBudget => return Some(Blocked { blockers: Vec::new(), nearest: nearest.1, over_budget: true, shut_in: Vec::new() }),
            Floods::NoWay { cells, sources_side } => (cells, sources_side),
        };
        let mut blockers = Tally::default();
        for &c in &cells {
            for (_, x, y, _) in neighbours(c as usize, grid.nx, grid.ny) {
                let o = grid.owner_xy(x as usize, y as usize);
                if o != FREE && o != owner {
                    blockers.count(o);
                }
            }
        }
        let shut_in = if sources_side {
            let mut cells = cells;
            cells.sort_unstable();
            cells
        } else {
            Vec::new()
        };
        Some(Blocked { blockers: blockers.ranked(), nearest: nearest.1, over_budget: false, shut_in })
    }

    /// The flood from `sources` and, given `goal_cells`, the one back from them, a cell of
    /// each in turn ([`Search::reaches`]); `visit` sees each cell the first flood takes.
    fn floods(&mut self, grid: &Grid, owner: u32, sources: &[usize], goal_cells: Option<&[usize]>, goal: impl Fn(usize) -> bool, mut visit: impl FnMut(usize)) -> Floods {
        // The flood from the sources marks its cells with one direction value, the flood
        // from the goal with another. Each keeps every cell it marked in its queue (read
        // from an index, not popped): when one side runs out, they are what is closed in.
        const AHEAD: u8 = 8;
        const BEHIND: u8 = 9;
        self.marks.next_search();
        let mut ahead = Vec::new();
        for &s in sources {
            let (x, y) = (s % grid.nx, s / grid.nx);
            if self.marks.get(x, y).is_none() {
                if !self.marks.set(x, y, AHEAD) {
                    return Floods::OverBudget;
                }
                ahead.push(s as u32);
            }
        }
        let mut behind = Vec::new();
        if let Some(cells) = goal_cells {
            for &g in cells.iter().filter(|&&g| goal(g)) {
                let (x, y) = (g % grid.nx, g / grid.nx);
                match self.marks.get(x, y) {
                    // A source on the goal.
                    Some(AHEAD) => return Floods::Way,
                    Some(_) => continue,
                    None => {}
                }
                // The first flood ends on a goal cell only by entering it.
                if !grid.usable_xy(x, y, owner) {
                    continue;
                }
                if !self.marks.set(x, y, BEHIND) {
                    return Floods::OverBudget;
                }
                behind.push(g as u32);
            }
        }
        let (mut next_ahead, mut next_behind) = (0, 0);
        loop {
            let Some(&cell) = ahead.get(next_ahead) else { return Floods::NoWay { cells: ahead, sources_side: true } };
            next_ahead += 1;
            visit(cell as usize);
            if goal(cell as usize) {
                return Floods::Way;
            }
            match self.spread(grid, owner, cell, AHEAD, &mut ahead) {
                Spread::Going => {}
                Spread::Met => return Floods::Way,
                Spread::OverBudget => return Floods::OverBudget,
            }
            if goal_cells.is_none() {
                continue;
            }
            // One cell back from the goal: the cells from which a move of the first flood
            // enters this one (the moves are the same both ways: into a cell a lead may
            // enter, past no corner of another net's cells).
            let Some(&cell) = behind.get(next_behind) else { return Floods::NoWay { cells: behind, sources_side: false } };
            next_behind += 1;
            match self.spread(grid, owner, cell, BEHIND, &mut behind) {
                Spread::Going => {}
                Spread::Met => return Floods::Way,
                Spread::OverBudget => return Floods::OverBudget,
            }
        }
    }

    /// One step of a flood of [`Search::reaches`] from `cell`: each neighbour a lead of
    /// `owner` may enter, past no corner of another net, not marked yet, is marked with
    /// `side` and queued; a neighbour marked by the other flood means the two have met
    /// (a cell where a lead starts counts though no lead may enter it: it is where one
    /// starts).
    fn spread(&mut self, grid: &Grid, owner: u32, cell: u32, side: u8, queue: &mut Vec<u32>) -> Spread {
        let c = cell as usize;
        let (cx, cy) = (c % grid.nx, c / grid.nx);
        for (d, x, y, n) in neighbours(c, grid.nx, grid.ny) {
            let (x, y) = (x as usize, y as usize);
            if d % 2 == 1 && !grid.corner_open(cx, cy, x, y, owner) {
                continue;
            }
            match self.marks.get(x, y) {
                Some(m) if m != side => return Spread::Met,
                Some(_) => continue,
                None => {}
            }
            if !grid.usable_xy(x, y, owner) {
                continue;
            }
            if !self.marks.set(x, y, side) {
                return Spread::OverBudget;
            }
            queue.push(n as u32);
        }
        Spread::Going
    }

    fn path_to(&self, mut c: usize) -> Vec<usize> {
        let mut path = vec![c];
        loop {
            let p = self.nodes.value(c % self.nx, c / self.nx).parent as usize;
            if p == c {
                break;
            }
            c = p;
            path.push(c);
        }
        path.reverse();
        path
    }
}

/// Turns a cell path into a polyline keeping only the corners.
pub fn corners(grid: &Grid, path: &[usize]) -> Vec<crate::geom::Pt> {
    let pts: Vec<_> = path.iter().map(|&i| grid.centre(i)).collect();
    let mut out: Vec<crate::geom::Pt> = Vec::new();
    for p in pts {
        if out.len() >= 2 {
            let a = out[out.len() - 2];
            let b = out[out.len() - 1];
            let cross = (b.x - a.x) * (p.y - b.y) - (b.y - a.y) * (p.x - b.x);
            if cross.abs() < 1e-12 {
                out.pop();
            }
        }
        out.push(p);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, region_of};
    use std::collections::BinaryHeap;

    /// The packed entries pop in the order of their costs (IEEE 754 totalOrder, through
    /// `f32::total_cmp`), the lower node first on equal costs: zero, a negative zero, the
    /// smallest subnormal, fractions, ties, a large cost and infinity.
    #[test]
    fn entries_pop_in_the_order_of_their_costs() {
        let costs = [3.5f32, 0.0, -0.0, f32::from_bits(1), 1.0, 1.0 + f32::EPSILON, 3.5, 1e30, f32::INFINITY, 0.25, 1.0];
        let mut heap: BinaryHeap<Open> = costs.iter().enumerate().map(|(i, &f)| Open::new(f, (100 - i) as u32)).collect();
        let mut want: Vec<(f32, u32)> = costs.iter().enumerate().map(|(i, &f)| (f + 0.0, (100 - i) as u32)).collect();
        want.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.1.cmp(&b.1)));
        let mut got = Vec::new();
        while let Some(e) = heap.pop() {
            got.push((e.f(), e.cell()));
        }
        assert_eq!(got, want);
    }

    #[test]
    fn goes_around_a_wall() {
        let mut g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        g.claim(&region_of([rect(4.8, 0.0, 5.2, 8.0)]), 7);
        let mut s = Search::new(&g);
        let start = g.index_of(crate::geom::pt(1.0, 1.0)).unwrap();
        let end = g.index_of(crate::geom::pt(9.0, 1.0)).unwrap();
        let path = s.find(&g, 1, &[start], |c| c == end, |_| 0.0).unwrap();
        assert!(path.iter().any(|&c| g.centre(c).y >= 8.0), "must pass above the wall");
    }

    /// The flood one way and from both ends, which must agree.
    fn flood(s: &mut Search, g: &Grid, owner: u32, start: usize, end: usize) -> Option<bool> {
        let one_way = s.reaches(g, owner, &[start], None, |c| c == end);
        assert_eq!(s.reaches(g, owner, &[start], Some(&[end]), |c| c == end), one_way, "from both ends");
        one_way
    }

    /// On grids walled at random (a fixed generator, so the walls are the same run after
    /// run), the flood from both ends answers as the one-way flood and as the costed
    /// search: a way found exactly when one exists. Goals of several cells, some of them
    /// sources, some shut in, and sources on blocked cells all occur.
    #[test]
    fn the_flood_from_both_ends_agrees_with_the_search_on_random_walls() {
        let (mut found, mut not) = (0, 0);
        for (g, sources, goal, owner) in random_walls() {
            let is_goal = |c: usize| goal.contains(&c);
            let mut s = Search::new(&g);
            let one_way = s.reaches(&g, owner, &sources, None, is_goal);
            assert_eq!(s.reaches(&g, owner, &sources, Some(&goal), is_goal), one_way);
            assert_eq!(one_way, Some(s.find(&g, owner, &sources, is_goal, |_| 0.0).is_ok()));
            if one_way == Some(true) { found += 1 } else { not += 1 }
        }
        assert!(found > 50 && not > 50, "both answers occur often: {found} found, {not} not");
    }

    /// On the same walls, the fence finds no way exactly when the costed search fails,
    /// and flooding from the sources alone it names the blockers a failing weighted search
    /// names (which expands each cell it reaches once), in the same order; from both ends
    /// it finds no way either.
    #[test]
    fn the_fence_reports_what_a_failing_search_reports() {
        let mut named = 0;
        for (g, sources, goal, owner) in random_walls() {
            let is_goal = |c: usize| goal.contains(&c);
            let mut s = Search::weighted(&g, 1.5);
            let searched = s.find(&g, owner, &sources, is_goal, |_| 0.0);
            let fenced = s.fence(&g, owner, &sources, None, is_goal, |_| 0.0);
            assert_eq!(fenced.is_none(), searched.is_ok());
            let (Some(f), Err(b)) = (fenced, searched) else { continue };
            assert_eq!(f.blockers, b.blockers);
            named += usize::from(!f.blockers.is_empty());
            assert!(s.fence(&g, owner, &sources, Some(&goal), is_goal, |_| 0.0).is_some(), "no way from either end");
        }
        assert!(named > 50, "failures that name a blocker occur often: {named}");
    }

    /// A goal shut in a ring of net 2, the sources out on an open glass that also holds a
    /// wall of net 3: from the sources alone the fence names both nets (its flood covers the
    /// open glass), from both ends only net 2, which closes in the side that runs out.
    #[test]
    fn the_fence_from_both_ends_names_what_closes_in_the_smaller_side() {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.25);
        for r in [rect(13.0, 13.0, 17.0, 13.5), rect(13.0, 16.5, 17.0, 17.0), rect(13.0, 13.0, 13.5, 17.0), rect(16.5, 13.0, 17.0, 17.0)] {
            g.claim(&region_of([r]), 2);
        }
        g.claim(&region_of([rect(2.0, 5.0, 10.0, 5.5)]), 3);
        let source = g.index_of(crate::geom::pt(2.0, 2.0)).unwrap();
        let goal = g.index_of(crate::geom::pt(15.0, 15.0)).unwrap();
        let mut s = Search::weighted(&g, 1.5);
        let one_way = s.fence(&g, 1, &[source], None, |c| c == goal, |_| 0.0).expect("shut in");
        assert_eq!(one_way.blockers.len(), 2, "{:?}", one_way.blockers);
        assert_eq!(s.find(&g, 1, &[source], |c| c == goal, |_| 0.0).unwrap_err().blockers, one_way.blockers);
        let both = s.fence(&g, 1, &[source], Some(&[goal]), |c| c == goal, |_| 0.0).expect("shut in");
        assert_eq!(both.blockers, [2]);
        assert!(both.shut_in.is_empty(), "the goal's side ran out, not the sources'");
        // From the goal's side, the sources' flood runs out inside the ring: it names the
        // free cells within the ring's outline, sorted, the goal among them.
        let inside = s.fence(&g, 1, &[goal], Some(&[source]), |c| c == source, |_| 0.0).expect("shut in");
        assert_eq!(inside.blockers, [2]);
        let within = |c: usize| {
            let p = g.centre(c);
            (13.0..17.0).contains(&p.x) && (13.0..17.0).contains(&p.y) && g.owner(c) == FREE
        };
        assert_eq!(inside.shut_in.len(), (0..g.nx * g.ny).filter(|&c| within(c)).count());
        assert!(inside.shut_in.windows(2).all(|w| w[0] < w[1]) && inside.shut_in.binary_search(&(goal as u32)).is_ok());
    }

    /// 300 grids of 24 × 24 cells with random walls of two nets (2 and 3), random cells of
    /// infinite cost, sources and goal cells, and the net that searches (1 or 2): from a
    /// fixed generator, so the walls are the same run after run.
    fn random_walls() -> Vec<(Grid, Vec<usize>, Vec<usize>, u32)> {
        let mut seed = 0x2545_f491_4f6c_dd1du64;
        let mut next = |n: usize| {
            // xorshift64 (Marsaglia 2003)
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed % n as u64) as usize
        };
        (0..300)
            .map(|_| {
                let mut g = Grid::new(0.0, 0.0, 6.0, 6.0, 0.25);
                for _ in 0..20 + next(60) {
                    let (x, y, w, h) = (next(24) as f64 * 0.25, next(24) as f64 * 0.25, 0.1 + next(12) as f64 * 0.25, 0.1 + next(3) as f64 * 0.25);
                    let r = if next(2) == 0 { rect(x, y, x + w, y + h) } else { rect(x, y, x + h, y + w) };
                    g.claim(&region_of([r]), 2 + next(2) as u32);
                }
                for _ in 0..next(6) {
                    let c = next(g.nx * g.ny);
                    g.set_cost(c, f32::INFINITY);
                }
                let cells = g.nx * g.ny;
                let sources: Vec<usize> = (0..1 + next(3)).map(|_| next(cells)).collect();
                let goal: Vec<usize> = (0..1 + next(4)).map(|_| next(cells)).collect();
                let owner = 1 + next(2) as u32;
                (g, sources, goal, owner)
            })
            .collect()
    }

    /// The flood reaches what the costed search reaches: round a wall with a gap, not
    /// through one that closes the grid, nor past a corner of two cells of another net
    /// touching diagonally, nor into cells of infinite cost.
    #[test]
    fn the_flood_reaches_what_the_search_finds() {
        let mut g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        let at = |g: &Grid, x: f64, y: f64| g.index_of(crate::geom::pt(x, y)).unwrap();
        g.claim(&region_of([rect(4.8, 0.0, 5.2, 8.0)]), 7);
        let (start, end) = (at(&g, 1.0, 1.0), at(&g, 9.0, 1.0));
        let mut s = Search::new(&g);
        assert_eq!(flood(&mut s, &g, 1, start, end), Some(true));
        assert!(s.find(&g, 1, &[start], |c| c == end, |_| 0.0).is_ok());
        g.claim(&region_of([rect(4.8, 7.9, 5.2, 11.0)]), 7);
        assert_eq!(flood(&mut s, &g, 1, start, end), Some(false));
        assert!(s.find(&g, 1, &[start], |c| c == end, |_| 0.0).is_err());
        // Its own net's cells are open to it.
        assert_eq!(flood(&mut s, &g, 7, start, end), Some(true));
        // The goal's eight neighbours at infinite cost.
        let mut h = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        for (_, _, _, n) in neighbours(end, h.nx, h.ny) {
            h.set_cost(n, f32::INFINITY);
        }
        assert_eq!(flood(&mut s, &h, 1, start, end), Some(false));
        assert!(s.find(&h, 1, &[start], |c| c == end, |_| 0.0).is_err());
        // A line of single cells of another net corner to corner across the grid: no
        // diagonal step slips between two of them.
        let mut d = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        for i in 0..d.nx {
            let c = i as f64 * 0.5;
            d.claim(&region_of([rect(c - 0.1, c - 0.1, c + 0.1, c + 0.1)]), 7);
        }
        let (below, above) = (at(&d, 9.0, 1.0), at(&d, 1.0, 9.0));
        assert_eq!(flood(&mut s, &d, 1, below, above), Some(false));
        assert!(s.find(&d, 1, &[below], |c| c == above, |_| 0.0).is_err());
    }

    /// A weighted search's path costs at most its weight times the plain search's, round a
    /// wall and through a costly band, with a bound by air that leaves both out (the
    /// guarantee of weighted A*, Pohl 1970; without reopening, Likhachev et al. 2003).
    #[test]
    fn a_weighted_path_costs_at_most_the_weight_times_the_cheapest() {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.25);
        g.claim(&region_of([rect(9.8, 0.0, 10.2, 15.0)]), 7);
        g.add_cost(&region_of([rect(0.0, 8.0, 8.0, 9.0)]), 20.0);
        let at = |x: f64, y: f64| g.index_of(crate::geom::pt(x, y)).unwrap();
        let (start, end) = (at(2.0, 2.0), at(18.0, 12.0));
        let by_air = |i: usize| {
            let (dx, dy) = ((i % g.nx) as f32 - (end % g.nx) as f32, (i / g.nx) as f32 - (end / g.nx) as f32);
            dx.hypot(dy)
        };
        let cost = |path: &[usize]| -> f32 {
            let mut total = 0.0;
            for w in path.windows(3).chain(std::iter::once(&path[path.len() - 2..])) {
                let (a, b) = (w[0], w[1]);
                let diagonal = a % g.nx != b % g.nx && a / g.nx != b / g.nx;
                total += if diagonal { std::f32::consts::SQRT_2 } else { 1.0 } * (1.0 + g.cost(b));
                if w.len() == 3 && (b as i64 - a as i64) != (w[2] as i64 - b as i64) {
                    total += TURN_PENALTY;
                }
            }
            total
        };
        let plain = Search::new(&g).find(&g, 1, &[start], |c| c == end, by_air).unwrap();
        let weighted = Search::weighted(&g, 1.5).find(&g, 1, &[start], |c| c == end, by_air).unwrap();
        assert!(plain.iter().any(|&c| g.centre(c).y >= 15.0), "round the wall");
        assert!(cost(&weighted) <= 1.5 * cost(&plain) + 1e-3, "weighted {} vs plain {}", cost(&weighted), cost(&plain));
    }

    #[test]
    fn reports_blocker() {
        let mut g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        g.claim(&region_of([rect(4.8, -1.0, 5.2, 11.0)]), 7);
        let mut s = Search::new(&g);
        let start = g.index_of(crate::geom::pt(1.0, 1.0)).unwrap();
        let end = g.index_of(crate::geom::pt(9.0, 1.0)).unwrap();
        let err = s.find(&g, 1, &[start], |c| c == end, |_| 0.0).unwrap_err();
        assert_eq!(err.blockers.first(), Some(&7));
    }
}
