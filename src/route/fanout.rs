//! The contact fan-out: from where each lead crosses into the seal band to its pad, as
//! orthogonal runs in the side's local frame (`u` along the side, `v` into the glass).
//!
//! Leads arrive sorted by `u` and pads are given to them in the same order, so the plan is
//! planar; each lead goes straight down, along at its own level, and down again. A lead
//! moving towards larger `u` must turn below every such lead it passes under, so levels are
//! stacked by a longest-chain count (the usual river-routing argument).

use crate::geom::{pt, Pt};

/// A lead arriving at the band.
#[derive(Debug, Clone, Copy)]
pub struct Arrival {
    /// Where it arrives along the side.
    pub u: f64,
    /// Where its fan-out starts (`v`).
    pub v: f64,
}

/// Matches arrivals (sorted by `u`) to free pads (sorted by `u`) in order, keeping the
/// total sideways travel smallest. Returns, for each arrival, the index of its pad.
///
/// ```
/// let m = segmask::route::fanout::match_in_order(&[1.1, 5.2], &[0.0, 2.0, 4.0, 6.0]);
/// assert_eq!(m, vec![1, 3]);
/// ```
pub fn match_in_order(arrivals: &[f64], pads: &[f64]) -> Vec<usize> {
    let (n, m) = (arrivals.len(), pads.len());
    assert!(n <= m, "more leads than pads is checked by the caller");
    // best[k][j]: cost of placing the first k arrivals on the first j pads.
    let mut best = vec![vec![f64::INFINITY; m + 1]; n + 1];
    let mut took = vec![vec![false; m + 1]; n + 1];
    for j in 0..=m {
        best[0][j] = 0.0;
    }
    for k in 1..=n {
        for j in k..=m {
            let skip = best[k][j - 1];
            let take = best[k - 1][j - 1] + (arrivals[k - 1] - pads[j - 1]).abs();
            if take <= skip {
                best[k][j] = take;
                took[k][j] = true;
            } else {
                best[k][j] = skip;
            }
        }
    }
    let mut out = vec![0; n];
    let (mut k, mut j) = (n, m);
    while k > 0 {
        if took[k][j] {
            out[k - 1] = j - 1;
            k -= 1;
        }
        j -= 1;
    }
    out
}

/// Plans each lead's polyline from its arrival to its pad at `pad_u`, turning at levels
/// between `v_top` (highest) and `v_floor` (lowest allowed), spaced `pitch`. `pad_end`
/// is the `v` where leads stop inside their pads. Arrivals and pads must be in the same
/// order. Returns the polylines, or the number of levels needed when the band is too
/// shallow.
pub fn plan(arrivals: &[Arrival], pad_u: &[f64], v_top: f64, v_floor: f64, pitch: f64, pad_end: f64) -> Result<Vec<Vec<Pt>>, usize> {
    let n = arrivals.len();
    let eps = 1e-9;
    let depth = depths(arrivals, pad_u, v_top, pitch);
    let deepest = depth.iter().copied().max().unwrap_or(0);
    if v_top - deepest as f64 * pitch < v_floor - eps {
        return Err(deepest + 1);
    }
    Ok((0..n)
        .map(|i| {
            let a = arrivals[i];
            if (pad_u[i] - a.u).abs() <= eps {
                vec![pt(a.u, a.v), pt(a.u, pad_end)]
            } else {
                let v = v_top - depth[i] as f64 * pitch;
                vec![pt(a.u, a.v), pt(a.u, v), pt(pad_u[i], v), pt(pad_u[i], pad_end)]
            }
        })
        .collect())
}

/// The level (0 = highest) at which each lead turns: a lead moving towards larger `u` turns
/// below every lead moving the same way whose arrival it passes, and the same towards
/// smaller `u`; a lead never turns less than one pitch below its own arrival.
pub fn depths(arrivals: &[Arrival], pad_u: &[f64], v_top: f64, pitch: f64) -> Vec<usize> {
    let n = arrivals.len();
    let eps = 1e-9;
    let mut depth = vec![0usize; n];
    // Leads moving to larger u: a lead must turn below every lead whose arrival it passes.
    for i in (0..n).rev() {
        if pad_u[i] > arrivals[i].u + eps {
            let mut d = 0;
            for j in i + 1..n {
                if arrivals[j].u > pad_u[i] + pitch {
                    break;
                }
                if pad_u[j] > arrivals[j].u + eps {
                    d = d.max(depth[j] + 1);
                }
            }
            depth[i] = d.max(min_depth(arrivals[i].v, v_top, pitch));
        }
    }
    for i in 0..n {
        if pad_u[i] < arrivals[i].u - eps {
            let mut d = 0;
            for j in (0..i).rev() {
                if arrivals[j].u < pad_u[i] - pitch {
                    break;
                }
                if pad_u[j] < arrivals[j].u - eps {
                    d = d.max(depth[j] + 1);
                }
            }
            depth[i] = d.max(min_depth(arrivals[i].v, v_top, pitch));
        }
    }
    depth
}

/// The smallest depth whose level lies at least one pitch below a start at `v`.
fn min_depth(v: f64, v_top: f64, pitch: f64) -> usize {
    let need = (v_top - (v - pitch)) / pitch;
    if need <= 0.0 { 0 } else { need.ceil() as usize }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn segments(p: &[Pt]) -> Vec<(Pt, Pt)> {
        p.windows(2).map(|w| (w[0], w[1])).collect()
    }

    fn seg_dist(a: (Pt, Pt), b: (Pt, Pt)) -> f64 {
        use geo::{Distance, Euclidean, Line};
        Euclidean.distance(&Line::new(a.0, a.1), &Line::new(b.0, b.1))
    }

    /// Every pair of planned leads keeps at least the pitch between them (checked with
    /// geo's exact segment distance).
    #[test]
    fn converging_fan_keeps_pitch() {
        let arrivals: Vec<Arrival> = (0..12).map(|i| Arrival { u: 10.0 + i as f64 * 0.3, v: 5.0 }).collect();
        let pads: Vec<f64> = (0..12).map(|i| 4.0 + i as f64 * 1.27).collect();
        let plans = plan(&arrivals, &pads, 4.7, 3.3, 0.2, 2.0).expect("fits");
        for i in 0..plans.len() {
            for j in i + 1..plans.len() {
                for a in segments(&plans[i]) {
                    for b in segments(&plans[j]) {
                        assert!(seg_dist(a, b) >= 0.2 - 1e-9, "leads {i} and {j}");
                    }
                }
            }
        }
    }

    #[test]
    fn too_shallow_band_says_how_many_levels() {
        let arrivals: Vec<Arrival> = (0..10).map(|i| Arrival { u: i as f64 * 0.3, v: 5.0 }).collect();
        let pads: Vec<f64> = (0..10).map(|i| 5.0 + i as f64 * 1.0).collect();
        assert_eq!(plan(&arrivals, &pads, 4.7, 4.3, 0.2, 2.0).unwrap_err(), 10);
    }
}
