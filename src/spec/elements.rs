//! Resolution of the display elements: raw digit groups, legends, icons and buses →
//! their typed form, each value checked on its own. Names, places and overlaps are
//! checked in `nets.rs` and `placement.rs`.

use super::problems::Problems;
use super::raw::*;
use super::limits::MAX_NET_NAME_CHARS;
use super::read::{Sign, mm};
use super::scalar::{OneOrList, Scalar};
use crate::geom::pt;
use crate::layout::*;

/// Styles as written in layouts.
const STYLES: [(&str, DigitStyle); 3] =
    [("seven", DigitStyle::Seven), ("fourteen", DigitStyle::Fourteen), ("sixteen", DigitStyle::Sixteen)];

/// Most digits in one group (a guard against typos such as `count: 40000`).
pub const MAX_DIGITS: i64 = 100;

/// Largest slant we accept, degrees either way.
pub const MAX_SLANT: f64 = 20.0;

/// Characters allowed in a digit group name.
const GROUP_NAME: &str = "a letter, then letters, digits or `_`, not ending in a digit (the digit number follows it)";
/// Characters allowed in a legend or icon name.
pub const NET_NAME: &str = "a letter, then letters, digits, `_`, `-` or `.`; not COM followed by a number";

/// `digits:`; the rules give the default segment gap ([`Rules::passing_gap`], or
/// [`Rules::centre_gap`] for fourteen-segment digits under multiplexed drive, `commons` > 1).
pub fn digit_groups(p: &mut Problems, raw: &[RawDigits], rules: &Rules, commons: u32) -> Vec<DigitGroup> {
    raw.iter().enumerate().map(|(i, d)| digit_group(p, d, &format!("digits[{i}]"), rules, commons)).collect()
}

fn digit_group(p: &mut Problems, d: &RawDigits, key: &str, rules: &Rules, commons: u32) -> DigitGroup {
    let k = |f: &str| format!("{key}.{f}");
    let name = p.text(d.name.as_ref(), &k("name"), None, GROUP_NAME);
    if !name.is_empty() && !group_name_ok(&name) {
        p.bad(&k("name"), format!("`{name}` is not a digit group name"), GROUP_NAME);
    }
    name_length(p, &name, &k("name"));
    let style = p.word(d.style.as_ref(), &k("style"), &STYLES, None);
    let mut count = p.int(d.count.as_ref(), &k("count"), None, 1);
    if count > MAX_DIGITS {
        p.bad(
            &k("count"),
            format!("{count} digits in one group is more than segment glass carries"),
            &format!("1 to {MAX_DIGITS}"),
        );
        count = 1;
    }
    let origin = p.point(d.origin.as_ref(), &k("origin"), None);
    let height = p.length(d.height.as_ref(), &k("height"), None, Sign::Positive);
    let width = p.length(d.width.as_ref(), &k("width"), None, Sign::Positive);
    let pitch = p.length(d.pitch.as_ref(), &k("pitch"), Some(width * 1.4), Sign::Positive);
    let slant = p.angle(d.slant.as_ref(), &k("slant"), 0.0);
    if slant.abs() > MAX_SLANT {
        p.bad(&k("slant"), format!("{slant}° is too steep"), &format!("-{MAX_SLANT} to {MAX_SLANT} degrees"));
    }
    let stroke = p.length(d.stroke.as_ref(), &k("stroke"), Some(height / 10.0), Sign::Positive);
    // Multiplexed, three leads cross the centre of a fourteen-segment digit side by side
    // (`assign::template::fourteen_segment`).
    let gap_default = rules.digit_gap(style, commons);
    let gap = p.length(d.gap.as_ref(), &k("gap"), Some(gap_default), Sign::NonNegative);
    let three_leads = 3.0 * rules.lead_width + 4.0 * rules.min_gap;
    if style == DigitStyle::Fourteen && commons > 1 && gap < three_leads - 1e-9 && p.clean(&[&k("gap")]) {
        p.bad(
            &k("gap"),
            format!(
                "gap {} is too narrow for fourteen-segment digits under multiplexed drive: three leads cross the centre of each digit side by side (3 × {} lead + 4 × {} gap = {})",
                mm(gap),
                mm(rules.lead_width),
                mm(rules.min_gap),
                mm(three_leads)
            ),
            &format!("at least {}; leave `gap` out for {}, which gives the router room", mm(three_leads), mm(rules.centre_gap())),
        );
    }
    // A gap as wide as the stroke leaves no segment ends to tell apart; the default gap
    // grows with the rules (coarse film rules and fourteen segments give more than a
    // millimetre), so the message says where it came from and what to change.
    if p.clean(&[&k("gap"), &k("stroke"), &k("height")]) && gap >= stroke - 1e-9 {
        if d.gap.is_some() {
            p.bad(&k("gap"), format!("gap {} is not narrower than the stroke {}", mm(gap), mm(stroke)), &format!("0 to less than {}", mm(stroke)));
        } else {
            let why = if style == DigitStyle::Fourteen && commons > 1 {
                format!("three {} leads side by side with {} gaps, and routing slack", mm(rules.lead_width), mm(rules.min_gap))
            } else {
                format!("a {} lead with a {} gap on each side, and routing slack", mm(rules.lead_width), mm(rules.min_gap))
            };
            p.bad(
                &k("stroke"),
                format!("stroke {} is not wider than the gap these rules give the segments by default, {} ({why})", mm(stroke), mm(gap)),
                &format!("a stroke above {} (in a digit large enough for it), finer `rules`, or a `gap` of your own below the stroke", mm(gap)),
            );
        }
    }
    let count_u = super::resolve::clamp_u32(count);
    let decimal_points = indices(p, d.decimal_points.as_ref(), &k("decimal_points"), count_u);
    let colons = indices(p, d.colons.as_ref(), &k("colons"), count_u);
    let half_digits = indices(p, d.half_digits.as_ref(), &k("half_digits"), count_u);
    let g = DigitGroup {
        name,
        style,
        count: count_u,
        origin,
        height,
        width,
        pitch,
        slant,
        stroke,
        gap,
        decimal_points,
        colons,
        half_digits,
        key: key.to_string(),
    };
    proportions(p, &g);
    g
}

/// Stroke and gap must leave a readable digit.
fn proportions(p: &mut Problems, g: &DigitGroup) {
    let key = &g.key;
    let sizes = [format!("{key}.height"), format!("{key}.width"), format!("{key}.stroke")];
    if !p.clean(&[&sizes[0], &sizes[1], &sizes[2]]) {
        return;
    }
    // A seven-segment cell stacks three bars and two gaps of at least a stroke each, and
    // sets two verticals apart by at least a stroke: stroke < height/5 and < width/3.
    let limit = (g.height / 5.0).min(g.width / 3.0);
    if g.stroke >= limit {
        p.bad(
            &format!("{key}.stroke"),
            format!("stroke {} is too heavy for a {} × {} digit", mm(g.stroke), mm(g.width), mm(g.height)),
            &format!("less than height/5 and width/3, here {}", mm(limit)),
        );
        return;
    }
    if p.clean(&[&format!("{key}.gap")]) {
        let room = (g.width - 2.0 * g.stroke).min(g.height / 2.0 - 1.5 * g.stroke);
        if 2.0 * g.gap >= room {
            p.bad(
                &format!("{key}.gap"),
                format!("gap {} leaves no segment between the gaps", mm(g.gap)),
                &format!("less than {}", mm(room / 2.0)),
            );
        }
    }
}

/// A group name: letter first, then letters, digits or `_`, not ending in a digit (so
/// `D` digit 1 and `D1` digit 1 cannot both be `D11`).
fn group_name_ok(n: &str) -> bool {
    let mut c = n.chars();
    c.next().is_some_and(|f| f.is_ascii_alphabetic())
        && n.chars().all(|c| c.is_ascii_alphanumeric() || c == '_')
        && !n.ends_with(|c: char| c.is_ascii_digit())
}

/// A legend or icon net name.
pub fn net_name_ok(n: &str) -> bool {
    n.chars().next().is_some_and(|f| f.is_ascii_alphabetic())
        && n.chars().all(|c| c.is_ascii_alphanumeric() || matches!(c, '_' | '-' | '.'))
        && !is_common_name(n)
}

/// `COM` followed by digits only: reserved for the common electrodes.
pub fn is_common_name(n: &str) -> bool {
    n.strip_prefix("COM").is_some_and(|r| !r.is_empty() && r.chars().all(|c| c.is_ascii_digit()))
}

/// A list of 1-based digit numbers, or `all`.
fn indices(p: &mut Problems, v: Option<&OneOrList>, key: &str, count: u32) -> Vec<u32> {
    let allowed = format!("`all` or a list of digit numbers from 1 to {count}");
    let items: &[Scalar] = match v {
        None => return Vec::new(),
        Some(OneOrList::One(s)) if s.text.trim() == "all" => return (1..=count).collect(),
        Some(OneOrList::One(s)) => {
            p.bad(key, format!("`{}` is not a list of digits", s.text), &allowed);
            return Vec::new();
        }
        Some(OneOrList::List(l)) => l,
    };
    let mut out = Vec::new();
    for (i, s) in items.iter().enumerate() {
        let k = format!("{key}[{i}]");
        let n = p.int(Some(s), &k, None, 1);
        if n > i64::from(count) {
            p.bad(&k, format!("digit {n} does not exist (the group has {count})"), &allowed);
        } else if out.contains(&(n as u32)) {
            p.bad(&k, format!("digit {n} is listed twice"), &allowed);
        } else if p.clean(&[&k]) {
            out.push(n as u32);
        }
    }
    out.sort_unstable();
    out
}

/// `legends:`.
pub fn legends(p: &mut Problems, raw: &[RawLegend]) -> Vec<Legend> {
    let aligns = [("left", Align::Left), ("centre", Align::Centre), ("center", Align::Centre), ("right", Align::Right)];
    let mut out = Vec::new();
    for (i, l) in raw.iter().enumerate() {
        let key = format!("legends[{i}]");
        let k = |f: &str| format!("{key}.{f}");
        let name = element_name(p, l.name.as_ref(), &k("name"));
        let text = p.text(l.text.as_ref(), &k("text"), None, "the text to show");
        let at = p.point(l.at.as_ref(), &k("at"), None);
        let height = p.length(l.height.as_ref(), &k("height"), None, Sign::Positive);
        let stroke = p.length(l.stroke.as_ref(), &k("stroke"), Some(height / 8.0), Sign::Positive);
        if p.clean(&[&k("height"), &k("stroke")]) && stroke * 2.0 >= height {
            p.bad(
                &k("stroke"),
                format!("stroke {} is too heavy for text {} high", mm(stroke), mm(height)),
                "less than half the height",
            );
        }
        let align = p.word(l.align.as_ref(), &k("align"), &aligns, Some(Align::Left));
        out.push(Legend { name, text, at, height, stroke, align, key });
    }
    out
}

/// A name is at most [`MAX_NET_NAME_CHARS`] characters long; false (and noted) when longer.
fn name_length(p: &mut Problems, name: &str, key: &str) -> bool {
    let n = name.chars().count();
    if n > MAX_NET_NAME_CHARS {
        p.bad(key, format!("a name of {n} characters is longer than segmask takes"), &format!("at most {MAX_NET_NAME_CHARS} characters"));
    }
    n <= MAX_NET_NAME_CHARS
}

/// A legend, icon or bar graph name.
pub fn element_name(p: &mut Problems, v: Option<&Scalar>, key: &str) -> String {
    let name = p.text(v, key, None, NET_NAME);
    if name_length(p, &name, key) && !name.is_empty() && !net_name_ok(&name) {
        let why = if is_common_name(&name) { "is reserved for a common electrode" } else { "is not a net name" };
        p.bad(key, format!("`{name}` {why}"), NET_NAME);
    }
    name
}

const SHAPES: &str = "exactly one of icon, gauge, rectangle, circle, ring, polygon, path";

/// `icons:`; `icon_names` are the icons the fonts define (for the parts of gauges).
pub fn icons(p: &mut Problems, raw: &[RawIcon], icon_names: &[String]) -> Vec<Icon> {
    let mut out = Vec::new();
    for (i, r) in raw.iter().enumerate() {
        let key = format!("icons[{i}]");
        let name = element_name(p, r.name.as_ref(), &format!("{key}.name"));
        // An icon without a usable shape keeps its place (and net) with an empty
        // polygon; the problem is noted, so the layout is refused anyway.
        let shape = icon_shape(p, r, &key, icon_names).unwrap_or(IconShape::Polygon { points: vec![] });
        out.push(Icon { name, shape, key });
    }
    out
}

fn icon_shape(p: &mut Problems, r: &RawIcon, key: &str, icon_names: &[String]) -> Option<IconShape> {
    let k = |f: &str| format!("{key}.{f}");
    let given: Vec<&str> = [
        ("icon", r.icon.is_some()),
        ("gauge", r.gauge.is_some()),
        ("rectangle", r.rectangle.is_some()),
        ("circle", r.circle.is_some()),
        ("ring", r.ring.is_some()),
        ("polygon", r.polygon.is_some()),
        ("path", r.path.is_some()),
    ]
    .iter()
    .filter(|(_, g)| *g)
    .map(|(n, _)| *n)
    .collect();
    if given.len() != 1 {
        let m = if given.is_empty() {
            "no shape given".to_string()
        } else {
            format!("several shapes given: {}", given.join(", "))
        };
        p.bad(key, m, SHAPES);
        return None;
    }
    if r.icon.is_none() && r.gauge.is_none() {
        for (f, set) in [("at", r.at.is_some()), ("size", r.size.is_some()), ("stroke", r.stroke.is_some())] {
            if set {
                p.bad(
                    &k(f),
                    format!("`{f}` belongs to a named `icon` or a `gauge`, not to a {}", given[0]),
                    "at, size and stroke only with `icon` or `gauge`",
                );
            }
        }
    }
    Some(if let Some(icon) = &r.icon {
        let icon = p.text(Some(icon), &k("icon"), None, "an icon name from the fonts");
        let (at, size, stroke) = icon_box(p, r, key);
        IconShape::Named { icon, at, size, stroke }
    } else if let Some(gauge) = &r.gauge {
        let names = super::gauges::gauge_names(icon_names);
        let allowed = format!("a gauge of the fonts: {}", names.join(", "));
        let gauge = p.text(Some(gauge), &k("gauge"), None, &allowed);
        let parts = super::gauges::gauge_parts(&gauge, icon_names).unwrap_or_default();
        if parts.is_empty() && p.clean(&[&k("gauge")]) {
            let mut m = format!("there is no gauge `{gauge}`");
            if let Some(near) = super::problems::nearest(&gauge, names.iter().map(String::as_str)) {
                m.push_str(&format!(" (did you mean `{near}`?)"));
            }
            p.bad(&k("gauge"), m, &allowed);
        }
        let (at, size, stroke) = icon_box(p, r, key);
        IconShape::Gauge { gauge, parts, at, size, stroke }
    } else if let Some(rc) = &r.rectangle {
        let k = |f: &str| format!("{key}.rectangle.{f}");
        let at = p.point(rc.at.as_ref(), &k("at"), None);
        let width = p.length(rc.width.as_ref(), &k("width"), None, Sign::Positive);
        let height = p.length(rc.height.as_ref(), &k("height"), None, Sign::Positive);
        let corner = p.length(rc.corner.as_ref(), &k("corner"), Some(0.0), Sign::NonNegative);
        if p.clean(&[&format!("{key}.rectangle")]) && corner * 2.0 > width.min(height) {
            p.bad(
                &k("corner"),
                format!("corner radius {} is more than half the side", mm(corner)),
                &format!("0 to {}", mm(width.min(height) / 2.0)),
            );
        }
        IconShape::Rectangle { at, width, height, corner }
    } else if let Some(c) = &r.circle {
        let centre = p.point(c.centre.as_ref(), &format!("{key}.circle.centre"), None);
        let radius = p.length(c.radius.as_ref(), &format!("{key}.circle.radius"), None, Sign::Positive);
        IconShape::Circle { centre, radius }
    } else if let Some(rg) = &r.ring {
        let k = |f: &str| format!("{key}.ring.{f}");
        let centre = p.point(rg.centre.as_ref(), &k("centre"), None);
        let outer = p.length(rg.outer.as_ref(), &k("outer"), None, Sign::Positive);
        let inner = p.length(rg.inner.as_ref(), &k("inner"), None, Sign::Positive);
        if p.clean(&[&format!("{key}.ring")]) && inner >= outer {
            p.bad(
                &k("inner"),
                format!("inner radius {} is not less than outer {}", mm(inner), mm(outer)),
                &format!("less than {}", mm(outer)),
            );
        }
        IconShape::Ring { centre, outer, inner }
    } else if let Some(pts) = &r.polygon {
        let points: Vec<_> =
            pts.iter().enumerate().map(|(j, q)| p.point(Some(q), &format!("{key}.polygon[{j}]"), None)).collect();
        if points.len() < 3 {
            p.bad(&k("polygon"), format!("{} points do not make a polygon", points.len()), "at least 3 points");
        } else if p.clean(&[&k("polygon")]) && shoelace(&points).abs() < 1e-9 {
            p.bad(&k("polygon"), "the points enclose no area", "at least 3 points not on one line");
        }
        IconShape::Polygon { points }
    } else {
        let path = r.path.as_ref()?;
        let d = p.text(path.d.as_ref(), &format!("{key}.path.d"), None, "SVG path data, mm, y up");
        let at = p.point(path.at.as_ref(), &format!("{key}.path.at"), Some(pt(0.0, 0.0)));
        IconShape::Path { d, at }
    })
}

/// `at`, `size` and `stroke` of a named icon or a gauge; stroke defaults to size / 12.
fn icon_box(p: &mut Problems, r: &RawIcon, key: &str) -> (crate::geom::Pt, f64, f64) {
    let k = |f: &str| format!("{key}.{f}");
    let at = p.point(r.at.as_ref(), &k("at"), None);
    let size = p.length(r.size.as_ref(), &k("size"), None, Sign::Positive);
    let stroke = p.length(r.stroke.as_ref(), &k("stroke"), Some(size / 12.0), Sign::Positive);
    if p.clean(&[&k("size"), &k("stroke")]) && stroke * 4.0 >= size {
        p.bad(
            &k("stroke"),
            format!("stroke {} is too heavy for a {} icon", mm(stroke), mm(size)),
            "less than a quarter of the size",
        );
    }
    (at, size, stroke)
}

/// Signed area of a closed ring (shoelace formula).
pub fn shoelace(pts: &[crate::geom::Pt]) -> f64 {
    let n = pts.len();
    (0..n).map(|i| pts[i].x * pts[(i + 1) % n].y - pts[(i + 1) % n].x * pts[i].y).sum::<f64>() / 2.0
}

/// `buses:`; width defaults to the lead width.
pub fn buses(p: &mut Problems, raw: &[RawBus], rules: &Rules) -> Vec<Bus> {
    let plates = [("front", PlateId::Front), ("back", PlateId::Back)];
    let mut out = Vec::new();
    for (i, b) in raw.iter().enumerate() {
        let key = format!("buses[{i}]");
        let k = |f: &str| format!("{key}.{f}");
        let net = p.text(b.net.as_ref(), &k("net"), None, "the name of a net of this layout");
        let plate = p.word(b.plate.as_ref(), &k("plate"), &plates, None);
        let width = p.length(b.width.as_ref(), &k("width"), Some(rules.lead_width), Sign::Positive);
        let raw_points = b.points.as_deref().unwrap_or(&[]);
        if b.points.is_none() {
            p.missing(&k("points"), "a list of at least 2 points");
        } else if raw_points.len() < 2 {
            p.bad(&k("points"), format!("{} point(s) do not make a trace", raw_points.len()), "at least 2 points");
        }
        let points =
            raw_points.iter().enumerate().map(|(j, q)| p.point(Some(q), &format!("{key}.points[{j}]"), None)).collect();
        out.push(Bus { net, plate, width, points, key });
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn group_names() {
        assert!(group_name_ok("D"));
        assert!(group_name_ok("Main_row"));
        assert!(!group_name_ok("D1"));
        assert!(!group_name_ok("1D"));
        assert!(!group_name_ok("D.x"));
        assert!(!group_name_ok(""));
    }

    #[test]
    fn net_names_keep_com_for_commons() {
        assert!(net_name_ok("UNIT_MV"));
        assert!(net_name_ok("BATT.low"));
        assert!(net_name_ok("COMMA"));
        assert!(!net_name_ok("COM2"));
        assert!(!net_name_ok("_x"));
        assert!(!net_name_ok("a b"));
    }

    #[test]
    fn shoelace_area_of_unit_square() {
        // Shoelace formula (Gauss's area formula): a counter-clockwise unit square has +1.
        let sq = [pt(0.0, 0.0), pt(1.0, 0.0), pt(1.0, 1.0), pt(0.0, 1.0)];
        assert_eq!(shoelace(&sq), 1.0);
        assert_eq!(shoelace(&[pt(0.0, 0.0), pt(1.0, 1.0), pt(2.0, 2.0)]), 0.0);
    }
}
