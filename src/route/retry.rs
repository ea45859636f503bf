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

/// Runs `attempt` on `guess` first and keeps its result when no net is stuck and
/// `accept` takes it; otherwise the rounds of [`rip_up_and_retry_arranged`] run from
/// `order` exactly as without the guess (none is skipped for being the guess), and their
/// result is kept unless the guess left strictly fewer findings. A guess that often
/// routes at once saves the rounds; one that fails costs one attempt and never a layout
/// that the rounds from `order` route, nor the report they give.
pub fn guess_then_retry<T>(
    guess: Vec<usize>,
    order: Vec<usize>,
    rounds: usize,
    arrange: impl Fn(&mut Vec<usize>),
    accept: impl Fn(&T) -> bool,
    mut attempt: impl FnMut(&[usize]) -> Attempt<T>,
) -> Option<(T, Vec<Finding>)> {
    if guess == order || rounds == 0 {
        return rip_up_and_retry_arranged(order, rounds, arrange, attempt);
    }
    let (result, failed, notes) = attempt(&guess);
    if failed.is_empty() && accept(&result) {
        return Some((result, notes));
    }
    match rip_up_and_retry_arranged(order, rounds, arrange, attempt) {
        Some((r, n)) if n.len() <= notes.len() => Some((r, n)),
        _ => Some((result, notes)),
    }
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

    /// A guess that routes is the only attempt; one that leaves a net stuck is followed by
    /// the rounds from the given order as if there had been no guess.
    #[test]
    fn a_guess_goes_first_and_the_rounds_only_when_it_fails() {
        let mut orders = Vec::new();
        let r = guess_then_retry(vec![2, 1, 0], vec![0, 1, 2], 5, |_| {}, |_| true, |order| {
            orders.push(order.to_vec());
            (order.to_vec(), vec![], vec![])
        });
        assert_eq!(orders, [vec![2, 1, 0]]);
        assert_eq!(r.unwrap().0, vec![2, 1, 0]);
        // Net 2 fails unless first, net 1 fails when last: the guess [0, 2, 1] leaves both
        // stuck, and the rounds from [0, 1, 2] run all four until [2, 1, 0] routes.
        let mut orders = Vec::new();
        let r = guess_then_retry(vec![0, 2, 1], vec![0, 1, 2], 5, |_| {}, |_| true, |order| {
            orders.push(order.to_vec());
            let mut failed = Vec::new();
            if order[0] != 2 {
                failed.push(2);
            }
            if order[2] == 1 {
                failed.push(1);
            }
            let notes = failed.iter().map(|&n| stuck(n)).collect();
            (order.to_vec(), failed, notes)
        });
        assert_eq!(orders, [vec![0, 2, 1], vec![0, 1, 2], vec![2, 0, 1], vec![1, 2, 0], vec![2, 1, 0]]);
        let (best, notes) = r.unwrap();
        assert_eq!((best, notes.len()), (vec![2, 1, 0], 0));
    }

    /// A guess equal to the order is not run twice.
    #[test]
    fn a_guess_equal_to_the_order_runs_once() {
        let mut runs = 0;
        guess_then_retry(vec![0, 1], vec![0, 1], 5, |_| {}, |_| true, |order| {
            runs += 1;
            (order.to_vec(), vec![], vec![])
        });
        assert_eq!(runs, 1);
    }

    /// A guess that routes but that `accept` refuses gives way to the rounds; when both
    /// leave the same number of findings, the rounds' result is kept.
    #[test]
    fn a_refused_or_tied_guess_gives_way_to_the_rounds() {
        let mut orders = Vec::new();
        let r = guess_then_retry(vec![1, 0], vec![0, 1], 5, |_| {}, |o: &Vec<usize>| o[0] == 0, |order| {
            orders.push(order.to_vec());
            (order.to_vec(), vec![], vec![])
        });
        assert_eq!(orders, [vec![1, 0], vec![0, 1]]);
        assert_eq!(r.unwrap().0, vec![0, 1]);
        // Net 1 is stuck in every order: one finding each; the rounds' first is kept.
        let r = guess_then_retry(vec![1, 0], vec![0, 1], 5, |_| {}, |_| true, |order| (order.to_vec(), vec![1], vec![stuck(1)]));
        assert_eq!(r.unwrap().0, vec![0, 1]);
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
