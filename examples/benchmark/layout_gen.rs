//! Writes the benchmark layout: parameters (digits, rows, style, icons, drive) → layout
//! YAML in segmask's own format (docs/layout-format.md), sized so that everything fits.
//!
//! The scenario is made up for the benchmark: a wall panel for a cold store, one row of
//! digits per floor showing the temperatures of its rooms (two decimals, so under static
//! drive every digit has a decimal point), and status icons (door, defrost, alarm, …):
//! a band above the digits under static drive, under the bottom row when multiplexed.
//! Only the sizes matter: the glass, window, seal and pad row are computed from the
//! element count so that leads from the upper rows have channels between the digits of
//! the rows below, and the pad row sits under the digits on the bottom ledge.
//! Multiplexed with two rows, the upper row's lines go to a second pad row on a ledge
//! on top (`pads.second_row`).
//!
//! This file and the two it includes (`digit_style.rs`, `icons.rs`) use only `std`, so
//! `tests/cli/benchmark_layout.rs` includes it with `#[path]` and checks that what it writes
//! is a valid layout.

#[path = "digit_style.rs"]
pub mod digit_style;
#[path = "icons.rs"]
pub mod icons;

pub use digit_style::{DigitSize, Style};
use icons::ICON_PITCH;
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
    /// Number of digits (1 to 26 × 100); under static drive each has a decimal point.
    pub digits: u32,
    /// Rows of digits [static: ⌈digits / 8⌉; multiplexed: 1].
    pub rows: Option<u32>,
    /// Segment set of the digits.
    pub style: Style,
    /// Number of icons: static, in bands above the digits; multiplexed, under the bottom
    /// row (one under each digit when there are no more icons than digits there, else a
    /// band).
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
    /// Pads the layout needs at least (docs/layout-format.md, "Pads needed").
    pub pads: u32,
    /// Pins the assign stage is expected to make (`pins_made`); the pad row is sized for
    /// these.
    pub pins: u32,
}

// Sizes in mm. Rules are written out in the layout so these stay consistent with them;
// digit sizes are in digit_style.rs, icon sizes in icons.rs.

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
/// Spare room in the pad row beyond the pins expected.
const PAD_SPARE: f64 = 1.15;

/// Generates the layout, or says which parameter is out of range.
pub fn generate(p: &Params) -> Result<Generated, String> {
    let g = Geometry::plan(p)?;
    let mut name = format!("bench-{}d-{}i-{}", p.digits, p.icons, p.drive.tag());
    if g.rows != default_rows(p) {
        write!(name, "-{}rows", g.rows).map_err(|e| e.to_string())?;
    }
    if p.style != Style::Seven {
        write!(name, "-{}", p.style.word()).map_err(|e| e.to_string())?;
    }
    let mut y = String::new();
    header(&mut y, &name, p, &g).map_err(|e| e.to_string())?;
    digit_rows(&mut y, p, &g).map_err(|e| e.to_string())?;
    icons::write_icons(&mut y, p, &g.icon_area(p)).map_err(|e| e.to_string())?;
    Ok(Generated { name, yaml: y, elements: g.elements, pads: g.pads, pins: g.pins })
}

/// Rows when `--rows` is not given: one when multiplexed (docs/performance.md, *Why one
/// row when multiplexed*), else eight digits to a row.
pub fn default_rows(p: &Params) -> u32 {
    if p.drive.commons() > 1 { 1 } else { p.digits.div_ceil(8) }
}

/// Pins the assign stage makes (docs/architecture.md, *Multiplexing*): static, one per
/// element and the common. Multiplexed at duty 1/N, seven-segment digits (no points)
/// take their template's ⌈7/N⌉ SEG lines each and leave the rest of those lines' places
/// free; icons fill the free places first and open new lines, N to a line, only when none
/// is left. Fourteen-segment digits take eight lines each on the top and bottom commons
/// and keep their free places free, so the icons (all near the digits) open lines of
/// their own on the N − 2 commons in between, or on all N at 1/2 duty, where the digits
/// leave none.
fn pins_made(p: &Params, elements: u32) -> u32 {
    let n = p.drive.commons();
    if n == 1 {
        return elements + 1;
    }
    match p.style {
        Style::Seven => {
            // One icon under each digit of the bottom row takes a free place there; the
            // rest stand in columns of N beside the rows, N to a new line
            // (`icons::columns_beside`).
            let per_digit = 7u32.div_ceil(n);
            n + p.digits * per_digit + column_icons(p, bottom_digits(p)).div_ceil(n)
        }
        Style::Fourteen => n + 8 * p.digits + p.icons.div_ceil(if n > 2 { n - 2 } else { n }),
    }
}

/// Digits in the bottom row when the digits are split into rows (as `Geometry::plan`).
fn bottom_digits(p: &Params) -> u32 {
    let rows = p.rows.unwrap_or_else(|| default_rows(p)).max(1);
    p.digits / rows + u32::from(rows - 1 < p.digits % rows)
}

/// Icons standing in columns beside the rows rather than one under each digit of the
/// bottom row (`bottom` digits): multiplexed seven-segment digits only, the rest beyond
/// one per digit.
fn column_icons(p: &Params, bottom: u32) -> u32 {
    if p.drive.commons() > 1 && p.style == Style::Seven { p.icons.saturating_sub(bottom) } else { 0 }
}

/// Every size derived from the parameters.
#[derive(Debug, Clone)]
struct Geometry {
    rows: u32,
    /// Digits in each row, top row first (split as evenly as possible, the upper rows
    /// taking one more).
    row_counts: Vec<u32>,
    size: DigitSize,
    elements: u32,
    pads: u32,
    pins: u32,
    pad_pitch: f64,
    /// Channel between neighbouring digit cells.
    channel: f64,
    digit_pitch: f64,
    /// Vertical room between rows.
    row_gap: f64,
    /// Static: icons in each band row above the digits.
    icons_per_row: u32,
    /// Icon rows: static, above the digits; multiplexed, below them.
    icon_rows: u32,
    /// Content box (digits and icons), lower-left and size.
    cx: f64,
    cy: f64,
    cw: f64,
    ch: f64,
    glass_w: f64,
    glass_h: f64,
    ledge: f64,
    /// Ledge on top for a second pad row (0 when there is none): multiplexed with two
    /// rows of digits, the upper row's lines go to pads on the top side.
    top_ledge: f64,
    /// Columns of icons beside the bottom row and beside the top row.
    column_split: [u32; 2],
}

impl Geometry {
    fn plan(p: &Params) -> Result<Geometry, String> {
        if p.digits == 0 {
            return Err("--digits must be at least 1".into());
        }
        let n = p.drive.commons();
        // Multiplexed, the commons run along a row of digits and the SEG leads leave
        // below it: rows stacked above each other cut the commons of the rows below (a
        // planar-routing limit, docs/performance.md), so one row unless asked for more.
        let rows = p.rows.unwrap_or_else(|| default_rows(p));
        if rows == 0 || rows > 26 || rows > p.digits {
            return Err(format!("--rows {rows} does not suit {} digits (allowed: 1 to 26, at most the digit count)", p.digits));
        }
        let per_row = p.digits.div_ceil(rows);
        if per_row > 100 {
            return Err(format!("{per_row} digits in a row (allowed: at most 100; add rows)"));
        }
        let row_counts: Vec<u32> = (0..rows).map(|r| p.digits / rows + u32::from(r < p.digits % rows)).collect();
        let size = p.style.size();
        // Static: every digit has a decimal point.
        let segments = p.style.segments() + u32::from(n == 1);
        let elements = p.digits * segments + p.icons;
        let lines = |e: u32| e.div_ceil(n);
        let pads = if n == 1 { elements + 1 } else { n + lines(elements) };
        let pins = pins_made(p, elements);
        // Leads that must pass the bottom row: the rows above (a digit's segments shared
        // N to a line) and the icons, spread over the channels, plus the bottom row's own.
        let own = segments.div_ceil(n);
        // Multiplexed with two rows, the upper row's leads go up to a second pad row.
        let pads_on_top = n > 1 && rows == 2;
        let through = if pads_on_top { 0 } else { rows - 1 };
        let above = through * per_row * own + lines(p.icons);
        let per_channel = above.div_ceil(per_row + 1) + own;
        let channel = (f64::from(per_channel) * LEAD_PITCH * 1.6 + 0.8).max(1.5);
        let cell = size.width + size.height * size.slant.to_radians().tan() + 1.5 * size.stroke;
        let digit_pitch = round_up(cell + channel, 0.05);
        // Room under a row for its leads to turn into the channels; multiplexed, also for
        // the commons of the row above and the row below to run along the gap on the back
        // plate, one lead pitch apart, each beside its own row.
        let mut turn = f64::from(own) * LEAD_PITCH * 2.0 + 1.5;
        if n > 1 && rows > 1 {
            turn += 2.0 * f64::from(n) * LEAD_PITCH + 1.0;
        }
        let row_gap = round_up(turn.max(2.5), 0.05);
        // Multiplexed seven-segment digits: the icons beyond one under each digit of the
        // bottom row stand in columns of N at the right end of the rows (with a second pad
        // row, half of the columns beside each row).
        let bottom = row_counts[rows as usize - 1];
        let columns = column_icons(p, bottom).div_ceil(n);
        let column_split = [columns, 0];
        let cw = f64::from(per_row) * digit_pitch + channel + f64::from(column_split[0].max(column_split[1])) * icons::COLUMN_PITCH;
        let icons_per_row = ((cw / ICON_PITCH).floor() as u32).max(1);
        // Multiplexed: icons below the bottom row (each takes a free place on the bottom
        // common); static: bands above the digits.
        let under = p.icons - column_icons(p, bottom);
        let icon_rows = if n > 1 { icons::rows_below(under, bottom, cw) } else { p.icons.div_ceil(icons_per_row) };
        let ch = f64::from(rows) * (size.height + row_gap) + f64::from(icon_rows) * ICON_PITCH;
        let pad_pitch = PAD_PITCHES.iter().copied().find(|q| f64::from(pins) * q <= cw).unwrap_or(0.5);
        let pad_row = f64::from(pins) * PAD_SPARE * pad_pitch + 2.0 * (PAD_EDGE + SEAL + 1.5);
        // Room in the seal at each end for half the transfer dots (one per common, 1.2 mm
        // pads a lead pitch apart) beyond the outermost lead.
        let dots = 2.0 * (f64::from(n).div_euclid(2.0) + 1.0) * 1.5;
        let glass_w = round_up((cw + 2.0 * (SEAL + 2.0 * MARGIN)).max(pad_row) + dots, 0.5);
        // Fan-out levels: leads leave the channels in bunches and spread out to evenly
        // spaced pads; the router stacks one level per lead a lead passes under. Measured
        // at static drive: 16 digits + 20 icons (149 pads) needed 61 levels.
        let levels = f64::from((2 * per_channel).max(pins / 2) + 10);
        let ledge = round_up((PAD_LENGTH + PAD_EDGE + levels * LEAD_PITCH - SEAL + 1.0).max(5.0), 0.5);
        let cx = (glass_w - cw) / 2.0;
        let cy = ledge + SEAL + 2.0 * MARGIN;
        let top_ledge = if pads_on_top { ledge } else { 0.0 };
        let glass_h = round_up(cy + ch + 2.0 * MARGIN + SEAL, 0.5) + top_ledge;
        Ok(Geometry {
            rows, row_counts, size, elements, pads, pins, pad_pitch, channel, digit_pitch, row_gap, icons_per_row,
            icon_rows, cx, cy, cw, ch, glass_w, glass_h, ledge, top_ledge, column_split,
        })
    }

    /// Where the icons go, for `icons.rs`.
    fn icon_area(&self, p: &Params) -> icons::Area {
        icons::Area {
            x: self.cx,
            y: self.cy,
            width: self.cw,
            first_digit: self.cx + self.channel,
            digit_pitch: self.digit_pitch,
            digit: self.size,
            bottom_digits: self.row_counts[self.rows as usize - 1],
            above: self.cy + f64::from(self.rows) * (self.size.height + self.row_gap),
            icons_per_row: self.icons_per_row,
            columns: icons::Columns {
                x: self.cx + self.channel + f64::from(self.row_counts[0]) * self.digit_pitch,
                split: self.column_split,
                row_y: [self.row_origin_y(p, self.rows - 1), self.row_origin_y(p, 0)],
            },
        }
    }

    /// Origin y of row `r` (0 = the top row): above the icon rows when multiplexed.
    fn row_origin_y(&self, p: &Params, r: u32) -> f64 {
        let below = if p.drive.commons() > 1 { f64::from(self.icon_rows) * ICON_PITCH } else { 0.0 };
        self.cy + below + f64::from(self.rows - 1 - r) * (self.size.height + self.row_gap)
    }
}

fn round_up(v: f64, step: f64) -> f64 {
    (v / step - 1e-9).ceil() * step
}

/// A length for YAML: mm with at most three decimals.
pub fn mm(v: f64) -> String {
    let s = format!("{v:.3}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".into() } else { s.into() }
}

fn header(y: &mut String, name: &str, p: &Params, g: &Geometry) -> std::fmt::Result {
    writeln!(y, "# Benchmark layout written by `cargo run --example benchmark` (examples/benchmark/).")?;
    writeln!(y, "# Made-up scenario: a cold-store wall panel, one row of digits per floor and a band")?;
    writeln!(y, "# of room status icons; {} digits in {} rows, {} icons in {} rows.", p.digits, g.rows, p.icons, g.icon_rows)?;
    if p.style != Style::Seven {
        writeln!(y, "# Digits of {} segments.", p.style.segments())?;
    }
    writeln!(y, "name: {name}")?;
    writeln!(y, "glass:")?;
    writeln!(y, "  front: {{width: {}, height: {}}}", mm(g.glass_w), mm(g.glass_h))?;
    let back_h = g.glass_h - g.ledge - g.top_ledge;
    writeln!(y, "  back: {{width: {}, height: {}, x: 0, y: {}}}", mm(g.glass_w), mm(back_h), mm(g.ledge))?;
    let wx = g.cx - MARGIN;
    let wy = g.cy - MARGIN;
    writeln!(y, "window: {{x: {}, y: {}, width: {}, height: {}}}", mm(wx), mm(wy), mm(g.cw + 2.0 * MARGIN), mm(g.ch + 2.0 * MARGIN))?;
    writeln!(y, "cell_gap: 7um")?;
    writeln!(y, "resist: positive")?;
    writeln!(y, "rules: {{min_width: 0.1, min_gap: 0.05, undercut: 5um}}")?;
    if g.top_ledge > 0.0 {
        writeln!(y, "seal: {{width: 1.0, inset: 1.5, fill_port: {{side: left, at: {}, width: 3}}}}", mm(back_h / 2.0))?;
    } else {
        writeln!(y, "seal: {{width: 1.0, inset: 1.5, fill_port: {{side: top, at: {}, width: 3}}}}", mm(g.glass_w / 2.0))?;
    }
    let pw = g.pad_pitch * 0.6;
    let second = if g.top_ledge > 0.0 { ", second_row: {}" } else { "" };
    writeln!(
        y,
        "pads: {{side: bottom, pitch: {}, width: {}, length: {}, edge_margin: {}{second}}}",
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
    let s = &g.size;
    for (r, &count) in g.row_counts.iter().enumerate() {
        let r = r as u32;
        let name = format!("R{}", char::from(b'A' + r as u8));
        let oy = g.row_origin_y(p, r);
        writeln!(y, "  - name: {name}")?;
        writeln!(y, "    style: {}", p.style.word())?;
        writeln!(y, "    count: {count}")?;
        writeln!(y, "    origin: [{}, {}]", mm(g.cx + g.channel), mm(oy))?;
        writeln!(y, "    height: {}", mm(s.height))?;
        writeln!(y, "    width: {}", mm(s.width))?;
        writeln!(y, "    pitch: {}", mm(g.digit_pitch))?;
        writeln!(y, "    slant: {}", mm(s.slant))?;
        writeln!(y, "    stroke: {}", mm(s.stroke))?;
        writeln!(y, "    gap: {}", mm(s.gap))?;
        if p.drive.commons() == 1 {
            writeln!(y, "    decimal_points: all")?;
        }
    }
    Ok(())
}
