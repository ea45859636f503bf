//! Drive arithmetic: the rms selection ratio of multiplexed drive (Alt & Pleshko, IEEE
//! Trans. Electron Devices ED-21, 1974) and pin counts.
//!
//! With N commons (1/N duty) and bias 1/a, the rms voltages across a selected and a
//! non-selected pixel are `Von = (V/a)·√((a² + N − 1)/N)` and
//! `Voff = (V/a)·√(((a − 2)² + N − 1)/N)`; their ratio is largest at `a = √N + 1`.

/// rms selection ratio `Von/Voff` at 1/`n` duty and bias 1/`a`.
///
/// ```
/// // Alt & Pleshko (1974): 1/4 duty at 1/3 bias gives √3.
/// let r = segmask::drive::selection_ratio(4, 3.0);
/// assert!((r - 3f64.sqrt()).abs() < 1e-12);
/// ```
pub fn selection_ratio(n: u32, a: f64) -> f64 {
    let n = n as f64;
    ((a * a + n - 1.0) / ((a - 2.0).powi(2) + n - 1.0)).sqrt()
}

/// The bias divisor that maximises the selection ratio at 1/`n` duty: `√N + 1`.
pub fn best_bias(n: u32) -> f64 {
    (n as f64).sqrt() + 1.0
}

/// rms voltage across a selected pixel, `(V/a)·√((a² + N − 1)/N)`, at drive amplitude
/// `v`; static drive (N = 1) gives `v` itself, the full amplitude in antiphase.
///
/// ```
/// // 1/4 duty, bias 1/3, 5 V: (5/3)·√(12/4) = 2.887 V.
/// assert!((segmask::drive::v_on(4, 3.0, 5.0) - 5.0 / 3f64.sqrt()).abs() < 1e-12);
/// ```
pub fn v_on(n: u32, a: f64, v: f64) -> f64 {
    if n <= 1 {
        return v;
    }
    let nf = n as f64;
    v / a * ((a * a + nf - 1.0) / nf).sqrt()
}

/// rms voltage across a non-selected pixel, `(V/a)·√(((a − 2)² + N − 1)/N)`; 0 under
/// static drive (segment in phase with the common).
pub fn v_off(n: u32, a: f64, v: f64) -> f64 {
    if n <= 1 {
        return 0.0;
    }
    let nf = n as f64;
    v / a * (((a - 2.0).powi(2) + nf - 1.0) / nf).sqrt()
}

/// The drive amplitudes that switch a mixture fully on without lighting off pixels:
/// `Von ≥ Vsat` and `Voff ≤ Vth` hold for amplitudes in `[low, high]`; `None` when no
/// amplitude does (the selection ratio is below `Vsat/Vth`). Static drive has no upper
/// bound from Voff, given as infinity.
pub fn amplitude_window(n: u32, a: f64, threshold: f64, saturation: f64) -> Option<(f64, f64)> {
    let low = saturation / v_on(n, a, 1.0);
    let off = v_off(n, a, 1.0);
    let high = if off > 0.0 { threshold / off } else { f64::INFINITY };
    (low <= high).then_some((low, high))
}

/// Pins needed for `s` switched elements on `n` commons: `N + ⌈S/N⌉`.
///
/// ```
/// assert_eq!(segmask::drive::pin_count(4, 30), 4 + 8);
/// ```
pub fn pin_count(n: u32, s: u32) -> u32 {
    n + s.div_ceil(n)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Alt & Pleshko (IEEE Trans. Electron Devices ED-21, 1974), values recomputed from
    /// their formula: N=2 a=2 → √5; N=3 a=3 → √(11/3); N=4 a=3 → √3; N=4 a=2 → √21/3.
    #[test]
    fn published_ratios() {
        assert!((selection_ratio(2, 2.0) - 5f64.sqrt()).abs() < 1e-12);
        assert!((selection_ratio(3, 3.0) - (11.0f64 / 3.0).sqrt()).abs() < 1e-12);
        assert!((selection_ratio(4, 3.0) - 3f64.sqrt()).abs() < 1e-12);
        assert!((selection_ratio(4, 2.0) - 21f64.sqrt() / 3.0).abs() < 1e-12);
    }

    /// The optimum a = √N + 1 gives the limits 2.414, 1.932, 1.732, 1.447 for N = 2, 3,
    /// 4, 8 (Alt & Pleshko 1974), and no nearby bias does better.
    #[test]
    fn best_bias_is_the_maximum() {
        for (n, limit) in [(2, 2.414), (3, 1.932), (4, 1.732), (8, 1.447)] {
            let a = best_bias(n);
            let r = selection_ratio(n, a);
            assert!((r - limit).abs() < 1e-3, "N={n}: {r}");
            assert!(selection_ratio(n, a - 0.05) < r && selection_ratio(n, a + 0.05) < r);
        }
    }

    /// Von and Voff themselves (Alt & Pleshko 1974, values recomputed from their formula)
    /// at V = 3: N=4 a=3 → √3 and 1, ratio √3 as in `published_ratios`; N=2 a=2 → 1.5·√(5/2)
    /// and 1.5·√(1/2), ratio √5; static → 3 and 0.
    #[test]
    fn rms_voltages() {
        assert!((v_on(4, 3.0, 3.0) - 3f64.sqrt()).abs() < 1e-12);
        assert!((v_off(4, 3.0, 3.0) - 1.0).abs() < 1e-12);
        assert!((v_on(2, 2.0, 3.0) - 1.5 * 2.5f64.sqrt()).abs() < 1e-12);
        assert!((v_on(2, 2.0, 3.0) / v_off(2, 2.0, 3.0) - 5f64.sqrt()).abs() < 1e-12);
        assert_eq!((v_on(1, 1.0, 3.0), v_off(1, 1.0, 3.0)), (3.0, 0.0));
        for (n, a) in [(2, 2.0), (3, 3.0), (4, 3.0), (4, 2.0)] {
            assert!((v_on(n, a, 1.0) / v_off(n, a, 1.0) - selection_ratio(n, a)).abs() < 1e-12);
        }
    }

    /// A mixture with Vth 1.5 V and Vsat 2.2 V (a ratio 1.47) at 1/4 duty, bias 1/3
    /// (ratio √3): amplitudes from 2.2·√3 = 3.81 V to 1.5·3 = 4.5 V work; at 1/8 duty with
    /// the best bias (ratio 1.447) the window closes for Vsat/Vth = 1.5.
    #[test]
    fn amplitude_window_edges() {
        let (lo, hi) = amplitude_window(4, 3.0, 1.5, 2.2).unwrap();
        assert!((lo - 2.2 * 3f64.sqrt()).abs() < 1e-12 && (hi - 4.5).abs() < 1e-12);
        assert!(amplitude_window(8, best_bias(8), 1.0, 1.5).is_none());
        assert_eq!(amplitude_window(1, 1.0, 1.5, 2.2), Some((2.2, f64::INFINITY)));
    }

    /// Static drive is the N = 1 case: one COM plus one pin per element.
    #[test]
    fn static_pin_count() {
        assert_eq!(pin_count(1, 29), 30);
    }
}
