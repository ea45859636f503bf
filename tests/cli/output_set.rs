//! The outputs of a build as one set (docs/outputs.md, *One set*): a run killed while
//! its new set is staged, or between the two renames of the fallback swap, a run that
//! fails half-way or at the rename that would put its set in place, two runs into one folder at once, and symbolic links planted where
//! segmask writes. After each, the folder must hold the complete old set or the
//! complete new one, never a mix, and nothing may be written outside it.
//!
//! Kills and failures are placed with `SEGMASK_FAULT` (src/emit/fault.rs): the child
//! stops at a named point and says so by creating a marker file, and the test kills it
//! there (SIGKILL, which no program can catch or clean up after).

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Output, Stdio};

fn minimal() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/good/minimal.yaml")
}

/// `segmask build minimal.yaml --out OUT --date DATE --masks-despite-errors` (every
/// output file, whatever the checks find), with `SEGMASK_FAULT` set to `fault`.
fn build(out: &Path, date: &str, fault: &str) -> Command {
    let mut c = Command::new(env!("CARGO_BIN_EXE_segmask"));
    c.arg("build").arg(minimal()).arg("--out").arg(out).arg("--date").arg(date).arg("--masks-despite-errors");
    c.env("SEGMASK_FAULT", fault).stdout(Stdio::null()).stderr(Stdio::piped());
    c
}

fn run(out: &Path, date: &str, fault: &str) -> Output {
    build(out, date, fault).output().unwrap()
}

/// Starts a build that stops at `point` (after `extra` faults), waits until it is
/// there, kills it.
fn kill_at(out: &Path, date: &str, point: &str, extra: &str, marker: &Path) {
    let fault = format!("{extra}hold:{point}:{}", marker.display());
    let mut child: Child = build(out, date, &fault).spawn().unwrap();
    while !marker.exists() {
        if let Some(status) = child.try_wait().unwrap() {
            panic!("build ended ({status}) before reaching {point}");
        }
        std::thread::sleep(std::time::Duration::from_millis(20));
    }
    child.kill().unwrap();
    child.wait().unwrap();
    std::fs::remove_file(marker).unwrap();
}

/// Every entry of `dir`: name → contents (a symbolic link as `-> target`).
fn snapshot(dir: &Path) -> BTreeMap<String, Vec<u8>> {
    let mut m = BTreeMap::new();
    for e in std::fs::read_dir(dir).unwrap() {
        let e = e.unwrap();
        let name = e.file_name().into_string().unwrap();
        let bytes = if e.file_type().unwrap().is_symlink() {
            format!("-> {}", std::fs::read_link(e.path()).unwrap().display()).into_bytes()
        } else {
            std::fs::read(e.path()).unwrap()
        };
        m.insert(name, bytes);
    }
    m
}

/// Names beside the output folder other than the folder itself.
fn siblings(parent: &Path) -> Vec<String> {
    let mut v: Vec<String> = std::fs::read_dir(parent)
        .unwrap()
        .map(|e| e.unwrap().file_name().into_string().unwrap())
        .filter(|n| n != "out" && n != "victim.txt")
        .collect();
    v.sort();
    v
}

fn contains(bytes: &[u8], s: &str) -> bool {
    bytes.windows(s.len()).any(|w| w == s.as_bytes())
}

#[test]
fn kills_failures_locks_and_planted_links_never_leave_a_mixed_set() {
    let tmp = tempfile::tempdir().unwrap();
    let out = tmp.path().join("out");
    let marker = tmp.path().join("marker");
    let victim = tmp.path().join("victim.txt");
    std::fs::write(&victim, b"victim").unwrap();

    // The old set, plus a file of the user's and a link the user made.
    let first = run(&out, "2025-01-01", "");
    assert_eq!(first.status.code(), Some(0), "{}", String::from_utf8_lossy(&first.stderr));
    let outputs = snapshot(&out).len();
    // Every output (the minimal layout now builds clean), the two PNG films among them.
    assert_eq!(outputs, 18, "{:?}", snapshot(&out).keys());
    std::fs::write(out.join("notes.txt"), b"mine").unwrap();
    std::os::unix::fs::symlink(&victim, out.join("link")).unwrap();
    let old = snapshot(&out);

    // Killed with the new set complete beside the folder: the old set stands. A second
    // run meanwhile finds the folder locked and says so instead of interleaving.
    let fault = format!("hold:staged:{}", marker.display());
    let mut held = build(&out, "2025-02-02", &fault).spawn().unwrap();
    while !marker.exists() {
        assert!(held.try_wait().unwrap().is_none(), "held build ended early");
        std::thread::sleep(std::time::Duration::from_millis(20));
    }
    let locked = build(&out, "2025-03-03", "").arg("--lock-wait").arg("0").output().unwrap();
    let msg = String::from_utf8_lossy(&locked.stderr);
    assert_eq!(locked.status.code(), Some(2), "{msg}");
    assert!(msg.contains("another segmask run is writing into this folder"), "{msg}");
    held.kill().unwrap();
    held.wait().unwrap();
    std::fs::remove_file(&marker).unwrap();
    assert_eq!(snapshot(&out), old);
    assert_eq!(siblings(tmp.path()).len(), 1, "the killed run's staging folder is left: {:?}", siblings(tmp.path()));

    // Killed between the two renames of the fallback swap: the old set lies aside
    // whole; the next run puts it back before anything else.
    kill_at(&out, "2025-04-04", "between", "no-exchange,", &marker);
    assert!(!out.exists());
    let aside: Vec<String> = siblings(tmp.path()).into_iter().filter(|n| n.starts_with(".out.old-")).collect();
    assert_eq!(aside.len(), 1);
    assert_eq!(snapshot(&tmp.path().join(&aside[0])), old);

    // A run that fails half-way through writing its set: old set back, nothing staged.
    let failed = run(&out, "2025-05-05", "fail:file-5");
    let msg = String::from_utf8_lossy(&failed.stderr);
    assert_eq!(failed.status.code(), Some(2), "{msg}");
    assert!(msg.contains("fault injected"), "{msg}");
    assert_eq!(snapshot(&out), old);
    assert!(siblings(tmp.path()).is_empty(), "stale staging cleaned: {:?}", siblings(tmp.path()));

    // The rename that would put the new set in place fails: the old set stands whole.
    let failed = run(&out, "2025-05-06", "fail:swap");
    assert_eq!(failed.status.code(), Some(2), "{}", String::from_utf8_lossy(&failed.stderr));
    assert_eq!(snapshot(&out), old);
    assert!(siblings(tmp.path()).is_empty(), "{:?}", siblings(tmp.path()));

    // Links planted at an output's name and at the next staging names are replaced or
    // removed, never written through.
    std::fs::remove_file(out.join("minimal.pins.csv")).unwrap();
    std::os::unix::fs::symlink(&victim, out.join("minimal.pins.csv")).unwrap();
    std::os::unix::fs::symlink(tmp.path(), tmp.path().join(".out.new-1-0")).unwrap();
    let done = run(&out, "2025-06-06", "");
    assert_eq!(done.status.code(), Some(0), "{}", String::from_utf8_lossy(&done.stderr));
    let new = snapshot(&out);
    assert_eq!(new.len(), outputs + 2);
    assert!(contains(&new["minimal.masks.txt"], "2025-06-06"));
    assert!(std::fs::symlink_metadata(out.join("minimal.pins.csv")).unwrap().is_file());
    assert_eq!(new["notes.txt"], b"mine");
    assert_eq!(new["link"], old["link"]);
    assert_eq!(std::fs::read(&victim).unwrap(), b"victim");
    assert!(siblings(tmp.path()).is_empty(), "{:?}", siblings(tmp.path()));

    // Two runs at once into one folder: both succeed, one after the other, and the
    // folder holds one run's whole set.
    let dates = ["2025-07-07", "2025-08-08"];
    let children: Vec<Child> = dates.iter().map(|d| build(&out, d, "").spawn().unwrap()).collect();
    for c in children {
        let o = c.wait_with_output().unwrap();
        assert_eq!(o.status.code(), Some(0), "{}", String::from_utf8_lossy(&o.stderr));
    }
    let last = snapshot(&out);
    let dated: Vec<&str> = dates.iter().copied().filter(|d| contains(&last["minimal.masks.txt"], d)).collect();
    assert_eq!(dated.len(), 1);
    for (name, bytes) in &last {
        for d in dates.iter().filter(|d| **d != dated[0]) {
            assert!(!contains(bytes, d), "{name} holds the other run's date {d}");
        }
    }
    assert!(contains(&last["minimal.front.gbr"], dated[0]) && contains(&last["minimal.masks.json"], dated[0]));
    assert!(siblings(tmp.path()).is_empty(), "{:?}", siblings(tmp.path()));
}

/// `--timings` lists every stage in pipeline order, the writers (`emit`) and the writing
/// of the set (`write`) last, each once with a time in seconds.
#[test]
fn timings_name_every_stage_including_emit_and_write() {
    let tmp = tempfile::tempdir().unwrap();
    let o = Command::new(env!("CARGO_BIN_EXE_segmask"))
        .arg("build")
        .arg(minimal())
        .arg("--out")
        .arg(tmp.path().join("out"))
        .args(["--date", "2026-12-01", "--timings"])
        .output()
        .unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    let stages: Vec<&str> = err
        .lines()
        .filter_map(|l| l.strip_prefix("time "))
        .map(|l| l.split(':').next().unwrap().trim())
        .collect();
    assert_eq!(stages, ["spec", "glyph", "assign", "electrode", "route", "plate", "check", "plan", "emit", "write"], "{err}");
    assert!(err.lines().filter(|l| l.starts_with("time ")).all(|l| l.ends_with(" s")), "{err}");
}
