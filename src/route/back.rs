//! The back plate: cuts the common electrode clear of the front leads, then joins its
//! islands and leads them to the transfer dot, never facing a front lead inside the window.
//!
//! Under static drive every front electrode faces the one common, so back leads may run
//! over front electrodes (that area switches with the electrode anyway); only front leads
//! must be avoided: forbidden inside the window, costly in the rest of the liquid crystal,
//! free under or outside the seal.

use super::grid::Grid;
use super::search::{corners, Search};
use super::{Lead, TransferSite};
use crate::electrode::Electrodes;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{difference, offset_round, region_of, stroke_polyline, union_all, Region};
use crate::layout::{Layout, PlateId};

/// Extra cost (per cell) of a back lead facing a front lead outside the window.
const HIDDEN_CROSSING_COST: f32 = 40.0;

/// What the back plate routing gives.
#[derive(Debug, Clone)]
pub struct BackRoutes {
    /// Back-plate leads joining the common's islands and the transfer dot.
    pub leads: Vec<Lead>,
    /// The pieces of the common electrode that are kept (each faces an electrode).
    pub kept: Vec<Region>,
    /// The part of the grown common electrode removed around front leads.
    pub cuts: Region,
}

/// Cuts and routes the common electrode.
pub fn route_common(layout: &Layout, el: &Electrodes, front_leads: &[&Lead], transfers: &[TransferSite], findings: &mut Vec<Finding>) -> BackRoutes {
    let rules = &layout.rules;
    let tol = layout.tolerance;
    let electrodes = union_all(el.segs.iter().flat_map(|s| s.outline.0.iter().cloned()));
    let leads = union_all(front_leads.iter().flat_map(|l| l.outline.0.iter().cloned()));
    let bare = difference(&leads, &electrodes);
    let cuts = difference(&offset_round(&bare, rules.min_gap, tol), &electrodes);
    let com = &el.coms[0];
    // Pieces that face no electrode (slivers of junction filling cut off by a lead) have
    // no pixel to serve: they are dropped rather than joined.
    let min_overlap = rules.min_width * rules.min_width;
    // An opening (shrink, then grow back) removes the slivers too narrow to etch that
    // the cuts leave beside segment corners.
    let keep_width = rules.min_width + 2.0 * (rules.undercut - rules.film_bias());
    let r = keep_width / 2.0 + 1e-4;
    let cut_body = difference(&com.outline, &cuts);
    // Flattened arcs of the grow-back may stray a chord's sagitta into a cut: cut again.
    let opened = difference(&offset_round(&offset_round(&cut_body, -r, tol), r, tol), &cuts);
    // The opening must not shave the pixels themselves: what faces an electrode stays.
    let body = crate::geom::union(&opened, &crate::geom::intersection(&cut_body, &electrodes));
    let mut islands: Vec<Region> = body
        .0
        .into_iter()
        .map(|p| region_of([p]))
        .filter(|isl| crate::geom::area(&crate::geom::intersection(isl, &electrodes)) > min_overlap)
        .collect();
    for b in layout.buses.iter().filter(|b| b.plate == PlateId::Back && b.net == com.net) {
        islands.push(stroke_polyline(&b.points, b.width, tol));
    }
    let mut out = Vec::new();
    let Some(dot) = transfers.iter().find(|t| t.net == com.net) else {
        return BackRoutes { leads: out, cuts, kept: islands };
    };
    let grid = back_grid(layout, &leads);
    let mut search = Search::new(grid.nx * grid.ny);
    let mut in_tree = vec![false; grid.owner.len()];
    let mut tree = Vec::new();
    grid.for_cells_in(&region_of([dot.pad.clone()]), |c| {
        in_tree[c] = true;
        tree.push(c);
    });
    // Islands nearest the dot join first, each by a search from its own cells to the
    // tree grown so far: every search stops at the nearest part of the tree, so the work
    // stays local instead of flooding the plate from the whole tree each time.
    let mut order: Vec<usize> = (0..islands.len()).collect();
    let centre = |k: usize| {
        use geo::Centroid;
        islands[k].centroid().map(|p| p.0).unwrap_or(dot.at)
    };
    let d2 = |p: crate::geom::Pt| (p.x - dot.at.x).powi(2) + (p.y - dot.at.y).powi(2);
    order.sort_by(|&a, &b| d2(centre(a)).total_cmp(&d2(centre(b))));
    for k in order {
        let mut cells = Vec::new();
        grid.for_cells_in(&islands[k], |c| cells.push(c));
        if cells.iter().any(|&c| in_tree[c]) || cells.is_empty() {
            for c in cells {
                if !in_tree[c] {
                    in_tree[c] = true;
                    tree.push(c);
                }
            }
            continue;
        }
        let it = &in_tree;
        match search.find(&grid, 1, &cells, |c| it[c], |_| 0.0) {
            Ok(path) => {
                let pts = corners(&grid, &path);
                if pts.len() >= 2 {
                    let outline = stroke_polyline(&pts, rules.lead_width, tol);
                    out.push(Lead { net: com.net.clone(), plate: PlateId::Back, path: pts, outline, user_bus: false });
                }
                for &c in path.iter().chain(cells.iter()) {
                    if !in_tree[c] {
                        in_tree[c] = true;
                        tree.push(c);
                    }
                }
            }
            Err(_) => findings.push(Finding {
                rule: Rule::Unroutable,
                severity: Severity::Error,
                plate: Some(PlateId::Back),
                nets: vec![com.net.clone()],
                location: centre(k),
                measured: None,
                required: None,
                message: format!(
                    "part {} of common electrode {} cannot reach its transfer dot without facing a front lead in the window",
                    k + 1,
                    com.net
                ),
            }),
        }
    }
    BackRoutes { leads: out, cuts, kept: islands }
}

fn back_grid(layout: &Layout, front_leads: &Region) -> Grid {
    let b = layout.glass.back;
    let h = super::grid_step(layout);
    let mut g = Grid::new(b.x, b.y, b.x1(), b.y1(), h);
    g.block_outside(&region_of([b.inset(layout.rules.lead_width / 2.0 + h).polygon()]));
    let lc = layout.glass.back.inset(layout.seal.inset + layout.seal.width);
    let w = layout.window;
    let reach = layout.rules.min_gap + layout.rules.lead_width / 2.0 + h;
    let keep = offset_round(front_leads, reach, layout.tolerance.max(h / 4.0));
    let mut cells = Vec::new();
    g.for_cells_in(&keep, |c| cells.push(c));
    for c in cells {
        let p = g.centre(c);
        // A cell counts as in the window (or the liquid crystal) when a lead centred on
        // it would reach in.
        let m = layout.rules.lead_width / 2.0 + h;
        let inside = |r: &crate::layout::Rect| p.x >= r.x - m && p.x <= r.x1() + m && p.y >= r.y - m && p.y <= r.y1() + m;
        if inside(&w) {
            g.cost[c] = f32::INFINITY;
        } else if inside(&lc) {
            g.cost[c] = g.cost[c].max(HIDDEN_CROSSING_COST);
        }
    }
    g
}
