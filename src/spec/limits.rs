//! The limits of a layout: how large, how many, how deep.
//!
//! Takes the raw layout (counts, text lengths) and the resolved one (the routing grid),
//! gives located problems that name the limit. Every limit is far beyond any segment
//! glass we know of and keeps a build inside bounded memory and time: the router keeps a
//! grid over the whole front glass, and several checks compare elements pairwise, so an
//! unbounded count or size becomes an unbounded allocation or run time. The values are
//! listed in docs/layout-format.md, *Limits*.
//!
//! Counts are checked on the raw layout before anything is resolved, and a layout over
//! a count limit is refused with those problems alone: resolving and cross-checking a
//! hundred thousand icons first would take the time the limit is there to save.

use super::problems::Problems;
use super::raw::{RawDrive, RawLayout};
use super::scalar::{Scalar, ScalarKind};
use crate::layout::Layout;

/// Largest length or coordinate, either way, in mm (1 m: no single glass plate of a
/// segment display comes near; a glass this size is a window pane).
pub const MAX_LENGTH_MM: f64 = 1000.0;
/// Largest angle either way, in degrees (two full turns, for arcs that start past 360°).
pub const MAX_ANGLE_DEG: f64 = 720.0;
/// Largest whole number any key takes (pin numbers, counts); keeps `first_pin` plus the
/// pin count far from the end of the 32-bit pin numbers.
pub const MAX_WHOLE: i64 = 1_000_000;
/// Most pads in the row (`pads.count`, and the pads a layout needs).
pub const MAX_PADS: i64 = 1000;
/// Most digit groups.
pub const MAX_DIGIT_GROUPS: usize = 20;
/// Most digits over all groups.
pub const MAX_DIGITS_TOTAL: i64 = 200;
/// Most legends.
pub const MAX_LEGENDS: usize = 200;
/// Most characters in one legend.
pub const MAX_LEGEND_CHARS: usize = 64;
/// Most icons.
pub const MAX_ICONS: usize = 400;
/// Most bar graphs.
pub const MAX_BARS: usize = 50;
/// Most buses.
pub const MAX_BUSES: usize = 200;
/// Most points in one polygon icon or one bus.
pub const MAX_POINTS: usize = 1000;
/// Most characters of one icon's path data.
pub const MAX_PATH_CHARS: usize = 10_000;
/// Most entries in `pads.fixed` or `drive.fixed`.
pub const MAX_FIXED: usize = 1000;
/// Most font files.
pub const MAX_FONTS: usize = 16;
/// Most characters in the layout name (it becomes the stem of every output file name,
/// and file systems allow 255 bytes for a whole name).
pub const MAX_NAME_CHARS: usize = 64;
/// Most characters in an element, group or net name.
pub const MAX_NET_NAME_CHARS: usize = 64;
/// Most cells of the routing grid over the front glass (glass area / grid step²). A
/// cell costs at most 16 bytes in the router's grids (owner and cost, 4 bytes each, in
/// the base grid and the copy one attempt writes), so 64 M cells bound them to 1 GiB;
/// with the search budgets (`route::pages::MAX_PAGES_LENT`, `route::search::MAX_OPEN`)
/// a build stays under 2 GB whatever the layout (docs/performance.md, *Memory bound*).
/// The 40-digit benchmark routes 25 M cells in 132 MiB.
pub const MAX_GRID_CELLS: f64 = 64e6;
/// Largest layout file, bytes.
pub const MAX_LAYOUT_BYTES: u64 = 1 << 20;
/// Largest font file, bytes.
pub const MAX_FONT_BYTES: u64 = 1 << 20;
/// Deepest nesting of YAML collections (a layout needs five).
pub const MAX_DEPTH: usize = 32;

/// Checks every count and text length of the raw layout; true when all are inside.
pub fn counts(p: &mut Problems, raw: &RawLayout) -> bool {
    let before = p.len();
    let digits = raw.digits.as_deref().unwrap_or(&[]);
    list(p, "digits", digits.len(), MAX_DIGIT_GROUPS, "digit groups");
    let total: i64 = digits.iter().map(|d| d.count.as_ref().and_then(whole).unwrap_or(0).max(0)).sum();
    if total > MAX_DIGITS_TOTAL {
        p.bad(
            "digits",
            format!("{total} digits over all groups are more than segmask lays out"),
            &format!("at most {MAX_DIGITS_TOTAL} digits in all"),
        );
    }
    let legends = raw.legends.as_deref().unwrap_or(&[]);
    list(p, "legends", legends.len(), MAX_LEGENDS, "legends");
    for (i, l) in legends.iter().enumerate() {
        let allowed = format!("at most {MAX_LEGEND_CHARS} characters; split it into several legends");
        text(p, &format!("legends[{i}].text"), l.text.as_ref(), MAX_LEGEND_CHARS, "one legend holds", &allowed);
    }
    let icons = raw.icons.as_deref().unwrap_or(&[]);
    list(p, "icons", icons.len(), MAX_ICONS, "icons");
    for (i, icon) in icons.iter().enumerate() {
        if let Some(pts) = &icon.polygon {
            list(p, &format!("icons[{i}].polygon"), pts.len(), MAX_POINTS, "points");
        }
        let d = icon.path.as_ref().and_then(|path| path.d.as_ref());
        let allowed = format!("at most {MAX_PATH_CHARS} characters");
        text(p, &format!("icons[{i}].path.d"), d, MAX_PATH_CHARS, "one icon's path data takes", &allowed);
    }
    list(p, "bars", raw.bars.as_deref().map_or(0, <[_]>::len), MAX_BARS, "bar graphs");
    let buses = raw.buses.as_deref().unwrap_or(&[]);
    list(p, "buses", buses.len(), MAX_BUSES, "buses");
    for (i, b) in buses.iter().enumerate() {
        list(p, &format!("buses[{i}].points"), b.points.as_deref().map_or(0, <[_]>::len), MAX_POINTS, "points");
    }
    if let Some(f) = raw.pads.as_ref().and_then(|r| r.fixed.as_ref()) {
        list(p, "pads.fixed", f.0.len(), MAX_FIXED, "fixed pins");
    }
    if let Some(RawDrive::Multiplexed(m)) = &raw.drive
        && let Some(f) = &m.fixed
    {
        list(p, "drive.fixed", f.0.len(), MAX_FIXED, "fixed elements");
    }
    list(p, "fonts", raw.fonts.as_deref().map_or(0, <[_]>::len), MAX_FONTS, "font files");
    p.len() == before
}

/// A whole number as written, if it is one (for counting before resolution).
fn whole(s: &Scalar) -> Option<i64> {
    match s.kind {
        ScalarKind::Integer(i) => Some(i64::try_from(i).unwrap_or(i64::MAX)),
        ScalarKind::Number(x) if x.is_finite() => Some(x.clamp(-1e15, 1e15) as i64),
        _ => s.text.trim().parse().ok(),
    }
}

/// A text at `key` holds at most `max` characters.
fn text(p: &mut Problems, key: &str, v: Option<&Scalar>, max: usize, what: &str, allowed: &str) {
    let n = v.map_or(0, |t| t.text.chars().count());
    if n > max {
        p.bad(key, format!("{n} characters are more than {what}"), allowed);
    }
}

/// A list at `key` holds at most `max` items.
fn list(p: &mut Problems, key: &str, n: usize, max: usize, what: &str) {
    if n > max {
        p.bad(key, format!("{n} {what} are more than segmask takes here"), &format!("at most {max} {what}"));
    }
}

/// The routing grid over the front glass stays within [`MAX_GRID_CELLS`].
pub fn grid(p: &mut Problems, l: &Layout) {
    if !p.clean(&["glass", "rules"]) {
        return;
    }
    let step = l.rules.grid_step();
    let cells = (l.glass.front.width / step + 1.0) * (l.glass.front.height / step + 1.0);
    if cells > MAX_GRID_CELLS {
        let side = (MAX_GRID_CELLS.sqrt() * step).floor();
        p.bad(
            "glass.front",
            format!(
                "a {} × {} mm glass at a routing step of {} mm (half the smaller of rules.lead_width and rules.min_gap) \
                 needs {:.0} million grid cells",
                l.glass.front.width,
                l.glass.front.height,
                step,
                cells / 1e6
            ),
            &format!(
                "at most {:.0} million cells: a smaller glass (about {side} × {side} mm at this step) or wider leads and gaps",
                MAX_GRID_CELLS / 1e6
            ),
        );
    }
}

/// The pads a layout needs stay within [`MAX_PADS`].
pub fn pads(p: &mut Problems, l: &Layout) {
    let need = i64::from(super::nets::pads_needed(l));
    if need > MAX_PADS {
        p.bad("pads", format!("{need} pads are needed, more than one pad row takes"), &format!("at most {MAX_PADS} pads"));
    }
}

/// The deepest nesting of flow (`[`, `{`) and block collections in `text`, and the
/// 1-based line and column where it first goes deeper than [`MAX_DEPTH`], if it does.
///
/// A cheap scan ahead of the YAML reader, which would otherwise walk (and the key
/// locator index) a hostile nesting level by level: quoted text and comments are
/// skipped, block nesting is counted by indentation steps and `- ` items.
pub fn too_deep(text: &str) -> Option<(usize, usize)> {
    let mut indents: Vec<usize> = Vec::new();
    let mut flow = 0usize;
    for (ln, line) in text.lines().enumerate() {
        let bytes = line.as_bytes();
        let indent = bytes.iter().take_while(|b| **b == b' ').count();
        let rest = &line[indent..];
        if flow == 0 && !rest.is_empty() && !rest.starts_with('#') {
            while indents.last().is_some_and(|&i| i > indent) {
                indents.pop();
            }
            if indents.last() != Some(&indent) {
                indents.push(indent);
            }
        }
        let mut block = indents.len();
        let mut quote: Option<u8> = None;
        let mut at_start = true;
        for (col, &b) in bytes.iter().enumerate().skip(indent) {
            match quote {
                Some(q) if b == q => quote = None,
                Some(_) => {}
                None => match b {
                    b'"' | b'\'' if at_start || col == 0 || matches!(bytes[col - 1], b' ' | b'[' | b'{' | b',' | b':') => {
                        quote = Some(b)
                    }
                    b'#' if col == 0 || bytes[col - 1] == b' ' => break,
                    b'[' | b'{' => flow += 1,
                    b']' | b'}' => flow = flow.saturating_sub(1),
                    b'-' if flow == 0 && at_start && matches!(bytes.get(col + 1), None | Some(b' ')) => block += 1,
                    _ => {}
                },
            }
            if b != b' ' && b != b'-' {
                at_start = false;
            }
            if block + flow > MAX_DEPTH {
                return Some((ln + 1, col + 1));
            }
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ordinary_nesting_passes_and_deep_nesting_is_located() {
        let ok = "a:\n  b:\n    - [1, [2, 3]]\n    - {x: '[[[[[[', y: \"{{{{\"}\n";
        assert_eq!(too_deep(ok), None);
        let flow = format!("a: {}1{}\n", "[".repeat(40), "]".repeat(40));
        assert_eq!(too_deep(&flow), Some((1, 4 + MAX_DEPTH - 1)));
        let dashes = format!("a:\n  {}x\n", "- ".repeat(40));
        assert!(too_deep(&dashes).is_some_and(|(l, _)| l == 2));
        let indented: String = (0..40).map(|i| format!("{}k{i}:\n", " ".repeat(i))).collect();
        assert!(too_deep(&indented).is_some_and(|(l, _)| l == MAX_DEPTH + 1));
        assert_eq!(too_deep("# [[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\n"), None);
    }
}
