//! SEG lines being filled: which elements sit on a line and which commons it still has
//! free.

use crate::geom::Pt;

/// One SEG line under construction.
#[derive(Debug, Clone)]
pub struct Line {
    /// Elements on it (indices into the element list), with their COM.
    pub members: Vec<(usize, u32)>,
    /// SEG number fixed by hand (0-based), if any.
    pub fixed: Option<u32>,
    /// In the far tier (`tiers.rs`): only far elements join it.
    pub far: bool,
    /// A line of a digit template that keeps its free places free
    /// (`Template::lends_free_places`): no other element joins it.
    pub closed: bool,
    sum: (f64, f64),
}

impl Line {
    /// An empty line.
    pub fn new(fixed: Option<u32>) -> Line {
        Line { members: Vec::new(), fixed, far: false, closed: false, sum: (0.0, 0.0) }
    }

    /// True when common `com` has no element on this line yet.
    pub fn is_free(&self, com: u32) -> bool {
        !self.members.iter().any(|m| m.1 == com)
    }

    /// Puts element `e` (centre `at`) on the line with common `com`.
    pub fn add(&mut self, e: usize, com: u32, at: Pt) {
        self.members.push((e, com));
        self.sum.0 += at.x;
        self.sum.1 += at.y;
    }

    /// Mean centre of its elements (the origin when empty).
    pub fn centre(&self) -> Pt {
        let k = self.members.len().max(1) as f64;
        crate::geom::pt(self.sum.0 / k, self.sum.1 / k)
    }
}

/// The free common of a line nearest to the wanted one (ties to the lower index).
pub fn nearest_free(line: &Line, commons: u32, want: u32) -> Option<u32> {
    (0..commons).filter(|c| line.is_free(*c)).min_by_key(|c| (c.abs_diff(want), *c))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_line_offers_the_free_common_nearest_the_wanted_one() {
        let mut l = Line::new(None);
        l.add(0, 1, crate::geom::pt(0.0, 0.0));
        l.add(1, 2, crate::geom::pt(2.0, 4.0));
        assert_eq!(nearest_free(&l, 4, 2), Some(3));
        assert_eq!(nearest_free(&l, 4, 1), Some(0));
        assert_eq!(l.centre(), crate::geom::pt(1.0, 2.0));
        l.add(2, 0, crate::geom::pt(0.0, 0.0));
        l.add(3, 3, crate::geom::pt(0.0, 0.0));
        assert_eq!(nearest_free(&l, 4, 0), None);
    }
}
