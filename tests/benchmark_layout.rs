//! The benchmark's layout generator (examples/benchmark/layout_gen.rs, included here by
//! path) must write layouts segmask accepts: a small static one builds clean through the
//! real binary, and every size — including the default 32 digits + 40 icons at 1/4 duty,
//! which the electrode stage does not build yet — passes the spec stage's fit and
//! placement checks. No times are measured here.

#[path = "../examples/benchmark/layout_gen.rs"]
#[allow(dead_code)]
mod layout_gen;

use layout_gen::{Drive, Params};
use std::path::Path;
use std::process::Command;

fn params(digits: u32, rows: Option<u32>, icons: u32, drive: Drive) -> Params {
    Params { digits, rows, icons, drive }
}

/// Resolves generated text with the library's spec stage, or fails naming the problems.
fn resolve(p: &Params) -> segmask::layout::Layout {
    let g = layout_gen::generate(p).unwrap_or_else(|e| panic!("{p:?} not generated: {e}"));
    match segmask::spec::parse_layout(&g.yaml, Path::new(&format!("{}.yaml", g.name))) {
        Ok(l) => l,
        Err(e) => panic!("{p:?} gave a layout segmask refuses:\n{e}\n---\n{}", g.yaml),
    }
}

#[test]
fn small_static_layout_builds_clean_through_segmask_check() {
    let g = layout_gen::generate(&params(4, None, 4, Drive::Static)).expect("generated");
    let dir = tempfile::tempdir().expect("temp dir");
    let file = dir.path().join(format!("{}.yaml", g.name));
    std::fs::write(&file, &g.yaml).expect("layout written");
    let out = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("check").arg(&file).output().expect("segmask runs");
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(0), "segmask check failed:\n{stderr}\n---\n{}", g.yaml);
    assert!(stderr.contains("0 error(s), 0 warning(s)"), "{stderr}");
}

#[test]
fn default_benchmark_size_fits_at_quarter_duty() {
    let p = params(40, None, 40, Drive::Duty(4));
    let layout = resolve(&p);
    let g = layout_gen::generate(&p).expect("generated");
    // Multiplexed: 40 digits × (a–g, no point) in one row + 40 icons under them.
    assert_eq!(segmask::spec::element_nets(&layout).len(), 40 * 7 + 40);
    assert_eq!(layout.digits.len(), 1, "one row of digits");
    // Multiplexed at duty 1/N: N commons + ⌈elements / N⌉ SEG lines (docs/background.md,
    // *Drive and pin count*) = 4 + ⌈320 / 4⌉ = 84.
    assert_eq!(segmask::spec::pads_needed(&layout), 84);
    assert_eq!(g.pads, 84, "the generator's own count sizes the pad row");
}

#[test]
fn every_size_and_drive_passes_the_spec_checks() {
    let drives = [Drive::Static, Drive::Duty(2), Drive::Duty(3), Drive::Duty(4)];
    // Odd sizes, then the sweep's (examples/benchmark/main.rs).
    let sizes = [
        (1, None, 0),
        (3, None, 1),
        (9, None, 11),
        (17, Some(2), 5),
        (16, Some(4), 60),
        (40, None, 50),
        (4, None, 5),
        (8, None, 10),
        (16, None, 20),
        (32, None, 40),
    ];
    for drive in drives {
        for (digits, rows, icons) in sizes {
            // Multiplexed, each icon sits under a digit of the bottom row.
            let icons = if drive == Drive::Static { icons } else { icons.min(u32::div_ceil(digits, rows.unwrap_or(1))) };
            let p = params(digits, rows, icons, drive);
            let layout = resolve(&p);
            let g = layout_gen::generate(&p).expect("generated");
            assert_eq!(segmask::spec::pads_needed(&layout), g.pads, "{p:?}");
            let made: u32 = layout.digits.iter().map(|d| d.count).sum();
            assert_eq!(made, digits, "{p:?}");
            assert_eq!(layout.icons.len(), icons as usize, "{p:?}");
        }
    }
}

#[test]
fn out_of_range_parameters_are_refused_with_a_reason() {
    for (digits, rows) in [(0, None), (4, Some(0)), (4, Some(5)), (300, Some(27)), (202, Some(2))] {
        let r = layout_gen::generate(&params(digits, rows, 0, Drive::Static));
        let e = r.expect_err("refused");
        assert!(e.contains("--digits") || e.contains("--rows") || e.contains("rows"), "{e}");
    }
    assert!(Drive::parse("1/5").unwrap_err().contains("allowed: static, 1/2, 1/3, 1/4"));
    assert_eq!(Drive::parse("1/3"), Ok(Drive::Duty(3)));
}
