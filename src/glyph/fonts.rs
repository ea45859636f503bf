//! The font set: the built-in files of `fonts-strokes/` (compiled in) plus any files the
//! layout adds, later files overriding earlier definitions of the same glyph, icon or
//! digit style.
//!
//! Takes `Layout.extra_fonts`; gives a [`Fonts`] to look glyphs, icons and skeletons up
//! in, or the parse problems of the added files (file and line).

use super::font::{GlyphDef, IconDef, SkeletonDef, parse_font};
use crate::layout::{DigitStyle, FontSource};
use std::collections::BTreeMap;
use std::path::Path;
use std::sync::OnceLock;

/// The built-in font files: name as shown in messages, and text.
pub const BUILTIN_FILES: [(&str, &str); 3] = [
    ("fonts-strokes/segments.strokes", include_str!("../../fonts-strokes/segments.strokes")),
    ("fonts-strokes/legend.strokes", include_str!("../../fonts-strokes/legend.strokes")),
    ("fonts-strokes/icons.strokes", include_str!("../../fonts-strokes/icons.strokes")),
];

/// Every glyph, icon and digit skeleton available to a layout.
#[derive(Debug, Clone)]
pub struct Fonts {
    glyphs: BTreeMap<char, GlyphDef>,
    icons: BTreeMap<String, IconDef>,
    /// Skeletons of the seven-, fourteen- and sixteen-segment styles, in that order.
    styles: [SkeletonDef; 3],
}

/// Other spellings of characters the legend font has: Greek mu for the micro sign, the
/// ohm sign for capital omega (Unicode keeps both pairs as compatibility equivalents).
const ALIASES: [(char, char); 2] = [('\u{03BC}', '\u{00B5}'), ('\u{2126}', '\u{03A9}')];

const STYLES: [DigitStyle; 3] = [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen];

fn style_index(style: DigitStyle) -> usize {
    match style {
        DigitStyle::Seven => 0,
        DigitStyle::Fourteen => 1,
        DigitStyle::Sixteen => 2,
    }
}

fn load_builtin() -> Result<Fonts, String> {
    let mut glyphs = BTreeMap::new();
    let mut icons = BTreeMap::new();
    let mut styles: [Option<SkeletonDef>; 3] = [None, None, None];
    for (name, text) in BUILTIN_FILES {
        let file = parse_font(Path::new(name), text).map_err(|p| format!("built-in font file is broken: {p}"))?;
        glyphs.extend(file.glyphs);
        icons.extend(file.icons);
        for (style, skel) in file.styles {
            styles[style_index(style)] = Some(skel);
        }
    }
    let [Some(a), Some(b), Some(c)] = styles else {
        return Err("the built-in fonts lack a digit style".into());
    };
    Ok(Fonts { glyphs, icons, styles: [a, b, c] })
}

impl Fonts {
    /// The built-in fonts alone (read once). An error here is a bug in segmask: the
    /// tests read every built-in file.
    pub fn builtin() -> crate::Result<&'static Fonts> {
        static FONTS: OnceLock<Result<Fonts, String>> = OnceLock::new();
        FONTS.get_or_init(load_builtin).as_ref().map_err(|e| crate::Error::Bug(e.clone()))
    }

    /// The built-in fonts with the layout's files added in order; every problem found in
    /// the added files is listed.
    pub fn with_extra(extra: &[FontSource]) -> crate::Result<Fonts> {
        let mut f = Fonts::builtin()?.clone();
        let mut problems = Vec::new();
        for s in extra {
            match parse_font(&s.path, &s.text) {
                Ok(file) => {
                    f.glyphs.extend(file.glyphs);
                    f.icons.extend(file.icons);
                    for (style, skel) in file.styles {
                        f.styles[style_index(style)] = skel;
                    }
                }
                Err(p) => problems.push(*p),
            }
        }
        if problems.is_empty() { Ok(f) } else { Err(crate::Error::Input(problems)) }
    }

    /// The glyph for `c` (or for its alias), if any.
    pub fn glyph(&self, c: char) -> Option<&GlyphDef> {
        let c = ALIASES.iter().find(|(a, _)| *a == c).map(|(_, b)| *b).unwrap_or(c);
        self.glyphs.get(&c)
    }

    /// All characters the legend font has, for messages (`space` for the space).
    pub fn glyph_list(&self) -> String {
        self.glyphs
            .keys()
            .map(|c| if *c == ' ' { "space".to_string() } else { c.to_string() })
            .collect::<Vec<_>>()
            .join(" ")
    }

    /// The characters of the legend font.
    pub fn chars(&self) -> impl Iterator<Item = char> + '_ {
        self.glyphs.keys().copied()
    }

    /// The icon called `name`, if any.
    pub fn icon(&self, name: &str) -> Option<&IconDef> {
        self.icons.get(name)
    }

    /// Names of all icons, sorted.
    pub fn icon_names(&self) -> Vec<&str> {
        self.icons.keys().map(String::as_str).collect()
    }

    /// The skeleton of a digit style.
    pub fn style(&self, style: DigitStyle) -> &SkeletonDef {
        &self.styles[style_index(style)]
    }

    /// All three digit styles.
    pub fn styles() -> [DigitStyle; 3] {
        STYLES
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::path::PathBuf;

    #[test]
    fn builtin_files_parse() {
        for (name, text) in BUILTIN_FILES {
            if let Err(p) = parse_font(Path::new(name), text) {
                panic!("{p}");
            }
        }
        let f = Fonts::builtin().unwrap();
        for s in [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen] {
            assert_eq!(f.style(s).segments.len(), s.segment_names().len());
        }
    }

    #[test]
    fn extra_files_add_and_override() {
        let extra = FontSource {
            path: PathBuf::from("my.strokes"),
            text: "strokes 1\ncap 10\nglyph A 3\n line 0 0 0 10\nicon flag 10\n line 0 0 0 10 8 8 0 6\n".into(),
        };
        let f = Fonts::with_extra(&[extra]).unwrap();
        assert!((f.glyph('A').unwrap().advance - 0.3).abs() < 1e-12);
        assert!(f.icon("flag").is_some());
        assert!(f.icon("battery").is_some());
        assert_eq!(f.glyph('μ'), f.glyph('µ'));
    }

    /// A layout file may restyle a digit: here a seven-segment skeleton with round dots.
    #[test]
    fn extra_file_replaces_a_style() {
        let text = "strokes 1\nstyle seven\n segment a 0 1 1 1\n segment b 1 1 1 0.5\n segment c 1 0.5 1 0\n\
                    segment d 1 0 0 0\n segment e 0 0 0 0.5\n segment f 0 0.5 0 1\n segment g 0 0.5 1 0.5\n\
                    dp round 1.5 0.5\n colon round 1.5 0.25 0.75\n";
        let f = Fonts::with_extra(&[FontSource { path: PathBuf::from("round.strokes"), text: text.into() }]).unwrap();
        let dp = f.style(DigitStyle::Seven).dp;
        assert_eq!((dp.shape, dp.size), (crate::glyph::font::DotShape::Round, 1.5));
        assert_eq!(f.style(DigitStyle::Seven).origin.file, PathBuf::from("round.strokes"));
        assert_eq!(Fonts::builtin().unwrap().style(DigitStyle::Seven).dp.size, 1.25);
    }

    #[test]
    fn extra_file_errors_name_file_and_line() {
        let bad = FontSource {
            path: PathBuf::from("bad.strokes"),
            text: "strokes 1\ncap 10\nglyph B 5\n line 0 0 x 1\n".into(),
        };
        let crate::Error::Input(p) = Fonts::with_extra(&[bad]).unwrap_err() else { panic!() };
        assert_eq!(p[0].file, PathBuf::from("bad.strokes"));
        assert_eq!(p[0].line, Some(4));
        assert!(p[0].to_string().starts_with("bad.strokes:4: error"), "{}", p[0]);
    }

    /// The table of named icons in docs/layout-format.md lists exactly the icons of
    /// fonts-strokes/icons.strokes (`x-1` … `x-3` stands for x-1, x-2, x-3).
    #[test]
    fn the_documented_icon_table_matches_the_fonts() {
        let doc = include_str!("../../docs/layout-format.md");
        let start = doc.find("Named icons of").expect("icon table");
        let section = &doc[start..start + doc[start..].find("### `bars`").expect("bars section")];
        let rows = section.lines().filter(|l| l.starts_with("| `"));
        let mut listed = Vec::new();
        for row in rows {
            // Names sit in the first and third cells.
            let cells: Vec<&str> = row.split('|').collect();
            for cell in [cells[1], cells[3]] {
                let names: Vec<&str> = cell.split('`').skip(1).step_by(2).collect();
                if cell.contains('…') && names.len() == 2 {
                    let (stem, a) = names[0].rsplit_once('-').unwrap();
                    let b = names[1].rsplit_once('-').unwrap().1;
                    let (a, b): (u32, u32) = (a.parse().unwrap(), b.parse().unwrap());
                    listed.extend((a..=b).map(|k| format!("{stem}-{k}")));
                } else {
                    listed.extend(names.iter().map(|n| n.to_string()));
                }
            }
        }
        listed.sort();
        let fonts: Vec<String> = Fonts::builtin().unwrap().icon_names().iter().map(|n| n.to_string()).collect();
        assert_eq!(listed, fonts);
    }
}
