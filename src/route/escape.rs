//! Escape routing: joins the pieces of every SEG net and leads it out of the liquid-crystal
//! region into the seal band on the pad side, by maze search, one net after another, with
//! rip-up and retry in a new order when a net is stuck; strip by strip of the glass
//! ([`super::strips`]), the strips at once on the cores, where the nets leave room to
//! divide it.

use super::grid::Grid;
use super::search::{corners, Search};
use super::corridor::{find_guided, Ask, Corridors, Goal, TileGeom};
use super::target::Targets;
use super::side::SideFrame;
use crate::electrode::Electrodes;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{region_of, stroke_lead, stroke_polyline, Polygon, Pt, Region};
use crate::layout::{Layout, PlateId};

/// How many times the whole escape is retried in a new order.
const ATTEMPTS: usize = 8;

/// Extra cost per cell of running inside a digit, legend or icon body (with its counters
/// filled), under static drive. Leads that cross a body cut the common electrode behind
/// them; enough such cuts cut a piece of it off, so leads should leave a body by the
/// shortest way.
const BODY_COST: f32 = 10.0;
/// The same when multiplexed: SEG lines join their segments through the counters and the
/// gaps of their own digit, which is shorter and keeps the sides of the digit free for the
/// commons, so running inside a body costs only a little.
const BODY_COST_MULTIPLEXED: f32 = 0.5;

/// The result of escape routing.
#[derive(Debug, Clone, Default)]
pub struct Escapes {
    /// Per routed net, the path from its pieces to the seal band (last point in the band).
    pub arrivals: Vec<(String, Vec<Pt>)>,
    /// Paths joining the pieces of multi-piece nets.
    pub joins: Vec<(String, Vec<Pt>)>,
    /// Per far-tier net, the path from its pieces to the seal band on the side opposite
    /// the pads (last point in that band); `ring.rs` carries it on to the pad side.
    pub far_arrivals: Vec<(String, Vec<Pt>)>,
}

struct NetPieces {
    name: String,
    /// SEG line (0-based).
    line: u32,
    pieces: Vec<Polygon>,
    /// In the far tier: leaves on the side opposite the pads (`assign::tiers`).
    far: bool,
}

/// Routes every SEG net to the seal band — the far tier's (`assign::tiers`) to the band
/// on the side opposite the pads, `far_frame` — ; nets that cannot be routed become
/// findings.
pub fn escape_all(layout: &Layout, el: &Electrodes, frame: &SideFrame, far_frame: &SideFrame, findings: &mut Vec<Finding>) -> Escapes {
    let nets = collect_pieces(layout, el);
    let frames = Frames { near: frame, far: far_frame };
    // The lines the assignment leads first (joins through a tight node), then the rest
    // nearest the pad side first.
    let rank = |i: usize| el.assignment.route_first.iter().position(|&l| l == nets[i].line).unwrap_or(usize::MAX);
    let mut order: Vec<usize> = (0..nets.len()).collect();
    order.sort_by(|&a, &b| rank(a).cmp(&rank(b)).then(nearest_v(frames.of(&nets[a]), &nets[a]).total_cmp(&nearest_v(frames.of(&nets[b]), &nets[b]))));
    if let Some(esc) = escape_in_strips(layout, el, &frames, &nets, &order) {
        return esc;
    }
    let (esc, notes) = escape_on_one_grid(layout, el, &frames, &nets, order);
    findings.extend(notes);
    esc
}

/// The escape of every net on one grid over the whole glass, with rip-up and retry.
fn escape_on_one_grid(layout: &Layout, el: &Electrodes, frames: &Frames, nets: &[NetPieces], order: Vec<usize>) -> (Escapes, Vec<Finding>) {
    let base = base_grid(layout, el, frames, nets, None);
    let mut kit = Kit::new(&base);
    super::retry::rip_up_and_retry(order, ATTEMPTS, |order| attempt(layout, frames, nets, order, base.clone(), &mut kit)).unwrap_or_default()
}

/// Fewest nets a strip of the glass holds ([`super::strips`]): below this, routing a
/// layout's nets in one piece costs too little to share out.
const LEAST_NETS_PER_STRIP: usize = 12;
/// How many times the glass is halved at most for the escape: up to eight strips, each
/// with a grid of its own part of the glass.
const STRIP_HALVINGS: u32 = 3;

/// The escape routed strip by strip ([`super::strips`]), the strips at once on the
/// cores, each on its own grid walled off at its ends; `None` when the layout does not
/// divide or some net of a strip cannot be routed inside it (the whole glass is then
/// routed as one, where a lead may go round into the next strip). The strips' leads keep
/// the gap from each other by the walls: a lead's centre stays `wall` inside its strip.
fn escape_in_strips(layout: &Layout, el: &Electrodes, frames: &Frames, nets: &[NetPieces], order: &[usize]) -> Option<Escapes> {
    use rayon::prelude::*;
    let h = super::grid_step(layout);
    let clearance = wall(layout, h) + keepout(layout, h) + 2.0 * h;
    let across = matches!(layout.pads.side, crate::layout::Side::Left | crate::layout::Side::Right);
    let spans: Vec<(f64, f64)> = nets.iter().map(|n| span_along(&n.pieces, across)).collect();
    let strips = super::strips::divide(&spans, clearance, LEAST_NETS_PER_STRIP, STRIP_HALVINGS);
    if strips.len() < 2 {
        return None;
    }
    // One search state per worker, kept from strip to strip: a state's per-tile arrays
    // span the glass, and each strip touches one memory page of each array per row of
    // tiles, so a state per strip faulted in four times the pages (and the check, after
    // routing, faulted them in again).
    // One strip that cannot be routed sends the whole glass to be routed as one, whatever
    // the other strips give, so once a strip has failed the strips not yet begun are not
    // routed at all (the escape of a layout whose SEG lines were shut in spent a third of
    // its time routing strips after the first had failed).
    let failed = std::sync::atomic::AtomicBool::new(false);
    let routed: Vec<Option<Escapes>> = strips
        .par_iter()
        .map_init(
            || None::<Kit>,
            |kit, strip| {
                if failed.load(std::sync::atomic::Ordering::Relaxed) {
                    return None;
                }
                let grid = base_grid(layout, el, frames, nets, Some(strip));
                let mine: Vec<usize> = order.iter().copied().filter(|i| strip.nets.binary_search(i).is_ok()).collect();
                let kit = kit.get_or_insert_with(|| Kit::new(&grid));
                let routed = super::retry::rip_up_and_retry(mine, ATTEMPTS, |order| attempt(layout, frames, nets, order, grid.clone(), kit)).and_then(|(esc, notes)| notes.is_empty().then_some(esc));
                if routed.is_none() {
                    failed.store(true, std::sync::atomic::Ordering::Relaxed);
                }
                routed
            },
        )
        .collect();
    let mut all = Escapes::default();
    for esc in routed {
        let esc = esc?;
        all.arrivals.extend(esc.arrivals);
        all.joins.extend(esc.joins);
        all.far_arrivals.extend(esc.far_arrivals);
    }
    // In the order the nets would have been routed on one grid, so that every later
    // stage meets the leads as it did before the glass was divided.
    let rank: std::collections::HashMap<&str, usize> = order.iter().enumerate().map(|(k, &i)| (nets[i].name.as_str(), k)).collect();
    for leads in [&mut all.arrivals, &mut all.joins, &mut all.far_arrivals] {
        leads.sort_by_key(|(net, _)| rank.get(net.as_str()).copied().unwrap_or(usize::MAX));
    }
    Some(all)
}

/// How far inside its strip a lead's centre stays: half a lead and half a gap, so that
/// leads of two strips keep the gap, and two cells for where the grid puts them.
fn wall(layout: &Layout, h: f64) -> f64 {
    (layout.rules.lead_width + layout.rules.min_gap) / 2.0 + 2.0 * h
}

/// The span of `pieces` along the pad side: in x for pads on the top or bottom, in y
/// (`across`) for pads on the left or right.
fn span_along(pieces: &[Polygon], across: bool) -> (f64, f64) {
    let along = |p: &Pt| if across { p.y } else { p.x };
    pieces.iter().flat_map(|p| p.exterior().0.iter()).map(along).fold((f64::MAX, f64::MIN), |(lo, hi), u| (lo.min(u), hi.max(u)))
}

/// The frames of the two sides a lead may leave by.
struct Frames<'a> {
    near: &'a SideFrame,
    far: &'a SideFrame,
}

impl Frames<'_> {
    fn of(&self, n: &NetPieces) -> &SideFrame {
        if n.far { self.far } else { self.near }
    }
}

fn collect_pieces(layout: &Layout, el: &Electrodes) -> Vec<NetPieces> {
    let a = &el.assignment;
    el.segs
        .iter()
        .map(|s| {
            let far = a.far_line(s.index);
            let mut pieces = s.outline.0.clone();
            for b in layout.buses.iter().filter(|b| b.plate == PlateId::Front && b.net == s.net) {
                pieces.extend(stroke_polyline(&b.points, b.width, layout.tolerance).0);
            }
            NetPieces { name: s.net.clone(), line: s.index, pieces: nearest_chain(pieces), far }
        })
        .collect()
}

/// The pieces in the order they join: the first, then always the piece nearest to those
/// taken so far (Prim's order for a minimum spanning tree, on polygon distances), so a
/// net's joins stay short and inside its own part of the glass.
fn nearest_chain(mut rest: Vec<Polygon>) -> Vec<Polygon> {
    if rest.len() < 3 {
        return rest;
    }
    let mut out = vec![rest.remove(0)];
    let mut best: Vec<f64> = rest.iter().map(|p| crate::geom::distance(p, &out[0])).collect();
    while !rest.is_empty() {
        let k = (0..rest.len()).min_by(|&a, &b| best[a].total_cmp(&best[b])).expect("rest is not empty");
        let p = rest.remove(k);
        best.remove(k);
        for (i, q) in rest.iter().enumerate() {
            best[i] = best[i].min(crate::geom::distance(q, &p));
        }
        out.push(p);
    }
    out
}

fn nearest_v(frame: &SideFrame, n: &NetPieces) -> f64 {
    n.pieces
        .iter()
        .flat_map(|p| p.exterior().0.iter())
        .map(|c| frame.to_local(*c).y)
        .fold(f64::MAX, f64::min)
}

/// Keep-out radius around placed ITO for the centre line of a new lead.
fn keepout(layout: &Layout, h: f64) -> f64 {
    layout.rules.min_gap + layout.rules.lead_width / 2.0 + h
}

/// The front plate's grid before any lead: the glass outside the liquid crystal and the
/// seal band strips blocked, every net's pieces claimed with their keep-out, the bodies
/// costly, the passages kept for back leads blocked. Inside one strip of the glass
/// ([`super::strips`]) only, when `strip` is given: everything outside it is blocked and
/// only its nets are claimed, so the grid's memory and its making follow the strip.
fn base_grid(layout: &Layout, el: &Electrodes, frames: &Frames, nets: &[NetPieces], strip: Option<&super::strips::Strip>) -> Grid {
    let f = layout.glass.front;
    let h = super::grid_step(layout);
    let mut g = Grid::new(f.x, f.y, f.x1(), f.y1(), h);
    // What lies in the strip: polygons cut to it (the whole glass without one).
    let window = strip.map(|s| {
        let w = wall(layout, h);
        let (lo, hi) = ((s.lo + w).max(-1e9), (s.hi - w).min(1e9));
        match layout.pads.side {
            crate::layout::Side::Left | crate::layout::Side::Right => (f.x - 1.0, lo, f.x1() + 1.0, hi),
            _ => (lo, f.y - 1.0, hi, f.y1() + 1.0),
        }
    });
    let inside = |polys: Vec<Polygon>| -> Region {
        match window {
            Some((x0, y0, x1, y1)) => region_of(polys.iter().filter_map(|p| crate::geom::clip_to_rect(p, x0, y0, x1, y1))),
            None => region_of(polys),
        }
    };
    let lc = layout.glass.back.inset(layout.seal.inset + layout.seal.width);
    let margin = layout.rules.lead_width / 2.0 + h;
    let band = |frame: &SideFrame| frame.rect_global(frame.u_lc.0 + margin, frame.v_lc - 3.0 * h, frame.u_lc.1 - margin, frame.v_lc + margin + h);
    let inner = lc.inset(margin);
    let mut open = vec![inner.polygon(), band(frames.near)];
    if nets.iter().any(|n| n.far) {
        open.push(band(frames.far));
    }
    g.block_outside(&crate::geom::union_all(inside(open).0));
    let k = keepout(layout, h);
    for (i, n) in nets.iter().enumerate().filter(|(i, _)| strip.is_none_or(|s| s.nets.binary_search(i).is_ok())) {
        // Piece by piece: a bus stroke may overlap a segment, and the spans are even-odd.
        // The keep-out is measured exactly (`claim_near`), a quarter cell short of the full
        // slack: the offset polygons it replaces fell short by up to their chord tolerance
        // (a quarter cell) round every corner, and the default gap at 1/3 duty needs that
        // room (a lead centred on a usable cell still keeps the gap and 3/4 of a cell).
        for p in &n.pieces {
            g.claim_near(&region_of([p.clone()]), k - h / 4.0, i as u32 + 1);
        }
    }
    let filled: Vec<Polygon> = el.coms.iter().flat_map(|c| c.outline.0.iter()).map(|p| Polygon::new(p.exterior().clone(), vec![])).collect();
    g.add_cost(&inside(filled), if el.coms.len() > 1 { BODY_COST_MULTIPLEXED } else { BODY_COST });
    // Passages the assignment keeps for back leads stay free of front leads.
    g.block(&inside(el.assignment.passages.clone()));
    g.compact();
    g
}

type AttemptResult = (Escapes, Vec<usize>, Vec<Finding>);

/// The search state of the escape's searches, reused from attempt to attempt (and strip
/// to strip): every buffer is reset by stamp, so what one search left never changes
/// another's result.
struct Kit {
    search: Search,
    corridors: Corridors,
}

impl Kit {
    fn new(grid: &Grid) -> Kit {
        Kit { search: Search::new(grid), corridors: Corridors::new(grid) }
    }
}

fn attempt(layout: &Layout, frames: &Frames, nets: &[NetPieces], order: &[usize], mut grid: Grid, kit: &mut Kit) -> AttemptResult {
    let Kit { search, corridors } = kit;
    let mut esc = Escapes::default();
    let mut failed = Vec::new();
    let mut notes = Vec::new();
    let h = grid.h;
    let k = keepout(layout, h);
    let mut joined = Targets::new(&grid);
    for &i in order {
        let owner = i as u32 + 1;
        let n = &nets[i];
        let mut tree: Vec<usize> = Vec::new();
        joined.clear();
        let mut ok = true;
        for (pi, piece) in n.pieces.iter().enumerate() {
            let cells = piece_cells(&grid, piece, owner);
            if pi == 0 || cells.iter().any(|&c| joined.contains(c)) {
                for &c in &cells {
                    if !joined.contains(c) {
                        joined.add(c);
                        tree.push(c);
                    }
                }
                continue;
            }
            match find_guided(search, corridors, &Ask { grid: &grid, owner, sources: &cells, goal: &joined }) {
                Ok(path) => {
                    let mut pts = corners(&grid, &path);
                    claim_lead(&mut grid, layout, &pts, owner, k);
                    // After the claim: the stub runs inside the piece, and claimed it
                    // would steer the leads routed after this one.
                    into_pieces(&n.pieces, &mut pts, layout.rules.lead_width, h);
                    for &c in path.iter().chain(cells.iter()) {
                        if !joined.contains(c) {
                            joined.add(c);
                            tree.push(c);
                        }
                    }
                    esc.joins.push((n.name.clone(), pts));
                }
                Err(b) => {
                    ok = false;
                    notes.push(stuck(&grid, nets, i, &b, "its pieces cannot be joined"));
                    break;
                }
            }
        }
        if !ok {
            failed.push(i);
            continue;
        }
        let frame = frames.of(n);
        let goal = SealBand { frame, grid: &grid, v_goal: frame.v_lc };
        match find_guided(search, corridors, &Ask { grid: &grid, owner, sources: &tree, goal: &goal }) {
            Ok(path) => {
                let mut pts = corners(&grid, &path);
                claim_lead(&mut grid, layout, &pts, owner, k);
                into_pieces(&n.pieces, &mut pts, layout.rules.lead_width, h);
                if n.far { esc.far_arrivals.push((n.name.clone(), pts)) } else { esc.arrivals.push((n.name.clone(), pts)) }
            }
            Err(b) => {
                failed.push(i);
                notes.push(stuck(&grid, nets, i, &b, "no lead can reach the pad side"));
            }
        }
    }
    (esc, failed, notes)
}

/// The escape ends in the seal band on the pad side: below `v_goal` in the side's frame.
struct SealBand<'a> {
    frame: &'a SideFrame,
    grid: &'a Grid,
    v_goal: f64,
}

impl Goal for SealBand<'_> {
    fn is_goal(&self, c: usize) -> bool {
        self.frame.to_local(self.grid.centre(c)).y < self.v_goal
    }
    fn is_goal_tile(&self, tiles: &TileGeom, t: usize) -> bool {
        tiles.corner_cells(t).iter().any(|&c| self.is_goal(c))
    }
    fn bound(&self, c: usize) -> f32 {
        ((self.frame.to_local(self.grid.centre(c)).y - self.v_goal) / self.grid.h).max(0.0) as f32
    }
}

/// Cells inside a piece that its own net may use; at least the cell nearest its centre.
fn piece_cells(grid: &Grid, piece: &Polygon, owner: u32) -> Vec<usize> {
    let mut cells = Vec::new();
    grid.for_cells_in(&region_of([piece.clone()]), |c| {
        if grid.owner(c) == owner {
            cells.push(c)
        }
    });
    if cells.is_empty() {
        use geo::Centroid;
        if let Some(c) = piece.centroid().and_then(|p| grid.index_of(p.0)) {
            cells.push(c);
        }
    }
    cells
}

/// A pointed corner of a piece: its point, its inside angle θ (radians, under 90°) and
/// the unit vector halving it, into the piece.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Tip {
    at: Pt,
    angle: f64,
    inward: Pt,
}

/// The corners of a piece's outline whose inside angle is under 90°: pointed tips, where
/// the piece is narrower than a lead for some way in.
fn pointed_corners(piece: &Polygon) -> Vec<Tip> {
    let ring = &piece.exterior().0;
    // The ring closes on its first point; its last point is left out.
    let n = ring.len().saturating_sub(1);
    if n < 3 {
        return Vec::new();
    }
    // Twice the signed area: positive for a counter-clockwise ring.
    let turn: f64 = (0..n).map(|i| ring[i].x * ring[(i + 1) % n].y - ring[(i + 1) % n].x * ring[i].y).sum();
    let unit = |v: Pt| v / v.x.hypot(v.y);
    (0..n)
        .filter_map(|i| {
            let (a, b, c) = (ring[(i + n - 1) % n], ring[i], ring[(i + 1) % n]);
            let (u, v) = (a - b, c - b);
            // Convex (the ring turns the way it winds) and the two edges less than 90°
            // apart.
            let cross = (b.x - a.x) * (c.y - b.y) - (b.y - a.y) * (c.x - b.x);
            (cross * turn > 0.0 && u.x * v.x + u.y * v.y > 0.0 && u != v).then(|| Tip {
                at: b,
                angle: (u.x * v.y - u.y * v.x).abs().atan2(u.x * v.x + u.y * v.y),
                inward: unit(unit(u) + unit(v)),
            })
        })
        .collect()
}

/// Where a lead ends at `end` in the narrow end of a pointed corner of one of its net's
/// `pieces` — within w / (2 tan(θ/2)) of the point, where a corner of inside angle θ is
/// narrower than the lead width w (plane geometry), and a cell further — the point a
/// straight stub (orthogonal or 45°, the direction nearest the corner's halving line)
/// carries it on to, half a lead past that narrow end, inside the piece. A lead that
/// ended in the pointed tip of a slanted segment joined the segment through the tip: the
/// tip's two edges, split apart by the lead's, faced each other 0.0973 mm apart where
/// 0.1 mm leads were drawn to a 0.1 mm width rule.
fn stub_into_piece(pieces: &[Polygon], end: Pt, w: f64, h: f64) -> Option<Pt> {
    use geo::Intersects;
    let dirs = (0..8).map(|k| {
        let a = k as f64 * std::f64::consts::FRAC_PI_4;
        crate::geom::pt(a.cos(), a.sin())
    });
    let dot = |a: Pt, b: Pt| a.x * b.x + a.y * b.y;
    pieces.iter().find_map(|piece| {
        pointed_corners(piece).into_iter().find_map(|tip| {
            let narrow = w / (2.0 * (tip.angle / 2.0).tan());
            if crate::geom::dist(tip.at, end) >= narrow + h {
                return None;
            }
            let dir = dirs.clone().max_by(|a, b| dot(*a, tip.inward).total_cmp(&dot(*b, tip.inward)))?;
            let along = (narrow + w / 2.0 - dot(end - tip.at, tip.inward)) / dot(dir, tip.inward);
            let to = end + dir * along;
            (along > 0.0 && piece.intersects(&geo::Point(to))).then_some(to)
        })
    })
}

/// [`stub_into_piece`] at both ends of a lead's corner points.
fn into_pieces(pieces: &[Polygon], pts: &mut Vec<Pt>, w: f64, h: f64) {
    if let Some(to) = pts.first().and_then(|&p| stub_into_piece(pieces, p, w, h)) {
        pts.insert(0, to);
    }
    if let Some(to) = pts.last().and_then(|&p| stub_into_piece(pieces, p, w, h)) {
        pts.push(to);
    }
}

fn claim_lead(grid: &mut Grid, layout: &Layout, pts: &[Pt], owner: u32, k: f64) {
    let tol = layout.tolerance.max(grid.h / 4.0);
    let lead: Region = stroke_lead(pts, layout.rules.lead_width, tol);
    grid.claim_near(&lead, k, owner);
}

fn stuck(grid: &Grid, nets: &[NetPieces], i: usize, b: &super::search::Blocked, why: &str) -> Finding {
    let mut names = vec![nets[i].name.clone()];
    names.extend(b.blockers.iter().take(2).filter_map(|&o| nets.get(o as usize - 1)).map(|n| n.name.clone()));
    let by = if b.over_budget {
        "; the search reached its memory budget before finding a way (a way this long is a sign of a layout far too crowded)".to_string()
    } else if names.len() > 1 {
        format!("; blocked by {}", names[1..].join(" and "))
    } else {
        "; the way out is closed".to_string()
    };
    Finding {
        rule: Rule::Unroutable,
        severity: Severity::Error,
        plate: Some(PlateId::Front),
        nets: names.clone(),
        location: grid.centre(b.nearest),
        measured: None,
        required: None,
        message: format!("net {} cannot be routed: {why}{by}", nets[i].name),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::rect;
    use crate::glyph::{Element, ElementKind};

    /// Thirty squares in a row on a glass 100 mm wide (static drive, one net each): the
    /// glass divides into strips, every strip routes, and the leads are those of the
    /// escape on one grid over the whole glass, in the same order.
    #[test]
    fn strips_give_the_leads_of_one_grid() {
        let mut layout = crate::layout::fixture::tiny_layout();
        layout.glass.front.width = 100.0;
        layout.glass.back.width = 100.0;
        layout.window.width = 92.0;
        let els: Vec<Element> = (0..30)
            .map(|i| {
                let r = region_of([rect(6.0 + 3.0 * i as f64, 12.0, 7.5 + 3.0 * i as f64, 13.5)]);
                Element { name: format!("S{i}"), kind: ElementKind::Icon, outline: r.clone(), body: r, digit: None, drives: format!("S{i}"), key: "icons".into() }
            })
            .collect();
        let a = crate::assign::assign(&layout, &els).unwrap();
        let el = crate::electrode::build_electrodes(&layout, &els, &a).unwrap();
        let (near, far) = (SideFrame::of(&layout), SideFrame::opposite(&layout));
        let frames = Frames { near: &near, far: &far };
        let nets = collect_pieces(&layout, &el);
        let h = super::super::grid_step(&layout);
        let spans: Vec<(f64, f64)> = nets.iter().map(|n| span_along(&n.pieces, false)).collect();
        let strips = super::super::strips::divide(&spans, wall(&layout, h) + keepout(&layout, h) + 2.0 * h, LEAST_NETS_PER_STRIP, STRIP_HALVINGS);
        assert_eq!(strips.len(), 2, "thirty nets, at least twelve a strip");
        let order: Vec<usize> = (0..nets.len()).rev().collect();
        let divided = escape_in_strips(&layout, &el, &frames, &nets, &order).expect("every strip routes");
        let (whole, notes) = escape_on_one_grid(&layout, &el, &frames, &nets, order);
        assert!(notes.is_empty(), "{notes:?}");
        assert_eq!(divided.arrivals.len(), 30);
        assert_eq!(divided.arrivals, whole.arrivals);
        assert_eq!(divided.joins, whole.joins);
    }

    /// A right triangle with legs 4 and 1 has inside angles of 90°, atan(1/4) ≈ 14° and
    /// atan(4) ≈ 76° (plane geometry): the two sharp ones are pointed, the right angle is
    /// not, whichever way the ring winds; a rectangle has none.
    #[test]
    fn pointed_corners_are_those_under_a_right_angle() {
        use crate::geom::{pt, rect};
        let ccw = Polygon::new(vec![pt(0.0, 0.0), pt(4.0, 0.0), pt(0.0, 1.0), pt(0.0, 0.0)].into(), vec![]);
        let cw = Polygon::new(vec![pt(0.0, 0.0), pt(0.0, 1.0), pt(4.0, 0.0), pt(0.0, 0.0)].into(), vec![]);
        for tri in [ccw, cw] {
            let mut got = pointed_corners(&tri);
            got.sort_by(|a, b| a.at.x.total_cmp(&b.at.x));
            assert_eq!(got.iter().map(|g| g.at).collect::<Vec<_>>(), vec![pt(0.0, 1.0), pt(4.0, 0.0)]);
            assert!((got[0].angle - 4f64.atan()).abs() < 1e-12 && (got[1].angle - 0.25f64.atan()).abs() < 1e-12, "{got:?}");
            // Halving the 14° corner at (4, 0) points back along the long leg, turned up
            // by half its angle.
            let half = 0.25f64.atan() / 2.0;
            assert!(crate::geom::dist(got[1].inward, pt(-half.cos(), half.sin())) < 1e-12, "{got:?}");
        }
        assert!(pointed_corners(&rect(0.0, 0.0, 3.0, 1.0)).is_empty());
    }

    /// A tip of 30° (vertices at (0, 0), (10, ±10 tan 15°)) is narrower than a 0.1 mm
    /// lead for 0.1 / (2 tan 15°) = 0.1866 mm from its point (plane geometry). A lead
    /// ending 0.1 mm in is carried on along the halving line, here the x axis, to
    /// 0.1866 + 0.05 mm, where the tip is 2 × 0.2366 × tan 15° = 0.127 mm wide, more than
    /// the lead; one ending 1 mm in, past the narrow end, gets no stub.
    #[test]
    fn a_lead_ending_in_a_narrow_tip_is_carried_on_to_where_it_is_a_lead_wide() {
        use crate::geom::pt;
        let t = 15f64.to_radians().tan();
        let tip = Polygon::new(vec![pt(0.0, 0.0), pt(10.0, -10.0 * t), pt(10.0, 10.0 * t), pt(0.0, 0.0)].into(), vec![]);
        let (w, h) = (0.1, 0.025);
        let to = stub_into_piece(std::slice::from_ref(&tip), pt(0.1, 0.0), w, h).expect("a stub");
        let narrow = w / (2.0 * t);
        assert!(crate::geom::dist(to, pt(narrow + w / 2.0, 0.0)) < 1e-12, "{to:?}");
        assert!(2.0 * to.x * t > w);
        assert_eq!(stub_into_piece(std::slice::from_ref(&tip), pt(1.0, 0.0), w, h), None);
        let mut pts = vec![pt(0.1, 0.0), pt(0.1, -5.0)];
        into_pieces(std::slice::from_ref(&tip), &mut pts, w, h);
        assert_eq!(pts.len(), 3, "{pts:?}");
        assert!(crate::geom::dist(pts[0], to) < 1e-12);
    }
}
