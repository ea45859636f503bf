//! Why a multiplexed layout has more pins than the fewest: a note naming where the SEG
//! lines' free places are and what keeps them free.
//!
//! Takes the layout, the elements and their assignment; gives a `pin-count` note when
//! the assignment uses more SEG lines than ⌈S/N⌉ for S elements at 1/N duty (the fewest
//! pins are N + ⌈S/N⌉, docs/background.md, *Drive and pin count*), else nothing. Every
//! line has N places, one per common; the free ones are counted by what holds their line:
//! a bar graph's steps or a gauge's parts (one common for the whole set, one line each),
//! a seven-segment template (each digit on its own lines), lines fixed by hand, or
//! nothing that could be moved there. The electrode stage adds the note to its findings,
//! which is how what the stages before routing find reaches the artwork.

use super::Assignment;
use crate::finding::{Finding, Rule, Severity};
use crate::glyph::Element;
use crate::layout::Layout;
use std::collections::BTreeMap;

/// What keeps a line's free places free, in the order the note lists them.
#[derive(Debug, Clone, PartialEq, Eq, PartialOrd, Ord)]
enum Cause {
    /// The members of a bar graph or gauge (`key`), one common for the set.
    OneCommon(String),
    /// The seven-segment template of the digits under `key`.
    Template(String),
    /// A line numbered by hand in `drive.fixed`.
    Fixed,
    /// Nothing near enough to take the place.
    Rest,
}

/// The `pin-count` note, when the assignment opens more SEG lines than the fewest.
pub fn extra_lines_note(layout: &Layout, elements: &[Element], a: &Assignment) -> Option<Finding> {
    let n = layout.drive.commons.max(1);
    if n < 2 || elements.is_empty() {
        return None;
    }
    let s = elements.len() as u32;
    let fewest = s.div_ceil(n);
    if a.lines <= fewest {
        return None;
    }
    // Free places and lines per cause.
    let mut by_cause: BTreeMap<Cause, (u32, u32, Vec<usize>)> = BTreeMap::new();
    for j in 0..a.lines {
        let members: Vec<usize> = a.on_line(j).collect();
        let free = n.saturating_sub(members.len() as u32);
        if free == 0 || members.is_empty() {
            continue;
        }
        let cause = cause_of(layout, elements, &members);
        let e = by_cause.entry(cause).or_default();
        e.0 += free;
        e.1 += 1;
        e.2.extend(members);
    }
    let free: u32 = by_cause.values().map(|v| v.0).sum();
    let sets: Vec<String> = by_cause
        .iter()
        .filter_map(|(c, (f, lines, _))| match c {
            Cause::OneCommon(key) => Some(format!("{f} on the {lines} line(s) of {}", entry(layout, key))),
            _ => None,
        })
        .collect();
    let mut parts = Vec::new();
    if !sets.is_empty() {
        parts.push(format!(
            "{}, whose parts keep one common per set, one part to a line, so that the common behind each set is one piece the back plate can lead out",
            sets.join(" and ")
        ));
    }
    parts.extend(by_cause.iter().filter(|(c, _)| !matches!(c, Cause::OneCommon(_))).map(|(c, (f, lines, _))| describe(layout, c, *f, *lines)));
    let first = by_cause.values().next().and_then(|v| v.2.first().copied()).unwrap_or(0);
    let at = {
        use geo::Centroid;
        elements[first].outline.centroid().map(|p| p.0).unwrap_or_default()
    };
    Some(Finding {
        rule: Rule::PinCount,
        severity: Severity::Note,
        plate: None,
        nets: Vec::new(),
        location: at,
        measured: None,
        required: None,
        message: format!(
            "{} pins ({n} COM + {} SEG) where {n} + ⌈{s}/{n}⌉ = {} is the fewest for {s} elements at 1/{n} duty: {free} places on the SEG lines stay free — {}",
            n + a.lines,
            a.lines,
            n + fewest,
            parts.join("; ")
        ),
    })
}

fn cause_of(layout: &Layout, elements: &[Element], members: &[usize]) -> Cause {
    if let Some(&i) = members.iter().find(|&&i| super::one_common(layout, &elements[i])) {
        return Cause::OneCommon(elements[i].key.clone());
    }
    if let Some(&i) = members.iter().find(|&&i| super::digit_template(layout, &elements[i]).is_some() && elements[i].digit.is_some()) {
        return Cause::Template(elements[i].key.clone());
    }
    if members.iter().any(|&i| layout.fixed_lines.get(&elements[i].name).is_some_and(|f| f.seg.is_some())) {
        return Cause::Fixed;
    }
    Cause::Rest
}

/// The layout entry `key` as the user reads it: `bars[0]` (LVL).
fn entry(layout: &Layout, key: &str) -> String {
    let name = layout
        .digits
        .iter()
        .find(|g| g.key == key)
        .map(|g| g.name.clone())
        .or_else(|| layout.icons.iter().find(|i| i.key == key).map(|i| i.name.clone()))
        .or_else(|| layout.bars.iter().find(|b| b.key == key).map(|b| b.name.clone()));
    let line = crate::layout::key_line(&layout.key_lines, key).map(|l| format!("line {l}"));
    let said: Vec<String> = name.into_iter().chain(line).collect();
    if said.is_empty() { format!("`{key}`") } else { format!("`{key}` ({})", said.join(", ")) }
}

/// Whether the layout entry `key` is a group of fourteen-segment digits.
fn is_fourteen(layout: &Layout, key: &str) -> bool {
    layout.digits.iter().any(|g| g.key == key && g.style == crate::layout::DigitStyle::Fourteen)
}

fn describe(layout: &Layout, c: &Cause, free: u32, lines: u32) -> String {
    match c {
        Cause::OneCommon(key) => format!("{free} on the {lines} line(s) of {}", entry(layout, key)),
        Cause::Template(key) if is_fourteen(layout, key) => format!(
            "{free} on the {lines} line(s) of {}: the fourteen-segment template puts the upper half of each digit on COM1 and the lower half on COM{}, eight lines a digit, because three leads cross the centre of the digit and would shut a common in between the halves; no other element takes these places",
            entry(layout, key),
            layout.drive.commons
        ),
        Cause::Template(key) => format!(
            "{free} on the {lines} line(s) of {}: the seven-segment template gives each digit lines of its own so that both plates route, and no icon or legend lies near enough to fill them",
            entry(layout, key)
        ),
        Cause::Fixed => format!("{free} on {lines} line(s) numbered by hand in `drive.fixed`"),
        Cause::Rest => format!("{free} on {lines} line(s) that no other element lies near enough to fill"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::assign::assign;
    use crate::glyph::build_elements;
    use crate::glyph::testkit::{empty_layout, seven_group};
    use crate::layout::Drive;

    fn note_for(commons: u32, digits: u32, dps: Vec<u32>) -> Option<Finding> {
        let mut l = empty_layout();
        let mut g = seven_group(digits, 0.0);
        g.decimal_points = dps;
        l.digits.push(g);
        l.drive = Drive { commons, bias: Some(3) };
        let e = build_elements(&l).unwrap();
        let a = assign(&l, &e).unwrap();
        extra_lines_note(&l, &e, &a)
    }

    /// At the fewest pins, N + ⌈S/N⌉ (docs/background.md, *Drive and pin count*), no
    /// note: four digits with points at 1/4 duty fill 8 lines exactly.
    #[test]
    fn no_note_at_the_fewest_pins() {
        assert!(note_for(4, 4, vec![1, 2, 3, 4]).is_none());
    }

    /// Two digits without points at 1/3 duty: the template {f e d} {b c dp} {a g ·}
    /// gives each digit three lines and leaves the point's place and `·` free, six
    /// lines for 14 elements where ⌈14/3⌉ = 5 would do: the note counts 3 · 6 − 14 = 4
    /// free places, one on each of two lines per digit.
    #[test]
    fn template_lines_above_the_fewest_are_explained() {
        let f = note_for(3, 2, vec![]).expect("a note");
        assert_eq!((f.rule, f.severity), (Rule::PinCount, Severity::Note));
        assert!(f.message.starts_with("9 pins (3 COM + 6 SEG) where 3 + ⌈14/3⌉ = 8 is the fewest"), "{}", f.message);
        assert!(f.message.contains("4 places on the SEG lines stay free — 4 on the 4 line(s) of `digits[0]`"), "{}", f.message);
    }

    /// Static drive has no lines to share: never a note.
    #[test]
    fn static_drive_has_no_note() {
        assert!(note_for(1, 2, vec![]).is_none());
    }
}
