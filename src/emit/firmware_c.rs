//! The firmware header `NAME.firmware.h`: C99 tables and small inline functions that set
//! the (COM, SEG) bits of a frame buffer to show a text and switch elements.
//!
//! Takes the artwork, gives the header text. The frame buffer is
//! `uint8_t frame[COMS][SEG_BYTES]`, bit `(seg − 1) % 8` of byte `(seg − 1) / 8` of row
//! `com − 1` standing for the pixel on (COM com, SEG seg) — the same 1-based numbers as
//! the segment map. Text is placed as `crate::firmware` places it (docs/outputs.md,
//! *Firmware tables*). Identifiers are the layout name made a C identifier, so two
//! panels' headers can be included together.

use crate::artwork::{Artwork, DigitSlot};
use crate::firmware::{Bit, bit_of, frame_size};
use crate::glyph::charset::charset;
use crate::layout::DigitStyle;
use std::collections::BTreeSet;
use std::fmt::Write;

/// Most segments a style has (sixteen); every digit row of the table has this many.
const MAX_SEGMENTS: usize = 16;

const STYLES: [DigitStyle; 3] = [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen];

/// A C identifier from a name: ASCII letters and digits kept, anything else `_`, a
/// leading digit (or nothing) prefixed with `lcd_`.
pub fn c_identifier(name: &str) -> String {
    let s: String = name.chars().map(|c| if c.is_ascii_alphanumeric() { c } else { '_' }).collect();
    if s.is_empty() || s.starts_with(|c: char| c.is_ascii_digit()) { format!("lcd_{s}") } else { s }
}

fn style_number(s: DigitStyle) -> usize {
    STYLES.iter().position(|x| *x == s).unwrap_or(0)
}

fn bit_text(b: Option<Bit>) -> String {
    let b = b.unwrap_or(Bit { com: 0, seg: 0 });
    format!("{{{}, {}}}", b.com, b.seg)
}

/// A comment-safe copy of a text (no `*/`, no line breaks, ASCII only).
fn comment(s: &str) -> String {
    s.replace("*/", "* /").chars().map(|c| if c.is_ascii() && !c.is_ascii_control() { c } else { '?' }).collect()
}

fn digit_row(art: &Artwork, d: &DigitSlot) -> String {
    let segs: Vec<String> = d
        .style
        .segment_names()
        .iter()
        .map(|s| d.segments.iter().find(|(n, _)| n == s).and_then(|(_, e)| bit_of(art, e)))
        .chain(std::iter::repeat(None))
        .take(MAX_SEGMENTS)
        .map(bit_text)
        .collect();
    format!(
        "    /* {}{} */ {{{}, {{{}}}, {}, {}}},\n",
        comment(&d.group),
        d.position,
        style_number(d.style),
        segs.join(", "),
        bit_text(d.point.as_deref().and_then(|e| bit_of(art, e))),
        format!("{{{}}}", (0..2).map(|k| bit_text(d.colon.get(k).and_then(|e| bit_of(art, e)))).collect::<Vec<_>>().join(", "))
    )
}

/// The table of one style's characters: code point and mask (bit i = segment i).
fn char_table(out: &mut String, p: &str, style: DigitStyle) {
    let names = style.segment_names();
    let set = charset(style);
    let _ = writeln!(out, "/* Characters of the {} style (bit i of the mask: segment i of {}). */", style.name(), names.join(" "));
    let _ = writeln!(out, "static const {p}_char {p}_{}_chars[{}] = {{", style.name(), set.chars.len());
    for (c, segs) in &set.chars {
        let mask: u32 = segs.iter().filter_map(|s| names.iter().position(|n| n == s)).map(|i| 1u32 << i).sum();
        let shown = if c.is_ascii_graphic() && *c != '\\' { c.to_string() } else { format!("U+{:04X}", *c as u32) };
        let _ = writeln!(out, "    {{0x{:04X}u, 0x{mask:04X}u}}, /* {} */", *c as u32, comment(&shown));
    }
    let _ = writeln!(out, "}};\n");
}

/// `NAME.firmware.h`.
pub fn render_firmware_header(art: &Artwork) -> Vec<u8> {
    let p = c_identifier(&art.name);
    let m = p.to_ascii_uppercase();
    let (coms, segs) = frame_size(art);
    let seg_bytes = segs.div_ceil(8).max(1);
    let digits = art.digits.len();
    let mut o = String::new();
    let _ = write!(
        o,
        "/* {name}.firmware.h: frame-buffer tables for the glass \"{name}\", written by segmask.\n\
          \x20* frame[com - 1][(seg - 1) / 8] bit (seg - 1) % 8 is the pixel on (COM com, SEG seg),\n\
          \x20* numbered as in {name}.segmap.csv. Placing text: docs/outputs.md, Firmware tables. */\n\
         #ifndef {m}_FIRMWARE_H\n#define {m}_FIRMWARE_H\n\n#include <stdint.h>\n\n\
         #define {m}_COMS {coms}\n#define {m}_SEGS {segs}\n#define {m}_SEG_BYTES {seg_bytes}\n#define {m}_DIGITS {digits}\n\n\
         /* A (COM, SEG) pair, both 1-based; {{0, 0}} where a position has no such segment. */\n\
         typedef struct {{ uint8_t com, seg; }} {p}_bit;\n\
         /* A character: code point and mask of the segments it lights. */\n\
         typedef struct {{ uint32_t code; uint16_t mask; }} {p}_char;\n\
         /* A digit position: style (0 seven, 1 fourteen, 2 sixteen), the bit of each segment in\n\
          \x20* the style's order, then its decimal point and its colon. */\n\
         typedef struct {{ uint8_t style; {p}_bit seg[{MAX_SEGMENTS}]; {p}_bit point; {p}_bit colon[2]; }} {p}_digit;\n\n",
        name = comment(&art.name),
    );
    let used: BTreeSet<usize> = art.digits.iter().map(|d| style_number(d.style)).collect();
    for &s in &used {
        char_table(&mut o, &p, STYLES[s]);
    }
    if digits > 0 {
        let _ = writeln!(o, "static const {p}_digit {p}_digits[{m}_DIGITS] = {{");
        for d in &art.digits {
            o.push_str(&digit_row(art, d));
        }
        let _ = writeln!(o, "}};\n");
    }
    o.push_str("/* Every element that is not part of a digit: its COM and SEG. */\n");
    let mut taken: BTreeSet<String> = BTreeSet::new();
    let in_digits: BTreeSet<&str> = art
        .digits
        .iter()
        .flat_map(|d| d.segments.iter().map(|(_, e)| e.as_str()).chain(d.point.as_deref()).chain(d.colon.iter().map(String::as_str)))
        .collect();
    for px in art.pixels.iter().filter(|px| !in_digits.contains(px.element.as_str())) {
        let Some(b) = bit_of(art, &px.element) else { continue };
        let base = c_identifier(&px.element).to_ascii_uppercase();
        let mut id = base.clone();
        let mut k = 2;
        while !taken.insert(id.clone()) {
            id = format!("{base}_{k}");
            k += 1;
        }
        let _ = writeln!(o, "#define {m}_{id}_COM {} /* {} */\n#define {m}_{id}_SEG {}", b.com, comment(&px.element), b.seg);
    }
    o.push('\n');
    o.push_str(&functions(&p, &m, &used, digits > 0));
    let _ = writeln!(o, "#endif /* {m}_FIRMWARE_H */");
    o.into_bytes()
}

/// The inline functions; those that place text only when the glass has digits.
fn functions(p: &str, m: &str, used: &BTreeSet<usize>, has_digits: bool) -> String {
    let mut o = format!(
        "/* Switches one pixel on or off. */\n\
         static inline void {p}_set(uint8_t frame[][{m}_SEG_BYTES], {p}_bit b, int on)\n{{\n\
         \x20   if (b.com == 0 || b.seg == 0) return;\n\
         \x20   if (on) frame[b.com - 1][(b.seg - 1) / 8] |= (uint8_t)(1u << ((b.seg - 1) % 8));\n\
         \x20   else frame[b.com - 1][(b.seg - 1) / 8] &= (uint8_t)~(1u << ((b.seg - 1) % 8));\n}}\n\n"
    );
    if !has_digits {
        return o;
    }
    let _ = write!(
        o,
        "/* Switches off every segment, point and colon of every digit. */\n\
         static inline void {p}_clear_digits(uint8_t frame[][{m}_SEG_BYTES])\n{{\n\
         \x20   int d, s;\n\
         \x20   for (d = 0; d < {m}_DIGITS; d++) {{\n\
         \x20       for (s = 0; s < {MAX_SEGMENTS}; s++) {p}_set(frame, {p}_digits[d].seg[s], 0);\n\
         \x20       {p}_set(frame, {p}_digits[d].point, 0);\n\
         \x20       {p}_set(frame, {p}_digits[d].colon[0], 0);\n\
         \x20       {p}_set(frame, {p}_digits[d].colon[1], 0);\n\
         \x20   }}\n}}\n\n\
         /* The mask of a character in a style; -1 when the style has no such character. */\n\
         static inline long {p}_mask(int style, uint32_t code)\n{{\n\
         \x20   const {p}_char *t = 0;\n\
         \x20   int n = 0, i;\n"
    );
    for &s in used {
        let name = STYLES[s].name();
        let _ = writeln!(
            o,
            "    if (style == {s}) {{ t = {p}_{name}_chars; n = (int)(sizeof {p}_{name}_chars / sizeof {p}_{name}_chars[0]); }}"
        );
    }
    let _ = write!(
        o,
        "\x20   for (i = 0; i < n; i++) if (t[i].code == code) return (long)t[i].mask;\n\
         \x20   /* The other case of a letter, as the character table allows. */\n\
         \x20   if (code < 128 && ((code | 32u) >= 'a' && (code | 32u) <= 'z'))\n\
         \x20       for (i = 0; i < n; i++) if (t[i].code == (code ^ 32u)) return (long)t[i].mask;\n\
         \x20   return -1;\n}}\n\n\
         /* Shows a character on digit d (0-based), leaving its point and colon alone;\n\
          \x20* 0 when shown, 1 when the position cannot show it (then it is left blank). */\n\
         static inline int {p}_put(uint8_t frame[][{m}_SEG_BYTES], int d, uint32_t code)\n{{\n\
         \x20   int s;\n\
         \x20   long mask;\n\
         \x20   if (d < 0 || d >= {m}_DIGITS) return 1;\n\
         \x20   mask = {p}_mask({p}_digits[d].style, code);\n\
         \x20   for (s = 0; s < {MAX_SEGMENTS}; s++) {p}_set(frame, {p}_digits[d].seg[s], 0);\n\
         \x20   if (mask < 0) return 1;\n\
         \x20   for (s = 0; s < {MAX_SEGMENTS}; s++)\n\
         \x20       if ((mask >> s) & 1 && {p}_digits[d].seg[s].com == 0) return 1;\n\
         \x20   for (s = 0; s < {MAX_SEGMENTS}; s++) if ((mask >> s) & 1) {p}_set(frame, {p}_digits[d].seg[s], 1);\n\
         \x20   return 0;\n}}\n\n\
         /* Shows UTF-8 text on the digits from the first: each character takes a position, a '.'\n\
          \x20* or ':' lights the point or colon of the position just filled. Returns the number of\n\
          \x20* characters not shown. Other elements are left as they are. */\n\
         static inline int {p}_show_text(uint8_t frame[][{m}_SEG_BYTES], const char *text)\n{{\n\
         \x20   const unsigned char *s = (const unsigned char *)text;\n\
         \x20   {p}_bit point = {{0, 0}}, colon[2] = {{{{0, 0}}, {{0, 0}}}};\n\
         \x20   int next = 0, missed = 0;\n\
         \x20   {p}_clear_digits(frame);\n\
         \x20   while (*s) {{\n\
         \x20       uint32_t c = *s++;\n\
         \x20       if (c >= 0xC0u && c < 0xE0u && (s[0] & 0xC0u) == 0x80u) {{\n\
         \x20           c = ((c & 0x1Fu) << 6) | (s[0] & 0x3Fu);\n\
         \x20           s += 1;\n\
         \x20       }} else if (c >= 0xE0u && c < 0xF0u && (s[0] & 0xC0u) == 0x80u && (s[1] & 0xC0u) == 0x80u) {{\n\
         \x20           c = ((c & 0x0Fu) << 12) | ((uint32_t)(s[0] & 0x3Fu) << 6) | (s[1] & 0x3Fu);\n\
         \x20           s += 2;\n\
         \x20       }}\n\
         \x20       if (c == '.' || c == ':') {{\n\
         \x20           /* A colon is one element, or two dots under multiplexed drive. */\n\
         \x20           {p}_bit *b = c == '.' ? &point : &colon[0];\n\
         \x20           if (b->com != 0) {{\n\
         \x20               {p}_set(frame, *b, 1);\n\
         \x20               b->com = 0;\n\
         \x20               if (c == ':' && colon[1].com != 0) {{\n\
         \x20                   {p}_set(frame, colon[1], 1);\n\
         \x20                   colon[1].com = 0;\n\
         \x20               }}\n\
         \x20           }} else {{\n\
         \x20               missed++;\n\
         \x20           }}\n\
         \x20           continue;\n\
         \x20       }}\n\
         \x20       if (next >= {m}_DIGITS) {{\n\
         \x20           missed++;\n\
         \x20           continue;\n\
         \x20       }}\n\
         \x20       point = {p}_digits[next].point;\n\
         \x20       colon[0] = {p}_digits[next].colon[0];\n\
         \x20       colon[1] = {p}_digits[next].colon[1];\n\
         \x20       missed += {p}_put(frame, next, c);\n\
         \x20       next++;\n\
         \x20   }}\n\
         \x20   return missed;\n}}\n\n"
    );
    o
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn identifiers() {
        assert_eq!(c_identifier("kiln-controller"), "kiln_controller");
        assert_eq!(c_identifier("3d"), "lcd_3d");
        assert_eq!(c_identifier("BATT.shell"), "BATT_shell");
    }
}
