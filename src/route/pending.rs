//! The goal of a common's growing tree: the islands not joined yet.
//!
//! A common's tree grows from its dots by searches that start from the whole tree and
//! end on any island still waiting (Prim's order by the lead's true cost). Rebuilding a
//! set of goal cells after every join cost time quadratic in the islands of a row; here
//! each landing cell is marked once with its island, a join only flips the island's flag,
//! and the A* bound is the distance to the nearest waiting island's bounding box in an
//! R-tree the join removes it from (every landing cell lies in its box, so the bound never
//! overestimates; Hart, Nilsson & Raphael, 1968).

use super::corridor::{Goal, TILE, TileGeom};
use super::grid::Grid;
use super::target::TileBound;
use super::pages::{PageGeom, PagedCells};
use rstar::primitives::{GeomWithData, Rectangle};
use rstar::{PointDistance, RTree};
use super::TileMap;

type Boxed = GeomWithData<Rectangle<[f64; 2]>, usize>;

/// The islands of one common still to join, as a search goal.
pub struct Pending {
    /// Each island's landing cells.
    ends: Vec<Vec<usize>>,
    /// Per cell, the island it is a landing cell of (`u32::MAX` for none): stored by page
    /// only where islands lie, one value per cell (a search's scratch pages, used here
    /// before, carry a stamp per cell as well, twice the memory for a map set once).
    island_of: PagedCells<u32>,
    waiting: Vec<bool>,
    boxes: Vec<Option<Boxed>>,
    by_tile: TileMap<(usize, usize), Vec<usize>>,
    index: RTree<Boxed>,
    /// Distances to the nearest waiting box, one R-tree query per tile until that box's
    /// island is joined.
    bound: TileBound,
}

impl Pending {
    /// The islands given by their landing cells (an island without any is never waited
    /// for); kept, and lent out by [`Pending::ends`].
    pub fn new(grid: &Grid, ends: Vec<Vec<usize>>) -> Pending {
        let nx = grid.nx;
        let mut island_of = PagedCells::new(PageGeom::of(grid.nx, grid.ny), u32::MAX);
        let mut by_tile: TileMap<(usize, usize), Vec<usize>> = TileMap::default();
        let mut boxes = Vec::with_capacity(ends.len());
        for (k, cells) in ends.iter().enumerate() {
            let (mut x0, mut y0, mut x1, mut y1) = (usize::MAX, usize::MAX, 0, 0);
            // Cells come in rows, most in the tile of the one before, whose entry holds
            // this island already.
            let mut last_tile = None;
            for &c in cells {
                let (x, y) = (c % nx, c / nx);
                island_of.set(c, k as u32);
                let tile = (x / TILE, y / TILE);
                if last_tile != Some(tile) {
                    last_tile = Some(tile);
                    let tiles = by_tile.entry(tile).or_default();
                    if tiles.last() != Some(&k) {
                        tiles.push(k);
                    }
                }
                (x0, y0, x1, y1) = (x0.min(x), y0.min(y), x1.max(x), y1.max(y));
            }
            boxes.push((!cells.is_empty()).then(|| {
                GeomWithData::new(
                    Rectangle::from_corners([x0 as f64, y0 as f64], [x1 as f64, y1 as f64]),
                    k,
                )
            }));
        }
        let index = RTree::bulk_load(boxes.iter().flatten().cloned().collect());
        let waiting = boxes.iter().map(Option::is_some).collect();
        Pending {
            ends,
            island_of,
            waiting,
            boxes,
            by_tile,
            index,
            bound: TileBound::new(grid),
        }
    }

    /// The landing cells of island `k`.
    pub fn ends(&self, k: usize) -> &[usize] {
        &self.ends[k]
    }

    /// Whether any island is still waiting.
    pub fn any(&self) -> bool {
        self.index.size() > 0
    }

    /// The islands still waiting.
    pub fn waiting(&self) -> Vec<usize> {
        (0..self.waiting.len())
            .filter(|&k| self.waiting[k])
            .collect()
    }

    /// The waiting island cell `c` lands on, if any.
    pub fn island_at(&self, c: usize) -> Option<usize> {
        let k = self.island_of.get(c) as usize;
        (k < self.waiting.len() && self.waiting[k]).then_some(k)
    }

    /// Marks island `k` joined: searches no longer end on it.
    pub fn join(&mut self, k: usize) {
        if std::mem::take(&mut self.waiting[k]) {
            if let Some(b) = &self.boxes[k] {
                self.index.remove(b);
            }
        }
    }
}

impl Goal for Pending {
    fn is_goal(&self, c: usize) -> bool {
        self.island_at(c).is_some()
    }
    fn is_goal_tile(&self, tiles: &TileGeom, t: usize) -> bool {
        self.by_tile
            .get(&tiles.column_row(t))
            .is_some_and(|ks| ks.iter().any(|&k| self.waiting[k]))
    }
    /// The distance from `c`'s tile centre to the nearest waiting box, less half the
    /// tile's diagonal: never more than the distance from `c` to a waiting landing cell.
    fn bound(&self, c: usize) -> f32 {
        // A tile's nearest waiting island stays its nearest until it is joined (joins
        // only take islands away), so the distance is worked out again only then: once
        // per tile and join, the R-tree was asked 4.8 M times at 64 digits.
        self.bound.at_while(
            c,
            |key| self.waiting[key as usize - 1],
            |p| self.index.nearest_neighbor(&p).map(|b| (b.distance_2(&p).sqrt() as f32, b.data as u32 + 1)).unwrap_or((0.0, 0)),
        )
    }
    /// The distance last worked out for `c`'s tile, to an island that may have been joined
    /// since: joins only take islands away, so it never exceeds the distance now.
    fn kept_bound(&self, c: usize) -> Option<f32> {
        self.bound.kept(c)
    }
    /// The waiting islands' landing cells (a cell of two islands counted with the later
    /// one, as [`Goal::is_goal`] counts it).
    fn cells(&self) -> Option<Vec<usize>> {
        let waiting = self.ends.iter().enumerate().filter(|(k, _)| self.waiting[*k]);
        Some(waiting.flat_map(|(_, cells)| cells.iter().copied().filter(|&c| self.island_at(c).is_some())).collect())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, rect, region_of};

    fn cells(g: &Grid, x0: f64, y0: f64, x1: f64, y1: f64) -> Vec<usize> {
        let mut v = Vec::new();
        g.for_cells_in(&region_of([rect(x0, y0, x1, y1)]), |i| v.push(i));
        v
    }

    /// A joined island is no goal any more and no longer draws the bound; the bound never
    /// exceeds the straight distance to a waiting island's cell.
    #[test]
    fn joining_an_island_takes_it_out_of_the_goal() {
        let g = Grid::new(0.0, 0.0, 10.0, 10.0, 0.1);
        let ends = vec![
            cells(&g, 1.0, 1.0, 2.0, 2.0),
            cells(&g, 7.0, 7.0, 8.0, 8.0),
            Vec::new(),
        ];
        let mut p = Pending::new(&g, ends);
        let a = g.index_of(pt(1.5, 1.5)).unwrap();
        let b = g.index_of(pt(7.5, 7.5)).unwrap();
        let near_a = g.index_of(pt(2.5, 1.5)).unwrap();
        assert_eq!(p.island_at(a), Some(0));
        assert_eq!(
            p.waiting(),
            vec![0, 1],
            "an island without landing cells is never waited for"
        );
        assert!(
            p.bound(near_a) <= 5.0 + 1e-3,
            "bound {} within the 5 cells to island 0",
            p.bound(near_a)
        );
        assert!(p.bound(b) == 0.0);
        p.join(0);
        assert_eq!(p.island_at(a), None);
        assert!(p.is_goal(b));
        // The bound kept from before the join still bounds from below, but is the old one.
        let kept = p.kept_bound(near_a).expect("worked out above");
        assert!(kept <= 5.0 + 1e-3, "kept {kept}");
        // Now the nearest waiting island is 1, about 50 cells away in x and y.
        assert!(p.bound(near_a) > 35.0, "bound {}", p.bound(near_a));
        assert_eq!(p.kept_bound(near_a), Some(p.bound(near_a)), "kept as worked out again");
        p.join(1);
        assert!(!p.any());
    }
}
