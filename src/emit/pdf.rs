//! Exact-scale PDF: the film pages (`NAME.films.pdf`) and the print sheet
//! (`NAME.sheet.pdf`).
//!
//! Takes drawings ([`super::drawing`], page mm, y down), gives a PDF built with the
//! pdf-writer crate whose pages have the drawings' sizes: ISO 32000-1 default user space
//! has 72 units per inch, so a page W × H mm has `MediaBox [0 0 W·72/25.4 H·72/25.4]`
//! (docs/background.md, *PDF*). Everything is vector paths — fills under the drawing's
//! rule and round-capped strokes — so nothing depends on fonts or resolution. The same
//! drawings give the same bytes (the document date is the build date).

use super::drawing::{Drawing, Item, Paint};
use pdf_writer::types::{LineCapStyle, LineJoinStyle};
use pdf_writer::{Content, Date, Finish, Pdf, Rect, Ref, TextStr};

/// PDF units (points) per millimetre.
pub const PT_PER_MM: f64 = 72.0 / 25.4;

/// Grey level of a paint (0 black, 1 white).
fn grey(p: Paint) -> f32 {
    match p {
        Paint::Ink => 0.0,
        Paint::Clear => 1.0,
    }
}

/// The content stream of one page.
fn content(d: &Drawing) -> Vec<u8> {
    let h = d.height;
    let xy = |(x, y): (f64, f64)| ((x * PT_PER_MM) as f32, ((h - y) * PT_PER_MM) as f32);
    let mut c = Content::new();
    c.set_line_cap(LineCapStyle::RoundCap);
    c.set_line_join(LineJoinStyle::RoundJoin);
    for item in &d.items {
        match item {
            Item::Fill { rings, even_odd, paint } => {
                let mut any = false;
                for r in rings.iter().filter(|r| r.len() >= 3) {
                    let (x, y) = xy(r[0]);
                    c.move_to(x, y);
                    for &p in &r[1..] {
                        let (x, y) = xy(p);
                        c.line_to(x, y);
                    }
                    c.close_path();
                    any = true;
                }
                if any {
                    c.set_fill_gray(grey(*paint));
                    if *even_odd {
                        c.fill_even_odd();
                    } else {
                        c.fill_nonzero();
                    }
                }
            }
            Item::Stroke { lines, width, paint } => {
                let mut any = false;
                for l in lines.iter().filter(|l| !l.is_empty()) {
                    let (x, y) = xy(l[0]);
                    c.move_to(x, y);
                    for &p in &l[1..] {
                        let (x, y) = xy(p);
                        c.line_to(x, y);
                    }
                    any = true;
                }
                if any {
                    c.set_stroke_gray(grey(*paint));
                    c.set_line_width((*width * PT_PER_MM) as f32);
                    c.stroke();
                }
            }
        }
    }
    c.finish().to_vec()
}

/// A PDF holding one page per drawing, each at the drawing's size; `title` and `date`
/// (year, month, day) go into the document information.
pub fn pdf_bytes(pages: &[Drawing], title: &str, date: (i32, u32, u32)) -> Vec<u8> {
    let mut pdf = Pdf::new();
    let catalog = Ref::new(1);
    let tree = Ref::new(2);
    let info = Ref::new(3);
    let ids: Vec<(Ref, Ref)> = (0..pages.len()).map(|i| (Ref::new(4 + 2 * i as i32), Ref::new(5 + 2 * i as i32))).collect();
    pdf.catalog(catalog).pages(tree);
    pdf.pages(tree).kids(ids.iter().map(|(p, _)| *p)).count(ids.len() as i32);
    for (d, (page_id, content_id)) in pages.iter().zip(&ids) {
        let mut page = pdf.page(*page_id);
        page.media_box(Rect::new(0.0, 0.0, (d.width * PT_PER_MM) as f32, (d.height * PT_PER_MM) as f32));
        page.parent(tree);
        page.contents(*content_id);
        page.finish();
        pdf.stream(*content_id, &content(d));
    }
    let (y, m, day) = date;
    let mut di = pdf.document_info(info);
    di.title(TextStr(title));
    di.producer(TextStr(concat!("segmask ", env!("CARGO_PKG_VERSION"))));
    di.creation_date(Date::new(y.clamp(0, 9999) as u16).month(m as u8).day(day as u8));
    di.finish();
    pdf.finish()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A 100 × 50 mm page has a MediaBox of 283.46 × 141.73 pt (ISO 32000-1, 8.3.2.3:
    /// 72 units per inch; 25.4 mm per inch).
    #[test]
    fn media_box_is_the_page_in_points() {
        let d = Drawing { width: 100.0, height: 50.0, title: "t".into(), items: vec![] };
        let b = pdf_bytes(&[d], "t", (2026, 12, 1));
        let s = String::from_utf8_lossy(&b);
        assert!(s.contains("/MediaBox [0 0 283.46457 141.73228]"), "{s}");
        assert!(s.starts_with("%PDF-"));
    }
}
