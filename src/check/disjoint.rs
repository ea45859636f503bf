//! Disjoint sets (union–find with path halving and union by size; Tarjan 1975), used to
//! group touching shapes into components and neighbouring hits into one finding.

/// A partition of `0..n` into disjoint sets.
#[derive(Debug, Clone)]
pub struct DisjointSets {
    parent: Vec<usize>,
    size: Vec<usize>,
}

impl DisjointSets {
    /// `n` singleton sets.
    pub fn new(n: usize) -> Self {
        DisjointSets { parent: (0..n).collect(), size: vec![1; n] }
    }

    /// The representative of `x`'s set.
    pub fn find(&mut self, mut x: usize) -> usize {
        while self.parent[x] != x {
            self.parent[x] = self.parent[self.parent[x]];
            x = self.parent[x];
        }
        x
    }

    /// Joins the sets of `a` and `b`; returns the new representative.
    pub fn union(&mut self, a: usize, b: usize) -> usize {
        let (mut ra, mut rb) = (self.find(a), self.find(b));
        if ra == rb {
            return ra;
        }
        if self.size[ra] < self.size[rb] {
            std::mem::swap(&mut ra, &mut rb);
        }
        self.parent[rb] = ra;
        self.size[ra] += self.size[rb];
        ra
    }

    /// Numbers the sets 0, 1, … in order of their smallest member; gives each element's
    /// set number and the number of sets.
    pub fn labels(&mut self) -> (Vec<usize>, usize) {
        let n = self.parent.len();
        let mut label_of_root = vec![usize::MAX; n];
        let mut labels = vec![0; n];
        let mut count = 0;
        for (x, label) in labels.iter_mut().enumerate() {
            let r = self.find(x);
            if label_of_root[r] == usize::MAX {
                label_of_root[r] = count;
                count += 1;
            }
            *label = label_of_root[r];
        }
        (labels, count)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Union–find invariant (Tarjan 1975): after union(3, 4) and union(1, 3), 1, 3 and 4
    /// share a set; labels follow the smallest member.
    #[test]
    fn unions_are_transitive_and_labels_ordered() {
        let mut s = DisjointSets::new(5);
        s.union(3, 4);
        s.union(1, 3);
        let (labels, count) = s.labels();
        assert_eq!(count, 3);
        assert_eq!(labels, vec![0, 1, 2, 1, 1]);
    }
}
