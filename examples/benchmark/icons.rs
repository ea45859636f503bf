//! Where the benchmark's status icons go: the icon count, the drive and the digits'
//! placement → the `icons:` list of the layout.
//!
//! - Static drive: bands above the top row of digits, in columns lined up so the leads
//!   of the upper band rows pass between the icons of the lower ones.
//! - Multiplexed, no more icons than digits in the bottom row: one under each digit, from
//!   the left. The icon takes the free place its digit's template leaves on the bottom
//!   common (docs/architecture.md, *Multiplexing*), so the pin count stays N + ⌈S/N⌉.
//! - Multiplexed seven-segment digits, more icons than that: one under each digit as
//!   above, the rest in columns of N (the number of commons) at the right end of the
//!   rows, each icon level with one of the commons of its row, so that a column is one
//!   SEG line whose icons meet the digits' commons at their own heights (with a second
//!   pad row, half the columns beside each row). A band of icons under a row, as the
//!   generator wrote before, does not route (docs/performance.md).
//! - Multiplexed fourteen-segment digits, more icons than digits: a band under the bottom
//!   row, spread evenly along it, in as many band rows as it takes to keep the columns
//!   `BAND_PITCH` apart; their leads go straight down to the ledge.
//!
//! Uses only `std`; part of the generator (`layout_gen.rs`).

use super::{mm, DigitSize, Params};
use std::fmt::Write;

/// Size of a static band's icons and the room each takes in the band, mm.
pub const ICON: f64 = 3.0;
/// Pitch of icon columns in a static band, and the height of one band row.
pub const ICON_PITCH: f64 = 4.5;
/// Size of a multiplexed icon (smaller, to sit under a digit).
const MUX_ICON: f64 = ICON * 0.8;
/// Closest spacing of icon columns in a multiplexed band: an icon and 1 mm beside it, room
/// for a few leads from the band row above.
const BAND_PITCH: f64 = 3.4;
const ICON_NAMES: [&str; 16] = [
    "snowflake", "drop", "warning", "lock", "bell", "thermometer", "clock", "power", "plug", "heat", "sun",
    "home", "speaker", "wireless", "check", "cross",
];

/// What the icon placement needs to know of the layout, mm.
#[derive(Debug, Clone, Copy)]
pub struct Area {
    /// Left edge of the content box (digits, channels and icons).
    pub x: f64,
    /// Bottom edge of the content box.
    pub y: f64,
    /// Width of the content box.
    pub width: f64,
    /// Origin x of the first digit of every row.
    pub first_digit: f64,
    /// Distance between digit origins.
    pub digit_pitch: f64,
    /// Size of the digits.
    pub digit: DigitSize,
    /// Digits in the bottom row.
    pub bottom_digits: u32,
    /// Static: bottom of the band above the top row.
    pub above: f64,
    /// Static: icons in each band row.
    pub icons_per_row: u32,
    /// Multiplexed: the columns of icons beside the rows.
    pub columns: Columns,
}

/// Columns of stacked icons at the right end of the rows.
#[derive(Debug, Clone, Copy)]
pub struct Columns {
    /// Left edge of the first column.
    pub x: f64,
    /// Columns beside the bottom row and beside the top row.
    pub split: [u32; 2],
    /// Origin y of the bottom row and of the top row.
    pub row_y: [f64; 2],
}

/// Distance between columns of stacked icons: an icon and room for the column's own
/// lead and the back leads beside it.
pub const COLUMN_PITCH: f64 = 2.8;

/// Band rows a multiplexed layout needs under its bottom row for `icons` icons, the
/// bottom row holding `bottom` digits in a content box `width` wide.
pub fn rows_below(icons: u32, bottom: u32, width: f64) -> u32 {
    match icons {
        0 => 0,
        i if i <= bottom => 1,
        i => i.div_ceil(band_columns(i, width)),
    }
}

fn band_columns(icons: u32, width: f64) -> u32 {
    ((width / BAND_PITCH).floor() as u32).clamp(1, icons)
}

/// The net name and icon of icon `k` (0-based): `ST01_SNOWFLAKE`, …
fn named(k: u32) -> (String, &'static str) {
    let icon = ICON_NAMES[k as usize % ICON_NAMES.len()];
    (format!("ST{:02}_{}", k + 1, icon.to_uppercase().replace('-', "_")), icon)
}

/// Writes the `icons:` list (nothing when there are none).
pub fn write_icons(y: &mut String, p: &Params, a: &Area) -> std::fmt::Result {
    if p.icons == 0 {
        return Ok(());
    }
    writeln!(y, "icons:")?;
    if p.drive.commons() == 1 {
        band_above(y, p.icons, a)
    } else if p.icons <= a.bottom_digits {
        under_digits(y, p.icons, a)
    } else if a.columns.split != [0, 0] {
        under_digits(y, a.bottom_digits, a)?;
        columns_beside(y, a.bottom_digits, p.icons - a.bottom_digits, p.drive.commons(), a)
    } else {
        band_below(y, p.icons, a)
    }
}

/// `count` icons from number `first` in columns of `n`, top to bottom, beside the bottom
/// row and then beside the top row; each icon centred in one of `n` equal bands of the
/// digit height.
fn columns_beside(y: &mut String, first: u32, count: u32, n: u32, a: &Area) -> std::fmt::Result {
    let c = &a.columns;
    let h = a.digit.height;
    let band = h / f64::from(n);
    let size = (band * 0.7).min(2.0);
    let mut k = first;
    let mut left = count;
    for (row, &cols) in c.split.iter().enumerate() {
        for col in 0..cols {
            let x = c.x + f64::from(col) * COLUMN_PITCH;
            for i in 0..n.min(left) {
                let v = c.row_y[row] + h - (f64::from(i) + 0.5) * band - size / 2.0;
                icon_line(y, k, (x, v), size, size / 10.0)?;
                k += 1;
            }
            left = left.saturating_sub(n);
        }
    }
    Ok(())
}

fn icon_line(y: &mut String, k: u32, at: (f64, f64), size: f64, stroke: f64) -> std::fmt::Result {
    let (net, icon) = named(k);
    writeln!(y, "  - {{name: {net}, icon: {icon}, at: [{}, {}], size: {}, stroke: {}}}", mm(at.0), mm(at.1), mm(size), mm(stroke))
}

/// Height of a multiplexed icon's box above the bottom of its band row.
const MUX_RISE: f64 = ICON / 2.0 + 0.3;

/// One icon under each of the first digits of the bottom row.
fn under_digits(y: &mut String, icons: u32, a: &Area) -> std::fmt::Result {
    let d = &a.digit;
    let skew = d.height * d.slant.to_radians().tan() / 4.0;
    for k in 0..icons {
        let x = a.first_digit + f64::from(k) * a.digit_pitch + d.width / 2.0 - skew;
        icon_line(y, k, (x, a.y + MUX_RISE), MUX_ICON, 0.25)?;
    }
    Ok(())
}

/// A band under the bottom row, spread evenly along the content box, top band row first.
fn band_below(y: &mut String, icons: u32, a: &Area) -> std::fmt::Result {
    let cols = band_columns(icons, a.width);
    let rows = icons.div_ceil(cols);
    let spacing = a.width / f64::from(cols);
    for k in 0..icons {
        let (row, col) = (k / cols, k % cols);
        let x = a.x + (f64::from(col) + 0.5) * spacing - MUX_ICON / 2.0;
        let v = a.y + f64::from(rows - 1 - row) * ICON_PITCH + MUX_RISE;
        icon_line(y, k, (x, v), MUX_ICON, 0.25)?;
    }
    Ok(())
}

/// Bands above the top row, centred, bottom band row first.
fn band_above(y: &mut String, icons: u32, a: &Area) -> std::fmt::Result {
    let cols = a.icons_per_row.min(icons);
    let x0 = a.x + (a.width - f64::from(cols) * ICON_PITCH + (ICON_PITCH - ICON)) / 2.0;
    for k in 0..icons {
        let (row, col) = (k / a.icons_per_row, k % a.icons_per_row);
        let at = (x0 + f64::from(col) * ICON_PITCH, a.above + f64::from(row) * ICON_PITCH);
        icon_line(y, k, at, ICON, 0.3)?;
    }
    Ok(())
}
