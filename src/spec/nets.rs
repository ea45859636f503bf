//! The nets a layout makes (every segment, decimal point, colon, legend, icon, gauge
//! part, bar-graph step and common electrode) and the checks on them: no net made twice, fixed pins and buses naming
//! nets that exist, pin numbers unique and on the pad row.

use super::problems::Problems;
use crate::layout::{COLON, COLON_DOTS, DECIMAL_POINT, IconShape, Layout, common_net, gauge_part_net, line_net, segment_net, step_net};
use std::collections::BTreeMap;

/// One net and the key of the layout entry that makes it.
#[derive(Debug, Clone, PartialEq)]
pub struct NetSource {
    /// Net name (`D1.a`, `UNIT_MV`, `COM1`).
    pub net: String,
    /// Key path of the entry that makes it (`digits[0]`, `legends[2]`, `drive`).
    pub key: String,
}

/// Segment names of digit `digit` (1-based) of group `g`, in drawing order, with its
/// decimal point and colon when it has them (the colon as two dots when `split_colon`,
/// under multiplexed drive). Half digits have only `b` and `c`.
pub fn digit_segments(g: &crate::layout::DigitGroup, digit: u32, split_colon: bool) -> Vec<&'static str> {
    let mut s: Vec<&'static str> =
        if g.half_digits.contains(&digit) { vec!["b", "c"] } else { g.style.segment_names().to_vec() };
    if g.decimal_points.contains(&digit) {
        s.push(DECIMAL_POINT);
    }
    if g.colons.contains(&digit) {
        if split_colon {
            s.extend(COLON_DOTS);
        } else {
            s.push(COLON);
        }
    }
    s
}

/// The nets of all display elements (everything but the commons), in layout order.
pub fn element_nets(layout: &Layout) -> Vec<NetSource> {
    let mut out = Vec::new();
    for g in &layout.digits {
        for d in 1..=g.count {
            for s in digit_segments(g, d, layout.drive.commons > 1) {
                out.push(NetSource { net: segment_net(&g.name, d, s), key: g.key.clone() });
            }
        }
    }
    out.extend(layout.legends.iter().map(|l| NetSource { net: l.name.clone(), key: l.key.clone() }));
    for i in &layout.icons {
        match &i.shape {
            IconShape::Gauge { parts, .. } => out.extend(
                parts.iter().map(|p| NetSource { net: gauge_part_net(&i.name, &p.suffix), key: i.key.clone() }),
            ),
            _ => out.push(NetSource { net: i.name.clone(), key: i.key.clone() }),
        }
    }
    for b in &layout.bars {
        out.extend((1..=b.count).map(|k| NetSource { net: step_net(&b.name, k), key: b.key.clone() }));
    }
    out
}

/// The common-electrode nets `COM1` … `COMn`.
pub fn common_nets(layout: &Layout) -> Vec<String> {
    (0..layout.drive.commons).map(common_net).collect()
}

/// Fewest pads the layout needs: one per common plus, at duty 1/N, one SEG line for every
/// N elements (docs/background.md, *Drive and pin count*: N + ⌈segments / N⌉; static
/// drive is N = 1).
pub fn pads_needed(layout: &Layout) -> u32 {
    let n = layout.drive.commons.max(1) as usize;
    let elements = element_nets(layout).len();
    (n + elements.div_ceil(n)) as u32
}

/// True when every key the net list depends on was read without problems, so that
/// checks against the net list do not report consequences of earlier mistakes.
pub fn nets_clean(p: &Problems, layout: &Layout) -> bool {
    let mut keys = vec!["drive".to_string()];
    for g in &layout.digits {
        for f in ["name", "style", "count", "decimal_points", "colons", "half_digits"] {
            keys.push(format!("{}.{f}", g.key));
        }
    }
    keys.extend(layout.legends.iter().map(|l| format!("{}.name", l.key)));
    keys.extend(layout.icons.iter().flat_map(|i| [format!("{}.name", i.key), format!("{}.gauge", i.key)]));
    keys.extend(layout.bars.iter().flat_map(|b| [format!("{}.name", b.key), format!("{}.count", b.key)]));
    let refs: Vec<&str> = keys.iter().map(String::as_str).collect();
    p.clean(&refs)
}

/// Reports nets made twice; each pair of clashing entries once.
pub fn check_unique(p: &mut Problems, layout: &Layout) {
    let mut first: BTreeMap<String, String> = BTreeMap::new();
    let mut reported: Vec<(String, String)> = Vec::new();
    for s in element_nets(layout) {
        if s.net.is_empty() {
            continue;
        }
        match first.get(&s.net) {
            None => {
                first.insert(s.net, s.key);
            }
            Some(k) => {
                let pair = (k.clone(), s.key.clone());
                if reported.contains(&pair) {
                    continue;
                }
                let here = name_key(&s.key);
                let m = if *k == s.key {
                    format!("net `{}` is made twice by this group", s.net)
                } else {
                    format!("net `{}` is also made by {}", s.net, p.place(&name_key(k)))
                };
                p.bad(&here, m, "each net name once");
                reported.push(pair);
            }
        }
    }
}

/// The key of the `name` of an entry.
fn name_key(entry: &str) -> String {
    format!("{entry}.name")
}

/// Checks `pads.fixed`: known nets, unique pins, pins on the pad row.
pub fn check_fixed_pins(p: &mut Problems, layout: &Layout) {
    if !p.clean(&["pads.count", "pads.first_pin"]) {
        return;
    }
    let known = known_nets(layout);
    let pads = &layout.pads;
    let count = pads.count.unwrap_or_else(|| pads_needed(layout));
    let (lo, hi) = (pads.first_pin, pads.first_pin.saturating_add(count));
    let mut by_pin: BTreeMap<u32, &str> = BTreeMap::new();
    for (net, pin) in &pads.fixed {
        let key = format!("pads.fixed.{net}");
        if !p.clean(&[&key]) {
            continue;
        }
        if !known.contains(net) {
            p.bad(&key, unknown_net(net, &known), "a net of this layout (elements and COM1 under static drive; SEG and COM lines when multiplexed)");
        }
        if *pin < lo || *pin >= hi {
            p.bad(&key, format!("pin {pin} is not on the pad row"), &format!("{lo} to {}", hi.saturating_sub(1)));
        } else if let Some(other) = by_pin.insert(*pin, net) {
            p.bad(&key, format!("pin {pin} is already fixed for `{other}`"), "each pin once");
        }
    }
}

/// Checks that every bus names a known net.
pub fn check_buses(p: &mut Problems, layout: &Layout) {
    let known = known_nets(layout);
    for b in &layout.buses {
        let key = format!("{}.net", b.key);
        if p.clean(&[&key]) && !known.contains(&b.net) {
            p.bad(&key, unknown_net(&b.net, &known), "a net of this layout (elements and COM1 under static drive; SEG and COM lines when multiplexed)");
        }
    }
}

/// Nets a pin or bus may name: under static drive every element and `COM1`; multiplexed,
/// the SEG lines `SEG1` … (at most one per element) and the commons.
fn known_nets(layout: &Layout) -> Vec<String> {
    let elements = element_nets(layout);
    let mut v: Vec<String> = if layout.drive.commons > 1 {
        (0..elements.len() as u32).map(line_net).collect()
    } else {
        elements.into_iter().map(|s| s.net).collect()
    };
    v.extend(common_nets(layout));
    v
}

/// Checks `drive.fixed`: known elements, and no (COM, SEG) pair given to two elements.
pub fn check_fixed_lines(p: &mut Problems, layout: &Layout) {
    let known: Vec<String> = element_nets(layout).into_iter().map(|s| s.net).collect();
    let mut by_pair: BTreeMap<(u32, u32), &str> = BTreeMap::new();
    for (name, f) in &layout.fixed_lines {
        let key = format!("drive.fixed.{name}");
        if !known.contains(name) {
            let mut m = format!("unknown element `{name}`");
            if let Some(near) = super::problems::nearest(name, known.iter().map(String::as_str)) {
                m.push_str(&format!(" (did you mean `{near}`?)"));
            }
            p.bad(&key, m, "a segment, legend or icon of this layout");
            continue;
        }
        if let (Some(c), Some(s)) = (f.com, f.seg) {
            if let Some(other) = by_pair.insert((c, s), name) {
                p.bad(&key, format!("COM{c} with SEG{s} is already fixed for `{other}`"), "each (com, seg) pair once");
            }
        }
    }
}

fn unknown_net(net: &str, known: &[String]) -> String {
    let mut m = format!("unknown net `{net}`");
    if let Some(near) = super::problems::nearest(net, known.iter().map(String::as_str)) {
        m.push_str(&format!(" (did you mean `{near}`?)"));
    }
    m
}
