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

    /// Static drive is the N = 1 case: one COM plus one pin per element.
    #[test]
    fn static_pin_count() {
        assert_eq!(pin_count(1, 29), 30);
    }
}
