//! Stage `plan`: `Artwork` → the electrical and optical plan of the cell, and the
//! warnings it gives.
//!
//! Takes the artwork (polygons and the cell's data) and its connectivity extraction;
//! gives a [`Plan`] — lead resistance, capacitance and RC of every line
//! ([`electrical`]), Von and Voff of the drive against the mixture ([`DrivePlan`],
//! Alt & Pleshko through `crate::drive`), gaps, spacer, rubbing and polarizers
//! ([`optics`]) — and the findings `line-rc` and `drive-margin` (docs/checks.md).

pub mod electrical;
pub mod lead_ways;
pub mod optics;

use crate::artwork::Artwork;
use crate::check::Extraction;
use crate::drive::{amplitude_window, best_bias, selection_ratio, v_off, v_on};
use crate::finding::{Finding, Rule, Severity};
use serde::Serialize;

/// The drive against the mixture.
#[derive(Debug, Clone, Serialize)]
pub struct DrivePlan {
    /// Commons N (1 for static).
    pub commons: u32,
    /// Bias divisor a (1 for static).
    pub bias_divisor: f64,
    /// Mixture threshold and saturation voltages, V rms.
    pub threshold_v: f64,
    /// Saturation voltage, V rms.
    pub saturation_v: f64,
    /// Drive amplitude V when the layout gives one.
    pub voltage_v: Option<f64>,
    /// rms on a selected pixel at that amplitude.
    pub v_on: Option<f64>,
    /// rms on a non-selected pixel at that amplitude.
    pub v_off: Option<f64>,
    /// Von ≥ Vsat (every selected pixel fully on).
    pub on_saturates: Option<bool>,
    /// Voff ≤ Vth (no non-selected pixel starts to switch).
    pub off_below_threshold: Option<bool>,
    /// Amplitudes that satisfy both, at this bias: `[low, high]` (high `null` when
    /// unbounded, static drive); `None` when none does.
    pub amplitude_window_v: Option<[Option<f64>; 2]>,
    /// The bias divisor `√N + 1` that maximises the selection ratio.
    pub best_bias_divisor: f64,
    /// The amplitude window at the best bias.
    pub best_bias_amplitude_window_v: Option<[Option<f64>; 2]>,
    /// Selection ratio `Von/Voff` at the chosen bias; `None` for static drive (no
    /// unselected level).
    pub selection_ratio: Option<f64>,
    /// `Vsat/Vth`.
    pub ratio_needed: f64,
}

/// The plan of one artwork.
#[derive(Debug, Clone, Serialize)]
pub struct Plan {
    /// Resistance, capacitance, RC.
    pub electrical: electrical::Electrical,
    /// Drive voltages.
    pub drive: DrivePlan,
    /// Gaps, spacer, rubbing, polarizers.
    pub optics: optics::Optics,
}

fn window(w: Option<(f64, f64)>) -> Option<[Option<f64>; 2]> {
    let r = |v: f64| (v * 1e3).round() / 1e3;
    w.map(|(lo, hi)| [Some(r(lo)), hi.is_finite().then(|| r(hi))])
}

/// The drive plan of an artwork's drive and cell.
pub fn drive_plan(art: &Artwork) -> DrivePlan {
    let c = &art.cell;
    let n = art.drive.commons.max(1);
    let a = if n > 1 { f64::from(art.drive.bias.unwrap_or(3)) } else { 1.0 };
    let von = c.voltage.map(|v| v_on(n, a, v));
    let voff = c.voltage.map(|v| v_off(n, a, v));
    DrivePlan {
        commons: n,
        bias_divisor: a,
        threshold_v: c.threshold,
        saturation_v: c.saturation,
        voltage_v: c.voltage,
        v_on: von,
        v_off: voff,
        on_saturates: von.map(|x| x >= c.saturation),
        off_below_threshold: voff.map(|x| x <= c.threshold),
        amplitude_window_v: window(amplitude_window(n, a, c.threshold, c.saturation)),
        best_bias_divisor: if n > 1 { best_bias(n) } else { 1.0 },
        best_bias_amplitude_window_v: window(amplitude_window(n, if n > 1 { best_bias(n) } else { 1.0 }, c.threshold, c.saturation)),
        selection_ratio: (n > 1).then(|| selection_ratio(n, a)),
        ratio_needed: c.saturation / c.threshold,
    }
}

/// Plans an artwork.
pub fn plan(art: &Artwork, ex: &Extraction) -> Plan {
    Plan { electrical: electrical::electrical(art, ex), drive: drive_plan(art), optics: optics::optics(&art.cell) }
}

/// Plans an artwork, extracting its connectivity first.
pub fn plan_artwork(art: &Artwork) -> Plan {
    plan(art, &Extraction::extract(art))
}

/// Centre of the window: where findings about the whole glass are placed.
fn centre(art: &Artwork) -> crate::geom::Pt {
    use geo::Centroid;
    art.window.centroid().map(|c| c.0).unwrap_or_default()
}

/// The warnings of a plan: every line whose RC exceeds `rc_limit` of the frame period
/// (`line-rc`), and a drive amplitude that leaves selected pixels short of saturation or
/// non-selected ones above threshold (`drive-margin`).
pub fn findings(art: &Artwork, plan: &Plan) -> Vec<Finding> {
    let mut out = Vec::new();
    let e = &plan.electrical;
    for l in e.lines.iter().filter(|l| l.rc_of_frame > e.rc_limit) {
        let pins: Vec<u32> = art.pins.iter().filter(|p| p.net == l.net).map(|p| p.number).collect();
        let at = art.pins.iter().find(|p| p.net == l.net).map(|p| {
            use geo::Centroid;
            p.pad.centroid().map(|c| c.0).unwrap_or_default()
        });
        out.push(Finding {
            rule: Rule::LineRc,
            severity: Severity::Warning,
            plate: None,
            nets: vec![l.net.clone()],
            location: at.unwrap_or_else(|| centre(art)),
            measured: Some(l.rc_of_frame),
            required: Some(e.rc_limit),
            message: format!(
                "{} (pin {:?}): Elmore delay to its farthest part {:.2} µs ({:.0} Ω of lead on the way there, {:.0} Ω in all its branches, {:.1} pF in all), {:.2} % of the {:.2} ms frame (limit {:.2} %)",
                l.net,
                pins,
                l.rc_us,
                l.way_resistance_ohm,
                l.lead_resistance_ohm,
                l.capacitance_on_pf,
                100.0 * l.rc_of_frame,
                e.frame_period_ms,
                100.0 * e.rc_limit
            ),
        });
    }
    let d = &plan.drive;
    if let (Some(v), Some(von), Some(voff)) = (d.voltage_v, d.v_on, d.v_off) {
        let mut wrong = Vec::new();
        if von < d.saturation_v {
            wrong.push(format!("Von {von:.3} V is below saturation {:.3} V (selected pixels not fully dark)", d.saturation_v));
        }
        if voff > d.threshold_v {
            wrong.push(format!("Voff {voff:.3} V is above threshold {:.3} V (unselected pixels start to show)", d.threshold_v));
        }
        if !wrong.is_empty() {
            let advice = match d.amplitude_window_v {
                Some([Some(lo), Some(hi)]) => format!("amplitudes from {lo} V to {hi} V work at this bias"),
                Some([Some(lo), None]) => format!("amplitudes from {lo} V up work"),
                _ => format!(
                    "no amplitude works at this duty and bias: the mixture needs a selection ratio of {:.3}, the drive gives {:.3}",
                    d.ratio_needed,
                    d.selection_ratio.unwrap_or(0.0)
                ),
            };
            out.push(Finding {
                rule: Rule::DriveMargin,
                severity: Severity::Warning,
                plate: None,
                nets: vec![],
                location: centre(art),
                measured: Some(v),
                required: None,
                message: format!("at {v} V: {}; {advice}", wrong.join("; ")),
            });
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// 1/4 duty, bias 1/3, Vth 1.5, Vsat 2.2 (the defaults): 4 V lies in the window
    /// 3.81–4.5 V (Alt & Pleshko 1974: Von = V/√3, Voff = V/3) and gives no warning;
    /// 3 V leaves Von = 1.73 V short of saturation; 5 V lifts Voff to 1.67 V.
    #[test]
    fn drive_margin_both_ways() {
        let mut art = crate::check::fixture::clean();
        art.drive = crate::layout::Drive { commons: 4, bias: Some(3) };
        for (v, warn, text) in [(4.0, false, ""), (3.0, true, "below saturation"), (5.0, true, "above threshold")] {
            art.cell.voltage = Some(v);
            let p = Plan { electrical: electrical::electrical(&art, &Extraction::extract(&art)), drive: drive_plan(&art), optics: optics::optics(&art.cell) };
            let f: Vec<Finding> = findings(&art, &p).into_iter().filter(|f| f.rule == Rule::DriveMargin).collect();
            assert_eq!(f.len(), usize::from(warn), "{v} V: {f:?}");
            if warn {
                assert!(f[0].message.contains(text) && f[0].message.contains("3.811 V to 4.5 V"), "{}", f[0].message);
            }
        }
        assert!((drive_plan(&art).v_on.unwrap() - 5.0 / 3f64.sqrt()).abs() < 1e-12);
    }

    /// The clean fixture's lines have a few kilohms of lead and some hundred pF: far
    /// below 2 % of a 15.6 ms frame; a limit of 1e-9 of the frame flags every line.
    #[test]
    fn line_rc_against_the_limit() {
        let mut art = crate::check::fixture::clean();
        let p = plan_artwork(&art);
        assert!(findings(&art, &p).is_empty());
        art.cell.rc_limit = 1e-9;
        let p = plan_artwork(&art);
        let f = findings(&art, &p);
        assert_eq!(f.iter().filter(|f| f.rule == Rule::LineRc).count(), 3, "{f:?}");
    }
}
