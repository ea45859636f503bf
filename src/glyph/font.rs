//! Reads one stroke font file (the text format of `fonts-strokes/README.md`) into plain
//! data: digit skeletons, legend glyphs and icons.
//!
//! Takes the file's path (for messages) and text; gives a [`FontFile`] or the first
//! problem, named by file and line. Coordinates are normalised on the way in: glyphs to a
//! cap height of 1, icons to a box of 1, skeletons stay in their unit cell.

use crate::error::InputProblem;
use crate::geom::path::{PATH_COMMANDS, SubPath, parse_svg_path};
use crate::geom::{Pt, pt};
use crate::layout::DigitStyle;
use std::path::{Path, PathBuf};

/// Where a definition was read from.
#[derive(Debug, Clone, PartialEq)]
pub struct Origin {
    /// Font file.
    pub file: PathBuf,
    /// 1-based line of the definition's first line.
    pub line: usize,
}

/// One drawing primitive in normalised units.
#[derive(Debug, Clone, PartialEq)]
pub enum Prim {
    /// Stroked open polyline; a single point is a dot as wide as the stroke.
    Line(Vec<Pt>),
    /// Stroked closed polyline.
    Loop(Vec<Pt>),
    /// Stroked circular arc: centre, radius, start and end angle in degrees (the arc
    /// runs counter-clockwise when `end > start`, clockwise when `end < start`).
    Arc(Pt, f64, f64, f64),
    /// Stroked full circle: centre, radius.
    Circle(Pt, f64),
    /// Filled polygon.
    Fill(Vec<Pt>),
    /// Filled circle: centre, radius.
    Disc(Pt, f64),
    /// Stroked rectangle: two corners and a corner radius.
    Frame(Pt, Pt, f64),
    /// Filled rectangle: two corners and a corner radius.
    Block(Pt, Pt, f64),
    /// Stroked SVG path.
    Path(Vec<SubPath>),
    /// Filled SVG path (even-odd).
    FillPath(Vec<SubPath>),
}

/// A primitive and whether it is removed from the drawing instead of added.
#[derive(Debug, Clone, PartialEq)]
pub struct Mark {
    /// What to draw.
    pub prim: Prim,
    /// `cut`: subtract this primitive's ink after all other marks are united.
    pub cut: bool,
}

/// A legend glyph, cap height 1.
#[derive(Debug, Clone, PartialEq)]
pub struct GlyphDef {
    /// Pen advance in cap heights.
    pub advance: f64,
    /// Strokes and fills.
    pub marks: Vec<Mark>,
    /// Where it was defined.
    pub origin: Origin,
}

/// An icon, box size 1.
#[derive(Debug, Clone, PartialEq)]
pub struct IconDef {
    /// Strokes and fills.
    pub marks: Vec<Mark>,
    /// Where it was defined.
    pub origin: Origin,
}

/// Shape of a decimal point or colon dot.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DotShape {
    /// A square (a parallelogram on slanted digits).
    Square,
    /// A disc.
    Round,
}

/// Where and how big the decimal point is, in stroke widths.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DotSpec {
    /// Dot shape.
    pub shape: DotShape,
    /// Side or diameter, in stroke widths.
    pub size: f64,
    /// Space between the digit cell's right edge and the dot, in stroke widths.
    pub space: f64,
}

/// The colon's dots.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ColonSpec {
    /// Dot shape.
    pub shape: DotShape,
    /// Side or diameter, in stroke widths.
    pub size: f64,
    /// Height of the lower dot's centre, as a fraction of the digit height.
    pub low: f64,
    /// Height of the upper dot's centre, as a fraction of the digit height.
    pub high: f64,
}

/// One segment of a skeleton.
#[derive(Debug, Clone, PartialEq)]
pub struct SegmentDef {
    /// Segment name (`a`, `g1`, …).
    pub name: String,
    /// One end of the centre line, unit cell.
    pub from: Pt,
    /// The other end.
    pub to: Pt,
    /// A minor segment gives way at its ends: it is cut parallel to the segments it
    /// meets, a gap clear of their edges, and they are mitred as if it were not there.
    pub minor: bool,
}

/// A digit style's skeleton: segment centrelines in the unit cell.
#[derive(Debug, Clone, PartialEq)]
pub struct SkeletonDef {
    /// Segments; (0,0) is the lower-left and (1,1) the upper-right centreline corner.
    pub segments: Vec<SegmentDef>,
    /// Decimal point.
    pub dp: DotSpec,
    /// Colon.
    pub colon: ColonSpec,
    /// Where it was defined.
    pub origin: Origin,
}

/// Everything one font file defines.
#[derive(Debug, Clone, Default)]
pub struct FontFile {
    /// Digit skeletons.
    pub styles: Vec<(DigitStyle, SkeletonDef)>,
    /// Legend glyphs.
    pub glyphs: Vec<(char, GlyphDef)>,
    /// Icons.
    pub icons: Vec<(String, IconDef)>,
}

/// The primitives allowed in glyphs and icons, for messages.
pub const PRIMITIVES: &str = "line, loop, arc, circle, fill, disc, box, block, path, fillpath (each may follow `cut`)";

const STYLES: [DigitStyle; 3] = [DigitStyle::Seven, DigitStyle::Fourteen, DigitStyle::Sixteen];

enum Block {
    None,
    Glyph(char, GlyphDef),
    Icon(String, f64, IconDef),
    Style(DigitStyle, StyleDraft),
}

struct StyleDraft {
    segments: Vec<SegmentDef>,
    dp: Option<DotSpec>,
    colon: Option<ColonSpec>,
    origin: Origin,
}

struct Reader<'a> {
    file: &'a Path,
    line: usize,
    cap: Option<f64>,
    out: FontFile,
    block: Block,
}

/// Problems are boxed: an `InputProblem` is large.
type R<T> = Result<T, Box<InputProblem>>;

/// Reads one font file.
pub fn parse_font(file: &Path, text: &str) -> Result<FontFile, Box<InputProblem>> {
    let mut r = Reader { file, line: 0, cap: None, out: FontFile::default(), block: Block::None };
    let mut seen_header = false;
    for (i, raw) in text.lines().enumerate() {
        r.line = i + 1;
        let body = strip_comment(raw).trim();
        if body.is_empty() {
            continue;
        }
        let (word, rest) = split_word(body);
        if !seen_header {
            if word != "strokes" || rest.trim() != "1" {
                return Err(r.problem("a font file must begin with the line `strokes 1`", None));
            }
            seen_header = true;
            continue;
        }
        r.directive(word, rest)?;
    }
    if !seen_header {
        r.line = 1;
        return Err(r.problem("a font file must begin with the line `strokes 1`", None));
    }
    r.finish_block()?;
    Ok(r.out)
}

/// Cuts a `#` comment: one at the start of the line or after white space.
fn strip_comment(line: &str) -> &str {
    let b = line.as_bytes();
    for i in 0..b.len() {
        if b[i] == b'#' && (i == 0 || b[i - 1].is_ascii_whitespace()) {
            return &line[..i];
        }
    }
    line
}

fn split_word(s: &str) -> (&str, &str) {
    let s = s.trim_start();
    match s.find(char::is_whitespace) {
        Some(i) => (&s[..i], &s[i..]),
        None => (s, ""),
    }
}

impl Reader<'_> {
    fn problem(&self, message: impl Into<String>, allowed: Option<&str>) -> Box<InputProblem> {
        Box::new(InputProblem {
            file: self.file.to_path_buf(),
            line: Some(self.line),
            column: None,
            key: String::new(),
            message: message.into(),
            allowed: allowed.map(str::to_string),
        })
    }

    fn origin(&self) -> Origin {
        Origin { file: self.file.to_path_buf(), line: self.line }
    }

    fn directive(&mut self, word: &str, rest: &str) -> R<()> {
        match word {
            "strokes" => Err(self.problem("`strokes` may only appear once, on the first line", None)),
            "cap" => {
                self.finish_block()?;
                let v = self.numbers(rest, 1)?;
                self.cap = Some(self.positive(v[0], "cap height")?);
                Ok(())
            }
            "glyph" => self.begin_glyph(rest),
            "icon" => self.begin_icon(rest),
            "style" => self.begin_style(rest),
            _ => {
                match &self.block {
                    Block::Glyph(..) | Block::Icon(..) => self.mark(word, rest),
                    Block::Style(..) => self.style_line(word, rest),
                    Block::None => Err(self
                        .problem(format!("`{word}` outside a definition"), Some("strokes, cap, glyph, icon, style"))),
                }
            }
        }
    }

    fn words<'s>(&self, rest: &'s str) -> Vec<&'s str> {
        rest.split_whitespace().collect()
    }

    fn number(&self, w: &str) -> R<f64> {
        match w.parse::<f64>() {
            Ok(v) if v.is_finite() => Ok(v),
            _ => Err(self.problem(format!("`{w}` is not a number"), None)),
        }
    }

    fn numbers(&self, rest: &str, n: usize) -> R<Vec<f64>> {
        let w = self.words(rest);
        if w.len() != n {
            return Err(self.problem(format!("expected {n} number(s), found {} value(s)", w.len()), None));
        }
        w.iter().map(|x| self.number(x)).collect()
    }

    fn positive(&self, v: f64, what: &str) -> R<f64> {
        if v > 0.0 { Ok(v) } else { Err(self.problem(format!("{what} must be greater than 0, found {v}"), None)) }
    }

    fn finish_block(&mut self) -> R<()> {
        match std::mem::replace(&mut self.block, Block::None) {
            Block::None => Ok(()),
            Block::Glyph(c, g) => {
                if self.out.glyphs.iter().any(|(d, _)| *d == c) {
                    return Err(self.dup(&format!("glyph {}", char_label(c)), &g.origin));
                }
                self.out.glyphs.push((c, g));
                Ok(())
            }
            Block::Icon(name, _, icon) => {
                if icon.marks.iter().all(|m| m.cut) {
                    let line = icon.origin.line;
                    let mut p = self.problem(format!("icon `{name}` draws nothing"), Some(PRIMITIVES));
                    p.line = Some(line);
                    return Err(p);
                }
                if self.out.icons.iter().any(|(d, _)| *d == name) {
                    return Err(self.dup(&format!("icon `{name}`"), &icon.origin));
                }
                self.out.icons.push((name, icon));
                Ok(())
            }
            Block::Style(style, d) => self.finish_style(style, d),
        }
    }

    fn dup(&self, what: &str, at: &Origin) -> Box<InputProblem> {
        let mut p = self.problem(format!("{what} is defined twice in this file (a later file may override it)"), None);
        p.line = Some(at.line);
        p
    }

    fn begin_glyph(&mut self, rest: &str) -> R<()> {
        self.finish_block()?;
        let w = self.words(rest);
        if w.len() != 2 {
            return Err(self.problem("expected `glyph <character> <advance>`", None));
        }
        let c = parse_char(w[0]).ok_or_else(|| {
            self.problem(format!("`{}` is not one character", w[0]), Some("a single character or U+XXXX"))
        })?;
        let cap = self.cap.ok_or_else(|| self.problem("`cap <height>` must come before the first glyph", None))?;
        let advance = self.number(w[1])?;
        if advance < 0.0 {
            return Err(self.problem("advance must not be negative", None));
        }
        self.block = Block::Glyph(c, GlyphDef { advance: advance / cap, marks: vec![], origin: self.origin() });
        Ok(())
    }

    fn begin_icon(&mut self, rest: &str) -> R<()> {
        self.finish_block()?;
        let w = self.words(rest);
        if w.len() != 2 {
            return Err(self.problem("expected `icon <name> <box size>`", None));
        }
        let name = w[0];
        if !name.chars().all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-') || name.is_empty() {
            return Err(self.problem(format!("icon name `{name}`"), Some("lower-case letters, digits and `-`")));
        }
        let size = self.positive(self.number(w[1])?, "icon box size")?;
        self.block = Block::Icon(name.to_string(), size, IconDef { marks: vec![], origin: self.origin() });
        Ok(())
    }

    fn begin_style(&mut self, rest: &str) -> R<()> {
        self.finish_block()?;
        let w = self.words(rest);
        let names: Vec<&str> = STYLES.iter().map(|s| s.name()).collect();
        let style = match w.as_slice() {
            [n] => STYLES.iter().copied().find(|s| s.name() == *n),
            _ => None,
        };
        let Some(style) = style else {
            return Err(self.problem(format!("expected `style <name>`, found `style{rest}`"), Some(&names.join(", "))));
        };
        if self.out.styles.iter().any(|(s, _)| *s == style) {
            return Err(self.problem(format!("style `{}` is defined twice in this file", style.name()), None));
        }
        let draft = StyleDraft { segments: vec![], dp: None, colon: None, origin: self.origin() };
        self.block = Block::Style(style, draft);
        Ok(())
    }

    fn style_line(&mut self, word: &str, rest: &str) -> R<()> {
        let w = self.words(rest);
        match word {
            "segment" => {
                let minor = w.len() == 6 && w[5] == "minor";
                if w.len() != 5 && !minor {
                    return Err(self.problem("expected `segment <name> <u0> <v0> <u1> <v1> [minor]`", None));
                }
                let v: Vec<f64> = w[1..5].iter().map(|x| self.number(x)).collect::<R<_>>()?;
                let (a, b) = (pt(v[0], v[1]), pt(v[2], v[3]));
                if a == b {
                    return Err(self.problem("a segment needs two different end points", None));
                }
                let Block::Style(_, d) = &mut self.block else { unreachable!() };
                d.segments.push(SegmentDef { name: w[0].to_string(), from: a, to: b, minor });
            }
            "dp" => {
                if w.len() != 3 {
                    return Err(self.problem("expected `dp <square|round> <size> <space>`", None));
                }
                let shape = self.shape(w[0])?;
                let size = self.positive(self.number(w[1])?, "dot size")?;
                let space = self.number(w[2])?;
                let Block::Style(_, d) = &mut self.block else { unreachable!() };
                d.dp = Some(DotSpec { shape, size, space });
            }
            "colon" => {
                if w.len() != 4 {
                    return Err(self.problem("expected `colon <square|round> <size> <low> <high>`", None));
                }
                let shape = self.shape(w[0])?;
                let size = self.positive(self.number(w[1])?, "dot size")?;
                let (low, high) = (self.number(w[2])?, self.number(w[3])?);
                if !(0.0 < low && low < high && high < 1.0) {
                    return Err(self.problem("colon heights must satisfy 0 < low < high < 1", None));
                }
                let Block::Style(_, d) = &mut self.block else { unreachable!() };
                d.colon = Some(ColonSpec { shape, size, low, high });
            }
            _ => return Err(self.problem(format!("`{word}` in a style"), Some("segment, dp, colon"))),
        }
        Ok(())
    }

    fn shape(&self, w: &str) -> R<DotShape> {
        match w {
            "square" => Ok(DotShape::Square),
            "round" => Ok(DotShape::Round),
            _ => Err(self.problem(format!("dot shape `{w}`"), Some("square, round"))),
        }
    }

    fn finish_style(&mut self, style: DigitStyle, d: StyleDraft) -> R<()> {
        let at = |message: String, allowed: Option<String>| {
            let mut p = self.problem(message, None);
            p.line = Some(d.origin.line);
            p.allowed = allowed;
            p
        };
        let want: Vec<&str> = style.segment_names().to_vec();
        let mut have: Vec<&str> = d.segments.iter().map(|s| s.name.as_str()).collect();
        have.sort();
        let mut sorted = want.clone();
        sorted.sort();
        if have != sorted {
            let msg = format!("style `{}` must define exactly its segments, found {}", style.name(), have.join(" "));
            return Err(at(msg, Some(want.join(" "))));
        }
        let (Some(dp), Some(colon)) = (d.dp, d.colon) else {
            return Err(at(format!("style `{}` needs a `dp` and a `colon` line", style.name()), None));
        };
        self.out.styles.push((style, SkeletonDef { segments: d.segments, dp, colon, origin: d.origin }));
        Ok(())
    }

    fn mark(&mut self, word: &str, rest: &str) -> R<()> {
        let (cut, word, rest) = if word == "cut" {
            let (w, r) = split_word(rest);
            (true, w, r)
        } else {
            (false, word, rest)
        };
        let scale = match &self.block {
            Block::Glyph(..) => self.cap.unwrap_or(1.0),
            Block::Icon(_, size, _) => *size,
            _ => 1.0,
        };
        let prim = self.prim(word, rest, scale)?;
        match &mut self.block {
            Block::Glyph(_, g) => g.marks.push(Mark { prim, cut }),
            Block::Icon(_, _, i) => i.marks.push(Mark { prim, cut }),
            _ => unreachable!(),
        }
        Ok(())
    }

    fn points(&self, rest: &str, unit: f64, min: usize) -> R<Vec<Pt>> {
        let v: Vec<f64> = self.words(rest).iter().map(|x| self.number(x)).collect::<R<_>>()?;
        if !v.len().is_multiple_of(2) {
            return Err(self.problem("coordinates must come in x y pairs", None));
        }
        let p: Vec<Pt> = v.chunks(2).map(|c| pt(c[0] / unit, c[1] / unit)).collect();
        if p.len() < min {
            return Err(self.problem(format!("needs at least {min} point(s), found {}", p.len()), None));
        }
        Ok(p)
    }

    fn rect_args(&self, rest: &str, unit: f64) -> R<(Pt, Pt, f64)> {
        let w = self.words(rest);
        if w.len() != 4 && w.len() != 5 {
            return Err(self.problem("expected `x0 y0 x1 y1 [corner radius]`", None));
        }
        let v: Vec<f64> = w.iter().map(|x| self.number(x)).collect::<R<_>>()?;
        let r = v.get(4).copied().unwrap_or(0.0);
        if r < 0.0 || v[0] == v[2] || v[1] == v[3] {
            return Err(self.problem("a rectangle needs two different corners and a corner radius ≥ 0", None));
        }
        Ok((pt(v[0] / unit, v[1] / unit), pt(v[2] / unit, v[3] / unit), r / unit))
    }

    /// One primitive; coordinates are divided by `unit` (the cap height or box size).
    fn prim(&self, word: &str, rest: &str, unit: f64) -> R<Prim> {
        Ok(match word {
            "line" => Prim::Line(self.points(rest, unit, 1)?),
            "loop" => Prim::Loop(self.points(rest, unit, 3)?),
            "fill" => Prim::Fill(self.points(rest, unit, 3)?),
            "arc" => {
                let v = self.numbers(rest, 5)?;
                let r = self.positive(v[2], "radius")?;
                if v[3] == v[4] {
                    return Err(self.problem("an arc needs different start and end angles", None));
                }
                Prim::Arc(pt(v[0] / unit, v[1] / unit), r / unit, v[3], v[4])
            }
            "circle" | "disc" => {
                let v = self.numbers(rest, 3)?;
                let r = self.positive(v[2], "radius")? / unit;
                let c = pt(v[0] / unit, v[1] / unit);
                if word == "circle" { Prim::Circle(c, r) } else { Prim::Disc(c, r) }
            }
            "box" => {
                let (a, b, r) = self.rect_args(rest, unit)?;
                Prim::Frame(a, b, r)
            }
            "block" => {
                let (a, b, r) = self.rect_args(rest, unit)?;
                Prim::Block(a, b, r)
            }
            "path" | "fillpath" => {
                let subs = parse_svg_path(rest.trim()).map_err(|e| self.problem(e.to_string(), Some(PATH_COMMANDS)))?;
                let subs: Vec<SubPath> = subs.iter().map(|s| s.mapped(1.0 / unit, 0.0, 0.0)).collect();
                if word == "path" { Prim::Path(subs) } else { Prim::FillPath(subs) }
            }
            _ => return Err(self.problem(format!("unknown primitive `{word}`"), Some(PRIMITIVES))),
        })
    }
}

/// `A`, `µ` or `U+00B5` → the character.
fn parse_char(w: &str) -> Option<char> {
    if let Some(hex) = w.strip_prefix("U+").or_else(|| w.strip_prefix("u+")) {
        return u32::from_str_radix(hex, 16).ok().and_then(char::from_u32);
    }
    let mut it = w.chars();
    match (it.next(), it.next()) {
        (Some(c), None) => Some(c),
        _ => None,
    }
}

/// How a character is shown in messages: `'A'`, or `U+0020` for invisible ones.
pub fn char_label(c: char) -> String {
    if c.is_whitespace() || c.is_control() {
        format!("U+{:04X}", c as u32)
    } else {
        format!("'{c}' (U+{:04X})", c as u32)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn parse(text: &str) -> R<FontFile> {
        parse_font(Path::new("test.strokes"), text)
    }

    #[test]
    fn reads_glyphs_icons_and_styles() {
        let f = parse(
            "strokes 1\n# a comment\ncap 10\nglyph A 6   # trailing comment\n  line 0 0 3 10 6 0\n  line 1 3.5 5 3.5\n\
             glyph U+0020 4\nicon dot 10\n  disc 5 5 2\n  cut disc 5 5 1\n",
        )
        .unwrap();
        assert_eq!(f.glyphs.len(), 2);
        assert_eq!(f.glyphs[0].0, 'A');
        assert!((f.glyphs[0].1.advance - 0.6).abs() < 1e-12);
        assert_eq!(f.glyphs[0].1.marks[0].prim, Prim::Line(vec![pt(0.0, 0.0), pt(0.3, 1.0), pt(0.6, 0.0)]));
        assert_eq!(f.glyphs[1].0, ' ');
        assert_eq!(f.icons[0].1.marks.len(), 2);
        assert!(f.icons[0].1.marks[1].cut);
        assert_eq!(f.icons[0].1.marks[0].prim, Prim::Disc(pt(0.5, 0.5), 0.2));
    }

    #[test]
    fn errors_name_file_and_line() {
        let e = parse("strokes 1\ncap 10\nglyph A 6\n  lin 0 0 1 1\n").unwrap_err();
        assert_eq!(e.file, PathBuf::from("test.strokes"));
        assert_eq!(e.line, Some(4));
        assert!(e.message.contains("unknown primitive `lin`"), "{}", e.message);
        assert!(e.allowed.unwrap().contains("line"));

        let e = parse("cap 10\n").unwrap_err();
        assert_eq!(e.line, Some(1));
        let e = parse("strokes 1\nglyph A 6\n").unwrap_err();
        assert!(e.message.contains("cap"));
        let e = parse("strokes 1\ncap 10\nglyph A 6\nline 0 0 1\n").unwrap_err();
        assert!(e.message.contains("pairs") && e.line == Some(4));
        let e = parse("strokes 1\ncap 10\nglyph A 6\nglyph A 5\n").unwrap_err();
        assert!(e.message.contains("twice") && e.line == Some(4), "{e}");
        let e = parse("strokes 1\nicon x 10\npath M 0 0 Q 1\n").unwrap_err();
        assert!(e.message.contains("character") && e.line == Some(3));
        let e =
            parse("strokes 1\nstyle seven\nsegment a 0 1 1 1\ndp square 1 1\ncolon square 1 0.3 0.7\n").unwrap_err();
        assert!(e.message.contains("exactly") && e.line == Some(2), "{e}");
        let e = parse("strokes 1\nstyle eleven\n").unwrap_err();
        assert!(e.allowed.unwrap().contains("fourteen"));
    }
}
