//! Character tables: which segments of a digit style light to show a character.
//!
//! Takes the text of `fonts-strokes/characters.table` (compiled in; format in
//! fonts-strokes/README.md, *Character tables*), gives for each digit style the list of
//! characters it shows and their lit segments, in file order. The firmware tables and
//! `segmask show` read it, so the glass, the firmware and the picture agree.

use crate::layout::DigitStyle;
use std::sync::OnceLock;

/// The built-in table's file name and text.
const BUILTIN: (&str, &str) = ("fonts-strokes/characters.table", include_str!("../../fonts-strokes/characters.table"));

/// The characters one digit style shows.
#[derive(Debug, Clone, PartialEq)]
pub struct Charset {
    /// The style.
    pub style: DigitStyle,
    /// Each character with its lit segments, in the style's segment order, in file order.
    pub chars: Vec<(char, Vec<&'static str>)>,
}

impl Charset {
    /// Segments lit for `c`: the exact character, else the same letter in the other case
    /// (so `B` shows as `b` and `h` as `H` where only one form is drawn).
    pub fn lookup(&self, c: char) -> Option<&[&'static str]> {
        let find = |c: char| self.chars.iter().find(|(k, _)| *k == c).map(|(_, s)| s.as_slice());
        find(c).or_else(|| {
            let other = if c.is_ascii_uppercase() { c.to_ascii_lowercase() } else { c.to_ascii_uppercase() };
            (other != c).then(|| find(other)).flatten()
        })
    }
}

/// The built-in table of every style (parsed once; the file is part of the program, so a
/// mistake in it is a bug).
pub fn charsets() -> &'static [Charset] {
    static TABLE: OnceLock<Vec<Charset>> = OnceLock::new();
    TABLE.get_or_init(|| match parse(BUILTIN.1) {
        Ok(t) => t,
        Err(e) => panic!("{}:{e}", BUILTIN.0),
    })
}

/// The built-in character set of a style.
pub fn charset(style: DigitStyle) -> &'static Charset {
    static EMPTY: OnceLock<Charset> = OnceLock::new();
    charsets()
        .iter()
        .find(|c| c.style == style)
        .unwrap_or_else(|| EMPTY.get_or_init(|| Charset { style, chars: Vec::new() }))
}

const STYLES: [DigitStyle; 3] = [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen];

/// Parses a character table; an error reads `LINE: error: WHAT (allowed: …)`.
pub fn parse(text: &str) -> Result<Vec<Charset>, String> {
    let mut out: Vec<Charset> = Vec::new();
    let mut version = false;
    for (i, raw) in text.lines().enumerate() {
        let n = i + 1;
        let line = strip_comment(raw);
        let words: Vec<&str> = line.split_whitespace().collect();
        let Some(&first) = words.first() else { continue };
        if !version {
            if words != ["table", "1"] {
                return Err(format!("{n}: error: the first statement must be `table 1` (the format version)"));
            }
            version = true;
            continue;
        }
        if first == "style" {
            let style = words
                .get(1)
                .and_then(|w| STYLES.iter().find(|s| s.name() == *w))
                .filter(|_| words.len() == 2)
                .ok_or_else(|| format!("{n}: error: `{line}` is not a style line (allowed: style seven|fourteen|sixteen)"))?;
            if out.iter().any(|c| c.style == *style) {
                return Err(format!("{n}: error: style {} is given twice", style.name()));
            }
            out.push(Charset { style: *style, chars: Vec::new() });
            continue;
        }
        let Some(set) = out.last_mut() else {
            return Err(format!("{n}: error: a character before any `style` line"));
        };
        let c = character(first).ok_or_else(|| {
            format!("{n}: error: `{first}` is not one character (allowed: one character, or U+XXXX)")
        })?;
        if set.chars.iter().any(|(k, _)| *k == c) {
            return Err(format!("{n}: error: character {first} is given twice in style {}", set.style.name()));
        }
        let names = set.style.segment_names();
        let mut segs: Vec<&'static str> = Vec::new();
        if words[1..] != ["-"] {
            for w in &words[1..] {
                let s = names.iter().find(|s| *s == w).ok_or_else(|| {
                    format!("{n}: error: unknown segment `{w}` (allowed: {}, or `-` alone for none)", names.join(" "))
                })?;
                if !segs.contains(s) {
                    segs.push(*s);
                }
            }
            if segs.is_empty() {
                return Err(format!("{n}: error: character {first} lists no segments (write `-` for none)"));
            }
        }
        segs.sort_by_key(|s| names.iter().position(|k| k == s));
        set.chars.push((c, segs));
    }
    if !version {
        return Err("1: error: empty table (allowed: `table 1`, then style blocks)".into());
    }
    Ok(out)
}

/// A line without its comment: `#` at the start or after a space.
fn strip_comment(line: &str) -> &str {
    let t = line.trim_start();
    if t.starts_with('#') {
        return "";
    }
    match line.find(" #").or_else(|| line.find("\t#")) {
        Some(i) => &line[..i],
        None => line,
    }
}

/// One character, or `U+XXXX`.
fn character(w: &str) -> Option<char> {
    if let Some(hex) = w.strip_prefix("U+") {
        return u32::from_str_radix(hex, 16).ok().and_then(char::from_u32);
    }
    let mut it = w.chars();
    let c = it.next()?;
    it.next().is_none().then_some(c)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Seven segments, 0–9 and A–F, against the usual byte encoding with bit 0 = a …
    /// bit 6 = g: 3F 06 5B 4F 66 6D 7D 07 7F 6F 77 7C 39 5E 79 71 (common practice, the
    /// table printed in driver data sheets; written here from memory, and it agrees with
    /// docs/background.md, *Seven-segment patterns*).
    #[test]
    fn seven_against_the_usual_bytes() {
        let bytes = [0x3F, 0x06, 0x5B, 0x4F, 0x66, 0x6D, 0x7D, 0x07, 0x7F, 0x6F, 0x77, 0x7C, 0x39, 0x5E, 0x79, 0x71];
        let set = charset(DigitStyle::Seven);
        for (i, want) in bytes.iter().enumerate() {
            let c = char::from_digit(i as u32, 16).unwrap();
            for c in [c.to_ascii_uppercase(), c.to_ascii_lowercase()] {
                let segs = set.lookup(c).unwrap_or_else(|| panic!("{c} missing"));
                let got = segs.iter().map(|s| 1u8 << (s.as_bytes()[0] - b'a')).fold(0, |a, b| a | b);
                assert_eq!(got, *want, "{c}: {segs:?}");
            }
        }
    }

    /// Fourteen and sixteen segments show A–Z, 0–9, the space and the signs the issue
    /// asks for; E is the usual form (top, bottom, left and both halves of the middle bar,
    /// common practice), with the top and bottom bars split in two on sixteen.
    #[test]
    fn alphanumeric_styles_cover_letters_and_digits() {
        for style in [DigitStyle::Fourteen, DigitStyle::Sixteen] {
            let set = charset(style);
            for c in ('A'..='Z').chain('0'..='9').chain([' ', '-', '+']) {
                assert!(set.lookup(c).is_some(), "{} lacks {c}", style.name());
            }
            assert!(set.lookup(' ').unwrap().is_empty());
            // The same letter drawn the same way, split bars on sixteen.
            let e = set.lookup('E').unwrap().to_vec();
            let want: &[&str] = if style == DigitStyle::Sixteen {
                &["a1", "a2", "d1", "d2", "e", "f", "g1", "g2"]
            } else {
                &["a", "d", "e", "f", "g1", "g2"]
            };
            assert_eq!(e, want);
        }
    }

    #[test]
    fn mistakes_name_their_line() {
        let e = parse("table 1\nstyle seven\n  X q\n").unwrap_err();
        assert!(e.starts_with("3: error: unknown segment `q`"), "{e}");
        let e = parse("table 1\nstyle eight\n").unwrap_err();
        assert!(e.starts_with("2: error:"), "{e}");
        let e = parse("table 1\n  A a\n").unwrap_err();
        assert!(e.contains("before any `style`"), "{e}");
        let e = parse("table 1\nstyle seven\n  AB a\n").unwrap_err();
        assert!(e.contains("not one character"), "{e}");
        let e = parse("table 1\nstyle seven\n  A a\n  A b\n").unwrap_err();
        assert!(e.contains("twice"), "{e}");
        assert!(parse("style seven\n").unwrap_err().contains("table 1"));
    }

    #[test]
    fn space_and_hex_code_points() {
        let t = parse("table 1\nstyle seven\n  U+0020 -\n  U+00B0 a b f g # degree\n").unwrap();
        assert_eq!(t[0].chars[0], (' ', vec![]));
        assert_eq!(t[0].chars[1], ('°', vec!["a", "b", "f", "g"]));
    }
}
