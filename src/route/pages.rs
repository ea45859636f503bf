//! Cell values kept in square pages of 64 × 64 cells, so that memory follows what is
//! drawn, not the size of the glass.
//!
//! A routing grid over a 400 mm glass at a 25 µm step has tens of millions of cells, but
//! most of them hold one value (free glass, or the inside of one keep-out): such a page is
//! stored as that one value and gets its own array only when a cell in it is set to
//! something else. Search state ([`Scratch`]) goes further: pages are lent from a pool for
//! one search and returned at the start of the next, so the state held is that of the
//! cells one search reaches, never of the whole glass.

use std::sync::Arc;

/// Cells along one side of a page (a power of two).
pub const SIDE: usize = 64;
const SHIFT: u32 = SIDE.trailing_zeros();
const MASK: usize = SIDE - 1;
/// Cells in one page.
pub const CELLS: usize = SIDE * SIDE;

/// How a `nx` × `ny` grid of cells divides into pages.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct PageGeom {
    /// Columns of cells.
    pub nx: usize,
    /// Rows of cells.
    pub ny: usize,
    /// Pages across.
    pub px: usize,
    /// Pages down.
    pub py: usize,
}

impl PageGeom {
    /// Pages covering `nx` × `ny` cells.
    pub fn of(nx: usize, ny: usize) -> PageGeom {
        PageGeom { nx, ny, px: nx.div_ceil(SIDE), py: ny.div_ceil(SIDE) }
    }

    /// Page and offset within it of the cell at column `x`, row `y`.
    #[inline]
    pub fn locate_xy(&self, x: usize, y: usize) -> (usize, usize) {
        ((y >> SHIFT) * self.px + (x >> SHIFT), ((y & MASK) << SHIFT) | (x & MASK))
    }

    /// Page and offset of cell `i` (row-major index).
    #[inline]
    pub fn locate(&self, i: usize) -> (usize, usize) {
        self.locate_xy(i % self.nx, i / self.nx)
    }

    /// Number of pages.
    pub fn pages(&self) -> usize {
        self.px * self.py
    }
}

/// One page: a single value for all its cells, or one value per cell. Dense pages are
/// shared between copies of a grid until one of them writes (copy on write), so the copy
/// each routing attempt starts from costs only the pages it changes.
#[derive(Debug, Clone)]
enum Page<T: Copy> {
    Uniform(T),
    Dense(Arc<[T]>),
}

/// A value per cell, stored by page (see the module comment).
#[derive(Debug, Clone)]
pub struct PagedCells<T: Copy + PartialEq> {
    geom: PageGeom,
    pages: Vec<Page<T>>,
}

impl<T: Copy + PartialEq> PagedCells<T> {
    /// Every cell of `geom` set to `value`.
    pub fn new(geom: PageGeom, value: T) -> PagedCells<T> {
        PagedCells { geom, pages: vec![Page::Uniform(value); geom.pages()] }
    }

    /// The value of cell `i`.
    #[inline]
    pub fn get(&self, i: usize) -> T {
        let (p, o) = self.geom.locate(i);
        self.at(p, o)
    }

    /// The value of the cell at column `x`, row `y`.
    #[inline]
    pub fn get_xy(&self, x: usize, y: usize) -> T {
        let (p, o) = self.geom.locate_xy(x, y);
        self.at(p, o)
    }

    /// The one value of every cell in the page holding column `x`, row `y`, when the
    /// page stores one value; `None` when its cells are stored one by one (they may
    /// still be alike until the grid is compacted).
    #[inline]
    pub fn uniform_xy(&self, x: usize, y: usize) -> Option<T> {
        match &self.pages[self.geom.locate_xy(x, y).0] {
            Page::Uniform(v) => Some(*v),
            Page::Dense(_) => None,
        }
    }

    #[inline]
    fn at(&self, p: usize, o: usize) -> T {
        match &self.pages[p] {
            Page::Uniform(v) => *v,
            Page::Dense(d) => d[o],
        }
    }

    /// Sets cell `i` to `value`; a uniform page gets its own array only when the value
    /// differs.
    pub fn set(&mut self, i: usize, value: T) {
        let (p, o) = self.geom.locate(i);
        match &mut self.pages[p] {
            Page::Uniform(v) if *v == value => {}
            Page::Uniform(v) => {
                let mut d = vec![*v; CELLS];
                d[o] = value;
                self.pages[p] = Page::Dense(d.into());
            }
            Page::Dense(d) => {
                if d[o] != value {
                    match Arc::get_mut(d) {
                        Some(own) => own[o] = value,
                        None => {
                            let mut own: Vec<T> = d.to_vec();
                            own[o] = value;
                            *d = own.into();
                        }
                    }
                }
            }
        }
    }

    /// Sets each cell of the run `x0..=x1` of row `y` to `f` of its value, page by page: a
    /// uniform page that `f` leaves as it is stays uniform, and a page is looked up (and
    /// made its own) once per run, not once per cell.
    pub fn update_run(&mut self, y: usize, x0: usize, x1: usize, f: impl Fn(T) -> T) {
        let row = (y & MASK) << SHIFT;
        for px in (x0 >> SHIFT)..=(x1 >> SHIFT) {
            let p = (y >> SHIFT) * self.geom.px + px;
            let (a, b) = (row | (x0.max(px << SHIFT) & MASK), row | (x1.min((px << SHIFT) | MASK) & MASK));
            match &mut self.pages[p] {
                Page::Uniform(v) => {
                    let (old, new) = (*v, f(*v));
                    if new != old {
                        let mut d = vec![old; CELLS];
                        d[a..=b].iter_mut().for_each(|c| *c = new);
                        self.pages[p] = Page::Dense(d.into());
                    }
                }
                Page::Dense(d) => {
                    if d[a..=b].iter().all(|&c| f(c) == c) {
                        continue;
                    }
                    if Arc::get_mut(d).is_none() {
                        *d = d.to_vec().into();
                    }
                    let own = Arc::get_mut(d).expect("a page just copied has one owner");
                    own[a..=b].iter_mut().for_each(|c| *c = f(*c));
                }
            }
        }
    }

    /// Sets every cell of columns `x0..=x1` and rows `y0..=y1` to `value`: a page the
    /// rectangle covers (up to the grid's edges) becomes that one value, the others are
    /// set run by run. Set run by run, every page of a large blocked area got an array of
    /// its own first (a run covers one row of a page) and gave it back only when the grid
    /// was compacted.
    pub fn fill_rect(&mut self, x0: usize, y0: usize, x1: usize, y1: usize, value: T) {
        let (x1, y1) = (x1.min(self.geom.nx - 1), y1.min(self.geom.ny - 1));
        if x0 > x1 || y0 > y1 {
            return;
        }
        for py in (y0 >> SHIFT)..=(y1 >> SHIFT) {
            let (cy0, cy1) = (py << SHIFT, ((py << SHIFT) | MASK).min(self.geom.ny - 1));
            for px in (x0 >> SHIFT)..=(x1 >> SHIFT) {
                let (cx0, cx1) = (px << SHIFT, ((px << SHIFT) | MASK).min(self.geom.nx - 1));
                if x0 <= cx0 && cx1 <= x1 && y0 <= cy0 && cy1 <= y1 {
                    self.pages[py * self.geom.px + px] = Page::Uniform(value);
                } else {
                    for y in y0.max(cy0)..=y1.min(cy1) {
                        self.update_run(y, x0.max(cx0), x1.min(cx1), |_| value);
                    }
                }
            }
        }
    }

    /// Turns every dense page whose cells are all alike back into one value.
    pub fn compact(&mut self) {
        for page in &mut self.pages {
            if let Page::Dense(d) = page
                && d.iter().all(|v| *v == d[0])
            {
                *page = Page::Uniform(d[0]);
            }
        }
    }

    /// Cells stored one by one (for reports of memory use), counting a page shared with
    /// copies of this grid once per copy.
    pub fn dense_cells(&self) -> usize {
        self.pages.iter().filter(|p| matches!(p, Page::Dense(_))).count() * CELLS
    }

    /// Cells stored one by one in pages this grid does not share with a copy.
    pub fn own_dense_cells(&self) -> usize {
        let own = |p: &Page<T>| matches!(p, Page::Dense(d) if Arc::strong_count(d) == 1);
        self.pages.iter().filter(|p| own(p)).count() * CELLS
    }
}

/// Most pages one search may be lent (8 M cells): the bound that keeps a search's state
/// within a fixed budget whatever the size of the glass (docs/performance.md, *Memory
/// bound*). Searches run inside corridors and reach far fewer; one that would need more
/// stops, as if blocked.
pub const MAX_PAGES_LENT: usize = 2048;

/// Per-cell state of one search, lent by page from a pool and valid only in the search
/// that stamped it: a page touched in an earlier search reads as untouched.
pub struct Scratch<T: Copy> {
    geom: PageGeom,
    /// Per page: (search number that last lent it a slot, the slot).
    table: Vec<(u32, u32)>,
    /// Per slot: its cells' values and, per cell, the search that last wrote it.
    slots: Vec<(Box<[T]>, Box<[u32]>)>,
    /// Slots lent in the current search.
    lent: usize,
    search: u32,
    fill: T,
}

impl<T: Copy> Scratch<T> {
    /// State for the cells of `geom`, unset cells reading as `fill`.
    pub fn new(geom: PageGeom, fill: T) -> Scratch<T> {
        Scratch { geom, table: vec![(0, 0); geom.pages()], slots: Vec::new(), lent: 0, search: 1, fill }
    }

    /// Starts a new search: every cell reads as unset, every slot goes back to the pool.
    pub fn next_search(&mut self) {
        self.search = self.search.wrapping_add(1);
        if self.search == 0 {
            // After 2³² searches the stamps would repeat: start over.
            self.table.iter_mut().for_each(|t| *t = (0, 0));
            self.slots.iter_mut().for_each(|s| s.1.iter_mut().for_each(|x| *x = 0));
            self.search = 1;
        }
        self.lent = 0;
    }

    /// The value of cell `(x, y)` in this search, if it was set.
    #[inline]
    pub fn get(&self, x: usize, y: usize) -> Option<T> {
        let (p, o) = self.geom.locate_xy(x, y);
        let (s, slot) = self.table[p];
        if s != self.search {
            return None;
        }
        let (vals, stamps) = &self.slots[slot as usize];
        (stamps[o] == self.search).then(|| vals[o])
    }

    /// The value of cell `(x, y)`, or the fill value when unset.
    #[inline]
    pub fn value(&self, x: usize, y: usize) -> T {
        self.get(x, y).unwrap_or(self.fill)
    }

    /// Sets cell `(x, y)` for this search; false (and nothing set) when that would lend
    /// the search more than [`MAX_PAGES_LENT`] pages.
    #[inline]
    #[must_use]
    pub fn set(&mut self, x: usize, y: usize, v: T) -> bool {
        let (p, o) = self.geom.locate_xy(x, y);
        let (s, slot) = self.table[p];
        let slot = if s == self.search {
            slot as usize
        } else {
            if self.lent == MAX_PAGES_LENT {
                return false;
            }
            if self.lent == self.slots.len() {
                self.slots.push((vec![self.fill; CELLS].into_boxed_slice(), vec![0; CELLS].into_boxed_slice()));
            }
            self.lent += 1;
            self.table[p] = (self.search, (self.lent - 1) as u32);
            self.lent - 1
        };
        let (vals, stamps) = &mut self.slots[slot];
        vals[o] = v;
        stamps[o] = self.search;
        true
    }

    /// Pages held in the pool (the most one search has needed).
    pub fn pages_held(&self) -> usize {
        self.slots.len()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn uniform_pages_become_dense_only_when_a_value_differs() {
        let g = PageGeom::of(200, 130);
        assert_eq!((g.px, g.py), (4, 3));
        let mut c = PagedCells::new(g, 0u32);
        c.set(5, 0);
        assert_eq!(c.dense_cells(), 0);
        c.set(130 * 200 - 1, 7);
        assert_eq!(c.dense_cells(), CELLS);
        assert_eq!(c.get(130 * 200 - 1), 7);
        assert_eq!(c.get_xy(199, 129), 7);
        assert_eq!(c.get(130 * 200 - 2), 0);
        // Every cell addresses its own place: write all, read all back.
        let mut all = PagedCells::new(g, 0u32);
        for i in 0..200 * 130 {
            all.set(i, i as u32 + 1);
        }
        assert!((0..200 * 130).all(|i| all.get(i) == i as u32 + 1));
    }

    #[test]
    fn copies_share_pages_until_written_and_alike_pages_compact() {
        let g = PageGeom::of(128, 64);
        let mut a = PagedCells::new(g, 0u8);
        for i in 0..64 * 128 {
            a.set(i, if i % 128 < 64 { 1 } else { 2 });
        }
        a.set(0, 3);
        let mut b = a.clone();
        assert_eq!(b.own_dense_cells(), 0, "a copy shares every page");
        b.set(1, 4);
        assert_eq!((a.get(1), b.get(1)), (1, 4), "writing a copy leaves the original alone");
        assert_eq!(b.own_dense_cells(), CELLS);
        b.set(0, 1);
        b.set(1, 1);
        b.compact();
        assert_eq!(b.dense_cells(), 0, "both pages are now alike inside");
        assert_eq!((b.get(0), b.get(127)), (1, 2));
        assert_eq!(a.get(0), 3);
    }

    /// A rectangle fill sets the cells inside and no other, as setting them one by one
    /// does; the pages it covers (up to the grid's ragged last row and column of pages)
    /// stay one value each, the pages it cuts get arrays.
    #[test]
    fn a_rectangle_fills_whole_pages_as_one_value() {
        let g = PageGeom::of(200, 130);
        let mut filled = PagedCells::new(g, 0u32);
        let mut cells = PagedCells::new(g, 0u32);
        filled.fill_rect(64, 0, 199, 129, 7);
        filled.fill_rect(10, 20, 30, 40, 3);
        for y in 0..130 {
            for x in 0..200 {
                let v = if (64..=199).contains(&x) { 7 } else if (10..=30).contains(&x) && (20..=40).contains(&y) { 3 } else { 0 };
                cells.set(y * 200 + x, v);
            }
        }
        assert!((0..200 * 130).all(|i| filled.get(i) == cells.get(i)));
        // Pages 1-3 of each of the three page rows are covered; only page 0 of row 0 is cut.
        assert_eq!(filled.dense_cells(), CELLS);
        filled.fill_rect(0, 0, 500, 500, 1);
        assert_eq!(filled.dense_cells(), 0, "clamped to the grid, every page covered");
        assert!((0..200 * 130).all(|i| filled.get(i) == 1));
    }

    /// A run across page borders does what setting its cells one by one does, leaves a
    /// copy sharing the pages alone, and keeps a page uniform when nothing in it changes.
    #[test]
    fn a_run_updates_as_its_cells_one_by_one_would() {
        let g = PageGeom::of(200, 130);
        let mut runs = PagedCells::new(g, 0u32);
        let mut cells = PagedCells::new(g, 0u32);
        let shared = {
            runs.update_run(70, 30, 150, |v| v + 1);
            runs.clone()
        };
        for x in 30..=150 {
            cells.set(70 * 200 + x, 1);
        }
        // Pages of rows 64-127: a run over three of them, another within one.
        runs.update_run(70, 10, 199, |v| if v == 1 { 9 } else { 5 });
        runs.update_run(127, 64, 127, |v| v + 2);
        for x in 10..=199 {
            let i = 70 * 200 + x;
            cells.set(i, if cells.get(i) == 1 { 9 } else { 5 });
        }
        for x in 64..=127 {
            cells.set(127 * 200 + x, 2);
        }
        assert!((0..200 * 130).all(|i| runs.get(i) == cells.get(i)));
        assert!((30..=150).all(|x| shared.get(70 * 200 + x) == 1), "the copy keeps its values");
        assert_eq!(shared.get(70 * 200 + 10), 0);
        let before = runs.dense_cells();
        runs.update_run(3, 0, 199, |v| v);
        assert_eq!(runs.dense_cells(), before, "a run that changes nothing leaves uniform pages uniform");
    }

    #[test]
    fn scratch_forgets_earlier_searches_and_reuses_its_pages() {
        let g = PageGeom::of(1000, 1000);
        let mut s = Scratch::new(g, 0.0f32);
        assert!(s.set(10, 10, 1.0) && s.set(900, 900, 2.0));
        assert_eq!(s.get(10, 10), Some(1.0));
        assert_eq!(s.get(11, 10), None);
        assert_eq!(s.value(11, 10), 0.0);
        assert_eq!(s.pages_held(), 2);
        s.next_search();
        assert_eq!(s.get(10, 10), None);
        assert_eq!(s.get(900, 900), None);
        assert!(s.set(500, 500, 3.0));
        assert_eq!(s.get(500, 500), Some(3.0));
        assert_eq!(s.pages_held(), 2, "pages of the last search are lent again");
    }

    /// A search is lent at most MAX_PAGES_LENT pages: the next page is refused and
    /// nothing is set; pages already lent still take values; the next search starts over.
    #[test]
    fn a_search_is_lent_at_most_its_budget_of_pages() {
        let side = SIDE * 64;
        let g = PageGeom::of(side, side);
        assert!(g.pages() > MAX_PAGES_LENT);
        let mut s = Scratch::new(g, 0u8);
        for p in 0..MAX_PAGES_LENT {
            assert!(s.set((p % 64) * SIDE, (p / 64) * SIDE, 1), "page {p}");
        }
        let beyond = (MAX_PAGES_LENT % 64 * SIDE, MAX_PAGES_LENT / 64 * SIDE);
        assert!(!s.set(beyond.0, beyond.1, 1));
        assert_eq!(s.get(beyond.0, beyond.1), None);
        assert!(s.set(1, 0, 2), "a page already lent takes more values");
        assert_eq!(s.pages_held(), MAX_PAGES_LENT);
        s.next_search();
        assert!(s.set(beyond.0, beyond.1, 1));
    }
}
