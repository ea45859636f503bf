//! What to change where a lead found no way past the segments of a digit group or the
//! steps of a bar graph whose gap is below the gap the rules give a digit by default
//! ([`crate::layout::Rules::digit_gap`]: a lead, a gap on each side and grid slack).
//!
//! Takes the layout, the electrodes and the elements behind a failure (a cut-off common's
//! pixels, a stuck SEG net's elements); gives the text appended to its `unroutable`
//! finding, one clause per such group. A gap that fits the default rules may not fit
//! coarser ones or a wider `lead_width`. Measured on the demos: the kiln demo under
//! 0.12/0.1 mm rules with 8 µm undercut keeps its 0.35 mm gap and COM1 is cut off
//! behind every digit, clean with 0.536 mm; the irrigation-timer demo (static drive)
//! with 0.2 mm leads leaves every digit's `g` shut in, clean with 0.4 mm; the
//! tank-level-dial demo with 0.2 mm leads and 0.4 mm digit gaps leaves a dial step shut
//! in behind the ticks (their default gap, 0.3 mm), clean with 0.4 mm.

use crate::electrode::Electrodes;
use crate::layout::Layout;

/// Where the lead that found no way had to pass.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Through {
    /// Between the back electrodes of two other commons at a digit's junctions (a
    /// common's lead, multiplexed drive).
    Junctions,
    /// Between two segments (a SEG lead on the front plate).
    Segments,
}

/// One clause per digit group or bar graph among `elements` whose gap is below the
/// rules' default, each starting with "; ".
pub fn narrow_gap_fixes(layout: &Layout, el: &Electrodes, elements: &[usize], through: Through) -> Vec<String> {
    let commons = layout.drive.commons;
    if through == Through::Junctions && commons < 2 {
        return Vec::new();
    }
    let r = &layout.rules;
    let what = match through {
        Through::Junctions => "for the commons' leads to pass through a group's junctions",
        Through::Segments => "for a lead to pass between a group's parts",
    };
    // Each group that holds one of the elements: its key, what its parts are called,
    // its gap and the gap the rules give. A bar graph's own default is a lead and a gap
    // on each side without the grid slack; the slack is what lets a lead through.
    let digits = layout.digits.iter().map(|g| (&g.key, "segments", g.gap, r.digit_gap(g.style, commons)));
    let bars = layout.bars.iter().map(|b| (&b.key, "steps", b.gap, r.passing_gap()));
    digits
        .chain(bars)
        .filter(|(key, ..)| elements.iter().any(|&i| el.elements.get(i).is_some_and(|e| &e.key == *key)))
        .filter_map(|(key, parts, gap, want)| {
            (gap < want - 1e-9).then(|| {
                let line = crate::layout::key_line(&layout.key_lines, &format!("{key}.gap")).map(|l| format!(" (line {l})")).unwrap_or_default();
                format!(
                    "; the {parts} of `{key}` are {gap:.3} mm apart{line}, narrower than the {want:.3} mm these rules give {what} (a {lead:.3} mm lead with {min:.3} mm gaps and routing slack): widen `{key}.gap` to {want:.3} mm",
                    lead = r.lead_width,
                    min = r.min_gap,
                )
            })
        })
        .collect()
}

/// Appends to every front-plate `unroutable` finding of a SEG net the clauses for the
/// digit groups and bar graphs of its elements and of the nets named as blocking it.
pub fn explain_stuck_seg_nets(layout: &Layout, el: &Electrodes, findings: &mut [crate::finding::Finding]) {
    use crate::finding::Rule;
    use crate::layout::PlateId;
    for f in findings.iter_mut().filter(|f| f.rule == Rule::Unroutable && f.plate == Some(PlateId::Front)) {
        // The stuck net's elements and those of the nets it names as blocking it: a step
        // of one bar graph shut in behind the ticks of another is the ticks' gap.
        let elements: Vec<usize> = (0..el.elements.len()).filter(|&i| f.nets.iter().any(|n| n == el.nets_of(i).0)).collect();
        for fix in narrow_gap_fixes(layout, el, &elements, Through::Segments) {
            f.message.push_str(&fix);
        }
    }
}
