//! Every position of a digit group routes: the multiplexed demos with all their elements
//! (digit groups, legends, icons) moved across the window in 0.5 mm steps either check
//! clean through the real binary or are refused as bad input with a located message
//! (`file:LINE: error in `key``, exit 2) — never an `unroutable` or `open` finding. Before
//! the pad row followed the leads, moving the rain-gauge demo's digits 0.5 mm sideways
//! made its fan-out one level too deep; earlier still, 1 mm gave 10–14 routing errors.

use std::path::{Path, PathBuf};
use std::process::Command;

/// The layout text with every `origin: [x, y]` and `at: [x, y]` moved by (dx, dy).
fn moved(text: &str, dx: f64, dy: f64) -> String {
    let mut out = String::new();
    for line in text.lines() {
        let mut rest = line;
        let mut new = String::new();
        while let Some(i) = ["origin: [", "at: ["].iter().filter_map(|k| rest.find(k).map(|i| i + k.len())).min() {
            let close = rest[i..].find(']').expect("a point closes") + i;
            let xy: Vec<f64> = rest[i..close].split(',').map(|v| v.trim().parse().expect("a number")).collect();
            new.push_str(&rest[..i]);
            new.push_str(&format!("{:.3}, {:.3}", xy[0] + dx, xy[1] + dy));
            rest = &rest[close..];
        }
        new.push_str(rest);
        out.push_str(&new);
        out.push('\n');
    }
    out
}

fn check_at(dir: &Path, demo: &str, dx: f64, dy: f64) -> Result<(), String> {
    let src = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("demo-layouts").join(format!("{demo}.yaml"));
    let text = moved(&std::fs::read_to_string(src).unwrap(), dx, dy);
    let path = dir.join(format!("{demo}.yaml"));
    std::fs::write(&path, text).unwrap();
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(&path).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    let clean = o.status.code() == Some(0) && err.contains(" 0 error(s)");
    let refused = o.status.code() == Some(2) && err.lines().any(|l| l.contains(&format!("{demo}.yaml:")) && l.contains(": error in `"));
    if err.contains("error[unroutable]") || err.contains("error[open]") || !(clean || refused) {
        return Err(format!("{demo} moved by ({dx}, {dy}) mm:\n{err}"));
    }
    Ok(())
}

fn sweep(demo: &str) {
    let dir = tempfile::tempdir().unwrap();
    let steps = |lo: i32, hi: i32| (lo..=hi).map(|k| k as f64 * 0.5);
    let failures: Vec<String> = steps(-4, 4)
        .map(|dx| (dx, 0.0))
        .chain(steps(-3, 3).filter(|dy| *dy != 0.0).map(|dy| (0.0, dy)))
        .filter_map(|(dx, dy)| check_at(dir.path(), demo, dx, dy).err())
        .collect();
    assert!(failures.is_empty(), "{} position(s) failed:\n{}", failures.len(), failures.join("\n"));
}

#[test]
fn kiln_controller_routes_at_every_position() {
    sweep("kiln-controller");
}

#[test]
fn rain_gauge_routes_at_every_position() {
    sweep("rain-gauge");
}

#[test]
fn darkroom_timer_with_its_colon_routes_at_every_position() {
    sweep("darkroom-timer");
}

#[test]
fn moving_shifts_only_points() {
    let t = moved("  origin: [6, 14.5]\n  - {name: A, at: [1, 2], size: 3}\n", 0.5, -1.0);
    assert_eq!(t, "  origin: [6.500, 13.500]\n  - {name: A, at: [1.500, 1.000], size: 3}\n");
}
