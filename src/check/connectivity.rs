//! Connectivity extraction: which ITO touches which, on each plate and through the
//! transfer dots, re-derived from the polygons alone.
//!
//! Takes the `Artwork`; gives an [`Extraction`]: the connected ITO components of each
//! plate (every etched layer of the plate, marks included, since they are the same ITO
//! film), the groups that transfer dots join across the plates, and the *pieces* of each
//! intended net. The shapes' `net` tags are never used to decide what is connected —
//! only to name what was found and to compare it with the intent.
//!
//! Two polygons are connected when they overlap or touch (distance at most
//! [`TOUCH_MM`]); a transfer dot conducts between every ITO polygon it touches, on either
//! plate.

use super::disjoint::DisjointSets;
use super::near::Prepared;
use super::index::{bbox_of_polygon, expand, BoxIndex, EdgeIndex};
use crate::artwork::{Artwork, Shape};
use crate::geom::{self, Polygon, Pt, Region};
use crate::layout::PlateId;
use geo::{Intersects, InteriorPoint};
use std::collections::BTreeSet;

/// Polygons closer than this (half the 1 nm snap grid) count as touching.
pub const TOUCH_MM: f64 = 0.5e-6;

/// A node of the connectivity graph: an ITO shape or a transfer dot.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Node {
    /// Index into `Artwork::shapes`.
    Shape(usize),
    /// Index into [`Extraction::dots`].
    Dot(usize),
}

/// Two nodes that touch.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Link {
    /// One end.
    pub a: Node,
    /// Other end.
    pub b: Node,
}

/// A connected piece of ITO on one plate.
#[derive(Debug, Clone)]
pub struct Component {
    /// Plate.
    pub plate: PlateId,
    /// Indices into `Artwork::shapes`.
    pub shapes: Vec<usize>,
    /// The united polygons, exteriors counter-clockwise.
    pub region: Region,
    /// Intended nets of the shapes it contains, sorted.
    pub nets: Vec<String>,
    /// The group it belongs to.
    pub group: usize,
}

/// Components of both plates joined through transfer dots: one electrical node.
#[derive(Debug, Clone, Default)]
pub struct Group {
    /// Indices into [`Extraction::components`].
    pub components: Vec<usize>,
    /// Indices into [`Extraction::dots`].
    pub dots: Vec<usize>,
    /// Pin numbers whose pads touch this group's ITO.
    pub pins: Vec<u32>,
    /// Intended nets of everything in it, sorted.
    pub nets: Vec<String>,
}

/// A connected set of one net's shapes, joined by same-net contacts, net-less ITO
/// (marks) and transfer dots — but not through another net's shapes. A net split into
/// two pieces is open even when another net happens to bridge them (that is a short).
#[derive(Debug, Clone)]
pub struct Piece {
    /// The net.
    pub net: String,
    /// Indices into `Artwork::shapes`, all tagged `net`.
    pub shapes: Vec<usize>,
    /// Pin numbers of this net whose pads touch the piece.
    pub pins: Vec<u32>,
}

/// Where net-less ITO or a transfer dot joins pieces of different nets.
#[derive(Debug, Clone)]
pub struct Bridge {
    /// The link that joined them.
    pub link: Link,
    /// Nets joined, sorted.
    pub nets: Vec<String>,
}

/// The result of extraction.
#[derive(Debug, Clone)]
pub struct Extraction {
    /// Connected ITO components of both plates.
    pub components: Vec<Component>,
    /// Cross-plate groups.
    pub groups: Vec<Group>,
    /// Component of each shape (`None` for shapes that are not ITO).
    pub shape_component: Vec<Option<usize>>,
    /// Transfer dot outlines (`Artwork::transfer_dots` and `TransferDots` shapes, without
    /// duplicates).
    pub dots: Vec<Polygon>,
    /// Every touching pair found.
    pub links: Vec<Link>,
    /// Pieces of every intended net.
    pub pieces: Vec<Piece>,
    /// Links between shapes tagged with different nets (direct shorts).
    pub cross_links: Vec<usize>,
    /// Shorts made through net-less ITO or dots.
    pub bridges: Vec<Bridge>,
    by_plate: [BoxIndex<usize>; 2],
    /// Where the plates' ITO overlap outside the designed pixels, worked out on first use
    /// for the rules that read it ([`super::ghost::ghost_region`]).
    pub(crate) ghosts: std::sync::OnceLock<crate::geom::Region>,
    /// Each plate's ITO inside the liquid crystal, worked out on first use
    /// ([`Extraction::ito_in_lc`]).
    ito_in_lc: [std::sync::OnceLock<crate::geom::Region>; 2],
}

fn plate_slot(p: PlateId) -> usize {
    match p {
        PlateId::Front => 0,
        PlateId::Back => 1,
    }
}

/// True for the shapes extraction treats as conducting ITO.
fn is_ito(s: &Shape) -> bool {
    s.layer.is_etched() && s.layer.plate().is_some()
}

fn touches(a: &Polygon, b: &Polygon) -> bool {
    touches_prepared(&Prepared::plain(a), &Prepared::plain(b))
}

fn touches_prepared(a: &Prepared, b: &Prepared) -> bool {
    super::near::distance_below_prepared(a, b, 2.0 * TOUCH_MM) <= TOUCH_MM
}

impl Extraction {
    /// Extracts the connectivity of an artwork.
    pub fn extract(art: &Artwork) -> Extraction {
        let ito: Vec<usize> = (0..art.shapes.len()).filter(|&i| is_ito(&art.shapes[i])).collect();
        let dots = collect_dots(art);
        let shape_index = BoxIndex::new(
            ito.iter().filter_map(|&i| bbox_of_polygon(&art.shapes[i].polygon).map(|b| (expand(&b, TOUCH_MM), i))),
        );
        let links = find_links(art, &ito, &dots, &shape_index);
        let node = |n: Node| match n {
            Node::Shape(i) => i,
            Node::Dot(k) => art.shapes.len() + k,
        };
        let total = art.shapes.len() + dots.len();

        // Components: shape–shape contacts on one plate. Groups: any link.
        let mut comp_sets = DisjointSets::new(total);
        let mut group_sets = DisjointSets::new(total);
        for l in &links {
            if let (Node::Shape(a), Node::Shape(b)) = (l.a, l.b) {
                comp_sets.union(a, b);
            }
            group_sets.union(node(l.a), node(l.b));
        }
        let (mut components, shape_component) = build_components(art, &ito, &comp_sets.labels().0);
        let groups = build_groups(art, &mut components, dots.len(), &group_sets.labels().0);

        let by_plate = [PlateId::Front, PlateId::Back].map(|p| {
            BoxIndex::new(components.iter().enumerate().filter(|(_, c)| c.plate == p).filter_map(|(i, c)| {
                super::index::bbox_of_region(&c.region).map(|b| (b, i))
            }))
        });

        let (pieces, shape_piece, cross_links, bridges) = find_pieces(art, &ito, &links, total, &node);
        let mut ex = Extraction {
            components,
            groups,
            shape_component,
            dots,
            links,
            pieces,
            cross_links,
            bridges,
            by_plate,
            ghosts: Default::default(),
            ito_in_lc: Default::default(),
        };
        ex.attach_pins(art, &shape_index, &shape_piece);
        ex
    }

    /// The ITO of `plate`'s components inside the liquid crystal of `art` (the artwork
    /// this was extracted from), snapped to the 1 nm grid: worked out once, as the ghost
    /// rule and the electrical plan both read it (a boolean over all of a plate's ITO).
    pub fn ito_in_lc(&self, art: &Artwork, plate: PlateId) -> &Region {
        self.ito_in_lc[plate_slot(plate)].get_or_init(|| {
            let polys = self.components.iter().filter(|c| c.plate == plate).flat_map(|c| c.region.0.iter().cloned());
            let lc = crate::geom::region_of([art.lc_region.clone()]);
            crate::geom::snap(&crate::geom::intersection(&crate::geom::region_of(polys), &lc))
        })
    }

    /// Components on `plate` whose ITO meets `area` (overlapping or touching).
    pub fn components_meeting(&self, plate: PlateId, area: &Polygon) -> Vec<usize> {
        let Some(b) = bbox_of_polygon(area) else { return Vec::new() };
        let mut out: Vec<usize> = self.by_plate[plate_slot(plate)]
            .near(&b)
            .copied()
            .filter(|&c| self.components[c].region.intersects(area))
            .collect();
        out.sort_unstable();
        out
    }

    /// Components on `plate` whose boxes meet `b` (candidates for a closer test).
    pub fn components_near(&self, plate: PlateId, b: &super::index::Bbox) -> Vec<usize> {
        let mut out: Vec<usize> = self.by_plate[plate_slot(plate)].near(b).copied().collect();
        out.sort_unstable();
        out
    }

    /// Sorted nets of a set of components.
    pub fn nets_of(&self, comps: &[usize]) -> Vec<String> {
        let nets: BTreeSet<&String> = comps.iter().flat_map(|&c| self.components[c].nets.iter()).collect();
        nets.into_iter().cloned().collect()
    }

    fn attach_pins(&mut self, art: &Artwork, shape_index: &BoxIndex<usize>, shape_piece: &[Option<usize>]) {
        for pin in &art.pins {
            let Some(b) = bbox_of_polygon(&pin.pad) else { continue };
            let under: Vec<usize> = shape_index
                .near(&b)
                .copied()
                .filter(|&i| art.shapes[i].layer.plate() == Some(PlateId::Front) && touches(&art.shapes[i].polygon, &pin.pad))
                .collect();
            let mut groups: BTreeSet<usize> = BTreeSet::new();
            for &i in &under {
                if let Some(c) = self.shape_component[i] {
                    groups.insert(self.components[c].group);
                }
            }
            for g in groups {
                self.groups[g].pins.push(pin.number);
            }
            let pieces: BTreeSet<usize> = under.iter().filter_map(|&i| shape_piece[i]).collect();
            for p in pieces {
                if self.pieces[p].net == pin.net {
                    self.pieces[p].pins.push(pin.number);
                }
            }
        }
    }

    /// The polygon of a node.
    pub fn node_polygon<'a>(&'a self, art: &'a Artwork, n: Node) -> &'a Polygon {
        match n {
            Node::Shape(i) => &art.shapes[i].polygon,
            Node::Dot(k) => &self.dots[k],
        }
    }

    /// A point where the two ends of a link meet: inside their overlap when they
    /// overlap, else where their outlines touch.
    pub fn link_point(&self, art: &Artwork, l: &Link) -> Pt {
        meeting_point(self.node_polygon(art, l.a), self.node_polygon(art, l.b))
    }
}

/// One component per set of touching shapes, in order of their first shape.
fn build_components(art: &Artwork, ito: &[usize], label: &[usize]) -> (Vec<Component>, Vec<Option<usize>>) {
    let mut comp_of_label: std::collections::BTreeMap<usize, usize> = Default::default();
    let mut components: Vec<Component> = Vec::new();
    let mut shape_component = vec![None; art.shapes.len()];
    for &i in ito {
        let c = *comp_of_label.entry(label[i]).or_insert_with(|| {
            let plate = art.shapes[i].layer.plate().unwrap_or(PlateId::Front);
            components.push(Component { plate, shapes: Vec::new(), region: Region::new(vec![]), nets: Vec::new(), group: 0 });
            components.len() - 1
        });
        components[c].shapes.push(i);
        shape_component[i] = Some(c);
    }
    for c in &mut components {
        c.region = unite(c.shapes.iter().map(|&i| art.shapes[i].polygon.clone()));
        c.nets = sorted_nets(c.shapes.iter().map(|&i| &art.shapes[i]));
    }
    (components, shape_component)
}

/// One group per set of components and dots joined by any link; sets each component's
/// group.
fn build_groups(art: &Artwork, components: &mut [Component], dots: usize, label: &[usize]) -> Vec<Group> {
    let mut group_of_label: std::collections::BTreeMap<usize, usize> = Default::default();
    let mut groups: Vec<Group> = Vec::new();
    let mut group_id = |l: usize, groups: &mut Vec<Group>| {
        *group_of_label.entry(l).or_insert_with(|| {
            groups.push(Group::default());
            groups.len() - 1
        })
    };
    for (ci, c) in components.iter_mut().enumerate() {
        let g = group_id(label[c.shapes[0]], &mut groups);
        c.group = g;
        groups[g].components.push(ci);
    }
    for k in 0..dots {
        let g = group_id(label[art.shapes.len() + k], &mut groups);
        groups[g].dots.push(k);
    }
    for g in &mut groups {
        let nets: BTreeSet<&String> = g.components.iter().flat_map(|&c| components[c].nets.iter()).collect();
        g.nets = nets.into_iter().cloned().collect();
    }
    groups
}

/// Unites polygons, puts the result back on the 1 nm grid and orients it
/// counter-clockwise.
///
/// The boolean engine works on its own integer grid sized from each operation's box
/// (docs/crate-notes.md, *Snapping*), so its output is off the 1 nm input grid by up to
/// about 1e-8 mm; the
/// inputs are on that grid, so snapping the output restores the exact vertices.
pub fn unite(polys: impl IntoIterator<Item = Polygon>) -> Region {
    geom::region_of(geom::snap(&geom::union_all(polys)).0.iter().map(geom::orient_ccw))
}

fn sorted_nets<'a>(shapes: impl Iterator<Item = &'a Shape>) -> Vec<String> {
    let nets: BTreeSet<&String> = shapes.filter_map(|s| s.net.as_ref()).collect();
    nets.into_iter().cloned().collect()
}

fn collect_dots(art: &Artwork) -> Vec<Polygon> {
    let mut dots: Vec<Polygon> = art.transfer_dots.iter().map(|d| d.dot.clone()).collect();
    for s in art.on_layer(crate::artwork::Layer::TransferDots) {
        if !dots.contains(&s.polygon) {
            dots.push(s.polygon.clone());
        }
    }
    dots
}

fn find_links(art: &Artwork, ito: &[usize], dots: &[Polygon], index: &BoxIndex<usize>) -> Vec<Link> {
    use rayon::prelude::*;
    // A common spans the glass and meets the box of every shape near it: its edges are
    // indexed once rather than scanned for each of them. The ITO shapes only (only they
    // are linked), prepared and then tested pair by pair on all cores: indexing the edges
    // of every shape one after another was half the extraction's time on the two-row
    // benchmark, and the extraction runs before the rules and the plan, on one core.
    let prepared: Vec<Option<Prepared>> = art.shapes.par_iter().map(|s| is_ito(s).then(|| Prepared::indexed(&s.polygon))).collect();
    let ito_prepared = |i: usize| prepared[i].as_ref().expect("an ITO shape is prepared");
    let mut links: Vec<Link> = ito
        .par_iter()
        .flat_map_iter(|&i| {
            let si = &art.shapes[i];
            let mut near: Vec<usize> = bbox_of_polygon(&si.polygon).map(|b| index.near(&b).copied().filter(|&j| j > i).collect()).unwrap_or_default();
            near.sort_unstable();
            near.into_iter()
                .filter(move |&j| art.shapes[j].layer.plate() == si.layer.plate() && touches_prepared(ito_prepared(i), ito_prepared(j)))
                .map(move |j| Link { a: Node::Shape(i), b: Node::Shape(j) })
        })
        .collect();
    for (k, dot) in dots.iter().enumerate() {
        let Some(b) = bbox_of_polygon(dot) else { continue };
        let mut near: Vec<usize> = index.near(&b).copied().collect();
        near.sort_unstable();
        for j in near {
            if touches_prepared(&Prepared::plain(dot), ito_prepared(j)) {
                links.push(Link { a: Node::Dot(k), b: Node::Shape(j) });
            }
        }
    }
    links
}

/// Joins nodes over every link except those between two different nets, and records
/// where net-less ITO or a dot brings different nets together.
fn find_pieces(
    art: &Artwork,
    ito: &[usize],
    links: &[Link],
    total: usize,
    node: &dyn Fn(Node) -> usize,
) -> (Vec<Piece>, Vec<Option<usize>>, Vec<usize>, Vec<Bridge>) {
    let net_of = |n: Node| match n {
        Node::Shape(i) => art.shapes[i].net.as_deref(),
        Node::Dot(_) => None,
    };
    let mut sets = DisjointSets::new(total);
    let mut nets: Vec<BTreeSet<String>> = (0..total)
        .map(|x| if x < art.shapes.len() { art.shapes[x].net.iter().cloned().collect() } else { BTreeSet::new() })
        .collect();
    let mut cross = Vec::new();
    let mut bridges = Vec::new();
    for (li, l) in links.iter().enumerate() {
        if let (Some(na), Some(nb)) = (net_of(l.a), net_of(l.b))
            && na != nb
        {
            cross.push(li);
            continue;
        }
        let (ra, rb) = (sets.find(node(l.a)), sets.find(node(l.b)));
        if ra == rb {
            continue;
        }
        let (sa, sb) = (std::mem::take(&mut nets[ra]), std::mem::take(&mut nets[rb]));
        if !sa.is_empty() && !sb.is_empty() && sa.is_disjoint(&sb) {
            bridges.push(Bridge { link: *l, nets: sa.union(&sb).cloned().collect() });
        }
        let r = sets.union(ra, rb);
        nets[r] = sa.into_iter().chain(sb).collect();
    }
    // One piece per (set, net) among tagged ITO shapes.
    let mut pieces: Vec<Piece> = Vec::new();
    let mut piece_of: std::collections::BTreeMap<(usize, String), usize> = Default::default();
    let mut shape_piece = vec![None; art.shapes.len()];
    for &i in ito {
        let Some(net) = &art.shapes[i].net else { continue };
        let r = sets.find(i);
        let p = *piece_of.entry((r, net.clone())).or_insert_with(|| {
            pieces.push(Piece { net: net.clone(), shapes: Vec::new(), pins: Vec::new() });
            pieces.len() - 1
        });
        pieces[p].shapes.push(i);
        shape_piece[i] = Some(p);
    }
    (pieces, shape_piece, cross, bridges)
}

/// A point where two polygons meet: an interior point of their overlap, or a point where
/// their outlines touch, or midway between their closest points when they do not meet.
pub fn meeting_point(a: &Polygon, b: &Polygon) -> Pt {
    let overlap = geom::intersection(&geom::region_of([a.clone()]), &geom::region_of([b.clone()]));
    let biggest = overlap.0.iter().max_by(|x, y| geom::area(*x).total_cmp(&geom::area(*y)));
    if let Some(p) = biggest.filter(|p| geom::area(*p) > 0.0).and_then(|p| p.interior_point()) {
        return p.0;
    }
    let (ea, eb) = (EdgeIndex::of_region(&geom::region_of([a.clone()])), EdgeIndex::of_region(&geom::region_of([b.clone()])));
    match ea.closest(&eb) {
        Some(c) => c.midpoint(),
        None => super::index::any_point(a),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::check::fixture;

    /// The clean fixture: front S1, S2, COM1 and the mark cross; back COM1 and four mark
    /// squares. The dot joins front and back COM1 into one group.
    #[test]
    fn clean_fixture_components_and_groups() {
        let art = fixture::clean();
        let ex = Extraction::extract(&art);
        let on = |p| ex.components.iter().filter(|c| c.plate == p).count();
        assert_eq!((on(PlateId::Front), on(PlateId::Back)), (4, 5));
        assert_eq!(ex.groups.len(), 8);
        let com: Vec<_> = ex.components.iter().filter(|c| c.nets == vec!["COM1".to_string()]).collect();
        assert_eq!(com.len(), 2);
        assert_eq!(com[0].group, com[1].group);
        assert_eq!(ex.pieces.len(), 3);
        assert!(ex.cross_links.is_empty() && ex.bridges.is_empty());
        // The united S1 component is the segment, lead and pad: 20 + 0.2·11 + 6 mm².
        let s1 = ex.components.iter().find(|c| c.nets == vec!["S1".to_string()]).unwrap();
        assert!((geom::area(&s1.region) - (20.0 + 0.2 * 11.0 + 6.0)).abs() < 1e-9);
    }

    /// A probe inside S1's segment meets only S1; one over bare glass meets nothing.
    #[test]
    fn components_meeting_finds_the_ito_under_a_polygon() {
        let art = fixture::clean();
        let ex = Extraction::extract(&art);
        let hit = ex.components_meeting(PlateId::Front, &geom::rect(11.0, 16.0, 11.5, 16.5));
        assert_eq!(ex.nets_of(&hit), vec!["S1".to_string()]);
        assert!(ex.components_meeting(PlateId::Front, &geom::rect(24.0, 24.0, 25.0, 25.0)).is_empty());
    }
}
