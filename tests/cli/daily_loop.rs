//! The daily loop of a designer: `new` writes a layout that builds clean at every drive
//! it offers (and never replaces a file), the complete example of docs/layout-format.md
//! builds clean, and `watch` builds again after a real save of the layout file, keeps
//! going after a save that does not read, and writes nothing for that save. "Clean" is
//! read from the report JSON (`summary`, docs/outputs.md) with serde_json.

use serde_json::Value;
use std::io::BufRead;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::sync::mpsc;
use std::time::{Duration, Instant};

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn segmask() -> Command {
    Command::new(env!("CARGO_BIN_EXE_segmask"))
}

/// Builds `layout` into `out` and gives the report's (errors, warnings) and the findings.
fn build_counts(layout: &Path, out: &Path, name: &str) -> (u64, u64, String) {
    let o = segmask().arg("build").arg(layout).arg("--out").arg(out).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr).into_owned();
    let report = std::fs::read_to_string(out.join(format!("{name}.report.json"))).unwrap_or_else(|_| panic!("no report:\n{err}"));
    let r: Value = serde_json::from_str(&report).unwrap();
    let s = &r["summary"];
    (s["errors"].as_u64().unwrap(), s["warnings"].as_u64().unwrap(), err)
}

#[test]
fn new_then_build_is_clean_at_every_drive() {
    let dir = tempfile::tempdir().unwrap();
    for (i, drive) in ["static", "1/2", "1/3", "1/4"].iter().enumerate() {
        let name = format!("starter-{i}");
        let o = segmask().args(["new", &name, "--drive", drive, "--out"]).arg(dir.path()).output().unwrap();
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
        let layout = dir.path().join(format!("{name}.yaml"));
        let (errors, warnings, err) = build_counts(&layout, &dir.path().join(format!("out-{i}")), &name);
        assert_eq!((errors, warnings), (0, 0), "drive {drive}:\n{err}");
    }
}

#[test]
fn new_refuses_to_replace_a_file() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("mine.yaml");
    std::fs::write(&path, "# my own work\n").unwrap();
    let o = segmask().args(["new", "mine", "--out"]).arg(dir.path()).output().unwrap();
    assert_eq!(o.status.code(), Some(2));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(err.contains("already exists"), "{err}");
    assert_eq!(std::fs::read_to_string(&path).unwrap(), "# my own work\n");
}

/// The YAML block after `<!-- complete example -->` in `text`.
fn marked_block(text: &str) -> Option<String> {
    let after = &text[text.find("<!-- complete example -->")?..];
    let body = &after[after.find("```yaml\n")? + "```yaml\n".len()..];
    Some(body[..body.find("\n```")? + 1].to_string())
}

#[test]
fn marked_block_is_found() {
    let doc = "intro\n```yaml\nname: no\n```\n<!-- complete example -->\n```yaml\nname: yes\nx: 1\n```\n";
    assert_eq!(marked_block(doc).as_deref(), Some("name: yes\nx: 1\n"));
    assert_eq!(marked_block("```yaml\nname: no\n```\n"), None);
}

#[test]
fn docs_complete_example_builds_clean() {
    let doc = std::fs::read_to_string(root().join("docs/layout-format.md")).unwrap();
    let yaml = marked_block(&doc).expect("docs/layout-format.md has no block marked <!-- complete example -->");
    let name = yaml.lines().find_map(|l| l.strip_prefix("name: ")).unwrap().split_whitespace().next().unwrap().to_string();
    let dir = tempfile::tempdir().unwrap();
    let layout = dir.path().join(format!("{name}.yaml"));
    std::fs::write(&layout, &yaml).unwrap();
    let (errors, warnings, err) = build_counts(&layout, &dir.path().join("out"), &name);
    assert_eq!((errors, warnings), (0, 0), "{err}");
}

/// Lines of the child's standard error, as they come.
fn lines_of(child: &mut std::process::Child) -> mpsc::Receiver<String> {
    let (tx, rx) = mpsc::channel();
    let stderr = child.stderr.take().unwrap();
    std::thread::spawn(move || {
        for line in std::io::BufReader::new(stderr).lines().map_while(Result::ok) {
            if tx.send(line).is_err() {
                break;
            }
        }
    });
    rx
}

/// Waits for a line starting `[` that contains `what` (the per-build line), up to
/// `deadline`; gives every line seen.
fn wait_for(rx: &mpsc::Receiver<String>, what: &str, deadline: Duration) -> String {
    let start = Instant::now();
    let mut seen = String::new();
    while start.elapsed() < deadline {
        if let Ok(line) = rx.recv_timeout(Duration::from_millis(100)) {
            seen.push_str(&line);
            seen.push('\n');
            if line.starts_with('[') && line.contains(what) {
                return seen;
            }
        }
    }
    panic!("no `{what}` line within {deadline:?}; seen:\n{seen}");
}

/// Kills the child when dropped, also when an assertion fails.
struct Killed(std::process::Child);

impl Drop for Killed {
    fn drop(&mut self) {
        let _ = self.0.kill();
        let _ = self.0.wait();
    }
}

#[test]
fn watch_rebuilds_after_a_save_and_survives_a_bad_one() {
    let dir = tempfile::tempdir().unwrap();
    let o = segmask().args(["new", "watched", "--out"]).arg(dir.path()).output().unwrap();
    assert!(o.status.success());
    let layout = dir.path().join("watched.yaml");
    let out = dir.path().join("out");
    let report = out.join("watched.report.json");
    let text = std::fs::read_to_string(&layout).unwrap();
    let mut child = segmask().arg("watch").arg(&layout).arg("--out").arg(&out).stderr(Stdio::piped()).spawn().unwrap();
    let rx = lines_of(&mut child);
    let child = Killed(child);
    // Generous deadlines: the test build of segmask is not optimised, and the machine is shared.
    let first = wait_for(&rx, "built watched: 0 error(s), 0 warning(s)", Duration::from_secs(120));
    let before = std::fs::read(&report).unwrap();

    // A save that does not read: its problem is printed, located, and nothing is written.
    std::fs::write(&layout, text.replace("count: 4", "count: [4")).unwrap();
    let bad = wait_for(&rx, "not built", Duration::from_secs(60));
    assert!(bad.contains("watched.yaml:"), "the problem names the file and line:\n{bad}");
    assert_eq!(std::fs::read(&report).unwrap(), before, "a bad save wrote the report");

    // A real change: the digits lean less (slant 6° to 4°); the report's segment centres
    // and areas change with them.
    assert!(text.contains("slant: 6 "), "the starter layout changed: edit this test");
    let saved = Instant::now();
    std::fs::write(&layout, text.replace("slant: 6 ", "slant: 4 ")).unwrap();
    let changed = loop {
        if std::fs::read(&report).is_ok_and(|now| now != before) {
            break saved.elapsed();
        }
        assert!(saved.elapsed() < Duration::from_secs(60), "no rebuild within 60 s of the save");
        std::thread::sleep(Duration::from_millis(20));
    };
    wait_for(&rx, "built watched: 0 error(s), 0 warning(s)", Duration::from_secs(60));
    println!("first build:\n{first}\nreport changed {:.3} s after the save", changed.as_secs_f64());
    drop(child);
}
