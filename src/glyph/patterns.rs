//! Which seven-segment segments light for a character (common practice;
//! docs/background.md, *Seven-segment patterns*), read from the character table the
//! firmware tables and `segmask show` use too.

/// Segments (`a`–`g`) lit to show `ch` on a seven-segment digit, or `None` when the
/// character has no usual seven-segment form: the `seven` block of
/// `fonts-strokes/characters.table` ([`super::charset`]), the exact character first,
/// else the same letter in the other case.
///
/// Digits and the hexadecimal letters follow common practice (docs/background.md,
/// *Seven-segment patterns*), the letters in either case: 0 abcdef, 1 bc, 2 abdeg,
/// 3 abcdg, 4 bcfg, 5 acdfg, 6 acdefg, 7 abc, 8 abcdefg, 9 abcdfg, A abcefg, b cdefg,
/// C adef, d bcdeg, E adefg, F aefg.
///
/// ```
/// use segmask::glyph::seven_segment_pattern;
/// assert_eq!(seven_segment_pattern('7'), Some(&["a", "b", "c"][..]));
/// assert_eq!(seven_segment_pattern('%'), None);
/// ```
pub fn seven_segment_pattern(ch: char) -> Option<&'static [&'static str]> {
    super::charset::charset(crate::layout::DigitStyle::Seven).lookup(ch)
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
        assert_eq!(seven_segment_pattern('K'), None);
        assert_eq!(seven_segment_pattern('M'), None);
    }
}
