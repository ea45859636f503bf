//! The electrical side of the plan: lead resistance, pixel and line capacitance, and
//! the RC of every SEG line and common (docs/background.md, *Lead resistance and pixel
//! capacitance*).
//!
//! Takes the artwork, its connectivity extraction and the cell's data; gives one
//! [`Line`] per SEG line and per common, one [`PixelCap`] per element, and the spread
//! of the RC across lines. Everything is measured from the polygons:
//!
//! - *Leads* are the parts of a net's ITO narrower than a disc of radius
//!   `0.75 · lead_width` fits in (the ITO less its morphological opening), less tiny
//!   corner slivers and pieces narrower than half of `min_width` (crescents the
//!   opening leaves along curves). Each lead piece of area A and perimeter P is taken as a strip
//!   L × W with `L·W = A` and `2(L + W) = P`; its squares are `L / W`. A net's lead
//!   resistance is `Rs` times the squares of all its lead pieces (the sum of every
//!   branch); its RC takes only the squares on the farthest way from its pads
//!   ([`super::lead_ways`]), which bounds the slowest delay of the tree.
//! - *Capacitance* of a line is `ε0·εr·A/d` (CODATA 2018 ε0) over the area A where its
//!   ITO faces the other plate's ITO inside the liquid crystal, at ε⊥ (all off) and ε∥
//!   (all on); its RC uses ε∥, the slower case.

use crate::artwork::Artwork;
use crate::check::Extraction;
use crate::geom::{self, Polygon, Region};
use crate::layout::{Cell, PlateId};
use serde::Serialize;

/// Vacuum permittivity ε0 in F/m (CODATA 2018: E. Tiesinga et al., Rev. Mod. Phys. 93,
/// 025010, 2021).
pub const EPSILON_0: f64 = 8.854_187_812_8e-12;

/// Capacitance of a parallel-plate capacitor, farads: area in mm², gap in mm.
///
/// ```
/// // 1 mm² over 5 µm with εr = 1: 8.854e-12 · 1e-6 / 5e-6 = 1.771 pF.
/// let c = segmask::plan::electrical::plate_capacitance(1.0, 0.005, 1.0);
/// assert!((c - 1.7708375625e-12).abs() < 1e-20);
/// ```
pub fn plate_capacitance(area_mm2: f64, gap_mm: f64, eps_r: f64) -> f64 {
    EPSILON_0 * eps_r * (area_mm2 * 1e-6) / (gap_mm * 1e-3)
}

/// Squares of a strip with this area and perimeter: `L / W` of the rectangle with the
/// same area and perimeter, or 1 for a piece too compact to be a strip.
pub fn strip_squares(area: f64, perimeter: f64) -> f64 {
    let half = perimeter / 2.0;
    let disc = half * half - 4.0 * area;
    if area <= 0.0 || disc <= 0.0 {
        return 1.0;
    }
    let long = (half + disc.sqrt()) / 2.0;
    let short = area / long;
    long / short
}

/// One SEG line or common.
#[derive(Debug, Clone, Serialize)]
pub struct Line {
    /// Net name.
    pub net: String,
    /// `seg` or `com`.
    pub kind: &'static str,
    /// Squares along its leads (both plates for a common: back leads and the front lead
    /// from its transfer dot to its pad).
    pub lead_squares: f64,
    /// `Rs · lead_squares`, ohms.
    pub lead_resistance_ohm: f64,
    /// Squares on the farthest way from its pads through its leads, each lead piece it
    /// passes counted whole ([`super::lead_ways`]); `lead_squares` when no part meets a
    /// pad.
    pub way_squares: f64,
    /// `Rs · way_squares`, ohms.
    pub way_resistance_ohm: f64,
    /// Area where its ITO faces the other plate's ITO in the liquid crystal, mm².
    pub facing_area_mm2: f64,
    /// Capacitance at ε⊥ (every pixel off), pF.
    pub capacitance_off_pf: f64,
    /// Capacitance at ε∥ (every pixel on), pF.
    pub capacitance_on_pf: f64,
    /// The line's slowest Elmore delay at ε∥ over its tree of ways, µs, each lead part
    /// counted whole ([`super::lead_ways`]): at most `way_resistance_ohm · C_on`.
    pub rc_us: f64,
    /// `rc_us` as a fraction of the frame period.
    pub rc_of_frame: f64,
}

/// The capacitance of one element's pixel.
#[derive(Debug, Clone, Serialize)]
pub struct PixelCap {
    /// Element name.
    pub element: String,
    /// Area of the designed pixel, mm².
    pub area_mm2: f64,
    /// At ε⊥, pF.
    pub capacitance_off_pf: f64,
    /// At ε∥, pF.
    pub capacitance_on_pf: f64,
}

/// Smallest, largest and their ratio, of the RC of one kind of line.
#[derive(Debug, Clone, Serialize)]
pub struct Spread {
    /// `seg` or `com`.
    pub kind: &'static str,
    /// Smallest RC, µs.
    pub min_rc_us: f64,
    /// Largest RC, µs.
    pub max_rc_us: f64,
    /// Largest over smallest (1 when all agree; `None` when the smallest is 0).
    pub ratio: Option<f64>,
}

/// The electrical plan.
#[derive(Debug, Clone, Serialize)]
pub struct Electrical {
    /// Sheet resistance used, ohms per square.
    pub sheet_resistance_ohm_sq: f64,
    /// Frame rate, Hz.
    pub frame_rate_hz: f64,
    /// Frame period, ms.
    pub frame_period_ms: f64,
    /// RC above this fraction of the frame period is warned about.
    pub rc_limit: f64,
    /// Cell gap, µm.
    pub cell_gap_um: f64,
    /// ε∥ and ε⊥ used.
    pub permittivity: [f64; 2],
    /// Every SEG line, then every common.
    pub lines: Vec<Line>,
    /// Every pixel.
    pub pixels: Vec<PixelCap>,
    /// Spread of RC over SEG lines and over commons (those that face some ITO).
    pub spread: Vec<Spread>,
}

/// Radius of the disc that tells leads from electrodes.
fn lead_radius(art: &Artwork) -> f64 {
    0.75 * art.rules.lead_width
}

/// ITO of a plate's components carrying `net`.
fn net_ito(ex: &Extraction, plate: PlateId, net: &str) -> Region {
    geom::region_of(
        ex.components.iter().filter(|c| c.plate == plate && c.nets.iter().any(|n| n == net)).flat_map(|c| c.region.0.iter().cloned()),
    )
}

/// Some ITO of a net told apart: its leads, and its wide parts.
#[derive(Debug, Clone)]
pub struct LeadSplit {
    /// The lead pieces (pads excluded), each with its squares.
    pub leads: Vec<(Polygon, f64)>,
    /// The parts a disc of the lead radius fits in (electrodes, pads, dots, common
    /// pieces): the ITO's opening.
    pub wide: Region,
}

/// The lead pieces of some ITO of `net` (pads excluded), each with its squares, and its
/// wide parts.
pub fn lead_pieces(art: &Artwork, ito: &Region, net: &str) -> LeadSplit {
    use geo::{Euclidean, Length};
    if ito.0.is_empty() {
        return LeadSplit { leads: Vec::new(), wide: geom::region_of([]) };
    }
    let r = lead_radius(art);
    // A tenth of the lead width: the plan's opening of every line was the largest part
    // of the stage (two offsets of a 16 000-vertex common with round joins); at a fiftieth,
    // as before, the two-row benchmark's plan took 0.235 s, now 0.13 s, and a line's
    // squares move by at most 2.2 % (the flattened round ends change the pieces'
    // perimeters), far inside what the sheet resistance itself is sold to (±10 % is a
    // usual tolerance for coated glass, from memory).
    let tol = art.rules.lead_width / 10.0;
    // A common that went through the electrode split and the route's offsets holds several
    // times the vertices its curves need (most of them the few-nanometre pairs that round
    // joins leave on flattened curves); the opening works to `tol` anyway, so the ITO is
    // first simplified within half of it: on a 40-digit common 30 000 vertices become
    // 10 000 and the opening takes a quarter of the time.
    let ito = &geom::simplified(ito, tol / 2.0);
    // The opening comes back to the straight edges only to within the 1 nm snap and to
    // curves within the chord tolerance; grown by two tolerances it swallows those
    // hair-thin rims, which would otherwise cling to a lead and double its perimeter.
    let opened = geom::offset_round(&geom::offset_round(ito, -r, tol), r + 2.0 * tol, tol);
    let pads = geom::region_of(art.pins.iter().filter(|p| p.net == net).map(|p| p.pad.clone()));
    let leads = geom::difference(&geom::difference(ito, &opened), &pads);
    // Corner slivers the opening leaves are far smaller than one square of lead, and the
    // thin crescents it leaves along curved edges (flattened a little differently after
    // the two offsets) are far narrower than any line that etches: neither is a lead.
    let least = art.rules.lead_width * art.rules.lead_width;
    let thinnest = 0.5 * art.rules.min_width;
    let leads = leads
        .0
        .into_iter()
        .filter(|p| geom::area(p) > least)
        .filter_map(|p| {
            let perimeter: f64 =
                std::iter::once(p.exterior()).chain(p.interiors()).map(|ring| Euclidean.length(ring)).sum();
            let squares = strip_squares(geom::area(&p), perimeter);
            let width = (geom::area(&p) / squares).sqrt();
            (width >= thinnest).then_some((p, squares))
        })
        .collect();
    // The opening reaches two tolerances past the ITO (above): the wide parts are what
    // of the ITO it covers.
    LeadSplit { leads, wide: geom::intersection(ito, &opened) }
}

/// ITO of a plate's components carrying `net`, as the plan measures it.
pub fn ito_of_net(ex: &Extraction, plate: PlateId, net: &str) -> Region {
    net_ito(ex, plate, net)
}

/// The electrical plan of an artwork.
pub fn electrical(art: &Artwork, ex: &Extraction) -> Electrical {
    let cell: &Cell = &art.cell;
    let lc = geom::region_of([art.lc_region.clone()]);
    // Each line is measured against the whole other plate: cut into bands once.
    let all_front = geom::bands::Banded::of(ex.ito_in_lc(art, PlateId::Front));
    let all_back = geom::bands::Banded::of(ex.ito_in_lc(art, PlateId::Back));
    let period = 1.0 / cell.frame_rate;
    // Each line is measured on its own (its lead pieces open the whole net's ITO, the
    // plan's largest cost), spread over the cores by rayon; collected in net order and
    // then sorted, so the plan is the same as one net after another.
    use rayon::prelude::*;
    let mut lines: Vec<Line> = art.nets.par_iter().map(|net| {
        let (plate, other, kind) = match net.kind {
            crate::artwork::NetKind::Segment => (PlateId::Front, &all_back, "seg"),
            crate::artwork::NetKind::Common => (PlateId::Back, &all_front, "com"),
        };
        let ito = net_ito(ex, plate, &net.name);
        let own = lead_pieces(art, &ito, &net.name);
        // The common's way on to its pad runs on the front plate.
        let front = (plate == PlateId::Back).then(|| lead_pieces(art, &net_ito(ex, PlateId::Front, &net.name), &net.name));
        let squares: f64 = own.leads.iter().chain(front.iter().flat_map(|f| &f.leads)).map(|(_, s)| s).sum();
        let pads: Vec<Polygon> = art.pins.iter().filter(|p| p.net == net.name).map(|p| p.pad.clone()).collect();
        // The pads lie on the front plate: the line's own for a SEG line, the second part
        // for a common.
        let mut parts = vec![super::lead_ways::PlatePart { wide: &own.wide, leads: &own.leads, pads: if front.is_none() { &pads } else { &[] } }];
        if let Some(f) = &front {
            parts.push(super::lead_ways::PlatePart { wide: &f.wide, leads: &f.leads, pads: &pads });
        }
        let dots: Vec<Polygon> = art.transfer_dots.iter().map(|d| d.dot.clone()).collect();
        // The pixels of the line are its loads, on the electrode that holds each.
        let loads: Vec<super::lead_ways::Load> = art
            .pixels
            .iter()
            .filter(|p| if plate == PlateId::Front { p.seg_net == net.name } else { p.com_net == net.name })
            .flat_map(|p| p.region.0.iter())
            .filter_map(|p| geom::interior_point(p).map(|at| (0, at, geom::area(p))))
            .collect();
        let ways = super::lead_ways::ways(&parts, &dots, &loads);
        // Measured near each piece of the line: the other plate spans the glass.
        let facing = geom::overlap_area(&geom::intersection(&ito, &lc), other);
        let c_off = plate_capacitance(facing, cell.gap, cell.permittivity_perpendicular);
        let c_on = plate_capacitance(facing, cell.gap, cell.permittivity_parallel);
        let way = ways.map_or(squares, |w| w.farthest_squares);
        let r = cell.sheet_resistance * way;
        // Elmore's delay over the tree of ways, at ε∥; without a pad, R · C of every branch.
        let f_per_mm2 = plate_capacitance(1.0, cell.gap, cell.permittivity_parallel);
        // The facing area outside the pixels (and any pixel not placed) is put where it
        // delays most: at the end of the farthest way.
        let delay = ways.map_or(cell.sheet_resistance * squares * c_on, |w| {
            let rest = (facing - w.placed_mm2).max(0.0);
            cell.sheet_resistance * (w.elmore_squares_mm2 + w.farthest_squares * rest) * f_per_mm2
        });
        Line {
            net: net.name.clone(),
            kind,
            lead_squares: round(squares, 2),
            lead_resistance_ohm: round(cell.sheet_resistance * squares, 1),
            way_squares: round(way, 2),
            way_resistance_ohm: round(r, 1),
            facing_area_mm2: round(facing, 4),
            capacitance_off_pf: round(c_off * 1e12, 2),
            capacitance_on_pf: round(c_on * 1e12, 2),
            rc_us: round(delay * 1e6, 4),
            rc_of_frame: delay / period,
        }
    }).collect();
    lines.sort_by(|a, b| b.kind.cmp(a.kind).then_with(|| a.net.cmp(&b.net)));
    let pixels = art
        .pixels
        .iter()
        .map(|p| {
            let a = geom::area(&p.region);
            PixelCap {
                element: p.element.clone(),
                area_mm2: round(a, 4),
                capacitance_off_pf: round(plate_capacitance(a, cell.gap, cell.permittivity_perpendicular) * 1e12, 3),
                capacitance_on_pf: round(plate_capacitance(a, cell.gap, cell.permittivity_parallel) * 1e12, 3),
            }
        })
        .collect();
    let spread = ["seg", "com"]
        .iter()
        .filter_map(|k| {
            // A line that faces nothing (a common no element uses) has no RC to compare.
            let rc: Vec<f64> = lines.iter().filter(|l| l.kind == *k && l.facing_area_mm2 > 0.0).map(|l| l.rc_us).collect();
            let (min, max) = rc.iter().fold((f64::INFINITY, 0.0f64), |(lo, hi), &v| (lo.min(v), hi.max(v)));
            (!rc.is_empty()).then(|| Spread { kind: *k, min_rc_us: min, max_rc_us: max, ratio: (min > 0.0).then(|| round(max / min, 3)) })
        })
        .collect();
    Electrical {
        sheet_resistance_ohm_sq: cell.sheet_resistance,
        frame_rate_hz: cell.frame_rate,
        frame_period_ms: round(period * 1e3, 4),
        rc_limit: cell.rc_limit,
        cell_gap_um: round(cell.gap * 1e3, 3),
        permittivity: [cell.permittivity_parallel, cell.permittivity_perpendicular],
        lines,
        pixels,
        spread,
    }
}

/// Rounds to `d` decimals (so the report reads well and stays byte-stable).
fn round(v: f64, d: i32) -> f64 {
    let f = 10f64.powi(d);
    (v * f).round() / f
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::artwork::{Layer, Role};
    use crate::geom::rect;

    /// A pixel of 4 × 5 mm over the default 7 µm gap with ε⊥ = 5 and ε∥ = 15, by hand:
    /// C = ε0·εr·A/d = 8.8541878128e-12 · 5 · 20e-6 / 7e-6 = 126.49 pF, and 379.46 pF at
    /// ε∥ (ε0: CODATA 2018).
    #[test]
    fn pixel_capacitance_by_hand() {
        let art = crate::check::fixture::clean();
        let e = electrical(&art, &Extraction::extract(&art));
        let p = &e.pixels[0];
        assert_eq!(p.area_mm2, 20.0);
        let by_hand_off = 8.8541878128e-12 * 5.0 * 20e-6 / 7e-6 * 1e12;
        assert!((p.capacitance_off_pf - by_hand_off).abs() < 1e-3, "{} {by_hand_off}", p.capacitance_off_pf);
        assert!((p.capacitance_on_pf - 379.465).abs() < 1e-3, "{}", p.capacitance_on_pf);
    }

    /// A straight lead 0.1 mm wide and 20 mm long between a 2 × 3 mm pad and a 4 × 5 mm
    /// segment: R = Rs·L/W = 50 Ω/sq · 200 squares = 10 kΩ. The opening eats into each
    /// end of the lead where the disc's cap fits (about 0.02 mm), so 0.5 % is allowed.
    #[test]
    fn straight_lead_resistance() {
        let mut art = crate::check::fixture::clean();
        art.rules.lead_width = 0.1;
        // S1: pad 11..13 × 1..4, a lead 11.95..12.05 × 4..24 and the segment above it.
        crate::check::fixture::set(&mut art, Layer::FrontIto, Role::Lead, "S1", rect(11.95, 4.0, 12.05, 24.0));
        crate::check::fixture::set(&mut art, Layer::FrontIto, Role::Segment, "S1", rect(10.0, 24.0, 14.0, 29.0));
        let e = electrical(&art, &Extraction::extract(&art));
        let s1 = e.lines.iter().find(|l| l.net == "S1").unwrap();
        assert!((s1.lead_squares - 200.0).abs() < 1.0, "{}", s1.lead_squares);
        assert!((s1.lead_resistance_ohm - 10_000.0).abs() < 50.0, "{}", s1.lead_resistance_ohm);
        assert_eq!(strip_squares(2.0, 2.0 * (20.0 + 0.1)).round(), 200.0);
    }

    /// A round electrode (a disc of 2 mm radius, flattened to 1 µm) on the fixture's
    /// 0.2 mm lead: the opening leaves thin crescents along the curve, which are not
    /// leads; only the lead's 10.9 mm from the pad's top (y = 4) to the disc (y = 14.9)
    /// counts, about 54.5 squares (plane geometry; the ends blur by a fraction of a square).
    #[test]
    fn curved_electrodes_add_no_squares() {
        let mut art = crate::check::fixture::clean();
        let disc = crate::geom::circle(crate::geom::pt(12.0, 16.9), 2.0, 1e-3);
        crate::check::fixture::set(&mut art, Layer::FrontIto, Role::Segment, "S1", disc);
        let e = electrical(&art, &Extraction::extract(&art));
        let s1 = e.lines.iter().find(|l| l.net == "S1").unwrap();
        assert!((52.5..56.5).contains(&s1.lead_squares), "{}", s1.lead_squares);
    }
}
