//! Routing on hand-built electrodes: every net reaches a pad, and the drawn ITO of
//! different nets keeps the minimum gap (checked with geo's exact polygon distance).

use super::*;
use crate::geom::{distance, rect, region_of, union_all};
use crate::glyph::{Element, ElementKind};

fn square(name: &str, x: f64, y: f64, s: f64) -> Element {
    let r = region_of([rect(x, y, x + s, y + s)]);
    Element { name: name.into(), kind: ElementKind::Icon, outline: r.clone(), body: r, digit: None, drives: name.into(), key: "icons".into() }
}

fn routed(elements: &[Element]) -> (Layout, Electrodes, Routes) {
    let layout = crate::layout::fixture::tiny_layout();
    let a = crate::assign::assign(&layout, elements).unwrap();
    let el = crate::electrode::build_electrodes(&layout, elements, &a).unwrap();
    let routes = route_leads(&layout, &el).unwrap();
    (layout, el, routes)
}

fn front_ito_by_net(el: &Electrodes, r: &Routes) -> Vec<(String, Region)> {
    let mut nets: Vec<String> = el.segs.iter().map(|s| s.net.clone()).collect();
    nets.push(el.coms[0].net.clone());
    nets.iter()
        .map(|n| {
            let mut parts: Vec<Polygon> = el.segs.iter().filter(|s| &s.net == n).flat_map(|s| s.outline.0.clone()).collect();
            parts.extend(r.leads.iter().filter(|l| l.plate == PlateId::Front && &l.net == n).flat_map(|l| l.outline.0.clone()));
            parts.extend(r.pads.iter().filter(|p| &p.net == n).map(|p| p.outline.clone()));
            parts.extend(r.transfers.iter().filter(|t| &t.net == n).map(|t| t.pad.clone()));
            (n.clone(), union_all(parts))
        })
        .collect()
}

#[test]
fn a_row_of_squares_routes_clean() {
    let els: Vec<Element> = (0..6).map(|i| square(&format!("S{i}"), 6.0 + 3.0 * i as f64, 12.0, 1.5)).collect();
    let (layout, el, r) = routed(&els);
    assert!(r.findings.is_empty(), "{:?}", r.findings);
    assert_eq!(r.pads.len(), 7, "six segments and the common");
    let nets = front_ito_by_net(&el, &r);
    for (n, reg) in &nets {
        assert_eq!(reg.0.len(), 1, "net {n} must be one connected piece of ITO");
    }
    for i in 0..nets.len() {
        for j in i + 1..nets.len() {
            let d = distance(&nets[i].1 .0[0], &nets[j].1 .0[0]);
            assert!(d >= layout.rules.min_gap - 1e-6, "{} and {} are {d} apart", nets[i].0, nets[j].0);
        }
    }
}

#[test]
fn a_square_boxed_in_by_a_ring_is_unroutable_and_named() {
    // S0 sits inside a closed ring R: no lead can leave without touching R.
    let ring = crate::geom::difference(&region_of([rect(8.0, 10.0, 16.0, 18.0)]), &region_of([rect(9.0, 11.0, 15.0, 17.0)]));
    let r_el = Element { name: "R".into(), kind: ElementKind::Icon, outline: ring.clone(), body: ring, digit: None, drives: "R".into(), key: "icons".into() };
    let (_, _, r) = routed(&[square("S0", 11.0, 13.0, 2.0), r_el]);
    let f = r.findings.iter().find(|f| f.nets.first().map(String::as_str) == Some("S0")).expect("S0 is reported");
    assert_eq!(f.rule, crate::finding::Rule::Unroutable);
    assert!(f.nets.contains(&"R".to_string()), "the blocking net is named: {:?}", f.nets);
}

#[test]
fn pads_take_arrival_order() {
    let els: Vec<Element> = (0..4).map(|i| square(&format!("S{i}"), 5.0 + 5.0 * i as f64, 14.0, 1.0)).collect();
    let (_, _, r) = routed(&els);
    let pin = |n: &str| r.pads.iter().find(|p| p.net == n).unwrap().pin;
    assert!(pin("S0") < pin("S1") && pin("S1") < pin("S2") && pin("S2") < pin("S3"));
    assert_eq!(pin("COM1"), 1, "the common's transfer dot lies left of every lead");
}
