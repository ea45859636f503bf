//! The area two regions share, measured piece by piece near where they meet.
//!
//! A common electrode spans the glass; the area a SEG line's ITO faces of it was the
//! area of a boolean of the line with the whole back plate, once per line. Here each
//! pair of polygons whose boxes meet is intersected after the larger of the two has been
//! cut to the smaller one's box, and a polygon that spans the glass is cut from its
//! bands ([`super::bands::Banded`]: the second region is cut into bands once by the
//! caller, a wide polygon of the first here), so the work follows the size of the small
//! shapes, not of the glass.

use super::bands::Banded;
use super::{area, cut_to_box, intersection, region_of, Polygon, Region};
use geo::BoundingRect;

/// The area `a` and `b` share (`b` cut into bands once, as it is asked about by many
/// regions). The polygons of each region must not overlap one another (as the pieces of
/// a region do); then each shared part is counted once.
pub fn overlap_area(a: &Region, b: &Banded) -> f64 {
    let mut total = 0.0;
    for pa in &a.0 {
        let Some(ra) = pa.bounding_rect() else { continue };
        if b.fits(&ra) {
            // A small polygon: what of `b` lies near it, cut from `b`'s bands (the
            // polygons of `b` do not overlap, so one boolean counts each once).
            if b.meeting(&ra).next().is_some() {
                total += area(&intersection(&region_of([pa.clone()]), &b.near(&ra)));
            }
            continue;
        }
        // A polygon spanning the glass: cut into bands once, then to each small polygon
        // of `b` it meets; two wide ones are each cut to the other's box.
        let meeting: Vec<(&Polygon, &geo::Rect<f64>)> = b.meeting(&ra).collect();
        if meeting.is_empty() {
            continue;
        }
        let wide = Banded::of(&region_of([pa.clone()]));
        for (pb, rb) in meeting {
            let part = region_of([pb.clone()]);
            total += if wide.fits(rb) {
                area(&intersection(&part, &wide.near(rb)))
            } else if vertices(pa) <= vertices(pb) {
                area(&intersection(&region_of([pa.clone()]), &cut_to_box([pb], &ra)))
            } else {
                area(&intersection(&part, &cut_to_box([pa], rb)))
            };
        }
    }
    total
}

fn vertices(p: &Polygon) -> usize {
    p.exterior().0.len() + p.interiors().iter().map(|r| r.0.len()).sum::<usize>()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{rect, ring};

    /// Against the full boolean (i_overlay through `geom::intersection`): a long comb with
    /// a hole, met by small squares, some inside, some across its edges, one in the hole.
    #[test]
    fn agrees_with_the_full_boolean() {
        let mut teeth = vec![rect(0.0, 0.0, 100.0, 2.0)];
        teeth.extend((0..40).map(|i| rect(i as f64 * 2.5, 2.0, i as f64 * 2.5 + 1.2, 6.0)));
        let comb = difference_hole(crate::geom::union_all(teeth), rect(50.0, 0.5, 60.0, 1.5));
        let small = region_of(
            [rect(1.0, 1.0, 3.0, 5.0), rect(49.5, 1.0, 51.0, 3.0), rect(55.0, 0.8, 56.0, 1.2), rect(98.0, -1.0, 101.0, 7.0)]
                .into_iter()
                .chain([ring(crate::geom::pt(30.0, 3.0), 0.8, 0.4, 0.01)]),
        );
        let full = area(&intersection(&small, &comb));
        let local = overlap_area(&small, &Banded::of(&comb));
        assert!(full > 1.0);
        // Both sides snap to the booleans' 1 nm grid, each along its own edges: over
        // edges some tens of mm long that moves the area by well under 1e-5 mm².
        assert!((full - local).abs() < 1e-5, "full {full} local {local}");
        assert!((overlap_area(&comb, &Banded::of(&small)) - local).abs() < 1e-5, "either order");
    }

    /// Two wide polygons, each too long for one band: two bars 80 mm long, one 1 mm high
    /// and one 2 mm high, overlapping over 60 mm by 0.5 mm, share 30 mm² (plane
    /// geometry), as the full boolean says too.
    #[test]
    fn two_wide_polygons_share_their_overlap() {
        let a = region_of([rect(0.0, 0.0, 80.0, 1.0)]);
        let b = region_of([rect(20.0, 0.5, 100.0, 2.5)]);
        let shared = overlap_area(&a, &Banded::of(&b));
        assert!((shared - 30.0).abs() < 1e-6, "{shared}");
        assert!((shared - area(&intersection(&a, &b))).abs() < 1e-6);
    }

    /// Nothing shared, nothing counted; boxes that meet but shapes that do not: zero.
    #[test]
    fn disjoint_regions_share_nothing() {
        let a = region_of([rect(0.0, 0.0, 1.0, 1.0)]);
        let b = region_of([rect(2.0, 2.0, 3.0, 3.0)]);
        assert_eq!(overlap_area(&a, &Banded::of(&b)), 0.0);
        let l = crate::geom::difference(&region_of([rect(0.0, 0.0, 4.0, 4.0)]), &region_of([rect(1.0, 1.0, 4.0, 4.0)]));
        let inside_box = region_of([rect(2.0, 2.0, 3.0, 3.0)]);
        assert_eq!(overlap_area(&l, &Banded::of(&inside_box)), 0.0);
    }

    fn difference_hole(r: Region, hole: Polygon) -> Region {
        crate::geom::difference(&r, &region_of([hole]))
    }
}
