//! Resolution of the plate-level parts: raw glass, window, rules, seal, transfer dots,
//! pads, drive, marks, GDSII layers and fonts → their typed form with units in mm and
//! every default filled in. Values are checked one by one here; how the parts fit
//! together is checked in `fit.rs`.

use super::problems::Problems;
use super::raw::*;
use super::read::{Sign, mm};
use super::scalar::{OneOrList, Scalar, ScalarKind};
use crate::layout::*;
use std::collections::BTreeMap;
use std::path::Path;

/// Sides as written in layouts.
pub const SIDES: [(&str, Side); 4] =
    [("bottom", Side::Bottom), ("top", Side::Top), ("left", Side::Left), ("right", Side::Right)];

/// A placeholder rectangle for a missing one (the layout is rejected anyway).
const NO_RECT: Rect = Rect { x: 0.0, y: 0.0, width: 1.0, height: 1.0 };

/// The layout name: letters, digits, `-` and `_`, since it becomes the file stem.
pub fn name(p: &mut Problems, v: Option<&Scalar>) -> String {
    let allowed = "letters, digits, `-` and `_`; it becomes the output file name";
    let n = p.text(v, "name", None, allowed);
    let max = super::limits::MAX_NAME_CHARS;
    if n.chars().count() > max {
        p.bad("name", format!("{} characters are more than an output file name takes", n.chars().count()), &format!("at most {max} characters; {allowed}"));
    } else if !n.is_empty() && !n.chars().all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_') {
        p.bad("name", format!("`{n}` has characters a file name should not have"), allowed);
    }
    n
}

/// `glass:` → both plates in the front-plate frame.
pub fn glass(p: &mut Problems, g: Option<&RawGlass>) -> Glass {
    let Some(g) = g else {
        p.missing("glass", "a mapping with front and back");
        return Glass { front: NO_RECT, back: NO_RECT };
    };
    let front = match &g.front {
        None => {
            p.missing("glass.front", "`{width: .., height: ..}`");
            NO_RECT
        }
        Some(f) => Rect {
            x: 0.0,
            y: 0.0,
            width: p.length(f.width.as_ref(), "glass.front.width", None, Sign::Positive),
            height: p.length(f.height.as_ref(), "glass.front.height", None, Sign::Positive),
        },
    };
    let back = match &g.back {
        None => {
            p.missing("glass.back", "`{width: .., height: .., x: .., y: ..}`");
            NO_RECT
        }
        Some(b) => rect(p, b, "glass.back", Some(0.0)),
    };
    Glass { front, back }
}

/// A rectangle `{x, y, width, height}`; `xy_default` makes x and y optional.
pub fn rect(p: &mut Problems, r: &RawRect, key: &str, xy_default: Option<f64>) -> Rect {
    Rect {
        x: p.length(r.x.as_ref(), &format!("{key}.x"), xy_default, Sign::Any),
        y: p.length(r.y.as_ref(), &format!("{key}.y"), xy_default, Sign::Any),
        width: p.length(r.width.as_ref(), &format!("{key}.width"), None, Sign::Positive),
        height: p.length(r.height.as_ref(), &format!("{key}.height"), None, Sign::Positive),
    }
}

/// `window:`.
pub fn window(p: &mut Problems, w: Option<&RawRect>) -> Rect {
    match w {
        None => {
            p.missing("window", "`{x: .., y: .., width: .., height: ..}`");
            NO_RECT
        }
        Some(w) => rect(p, w, "window", None),
    }
}

/// `cell_gap:` in mm, default 7 µm; values outside 1–50 µm are almost surely a unit slip.
pub fn cell_gap(p: &mut Problems, v: Option<&Scalar>) -> f64 {
    // Common practice: cells are 5–10 µm thick; we accept a generous 1–50 µm.
    let g = p.length(v, "cell_gap", Some(0.007), Sign::Positive);
    if p.clean(&["cell_gap"]) && !(0.001..=0.05).contains(&g) {
        p.bad(
            "cell_gap",
            format!("{} is not a plausible cell gap (check the unit)", mm(g)),
            "1um to 50um; usually 5um to 10um",
        );
    }
    g
}

/// `tolerance:` in mm, default 1 µm.
pub fn tolerance(p: &mut Problems, v: Option<&Scalar>) -> f64 {
    let t = p.length(v, "tolerance", Some(crate::geom::DEFAULT_TOLERANCE_MM), Sign::Positive);
    // Below ten grid steps of 1 nm the curves would only add vertices; above 50 µm they
    // would visibly facet the segments.
    if p.clean(&["tolerance"]) && !(1e-5..=0.05).contains(&t) {
        p.bad("tolerance", format!("{} is outside the useful range", mm(t)), "10nm to 50um");
    }
    t
}

/// `resist:`, default positive.
pub fn resist(p: &mut Problems, v: Option<&Scalar>) -> Resist {
    p.word(v, "resist", &[("positive", Resist::Positive), ("negative", Resist::Negative)], Some(Resist::Positive))
}

/// `masks:` with their defaults (photoplotted film, mirrored as contact printing needs,
/// A4, one copy).
pub fn masks(p: &mut Problems, m: Option<&RawMasks>) -> MaskOptions {
    let get = |f: fn(&RawMasks) -> &Option<Scalar>| m.and_then(|m| f(m).as_ref());
    let d = MaskOptions::default();
    let process = p.word(get(|m| &m.process), "masks.process", &Process::ALL, Some(d.process));
    let mirror = p.boolean(get(|m| &m.mirror), "masks.mirror", d.mirror);
    let sheet = p.word(get(|m| &m.sheet), "masks.sheet", &[("a4", Sheet::A4), ("letter", Sheet::Letter)], Some(d.sheet));
    let copies = p.int(get(|m| &m.copies), "masks.copies", Some(d.copies as i64), 1);
    if p.clean(&["masks.copies"]) && copies > MAX_COPIES {
        p.bad("masks.copies", format!("{copies} copies are more than a print sheet is for"), &format!("1 to {MAX_COPIES}"));
    }
    MaskOptions { process, mirror, sheet, copies: copies.clamp(1, MAX_COPIES) as u32, panel: None }
}

/// Most copies of each film on the print sheet (more belong on a second print run).
const MAX_COPIES: i64 = 50;

/// `rules:` with their defaults; `process` (from `masks.process`) gives the defaults of
/// `min_width`, `min_gap` and `film_min_feature`, and the floor of `film_min_feature`.
pub fn rules(p: &mut Problems, r: Option<&RawRules>, process: Process) -> Rules {
    let get = |f: fn(&RawRules) -> &Option<Scalar>| r.and_then(|r| f(r).as_ref());
    let (width0, gap0) = process.suggested_rules();
    let min_width = p.length(get(|r| &r.min_width), "rules.min_width", Some(width0), Sign::Positive);
    let min_gap = p.length(get(|r| &r.min_gap), "rules.min_gap", Some(gap0), Sign::Positive);
    let undercut = p.length(get(|r| &r.undercut), "rules.undercut", Some(0.005), Sign::NonNegative);
    let compensate = p.boolean(get(|r| &r.compensate), "rules.compensate", false);
    let limit = process.mask_limit();
    let film_min_feature = p.length(get(|r| &r.film_min_feature), "rules.film_min_feature", Some(limit), Sign::Positive);
    if p.clean(&["rules.film_min_feature"]) && film_min_feature < limit - 1e-9 {
        p.bad(
            "rules.film_min_feature",
            format!("{} is finer than {} holds reliably", mm(film_min_feature), process.name()),
            &format!("at least {} for masks.process {} (or choose a finer masks.process)", mm(limit), process.name()),
        );
    }
    let backplane_overlap =
        p.length(get(|r| &r.backplane_overlap), "rules.backplane_overlap", Some(0.15), Sign::NonNegative);
    let edge_clearance = p.length(get(|r| &r.edge_clearance), "rules.edge_clearance", Some(1.5), Sign::NonNegative);
    // A drawn lead etches to `drawn − 2·undercut` unless the film pre-compensates.
    let lead_default = if compensate { min_width } else { min_width + 2.0 * undercut };
    let lead_width = p.length(get(|r| &r.lead_width), "rules.lead_width", Some(lead_default), Sign::Positive);
    let registration = p.length(get(|r| &r.registration), "rules.registration", Some(0.0), Sign::NonNegative);
    let rules = Rules {
        min_width,
        min_gap,
        undercut,
        compensate,
        film_min_feature,
        backplane_overlap,
        edge_clearance,
        lead_width,
        registration,
    };
    if p.clean(&["rules"]) && rules.etched_width(lead_width) < min_width - 1e-9 {
        p.bad(
            "rules.lead_width",
            format!(
                "a lead drawn {} wide etches to {}, below min_width {}",
                mm(lead_width),
                mm(rules.etched_width(lead_width)),
                mm(min_width)
            ),
            &format!("at least {}", mm(lead_default)),
        );
    }
    film_holds_the_rules(p, &rules, r.is_some_and(|r| r.lead_width.is_some()));
    rules
}

/// Leads drawn at `lead_width` and gaps drawn at `min_gap` are what segmask draws most
/// of: where the film cannot hold them, every lead or every close pair of leads would
/// come out as its own `film-feature` error after the whole build (72 of them for a
/// four-digit panel), so the rules are refused here, once, at the key to change.
fn film_holds_the_rules(p: &mut Problems, rules: &Rules, lead_given: bool) {
    if !p.clean(&["rules"]) {
        return;
    }
    let holds = rules.film_min_feature;
    // With compensation the film's features differ from the drawing: say both.
    let on_film = |w: f64| if rules.film_bias() == 0.0 { String::new() } else { format!(" (on the film {})", mm(w)) };
    let film_lead = rules.film_width(rules.lead_width);
    if film_lead < holds - 1e-9 {
        let (key, change) = if lead_given {
            ("rules.lead_width", format!("a `lead_width` of at least {}", mm(holds - 2.0 * rules.film_bias())))
        } else {
            // The default lead is min_width grown by the undercut on each side (or
            // min_width itself when the film compensates).
            let grow = rules.lead_width - rules.min_width;
            ("rules.min_width", format!("a `min_width` of at least {} (leads are drawn {} wider)", mm(holds - 2.0 * rules.film_bias() - grow), mm(grow)))
        };
        p.bad(
            key,
            format!("leads drawn {} wide{} are finer than the {} the film holds (`rules.film_min_feature`)", mm(rules.lead_width), on_film(film_lead), mm(holds)),
            &format!("{change}, or a finer `masks.process`"),
        );
    }
    let film_space = rules.film_gap(rules.min_gap);
    if film_space < holds - 1e-9 {
        p.bad(
            "rules.min_gap",
            format!("gaps drawn {} wide{} are finer than the {} the film holds (`rules.film_min_feature`)", mm(rules.min_gap), on_film(film_space), mm(holds)),
            &format!("at least {}, or a finer `masks.process`", mm(holds + 2.0 * rules.film_bias())),
        );
    }
}

/// `seal:`; the fill port defaults to the side opposite the pads (with a second pad row
/// there, the left side, or the bottom when the pads are left and right), centred on the
/// back glass, 3 mm wide.
pub fn seal(p: &mut Problems, s: Option<&RawSeal>, pads: &Pads, back: &Rect) -> Seal {
    let port_default = match (&pads.second_row, pads.side) {
        (None, side) => side.opposite(),
        (Some(_), Side::Bottom | Side::Top) => Side::Left,
        (Some(_), Side::Left | Side::Right) => Side::Bottom,
    };
    let width = p.length(s.and_then(|s| s.width.as_ref()), "seal.width", Some(1.0), Sign::Positive);
    let inset = p.length(s.and_then(|s| s.inset.as_ref()), "seal.inset", Some(1.5), Sign::NonNegative);
    let port = s.and_then(|s| s.fill_port.as_ref());
    let port_side = p.word(port.and_then(|f| f.side.as_ref()), "seal.fill_port.side", &SIDES, Some(port_default));
    let run = side_length(back, port_side);
    let port_at = p.length(port.and_then(|f| f.at.as_ref()), "seal.fill_port.at", Some(run / 2.0), Sign::NonNegative);
    let port_width = p.length(port.and_then(|f| f.width.as_ref()), "seal.fill_port.width", Some(3.0), Sign::Positive);
    Seal { width, inset, port_side, port_at, port_width }
}

/// Length of side `s` of `r`.
pub fn side_length(r: &Rect, s: Side) -> f64 {
    match s {
        Side::Bottom | Side::Top => r.width,
        Side::Left | Side::Right => r.height,
    }
}

/// `transfer_dots:`.
pub fn transfer(p: &mut Problems, t: Option<&RawTransfer>) -> Transfer {
    let diameter = p.length(t.and_then(|t| t.diameter.as_ref()), "transfer_dots.diameter", Some(0.8), Sign::Positive);
    let pad = p.length(t.and_then(|t| t.pad.as_ref()), "transfer_dots.pad", Some(1.2), Sign::Positive);
    if p.clean(&["transfer_dots"]) && pad < diameter {
        p.bad(
            "transfer_dots.pad",
            format!("the pad ({}) is smaller than the dot ({})", mm(pad), mm(diameter)),
            &format!("at least the diameter, {}", mm(diameter)),
        );
    }
    Transfer { diameter, pad }
}

/// `pads:`; side and pitch are required. `pads.second_row`, if given, takes the side
/// opposite (the only one allowed), and the first row's pitch, width, length and edge
/// margin unless it gives its own; its pins are numbered on from the first row's unless
/// it gives `first_pin`. Fixed pins are given once, under `pads.fixed`, for both rows.
pub fn pads(p: &mut Problems, r: Option<&RawPads>) -> Pads {
    if r.is_none() {
        p.missing("pads", "a mapping with at least side and pitch");
    }
    let mut first = pad_row(p, r, "pads", None);
    for (net, pin) in r.and_then(|r| r.fixed.as_ref()).map(|e| e.0.as_slice()).unwrap_or(&[]) {
        let key = format!("pads.fixed.{}", net.text);
        let n = p.int(Some(pin), &key, None, 0);
        if first.fixed.insert(net.text.clone(), clamp_u32(n)).is_some() {
            p.repeated(&key, format!("net `{}` is given a pin twice", net.text), "each net once");
        }
    }
    if let Some(second) = r.and_then(|r| r.second_row.as_deref()) {
        if second.fixed.is_some() {
            p.bad("pads.second_row.fixed", "fixed pins of both rows are given once, under `pads.fixed`", "`pads.fixed`");
        }
        if second.second_row.is_some() {
            p.bad("pads.second_row.second_row", "a layout has at most two pad rows", "one `second_row`");
        }
        first.second_row = Some(Box::new(pad_row(p, Some(second), "pads.second_row", Some(&first))));
    }
    first
}

/// One pad row under `key`; `first` is the first row when this is the second, which
/// gives the side (opposite) and the defaults.
fn pad_row(p: &mut Problems, r: Option<&RawPads>, key: &str, first: Option<&Pads>) -> Pads {
    let get = |f: fn(&RawPads) -> &Option<Scalar>| r.and_then(|r| f(r).as_ref());
    let k = |leaf: &str| format!("{key}.{leaf}");
    let side = match first {
        None if r.is_some() => p.word(get(|r| &r.side), &k("side"), &SIDES, None),
        None => Side::Bottom,
        Some(f) => {
            let want = f.side.opposite();
            let side = p.word(get(|r| &r.side), &k("side"), &SIDES, Some(want));
            if side != want {
                p.bad(&k("side"), format!("the second pad row must face the first, which is on the {} side", f.side.name()), want.name());
            }
            want
        }
    };
    let pitch = match first {
        None if r.is_none() => 1.0,
        None => p.length(get(|r| &r.pitch), &k("pitch"), None, Sign::Positive),
        Some(f) => p.length(get(|r| &r.pitch), &k("pitch"), Some(f.pitch), Sign::Positive),
    };
    let inherited = |f: fn(&Pads) -> f64, own: f64| first.map(f).unwrap_or(own);
    let width_default = if first.is_some() && get(|r| &r.pitch).is_none() { inherited(|f| f.width, 0.6 * pitch) } else { 0.6 * pitch };
    let width = p.length(get(|r| &r.width), &k("width"), Some(width_default), Sign::Positive);
    let length = p.length(get(|r| &r.length), &k("length"), Some(inherited(|f| f.length, 3.0)), Sign::Positive);
    let edge_margin = p.length(get(|r| &r.edge_margin), &k("edge_margin"), Some(inherited(|f| f.edge_margin, 0.3)), Sign::NonNegative);
    // The second row's pins follow the first row's unless given (0 here, numbered when
    // the first row's length is known, in the route stage).
    let first_pin = match (first, get(|r| &r.first_pin)) {
        (Some(_), None) => 0,
        _ => clamp_u32(p.int(get(|r| &r.first_pin), &k("first_pin"), Some(1), 0)),
    };
    let start = get(|r| &r.start).map(|v| p.length(Some(v), &k("start"), None, Sign::NonNegative));
    let count = get(|r| &r.count).map(|v| p.int(Some(v), &k("count"), None, 1));
    if let Some(n) = count.filter(|n| *n > super::limits::MAX_PADS) {
        p.bad(&k("count"), format!("{n} pads are more than one pad row takes"), &format!("1 to {}", super::limits::MAX_PADS));
    }
    if p.clean(&[&k("pitch"), &k("width")]) && width >= pitch {
        p.bad(&k("width"), format!("pads {} wide at pitch {} would touch", mm(width), mm(pitch)), &format!("less than the pitch, {}", mm(pitch)));
    }
    Pads {
        side,
        pitch,
        width,
        length,
        edge_margin,
        first_pin,
        pins_follow: first.is_some() && get(|r| &r.first_pin).is_none(),
        start,
        count: count.map(clamp_u32),
        fixed: BTreeMap::new(),
        second_row: None,
    }
}

/// An i64 that was checked non-negative, as u32 (saturating, so absurd values stay absurd).
pub fn clamp_u32(n: i64) -> u32 {
    u32::try_from(n.max(0)).unwrap_or(u32::MAX)
}

const DRIVE_ALLOWED: &str =
    "`static`, or `{duty: 1/2, bias: 1/2 or 1/3}`, `{duty: 1/3, bias: 1/3}`, `{duty: 1/4, bias: 1/3}`";

/// `drive:`, default static.
pub fn drive(p: &mut Problems, d: Option<&RawDrive>) -> Drive {
    let stat = Drive { commons: 1, bias: None };
    match d {
        None => stat,
        Some(RawDrive::Word(w)) if w.text.trim() == "static" => stat,
        Some(RawDrive::Word(w)) => {
            p.bad("drive", format!("unknown drive `{}`", w.text), DRIVE_ALLOWED);
            stat
        }
        Some(RawDrive::Multiplexed(m)) => {
            let Some(duty) = &m.duty else {
                p.missing("drive.duty", "1/2, 1/3, 1/4");
                return stat;
            };
            let Some(n) = fraction(duty).filter(|n| (2..=4).contains(n)) else {
                p.bad("drive.duty", format!("duty `{}` not supported", duty.text), "1/2, 1/3, 1/4; or `drive: static`");
                return stat;
            };
            let a = match &m.bias {
                None => 3,
                Some(b) => match fraction(b).filter(|a| (2..=3).contains(a)) {
                    Some(a) => a,
                    None => {
                        p.bad("drive.bias", format!("bias `{}` not supported", b.text), "1/2, 1/3");
                        return stat;
                    }
                },
            };
            // Common practice (docs/background.md, *Drive and pin count*): 1/2 duty at
            // 1/2 or 1/3 bias, 1/3 and 1/4 duty
            // at 1/3 bias; 1/2 bias at higher duty loses most of the contrast
            // (Alt & Pleshko 1974: N=4, a=2 gives Von/Voff = √21/3 ≈ 1.53 against √3 at a=3).
            if a == 2 && n > 2 {
                p.bad(
                    "drive.bias",
                    format!("bias 1/2 with duty 1/{n} gives poor contrast"),
                    "bias 1/3 for duty 1/3 and 1/4",
                );
                return stat;
            }
            Drive { commons: n, bias: Some(a) }
        }
    }
}

/// `drive.fixed`: element name → the COM and SEG numbers fixed by hand. Ranges are
/// checked here (COM within the duty, SEG from 1); names and pairs by `nets`.
pub fn fixed_lines(p: &mut Problems, d: Option<&RawDrive>) -> BTreeMap<String, FixedLine> {
    let mut out = BTreeMap::new();
    let Some(RawDrive::Multiplexed(m)) = d else { return out };
    let n = m.duty.as_ref().and_then(fraction).unwrap_or(1);
    for (name, f) in m.fixed.as_ref().map(|e| e.0.as_slice()).unwrap_or(&[]) {
        let key = format!("drive.fixed.{}", name.text);
        if f.com.is_none() && f.seg.is_none() {
            p.missing(&format!("{key}.com"), "com, seg or both");
        }
        let com = f.com.as_ref().map(|c| clamp_u32(p.int(Some(c), &format!("{key}.com"), None, 1)));
        if let Some(c) = com.filter(|c| *c > n && (2..=4).contains(&n)) {
            p.bad(&format!("{key}.com"), format!("COM{c} does not exist at duty 1/{n}"), &format!("1 … {n}"));
        }
        let seg = f.seg.as_ref().map(|s| clamp_u32(p.int(Some(s), &format!("{key}.seg"), None, 1)));
        if out.insert(name.text.clone(), FixedLine { com, seg }).is_some() {
            p.repeated(&key, format!("element `{}` is fixed twice", name.text), "each element once");
        }
    }
    out
}

/// `1/N` → N.
fn fraction(s: &Scalar) -> Option<u32> {
    if s.kind != ScalarKind::Text {
        return None;
    }
    let (one, n) = s.text.split_once('/')?;
    (one.trim() == "1").then_some(())?;
    n.trim().parse().ok()
}

/// `marks:`. The line defaults to 0.15 mm, or to the narrowest line that still etches to
/// `min_width` when that is wider: marks are ITO like any other and must pass the same
/// width rule (coarse film rules made the fixed 0.15 mm marks fail it).
pub fn marks(p: &mut Problems, m: Option<&RawMarks>, rules: &Rules) -> Marks {
    let size = p.length(m.and_then(|m| m.size.as_ref()), "marks.size", Some(1.0), Sign::Positive);
    let narrowest = rules.min_width + 2.0 * (rules.undercut - rules.film_bias());
    let line_default = narrowest.max(0.15);
    let line = p.length(m.and_then(|m| m.line.as_ref()), "marks.line", Some(line_default), Sign::Positive);
    if p.clean(&["marks", "rules"]) && rules.etched_width(line) < rules.min_width - 1e-9 {
        p.bad(
            "marks.line",
            format!("a mark line drawn {} wide etches to {}, below min_width {}", mm(line), mm(rules.etched_width(line)), mm(rules.min_width)),
            &format!("at least {}", mm(narrowest)),
        );
    }
    if p.clean(&["marks"]) && line * 2.0 >= size {
        p.bad("marks.line", format!("a {} line does not fit a {} mark", mm(line), mm(size)), "less than half the size");
    }
    Marks { size, line }
}

/// `gds_layers:` over [`LayerMap::defaults`].
pub fn layers(p: &mut Problems, g: Option<&super::scalar::Entries<OneOrList>>) -> LayerMap {
    let mut map = LayerMap::defaults();
    let names: Vec<String> = map.entries.keys().cloned().collect();
    let mut seen = Vec::new();
    for (name, value) in g.map(|g| g.0.as_slice()).unwrap_or(&[]) {
        let key = format!("gds_layers.{}", name.text);
        if !map.entries.contains_key(&name.text) {
            let mut m = format!("unknown layer `{}`", name.text);
            if let Some(near) = super::problems::nearest(&name.text, names.iter().map(String::as_str)) {
                m.push_str(&format!(" (did you mean `{near}`?)"));
            }
            p.bad(&key, m, &names.join(", "));
            continue;
        }
        if seen.contains(&name.text) {
            p.repeated(&key, format!("layer `{}` is given twice", name.text), "each layer once");
            continue;
        }
        seen.push(name.text.clone());
        if let Some(pair) = layer_pair(p, value, &key) {
            map.entries.insert(name.text.clone(), pair);
        }
    }
    map
}

/// `[layer, datatype]` or `layer` (datatype 0). GDSII release 6.0 allows 0–255 for both
/// (Calma GDSII Stream Format Manual, LAYER and DATATYPE records; from memory).
fn layer_pair(p: &mut Problems, v: &OneOrList, key: &str) -> Option<(i16, i16)> {
    let allowed = "`[layer, datatype]` or `layer`, each 0 to 255";
    let items: Vec<&Scalar> = match v {
        OneOrList::One(s) => vec![s],
        OneOrList::List(l) => l.iter().collect(),
    };
    if items.is_empty() || items.len() > 2 {
        p.bad(key, format!("{} numbers given", items.len()), allowed);
        return None;
    }
    let mut out = [0i16; 2];
    for (i, s) in items.iter().enumerate() {
        let k = if items.len() == 2 { format!("{key}[{i}]") } else { key.to_string() };
        let n = p.int(Some(s), &k, None, 0);
        if n > 255 {
            p.bad(&k, format!("{n} is above 255"), allowed);
            return None;
        }
        out[i] = n as i16;
    }
    p.clean(&[key]).then_some((out[0], out[1]))
}

/// `fonts:` read relative to the layout file. A font must lie in the layout's folder
/// (or below it) or in one of `font_dirs` (the command line's `--fonts-from`), after
/// symbolic links are followed: a layout from elsewhere must not make segmask read any
/// file it names (docs/layout-format.md, *Limits*).
pub fn fonts(p: &mut Problems, f: Option<&Vec<Scalar>>, file: &Path, font_dirs: &[std::path::PathBuf]) -> Vec<FontSource> {
    let dir = file.parent().unwrap_or(Path::new(""));
    let roots: Vec<std::path::PathBuf> = std::iter::once(if dir.as_os_str().is_empty() { Path::new(".") } else { dir })
        .chain(font_dirs.iter().map(|d| d.as_path()))
        .filter_map(|d| std::fs::canonicalize(d).ok())
        .collect();
    let mut out = Vec::new();
    for (i, s) in f.map(|f| f.as_slice()).unwrap_or(&[]).iter().enumerate() {
        let key = format!("fonts[{i}]");
        let name = p.text(Some(s), &key, None, "a font file path, relative to the layout file");
        if name.is_empty() {
            continue;
        }
        let path = dir.join(&name);
        let allowed = "a readable font file in the layout's folder (or below it), or in a folder given with --fonts-from";
        let real = match std::fs::canonicalize(&path) {
            Ok(r) => r,
            Err(e) => {
                p.bad(&key, format!("cannot read `{}`: {e}", path.display()), allowed);
                continue;
            }
        };
        if !roots.iter().any(|r| real.starts_with(r)) {
            p.bad(&key, format!("`{name}` lies outside the layout's folder"), allowed);
            continue;
        }
        match super::input::read_text(&real, super::limits::MAX_FONT_BYTES, "font file") {
            Ok(text) => out.push(FontSource { path, text }),
            Err(super::input::ReadProblem::Io(e)) => {
                p.bad(&key, format!("cannot read `{}`: {e}", path.display()), allowed)
            }
            Err(super::input::ReadProblem::Bad { line, column, message, allowed }) => {
                let at = match (line, column) {
                    (Some(l), Some(c)) => format!(" (its line {l}, column {c})"),
                    _ => String::new(),
                };
                p.bad(&key, format!("the font file `{name}` {message}{at}"), &allowed)
            }
        }
    }
    out
}
