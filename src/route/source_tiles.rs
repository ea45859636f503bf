//! The tiles a growing tree's coarse searches start from, held between searches in a
//! heap by the lowest bound known for each.
//!
//! A common grows its tree island by island, and each coarse search for the next island
//! starts from every tile of the tree (thousands on a large glass, about 160 searches per
//! common and attempt). Laid into the search's open list all at once, every tile was
//! looked up, bounded and heaped in every search, though a search takes only those whose
//! bound is below the cost of the way it finds: the two-row benchmark's tree growth laid
//! 1.05 M source tiles into its coarse searches, a quarter of its route stage. Here the
//! tiles wait in a heap of their own, keyed by a lower bound on the cost to the goal from
//! each (0 when added; the bound the search last knew after that, which only grows as
//! islands are joined), and [`super::corridor::Corridors`] takes each in only when the
//! open list reaches its key. Taken in at its exact starting key and in key order, a tile
//! is expanded when and as it would be had it been laid in at the start, so the search
//! finds the same corridor.
//!
//! Takes tile indices of a [`super::corridor::TileGeom`]; gives them back in key order.

use super::open_list::OpenList;
use super::search::Open;

/// The source tiles of one growing tree (see the module comment).
pub struct SourceTiles {
    /// Entries (lower bound, tile), one per source tile; while a search runs, the tiles
    /// it took out are in `taken` instead.
    waiting: OpenList,
    /// Per tile, whether it is a source.
    member: Vec<bool>,
    /// Tiles taken out during the current search, put back when it ends.
    taken: Vec<u32>,
}

impl SourceTiles {
    /// No sources, for a grid of `tiles` tiles.
    pub fn new(tiles: usize) -> SourceTiles {
        SourceTiles { waiting: OpenList::new(), member: vec![false; tiles], taken: Vec::new() }
    }

    /// Makes tile `t` a source (once; later calls change nothing) and says whether it
    /// was not one before. Its key is 0 until a search works out a bound for it.
    pub fn add(&mut self, t: usize) -> bool {
        let new = !self.member[t];
        if new {
            self.member[t] = true;
            self.waiting.push(Open::new(0.0, t as u32));
        }
        new
    }

    /// Whether tile `t` is a source.
    #[inline]
    pub fn contains(&self, t: usize) -> bool {
        self.member[t]
    }

    /// The waiting entry with the lowest key, if it is at most `limit` (a packed key,
    /// [`Open::key`]; `None` for no limit): taken out and noted as taken.
    pub(crate) fn take_up_to(&mut self, limit: Option<u64>) -> Option<Open> {
        let top = self.waiting.peek()?;
        if limit.is_some_and(|l| top.key() > l) {
            return None;
        }
        let top = self.waiting.pop()?;
        self.taken.push(top.cell());
        Some(top)
    }

    /// Puts tile `t`, just taken out, back under the higher key `bound`: its start is
    /// not due yet.
    pub(crate) fn defer(&mut self, t: usize, bound: f32) {
        debug_assert_eq!(self.taken.last(), Some(&(t as u32)));
        self.taken.pop();
        self.waiting.push(Open::new(bound, t as u32));
    }

    /// Ends a search: every tile taken out goes back under `bound` of it (the bound the
    /// search knows now, a lower one where it knows none).
    pub(crate) fn put_back(&mut self, bound: impl Fn(usize) -> f32) {
        for t in std::mem::take(&mut self.taken) {
            self.waiting.push(Open::new(bound(t as usize), t));
        }
    }

    /// Every source tile, each once, in increasing order.
    pub fn tiles(&self) -> impl Iterator<Item = usize> + '_ {
        self.member.iter().enumerate().filter(|(_, m)| **m).map(|(t, _)| t)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Tiles come out lowest key first, only up to the limit; a deferred tile comes out
    /// again under its new key; put back, the taken tiles wait again.
    #[test]
    fn tiles_come_out_by_key_up_to_the_limit() {
        let mut s = SourceTiles::new(10);
        let added: Vec<bool> = [7, 3, 3, 5].into_iter().map(|t| s.add(t)).collect();
        assert_eq!(added, [true, true, false, true]);
        assert_eq!(s.tiles().collect::<Vec<_>>(), [3, 5, 7], "each tile once");
        // All at key 0: by tile number.
        let first = s.take_up_to(None).unwrap();
        assert_eq!((first.f(), first.cell()), (0.0, 3));
        s.defer(3, 4.0);
        assert_eq!(s.take_up_to(Some(Open::new(2.0, 0).key())).unwrap().cell(), 5);
        assert_eq!(s.take_up_to(Some(Open::new(2.0, 0).key())).unwrap().cell(), 7);
        assert!(s.take_up_to(Some(Open::new(2.0, 0).key())).is_none(), "tile 3 now waits at 4");
        s.put_back(|t| t as f32);
        let order: Vec<(f32, u32)> = std::iter::from_fn(|| s.take_up_to(None)).map(|e| (e.f(), e.cell())).collect();
        assert_eq!(order, [(4.0, 3), (5.0, 5), (7.0, 7)], "each tile once");
    }
}
