//! Reference tests: every demo layout is built by the real binary and its GDSII is read
//! back by independent libraries from PyPI — gdstk (GDSII reader) and shapely (GEOS) —
//! installed by this test into a virtual environment under `target/`. The test fails,
//! never skips, when Python or the packages cannot be set up.

mod demo_build;

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// The venv's python, created on first use (shared by every test in this binary).
fn python() -> &'static Path {
    static PY: OnceLock<PathBuf> = OnceLock::new();
    PY.get_or_init(|| {
        let venv = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("reference-venv");
        let py = venv.join("bin").join("python");
        let stamp = venv.join("installed.txt");
        let reqs = root().join("tests/reference/requirements.txt");
        let want = std::fs::read_to_string(&reqs).expect("requirements.txt");
        if std::fs::read_to_string(&stamp).ok().as_deref() != Some(want.as_str()) {
            let st = Command::new("python3").arg("-m").arg("venv").arg(&venv).status().expect("python3 must be installed");
            assert!(st.success(), "python3 -m venv failed");
            let st = Command::new(&py)
                .args(["-m", "pip", "install", "--quiet", "--disable-pip-version-check", "-r"])
                .arg(&reqs)
                .status()
                .expect("pip");
            assert!(st.success(), "pip install of the reference packages failed");
            std::fs::write(&stamp, want).unwrap();
        }
        py
    })
}

fn build_demo(name: &str) -> (tempfile::TempDir, PathBuf, PathBuf) {
    let (dir, out) = demo_build::build_demo(name);
    let gds = out.join(format!("{name}.gds"));
    let report = out.join(format!("{name}.report.json"));
    (dir, gds, report)
}

fn run_py(script: &str, gds: &Path, report: &Path) {
    let o = Command::new(python()).arg(root().join("tests/reference").join(script)).arg(gds).arg(report).output().unwrap();
    let text = String::from_utf8_lossy(&o.stdout);
    println!("{text}{}", String::from_utf8_lossy(&o.stderr));
    assert!(o.status.success(), "{script} failed:\n{text}{}", String::from_utf8_lossy(&o.stderr));
}

fn demos() -> Vec<String> {
    let mut v: Vec<String> = std::fs::read_dir(root().join("demo-layouts"))
        .unwrap()
        .filter_map(|e| {
            let p = e.ok()?.path();
            (p.extension()? == "yaml").then(|| p.file_stem().unwrap().to_string_lossy().into_owned())
        })
        .collect();
    v.sort();
    assert!(v.len() >= 3, "the demo layouts are missing");
    v
}

/// gdstk reads every demo's GDSII with the expected units, layers, polygon counts and
/// areas equal to the report's (GDSII Stream Format Manual 6.0, via gdstk).
#[test]
fn gdstk_reads_every_demo() {
    for d in demos() {
        let (_dir, gds, report) = build_demo(&d);
        run_py("check_gds.py", &gds, &report);
    }
}

/// shapely (GEOS) confirms one connected part per net and the minimum gap between nets
/// on each plate of every demo.
#[test]
fn shapely_confirms_gaps_in_every_demo() {
    for d in demos() {
        let (_dir, gds, report) = build_demo(&d);
        run_py("check_gaps.py", &gds, &report);
    }
}
