//! Icons, legends and colon dots moved to another common when theirs cannot reach its dot.
//!
//! Takes a layout, its elements and what the assignment, electrode and route stages made
//! of them; gives the same four, with some icons, legends or colon dots fixed on another
//! common where the check then finds fewer errors and warnings, and a `reassigned` note
//! for each saying which and how to keep it.
//!
//! The assignment places an icon, a legend or a colon's dot (when the digits' template
//! names no common for it) on the common with a free place nearest it; whether that
//! common's piece behind it can then reach its transfer dot is known only after routing
//! (three test lines side by side on three commons: the line of the common laid last is
//! fenced in by the other two's leads). Digit segments keep their template's commons,
//! and the parts of a gauge and the steps of a bar graph share one common, so only these
//! are moved.

use crate::assign::Assignment;
use crate::electrode::Electrodes;
use crate::finding::{Finding, Rule, Severity};
use crate::glyph::{Element, ElementKind};
use crate::layout::{FixedLine, Layout};
use crate::route::Routes;
use crate::Result;

/// At most this many other commons are tried, all elements together: each try is one
/// more pass through assignment, electrodes and routing.
const MOST_TRIES: usize = 6;
/// Moves are tried when at most this many elements lie behind cut-off pieces.
const MOST_CUT_OFF: usize = 3;

/// What the stages up to routing made of a layout.
pub struct Routed {
    /// The layout, with any element fixed on a common by [`move_cut_off`].
    pub layout: Layout,
    /// The COM and SEG line of every element.
    pub assignment: Assignment,
    /// The electrodes.
    pub electrodes: Electrodes,
    /// The routes.
    pub routes: Routes,
}

/// (errors, warnings) the checks find in what the stages made: fewer is better, errors
/// first. Scored by the check, not by the routes' own findings: a move can route without
/// an error and still leave back leads crossing front leads in the liquid crystal (the
/// `ghost` warnings only the check finds), and another move none.
fn score(layout: &Layout, electrodes: &Electrodes, routes: &Routes) -> Result<(usize, usize)> {
    let artwork = crate::plate::build_artwork(layout, electrodes, routes)?;
    let findings = crate::check::build_findings(&artwork, &crate::check::Extraction::extract(&artwork));
    let count = |s: Severity| findings.iter().filter(|f| f.severity == s).count();
    Ok((count(Severity::Error), count(Severity::Warning)))
}

/// Whether element `e` may be moved to another common: an icon or legend, or a colon's
/// dot (which the assignment places as it places an icon), not fixed by hand. Digit
/// segments keep their template's commons, and the parts of a gauge and the steps of a
/// bar graph share one.
fn movable(layout: &Layout, e: &Element) -> bool {
    let colon_dot = e.kind == ElementKind::Segment && crate::layout::COLON_DOTS.iter().any(|d| e.name.rsplit('.').next() == Some(*d));
    let whole = matches!(e.kind, ElementKind::Icon | ElementKind::Legend) && !e.name.contains('.');
    (whole || colon_dot) && !layout.fixed_lines.contains_key(&e.name)
}

/// Tries the icons, legends and colon dots behind pieces of commons cut off from their
/// dots (not fixed by hand) on the other commons — all of them together on one common,
/// then each alone — and keeps the first try the
/// check finds clean, or else the one with the fewest errors and then warnings; the notes
/// go among the routes' findings.
pub fn move_cut_off(routed: Routed, elements: &[Element]) -> Result<Routed> {
    let commons = routed.layout.drive.commons;
    // Many elements cut off is no local fence that one move undoes, and each try routes
    // the whole glass again.
    // Nor can a move help where the front left SEG lines unrouted: they come back in
    // every try.
    if routed.routes.cut_off.is_empty() || routed.routes.cut_off.len() > MOST_CUT_OFF || commons < 2 || crate::route::front_unroutable(&routed.routes.findings) {
        return Ok(routed);
    }
    let movable: Vec<usize> = routed.routes.cut_off.iter().copied().filter(|&i| movable(&routed.layout, &elements[i])).collect();
    if movable.is_empty() {
        return Ok(routed);
    }
    let first = routed.assignment.com.clone();
    // All together on each common none of them is on first — two dots of a colon or
    // icons side by side are fenced in together, and one moved alone leaves the other
    // where the fence is (a colon at 1/3 duty: each dot alone left `ghost` warnings,
    // both on COM2 checked clean) — then each alone on each other common.
    let mut tries: Vec<Vec<(usize, u32)>> = Vec::new();
    if movable.len() > 1 {
        tries.extend((1..=commons).filter(|&c| movable.iter().all(|&i| first[i] + 1 != c)).map(|c| movable.iter().map(|&i| (i, c)).collect()));
    }
    for &i in &movable {
        tries.extend((1..=commons).filter(|&c| c != first[i] + 1).map(|c| vec![(i, c)]));
    }
    let mut best_score = score(&routed.layout, &routed.electrodes, &routed.routes)?;
    let mut best = routed;
    let mut moved: Vec<(usize, u32)> = Vec::new();
    for moves in tries.into_iter().take(MOST_TRIES) {
        let mut layout = best.layout.clone();
        for (m, _) in &moved {
            layout.fixed_lines.remove(&elements[*m].name);
        }
        for &(i, com) in &moves {
            layout.fixed_lines.insert(elements[i].name.clone(), FixedLine { com: Some(com), seg: None });
        }
        // A try the stages refuse (a fixed choice they cannot keep) is no better.
        let Ok(assignment) = crate::assign::assign(&layout, elements) else { continue };
        let Ok(electrodes) = crate::electrode::build_electrodes(&layout, elements, &assignment) else { continue };
        let Ok(routes) = crate::route::route_leads(&layout, &electrodes) else { continue };
        let Ok(s) = score(&layout, &electrodes, &routes) else { continue };
        if s < best_score {
            best = Routed { layout, assignment, electrodes, routes };
            best_score = s;
            moved = moves;
            if s == (0, 0) {
                break;
            }
        }
    }
    for &(i, com) in &moved {
        let note = reassigned_note(&best.layout, &elements[i], first[i] + 1, com);
        best.routes.findings.push(note);
    }
    Ok(best)
}

/// The note for element `e` moved from common `from` to `to` (1-based).
fn reassigned_note(layout: &Layout, e: &Element, from: u32, to: u32) -> Finding {
    use geo::Centroid;
    let entry = match crate::layout::key_line(&layout.key_lines, &e.key) {
        Some(l) => format!("`{}` line {l}", e.key),
        None => format!("`{}`", e.key),
    };
    Finding {
        rule: Rule::Reassigned,
        severity: Severity::Note,
        plate: None,
        nets: vec![format!("COM{to}")],
        location: e.outline.centroid().map(|p| p.0).unwrap_or_default(),
        measured: None,
        required: None,
        message: format!(
            "{} ({entry}) put on COM{to}: on COM{from}, where the assignment first put it, the back plate could not join its common's piece behind it to the transfer dot; to keep this choice whatever else changes, add `{}: {{com: {to}}}` under `drive.fixed`",
            e.name, e.name
        ),
    }
}
