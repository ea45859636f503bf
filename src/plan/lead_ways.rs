//! The ways through a line, from its pads along its leads to every part of it, and the
//! Elmore delay over them.
//!
//! Takes one line's wide parts and lead pieces on each plate
//! ([`super::electrical::lead_pieces`]), its pads, the transfer dots and its pixels as
//! loads; gives the squares on the farthest way and the largest Elmore sum, each lead
//! cut into 1 mm tiles and each part a way passes through counted whole.
//!
//! Why not all the squares of the line times all its capacitance, as the plan took
//! before: a line is a tree of resistors (the leads) with its capacitance on the
//! electrodes. In such an RC tree driven at its root the delay to node i is Elmore's
//! `T_i = Σ_k R_ki · C_k` (W. C. Elmore, J. Appl. Phys. 19, 55, 1948), where `R_ki` is
//! the resistance of the part of the way to i that the way to k shares: each resistor
//! counts only the capacitance beyond it, and `T_i ≤ R_i · C` with `R_i` the resistance
//! of the way to i. The product of every branch and the whole capacitance bounds the
//! same delay far more loosely on a common that branches to hundreds of pieces. (The
//! bounds by the way's resistance are the ones J. Rubinstein, P. Penfield and M. A.
//! Horowitz give for RC trees, IEEE Trans. CAD 2, 202, 1983 — *from memory*.) Where two
//! pads or a loop give a part two ways, the cheaper is taken: a second way in parallel
//! only lowers the resistance, so the figures stay above the line's own.

use crate::geom::{self, Polygon, Pt, Region};
use geo::{BoundingRect, Contains, Distance, Euclidean, Rect};
use std::cmp::Reverse;
use std::collections::BinaryHeap;

/// How near a lead's corner must come to an electrode to join it: the pieces are cut
/// from one region by separate boolean operations, so a shared edge matches only to the
/// 1 nm snap of their vertices.
const TOUCH: f64 = 1e-5;

/// Area below which a piece of ITO left over is a seam, not a conductor, mm².
const MIN_AREA: f64 = 1e-9;

/// One plate's part of a line, as [`super::electrical::lead_pieces`] tells it apart.
pub struct PlatePart<'a> {
    /// Its wide parts: electrodes, common pieces, dots, pads.
    pub wide: &'a Region,
    /// Its lead pieces with their squares.
    pub leads: &'a [(Polygon, f64)],
    /// The line's pads on this plate, where every way starts.
    pub pads: &'a [Polygon],
}

/// A part of the line the ways run through: a wide part (segment, common piece, dot), a
/// pad, or a lead's part in one tile.
struct Node {
    plate: usize,
    outline: Polygon,
    bbox: Rect<f64>,
    /// Squares paid to enter it (a lead piece's own; 0 for an electrode).
    squares: f64,
    /// A pad: the ways start here.
    root: bool,
}

/// What the ways through a line measure.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Ways {
    /// Squares of lead on the farthest way from a pad, each part it passes counted whole.
    pub farthest_squares: f64,
    /// The largest Elmore sum over the parts of the line with the loads placed,
    /// `Σ squares · area beyond`, in squares × mm²: times `Rs · ε0·εr / d` it is a delay.
    pub elmore_squares_mm2: f64,
    /// The area of the loads placed on some electrode reached from a pad, mm².
    pub placed_mm2: f64,
}

/// A capacitive load on a line: the plate's index in the parts, a point inside the load
/// (a pixel's), and its area in mm².
pub type Load = (usize, Pt, f64);

/// The ways from the line's pads through it: each part of it (wide part or cut lead)
/// reached the way that pays the fewest squares, a lead part paying its squares whole
/// on entry, and Elmore's sum at each part over that tree of ways with the `loads` on
/// the wide parts that hold their points. `None` when the line has no pad (the plan
/// then keeps the sum of every branch).
///
/// Both figures bound the line's own from above: a lead part counted whole costs at
/// least what a way through it pays, and a tree of ways taken out of a line with loops
/// (two pads, say) only leaves out ways in parallel, which would lower the resistance.
/// Capacitance not placed here (where the line faces the other plate outside its
/// pixels) adds at most `farthest_squares` times its area to any part's sum, wherever it
/// lies: the caller adds that.
pub fn ways(parts: &[PlatePart<'_>], dots: &[Polygon], loads: &[Load]) -> Option<Ways> {
    let mut nodes: Vec<Node> = Vec::new();
    for (plate, part) in parts.iter().enumerate() {
        // Only the wide parts join leads at no cost: what the leads leave of the ITO also
        // holds thin rims along them, and a rim 18 mm long, joined to the electrode at its
        // end, let the way along a lead pass for free.
        for p in part.wide.0.iter().filter(|p| geom::area(*p) > MIN_AREA) {
            nodes.push(node(plate, p.clone(), 0.0));
        }
        // The pads themselves, where the ways start (a pad narrower than the lead
        // radius's disc is not among the wide parts).
        for pad in part.pads {
            nodes.push(Node { root: true, ..node(plate, pad.clone(), 0.0) });
        }
        for (p, squares) in part.leads {
            for (piece, squares) in cut_into_tiles(p, *squares) {
                nodes.push(node(plate, piece, squares));
            }
        }
    }
    let links = touching(&nodes, dots);
    // Dijkstra (1959) from the pads, a node's entry paying its squares; the order nodes
    // are settled in, and the one each was reached from.
    let mut dist = vec![f64::INFINITY; nodes.len()];
    let mut parent = vec![usize::MAX; nodes.len()];
    let mut settled = Vec::new();
    let mut heap = BinaryHeap::new();
    for (i, n) in nodes.iter().enumerate() {
        if n.root {
            dist[i] = 0.0;
            heap.push(Reverse((Key(0.0), i)));
        }
    }
    if heap.is_empty() {
        return None;
    }
    let mut done = vec![false; nodes.len()];
    while let Some(Reverse((Key(d), i))) = heap.pop() {
        if done[i] {
            continue;
        }
        done[i] = true;
        settled.push(i);
        for &j in &links[i] {
            let nd = d + nodes[j].squares;
            if nd < dist[j] {
                dist[j] = nd;
                parent[j] = i;
                heap.push(Reverse((Key(nd), j)));
            }
        }
    }
    // Each load on the electrode reached from a pad that holds its point.
    let mut below = vec![0.0; nodes.len()];
    let mut placed = 0.0;
    for &(plate, at, area) in loads {
        let holder = (0..nodes.len()).find(|&i| {
            let n = &nodes[i];
            done[i] && n.squares == 0.0 && n.plate == plate && near_boxes(&n.bbox, &Rect::new(at, at)) && n.outline.contains(&geo::Point::from(at))
        });
        if let Some(i) = holder {
            below[i] += area;
            placed += area;
        }
    }
    // Elmore over the tree: each part's resistance (its squares) carries the
    // capacitance of everything reached through it.
    for &i in settled.iter().rev() {
        if parent[i] != usize::MAX {
            below[parent[i]] += below[i];
        }
    }
    let mut elmore = vec![0.0; nodes.len()];
    for &i in &settled {
        if parent[i] != usize::MAX {
            elmore[i] = elmore[parent[i]] + nodes[i].squares * below[i];
        }
    }
    Some(Ways {
        farthest_squares: settled.iter().map(|&i| dist[i]).fold(0.0, f64::max),
        elmore_squares_mm2: settled.iter().map(|&i| elmore[i]).fold(0.0, f64::max),
        placed_mm2: placed,
    })
}

/// Side of the square tiles a long lead piece is cut into, mm. A common's back leads
/// meet one another, so most of them form one branching piece: counted whole, every way
/// through it would pay for every branch. Cut into tiles, a way pays only for the tiles
/// it passes, each counted whole (a tile's part of a branch point included), so the
/// bound still holds; finer tiles bound closer and make more parts to join.
const TILE: f64 = 1.0;

/// A lead piece cut into its parts in each [`TILE`] (a piece within one tile as it is),
/// each with its share of the piece's squares by area: a lead of width W and length L
/// has `L / W = A / W²` squares, so a part of area a holds `a / W²` of them, with W the
/// piece's own (`√(A / squares)`), and the parts add up to the piece. That holds where
/// a tile's edge cuts across a lead; where one runs along a lead and splits it
/// lengthwise, the two strips carry its current side by side and a way along the
/// narrower alone would pay a fraction of the squares there, so parts of neighbouring
/// tiles that share more than two widths of a tile's edge are taken as one. (Counting
/// each part as a strip of its own area and perimeter instead put a common's farthest
/// way a quarter above all its branches on the kiln demo.)
fn cut_into_tiles(p: &Polygon, squares: f64) -> Vec<(Polygon, f64)> {
    let Some(b) = p.bounding_rect() else { return Vec::new() };
    let (i0, i1) = ((b.min().x / TILE).floor() as i64, (b.max().x / TILE).ceil() as i64);
    let (j0, j1) = ((b.min().y / TILE).floor() as i64, (b.max().y / TILE).ceil() as i64);
    if i1 - i0 <= 1 && j1 - j0 <= 1 {
        return vec![(p.clone(), squares)];
    }
    let whole = geom::area(p);
    if whole <= 0.0 || squares <= 0.0 {
        return vec![(p.clone(), squares)];
    }
    let width2 = whole / squares;
    // Each part with its tile.
    let mut parts: Vec<(Polygon, i64, i64)> = Vec::new();
    for j in j0..j1 {
        for i in i0..i1 {
            let (x0, y0) = (i as f64 * TILE, j as f64 * TILE);
            let Some(clipped) = geom::clip_to_rect(p, x0, y0, x0 + TILE, y0 + TILE) else { continue };
            // The clipped ring may run along the tile's edges where the piece left and
            // came back (geom::clip); a union takes those seams away.
            parts.extend(geom::union_all([clipped]).0.into_iter().filter(|q| geom::area(q) > MIN_AREA).map(|q| (q, i, j)));
        }
    }
    // Parts of side-by-side tiles that split the lead lengthwise, joined (union-find).
    let mut group: Vec<usize> = (0..parts.len()).collect();
    fn find(group: &mut [usize], mut k: usize) -> usize {
        while group[k] != k {
            group[k] = group[group[k]];
            k = group[k];
        }
        k
    }
    let long_enough = 2.0 * width2.sqrt();
    // Each part meets only the parts of the tile east of its own and the tile north.
    let mut in_tile: std::collections::HashMap<(i64, i64), Vec<usize>> = std::collections::HashMap::new();
    for (k, (_, i, j)) in parts.iter().enumerate() {
        in_tile.entry((*i, *j)).or_default().push(k);
    }
    for a in 0..parts.len() {
        let (i, j) = (parts[a].1, parts[a].2);
        for (next, vertical, at) in [((i + 1, j), true, (i + 1) as f64 * TILE), ((i, j + 1), false, (j + 1) as f64 * TILE)] {
            for &b in in_tile.get(&next).map(Vec::as_slice).unwrap_or(&[]) {
                if shared_on_line(&parts[a].0, &parts[b].0, vertical, at) > long_enough {
                    let (ra, rb) = (find(&mut group, a), find(&mut group, b));
                    group[ra] = rb;
                }
            }
        }
    }
    let mut out: Vec<(Polygon, f64)> = Vec::new();
    let roots: Vec<usize> = (0..parts.len()).map(|k| find(&mut group, k)).collect();
    let mut done = vec![false; parts.len()];
    for k in 0..parts.len() {
        if done[roots[k]] {
            continue;
        }
        done[roots[k]] = true;
        let members: Vec<Polygon> = (0..parts.len()).filter(|&m| roots[m] == roots[k]).map(|m| parts[m].0.clone()).collect();
        let joined = if members.len() == 1 { geom::region_of(members) } else { geom::union_all(members) };
        for q in joined.0 {
            let sq = geom::area(&q) / width2;
            out.push((q, sq));
        }
    }
    out
}

/// How long the edges of `a` and `b` that lie on the tile line (`x = at` when
/// `vertical`, else `y = at`) overlap.
fn shared_on_line(a: &Polygon, b: &Polygon, vertical: bool, at: f64) -> f64 {
    const ON: f64 = 1e-6;
    let spans = |p: &Polygon| -> Vec<(f64, f64)> {
        let ring = &p.exterior().0;
        ring.windows(2)
            .filter(|w| if vertical { (w[0].x - at).abs() < ON && (w[1].x - at).abs() < ON } else { (w[0].y - at).abs() < ON && (w[1].y - at).abs() < ON })
            .map(|w| {
                let (u, v) = if vertical { (w[0].y, w[1].y) } else { (w[0].x, w[1].x) };
                (u.min(v), u.max(v))
            })
            .collect()
    };
    let (sa, sb) = (spans(a), spans(b));
    sa.iter().flat_map(|x| sb.iter().map(move |y| (x.1.min(y.1) - x.0.max(y.0)).max(0.0))).sum()
}

fn node(plate: usize, outline: Polygon, squares: f64) -> Node {
    let bbox = outline.bounding_rect().unwrap_or(Rect::new((0.0, 0.0), (0.0, 0.0)));
    Node { plate, outline, bbox, squares, root: false }
}

/// Per node, the nodes it touches: on one plate, where their outlines come within
/// [`TOUCH`]; across the plates, where both meet one transfer dot.
fn touching(nodes: &[Node], dots: &[Polygon]) -> Vec<Vec<usize>> {
    let mut links = vec![Vec::new(); nodes.len()];
    let mut link = |i: usize, j: usize| {
        links[i].push(j);
        links[j].push(i);
    };
    // Swept in order of the boxes' left edges: only nodes whose boxes reach each other
    // across x are compared (a line has hundreds of parts once its leads are cut).
    let mut by_x: Vec<usize> = (0..nodes.len()).collect();
    by_x.sort_by(|&a, &b| nodes[a].bbox.min().x.total_cmp(&nodes[b].bbox.min().x).then(a.cmp(&b)));
    for (k, &i) in by_x.iter().enumerate() {
        for &j in &by_x[k + 1..] {
            if nodes[j].bbox.min().x > nodes[i].bbox.max().x + TOUCH {
                break;
            }
            let (a, b) = (&nodes[i], &nodes[j]);
            if a.plate == b.plate && near_boxes(&a.bbox, &b.bbox) && outlines_touch(a, b) {
                link(i, j);
            }
        }
    }
    for d in dots {
        let at: Vec<usize> = (0..nodes.len()).filter(|&i| meets(&nodes[i], d)).collect();
        for (k, &i) in at.iter().enumerate() {
            for &j in &at[k + 1..] {
                if nodes[i].plate != nodes[j].plate {
                    link(i, j);
                }
            }
        }
    }
    links
}

fn near_boxes(a: &Rect<f64>, b: &Rect<f64>) -> bool {
    a.min().x <= b.max().x + TOUCH && b.min().x <= a.max().x + TOUCH && a.min().y <= b.max().y + TOUCH && b.min().y <= a.max().y + TOUCH
}

/// Whether the outlines share a stretch of edge: two corners of one, apart from each
/// other, lie within [`TOUCH`] of the other (two pieces cut apart share the ends of the
/// edge between them, the ends of the shorter side of it at least). Parts that meet in a
/// single point, as the parts of a lead in diagonally neighbouring tiles may, carry no
/// current between them and are not joined: joined, a way could cut a corner and pay
/// for fewer parts than the lead holds.
fn outlines_touch(a: &Node, b: &Node) -> bool {
    shares_two_corners(a, b) || shares_two_corners(b, a)
}

/// Whether two corners of `a`, more than `2 · TOUCH` apart, lie within [`TOUCH`] of `b`.
fn shares_two_corners(a: &Node, b: &Node) -> bool {
    let mut first: Option<geo::Coord<f64>> = None;
    for c in &a.outline.exterior().0 {
        if !near_boxes(&Rect::new(*c, *c), &b.bbox) || Euclidean.distance(&geo::Point::from(*c), &b.outline) > TOUCH {
            continue;
        }
        match first {
            None => first = Some(*c),
            Some(f) if (f.x - c.x).hypot(f.y - c.y) > 2.0 * TOUCH => return true,
            Some(_) => {}
        }
    }
    false
}

/// Whether node `n` overlaps polygon `p` (a pad or a transfer dot) over some area.
fn meets(n: &Node, p: &Polygon) -> bool {
    let Some(pb) = p.bounding_rect() else { return false };
    near_boxes(&n.bbox, &pb) && geom::area(&geom::intersection(&geom::region_of([n.outline.clone()]), &geom::region_of([p.clone()]))) > 0.0
}

/// A distance ordered for the heap (never NaN: sums of finite squares).
#[derive(PartialEq, PartialOrd, Clone, Copy)]
struct Key(f64);
impl Eq for Key {}
impl Ord for Key {
    fn cmp(&self, o: &Self) -> std::cmp::Ordering {
        self.0.total_cmp(&o.0)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, region_of};

    /// A comb, worked by hand: a pad, a trunk of 10 squares (10 × 1 mm), and three teeth
    /// of 4 squares each (0.5 mm wide, 2 mm long) to three electrodes. The sum of every
    /// branch is 10 + 3 · 4 = 22 squares; the farthest way from the pad, trunk and one
    /// tooth, is 14 (Elmore's bound, module comment).
    #[test]
    fn a_comb_counts_its_trunk_and_one_tooth() {
        let pad = rect(-2.0, 0.0, 0.0, 1.0);
        let trunk = rect(0.0, 0.0, 10.0, 1.0);
        let teeth: Vec<Polygon> = [1.0, 5.0, 9.0].iter().map(|&x| rect(x, 1.0, x + 0.5, 3.0)).collect();
        let pixels: Vec<Polygon> = [1.0, 5.0, 9.0].iter().map(|&x| rect(x - 1.0, 3.0, x + 1.5, 5.0)).collect();
        let leads: Vec<(Polygon, f64)> = std::iter::once((trunk, 10.0)).chain(teeth.into_iter().map(|t| (t, 4.0))).collect();
        let wide = region_of(std::iter::once(pad.clone()).chain(pixels.iter().cloned()));
        let parts = [PlatePart { wide: &wide, leads: &leads, pads: &[pad.clone()] }];
        // A pixel of 5 mm² on each electrode, and a point on no part of the line.
        let loads: Vec<Load> = [1.25, 5.25, 9.25, 20.0].iter().map(|&x| (0, crate::geom::pt(x, 4.0), 5.0)).collect();
        let w = ways(&parts, &[], &loads).unwrap();
        assert!((w.farthest_squares - 14.0).abs() < 1e-9, "{w:?}");
        // Elmore by hand at the farthest pixel, the trunk in its 1 mm tiles of 1 square:
        // tiles 0–1 carry all three pixels (the first tooth leaves tile 1), tiles 2–5
        // two, tiles 6–9 one, and the last tooth (two tiles of 2 squares) its own:
        // 2·15 + 4·10 + 4·5 + 4·5 = 110. (The trunk taken whole, as one resistor
        // carrying all three, would give 10·15 + 4·5 = 170: the tiles bound closer.)
        // The fourth load is not placed.
        assert!((w.elmore_squares_mm2 - 110.0).abs() < 1e-6, "{w:?}");
        assert!((w.placed_mm2 - 15.0).abs() < 1e-12, "{w:?}");
        // From a pad the line does not touch no load is reached; without a pad there is
        // no way to measure.
        let far_pad = [rect(30.0, 0.0, 31.0, 1.0)];
        let parts = [PlatePart { wide: &wide, leads: &leads, pads: &far_pad }];
        assert_eq!(ways(&parts, &[], &loads).map(|w| w.placed_mm2), Some(0.0));
        let parts = [PlatePart { wide: &wide, leads: &leads, pads: &[] }];
        assert_eq!(ways(&parts, &[], &loads), None);
    }

    /// A lead that runs along a tile line, split lengthwise into two strips by the
    /// tiles, pays its own squares (0.1 mm wide, 5 mm long, centred on x = 1 mm: 50),
    /// not the narrower strip's share; one cut across its middle by a tile line in y
    /// only divides it in series.
    #[test]
    fn a_lead_along_a_tile_line_pays_its_own_squares() {
        for (x0, x1) in [(0.95, 1.05), (0.98, 1.08), (1.2, 1.3)] {
            let pad = rect(x0 - 0.5, -1.0, x1 + 0.5, 0.0);
            let lead = rect(x0, 0.0, x1, 5.0);
            let electrode = rect(x0 - 1.0, 5.0, x1 + 1.0, 7.0);
            let wide = region_of([pad.clone(), electrode]);
            let leads = [(lead, 50.0)];
            let pads = [pad];
            let parts = [PlatePart { wide: &wide, leads: &leads, pads: &pads }];
            let w = ways(&parts, &[], &[]).unwrap();
            assert!((w.farthest_squares - 50.0).abs() < 1e-6, "lead at x {x0}-{x1}: {w:?}");
        }
    }

    /// A common's way crosses the plates at its transfer dot: a front lead of 6 squares
    /// from the pad to the dot, then a back lead of 3 squares to the electrode: 9. Without
    /// the dot the back is not reached and only the front lead counts.
    #[test]
    fn a_way_crosses_the_plates_at_a_dot() {
        let pad = rect(0.0, 0.0, 1.0, 1.0);
        let front_lead = rect(1.0, 0.25, 4.0, 0.75); // 3 × 0.5 mm: 6 squares
        let dot = rect(4.0, 0.0, 5.0, 1.0);

        let back_lead = rect(5.0, 0.0, 8.0, 1.0); // 3 × 1 mm: 3 squares
        let electrode = rect(8.0, -2.0, 12.0, 3.0);

        let (fl, bl) = ([(front_lead, 6.0)], [(back_lead, 3.0)]);
        let (front_wide, back_wide) = (region_of([pad.clone(), dot.clone()]), region_of([dot.clone(), electrode]));
        let pads = [pad];
        let parts = [PlatePart { wide: &front_wide, leads: &fl, pads: &pads }, PlatePart { wide: &back_wide, leads: &bl, pads: &[] }];
        let w = ways(&parts, &[dot], &[]).unwrap();
        assert!((w.farthest_squares - 9.0).abs() < 1e-9, "{w:?}");
        let w = ways(&parts, &[], &[]).unwrap();
        assert!((w.farthest_squares - 6.0).abs() < 1e-9, "{w:?}");
    }
}
