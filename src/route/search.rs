//! Maze search on the routing grid: A* (Hart, Nilsson & Raphael, 1968) over the eight
//! neighbours of a cell, in the manner of Lee's maze router (Lee, 1961), with a penalty for
//! every change of direction so that leads come out as few straight and 45° runs.

use super::grid::{Grid, BLOCKED, FREE};
use std::cmp::Ordering;
use std::collections::BinaryHeap;

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

/// Reusable search state (so a search does not clear millions of cells).
pub struct Search {
    g: Vec<f32>,
    /// The heuristic of each cell reached in this search, computed once.
    hv: Vec<f32>,
    dir: Vec<u8>,
    parent: Vec<u32>,
    stamp: Vec<u32>,
    generation: u32,
}

/// What a failed search learned.
#[derive(Debug, Clone)]
pub struct Blocked {
    /// Owners (net id + 1) of the cells that stopped the search, most often first.
    pub blockers: Vec<u32>,
    /// The explored cell nearest the goal.
    pub nearest: usize,
}

/// An entry of a search's open list: a node (cell or tile) and its estimated total cost;
/// the heap pops the lowest `f` first, the lowest node on ties, so searches are
/// deterministic.
#[derive(PartialEq)]
pub(crate) struct Open {
    /// Cost so far plus the heuristic.
    pub f: f32,
    /// Node index.
    pub cell: u32,
}
impl Eq for Open {}
impl PartialOrd for Open {
    fn partial_cmp(&self, o: &Self) -> Option<Ordering> {
        Some(self.cmp(o))
    }
}
impl Ord for Open {
    fn cmp(&self, o: &Self) -> Ordering {
        o.f.total_cmp(&self.f).then(o.cell.cmp(&self.cell))
    }
}

impl Search {
    /// State for grids of `cells` cells.
    pub fn new(cells: usize) -> Search {
        Search { g: vec![0.0; cells], hv: vec![0.0; cells], dir: vec![8; cells], parent: vec![0; cells], stamp: vec![0; cells], generation: 0 }
    }

    /// Finds the cheapest path from any of `sources` to a cell where `goal` holds, moving
    /// only through cells free or owned by `owner`; `heuristic` must never overestimate
    /// the remaining cost (in cells). Returns the path from source to goal.
    pub fn find(
        &mut self,
        grid: &Grid,
        owner: u32,
        sources: &[usize],
        goal: impl Fn(usize) -> bool,
        heuristic: impl Fn(usize) -> f32,
    ) -> Result<Vec<usize>, Blocked> {
        self.find_within(grid, owner, sources, goal, heuristic, |_| true)
    }

    /// As `find`, but never entering a cell where `allowed` is false (the corridor of a
    /// coarse search; sources are always allowed).
    pub fn find_within(
        &mut self,
        grid: &Grid,
        owner: u32,
        sources: &[usize],
        goal: impl Fn(usize) -> bool,
        heuristic: impl Fn(usize) -> f32,
        allowed: impl Fn(usize) -> bool,
    ) -> Result<Vec<usize>, Blocked> {
        self.generation += 1;
        let stamp_now = self.generation;
        let mut open = BinaryHeap::new();
        let mut blockers: std::collections::HashMap<u32, usize> = Default::default();
        let mut nearest = (f32::MAX, sources.first().copied().unwrap_or(0));
        for &s in sources {
            if self.stamp[s] != stamp_now {
                self.stamp[s] = stamp_now;
                self.g[s] = 0.0;
                self.hv[s] = heuristic(s);
                self.dir[s] = 8;
                self.parent[s] = s as u32;
                open.push(Open { f: self.hv[s], cell: s as u32 });
            }
        }
        let nx = grid.nx as i64;
        while let Some(Open { f, cell }) = open.pop() {
            let c = cell as usize;
            let gc = self.g[c];
            let hc = self.hv[c];
            if f - hc > gc + 1e-3 {
                continue; // stale entry
            }
            if goal(c) {
                return Ok(self.path_to(c));
            }
            if hc < nearest.0 {
                nearest = (hc, c);
            }
            let (cx, cy) = ((c % grid.nx) as i64, (c / grid.nx) as i64);
            for (d, x, y, n) in neighbours(c, grid.nx, grid.ny) {
                if !allowed(n) {
                    continue;
                }
                let o = grid.owner[n];
                if o != FREE && o != owner {
                    if o != BLOCKED {
                        *blockers.entry(o).or_default() += 1;
                    }
                    continue;
                }
                if d % 2 == 1 {
                    // no corner cutting past a blocked orthogonal neighbour
                    let a = grid.owner[(cy * nx + x) as usize];
                    let b = grid.owner[(y * nx + cx) as usize];
                    if (a != FREE && a != owner) || (b != FREE && b != owner) {
                        continue;
                    }
                }
                let extra = grid.cost[n];
                if extra.is_infinite() {
                    continue;
                }
                let step = if d % 2 == 1 { std::f32::consts::SQRT_2 } else { 1.0 };
                let turn = if self.dir[c] != 8 && self.dir[c] as usize != d { TURN_PENALTY } else { 0.0 };
                let ng = gc + step * (1.0 + extra) + turn;
                let fresh = self.stamp[n] != stamp_now;
                if fresh || ng < self.g[n] {
                    if fresh {
                        self.stamp[n] = stamp_now;
                        self.hv[n] = heuristic(n);
                    }
                    self.g[n] = ng;
                    self.dir[n] = d as u8;
                    self.parent[n] = c as u32;
                    open.push(Open { f: ng + self.hv[n], cell: n as u32 });
                }
            }
        }
        let mut b: Vec<(u32, usize)> = blockers.into_iter().collect();
        b.sort_by(|x, y| y.1.cmp(&x.1).then(x.0.cmp(&y.0)));
        Err(Blocked { blockers: b.into_iter().map(|x| x.0).collect(), nearest: nearest.1 })
    }

    fn path_to(&self, mut c: usize) -> Vec<usize> {
        let mut path = vec![c];
        while self.parent[c] as usize != c {
            c = self.parent[c] as usize;
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

    #[test]
    fn goes_around_a_wall() {
        let mut g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        g.claim(&region_of([rect(4.8, 0.0, 5.2, 8.0)]), 7);
        let mut s = Search::new(g.nx * g.ny);
        let start = g.index_of(crate::geom::pt(1.0, 1.0)).unwrap();
        let end = g.index_of(crate::geom::pt(9.0, 1.0)).unwrap();
        let path = s.find(&g, 1, &[start], |c| c == end, |_| 0.0).unwrap();
        assert!(path.iter().any(|&c| g.centre(c).y >= 8.0), "must pass above the wall");
    }

    #[test]
    fn reports_blocker() {
        let mut g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.5);
        g.claim(&region_of([rect(4.8, -1.0, 5.2, 11.0)]), 7);
        let mut s = Search::new(g.nx * g.ny);
        let start = g.index_of(crate::geom::pt(1.0, 1.0)).unwrap();
        let end = g.index_of(crate::geom::pt(9.0, 1.0)).unwrap();
        let err = s.find(&g, 1, &[start], |c| c == end, |_| 0.0).unwrap_err();
        assert_eq!(err.blockers.first(), Some(&7));
    }
}
