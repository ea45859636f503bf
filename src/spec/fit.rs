//! How the plate-level parts fit together: back glass on the front glass, seal inside
//! the back glass, window inside the liquid-crystal region, a ledge under the pads, the
//! pad row along the ledge, the fill port on its side.

use super::nets::{element_nets, pads_needed};
use super::problems::Problems;
use super::read::mm;
use super::resolve::{SIDES, side_length};
use crate::layout::{Layout, Rect, Side};

/// Runs every fit check whose inputs were read without problems.
pub fn check_fit(p: &mut Problems, l: &Layout) {
    if p.clean(&["glass"]) {
        back_on_front(p, l);
    }
    if p.clean(&["glass", "seal.inset", "seal.width"]) && seal_region(p, l) && p.clean(&["window"]) {
        window_inside(p, l);
        if p.clean(&["window", "marks", "rules"]) {
            super::mark_fit::marks_fit(p, l);
        }
    }
    if p.clean(&["glass", "pads.side", "pads.length", "pads.edge_margin", "pads.second_row"])
        && l.pads.rows().zip(ROW_KEYS).all(|(row, key)| ledge(p, l, row, key))
        && p.clean(&["pads", "drive", "digits", "legends", "icons", "bars"])
    {
        pad_row(p, l);
    }
    if p.clean(&["glass", "seal", "pads.side"]) {
        fill_port(p, l);
    }
}

fn span(r: &Rect) -> String {
    format!("x {} to {}, y {} to {}", num(r.x), num(r.x1()), num(r.y), num(r.y1()))
}

fn num(v: f64) -> String {
    mm(v).trim_end_matches(" mm").to_string()
}

fn back_on_front(p: &mut Problems, l: &Layout) {
    let (f, b) = (&l.glass.front, &l.glass.back);
    if !f.contains_rect(b) {
        p.bad(
            "glass.back",
            format!("the back glass ({}) reaches outside the front glass ({})", span(b), span(f)),
            "a back glass lying within the front glass",
        );
    }
}

/// The liquid-crystal region: the back glass inset by the seal's inset and width.
pub fn liquid_crystal_region(l: &Layout) -> Rect {
    l.glass.back.inset(l.seal.inset + l.seal.width)
}

fn seal_region(p: &mut Problems, l: &Layout) -> bool {
    let lc = liquid_crystal_region(l);
    if lc.width <= 0.0 || lc.height <= 0.0 {
        p.bad(
            "seal.inset",
            format!(
                "inset {} plus width {} leave no room inside the back glass ({} × {})",
                mm(l.seal.inset),
                mm(l.seal.width),
                mm(l.glass.back.width),
                mm(l.glass.back.height)
            ),
            "inset + width less than half the smaller side of the back glass",
        );
        return false;
    }
    true
}

fn window_inside(p: &mut Problems, l: &Layout) {
    let lc = liquid_crystal_region(l);
    if !lc.contains_rect(&l.window) {
        p.bad(
            "window",
            format!("the window ({}) reaches outside the liquid-crystal region inside the seal", span(&l.window)),
            &format!("a window within {}", span(&lc)),
        );
    }
}

/// How far the front glass extends beyond the back glass on side `s`.
pub fn ledge_depth(l: &Layout, s: Side) -> f64 {
    let (f, b) = (&l.glass.front, &l.glass.back);
    match s {
        Side::Bottom => b.y - f.y,
        Side::Top => f.y1() - b.y1(),
        Side::Left => b.x - f.x,
        Side::Right => f.x1() - b.x1(),
    }
}

/// The keys of the first and second pad rows.
const ROW_KEYS: [&str; 2] = ["pads", "pads.second_row"];

fn ledge(p: &mut Problems, l: &Layout, row: &crate::layout::Pads, key: &str) -> bool {
    let need = row.length + row.edge_margin;
    let depth = ledge_depth(l, row.side);
    if depth + 1e-9 >= need {
        return true;
    }
    let fits: Vec<&str> = SIDES.iter().filter(|(_, s)| ledge_depth(l, *s) + 1e-9 >= need).map(|(n, _)| *n).collect();
    let allowed = if fits.is_empty() {
        format!("none: no side of the front glass extends {} beyond the back glass", mm(need))
    } else if key == "pads" {
        fits.join(", ")
    } else {
        format!("a front glass extending {} beyond the back glass on the {} side", mm(need), row.side.name())
    };
    p.add(
        &format!("{key}.side"),
        format!(
            "the front glass extends {} beyond the back glass on the {} side; pads need a ledge of {} (length {} + edge_margin {})",
            mm(depth.max(0.0)),
            row.side.name(),
            mm(need),
            mm(row.length),
            mm(row.edge_margin)
        ),
        Some(allowed),
    );
    false
}

/// Where a row of `n` pads starts (its given start, or centred on the back glass) and
/// how many pads fit from there (or centred) within the edge margins.
fn row_room(l: &Layout, row: &crate::layout::Pads, n: u32) -> (f64, bool, u64) {
    let side_len = side_length(&l.glass.front, row.side);
    let back = &l.glass.back;
    let back_centre = match row.side {
        Side::Bottom | Side::Top => back.x + back.width / 2.0,
        Side::Left | Side::Right => back.y + back.height / 2.0,
    };
    let span = f64::from(n.saturating_sub(1)) * row.pitch;
    let first = row.start.unwrap_or(back_centre - span / 2.0);
    let (lo, hi) = (first - row.width / 2.0, first + span + row.width / 2.0);
    let m = row.edge_margin;
    let fits_all = lo >= m - 1e-9 && hi <= side_len - m + 1e-9;
    let room = match row.start {
        Some(s) if s - row.width / 2.0 >= m => side_len - m - row.width / 2.0 - s,
        Some(_) => -1.0,
        None => 2.0 * (back_centre - m).min(side_len - m - back_centre) - row.width,
    };
    let fit = if room < 0.0 { 0 } else { (room / row.pitch + 1e-9).floor() as u64 + 1 };
    (first, fits_all, fit)
}

fn pad_row(p: &mut Problems, l: &Layout) {
    let pads = &l.pads;
    let needed = pads_needed(l);
    let elements = element_nets(l).len();
    let why = if l.drive.commons == 1 {
        format!("{elements} elements + 1 common")
    } else {
        format!("{} commons + {elements} elements shared {} to a line", l.drive.commons, l.drive.commons)
    };
    if let Some(second) = pads.second_row.as_deref() {
        // Which row each line takes is known only after assignment; here both rows
        // together must hold what is needed (the route stage checks each row), and a
        // given start must put at least the first pad on the glass.
        for (row, key) in [(pads, "pads.start"), (second, "pads.second_row.start")] {
            let side_len = side_length(&l.glass.front, row.side);
            if let Some(s) = row.start.filter(|s| s - row.width / 2.0 < row.edge_margin - 1e-9 || s + row.width / 2.0 > side_len - row.edge_margin + 1e-9) {
                p.bad(
                    key,
                    format!("a pad centred at {} does not fit on the {} ledge ({} of glass, edge_margin {} at each end)", mm(s), row.side.name(), mm(side_len), mm(row.edge_margin)),
                    &format!("{} to {}", mm(row.edge_margin + row.width / 2.0), mm(side_len - row.edge_margin - row.width / 2.0)),
                );
                return;
            }
        }
        let rows = [pads, second];
        let fit: u64 = rows.iter().map(|r| r.count.map(u64::from).unwrap_or_else(|| row_room(l, r, 1).2)).sum();
        if fit < u64::from(needed) {
            p.bad(
                "pads.pitch",
                format!("{needed} pads are needed ({why}) but only {fit} fit on the {} and {} ledges at these pitches", pads.side.name(), second.side.name()),
                "a smaller pitch, fewer elements, multiplexed drive or longer ledges",
            );
        }
        return;
    }
    if let Some(c) = pads.count.filter(|c| *c < needed) {
        p.bad("pads.count", format!("{c} pads given but {needed} are needed ({why})"), &format!("at least {needed}"));
        return;
    }
    let n = pads.count.unwrap_or(needed);
    let (first, fits_all, fit) = row_room(l, pads, n);
    if fits_all {
        return;
    }
    let side_len = side_length(&l.glass.front, pads.side);
    let placed =
        if pads.start.is_some() { format!("from start {}", mm(first)) } else { "centred on the back glass".into() };
    let key = if pads.start.is_some() { "pads.start" } else { "pads.pitch" };
    p.bad(
        key,
        format!(
            "{n} pads are needed ({why}) but only {fit} fit on the {} ledge at pitch {} {placed} ({} of glass, edge_margin {} at each end)",
            pads.side.name(),
            mm(pads.pitch),
            mm(side_len),
            mm(pads.edge_margin)
        ),
        "a smaller pitch, fewer elements, multiplexed drive or a longer ledge",
    );
}

fn fill_port(p: &mut Problems, l: &Layout) {
    let s = &l.seal;
    if l.pads.rows().any(|r| r.side == s.port_side) {
        let others: Vec<&str> = SIDES.iter().filter(|(_, x)| l.pads.rows().all(|r| r.side != *x)).map(|(n, _)| *n).collect();
        p.bad(
            "seal.fill_port.side",
            format!("the fill port cannot open onto the pad side ({})", s.port_side.name()),
            &others.join(", "),
        );
        return;
    }
    let run = side_length(&l.glass.back, s.port_side);
    let corner = s.inset + s.width;
    let (lo, hi) = (corner + s.port_width / 2.0, run - corner - s.port_width / 2.0);
    if lo > hi + 1e-9 {
        p.bad(
            "seal.fill_port.width",
            format!("a {} port does not fit the {} side of the seal", mm(s.port_width), s.port_side.name()),
            &format!("at most {}", mm((run - 2.0 * corner).max(0.0))),
        );
    } else if s.port_at < lo - 1e-9 || s.port_at > hi + 1e-9 {
        p.bad(
            "seal.fill_port.at",
            format!("a port centred at {} runs into the corner of the seal", mm(s.port_at)),
            &format!("{} to {}, measured along the {} side of the back glass", num(lo), num(hi), s.port_side.name()),
        );
    }
}
