//! The delay the plan gives every line (`plan.electrical.lines[].rc_us` of the report,
//! docs/outputs.md), read from each demo's report built by the real CLI, against the
//! bounds an RC tree's Elmore delay obeys (W. C. Elmore, J. Appl. Phys. 19, 55, 1948;
//! the bounds as J. Rubinstein, P. Penfield and M. A. Horowitz give them for RC trees,
//! IEEE Trans. CAD 2, 202, 1983 — from memory): the delay to any node is at most the
//! resistance of the way to it times the whole capacitance, and no way holds more
//! resistance than every branch together.

use crate::demo_build::{build_demo, demo_names};

fn lines(name: &str) -> Vec<serde_json::Value> {
    let (_scratch, out) = build_demo(name);
    let text = std::fs::read_to_string(out.join(format!("{name}.report.json"))).unwrap();
    let report: serde_json::Value = serde_json::from_str(&text).unwrap();
    report["plan"]["electrical"]["lines"].as_array().expect("the plan's lines").clone()
}

fn num(line: &serde_json::Value, key: &str) -> f64 {
    line[key].as_f64().unwrap_or_else(|| panic!("{key} in {line}"))
}

/// On every demo, each line's way holds no more squares than all its branches, and its
/// delay is at most the way's resistance times the line's capacitance (the report rounds
/// each figure, hence the small allowance).
#[test]
fn every_line_keeps_to_the_bounds_of_an_rc_tree() {
    for name in demo_names() {
        for l in lines(&name) {
            let net = l["net"].as_str().unwrap();
            assert!(num(&l, "way_squares") <= num(&l, "lead_squares") + 0.01, "{name} {net}: {l}");
            let bound_us = num(&l, "way_resistance_ohm") * num(&l, "capacitance_on_pf") * 1e-6;
            assert!(num(&l, "rc_us") <= bound_us * 1.001 + 1e-3, "{name} {net}: delay {} µs over R_way·C = {bound_us} µs", num(&l, "rc_us"));
        }
    }
}

/// A common of a multiplexed row branches to a piece in every digit: its delay lies well
/// below the product of all its branches and its whole capacitance, the figure the plan
/// gave before (on the kiln demo's COM4 about 0.4 of it).
#[test]
fn a_branching_common_is_faster_than_all_its_branches_times_its_capacitance() {
    let ls = lines("kiln-controller");
    let ratios: Vec<(String, f64)> = ls
        .iter()
        .filter(|l| l["kind"] == "com")
        .map(|l| (l["net"].as_str().unwrap().to_string(), num(l, "rc_us") / (num(l, "lead_resistance_ohm") * num(l, "capacitance_on_pf") * 1e-6)))
        .collect();
    assert_eq!(ratios.len(), 4, "{ratios:?}");
    assert!(ratios.iter().any(|(_, r)| *r < 0.6), "no common's delay is below 0.6 of R_all·C: {ratios:?}");
    assert!(ratios.iter().all(|(_, r)| *r <= 1.001), "{ratios:?}");
}
