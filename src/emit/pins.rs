//! The pin map `NAME.pins.csv`.
//!
//! Takes the artwork's pins and nets, gives a CSV table (RFC 4180: comma separated,
//! CRLF-free `\n` line ends, fields with commas, quotes or line breaks quoted and inner
//! quotes doubled) with header `pin,net,plate,drives`, one row per pin, sorted by pin.

use crate::artwork::Artwork;

/// Quotes a CSV field when it needs it (RFC 4180 §2).
fn field(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) { format!("\"{}\"", s.replace('"', "\"\"")) } else { s.to_string() }
}

/// The pin map of an artwork.
pub fn render_pins(art: &Artwork) -> Vec<u8> {
    let mut pins: Vec<_> = art.pins.iter().collect();
    pins.sort_by(|a, b| a.number.cmp(&b.number).then_with(|| a.net.cmp(&b.net)));
    let mut out = String::from("pin,net,plate,drives\n");
    for p in pins {
        let net = art.net(&p.net);
        let plate = net.map(|n| n.plate.name()).unwrap_or("");
        let drives = net.map(|n| n.drives.as_str()).unwrap_or("");
        out.push_str(&format!("{},{},{},{}\n", p.number, field(&p.net), plate, field(drives)));
    }
    out.into_bytes()
}

#[cfg(test)]
mod tests {
    use super::field;

    /// RFC 4180 §2.6–2.7: fields with commas or quotes are quoted, quotes doubled.
    #[test]
    fn fields_are_quoted_per_rfc_4180() {
        assert_eq!(field("D1.a"), "D1.a");
        assert_eq!(field("digit 1, segment a"), "\"digit 1, segment a\"");
        assert_eq!(field("the \"a\" bar"), "\"the \"\"a\"\" bar\"");
    }
}
