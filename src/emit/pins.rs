//! The pin map `NAME.pins.csv`.
//!
//! Takes the artwork's pins and nets, gives a CSV table (RFC 4180: comma separated,
//! CRLF-free `\n` line ends, fields with commas, quotes or line breaks quoted and inner
//! quotes doubled) with header `pin,net,plate,role,index,drives,side`, one row per pin,
//! sorted by pin. `role` is `COM` or `SEG`; `index` is the 1-based COM index or SEG line;
//! `side` is the ledge the pad lies on, read from where the pad lies off the back glass
//! (with two pad rows, which connector the pin is on).

use super::csv::field;
use crate::artwork::{Artwork, NetKind};

/// Header line of the pin map.
pub const HEADER: &str = "pin,net,plate,role,index,drives,side\n";

/// Name of a net kind in the pin and segment maps.
pub fn role_name(kind: NetKind) -> &'static str {
    match kind {
        NetKind::Common => "COM",
        NetKind::Segment => "SEG",
    }
}

/// The pin map of an artwork. A pin whose net is not in the net list keeps its number
/// and net name; its other cells are empty.
pub fn render_pins(art: &Artwork) -> Vec<u8> {
    let mut pins: Vec<_> = art.pins.iter().collect();
    pins.sort_by(|a, b| a.number.cmp(&b.number).then_with(|| a.net.cmp(&b.net)));
    let mut out = String::from(HEADER);
    for p in pins {
        let net = art.net(&p.net);
        let plate = net.map(|n| n.plate.name()).unwrap_or("");
        let role = net.map(|n| role_name(n.kind)).unwrap_or("");
        let index = net.map(|n| (n.index + 1).to_string()).unwrap_or_default();
        let drives = net.map(|n| n.drives.as_str()).unwrap_or("");
        let side = ledge_side(art, &p.pad);
        out.push_str(&format!("{},{},{plate},{role},{index},{},{side}\n", p.number, field(&p.net), field(drives)));
    }
    out.into_bytes()
}

/// The side of the glass whose ledge holds `pad`: where its centre lies off the back
/// glass's bounding box (the side it lies farthest beyond); empty for a pad over the
/// back glass, which no layout makes.
fn ledge_side(art: &Artwork, pad: &crate::geom::Polygon) -> &'static str {
    use geo::{BoundingRect, Centroid};
    let (Some(b), Some(c)) = (art.back_glass.bounding_rect(), pad.centroid()) else { return "" };
    let beyond = [
        ("bottom", b.min().y - c.y()),
        ("top", c.y() - b.max().y),
        ("left", b.min().x - c.x()),
        ("right", c.x() - b.max().x),
    ];
    beyond.into_iter().filter(|(_, d)| *d > 0.0).max_by(|a, b| a.1.total_cmp(&b.1)).map(|(s, _)| s).unwrap_or("")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::artwork::Pin;
    use crate::geom::rect;

    /// Rows sorted by pin; role and 1-based index from the net; a pin on an unknown net
    /// keeps empty cells (RFC 4180 §2.4: every record has the same number of fields).
    #[test]
    fn rows_carry_role_and_one_based_index() {
        let mut art = crate::check::fixture::clean();
        art.pins.push(Pin { number: 9, net: "stray".into(), pad: rect(0.0, 0.0, 1.0, 1.0) });
        art.nets[0].drives = "digit 1, segment a".into();
        let csv = String::from_utf8(render_pins(&art)).unwrap();
        let want = concat!(
            "pin,net,plate,role,index,drives,side\n",
            "1,S1,front,SEG,1,\"digit 1, segment a\",bottom\n",
            "2,S2,front,SEG,2,fixture S2,bottom\n",
            "3,COM1,back,COM,1,fixture COM1,bottom\n",
            "9,stray,,,,,bottom\n",
        );
        assert_eq!(csv, want);
    }
}
