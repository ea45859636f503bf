//! Icons: named stroke icons from the font files, and shapes drawn in the layout
//! (rectangle, circle, ring, polygon, SVG path).
//!
//! Takes one [`IconShape`]; gives its outline, or a message saying what is wrong and what
//! is allowed. Named icons are scaled so that their ink fills the `size` box at `at`:
//! centre lines span `size − stroke`, half a stroke in from the box edges.

use super::fonts::Fonts;
use super::ink::{Pen, ink};
use crate::geom::path::{PATH_COMMANDS, parse_svg_path};
use crate::geom::{Polygon, Pt, Region, circle, fill_even_odd, pt, region_of, ring, rounded_rect};
use crate::layout::IconShape;
use geo::{LineString, Validation};

/// Why an icon could not be built: the key under the icon entry, the message and what is
/// allowed.
#[derive(Debug, Clone, PartialEq)]
pub struct IconProblem {
    /// Key below the icon's own key (`icon`, `corner`, `d`, …).
    pub field: &'static str,
    /// What is wrong.
    pub message: String,
    /// What is allowed.
    pub allowed: Option<String>,
}

fn problem(field: &'static str, message: impl Into<String>, allowed: Option<String>) -> IconProblem {
    IconProblem { field, message: message.into(), allowed }
}

/// Short description of the shape, for `Element::drives`.
pub fn describe(shape: &IconShape) -> String {
    match shape {
        IconShape::Named { icon, .. } => format!("icon {icon}"),
        IconShape::Gauge { gauge, .. } => format!("gauge {gauge}"),
        IconShape::Rectangle { .. } => "rectangle icon".into(),
        IconShape::Circle { .. } => "circle icon".into(),
        IconShape::Ring { .. } => "ring icon".into(),
        IconShape::Polygon { .. } => "polygon icon".into(),
        IconShape::Path { .. } => "path icon".into(),
    }
}

/// Builds the outline of one icon shape.
pub fn build_icon(fonts: &Fonts, shape: &IconShape, tol: f64) -> Result<Region, IconProblem> {
    match shape {
        IconShape::Named { icon, at, size, stroke } => named(fonts, icon, *at, *size, *stroke, tol),
        // All parts together, as the whole gauge looks with every part on (the glyph stage
        // makes one element per part, `gauge.rs`).
        IconShape::Gauge { parts, at, size, stroke, .. } => {
            let mut all = Vec::new();
            for p in parts {
                all.extend(named(fonts, &p.icon, *at, *size, *stroke, tol)?.0);
            }
            Ok(crate::geom::union_all(all))
        }
        IconShape::Rectangle { at, width, height, corner } => {
            if !(*width > 0.0 && *height > 0.0) {
                return Err(problem(
                    "width",
                    format!("a {width} × {height} mm rectangle"),
                    Some("width and height above 0".into()),
                ));
            }
            let limit = width.min(*height) / 2.0;
            if *corner < 0.0 || *corner > limit + 1e-12 {
                return Err(problem(
                    "corner",
                    format!("corner radius {corner} mm does not fit"),
                    Some(format!("0 to {limit} mm (half the shorter side)")),
                ));
            }
            Ok(region_of([rounded_rect(at.x, at.y, at.x + width, at.y + height, *corner, tol)]))
        }
        IconShape::Circle { centre, radius } => {
            if *radius <= 0.0 {
                return Err(problem("radius", format!("radius {radius} mm"), Some("above 0".into())));
            }
            Ok(region_of([circle(*centre, *radius, tol)]))
        }
        IconShape::Ring { centre, outer, inner } => {
            if !(*inner > 0.0 && inner < outer && outer.is_finite()) {
                return Err(problem(
                    "inner",
                    format!("inner radius {inner} mm must be above 0 and below the outer radius {outer} mm"),
                    None,
                ));
            }
            Ok(region_of([ring(*centre, *outer, *inner, tol)]))
        }
        IconShape::Polygon { points } => polygon(points),
        IconShape::Path { d, at } => path(d, *at, tol),
    }
}

/// A named icon from the fonts, its ink filling the `size` box at `at`.
pub fn named(fonts: &Fonts, icon: &str, at: Pt, size: f64, stroke: f64, tol: f64) -> Result<Region, IconProblem> {
    let Some(def) = fonts.icon(icon) else {
        return Err(problem("icon", format!("there is no icon `{icon}`"), Some(fonts.icon_names().join(", "))));
    };
    if !(stroke > 0.0 && stroke < size) {
        return Err(problem(
            "stroke",
            format!("stroke {stroke} mm must be above 0 and below the size {size} mm"),
            None,
        ));
    }
    let pen = Pen { scale: size - stroke, origin: pt(at.x + stroke / 2.0, at.y + stroke / 2.0), stroke, tol };
    Ok(ink(&def.marks, &pen))
}

fn polygon(points: &[Pt]) -> Result<Region, IconProblem> {
    let mut v = points.to_vec();
    v.dedup();
    if v.len() > 1 && v.first() == v.last() {
        v.pop();
    }
    if v.len() < 3 {
        return Err(problem("points", "a polygon needs at least 3 different points", None));
    }
    v.push(v[0]);
    let p = Polygon::new(LineString::from(v), vec![]);
    if let Err(e) = p.check_validation() {
        return Err(problem(
            "points",
            format!("the polygon is not simple: {e}"),
            Some("a closed outline that does not cross or touch itself".into()),
        ));
    }
    Ok(region_of([p]))
}

fn path(d: &str, at: Pt, tol: f64) -> Result<Region, IconProblem> {
    let subs = parse_svg_path(d).map_err(|e| problem("d", e.to_string(), Some(PATH_COMMANDS.into())))?;
    let rings: Vec<Vec<Pt>> = subs.iter().map(|s| s.mapped(1.0, at.x, at.y).flatten(tol)).collect();
    if let Some(i) = rings.iter().position(|r| r.len() < 3) {
        return Err(problem(
            "d",
            format!("sub-path {} encloses no area", i + 1),
            Some("closed outlines (a fill ignores lines)".into()),
        ));
    }
    let r = fill_even_odd(&rings);
    if r.0.is_empty() {
        return Err(problem("d", "the path encloses no area", None));
    }
    Ok(r)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::area;
    use geo::{BoundingRect, Validation};
    use std::f64::consts::PI;

    fn fonts() -> &'static Fonts {
        Fonts::builtin().unwrap()
    }

    #[test]
    fn every_builtin_icon_fills_its_box() {
        let f = fonts();
        assert!(f.icon_names().len() >= 12);
        for name in f.icon_names() {
            for (size, stroke) in [(8.0, 0.4), (3.0, 0.25)] {
                let shape = IconShape::Named { icon: name.into(), at: pt(20.0, 10.0), size, stroke };
                let r = build_icon(f, &shape, 1e-3).unwrap();
                assert!(!r.0.is_empty() && area(&r) > 0.02 * size * size, "{name}");
                assert!(r.is_valid(), "{name}: {:?}", r.validation_errors());
                let bb = r.bounding_rect().unwrap();
                let e = 1e-6;
                assert!(bb.min().x >= 20.0 - e && bb.min().y >= 10.0 - e, "{name} {bb:?}");
                assert!(bb.max().x <= 20.0 + size + e && bb.max().y <= 10.0 + size + e, "{name} {bb:?}");
            }
        }
    }

    /// The flattened circle has its vertices on the circle, so it lies inside and falls
    /// short of πr² by at most perimeter × tolerance (the chord sagitta bound).
    #[test]
    fn circle_area_within_tolerance() {
        for tol in [1e-2, 1e-3, 1e-4] {
            let r = 2.5;
            let a = area(&build_icon(fonts(), &IconShape::Circle { centre: pt(1.0, 1.0), radius: r }, tol).unwrap());
            assert!(a <= PI * r * r + 1e-12, "{a}");
            assert!(PI * r * r - a <= 2.0 * PI * r * tol, "tol {tol}: deficit {}", PI * r * r - a);
        }
    }

    #[test]
    fn ring_and_rectangle() {
        let tol = 1e-4;
        let a =
            area(&build_icon(fonts(), &IconShape::Ring { centre: pt(0.0, 0.0), outer: 2.0, inner: 1.0 }, tol).unwrap());
        assert!((a - 3.0 * PI).abs() < 2.0 * PI * 3.0 * tol, "{a}");
        let a = area(
            &build_icon(fonts(), &IconShape::Rectangle { at: pt(0.0, 0.0), width: 4.0, height: 2.0, corner: 0.5 }, tol)
                .unwrap(),
        );
        assert!((a - (8.0 - (4.0 - PI) * 0.25)).abs() < 1e-3, "{a}");
        let e =
            build_icon(fonts(), &IconShape::Rectangle { at: pt(0.0, 0.0), width: 4.0, height: 2.0, corner: 1.5 }, tol)
                .unwrap_err();
        assert_eq!(e.field, "corner");
    }

    /// The brief's check: "M 0 0 A 1 1 0 0 1 2 0 Z" is a half disc of area π/2; flattened
    /// inside the arc, within 2·tol·π.
    #[test]
    fn path_half_disc() {
        let tol = 1e-3;
        let r = build_icon(fonts(), &IconShape::Path { d: "M 0 0 A 1 1 0 0 1 2 0 Z".into(), at: pt(5.0, 5.0) }, tol)
            .unwrap();
        let a = area(&r);
        assert!((a - PI / 2.0).abs() <= 2.0 * tol * PI, "{a}");
        let bb = r.bounding_rect().unwrap();
        assert!((bb.min().x - 5.0).abs() < 1e-9 && (bb.max().x - 7.0).abs() < 1e-9);
    }

    #[test]
    fn path_even_odd_subpaths() {
        let r = build_icon(fonts(), &IconShape::Path { d: "M0 0H4V4H0Z M1 1H3V3H1Z".into(), at: pt(0.0, 0.0) }, 1e-3)
            .unwrap();
        assert!((area(&r) - 12.0).abs() < 1e-9);
        assert_eq!(r.0.len(), 1);
        assert_eq!(r.0[0].interiors().len(), 1);
    }

    #[test]
    fn bad_icons_say_what_is_allowed() {
        let e = build_icon(
            fonts(),
            &IconShape::Named { icon: "kettle".into(), at: pt(0.0, 0.0), size: 5.0, stroke: 0.3 },
            1e-3,
        )
        .unwrap_err();
        assert_eq!(e.field, "icon");
        assert!(e.allowed.unwrap().contains("battery"));
        let bow_tie = vec![pt(0.0, 0.0), pt(1.0, 1.0), pt(1.0, 0.0), pt(0.0, 1.0)];
        assert_eq!(build_icon(fonts(), &IconShape::Polygon { points: bow_tie }, 1e-3).unwrap_err().field, "points");
        let e = build_icon(fonts(), &IconShape::Path { d: "M 0 0 L 1 1".into(), at: pt(0.0, 0.0) }, 1e-3).unwrap_err();
        assert!(e.message.contains("no area"));
        let e = build_icon(fonts(), &IconShape::Path { d: "M 0 0 K 1 1".into(), at: pt(0.0, 0.0) }, 1e-3).unwrap_err();
        assert!(e.message.contains("character 7"), "{}", e.message);
    }
}
