//! The open list of the grid and tile searches: a priority queue of packed entries
//! ([`super::search::Open`]), lowest first, kept between searches so that a search
//! neither allocates it nor grows it again.
//!
//! A four-ary heap (Johnson, 1975) in place of the standard library's binary one: half as
//! deep, so a push climbs half as many levels, and the four children of a node lie side by
//! side in memory. The entries are whole keys — cost and node packed in one integer — so
//! any correct priority queue pops them in the one order the keys give (two equal entries
//! are the same entry): a search takes the same path with either heap.

use super::search::Open;

/// Children per node.
const ARITY: usize = 4;

/// A min-heap of open-list entries, reused from search to search.
#[derive(Default, Clone)]
pub(crate) struct OpenList {
    keys: Vec<u64>,
}

impl OpenList {
    /// An empty list.
    pub fn new() -> OpenList {
        OpenList::default()
    }

    /// Empties the list, keeping its memory for the next search.
    pub fn clear(&mut self) {
        self.keys.clear();
    }

    /// Entries held.
    pub fn len(&self) -> usize {
        self.keys.len()
    }

    /// Adds an entry.
    #[inline]
    pub fn push(&mut self, entry: Open) {
        let key = entry.key();
        let mut i = self.keys.len();
        self.keys.push(key);
        while i > 0 {
            let parent = (i - 1) / ARITY;
            if self.keys[parent] <= key {
                break;
            }
            self.keys[i] = self.keys[parent];
            i = parent;
        }
        self.keys[i] = key;
    }

    /// Adds an entry without ordering the list: after one or more of these, call
    /// [`OpenList::order`] before the next [`OpenList::push`] or [`OpenList::pop`].
    /// A search starts from thousands of sources (a common's whole tree): laid down
    /// unordered and ordered once (Floyd, 1964), they cost a few steps each instead of a
    /// climb up the heap per push. Pops come out as they would after pushes (see the
    /// module comment: the keys alone decide the order).
    #[inline]
    pub fn push_unordered(&mut self, entry: Open) {
        self.keys.push(entry.key());
    }

    /// Makes the list a heap again after [`OpenList::push_unordered`]: each node from
    /// the last parent up to the root sinks to where its children are all above it.
    pub fn order(&mut self) {
        let n = self.keys.len();
        if n < 2 {
            return;
        }
        for start in (0..=(n - 2) / ARITY).rev() {
            self.sink(start);
        }
    }

    /// Moves the entry at `i` down until its children are all above it.
    #[inline]
    fn sink(&mut self, mut i: usize) {
        let n = self.keys.len();
        let key = self.keys[i];
        loop {
            let first = ARITY * i + 1;
            if first >= n {
                break;
            }
            let end = (first + ARITY).min(n);
            let mut least = first;
            for c in first + 1..end {
                if self.keys[c] < self.keys[least] {
                    least = c;
                }
            }
            if self.keys[least] >= key {
                break;
            }
            self.keys[i] = self.keys[least];
            i = least;
        }
        self.keys[i] = key;
    }

    /// The lowest entry, left in the list.
    #[inline]
    pub fn peek(&self) -> Option<Open> {
        self.keys.first().map(|&k| Open::from_key(k))
    }

    /// Takes the lowest entry.
    #[inline]
    pub fn pop(&mut self) -> Option<Open> {
        let last = self.keys.pop()?;
        let n = self.keys.len();
        if n == 0 {
            return Some(Open::from_key(last));
        }
        let top = self.keys[0];
        // The last entry sinks from the root to where its children are all above it.
        self.keys[0] = last;
        self.sink(0);
        Some(Open::from_key(top))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::collections::BinaryHeap;

    /// Against the standard library's binary heap (a reader outside this module): the
    /// same entries, pushed and popped in the same interleaving — bursts of pushes, runs
    /// of pops, repeated entries, ties in cost — come out in the same order. Fails when
    /// the sift-down compares only the first child, or stops a level early (both tried).
    #[test]
    fn pops_as_the_standard_heap_does() {
        let mut ours = OpenList::new();
        let mut std_heap: BinaryHeap<Open> = BinaryHeap::new();
        // A small linear congruential sequence: deterministic, varied.
        let mut state: u64 = 0x2545_f491_4f6c_dd1d;
        let mut next = || {
            state = state.wrapping_mul(6_364_136_223_846_793_005).wrapping_add(1_442_695_040_888_963_407);
            (state >> 33) as u32
        };
        let (mut popped_ours, mut popped_std) = (Vec::new(), Vec::new());
        for round in 0..400 {
            for _ in 0..(next() % 9) {
                // Few distinct costs and cells, so ties and repeated entries are common.
                let e = Open::new((next() % 40) as f32 * 0.5, next() % 64);
                ours.push(e);
                std_heap.push(e);
            }
            for _ in 0..(next() % 7 + round % 2) {
                popped_ours.push(ours.pop().map(|e| (e.f(), e.cell())));
                popped_std.push(std_heap.pop().map(|e| (e.f(), e.cell())));
            }
            assert_eq!(ours.len(), std_heap.len());
        }
        while let Some(e) = std_heap.pop() {
            popped_std.push(Some((e.f(), e.cell())));
            popped_ours.push(ours.pop().map(|e| (e.f(), e.cell())));
        }
        assert_eq!(ours.len(), 0);
        assert!(popped_std.len() > 500, "the sequence exercised the heap");
        assert_eq!(popped_ours, popped_std);
    }

    /// Entries laid down unordered and ordered once pop as the standard heap pops the
    /// same entries pushed one by one, for every size from empty to a few levels deep
    /// (a heap of four-ary nodes changes shape at 1, 5, 21, 85 entries), and pushes and
    /// pops after the ordering keep that order. Fails when the ordering starts below the
    /// last parent or sinks a node only one level.
    #[test]
    fn unordered_then_ordered_pops_as_pushed_one_by_one() {
        let mut state: u64 = 0x9e37_79b9_7f4a_7c15;
        let mut next = || {
            state = state.wrapping_mul(6_364_136_223_846_793_005).wrapping_add(1_442_695_040_888_963_407);
            (state >> 33) as u32
        };
        for size in 0..120 {
            let mut ours = OpenList::new();
            let mut std_heap: BinaryHeap<Open> = BinaryHeap::new();
            for _ in 0..size {
                let e = Open::new((next() % 50) as f32 * 0.25, next() % 97);
                ours.push_unordered(e);
                std_heap.push(e);
            }
            ours.order();
            for _ in 0..size / 3 {
                let e = Open::new((next() % 50) as f32 * 0.25, next() % 97);
                ours.push(e);
                std_heap.push(e);
            }
            let mut popped = Vec::new();
            while let Some(e) = ours.pop() {
                popped.push((e.f(), e.cell()));
            }
            let expected: Vec<(f32, u32)> = std::iter::from_fn(|| std_heap.pop()).map(|e| (e.f(), e.cell())).collect();
            assert_eq!(popped, expected, "{size} entries");
        }
    }
}
