//! The back plate: cuts every common electrode clear of the front leads, then joins each
//! common's islands and leads them to its transfer dot.
//!
//! A back lead faces front ITO of another net only where that cannot light: it is
//! forbidden over front leads inside the window, costly over them in the rest of the
//! liquid crystal and free under or outside the seal. A lead of one common keeps the gap
//! from every other common's electrode and leads (facing another common's pixels would
//! switch them with the wrong SEG line); the overlap margins give way to the passages
//! the assignment keeps for back leads. Commons are routed one after another, each
//! growing its tree from its dots to the island nearest by the way a lead takes (Prim's
//! order), with rip-up and a new order when one is stuck.

use super::grid::Grid;
use super::search::{corners, neighbours, Blocked, Search};
use super::corridor::{find_guided_or_fence, find_guided_or_give_up, Ask, Corridors};
use super::source_tiles::SourceTiles;
use super::pending::Pending;
use super::target::Targets;
use super::{Lead, TransferSite};
use crate::electrode::Electrodes;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{cut_to_box, difference, offset_round, region_of, snap, stroke_lead, stroke_polyline, translate, union_all, Polygon, Pt, Region};
use crate::layout::{Layout, PlateId};

/// Extra cost (per cell) of a back lead facing a front lead outside the window.
const HIDDEN_CROSSING_COST: f32 = 40.0;
/// The weight on the back searches' heuristic ([`Search::weighted`]). A common's lead
/// from its tree to its next island crosses the costly liquid crystal outside the window
/// and turns, which the bound by air leaves out, so a plain search popped nearly every
/// cell of its corridor: on the 32-digit two-row benchmark the 195 back searches made
/// 2.96 M pops, 0.93 M at 1.5 (2.3 M at 1.2, 1.0 M at 2.0), route time 1.16 → 0.95 s.
/// The front plate's searches stay plain: weighted there, leads of a digit took routes
/// that shut in their neighbours' (eight demos and tests failed).
const HEURISTIC_WEIGHT: f32 = 1.5;
/// How many orders of the commons are tried.
pub const ATTEMPTS: usize = 4;

/// What the back plate routing gives.
#[derive(Debug, Clone)]
pub struct BackRoutes {
    /// Back-plate leads joining each common's islands and its transfer dot.
    pub leads: Vec<Lead>,
    /// The pieces of each common electrode that are kept (net, piece).
    pub kept: Vec<(String, Region)>,
    /// The elements (indices) behind the pieces that could not be joined to their dot.
    pub cut_off: Vec<usize>,
}

/// One common's islands and its dot.
struct Common {
    net: String,
    owner: u32,
    islands: Vec<Region>,
    /// Per island, the cells where a lead may end on it ([`landing_area`]).
    landings: Vec<CellRuns>,
    /// Its transfer dots' pads (the far tier's commons may have two).
    dots: Vec<Polygon>,
    /// Per dot, the cells where a lead may end on it.
    dot_landings: Vec<CellRuns>,
}

/// An island that could not be joined: its common, the island and what blocked it.
#[derive(Debug, Clone)]
struct Stuck {
    common: usize,
    island: usize,
    at: Pt,
    blockers: Vec<u32>,
}

/// Cuts and routes every common electrode, trying up to `orders` orders of the commons.
pub fn route_commons(layout: &Layout, el: &Electrodes, front_leads: &[&Lead], transfers: &[TransferSite], orders: usize, findings: &mut Vec<Finding>) -> BackRoutes {
    let tol = layout.tolerance;
    let electrodes = union_all(el.segs.iter().flat_map(|s| s.outline.0.iter().cloned()));
    let leads = union_all(front_leads.iter().flat_map(|l| l.outline.0.iter().cloned()));
    let bare = difference(&leads, &electrodes);
    let cuts = difference(&offset_round(&bare, layout.rules.min_gap, tol), &electrodes);
    let passages = region_of(el.assignment.passages.iter().cloned());
    // The grid's frame alone (its cells all free), for the landing cells found beside
    // the grid's own making.
    let frame = back_frame(layout);
    // Each common's islands are cut on their own, spread over the cores (and each cut
    // piece opened on its own inside, `islands_of`); collected in common order.
    use rayon::prelude::*;
    let cut_commons = || {
        el.coms
        .par_iter()
        .enumerate()
        .map(|(k, c)| {
            let pixels = union_all(
                el.elements.iter().zip(&el.assignment.com).filter(|(_, ck)| **ck == k as u32).flat_map(|(e, _)| e.outline.0.iter().cloned()),
            );
            let mut islands = islands_of(layout, &c.outline, &cuts, &pixels, &passages);
            for b in layout.buses.iter().filter(|b| b.plate == PlateId::Back && b.net == c.net) {
                islands.push(stroke_polyline(&b.points, b.width, tol));
            }
            let dots: Vec<Polygon> = transfers.iter().filter(|t| t.net == c.net).map(|t| t.pad.clone()).collect();
            // Worked out once here, on all cores, not in every attempt. (The elements behind
            // each island, which only messages name, are found for the stuck ones alone.)
            let landings = islands.par_iter().map(|isl| landing_area(layout, &frame, isl)).collect();
            let dot_landings = dots.iter().map(|d| landing_area(layout, &frame, &region_of([d.clone()]))).collect();
            Common { net: c.net.clone(), owner: k as u32 + 1, islands, landings, dots, dot_landings }
        })
        .collect::<Vec<Common>>()
    };
    // The grid's glass edge and front-lead costs need nothing of the commons: laid out
    // beside the islands (rayon::join), the commons' claims after.
    let (commons, mut base) = rayon::join(cut_commons, || back_grid(layout, &leads));
    claim_commons(layout, &mut base, &commons);
    // The islands were cut on all cores and the attempts run on this thread: without
    // giving back what the cutting freed, the attempts' own memory came on top of it
    // (the 40-digit benchmark's peak, here, 127–145 MB in five runs; 116–118 MB with).
    crate::memory::release_freed();
    let mut search = Search::weighted(&base, HEURISTIC_WEIGHT);
    // Stuck commons lead the next attempt, the higher-numbered first: in the row nearest
    // the pads the commons are numbered down the row (the far tier counts the other way),
    // so there of two stuck ones the lower, whose way out to the seal runs beneath the
    // other's, is laid first and the upper one goes round it. A column of
    // stacked icons at the end of a row, moved 5 mm left, left COM3 and COM4 shut in by
    // COM2 and every later order worse with COM3 first; with COM4 first it routed.
    let stuck_order = |stuck: &mut Vec<usize>| stuck.sort_unstable_by(|a, b| b.cmp(a));
    let ((out, stuck, order), notes) = super::retry::rip_up_and_retry_arranged((0..commons.len()).collect(), orders, stuck_order, |order| {
        let (((out, stuck), failed, notes), _) = attempt(layout, &commons, order, &base, &[], false, &mut search);
        ((out, stuck, order.to_vec()), failed, notes)
    })
    .unwrap_or_default();
    // Ways are held only for a few cut-off islands (a local fence, as the three test
    // lines): with many, no held way undoes what fences them, and each round is one more
    // whole attempt with its floods on a layout that already took four.
    let (out, stuck) = if stuck.is_empty() || stuck.len() > MOST_HELD_ISLANDS {
        (out, stuck)
    } else {
        reserve_and_retry(layout, &commons, &base, &mut search, (out, stuck, order), notes.len())
    };
    findings.extend(by_cause(layout, el, &commons, &stuck));
    let mut cut_off: Vec<usize> = Vec::new();
    for s in &stuck {
        for e in elements_behind(el, s.common as u32, &commons[s.common].islands[s.island]) {
            if !cut_off.contains(&e) {
                cut_off.push(e);
            }
        }
    }
    let kept = commons.iter().flat_map(|c| c.islands.iter().map(|r| (c.net.clone(), r.clone()))).collect();
    BackRoutes { leads: out, kept, cut_off }
}

/// The pieces of a grown common that remain after the cuts and face one of its pixels.
/// The cut common falls apart into pieces that an opening cannot join again (it only
/// takes away), so each piece is opened on its own, against the cuts and pixels near it
/// ([`crate::geom::cut_to_box`]), spread over the cores: the opening of the whole
/// common, one polygon of thousands of vertices, was most of this stage's time. A piece
/// alike an earlier one but for a shift, with the cuts and pixels about it
/// ([`crate::geom::alike`]), takes that one's islands shifted.
fn islands_of(layout: &Layout, outline: &Region, cuts: &Region, pixels: &Region, passages: &Region) -> Vec<Region> {
    use geo::BoundingRect;
    use rayon::prelude::*;
    let rules = &layout.rules;
    let tol = layout.tolerance;
    // An opening (shrink, then grow back) removes the slivers too narrow to etch that
    // the cuts leave beside segment corners; what faces a pixel always stays.
    let keep_width = rules.min_width + 2.0 * (rules.undercut - rules.film_bias());
    let r = keep_width / 2.0 + 1e-4;
    // Margins give way to the passages kept for back leads.
    let cut_body = difference(&difference(outline, cuts), &difference(passages, pixels));
    let min_overlap = rules.min_width * rules.min_width;
    // Each piece with the cuts and pixels about it: pieces alike but for a shift (the
    // same part of equal digits, cut the same way) are opened once and the others take
    // its islands shifted (on the two-row benchmark 256 pieces are 171 shapes).
    let locals: Vec<Vec<Region>> = cut_body
        .0
        .par_iter()
        .map(|piece| {
            let Some(bb) = piece.bounding_rect() else { return Vec::new() };
            vec![region_of([piece.clone()]), cut_to_box(&cuts.0, &bb), cut_to_box(&pixels.0, &bb)]
        })
        .collect();
    let (model, shift) = crate::geom::alike(&locals);
    let once: Vec<Option<Vec<Region>>> = (0..locals.len())
        .into_par_iter()
        .map(|i| {
            (model[i] == i).then(|| {
                // An empty polygon (no box) leaves no island.
                let [piece, cuts, pixels] = locals[i].as_slice() else { return Vec::new() };
                let opened = difference(&offset_round(&offset_round(piece, -r, tol), r, tol), cuts);
                let body = crate::geom::union(&opened, &crate::geom::intersection(piece, pixels));
                body.0
                    .into_iter()
                    .map(|p| region_of([p]))
                    .filter(|isl| crate::geom::area(&crate::geom::intersection(isl, pixels)) > min_overlap)
                    .collect()
            })
        })
        .collect();
    (0..locals.len())
        .flat_map(|i| match &once[i] {
            Some(islands) => islands.clone(),
            None => {
                let (dx, dy) = shift[i];
                once[model[i]].iter().flatten().map(|isl| snap(&translate(isl, dx, dy))).collect()
            }
        })
        .collect()
}

type AttemptResult = ((Vec<Lead>, Vec<Stuck>), Vec<usize>, Vec<Finding>);

/// How many times the islands every order left cut off are given ways of their own
/// ([`reserve_and_retry`]).
const RESERVING_ROUNDS: usize = 3;
/// Ways are held when at most this many islands are left cut off.
const MOST_HELD_ISLANDS: usize = 3;

/// When every order of the commons left islands cut off (`best`, its order last, with
/// `findings` findings): the best order is run again asking each cut-off island for a
/// way across the other commons' leads ([`super::reserve`]), and run once more with those
/// ways held for their commons from the start — up to [`RESERVING_ROUNDS`] times, each
/// round's new ways added to the last (the common's tree of that attempt is held with
/// its way, since the way ends on it). Three lines side by side, each behind one of
/// three commons (the coupons demo at 1/3 duty), leave the line of whichever common is
/// laid last fenced in by the two others' leads, in every order; with a way held for it
/// across them, the others go round. Keeps the attempt with the fewest findings, the
/// best order's on ties.
fn reserve_and_retry(layout: &Layout, commons: &[Common], base: &Grid, search: &mut Search, best: (Vec<Lead>, Vec<Stuck>, Vec<usize>), findings: usize) -> (Vec<Lead>, Vec<Stuck>) {
    let (mut out, mut stuck, order) = best;
    let mut fewest = findings;
    let mut reserved: Vec<super::reserve::Reservation> = Vec::new();
    for _ in 0..RESERVING_ROUNDS {
        // The round that asks for the ways runs the order with the ways held so far;
        // what it routes counts as an attempt of its own.
        let (((o, s), _, notes), ways) = attempt(layout, commons, &order, base, &reserved, true, search);
        if notes.len() < fewest {
            (out, stuck, fewest) = (o, s, notes.len());
        }
        if fewest == 0 || ways.is_empty() {
            break;
        }
        reserved.extend(ways);
    }
    if fewest > 0 && !reserved.is_empty() {
        let (((o, s), _, notes), _) = attempt(layout, commons, &order, base, &reserved, false, search);
        if notes.len() < fewest {
            (out, stuck) = (o, s);
        }
    }
    (out, stuck)
}

/// Routes the commons in `order` on `base` with the ways `reserved` held for their
/// commons; with `seek`, each island left cut off is asked for once more across the
/// other commons' leads, and the ways found come back beside the attempt's result.
fn attempt(layout: &Layout, commons: &[Common], order: &[usize], base: &Grid, reserved: &[super::reserve::Reservation], seek: bool, search: &mut Search) -> (AttemptResult, Vec<super::reserve::Reservation>) {
    let mut grid = base.clone();
    super::reserve::hold(&mut grid, reserved);
    let mut ways = Vec::new();
    let mut out = Vec::new();
    let mut failed = Vec::new();
    let mut notes = Vec::new();
    let mut stuck_islands = Vec::new();
    let mut tree = Targets::new(&grid);
    let mut corridors = Corridors::new(&grid);
    for &k in order {
        let c = &commons[k];
        let Some(dot) = c.dots.first() else { continue };
        let mut seeds = Vec::new();
        for (d, inner) in c.dots.iter().zip(&c.dot_landings) {
            seeds.extend(landing_cells(&grid, &region_of([d.clone()]), inner, |_| true));
        }
        // A common's own claims leave what it may use as it was.
        corridors.keep_factors_for(c.owner);
        let tiles = corridors.tiles();
        let mut source_tiles = SourceTiles::new(tiles.ntx * tiles.nty);
        for &s in &seeds {
            source_tiles.add(tiles.tile_index(s));
        }
        let mut grow = Growth { tree_cells: seeds.iter().map(|&i| i as u32).collect(), seeds, source_tiles };
        let left = grow_tree(layout, &mut grid, search, &mut corridors, c, &mut grow, &mut out);
        // The tree as a goal only for the islands the growth could not reach (most often
        // none): kept as it grew, it cost an R-tree insertion per tile of every island.
        tree.clear();
        if !left.is_empty() {
            for &i in &grow.tree_cells {
                tree.add(i as usize);
            }
        }
        let mut ok = true;
        let mut shut = ShutIn::default();
        let mut cut_off = Vec::new();
        // What the growth could not reach is asked for from its own side, nearest the dot
        // first, so that each cut-off part reports what blocks it.
        for i in nearest_first(&c.islands, dot).into_iter().filter(|i| left.contains(i)) {
            match join(layout, &mut grid, search, &mut corridors, c, &mut tree, &mut shut, i) {
                Ok(Some(lead)) => out.push(lead),
                Ok(None) => {}
                Err((at, blockers)) => {
                    ok = false;
                    // Counted per island, so that the attempt with fewest cut-off parts wins.
                    notes.push(stuck(c, at, &blockers, commons));
                    if !blockers.is_empty() {
                        cut_off.push(i);
                    }
                    stuck_islands.push(Stuck { common: k, island: i, at, blockers });
                }
            }
        }
        corridors.forget();
        if seek && !cut_off.is_empty() {
            ways.extend(ways_across(layout, base, reserved, &out, search, c, &mut tree, &cut_off));
        }
        if !ok {
            failed.push(k);
        }
    }
    (((out, stuck_islands), failed, notes), ways)
}

/// The ways common `c`'s islands `cut_off` would take across the other commons' leads
/// `leads` (from `tree`, the common's tree as the attempt left it), each as the keep-out
/// of its lead to hold for `c` ([`super::reserve::soft_grid`]). Islands found no way even
/// so (shut in by front leads and other commons' islands) give none.
#[allow(clippy::too_many_arguments)]
fn ways_across(layout: &Layout, base: &Grid, reserved: &[super::reserve::Reservation], leads: &[Lead], search: &mut Search, c: &Common, tree: &mut Targets, cut_off: &[usize]) -> Vec<super::reserve::Reservation> {
    let mut soft = super::reserve::soft_grid(layout, base, reserved, leads, c.owner, &c.net);
    let mut corridors = Corridors::new(&soft);
    corridors.keep_factors_for(c.owner);
    let mut shut = ShutIn::default();
    let reach = super::reserve::keep_out(layout, base.h);
    let held = |lead: &Lead| super::reserve::Reservation { owner: c.owner, spans: base.spans_near(&lead.outline, reach) };
    let mut ways = Vec::new();
    for &i in cut_off {
        // Each way joins the tree, so the next island may join through it.
        if let Ok(Some(lead)) = join(layout, &mut soft, search, &mut corridors, c, tree, &mut shut, i) {
            ways.push(held(&lead));
        }
    }
    if !ways.is_empty() {
        // The way ends on the tree as this attempt grew it: the tree's leads are held too.
        for lead in leads.iter().filter(|l| l.net == c.net) {
            ways.push(held(lead));
        }
    }
    ways
}

/// A common's tree while it grows: the cells a search for the next island starts from
/// (the dots' landing cells, then one cell per corridor tile of each lead and island
/// joined: the common's own ITO and leads, which the search may cross, join the rest)
/// and every cell of the tree, from which the fallback joins' goal is made.
struct Growth {
    seeds: Vec<usize>,
    /// Every cell of the tree, in the order it grew (as `u32`, as the searches keep
    /// cells: hundreds of thousands per common on a large glass).
    tree_cells: Vec<u32>,
    /// The tiles of the seeds (each holds one already), as the coarse searches take
    /// them in.
    source_tiles: SourceTiles,
}

/// Grows a common's tree from its dots (Prim's order by the lead's true cost): each search
/// runs from the whole tree to the nearest island not yet joined, so the islands join in
/// the order the ways between them allow. Joining the island nearest the dot in a straight
/// line first (as before) joined the second digit of a row ahead of the first: its lead
/// went round the first digit through the seal band and shut in the first digit's other
/// common. Returns the islands it could not reach.
fn grow_tree(layout: &Layout, grid: &mut Grid, search: &mut Search, corridors: &mut Corridors, c: &Common, g: &mut Growth, out: &mut Vec<Lead>) -> Vec<usize> {
    let ends: Vec<Vec<usize>> = c
        .islands
        .iter()
        .zip(&c.landings)
        .map(|(isl, inner)| landing_cells(grid, isl, inner, |i| grid.owner(i) == c.owner || grid.owner(i) == super::grid::FREE))
        .collect();
    let mut pending = Pending::new(grid, ends);
    while pending.any() {
        let Ok(path) = find_guided_or_give_up(search, corridors, &Ask { grid, owner: c.owner, sources: &g.seeds, goal: &pending }, &mut g.source_tiles) else { break };
        let Some(k) = path.last().and_then(|&e| pending.island_at(e)) else { break };
        pending.join(k);
        let tiles = corridors.tiles();
        // Neighbouring cells mostly share a tile, which then needs no hashing.
        let mut last = usize::MAX;
        for &i in path.iter().chain(pending.ends(k)) {
            g.tree_cells.push(i as u32);
            let t = tiles.tile_index(i);
            if t != last && g.source_tiles.add(t) {
                g.seeds.push(i);
            }
            last = t;
        }
        let pts = corners(grid, &path);
        if pts.len() >= 2 {
            let outline = stroke_lead(&pts, layout.rules.lead_width, layout.tolerance);
            let h = grid.h;
            grid.claim_near(&outline, layout.rules.min_gap + layout.rules.lead_width / 2.0 + h, c.owner);
            out.push(Lead { net: c.net.clone(), plate: PlateId::Back, path: pts, outline, user_bus: false });
        }
    }
    pending.waiting()
}

/// The elements of common `k` whose pixels the island lies behind.
fn elements_behind(el: &Electrodes, k: u32, island: &Region) -> Vec<usize> {
    use geo::{BoundingRect, Intersects};
    let Some(bb) = island.bounding_rect() else { return Vec::new() };
    el.elements
        .iter()
        .zip(&el.assignment.com)
        .enumerate()
        .filter(|(_, (e, ck))| {
            **ck == k && e.outline.bounding_rect().is_some_and(|r| r.intersects(&bb)) && e.outline.intersects(island)
        })
        .map(|(i, _)| i)
        .collect()
}

/// One finding per cause: the stuck islands of a common blocked by the same commons
/// become one finding at the first of them, naming every element behind them as the
/// layout names it, with the line of its entry. A common cut off behind every digit of
/// a row gave one finding per digit before.
fn by_cause(layout: &Layout, el: &Electrodes, commons: &[Common], islands: &[Stuck]) -> Vec<Finding> {
    let mut groups: Vec<(usize, Vec<u32>, Vec<&Stuck>)> = Vec::new();
    for s in islands {
        // The two commons the message names, in either order.
        let mut key = s.blockers.clone();
        key.truncate(2);
        key.sort_unstable();
        match groups.iter_mut().find(|(c, b, _)| *c == s.common && *b == key) {
            Some(g) => g.2.push(s),
            None => groups.push((s.common, key, vec![s])),
        }
    }
    groups
        .into_iter()
        .map(|(k, blockers, members)| {
            let c = &commons[k];
            let mut names: Vec<String> = Vec::new();
            let mut entries: Vec<String> = Vec::new();
            let mut behind_all: Vec<usize> = Vec::new();
            for m in &members {
                for e in elements_behind(el, k as u32, &c.islands[m.island]) {
                    behind_all.push(e);
                    let e = &el.elements[e];
                    if !names.contains(&e.name) {
                        names.push(e.name.clone());
                    }
                    let entry = match crate::layout::key_line(&layout.key_lines, &e.key) {
                        Some(l) => format!("`{}` line {l}", e.key),
                        None => format!("`{}`", e.key),
                    };
                    if !entries.contains(&entry) {
                        entries.push(entry);
                    }
                }
            }
            let behind = if names.is_empty() {
                String::new()
            } else {
                format!(" behind {} ({})", names.join(", "), entries.join(", "))
            };
            let mut f = stuck(c, members[0].at, &blockers, commons);
            let parts = if members.len() == 1 { "a part".to_string() } else { format!("{} parts", members.len()) };
            f.message = f.message.replacen("a part", &parts, 1);
            if let Some(i) = f.message.find(" cannot reach") {
                f.message.insert_str(i, &behind);
            }
            if side_pads_fence(layout, el, &behind_all) {
                f.message.push_str(SIDE_PADS_FIX);
            }
            for fix in super::gap_fixes::narrow_gap_fixes(layout, el, &behind_all, super::gap_fixes::Through::Junctions) {
                f.message.push_str(&fix);
            }
            f
        })
        .collect()
}

/// What to change where a common of a row of multiplexed digits is cut off with the pads
/// at the row's end (docs/architecture.md, *Pads on the left or right of a row of
/// multiplexed digits*).
const SIDE_PADS_FIX: &str = "; with the pads on the left or right, the SEG leads of the digits further from them run along the row and fence off a common of three or more digits in a row (two route): put the pads on the top or bottom side (`pads.side`)";

/// Whether the pads lie at the end of a row (left or right, one row of pads) and some of
/// `behind` are digits of a group of three or more: the case [`SIDE_PADS_FIX`] answers.
fn side_pads_fence(layout: &Layout, el: &Electrodes, behind: &[usize]) -> bool {
    use crate::layout::Side;
    if !matches!(layout.pads.side, Side::Left | Side::Right) || layout.pads.second_row.is_some() {
        return false;
    }
    behind.iter().any(|&i| {
        let e = &el.elements[i];
        e.digit.is_some() && {
            let mut digits: Vec<&str> = el.elements.iter().filter(|o| o.key == e.key).filter_map(|o| o.digit.as_deref()).collect();
            digits.sort_unstable();
            digits.dedup();
            digits.len() >= 3
        }
    })
}

/// The cells of a piece of ITO (a transfer dot's pad, an island of a common) where a lead
/// may end: at least half a lead width in from its edge, so that the round end of the
/// lead lies inside (a lead ending on the edge leaves part of its end outside, a notch
/// narrower than the lead — 0.1617 mm for a 0.17 mm lead under laser-film rules); all its
/// usable cells when it is too small for that.
fn landing_cells(grid: &Grid, piece: &Region, inner: &CellRuns, usable: impl Fn(usize) -> bool) -> Vec<usize> {
    let mut cells: Vec<usize> = inner.cells().filter(|&i| usable(i)).collect();
    if cells.is_empty() {
        grid.for_cells_in(piece, |i| {
            if usable(i) {
                cells.push(i)
            }
        });
    }
    cells
}

/// The cells of a piece of ITO where a lead's centre may end ([`landing_cells`]): more
/// than half a lead width in from its edge, found on the grid ([`Grid::for_cells_inward`]).
/// The shrunk polygon they were taken from before (an offset with round joins per
/// island) was a sixth of the route's CPU on the two-row benchmark.
fn landing_area(layout: &Layout, frame: &Grid, piece: &Region) -> CellRuns {
    let mut runs = CellRuns::default();
    frame.for_cells_inward(piece, layout.rules.lead_width / 2.0, |i| runs.push(i));
    runs
}

/// Cells kept as runs of consecutive indices (first cell, count), pushed in increasing
/// order: every island's landing cells are held through the whole back plate, and as
/// one index each they raised the two-row benchmark's peak memory by 18 MB. A cell
/// index fits 32 bits: the grid holds at most 64 million cells (`spec::limits`).
#[derive(Debug, Clone, Default)]
struct CellRuns(Vec<(u32, u32)>);

impl CellRuns {
    fn push(&mut self, i: usize) {
        let i = i as u32;
        match self.0.last_mut() {
            Some((first, n)) if *first + *n == i => *n += 1,
            _ => self.0.push((i, 1)),
        }
    }

    /// The cells in increasing order.
    fn cells(&self) -> impl Iterator<Item = usize> + '_ {
        self.0.iter().flat_map(|&(first, n)| (first..first + n).map(|i| i as usize))
    }
}

/// The places a common's failed joins found shut in, each with the nets that close it
/// in. They stay shut in while the common's tree grows elsewhere: its own claims
/// ([`Grid::claim_near`]) turn free cells into its own and other nets' cells into
/// blocked ones, so no cell changes between open and closed for it. A wall of other
/// commons' leads across the glass leaves most islands of a common on its far side: on
/// the 32-digit two-row benchmark with its commons in the order 2, 1, 3, 4 (a temporary
/// switch) the joins of COM3's 34 islands each flooded the same 2.55 M cells, 29.8 s,
/// and COM4's 16 islands 14.7 s.
#[derive(Default)]
struct ShutIn {
    places: Vec<(Vec<u32>, Vec<u32>, usize)>,
}

impl ShutIn {
    /// The nets closing in a place found before from which a flood of `owner` starting
    /// on `cells` cannot get out, and the place's cell nearest the tree. Such a flood
    /// moves only into cells a lead may enter: those of `cells` must lie in the place,
    /// and of the others (a landing cell may be closed to leads, in the window beside
    /// a front lead) every open neighbour; at least one must lie in it.
    fn blockers_around(&self, grid: &Grid, owner: u32, cells: &[usize]) -> Option<(&[u32], usize)> {
        let has = |place: &[u32], i: usize| u32::try_from(i).is_ok_and(|i| place.binary_search(&i).is_ok());
        let open = |i: usize| grid.usable_xy(i % grid.nx, i / grid.nx, owner);
        // Every open neighbour, diagonals too (the flood steps past no corner of another
        // net, so this asks for more than it needs, never less).
        let closed_in = |place: &[u32], i: usize| neighbours(i, grid.nx, grid.ny).all(|(_, _, _, n)| !open(n) || has(place, n));
        let shut_in = |place: &[u32]| {
            cells.iter().any(|&i| has(place, i)) && cells.iter().all(|&i| if open(i) { has(place, i) } else { closed_in(place, i) })
        };
        self.places.iter().find(|(place, _, _)| shut_in(place)).map(|(_, b, nearest)| (b.as_slice(), *nearest))
    }

    /// What the floods found: the place shut in (its cells sorted; none when the tree's
    /// side ran out), the nets closing it in and its cell nearest the tree.
    fn add(&mut self, blocked: Blocked) {
        if !blocked.shut_in.is_empty() {
            self.places.push((blocked.shut_in, blocked.blockers, blocked.nearest));
        }
    }
}

/// Joins island `k` of a common to the tree; the lead drawn, if one was needed, or the place where
/// the search stopped. An island whose landing cells all lie in a place an earlier join
/// found shut in (`shut`) is shut in by the same nets, without flooding it again.
#[allow(clippy::too_many_arguments)]
fn join(layout: &Layout, grid: &mut Grid, search: &mut Search, corridors: &mut Corridors, c: &Common, tree: &mut Targets, shut: &mut ShutIn, k: usize) -> Result<Option<Lead>, (Pt, Vec<u32>)> {
    use geo::Centroid;
    let isl = &c.islands[k];
    let usable = |i: usize| grid.owner(i) == c.owner || grid.owner(i) == super::grid::FREE;
    let mut cells = Vec::new();
    grid.for_cells_in(isl, |i| {
        if usable(i) {
            cells.push(i)
        }
    });
    let ends = landing_cells(grid, isl, &c.landings[k], usable);
    if cells.is_empty() || cells.iter().any(|&i| tree.contains(i)) {
        for &i in &ends {
            tree.add(i);
        }
        return Ok(None);
    }
    let at = |nearest: usize| isl.centroid().map(|p| p.0).unwrap_or_else(|| grid.centre(nearest));
    if let Some((blockers, nearest)) = shut.blockers_around(grid, c.owner, &ends) {
        return Err((at(nearest), blockers.to_vec()));
    }
    match find_guided_or_fence(search, corridors, &Ask { grid, owner: c.owner, sources: &ends, goal: &*tree }) {
        Ok(path) => {
            let pts = corners(grid, &path);
            for &i in path.iter().chain(ends.iter()) {
                tree.add(i);
            }
            if pts.len() < 2 {
                return Ok(None);
            }
            let tol = layout.tolerance;
            let outline = stroke_lead(&pts, layout.rules.lead_width, tol);
            let h = grid.h;
            grid.claim_near(&outline, layout.rules.min_gap + layout.rules.lead_width / 2.0 + h, c.owner);
            Ok(Some(Lead { net: c.net.clone(), plate: PlateId::Back, path: pts, outline, user_bus: false }))
        }
        Err(b) => {
            let found = (at(b.nearest), b.blockers.clone());
            shut.add(b);
            Err(found)
        }
    }
}

/// Island indices, nearest the dot first.
fn nearest_first(islands: &[Region], dot: &Polygon) -> Vec<usize> {
    use geo::Centroid;
    let at = dot.centroid().map(|p| p.0).unwrap_or_default();
    let d2 = |r: &Region| r.centroid().map(|p| (p.0.x - at.x).powi(2) + (p.0.y - at.y).powi(2)).unwrap_or(f64::MAX);
    let mut v: Vec<usize> = (0..islands.len()).collect();
    v.sort_by(|&a, &b| d2(&islands[a]).total_cmp(&d2(&islands[b])));
    v
}

fn stuck(c: &Common, at: Pt, blockers: &[u32], commons: &[Common]) -> Finding {
    let by: Vec<&str> = blockers.iter().filter_map(|&o| commons.iter().find(|x| x.owner == o)).map(|x| x.net.as_str()).take(2).collect();
    let why = if by.is_empty() {
        "front leads in the window close the way".to_string()
    } else {
        format!("blocked by {} and the front leads in the window", by.join(" and "))
    };
    Finding {
        rule: Rule::Unroutable,
        severity: Severity::Error,
        plate: Some(PlateId::Back),
        nets: std::iter::once(c.net.clone()).chain(by.iter().map(|n| n.to_string())).collect(),
        location: at,
        measured: None,
        required: None,
        message: format!("a part of common electrode {} cannot reach its transfer dot: {why}", c.net),
    }
}

/// The back plate's grid before the commons: every cell outside the edge clearance
/// blocked, and cells near the front leads forbidden in the window and costly in the rest
/// of the liquid crystal.
/// The back plate's grid with every cell free: the back glass in cells of the grid step.
fn back_frame(layout: &Layout) -> Grid {
    let b = layout.glass.back;
    Grid::new(b.x, b.y, b.x1(), b.y1(), super::grid_step(layout))
}

fn back_grid(layout: &Layout, front_leads: &Region) -> Grid {
    let b = layout.glass.back;
    let h = super::grid_step(layout);
    let mut g = back_frame(layout);
    // Back leads keep the edge clearance from the back glass edge, like all ITO but pads
    // (the check's `edge-clearance`): a lead run outside the seal would otherwise sit on
    // the strip that scribing and breaking the glass may chip.
    g.block_outside(&region_of([b.inset(layout.rules.edge_clearance + layout.rules.lead_width / 2.0 + h).polygon()]));
    let lc = layout.glass.back.inset(layout.seal.inset + layout.seal.width);
    let w = layout.window;
    let reach = layout.rules.min_gap + layout.rules.lead_width / 2.0 + h;
    let mut cells = Vec::new();
    g.for_cells_near(front_leads, reach, |c| cells.push(c));
    for c in cells {
        let p = g.centre(c);
        // A cell counts as in the window (or the liquid crystal) when a lead centred on
        // it would reach in.
        let m = layout.rules.lead_width / 2.0 + h;
        let inside = |r: &crate::layout::Rect| p.x >= r.x - m && p.x <= r.x1() + m && p.y >= r.y - m && p.y <= r.y1() + m;
        if inside(&w) {
            g.set_cost(c, f32::INFINITY);
        } else if inside(&lc) {
            g.set_cost(c, g.cost(c).max(HIDDEN_CROSSING_COST));
        }
    }
    g
}

/// Each common's islands, and its dot, are its own: other commons keep the gap from
/// them (with one common there is no other). Then the grid is compacted.
fn claim_commons(layout: &Layout, g: &mut Grid, commons: &[Common]) {
    let reach = layout.rules.min_gap + layout.rules.lead_width / 2.0 + g.h;
    if commons.len() > 1 {
        // The cells near each piece of a common are found on all cores, then claimed
        // one piece after another in the order they were claimed when each was found in
        // turn (commons in order, each its islands then its dots), so the grid comes out
        // the same. One common's runs at a time: every common's held at once would all
        // be alive together, a few MB on a large glass, for nothing.
        use rayon::prelude::*;
        for c in commons {
            let dots: Vec<Region> = c.dots.iter().map(|d| region_of([d.clone()])).collect();
            let pieces: Vec<&Region> = c.islands.iter().chain(&dots).collect();
            let spans: Vec<Vec<(usize, usize, usize)>> = pieces.par_iter().map(|r| g.spans_near(r, reach)).collect();
            for s in &spans {
                g.claim_spans(s, c.owner);
            }
        }
    }
    g.compact();
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{pt, rect};

    /// A ring of net 2 on an open glass, and the place its inside makes once a flood of
    /// net 1 from there ran out: islands whose landing cells lie inside are shut in by
    /// net 2 without a flood; one with a cell outside is not, nor one with a cell closed
    /// to leads (infinite cost) beside open cells outside; one whose closed cell lies
    /// inside is.
    #[test]
    fn a_place_found_shut_in_answers_for_the_islands_inside_it() {
        let mut g = Grid::new(0.0, 0.0, 20.0, 20.0, 0.25);
        for r in [rect(13.0, 13.0, 17.0, 13.5), rect(13.0, 16.5, 17.0, 17.0), rect(13.0, 13.0, 13.5, 17.0), rect(16.5, 13.0, 17.0, 17.0)] {
            g.claim(&region_of([r]), 2);
        }
        let cell = |x: f64, y: f64| g.index_of(pt(x, y)).unwrap();
        let (inside, outside) = (cell(15.0, 15.0), cell(2.0, 2.0));
        let mut search = Search::weighted(&g, 1.5);
        let blocked = search.fence(&g, 1, &[inside], Some(&[outside]), |c| c == outside, |_| 0.0).expect("shut in");
        let mut shut = ShutIn::default();
        assert!(shut.blockers_around(&g, 1, &[inside]).is_none(), "nothing found yet");
        shut.add(blocked);
        let (a, b) = (cell(14.0, 14.0), cell(16.0, 16.0));
        assert_eq!(shut.blockers_around(&g, 1, &[a, b]).map(|(b, _)| b.to_vec()), Some(vec![2]));
        assert!(shut.blockers_around(&g, 1, &[a, cell(12.0, 12.0)]).is_none(), "a cell outside the ring");
        let closed_outside = cell(10.0, 10.0);
        let closed_inside = cell(15.5, 15.5);
        g.set_cost(closed_outside, f32::INFINITY);
        g.set_cost(closed_inside, f32::INFINITY);
        assert!(shut.blockers_around(&g, 1, &[a, closed_outside]).is_none(), "a closed cell whose neighbours lie outside");
        assert!(shut.blockers_around(&g, 1, &[a, closed_inside]).is_some(), "a closed cell inside");
    }

    /// A piece alike another but for a shift takes the other's islands shifted: two
    /// bodies of a common, each cut by a slot that leaves a neck narrower than the width to
    /// keep (the opening parts it), give two islands each, and the shifted body's are
    /// those it gives opened on its own (symmetric difference below 10⁻⁹ mm²).
    #[test]
    fn pieces_alike_but_for_a_shift_share_their_islands() {
        let layout = crate::layout::fixture::tiny_layout();
        let (dx, dy) = (7.37, 0.5);
        let at = |x: f64, y: f64, r: geo::Rect<f64>| crate::geom::translate(&region_of([rect(r.min().x, r.min().y, r.max().x, r.max().y)]), x, y);
        let body = |x, y| at(x, y, geo::Rect::new((2.0, 2.0), (5.0, 4.0)));
        let slot = |x, y| at(x, y, geo::Rect::new((3.0, 2.0), (3.05, 3.95)));
        let pixels = |x, y| union_all(at(x, y, geo::Rect::new((2.2, 2.2), (2.8, 3.8))).0.into_iter().chain(at(x, y, geo::Rect::new((3.3, 2.2), (4.8, 3.8))).0));
        let both = |f: &dyn Fn(f64, f64) -> Region| union_all(f(0.0, 0.0).0.into_iter().chain(f(dx, dy).0));
        let none = Region::new(vec![]);
        let together = islands_of(&layout, &both(&body), &both(&slot), &both(&pixels), &none);
        let alone = islands_of(&layout, &body(dx, dy), &slot(dx, dy), &pixels(dx, dy), &none);
        let shifted: Vec<&Region> = together.iter().filter(|r| r.0.iter().all(|p| p.exterior().0.iter().all(|c| c.x > 7.0))).collect();
        assert_eq!((together.len(), shifted.len(), alone.len()), (4, 2, 2), "the neck parts each body in two");
        let a = union_all(shifted.iter().flat_map(|r| r.0.iter().cloned()));
        let b = union_all(alone.iter().flat_map(|r| r.0.iter().cloned()));
        let xor = crate::geom::area(&difference(&a, &b)) + crate::geom::area(&difference(&b, &a));
        assert!(crate::geom::area(&b) > 2.0 && xor < 1e-9, "{xor}");
    }

    /// Cells pushed in increasing order come back as pushed, held as runs of
    /// consecutive indices (a gap, a single cell and a run across a row's end each start
    /// a new run only where the next index is not the one after).
    #[test]
    fn cell_runs_give_back_the_cells_pushed() {
        let pushed = [3, 4, 5, 9, 11, 12, 99, 100, 101, 102];
        let mut runs = CellRuns::default();
        for &i in &pushed {
            runs.push(i);
        }
        assert_eq!(runs.0, [(3, 3), (9, 1), (11, 2), (99, 4)]);
        assert_eq!(runs.cells().collect::<Vec<_>>(), pushed);
        assert_eq!(CellRuns::default().cells().count(), 0);
    }
}
