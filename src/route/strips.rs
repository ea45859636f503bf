//! Strips: the glass divided along the pad side into parts whose nets can be routed apart.
//!
//! Takes, per net, the span its pieces cover along the pad side; gives strips, each a
//! range along the side and the nets wholly inside it, cut only where no net's pieces
//! (grown by a clearance) lie. Escape leads run from their pieces across the glass to the
//! seal band, seldom sideways, so the nets of one strip do not need the room of another:
//! each strip is routed on its own grid, walled off at its ends, and the strips are
//! routed at once on the cores. Whether a layout is divided, and where, depends on the
//! layout only, never on how many cores there are, so the leads come out the same on
//! every machine.

/// A strip of the glass along the pad side and the nets inside it.
#[derive(Debug, Clone, PartialEq)]
pub struct Strip {
    /// Where the strip starts along the side (`f64::NEG_INFINITY` for the first).
    pub lo: f64,
    /// Where it ends (`f64::INFINITY` for the last).
    pub hi: f64,
    /// The nets (indices into the spans given) wholly inside it, in index order.
    pub nets: Vec<usize>,
}

/// Divides the nets whose pieces span `spans` (lo ≤ hi, along the pad side) into strips,
/// halving at most `halvings` times down each side while both halves keep at least
/// `least` nets: each cut lies midway in a gap between the spans grown by `clearance` on
/// each side, the one that balances the two halves best. One strip when there is no
/// such gap.
pub fn divide(spans: &[(f64, f64)], clearance: f64, least: usize, halvings: u32) -> Vec<Strip> {
    // Clusters of spans that overlap once grown, in order along the side: (lo, hi, nets).
    let mut order: Vec<usize> = (0..spans.len()).collect();
    order.sort_by(|&a, &b| spans[a].0.total_cmp(&spans[b].0).then(a.cmp(&b)));
    let mut clusters: Vec<(f64, f64, Vec<usize>)> = Vec::new();
    for i in order {
        let (lo, hi) = (spans[i].0 - clearance, spans[i].1 + clearance);
        match clusters.last_mut() {
            Some(c) if lo <= c.1 => {
                c.1 = c.1.max(hi);
                c.2.push(i);
            }
            _ => clusters.push((lo, hi, vec![i])),
        }
    }
    let mut out = Vec::new();
    halve(&clusters, f64::NEG_INFINITY, f64::INFINITY, least, halvings, &mut out);
    out
}

/// Divides clusters `c` (lying between `lo` and `hi`) into strips appended to `out`.
fn halve(c: &[(f64, f64, Vec<usize>)], lo: f64, hi: f64, least: usize, halvings: u32, out: &mut Vec<Strip>) {
    let total: usize = c.iter().map(|k| k.2.len()).sum();
    let mut before = 0;
    let mut best: Option<(usize, usize)> = None;
    for k in (1..c.len()).filter(|_| halvings > 0) {
        before += c[k - 1].2.len();
        let after = total - before;
        if before < least || after < least {
            continue;
        }
        let off = before.abs_diff(after);
        if best.is_none_or(|(_, b)| off < b) {
            best = Some((k, off));
        }
    }
    match best {
        Some((k, _)) => {
            let cut = (c[k - 1].1 + c[k].0) / 2.0;
            halve(&c[..k], lo, cut, least, halvings - 1, out);
            halve(&c[k..], cut, hi, least, halvings - 1, out);
        }
        None => {
            let mut nets: Vec<usize> = c.iter().flat_map(|k| k.2.iter().copied()).collect();
            nets.sort_unstable();
            out.push(Strip { lo, hi, nets });
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Eight nets in four pairs 10 apart, each pair 2 wide: cut midway between pairs,
    /// into halves of four then quarters of two.
    #[test]
    fn cuts_midway_between_groups_into_balanced_halves() {
        let spans: Vec<(f64, f64)> = (0..8).map(|i| ((i / 2) as f64 * 10.0, (i / 2) as f64 * 10.0 + 2.0)).collect();
        let s = divide(&spans, 1.0, 4, 8);
        assert_eq!(s.len(), 2);
        assert_eq!((s[0].lo, s[0].hi, s[0].nets.clone()), (f64::NEG_INFINITY, 16.0, vec![0, 1, 2, 3]));
        assert_eq!((s[1].lo, s[1].hi, s[1].nets.clone()), (16.0, f64::INFINITY, vec![4, 5, 6, 7]));
        assert_eq!(divide(&spans, 1.0, 2, 1), s, "one halving");
        let q = divide(&spans, 1.0, 2, 8);
        assert_eq!(q.iter().map(|s| s.nets.clone()).collect::<Vec<_>>(), [vec![0, 1], vec![2, 3], vec![4, 5], vec![6, 7]]);
        assert_eq!(q[1].lo, 6.0);
        assert_eq!(q[1].hi, 16.0);
    }

    /// A net spanning the whole glass (a bus) leaves no gap: one strip of every net.
    #[test]
    fn a_net_across_everything_keeps_one_strip() {
        let mut spans: Vec<(f64, f64)> = (0..8).map(|i| (i as f64 * 10.0, i as f64 * 10.0 + 2.0)).collect();
        spans.push((0.0, 72.0));
        let s = divide(&spans, 1.0, 2, 8);
        assert_eq!(s, [Strip { lo: f64::NEG_INFINITY, hi: f64::INFINITY, nets: (0..9).collect() }]);
    }

    /// Gaps narrower than twice the clearance are no place to cut; a half that would hold
    /// fewer than `least` nets is not cut off.
    #[test]
    fn narrow_gaps_and_small_halves_stay_whole() {
        let spans = [(0.0, 2.0), (3.0, 5.0), (6.0, 8.0), (9.0, 11.0)];
        assert_eq!(divide(&spans, 0.6, 1, 8).len(), 1, "gaps of 1 against 1.2 of clearance");
        assert_eq!(divide(&spans, 0.4, 1, 8).len(), 4);
        assert_eq!(divide(&spans, 0.4, 1, 0).len(), 1, "no halving");
        assert_eq!(divide(&spans, 0.4, 3, 8).len(), 1, "3 + 1 or 1 + 3 nets");
    }
}
