//! Which parts a gauge has, so that the net list knows every element before the glyph
//! stage draws anything.
//!
//! A gauge `G` is made of the icons named `G-shell` (optional) and `G-bar-1`, `G-bar-2`,
//! … (at least the first; numbering stops at the first missing one) in the built-in icon
//! file and the layout's font files (fonts-strokes/README.md). Only the names on `icon`
//! lines are read here; the glyph stage reads the drawings and reports any mistake in
//! them with file and line.

use crate::layout::{FontSource, GaugePart};

/// The built-in icon file, the same text the glyph stage compiles in.
const BUILTIN_ICONS: &str = include_str!("../../fonts-strokes/icons.strokes");

/// Suffix of the shell part, in icon names and element names.
pub const SHELL: &str = "shell";

/// Names of every icon defined in the built-in icon file and in `extra`.
pub fn icon_names(extra: &[FontSource]) -> Vec<String> {
    let mut names: Vec<String> = std::iter::once(BUILTIN_ICONS)
        .chain(extra.iter().map(|f| f.text.as_str()))
        .flat_map(|text| text.lines().filter_map(icon_line))
        .collect();
    names.sort();
    names.dedup();
    names
}

/// The name on an `icon NAME SIZE` line (comments and indentation allowed).
fn icon_line(line: &str) -> Option<String> {
    let mut words = line.split_whitespace();
    (words.next()? == "icon").then_some(())?;
    words.next().map(str::to_string)
}

/// The parts of gauge `gauge`, shell first, then the bars in order; `None` when it has
/// no `-bar-1`.
pub fn gauge_parts(gauge: &str, names: &[String]) -> Option<Vec<GaugePart>> {
    let has = |n: &str| names.iter().any(|x| x == n);
    let bar = |k: u32| format!("{gauge}-bar-{k}");
    if !has(&bar(1)) {
        return None;
    }
    let mut parts = Vec::new();
    let shell = format!("{gauge}-{SHELL}");
    if has(&shell) {
        parts.push(GaugePart { suffix: SHELL.into(), icon: shell });
    }
    let mut k = 1;
    while has(&bar(k)) {
        parts.push(GaugePart { suffix: k.to_string(), icon: bar(k) });
        k += 1;
    }
    Some(parts)
}

/// Names of every gauge the fonts define, for messages.
pub fn gauge_names(names: &[String]) -> Vec<String> {
    names.iter().filter_map(|n| n.strip_suffix("-bar-1").map(str::to_string)).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn builtin_gauges_have_their_parts() {
        let names = icon_names(&[]);
        let b = gauge_parts("battery", &names).unwrap();
        let s: Vec<&str> = b.iter().map(|p| p.suffix.as_str()).collect();
        assert_eq!(s, ["shell", "1", "2", "3"]);
        assert_eq!(b[1].icon, "battery-bar-1");
        assert_eq!(gauge_parts("signal", &names).unwrap().len(), 4);
        assert!(gauge_parts("bell", &names).is_none());
        assert_eq!(gauge_names(&names), ["battery", "signal"]);
    }

    #[test]
    fn layout_fonts_add_gauges() {
        let f = FontSource {
            path: "tank.strokes".into(),
            text: "strokes 1\n# a tank\nicon tank-bar-1 10\n  block 0 0 10 2\n  icon tank-bar-2 10 # indented\n block 0 3 10 5\n".into(),
        };
        let names = icon_names(&[f]);
        let t = gauge_parts("tank", &names).unwrap();
        assert_eq!(t.iter().map(|p| p.suffix.as_str()).collect::<Vec<_>>(), ["1", "2"]);
    }
}
