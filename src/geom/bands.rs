//! A region cut once into overlapping vertical bands, so that the part of it near a small
//! box is cut from one band's pieces, not from the whole region.
//!
//! [`super::cut_to_box`] cuts every polygon whose box meets the small box with one pass
//! over all its vertices; a common electrode spans the glass, so asking it for each pixel
//! cost a pass over the whole common per pixel, and the check grew with the square of the
//! digit count. Here each polygon wider than a few bands is cut once into bands of
//! [`BAND`] mm, each grown by [`OVERLAP`] mm on both sides, by halving the range of bands
//! again and again (each halving one pass over the pieces, so the whole cut costs the
//! vertices times the number of halvings). A box that fits in one grown band is then cut
//! from that band's pieces: inside the box they bound exactly what the whole polygon does,
//! since cutting to the band and then to the box is cutting to the box. A wider box is cut
//! from the whole polygon, as before.

use super::{clip_to_rect, region_of, Polygon, Region};
use geo::BoundingRect;

/// Width of a band's core, mm.
pub const BAND: f64 = 4.0;
/// How far each band reaches past its core on either side, mm: a box up to this wide
/// (after [`super::CUT_MARGIN`]) always fits in one band.
pub const OVERLAP: f64 = 6.0;

/// One polygon of the region: small ones are cut whole; large ones keep their band pieces.
struct Part {
    polygon: Polygon,
    bbox: geo::Rect<f64>,
    /// Per band (from `x0`), the pieces of the polygon in the grown band; empty for a
    /// polygon no wider than [`OVERLAP`].
    bands: Vec<Vec<Polygon>>,
}

/// A region ready to be cut down to small boxes ([`Banded::near`]).
pub struct Banded {
    parts: Vec<Part>,
    x0: f64,
}

impl Banded {
    /// The region's polygons, the wide ones cut into bands.
    pub fn of(region: &Region) -> Banded {
        let x0 = region.bounding_rect().map(|r| r.min().x).unwrap_or(0.0);
        let parts = region
            .0
            .iter()
            .filter_map(|p| {
                let bbox = p.bounding_rect()?;
                let bands = if bbox.width() > OVERLAP {
                    // Every band whose grown reach meets the polygon.
                    let (k0, k1) = (band_of(x0, bbox.min().x - OVERLAP), band_of(x0, bbox.max().x + OVERLAP) + 1);
                    let mut bands = vec![Vec::new(); k1];
                    split(vec![p.clone()], x0, k0, k1, &mut bands);
                    bands
                } else {
                    Vec::new()
                };
                Some(Part { polygon: p.clone(), bbox, bands })
            })
            .collect();
        Banded { parts, x0 }
    }

    /// The parts of the region that can meet a shape whose box is `bbox`, cut to `bbox`
    /// grown by [`super::CUT_MARGIN`]: the same region [`super::cut_to_box`] gives.
    pub fn near(&self, bbox: &geo::Rect<f64>) -> Region {
        use geo::Intersects;
        let (x0, y0, x1, y1) = super::clip::cut_window(bbox);
        let (k, fits) = self.band_for(bbox);
        let mut out = Vec::new();
        for part in self.parts.iter().filter(|p| p.bbox.intersects(bbox)) {
            match part.bands.get(k).filter(|_| fits && !part.bands.is_empty()) {
                Some(pieces) => out.extend(pieces.iter().filter_map(|q| clip_to_rect(q, x0, y0, x1, y1))),
                None => out.extend(clip_to_rect(&part.polygon, x0, y0, x1, y1)),
            }
        }
        region_of(out)
    }

    /// The band whose grown reach holds `bbox` cut with its margin, and whether it does
    /// hold it (else [`Banded::near`] cuts whole polygons).
    fn band_for(&self, bbox: &geo::Rect<f64>) -> (usize, bool) {
        let (x0, _, x1, _) = super::clip::cut_window(bbox);
        let k = band_of(self.x0, x0);
        (k, x0 >= self.x0 + k as f64 * BAND - OVERLAP && x1 <= self.x0 + (k + 1) as f64 * BAND + OVERLAP)
    }

    /// Whether a shape whose box is `bbox` is cut from band pieces by [`Banded::near`]
    /// (it is narrow enough for one band's reach) rather than from whole polygons.
    pub fn fits(&self, bbox: &geo::Rect<f64>) -> bool {
        self.band_for(bbox).1
    }

    /// The region's polygons whose boxes meet `bbox`, each with its box.
    pub fn meeting<'a>(&'a self, bbox: &'a geo::Rect<f64>) -> impl Iterator<Item = (&'a Polygon, &'a geo::Rect<f64>)> + 'a {
        use geo::Intersects;
        self.parts.iter().filter(move |p| p.bbox.intersects(bbox)).map(|p| (&p.polygon, &p.bbox))
    }
}

/// The band whose core holds `x` (bands start at `x0`; none before it).
fn band_of(x0: f64, x: f64) -> usize {
    ((x - x0) / BAND).floor().max(0.0) as usize
}

/// Cuts `pieces` into the grown bands `k0..k1`, halving the range each time.
fn split(pieces: Vec<Polygon>, x0: f64, k0: usize, k1: usize, out: &mut [Vec<Polygon>]) {
    if pieces.is_empty() {
        return;
    }
    if k1 - k0 == 1 {
        out[k0] = pieces;
        return;
    }
    let mid = (k0 + k1) / 2;
    let edge = |k: usize| x0 + k as f64 * BAND;
    let cut = |lo: f64, hi: f64| -> Vec<Polygon> { pieces.iter().filter_map(|p| clip_to_rect(p, lo, f64::MIN, hi, f64::MAX)).collect() };
    let left = cut(edge(k0) - OVERLAP, edge(mid) + OVERLAP);
    let right = cut(edge(mid) - OVERLAP, edge(k1) + OVERLAP);
    split(left, x0, k0, mid, out);
    split(right, x0, mid, k1, out);
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, cut_to_box, difference, intersection, rect, ring};

    /// A comb 60 mm long with teeth and holes: every small box, in every band and across
    /// band edges, gets the same part of it from the bands as from the whole polygon
    /// (areas of the two cuts and of their difference, by the polygon booleans; the
    /// largest difference seen is 4e-9 mm², the booleans' rounding).
    #[test]
    fn the_bands_give_what_the_whole_polygon_gives() {
        let mut comb = region_of([rect(0.0, 0.0, 60.0, 2.0)]);
        for i in 0..30 {
            let x = 1.0 + 2.0 * i as f64;
            comb = crate::geom::union(&comb, &region_of([rect(x, 2.0, x + 0.8, 5.0 + (i % 3) as f64)]));
        }
        comb = difference(&comb, &region_of([ring(crate::geom::pt(30.0, 1.0), 0.6, 0.2, 0.01)]));
        let banded = Banded::of(&comb);
        assert!(banded.parts.iter().any(|p| !p.bands.is_empty()), "the comb is cut into bands");
        let mut boxes = 0;
        for i in 0..120 {
            let x = -1.0 + 0.53 * i as f64;
            for (w, h) in [(0.7, 1.0), (3.9, 2.5), (5.8, 6.0), (13.0, 3.0)] {
                let b = geo::Rect::new(geo::coord! { x: x, y: 0.5 }, geo::coord! { x: x + w, y: 0.5 + h });
                let (ours, whole) = (banded.near(&b), cut_to_box(&comb.0, &b));
                let probe = region_of([rect(x, 0.5, x + w, 0.5 + h)]);
                let (a, c) = (area(&intersection(&probe, &ours)), area(&intersection(&probe, &whole)));
                assert!((a - c).abs() < 1e-9, "box at x {x} w {w}: {a} vs {c}");
                let d = area(&difference(&intersection(&probe, &ours), &whole));
                // The booleans snap to a fine grid: a sliver of 1e-8 mm² is rounding.
                assert!(d < 1e-6, "box at x {x} w {w}: difference {d} (areas {a} {c})");
                boxes += 1;
            }
        }
        assert_eq!(boxes, 480);
    }
}
