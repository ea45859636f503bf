//! Resolution of the cell's data: `mixture`, `electrical` and `optics` → [`Cell`].
//!
//! Takes the raw mappings and the resolved `cell_gap`, gives the cell with every default
//! filled (docs/layout-format.md, *mixture*, *electrical*, *optics*). Each value is a
//! number, or a number followed by its unit (`2.2V`, `64 Hz`, `50 ohm`, `550nm`); a value
//! outside its plausible range is refused at its key with the range.

use super::problems::Problems;
use super::raw::RawLayout;
use super::scalar::{Scalar, ScalarKind};
use crate::layout::{Cell, Viewing};

/// A plain quantity: its unit words (the first is the canonical one, empty for none),
/// the factor each unit multiplies by, and the range allowed after conversion.
struct Quantity {
    units: &'static [(&'static str, f64)],
    range: (f64, f64),
    allowed: &'static str,
}

impl Quantity {
    /// Reads the value at `key`, or gives `default` when the key is absent.
    fn read(&self, p: &mut Problems, v: Option<&Scalar>, key: &str, default: f64) -> f64 {
        let Some(v) = v else { return default };
        let value = match v.kind {
            ScalarKind::Number(x) if x.is_finite() => Some(x),
            ScalarKind::Integer(i) => Some(i as f64),
            ScalarKind::Text => self.parse(&v.text),
            _ => None,
        };
        match value {
            Some(x) if x >= self.range.0 && x <= self.range.1 => x,
            Some(x) => {
                p.bad(key, format!("{} is outside the plausible range", super::read::number(x)), self.allowed);
                default
            }
            None => {
                p.bad(key, format!("`{}` is not a number with a known unit", v.text.trim()), self.allowed);
                default
            }
        }
    }

    fn parse(&self, text: &str) -> Option<f64> {
        let t = text.trim();
        let end = t.find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E'))).unwrap_or(t.len());
        let (num, unit) = t.split_at(end);
        let x: f64 = num.trim().parse().ok().filter(|x: &f64| x.is_finite())?;
        let unit = unit.trim();
        self.units.iter().find(|(u, _)| *u == unit).map(|(_, f)| x * f)
    }
}

const PLAIN: &[(&str, f64)] = &[("", 1.0)];
const VOLTS: &[(&str, f64)] = &[("", 1.0), ("V", 1.0), ("mV", 1e-3)];
const HERTZ: &[(&str, f64)] = &[("", 1.0), ("Hz", 1.0)];
const OHMS: &[(&str, f64)] = &[("", 1.0), ("ohm", 1.0), ("Ω", 1.0), ("ohm/sq", 1.0), ("Ω/sq", 1.0)];
const NANOMETRES: &[(&str, f64)] = &[("", 1.0), ("nm", 1.0), ("um", 1e3), ("µm", 1e3), ("μm", 1e3)];

/// The cell of a layout: `cell_gap` (mm) and the three mappings.
pub fn cell(p: &mut Problems, raw: &RawLayout, gap: f64) -> Cell {
    let d = Cell::with_gap(gap);
    let m = raw.mixture.as_ref();
    let e = raw.electrical.as_ref();
    let o = raw.optics.as_ref();
    let birefringence = Quantity { units: PLAIN, range: (0.01, 0.5), allowed: "a birefringence Δn from 0.01 to 0.5" };
    let permittivity = Quantity { units: PLAIN, range: (1.0, 100.0), allowed: "a relative permittivity from 1 to 100" };
    let volts = Quantity { units: VOLTS, range: (0.1, 100.0), allowed: "volts rms from 0.1 to 100, e.g. `2.2` or `2.2V`" };
    let cell = Cell {
        gap,
        birefringence: birefringence.read(p, m.and_then(|m| m.birefringence.as_ref()), "mixture.birefringence", d.birefringence),
        permittivity_parallel: permittivity.read(
            p,
            m.and_then(|m| m.permittivity_parallel.as_ref()),
            "mixture.permittivity_parallel",
            d.permittivity_parallel,
        ),
        permittivity_perpendicular: permittivity.read(
            p,
            m.and_then(|m| m.permittivity_perpendicular.as_ref()),
            "mixture.permittivity_perpendicular",
            d.permittivity_perpendicular,
        ),
        threshold: volts.read(p, m.and_then(|m| m.threshold.as_ref()), "mixture.threshold", d.threshold),
        saturation: volts.read(p, m.and_then(|m| m.saturation.as_ref()), "mixture.saturation", d.saturation),
        sheet_resistance: Quantity {
            units: OHMS,
            range: (0.1, 100_000.0),
            allowed: "ohms per square from 0.1 to 100000, e.g. `50` or `50 ohm/sq`",
        }
        .read(p, e.and_then(|e| e.sheet_resistance.as_ref()), "electrical.sheet_resistance", d.sheet_resistance),
        frame_rate: Quantity { units: HERTZ, range: (1.0, 10_000.0), allowed: "hertz from 1 to 10000, e.g. `64` or `64Hz`" }
            .read(p, e.and_then(|e| e.frame_rate.as_ref()), "electrical.frame_rate", d.frame_rate),
        rc_limit: Quantity { units: PLAIN, range: (1e-6, 1.0), allowed: "a fraction of the frame period, above 0 and at most 1" }
            .read(p, e.and_then(|e| e.rc_limit.as_ref()), "electrical.rc_limit", d.rc_limit),
        voltage: e.and_then(|e| e.voltage.as_ref()).map(|v| volts.read(p, Some(v), "electrical.voltage", 1.0)),
        wavelength_nm: Quantity {
            units: NANOMETRES,
            range: (300.0, 1000.0),
            allowed: "a wavelength from 300nm to 1000nm (a bare number is nm)",
        }
        .read(p, o.and_then(|o| o.wavelength.as_ref()), "optics.wavelength", d.wavelength_nm),
        viewing: p.word(
            o.and_then(|o| o.viewing.as_ref()),
            "optics.viewing",
            &[("bottom", Viewing::Bottom), ("top", Viewing::Top), ("left", Viewing::Left), ("right", Viewing::Right)],
            Some(d.viewing),
        ),
    };
    if p.clean(&["mixture"]) && cell.saturation <= cell.threshold {
        p.bad(
            "mixture.saturation",
            format!("saturation {} V is not above threshold {} V", cell.saturation, cell.threshold),
            "a saturation voltage above the threshold voltage",
        );
    }
    if p.clean(&["mixture"]) && cell.permittivity_parallel < cell.permittivity_perpendicular {
        p.bad(
            "mixture.permittivity_parallel",
            "ε∥ below ε⊥ describes a mixture a TN cell cannot switch".to_string(),
            "ε∥ at least ε⊥ (positive dielectric anisotropy)",
        );
    }
    cell
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::path::Path;

    fn resolve(yaml: &str) -> (Cell, Problems) {
        let raw: RawLayout = serde_yaml::from_str(yaml).unwrap();
        let mut p = Problems::new(Path::new("t.yaml"), Default::default(), Default::default());
        (cell(&mut p, &raw, 0.007), p)
    }

    #[test]
    fn defaults_and_units() {
        let (c, p) = resolve("name: x\n");
        assert!(p.is_empty());
        assert_eq!(c, Cell::with_gap(0.007));
        let (c, p) = resolve(
            "mixture: {threshold: 1500mV, saturation: 2.5V}\nelectrical: {frame_rate: 80 Hz, voltage: 5, sheet_resistance: 30 ohm/sq}\noptics: {wavelength: 0.55um, viewing: top}\n",
        );
        assert!(p.is_empty());
        assert!((c.threshold - 1.5).abs() < 1e-12 && (c.wavelength_nm - 550.0).abs() < 1e-9);
        assert_eq!((c.frame_rate, c.voltage, c.sheet_resistance, c.viewing), (80.0, Some(5.0), 30.0, Viewing::Top));
    }

    #[test]
    fn bad_values_are_reported_at_their_keys() {
        let (_, p) = resolve("mixture: {birefringence: 2}\noptics: {wavelength: 5cm, viewing: sideways}\nelectrical: {frame_rate: 64kHz}\n");
        let mut keys: Vec<String> = p.into_sorted().into_iter().map(|q| q.key).collect();
        let (_, p) = resolve("mixture: {threshold: 3V, saturation: 2V}\n");
        keys.extend(p.into_sorted().into_iter().map(|q| q.key));
        for k in ["mixture.birefringence", "mixture.saturation", "optics.wavelength", "optics.viewing", "electrical.frame_rate"] {
            assert!(keys.iter().any(|x| x == k), "{k} not in {keys:?}");
        }
    }
}
