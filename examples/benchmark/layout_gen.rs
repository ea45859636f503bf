//! Writes the benchmark layout: parameters (digits, rows, icons, drive) → layout YAML in
//! segmask's own format (docs/layout-format.md), sized so that everything fits.
//!
//! The scenario is made up for the benchmark: a wall panel for a cold store, one row of
//! digits per floor showing the temperatures of its rooms (two decimals, so every digit
//! has a decimal point), and a band of status icons above them (door, defrost, alarm, …).
//! Only the sizes matter: the glass, window, seal and pad row are computed from the
//! element count so that leads from the upper rows have channels between the digits of
//! the rows below, and the pad row sits under the digits on the bottom ledge.
//!
//! This file uses only `std`, so `tests/benchmark_layout.rs` includes it with `#[path]`
//! and checks that what it writes is a valid layout.

use std::fmt::Write;

/// How the panel is driven.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Drive {
    /// One common electrode, one pad per element.
    Static,
    /// Multiplexed at duty 1/N (N = 2, 3 or 4), bias 1/3.
    Duty(u32),
}

impl Drive {
    /// Reads `static`, `1/2`, `1/3` or `1/4`.
    pub fn parse(s: &str) -> Result<Drive, String> {
        match s.trim() {
            "static" => Ok(Drive::Static),
            "1/2" => Ok(Drive::Duty(2)),
            "1/3" => Ok(Drive::Duty(3)),
            "1/4" => Ok(Drive::Duty(4)),
            other => Err(format!("unknown duty `{other}` (allowed: static, 1/2, 1/3, 1/4)")),
        }
    }

    /// Number of common electrodes.
    pub fn commons(self) -> u32 {
        match self {
            Drive::Static => 1,
            Drive::Duty(n) => n,
        }
    }

    /// Short word for file names: `static`, `duty4`, …
    pub fn tag(self) -> String {
        match self {
            Drive::Static => "static".into(),
            Drive::Duty(n) => format!("duty{n}"),
        }
    }
}

/// What to generate.
#[derive(Debug, Clone, Copy)]
pub struct Params {
    /// Number of seven-segment digits, each with a decimal point (1 to 26 × 100).
    pub digits: u32,
    /// Rows of digits [ceil(digits / 8)].
    pub rows: Option<u32>,
    /// Number of icons in the band above the digits.
    pub icons: u32,
    /// Drive scheme.
    pub drive: Drive,
}

/// A generated layout.
#[derive(Debug, Clone)]
pub struct Generated {
    /// The layout name (file stem).
    pub name: String,
    /// The YAML text.
    pub yaml: String,
    /// Switchable elements: digit segments, decimal points and icons.
    pub elements: u32,
    /// Pads the layout needs (docs/layout-format.md, "Pads needed").
    pub pads: u32,
}

// Sizes in mm. Rules are written out in the layout so these stay consistent with them.
const DIGIT_H: f64 = 10.0;
const DIGIT_W: f64 = 6.0;
const STROKE: f64 = 1.0;
/// Gap between segments: wide enough for the router to lead the middle segment out
/// between two others (its keep-out is gap + half a lead + one cell on each side).
const GAP: f64 = 0.35;
const SLANT_DEG: f64 = 4.0;
const SEGMENTS: u32 = 8; // a–g and dp
const ICON: f64 = 3.0;
const ICON_PITCH: f64 = 4.5;
/// Lead width 0.11 (0.1 + 2 × 5 µm undercut) + gap 0.05 + one 25 µm grid cell: the
/// router's lead pitch (`segmask::route::lead_pitch`) under the rules written below.
const LEAD_PITCH: f64 = 0.185;
/// Seal inset + width.
const SEAL: f64 = 2.5;
/// Room between the window and the seal's inner edge, and around the content.
const MARGIN: f64 = 1.0;
const PAD_LENGTH: f64 = 3.0;
const PAD_EDGE: f64 = 0.3;
/// Pad pitches tried, largest first (common practice: 1.27 mm down to 0.5 mm for
/// elastomeric connectors).
const PAD_PITCHES: [f64; 5] = [1.27, 1.0, 0.8, 0.65, 0.5];
/// Spare room in the pad row for SEG lines beyond the lower bound.
const PAD_SPARE: f64 = 1.15;
const ICON_NAMES: [&str; 16] = [
    "snowflake", "drop", "warning", "lock", "bell", "thermometer", "clock", "power", "plug", "heat", "sun",
    "home", "speaker", "wireless", "check", "cross",
];

/// Generates the layout, or says which parameter is out of range.
pub fn generate(p: &Params) -> Result<Generated, String> {
    let g = Geometry::plan(p)?;
    let name = format!("bench-{}d-{}i-{}", p.digits, p.icons, p.drive.tag());
    let mut y = String::new();
    header(&mut y, &name, p, &g).map_err(|e| e.to_string())?;
    digit_rows(&mut y, p, &g).map_err(|e| e.to_string())?;
    icon_band(&mut y, p, &g).map_err(|e| e.to_string())?;
    Ok(Generated { name, yaml: y, elements: g.elements, pads: g.pads })
}

/// Every size derived from the parameters.
#[derive(Debug, Clone, Copy)]
struct Geometry {
    rows: u32,
    per_row: u32,
    elements: u32,
    pads: u32,
    pad_pitch: f64,
    /// Channel between neighbouring digit cells.
    channel: f64,
    digit_pitch: f64,
    /// Vertical room between rows.
    row_gap: f64,
    icons_per_row: u32,
    icon_rows: u32,
    /// Content box (digits and icons), lower-left and size.
    cx: f64,
    cy: f64,
    cw: f64,
    ch: f64,
    glass_w: f64,
    glass_h: f64,
    ledge: f64,
}

impl Geometry {
    fn plan(p: &Params) -> Result<Geometry, String> {
        if p.digits == 0 {
            return Err("--digits must be at least 1".into());
        }
        let n = p.drive.commons();
        // Multiplexed, the commons run along a row of digits and the SEG leads leave
        // below it: rows stacked above each other would cut the commons of the rows
        // below (a planar-routing limit, docs/performance.md), so one row by default.
        let rows = p.rows.unwrap_or(if n > 1 { 1 } else { p.digits.div_ceil(8) });
        if rows == 0 || rows > 26 || rows > p.digits {
            return Err(format!("--rows {rows} does not suit {} digits (allowed: 1 to 26, at most the digit count)", p.digits));
        }
        let per_row = p.digits.div_ceil(rows);
        if per_row > 100 {
            return Err(format!("{per_row} digits in a row (allowed: at most 100; add rows)"));
        }
        let segments = if n > 1 { SEGMENTS - 1 } else { SEGMENTS };
        if n > 1 && p.icons > per_row {
            return Err(format!(
                "{} icons (allowed: at most {per_row} under multiplexed drive, one under each digit of the bottom row)",
                p.icons
            ));
        }
        let elements = p.digits * segments + p.icons;
        let lines = |e: u32| e.div_ceil(n);
        let pads = if n == 1 { elements + 1 } else { n + lines(elements) };
        // Leads that must pass the bottom row: everything above it, shared N to a line,
        // spread over the channels, plus the bottom row's own.
        let above = (rows - 1) * per_row * segments + p.icons;
        let per_channel = lines(above).div_ceil(per_row + 1) + segments.div_ceil(n);
        let channel = (f64::from(per_channel) * LEAD_PITCH * 1.6 + 0.8).max(1.5);
        let cell = DIGIT_W + DIGIT_H * SLANT_DEG.to_radians().tan() + 1.5 * STROKE;
        let digit_pitch = round_up(cell + channel, 0.05);
        let row_gap = round_up((f64::from(segments.div_ceil(n)) * LEAD_PITCH * 2.0 + 1.5).max(2.5), 0.05);
        let cw = f64::from(per_row) * digit_pitch + channel;
        let icons_per_row = ((cw / ICON_PITCH).floor() as u32).max(1);
        // Multiplexed: one band of icons under the bottom row (each shares the SEG line
        // of the digit above it, which has no point); static: bands above the digits.
        let icon_rows = if n > 1 { u32::from(p.icons > 0) } else { p.icons.div_ceil(icons_per_row) };
        let ch = f64::from(rows) * (DIGIT_H + row_gap) + f64::from(icon_rows) * ICON_PITCH;
        let pad_pitch = PAD_PITCHES.iter().copied().find(|q| f64::from(pads) * q <= cw).unwrap_or(0.5);
        let pad_row = f64::from(pads) * PAD_SPARE * pad_pitch + 2.0 * (PAD_EDGE + SEAL + 1.5);
        // Room in the seal at each end for half the transfer dots (one per common, 1.2 mm
        // pads a lead pitch apart) beyond the outermost lead.
        let dots = 2.0 * (f64::from(n).div_euclid(2.0) + 1.0) * 1.5;
        let glass_w = round_up((cw + 2.0 * (SEAL + 2.0 * MARGIN)).max(pad_row) + dots, 0.5);
        // Fan-out levels: leads leave the channels in bunches and spread out to evenly
        // spaced pads; the router stacks one level per lead a lead passes under. Measured
        // at static drive: 16 digits + 20 icons (149 pads) needed 61 levels.
        let levels = f64::from((2 * per_channel).max(pads / 2) + 10);
        let ledge = round_up((PAD_LENGTH + PAD_EDGE + levels * LEAD_PITCH - SEAL + 1.0).max(5.0), 0.5);
        let cx = (glass_w - cw) / 2.0;
        let cy = ledge + SEAL + 2.0 * MARGIN;
        let glass_h = round_up(cy + ch + 2.0 * MARGIN + SEAL, 0.5);
        Ok(Geometry {
            rows, per_row, elements, pads, pad_pitch, channel, digit_pitch, row_gap, icons_per_row, icon_rows, cx, cy,
            cw, ch, glass_w, glass_h, ledge,
        })
    }
}

fn round_up(v: f64, step: f64) -> f64 {
    (v / step - 1e-9).ceil() * step
}

/// A length for YAML: mm with at most three decimals.
fn mm(v: f64) -> String {
    let s = format!("{v:.3}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".into() } else { s.into() }
}

fn header(y: &mut String, name: &str, p: &Params, g: &Geometry) -> std::fmt::Result {
    writeln!(y, "# Benchmark layout written by `cargo run --example benchmark` (examples/benchmark/).")?;
    writeln!(y, "# Made-up scenario: a cold-store wall panel, one row of digits per floor and a band")?;
    writeln!(y, "# of room status icons; {} digits in {} rows, {} icons in {} rows.", p.digits, g.rows, p.icons, g.icon_rows)?;
    writeln!(y, "name: {name}")?;
    writeln!(y, "glass:")?;
    writeln!(y, "  front: {{width: {}, height: {}}}", mm(g.glass_w), mm(g.glass_h))?;
    writeln!(y, "  back: {{width: {}, height: {}, x: 0, y: {}}}", mm(g.glass_w), mm(g.glass_h - g.ledge), mm(g.ledge))?;
    let wx = g.cx - MARGIN;
    let wy = g.cy - MARGIN;
    writeln!(y, "window: {{x: {}, y: {}, width: {}, height: {}}}", mm(wx), mm(wy), mm(g.cw + 2.0 * MARGIN), mm(g.ch + 2.0 * MARGIN))?;
    writeln!(y, "cell_gap: 7um")?;
    writeln!(y, "resist: positive")?;
    writeln!(y, "rules: {{min_width: 0.1, min_gap: 0.05, undercut: 5um}}")?;
    writeln!(y, "seal: {{width: 1.0, inset: 1.5, fill_port: {{side: top, at: {}, width: 3}}}}", mm(g.glass_w / 2.0))?;
    let pw = g.pad_pitch * 0.6;
    writeln!(
        y,
        "pads: {{side: bottom, pitch: {}, width: {}, length: {}, edge_margin: {}}}",
        mm(g.pad_pitch),
        mm(pw),
        mm(PAD_LENGTH),
        mm(PAD_EDGE)
    )?;
    match p.drive {
        Drive::Static => writeln!(y, "drive: static"),
        Drive::Duty(n) => writeln!(y, "drive: {{duty: 1/{n}, bias: 1/3}}"),
    }
}

/// One digit group per row, top row first: `RA`, `RB`, … (nets `RA1.a` … `RA8.dp`).
fn digit_rows(y: &mut String, p: &Params, g: &Geometry) -> std::fmt::Result {
    writeln!(y, "digits:")?;
    let mut left = p.digits;
    for r in 0..g.rows {
        let count = left.min(g.per_row);
        left -= count;
        let name = format!("R{}", char::from(b'A' + r as u8));
        let below = if p.drive.commons() > 1 { f64::from(g.icon_rows) * ICON_PITCH } else { 0.0 };
        let oy = g.cy + below + f64::from(g.rows - 1 - r) * (DIGIT_H + g.row_gap);
        writeln!(y, "  - name: {name}")?;
        writeln!(y, "    style: seven")?;
        writeln!(y, "    count: {count}")?;
        writeln!(y, "    origin: [{}, {}]", mm(g.cx + g.channel), mm(oy))?;
        writeln!(y, "    height: {}", mm(DIGIT_H))?;
        writeln!(y, "    width: {}", mm(DIGIT_W))?;
        writeln!(y, "    pitch: {}", mm(g.digit_pitch))?;
        writeln!(y, "    slant: {}", mm(SLANT_DEG))?;
        writeln!(y, "    stroke: {}", mm(STROKE))?;
        writeln!(y, "    gap: {}", mm(GAP))?;
        if p.drive.commons() == 1 {
            writeln!(y, "    decimal_points: all")?;
        }
    }
    Ok(())
}

/// The icon band above the top row of digits, in columns lined up so the leads of the
/// upper band rows pass between the icons of the lower ones.
fn icon_band(y: &mut String, p: &Params, g: &Geometry) -> std::fmt::Result {
    if p.icons == 0 {
        return Ok(());
    }
    writeln!(y, "icons:")?;
    if p.drive.commons() > 1 {
        // Under each digit of the bottom row, centred below it.
        let skew = DIGIT_H * SLANT_DEG.to_radians().tan() / 4.0;
        for k in 0..p.icons {
            let icon = ICON_NAMES[k as usize % ICON_NAMES.len()];
            let net = format!("ST{:02}_{}", k + 1, icon.to_uppercase().replace('-', "_"));
            let x = g.cx + g.channel + f64::from(k) * g.digit_pitch + DIGIT_W / 2.0 - skew;
            let at = (x, g.cy + ICON / 2.0 + 0.3);
            writeln!(y, "  - {{name: {net}, icon: {icon}, at: [{}, {}], size: {}, stroke: 0.25}}", mm(at.0), mm(at.1), mm(ICON * 0.8))?;
        }
        return Ok(());
    }
    let base = g.cy + f64::from(g.rows) * (DIGIT_H + g.row_gap);
    let cols = g.icons_per_row.min(p.icons);
    let x0 = g.cx + (g.cw - f64::from(cols) * ICON_PITCH + (ICON_PITCH - ICON)) / 2.0;
    for k in 0..p.icons {
        let (row, col) = (k / g.icons_per_row, k % g.icons_per_row);
        let icon = ICON_NAMES[k as usize % ICON_NAMES.len()];
        let net = format!("ST{:02}_{}", k + 1, icon.to_uppercase().replace('-', "_"));
        let at = (x0 + f64::from(col) * ICON_PITCH, base + f64::from(row) * ICON_PITCH);
        writeln!(
            y,
            "  - {{name: {net}, icon: {icon}, at: [{}, {}], size: {}, stroke: 0.3}}",
            mm(at.0),
            mm(at.1),
            mm(ICON)
        )?;
    }
    Ok(())
}
