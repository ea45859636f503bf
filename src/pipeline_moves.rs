//! Icons and legends moved to another common when theirs cannot reach its dot.
//!
//! Takes a layout, its elements and what the assignment, electrode and route stages made
//! of them; gives the same four, with one icon or legend fixed on another common where
//! that routes with fewer errors, and a `reassigned` note saying which and how to keep it.
//!
//! The assignment places an icon or legend on the common with a free place nearest it;
//! whether that common's piece behind it can then reach its transfer dot is known only
//! after routing (three test lines side by side on three commons: the line of the common
//! laid last is fenced in by the other two's leads). Digit segments keep their
//! template's commons, and the parts of a gauge and the steps of a bar graph share one
//! common, so only a whole icon or legend is moved.

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

/// (errors, warnings) among the routes' findings: fewer is better, errors first.
fn score(r: &Routes) -> (usize, usize) {
    let count = |s: Severity| r.findings.iter().filter(|f| f.severity == s).count();
    (count(Severity::Error), count(Severity::Warning))
}

/// Tries each icon or legend behind a piece of a common cut off from its dot (not
/// fixed by hand) on each other common, and keeps the first try that routes with no
/// error, or else the one with the fewest; the note goes among the routes' findings.
pub fn move_cut_off(routed: Routed, elements: &[Element]) -> Result<Routed> {
    let commons = routed.layout.drive.commons;
    // Many elements cut off is no local fence that one move undoes, and each try routes
    // the whole glass again.
    if routed.routes.cut_off.is_empty() || routed.routes.cut_off.len() > MOST_CUT_OFF || commons < 2 {
        return Ok(routed);
    }
    let movable: Vec<usize> = routed
        .routes
        .cut_off
        .iter()
        .copied()
        .filter(|&i| {
            let e = &elements[i];
            matches!(e.kind, ElementKind::Icon | ElementKind::Legend) && !e.name.contains('.') && !routed.layout.fixed_lines.contains_key(&e.name)
        })
        .collect();
    let first = routed.assignment.com.clone();
    let mut best = routed;
    let mut best_score = score(&best.routes);
    let mut moved: Option<(usize, u32)> = None;
    let mut tries = 0;
    'elements: for i in movable {
        for com in (1..=commons).filter(|&c| c != first[i] + 1) {
            if tries == MOST_TRIES {
                break 'elements;
            }
            tries += 1;
            let mut layout = best.layout.clone();
            if let Some((m, _)) = moved {
                layout.fixed_lines.remove(&elements[m].name);
            }
            layout.fixed_lines.insert(elements[i].name.clone(), FixedLine { com: Some(com), seg: None });
            // A try the stages refuse (a fixed choice they cannot keep) is no better.
            let Ok(assignment) = crate::assign::assign(&layout, elements) else { continue };
            let Ok(electrodes) = crate::electrode::build_electrodes(&layout, elements, &assignment) else { continue };
            let Ok(routes) = crate::route::route_leads(&layout, &electrodes) else { continue };
            let s = score(&routes);
            if s < best_score {
                best = Routed { layout, assignment, electrodes, routes };
                best_score = s;
                moved = Some((i, com));
                if s.0 == 0 {
                    break 'elements;
                }
            }
        }
    }
    if let Some((i, com)) = moved {
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
