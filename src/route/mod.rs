//! Stage `route`: electrodes → leads, pads, transfer dots and the cuts in the common
//! electrode.
//!
//! Takes the electrodes and the layout; gives every drawn lead (centre line and outline),
//! the pad of every net, the transfer dot, and the parts of the back plate that must stay
//! clear of ITO so that front leads face no common electrode. First the capacity check
//! (`capacity.rs`) refuses, in milliseconds and located in the layout, what the steps
//! below cannot route; then three steps:
//! 1. *escape* (`escape.rs`): each SEG net's pieces are joined and led to the seal band on
//!    the pad side by maze search on a grid (search.rs), keeping the minimum gap to
//!    everything already placed, with rip-up and retry in a new order when a net is stuck;
//!    the nets of a row behind another as seen from the pads (`assign::tiers`) go to the
//!    seal band on the far side instead, and `ring.rs` carries them round the seal to the
//!    pad side;
//! 2. *fan-out* (`fanout.rs`): leads are given pads in the order they arrive and drawn to
//!    them as a planar, orthogonal fan-out in the seal band and on the ledge, the transfer
//!    dots (`dots.rs`) among them;
//! 3. *back plate* (`back.rs`): the common electrode is cut clear of the front leads and
//!    its islands are joined and led to the transfer dot without crossing front leads in
//!    the window.

pub mod back;
pub mod capacity;
pub mod corridor;
pub mod dots;
pub mod escape;
pub mod fanout;
pub mod gap_fixes;
pub mod grid;
pub mod open_list;
pub mod pages;
pub mod pending;
pub mod reserve;
pub mod retry;
pub mod ring;
pub mod search;
pub mod side;
pub mod source_tiles;
pub mod strips;
pub mod target;

use crate::electrode::Electrodes;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{Polygon, Pt, Region};
use crate::layout::{Layout, PlateId};
use crate::Result;
use side::SideFrame;

/// A hash set of grid tiles or cells, with foldhash's fixed-seed hasher: the router asks
/// such sets about nearly every tile a search passes (the growth's seed tiles, a goal's
/// tiles), and the standard library's SipHash, built to resist crafted keys, was about
/// 5 % of the route's samples under the test build. Never iterated, so the hasher cannot
/// change what is routed.
pub(crate) type TileSet<T> = std::collections::HashSet<T, foldhash::fast::FixedState>;
/// A hash map keyed by grid tiles, with the hasher of [`TileSet`].
pub(crate) type TileMap<K, V> = std::collections::HashMap<K, V, foldhash::fast::FixedState>;

/// One drawn lead or bus trace.
#[derive(Debug, Clone)]
pub struct Lead {
    /// Net.
    pub net: String,
    /// Plate.
    pub plate: PlateId,
    /// Centre line.
    pub path: Vec<Pt>,
    /// Outline as the router claims it and cuts the commons clear of it, round ends
    /// flattened inside their circles ([`crate::geom::stroke_lead`]); the plate stage
    /// draws a front lead from its centre line with its ends outside their circles
    /// ([`crate::geom::stroke_lead_drawn`]).
    pub outline: Region,
    /// Drawn by the user (bus) or by segmask.
    pub user_bus: bool,
}

/// A pad and the net on it.
#[derive(Debug, Clone)]
pub struct PadSite {
    /// Pin number.
    pub pin: u32,
    /// Net.
    pub net: String,
    /// Pad outline.
    pub outline: Polygon,
}

/// A transfer dot site.
#[derive(Debug, Clone)]
pub struct TransferSite {
    /// Back-plate net it carries.
    pub net: String,
    /// Centre.
    pub at: Pt,
    /// The ITO pad under the dot (same on both plates).
    pub pad: Polygon,
}

/// Everything routing adds.
#[derive(Debug, Clone)]
pub struct Routes {
    /// Leads and bus traces on both plates.
    pub leads: Vec<Lead>,
    /// Pads on the ledge.
    pub pads: Vec<PadSite>,
    /// Transfer dots.
    pub transfers: Vec<TransferSite>,
    /// The pieces of each common electrode that remain after the cuts (net, piece).
    pub common_pieces: Vec<(String, Region)>,
    /// Problems met while routing.
    pub findings: Vec<Finding>,
    /// The elements (indices into the electrodes' elements) behind pieces of a common
    /// the back plate could not join to its transfer dot.
    pub cut_off: Vec<usize>,
}

/// Grid cell size ([`crate::layout::Rules::grid_step`]).
pub fn grid_step(layout: &Layout) -> f64 {
    layout.rules.grid_step()
}

/// Centre-to-centre spacing of neighbouring leads in the fan-out: lead width plus gap,
/// plus one grid cell of margin for the grid-drawn parts.
pub fn lead_pitch(layout: &Layout) -> f64 {
    layout.rules.lead_width + layout.rules.min_gap + grid_step(layout)
}

/// Routes every net to its pad.
pub fn route_leads(layout: &Layout, el: &Electrodes) -> Result<Routes> {
    check_buses(layout, el)?;
    let frame = SideFrame::of(layout);
    capacity::check_capacity(layout, el, &frame)?;
    let mut findings = Vec::new();
    let far_frame = SideFrame::opposite(layout);
    let mut escapes = escape::escape_all(layout, el, &frame, &far_frame, &mut findings);
    gap_fixes::explain_stuck_seg_nets(layout, el, &mut findings);
    let extra = dots::far_tier_dots(el.coms.len(), el.assignment.far.iter().any(|f| *f), layout.pads.side);
    let second = layout.pads.second_row.as_deref();
    // Without a second pad row the far tier's leads go round the seal to the pad side
    // and its own dots sit beside the one row; with one, both go to the second row.
    let (carried, near_extra, far_extra) = match second {
        None => (ring_carry(layout, &frame, &escapes.far_arrivals)?, extra.clone(), Vec::new()),
        Some(_) => (ring::Carried { arrivals: Vec::new(), reach: frame.u_back }, Vec::new(), extra.clone()),
    };
    let near = Near { count: escapes.arrivals.len(), reach: carried.reach, extra: &near_extra };
    escapes.arrivals.extend(carried.arrivals);
    let mut leads: Vec<Lead> = user_buses(layout);
    let near_lines = el.segs.iter().filter(|s| second.is_none() || !el.assignment.far_line(s.index)).count();
    let first_row = RowPlan { pads: &layout.pads, frame: &frame, commons: el.coms.len(), lines: near_lines };
    let (mut pads, mut transfers, mut fan) = plan_pads_and_fanout(layout, el, first_row, &escapes.arrivals, near, &mut findings)?;
    if let Some(row) = second {
        if !el.assignment.far.iter().any(|f| *f) {
            return Err(crate::Error::input(layout.problem(
                "pads.second_row",
                "no SEG line goes to the second pad row: it takes the lines of a row of multiplexed digits that lies behind another as seen from the first row (pads on the top or bottom), and this layout has none".to_string(),
                Some("one pad row (leave out `second_row`)".into()),
            )));
        }
        let mut row = row.clone();
        if row.pins_follow {
            row.first_pin = first_row_end(layout, &pads);
        }
        let far = Near { count: escapes.far_arrivals.len(), reach: far_frame.u_back, extra: &far_extra };
        let plan = RowPlan { pads: &row, frame: &far_frame, commons: 0, lines: el.segs.len() - near_lines };
        let (p2, t2, f2) = plan_pads_and_fanout(layout, el, plan, &escapes.far_arrivals, far, &mut findings)?;
        check_row_fits(layout, &row, &far_frame, &p2)?;
        pads.extend(p2);
        transfers.extend(t2);
        fan.extend(f2);
        check_fixed_pins(layout, &pads, &mut findings);
    }
    for (net, path) in escapes.joins.iter().chain(fan.iter()) {
        leads.push(front_lead(layout, net, path.clone()));
    }
    if let Some(note) = second_pins_note(layout, el, &extra, &transfers) {
        findings.push(note);
    }
    let front_leads: Vec<&Lead> = leads.iter().filter(|l| l.plate == PlateId::Front).collect();
    // With SEG lines the front could not route, the front must change, and the back
    // with it: its commons are laid in one order only. Routed around SEG pieces that
    // never reach the pads, every order of a two-row layout left 70–146 islands cut off
    // and together took half of a failure's 40 s.
    let orders = if front_unroutable(&findings) { 1 } else { back::ATTEMPTS };
    let back = back::route_commons(layout, el, &front_leads, &transfers, orders, &mut findings);
    leads.extend(back.leads);
    Ok(Routes { leads, pads, transfers, common_pieces: back.kept, findings, cut_off: back.cut_off })
}

/// Whether `findings` hold a SEG line the front plate could not route.
pub fn front_unroutable(findings: &[Finding]) -> bool {
    findings.iter().any(|f| f.rule == Rule::Unroutable && f.plate == Some(PlateId::Front))
}

/// The far tier's leads carried round the seal ([`ring::carry`]), or the located reason
/// they do not fit.
fn ring_carry(layout: &Layout, frame: &SideFrame, far: &[(String, Vec<Pt>)]) -> Result<ring::Carried> {
    ring::carry(layout, frame, far).map_err(|r| {
        crate::Error::input(layout.problem(
            "seal.width",
            format!(
                "the digits behind another row lead {} SEG lines round each end of the glass in the seal band, which holds {} at this lead width and gap",
                r.lanes, r.room
            ),
            Some("a wider seal, a smaller lead width and gap, a second pad row on the far side (`pads.second_row`), or fewer lines behind the front row".into()),
        ))
    })
}

/// The pin after the first row's last pad position (the second row's pins follow on).
fn first_row_end(layout: &Layout, pads: &[PadSite]) -> u32 {
    let p = &layout.pads;
    let placed = pads.iter().map(|s| s.pin + 1).max().unwrap_or(p.first_pin);
    placed.max(p.first_pin + p.count.unwrap_or(0))
}

/// The second row's pads lie on its ledge, `edge_margin` clear of both ends of the glass
/// (the spec stage checks this for the first row, whose length it knows).
fn check_row_fits(layout: &Layout, row: &crate::layout::Pads, frame: &SideFrame, pads: &[PadSite]) -> Result<()> {
    let (lo, hi) = (row.edge_margin - 1e-9, frame.side_length() - row.edge_margin + 1e-9);
    let out = pads.iter().any(|s| s.outline.exterior().0.iter().any(|q| !(lo..=hi).contains(&frame.to_local(*q).x)));
    if !out {
        return Ok(());
    }
    let n = pads.len();
    Err(crate::Error::input(layout.problem(
        "pads.second_row.pitch",
        format!(
            "the {n} pads of the second row (the lines of the digits behind the front row) do not fit on the {} ledge at pitch {:.3} mm ({:.3} mm of glass, edge_margin {:.3} mm at each end)",
            row.side.name(),
            row.pitch,
            frame.side_length(),
            row.edge_margin
        ),
        Some("a smaller pitch for the second row, or fewer lines behind the front row".into()),
    )))
}

/// A fixed pin whose net's lead reaches the other row (or no pad) is reported: the rows
/// are chosen by where each line's digits lie (`assign::tiers`), and a fixed pin on the
/// other row would need its lead to cross the glass.
fn check_fixed_pins(layout: &Layout, pads: &[PadSite], findings: &mut Vec<Finding>) {
    for (net, &pin) in &layout.pads.fixed {
        let Some(site) = pads.iter().find(|s| &s.net == net) else { continue };
        if site.pin != pin {
            let c = site.outline.exterior().0.first().copied().unwrap_or(crate::geom::pt(0.0, 0.0));
            findings.push(Finding {
                rule: Rule::Unroutable,
                severity: Severity::Error,
                plate: Some(PlateId::Front),
                nets: vec![net.clone()],
                location: c,
                measured: None,
                required: None,
                message: format!("`{net}` is fixed to pin {pin} but its lead reaches pin {} on the other pad row: lines of the digits behind the front row go to the second row", site.pin),
            });
        }
    }
}

/// The note saying which commons come out on a second pin ([`dots::far_tier_dots`]) and
/// why, at the second dot of the first of them.
fn second_pins_note(layout: &Layout, el: &Electrodes, extra: &[(usize, bool)], transfers: &[TransferSite]) -> Option<Finding> {
    let first = extra.first()?;
    let nets: Vec<String> = extra.iter().map(|(c, _)| el.coms[*c].net.clone()).collect();
    let at = transfers.iter().filter(|t| t.net == nets[0]).nth(1).or_else(|| transfers.iter().find(|t| t.net == el.coms[first.0].net))?.at;
    let n = el.coms.len();
    let s = el.elements.len();
    let segs = el.segs.len();
    Some(Finding {
        rule: Rule::PinCount,
        severity: Severity::Note,
        plate: None,
        nets: nets.clone(),
        location: at,
        measured: None,
        required: None,
        message: format!(
            "{} pins ({} COM + {segs} SEG) where {n} + ⌈{s}/{n}⌉ = {} is the fewest for {s} elements at 1/{n} duty: {} of the row behind the front row as seen from the pads, {}, reach a transfer dot of their own {}, so each comes out on a second pin; join each pair on the board the glass plugs into",
            n + extra.len() + segs,
            n + extra.len(),
            n + s.div_ceil(n),
            nets.join(" and "),
            far_rows(layout, el),
            if layout.pads.second_row.is_some() { "beside the second pad row" } else { "round the seal" },
        ),
    })
}

/// The digit groups of the far tier, as the layout names them with their lines.
fn far_rows(layout: &Layout, el: &Electrodes) -> String {
    let mut keys: Vec<&str> = el.elements.iter().zip(&el.assignment.far).filter(|(e, f)| **f && e.digit.is_some()).map(|(e, _)| e.key.as_str()).collect();
    keys.dedup();
    keys.iter()
        .map(|k| {
            let name = layout.digits.iter().find(|g| g.key == *k).map(|g| g.name.as_str()).unwrap_or("");
            let line = layout.key_lines.get(*k).map(|l| format!(", line {l}")).unwrap_or_default();
            format!("`{k}` ({name}{line})")
        })
        .collect::<Vec<_>>()
        .join(", ")
}

fn front_lead(layout: &Layout, net: &str, path: Vec<Pt>) -> Lead {
    let outline = crate::geom::stroke_lead(&path, layout.rules.lead_width, layout.tolerance);
    Lead { net: net.to_string(), plate: PlateId::Front, path, outline, user_bus: false }
}

fn user_buses(layout: &Layout) -> Vec<Lead> {
    layout
        .buses
        .iter()
        .map(|b| Lead {
            net: b.net.clone(),
            plate: b.plate,
            path: b.points.clone(),
            outline: crate::geom::stroke_polyline(&b.points, b.width, layout.tolerance),
            user_bus: true,
        })
        .collect()
}

fn check_buses(layout: &Layout, el: &Electrodes) -> Result<()> {
    let mut problems = Vec::new();
    for (i, b) in layout.buses.iter().enumerate() {
        let on_front = el.segs.iter().any(|s| s.net == b.net);
        let on_back = el.coms.iter().any(|c| c.net == b.net);
        let ok = match b.plate {
            PlateId::Front => on_front,
            PlateId::Back => on_back,
        };
        if !ok {
            let key = format!("buses[{i}].plate");
            let want = if on_back { "back" } else { "front" };
            problems.push(layout.problem(&key, format!("net `{}` has no electrodes on the {} plate", b.net, b.plate.name()), Some(want.into())));
        }
    }
    if problems.is_empty() { Ok(()) } else { Err(crate::Error::Input(problems)) }
}

/// Which arrivals come straight from the near tier (the first `count`; the rest come
/// round the ring) and how far the ring's lanes reach in from each end of the side.
#[derive(Debug, Clone, Copy)]
struct Near<'a> {
    count: usize,
    reach: (f64, f64),
    /// Second dots of far-tier commons ([`dots::far_tier_dots`]).
    extra: &'a [(usize, bool)],
}

/// How the fan-out below the liquid crystal is laid out: the highest level and the pitch
/// between levels.
#[derive(Debug, Clone, Copy)]
struct FanLevels {
    v_top: f64,
    pitch: f64,
}

/// The pad row along the side, as `u` centres (pin order) and outlines. Without a
/// `start` the row is placed under the leads that reach the seal band (`arrivals`), kept
/// on the back glass and clear of the glass ends, at the offset (within a pad pitch of
/// centred under their span) whose fan-out needs the fewest levels: a fan converging on
/// a row off to one side, or out of step with the leads, needs more levels than the
/// ledge holds (moving the rain-gauge demo's digits 0.5 mm sideways did that). When the
/// row cannot move it stays centred on the back glass.
fn pad_row(p: &crate::layout::Pads, frame: &SideFrame, needed: usize, arrivals: &[fanout::Arrival], levels: impl Fn(f64, usize) -> usize) -> Vec<(f64, Polygon)> {
    let n = p.count.map(|c| c as usize).unwrap_or(needed).max(needed);
    let row = (n as f64 - 1.0) * p.pitch;
    let first = match p.start {
        Some(s) => s,
        None => {
            let centred = (frame.u_back.0 + frame.u_back.1) / 2.0 - row / 2.0;
            let lo = (p.edge_margin + p.width / 2.0).max(frame.u_back.0 + p.width / 2.0);
            let hi = (frame.side_length() - p.edge_margin - p.width / 2.0).min(frame.u_back.1 - p.width / 2.0) - row;
            if arrivals.is_empty() || hi < lo {
                centred
            } else {
                let span = arrivals.iter().fold((f64::MAX, f64::MIN), |(a, b), x| (a.min(x.u), b.max(x.u)));
                let middle = ((span.0 + span.1) / 2.0 - row / 2.0).clamp(lo, hi);
                // Offsets in eighths of a pitch, nearest the middle first (ties keep it).
                (0..=8)
                    .flat_map(|k| [k as f64, -(k as f64)])
                    .map(|k| (middle + k * p.pitch / 8.0).clamp(lo, hi))
                    .min_by_key(|&first| levels(first, n))
                    .unwrap_or(middle)
            }
        }
    };
    (0..n)
        .map(|i| {
            let u = first + i as f64 * p.pitch;
            let poly = frame.rect_global(u - p.width / 2.0, p.edge_margin, u + p.width / 2.0, p.edge_margin + p.length);
            (u, poly)
        })
        .collect()
}

/// The deepest level the fan-out from `arrivals` plus the transfer dots placed beside them
/// needs onto a row of `n` pads from `first` at `pitch` (`usize::MAX` when the dots do not
/// fit).
fn fan_levels(layout: &Layout, row: RowPlan<'_>, arrivals: &[fanout::Arrival], near: Near<'_>, first: f64, n: usize, fan: FanLevels) -> usize {
    let (frame, commons, pitch) = (row.frame, row.commons, row.pads.pitch);
    let pads: Vec<f64> = (0..n).map(|i| first + i as f64 * pitch).collect();
    let mut arrivals = arrivals.to_vec();
    let us: Vec<f64> = arrivals[..near.count].iter().map(|a| a.u).chain(pads.iter().copied()).collect();
    let Some(dots) = dots::place_transfer_dots(layout, frame, row.pads.width, &us, fan.pitch, commons, near.reach, near.extra) else { return usize::MAX };
    arrivals.extend(dots.iter().map(|d| fanout::Arrival { u: d.x, v: d.y }));
    arrivals.sort_by(|a, b| a.u.total_cmp(&b.u));
    let us: Vec<f64> = arrivals.iter().map(|a| a.u).collect();
    let m = fanout::match_in_order(&us, &pads);
    let pad_u: Vec<f64> = m.iter().map(|&k| pads[k]).collect();
    fanout::depths(&arrivals, &pad_u, fan.v_top, fan.pitch).into_iter().max().unwrap_or(0)
}

type Planned = (Vec<PadSite>, Vec<TransferSite>, Vec<(String, Vec<Pt>)>);

/// One pad row to plan: its pads, its side's frame, how many of the commons' transfer
/// dots go beside it (the first row: all; a second row: none, only the far tier's own)
/// and how many SEG lines it takes.
#[derive(Clone, Copy)]
struct RowPlan<'a> {
    pads: &'a crate::layout::Pads,
    frame: &'a SideFrame,
    commons: usize,
    lines: usize,
}

fn plan_pads_and_fanout(
    layout: &Layout,
    el: &Electrodes,
    row_plan: RowPlan<'_>,
    escaped: &[(String, Vec<Pt>)],
    near: Near<'_>,
    findings: &mut Vec<Finding>,
) -> Result<Planned> {
    let (p, frame, commons) = (row_plan.pads, row_plan.frame, row_plan.commons);
    let nets_needed = row_plan.lines + commons + near.extra.len();
    let pitch = lead_pitch(layout);
    // With several transfer dots side by side in the seal, horizontal runs stay below the
    // seal band so that no lead passes under another common's dot.
    let v_top = if commons + near.extra.len() > 1 { frame.v_lc - layout.seal.width - pitch } else { frame.v_lc - pitch };
    let seg_arrivals: Vec<fanout::Arrival> = escaped
        .iter()
        .filter_map(|(_, path)| path.last())
        .map(|q| frame.to_local(*q))
        .map(|q| fanout::Arrival { u: q.x, v: q.y })
        .collect();
    let fan = FanLevels { v_top, pitch };
    let row = pad_row(p, frame, nets_needed, &seg_arrivals, |first, n| fan_levels(layout, row_plan, &seg_arrivals, near, first, n, fan));
    // Arrivals in local (u, v) with their nets; the common's arrival is its transfer dot.
    let mut arrivals: Vec<(String, Vec<Pt>, fanout::Arrival)> = escaped
        .iter()
        .map(|(net, path)| {
            let end = frame.to_local(*path.last().expect("escape paths are never empty"));
            (net.clone(), path.clone(), fanout::Arrival { u: end.x, v: end.y })
        })
        .collect();
    let tpad = layout.transfer.pad;
    let us: Vec<f64> = arrivals[..near.count].iter().map(|a| a.2.u).chain(row.iter().map(|r| r.0)).collect();
    let dots = dots::place_transfer_dots(layout, frame, p.width, &us, pitch, commons, near.reach, near.extra).ok_or_else(|| {
        crate::Error::input(layout.problem(
            "pads",
            format!("no room in the seal beside the pad row for the {} transfer dot(s) of the common electrodes", commons + near.extra.len()),
            Some("a shorter pad row (`pads.start`, `pads.pitch`) or a wider back plate".into()),
        ))
    })?;
    let mut transfers = Vec::new();
    let common_of = |i: usize| if i < commons { &el.coms[i] } else { &el.coms[near.extra[i - commons].0] };
    for (i, dot) in dots.into_iter().enumerate() {
        let c = common_of(i);
        let dot_at = frame.to_global(dot);
        let band = frame.rect_global(dot.x - tpad / 2.0, frame.v_lc - layout.seal.width, dot.x + tpad / 2.0, frame.v_lc);
        let square = frame.rect_global(dot.x - tpad / 2.0, dot.y - tpad / 2.0, dot.x + tpad / 2.0, dot.y + tpad / 2.0);
        let pad_poly = crate::geom::intersection(&crate::geom::region_of([square.clone()]), &crate::geom::region_of([band]))
            .0
            .into_iter()
            .next()
            .unwrap_or(square);
        arrivals.push((c.net.clone(), vec![dot_at], fanout::Arrival { u: dot.x, v: dot.y }));
        transfers.push(TransferSite { net: c.net.clone(), at: dot_at, pad: pad_poly });
    }
    arrivals.sort_by(|a, b| a.2.u.total_cmp(&b.2.u));

    // Fixed pins first, the rest matched in order to the free pads.
    let mut pad_of: Vec<Option<usize>> = vec![None; arrivals.len()];
    let mut taken = vec![false; row.len()];
    for (i, (net, _, _)) in arrivals.iter().enumerate() {
        if let Some(&pin) = layout.pads.fixed.get(net).filter(|&&pin| pin >= p.first_pin) {
            let k = (pin - p.first_pin) as usize;
            if k < row.len() {
                pad_of[i] = Some(k);
                taken[k] = true;
            }
        }
    }
    let free_pads: Vec<usize> = (0..row.len()).filter(|k| !taken[*k]).collect();
    let loose: Vec<usize> = (0..arrivals.len()).filter(|i| pad_of[*i].is_none()).collect();
    let m = fanout::match_in_order(
        &loose.iter().map(|&i| arrivals[i].2.u).collect::<Vec<_>>(),
        &free_pads.iter().map(|&k| row[k].0).collect::<Vec<_>>(),
    );
    for (j, &i) in loose.iter().enumerate() {
        pad_of[i] = Some(free_pads[m[j]]);
    }
    let pad_idx: Vec<usize> = pad_of.iter().map(|x| x.expect("every arrival has a pad")).collect();
    report_crossings(&arrivals, &pad_idx, frame, findings);

    let pad_u: Vec<f64> = pad_idx.iter().map(|&k| row[k].0).collect();
    let arr: Vec<fanout::Arrival> = arrivals.iter().map(|a| a.2).collect();
    let v_floor = p.edge_margin + p.length + pitch;
    let pad_end = p.edge_margin + p.length - p.width.min(p.length) / 2.0;
    let plans = match fanout::plan(&arr, &pad_u, v_top, v_floor, pitch, pad_end) {
        Ok(pl) => pl,
        Err(levels) => {
            return Err(crate::Error::input(layout.problem(
                "seal",
                format!(
                    "the fan-out between the liquid crystal and the pads needs {levels} lead levels of {pitch:.3} mm but the seal band and ledge leave room for {}",
                    ((v_top - v_floor) / pitch).floor() as i64 + 1
                ),
                Some("a deeper ledge or seal inset, pads closer under the digits, or a smaller lead width and gap".into()),
            )));
        }
    };
    let mut fan = Vec::new();
    for ((net, escape_path, _), plan) in arrivals.iter().zip(plans) {
        let mut path = escape_path.clone();
        path.extend(plan.into_iter().skip(1).map(|q| frame.to_global(q)));
        fan.push((net.clone(), path));
    }
    let pads = arrivals
        .iter()
        .zip(&pad_idx)
        .map(|((net, _, _), &k)| PadSite { pin: p.first_pin + k as u32, net: net.clone(), outline: row[k].1.clone() })
        .collect();
    Ok((pads, transfers, fan))
}

fn report_crossings(arrivals: &[(String, Vec<Pt>, fanout::Arrival)], pad_idx: &[usize], frame: &SideFrame, findings: &mut Vec<Finding>) {
    for i in 0..arrivals.len() {
        for j in i + 1..arrivals.len() {
            if pad_idx[j] < pad_idx[i] {
                let at = frame.to_global(crate::geom::pt((arrivals[i].2.u + arrivals[j].2.u) / 2.0, arrivals[i].2.v));
                findings.push(Finding {
                    rule: Rule::Unroutable,
                    severity: Severity::Error,
                    plate: Some(PlateId::Front),
                    nets: vec![arrivals[i].0.clone(), arrivals[j].0.clone()],
                    location: at,
                    measured: None,
                    required: None,
                    message: format!(
                        "fixed pins make the leads of {} and {} cross in the fan-out",
                        arrivals[i].0, arrivals[j].0
                    ),
                });
            }
        }
    }
}
#[cfg(test)]
mod tests;
