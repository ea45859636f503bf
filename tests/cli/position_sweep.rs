//! Every position of a digit group routes: the multiplexed demos with all their elements
//! (digit groups, legends, icons, bar graphs) moved across the window in 0.5 mm steps, 25
//! positions along x and 25 along y (-6 mm to +6 mm), either check clean through the real
//! binary or are refused as bad input with a located message (`file:LINE: error in
//! `key``, exit 2) — never an `unroutable` or `open` finding. Before the pad row followed
//! the leads, moving the rain-gauge demo's digits 0.5 mm sideways made its fan-out one
//! level too deep; earlier still, 1 mm gave 10–14 routing errors.

use std::path::{Path, PathBuf};
use std::process::Command;

/// The keys whose value is a point `[x, y]` placing something in the layout.
const POINT_KEYS: [&str; 5] = ["origin", "at", "from", "to", "centre"];

/// Steps of 0.5 mm on each side of the drawn position along one axis: 12 each way, so 25
/// positions per axis with the drawn one.
const STEPS: i32 = 12;
const _: () = assert!(2 * STEPS + 1 >= 25, "the routing issue asks for at least 25 positions per axis");

/// Where the next point key starts in `rest`: the index just past its `[`.
fn next_point(rest: &str) -> Option<usize> {
    POINT_KEYS
        .iter()
        .filter_map(|k| {
            let pat = format!("{k}: [");
            rest.match_indices(&pat)
                .find(|(i, _)| rest[..*i].chars().next_back().is_none_or(|c| !(c.is_alphanumeric() || c == '_')))
                .map(|(i, _)| i + pat.len())
        })
        .min()
}

/// The layout text with every point (see `POINT_KEYS`) moved by (dx, dy).
fn moved(text: &str, dx: f64, dy: f64) -> String {
    let mut out = String::new();
    for line in text.lines() {
        let mut rest = line;
        let mut new = String::new();
        while let Some(i) = next_point(rest) {
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

/// Checks every position, on two threads (each with its own folder): the sweeps are the
/// longest tests, and one of them left running alone at the end of `cargo test` kept the
/// other core idle.
fn sweep(demo: &str) {
    let steps = |lo: i32, hi: i32| (lo..=hi).map(|k| k as f64 * 0.5);
    let positions: Vec<(f64, f64)> = steps(-STEPS, STEPS)
        .map(|dx| (dx, 0.0))
        .chain(steps(-STEPS, STEPS).filter(|dy| *dy != 0.0).map(|dy| (0.0, dy)))
        .collect();
    let half = positions.len().div_ceil(2);
    let failures: Vec<String> = std::thread::scope(|s| {
        let runs: Vec<_> = positions
            .chunks(half)
            .map(|part| {
                s.spawn(move || {
                    let dir = tempfile::tempdir().unwrap();
                    part.iter().filter_map(|&(dx, dy)| check_at(dir.path(), demo, dx, dy).err()).collect::<Vec<String>>()
                })
            })
            .collect();
        runs.into_iter().flat_map(|r| r.join().unwrap()).collect()
    });
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
fn greenhouse_bar_graph_and_gauge_route_at_every_position() {
    sweep("greenhouse-humidity");
}

/// Two rows sharing commons with the pads on one side: the row above sends its leads round
/// the seal. Before the back plate grew each common's tree by the true length of the way
/// (route::back), moving this layout 2 to 4 mm left or 6 mm right cut commons off.
#[test]
fn cold_store_two_rows_route_at_every_position() {
    sweep("cold-store-monitor");
}

/// Six fourteen-segment characters at 1/3 duty with a ten-step meter and two gauges: the
/// characters take the fourteen-segment template (three front leads through the centre of
/// each, at the multiplexed default gap); before it, every assignment on five or six
/// lines a character left parts of commons cut off even at the drawn position.
#[test]
fn borehole_fourteen_segments_route_at_every_position() {
    sweep("borehole-pump");
}

/// Forty digits in two rows with sixty icons at 1/4 duty, pad rows above and below; 14
/// of the 49 positions are refused with a located message. Before the back plate's
/// searches were weighted and the cut commons opened piece by piece, a check took 3–4 s
/// in the release build and this sweep was run by hand; moved 5 mm left, one back search
/// that reopened cells ran for minutes.
#[test]
fn germination_cabinet_two_rows_of_twenty_route_at_every_position() {
    sweep("germination-cabinet");
}

#[test]
fn moving_shifts_only_points() {
    let t = moved("  origin: [6, 14.5]\n  - {name: A, at: [1, 2], size: 3}\n", 0.5, -1.0);
    assert_eq!(t, "  origin: [6.500, 13.500]\n  - {name: A, at: [1.500, 1.000], size: 3}\n");
    let bar = moved("    line: {from: [8, 14], to: [20, 14]}\n    arc: {centre: [1, 1], radius: 3}\n    auto: [4, 4]\n", 1.0, 1.0);
    assert_eq!(bar, "    line: {from: [9.000, 15.000], to: [21.000, 15.000]}\n    arc: {centre: [2.000, 2.000], radius: 3}\n    auto: [4, 4]\n");
}

/// The demos swept above.
const SWEPT: [&str; 7] = ["kiln-controller", "rain-gauge", "darkroom-timer", "greenhouse-humidity", "cold-store-monitor", "borehole-pump", "germination-cabinet"];

/// Multiplexed demos not swept yet, each with the reason.
const NOT_YET_SWEPT: [(&str, &str); 0] = [];

/// Whether a layout's `drive` names a duty, written inline (`drive: {duty: 1/4}`) or as a
/// block (`drive:` then `  duty: 1/4`).
fn is_multiplexed(text: &str) -> bool {
    let lines: Vec<&str> = text.lines().collect();
    lines.iter().enumerate().any(|(i, l)| {
        l.starts_with("drive:") && (l.contains("duty") || lines[i + 1..].iter().take_while(|n| n.starts_with(' ')).any(|n| n.trim_start().starts_with("duty:")))
    })
}

/// Every multiplexed demo (a `duty:` in its drive) is swept, or listed with its reason as
/// not swept yet: a new one must join one of the lists.
#[test]
fn every_multiplexed_demo_is_swept() {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("demo-layouts");
    let mut multiplexed: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|x| x == "yaml"))
        .filter(|p| is_multiplexed(&std::fs::read_to_string(p).unwrap()))
        .map(|p| p.file_stem().unwrap().to_string_lossy().into_owned())
        .collect();
    multiplexed.sort();
    let mut swept: Vec<String> = SWEPT.iter().chain(NOT_YET_SWEPT.iter().map(|(d, _)| d)).map(|s| s.to_string()).collect();
    swept.sort();
    assert_eq!(multiplexed, swept);
}
