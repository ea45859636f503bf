//! One finding per cause: an `open` the check finds where the router has already said why
//! the net is cut off is folded into the router's `unroutable` finding.
//!
//! Takes the generation findings and the check findings; gives the same list with every
//! such `open` removed and counted in the message of the `unroutable` finding it
//! confirms. A stuck part of a common used to give two errors for one cause — the
//! router's "cannot reach its transfer dot" and the check's "a piece … is cut off from
//! its pad" — and a layout with a few blocked places printed dozens. The check still
//! derives every open from the artwork: an open the router did not explain (no
//! `unroutable` finding of that net) stays on its own.

use crate::finding::{Finding, Rule};
use crate::geom::dist;

/// Folds each `open` of a net into the nearest `unroutable` finding naming that net
/// first, on the same plate or on none.
pub fn fold_opens_into_causes(findings: Vec<Finding>) -> Vec<Finding> {
    let mut out: Vec<Finding> = Vec::with_capacity(findings.len());
    let mut confirmed: Vec<usize> = Vec::new();
    let causes: Vec<usize> = (0..findings.len()).filter(|&i| findings[i].rule == Rule::Unroutable).collect();
    let mut folded = vec![0usize; findings.len()];
    for (i, f) in findings.iter().enumerate() {
        if f.rule != Rule::Open {
            continue;
        }
        let net = f.nets.first();
        let cause = causes
            .iter()
            .copied()
            .filter(|&c| findings[c].nets.first() == net && (findings[c].plate.is_none() || f.plate.is_none() || findings[c].plate == f.plate))
            .min_by(|&a, &b| dist(findings[a].location, f.location).total_cmp(&dist(findings[b].location, f.location)));
        if let Some(c) = cause {
            folded[c] += 1;
            confirmed.push(i);
        }
    }
    for (i, mut f) in findings.into_iter().enumerate() {
        if confirmed.contains(&i) {
            continue;
        }
        if folded[i] > 0 {
            let pieces = if folded[i] == 1 { "1 piece".to_string() } else { format!("{} pieces", folded[i]) };
            f.message = format!("{} (the check confirms: {pieces} of {} cut off from its pad)", f.message, f.nets[0]);
        }
        out.push(f);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::finding::Severity;
    use crate::geom::pt;
    use crate::layout::PlateId;

    fn finding(rule: Rule, net: &str, x: f64) -> Finding {
        Finding {
            rule,
            severity: Severity::Error,
            plate: Some(PlateId::Back),
            nets: vec![net.into()],
            location: pt(x, 0.0),
            measured: None,
            required: None,
            message: format!("{net} at {x}"),
        }
    }

    /// Two stuck islands of COM2 and the check's two opens of COM2 give two findings, each
    /// confirmed once; the open of COM3, which no router finding explains, stays.
    #[test]
    fn opens_fold_into_the_nearest_cause_of_their_net() {
        let f = vec![
            finding(Rule::Unroutable, "COM2", 1.0),
            finding(Rule::Unroutable, "COM2", 9.0),
            finding(Rule::Open, "COM2", 1.2),
            finding(Rule::Open, "COM2", 8.7),
            finding(Rule::Open, "COM3", 5.0),
        ];
        let out = fold_opens_into_causes(f);
        assert_eq!(out.len(), 3);
        assert!(out[0].message.ends_with("(the check confirms: 1 piece of COM2 cut off from its pad)"), "{}", out[0].message);
        assert!(out[1].message.contains("1 piece"));
        assert_eq!((out[2].rule, out[2].nets[0].as_str()), (Rule::Open, "COM3"));
    }
}
