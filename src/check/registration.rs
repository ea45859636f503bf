//! Rule `registration`: what a misalignment of the plates within the process's
//! registration would light or uncover.
//!
//! Takes the artwork, its extraction and `rules.registration` = r (off when 0). The back
//! plate is shifted by +r and −r in x and in y, one at a time. For each shift:
//!
//! - *Stray area*: front ITO of one component newly facing back ITO of another inside
//!   the window and the liquid crystal — `F ∩ shifted(B) − F ∩ B` — is a place that
//!   switches with that (COM, SEG) pair although it did not before: typically a front
//!   lead whose cut in the common is narrower than r.
//! - *Lost coverage*: part of a designed pixel its common no longer faces.
//!
//! Everything is worked out locally: the window is cut into tiles of [`TILE_MM`], and
//! each tile clips only the components whose boxes meet it (R-tree queries), and each
//! pixel only its own SEG and COM ITO near its box; no boolean ever covers the whole
//! glass. The pieces of one pair under all four shifts are gathered into one warning
//! (the shifts named, the largest total of any one shift and the place of the largest
//! piece), and each pixel's losses likewise: one place is one decision for the designer,
//! not four lines.

use super::connectivity::Extraction;
use super::ghost::MIN_GHOST_MM2;
use super::index::{Bbox, bbox_of_region, expand};
use crate::artwork::Artwork;
use crate::finding::{Finding, Rule, Severity};
use crate::geom::{self, Polygon, Region, rect};
use crate::layout::PlateId;
use std::collections::BTreeMap;

/// Side of the square tiles the window is cut into, mm.
pub const TILE_MM: f64 = 2.0;

fn bbox_polygon(b: &Bbox) -> Polygon {
    let (lo, hi) = (b.lower(), b.upper());
    rect(lo[0], lo[1], hi[0], hi[1])
}

/// The four shifts and their names.
fn shifts(r: f64) -> [((f64, f64), String); 4] {
    let s = |dx: f64, dy: f64, name: &str| ((dx, dy), format!("{name} {r:.3} mm"));
    [s(r, 0.0, "+x"), s(-r, 0.0, "−x"), s(0.0, r, "+y"), s(0.0, -r, "−y")]
}

/// ITO of the components of `plate` near `b`, clipped to `b`, with their nets.
fn clipped(ex: &Extraction, plate: PlateId, b: &Bbox) -> Vec<(Vec<String>, Region)> {
    let clip = geom::region_of([bbox_polygon(b)]);
    ex.components_near(plate, b)
        .into_iter()
        .map(|c| (ex.groups[ex.components[c].group].nets.clone(), geom::intersection(&ex.components[c].region, &clip)))
        .filter(|(_, r)| !r.0.is_empty())
        .collect()
}

/// Runs the rule; nothing when `rules.registration` is 0.
pub fn check_registration(art: &Artwork, ex: &Extraction) -> Vec<Finding> {
    let r = art.rules.registration;
    if r <= 0.0 {
        return Vec::new();
    }
    let mut out = stray(art, ex, r);
    out.extend(lost(art, ex, r));
    out
}

/// New lit area in the window, per (front nets, back nets, shift).
fn stray(art: &Artwork, ex: &Extraction, r: f64) -> Vec<Finding> {
    let seen = geom::intersection(&geom::region_of([art.window.clone()]), &geom::region_of([art.lc_region.clone()]));
    let Some(wb) = bbox_of_region(&seen) else { return Vec::new() };
    let (lo, hi) = (wb.lower(), wb.upper());
    let mut pieces: BTreeMap<(Vec<String>, Vec<String>, usize), Vec<Polygon>> = BTreeMap::new();
    let (nx, ny) = (((hi[0] - lo[0]) / TILE_MM).ceil() as usize, ((hi[1] - lo[1]) / TILE_MM).ceil() as usize);
    for ix in 0..nx {
        for iy in 0..ny {
            let x0 = lo[0] + ix as f64 * TILE_MM;
            let y0 = lo[1] + iy as f64 * TILE_MM;
            let tile = Bbox::from_corners([x0, y0], [(x0 + TILE_MM).min(hi[0]), (y0 + TILE_MM).min(hi[1])]);
            let tile_region = geom::intersection(&geom::region_of([bbox_polygon(&tile)]), &seen);
            if tile_region.0.is_empty() {
                continue;
            }
            let front = clipped(ex, PlateId::Front, &tile);
            if front.is_empty() {
                continue;
            }
            // Back ITO that a shift of r can bring into the tile.
            let back = clipped(ex, PlateId::Back, &expand(&tile, r));
            for (si, ((dx, dy), _)) in shifts(r).iter().enumerate() {
                for (bn, b) in &back {
                    let moved = geom::translate(b, *dx, *dy);
                    for (fnets, f) in &front {
                        let now = geom::intersection(f, &moved);
                        if now.0.is_empty() {
                            continue;
                        }
                        let before = geom::intersection(f, b);
                        let new = geom::intersection(&geom::difference(&now, &before), &tile_region);
                        if !new.0.is_empty() {
                            pieces.entry((fnets.clone(), bn.clone(), si)).or_default().extend(new.0);
                        }
                    }
                }
            }
        }
    }
    // Each pair's pieces under each shift, then one warning per pair over all four.
    let mut per_pair: BTreeMap<(Vec<String>, Vec<String>), Vec<ShiftedPieces>> = BTreeMap::new();
    for ((fnets, bnets, si), polys) in pieces {
        let united = geom::snap(&geom::union_all(polys));
        let parts: Vec<&Polygon> = united.0.iter().filter(|p| geom::area(*p) > MIN_GHOST_MM2).collect();
        let Some(largest) = parts.iter().max_by(|a, b| geom::area(**a).total_cmp(&geom::area(**b))) else { continue };
        let at = {
            use geo::InteriorPoint;
            largest.interior_point().map(|p| p.0).unwrap_or_default()
        };
        let total = parts.iter().map(|p| geom::area(*p)).sum();
        per_pair.entry((fnets, bnets)).or_default().push(ShiftedPieces { shift: si, total, count: parts.len(), largest: geom::area(*largest), at });
    }
    let names = shifts(r);
    let mut out = Vec::new();
    for ((fnets, bnets), found) in per_pair {
        let most = found.iter().max_by(|a, b| a.total.total_cmp(&b.total)).expect("a pair is kept with a piece");
        let worst = found.iter().max_by(|a, b| a.largest.total_cmp(&b.largest)).expect("a pair is kept with a piece");
        let mut nets = fnets.clone();
        nets.extend(bnets.iter().cloned());
        out.push(Finding {
            rule: Rule::Registration,
            severity: Severity::Warning,
            plate: None,
            nets,
            location: worst.at,
            measured: Some(most.total),
            required: Some(0.0),
            message: format!(
                "with the back plate shifted by {r:.3} mm ({}): front ITO of {} newly faces back ITO of {} over {:.4} mm² at most in the window ({} piece(s) under that shift; the largest of all {:.4} mm² at ({:.3}, {:.3}) mm)",
                shift_list(&names, found.iter().map(|f| f.shift)),
                fnets.join("/"),
                bnets.join("/"),
                most.total,
                most.count,
                worst.largest,
                worst.at.x,
                worst.at.y
            ),
        });
    }
    out
}

/// What one shift brings a pair to face: the area in all, in how many pieces, the
/// largest piece's area and a point inside it.
struct ShiftedPieces {
    shift: usize,
    total: f64,
    count: usize,
    largest: f64,
    at: geom::Pt,
}

/// The names of the shifts `which` (indices into `names`), in the order of `names`: the
/// sign and axis only ("+x, −y"), the distance being said once.
fn shift_list(names: &[((f64, f64), String); 4], which: impl Iterator<Item = usize>) -> String {
    let mut which: Vec<usize> = which.collect();
    which.sort_unstable();
    which.dedup();
    which.iter().map(|&i| names[i].1.split(' ').next().unwrap_or_default()).collect::<Vec<_>>().join(", ")
}

/// Pixels whose common no longer faces all of them.
fn lost(art: &Artwork, ex: &Extraction, r: f64) -> Vec<Finding> {
    let lc = geom::region_of([art.lc_region.clone()]);
    let names = shifts(r);
    let mut out = Vec::new();
    for p in &art.pixels {
        let Some(b) = bbox_of_region(&p.region) else { continue };
        let near = expand(&b, r);
        let own = |plate: PlateId, net: &str| {
            geom::region_of(
                clipped(ex, plate, &near).into_iter().filter(|(n, _)| n.iter().any(|x| x == net)).flat_map(|(_, r)| r.0),
            )
        };
        let front = own(PlateId::Front, &p.seg_net);
        let back = own(PlateId::Back, &p.com_net);
        let designed = geom::intersection(&geom::intersection(&p.region, &lc), &front);
        let whole = geom::area(&designed);
        // (shift, area lost, where) under each shift that uncovers some of it.
        let mut found: Vec<(usize, f64, geom::Pt)> = Vec::new();
        for (si, ((dx, dy), _)) in names.iter().enumerate() {
            let lit = geom::intersection(&designed, &geom::translate(&back, *dx, *dy));
            let dark = geom::difference(&designed, &lit);
            let area = geom::area(&dark);
            if area <= MIN_GHOST_MM2 {
                continue;
            }
            let at = {
                use geo::Centroid;
                dark.centroid().map(|c| c.0).unwrap_or_default()
            };
            found.push((si, area, at));
        }
        // One warning per pixel, at the shift that uncovers the most of it.
        let Some(&(_, area, at)) = found.iter().max_by(|a, b| a.1.total_cmp(&b.1)) else { continue };
        out.push(Finding {
            rule: Rule::Registration,
            severity: Severity::Warning,
            plate: None,
            nets: vec![p.seg_net.clone(), p.com_net.clone()],
            location: at,
            measured: Some(area),
            required: Some(0.0),
            message: format!(
                "with the back plate shifted by {r:.3} mm ({}): {area:.4} mm² at most of {} ({:.1} % of it) at ({:.3}, {:.3}) mm is no longer faced by {}",
                shift_list(&names, found.iter().map(|f| f.0)),
                p.element,
                100.0 * area / whole.max(1e-12),
                at.x,
                at.y,
                p.com_net
            ),
        });
    }
    out
}

#[cfg(test)]
mod tests {
    use super::super::fixture::{self, show};
    use super::*;
    use crate::artwork::{Layer, Role};

    /// Off by default; at 0.2 mm the clean fixture (plane geometry: two 4 × 5 mm squares
    /// whose common ends flush with their bottom edge at y = 15 and 0.5 mm beyond them
    /// elsewhere; 0.2 mm leads leaving downwards) loses a 4 × 0.2 mm strip of each
    /// square when the back plate moves up, and lights 0.2 × 0.2 mm of each lead when it
    /// moves down; sideways nothing changes.
    #[test]
    fn fixture_by_hand() {
        let mut art = fixture::clean();
        assert!(check_registration(&art, &Extraction::extract(&art)).is_empty());
        art.rules.registration = 0.2;
        let f = check_registration(&art, &Extraction::extract(&art));
        assert_eq!(f.len(), 4, "{}", show(&f));
        let lost: Vec<&Finding> = f.iter().filter(|f| f.message.contains("0.200 mm (+y)") && f.message.contains("no longer")).collect();
        assert_eq!(lost.len(), 2, "{}", show(&f));
        assert!(lost.iter().all(|f| (f.measured.unwrap() - 0.8).abs() < 1e-6 && (f.location.y - 15.1).abs() < 1e-6));
        let stray: Vec<&Finding> = f.iter().filter(|f| f.message.contains("0.200 mm (−y)") && f.message.contains("newly")).collect();
        assert_eq!(stray.len(), 2, "{}", show(&f));
        assert!(stray.iter().all(|f| (f.measured.unwrap() - 0.04).abs() < 1e-6 && (14.8..15.0).contains(&f.location.y)));
    }

    /// A front stub of S2 running right, 0.1 mm clear of a piece of COM1 ITO above it:
    /// moved 0.2 mm down, the common overlaps the stub by 0.1 mm × 1 mm = 0.1 mm², which
    /// joins S2's 0.04 mm² at its lead (plane geometry); the place given is the stub's.
    #[test]
    fn stray_overlap_is_reported_with_area_and_place() {
        let mut art = fixture::clean();
        fixture::add(&mut art, Layer::FrontIto, Role::Lead, Some("S2"), rect(20.0, 14.0, 25.0, 14.2));
        fixture::add(&mut art, Layer::BackIto, Role::Common, Some("COM1"), rect(22.0, 14.3, 23.0, 15.0));
        art.rules.registration = 0.2;
        let f = check_registration(&art, &Extraction::extract(&art));
        let s2: Vec<&Finding> = f.iter().filter(|f| f.message.contains("−y") && f.nets[0] == "S2").collect();
        assert_eq!(s2.len(), 1, "{}", show(&f));
        assert!((s2[0].measured.unwrap() - 0.14).abs() < 1e-6, "{}", show(&f));
        let at = s2[0].location;
        assert!((22.0..23.0).contains(&at.x) && (14.0..14.2).contains(&at.y), "{at:?}");
    }

    /// One warning per pair, whatever the shifts: a second piece of COM1 0.1 mm below
    /// the stub of the test above lights 0.1 mm × 1 mm of it when the back plate moves
    /// up, as the piece above does when it moves down (0.14 mm² with S2's lead). The two
    /// shifts give one warning naming both, with the larger area (plane geometry);
    /// before, each shift was a warning of its own.
    #[test]
    fn one_warning_per_pair_over_all_shifts() {
        let mut art = fixture::clean();
        fixture::add(&mut art, Layer::FrontIto, Role::Lead, Some("S2"), rect(20.0, 14.0, 25.0, 14.2));
        fixture::add(&mut art, Layer::BackIto, Role::Common, Some("COM1"), rect(22.0, 14.3, 23.0, 15.0));
        fixture::add(&mut art, Layer::BackIto, Role::Common, Some("COM1"), rect(22.0, 13.2, 23.0, 13.9));
        art.rules.registration = 0.2;
        let f = check_registration(&art, &Extraction::extract(&art));
        let s2: Vec<&Finding> = f.iter().filter(|f| f.nets[0] == "S2" && f.message.contains("newly")).collect();
        assert_eq!(s2.len(), 1, "{}", show(&f));
        assert!(s2[0].message.contains("0.200 mm (+y, −y)"), "{}", show(&f));
        assert!((s2[0].measured.unwrap() - 0.14).abs() < 1e-6, "{}", show(&f));
        let at = s2[0].location;
        assert!((22.0..23.0).contains(&at.x) && (14.0..14.2).contains(&at.y), "{at:?}");
    }
}
