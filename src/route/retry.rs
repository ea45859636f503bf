//! Rip-up and retry: route every net in an order; when some are stuck, rip everything up
//! and route the stuck ones first next time; keep the attempt with the fewest findings.

use crate::finding::Finding;

/// What one attempt gives: its result, the nets (indices) that were stuck, its findings.
pub type Attempt<T> = (T, Vec<usize>, Vec<Finding>);

/// Runs `attempt` up to `rounds` times starting from `order`, moving the stuck nets to the
/// front each time, and stops early when that gives an order already tried (the same
/// order routes the same way again); returns the result with the fewest findings (the
/// first on ties), or `None` when `rounds` is 0.
pub fn rip_up_and_retry<T>(order: Vec<usize>, rounds: usize, attempt: impl FnMut(&[usize]) -> Attempt<T>) -> Option<(T, Vec<Finding>)> {
    rip_up_and_retry_arranged(order, rounds, |_| {}, attempt)
}

/// As [`rip_up_and_retry`], with `arrange` putting the stuck nets of a round in the order
/// they lead the next one.
pub fn rip_up_and_retry_arranged<T>(
    mut order: Vec<usize>,
    rounds: usize,
    arrange: impl Fn(&mut Vec<usize>),
    mut attempt: impl FnMut(&[usize]) -> Attempt<T>,
) -> Option<(T, Vec<Finding>)> {
    let mut best: Option<(T, Vec<Finding>)> = None;
    let mut tried: Vec<Vec<usize>> = Vec::new();
    for _ in 0..rounds {
        if tried.contains(&order) {
            break;
        }
        tried.push(order.clone());
        let (result, failed, notes) = attempt(&order);
        if best.as_ref().is_none_or(|(_, f)| notes.len() < f.len()) {
            best = Some((result, notes));
        }
        if failed.is_empty() {
            break;
        }
        order.retain(|i| !failed.contains(i));
        let mut next = failed;
        arrange(&mut next);
        next.extend(order);
        order = next;
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The finding of net `n` stuck.
    fn stuck(n: usize) -> Finding {
        Finding {
            rule: crate::finding::Rule::Unroutable,
            severity: crate::finding::Severity::Error,
            plate: None,
            nets: vec![format!("N{n}")],
            location: crate::geom::pt(0.0, 0.0),
            measured: None,
            required: None,
            message: "stuck".into(),
        }
    }

    /// Net 2 fails unless it goes first: the second round puts it first and succeeds.
    #[test]
    fn stuck_nets_go_first_next_time() {
        let mut orders = Vec::new();
        let r = rip_up_and_retry(vec![0, 1, 2], 5, |order| {
            orders.push(order.to_vec());
            let failed = if order[0] == 2 { vec![] } else { vec![2] };
            let notes = failed.iter().map(|&n| stuck(n)).collect();
            (order.to_vec(), failed, notes)
        });
        assert_eq!(orders, [vec![0, 1, 2], vec![2, 0, 1]]);
        assert_eq!(r.unwrap().0, vec![2, 0, 1]);
    }

    /// The stuck nets lead the next round in the order `arrange` gives them: here the
    /// higher-numbered first, which is the only order that succeeds.
    #[test]
    fn stuck_nets_lead_in_the_arranged_order() {
        let mut orders = Vec::new();
        let r = rip_up_and_retry_arranged(vec![0, 1, 2], 5, |s| s.sort_unstable_by(|a, b| b.cmp(a)), |order| {
            orders.push(order.to_vec());
            let failed: Vec<usize> = if order[..2] == [2, 1] { vec![] } else { vec![1, 2] };
            let notes = failed.iter().map(|&n| stuck(n)).collect();
            (order.to_vec(), failed, notes)
        });
        assert_eq!(orders, [vec![0, 1, 2], vec![2, 1, 0]]);
        assert_eq!(r.unwrap().0, vec![2, 1, 0]);
    }

    /// Two nets that each get stuck when the other goes first send the order back and
    /// forth: the third round would repeat the first, so it is not run.
    #[test]
    fn an_order_already_tried_is_not_run_again() {
        let mut orders = Vec::new();
        let r = rip_up_and_retry(vec![0, 1], 5, |order| {
            orders.push(order.to_vec());
            let last = order[1];
            (order.to_vec(), vec![last], vec![stuck(last)])
        });
        assert_eq!(orders, [vec![0, 1], vec![1, 0]]);
        assert_eq!(r.unwrap().0, vec![0, 1], "the first of equal results is kept");
    }
}
