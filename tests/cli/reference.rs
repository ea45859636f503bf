//! Reference tests: every demo layout is built by the real binary (once per run, shared
//! by the tests here) and its GDSII, Gerber and PDF files are read back by independent
//! libraries from PyPI — gdstk (GDSII reader), shapely (GEOS), gerbonara (Gerber reader)
//! and pypdf (PDF reader) — installed by this test into a virtual environment under
//! `target/`. The test fails, never skips, when Python or the packages cannot be set up.

use crate::demo_build;

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// The venv's python, created on first use (shared by every test in this binary).
pub(crate) fn python() -> &'static Path {
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

/// One build: the folder (kept while the run lasts), its output folder and the name.
struct Build {
    _dir: tempfile::TempDir,
    out: PathBuf,
    name: String,
}

/// Every demo, and the negative-resist mask fixture, built once for all tests here.
fn builds() -> &'static [Build] {
    static BUILDS: OnceLock<Vec<Build>> = OnceLock::new();
    BUILDS.get_or_init(|| {
        demo_build::demos_and_negative()
            .into_iter()
            .map(|(name, layout)| {
                let (dir, out) = demo_build::build_layout(&layout, &name);
                Build { _dir: dir, out, name }
            })
            .collect()
    })
}

fn run_py(script: &str, args: &[&Path]) {
    let o = Command::new(python()).arg(root().join("tests/reference").join(script)).args(args).output().unwrap();
    let text = String::from_utf8_lossy(&o.stdout);
    println!("{text}{}", String::from_utf8_lossy(&o.stderr));
    assert!(o.status.success(), "{script} failed:\n{text}{}", String::from_utf8_lossy(&o.stderr));
}

/// gdstk reads every demo's GDSII with the expected units, layers, polygon counts and
/// areas equal to the report's (GDSII Stream Format Manual 6.0, via gdstk).
#[test]
fn gdstk_reads_every_demo() {
    for b in builds() {
        let (gds, report) = (b.out.join(format!("{}.gds", b.name)), b.out.join(format!("{}.report.json", b.name)));
        run_py("check_gds.py", &[&gds, &report]);
    }
}

/// shapely (GEOS) confirms one connected part per net and the minimum gap between nets
/// on each plate of every demo.
#[test]
fn shapely_confirms_gaps_in_every_demo() {
    for b in builds() {
        let (gds, report) = (b.out.join(format!("{}.gds", b.name)), b.out.join(format!("{}.report.json", b.name)));
        run_py("check_gaps.py", &[&gds, &report]);
    }
}

/// gerbonara reads each plate's Gerber file (Gerber Layer Format Specification 2022.02)
/// and its dark area equals the ITO of the GDSII mask structure (gdstk) within 0.1 %
/// (the field minus it on dark-field files); the mask structures are the drawn ITO
/// mirrored and compensated as the mask order says; pypdf reads films.pdf with pages of
/// the SVG films' size (ISO 32000-1 MediaBox) and the same path points. Covers both
/// tones, compensation on and off, mirroring on and off (tests/reference/check_masks.py).
#[test]
fn mask_files_agree_with_each_other_in_every_demo() {
    for b in builds() {
        run_py("check_masks.py", &[&b.out, Path::new(&b.name)]);
    }
}
