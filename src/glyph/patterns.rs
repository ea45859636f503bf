//! Which seven-segment segments light for a character (common practice;
//! docs/background.md, *Seven-segment patterns*).
//! The firmware side needs the same table, so it is public.

/// Segments (`a`–`g`) lit to show `ch` on a seven-segment digit, or `None` when the
/// character has no usual seven-segment form.
///
/// Digits and the hexadecimal letters follow common practice (docs/background.md,
/// *Seven-segment patterns*), the
/// letters in either case: 0 abcdef, 1 bc, 2 abdeg, 3 abcdg, 4 bcfg, 5 acdfg, 6 acdefg,
/// 7 abc, 8 abcdefg, 9 abcdfg, A abcefg, b cdefg, C adef, d bcdeg, E adefg, F aefg.
/// A few more common forms are case-sensitive: H h J L n o P r t U u y, `-`, `_`, `=`,
/// and the space (nothing lit).
///
/// ```
/// use segmask::glyph::seven_segment_pattern;
/// assert_eq!(seven_segment_pattern('7'), Some(&["a", "b", "c"][..]));
/// assert_eq!(seven_segment_pattern('%'), None);
/// ```
pub fn seven_segment_pattern(ch: char) -> Option<&'static [&'static str]> {
    let hex: Option<&'static [&'static str]> = match ch.to_ascii_uppercase() {
        '0' => Some(&["a", "b", "c", "d", "e", "f"]),
        '1' => Some(&["b", "c"]),
        '2' => Some(&["a", "b", "d", "e", "g"]),
        '3' => Some(&["a", "b", "c", "d", "g"]),
        '4' => Some(&["b", "c", "f", "g"]),
        '5' => Some(&["a", "c", "d", "f", "g"]),
        '6' => Some(&["a", "c", "d", "e", "f", "g"]),
        '7' => Some(&["a", "b", "c"]),
        '8' => Some(&["a", "b", "c", "d", "e", "f", "g"]),
        '9' => Some(&["a", "b", "c", "d", "f", "g"]),
        'A' => Some(&["a", "b", "c", "e", "f", "g"]),
        'B' => Some(&["c", "d", "e", "f", "g"]),
        'C' => Some(&["a", "d", "e", "f"]),
        'D' => Some(&["b", "c", "d", "e", "g"]),
        'E' => Some(&["a", "d", "e", "f", "g"]),
        'F' => Some(&["a", "e", "f", "g"]),
        _ => None,
    };
    hex.or(match ch {
        'H' => Some(&["b", "c", "e", "f", "g"]),
        'h' => Some(&["c", "e", "f", "g"]),
        'J' => Some(&["b", "c", "d", "e"]),
        'L' => Some(&["d", "e", "f"]),
        'n' => Some(&["c", "e", "g"]),
        'o' => Some(&["c", "d", "e", "g"]),
        'P' => Some(&["a", "b", "e", "f", "g"]),
        'r' => Some(&["e", "g"]),
        't' => Some(&["d", "e", "f", "g"]),
        'U' => Some(&["b", "c", "d", "e", "f"]),
        'u' => Some(&["c", "d", "e"]),
        'y' => Some(&["b", "c", "d", "f", "g"]),
        '-' => Some(&["g"]),
        '_' => Some(&["d"]),
        '=' => Some(&["d", "g"]),
        ' ' => Some(&[]),
        _ => None,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The truth table of docs/background.md, *Seven-segment patterns* (common practice),
    /// written out independently as
    /// strings so a typo in either copy shows.
    #[test]
    fn truth_table() {
        let table = [
            ('0', "abcdef"),
            ('1', "bc"),
            ('2', "abdeg"),
            ('3', "abcdg"),
            ('4', "bcfg"),
            ('5', "acdfg"),
            ('6', "acdefg"),
            ('7', "abc"),
            ('8', "abcdefg"),
            ('9', "abcdfg"),
            ('A', "abcefg"),
            ('b', "cdefg"),
            ('C', "adef"),
            ('d', "bcdeg"),
            ('E', "adefg"),
            ('F', "aefg"),
        ];
        for (c, want) in table {
            for c in [c, c.to_ascii_lowercase(), c.to_ascii_uppercase()] {
                assert_eq!(seven_segment_pattern(c).unwrap().concat(), want, "{c}");
            }
        }
    }

    #[test]
    fn segment_names_are_real_and_sorted() {
        let names = crate::layout::DigitStyle::Seven.segment_names();
        for c in (0u8..128).map(char::from) {
            if let Some(p) = seven_segment_pattern(c) {
                assert!(p.iter().all(|s| names.contains(s)), "{c}");
                assert!(p.windows(2).all(|w| w[0] < w[1]), "{c}");
            }
        }
        assert_eq!(seven_segment_pattern('G'), None);
    }
}
