//! The digit styles the benchmark generates and the sizes that suit each: a word
//! (`seven`, `fourteen`) → the layout's `style:` value, the segment count and the digit
//! size, stroke, gap and slant written into the layout.
//!
//! Segment names are the layout format's (docs/layout-format.md, *digits*): `seven` a–g,
//! `fourteen` a–f, g1, g2, h–m (fonts-strokes/segments.strokes). Uses only `std`, like the
//! generator that includes it.

/// Segment set of every digit in the generated layout.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Style {
    /// Seven segments a–g.
    Seven,
    /// Fourteen segments: the seven outer ones with the middle bar split (g1, g2), two
    /// inner verticals (i, l) and four diagonals (h, j, k, m).
    Fourteen,
}

/// How one digit is drawn, in mm and degrees.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DigitSize {
    /// Character height.
    pub height: f64,
    /// Character width (upright).
    pub width: f64,
    /// Segment stroke.
    pub stroke: f64,
    /// Gap between neighbouring segments.
    pub gap: f64,
    /// Italic slant, leaning right.
    pub slant: f64,
}

/// Gap between segments for both styles: the rules the generator writes make leads
/// 0.11 mm wide (0.1 + 2 × 5 µm undercut) and 0.05 mm apart, so one lead between two
/// segments needs 0.11 + 2 × 0.05 = 0.21 mm, and the router keeps one more 25 µm grid
/// cell clear on each side (docs/layout-format.md, *drive*: about 0.3 mm); 0.35 mm
/// leaves a little over that for the middle segment (seven) or an inner one (fourteen)
/// to be led out between two others.
const GAP: f64 = 0.35;

/// Gap between the segments of a fourteen-segment digit: under multiplexed drive three
/// leads cross its centre side by side (segmask's default for such digits,
/// `3·lead_width + 4·min_gap + 6·grid` = 0.33 + 0.2 + 0.15 mm); static layouts take it
/// too, so that both drives draw the same digit.
const FOURTEEN_GAP: f64 = 0.68;

impl Style {
    /// Reads `seven` or `fourteen`.
    pub fn parse(s: &str) -> Result<Style, String> {
        match s.trim() {
            "seven" => Ok(Style::Seven),
            "fourteen" => Ok(Style::Fourteen),
            other => Err(format!("unknown style `{other}` (allowed: seven, fourteen)")),
        }
    }

    /// The layout's `style:` word.
    pub fn word(self) -> &'static str {
        match self {
            Style::Seven => "seven",
            Style::Fourteen => "fourteen",
        }
    }

    /// Segments of one digit, without a decimal point.
    pub fn segments(self) -> u32 {
        match self {
            Style::Seven => 7,
            Style::Fourteen => 14,
        }
    }

    /// Size, stroke, gap and slant of one digit.
    ///
    /// Seven segments: 10 × 6 mm, stroke 1 mm. Fourteen: as tall but 8 mm wide, so each
    /// of the four counters the middle bar and the inner verticals leave still holds its
    /// diagonal with a gap on both sides, at the default stroke (height / 10: with
    /// 0.9 mm, the six-digit preset left the left junction's join of two digits unrouted).
    pub fn size(self) -> DigitSize {
        match self {
            Style::Seven => DigitSize { height: 10.0, width: 6.0, stroke: 1.0, gap: GAP, slant: 4.0 },
            Style::Fourteen => DigitSize { height: 10.0, width: 8.0, stroke: 1.0, gap: FOURTEEN_GAP, slant: 4.0 },
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn styles_read_their_words_and_refuse_others() {
        assert_eq!(Style::parse("fourteen"), Ok(Style::Fourteen));
        assert_eq!(Style::parse(" seven "), Ok(Style::Seven));
        assert!(Style::parse("sixteen").unwrap_err().contains("allowed: seven, fourteen"));
        assert_eq!(Style::Fourteen.word(), "fourteen");
    }
}
