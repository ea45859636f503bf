//! The benchmark's layout generator (examples/benchmark/layout_gen.rs and its presets,
//! included here by path) must write layouts segmask accepts: a small static one builds
//! clean through the real binary, and every size, drive, row count and digit style —
//! several multiplexed rows and fourteen-segment digits too, which the router does not
//! route cleanly yet (docs/performance.md) — passes the spec stage's fit and placement
//! checks; the multiplexed ones also leave room on the ledge for the pins the assign
//! stage really makes and for the transfer dots. No times are measured here.

use crate::{layout_gen, presets};

use crate::layout_gen::{Drive, Params, Style};
use segmask::layout::{DigitStyle, IconShape, Layout};
use std::path::Path;
use std::process::Command;

fn params(digits: u32, rows: Option<u32>, icons: u32, drive: Drive) -> Params {
    Params { digits, rows, style: Style::Seven, icons, drive }
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

/// Checks what the spec stage resolved against what was asked for: digit count, rows,
/// style, icons, the generator's pad count; multiplexed icons below the bottom row or in
/// columns right of the digits.
fn resolve_as_asked(p: &Params) -> Layout {
    let layout = resolve(p);
    let g = layout_gen::generate(p).expect("generated");
    assert_eq!(segmask::spec::pads_needed(&layout), g.pads, "{p:?}");
    assert_eq!(layout.digits.iter().map(|d| d.count).sum::<u32>(), p.digits, "{p:?}");
    assert_eq!(layout.digits.len() as u32, p.rows.unwrap_or_else(|| layout_gen::default_rows(p)), "{p:?}");
    let counts: Vec<u32> = layout.digits.iter().map(|d| d.count).collect();
    assert!(counts.iter().max().unwrap() - counts.iter().min().unwrap() <= 1, "digits split evenly: {counts:?} ({p:?})");
    let style = if p.style == Style::Seven { DigitStyle::Seven } else { DigitStyle::Fourteen };
    assert!(layout.digits.iter().all(|d| d.style == style), "{p:?}");
    assert_eq!(layout.icons.len(), p.icons as usize, "{p:?}");
    if p.drive != Drive::Static {
        // Below the bottom row, or in the columns right of every digit cell.
        let bottom = layout.digits.iter().map(|d| d.origin.y).fold(f64::MAX, f64::min);
        let right = layout.digits.iter().map(|d| d.origin.x + f64::from(d.count - 1) * d.pitch + d.width + d.height * d.slant.to_radians().tan()).fold(f64::MIN, f64::max);
        for icon in &layout.icons {
            let IconShape::Named { at, size, .. } = &icon.shape else { panic!("{} is not a named icon", icon.name) };
            assert!(at.y + size < bottom || at.x > right, "{} reaches into the digits ({p:?})", icon.name);
        }
    }
    layout
}

/// The pins the assign stage makes for a resolved layout: commons + SEG lines.
fn pins_made(layout: &Layout) -> usize {
    let elements = segmask::glyph::build_elements(layout).unwrap_or_else(|e| panic!("{}: glyph stage refused: {e}", layout.name));
    let a = segmask::assign::assign(layout, &elements).unwrap_or_else(|e| panic!("{}: assign stage refused: {e}", layout.name));
    layout.drive.commons as usize + a.lines as usize
}

/// Fails unless a row of `pins` pads, centred on the back glass as the router places it,
/// keeps `edge_margin` from both ends of the front glass, and the transfer dots still
/// fit in the seal beside it and beside the leads coming down from the window.
fn assert_pins_and_dots_fit(layout: &Layout, pins: usize) {
    let pads = &layout.pads;
    let back = &layout.glass.back;
    let first = back.x + back.width / 2.0 - (pins as f64 - 1.0) * pads.pitch / 2.0;
    let last = first + (pins as f64 - 1.0) * pads.pitch;
    let (lo, hi) = (first - pads.width / 2.0, last + pads.width / 2.0);
    assert!(
        lo >= pads.edge_margin - 1e-9 && hi <= layout.glass.front.width - pads.edge_margin + 1e-9,
        "{}: {pins} pads at pitch {} run from {lo:.3} to {hi:.3} on {} mm of glass",
        layout.name,
        pads.pitch,
        layout.glass.front.width
    );
    let frame = segmask::route::side::SideFrame::of(layout);
    let mut us: Vec<f64> = (0..pins).map(|k| first + k as f64 * pads.pitch).collect();
    us.extend([layout.window.x, layout.window.x1()]);
    let pitch = segmask::route::lead_pitch(layout);
    let dots = segmask::route::dots::place_transfer_dots(layout, &frame, layout.pads.width, &us, pitch, layout.drive.commons as usize, frame.u_back, &[]);
    assert!(dots.is_some(), "{}: no room for {} transfer dots beside {pins} pads", layout.name, layout.drive.commons);
}

#[test]
fn several_multiplexed_rows_and_both_styles_pass_the_spec_checks() {
    let drives = [Drive::Duty(2), Drive::Duty(3), Drive::Duty(4)];
    // (digits, rows, icons): icons under each digit of the bottom row, fewer, and more
    // (a band under the bottom row), with uneven splits.
    let sizes = [(2, 2, 0), (7, 2, 3), (9, 3, 3), (16, 2, 8), (16, 2, 30), (17, 3, 40), (32, 2, 40), (26, 4, 12), (40, 5, 90)];
    for style in [Style::Seven, Style::Fourteen] {
        for drive in drives {
            for (digits, rows, icons) in sizes {
                resolve_as_asked(&Params { digits, rows: Some(rows), style, icons, drive });
            }
        }
        // One row, as multiplexed layouts are by default, and static drive.
        for (digits, icons) in [(1, 0), (6, 6), (6, 40), (12, 20)] {
            resolve_as_asked(&Params { digits, rows: None, style, icons, drive: Drive::Duty(3) });
            resolve_as_asked(&Params { digits, rows: None, style, icons, drive: Drive::Static });
        }
    }
}

#[test]
fn presets_and_the_routing_targets_leave_room_for_every_pin() {
    let mut cases: Vec<Params> = presets::PRESETS.iter().map(|(_, _, p)| *p).collect();
    // `--digits 6 --style fourteen --duty 1/3 --rows 1` with the default 40 icons.
    cases.push(Params { digits: 6, rows: Some(1), style: Style::Fourteen, icons: 40, drive: Drive::Duty(3) });
    cases.push(Params { digits: 16, rows: Some(2), style: Style::Seven, icons: 8, drive: Drive::Duty(3) });
    cases.push(Params { digits: 12, rows: Some(3), style: Style::Fourteen, icons: 20, drive: Drive::Duty(4) });
    cases.push(Params { digits: 10, rows: Some(2), style: Style::Seven, icons: 25, drive: Drive::Duty(2) });
    for p in cases {
        let layout = resolve_as_asked(&p);
        let pins = pins_made(&layout);
        assert!(pins >= segmask::spec::pads_needed(&layout) as usize, "{p:?}");
        assert_pins_and_dots_fit(&layout, pins);
    }
    // The routing issue's target: 32 digits in two rows of 16, 40 icons, 1/4 duty. The
    // lower bound N + ⌈(32 × 7 + 40) / 4⌉ is 70 pins; the upper row lies behind the lower
    // one and leads out on the far side (`assign::tiers`), so the icons under the lower
    // row cannot take the 16 free places on its lines: 4 commons + 2 lines a digit (64)
    // + the 24 icons beyond the lower row's 16 free places, 4 to a line (6) = 74.
    let p = presets::parse("two-rows").expect("preset");
    assert_eq!((p.digits, p.rows, p.icons, p.drive, p.style), (32, Some(2), 40, Drive::Duty(4), Style::Seven));
    let layout = resolve(&p);
    assert_eq!(layout.digits.iter().map(|d| d.count).collect::<Vec<_>>(), [16, 16]);
    assert_eq!(pins_made(&layout), 74);
    assert!(presets::parse("three-rows").unwrap_err().contains("allowed: two-rows, two-rows-third, fourteen"));
}

#[test]
fn a_too_small_pad_row_is_caught_by_the_fit_check() {
    // The check above must be able to fail: a row of one pad more than the front glass
    // holds at the pad pitch, on the two-rows target, does not fit.
    let layout = resolve(&presets::parse("two-rows").expect("preset"));
    let too_many = (layout.glass.front.width / layout.pads.pitch).ceil() as usize + 1;
    let fits = std::panic::catch_unwind(|| assert_pins_and_dots_fit(&layout, too_many));
    assert!(fits.is_err(), "{too_many} pads reported as fitting on {} mm of glass", layout.glass.front.width);
}
