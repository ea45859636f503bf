//! The drive summary of the report and the segment map.
//!
//! Takes the artwork's drive scheme, pins and pixels, gives the duty and bias as written
//! in layouts (`static`, `1/2`…), the pin count against the formula `N + ⌈S/N⌉`
//! (docs/background.md, *Drive and pin count*) and the rms selection ratio of Alt & Pleshko (IEEE
//! Trans. Electron Devices ED-21, 1974) at the chosen bias and at the best one.

use crate::artwork::Artwork;
use crate::drive::{best_bias, pin_count, selection_ratio};
use crate::layout::Drive;
use serde::Serialize;

/// The `drive` object of `NAME.report.json`.
#[derive(Debug, Clone, Serialize)]
pub struct DriveSummary {
    /// `static`, or the duty `1/N`.
    pub duty: String,
    /// Number of commons N (1 for static).
    pub commons: u32,
    /// Bias `1/a`; `None` for static.
    pub bias: Option<String>,
    /// Pins the artwork has.
    pub pin_count: usize,
    /// `N + ⌈S/N⌉` for S pixels: the fewest pins that can drive them.
    pub pin_count_formula: u32,
    /// rms `Von/Voff` at the chosen bias; `None` for static, which selects nothing.
    pub selection_ratio: Option<f64>,
    /// Bias divisor `√N + 1` that maximises the ratio; `None` for static.
    pub best_bias: Option<f64>,
    /// The ratio at `best_bias`; `None` for static.
    pub best_selection_ratio: Option<f64>,
}

/// Duty as written in layouts: `static` for one common, else `1/N`.
pub fn duty_name(d: Drive) -> String {
    if d.commons <= 1 { "static".into() } else { format!("1/{}", d.commons) }
}

/// Bias as written in layouts (`1/a`); `None` for static drive.
pub fn bias_name(d: Drive) -> Option<String> {
    if d.commons <= 1 { None } else { d.bias.map(|a| format!("1/{a}")) }
}

/// The drive summary of an artwork.
pub fn drive_summary(art: &Artwork) -> DriveSummary {
    let d = art.drive;
    let n = d.commons.max(1);
    let pixels = u32::try_from(art.pixels.len()).unwrap_or(u32::MAX);
    let multiplexed = n > 1;
    DriveSummary {
        duty: duty_name(d),
        commons: n,
        bias: bias_name(d),
        pin_count: art.pins.len(),
        pin_count_formula: pin_count(n, pixels),
        selection_ratio: d.bias.filter(|_| multiplexed).map(|a| selection_ratio(n, f64::from(a))),
        best_bias: multiplexed.then(|| best_bias(n)),
        best_selection_ratio: multiplexed.then(|| selection_ratio(n, best_bias(n))),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Static drive: one common and a pin per element, N + ⌈S/N⌉ = 1 + S (common
    /// practice); no selection, so no ratio.
    #[test]
    fn static_has_no_ratio() {
        let art = crate::check::fixture::clean();
        let s = drive_summary(&art);
        assert_eq!((s.duty.as_str(), s.commons, s.bias.clone()), ("static", 1, None));
        assert_eq!((s.pin_count, s.pin_count_formula), (3, 1 + 2));
        assert!(s.selection_ratio.is_none() && s.best_bias.is_none() && s.best_selection_ratio.is_none());
    }

    /// 1/4 duty at 1/3 bias: Alt & Pleshko (1974) give √3 ≈ 1.732 there, and the best
    /// bias √4 + 1 = 3, so both ratios agree; 30 elements need 4 + ⌈30/4⌉ = 12 pins.
    #[test]
    fn quarter_duty_third_bias() {
        let mut art = crate::check::fixture::clean();
        art.drive = Drive { commons: 4, bias: Some(3) };
        let one = art.pixels[0].clone();
        art.pixels = vec![one; 30];
        let s = drive_summary(&art);
        assert_eq!((s.duty.as_str(), s.bias.as_deref()), ("1/4", Some("1/3")));
        assert_eq!(s.pin_count_formula, 12);
        assert!((s.selection_ratio.unwrap() - 3f64.sqrt()).abs() < 1e-12);
        assert_eq!(s.best_bias, Some(3.0));
        assert!((s.best_selection_ratio.unwrap() - 3f64.sqrt()).abs() < 1e-12);
    }

    /// 1/2 duty at 1/2 bias: √5 ≈ 2.236 (Alt & Pleshko 1974), below the best
    /// √2 + 1 ≈ 2.414 reached at a = 1 + √2.
    #[test]
    fn half_duty_half_bias_is_below_best() {
        let mut art = crate::check::fixture::clean();
        art.drive = Drive { commons: 2, bias: Some(2) };
        let s = drive_summary(&art);
        assert!((s.selection_ratio.unwrap() - 5f64.sqrt()).abs() < 1e-12);
        assert!((s.best_selection_ratio.unwrap() - 2.414).abs() < 1e-3);
        assert_eq!(s.pin_count_formula, 2 + 1);
    }
}
