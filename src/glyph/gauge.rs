//! Gauges: an icon entry with `gauge:` → one element per part (`BATT.shell`, `BATT.1`,
//! …), every part drawn from its own icon in the same box, so the parts line up as the
//! font drew them.
//!
//! Two checks keep the parts usable as separate electrodes: at the layout's size and
//! stroke they must keep the minimum gap from each other, and no part may lie inside a
//! hole of another. The second is topology, not taste: every part needs its own lead to
//! the pads, a lead on the front plate cannot cross another part, so a part enclosed by
//! a closed shell could never be connected. Shells of gauges leave an opening instead
//! (fonts-strokes/icons.strokes).

use super::fonts::Fonts;
use super::icon::named;
use super::outline::finish;
use super::{Element, ElementKind};
use crate::geom::{Region, distance, interior_point};
use crate::layout::{GaugePart, Icon, IconShape, Layout, gauge_part_net};
use crate::{Error, Result};
use geo::Contains;

/// Builds every part of a gauge icon as its own element.
pub fn build_gauge(layout: &Layout, fonts: &Fonts, i: &Icon) -> Result<Vec<Element>> {
    let IconShape::Gauge { gauge, parts, at, size, stroke } = &i.shape else {
        return Err(Error::Bug(format!("{}: not a gauge", i.key)));
    };
    let problem = |field: &str, m: String, allowed: Option<String>| {
        Error::input(layout.problem(&format!("{}.{field}", i.key), m, allowed))
    };
    let mut regions: Vec<Region> = Vec::new();
    for p in parts {
        let r = named(fonts, &p.icon, *at, *size, *stroke, layout.tolerance)
            .map_err(|e| problem(e.field, e.message, e.allowed))?;
        let r = finish(&r).map_err(|e| Error::Bug(format!("{}: {e}", p.icon)))?;
        regions.push(r);
    }
    if let Some(m) = enclosed(parts, &regions) {
        return Err(problem(
            "gauge",
            m,
            Some("a gauge whose shell leaves an opening for the leads of the parts inside it".into()),
        ));
    }
    let gap = layout.rules.min_gap;
    if let Some((a, b, d)) = closest_pair(&regions).filter(|t| t.2 < gap - 1e-9) {
        let how = if d <= 1e-9 { "touch".to_string() } else { format!("come within {d:.4} mm of each other") };
        return Err(problem(
            "stroke",
            format!(
                "parts `{}` and `{}` of gauge `{gauge}` {how} at size {size} mm and stroke {stroke} mm",
                parts[a].icon, parts[b].icon
            ),
            Some(format!("a larger size or a thinner stroke, keeping rules.min_gap ({gap} mm) between parts")),
        ));
    }
    Ok(parts
        .iter()
        .zip(regions)
        .map(|(p, outline)| Element {
            name: gauge_part_net(&i.name, &p.suffix),
            kind: ElementKind::Icon,
            body: outline.clone(),
            outline,
            digit: None,
            drives: if p.suffix == "shell" {
                format!("gauge {gauge} shell")
            } else {
                format!("gauge {gauge} bar {}", p.suffix)
            },
            key: i.key.clone(),
        })
        .collect())
}

/// A message when some part lies inside a hole of another part.
fn enclosed(parts: &[GaugePart], regions: &[Region]) -> Option<String> {
    for (a, ra) in regions.iter().enumerate() {
        let Some(inner) = ra.0.first().and_then(interior_point) else { continue };
        for (b, rb) in regions.iter().enumerate() {
            let holes = rb.0.iter().flat_map(|p| p.interiors());
            if a != b && holes.map(|h| geo::Polygon::new(h.clone(), vec![])).any(|h| h.contains(&geo::Point(inner))) {
                return Some(format!(
                    "part `{}` lies inside a hole of part `{}`: its lead could not get out to the pads",
                    parts[a].icon, parts[b].icon
                ));
            }
        }
    }
    None
}

/// The two parts nearest each other and their distance.
fn closest_pair(regions: &[Region]) -> Option<(usize, usize, f64)> {
    let mut best: Option<(usize, usize, f64)> = None;
    for a in 0..regions.len() {
        for b in a + 1..regions.len() {
            let d = regions[a]
                .0
                .iter()
                .flat_map(|p| regions[b].0.iter().map(move |q| distance(p, q)))
                .fold(f64::INFINITY, f64::min);
            if best.is_none_or(|t| d < t.2) {
                best = Some((a, b, d));
            }
        }
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{area, pt};
    use crate::layout::FontSource;

    fn gauge(name: &str, gauge: &str, size: f64, stroke: f64) -> Icon {
        let names = ["shell", "1", "2", "3", "4"];
        let f = Fonts::builtin().unwrap();
        let mut parts = Vec::new();
        for s in names {
            let icon = if s == "shell" { format!("{gauge}-shell") } else { format!("{gauge}-bar-{s}") };
            if f.icon(&icon).is_some() {
                parts.push(GaugePart { suffix: s.into(), icon });
            }
        }
        Icon {
            name: name.into(),
            shape: IconShape::Gauge { gauge: gauge.into(), parts, at: pt(10.0, 12.0), size, stroke },
            key: "icons[0]".into(),
        }
    }

    #[test]
    fn a_battery_gauge_is_one_element_per_part() {
        let l = crate::glyph::testkit::empty_layout();
        let e = build_gauge(&l, Fonts::builtin().unwrap(), &gauge("BATT", "battery", 6.0, 0.3)).unwrap();
        let names: Vec<&str> = e.iter().map(|x| x.name.as_str()).collect();
        assert_eq!(names, ["BATT.shell", "BATT.1", "BATT.2", "BATT.3"]);
        assert_eq!(e[2].drives, "gauge battery bar 2");
        // The parts' ink is the whole battery icon's ink less the shell's opening: they
        // never overlap, so their areas add up.
        let whole = named(Fonts::builtin().unwrap(), "battery", pt(10.0, 12.0), 6.0, 0.3, l.tolerance).unwrap();
        let parts: f64 = e.iter().map(|x| area(&x.outline)).sum();
        let united = area(&crate::geom::union_all(e.iter().flat_map(|x| x.outline.0.clone())));
        assert!((parts - united).abs() < 1e-6, "parts overlap: {parts} vs {united}");
        assert!(parts < area(&whole) && parts > 0.8 * area(&whole), "{parts} vs {}", area(&whole));
    }

    #[test]
    fn signal_bars_have_no_shell() {
        let l = crate::glyph::testkit::empty_layout();
        let e = build_gauge(&l, Fonts::builtin().unwrap(), &gauge("SIG", "signal", 5.0, 0.3)).unwrap();
        assert_eq!(e.iter().map(|x| x.name.as_str()).collect::<Vec<_>>(), ["SIG.1", "SIG.2", "SIG.3", "SIG.4"]);
    }

    #[test]
    fn parts_closer_than_the_gap_are_refused_at_the_stroke() {
        let l = crate::glyph::testkit::empty_layout();
        let Err(Error::Input(p)) = build_gauge(&l, Fonts::builtin().unwrap(), &gauge("B", "battery", 3.0, 0.7)) else {
            panic!("accepted")
        };
        assert_eq!(p[0].key, "icons[0].stroke");
        assert!(p[0].message.contains("`battery-shell` and `battery-bar-1` of gauge `battery` touch"), "{}", p[0].message);
    }

    /// A closed shell traps the bar inside it: refused, naming both parts.
    #[test]
    fn a_part_inside_a_closed_shell_is_refused() {
        let mut l = crate::glyph::testkit::empty_layout();
        l.extra_fonts.push(FontSource {
            path: "box.strokes".into(),
            text: "strokes 1\nicon box-shell 10\n  box 0 0 10 10\nicon box-bar-1 10\n  block 4 4 6 6\n".into(),
        });
        let f = Fonts::with_extra(&l.extra_fonts).unwrap();
        let parts = vec![
            GaugePart { suffix: "shell".into(), icon: "box-shell".into() },
            GaugePart { suffix: "1".into(), icon: "box-bar-1".into() },
        ];
        let i = Icon {
            name: "BOX".into(),
            shape: IconShape::Gauge { gauge: "box".into(), parts, at: pt(10.0, 12.0), size: 6.0, stroke: 0.3 },
            key: "icons[2]".into(),
        };
        let Err(Error::Input(p)) = build_gauge(&l, &f, &i) else { panic!("accepted") };
        assert_eq!(p[0].key, "icons[2].gauge");
        assert!(p[0].message.contains("`box-bar-1` lies inside a hole of part `box-shell`"), "{}", p[0].message);
    }
}
