//! The optical side of the plan: cell gaps at the Gooch & Tarry minima, the spacer, the
//! rubbing directions of both plates and the polarizer axes for the viewing side
//! (docs/background.md, *Optics: the first minimum* and *Rubbing and polarizers*).
//!
//! Takes the cell's data, gives numbers only (no geometry), so the films' notes can
//! carry them too.

use crate::layout::{Cell, Viewing};
use serde::Serialize;

/// Gap of the m-th Gooch & Tarry minimum (m = 1, 2, …) in µm: `u = 2·d·Δn/λ = √(4m² − 1)`
/// (C. H. Gooch and H. A. Tarry, J. Phys. D 8, 1575, 1975), so
/// `d = √(4m² − 1) · λ / (2·Δn)`.
///
/// ```
/// // Δn 0.15 at 550 nm: first minimum at √3 · 0.55 / 0.3 = 3.175 µm.
/// let d = segmask::plan::optics::minimum_gap_um(1, 0.15, 550.0);
/// assert!((d - 3.175).abs() < 1e-3);
/// ```
pub fn minimum_gap_um(m: u32, birefringence: f64, wavelength_nm: f64) -> f64 {
    let u = (4.0 * f64::from(m * m) - 1.0).sqrt();
    u * wavelength_nm * 1e-3 / (2.0 * birefringence)
}

/// The optical plan.
#[derive(Debug, Clone, Serialize)]
pub struct Optics {
    /// Birefringence Δn used.
    pub birefringence: f64,
    /// Wavelength, nm.
    pub wavelength_nm: f64,
    /// Cell gap of the first minimum (u = √3), µm.
    pub first_minimum_gap_um: f64,
    /// Cell gap of the second minimum (u = √15), µm.
    pub second_minimum_gap_um: f64,
    /// The layout's cell gap, µm.
    pub cell_gap_um: f64,
    /// `u = 2·d·Δn/λ` at the layout's gap.
    pub u: f64,
    /// Diameter of the spacers that hold the layout's gap, µm (the gap itself).
    pub spacer_um: f64,
    /// Side the viewer looks from.
    pub viewing: &'static str,
    /// Direction the front plate's alignment layer is rubbed, degrees counter-clockwise
    /// from +x as the viewer sees the display.
    pub front_rubbing_deg: f64,
    /// Direction the back plate's alignment layer is rubbed, same frame.
    pub back_rubbing_deg: f64,
    /// Transmission axis of the front polarizer (an axis: modulo 180°).
    pub front_polarizer_deg: f64,
    /// Transmission axis of the back polarizer, crossed with the front one.
    pub back_polarizer_deg: f64,
    /// The twist from the back plate to the front, as the viewer sees it.
    pub twist: &'static str,
}

/// Angle of the viewing side, degrees from +x (bottom = 270°).
fn viewing_angle(v: Viewing) -> f64 {
    match v {
        Viewing::Right => 0.0,
        Viewing::Top => 90.0,
        Viewing::Left => 180.0,
        Viewing::Bottom => 270.0,
    }
}

fn norm(a: f64, modulo: f64) -> f64 {
    let r = a.rem_euclid(modulo);
    if (r - modulo).abs() < 1e-9 { 0.0 } else { r }
}

/// The optical plan of a cell.
///
/// Rubbing (docs/background.md, *Rubbing and polarizers*): the two directions are 90°
/// apart and 45° off the edges, with `back − front` pointing to the viewer's side, so that
/// the middle of the layer tilts up towards the viewer: for the bottom (6 o'clock) side
/// the front plate is rubbed at 135° and the back at 225°. The polarizers are crossed
/// (normally white: dark segments on a light ground), each along its own plate's rubbing.
pub fn optics(cell: &Cell) -> Optics {
    let turn = viewing_angle(cell.viewing) - 270.0;
    let front = norm(135.0 + turn, 360.0);
    let back = norm(225.0 + turn, 360.0);
    let gap_um = cell.gap * 1e3;
    Optics {
        birefringence: cell.birefringence,
        wavelength_nm: cell.wavelength_nm,
        first_minimum_gap_um: round3(minimum_gap_um(1, cell.birefringence, cell.wavelength_nm)),
        second_minimum_gap_um: round3(minimum_gap_um(2, cell.birefringence, cell.wavelength_nm)),
        cell_gap_um: round3(gap_um),
        u: round3(2.0 * gap_um * cell.birefringence / (cell.wavelength_nm * 1e-3)),
        spacer_um: round3(gap_um),
        viewing: cell.viewing.name(),
        front_rubbing_deg: front,
        back_rubbing_deg: back,
        front_polarizer_deg: norm(front, 180.0),
        back_polarizer_deg: norm(back, 180.0),
        twist: "90°, clockwise from back to front as the viewer sees it (the chiral dopant must give this sense)",
    }
}

/// Two lines for the films' notes, in the characters the film's stroke font draws
/// (it sets capitals, so no µ or °).
pub fn note_lines(cell: &Cell) -> [String; 2] {
    let o = optics(cell);
    [
        format!(
            "CELL GAP {} UM, SPACERS {} UM - FIRST MINIMUM {} UM, SECOND {} UM (DN {} AT {} NM)",
            o.cell_gap_um, o.spacer_um, o.first_minimum_gap_um, o.second_minimum_gap_um, o.birefringence, o.wavelength_nm
        ),
        format!(
            "VIEWED FROM {}: RUB FRONT {} DEG, BACK {} DEG - POLARIZERS FRONT {} DEG, BACK {} DEG (CROSSED)",
            o.viewing.to_uppercase(),
            o.front_rubbing_deg,
            o.back_rubbing_deg,
            o.front_polarizer_deg,
            o.back_polarizer_deg
        ),
    ]
}

fn round3(v: f64) -> f64 {
    (v * 1e3).round() / 1e3
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Gooch & Tarry (J. Phys. D 8, 1975): first minimum at u = √3, second at u = √15;
    /// with Δn = 0.15 at 550 nm, d = 3.18 µm and 7.10 µm (computed: √3·0.55/0.3 = 3.175,
    /// √15·0.55/0.3 = 7.100).
    #[test]
    fn gooch_tarry_minima() {
        let d1 = minimum_gap_um(1, 0.15, 550.0);
        let d2 = minimum_gap_um(2, 0.15, 550.0);
        assert!((d1 - 3.18).abs() < 0.005, "{d1}");
        assert!((d2 - 7.10).abs() < 0.005, "{d2}");
        // u back from d: 2·d·Δn/λ.
        assert!((2.0 * d1 * 0.15 / 0.55 - 3f64.sqrt()).abs() < 1e-12);
        assert!((2.0 * d2 * 0.15 / 0.55 - 15f64.sqrt()).abs() < 1e-12);
    }

    /// The rubbing directions are 90° apart, the polarizers crossed, and back − front
    /// points to the viewing side for every side.
    #[test]
    fn rubbing_points_to_the_viewer() {
        for (v, angle) in [(Viewing::Bottom, 270.0f64), (Viewing::Top, 90.0), (Viewing::Left, 180.0), (Viewing::Right, 0.0)] {
            let mut cell = Cell::with_gap(0.007);
            cell.viewing = v;
            let o = optics(&cell);
            let (f, b) = (o.front_rubbing_deg.to_radians(), o.back_rubbing_deg.to_radians());
            assert!((f.cos() * b.cos() + f.sin() * b.sin()).abs() < 1e-12, "{v:?} not 90° apart");
            let (dx, dy) = (b.cos() - f.cos(), b.sin() - f.sin());
            let a = angle.to_radians();
            assert!((dx * a.cos() + dy * a.sin() - 2f64.sqrt()).abs() < 1e-9, "{v:?}: {o:?}");
            assert!(((o.front_polarizer_deg - o.back_polarizer_deg).abs() - 90.0).abs() < 1e-9);
        }
    }
}
