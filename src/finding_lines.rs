//! Which layout entries a finding concerns, and on which lines of the layout file.
//!
//! Takes a built layout (its artwork's pixels, its buses, the key path of every element
//! and the key lines of the file) and a finding; gives the elements its nets drive, each
//! with the key path of the layout entry it comes from and that entry's 1-based line.
//! A finding names nets, not elements: under static drive an element's SEG net is its
//! own name; under multiplexed drive a SEG line drives several elements and a common
//! drives many, so a finding that names both a SEG line and a common concerns the
//! elements on both, and one that names only commons concerns no element in particular.

use crate::artwork::NetKind;
use crate::finding::{ElementLine, Finding};
use crate::pipeline::Built;

/// The elements (and bus traces) that finding `f` concerns, in artwork order, each once.
pub fn elements_of(built: &Built, f: &Finding) -> Vec<ElementLine> {
    let art = &built.artwork;
    let is_common =
        |n: &str| art.nets.iter().any(|net| net.name == n && net.kind == NetKind::Common);
    let (coms, segs): (Vec<&str>, Vec<&str>) = f.nets.iter().map(String::as_str).partition(|n| is_common(n));
    let mut out: Vec<ElementLine> = Vec::new();
    let mut push = |element: &str, key: &str| {
        if !out.iter().any(|e| e.element == element && e.key == key) {
            let line = crate::layout::key_line(&built.layout.key_lines, key);
            out.push(ElementLine { element: element.to_string(), key: key.to_string(), line });
        }
    };
    if !segs.is_empty() {
        for p in &art.pixels {
            let on_seg = segs.contains(&p.seg_net.as_str()) || segs.contains(&p.element.as_str());
            let on_com = coms.is_empty() || coms.contains(&p.com_net.as_str());
            if let (true, true, Some(key)) = (on_seg, on_com, built.element_keys.get(&p.element)) {
                push(&p.element, key);
            }
        }
    }
    for b in built.layout.buses.iter().filter(|b| f.nets.contains(&b.net)) {
        push(&b.net, &b.key);
    }
    out
}
